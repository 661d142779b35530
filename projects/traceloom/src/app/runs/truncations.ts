/** A truncation of the result: an infinite sum, product or lattice cut off at the order. */
export interface Truncation {
  field: string;
  what: string;
  terms: number;
}

/** Truncations of the same field and kind, said once. */
export interface TruncationGroup {
  field: string;
  what: string;
  /** How many times it happened (a sector sum: once per sector). */
  times: number;
  fewest: number;
  most: number;
}

/** Groups the result's truncations by field and kind, in the order they first appear. */
export function groupTruncations(list: readonly Truncation[]): TruncationGroup[] {
  const groups = new Map<string, TruncationGroup>();
  for (const t of list) {
    const key = `${t.field}\u0000${t.what}`;
    const g = groups.get(key);
    if (!g)
      groups.set(key, { field: t.field, what: t.what, times: 1, fewest: t.terms, most: t.terms });
    else {
      g.times++;
      g.fewest = Math.min(g.fewest, t.terms);
      g.most = Math.max(g.most, t.terms);
    }
  }
  return [...groups.values()];
}

/** One caution line: `weights: spectrum lattice points cut off after 15 terms at the order.` */
export function truncationText(g: TruncationGroup): string {
  const terms = g.fewest === g.most ? `${g.most}` : `${g.fewest}–${g.most}`;
  if (g.times === 1) return `${g.field}: ${g.what} cut off after ${terms} terms at the order.`;
  return `${g.field}: ${g.what} cut off at the order ${g.times} times (after ${terms} terms each; a sector sum cuts once per sector).`;
}
