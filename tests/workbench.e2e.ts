import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, type TestBrowser } from './support/browser.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * The workbench as its users meet it: an author defines the harmonic trap through the form, runs
 * it, reads the canonical and class tables, checks a grand function and an uploaded reference
 * table; a reviewer gets a row-by-row verdict on a table dropped onto the page.
 *
 * Outside values: harmonic trap, fermions, Z_L = q^(L/2)/(1-q^L) gives Z(N) = q^(N^2/2)/(q;q)_N
 * (G. E. Andrews, The Theory of Partitions, Cor. 2.2; DLMF 17.5), so Z(3) leads with q^(9/2) and
 * Z(2) = q^2 + q^3 + 2q^4 + 2q^5 + 3q^6 + ... (coefficients floor(n/2) + 1, OEIS A008619).
 * S_4 has p(4) = 5 cycle types (OEIS A000041) with class sizes 1, 6, 3, 8, 6 summing to 4! = 24
 * (Abramowitz & Stegun Table 24.2).
 */
const PASSWORD = 'traceloom-demo';
const GAS_TITLE = `harmonic trap ${Date.now()}`;
/** A low-N table with one planted mistake: the q^5 coefficient of Z(2) is 2, not 3. */
const PREPRINT_CSV = [
  'N,value,note',
  '1,q^(1/2) + q^(3/2) + q^(5/2) + O(q^3),',
  '2,q^2 + q^3 + 2*q^4 + 3*q^5 + O(q^6),planted',
  '3,q^(9/2) + q^(11/2) + 2*q^(13/2) + O(q^7),',
  '',
].join('\n');
const BROKEN_CSV = 'N,value,note\n1,q^(1/2 + O(q^3),\n';

let server: TestServer;
let browser: TestBrowser;
let dir: string;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser(server.baseUrl);
  dir = mkdtempSync(path.join(os.tmpdir(), 'traceloom-workbench-'));
  writeFileSync(path.join(dir, 'preprint.csv'), PREPRINT_CSV);
  writeFileSync(path.join(dir, 'broken.csv'), BROKEN_CSV);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function signIn(page: Page, email: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('current-user').waitFor();
}

async function openDemoStudy(page: Page): Promise<void> {
  await page.getByTestId('nav-studies').click();
  await page.getByTestId('study-link').filter({ hasText: 'Fermions on a ring' }).click();
  await page.getByTestId('study-heading').waitFor();
}

/** True when the element is wholly inside the window (not below the fold). */
async function inViewport(page: Page, testId: string): Promise<boolean> {
  return page.getByTestId(testId).evaluate((el) => {
    const r = el.getBoundingClientRect();
    return r.top >= 0 && r.bottom <= window.innerHeight;
  });
}

async function openTab(page: Page, name: string): Promise<void> {
  await page.getByRole('tab', { name }).click();
}

/** The plain text of the comparison rows that disagree. */
async function mismatchRows(page: Page): Promise<string[]> {
  return page.locator('[data-testid="comparison-row"][data-agrees="false"]').allInnerTexts();
}

