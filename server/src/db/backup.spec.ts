import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../app.js';
import type { User } from '../db/entities/index.js';
import { api, lockedDataset, warmWorkers } from '../testing/dataset-fixtures.js';
import {
  createTestApp,
  insertStudy,
  insertUser,
  tokenFor,
  type TestApp,
} from '../testing/test-app.js';
import { backupDatabase, restoreDatabase } from './backup.js';
import { backupName, pruneBackups, scheduledBackup } from './backup-schedule.js';
import { openDatabase } from './open-database.js';

// Durability and backup (issue finding 11), replayed on a serving app.
let t: TestApp;
let author: User;
let reviewer: User;
let steward: User;
let studyId: string;

beforeAll(async () => {
  t = await createTestApp();
  author = await insertUser(t, 'author');
  reviewer = await insertUser(t, 'reviewer');
  steward = await insertUser(t, 'steward');
  studyId = await insertStudy(t, author, [reviewer, steward]);
  await warmWorkers(t, author);
});
afterAll(() => t.close());

const newStudy = async (title: string): Promise<string> =>
  (await api(t, author, 'post', '/studies', { title }, 201)).id;

describe('durability', () => {
  it('commits with synchronous = FULL (2), in WAL mode', async () => {
    expect(await t.dataSource.query('PRAGMA synchronous')).toEqual([{ synchronous: 2 }]);
    expect(await t.dataSource.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
  });
});

describe('backup and restore', () => {
  it('keeps every write acknowledged before the backup started, while writes go on', async () => {
    const acknowledged: string[] = [];
    for (let i = 0; i < 20; i++) acknowledged.push(await newStudy(`before ${i}`));
    // Writes keep arriving during the backup.
    let writing = true;
    const during = (async () => {
      let i = 0;
      while (writing) await newStudy(`during ${i++}`);
      return i;
    })();
    const file = path.join(t.dir, 'live-backup.sqlite');
    const report = await backupDatabase(t.config.databasePath, file);
    writing = false;
    expect(await during).toBeGreaterThan(0);
    expect(report.bytes).toBeGreaterThan(0);
    expect(existsSync(`${file}.partial`)).toBe(false);

    const restoredPath = path.join(t.dir, 'restored', 'db.sqlite');
    mkdirSync(path.dirname(restoredPath), { recursive: true });
    expect(restoreDatabase(file, restoredPath)).toBeNull();
    const restored = new Database(restoredPath, { readonly: true });
    try {
      const ids = new Set(
        (restored.prepare('SELECT id FROM study').all() as Array<{ id: string }>).map((r) => r.id),
      );
      for (const id of acknowledged) expect(ids.has(id), id).toBe(true);
      expect(restored.pragma('integrity_check', { simple: true })).toBe('ok');
    } finally {
      restored.close();
    }
  });

  it('restores a locked dataset that still verifies and is still public', async () => {
    const locked = await lockedDataset(t, { author, reviewer, steward }, studyId);
    const file = path.join(t.dir, 'locked-backup.sqlite');
    await backupDatabase(t.config.databasePath, file);
    const restoredPath = path.join(t.dir, 'restored-locked', 'db.sqlite');
    mkdirSync(path.dirname(restoredPath), { recursive: true });
    restoreDatabase(file, restoredPath);
    const dataSource = await openDatabase(restoredPath);
    const built = await createApp({
      dataSource,
      config: { ...t.config, databasePath: restoredPath },
    });
    const app = built.app;
    try {
      const verified = await request(app)
        .post(`/api/datasets/${locked.id}/verify`)
        .set('Authorization', `Bearer ${await tokenFor(t, steward)}`)
        .expect(200);
      expect(verified.body).toMatchObject({ ok: true, hashOk: true, mismatches: [] });
      const open = await request(app).get(`/api/public/datasets/${locked.hash}`).expect(200);
      expect(open.body.hash).toBe(locked.hash);
    } finally {
      await built.close();
      await dataSource.destroy();
    }
  });

  it('refuses to restore over a database in use, a damaged copy and a newer copy', async () => {
    const file = path.join(t.dir, 'refusals.sqlite');
    await backupDatabase(t.config.databasePath, file);
    // The serving app has its database open.
    expect(() => restoreDatabase(file, t.config.databasePath)).toThrow(
      /is in use: stop the Traceloom server/,
    );
    const junk = path.join(t.dir, 'junk.sqlite');
    writeFileSync(junk, Buffer.alloc(8192, 7));
    const target = path.join(t.dir, 'target', 'db.sqlite');
    mkdirSync(path.dirname(target), { recursive: true });
    expect(() => restoreDatabase(junk, target)).toThrow(/junk\.sqlite/);
    const newer = path.join(t.dir, 'newer.sqlite');
    await backupDatabase(t.config.databasePath, newer);
    const db = new Database(newer);
    db.prepare('INSERT INTO migrations (timestamp, name) VALUES (?, ?)').run(
      9999999999999,
      'FromTheFuture9999999999999',
    );
    db.close();
    expect(() => restoreDatabase(newer, target)).toThrow(/FromTheFuture9999999999999 is unknown/);
    expect(existsSync(target)).toBe(false);
  });

  it('keeps the database a restore replaces', async () => {
    const file = path.join(t.dir, 'replace.sqlite');
    await backupDatabase(t.config.databasePath, file);
    const target = path.join(t.dir, 'replace-target', 'db.sqlite');
    mkdirSync(path.dirname(target), { recursive: true });
    restoreDatabase(file, target);
    const kept = restoreDatabase(file, target, new Date('2026-12-02T18:00:00Z'));
    expect(kept).toBe(`${target}.before-restore-2026-12-02T18-00-00-000Z`);
    expect(existsSync(kept!)).toBe(true);
  });

  it('scheduled backups are named by time and only the newest are kept', async () => {
    const dir = path.join(t.dir, 'scheduled');
    const schedule = { dir, everyHours: 24, keep: 2 };
    for (const hour of [1, 2, 3]) {
      await scheduledBackup(t.config.databasePath, schedule, new Date(Date.UTC(2026, 11, 2, hour)));
    }
    expect(readdirSync(dir).sort()).toEqual([
      'traceloom-20261202T020000Z.sqlite',
      'traceloom-20261202T030000Z.sqlite',
    ]);
    expect(backupName(new Date('2026-12-02T18:30:05.123Z'))).toBe(
      'traceloom-20261202T183005Z.sqlite',
    );
    writeFileSync(path.join(dir, 'notes.txt'), 'kept: not a scheduled backup');
    expect(pruneBackups(dir, 1)).toEqual(['traceloom-20261202T020000Z.sqlite']);
    expect(readdirSync(dir)).toContain('notes.txt');
  });
});
