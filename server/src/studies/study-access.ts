import { may } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import { Study } from '../db/entities/index.js';
import { forbidden, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';

/** Relations every study answer needs. */
export const STUDY_RELATIONS = { owner: true, members: { user: true } } as const;

/** True when `actor` may see `study`: its owner, a member, or an admin. */
export function canSee(actor: Actor, study: Study): boolean {
  return (
    may(actor.role, 'everyStudy') ||
    study.owner.id === actor.id ||
    study.members.some((member) => member.user.id === actor.id)
  );
}

/**
 * Loads a study the actor may see, with owner and members; 404 `not_found` both when it does not
 * exist and when it is hidden from the actor, so its existence is not revealed.
 */
export async function loadVisibleStudy(
  manager: EntityManager,
  actor: Actor,
  studyId: string,
): Promise<Study> {
  const study = await manager
    .getRepository(Study)
    .findOne({ where: { id: studyId }, relations: STUDY_RELATIONS });
  if (!study || !canSee(actor, study)) throw notFound('The study');
  return study;
}

/** Title and description: the owner, an admin, or a member whose role is author or steward. */
export function assertCanEdit(actor: Actor, study: Study): void {
  const editorRole = may(actor.role, 'editStudies');
  if (may(actor.role, 'everyStudy') || study.owner.id === actor.id || editorRole) return;
  throw forbidden('Only the owner, an admin, or an author or steward member may edit this study.');
}

/** Deleting and membership: the owner or an admin. */
export function assertCanManage(actor: Actor, study: Study): void {
  if (may(actor.role, 'everyStudy') || study.owner.id === actor.id) return;
  throw forbidden('Only the study owner or an admin may do this.');
}
