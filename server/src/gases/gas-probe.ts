import type { GasSpec } from '@traceloom/shared/engine';
import Fraction from 'fraction.js';
import type { AppContext } from '../app-context.js';
import { runWithin, specRefusal } from '../compute/refusal.js';
import { AppError } from '../http/app-error.js';
import { computeServices } from '../compute/services.js';
import type { WorkerRefusal } from '../runs/worker.js';

/** The probe's size: N up to 2, eight grid steps. */
const PROBE_N = 2;
const PROBE_STEPS = 8;
/** Longest the probe may take: a spec whose cut-down copy needs longer is refused as too heavy. */
const PROBE_MS = 1000;

/** The same gas, cut down to a few N and grid steps. */
export function probeOf(spec: GasSpec): GasSpec {
  const step = new Fraction(spec.step);
  const cap = step.mul(PROBE_STEPS);
  const order = spec.order === null || new Fraction(spec.order).compare(cap) <= 0 ? spec.order : cap.toFraction();
  const probe: GasSpec = {
    ...spec,
    nMax: Math.min(spec.nMax, PROBE_N),
    classTable: Math.min(spec.classTable, PROBE_N),
    order,
  };
  if (spec.reference) {
    probe.reference = { ...spec.reference, rows: spec.reference.rows.filter((row) => row.N <= PROBE_N) };
  }
  return probe;
}

/**
 * Evaluates a cut-down copy of a spec in a worker before it is stored, so an unknown function,
 * a symbol out of place or a power beyond the engine's limits is refused at once (400 naming
 * the field) rather than when a run fails. When even the cut-down copy takes longer than 1 s the
 * spec is refused with 422 `too_heavy` (the full run could not finish either).
 */
export async function assertSpecEvaluates(ctx: AppContext, spec: GasSpec): Promise<void> {
  const output = (await runWithin(
    computeServices(ctx).pools.quick,
    { kind: 'preview', spec: probeOf(spec) },
    PROBE_MS,
    () =>
      new AppError(
        422,
        'too_heavy',
        `spec: even a cut-down copy (N up to ${PROBE_N}, ${PROBE_STEPS} grid steps) takes longer than ${PROBE_MS / 1000} s to compute.`,
        'spec',
      ),
  )) as { ok: true } | WorkerRefusal;
  if (!output.ok) throw specRefusal(output);
}
