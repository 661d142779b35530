import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, type TestBrowser } from './support/browser.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The foundation as a user meets it: sign in as each demo role, see the navigation that role may
 * use, create a study, add a member — with no request ever leaving the machine.
 */
const PASSWORD = 'traceloom-demo';
const ROLES = [
  { email: 'author@demo.test', role: 'author', admin: false },
  { email: 'reviewer@demo.test', role: 'reviewer', admin: false },
  { email: 'steward@demo.test', role: 'steward', admin: false },
  { email: 'admin@demo.test', role: 'admin', admin: true },
] as const;

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

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('current-user').waitFor();
}

describe('foundation in the browser', () => {
  for (const { email, role, admin } of ROLES) {
    it(`${role} sees only the navigation the role may use`, async () => {
      const { page, context } = await browser.newPage();
      await signIn(page, email);
      await expect(page.getByTestId('current-role').innerText()).resolves.toMatch(
        new RegExp(role, 'i'),
      );
      await page.getByTestId('nav-studies').waitFor();
      expect(await page.getByTestId('nav-users').count()).toBe(admin ? 1 : 0);
      await browser.screenshot(page, `foundation-shell-${role}`);
      if (admin) {
        await page.getByTestId('nav-users').click();
        await page.getByTestId('user-row').first().waitFor();
        expect(await page.getByTestId('user-row').count()).toBeGreaterThanOrEqual(4);
        await browser.screenshot(page, 'foundation-users');
      } else {
        // The admin screen is not reachable by typing its address either.
        await page.goto('/admin/users');
        await page.waitForLoadState('networkidle');
        expect(await page.getByTestId('user-row').count()).toBe(0);
      }
      await page.getByTestId('sign-out').click();
      await page.getByTestId('sign-in-email').waitFor();
      await context.close();
    });
  }

  it('an author creates a study and adds a member, who then sees it', async () => {
    const title = `Hard-wall fermions ${Date.now()}`;
    const { page, context } = await browser.newPage();
    await signIn(page, 'author@demo.test');
    await page.getByTestId('nav-studies').click();
    await page.getByTestId('study-create').click();
    await page.getByTestId('study-title').fill(title);
    await page.getByTestId('study-description').fill('Cycle weights of a gas between two walls.');
    await browser.screenshot(page, 'foundation-study-create');
    await page.getByTestId('study-save').click();
    await page.getByTestId('study-heading').filter({ hasText: title }).waitFor();

    await page.getByRole('combobox', { name: 'Add a member' }).click();
    await page.getByRole('option', { name: /reviewer@demo\.test/ }).click();
    await page.getByTestId('member-add').click();
    await page.getByTestId('member-row').filter({ hasText: 'reviewer@demo.test' }).waitFor();
    await browser.screenshot(page, 'foundation-study-page');
    await context.close();

    const reviewer = await browser.newPage();
    await signIn(reviewer.page, 'reviewer@demo.test');
    await reviewer.page.getByTestId('nav-studies').click();
    await reviewer.page.getByTestId('study-row').filter({ hasText: title }).waitFor();
    await browser.screenshot(reviewer.page, 'foundation-studies-reviewer');
    await reviewer.context.close();
  });

  it('a wrong password is answered inline, not with a crash', async () => {
    const { page, context } = await browser.newPage();
    await page.goto('/sign-in');
    await page.getByTestId('sign-in-email').fill('author@demo.test');
    await page.getByTestId('sign-in-password').fill('not-the-password');
    await page.getByTestId('sign-in-submit').click();
    await expect(page.getByTestId('sign-in-error').innerText()).resolves.toMatch(/\w/);
    await browser.screenshot(page, 'foundation-sign-in-error');
    await context.close();
  });

  it('no request went to another host', () => {
    expect(browser.foreignRequests()).toEqual([]);
  });
});
