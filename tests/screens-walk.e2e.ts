import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, signInPage, type TestBrowser } from './support/browser.js';
import { apiCall, signInApi } from './support/api.js';
import { startServer, type TestServer } from './support/server.js';

/**
 * Every screen in every role, as a person walks them: each is photographed into the test
 * artifacts (test-artifacts/screens/walk-*.png) and read for what a person would notice — a
 * label, hint or select value cut short, a hint lying over the next field, content wider than
 * the page, or a placeholder word ("undefined", "NaN") where a value belongs.
 */
const PASSWORD = 'traceloom-demo';

/** The harmonic trap, Z_L = q^(L/2)/(1 - q^L), with its grand check (fast). */
const TRAP = {
  format: 'traceloom.gas/1',
  title: 'harmonic trap, walk',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '12',
  nMax: 4,
  classTable: 3,
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  grand: { kind: 'expression', expression: 'qpoch(-kappa*q^(1/2), q, inf)' },
};
/** Z(N) of the trap times q^(-N^2/2) is 1/(q;q)_N; row 2's q^2 coefficient is planted wrong. */
const TABLE = [
  'N,value,note',
  '1,1 + q + q^2 + q^3 + O(q^4),',
  '2,1 + q + 3*q^2 + O(q^3),planted',
  '3,1 + q + 2*q^2 + 3*q^3 + O(q^4),',
  '',
].join('\n');

let server: TestServer;
let browser: TestBrowser;
const ids = {} as {
  study: string;
  gas: string;
  run: string;
  reference: string;
  locked: string;
  hash: string;
  approved: string;
  draft: string;
};

const call = (token: string | null, method: string, path: string, body?: unknown) =>
  apiCall(server.baseUrl, token, method, path, body);

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser(server.baseUrl);
});

/** Through the API: a finished run, a reference table compared with it, three datasets. */
async function setUp(): Promise<void> {
  const sign = (who: string) => signInApi(server.baseUrl, `${who}@demo.test`, PASSWORD);
  const [author, reviewer, steward] = [
    await sign('author'),
    await sign('reviewer'),
    await sign('steward'),
  ];
  const [study] = (await call(author.token, 'GET', '/studies')).json;
  ids.study = study.id;
  // The demo study has the reviewer and the steward as members (the seed).
  const gas = await call(author.token, 'POST', `/studies/${study.id}/gases`, { spec: TRAP });
  expect(gas.status).toBe(201);
  ids.gas = gas.json.id;
  const run = await call(author.token, 'POST', `/gases/${ids.gas}/runs`, {});
  ids.run = run.json.id;
  await expect
    .poll(async () => (await call(author.token, 'GET', `/runs/${ids.run}`)).json.status, {
      timeout: 60_000,
    })
    .toBe('done');
  // The datasets first: the planted mistake of the table below would fail their checks.
  const dataset = async (title: string) =>
    (await call(author.token, 'POST', `/runs/${ids.run}/datasets`, { title })).json.id as string;
  const review = async (id: string) => {
    await call(author.token, 'POST', `/datasets/${id}/review-requests`, {
      reviewerIds: [reviewer.id],
    });
    const verdict = { verdict: 'approve', comment: 'Reproduced every row.' };
    expect((await call(reviewer.token, 'POST', `/datasets/${id}/reviews`, verdict)).status).toBe(
      201,
    );
  };
  ids.locked = await dataset('Trap table, locked (walk)');
  await review(ids.locked);
  const lock = await call(steward.token, 'POST', `/datasets/${ids.locked}/lock`);
  expect(lock.status, lock.text).toBe(200);
  ids.hash = lock.json.hash;
  ids.approved = await dataset('Trap table, approved (walk)');
  await review(ids.approved);
  ids.draft = await dataset('Trap table, draft (walk)');
  const form = new FormData();
  form.append('file', new Blob([TABLE], { type: 'text/csv' }), 'walk-table.csv');
  form.append('title', "colleague's preprint, table 2 (walk)");
  form.append('normalization', 'q^(-N^2/2)');
  const up = await fetch(`${server.baseUrl}/api/studies/${study.id}/references`, {
    method: 'POST',
    headers: { authorization: `Bearer ${reviewer.token}` },
    body: form,
  });
  expect(up.status).toBe(201);
  ids.reference = ((await up.json()) as { id: string }).id;
  const compared = await call(reviewer.token, 'POST', `/runs/${ids.run}/comparisons`, {
    referenceId: ids.reference,
  });
  expect(compared.status).toBe(201);
}

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** What a person would notice on the screen now, one sentence each. */
async function findings(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const visible = (el: Element) => {
      const r = el.getBoundingClientRect();
      return r.width > 0 && r.height > 0 && getComputedStyle(el).visibility !== 'hidden';
    };
    const text = (el: Element) => (el.textContent ?? '').replace(/\s+/g, ' ').trim();
    const cut = [
      'mat-label',
      '.mdc-floating-label',
      '.mat-mdc-form-field-hint',
      '.mat-mdc-select-value-text',
      '.mdc-button__label',
      '.mat-mdc-tab .mdc-tab__text-label',
      'th',
    ];
    for (const el of Array.from(document.querySelectorAll(cut.join(',')))) {
      if (!visible(el)) continue;
      // An inline element has no box width of its own: judge the box that clips it.
      let box: Element | null = el;
      while (box && getComputedStyle(box).display === 'inline') box = box.parentElement;
      if (!box) continue;
      const clips = getComputedStyle(box).overflowX !== 'visible';
      if (clips && box.scrollWidth > box.clientWidth + 1) out.push(`cut short: "${text(el)}"`);
    }
    // The hint's own box: a long hint overflows the fixed-height line under its field.
    const hints = Array.from(document.querySelectorAll('mat-hint, mat-error')).filter(visible);
    const boxes = Array.from(document.querySelectorAll('.mat-mdc-text-field-wrapper')).filter(
      visible,
    );
    for (const hint of hints) {
      const field = hint.closest('mat-form-field');
      const h = hint.getBoundingClientRect();
      for (const box of boxes) {
        if (box.closest('mat-form-field') === field) continue;
        const b = box.getBoundingClientRect();
        const w = Math.min(h.right, b.right) - Math.max(h.left, b.left);
        const ht = Math.min(h.bottom, b.bottom) - Math.max(h.top, b.top);
        if (w > 2 && ht > 2 && text(hint)) out.push(`hint "${text(hint)}" lies over another field`);
      }
    }
    const pane = document.querySelector('mat-sidenav-content') ?? document.scrollingElement!;
    if (pane.scrollWidth > pane.clientWidth + 1)
      out.push(`wider than the page by ${pane.scrollWidth - pane.clientWidth}px`);
    const body = document.body.innerText;
    for (const word of ['undefined', 'NaN', '[object Object]']) {
      if (body.includes(word)) out.push(`shows "${word}"`);
    }
    return out;
  });
}

