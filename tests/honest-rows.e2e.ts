import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * Rows beyond the order, read as a person would: fermions on c_p = q^|p| (p in Z), whose Z(N)
 * starts at q^floor(N^2/4) (the sum of the N lowest levels 0, 1, 1, 2, 2, ...; OEIS A002620).
 * At O(q^200) with N_max = 40 the rows 29..40 are not determined; O(q^401) would reach N = 40.
 */
const PASSWORD = 'traceloom-demo';
const RING = {
  format: 'traceloom.gas/1',
  title: 'ring, too low an order',
  statistics: 'fermion',
  variable: 'q',
  order: '200',
  nMax: 40,
  classTable: 0,
  weights: { kind: 'spectrum', expression: 'q^abs(p)', offset: '0', from: null, to: null },
};

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

const call = (token: string | null, method: string, path: string, body?: unknown) =>
  apiCall(server.baseUrl, token, method, path, body);

describe('rows beyond the order in the browser', () => {
  it('the editor warns before the run; the run page says not determined and which order reaches N_max', async () => {
    const { token } = await signInApi(server.baseUrl, 'author@demo.test', PASSWORD);
    const [study] = (await call(token, 'GET', '/studies')).json;
    const gas = await call(token, 'POST', `/studies/${study.id}/gases`, { spec: RING });
    expect(gas.status).toBe(201);

    const { page, context } = await browser.newPage();
    await signInPage(page, 'author@demo.test', PASSWORD);
    await page.goto(`/gases/${gas.json.id}`);
    const before = page.getByTestId('run-estimate-warning').first();
    await before.waitFor({ timeout: 30_000 });
    expect(await before.innerText()).toMatch(/N = 29\.\.40 will not be determined at O\(q\^200\)/);
    expect(await before.innerText()).toMatch(/at least O\(q\^401\) is needed to reach N_max = 40/);
    await browser.screenshot(page, 'honest-editor-warning');

    // Run opens the run's page: the start's warning there, then the results when done.
    await page.getByTestId('run-start').click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const started = page.getByTestId('run-start-warning').first();
    await started.waitFor({ timeout: 30_000 });
    expect(await started.innerText()).toMatch(/N = 29\.\.40/);

    const advice = page.getByTestId('run-order-advice');
    await advice.waitFor();
    expect(await advice.innerText()).toMatch(/N = 29\.\.40 is not determined at O\(q\^200\)/);
    expect(await advice.innerText()).toMatch(/O\(q\^401\)/);
    // scroll the virtual table to the rows beyond the order
    const viewport = page.getByLabel('Canonical table, scrollable');
    await viewport.evaluate((el) => (el.scrollTop = el.scrollHeight));
    const lead = page.getByTestId('canonical-lead-35');
    await lead.waitFor();
    expect(await lead.getAttribute('data-plain')).toBe('not determined');
    expect(await page.getByTestId('canonical-agree-35').innerText()).toContain('not compared');
    expect(await page.getByTestId('canonical-agree-35').innerText()).not.toMatch(/agree:/);
    expect(await page.getByTestId('canonical-lead-28').getAttribute('data-plain')).toBe('2*q^196');
    await browser.screenshot(page, 'honest-run-page');
    await context.close();
    expect(browser.foreignRequests()).toEqual([]);
  }, 180_000);
});
