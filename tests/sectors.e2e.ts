import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The sector walk of a theorist: a two-node quiver's SU(N) gas written as a 1-index sector sum
 * of spectra, c_p(n) = q^((|p| + |p + n|)/2) over p and n in Z, weight 1 (an invented scenario of
 * our own), entered in the editor, run, read (summed table, sector breakdown), and compared with a
 * reference table. The reference rows were computed independently of Traceloom by a python3
 * brute force (elementary symmetric functions of the spectrum, |p|, |n| <= 40, exact integers):
 * Z(N) = sum_n e_N({c_p(n)}) to O(q^8).
 */
const PASSWORD = 'traceloom-demo';
const TITLE = `two-node quiver ${Date.now()}`;
const REFERENCE = [
  'N,value',
  '1,"1 + 4*q^(1/2) + 8*q + 12*q^(3/2) + 16*q^2 + 20*q^(5/2) + 24*q^3 + 28*q^(7/2) + 32*q^4 + 36*q^(9/2) + 40*q^5 + 44*q^(11/2) + 48*q^6 + 52*q^(13/2) + 56*q^7 + 60*q^(15/2) + O(q^8)"',
  '2,"4*q + 17*q^2 + 40*q^3 + 73*q^4 + 116*q^5 + 169*q^6 + 232*q^7 + O(q^8)"',
  '3,"q^2 + 4*q^(5/2) + 6*q^3 + 8*q^(7/2) + 19*q^4 + 28*q^(9/2) + 30*q^5 + 52*q^(11/2) + 75*q^6 + 76*q^(13/2) + 112*q^7 + 156*q^(15/2) + O(q^8)"',
  '4,"4*q^4 + 16*q^5 + 41*q^6 + 94*q^7 + O(q^8)"',
].join('\n');

let server: TestServer;
let browser: TestBrowser;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser(server.baseUrl);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Uploads the reference table to a study through the API (multipart, as the page does). */
async function uploadReference(token: string, studyId: string): Promise<void> {
  const form = new FormData();
  form.append('file', new Blob([REFERENCE], { type: 'text/csv' }), 'quiver-reference.csv');
  form.append('title', 'quiver brute force');
  const res = await fetch(`${server.baseUrl}/api/studies/${studyId}/references`, {
    method: 'POST',
    headers: { authorization: `Bearer ${token}` },
    body: form,
  });
  expect(res.status, await res.clone().text()).toBe(201);
}

describe('sectors in the browser', () => {
  it('enter a sector sum, run it, read the table and the breakdown, check it', async () => {
    const { page, context } = await browser.newPage();
    await signInPage(page, 'author@demo.test', PASSWORD);
    await page.getByTestId('nav-studies').click();
    await page.getByTestId('study-link').filter({ hasText: 'Fermions on a ring' }).click();
    await page.getByTestId('study-heading').waitFor();
    const studyId = /\/studies\/([0-9a-f-]{36})/.exec(page.url())![1]!;

    await page.getByTestId('gas-new').click();
    await page.getByTestId('gas-title').fill(TITLE);
    await page.getByTestId('gas-step').fill('1/2');
    await page.getByTestId('gas-order').fill('8');
    await page.getByTestId('gas-nmax').fill('4');
    await page.getByTestId('gas-classtable').fill('0');
    await page.getByTestId('gas-kind-spectrum').click();
    await page.getByTestId('gas-spectrum').fill('q^((abs(p) + abs(p + n))/2)');
    await page.getByTestId('gas-sectors').click();
    await page.getByTestId('gas-sector-name-0').fill('n');
    await page.getByTestId('gas-sector-weight').fill('1');
    // a clash is named on its field before anything is sent
    await page.getByTestId('gas-sector-name-0').fill('kappa');
    await page.getByTestId('gas-sector-weight').click();
    await page.getByText(/kappa already has a meaning/).waitFor();
    await page.getByTestId('gas-sector-name-0').fill('n');
    // the live preview sums the sectors too
    await page.getByTestId('preview-z-1').waitFor({ timeout: 30_000 });
    await page.getByTestId('gas-sectors-group').scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'sectors-editor');
    await page.getByTestId('gas-save').click();
    await page.waitForURL(/\/gases\/[0-9a-f-]{36}$/);
    await page.getByTestId('run-start').click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.getByTestId('canonical-table').waitFor({ timeout: 90_000 });
    const runId = /\/runs\/([0-9a-f-]{36})/.exec(page.url())![1]!;

    // The summed table says how many sectors made each row, as the result does.
    const { token } = await signInApi(server.baseUrl, 'author@demo.test', PASSWORD);
    const run = (await apiCall(server.baseUrl, token, 'GET', `/runs/${runId}`)).json;
    const counts = run.result.canonical.map((r: { sectors: number }) => r.sectors);
    expect(counts[1]).toBeGreaterThan(10);
    for (const N of [1, 2, 3, 4]) {
      expect((await page.getByTestId(`canonical-sectors-${N}`).innerText()).trim()).toBe(
        String(counts[N]),
      );
    }
    expect(await page.getByTestId('canonical-sectors-0').innerText()).toContain('by convention');
    // the spectrum is cut once per sector: the cautions say so once, not once per sector
    const cuts = await page.getByTestId('run-truncation').allInnerTexts();
    expect(cuts.length).toBeLessThan(4);
    expect(cuts.join(' ')).toMatch(/cut off at the order \d+ times/);
    await browser.screenshot(page, 'sectors-canonical');

    // The breakdown: every sector with its lowest exponents, sortable.
    await page.getByRole('tab', { name: 'Sectors' }).click();
    const count = await page.getByTestId('sectors-count').innerText();
    expect(count).toContain(`${run.result.sectors.count} sectors computed`);
    expect(count).toContain('cut off by the stopping rule');
    expect(await page.getByTestId('sectors-convention').innerText()).toMatch(/Z\(0\) = 1/);
    // sector n = 3 at N = 1: lowest exponent of Z_3(1) is min_p (|p| + |p + 3|)/2 = 3/2
    const row3 =
      run.result.sectors.rows.findIndex((r: { index: number[] }) => r.index[0] === 3) + 1;
    const indices = run.result.sectors.rows.map((r: { index: number[] }) => r.index[0]);
    const firstIndex = async () =>
      Number((await page.locator('[data-testid^="sector-index-"]').first().innerText()).trim());
    const header = page.getByRole('columnheader', { name: 'n', exact: true });
    await header.click();
    await expect.poll(firstIndex).toBe(Math.min(...indices));
    await header.click();
    await expect.poll(firstIndex).toBe(Math.max(...indices));
    await page.getByRole('columnheader', { name: '#', exact: true }).click();
    await page.getByTestId(`sector-v-${row3}-1`).scrollIntoViewIfNeeded();
    expect((await page.getByTestId(`sector-v-${row3}-1`).innerText()).trim()).toBe('3/2');
    await browser.screenshot(page, 'sectors-breakdown');

    // The check against the reference table.
    await uploadReference(token, studyId);
    await page.getByRole('tab', { name: 'Checks' }).click();
    await page.getByTestId('compare-reference').click();
    await page.getByRole('option', { name: /quiver brute force/ }).click();
    await page.getByTestId('compare-run').click();
    const verdict = page.getByTestId('comparison').first();
    await verdict.waitFor();
    expect(await verdict.getAttribute('data-total')).toBe('4');
    expect(await verdict.getAttribute('data-agreeing')).toBe('4');
    await browser.screenshot(page, 'sectors-checked');
    await context.close();
    expect(browser.foreignRequests()).toEqual([]);
  }, 180_000);
});
