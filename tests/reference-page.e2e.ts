import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * A reference table's own page, read as a person would: reached from the study's list, its
 * rows, comparing it with a finished run (the comparison links to the run), renaming it, and
 * deleting it after a confirmation.
 */
const PASSWORD = 'traceloom-demo';

/** The harmonic trap: Z_L = q^(L/2)/(1-q^L). */
const TRAP = {
  format: 'traceloom.gas/1',
  title: 'Trap for the table page',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '12',
  nMax: 4,
  classTable: 3,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
};

/** Z_1 = q^(1/2)/(1-q) as a geometric series (common practice); N = 2 given one coefficient off. */
const TABLE = 'N,value\n0,1\n1,"q^(1/2) + q^(3/2) + q^(5/2) + O(q^3)"\n2,"q^2 + 2*q^3 + O(q^4)"\n';

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

describe('the reference table page', () => {
  it('shows rows, compares with a run, renames and deletes the table', async () => {
    const author = (await signInApi(server.baseUrl, 'author@demo.test', PASSWORD)).token;
    const [study] = (await call(author, 'GET', '/studies')).json;
    const gas = await call(author, 'POST', `/studies/${study.id}/gases`, { spec: TRAP });
    expect(gas.status).toBe(201);
    const run = await call(author, 'POST', `/gases/${gas.json.id}/runs`, {});
    expect(run.status).toBe(202);
    await expect
      .poll(async () => (await call(author, 'GET', `/runs/${run.json.id}`)).json.status, {
        timeout: 60_000,
      })
      .toBe('done');
    const form = new FormData();
    form.append('file', new Blob([TABLE], { type: 'text/csv' }), 'trap-table.csv');
    form.append('title', 'Trap rows by hand');
    const up = await fetch(`${server.baseUrl}/api/studies/${study.id}/references`, {
      method: 'POST',
      headers: { authorization: `Bearer ${author}` },
      body: form,
    });
    expect(up.status).toBe(201);

    const { page, context } = await browser.newPage();
    await signInPage(page, 'author@demo.test', PASSWORD);
    await page.goto(`/studies/${study.id}`);
    await page.getByRole('link', { name: 'Trap rows by hand' }).click();
    await page.getByRole('heading', { name: 'Trap rows by hand', level: 1 }).waitFor();
    const crumbs = page.getByRole('navigation', { name: 'Breadcrumb' });
    await expect.poll(() => crumbs.innerText()).toContain(study.title);
    const rows = page.getByRole('table', { name: 'Rows of the table' }).locator('tbody tr');
    expect(await rows.count()).toBe(3);
    await page.getByText('Not compared with any run yet.').waitFor();

    await page.getByRole('combobox', { name: 'Finished run' }).click();
    await page.getByRole('option', { name: /Trap for the table page, version 1/ }).click();
    await page.getByRole('button', { name: 'Compare with this run' }).click();
    const item = page.getByTestId('reference-comparison');
    await item.waitFor();
    expect(await item.innerText()).toContain('2 of 3 rows agree');
    await browser.screenshot(page, 'reference-page');

    await page.getByLabel('Name').fill('Trap rows, checked');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.getByRole('heading', { name: 'Trap rows, checked', level: 1 }).waitFor();

    await item.getByRole('link').click();
    await page.waitForURL(new RegExp(`/runs/${run.json.id}$`));
    await page.goBack();
    await page.getByRole('button', { name: 'Delete table' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Delete table' }).click();
    await page.waitForURL(new RegExp(`/studies/${study.id}$`));
    expect(await page.getByRole('link', { name: 'Trap rows, checked' }).count()).toBe(0);
    await context.close();
  }, 180_000);
});

describe('implied cycle weights on the Checks tab', () => {
  it('shows each implied Z_L beside the entered one, a differing one term by term', async () => {
    const author = (await signInApi(server.baseUrl, 'author@demo.test', PASSWORD)).token;
    const [study] = (await call(author, 'GET', '/studies')).json;
    // The bosonic grand function supplied for fermions: Z_1 implied agrees, Z_2 does not.
    const spec = {
      ...TRAP,
      title: 'Trap with the bosonic grand function',
      grand: { kind: 'expression', expression: '1/qpoch(kappa*q^(1/2), q, inf)' },
    };
    const gas = await call(author, 'POST', `/studies/${study.id}/gases`, { spec });
    expect(gas.status).toBe(201);
    const run = await call(author, 'POST', `/gases/${gas.json.id}/runs`, {});
    await expect
      .poll(async () => (await call(author, 'GET', `/runs/${run.json.id}`)).json.status, {
        timeout: 60_000,
      })
      .toBe('done');
    const { page, context } = await browser.newPage();
    await signInPage(page, 'author@demo.test', PASSWORD);
    await page.goto(`/runs/${run.json.id}`);
    await page.getByRole('tab', { name: 'Checks' }).click();
    const table = page.getByRole('table', { name: 'Implied weights' });
    await table.waitFor();
    const rows = table.locator('tbody tr');
    expect(await rows.count()).toBe(4);
    expect(await rows.nth(0).innerText()).toContain('the same');
    expect(await rows.nth(1).innerText()).toContain('differs');
    // every row shows the implied series itself, not only the verdict
    expect(await table.getByTestId('implied-value').count()).toBe(4);
    const sides = page.getByRole('table', {
      name: 'Z_2: the entered weight (computed) beside the one implied by the supplied Ξ',
    });
    await sides.waitFor();
    expect(await sides.innerText()).toContain('✗ differs');
    await sides.scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'implied-weights');
    await context.close();
  }, 180_000);
});
