import type { Progress } from '@traceloom/shared/engine';
import type { RunSummary } from '@traceloom/shared/api';
import type { Run } from '../db/entities/index.js';
import { personRef } from '../gases/gas-dto.js';

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
