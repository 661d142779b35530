import type { ComputeResult, GasSpec, Progress } from '@traceloom/shared/engine';
import type { Run } from '../db/entities/index.js';
import { personRef, type PersonRef } from '../gases/gas-dto.js';

/** A run's progress as the API gives it. */
export interface RunProgress {
  done: number;
  total: number;
  phase: string;
  /** What done and total count (cycle types, products), while the worker reports it live. */
  unit?: string;
}

/** One line of a gas's run list. */
export interface RunSummary {
  id: string;
  gasId: string;
  gasVersion: number;
  status: Run['status'];
  progress: RunProgress;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  durationMs: number | null;
  createdBy: PersonRef;
  error: string | null;
}

/** The result as a run answer carries it: class rows only on request. */
export type RunResult = Omit<ComputeResult, 'classes'> & { classes?: ComputeResult['classes'] };

/** A run with its spec and (when done) its result. */
export interface RunDto extends RunSummary {
  studyId: string;
  spec: GasSpec;
  result: RunResult | null;
  classCounts?: Record<string, number>;
  /** Stored pages of class rows per N (`?classes=N&classPage=k` reads one). */
  classPages?: Record<string, number>;
}

/** A run loaded with `gas`, `gasVersion`, `createdBy`; `live` overrides the stored progress. */
export function toRunSummary(run: Run, live: Progress | null = null): RunSummary {
  return {
    id: run.id,
    gasId: run.gas.id,
    gasVersion: run.gasVersion.version,
    status: run.status,
    progress: live
      ? {
          done: live.done,
          total: live.total,
          phase: live.phase,
          ...(live.unit && { unit: live.unit }),
        }
      : { done: run.progressDone, total: run.progressTotal, phase: run.progressPhase },
    createdAt: run.createdAt,
    startedAt: run.startedAt,
    finishedAt: run.finishedAt,
    durationMs: run.durationMs,
    createdBy: personRef(run.createdBy),
    error: run.error,
  };
}
