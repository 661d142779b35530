import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, TEST_SCRYPT, type TestApp } from '../testing/test-app.js';
import { Comparison, Gas, ReferenceTable, Run } from './entities/index.js';
import { seedDemo } from './seed-demo.js';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('demo gases', () => {
  it('seeds three gases with finished runs and a preprint comparison showing one mismatch, once', async () => {
    await seedDemo(t.dataSource, TEST_SCRYPT);
    await seedDemo(t.dataSource, TEST_SCRYPT);
    expect(await t.dataSource.getRepository(Gas).count()).toBe(3);
    const runs = await t.dataSource.getRepository(Run).find();
    expect(runs.map((r) => r.status)).toEqual(['done', 'done', 'done']);
    expect(await t.dataSource.getRepository(ReferenceTable).count()).toBe(1);
    const [comparison] = await t.dataSource.getRepository(Comparison).find();
    const rows = JSON.parse(comparison!.verdicts);
    // 1/(q;q)_4 = 1 + q + 2q^2 + 3q^3 + 5q^4 + 6q^5 + ... (partitions into at most 4 parts, OEIS A008284).
    expect(rows.map((r: { agrees: boolean }) => r.agrees)).toEqual([true, true, true, false]);
    expect(rows[3].firstMismatch).toEqual({ exponent: '5', computed: '6', supplied: '7' });
    expect(rows[0].agreesBelow).toBe('6');
  });
});
