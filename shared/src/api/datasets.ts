import { z } from 'zod';
import { API_LIMITS, idSchema } from './fields.js';

/** Limits of the dataset routes. */
export const DATASET_LIMITS = {
  commentMax: 5000,
  reasonMax: 2000,
  reviewersMax: 20,
  authorsMax: 50,
  checkKeyMax: 64,
} as const;

const titleSchema = z
  .string({ error: 'must be a text value' })
  .trim()
  .min(1, 'must not be empty')
  .max(API_LIMITS.titleMax, `must be at most ${API_LIMITS.titleMax} characters`);

const descriptionSchema = z
  .string({ error: 'must be a text value' })
  .max(API_LIMITS.descriptionMax, `must be at most ${API_LIMITS.descriptionMax} characters`);

const rowSchema = z
  .number({ error: 'must be a row number N' })
  .int({ error: 'must be a whole number' })
  .min(0, { error: 'must be at least 0' });

const textSchema = (max: number) =>
  z
    .string({ error: 'must be a text value' })
    .trim()
    .min(1, 'must not be empty')
    .max(max, `must be at most ${max} characters`);

/** Body of `POST /api/runs/:id/datasets`. */
export const datasetCreateSchema = z.strictObject({
  title: titleSchema,
  description: descriptionSchema.optional(),
  supersedesId: idSchema.optional(),
});

/** Parsed dataset creation body. */
export type DatasetCreateRequest = z.infer<typeof datasetCreateSchema>;

/** The citation's authors: study members' ids in citation order, each once. */
const authorsSchema = z
  .array(idSchema, { error: 'must be a list of user ids' })
  .min(1, 'must name at least one author')
  .max(DATASET_LIMITS.authorsMax, `must name at most ${DATASET_LIMITS.authorsMax} authors`)
  .refine((ids) => new Set(ids).size === ids.length, { message: 'must name each author once' });

/**
 * Body of `PATCH /api/datasets/:id`; at least one field. Title and description change on a
 * draft only; `authors` (the citation's authors) until the dataset is locked.
 */
export const datasetPatchSchema = z
  .strictObject({
    title: titleSchema.optional(),
    description: descriptionSchema.optional(),
    authors: authorsSchema.optional(),
  })
  .refine(
    (patch) =>
      patch.title !== undefined || patch.description !== undefined || patch.authors !== undefined,
    { message: 'give at least one of title, description, authors' },
  );

/** Parsed dataset patch. */
export type DatasetPatchRequest = z.infer<typeof datasetPatchSchema>;

/** Body of `POST /api/datasets/:id/review-requests`. */
export const reviewRequestSchema = z.strictObject({
  reviewerIds: z
    .array(idSchema, { error: 'must be a list of user ids' })
    .min(1, 'must name at least one reviewer')
    .max(DATASET_LIMITS.reviewersMax, `must name at most ${DATASET_LIMITS.reviewersMax} reviewers`),
});

/** Body of `POST /api/datasets/:id/comments`. */
export const datasetCommentSchema = z.strictObject({
  body: textSchema(DATASET_LIMITS.commentMax),
  N: rowSchema.optional(),
});

/** Body of `POST /api/datasets/:id/reviews`. */
export const datasetReviewSchema = z.strictObject({
  verdict: z.enum(['approve', 'changes'], { error: 'must be approve or changes' }),
  comment: z
    .string({ error: 'must be a text value' })
    .trim()
    .max(DATASET_LIMITS.commentMax, `must be at most ${DATASET_LIMITS.commentMax} characters`),
});

/** Body of `POST /api/datasets/:id/waivers`. */
export const datasetWaiverSchema = z.strictObject({
  check: z
    .string({ error: 'must be a check key' })
    .min(1, 'must not be empty')
    .max(DATASET_LIMITS.checkKeyMax, `must be at most ${DATASET_LIMITS.checkKeyMax} characters`),
  N: rowSchema.optional(),
  reason: textSchema(DATASET_LIMITS.reasonMax),
});

/**
 * Body of `POST /api/datasets/:id/lock` when the steward confirmed a lock preview: the lock time
 * and hash the preview named. The lock is then made with that time and refused (409 `changed`)
 * when the document would hash differently. An empty body locks now without a preview.
 */
export const datasetLockSchema = z
  .strictObject({
    lockedAt: z.iso.datetime({ error: 'must be a time as the lock preview gave it' }),
    hash: z.string().regex(/^[0-9a-f]{64}$/, 'must be the 64-digit hash the lock preview gave'),
  })
  .optional();

