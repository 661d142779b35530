import type { ComputeResult } from '../engine/result.js';
import type { GasSpec } from '../engine/spec/schema.js';
import type { ComparisonDto } from './comparisons.js';
import type { DatasetCheckDto, DatasetPersonDto } from './datasets.js';

/** Format name of a dataset document. */
export const DATASET_FORMAT = 'traceloom.dataset/1';

/** Export formats of a dataset (`GET /api/datasets/:id/export?format=`). */
export const EXPORT_FORMATS = ['json', 'csv', 'latex'] as const;

/** An export format of a dataset. */
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** What a dataset freezes of its run: stored as JSON text in the dataset's snapshot. */
export interface DatasetSnapshot {
  gas: { id: string; title: string; version: number };
  run: { id: string; finishedAt: string | null; durationMs: number | null };
  spec: GasSpec;
  /** The full result, class rows included. */
  result: ComputeResult;
  comparisons: Array<Pick<ComparisonDto, 'id' | 'referenceId' | 'kind' | 'normalization' | 'rows'>>;
}

/** The document a lock hashes and the JSON export answers: snapshot plus metadata. */
export interface DatasetDocument {
  format: typeof DATASET_FORMAT;
  id: string;
  title: string;
  description: string;
  version: number;
  supersedes: { id: string; version: number } | null;
  study: { id: string; title: string };
  createdBy: DatasetPersonDto;
  createdAt: string;
  /** The citation's authors, in order (documents locked before authors were chosen lack it). */
  authors?: DatasetPersonDto[];
  lockedBy: DatasetPersonDto;
  lockedAt: string;
  snapshot: DatasetSnapshot;
  checks: DatasetCheckDto[];
  reviews: Array<{ reviewer: DatasetPersonDto; verdict: string; comment: string; at: string }>;
  comments: Array<{ author: DatasetPersonDto; N: number | null; body: string; at: string }>;
}

/** What `GET /api/public/datasets/:hash` answers for a locked dataset, without sign-in. */
export interface PublicDatasetDto {
  hash: string;
  citation: string;
  /** The citation's authors, frozen by the lock. */
  authors: string[];
  /** The next locked version, when one exists (a draft successor is never named). */
  supersededBy: { id: string; version: number } | null;
  /** The locked document exactly as hashed (datasets locked long ago may lack newer fields). */
  document: DatasetDocument;
}

/** What `POST /api/datasets/:id/verify` answers. */
export interface VerifyAnswerDto {
  ok: boolean;
  /** Each difference between the stored result and the one computed again, one sentence. */
  mismatches: string[];
  /** Locked: the stored canonical text still hashes to the lock hash; null for a draft. */
  hashOk: boolean | null;
  durationMs: number;
}
