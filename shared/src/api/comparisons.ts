import { z } from 'zod';
import type { RowVerdict, WeightVerdict } from '../engine/checks/grand.js';
import type { ComputeResult } from '../engine/result.js';
import type { ValueJson } from '../engine/series/format.js';

type AnyRowVerdict = NonNullable<ComputeResult['grandCheck']>[number];
type AnyWeightVerdict = NonNullable<ComputeResult['impliedWeights']>[number];

/** A numeric verdict: compared within `tolerance`, the combined error of both sides. */
export type NumericVerdict = Extract<AnyRowVerdict | AnyWeightVerdict, { tolerance: string }>;

/** Body of `POST /api/runs/:id/comparisons`: a reference table of the study, or the grand check. */
export const comparisonBodySchema = z.union(
  [
    z.strictObject({ referenceId: z.uuid({ error: 'must be an identifier (UUID)' }) }),
    z.strictObject({ grand: z.literal(true, { error: 'must be true' }) }),
  ],
  { error: 'send {referenceId} or {grand: true}' },
);

/** A comparison request as parsed. */
export type ComparisonRequest = z.infer<typeof comparisonBodySchema>;

/**
 * A series row verdict as the API gives it ("not compared" when Z(N) is not determined). A row
 * that differs carries both sides whole, so every differing coefficient can be shown:
 * normalization(N) * Z(N) as computed, and the table's value as supplied.
 */
export type SeriesRowVerdictDto = RowVerdict & {
  series?: { computed: ValueJson; supplied: ValueJson };
};

/** A numeric row verdict: computed and supplied values compared within the combined tolerance. */
export type NumericRowVerdictDto = NumericVerdict & { N: number };

/** A row verdict as the API gives it (series, or numeric with its tolerance). */
export type RowVerdictDto = SeriesRowVerdictDto | NumericRowVerdictDto;

/** A stored comparison of a run with a reference table or with its grand function. */
export interface ComparisonDto {
  id: string;
  runId: string;
  referenceId: string | null;
  kind: 'reference' | 'grand';
  /** The normalization the rows were compared under (`1` for the grand check). */
  normalization: string;
  rows: RowVerdictDto[];
  summary: { agreeing: number; total: number };
  /**
   * A series reference comparison: the Z_L the table's rows imply (Newton identities) beside the
   * run's entered ones, "not compared" where the rows do not determine them; null for grand and
   * numeric comparisons and for those stored before.
   */
  impliedWeights: WeightVerdict[] | null;
  createdAt: string;
}
