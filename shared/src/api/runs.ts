import { z } from 'zod';
import type { ComputeResult } from '../engine/result.js';
import type { RunEstimate } from '../engine/estimate.js';
import type { GasSpec } from '../engine/spec/schema.js';
import type { PersonRef } from './people.js';

/** Where a run is in its life. */
export const RUN_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;

/** Where a run is in its life. */
export type RunStatus = (typeof RUN_STATUSES)[number];

/** True while a run may still change (queued or running). */
export function isActive(status: RunStatus): status is 'queued' | 'running' {
  return status === 'queued' || status === 'running';
}

/** Body of `POST /api/gases/:id/runs`: the version to run (default: the latest). */
export const runStartSchema = z.strictObject({
  version: z
    .number({ error: 'must be a version number' })
    .int({ error: 'must be a whole number' })
    .min(1, { error: 'must be at least 1' })
    .optional(),
});

/** Parsed run start body. */
export type RunStartRequest = z.infer<typeof runStartSchema>;

/** A run's progress as the API gives it. */
export interface RunProgress {
  done: number;
  total: number;
  /** The engine's phase name; empty before the worker reported one. */
  phase: string;
  /** What done and total count (cycle types, products), while the worker reports it live. */
  unit?: string;
}

/** One line of a gas's run list (`GET /api/gases/:id/runs`). */
export interface RunSummary {
  id: string;
  gasId: string;
  gasVersion: number;
  status: RunStatus;
  progress: RunProgress;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  durationMs: number | null;
  createdBy: PersonRef;
  /** Why a run failed, one sentence (`field: message` when the engine named a field). */
  error: string | null;
}

/** The result as a run answer carries it: class rows only on request (`?classes=N`). */
export type RunResult = Omit<ComputeResult, 'classes'> & { classes?: ComputeResult['classes'] };

/** A run with its spec and (when done) its result (`GET /api/runs/:id`). */
export interface RunDto extends RunSummary {
  studyId: string;
  spec: GasSpec;
  result: RunResult | null;
  /** Cycle types per N of the class table (given when `?classes` is not asked for). */
  classCounts?: Record<string, number>;
  /** Stored pages of class rows per N (`?classes=N&classPage=k` reads one). */
  classPages?: Record<string, number>;
}

/** A run's estimate with what the server makes of it against the run limits. */
export interface RunEstimateDto {
  estimate: RunEstimate;
  /** Sentences shown before the run: the order is too low for some rows, the run may be slow. */
  warnings: string[];
  /** Why a run of this gas would be refused (the class table would not fit), or null. */
  refusal: { field: string; message: string } | null;
}

/** What `POST /api/gases/:id/runs` answers (202): the queued run and its estimate. */
export interface RunStarted {
  id: string;
  status: 'queued';
  warnings: string[];
  estimate: RunEstimate;
}

/** The data of a `progress` server-sent event of `GET /api/runs/:id/events`. */
export interface RunProgressEvent {
  status: 'queued' | 'running';
  done: number;
  total: number;
  phase: string;
  unit?: string;
}

/** The data of the `end` event: the run's final status and error. */
export interface RunEndEvent {
  status: RunStatus;
  error: string | null;
}

/** One server-sent event of a run as a client reads it: progress while it works, then the end. */
export type RunEvent = ({ type: 'progress' } & RunProgressEvent) | ({ type: 'end' } & RunEndEvent);
