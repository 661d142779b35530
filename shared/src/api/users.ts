import { z } from 'zod';
import { displayNameSchema, emailSchema } from './fields.js';
import { roleSchema, type Role } from './roles.js';

/** Body of `POST /api/users` (an admin invites a person). */
export const inviteSchema = z.strictObject({
  email: emailSchema,
  displayName: displayNameSchema,
  role: roleSchema,
});

/** Parsed invitation body. */
export type InviteRequest = z.infer<typeof inviteSchema>;

/** Body of `PATCH /api/users/:id`; at least one field. */
export const userPatchSchema = z
  .strictObject({
    role: roleSchema.optional(),
    disabled: z.boolean({ error: 'must be true or false' }).optional(),
    displayName: displayNameSchema.optional(),
  })
  .refine((patch) => Object.values(patch).some((value) => value !== undefined), {
    message: 'give at least one of role, disabled, displayName',
  });

/** Parsed user patch. */
export type UserPatchRequest = z.infer<typeof userPatchSchema>;

/** A user as the API shows it. */
export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  disabled: boolean;
  /** Invited and not yet accepted: the account has no password yet. */
  invited: boolean;
  createdAt: string;
}

/** Answer of `POST /api/users`. */
export interface InviteResponse {
  user: UserDto;
  invitation: { id: string; email: string; createdAt: string };
}

/** One entry of `GET /api/users/directory` (active users, for picking study members). */
export interface DirectoryEntryDto {
  id: string;
  displayName: string;
  email: string;
  role: Role;
}
