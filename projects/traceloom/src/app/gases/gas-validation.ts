import { gasSpecSchema, type GasSpecInput } from '@traceloom/shared/api';
import { WeightsKind, controlPathFor } from './gas-form';
import { numericPreviewSpec } from './gas-numeric';

/** Problems of a spec as the shared schema (the server's own) finds them, by form control. */
export interface SpecProblems {
  byControl: Map<string, string>;
  /** Problems that name no control of the form. */
  other: string[];
}

/**
 * Validates the spec with the shared `gasSpecSchema` and maps each issue to the control that
 * shows it (first issue per control wins).
 */
export function specProblems(spec: GasSpecInput, kind: WeightsKind): SpecProblems {
  const result = gasSpecSchema.safeParse(spec);
  const problems: SpecProblems = { byControl: new Map(), other: [] };
  if (result.success) return problems;
  for (const issue of result.error.issues) {
    const field = issue.path.map(String).join('.');
    const control = controlPathFor(field, kind);
    const message = issue.message;
    if (control === null) problems.other.push(field ? `${field} ${message}` : message);
    else if (!problems.byControl.has(control)) problems.byControl.set(control, message);
  }
  return problems;
}

/** Largest preview, kept inside the server's caps for /api/compute. */
const PREVIEW_N = 3;
const PREVIEW_STEPS = 200;

/**
 * The light spec behind the live preview: Z(1..3) and the first weights, no class table or
 * checks, and an order cut at 200 grid steps so the server's preview caps are never hit.
 */
export function previewSpec(spec: GasSpecInput): GasSpecInput {
  if (spec.precision !== undefined) return numericPreviewSpec(spec);
  const { grand: _grand, reference: _reference, ...rest } = spec;
  const step = parseRational(spec.step ?? '1');
  let order = spec.order ?? null;
  if (order !== null && step !== null) {
    const value = parseRational(order);
    if (value !== null && value / step > PREVIEW_STEPS)
      order = scaleText(spec.step ?? '1', PREVIEW_STEPS);
  }
  return { ...rest, order, nMax: Math.min(spec.nMax, PREVIEW_N), classTable: 0 };
}

function parseRational(t: string): number | null {
  const m = /^\s*(-?\d+)(?:\s*\/\s*(\d+))?\s*$/.exec(t);
  return m ? Number(m[1]) / Number(m[2] ?? '1') : null;
}

function scaleText(step: string, k: number): string {
  const [num, den = '1'] = step.replace(/\s/g, '').split('/');
  const n = BigInt(num) * BigInt(k);
  const d = BigInt(den);
  const gcd = (a: bigint, b: bigint): bigint => (b === 0n ? (a < 0n ? -a : a) : gcd(b, a % b));
  const g = gcd(n, d);
  return d / g === 1n ? `${n / g}` : `${n / g}/${d / g}`;
}
