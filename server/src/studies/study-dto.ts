import type { StudyDto } from '@traceloom/shared/api';
import type { Study } from '../db/entities/index.js';

/** The API's view of a study loaded with its owner and members' users. */
export function toStudyDto(study: Study): StudyDto {
  const members = [...study.members].sort((a, b) => a.addedAt.localeCompare(b.addedAt));
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
    createdAt: study.createdAt,
    updatedAt: study.updatedAt,
  };
}
