// Bundles the compiled command line (dist/server/cli/main.js and the shared library it imports)
// into one file, dist/cli/traceloom.mjs: one module to load instead of some 130, which is most of
// the command's start-up (see bench/README.md). `npm run build:server` runs it after tsc.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { root } from './lib.mjs';

const entry = path.join(root, 'dist/server/cli/main.js');
const bundle = path.join(root, 'dist/cli/traceloom.mjs');
const parserOnly = path.join(root, 'shared/dist/engine/expr/parser-only.js');

if (!existsSync(entry) || !existsSync(parserOnly)) {
  console.error(
    `bundle-cli: ${entry} is missing; run npm run build:shared && npm run build:server`,
  );
  process.exit(2);
}
await build({
  entryPoints: [entry],
  outfile: bundle,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  // the expression parser ships as a CommonJS file: give it a require in the ES module
  banner: {
    js: "import { createRequire } from 'node:module'; const require = createRequire(import.meta.url);",
  },
  logLevel: 'warning',
  plugins: [
    {
      // the parser alone instead of the whole single-file build (see engine/expr/parser-only.ts)
      name: 'parser-only',
      setup(b) {
        b.onResolve({ filter: /^mathjs\/lib\/browser\/math\.js$/ }, () => ({ path: parserOnly }));
      },
    },
  ],
});
