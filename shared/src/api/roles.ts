import { z } from 'zod';

/** The four Traceloom roles, in the order screens list them. */
export const ROLES = ['author', 'reviewer', 'steward', 'admin'] as const;

/** A Traceloom role: what a signed-in person may do. */
export type Role = (typeof ROLES)[number];

/** Schema for a role field (`author`, `reviewer`, `steward`, `admin`). */
export const roleSchema = z.enum(ROLES, {
  error: 'must be one of author, reviewer, steward, admin',
});
