// Debian's Chromium, headless, through playwright-core (no browser download), for the tests of the HTML
// pages. Without /usr/bin/chromium a browser test is skipped with its reason, unless
// LADDERWAVE_REQUIRE_BROWSER=1 (set by .ci/run, which installs the package): then it fails.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';
export const BROWSER_REQUIRED = process.env.LADDERWAVE_REQUIRE_BROWSER === '1';
export const BROWSER_PRESENT = existsSync(CHROMIUM);

/** Skips the test when there is no browser (or throws when one is required). Returns false when skipped. */
export function needBrowser(ctx: { skip: (note?: string) => void }): boolean {
  if (BROWSER_PRESENT) return true;
  if (BROWSER_REQUIRED) throw new Error(`LADDERWAVE_REQUIRE_BROWSER=1 but ${CHROMIUM} is missing (apt-get install chromium)`);
  ctx.skip(`${CHROMIUM} not found: install Debian's chromium package to test the pages in a real browser`);
  return false;
}

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** One headless browser with a throw-away profile, no background networking, a fixed window size. */
export async function launchBrowser(): Promise<Browser> {
  const { chromium } = await import('playwright-core');
  const profile = mkdtempSync(join(tmpdir(), 'lw-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 900 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Everything a page says that a clean page must not: console errors, page errors, and every request other than `allowed`. */
export function watchPage(page: Page, allowed: (url: string) => boolean): { problems: string[]; requests: string[] } {
  const out = { problems: [] as string[], requests: [] as string[] };
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') out.problems.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on('pageerror', (e) => out.problems.push(`page error: ${e.message}`));
  page.on('request', (r) => {
    if (!allowed(r.url())) out.requests.push(r.url().slice(0, 120));
  });
  return out;
}