/** Waits until nothing loads, photographs the screen and returns what was noticed on it. */
async function look(page: Page, name: string): Promise<string[]> {
  await page
    .locator('mat-progress-bar')
    .first()
    .waitFor({ state: 'detached', timeout: 20_000 })
    .catch(() => undefined);
  await page.waitForTimeout(400);
  await browser.screenshot(page, `walk-${name}`);
  return (await findings(page)).map((f) => `${name}: ${f}`);
}

type Role = 'author' | 'reviewer' | 'steward' | 'admin';

/** The screens each role reaches; the run's tabs are opened one by one. */
function screens(role: Role): Array<[name: string, path: string]> {
  const all: Array<[string, string]> = [
    ['studies', '/studies'],
    ['study', `/studies/${ids.study}`],
    ['gas', `/gases/${ids.gas}`],
    ['run', `/runs/${ids.run}`],
    ['reference', `/references/${ids.reference}`],
    ['datasets', '/datasets'],
    ['dataset-locked', `/datasets/${ids.locked}`],
    ['dataset-approved', `/datasets/${ids.approved}`],
    ['dataset-draft', `/datasets/${ids.draft}`],
    ['guide', '/help'],
  ];
  if (role === 'author' || role === 'steward')
    all.push(['gas-new', `/studies/${ids.study}/gases/new`]);
  if (role === 'reviewer' || role === 'steward') all.push(['reviews', '/reviews']);
  if (role === 'steward' || role === 'admin') all.push(['audit', '/audit']);
  if (role === 'admin') all.push(['users', '/admin/users'], ['mailbox', '/admin/mailbox']);
  return all;
}

const RUN_TABS = ['Class table', 'Checks', 'Plots', 'Large N'];

describe('every screen in every role', () => {
  it('shows nothing cut, overlapping or placeholder-worded', async () => {
    await setUp();
    const noticed: string[] = [];
    // TRACELOOM_WALK_ROLES=reviewer,admin walks some roles only (while fixing a screen).
    const wanted = process.env.TRACELOOM_WALK_ROLES?.split(',');
    const roles = (['author', 'reviewer', 'steward', 'admin'] as const).filter(
      (r) => !wanted || wanted.includes(r),
    );
    for (const role of roles) {
      const { page, context } = await browser.newPage();
      await signInPage(page, `${role}@demo.test`, PASSWORD);
      for (const [name, path] of screens(role)) {
        await page.goto(path);
        await page.locator('h1').first().waitFor({ timeout: 20_000 });
        noticed.push(...(await look(page, `${role}-${name}`)));
        if (name === 'run') {
          for (const tab of RUN_TABS) {
            await page.getByRole('tab', { name: tab }).click();
            if (tab === 'Checks') {
              // a chosen table shows its title and normalization in the select: all of it
              await page.getByTestId('compare-reference').click();
              await page.getByRole('option').first().click();
            }
            noticed.push(
              ...(await look(page, `${role}-run-${tab.toLowerCase().replace(' ', '-')}`)),
            );
          }
        }
      }
      await context.close();
    }
    const { page, context } = await browser.newPage();
    await page.goto(`/public/${ids.hash}`);
    await page.locator('h1').first().waitFor();
    noticed.push(...(await look(page, 'public-dataset')));
    await page.goto('/sign-in');
    await page.getByTestId('sign-in-email').waitFor();
    noticed.push(...(await look(page, 'sign-in')));
    await context.close();
    expect(noticed).toEqual([]);
    expect(browser.foreignRequests()).toEqual([]);
  }, 600_000);
});
