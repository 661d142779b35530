import { z } from 'zod';
import { emailSchema, API_LIMITS } from './fields.js';
import type { UserDto } from './users.js';

/** Body of `POST /api/auth/login`. */
export const loginSchema = z.strictObject({
  email: emailSchema,
  password: z
    .string({ error: 'must be a text value' })
    .min(1, 'must not be empty')
    .max(API_LIMITS.passwordMax, `must be at most ${API_LIMITS.passwordMax} characters`),
});

/** Body of `POST /api/auth/password-reset`: the address to send a new-password link to. */
export const passwordResetSchema = z.strictObject({ email: emailSchema });

/** Parsed login body. */
export type LoginRequest = z.infer<typeof loginSchema>;

/** Answer of a successful sign-in. */
export interface LoginResponse {
  token: string;
  /** ISO time at which the token stops working. */
  expiresAt: string;
  user: UserDto;
}

/** Answer of `GET /api/health`. */
export interface HealthDto {
  status: 'ok' | 'degraded';
  version: string;
  database: 'ok' | 'error';
  /** `demo` when the demo accounts are seeded (the sign-in page then shows them). */
  mode: 'demo' | 'production' | 'test';
}

/** The body of every failed API request. */
export interface ApiErrorBody {
  error: { code: string; message: string; field?: string };
}
