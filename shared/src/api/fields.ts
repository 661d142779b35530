import { z } from 'zod';

/** Limits shared by the server's checks and the client's forms. */
export const API_LIMITS = {
  emailMax: 254,
  displayNameMax: 100,
  passwordMax: 1024,
  titleMax: 200,
  descriptionMax: 5000,
} as const;

/** An e-mail address: trimmed, lower-cased, at most 254 characters. */
export const emailSchema = z
  .string({ error: 'must be a text value' })
  .trim()
  .max(API_LIMITS.emailMax, `must be at most ${API_LIMITS.emailMax} characters`)
  .pipe(z.email({ error: 'must be a valid e-mail address' }))
  .transform((value) => value.toLowerCase());

/** A person's display name: trimmed, 1..100 characters. */
export const displayNameSchema = z
  .string({ error: 'must be a text value' })
  .trim()
  .min(1, 'must not be empty')
  .max(API_LIMITS.displayNameMax, `must be at most ${API_LIMITS.displayNameMax} characters`);

/** An identifier (UUID string). */
export const idSchema = z.uuid({ error: 'must be an identifier (UUID)' });
