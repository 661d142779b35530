import type { SectorRowJson, SectorsJson } from '@traceloom/shared/engine';
import { valueText, type AnyValue, type ExportTable } from '@traceloom/shared/format';

/** One line of the Sectors tab. */
export interface SectorLine {
  /** Position in the enumeration (growing max |n_k|), from 1. */
  order: number;
  index: number[];
  /** `3`, or `(1, -2)` for several indices. */
  indexText: string;
  weight: string;
  /**
   * Per N = 1..nMax what the sector gives: the lowest exponent of Z_n(N) (series mode) or
   * `10^x` for log10 |w(n) Z_n(N)| = x (numeric mode); `—` when nothing is below the order.
   */
  cells: string[];
  /** The same as numbers for sorting, smaller = a larger contribution (null: none). */
  levels: (number | null)[];
  contributes: boolean[];
  contributed: boolean;
  /** The rows N the sector entered, in words (`1–8`, `2, 4`, `none`). */
  rowsText: string;
}

/** What the table can be sorted by: enumeration order, index, contribution, or the column of N. */
export type SectorSortKey = 'order' | 'index' | 'contributed' | `v${number}`;

/** `1–8` for a run of rows, else a list; `none` when empty. */
export function rowsText(contributes: readonly boolean[]): string {
  const rows = contributes.flatMap((c, i) => (c ? [i + 1] : []));
  if (rows.length === 0) return 'none';
  const first = rows[0]!;
  const last = rows[rows.length - 1]!;
  if (rows.length > 2 && last - first + 1 === rows.length) return `${first}–${last}`;
  return rows.join(', ');
}

/** The Sectors tab's lines from the result's block. */
export function sectorLines(block: SectorsJson, variable: string): SectorLine[] {
  return block.rows.map((r: SectorRowJson, i) => {
    const cells = perN(r);
    return {
      order: i + 1,
      index: r.index,
      indexText: r.index.length === 1 ? String(r.index[0]) : `(${r.index.join(', ')})`,
      weight: valueText(r.weight as AnyValue, variable),
      cells: cells.map((c) => c.text),
      levels: cells.map((c) => c.level),
      contributes: r.contributes,
      contributed: r.contributed,
      rowsText: rowsText(r.contributes),
    };
  });
}

/** An exact rational text as a number, for ordering only (`-9/2` -> -4.5). */
function rationalValue(t: string): number {
  const [a, b = '1'] = t.split('/');
  return Number(a) / Number(b);
}

/** The per-N cells of a sector, series or numeric. */
function perN(r: SectorRowJson): { text: string; level: number | null }[] {
  if (r.valuations.length > 0) {
    return r.valuations.map((v) =>
      v === null ? { text: '—', level: null } : { text: v, level: rationalValue(v) },
    );
  }
  return r.magnitudes.map((m) =>
    m === null ? { text: '—', level: null } : { text: `10^${m.toFixed(1)}`, level: -m },
  );
}

/** Comparator of two lines by `key`; undetermined valuations sort after every number. */
function compare(a: SectorLine, b: SectorLine, key: SectorSortKey): number {
  if (key === 'order') return a.order - b.order;
  if (key === 'contributed') return Number(b.contributed) - Number(a.contributed);
  if (key === 'index') {
    for (let k = 0; k < Math.max(a.index.length, b.index.length); k++) {
      const d = (a.index[k] ?? 0) - (b.index[k] ?? 0);
      if (d !== 0) return d;
    }
    return 0;
  }
  const N = Number(key.slice(1));
  return (a.levels[N - 1] ?? 0) - (b.levels[N - 1] ?? 0);
}

/**
 * The lines sorted by `key` (ties keep the enumeration order); `desc` reverses the order of the
 * known values, undetermined valuations staying last either way.
 */
export function sortSectorLines(
  lines: readonly SectorLine[],
  key: SectorSortKey,
  desc: boolean,
): SectorLine[] {
  const undetermined = (l: SectorLine) =>
    key.startsWith('v') && (l.levels[Number(key.slice(1)) - 1] ?? null) === null;
  return [...lines].sort((a, b) => {
    const ua = undetermined(a);
    const ub = undetermined(b);
    if (ua !== ub) return ua ? 1 : -1;
    const c = compare(a, b, key);
    return (desc ? -c : c) || a.order - b.order;
  });
}

/** The breakdown for the CSV/JSON exports: one line per sector, one column per N. */
export function sectorExport(block: SectorsJson, lines: readonly SectorLine[]): ExportTable {
  const nMax = lines[0]?.cells.length ?? 0;
  const Ns = Array.from({ length: nMax }, (_, i) => i + 1);
  const what = block.rows[0]?.valuations.length ? 'lowest exponent' : 'size';
  return {
    columns: [...block.index, 'weight', ...Ns.map((N) => `${what} N=${N}`), 'contributed'],
    rows: lines.map((l) => [
      ...l.index.map(String),
      l.weight,
      ...Ns.map((N) => (l.levels[N - 1] === null ? 'none below the order' : l.cells[N - 1]!)),
      l.contributed ? `yes (rows ${l.rowsText})` : 'no',
    ]),
  };
}
