import type { GasSpec } from '../engine/spec/schema.js';
import { FIELD_LABELS } from './vocabulary.js';

/** One line of a gas definition as people read it: a label and its value. */
export interface DefinitionLine {
  label: string;
  value: string;
}

/** An end of a range, or "−∞"/"∞" when open. */
const end = (v: string | null | undefined, open: string): string => v ?? open;

/**
 * A gas spec as labelled lines (statistics, variable, what the weights are, N_max, order, class
 * table depth, grand function, sectors, precision), for pages that show a stored spec to readers.
 */
export function gasDefinition(spec: GasSpec): DefinitionLine[] {
  const x = spec.variable;
  const w = spec.weights;
  const lines: DefinitionLine[] = [
    { label: 'Particles', value: spec.statistics === 'fermion' ? 'fermions' : 'bosons' },
    { label: 'Variable', value: x },
  ];
  if (w.kind === 'values') {
    lines.push({
      label: 'Cycle weights',
      value: w.values.map((v, i) => `Z_${i + 1} = ${v}`).join('; '),
    });
  } else if (w.kind === 'formula') {
    lines.push({ label: 'Cycle weights', value: `Z_L = ${w.expression}` });
  } else if (w.kind === 'spectrum') {
    const offset = w.offset && w.offset !== '0' ? `${w.offset} + ` : '';
    lines.push({
      label: 'Spectrum',
      value: `c_p = ${w.expression} over p = ${offset}n, n from ${end(w.from, '−∞')} to ${end(w.to, '∞')}`,
    });
  } else {
    lines.push({
      label: 'Kernel',
      value: `${w.expression} on ${end(w.from, '−∞')} to ${end(w.to, '∞')}${w.periodic ? ', periodic' : ''}`,
    });
  }
  if (spec.step && spec.step !== '1') lines.push({ label: 'Exponent step', value: spec.step });
  lines.push({ label: FIELD_LABELS.nMax, value: String(spec.nMax) });
  if (spec.precision !== undefined) {
    lines.push({ label: 'Precision', value: `${spec.precision} digits` });
  } else {
    lines.push({ label: 'Order', value: spec.order ? `O(${x}^${spec.order})` : 'exact' });
  }
  lines.push({
    label: 'Class-table depth',
    value: spec.classTable ? `N ≤ ${spec.classTable}` : 'no class table',
  });
  if (spec.grand) {
    lines.push({
      label: 'Grand function',
      value:
        spec.grand.kind === 'expression'
          ? spec.grand.expression
          : `coefficients ${spec.grand.values.join('; ')}`,
    });
  }
  if (spec.sectors) lines.push({ label: 'Sectors', value: 'summed over sectors' });
  return lines;
}
