import type { DatasetDocument, LockPreviewDto } from '@traceloom/shared/api';
import type { AppContext } from '../app-context.js';
import type { Actor } from '../http/route-table.js';
import { buildDocument, canonicalHash } from './dataset-document.js';
import { person } from './dataset-dto.js';
import { loadLockable } from './lock-service.js';
import { snapshotOrder } from './snapshot.js';

function plural(count: number, one: string, many = `${one}s`): string {
  return `${count} ${count === 1 ? one : many}`;
}

/** What a lock of `doc` freezes, one phrase each, as the confirm dialog lists it. */
export function freezeList(doc: DatasetDocument): string[] {
  const { gas, spec, result } = doc.snapshot;
  const nMax = result.canonical.length - 1;
  const order = snapshotOrder(doc.snapshot);
  const waived = doc.checks.filter((c) => c.status === 'waived').length;
  return [
    `the title "${doc.title}", version ${doc.version}, and the description`,
    `the gas "${gas.title}" as of its version ${gas.version} (${spec.statistics}s)`,
    `the canonical table Z(0)..Z(${nMax})` +
      (order === null ? '' : ` to O(${spec.variable}^${order})`),
    `${plural(doc.checks.length, 'check row')} (${waived} waived)`,
    `${plural(doc.reviews.length, 'review')} and ${plural(doc.comments.length, 'comment')}`,
  ];
}

/**
 * `GET /datasets/:id/lock-preview` (a steward who may lock it now): the hash the dataset would
 * carry if locked at the answered time, and what the lock freezes. Confirming sends both back.
 */
export async function lockPreview(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
): Promise<LockPreviewDto> {
  const { d, children } = await loadLockable(ctx.dataSource.manager, actor, datasetId);
  const lockedAt = new Date().toISOString();
  const doc = buildDocument(d, children, person(actor), lockedAt);
  return { hash: canonicalHash(doc).hash, lockedAt, freezes: freezeList(doc) };
}
