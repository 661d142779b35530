import { z } from 'zod';

/** The four Traceloom roles, in the order screens list them. */
export const ROLES = ['author', 'reviewer', 'steward', 'admin'] as const;

/** A Traceloom role: what a signed-in person may do. */
export type Role = (typeof ROLES)[number];

/** Schema for a role field (`author`, `reviewer`, `steward`, `admin`). */
export const roleSchema = z.enum(ROLES, {
  error: 'must be one of author, reviewer, steward, admin',
});

/**
 * Who may do what, by role: the one table the server's route guards and domain checks and the
 * client's menus and buttons read. A person's membership of a study (and being a draft's
 * creator or a study's owner) is checked beside it, per resource.
 */
export const PERMISSIONS = {
  /** Sign in and read what their studies hold. */
  signedIn: ROLES,
  /** Create studies and edit those they own or belong to. */
  editStudies: ['author', 'steward', 'admin'],
  /** Create and edit gases, start and cancel runs, edit any reference table of the study. */
  editGases: ['author', 'steward', 'admin'],
  /** Upload reference tables and compare runs with them. */
  check: ROLES,
  /** Make a dataset from a run (and edit or delete the drafts one made). */
  makeDatasets: ['author', 'steward', 'admin'],
  /** Edit or delete anyone's draft dataset. */
  editAnyDraft: ['steward', 'admin'],
  /** Request reviews of anyone's open dataset and choose its authors (its maker may too). */
  curate: ['steward'],
  /** Be asked for a review and give a verdict. */
  review: ['reviewer', 'steward'],
  /** Waive a failing check, lock and withdraw a dataset. */
  lock: ['steward'],
  /** Read the audit log (stewards: their studies' events, without addresses). */
  readAudit: ['steward', 'admin'],
  /**
   * See every study with its datasets and audit events, delete it and change its members,
   * without being its owner or a member.
   */
  everyStudy: ['admin'],
  /** Manage users and invitations; read the local mail fake. */
  administer: ['admin'],
} as const satisfies Record<string, readonly Role[]>;

/** A name of a row of `PERMISSIONS`. */
export type Permission = keyof typeof PERMISSIONS;

/** True when `role` may do `permission` (false when signed out). */
export function may(role: Role | null | undefined, permission: Permission): boolean {
  return !!role && (PERMISSIONS[permission] as readonly Role[]).includes(role);
}
