import { z } from 'zod';
import type { GrandProductJson, SeriesProductJson } from '../engine/largen/types.js';

const whole = (what: string) =>
  z
    .string({ error: `must be a whole number ${what}` })
    .regex(/^\d{1,4}$/, { error: `must be a whole number ${what}` })
    .transform(Number);

/** The query of `GET /api/runs/:id/product-form`: `of=row&N=3`, `of=weight&L=2` or `of=grand`. */
export const productQuerySchema = z.discriminatedUnion(
  'of',
  [
    z.object({ of: z.literal('row'), N: whole('N') }),
    z.object({ of: z.literal('weight'), L: whole('L') }),
    z.object({ of: z.literal('grand') }),
  ],
  { error: 'must be row, weight or grand' },
);

/** What to write as a product: a canonical row, a cycle weight or the grand function. */
export type ProductTarget = z.output<typeof productQuerySchema>;

/** The answer of `GET /api/runs/:id/product-form`, with the run it was read from. */
export type ProductFormDto = { runId: string } & (
  | ({ target: 'row'; N: number } & SeriesProductJson)
  | ({ target: 'weight'; L: number } & SeriesProductJson)
  | ({ target: 'grand' } & GrandProductJson)
);
