import type { ReferenceRow } from '@traceloom/shared/api';
import { referenceUploadFieldsSchema } from '@traceloom/shared/api';
import type { ReferenceDto, ReferenceSummary } from '@traceloom/shared/api';
import { createHash } from 'node:crypto';
import type { Request, Response } from 'express';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { ReferenceTable } from '../db/entities/index.js';
import { personRef } from '../gases/gas-dto.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { parseInput } from '../http/validate.js';
import { canSee, loadVisibleStudy, STUDY_RELATIONS } from '../studies/study-access.js';
import { referenceFacts, type ParsedReference, type RowError } from './reference-parse.js';
import { assertDense } from './reference-density.js';
import { assertWithinQuota, DEFAULT_REFERENCE_QUOTA } from './reference-quota.js';
import { refusalError } from '../compute/run-task.js';
import { receiveUpload, type Upload } from './receive-upload.js';

function toSummary(table: ReferenceTable): ReferenceSummary {
  return {
    id: table.id,
    studyId: table.study.id,
    title: table.title,
    filename: table.filename,
    contentType: table.contentType,
    sha256: table.sha256,
    normalization: table.normalization,
    variable: table.variable,
    note: table.note,
    numeric: table.numeric,
    rowCount: table.rowCount,
    createdAt: table.createdAt,
    createdBy: personRef(table.createdBy),
  };
}

function toDto(table: ReferenceTable): ReferenceDto {
  const { rowCount: _count, ...summary } = toSummary(table);
  return { ...summary, rows: JSON.parse(table.rows) as ReferenceRow[] };
}

/** Longest the worker may take to read one upload. */
const READ_LIMIT_MS = 10_000;

/** Reads the upload in a worker (the main thread never evaluates user text). */
async function parseInWorker(
  ctx: AppContext,
  file: Upload['file'],
  normalization: string | undefined,
  variable: string,
): Promise<ParsedReference> {
  const { parsed } = await ctx.services.tasks.runTask(
    'reference',
    { ...file, variable, ...(normalization === undefined ? {} : { normalization }) },
    {
      timeoutMs: READ_LIMIT_MS,
      onTimeout: () =>
        new AppError(
          400,
          'invalid_upload',
          `file: reading it took longer than ${READ_LIMIT_MS / 1000} s.`,
          'file',
        ),
      outOfMemory: () =>
        new AppError(
          413,
          'file_too_complex',
          'file: reading it needed more memory than one upload may use; split the table.',
          'file',
        ),
      refused: (r) =>
        r.status !== undefined
          ? refusalError(r)
          : new AppError(400, 'invalid_upload', `file: ${r.message}.`, 'file'),
    },
  );
  return parsed;
}

function firstError(errors: RowError[]): never {
  const { line, message } = errors[0]!;
  const more = errors.length > 1 ? ` (and ${errors.length - 1} more)` : '';
  throw new AppError(
    400,
    'invalid_row',
    `line ${line}: ${message}${more}. Nothing was stored.`,
    'file',
  );
}

/**
 * `POST /studies/:id/references`: receives, checks and stores a reference table with the file
 * as uploaded. With `?dryRun=1` only parses and answers `{rows, errors}`. Any bad row refuses
 * the whole file (400 `invalid_row` naming its line); nothing is stored half.
 */
export async function uploadReference(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
  req: Request,
  res: Response,
): Promise<ReferenceDto | { rows: ReferenceRow[]; errors: RowError[]; numeric: boolean }> {
  await loadVisibleStudy(ctx.dataSource.manager, actor, studyId);
  const quota = ctx.config.referenceQuota ?? DEFAULT_REFERENCE_QUOTA;
  const who = { userId: actor.id, studyId };
  const dryRun = req.query.dryRun === '1' || req.query.dryRun === 'true';
  const { file, fields } = await receiveUpload(req, res, ctx.config.uploadLimitBytes);
  const input = parseInput(referenceUploadFieldsSchema, fields);
  // Before the worker reads it; checked again in the transaction that stores it.
  if (!dryRun) await assertWithinQuota(ctx.dataSource.manager, quota, who, file.bytes.length);
  const parsed = await parseInWorker(ctx, file, input.normalization, input.variable ?? 'q');
  assertDense(file.bytes.length, parsed.rows.length + parsed.errors.length);
  if (dryRun) {
    res.status(200);
    return { rows: parsed.rows, errors: parsed.errors, numeric: parsed.numeric ?? false };
  }
  if (parsed.errors.length) firstError(parsed.errors);
  const normalization = parsed.normalization ?? '1';
  const title =
    (input.title ?? parsed.title?.trim() ?? file.filename.replace(/\.[^.]*$/, '')).slice(0, 200) ||
    'reference table';
  return ctx.dataSource.transaction(async (manager) => {
    await assertWithinQuota(manager, quota, who, file.bytes.length);
    const repo = manager.getRepository(ReferenceTable);
    const { id } = await repo.save(
      repo.create({
        study: { id: studyId },
        title,
        fileBytes: file.bytes,
        filename: file.filename.slice(0, 255),
        contentType: (file.contentType || 'application/octet-stream').slice(0, 100),
        sha256: createHash('sha256').update(file.bytes).digest('hex'),
        rows: JSON.stringify(parsed.rows),
        ...referenceFacts(file.bytes, parsed.rows),
        normalization,
        variable: input.variable ?? 'q',
        note: input.note ?? '',
        createdBy: { id: actor.id },
        createdAt: new Date().toISOString(),
      }),
    );
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'reference.create',
      targetType: 'reference',
      targetId: id,
      detail: { studyId, title, rows: parsed.rows.length, filename: file.filename },
    });
    return toDto(
      await repo.findOneOrFail({ where: { id }, relations: { study: true, createdBy: true } }),
    );
  });
}

/** The study's reference tables, newest first. */
export async function listReferences(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
): Promise<ReferenceSummary[]> {
  await loadVisibleStudy(ctx.dataSource.manager, actor, studyId);
  // Explicit columns: neither the uploaded bytes nor the rows are read for a list.
  const tables = await ctx.dataSource
    .getRepository(ReferenceTable)
    .createQueryBuilder('r')
    .innerJoin('r.study', 'study')
    .innerJoin('r.createdBy', 'by')
    .select(['r.id', 'r.title', 'r.filename', 'r.contentType', 'r.sha256', 'r.normalization'])
    .addSelect(['r.variable', 'r.note', 'r.numeric', 'r.rowCount', 'r.createdAt'])
    .addSelect(['study.id', 'by.id', 'by.displayName'])
    .where('r.study_id = :studyId', { studyId })
    .orderBy('r.createdAt', 'DESC')
    .getMany();
  return tables.map(toSummary);
}

/** Loads a reference table whose study the actor may see; 404 naming `field` otherwise. */
export async function loadVisibleReference(
  ctx: AppContext,
  actor: Actor,
  referenceId: string,
  field?: string,
): Promise<ReferenceTable> {
  const table = await ctx.dataSource.getRepository(ReferenceTable).findOne({
    where: { id: referenceId },
    relations: { study: STUDY_RELATIONS, createdBy: true },
  });
  if (!table || !canSee(actor, table.study)) throw notFound('The reference table', field);
  return table;
}

/** One reference table with its rows. */
export async function getReference(
  ctx: AppContext,
  actor: Actor,
  referenceId: string,
): Promise<ReferenceDto> {
  return toDto(await loadVisibleReference(ctx, actor, referenceId));
}
