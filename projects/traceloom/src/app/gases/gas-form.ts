import { AbstractControl, FormArray, FormControl, FormGroup, Validators } from '@angular/forms';
import type { GasSpecInput } from '@traceloom/shared/engine';
import { numericFormPart, numericSpecPart, kernelWeights } from './gas-numeric';
import {
  fillSectorsForm,
  sectorsControlPath,
  sectorsFormGroup,
  sectorsSpecPart,
} from './gas-sectors';

/** The weight sources a gas may use (a kernel only in numeric mode). */
export type WeightsKind = 'values' | 'formula' | 'spectrum' | 'kernel';
/** Whether a grand function is supplied, and how. */
export type GrandKind = 'none' | 'coefficients' | 'expression';

const text = (value = '', required = false) =>
  new FormControl(value, { nonNullable: true, validators: required ? [Validators.required] : [] });

/** The gas editor's controls, one per spec field (weights and grand split by kind). */
export function gasForm() {
  return new FormGroup({
    title: text('', true),
    statistics: new FormControl<'fermion' | 'boson'>('fermion', { nonNullable: true }),
    variable: text('q', true),
    step: text('1', true),
    order: text('20'),
    nMax: new FormControl<number | null>(6, { validators: [Validators.required] }),
    classTable: new FormControl<number | null>(4),
    weightsKind: new FormControl<WeightsKind>('formula', { nonNullable: true }),
    values: new FormArray<FormControl<string>>([text('')]),
    formula: text(''),
    spectrum: new FormGroup({
      expression: text(''),
      offset: text('0'),
      from: text(''),
      to: text(''),
    }),
    kernel: new FormGroup({
      expression: text(''),
      from: text(''),
      to: text(''),
      periodic: new FormControl(false, { nonNullable: true }),
    }),
    numeric: new FormControl(false, { nonNullable: true }),
    precision: new FormControl<number | null>(30),
    at: text('1/10'),
    recognizeBasis: text(''),
    recognizeMaxHeight: new FormControl<number | null>(null),
    grandKind: new FormControl<GrandKind>('none', { nonNullable: true }),
    grandValues: text(''),
    grandExpression: text(''),
    sectors: sectorsFormGroup(),
  });
}

/** The editor's form group. */
export type GasForm = ReturnType<typeof gasForm>;
/** The editor's raw value. */
export type GasFormValue = ReturnType<GasForm['getRawValue']>;

const orNull = (s: string): string | null => (s.trim() === '' ? null : s.trim());

/** Splits the grand coefficients box (one per line, or separated by semicolons). */
export function splitLines(textValue: string): string[] {
  return textValue
    .split(/[\n;]/)
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
}

/** The `traceloom.gas/1` spec the form describes (not yet validated). */
export function specFromForm(v: GasFormValue): GasSpecInput {
  const weights =
    v.weightsKind === 'kernel'
      ? kernelWeights(v)
      : v.weightsKind === 'values'
        ? { kind: 'values' as const, values: v.values.map((s) => s.trim()) }
        : v.weightsKind === 'formula'
          ? { kind: 'formula' as const, expression: v.formula.trim() }
          : {
              kind: 'spectrum' as const,
              expression: v.spectrum.expression.trim(),
              offset: v.spectrum.offset.trim() || '0',
              from: orNull(v.spectrum.from),
              to: orNull(v.spectrum.to),
            };
  const spec: GasSpecInput = {
    format: 'traceloom.gas/1',
    title: v.title.trim(),
    statistics: v.statistics,
    variable: v.variable.trim(),
    ...(v.numeric ? numericSpecPart(v) : { step: v.step.trim(), order: orNull(v.order) }),
    nMax: v.nMax as number,
    classTable: v.classTable ?? 0,
    weights,
    ...sectorsSpecPart(v.sectors),
  };
  if (v.grandKind === 'coefficients') {
    spec.grand = { kind: 'coefficients', values: splitLines(v.grandValues) };
  } else if (v.grandKind === 'expression') {
    spec.grand = { kind: 'expression', expression: v.grandExpression.trim() };
  }
  return spec;
}

