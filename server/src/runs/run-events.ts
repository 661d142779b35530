import type { Response } from 'express';
import { In, type DataSource } from 'typeorm';
import type { AppContext } from '../app-context.js';
import { Run, User } from '../db/entities/index.js';
import { AppError } from '../http/app-error.js';
import type { Actor } from '../http/route-table.js';
import type { RunExecutor } from './run-executor.js';
import { loadVisibleRun } from './run-service.js';

/** How often a run's publisher sends its progress while it is queued or running. */
export const EVENT_EVERY_MS = 200;

/** How often open streams are checked against token expiry and revocation (one query for all). */
export const STREAM_SWEEP_MS = 1000;

/** What the stream's token says: its version (revocation) and expiry (seconds since 1970). */
export interface StreamToken {
  tv: number;
  exp: number;
}

interface Stream {
  userId: string;
  token: StreamToken;
  res: Response;
  close: () => void;
}

interface Publisher {
  streams: Set<Stream>;
  timer: NodeJS.Timeout;
}

function send(res: Response, event: string, data: unknown): void {
  res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
}

/**
 * The server-sent progress of runs: one in-memory publisher per watched run (a 200 ms timer
 * reading the executor's live state, never the database), fanning out to every open stream of
 * that run. Streams are capped per person and in total; a sweep every second closes the streams
 * whose token expired or was revoked (sign-out, role change, disabling) with one query for all.
 */
export class RunEventHub {
  private readonly publishers = new Map<string, Publisher>();
  private readonly perUser = new Map<string, number>();
  private total = 0;
  private sweeper: NodeJS.Timeout | null = null;

  constructor(
    private readonly dataSource: DataSource,
    private readonly executor: RunExecutor,
    private readonly limits: { streamsPerUser: number; streamsTotal: number },
  ) {
    executor.onEnd((runId, status, error) => this.end(runId, { status, error }));
  }

  /** Runs with a publisher now (one per watched run, however many streams watch it). */
  watchedRuns(): number {
    return this.publishers.size;
  }

  /** Streams open now (all, or one person's). */
  openStreams(userId?: string): number {
    return userId === undefined ? this.total : (this.perUser.get(userId) ?? 0);
  }

  /** 429 `too_many_streams` when the actor or the server already holds its cap of streams. */
  assertRoom(actor: Actor): void {
    const mine = this.perUser.get(actor.id) ?? 0;
    if (mine >= this.limits.streamsPerUser || this.total >= this.limits.streamsTotal) {
      const which =
        mine >= this.limits.streamsPerUser
          ? `you have ${mine} open; the limit is ${this.limits.streamsPerUser} per person`
          : `the server has ${this.total} open; the limit is ${this.limits.streamsTotal}`;
      throw new AppError(429, 'too_many_streams', `Too many progress streams: ${which}.`);
    }
  }

  /** Opens a stream of `runId` (already checked visible) on `res`; resolves when it closes. */
  async open(actor: Actor, token: StreamToken, run: Run, res: Response): Promise<void> {
    this.assertRoom(actor);
    res.status(200);
    res.set({
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-cache, no-transform',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    res.flushHeaders();
    if (!this.executor.stateOf(run.id)) {
      send(res, 'end', { status: run.status, error: run.error });
      res.end();
      return;
    }
    await new Promise<void>((resolve) => {
      let closed = false;
      const stream: Stream = {
        userId: actor.id,
        token,
        res,
        close: () => {
          if (closed) return;
          closed = true;
          this.detach(run.id, stream);
          res.end();
          resolve();
        },
      };
      this.attach(run.id, stream);
      res.on('close', stream.close);
      this.tick(run.id);
    });
  }

  /** Closes every stream (server shutdown). */
  stop(): void {
    for (const publisher of [...this.publishers.values()]) {
      for (const stream of [...publisher.streams]) stream.close();
    }
  }

  private attach(runId: string, stream: Stream): void {
    let publisher = this.publishers.get(runId);
    if (!publisher) {
      publisher = {
        streams: new Set(),
        timer: setInterval(() => this.tick(runId), EVENT_EVERY_MS),
      };
      this.publishers.set(runId, publisher);
    }
    publisher.streams.add(stream);
    this.perUser.set(stream.userId, (this.perUser.get(stream.userId) ?? 0) + 1);
    this.total += 1;
    this.sweeper ??= setInterval(() => void this.sweep(), STREAM_SWEEP_MS);
  }

  private detach(runId: string, stream: Stream): void {
    const publisher = this.publishers.get(runId);
    if (!publisher?.streams.delete(stream)) return;
    const left = (this.perUser.get(stream.userId) ?? 1) - 1;
    if (left > 0) this.perUser.set(stream.userId, left);
    else this.perUser.delete(stream.userId);
    this.total -= 1;
    if (publisher.streams.size === 0) {
      clearInterval(publisher.timer);
      this.publishers.delete(runId);
    }
    if (this.total === 0 && this.sweeper) {
      clearInterval(this.sweeper);
      this.sweeper = null;
    }
  }

  /** Sends the live progress; a run the executor no longer holds ends from its stored row. */
  private tick(runId: string): void {
    const publisher = this.publishers.get(runId);
    if (!publisher) return;
    const state = this.executor.stateOf(runId);
    if (state) {
      for (const stream of publisher.streams) send(stream.res, 'progress', state);
      return;
    }
    void this.dataSource
      .getRepository(Run)
      .findOne({ where: { id: runId }, select: { id: true, status: true, error: true } })
      .then((run) =>
        this.end(runId, { status: run?.status ?? 'failed', error: run?.error ?? null }),
      )
      .catch(() => this.end(runId, { status: 'failed', error: null }));
  }

  private end(runId: string, data: { status: string; error: string | null }): void {
    const publisher = this.publishers.get(runId);
    if (!publisher) return;
    for (const stream of [...publisher.streams]) {
      send(stream.res, 'end', data);
      stream.close();
    }
  }

  /** Closes streams whose token has expired or whose person's tokens were revoked. */
  private async sweep(): Promise<void> {
    const streams = [...this.publishers.values()].flatMap((p) => [...p.streams]);
    if (streams.length === 0) return;
    const now = Date.now() / 1000;
    const ids = [...new Set(streams.map((s) => s.userId))];
    const users = await this.dataSource.getRepository(User).find({
      where: { id: In(ids) },
      select: { id: true, tokenVersion: true, disabled: true },
    });
    const byId = new Map(users.map((u) => [u.id, u]));
    for (const stream of streams) {
      const user = byId.get(stream.userId);
      const revoked = !user || user.disabled || user.tokenVersion !== stream.token.tv;
      const expired = stream.token.exp <= now;
      if (!revoked && !expired) continue;
      send(stream.res, 'closed', { reason: expired ? 'token expired' : 'token revoked' });
      stream.close();
    }
  }
}

/**
 * `GET /runs/:id/events`: a server-sent event stream of one run. Sends `progress` {status, done,
 * total, phase} every 200 ms while the run is queued or running, then one `end` {status, error}
 * and closes; `closed` {reason} when the token expires or is revoked first. Resolves when the
 * stream ends.
 */
export async function streamRunEvents(
  ctx: AppContext,
  actor: Actor,
  token: StreamToken,
  runId: string,
  res: Response,
): Promise<void> {
  const { events } = ctx.services;
  events.assertRoom(actor); // refused before any database read
  const run = await loadVisibleRun(ctx, actor, runId);
  await events.open(actor, token, run, res);
}
