import type { VerifyAnswerDto } from '@traceloom/shared/api';
import { In } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { recordAudit } from '../audit/record-audit.js';
import { Run } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import { loadVisibleDataset, withBytes } from './dataset-access.js';
import { sha256Hex } from './dataset-document.js';

/**
 * 429 `too_many_runs` when `actor` already holds the per-user cap of runs queued or running and
 * verifications waiting for or holding a run thread (the same cap `startRun` applies).
 */
async function assertRoom(ctx: AppContext, actor: Actor): Promise<void> {
  const cap = ctx.config.runs.perUserCap;
  const runs = await ctx.dataSource.getRepository(Run).countBy({
    createdBy: { id: actor.id },
    status: In(['queued', 'running']),
  });
  const open = runs + ctx.services.executor.jobsOf(actor.id);
  if (open >= cap) {
    throw new AppError(
      429,
      'too_many_runs',
      `You already have ${open} runs or verifications queued or running; the limit is ${cap}. Wait for one to finish.`,
    );
  }
}

/**
 * `POST /datasets/:id/verify`: computes the stored spec again with the engine and compares every
 * part of the result but timings with the stored one (numeric values within their combined
 * error, everything else exactly); for a locked dataset also checks that the stored canonical
 * text still hashes to the lock hash. The recomputation is a job of the run executor: it waits
 * in the runs' line, counts against the per-user cap and the fair share of the run threads, and
 * stops (out of the line, or its worker terminated) when `signal` aborts — the route aborts it
 * when the client disconnects. A locked dataset's answer is kept per dataset and hash, since its
 * bytes cannot change; the hash is checked again every time.
 */
export async function verifyDataset(
  ctx: AppContext,
  actor: Actor,
  datasetId: string,
  signal?: AbortSignal,
): Promise<VerifyAnswerDto> {
  const manager = ctx.dataSource.manager;
  const d = await withBytes(manager, await loadVisibleDataset(manager, actor, datasetId));
  const started = Date.now();
  const { executor, tasks, verifications } = ctx.services;
  const key = d.state === 'locked' && d.hash ? `${d.id}:${d.hash}` : null;
  let found = key ? verifications.get(key) : undefined;
  const cached = found !== undefined;
  if (!found) {
    await assertRoom(ctx, actor);
    const limitMs = ctx.config.runs.wallClockMs;
    // Parsing the snapshot, the computation and the comparison all happen in the worker.
    const { mismatches } = await executor.submit(
      actor.id,
      (jobSignal) =>
        tasks.runTask(
          'verify',
          { snapshot: d.snapshot },
          {
            signal: jobSignal,
            timeoutMs: limitMs,
            onTimeout: () =>
              new AppError(
                422,
                'too_heavy',
                `Verify stopped after the wall-clock limit of ${limitMs / 1000} s for one run.`,
              ),
            refused: (r) =>
              new AppError(
                422,
                'verify_failed',
                `The stored spec no longer computes: ${r.message}`,
              ),
          },
        ),
      signal,
    );
    found = mismatches;
    if (key) verifications.set(key, found);
  }
  const mismatches = [...found];
  const hashOk =
    d.state === 'locked' ? d.canonical !== null && sha256Hex(d.canonical) === d.hash : null;
  if (hashOk === false)
    mismatches.push('the stored canonical text no longer hashes to the lock hash');
  await ctx.dataSource.transaction((manager) =>
    recordAudit(manager, {
      actorId: actor.id,
      action: 'dataset.verify',
      targetType: 'dataset',
      targetId: d.id,
      detail: { ok: mismatches.length === 0, mismatches: mismatches.length, cached },
    }),
  );
  return { ok: mismatches.length === 0, mismatches, hashOk, durationMs: Date.now() - started };
}
