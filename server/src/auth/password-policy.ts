import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';
import { AppError } from '../http/app-error.js';

/** Lowest zxcvbn score (0-4) a new password needs: 3 = "safely unguessable" in its scale. */
export const MIN_PASSWORD_SCORE = 3;

const checker = new ZxcvbnFactory({
  dictionary: { ...common.dictionary, ...en.dictionary },
  graphs: common.adjacencyGraphs,
  translations: en.translations,
});

/**
 * Refuses a common or trivial password (400 `weak_password` on `password`) with the checker's
 * own hint: dictionary words and leaked-password lists, keyboard runs, repeats, dates, and the
 * person's own e-mail or name and the product's name count against it.
 */
export function assertStrongPassword(password: string, personal: readonly string[]): void {
  const userInputs = ['traceloom', ...personal.flatMap((p) => p.toLowerCase().split(/[@.\s]+/))];
  const result = checker.check(
    password,
    userInputs.filter((s) => s.length >= 3),
  );
  if (result.score >= MIN_PASSWORD_SCORE) return;
  const hint = [result.feedback.warning, ...result.feedback.suggestions].filter(Boolean).join(' ');
  throw new AppError(
    400,
    'weak_password',
    `password: too easy to guess.${hint ? ` ${hint}` : ''}`,
    'password',
  );
}
