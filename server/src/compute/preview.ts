import { fieldLabel } from '@traceloom/shared/format';
import type { ComputeResult, GasSpec } from '@traceloom/shared/engine';
import Fraction from 'fraction.js';
import type { AppContext } from '../app-context.js';
import { AppError } from '../http/app-error.js';

/** The preview's caps, tighter than a run's. */
export const PREVIEW_LIMITS = { nMax: 12, orderSteps: 200, classTable: 8 } as const;

/** The preview's caps for a numeric gas: few digits and few N, so it answers at once. */
export const NUMERIC_PREVIEW_LIMITS = { precision: 20, nMax: 6, classTable: 3 } as const;

function tooBig(field: string, message: string): never {
  throw new AppError(400, 'invalid_spec', `${fieldLabel(field)}: ${message}.`, field);
}

/** Refuses a numeric spec beyond the numeric preview's caps (digits, N, class table). */
function assertNumericPreviewSize(spec: GasSpec): void {
  const caps = NUMERIC_PREVIEW_LIMITS;
  const start = 'start a run for more';
  if (spec.precision! > caps.precision) {
    tooBig(
      'spec.precision',
      `is ${spec.precision}; the preview allows at most ${caps.precision} digits (${start})`,
    );
  }
  if (spec.nMax > caps.nMax) {
    tooBig(
      'spec.nMax',
      `is ${spec.nMax}; the numeric preview allows at most ${caps.nMax} (${start})`,
    );
  }
  if (spec.classTable > caps.classTable) {
    tooBig(
      'spec.classTable',
      `is ${spec.classTable}; the numeric preview allows at most ${caps.classTable}`,
    );
  }
}

/** Refuses specs beyond the preview's caps with 400 naming the field and its limit. */
export function assertPreviewSize(spec: GasSpec): void {
  if (spec.precision !== undefined) return assertNumericPreviewSize(spec);
  if (spec.nMax > PREVIEW_LIMITS.nMax) {
    tooBig(
      'spec.nMax',
      `is ${spec.nMax}; the preview allows at most ${PREVIEW_LIMITS.nMax} (start a run for more)`,
    );
  }
  if (spec.classTable > PREVIEW_LIMITS.classTable) {
    tooBig(
      'spec.classTable',
      `is ${spec.classTable}; the preview allows at most ${PREVIEW_LIMITS.classTable}`,
    );
  }
  if (spec.order != null) {
    const steps = new Fraction(spec.order).div(new Fraction(spec.step));
    if (steps.compare(PREVIEW_LIMITS.orderSteps) > 0) {
      tooBig(
        'spec.order',
        `is ${steps.toFraction()} steps of ${spec.step}; the preview allows at most ${PREVIEW_LIMITS.orderSteps} steps`,
      );
    }
  }
}

/**
 * `POST /compute`: a small synchronous computation for the live preview, in a worker with a
 * wall-clock limit (422 `too_heavy` beyond it). Engine refusals answer 400 naming the field.
 */
export async function previewCompute(ctx: AppContext, spec: GasSpec): Promise<ComputeResult> {
  assertPreviewSize(spec);
  const limitMs = ctx.config.runs.previewMs;
  const { result } = await ctx.services.tasks.runTask(
    'preview',
    { spec },
    {
      timeoutMs: limitMs,
      onTimeout: () =>
        new AppError(
          422,
          'too_heavy',
          `spec: this takes longer than the preview's ${limitMs / 1000} s; start a run instead.`,
          'spec',
        ),
    },
  );
  return result;
}
