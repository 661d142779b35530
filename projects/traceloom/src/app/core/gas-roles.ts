import { may, type Role } from '@traceloom/shared/api';

/**
 * Roles that may create and edit gases and start or cancel runs (API contract for gases and
 * runs: author, steward, admin; reviewers read, upload references and compare).
 */
export function canWriteGases(role: Role | null): boolean {
  return may(role, 'editGases');
}
