import type { ProductFormDto, ProductTarget } from '@traceloom/shared/api';
import type { GrandProductJson, SeriesProductJson, ValueJson } from '@traceloom/shared/engine';
import type { AppContext } from '../app-context.js';
import { isNumericResult } from '../compute/numeric-values.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { loadResult, loadVisibleRun } from '../runs/run-service.js';
import type { ProductTask } from './product-task.js';

/** Wall-clock limit of one product form in the worker. */
const PRODUCT_LIMIT_MS = 10_000;

/**
 * The product form of one canonical row, one cycle weight or the grand function of a finished
 * series run, computed on request in the quick worker pool. 400 naming `N`/`L` for a row or
 * weight the run does not hold, 409 for a run that is not done, 400 for a numeric run, 400
 * naming the target when the series has no product form (zero, not determined).
 */
export async function productFormOf(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  q: ProductTarget,
): Promise<ProductFormDto> {
  const run = await loadVisibleRun(ctx, actor, runId);
  const result = await loadResult(ctx, run);
  if (run.status !== 'done' || !result) {
    throw new AppError(409, 'run_not_done', `The run is ${run.status}; ask a finished run.`);
  }
  if (isNumericResult(result)) {
    throw new AppError(
      400,
      'invalid_input',
      'of: product forms are for q-series tables; this run is numeric.',
      'of',
    );
  }
  let task: ProductTask;
  let field: string;
  if (q.of === 'row') {
    field = 'N';
    const row = result.canonical.find((r) => r.N === q.N);
    if (!row) throw outOfRange('N', q.N, result.canonical.length - 1);
    task = { target: 'row', label: `Z(${q.N})`, value: row.value as ValueJson };
  } else if (q.of === 'weight') {
    field = 'L';
    const w = result.weights.find((r) => r.L === q.L);
    if (!w || q.L < 1) throw outOfRange('L', q.L, result.weights.length);
    task = { target: 'weight', label: `Z_${q.L}`, value: w.value as ValueJson };
  } else {
    field = 'of';
    task = {
      target: 'grand',
      canonical: result.canonical.map((r) => r.value as ValueJson),
      order: result.spec.order ?? null,
    };
  }
  const output = await ctx.services.tasks.runTask('productForm', task, {
    timeoutMs: PRODUCT_LIMIT_MS,
    onTimeout: () =>
      new AppError(422, 'too_heavy', `${field}: the product form took too long.`, field),
    refused: (r) => new AppError(400, 'invalid_input', `${field}: ${r.message}.`, field),
  });
  const base = { runId };
  if (q.of === 'row')
    return { ...base, target: 'row', N: q.N, ...(output.product as SeriesProductJson) };
  if (q.of === 'weight') {
    return { ...base, target: 'weight', L: q.L, ...(output.product as SeriesProductJson) };
  }
  return { ...base, target: 'grand', ...(output.product as GrandProductJson) };
}

function outOfRange(field: 'N' | 'L', value: number, max: number): AppError {
  const from = field === 'N' ? 0 : 1;
  return new AppError(
    400,
    'invalid_input',
    `${field}: ${value} is not in this run (it holds ${field} = ${from}..${max}).`,
    field,
  );
}
