import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';

/**
 * kill -9 of the built server during a stream of gas creations: after each kill every gas whose
 * creation was acknowledged (201) is in the database and `PRAGMA integrity_check` is ok. The
 * same database carries over all trials, so each restart also recovers from the previous kill.
 * Needs a prior build (`npm run build`, or tsc of shared and server).
 */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const TRIALS = 20;
const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-crash-'));
const dbFile = path.join(dir, 'traceloom.sqlite');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SPEC = {
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  step: '1',
  order: '6',
  nMax: 2,
  weights: { kind: 'formula', expression: 'q^L' },
};

async function start(): Promise<{ child: ChildProcess; baseUrl: string }> {
  const child = spawn(process.execPath, ['dist/server/main.js'], {
    cwd: root,
    env: {
      ...process.env,
      PORT: '0',
      TRACELOOM_DB: dbFile,
      TRACELOOM_MODE: 'demo',
      TRACELOOM_STATIC: '/nonexistent',
      TRACELOOM_RUN_THREADS: '1',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  const baseUrl = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${log}`)), 60_000);
    const onData = (chunk: Buffer) => {
      log += chunk.toString();
      const match = /serving on (http:\/\/localhost:\d+)/.exec(log);
      if (match) {
        clearTimeout(timer);
        resolve(match[1]!);
      }
    };
    child.stdout.on('data', onData);
    child.stderr.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited with ${code}:\n${log}`));
    });
  });
  return { child, baseUrl };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each test reads the answer it asked for
async function json(url: string, init: RequestInit = {}): Promise<{ status: number; body: any }> {
  const res = await fetch(url, {
    ...init,
    headers: { 'content-type': 'application/json', ...init.headers },
  });
  return { status: res.status, body: await res.json().catch(() => null) };
}

describe('kill -9 during writes', () => {
  it(`loses no acknowledged gas over ${TRIALS} trials, integrity ok each time`, async () => {
    const acknowledged: string[] = [];
    let attempted = 0;
    for (let trial = 1; trial <= TRIALS; trial++) {
      const { child, baseUrl } = await start();
      const login = await json(`${baseUrl}/api/auth/login`, {
        method: 'POST',
        body: JSON.stringify({ email: 'author@demo.test', password: 'traceloom-demo' }),
      });
      expect(login.status).toBe(200);
      const auth = { authorization: `Bearer ${login.body.token}` };
      const studies = await json(`${baseUrl}/api/studies`, { headers: auth });
      const studyId = studies.body[0].id as string;
      // Four writers in parallel; the kill lands at a random moment while they write.
      let killed = false;
      const writer = async () => {
        while (!killed) {
          attempted += 1;
          try {
            const res = await json(`${baseUrl}/api/studies/${studyId}/gases`, {
              method: 'POST',
              headers: auth,
              body: JSON.stringify({ spec: { ...SPEC, title: `trial ${trial} gas ${attempted}` } }),
            });
            if (res.status === 201) acknowledged.push(res.body.id);
          } catch {
            // the connection died with the server: not acknowledged
          }
        }
      };
      const before = acknowledged.length;
      const writers = [writer(), writer(), writer(), writer()];
      // Once writes are being acknowledged, kill at a random moment within the next 0.2-1 s.
      while (acknowledged.length === before) await new Promise((r) => setTimeout(r, 5));
      await new Promise((r) => setTimeout(r, 200 + Math.random() * 800));
      const exited = new Promise((r) => child.once('exit', r));
      child.kill('SIGKILL');
      killed = true;
      await exited;
      await Promise.all(writers);

      const db = new Database(dbFile);
      try {
        expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
        const present = new Set(
          (db.prepare('SELECT id FROM gas').all() as Array<{ id: string }>).map((r) => r.id),
        );
        const lost = acknowledged.filter((id) => !present.has(id));
        expect(lost, `trial ${trial}`).toEqual([]);
      } finally {
        db.close();
      }
    }
    console.log(
      `kill -9: ${TRIALS} trials, ${acknowledged.length} acknowledged gas creations of ${attempted} attempted, 0 lost, integrity ok`,
    );
    expect(acknowledged.length).toBeGreaterThan(TRIALS * 5);
  }, 400_000);
});
