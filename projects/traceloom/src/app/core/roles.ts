import { may, type Role } from '@traceloom/shared/api';

/** How each role is named on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  author: 'Author',
  reviewer: 'Reviewer',
  steward: 'Steward',
  admin: 'Admin',
};

/** Roles that may create a study (API contract: POST /api/studies). */
export function canCreateStudy(role: Role | null): boolean {
  return may(role, 'editStudies');
}
