import type { GasSpec } from '@traceloom/shared/engine';
import Fraction from 'fraction.js';
import type { AppContext } from '../app-context.js';
import { specRefusal } from '../compute/refusal.js';
import { computeServices } from '../compute/services.js';
import type { WorkerRefusal } from '../runs/worker.js';

/** The probe's size: N up to 2, eight grid steps. */
const PROBE_N = 2;
const PROBE_STEPS = 8;
/** Longest the probe may take; a spec it cannot finish in time is accepted unjudged. */
const PROBE_MS = 1000;

/** Digits a numeric probe computes (the least the gas schema lets a numeric spec ask for). */
const PROBE_DIGITS = 8;

/** The same gas, cut down to a few N and grid steps (numeric: a few N at few digits). */
export function probeOf(spec: GasSpec): GasSpec {
  const probe: GasSpec = {
    ...spec,
    nMax: Math.min(spec.nMax, PROBE_N),
    classTable: Math.min(spec.classTable, PROBE_N),
  };
  if (spec.precision !== undefined) {
    probe.precision = Math.min(spec.precision, PROBE_DIGITS);
  } else {
    const cap = new Fraction(spec.step).mul(PROBE_STEPS);
    const order = spec.order ?? null;
    probe.order =
      order === null || new Fraction(order).compare(cap) <= 0 ? order : cap.toFraction();
  }
  if (spec.reference) {
    probe.reference = {
      ...spec.reference,
      rows: spec.reference.rows.filter((row) => row.N <= PROBE_N),
    };
  }
  return probe;
}

/**
 * Evaluates a cut-down copy of a spec in a worker before it is stored, so an unknown function,
 * a symbol out of place or a power beyond the engine's limits is refused at once (400 naming
 * the field) rather than when a run fails. A probe that runs out of time is no refusal (the
 * worker may have been starting); the run's own limits then apply.
 */
export async function assertSpecEvaluates(ctx: AppContext, spec: GasSpec): Promise<void> {
  const signal = AbortSignal.timeout(PROBE_MS);
  let output: { ok: true } | WorkerRefusal;
  try {
    output = (await computeServices(ctx).pools.quick.run(
      { kind: 'preview', spec: probeOf(spec) },
      { signal },
    )) as { ok: true } | WorkerRefusal;
  } catch (err) {
    // Out of time (possibly a worker still starting): no verdict; the run has its own limits.
    if (signal.aborted) return;
    throw err;
  }
  if (!output.ok) throw specRefusal(output);
}
