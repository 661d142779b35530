import {
  isNumericVerdict,
  numericVerdictText,
  readMismatch,
  tableLatex,
  toCsv,
  type ExportTable,
} from '@traceloom/shared/format';
import type { ComparisonDto } from './checks-api';

/** A comparison's rows for the CSV/LaTeX exports: both sides of the first mismatch. */
export function comparisonExport(comparison: ComparisonDto): ExportTable {
  return {
    columns: ['N', 'verdict', 'agrees below', 'first mismatch at', 'computed', 'supplied'],
    rows: comparison.rows.map((r) => {
      if (isNumericVerdict(r)) return [String(r.N), numericVerdictText(r), '', '', '', ''];
      const m = readMismatch(r.firstMismatch);
      return [
        String(r.N),
        r.agrees === null ? 'not compared' : r.agrees ? 'agrees' : 'differs',
        r.agrees === null ? '' : (r.agreesBelow ?? 'exact'),
        m?.exponent ?? '',
        m?.computed ?? '',
        m?.supplied ?? '',
      ];
    }),
  };
}

/** The comparison as CSV (called on click). */
export function comparisonCsv(comparison: ComparisonDto): () => string {
  return () => toCsv(comparisonExport(comparison));
}

/** The comparison as LaTeX in the export layout (called on click). */
export function comparisonTex(comparison: ComparisonDto, title: string): () => string {
  return () => tableLatex(comparisonExport(comparison), [], `comparison ${title}`);
}
