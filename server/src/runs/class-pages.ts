import { promisify } from 'node:util';
import { gunzip as gunzipCb } from 'node:zlib';
import type { EntityManager } from 'typeorm';
import { RunClassPage } from '../db/entities/index.js';
import type { ClassPageData } from './class-pager.js';

const gunzip = promisify(gunzipCb);

/** Stores one page of a run's class rows. */
export async function storeClassPage(
  manager: EntityManager,
  runId: string,
  page: ClassPageData,
): Promise<void> {
  await manager.getRepository(RunClassPage).insert({
    runId,
    n: page.n,
    page: page.page,
    rowCount: page.rowCount,
    rows: Buffer.from(page.gzip.buffer, page.gzip.byteOffset, page.gzip.byteLength),
  });
}

/** Removes every stored class row of a run (before a retry, or when it did not finish). */
export async function dropClassPages(manager: EntityManager, runId: string): Promise<void> {
  await manager.getRepository(RunClassPage).delete({ runId });
}

/**
 * The class rows of one N as the bytes of one JSON array, yielded page by page: each page is
 * read from the database and unpacked off the main thread (zlib's thread pool), never parsed
 * nor decoded here. `page` picks one page only.
 */
export async function* classRowsJson(
  manager: EntityManager,
  runId: string,
  n: number,
  page: number | null = null,
): AsyncGenerator<Buffer | string> {
  const where = page === null ? { runId, n } : { runId, n, page };
  const pages = await manager
    .getRepository(RunClassPage)
    .find({ where, select: { page: true }, order: { page: 'ASC' } });
  yield '[';
  let first = true;
  for (const { page: k } of pages) {
    const stored = await manager
      .getRepository(RunClassPage)
      .findOne({ where: { runId, n, page: k }, select: { rows: true } });
    if (!stored) continue;
    const bytes = await gunzip(stored.rows);
    if (bytes.length <= 2) continue; // "[]"
    if (!first) yield ',';
    first = false;
    yield bytes.subarray(1, bytes.length - 1); // the rows without the page's brackets
  }
  yield ']';
}

/** The stored result (gzip of the result JSON without class rows), unpacked off the main thread. */
export async function resultJson(gzip: Buffer): Promise<Buffer> {
  return gunzip(gzip);
}
