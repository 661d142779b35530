import { MessageChannel } from 'node:worker_threads';
import type { GasSpec } from '@traceloom/shared/engine';
import Fraction from 'fraction.js';
import type { AppContext } from '../app-context.js';
import { AppError } from '../http/app-error.js';

/** The probe's size: N up to 2, eight grid steps. */
const PROBE_N = 2;
const PROBE_STEPS = 8;
/** Longest the probe may take; a spec it cannot judge in time is refused (503), never stored. */
export const PROBE_MS = 5000;
/** Longest a probe may wait for its worker to begin (a fresh worker first loads the engine). */
const PROBE_START_GRACE_MS = 60_000;

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
 * the field) rather than when a run fails. The probe has its own worker; when it cannot decide
 * in time the gas is refused with 503 `probe_undecided` (try again) rather than stored unjudged.
 */
export async function assertSpecEvaluates(ctx: AppContext, spec: GasSpec): Promise<void> {
  const controller = new AbortController();
  const channel = new MessageChannel();
  const stop = () =>
    controller.abort(
      new AppError(
        503,
        'probe_undecided',
        `spec: the check before saving could not finish within ${PROBE_MS / 1000} s (the server is busy); nothing was saved, try again.`,
        'spec',
        { 'Retry-After': '5' },
      ),
    );
  // The probe's own clock starts when its worker begins; until then only a start-up grace runs.
  let timer = setTimeout(stop, PROBE_START_GRACE_MS);
  channel.port1.once('message', () => {
    clearTimeout(timer);
    timer = setTimeout(stop, PROBE_MS);
  });
  try {
    await ctx.services.tasks.runTask(
      'probe',
      { spec: probeOf(spec), port: channel.port2 },
      { transferList: [channel.port2], signal: controller.signal },
    );
  } finally {
    clearTimeout(timer);
    channel.port1.close();
  }
}
