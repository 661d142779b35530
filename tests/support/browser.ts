import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
/** Screenshots land here (git-ignored); CI keeps them as artifacts. */
export const artifactsDir = path.join(root, 'test-artifacts', 'screens');

/**
 * A headless Debian chromium (fresh temporary profile per launch, made by playwright) that records
 * every request the pages make.
 */
export interface TestBrowser {
  browser: Browser;
  newPage: () => Promise<{ page: Page; context: BrowserContext }>;
  /** Hosts other than the app's own that any page asked for (must stay empty). */
  foreignRequests: () => string[];
  screenshot: (page: Page, name: string) => Promise<void>;
  close: () => Promise<void>;
}

export async function launchBrowser(baseUrl: string): Promise<TestBrowser> {
  const browser = await chromium.launch({
    executablePath: process.env.TRACELOOM_CHROMIUM ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
  const own = new URL(baseUrl).host;
  const foreign: string[] = [];
  mkdirSync(artifactsDir, { recursive: true });
  return {
    browser,
    newPage: async () => {
      const context = await browser.newContext({
        baseURL: baseUrl,
        viewport: { width: 1366, height: 820 },
      });
      context.on('request', (request) => {
        const url = new URL(request.url());
        if (url.protocol.startsWith('http') && url.host !== own) foreign.push(request.url());
        if (url.protocol === 'ws:' || url.protocol === 'wss:') foreign.push(request.url());
      });
      return { page: await context.newPage(), context };
    },
    foreignRequests: () => [...foreign],
    screenshot: async (page, name) => {
      // The app scrolls inside its content pane, not the document: grow the window to the
      // pane's whole height for the picture, so nothing below the fold is left out.
      const size = page.viewportSize();
      const extra = await page.evaluate(() => {
        const pane = document.querySelector('mat-sidenav-content');
        return pane ? Math.max(0, pane.scrollHeight - pane.clientHeight) : 0;
      });
      if (size && extra > 0) {
        await page.setViewportSize({
          width: size.width,
          height: Math.min(size.height + extra, 8000),
        });
      }
      await page.screenshot({ path: path.join(artifactsDir, `${name}.png`), fullPage: true });
      if (size && extra > 0) await page.setViewportSize(size);
    },
    close: async () => {
      await browser.close();
    },
  };
}

/** Signs in through the sign-in page and waits for the top bar to show the user. */
export async function signInPage(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByTestId('sign-in-email').fill(email);
  await page.getByTestId('sign-in-password').fill(password);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('current-user').waitFor();
}
