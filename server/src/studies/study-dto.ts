import type { StudyDto } from '@traceloom/shared/api';
import type { EntityManager } from 'typeorm';
import type { Study } from '../db/entities/index.js';

/**
 * The API's view of a study loaded with its owner and members' users. `lastChangeAt` comes from
 * `lastChanges` (the study's own `updatedAt` when not given).
 */
export function toStudyDto(study: Study, lastChangeAt?: string): StudyDto {
  const members = [...study.members].sort((a, b) => a.addedAt.localeCompare(b.addedAt));
  const others = members.filter(({ user }) => user.id !== study.owner.id);
  return {
    id: study.id,
    title: study.title,
    description: study.description,
    owner: { id: study.owner.id, displayName: study.owner.displayName, email: study.owner.email },
    members: members.map(({ user }) => ({
      id: user.id,
      displayName: user.displayName,
      email: user.email,
      role: user.role,
    })),
    memberCount: 1 + others.length,
    createdAt: study.createdAt,
    updatedAt: study.updatedAt,
    lastChangeAt: lastChangeAt ?? study.updatedAt,
  };
}

/**
 * The latest change of each study, by id: the newest of its own `updated_at`, its audit events
 * (member added or removed), and the times of its gases, runs, reference tables and datasets.
 * All times are ISO strings of one format, so the text maximum is the latest time.
 */
export async function lastChanges(
  manager: EntityManager,
  studyIds: readonly string[],
): Promise<Map<string, string>> {
  if (studyIds.length === 0) return new Map();
  const marks = studyIds.map(() => '?').join(', ');
  const rows = (await manager.query(
    `SELECT sid, MAX(at) AS at FROM (
       SELECT id AS sid, updated_at AS at FROM study
       UNION ALL SELECT target_id, created_at FROM audit_event WHERE target_type = 'study'
       UNION ALL SELECT study_id, added_at FROM study_member
       UNION ALL SELECT study_id, updated_at FROM gas
       UNION ALL SELECT g.study_id, MAX(r.created_at, COALESCE(r.started_at, ''),
                                        COALESCE(r.finished_at, ''))
         FROM run r JOIN gas g ON g.id = r.gas_id
       UNION ALL SELECT study_id, created_at FROM reference_table
       UNION ALL SELECT study_id, updated_at FROM dataset
     ) WHERE sid IN (${marks}) GROUP BY sid`,
    [...studyIds],
  )) as Array<{ sid: string; at: string }>;
  return new Map(rows.map((r) => [r.sid, r.at]));
}
