import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';
import type { ScryptParams } from '../config.js';

const SALT_BYTES = 16;
const KEY_BYTES = 32;

/** Memory scrypt needs is about 128 * N * r bytes; leave room above it. */
function maxmemFor({ N, r }: ScryptParams): number {
  return 256 * N * r;
}

function derive(password: string, salt: Buffer, params: ScryptParams): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(
      password.normalize('NFC'),
      salt,
      KEY_BYTES,
      { ...params, maxmem: maxmemFor(params) },
      (err, key) => (err ? reject(err) : resolve(key)),
    );
  });
}

/**
 * Hashes a password with scrypt and a fresh 16-byte salt. The result describes itself:
 * `scrypt$N$r$p$salt$hash` (salt and hash base64), so verification needs no outside settings
 * and the cost can be raised later without breaking stored hashes.
 */
export async function hashPassword(password: string, params: ScryptParams): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, params);
  return [
    'scrypt',
    params.N,
    params.r,
    params.p,
    salt.toString('base64'),
    key.toString('base64'),
  ].join('$');
}

/** Reads the parameters of a stored hash; `null` for anything that is not a scrypt hash. */
export function parsePasswordHash(
  stored: string,
): { params: ScryptParams; salt: Buffer; key: Buffer } | null {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return null;
  const [N, r, p] = parts.slice(1, 4).map(Number);
  if (![N, r, p].every((n) => Number.isSafeInteger(n) && n > 0)) return null;
  return {
    params: { N, r, p },
    salt: Buffer.from(parts[4], 'base64'),
    key: Buffer.from(parts[5], 'base64'),
  };
}

/**
 * True when `password` matches `stored` (compared in constant time). A stored value that is not
 * a scrypt hash (e.g. an invited person's unusable marker) never matches.
 */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parsed = parsePasswordHash(stored);
  if (!parsed) return false;
  const key = await derive(password, parsed.salt, parsed.params);
  return key.length === parsed.key.length && timingSafeEqual(key, parsed.key);
}

/** A stored value no password can match: for invited people until they set one. */
const UNUSABLE = 'unusable$';

export function unusablePasswordHash(): string {
  return `${UNUSABLE}${randomBytes(24).toString('base64')}`;
}

/** True for the marker of an invited account that has not set a password yet. */
export function isUnusablePasswordHash(stored: string): boolean {
  return stored.startsWith(UNUSABLE);
}
