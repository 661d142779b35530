import { rmSync } from 'node:fs';
import type { DataSource } from 'typeorm';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp, type TraceloomApp } from '../app.js';
import { GasVersion, Run } from '../db/entities/index.js';
import { openDatabase } from '../db/open-database.js';
import { createGas } from '../testing/gas-fixtures.js';
import { createTestApp, insertStudy, insertUser, tokenFor } from '../testing/test-app.js';
import { INTERRUPTED } from './run-executor.js';

let reopened: DataSource | null = null;
let restarted: TraceloomApp | null = null;
let dir = '';
afterAll(async () => {
  await restarted?.close();
  await reopened?.destroy();
  rmSync(dir, { recursive: true, force: true });
});

describe('restart recovery', () => {
  it('resumes queued runs, re-queues an interrupted one once, and fails a twice-interrupted one with the reason', async () => {
    const t = await createTestApp();
    dir = t.dir;
    const author = await insertUser(t, 'author');
    const gasId = await createGas(t, await tokenFor(t, author), await insertStudy(t, author));
    const version = await t.dataSource
      .getRepository(GasVersion)
      .findOneByOrFail({ gas: { id: gasId } });
    // Rows as a server killed mid-work leaves them (stored directly: no executor knows them).
    const repo = t.dataSource.getRepository(Run);
    const row = (status: Run['status'], requeues: number) =>
      repo.save({
        gas: { id: gasId },
        gasVersion: { id: version.id },
        status,
        requeues,
        startedAt: status === 'running' ? new Date().toISOString() : null,
        createdBy: { id: author.id },
        createdAt: new Date().toISOString(),
      });
    const queued = await row('queued', 0);
    const running = await row('running', 0);
    const retried = await row('running', 1);
    await t.services.close();
    await t.dataSource.destroy();

    reopened = await openDatabase(t.config.databasePath);
    restarted = await createApp({ dataSource: reopened, config: t.config });
    const runs = reopened.getRepository(Run);
    // One person's runs take one thread at a time (fair share), so the two resumed runs go in turn.
    const until = Date.now() + 90_000;
    let states: Run[] = [];
    while (Date.now() < until) {
      states = await Promise.all(
        [queued, running, retried].map((r) => runs.findOneByOrFail({ id: r.id })),
      );
      if (states.every((s) => ['done', 'failed', 'cancelled'].includes(s.status))) break;
      await new Promise((r) => setTimeout(r, 50));
    }
    const [q, r, twice] = states;
    expect(q!.status, q!.error ?? '').toBe('done');
    expect(r!.status, r!.error ?? '').toBe('done');
    expect(r!.requeues).toBe(1);
    expect(twice!.status).toBe('failed');
    expect(twice!.error).toBe(INTERRUPTED);
    const audit = await reopened.query(
      `SELECT action FROM audit_event WHERE target_id IN (?, ?) ORDER BY created_at`,
      [running.id, retried.id],
    );
    expect(audit.map((a: { action: string }) => a.action).sort()).toEqual([
      'run.fail',
      'run.finish',
      'run.requeue',
    ]);
  }, 120_000);
});
