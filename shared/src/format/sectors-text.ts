import type { ComputeResult, SectorRowJson } from '../engine/result.js';
import { csvRow } from './tables.js';

/** Sectors listed one per line in the plain-text table before the rest is summarized. */
const SHOWN = 40;

/** The sector vector as "(n=1, m=-2)". */
function label(index: readonly string[], row: SectorRowJson): string {
  return `(${index.map((name, k) => `${name}=${row.index[k]}`).join(', ')})`;
}

/** Valuations of Z_n(1..nMax), "-" where no term lies below the order (numeric: log10 sizes). */
function valuations(row: SectorRowJson): string {
  if (row.valuations.length === 0)
    return row.magnitudes.map((m) => (m === null ? '-' : m.toFixed(1))).join(' ');
  return row.valuations.map((v) => v ?? '-').join(' ');
}

/**
 * Plain-text lines of the sector breakdown: how many sectors were summed and how the sum stopped,
 * the Z(0) convention, how many sectors made each row, and the sectors themselves (contributing
 * ones first, up to SHOWN).
 */
export function sectorTableLines(r: ComputeResult): string[] {
  const s = r.sectors;
  if (!s) return [];
  const out = [
    '',
    `sectors over ${s.index.join(', ')}: ${s.count} computed, ${s.contributing} contributed`,
  ];
  out.push(`  ${s.rule}`, `  ${s.convention}`);
  out.push(
    `  sectors per row: ${r.canonical
      .filter((c) => c.N > 0)
      .map((c) => `N=${c.N}: ${c.sectors ?? 0}`)
      .join(', ')}`,
  );
  const sorted = [...s.rows].sort((a, b) => Number(b.contributed) - Number(a.contributed));
  const what = r.numeric ? 'log10 |w(n) Z_n(N)|' : 'valuations of Z_n(N)';
  out.push(`  sector  contributed  ${what}, N = 1..${r.spec.nMax}`);
  for (const row of sorted.slice(0, SHOWN))
    out.push(`  ${label(s.index, row)}  ${row.contributed ? 'yes' : 'no '}  ${valuations(row)}`);
  if (sorted.length > SHOWN)
    out.push(`  ... ${sorted.length - SHOWN} more sectors (all of them in --format csv or json)`);
  return out;
}

/** CSV lines of the sector breakdown of a series result (after a blank line): one row per sector. */
export function sectorCsvLines(r: ComputeResult): string[] {
  const s = r.sectors;
  if (!s) return [];
  const head = [
    ...s.index,
    'contributed',
    ...s.rows[0]!.valuations.map((_, i) => `val Z_n(${i + 1})`),
  ];
  const out = ['', csvRow(head)];
  for (const row of s.rows)
    out.push(
      csvRow([
        ...row.index.map(String),
        String(row.contributed),
        ...row.valuations.map((v) => v ?? ''),
      ]),
    );
  return out;
}
