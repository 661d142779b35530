import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

const serverDir = fileURLToPath(new URL('..', import.meta.url));
const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-main-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Starts main.ts (through tsx) with `env`; resolves with the child and its output so far. */
function start(env: Record<string, string>) {
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', path.join(serverDir, 'src', 'main.ts')],
    {
      env: { ...process.env, TSX_TSCONFIG_PATH: path.join(serverDir, 'tsconfig.dev.json'), ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  let output = '';
  child.stdout.on('data', (chunk) => (output += chunk));
  child.stderr.on('data', (chunk) => (output += chunk));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  const serving = new Promise<number>((resolve, reject) => {
    child.stdout.on('data', () => {
      const match = /serving on http:\/\/localhost:(\d+)/.exec(output);
      if (match) resolve(Number(match[1]));
    });
    exited.then(() => reject(new Error(`exited early: ${output}`)));
  });
  serving.catch(() => {}); // a test that expects an early exit does not await it
  return { child, serving, exited, output: () => output };
}

describe('main', () => {
  it('migrates, seeds in demo mode, serves on the real port for PORT=0, and stops on SIGTERM', async () => {
    const server = start({
      PORT: '0',
      TRACELOOM_MODE: 'demo',
      TRACELOOM_DB: path.join(dir, 'demo.sqlite'),
      TRACELOOM_STATIC: path.join(dir, 'no-client'),
    });
    const port = await server.serving;
    expect(port).toBeGreaterThan(0);
    const health = await fetch(`http://localhost:${port}/api/health`);
    expect(await health.json()).toEqual({
      status: 'ok',
      version: '0.1.0',
      database: 'ok',
      mode: 'demo',
    });
    const login = await fetch(`http://localhost:${port}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'steward@demo.test', password: 'traceloom-demo' }),
    });
    expect(login.status).toBe(200);
    expect(server.output()).toContain('Demo sign-in: author@demo.test');
    expect(server.output()).toContain('traceloom-demo');
    server.child.kill('SIGTERM');
    expect(await server.exited).toBe(0);
  }, 90_000);

  it('refuses a bad PORT with a one-line message and exit code 1', async () => {
    const server = start({ PORT: 'eighty', TRACELOOM_DB: path.join(dir, 'bad.sqlite') });
    expect(await server.exited).toBe(1);
    expect(server.output().trim()).toBe(
      'Traceloom could not start: PORT must be an integer from 0 to 65535, got "eighty"',
    );
  }, 60_000);
});
