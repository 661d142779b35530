import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Role } from '@traceloom/shared/api';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { createApp } from '../app.js';
import type { AppServices } from '../app-services.js';
import { hashPassword } from '../auth/password.js';
import { keysFromFile } from '../auth/token-keys.js';
import { signToken } from '../auth/tokens.js';
import { DEFAULT_CONFIG, type ServerConfig } from '../config.js';
import { Study, StudyMember, User } from '../db/entities/index.js';
import { openDatabase } from '../db/open-database.js';

/**
 * Lower scrypt cost for test speed only (an explicit option; password.spec.ts keeps a test at
 * the production parameters).
 */
export const TEST_SCRYPT = { N: 2 ** 10, r: 8, p: 1 };

/** Password every test user gets. */
export const TEST_PASSWORD = 'correct horse battery staple';

/** A running test app over its own temporary SQLite file. */
export interface TestApp {
  app: Express;
  /** The app's services (pools, executor, mailer), closed by `close()`. */
  services: AppServices;
  dataSource: DataSource;
  config: ServerConfig;
  dir: string;
  close(): Promise<void>;
}

/** Builds an app on a fresh migrated database in the OS temp directory. */
export async function createTestApp(
  overrides: Partial<ServerConfig> = {},
  log: (err: unknown) => void = () => {},
): Promise<TestApp> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-test-'));
  const config: ServerConfig = {
    ...DEFAULT_CONFIG,
    mode: 'test',
    staticDir: null,
    scrypt: TEST_SCRYPT,
    databasePath: path.join(dir, 'test.sqlite'),
    keyFile: path.join(dir, 'traceloom.key'),
    ...overrides,
  };
  const dataSource = await openDatabase(config.databasePath);
  const built = await createApp({ dataSource, config, log });
  return {
    app: built.app,
    services: built.services,
    dataSource,
    config,
    dir,
    async close() {
      await built.close();
      await dataSource.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

let counter = 0;

/** Inserts a user with `TEST_PASSWORD` (hashed at the app's cost); returns the row. */
export async function insertUser(
  t: TestApp,
  role: Role,
  extra: Partial<Pick<User, 'email' | 'displayName' | 'disabled'>> = {},
): Promise<User> {
  counter += 1;
  const users = t.dataSource.getRepository(User);
  return users.save(
    users.create({
      email: `${role}-${counter}@example.test`,
      displayName: `Test ${role} ${counter}`,
      role,
      passwordHash: await hashPassword(TEST_PASSWORD, t.config.scrypt),
      tokenVersion: 0,
      disabled: false,
      createdAt: new Date().toISOString(),
      ...extra,
    }),
  );
}

/** The app's current signing key (the explicit one, else the test's own key file). */
export function tokenSecretOf(t: TestApp): Buffer {
  return (t.config.tokenKeys ?? keysFromFile(t.config.keyFile)).current;
}

/** A valid bearer token for `user` at their current token version. */
export async function tokenFor(t: TestApp, user: Pick<User, 'id'>): Promise<string> {
  const row = await t.dataSource.getRepository(User).findOneByOrFail({ id: user.id });
  return signToken({ sub: row.id, tv: row.tokenVersion, role: row.role }, tokenSecretOf(t), 600)
    .token;
}

/** Inserts a study owned by `owner` with `members`; returns its id. */
export async function insertStudy(
  t: TestApp,
  owner: Pick<User, 'id'>,
  members: ReadonlyArray<Pick<User, 'id'>> = [],
): Promise<string> {
  const now = new Date().toISOString();
  const study = await t.dataSource.getRepository(Study).save({
    title: `Study ${++counter}`,
    description: '',
    owner: { id: owner.id },
    createdAt: now,
    updatedAt: now,
  });
  for (const member of members) {
    await t.dataSource
      .getRepository(StudyMember)
      .insert({ study: { id: study.id }, user: { id: member.id }, addedAt: now });
  }
  return study.id;
}
