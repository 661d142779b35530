import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * A dataset's whole life in the browser: the author asks for review, the reviewer finds the mail
 * in the local mail fake and approves, the steward locks, and the public page (no sign-in) shows
 * the hash, which is the SHA-256 of the public JSON export; verify passes.
 */
const PASSWORD = 'traceloom-demo';

/** The harmonic trap, Z_L = q^(L/2)/(1 - q^L), with its grand check (a fast spec). */
const TRAP = {
  format: 'traceloom.gas/1',
  title: 'harmonic trap, low N',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '12',
  nMax: 4,
  classTable: 3,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  grand: { kind: 'expression', expression: 'qpoch(-kappa*q^(1/2), q, inf)' },
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
const tokenOf = async (email: string): Promise<string> =>
  (await signInApi(server.baseUrl, email, PASSWORD)).token;

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('current-user').waitFor();
}

describe('datasets in the browser', () => {
  it('review, lock and the public page with a checkable hash', async () => {
    // Set-up through the API: a finished run of the trap in the demo study.
    const author = await tokenOf('author@demo.test');
    const [study] = (await call(author, 'GET', '/studies')).json;
    const gas = await call(author, 'POST', `/studies/${study.id}/gases`, { spec: TRAP });
    expect(gas.status).toBe(201);
    const run = await call(author, 'POST', `/gases/${gas.json.id}/runs`, {});
    expect(run.status).toBe(202);
    await expect
      .poll(async () => (await call(author, 'GET', `/runs/${run.json.id}`)).json.status, {
        timeout: 30_000,
      })
      .toBe('done');
    // The author makes the dataset from the run page, then asks the demo reviewer.
    const a = await browser.newPage();
    await signIn(a.page, 'author@demo.test');
    await a.page.goto(`/runs/${run.json.id}`);
    await a.page.getByTestId('dataset-create-open').click();
    await a.page.getByTestId('dataset-create-title').fill('Trap table for the group');
    await browser.screenshot(a.page, 'datasets-run-page-create');
    await a.page.getByTestId('dataset-create-submit').click();
    await a.page
      .getByTestId('dataset-heading')
      .filter({ hasText: 'Trap table for the group' })
      .waitFor();
    const datasetId = /\/datasets\/([0-9a-f-]{36})/.exec(a.page.url())?.[1];
    expect(datasetId).toBeDefined();
    await a.page.getByTestId('review-request-select').click();
    await a.page
      .getByRole('option', { name: /reviewer/i })
      .first()
      .click();
    await a.page.keyboard.press('Escape');
    await a.page.getByTestId('review-request-submit').click();
    await a.page.getByTestId('dataset-state').filter({ hasText: 'In review' }).waitFor();
    await browser.screenshot(a.page, 'datasets-author-in-review');
    await a.context.close();

    // The admin's mailbox shows the request sent to the reviewer; the reviewer follows its link.
    const m = await browser.newPage();
    await signIn(m.page, 'admin@demo.test');
    await m.page.getByTestId('nav-mailbox').click();
    const row = m.page
      .getByTestId('mail-row')
      .filter({ hasText: 'Review requested: Trap table for the group' });
    await row.waitFor();
    expect(await row.innerText()).toContain('reviewer@demo.test');
    await row.locator('button').click();
    const mailText = await m.page.getByTestId('mail-text').innerText();
    await browser.screenshot(m.page, 'datasets-mailbox');
    await m.context.close();
    const link = /https?:\/\/\S+\/datasets\/([0-9a-f-]{36})/.exec(mailText);
    expect(link?.[1]).toBe(datasetId);

    const r = await browser.newPage();
    await signIn(r.page, 'reviewer@demo.test');
    await r.page.getByTestId('nav-reviews').click();
    await r.page.getByTestId('inbox-row').filter({ hasText: 'Trap table for the group' }).waitFor();
    await r.page.goto(`/datasets/${link![1]}`);
    await r.page.getByTestId('comment-body').fill('N = 2 agrees with my hand count.');
    await r.page.getByTestId('comment-row-select').click();
    await r.page.getByRole('option', { name: 'row N = 2' }).click();
    await r.page.getByTestId('comment-submit').click();
    await r.page.getByTestId('comment-row').filter({ hasText: 'row N = 2' }).waitFor();
    await r.page.getByTestId('review-comment').fill('Reproduced every row.');
    await r.page.getByTestId('review-submit').click();
    await r.page.getByTestId('review-row').filter({ hasText: 'approved' }).waitFor();
    await browser.screenshot(r.page, 'datasets-reviewer-approved');
    await r.context.close();

    // The steward locks; the citation and the public link appear; verify passes.
    const s = await browser.newPage();
    await signIn(s.page, 'steward@demo.test');
    await s.page.getByTestId('nav-datasets').click();
    await s.page
      .getByTestId('dataset-row')
      .filter({ hasText: 'Trap table for the group' })
      .filter({ hasText: 'Approved, ready to lock' })
      .waitFor();
    await s.page.goto(`/datasets/${datasetId}`);
    await s.page
      .getByTestId('dataset-state')
      .filter({ hasText: 'Approved, ready to lock' })
      .waitFor();
    await s.page.getByTestId('dataset-lock').click();
    const confirm = s.page.getByRole('dialog');
    const promised = await confirm.getByTestId('confirm-code').innerText();
    expect(promised).toMatch(/^[0-9a-f]{64}$/);
    await expect(confirm.getByTestId('confirm-items').innerText()).resolves.toMatch(
      /canonical table Z\(0\)\.\.Z\(\d+\)/,
    );
    await browser.screenshot(s.page, 'datasets-steward-lock-confirm');
    await confirm.getByRole('button', { name: 'Lock for good' }).click();
    await s.page.getByTestId('dataset-state').filter({ hasText: 'Locked' }).waitFor();
    const citation = await s.page.getByTestId('dataset-citation').innerText();
    const hash = /SHA-256 ([0-9a-f]{64})/.exec(citation)?.[1];
    expect(hash).toBe(promised);
    expect(citation).toContain('Trap table for the group, version 1');
    // The citation files on the dataset page as well.
    expect(await s.page.getByRole('link', { name: 'BibTeX' }).getAttribute('href')).toBe(
      `/api/public/datasets/${hash}/citation?format=bibtex`,
    );
    expect(await s.page.getByRole('link', { name: 'CSL-JSON' }).getAttribute('href')).toBe(
      `/api/public/datasets/${hash}/citation?format=csl`,
    );
    await s.page.getByTestId('dataset-verify').click();
    await expect(s.page.getByTestId('dataset-verify-result').innerText()).resolves.toContain(
      'every value matches',
    );
    await browser.screenshot(s.page, 'datasets-steward-locked');
    await s.context.close();

    // Anyone, signed out: the public page shows the hash, and the JSON there hashes to it.
    const p = await browser.newPage();
    await p.page.goto(`/public/${hash}`);
    await expect(p.page.getByTestId('public-hash').innerText()).resolves.toBe(hash);
    await expect(p.page.getByTestId('public-citation').innerText()).resolves.toContain(hash!);
    for (const [id, format] of [
      ['public-bibtex', 'citation?format=bibtex'],
      ['public-csl', 'citation?format=csl'],
      ['public-csv', 'export?format=csv'],
      ['public-latex', 'export?format=latex'],
    ]) {
      const href = await p.page.getByTestId(id!).getAttribute('href');
      expect(href).toBe(`/api/public/datasets/${hash}/${format}`);
      expect((await fetch(`${server.baseUrl}${href}`)).status).toBe(200);
    }
    // The gas as defined, and one sentence of what is known (orders, rows, checks).
    const definition = await p.page.getByTestId('public-definition').innerText();
    expect(definition).toContain('Z_L = q^(L/2)/(1-q^L)');
    expect(definition).toContain('qpoch(-kappa*q^(1/2), q, inf)');
    const known = await p.page.getByTestId('public-known').innerText();
    expect(known).toContain('Z(N) for N = 0 to 4 (5 of 5 rows determined)');
    expect(known).toMatch(/checks: \d+ passes, 0 fails, 0 waived of \d+/);
    await browser.screenshot(p.page, 'datasets-public');
    await p.context.close();
    const exported = await fetch(
      `${server.baseUrl}/api/public/datasets/${hash}/export?format=json`,
    );
    const bytes = Buffer.from(await exported.arrayBuffer());
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(hash);

    // And no one, admin included, can change it any more.
    const admin = await tokenOf('admin@demo.test');
    const patch = await call(admin, 'PATCH', `/datasets/${datasetId}`, { title: 'forged' });
    expect(patch.status).toBe(409);
    expect(patch.json.error.code).toBe('dataset_locked');
  });

  it('a steward reads the audit log of the lock', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'steward@demo.test');
    await page.getByTestId('nav-audit').click();
    await page.getByTestId('audit-row').filter({ hasText: 'dataset.lock' }).waitFor();
    await browser.screenshot(page, 'datasets-audit');
    await context.close();
  });

  it('an invited person sets a first password from the mail and signs in', async () => {
    const admin = await tokenOf('admin@demo.test');
    const email = `invited-${Date.now()}@example.test`;
    const invite = await call(admin, 'POST', '/users', {
      email,
      displayName: 'Aiko Brandt',
      role: 'reviewer',
    });
    expect(invite.status).toBe(201);
    const box = (await call(admin, 'GET', '/dev/mailbox')).json as Array<{
      envelope: { to: string[] };
      text: string;
    }>;
    const text = box.find((m) => m.envelope.to.includes(email))?.text ?? '';
    const path = /\/welcome\/\S+/.exec(text)?.[0];
    expect(path).toBeDefined();
    const { page, context } = await browser.newPage();
    await page.goto(path!);
    await page.getByTestId('welcome-password').fill('a long first password');
    await page.getByTestId('welcome-again').fill('a long first password');
    await page.getByTestId('welcome-submit').click();
    await page.getByTestId('welcome-done').waitFor();
    await browser.screenshot(page, 'datasets-welcome');
    await page.goto('/sign-in');
    await page.getByTestId('sign-in-email').fill(email);
    await page.getByTestId('sign-in-password').fill('a long first password');
    await page.getByTestId('sign-in-submit').click();
    await page.getByTestId('current-user').filter({ hasText: 'Aiko Brandt' }).waitFor();
    await context.close();
  });

  it('no request went to another host', () => {
    expect(browser.foreignRequests()).toEqual([]);
  });
});
