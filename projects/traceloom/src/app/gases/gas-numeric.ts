import type { GasSpecInput } from '@traceloom/shared/engine';
import { splitLines, type GasFormValue } from './gas-form';

/** The line-kernel example of the numeric mode, in the expression language (hint text). */
export const LINE_KERNEL_EXAMPLE =
  '1/(2*pi) * (2*cosh(x/2))^(-1/2) * (2*cosh((x-y)/2))^(-1) * (2*cosh(y/2))^(-1/2)';

/** Precision the preview asks for (significant digits), whatever the gas wants. */
export const PREVIEW_PRECISION = 10;

const orNull = (s: string): string | null => (s.trim() === '' ? null : s.trim());

/** The kernel weight source the form describes; an empty end is an infinite one (null). */
export function kernelWeights(
  v: GasFormValue,
): Extract<GasSpecInput['weights'], { kind: 'kernel' }> {
  return {
    kind: 'kernel',
    expression: v.kernel.expression.trim(),
    from: orNull(v.kernel.from),
    to: orNull(v.kernel.to),
    periodic: v.kernel.periodic,
  };
}

/**
 * The numeric-mode fields of the spec (`precision`, `at`, `recognize`) from the form; step and
 * order do not apply then and are left out. `at` is sent for formula and spectrum gases only.
 */
export function numericSpecPart(v: GasFormValue): Partial<GasSpecInput> {
  const part: Partial<GasSpecInput> = { precision: v.precision as number };
  if (v.weightsKind === 'formula' || v.weightsKind === 'spectrum') {
    part.at = { [v.variable.trim() || 'q']: v.at.trim() };
  }
  const basis = splitLines(v.recognizeBasis);
  if (basis.length > 0) {
    part.recognize =
      v.recognizeMaxHeight === null ? { basis } : { basis, maxHeight: v.recognizeMaxHeight };
  }
  return part;
}

/** The numeric and kernel controls' values for a spec (the inverse of the two above). */
export function numericFormPart(spec: GasSpecInput) {
  const w = spec.weights;
  const variable = spec.variable ?? 'q';
  const at = spec.at ? (spec.at[variable] ?? Object.values(spec.at)[0] ?? '') : '1/10';
  return {
    kernel: {
      expression: w.kind === 'kernel' ? w.expression : '',
      from: w.kind === 'kernel' ? (w.from ?? '') : '',
      to: w.kind === 'kernel' ? (w.to ?? '') : '',
      periodic: w.kind === 'kernel' ? (w.periodic ?? false) : false,
    },
    numeric: spec.precision !== undefined,
    precision: spec.precision ?? 30,
    at,
    recognizeBasis: spec.recognize ? spec.recognize.basis.join('\n') : '',
    recognizeMaxHeight: spec.recognize?.maxHeight ?? null,
  };
}

/**
 * The preview's light copy of a numeric spec: 10 digits, Z(1..3), no class table, no recognition
 * (10 digits cannot certify a closed form) and no checks.
 */
export function numericPreviewSpec(spec: GasSpecInput): GasSpecInput {
  const { grand: _g, reference: _r, recognize: _rec, largeN: _l, ...rest } = spec;
  return { ...rest, precision: PREVIEW_PRECISION, nMax: Math.min(spec.nMax, 3), classTable: 0 };
}
