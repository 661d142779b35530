import { z } from 'zod';
import { idSchema, API_LIMITS } from './fields.js';
import type { Role } from './roles.js';

const titleSchema = z
  .string({ error: 'must be a text value' })
  .trim()
  .min(1, 'must not be empty')
  .max(API_LIMITS.titleMax, `must be at most ${API_LIMITS.titleMax} characters`);

const descriptionSchema = z
  .string({ error: 'must be a text value' })
  .max(API_LIMITS.descriptionMax, `must be at most ${API_LIMITS.descriptionMax} characters`);

/** Body of `POST /api/studies`. */
export const studyCreateSchema = z.strictObject({
  title: titleSchema,
  description: descriptionSchema.optional(),
});

/** Parsed study creation body. */
export type StudyCreateRequest = z.infer<typeof studyCreateSchema>;

/** Body of `PATCH /api/studies/:id`; at least one field. */
export const studyPatchSchema = z
  .strictObject({ title: titleSchema.optional(), description: descriptionSchema.optional() })
  .refine((patch) => patch.title !== undefined || patch.description !== undefined, {
    message: 'give at least one of title, description',
  });

/** Parsed study patch. */
export type StudyPatchRequest = z.infer<typeof studyPatchSchema>;

/** Body of `POST /api/studies/:id/members`. */
export const memberAddSchema = z.strictObject({ userId: idSchema });

/** Parsed member addition. */
export type MemberAddRequest = z.infer<typeof memberAddSchema>;

/** A person as a study shows them. */
export interface StudyPersonDto {
  id: string;
  displayName: string;
  email: string;
}

/** A study member: a person with their role. */
export interface StudyMemberDto extends StudyPersonDto {
  role: Role;
}

/** A study as the API shows it. */
export interface StudyDto {
  id: string;
  title: string;
  description: string;
  owner: StudyPersonDto;
  members: StudyMemberDto[];
  /** People in the study: the owner and every member (the owner counted once). */
  memberCount: number;
  createdAt: string;
  updatedAt: string;
  /**
   * The latest change anywhere in the study: its own fields and members, its gases, runs,
   * reference tables and datasets.
   */
  lastChangeAt: string;
}
