import { randomBytes } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { Setting } from './entities/index.js';

const TOKEN_SECRET_KEY = 'auth.token_secret';

/**
 * The token signing secret: 32 random bytes (256 bits) from the operating system's secure
 * source, created on first start and kept in the database, never in the repository.
 */
export async function ensureTokenSecret(dataSource: DataSource): Promise<Buffer> {
  const repo = dataSource.getRepository(Setting);
  const existing = await repo.findOneBy({ key: TOKEN_SECRET_KEY });
  if (existing) return Buffer.from(existing.value, 'base64');
  const secret = randomBytes(32);
  // INSERT OR IGNORE: two processes starting together keep one secret.
  await repo
    .createQueryBuilder()
    .insert()
    .values({ key: TOKEN_SECRET_KEY, value: secret.toString('base64') })
    .orIgnore()
    .execute();
  const stored = await repo.findOneByOrFail({ key: TOKEN_SECRET_KEY });
  return Buffer.from(stored.value, 'base64');
}
