import { z } from 'zod';
import { MAX_EXPRESSION_LENGTH } from '../limits.js';

/** Most sector indices (the dimension d of the sector lattice Z^d). */
export const MAX_SECTOR_INDICES = 3;

/** Largest |n| a sector range may name. */
export const MAX_SECTOR_INDEX = 1_000_000;

/** Names a sector index may not take: they already mean something in a gas. */
export const SECTOR_RESERVED = ['L', 'p', 'N', 'kappa', 'inf', 'e', 'i', 'pi'];

const INTEGER_TEXT = /^\s*-?\d+\s*$/;
const end = z.union(
  [
    z.number({ error: 'must be an integer or null' }).int({ error: 'must be an integer' }),
    z.string().regex(INTEGER_TEXT, { error: 'must be an integer such as "-3"' }),
    z.null(),
  ],
  { error: 'must be an integer or null (unbounded)' },
);

/**
 * The `sectors` field of a gas spec: an integer vector n over a box of Z^d (d <= 3; null = an
 * unbounded side) and a weight w(n), an expression in the indices (and the series variable).
 * Weight expressions of the gas (formula in L, spectrum in p, each listed value) may use the indices.
 */
export const sectorsSchema = z
  .object({
    index: z
      .array(
        z.string({ error: 'must be a name' }).regex(/^[a-zA-Z][a-zA-Z0-9]{0,11}$/, {
          error: 'must be a name of letters and digits, starting with a letter',
        }),
        { error: 'must be a list of index names' },
      )
      .min(1, { error: 'needs at least one index' })
      .max(MAX_SECTOR_INDICES, { error: `has more than ${MAX_SECTOR_INDICES} indices` }),
    from: z.array(end, { error: 'must be a list of integers or null, one per index' }),
    to: z.array(end, { error: 'must be a list of integers or null, one per index' }),
    weight: z
      .string({ error: 'must be an expression (a string)' })
      .min(1, { error: 'must not be empty' })
      .max(MAX_EXPRESSION_LENGTH, { error: `is longer than ${MAX_EXPRESSION_LENGTH} characters` })
      .default('1'),
  })
  .superRefine((s, ctx) => {
    const seen = new Set<string>();
    s.index.forEach((name, k) => {
      if (SECTOR_RESERVED.includes(name))
        ctx.addIssue({
          code: 'custom',
          path: ['index', k],
          message: `${name} already has a meaning in a gas; choose another index name`,
        });
      if (seen.has(name))
        ctx.addIssue({ code: 'custom', path: ['index', k], message: `${name} is listed twice` });
      seen.add(name);
    });
    for (const key of ['from', 'to'] as const) {
      if (s[key].length !== s.index.length)
        ctx.addIssue({
          code: 'custom',
          path: [key],
          message: `needs ${s.index.length} entries, one per index`,
        });
    }
    s.index.forEach((_, k) => {
      const a = sectorEnd(s.from[k]);
      const b = sectorEnd(s.to[k]);
      for (const [key, v] of [
        ['from', a],
        ['to', b],
      ] as const) {
        if (v !== null && Math.abs(v) > MAX_SECTOR_INDEX)
          ctx.addIssue({
            code: 'custom',
            path: [key, k],
            message: `must lie within -${MAX_SECTOR_INDEX}..${MAX_SECTOR_INDEX}`,
          });
      }
      if (a !== null && b !== null && a > b)
        ctx.addIssue({ code: 'custom', path: ['to', k], message: 'must not be below from' });
    });
  });

/** A validated `sectors` field. */
export type SectorsSpec = z.infer<typeof sectorsSchema>;

/** An end of a sector range as a number (null = unbounded; undefined counts as unbounded). */
export function sectorEnd(v: number | string | null | undefined): number | null {
  if (v === null || v === undefined) return null;
  return typeof v === 'number' ? v : Number(v.trim());
}
