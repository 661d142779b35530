import type { RunEstimateDto } from '@traceloom/shared/api';
import { classTableCost, type GasSpec, type RunEstimate } from '@traceloom/shared/engine';
import type { AppContext } from '../app-context.js';
import type { RunLimits } from '../config.js';
import { AppError } from '../http/app-error.js';

/** How long the estimate may take (a fresh worker loads the engine first); beyond it only the cost is given. */
const ESTIMATE_MS = 8000;

const mb = (n: number): string => `${Math.round(n).toLocaleString('en-US')} MB`;

/** Judges an estimate against the run limits: refuse when the class rows cannot fit in memory. */
export function judgeEstimate(estimate: RunEstimate, limits: RunLimits): RunEstimateDto {
  const warnings: string[] = [];
  if (estimate.orderAdvice) warnings.push(estimate.orderAdvice.message);
  let refusal: RunEstimateDto['refusal'] = null;
  // the rows share the worker's heap with the engine and the result's JSON text: keep headroom
  const room = limits.maxOldGenerationSizeMb * 0.6;
  if (estimate.classMemoryMb > room) {
    refusal = {
      field: 'classTable',
      message:
        `Class table: ${estimate.summary} That is more than a run can hold (${mb(room)} of its ` +
        `${mb(limits.maxOldGenerationSizeMb)}); lower the class table depth or the order.`,
    };
  } else if (estimate.classSeconds * 1000 > limits.wallClockMs / 2) {
    warnings.push(
      `${estimate.summary} A run stops after ${limits.wallClockMs / 1000} s; the class table may not finish (the canonical table is kept if it does not).`,
    );
  }
  return { estimate, warnings, refusal };
}

/**
 * Estimates a run of `spec` in a quick worker (the weights and the first rows, for the order
 * advice); when that takes too long, the class table's cost alone. Engine refusals answer 400.
 */
export async function estimateSpec(ctx: AppContext, spec: GasSpec): Promise<RunEstimateDto> {
  let estimate: RunEstimate;
  try {
    ({ estimate } = await ctx.services.tasks.runTask(
      'estimate',
      { spec },
      {
        timeoutMs: ESTIMATE_MS,
        onTimeout: () => new AppError(422, 'too_heavy', 'estimate timed out'),
      },
    ));
  } catch (e) {
    if (!(e instanceof AppError) || e.code !== 'too_heavy') throw e;
    const cost = classTableCost(spec);
    estimate = {
      ...cost,
      orderAdvice: null,
      summary: `A class table of ${spec.classTable} has ${cost.cycleTypes.toLocaleString('en-US')} cycle types (the order advice took too long to estimate).`,
    };
  }
  return judgeEstimate(estimate, ctx.config.runs);
}

/** Refuses a run whose estimate says it cannot fit (400 naming the class table). */
export function assertRunFits(judged: RunEstimateDto): void {
  if (judged.refusal) {
    throw new AppError(400, 'too_costly', judged.refusal.message, judged.refusal.field);
  }
}
