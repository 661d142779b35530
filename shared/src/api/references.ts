import { z } from 'zod';
import { MAX_EXPRESSION_LENGTH } from '../engine/limits.js';
import { API_LIMITS } from './fields.js';
import type { PersonRef } from './people.js';

/** Limits of the reference-table fields. */
export const REFERENCE_FIELD_LIMITS = { noteMax: 5000 } as const;

const titleField = z
  .string({ error: 'must be text' })
  .trim()
  .min(1, 'must not be empty')
  .max(API_LIMITS.titleMax, `must be at most ${API_LIMITS.titleMax} characters`);

const normalizationField = z
  .string({ error: 'must be text' })
  .trim()
  .min(1, 'must not be empty')
  .max(MAX_EXPRESSION_LENGTH, `must be at most ${MAX_EXPRESSION_LENGTH} characters`);

const noteField = z
  .string({ error: 'must be text' })
  .max(
    REFERENCE_FIELD_LIMITS.noteMax,
    `must be at most ${REFERENCE_FIELD_LIMITS.noteMax} characters`,
  );

/**
 * The text fields sent with an uploaded reference file (`POST /api/studies/:id/references`,
 * multipart): all optional; unknown multipart fields are ignored.
 */
export const referenceUploadFieldsSchema = z.object({
  title: titleField.optional(),
  normalization: normalizationField.optional(),
  variable: z
    .string({ error: 'must be text' })
    .regex(/^[a-df-hj-z]$/, 'must be one lower-case letter other than e and i')
    .optional(),
  note: noteField.optional(),
});

/** The descriptive fields of an upload as parsed. */
export type ReferenceUploadFields = z.infer<typeof referenceUploadFieldsSchema>;

/** The query of an upload: `?dryRun=1` (or `true`) parses without storing. */
export const referenceUploadQuerySchema = z.looseObject({
  dryRun: z.enum(['0', '1', 'true', 'false'], { error: 'must be 1 or 0' }).optional(),
});

/** Body of `PATCH /api/references/:id`: at least one of title, normalization, note. */
export const referencePatchSchema = z
  .strictObject({
    title: titleField.optional(),
    normalization: normalizationField.optional(),
    note: noteField.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { error: 'send title, normalization or note' });

/** A reference table patch as parsed. */
export type ReferencePatch = z.infer<typeof referencePatchSchema>;

/** A reference row as stored: its file line, N, the value expression and a note. */
export interface ReferenceRow {
  line: number;
  N: number;
  value: string;
  note: string;
}

/** A row-level problem of an uploaded table. */
export interface ReferenceRowError {
  line: number;
  message: string;
  field?: string;
}

/** A reference table in a study's list (`GET /api/studies/:id/references`). */
export interface ReferenceSummary {
  id: string;
  studyId: string;
  title: string;
  filename: string;
  contentType: string;
  sha256: string;
  normalization: string;
  variable: string;
  note: string;
  /** Every value is a decimal number: compared with a numeric run within tolerance. */
  numeric: boolean;
  rowCount: number;
  createdAt: string;
  createdBy: PersonRef;
}

/** A reference table with its rows (`GET /api/references/:id`, the upload's answer). */
export interface ReferenceDto extends Omit<ReferenceSummary, 'rowCount'> {
  rows: ReferenceRow[];
}

/** The dry-run answer of an upload: what would be stored, and what is wrong. */
export interface ReferencePreview {
  rows: ReferenceRow[];
  errors: ReferenceRowError[];
  /** Every value is a decimal number. */
  numeric: boolean;
}

/** One comparison of a reference table with a run, as the table's page lists it. */
export interface ReferenceComparisonDto {
  id: string;
  runId: string;
  gasId: string;
  gasTitle: string;
  gasVersion: number;
  normalization: string;
  summary: { agreeing: number; total: number };
  createdAt: string;
}
