import { isNumericResult, renderMatrix } from '@traceloom/shared/format';
import { AppError } from '../http/app-error.js';
import type { DatasetPersonDto } from '@traceloom/shared/api';
import type { Dataset } from '../db/entities/index.js';
import {
  buildDocument,
  canonicalHash,
  datasetCsv,
  datasetLatex,
  type ExportHeading,
} from './dataset-document.js';
import type { DatasetChildren } from './dataset-dto.js';
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

/** A lock's document built on a run thread: the dataset with its bytes and relations. */
export interface LockDocumentTask {
  dataset: Dataset;
  children: DatasetChildren;
  lockedBy: DatasetPersonDto;
  lockedAt: string;
}

/**
 * Worker task: builds the locked document (parsing the snapshot) and answers its canonical
 * text and SHA-256, so the main thread neither parses the snapshot nor canonicalizes it.
 */
export function lockDocumentTask(task: LockDocumentTask): {
  ok: true;
  canonical: string;
  hash: string;
} {
  const doc = buildDocument(task.dataset, task.children, task.lockedBy, task.lockedAt);
  return { ok: true, ...canonicalHash(doc) };
}
