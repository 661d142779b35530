import type { DirectoryEntryDto, UserDto } from '@traceloom/shared/api';
import { isUnusablePasswordHash } from '../auth/password.js';
import type { User } from '../db/entities/index.js';

/** The API's view of a user row (never the hash or token version). */
export function toUserDto(user: User): UserDto {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    disabled: Boolean(user.disabled),
    invited: isUnusablePasswordHash(user.passwordHash),
    createdAt: user.createdAt,
  };
}

/** The directory's view of a user row. */
export function toDirectoryEntry(user: User): DirectoryEntryDto {
  return { id: user.id, displayName: user.displayName, email: user.email, role: user.role };
}