describe('workbench in the browser', () => {
  it('an author defines the harmonic trap, runs it and checks it', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'author@demo.test');
    await openDemoStudy(page);
    await browser.screenshot(page, 'workbench-study');

    await page.getByTestId('gas-new').click();
    await page.getByTestId('gas-title').waitFor();
    await browser.screenshot(page, 'workbench-gas-new');
    await page.getByTestId('gas-title').fill(GAS_TITLE);
    await page.getByTestId('gas-step').fill('1/2');
    await page.getByTestId('gas-order').fill('3/4');
    await page.getByTestId('gas-nmax').fill('8');
    await page.getByTestId('gas-classtable').fill('6');
    await page.getByTestId('gas-formula').fill('q^(L/2)/(1-q^L)');
    // A bad order is named on its field before anything is sent.
    await page.getByText('The order must be a multiple of step.').waitFor();
    await browser.screenshot(page, 'workbench-gas-invalid');
    await page.getByTestId('gas-order').fill('40');
    await page.getByTestId('preview-z-3').waitFor();
    await browser.screenshot(page, 'workbench-gas-preview');

    await page.getByTestId('gas-save').click();
    await page.waitForURL(/\/gases\/[0-9a-f-]{36}$/);
    await page.getByTestId('gas-heading').filter({ hasText: GAS_TITLE }).waitFor();
    await page.getByTestId('gas-version-1').waitFor();

    // Save brings the Run button into view; Run opens the run's page and follows it live.
    expect(await page.getByTestId('run-start').isVisible()).toBe(true);
    expect(await inViewport(page, 'run-start')).toBe(true);
    await browser.screenshot(page, 'workbench-after-save');
    await page.getByTestId('run-start').click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.getByTestId('run-heading').waitFor();
    await browser.screenshot(page, 'workbench-run-progress');
    await page.getByTestId('canonical-table').waitFor({ timeout: 60_000 });
    expect(await page.getByTestId('run-page-status').innerText()).toContain('Done');
    const lead3 = page.getByTestId('canonical-lead-3');
    expect(await lead3.getAttribute('data-plain')).toBe('q^(9/2)');
    expect(await page.getByTestId('canonical-agree-3').innerText()).toMatch(/agree/);
    await page.getByTestId('canonical-expand-2').click();
    const plain2 = await page.getByTestId('canonical-detail-2').locator('code').innerText();
    expect(plain2.startsWith('q^2 + q^3 + 2*q^4 + 2*q^5 + 3*q^6')).toBe(true);
    await browser.screenshot(page, 'workbench-canonical');

    await openTab(page, 'Class table');
    await page.getByTestId('classes-n').click();
    await page.getByRole('option', { name: /N = 4 / }).click();
    await expect.poll(() => page.getByTestId('class-row').count()).toBe(5);
    const sizes = await page.locator('[data-testid="class-row"] td:nth-child(2)').allInnerTexts();
    expect(sizes.map(Number).sort((a, b) => a - b)).toEqual([1, 3, 6, 6, 8]);
    await browser.screenshot(page, 'workbench-class-table');

    await openTab(page, 'Checks');
    await page.getByTestId('reference-upload-toggle').click();
    await page.getByTestId('reference-file').setInputFiles(path.join(dir, 'broken.csv'));
    await page.getByTestId('reference-row-errors').waitFor();
    expect(await page.getByTestId('reference-row-errors').innerText()).toMatch(/Line 2/);
    expect(await page.getByTestId('reference-save').isDisabled()).toBe(true);
    await browser.screenshot(page, 'workbench-reference-errors');
    await page.getByTestId('reference-file').setInputFiles(path.join(dir, 'preprint.csv'));
    await page.getByTestId('reference-title').fill('colleague preprint, table 1');
    await expect.poll(() => page.getByTestId('reference-preview-row').count()).toBe(3);
    await page.getByTestId('reference-row-errors').waitFor({ state: 'detached' });
    await browser.screenshot(page, 'workbench-reference-preview');
    await page.getByTestId('reference-save').click();
    await page.getByTestId('comparison').first().waitFor();
    const mismatches = await mismatchRows(page);
    expect(mismatches).toHaveLength(1);
    expect(mismatches[0]).toMatch(/^2\s/);
    expect(mismatches[0]).toMatch(/q\^5/);
    // The Z_L the table implies beside the entered ones, each only as far as its rows reach:
    // Z_2 = Z_1^2 - 2 Z(2) is known below q^(7/2) only, so the planted q^5 cannot show there.
    const implied = page.getByTestId('comparison-implied-weights').first();
    await implied.waitFor();
    const impliedRows = await implied.locator('tbody tr').allInnerTexts();
    expect(impliedRows).toHaveLength(3);
    expect(impliedRows[0]).toMatch(/the same: agrees below q\^3/);
    expect(impliedRows[1]).toMatch(/the same: agrees below q\^\(7\/2\)/);
    await browser.screenshot(page, 'workbench-checks-reference');

    await openTab(page, 'Plots');
    await page.getByTestId('plot-coefficients').locator('canvas').waitFor();
    await page.waitForTimeout(300);
    await browser.screenshot(page, 'workbench-plots');

    // A second version with the closed form's coefficients as the grand function to check.
    await page.getByRole('link', { name: GAS_TITLE }).click();
    await page.getByTestId('gas-grand-coefficients').click();
    await page
      .getByTestId('gas-grand-values')
      .fill(
        ['1', 'q^(1/2)/(1-q)', 'q^2/((1-q)*(1-q^2))', 'q^(9/2)/((1-q)*(1-q^2)*(1-q^3))'].join('\n'),
      );
    await page.getByTestId('gas-save').click();
    await page.getByTestId('gas-version-2').waitFor();
    await page.getByTestId('gas-version-1').click();
    await page.getByTestId('gas-latest').waitFor();
    expect(await page.getByTestId('gas-title').isDisabled()).toBe(true);
    await browser.screenshot(page, 'workbench-gas-old-version');
    await page.getByTestId('gas-latest').click();
    await page.getByTestId('run-row').first().waitFor();
    expect(await page.getByTestId('run-row').first().getAttribute('data-status')).toBe('done');
    await browser.screenshot(page, 'workbench-run-history');
    await page.getByTestId('run-start').click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    await page.getByTestId('canonical-table').waitFor({ timeout: 60_000 });
    await openTab(page, 'Checks');
    await page.getByTestId('grand-check').waitFor();
    await page.getByTestId('matrix-all-agree').waitFor();
    expect(await page.locator('[data-testid^="matrix-row-"]').count()).toBe(4);
    await browser.screenshot(page, 'workbench-checks-grand');

    await page.getByTestId('nav-help').click();
    await page.getByTestId('help-article').waitFor();
    await page.locator('[data-testid="help-article"] h1').first().waitFor();
    await browser.screenshot(page, 'workbench-help');
    await context.close();
  });

  it('a reviewer drops a reference table onto a run and gets a row-by-row verdict', async () => {
    const { page, context } = await browser.newPage();
    await signIn(page, 'reviewer@demo.test');
    await openDemoStudy(page);
    await page
      .getByTestId('gas-row')
      .filter({ hasText: GAS_TITLE })
      .getByTestId('gas-link')
      .click();
    await page.getByTestId('gas-read-only').waitFor();
    expect(await page.getByTestId('run-start').count()).toBe(0);
    await page.getByTestId('run-link').first().click();
    await openTab(page, 'Checks');
    await page.getByTestId('reference-upload-toggle').click();
    // the upload panel renders after the click: wait for its drop zone before dropping a file
    await page.getByTestId('reference-drop').waitFor();
    await page.evaluate((text) => {
      const drop = document.querySelector('[data-testid="reference-drop"]')!;
      const data = new DataTransfer();
      data.items.add(new File([text], 'reviewer-table.csv', { type: 'text/csv' }));
      drop.dispatchEvent(
        new DragEvent('dragover', { dataTransfer: data, bubbles: true, cancelable: true }),
      );
      drop.dispatchEvent(
        new DragEvent('drop', { dataTransfer: data, bubbles: true, cancelable: true }),
      );
    }, PREPRINT_CSV);
    await expect.poll(() => page.getByTestId('reference-preview-row').count()).toBe(3);
    await page.getByTestId('reference-save').click();
    await page.locator('[data-testid="comparison"][data-total="3"]').first().waitFor();
    const first = page.getByTestId('comparison').first();
    expect(await first.getAttribute('data-agreeing')).toBe('2');
    expect(await first.getByTestId('comparison-normalization').innerText()).toBe('1');
    const mismatches = await mismatchRows(page);
    expect(mismatches.length).toBeGreaterThanOrEqual(1);
    expect(mismatches[0]).toMatch(/differs/);
    await browser.screenshot(page, 'workbench-reviewer-verdict');
    await context.close();
  });

  it('no request went to another host', () => {
    expect(browser.foreignRequests()).toEqual([]);
  });
});
