// Watch mode in a real browser (Debian's Chromium through playwright-core; test/support/browser.ts):
// the page served by the watch server reloads by itself when the scenario file is rewritten, and shows
// the new result; a file saved with a mistake puts the problem, with its key path, on the page over the
// last good result; fixing it reloads the page again. The waveform must change as Ohm's law says: a
// 1 V step from a 50 Ω driver, through a matched 50 Ω line, into a resistive receiver R settles at
// R / (R + 50 Ω) — 0.5 V for 50 Ω, 0.75 V for 150 Ω, 2/3 V for 100 Ω (the voltage divider: Horowitz &
// Hill, The Art of Electronics, 3rd ed., §1.2.3, section number from memory; the lossless line drops
// nothing at DC). The session stops by itself within the test's time.
//
// LADDERWAVE_SCREENSHOTS=DIR keeps a screenshot of each step in DIR.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import { startWatch, type WatchSession } from '../../../src/explore/watch.js';
import { launchBrowser, needBrowser, watchPage, type Browser } from '../../support/browser.js';
import { tempDirs, writeScenario } from '../cli/fixtures.js';

const newDir = tempDirs('lw-watch-browser-');
const SHOTS = process.env.LADDERWAVE_SCREENSHOTS;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });

const net = (receiver: unknown, length: unknown = '10cm') => ({
  title: 'Watch test: a matched line into a resistor',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '0.2ns', rise: '100ps' }, resistance: '50ohm' },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length }],
  receiver: { parts: [{ r: receiver }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '3ns' },
});

let browser: Browser | undefined;
afterAll(async () => browser?.close());

async function shot(page: Page, name: string): Promise<void> {
  if (SHOTS) await page.screenshot({ path: join(SHOTS, `watch-${name}.png`), fullPage: false });
}

/** The rx probe's last value, as the page's probe table holds it. */
const finalRx = (page: Page) => page.locator('#probes tbody tr:has(th:text-is("rx")) td:nth-child(6)').getAttribute('data-value').then(Number);

describe('watch mode in headless Chromium', { timeout: 150_000 }, () => {
  it('reloads with the new result on a save, and shows a saved mistake with its key path', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const d = newDir();
    const file = writeScenario(d, 'net.json', net('50ohm'));
    let session: WatchSession | undefined;
    browser = await launchBrowser();
    try {
      session = await startWatch({ file, outDir: join(d, 'out'), settle: 50, stopAfter: 140_000 });
      const page = await browser.context.newPage();
      const seen = watchPage(page, (u) => u.startsWith(session!.url));
      await page.goto(session.url);
      await page.waitForSelector('body[data-ready="true"]');
      expect(Math.abs((await finalRx(page)) - 0.5)).toBeLessThan(1e-9);
      await shot(page, '1-first');

      // a changed resistor: the page reloads by itself with the new waveform
      let reloaded = page.waitForEvent('load');
      writeFileSync(file, JSON.stringify(net('150ohm'), null, 2));
      await reloaded;
      await page.waitForSelector('body[data-ready="true"]');
      expect(Math.abs((await finalRx(page)) - 0.75)).toBeLessThan(1e-9);
      await shot(page, '2-changed');

      // a mistake: listed with its file position and key path, over the last good result
      writeFileSync(file, JSON.stringify(net('150ohm', '-3in'), null, 2));
      await page.waitForSelector('#problems:not([hidden])');
      const item = page.locator('#problems li.problem-item');
      expect(await item.getAttribute('data-path')).toBe('route[0].length');
      expect(await item.textContent()).toMatch(/net\.json:\d+:\d+route\[0\]\.length "-3in" — expected a length/);
      expect(Math.abs((await finalRx(page)) - 0.75)).toBeLessThan(1e-9); // still the last good run
      await shot(page, '3-mistake');

      // fixed: reloads, no banner, the new divider
      reloaded = page.waitForEvent('load');
      writeFileSync(file, JSON.stringify(net('100ohm'), null, 2));
      await reloaded;
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('#problems').isHidden()).toBe(true);
      expect(Math.abs((await finalRx(page)) - 2 / 3)).toBeLessThan(1e-9);
      await shot(page, '4-fixed');

      expect(seen.problems).toEqual([]);
      expect(seen.requests).toEqual([]);
    } finally {
      await session?.close();
    }
  });

  it('shows the problems alone when the file has never run, and the run after a good save', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const d = newDir();
    const file = writeScenario(d, 'net.json', net('50ohm', '-3in'));
    let session: WatchSession | undefined;
    browser ??= await launchBrowser();
    try {
      session = await startWatch({ file, outDir: join(d, 'out'), settle: 50, stopAfter: 100_000 });
      const page = await browser.context.newPage();
      const seen = watchPage(page, (u) => u.startsWith(session!.url));
      await page.goto(session.url);
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('#problems li.problem-item').getAttribute('data-path')).toBe('route[0].length');
      expect(await page.locator('#problems').textContent()).toContain('Nothing has run yet.');
      expect(await page.locator('#waveforms').count()).toBe(0);
      await shot(page, '5-never-ran');

      const reloaded = page.waitForEvent('load');
      writeFileSync(file, JSON.stringify(net('50ohm'), null, 2));
      await reloaded;
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('#problems').isHidden()).toBe(true);
      expect(Math.abs((await finalRx(page)) - 0.5)).toBeLessThan(1e-9);
      expect(seen.problems).toEqual([]);
      expect(seen.requests).toEqual([]);
    } finally {
      await session?.close();
    }
  });
});
