import type { Response } from 'express';
import type { AppContext } from '../app-context.js';
import { computeServices } from '../compute/services.js';
import { Run } from '../db/entities/index.js';
import type { Actor } from '../http/route-table.js';
import { ACTIVE_STATUSES, loadVisibleRun } from './run-service.js';

/** How often a stream sends the run's progress while it is queued or running. */
export const EVENT_EVERY_MS = 200;

function send(res: Response, event: string, data: unknown): void {
  res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
}

/**
 * `GET /runs/:id/events`: a server-sent event stream. Sends `progress` {status, done, total,
 * phase} every 200 ms while the run is queued or running (the live value from the worker, else
 * the stored one), then one `end` {status, error} and closes. Resolves when the stream ends.
 */
export async function streamRunEvents(
  ctx: AppContext,
  actor: Actor,
  runId: string,
  res: Response,
): Promise<void> {
  await loadVisibleRun(ctx, actor, runId);
  const { executor } = computeServices(ctx);
  const repo = ctx.dataSource.getRepository(Run);
  res.status(200);
  res.set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  await new Promise<void>((resolve) => {
    let closed = false;
    let busy = false;
    const finish = () => {
      if (closed) return;
      closed = true;
      clearInterval(timer);
      res.end();
      resolve();
    };
    const tick = async () => {
      if (closed || busy) return;
      busy = true;
      try {
        const run = await repo.findOneBy({ id: runId });
        if (closed) return;
        if (!run) return finish();
        if ((ACTIVE_STATUSES as readonly string[]).includes(run.status)) {
          const live = executor.progressOf(runId);
          send(res, 'progress', {
            status: run.status,
            done: live?.done ?? run.progressDone,
            total: live?.total ?? run.progressTotal,
            phase: live?.phase ?? run.progressPhase,
            ...(live?.unit && { unit: live.unit }),
          });
        } else {
          send(res, 'end', { status: run.status, error: run.error });
          finish();
        }
      } catch {
        finish();
      } finally {
        busy = false;
      }
    };
    const timer = setInterval(() => void tick(), EVENT_EVERY_MS);
    res.on('close', finish);
    void tick();
  });
}
