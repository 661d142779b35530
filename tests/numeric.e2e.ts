import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The numeric mode as a theorist meets it: the line kernel
 * rho(x, y) = (2 pi)^-1 (2cosh(x/2))^-1/2 (2cosh((x-y)/2))^-1 (2cosh(y/2))^-1/2 entered in the
 * editor with a precision and a basis of powers of 1/pi, run, read with closed forms and the
 * Airy fit; then made a dataset, reviewed, locked and verified.
 *
 * Outside values (../shared/SOURCES.md; Hatsuda, Moriyama, Okuyama, JHEP 10 (2012) 020, from
 * memory, confirmed numerically): Z(1) = 1/4, Z(2) = 1/(16 pi) = 1.98943678864869169711e-2,
 * Z(3) = (pi - 3)/(64 pi) = 7.04224085134812271667e-4.
 */
const PASSWORD = 'traceloom-demo';
const TITLE = `line kernel ${Date.now()}`;
const KERNEL = '1/(2*pi) / sqrt(2*cosh(x/2)) / (2*cosh((x-y)/2)) / sqrt(2*cosh(y/2))';

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
const tokenOf = (email: string) => signInApi(server.baseUrl, email, PASSWORD);

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('current-user').waitFor();
}

/** The significant digits shown for Z(N) (grouping, point, exponent and leading zeros removed). */
async function digits(page: Page, N: number): Promise<string> {
  const text = await page.getByTestId(`canonical-digits-${N}`).innerText();
  return text
    .replace(/\s+/g, '')
    .replace(/(e|×10).*$/, '')
    .replace(/[-.]/g, '')
    .replace(/^0+/, '');
}

describe('numeric mode in the browser', () => {
  let runUrl = '';

  it('an author enters the line kernel, runs it and reads digits, closed forms and the Airy fit', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'author@demo.test');
    await page.getByTestId('nav-studies').click();
    await page.getByTestId('study-link').filter({ hasText: 'Fermions on a ring' }).click();
    await page.getByTestId('study-heading').waitFor();
    await page.getByTestId('gas-new').click();
    await page.getByTestId('gas-title').fill(TITLE);
    await page.getByTestId('gas-numeric').click();
    await page.getByTestId('gas-precision').fill('20');
    await page.getByTestId('gas-nmax').fill('6');
    await page.getByTestId('gas-kind-kernel').click();
    await page.getByTestId('gas-kernel').fill(KERNEL);
    await page
      .getByTestId('gas-recognize-basis')
      .fill(['1', '1/pi', '1/pi^2', '1/pi^3'].join('\n'));
    // the live preview: Z(2) to 10 digits
    await expect
      .poll(
        async () => (await page.getByTestId('preview-canonical').innerText()).replace(/\s+/g, ''),
        {
          timeout: 30_000,
        },
      )
      .toContain('0.01989436789');
    await browser.screenshot(page, 'numeric-gas-editor');

    await page.getByTestId('gas-save').click();
    await page.waitForURL(/\/gases\/[0-9a-f-]{36}$/);
    // Run opens the run's page, which follows it live and shows the results when it is done.
    await page.getByTestId('run-start').click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.getByTestId('canonical-table').waitFor({ timeout: 120_000 });
    runUrl = page.url();

    // determined digits only; each a correct rounding of the published value
    expect(await digits(page, 1)).toMatch(/^250{18}$/);
    expect((await digits(page, 2)).slice(0, 18)).toBe('198943678864869169');
    expect((await digits(page, 3)).slice(0, 17)).toBe('70422408513481227');
    // every determined digit is on the screen: no value cell is cut short (an ellipsis would hide
    // digits that were determined)
    const cut = await page.evaluate(() =>
      Array.from(document.querySelectorAll('[data-testid^="canonical-digits-"]'))
        .filter((el) => el.scrollWidth > el.clientWidth + 1)
        .map((el) => (el.textContent ?? '').trim()),
    );
    expect(cut).toEqual([]);
    expect(await page.getByTestId('canonical-recognized-2').innerText()).toMatch(/16/);
    expect(await page.getByTestId('canonical-recognized-3').innerText()).toMatch(/64/);
    await page.getByTestId('canonical-expand-3').click();
    await page.getByTestId('canonical-route-3-fredholm').waitFor();
    expect(await page.getByTestId('canonical-routes-verdict-3').innerText()).toMatch(/agree/i);
    await browser.screenshot(page, 'numeric-canonical');

    await page.getByRole('tab', { name: 'Plots' }).click();
    await page.getByTestId('plot-airy').waitFor();
    const params = await page.getByTestId('airy-parameters').innerText();
    // C = 2/(pi^2 k) = 0.2026... for k = 1 (Marino-Putrov 2012, from memory; SOURCES.md)
    expect(params).toMatch(/0\.2026/);
    await page.waitForTimeout(300);
    await browser.screenshot(page, 'numeric-plots');
    await context.close();
  });

  it('the run becomes a dataset that a steward locks and that verifies within its error', async () => {
    const author = await tokenOf('author@demo.test');
    const reviewer = await tokenOf('reviewer@demo.test');
    const steward = await tokenOf('steward@demo.test');
    const runId = /\/runs\/([0-9a-f-]{36})/.exec(runUrl)?.[1];
    expect(runId).toBeTruthy();
    const made = await call(author.token, 'POST', `/runs/${runId}/datasets`, {
      title: `${TITLE}, 20 digits`,
    });
    expect(made.status).toBe(201);
    const id = made.json.id as string;
    const asked = await call(author.token, 'POST', `/datasets/${id}/review-requests`, {
      reviewerIds: [reviewer.id],
    });
    expect(asked.status).toBeLessThan(300);
    const approved = await call(reviewer.token, 'POST', `/datasets/${id}/reviews`, {
      verdict: 'approve',
      comment: 'digits agree with the published closed forms',
    });
    expect(approved.status).toBeLessThan(300);
    const locked = await call(steward.token, 'POST', `/datasets/${id}/lock`);
    expect(locked.status).toBe(200);
    expect(locked.json.hash).toMatch(/^[0-9a-f]{64}$/);
    const verified = await call(steward.token, 'POST', `/datasets/${id}/verify`);
    expect(verified.status).toBe(200);
    expect(verified.json.ok).toBe(true);
    expect(verified.json.mismatches).toEqual([]);

    const { page, context } = await browser.newPage();
    await page.goto(`/public/${locked.json.hash}`);
    await page.waitForFunction(
      () => document.body.innerText.replace(/\s+/g, '').includes('198943678'),
      null,
      {
        timeout: 30_000,
      },
    );
    await browser.screenshot(page, 'numeric-public-dataset');
    await context.close();
  });
});
