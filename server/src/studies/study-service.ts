import type {
  MemberAddRequest,
  StudyCreateRequest,
  StudyDto,
  StudyPatchRequest,
} from '@traceloom/shared/api';
import { In, type EntityManager } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { Dataset, Study, StudyMember, User } from '../db/entities/index.js';
import { AppError, notFound } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import {
  STUDY_RELATIONS,
  assertCanEdit,
  assertCanManage,
  loadVisibleStudy,
} from './study-access.js';
import { lastChanges, toStudyDto } from './study-dto.js';

/** Studies the actor owns or belongs to (an admin: all), most recently changed first. */
export async function listStudies(ctx: AppContext, actor: Actor): Promise<StudyDto[]> {
  const repo = ctx.dataSource.getRepository(Study);
  let where = {};
  if (actor.role !== 'admin') {
    const rows = (await ctx.dataSource.query(
      `SELECT id FROM study WHERE owner_id = ?
       UNION SELECT study_id AS id FROM study_member WHERE user_id = ?`,
      [actor.id, actor.id],
    )) as Array<{ id: string }>;
    where = { id: In(rows.map((row) => row.id)) };
  }
  const studies = await repo.find({
    where,
    relations: STUDY_RELATIONS,
    order: { updatedAt: 'DESC' },
  });
  const changes = await lastChanges(
    ctx.dataSource.manager,
    studies.map((st) => st.id),
  );
  return studies
    .map((study) => toStudyDto(study, changes.get(study.id)))
    .sort((a, b) => b.lastChangeAt.localeCompare(a.lastChangeAt));
}

/** Creates a study owned by the actor. */
export async function createStudy(
  ctx: AppContext,
  actor: Actor,
  input: StudyCreateRequest,
): Promise<StudyDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const now = new Date().toISOString();
    const repo = manager.getRepository(Study);
    const { id } = await repo.save(
      repo.create({
        title: input.title,
        description: input.description ?? '',
        owner: { id: actor.id },
        createdAt: now,
        updatedAt: now,
      }),
    );
    return studyChanged(manager, actor, 'study.create', id, { title: input.title });
  });
}

/** One study, if the actor may see it (else 404). */
export async function getStudy(ctx: AppContext, actor: Actor, studyId: string): Promise<StudyDto> {
  const study = await loadVisibleStudy(ctx.dataSource.manager, actor, studyId);
  return toStudyDto(study, (await lastChanges(ctx.dataSource.manager, [study.id])).get(study.id));
}

/** Renames or re-describes a study. */
export async function patchStudy(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
  patch: StudyPatchRequest,
): Promise<StudyDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const study = await loadVisibleStudy(manager, actor, studyId);
    assertCanEdit(actor, study);
    const changes: Partial<Pick<Study, 'title' | 'description'>> = {};
    if (patch.title !== undefined) changes.title = patch.title;
    if (patch.description !== undefined) changes.description = patch.description;
    await touch(manager, studyId, changes);
    return studyChanged(manager, actor, 'study.update', studyId, {
      before: { title: study.title, description: study.description },
      after: changes,
    });
  });
}

/** Deletes a study and its memberships (owner or admin). */
export async function deleteStudy(ctx: AppContext, actor: Actor, studyId: string): Promise<void> {
  await ctx.dataSource.transaction(async (manager) => {
    const study = await loadVisibleStudy(manager, actor, studyId);
    assertCanManage(actor, study);
    // Locked datasets are permanent (database triggers refuse their deletion), so their study stays.
    const locked = await manager
      .getRepository(Dataset)
      .count({ where: { study: { id: studyId }, state: 'locked' } });
    if (locked > 0) {
      throw new AppError(
        409,
        'study_has_locked_datasets',
        `This study holds ${locked} locked dataset${locked === 1 ? '' : 's'}; locked datasets are permanent, so the study cannot be deleted.`,
      );
    }
    await manager.getRepository(Study).delete({ id: studyId });
    await recordAudit(manager, {
      actorId: actor.id,
      action: 'study.delete',
      targetType: 'study',
      targetId: studyId,
      detail: { title: study.title },
    });
  });
}

/**
 * Adds a member (owner or admin). 404 naming `userId` for an unknown or disabled user; 409
 * `already_member` when the person is already a member or the owner.
 */
export async function addMember(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
  input: MemberAddRequest,
): Promise<StudyDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const study = await loadVisibleStudy(manager, actor, studyId);
    assertCanManage(actor, study);
    const user = await manager.getRepository(User).findOneBy({ id: input.userId });
    if (!user || user.disabled) throw notFound('The user', 'userId');
    if (study.owner.id === user.id || study.members.some((m) => m.user.id === user.id)) {
      throw new AppError(
        409,
        'already_member',
        `${user.displayName} is already in this study.`,
        'userId',
      );
    }
    const now = new Date().toISOString();
    await manager
      .getRepository(StudyMember)
      .insert({ study: { id: studyId }, user: { id: user.id }, addedAt: now });
    await touch(manager, studyId, {});
    return studyChanged(manager, actor, 'study.member_add', studyId, { userId: user.id });
  });
}

/** Removes a member (owner or admin); 404 naming `userId` when they are not a member. */
export async function removeMember(
  ctx: AppContext,
  actor: Actor,
  studyId: string,
  userId: string,
): Promise<StudyDto> {
  return ctx.dataSource.transaction(async (manager) => {
    const study = await loadVisibleStudy(manager, actor, studyId);
    assertCanManage(actor, study);
    const membership = study.members.find((member) => member.user.id === userId);
    if (!membership) throw notFound('The member', 'userId');
    await manager.getRepository(StudyMember).delete({ id: membership.id });
    await touch(manager, studyId, {});
    return studyChanged(manager, actor, 'study.member_remove', studyId, { userId });
  });
}

async function touch(
  manager: EntityManager,
  studyId: string,
  changes: Partial<Study>,
): Promise<void> {
  await manager
    .getRepository(Study)
    .update({ id: studyId }, { ...changes, updatedAt: new Date().toISOString() });
}

/** Records a study change in the audit trail and answers the study as it now is. */
async function studyChanged(
  manager: EntityManager,
  actor: Actor,
  action: string,
  studyId: string,
  detail: Record<string, unknown>,
): Promise<StudyDto> {
  await recordAudit(manager, {
    actorId: actor.id,
    action,
    targetType: 'study',
    targetId: studyId,
    detail,
  });
  const study = await loadVisibleStudy(manager, actor, studyId);
  return toStudyDto(study, (await lastChanges(manager, [study.id])).get(study.id));
}
