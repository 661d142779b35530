import { may } from '@traceloom/shared/api';
import type { DatasetDocument, DatasetPersonDto } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import { Dataset } from '../db/entities/index.js';
import { recordAudit } from '../audit/record-audit.js';
import { AppError, forbidden } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { assertWritable } from './dataset-access.js';
import { latestVerdicts, person, type DatasetChildren } from './dataset-dto.js';

/** The people of a dataset's study (owner first, then members), by id. */
function studyPeople(d: Dataset): Map<string, DatasetPersonDto> {
  const people = new Map<string, DatasetPersonDto>();
  people.set(d.study.owner.id, person(d.study.owner));
  for (const m of d.study.members) people.set(m.user.id, person(m.user));
  return people;
}

/** The stored author ids of a dataset, or null when nobody chose them. */
function storedIds(d: Dataset): string[] | null {
  if (!d.authors) return null;
  const ids = JSON.parse(d.authors) as unknown;
  return Array.isArray(ids) && ids.every((x) => typeof x === 'string') ? ids : null;
}

/**
 * The citation's authors of a dataset (loaded with its study's owner and members): the chosen
 * list (people no longer in the study dropped), else the maker, then each reviewer whose latest
 * verdict approves it, in the order they reviewed.
 */
export function datasetAuthors(
  d: Dataset,
  children: Pick<DatasetChildren, 'reviews'>,
): { authors: DatasetPersonDto[]; edited: boolean } {
  const people = studyPeople(d);
  const chosen = (storedIds(d) ?? []).flatMap((id) => {
    const p = people.get(id);
    return p ? [p] : [];
  });
  if (chosen.length > 0) return { authors: chosen, edited: true };
  const authors = [person(d.createdBy)];
  const verdicts = latestVerdicts(children.reviews);
  for (const r of children.reviews) {
    const seen = authors.some((a) => a.id === r.reviewer.id);
    if (!seen && verdicts.get(r.reviewer.id) === 'approve') authors.push(person(r.reviewer));
  }
  return { authors, edited: false };
}

/** True when `actor` may choose the dataset's authors now (maker or steward, before the lock). */
export function canEditAuthors(actor: Actor, d: Dataset): boolean {
  const open = d.state === 'draft' || d.state === 'in_review';
  return open && (d.createdBy.id === actor.id || may(actor.role, 'curate'));
}

/**
 * Stores the citation's authors of a dataset loaded in the caller's transaction: refused once the
 * dataset is locked or withdrawn (409, for everyone), to anyone but its maker or a steward (403),
 * and for an id that is not a person of the study (400 on `authors`).
 */
export async function writeAuthors(
  manager: EntityManager,
  actor: Actor,
  d: Dataset,
  ids: string[],
): Promise<void> {
  assertWritable(d);
  if (!canEditAuthors(actor, d)) {
    throw forbidden("Only the dataset's maker or a steward may choose its authors.");
  }
  const people = studyPeople(d);
  const stranger = ids.findIndex((id) => !people.has(id));
  if (stranger >= 0) {
    throw new AppError(
      400,
      'invalid_input',
      `authors: entry ${stranger + 1} is not a member of the study.`,
      'authors',
    );
  }
  const before = storedIds(d);
  await manager
    .getRepository(Dataset)
    .update({ id: d.id }, { authors: JSON.stringify(ids), updatedAt: new Date().toISOString() });
  await recordAudit(manager, {
    actorId: actor.id,
    action: 'dataset.authors',
    targetType: 'dataset',
    targetId: d.id,
    detail: { before, after: ids },
  });
}

/**
 * The people a citation names: the authors frozen into the document; for a document locked
 * before authors were chosen, who made the dataset, then each reviewer who approved it.
 */
export function citationAuthors(doc: DatasetDocument): string[] {
  if (doc.authors && doc.authors.length > 0) return doc.authors.map((a) => a.displayName);
  const names = [doc.createdBy.displayName];
  for (const r of doc.reviews) {
    if (r.verdict === 'approve' && !names.includes(r.reviewer.displayName)) {
      names.push(r.reviewer.displayName);
    }
  }
  return names;
}