/** A confirmed lock preview, or nothing. */
export type DatasetLockInput = NonNullable<z.output<typeof datasetLockSchema>>;

/** What `GET /api/datasets/:id/lock-preview` answers: the lock as it would be made now. */
export interface LockPreviewDto {
  /** The SHA-256 the dataset will carry when locked with `lockedAt`. */
  hash: string;
  lockedAt: string;
  /** What the lock freezes, one phrase each. */
  freezes: string[];
}

/** Where a dataset is in its life. */
export type DatasetStateName = 'draft' | 'in_review' | 'locked' | 'withdrawn';

/** A person as a dataset names them. */
export interface DatasetPersonDto {
  id: string;
  displayName: string;
}

/** One row of one check of a dataset, with its waiver when a steward accepted it failing. */
export interface DatasetCheckDto {
  /** `class-sum`, `product`, `grand`, `implied-weights`, `reference`, or `comparison:<id>`. */
  check: string;
  label: string;
  N: number | null;
  /** `not compared` when the row's Z(N) is not determined at the order (nothing was compared). */
  status: 'passes' | 'fails' | 'waived' | 'not compared';
  detail: string;
  waiver: { reason: string; by: DatasetPersonDto; at: string } | null;
}

/** A dataset in a list. */
export interface DatasetSummaryDto {
  id: string;
  studyId: string;
  runId: string;
  title: string;
  version: number;
  state: DatasetStateName;
  hash: string | null;
  lockedAt: string | null;
  supersedes: { id: string; version: number } | null;
  supersededBy: { id: string; version: number } | null;
  createdBy: DatasetPersonDto;
  createdAt: string;
  updatedAt: string;
  /** In review, and some reviewer's latest verdict is "approve" (the lock's rule). */
  approved: boolean;
  /** Approved, every check green or waived: a steward may lock it now. */
  readyToLock: boolean;
}

/** A dataset with its snapshot summary, checks, reviews and comments. */
export interface DatasetDto extends DatasetSummaryDto {
  description: string;
  snapshot: {
    gas: { id: string; title: string; version: number };
    run: { id: string; finishedAt: string | null; durationMs: number | null };
    statistics: string;
    variable: string;
    /** The series order, or null (exact, or a numeric table: see `precision`). */
    order: string | null;
    nMax: number;
    /** Numeric mode: the digits requested (null for a series table). */
    precision: number | null;
    /**
     * What is known of the values, one sentence: "exact (...)", "truncated at O(q^k)" or
     * "numeric, D digits requested, errors estimated by ...".
     */
    known: string;
    /** Z(N) rows as the result format gives them (a series, or a number with its error). */
    canonical: Array<{
      N: number;
      value: { order: string | null; terms: [string, string][] } | { real: string; error: string };
    }>;
  };
  checks: DatasetCheckDto[];
  reviewRequests: Array<{ reviewer: DatasetPersonDto; requestedBy: DatasetPersonDto; at: string }>;
  reviews: Array<{
    id: string;
    reviewer: DatasetPersonDto;
    verdict: 'approve' | 'changes';
    comment: string;
    at: string;
  }>;
  comments: Array<{
    id: string;
    author: DatasetPersonDto;
    N: number | null;
    body: string;
    at: string;
  }>;
  /** Ready to paste: title, version, date, hash (locked datasets only). */
  citation: string | null;
  /**
   * The citation's authors in order: as edited before the lock, else the dataset's maker and
   * each reviewer whose latest verdict approves it. A lock freezes them into the document.
   */
  authors: DatasetPersonDto[];
  /** True when someone chose the authors (false: the default list above). */
  authorsEdited: boolean;
  /** What the caller may do now. */
  can: {
    edit: boolean;
    /** Change the citation's authors: the dataset's maker or a steward, until it is locked. */
    editAuthors: boolean;
    requestReview: boolean;
    review: boolean;
    waive: boolean;
    lock: boolean;
    withdraw: boolean;
  };
  /** Why locking is not possible yet (empty when it is, or when the caller may not lock). */
  lockBlockers: string[];
}

/** One review request in the reviewer's inbox. */
export interface ReviewInboxEntryDto {
  dataset: DatasetSummaryDto;
  requestedBy: DatasetPersonDto;
  requestedAt: string;
  myVerdict: 'approve' | 'changes' | null;
}
