import { Run } from '../db/entities/index.js';
import { ClassPager } from '../runs/class-pager.js';
import { storeClassPage } from '../runs/class-pages.js';
import type { TestApp } from './test-app.js';

/** The table's size: p(30) = 5604 rows (OEIS A000041; `LARGE_ROWS` lowers it) of 400 terms. */
export const LARGE_TABLE = { rows: Number(process.env.LARGE_ROWS ?? 5604), terms: 400 } as const;

/**
 * Gives a finished run the class table of N = 30 at `rows` rows of `terms` terms each, stored
 * the way a run stores it (page by page): with p(30) = 5604 rows (OEIS A000041) and 400 terms,
 * about 60 MB of JSON, what a spec within the documented limits can give. Returns its bytes.
 */
export async function storeLargeClassTable(
  t: TestApp,
  runId: string,
  rows: number,
  termCount: number,
): Promise<number> {
  let storedBytes = 0;
  const terms = Array.from(
    { length: termCount },
    (_, i) => `["${i + 30}","-12345678901234567890/${i + 7}"]`,
  ).join(',');
  const pending: Promise<void>[] = [];
  const pager = new ClassPager((page) => {
    pending.push(t.dataSource.transaction((m) => storeClassPage(m, runId, page)));
  });
  for (let i = 0; i < rows; i++) {
    const text = `{"N":30,"cycleType":[[1,${i}]],"size":"${i + 1}","sign":1,"contribution":{"order":"430","terms":[${terms}]}}`;
    storedBytes += text.length + 1;
    pager.add(30, text);
  }
  pager.flush();
  await Promise.all(pending);
  await t.dataSource
    .getRepository(Run)
    .update({ id: runId }, { classCounts: JSON.stringify({ 30: rows }) });
  return storedBytes;
}
