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
  sectors: 'sector sums',
};

/** The name of a progress phase (`classSum` -> `class sum`); unknown keys pass through. */
export function phaseName(key: string): string {
  return PHASE_NAMES[key] ?? key;
}

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

/** Gas-spec fields as the gas form labels them (dotted spec path -> label). */
const SPEC_LABELS: [RegExp, (m: RegExpExecArray) => string][] = [
  [/^title$/, () => 'Title'],
  [/^statistics$/, () => 'Statistics'],
  [/^variable$/, () => 'Variable'],
  [/^step$/, () => 'Step'],
  [/^order$/, () => 'Order'],
  [/^nMax$/, () => FIELD_LABELS.nMax],
  [/^classTable$/, () => 'Class-table depth'],
  [/^precision$/, () => 'Precision'],
  [/^at\.(\w+)$/, (m) => `Evaluate at ${m[1]}`],
  [/^weights\.values\.(\d+)$/, (m) => `Z_${Number(m[1]) + 1}`],
  [/^weights\.values$/, () => 'Cycle weights'],
  [/^weights\.expression$/, () => 'Cycle-weight expression'],
  [/^weights\.(offset|from|to|periodic)$/, (m) => `Weights ${m[1]}`],
  [/^weights(\.kind)?$/, () => 'Weight source'],
  [/^grand\.values\.(\d+)$/, (m) => `Grand function coefficient ${m[1]}`],
  [/^grand(\.\w+)?$/, () => 'Grand function'],
  [/^reference\.normalization$/, () => 'Normalization'],
  [/^reference\.rows\.(\d+)(\.\w+)?$/, (m) => `Reference row ${Number(m[1]) + 1}`],
  [/^recognize\.basis\.(\d+)$/, (m) => `Closed-form basis line ${Number(m[1]) + 1}`],
  [/^recognize(\.\w+)?$/, () => 'Closed-form basis'],
  [/^sectors\.index\.(\d+)$/, (m) => `Index ${Number(m[1]) + 1} name`],
  [/^sectors\.weight$/, () => 'Sector weight w(n)'],
  [/^sectors(\.\w+)?(\.\d+)?$/, () => 'Sectors'],
];

/**
 * How a message names a gas-spec field: the label the gas form shows (`spec.weights.expression`
 * -> `Cycle-weight expression`, `spec.nMax` -> `N_max`); the API's `field` keeps the path.
 * A path outside the spec comes back unchanged.
 */
export function fieldLabel(path: string): string {
  const inner = path.startsWith('spec.') ? path.slice(5) : path === 'spec' ? '' : null;
  if (inner === null) return path;
  if (inner === '') return 'Gas';
  for (const [re, label] of SPEC_LABELS) {
    const m = re.exec(inner);
    if (m) return label(m);
  }
  return 'Gas';
}
