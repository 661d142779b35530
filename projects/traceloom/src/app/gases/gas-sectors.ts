import { FormArray, FormControl, FormGroup } from '@angular/forms';
import type { GasSpecInput } from '@traceloom/shared/engine';

/** Most sector indices a gas may have (the engine's limit, d <= 3). */
export const MAX_SECTOR_INDICES = 3;

const text = (value = '') => new FormControl(value, { nonNullable: true });

/** One sector index: its name and its range (an empty end is unbounded). */
export function sectorIndexGroup(name = 'n', from = '', to = '') {
  return new FormGroup({ name: text(name), from: text(from), to: text(to) });
}

/** The Sectors section's controls: on/off, the indices with their ranges, the weight w(n). */
export function sectorsFormGroup() {
  return new FormGroup({
    enabled: new FormControl(false, { nonNullable: true }),
    indices: new FormArray([sectorIndexGroup()]),
    weight: text('1'),
  });
}

/** The Sectors section's form group. */
export type SectorsForm = ReturnType<typeof sectorsFormGroup>;

type SectorsValue = ReturnType<SectorsForm['getRawValue']>;

/** `"3"` -> 3, `""` -> null (unbounded); anything else is sent as typed for the schema to name. */
function end(s: string): number | string | null {
  const t = s.trim();
  if (t === '') return null;
  return /^-?\d+$/.test(t) ? Number(t) : t;
}

/** The spec's `sectors` field from the section (nothing when the section is off). */
export function sectorsSpecPart(v: SectorsValue): Pick<GasSpecInput, 'sectors'> {
  if (!v.enabled) return {};
  return {
    sectors: {
      index: v.indices.map((i) => i.name.trim()),
      from: v.indices.map((i) => end(i.from)) as (number | null)[],
      to: v.indices.map((i) => end(i.to)) as (number | null)[],
      weight: v.weight.trim() || '1',
    },
  };
}

/** Puts a spec's `sectors` field into the section (rebuilding the index rows). */
export function fillSectorsForm(form: SectorsForm, spec: GasSpecInput): void {
  const s = spec.sectors;
  const show = (x: number | string | null | undefined) =>
    x === null || x === undefined ? '' : String(x);
  const indices = (s?.index.length ? s.index : ['n']).map((name, k) => ({
    name,
    from: show(s?.from[k]),
    to: show(s?.to[k]),
  }));
  const rows = form.controls.indices;
  rows.clear({ emitEvent: false });
  for (const i of indices) rows.push(sectorIndexGroup(i.name, i.from, i.to), { emitEvent: false });
  form.reset({ enabled: s !== undefined, indices, weight: s?.weight ?? '1' });
}

/**
 * The control that shows a problem with a `sectors...` spec path: `sectors.index.1` ->
 * `sectors.indices.1.name`, `sectors.from.0` -> `sectors.indices.0.from`; problems of the whole
 * sum (it does not converge, too many sectors) go under the weight.
 */
export function sectorsControlPath(rest: readonly string[]): string {
  const [key, k] = rest;
  const row = k !== undefined && /^\d+$/.test(k) ? k : '0';
  if (key === 'index') return `sectors.indices.${row}.name`;
  if (key === 'from' || key === 'to') return `sectors.indices.${row}.${key}`;
  return 'sectors.weight';
}
