import { describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG, PRODUCTION_SCRYPT } from '../config.js';
import {
  hashPassword,
  parsePasswordHash,
  unusablePasswordHash,
  verifyPassword,
} from './password.js';

describe('password hashing', () => {
  it('uses N = 2^17, r = 8, p = 1 outside tests (OWASP Password Storage Cheat Sheet)', () => {
    expect(PRODUCTION_SCRYPT).toEqual({ N: 131072, r: 8, p: 1 });
    expect(DEFAULT_CONFIG.scrypt).toBe(PRODUCTION_SCRYPT);
  });

  it('stores the real parameters, a 16-byte salt and verifies a 64-character password untruncated', async () => {
    const password = 'p'.repeat(63) + 'Z';
    const stored = await hashPassword(password, PRODUCTION_SCRYPT);
    expect(stored).toMatch(/^scrypt\$131072\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    const parsed = parsePasswordHash(stored)!;
    expect(parsed.params).toEqual(PRODUCTION_SCRYPT);
    expect(parsed.salt).toHaveLength(16);
    expect(parsed.key).toHaveLength(32);
    expect(await verifyPassword(password, stored)).toBe(true);
    // Differs only in the 64th character, or is the 63-character prefix: both refused.
    expect(await verifyPassword('p'.repeat(64), stored)).toBe(false);
    expect(await verifyPassword('p'.repeat(63), stored)).toBe(false);
  }, 60_000);

  it('salts every hash afresh', async () => {
    const params = { N: 1024, r: 8, p: 1 };
    const [a, b] = await Promise.all([hashPassword('same', params), hashPassword('same', params)]);
    expect(a).not.toBe(b);
    expect(await verifyPassword('same', a)).toBe(true);
    expect(await verifyPassword('same', b)).toBe(true);
  });

  it('verifies a 1024-character password and tells it from one differing in the last character', async () => {
    const params = { N: 1024, r: 8, p: 1 };
    const long = 'x'.repeat(1023) + 'a';
    const stored = await hashPassword(long, params);
    expect(await verifyPassword(long, stored)).toBe(true);
    expect(await verifyPassword('x'.repeat(1023) + 'b', stored)).toBe(false);
  });

  it('never matches an unusable or malformed stored value', async () => {
    expect(await verifyPassword('', unusablePasswordHash())).toBe(false);
    expect(await verifyPassword('a', 'scrypt$0$8$1$AA==$AA==')).toBe(false);
    expect(await verifyPassword('a', 'plain-text')).toBe(false);
  });
});
