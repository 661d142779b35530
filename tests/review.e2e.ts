import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The admin's and the reviewer's screens as a person reads them: an invited account says
 * "Invited", roles are changed with the Material select, a toast stays on its page, mailbox
 * addresses are links, the study list counts people and dates the latest change.
 */
const PASSWORD = 'traceloom-demo';

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
const tokenOf = async (email: string): Promise<string> =>
  (await signInApi(server.baseUrl, email, PASSWORD)).token;

const signIn = (page: Page, email: string) => signInPage(page, email, PASSWORD);

describe('admin and reviewer screens', () => {
  it('shows an invited person as Invited, changes a role, and the toast stays on its page', async () => {
    const admin = await tokenOf('admin@demo.test');
    const email = `invitee-${Date.now()}@example.test`;
    const invite = await call(admin, 'POST', '/users', {
      email,
      displayName: 'Wren Achterberg',
      role: 'author',
    });
    expect(invite.status).toBe(201);
    const { page, context } = await browser.newPage();
    await signIn(page, 'admin@demo.test');
    await page.getByTestId('nav-users').click();
    const row = page.getByTestId('user-row').filter({ hasText: email });
    await expect(row.getByTestId('user-status').innerText()).resolves.toContain('Invited');
    const steward = page.getByTestId('user-row').filter({ hasText: 'steward@demo.test' });
    await expect(steward.getByTestId('user-status').innerText()).resolves.toContain('Active');
    expect(await page.locator('select').count()).toBe(0);
    await page.getByRole('combobox', { name: 'Role of Wren Achterberg' }).click();
    await page.getByRole('option', { name: 'Reviewer' }).click();
    await page.getByText('Wren Achterberg is now Reviewer.').waitFor();
    await browser.screenshot(page, 'review-admin-users');
    await page.waitForTimeout(600);
    await page.getByTestId('nav-mailbox').click();
    await page.getByTestId('mail-row').first().waitFor();
    await expect.poll(() => page.getByText('Wren Achterberg is now Reviewer.').count()).toBe(0);
    await page.getByTestId('mail-row').filter({ hasText: email }).getByRole('button').click();
    const link = page.getByTestId('mail-text').getByRole('link').first();
    expect(await link.getAttribute('href')).toMatch(/^http:\/\/[^/]+\/welcome\/\S+$/);
    await browser.screenshot(page, 'review-admin-mailbox');
    await context.close();
  });

  it('counts the owner with the members and dates a study by its latest change', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'author@demo.test');
    await page.getByTestId('nav-studies').click();
    const row = page.getByTestId('study-row').filter({ hasText: 'Fermions on a ring' });
    const cells = await row.locator('td').allInnerTexts();
    await browser.screenshot(page, 'review-study-list');
    await row.getByTestId('study-link').click();
    await page.getByTestId('study-heading').waitFor();
    const members = await page.getByTestId('member-row').count();
    expect(Number(cells[2])).toBe(members + 1);
    await context.close();
  });

  it('a reviewer sees both series of a differing row side by side, each difference marked', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'reviewer@demo.test');
    await page.getByTestId('nav-studies').click();
    await page.getByTestId('study-link').filter({ hasText: 'Fermions on a ring' }).click();
    await page
      .getByTestId('gas-link')
      .filter({ hasText: /^harmonic trap$/ })
      .click();
    await page.getByTestId('run-link').first().click();
    await page.getByRole('tab', { name: 'Checks' }).click();
    const side = page.getByRole('table', { name: /^N = 4, normalization/ });
    await side.waitFor();
    // The seeded preprint row N = 4 misprints q^5: partitions of 5 into at most 4 parts are 6
    // (OEIS A008284), the table says 7; every other coefficient agrees.
    const differing = side.locator('tr.is-differs');
    expect(await differing.count()).toBe(1);
    const cells = await differing.locator('td').allInnerTexts();
    expect(cells.slice(0, 3)).toEqual(['q^5', '6', '7']);
    expect(cells[3]).toContain('differs');
    // Only the terms both sides determine are listed (1 .. q^5); the rest is one sentence.
    expect(await side.getByTestId('side-by-side-line').count()).toBe(6);
    await expect(
      page
        .getByText(/more terms lie beyond what both sides determine/)
        .first()
        .innerText(),
    ).resolves.toContain('supplied to O(q^6)');
    await side.scrollIntoViewIfNeeded();
    await browser.screenshot(page, 'review-reviewer-side-by-side');
    await context.close();
  });

  it('the spectrum form: nothing cut or overlapping, a syntax link, and a draft that survives a reload', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'author@demo.test');
    await page.getByTestId('nav-studies').click();
    await page.getByTestId('study-link').filter({ hasText: 'Fermions on a ring' }).click();
    await page.getByTestId('gas-new').click();
    await page.getByTestId('gas-title').fill('ring draft');
    await page.getByTestId('gas-kind-spectrum').click();
    await page.getByTestId('gas-spectrum').fill('q^abs(p)');
    await page.getByTestId('gas-spectrum-offset').fill('1/2');
    for (const name of ['Offset', 'From', 'To']) {
      const label = page.locator('mat-label', { hasText: new RegExp(`^${name}$`) }).first();
      // The label is shown whole: its text fits its box.
      const fits = await label.evaluate((el) => el.scrollWidth <= el.clientWidth + 1);
      expect(fits, name).toBe(true);
    }
    expect(await page.getByRole('link', { name: 'Syntax' }).count()).toBeGreaterThanOrEqual(1);
    await browser.screenshot(page, 'review-gas-spectrum-form');
    await page.reload();
    await page.getByTestId('gas-draft-restored').waitFor();
    await expect(page.getByTestId('gas-title').inputValue()).resolves.toBe('ring draft');
    await expect(page.getByTestId('gas-spectrum').inputValue()).resolves.toBe('q^abs(p)');
    await page.getByTestId('gas-draft-discard').click();
    await expect(page.getByTestId('gas-title').inputValue()).resolves.toBe('');
    await context.close();
  });

  it('no request went to another host', () => {
    expect(browser.foreignRequests()).toEqual([]);
  });
});
