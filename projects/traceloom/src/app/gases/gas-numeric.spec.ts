import type { GasSpecInput } from '@traceloom/shared/engine';
import { controlPathFor, fillGasForm, gasForm, specFromForm } from './gas-form';
import { LINE_KERNEL_EXAMPLE } from './gas-numeric';
import { previewSpec, specProblems } from './gas-validation';

// The line kernel of the numeric-mode contract (PRODUCT.md, "Numbers"), on the whole line.
const LINE_KERNEL: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'line kernel',
  statistics: 'fermion',
  variable: 'q',
  precision: 30,
  nMax: 6,
  classTable: 0,
  weights: {
    kind: 'kernel',
    expression: LINE_KERNEL_EXAMPLE,
    from: null,
    to: null,
    periodic: false,
  },
  recognize: { basis: ['1', '1/pi', '1/pi^2'], maxHeight: 1000000 },
};

// A formula gas evaluated at q = 1/10 (harmonic trap, Z_L = q^(L/2)/(1-q^L)).
const TRAP_AT: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'trap at q = 1/10',
  statistics: 'boson',
  variable: 'q',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  classTable: 2,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
};

// A periodic kernel on the circle [0, 2 pi).
const CIRCLE: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'circle',
  statistics: 'fermion',
  variable: 'q',
  precision: 12,
  nMax: 3,
  classTable: 0,
  weights: {
    kind: 'kernel',
    expression: 'exp(cos(x-y))/(2*pi)',
    from: '0',
    to: '2*pi',
    periodic: true,
  },
};

describe('numeric and kernel fields of the gas form', () => {
  it('round-trips numeric specs through the form (spec -> form -> spec)', () => {
    for (const spec of [LINE_KERNEL, TRAP_AT, CIRCLE]) {
      const form = gasForm();
      fillGasForm(form, spec);
      expect(specFromForm(form.getRawValue())).toEqual(spec);
      expect(specProblems(spec, form.getRawValue().weightsKind).byControl.size).toBe(0);
    }
  });

  it('leaves step and order out in numeric mode and keeps them in series mode', () => {
    const form = gasForm();
    fillGasForm(form, TRAP_AT);
    const numeric = specFromForm(form.getRawValue());
    expect(numeric).not.toHaveProperty('step');
    expect(numeric).not.toHaveProperty('order');
    form.controls.numeric.setValue(false);
    form.controls.order.setValue('20');
    const series = specFromForm(form.getRawValue());
    expect(series).toMatchObject({ step: '1', order: '20' });
    expect(series).not.toHaveProperty('precision');
    expect(series).not.toHaveProperty('at');
  });

  it('maps schema findings of the numeric fields to their controls', () => {
    const table: [string, 'kernel' | 'formula', string][] = [
      ['precision', 'kernel', 'precision'],
      ['at', 'formula', 'at'],
      ['at.q', 'formula', 'at'],
      ['recognize.basis.1', 'kernel', 'recognizeBasis'],
      ['recognize.maxHeight', 'kernel', 'recognizeMaxHeight'],
      ['weights.expression', 'kernel', 'kernel.expression'],
      ['body.spec.weights.to', 'kernel', 'kernel.to'],
      ['weights.from', 'kernel', 'kernel.from'],
    ];
    for (const [field, kind, control] of table) expect(controlPathFor(field, kind)).toBe(control);
    // A periodic kernel without its ends: the shared schema names the end, the form the field.
    const open = { ...CIRCLE, weights: { ...CIRCLE.weights, from: null } } as GasSpecInput;
    expect(specProblems(open, 'kernel').byControl.get('kernel.from')).toContain('both ends');
    expect(
      specProblems({ ...LINE_KERNEL, precision: 7 }, 'kernel').byControl.get('precision'),
    ).toBe('must be at least 8 digits');
  });

  it('previews a numeric gas at 10 digits and N <= 3, without recognition or checks', () => {
    const preview = previewSpec(LINE_KERNEL);
    expect(preview).toMatchObject({ precision: 10, nMax: 3, classTable: 0 });
    expect(preview).not.toHaveProperty('recognize');
    expect(previewSpec(TRAP_AT)).toMatchObject({ precision: 10, at: { q: '1/10' }, nMax: 3 });
  });
});
