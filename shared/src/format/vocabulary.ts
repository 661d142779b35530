/**
 * The product's words for what the screens, the CLI, the exports and the mails say about a
 * result. One place for each: DEVELOPERS.md ("Vocabulary") and docs/getting-started.md list the
 * same words, and `vocabulary.spec.ts` keeps the banned variants out of templates and messages.
 */

/** Names of the routes to Z(N), keyed as in the result (`routes`, `methods`) and the progress. */
export const ROUTE_NAMES: Readonly<Record<string, string>> = {
  recursion: 'Newton recursion',
  classSum: 'class sum',
  product: 'product form',
  fredholm: 'Fredholm determinant',
};

/** The human name of a route key (`classSum` -> `class sum`); unknown keys pass through. */
export function routeName(key: string): string {
  return ROUTE_NAMES[key] ?? key;
}

/** Names of the progress phases that are not routes (the routes use their route names). */
export const PHASE_NAMES: Readonly<Record<string, string>> = {
  ...ROUTE_NAMES,
  weights: 'cycle weights',
  grand: 'grand check',
  reference: 'reference check',
};

/** The two sides of every verdict: what Traceloom computed, and what the user supplied. */
export const SIDES = { computed: 'computed', supplied: 'supplied' } as const;

/** The verdict words: a match, and the one word for a mismatch. */
export const VERDICT = { agrees: 'agrees', differs: 'differs' } as const;

/** Statuses of a dataset check. */
export const CHECK_STATUS = ['passes', 'fails', 'waived'] as const;

/** A dataset check's status. */
export type CheckStatus = (typeof CHECK_STATUS)[number];

/** Labels for the same names the gas spec uses (the spec field in brackets). */
export const FIELD_LABELS = {
  /** `nMax` */
  nMax: 'N_max',
  /** `classTable` */
  classTable: 'class-table depth',
  /** the exponent of the lowest non-zero term */
  valuation: 'lowest exponent',
  /** the in-app user guide */
  guide: 'Guide',
} as const;
