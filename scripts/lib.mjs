// Small helpers shared by the start, test and bench scripts (plain Node, no dependencies).
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Runs a command in the repository root, inheriting stdio; exits the script if it fails. */
export function run(command, args, options = {}) {
  const started = Date.now();
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', ...options });
  if (result.status !== 0) {
    console.error(
      `\n✗ ${command} ${args.join(' ')} failed (exit ${result.status ?? result.signal})`,
    );
    process.exit(result.status ?? 1);
  }
  return Date.now() - started;
}

/** Installs dependencies with `npm ci` when node_modules is missing or older than the lockfile. */
export function ensureInstalled() {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return;
  console.log('› installing dependencies (npm ci)…');
  run('npm', ['ci', '--no-audit', '--no-fund']);
}

/** Builds the computation library, the server and (unless skipped) the client. */
export function buildAll({ client = true } = {}) {
  console.log('› building shared/ and server/…');
  run('npx', ['tsc', '-p', 'shared/tsconfig.json']);
  run('npx', ['tsc', '-p', 'server/tsconfig.json']);
  run(process.execPath, ['scripts/bundle-cli.mjs']);
  if (client) {
    console.log('› building the client…');
    run('npx', ['ng', 'build', 'traceloom'], {
      env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
    });
  }
}
