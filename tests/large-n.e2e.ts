import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The Large N tab as a theorist reads it: the fermion harmonic trap, whose rows are
 * Z(N) = q^(N^2/2)/(q;q)_N (Andrews, Theory of Partitions, Cor. 2.2): normalization q^(-N^2/2),
 * limit 1/(q;q)_inf with a_n = 1, agreement below q^(N+1), first correction -q^(N+1); then product
 * forms on request for a row and for the grand function (Xi = (-kappa q^(1/2); q)_inf, so
 * c_1 = q^(1/2)/(1-q), c_2 = -q/(1-q^2) and nothing beyond, since 1 + x = (1-x^2)/(1-x)).
 */
const PASSWORD = 'traceloom-demo';
const TRAP = {
  format: 'traceloom.gas/1',
  title: 'trap, large N walk',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '60',
  nMax: 8,
  classTable: 0,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
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

describe('the Large N tab in the browser', () => {
  it('reads normalization, limit, walls, and product forms on request', async () => {
    const { token } = await signInApi(server.baseUrl, 'author@demo.test', PASSWORD);
    const [study] = (await call(token, 'GET', '/studies')).json;
    const gas = await call(token, 'POST', `/studies/${study.id}/gases`, { spec: TRAP });
    expect(gas.status).toBe(201);
    const run = await call(token, 'POST', `/gases/${gas.json.id}/runs`, {});
    expect(run.status).toBe(202);
    await expect
      .poll(async () => (await call(token, 'GET', `/runs/${run.json.id}`)).json.status, {
        timeout: 30_000,
      })
      .toBe('done');

    const { page, context } = await browser.newPage();
    await signInPage(page, 'author@demo.test', PASSWORD);
    await page.goto(`/runs/${run.json.id}`);
    await page.getByRole('tab', { name: 'Large N' }).click();
    const text = (id: string) => page.getByTestId(id).first().innerText();
    await page.getByTestId('largen-class-all').waitFor();
    expect(await text('largen-normalization')).toContain('fitted on rows 1, 2, 3');
    expect(await text('largen-product')).toContain('a(1) = 1');
    expect(await text('largen-pattern')).toContain('a_n = 1');
    expect(await text('largen-stabilization')).toMatch(/N\s*\+\s*1/);
    expect(await text('largen-wall-all-1')).toContain('3, 4, 5, 6');
    await browser.screenshot(page, 'large-n-tab');
    await page.getByTestId('largen-wall-all-1').scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'large-n-walls');

    // a canonical row on request
    await page.getByTestId('product-index').fill('3');
    await page.getByTestId('product-show').click();
    await page.getByTestId('product-series').waitFor();
    expect(await text('product-series')).toContain('Leading term q^(9/2) divided out');
    expect(await text('product-request-product')).toContain('determined for n < 55: a(1) = 1');
    expect(await text('product-request-pattern')).toContain('a_n = 0 for n > 3');
    await page.getByTestId('product-request-pattern').scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'large-n-row-product');
    // a row beyond the table is named before anything is sent
    await page.getByTestId('product-index').fill('12');
    await page.getByTestId('product-show').click();
    expect(await text('product-field-error')).toBe('N: must be a whole number from 0 to 8.');

    // the grand function
    await page.getByTestId('product-kind').click();
    await page.getByRole('option', { name: /Grand function/ }).click();
    await page.getByTestId('product-show').click();
    await page.getByTestId('product-grand').waitFor();
    expect(await page.locator('[data-testid^="product-factor-"]').count()).toBe(8);
    expect(await text('product-request-pattern')).toContain('c_N = 0 for N > 2');
    await page.getByTestId('product-grand').scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'large-n-grand-product');
    await context.close();
    expect(browser.foreignRequests()).toEqual([]);
  }, 120_000);
});
