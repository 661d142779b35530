// @ts-check
import js from '@eslint/js';
import angular from 'angular-eslint';
import prettier from 'eslint-config-prettier';
import tseslint from 'typescript-eslint';

/**
 * The lint rules of the whole tree (npm run lint): ESLint's and typescript-eslint's recommended
 * sets for every TypeScript file, tests included, and angular-eslint's recommended sets for the
 * client's components and templates. Formatting is Prettier's, checked beside this.
 */
export default tseslint.config(
  {
    ignores: ['**/dist/**', 'node_modules/**', '.angular/**', 'fonts/**', 'data/**', 'coverage/**'],
  },
  {
    files: ['**/*.ts', '**/*.mjs'],
    extends: [js.configs.recommended, ...tseslint.configs.recommended],
    languageOptions: { ecmaVersion: 2023, sourceType: 'module' },
    rules: {
      // `_name` marks a binding kept on purpose (a destructured field left out of a copy).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
    },
  },
  {
    files: ['scripts/**/*.mjs', 'eslint.config.mjs'],
    languageOptions: {
      globals: { process: 'readonly', console: 'readonly', URL: 'readonly', Buffer: 'readonly' },
    },
  },
  {
    files: ['projects/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: 'tl', style: 'kebab-case' },
      ],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'tl', style: 'camelCase' },
      ],
    },
  },
  {
    files: ['projects/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
  {
    // Reference values are quoted with every published digit; the tests compare within a
    // tolerance, so the double a literal rounds to is what they mean.
    files: ['**/*.spec.ts'],
    rules: { 'no-loss-of-precision': 'off' },
  },
  // Line breaks and layout are Prettier's: the rules that would fight it are off.
  prettier,
);
