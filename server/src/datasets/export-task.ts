import { isNumericResult, renderMatrix } from '@traceloom/shared/format';
import { AppError } from '../http/app-error.js';
import { datasetCsv, datasetLatex, type ExportHeading } from './dataset-document.js';
import { readSnapshot } from './snapshot.js';

/** A dataset export rendered on a run thread: the stored snapshot text and the heading. */
export interface ExportTask {
  snapshot: string;
  format: 'csv' | 'latex' | 'matrix';
  heading: ExportHeading;
}

/**
 * Renders the CSV, LaTeX or coefficient-matrix export of a dataset from its snapshot text (on a
 * worker, so the server's main thread neither parses the snapshot nor builds the text). A numeric
 * table has no coefficient matrix: 400 naming `format`.
 */
export function renderExport(task: ExportTask): string {
  const result = readSnapshot(task.snapshot).result;
  if (task.format === 'matrix') {
    if (isNumericResult(result)) {
      throw new AppError(
        400,
        'invalid_input',
        'format: a numeric table has no coefficient matrix; export CSV instead.',
        'format',
      );
    }
    return renderMatrix(result);
  }
  return task.format === 'csv'
    ? datasetCsv(task.heading, result)
    : datasetLatex(task.heading, result);
}

/** Worker task: the export's bytes (UTF-8). */
export function exportTask(task: ExportTask): { ok: true; body: Uint8Array } {
  return { ok: true, body: Buffer.from(renderExport(task), 'utf8') };
}
