import type { DatasetDocument } from '@traceloom/shared/api';
import { DATASET_FORMAT } from '@traceloom/shared/api';
import type { Response } from 'express';
import { z } from 'zod';
import type { AppContext } from '../app-context.js';
import { Dataset } from '../db/entities/index.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { parseInput } from '../http/validate.js';
import { DATASET_RELATIONS, loadVisibleDataset, withBytes } from './dataset-access.js';
import { citationAuthors } from './dataset-authors.js';
import { canonicalHash } from './dataset-document.js';
import { citationOf, supersededBy, toSummary } from './dataset-dto.js';

const FORMATS = ['json', 'csv', 'latex', 'matrix'] as const;

/** A file name from a title: letters, digits and dashes only. */
function fileStem(d: Pick<Dataset, 'title' | 'version'>): string {
  const stem = d.title
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 60);
  return `${stem || 'dataset'}-v${d.version}`;
}

function send(
  res: Response,
  d: Dataset,
  format: (typeof FORMATS)[number],
  body: string | Buffer,
): void {
  const types = {
    json: 'application/json',
    csv: 'text/csv',
    latex: 'application/x-latex',
    matrix: 'text/csv',
  } as const;
  const ext = { json: 'json', csv: 'csv', latex: 'tex', matrix: 'matrix.csv' } as const;
  res
    .status(200)
    .set('Content-Type', `${types[format]}; charset=utf-8`)
    .set('Content-Disposition', `attachment; filename="${fileStem(d)}.${ext[format]}"`)
    .send(typeof body === 'string' ? Buffer.from(body, 'utf8') : body);
}

/**
 * Writes the export of `d` to `res`. JSON (locked only) is exactly the canonical bytes that were
 * hashed, so SHA-256 of the body equals the lock hash; CSV and LaTeX carry the tables, `matrix`
 * the coefficient matrix (N x exponent) of a series table as CSV.
 */
export async function writeExport(
  ctx: AppContext,
  res: Response,
  d: Dataset,
  formatParam: unknown,
): Promise<void> {
  const format = (formatParam ?? 'json') as (typeof FORMATS)[number];
  if (!FORMATS.includes(format)) {
    throw new AppError(
      400,
      'invalid_input',
      'format: must be json, csv, latex or matrix.',
      'format',
    );
  }
  if (format === 'json') {
    if (d.state !== 'locked' || d.canonical === null) {
      throw new AppError(
        409,
        'not_locked',
        'The JSON export is the locked, hashed document: lock the dataset first.',
      );
    }
    return send(res, d, format, d.canonical);
  }
  const heading = { title: d.title, version: d.version, lockedAt: d.lockedAt, hash: d.hash };
  const { body } = await ctx.services.tasks.runTask('datasetExport', {
    snapshot: d.snapshot,
    format,
    heading,
  });
  send(res, d, format, Buffer.from(body.buffer, body.byteOffset, body.byteLength));
}

/** `GET /datasets/:id/export?format=json|csv|latex|matrix`. */
export async function exportDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  format: unknown,
  res: Response,
): Promise<void> {
  const manager = ctx.dataSource.manager;
  const d = await loadVisibleDataset(manager, actor, datasetId);
  await writeExport(ctx, res, await withBytes(manager, d), format);
}

const HASH = /^[0-9a-f]{64}$/;

/** The locked dataset with this hash; 404 otherwise. */
export async function lockedByHash(ctx: AppContext, hash: string | undefined): Promise<Dataset> {
  const d =
    hash && HASH.test(hash)
      ? await ctx.dataSource
          .getRepository(Dataset)
          .findOne({ where: { hash, state: 'locked' }, relations: DATASET_RELATIONS })
      : null;
  if (!d) throw notFound('No locked dataset has this hash; it');
  return withBytes(ctx.dataSource.manager, d);
}

/** `GET /public/datasets/:hash` (no sign-in): a locked dataset's document and citation. */
export async function publicDataset(ctx: AppContext, hash: string | undefined) {
  const d = await lockedByHash(ctx, hash);
  const document = JSON.parse(d.canonical!) as DatasetDocument;
  return {
    hash: d.hash,
    citation: citationOf(d),
    authors: citationAuthors(document),
    supersededBy: await supersededBy(ctx.dataSource.manager, d.id, true),
    document: document as unknown,
  };
}

/** `GET /public/datasets/:hash/export?format=`: the same exports, without sign-in. */
export async function publicExport(
  ctx: AppContext,
  hash: string | undefined,
  format: unknown,
  res: Response,
): Promise<void> {
  await writeExport(ctx, res, await lockedByHash(ctx, hash), format);
}

const importSchema = z.looseObject({
  format: z.literal(DATASET_FORMAT, { error: `must be "${DATASET_FORMAT}"` }),
  id: z.uuid({ error: 'must be an identifier (UUID)' }),
  title: z.string({ error: 'must be a text value' }),
  version: z.number({ error: 'must be a number' }).int().min(1),
  lockedAt: z.string({ error: 'must be a time' }),
  snapshot: z.looseObject({
    spec: z.looseObject({ format: z.string({ error: 'must be the gas format name' }) }),
    result: z.looseObject({ format: z.string({ error: 'must be the result format name' }) }),
  }),
  checks: z.array(z.unknown(), { error: 'must be a list' }),
  reviews: z.array(z.unknown(), { error: 'must be a list' }),
});

/**
 * `POST /datasets/import` (body = a JSON export): validates the document, recomputes its
 * canonical form and SHA-256, and says whether a locked dataset here has that hash. Nothing is
 * stored; a document changed by even one character gives another hash.
 */
export async function importDataset(ctx: AppContext, actor: Actor, body: unknown) {
  const doc = parseInput(importSchema, body);
  const { hash } = canonicalHash(body);
  const match = await ctx.dataSource
    .getRepository(Dataset)
    .findOne({ where: { hash, state: 'locked' }, relations: DATASET_RELATIONS });
  let dataset = null;
  if (match) {
    try {
      dataset = await toSummary(
        ctx.dataSource.manager,
        await loadVisibleDataset(ctx.dataSource.manager, actor, match.id),
      );
    } catch {
      dataset = null; // locked here but in a study the caller cannot see: the public page still shows it
    }
  }
  return {
    hash,
    known: match !== null,
    idMatches: match?.id === doc.id,
    dataset,
    publicPath: match ? `/public/${hash}` : null,
  };
}
