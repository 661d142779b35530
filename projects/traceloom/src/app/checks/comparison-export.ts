import type { ExportTable } from '../exports/export-files';
import type { ComparisonDto } from './checks-api';

/** A comparison's rows for the CSV/LaTeX exports. */
export function comparisonExport(comparison: ComparisonDto): ExportTable {
  return {
    columns: ['N', 'agrees', 'agrees below', 'first mismatch at', 'computed', 'table'],
    rows: comparison.rows.map((r) => [
      String(r.N),
      r.agrees === null ? 'not compared' : r.agrees ? 'yes' : 'no',
      r.agrees === null ? '' : (r.agreesBelow ?? 'exact'),
      r.firstMismatch?.exponent ?? '',
      r.firstMismatch?.expected ?? '',
      r.firstMismatch?.found ?? '',
    ]),
  };
}