/** Puts a spec into the form (rebuilding the values rows); the reference part is kept aside. */
export function fillGasForm(form: GasForm, spec: GasSpecInput): void {
  const w = spec.weights;
  const values = w.kind === 'values' ? w.values : [''];
  const rows = form.controls.values;
  rows.clear({ emitEvent: false });
  for (const value of values) rows.push(text(value), { emitEvent: false });
  const grand = spec.grand;
  form.reset({
    title: spec.title ?? '',
    statistics: spec.statistics,
    variable: spec.variable ?? 'q',
    step: spec.step ?? '1',
    order: spec.order ?? '',
    nMax: spec.nMax,
    classTable: spec.classTable ?? 0,
    weightsKind: w.kind,
    values,
    formula: w.kind === 'formula' ? w.expression : '',
    spectrum: {
      expression: w.kind === 'spectrum' ? w.expression : '',
      offset: w.kind === 'spectrum' ? (w.offset ?? '0') : '0',
      from: w.kind === 'spectrum' ? (w.from ?? '') : '',
      to: w.kind === 'spectrum' ? (w.to ?? '') : '',
    },
    ...numericFormPart(spec),
    grandKind: grand ? grand.kind : 'none',
    grandValues: grand?.kind === 'coefficients' ? grand.values.join('\n') : '',
    grandExpression: grand?.kind === 'expression' ? grand.expression : '',
  });
  fillSectorsForm(form.controls.sectors, spec);
}

/**
 * The form control that shows a problem with a spec field. Spec paths come from the shared schema
 * (`weights.values.2`) or from the server's `error.field` (`body.spec.weights.expression`).
 */
export function controlPathFor(field: string, kind: WeightsKind): string | null {
  const path = field.replace(/^(body\.)?(spec\.)?/, '');
  const [head, second, third] = path.split('.');
  if (head === 'weights' && kind === 'kernel') {
    const part = ['expression', 'from', 'to', 'periodic'].includes(second ?? '') ? second : null;
    return `kernel.${part ?? 'expression'}`;
  }
  if (head === 'precision') return 'precision';
  if (head === 'at') return 'at';
  if (head === 'recognize') return second === 'maxHeight' ? 'recognizeMaxHeight' : 'recognizeBasis';
  if (head === 'weights') {
    if (second === 'values') return third !== undefined ? `values.${third}` : 'values.0';
    if (second === 'expression') return kind === 'spectrum' ? 'spectrum.expression' : 'formula';
    if (second === 'offset' || second === 'from' || second === 'to') return `spectrum.${second}`;
    return kind === 'values' ? 'values.0' : kind === 'formula' ? 'formula' : 'spectrum.expression';
  }
  if (head === 'grand') return second === 'expression' ? 'grandExpression' : 'grandValues';
  if (head === 'sectors') return sectorsControlPath(path.split('.').slice(1));
  const direct = ['title', 'statistics', 'variable', 'step', 'order', 'nMax', 'classTable'];
  return head && direct.includes(head) ? head : null;
}

/** Sentence case with a full stop, naming the field: `Order must be a multiple of step.` */
export function fieldMessage(message: string): string {
  const t = message.trim();
  const s = t.charAt(0).toUpperCase() + t.slice(1);
  return /[.!?]$/.test(s) ? s : `${s}.`;
}

/**
 * Sets (or clears) the error `key` on every control: `messages` maps a control path to its
 * message. Other error keys (required, server) are left alone. `touch` shows the messages at
 * once (server answers); schema findings wait until the field is left or the form submitted.
 */
export function applyFieldErrors(
  form: GasForm,
  key: string,
  messages: ReadonlyMap<string, string>,
  touch = false,
): void {
  for (const control of allControls(form)) {
    const path = pathOf(form, control);
    const message = path === null ? undefined : messages.get(path);
    const current = { ...(control.errors ?? {}) };
    const had = key in current;
    if (message === undefined && !had) continue;
    if (message === undefined) delete current[key];
    else current[key] = message;
    control.setErrors(Object.keys(current).length ? current : null);
    if (message !== undefined && touch) control.markAsTouched();
  }
}

function allControls(root: AbstractControl): AbstractControl[] {
  if (root instanceof FormGroup || root instanceof FormArray) {
    return Object.values(root.controls).flatMap((c: AbstractControl) => allControls(c));
  }
  return [root];
}

function pathOf(form: GasForm, control: AbstractControl): string | null {
  const parts: string[] = [];
  let at: AbstractControl | null = control;
  while (at && at !== form) {
    const parent: FormGroup | FormArray | null = at.parent;
    if (!parent) return null;
    const key = Object.entries(parent.controls).find(([, c]) => c === at)?.[0];
    if (key === undefined) return null;
    parts.unshift(key);
    at = parent;
  }
  return parts.join('.');
}
