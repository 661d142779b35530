/**
 * The DTOs of the foundation API, as the client sees them. They mirror the API contract; once
 * `@traceloom/shared` exports the request schemas and DTO types, these move there.
 */

/** The four roles of the product. */
export const ROLES = ['author', 'reviewer', 'steward', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  disabled: boolean;
  createdAt: string;
}

export interface LoginResponse {
  token: string;
  expiresAt: string;
  user: UserDto;
}

export interface DirectoryEntry {
  id: string;
  displayName: string;
  email: string;
  role: Role;
}

export interface StudyDto {
  id: string;
  title: string;
  description: string;
  owner: { id: string; displayName: string; email: string };
  members: DirectoryEntry[];
  createdAt: string;
  updatedAt: string;
}

export interface InviteResponse {
  user: UserDto;
  invitation: { id: string; email: string; createdAt: string };
}

/** Field limits of the request bodies (API contract, "Validation"). */
export const LIMITS = {
  titleMax: 200,
  descriptionMax: 5000,
  emailMax: 254,
  displayNameMax: 100,
  passwordMax: 1024,
} as const;
