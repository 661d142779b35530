import { createHash, randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';

/** The signing keys: the first signs, every one verifies (older keys stay for a rotation). */
export interface TokenKeys {
  current: Buffer;
  all: readonly Buffer[];
}

/** Fewest bytes a signing key may have (256 bits, for HS256). */
export const MIN_KEY_BYTES = 32;

/** Keys kept in a key file after a rotation: the new one and this many before it. */
export const KEPT_PREVIOUS_KEYS = 2;

/** The `kid` header a token signed with `key` carries: 16 hex digits of its SHA-256. */
export function keyId(key: Buffer): string {
  return createHash('sha256').update(key).digest('hex').slice(0, 16);
}

/** One key from base64 (or base64url) text; throws naming `where` when it is too short. */
export function parseKey(text: string, where: string): Buffer {
  const key = Buffer.from(text.trim(), 'base64');
  if (key.length < MIN_KEY_BYTES) {
    throw new Error(`${where}: a signing key must be at least ${MIN_KEY_BYTES} bytes of base64`);
  }
  return key;
}

function keysOf(list: Buffer[]): TokenKeys {
  return { current: list[0]!, all: list };
}

function readKeyFile(file: string): Buffer[] {
  const mode = statSync(file).mode & 0o777;
  if ((mode & 0o077) !== 0) {
    throw new Error(
      `${file}: the key file is readable by others (mode ${mode.toString(8)}); run chmod 600 on it`,
    );
  }
  const lines = readFileSync(file, 'utf8')
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line !== '' && !line.startsWith('#'));
  if (lines.length === 0) throw new Error(`${file}: the key file holds no key`);
  return lines.map((line, i) => parseKey(line, `${file} line ${i + 1}`));
}

function writeKeyFile(file: string, keys: readonly Buffer[], flag: 'wx' | 'w'): void {
  mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const text = [
    '# Traceloom token signing keys: the first signs, all verify. Keep this file private.',
    ...keys.map((k) => k.toString('base64')),
    '',
  ].join('\n');
  writeFileSync(file, text, { mode: 0o600, flag });
  chmodSync(file, 0o600);
}

/**
 * The signing keys from the environment, or null when `TRACELOOM_TOKEN_SECRET` is unset:
 * `TRACELOOM_TOKEN_SECRET` (base64) signs, `TRACELOOM_TOKEN_SECRETS_PREVIOUS` (comma-separated
 * base64) are still accepted after a rotation.
 */
export function keysFromEnv(env: NodeJS.ProcessEnv): TokenKeys | null {
  const fromEnv = env.TRACELOOM_TOKEN_SECRET;
  if (!fromEnv) return null;
  const previous = (env.TRACELOOM_TOKEN_SECRETS_PREVIOUS ?? '')
    .split(',')
    .filter((s) => s.trim() !== '')
    .map((s, i) => parseKey(s, `TRACELOOM_TOKEN_SECRETS_PREVIOUS item ${i + 1}`));
  return keysOf([parseKey(fromEnv, 'TRACELOOM_TOKEN_SECRET'), ...previous]);
}

/**
 * The signing keys from the key file (one base64 key per line, the first signs), created on
 * first start with 32 random bytes and mode 600. Never from the database. A key file others may
 * read is refused.
 */
export function keysFromFile(keyFile: string): TokenKeys {
  if (!existsSync(keyFile)) {
    try {
      writeKeyFile(keyFile, [randomBytes(MIN_KEY_BYTES)], 'wx');
    } catch (err) {
      // Another process created it first: read theirs.
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    }
  }
  return keysOf(readKeyFile(keyFile));
}

/**
 * Rotates the key file: a new random key signs from the next start; the previous
 * `KEPT_PREVIOUS_KEYS` still verify, so tokens and invitation links already out keep working
 * until they expire. Returns the new key's id.
 */
export function rotateKeyFile(keyFile: string): string {
  const old = existsSync(keyFile) ? readKeyFile(keyFile) : [];
  const fresh = randomBytes(MIN_KEY_BYTES);
  writeKeyFile(keyFile, [fresh, ...old.slice(0, KEPT_PREVIOUS_KEYS)], 'w');
  return keyId(fresh);
}

/**
 * Removes the signing secret older servers kept in the database, so a copy of the database can
 * no longer mint tokens.
 */
export async function forgetDatabaseSecret(dataSource: DataSource): Promise<void> {
  await dataSource.query(`DELETE FROM "setting" WHERE "key" = 'auth.token_secret'`);
}
