// explore.html in a real browser (Debian's Chromium through playwright-core; see test/support/browser.ts).
// The page must load without console errors and without a single request; a dragged box must zoom the
// time axis to the dragged interval (within a pixel); a cursor must read probes.csv's value at its
// instant; the time slider must show the engine's voltages along the route at the recorded instant;
// and a measured number must put the cursors where it was measured — checked against the IEEE 181
// definitions (the 50 % reference level is crossed at the 50 % instant; a settling time is the span from
// the 50 % instant to the settling instant, IEEE Std 181-2011 §5.3.3 and §5.8).
//
// LADDERWAVE_SCREENSHOTS=DIR keeps a screenshot of each step in DIR.
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulate } from '../../../sim/simulate.js';
import { runScenarioFile, type RunReport } from '../../../src/index.js';
import { readScenarioFile } from '../../../src/output/run.js';
import { formatSI } from '../../../src/units.js';
import { launchBrowser, needBrowser, watchPage, BROWSER_PRESENT, type Browser } from '../../support/browser.js';
import { tempDirs, writeScenario } from '../cli/fixtures.js';

// The functions passed to page.evaluate run in the page; this file is type-checked without the DOM library.
declare const document: any;

/** A 1 V step through a series resistor into 15 cm of 50 Ω line, a pad capacitance, 5 cm more, and an RC receiver: rings, then settles. */
const SCENARIO = {
  title: 'Explore test: a stepped line with a pad',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '0.5ns', rise: '200ps' }, resistance: '20ohm' },
  route: [
    { name: 'rs', series: { r: '10ohm' } },
    { name: 'trace', line: { z0: '50ohm', delay: '6ns/m' }, length: '15cm' },
    { name: 'pad', shunt: [{ c: '1pF' }] },
    { name: 'tail', line: { z0: '50ohm', delay: '6ns/m' }, length: '5cm' },
  ],
  receiver: { parts: [{ r: '1kohm' }, { c: '2pF' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '15ns' },
  checks: [
    { probe: 'rx', metric: 'overshoot', max: '50%' },
    { probe: 'rx', metric: 'settling', max: '8ns' },
  ],
};

const newDir = tempDirs('lw-explore-');
const SHOTS = process.env.LADDERWAVE_SCREENSHOTS;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });

let browser: Browser | undefined;
/** One page for the whole file (each test leaves it usable for the next); what it said, over its whole life. */
let shared: { page: Page; seen: ReturnType<typeof watchPage> } | undefined;
let run: { out: string; file: string; report: RunReport; csv: number[][]; summary: any };

beforeAll(async () => {
  if (!BROWSER_PRESENT) return;
  const d = newDir();
  const file = writeScenario(d, 'pad.json', SCENARIO);
  const out = join(d, 'out');
  const report = await runScenarioFile(file, out, { explore: true });
  const csv = readFileSync(join(out, 'probes.csv'), 'utf8')
    .trim()
    .split('\n')
    .slice(1)
    .map((line) => line.split(',').map(Number));
  const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
  run = { out, file, report, csv, summary };
  browser = await launchBrowser();
}, 120_000);
afterAll(async () => browser?.close());

async function openPage(): Promise<{ page: Page; seen: ReturnType<typeof watchPage> }> {
  if (shared) return shared;
  const url = 'file://' + join(run.out, 'explore.html');
  const page = await browser!.context.newPage();
  const seen = watchPage(page, (u) => u === url);
  await page.goto(url, { waitUntil: 'load' });
  await page.waitForSelector('body[data-ready="true"]');
  shared = { page, seen };
  return shared;
}

async function shot(page: Page, name: string, selector?: string): Promise<void> {
  if (!SHOTS) return;
  const path = join(SHOTS, `explore-${name}.png`);
  if (selector) await page.locator(selector).screenshot({ path });
  else await page.screenshot({ path, fullPage: true });
}

const cellValue = (page: Page, selector: string) => page.locator(selector).getAttribute('data-value').then((v) => (v === null || v === '' ? null : Number(v)));

describe('explore.html in headless Chromium', { timeout: 120_000 }, () => {
  it('loads without console errors or any request, and shows every section', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const { page, seen } = await openPage();
    const sections = await page.evaluate(() => [...document.querySelectorAll('main > section')].map((s: any) => s.id));
    expect(sections).toEqual(['waveforms', 'route', 'numbers', 'notes']);
    const tables = await page.evaluate(() => [...document.querySelectorAll('#numbers table')].map((t: any) => t.id));
    expect(tables).toEqual(['checks', 'probes', 'edges-tx', 'edges-rx']);
    await shot(page, 'page');
    expect(seen.problems).toEqual([]);
    expect(seen.requests).toEqual([]);
  });

  it('zooms the time axis to a dragged box, within a pixel', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const { page, seen } = await openPage();
    const box = (await page.locator('#waveform-chart .u-over').boundingBox())!;
    const before = await page.locator('#waveform-view').evaluate((e: any) => ({ x0: Number(e.dataset.xMin), x1: Number(e.dataset.xMax) }));
    const px0 = 0.23 * box.width, px1 = 0.61 * box.width;
    await page.mouse.move(box.x + px0, box.y + 0.2 * box.height);
    await page.mouse.down();
    await page.mouse.move(box.x + px1, box.y + 0.75 * box.height, { steps: 8 });
    await page.mouse.up();
    const after = await page.locator('#waveform-view').evaluate((e: any) => ({ x0: Number(e.dataset.xMin), x1: Number(e.dataset.xMax) }));
    const perPixel = (before.x1 - before.x0) / box.width;
    expect(Math.abs(after.x0 - (before.x0 + px0 * perPixel))).toBeLessThanOrEqual(perPixel);
    expect(Math.abs(after.x1 - (before.x0 + px1 * perPixel))).toBeLessThanOrEqual(perPixel);
    await shot(page, 'zoomed', '#waveforms');
    // and back
    await page.locator('#waveform-whole').click();
    const whole = await page.locator('#waveform-view').evaluate((e: any) => ({ x0: Number(e.dataset.xMin), x1: Number(e.dataset.xMax) }));
    expect(whole).toEqual({ x0: 0, x1: run.csv[run.csv.length - 1][0] });
    expect(seen.problems).toEqual([]);
  });

  it('reads the probe values of probes.csv at a cursor, to the digits it prints', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const { page, seen } = await openPage();
    const header = ['time', 'tx', 'rx'];
    for (const frac of [0.1, 0.23, 0.5]) {
      const i = Math.round(frac * (run.csv.length - 1));
      const row = run.csv[i];
      await page.locator('#cursor-a').fill(String(row[0]));
      await page.locator('#cursor-a').press('Enter');
      expect(await cellValue(page, '#cursor-readout td[data-cursor="a"]:not([data-probe])')).toBe(row[0]);
      for (const probe of ['tx', 'rx']) {
        const cell = page.locator(`#cursor-readout td[data-cursor="a"][data-probe="${probe}"]`);
        const v = row[header.indexOf(probe)];
        expect(Number(await cell.getAttribute('data-value'))).toBe(v);
        expect(await cell.textContent()).toBe(formatSI(v, 'V', 4));
      }
    }
    await shot(page, 'cursor', '#waveforms');
    expect(seen.problems).toEqual([]);
  });

  it('shows the engine’s voltages along the route at the instant the slider chooses', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const { page, seen } = await openPage();
    const { net } = await readScenarioFile(run.file);
    const rm = simulate(net, { routeMap: {} }).routeMap!;
    const [rows, cols] = rm.values.shape;
    await page.locator('#route details summary').click();
    for (const t of [1.1e-9, 2.45e-9, 9e-9]) {
      const r = Math.round(t / rm.dtRow); // the recorded instant nearest t
      await page.locator('#map-time').fill(String(r));
      expect(Number(await page.locator('#map-time-text').getAttribute('data-time'))).toBe(r * rm.dtRow);
      const shown = await page.evaluate(() =>
        [...document.querySelectorAll('#profile-table-0 td[data-column]')].map((td: any) => ({ c: Number(td.dataset.column), v: Number(td.dataset.value) })),
      );
      expect(shown.map((s) => s.c)).toEqual(Array.from({ length: cols }, (_, c) => c));
      // the page holds the map in single precision: each value is the engine's, rounded to float32
      for (const s of shown) expect(s.v).toBe(Math.fround(rm.values.get(r, s.c)));
      expect(r).toBeLessThan(rows);
    }
    await shot(page, 'route', '#route');
    expect(seen.problems).toEqual([]);
  });

  it('puts the cursors where a measurement was taken when its number is pressed', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const { page, seen } = await openPage();
    const m = run.summary.measurements.rx;
    const edge = m.edges[0];
    const rxAtA = () => cellValue(page, '#cursor-readout td[data-cursor="a"][data-probe="rx"]');
    const tA = () => cellValue(page, '#cursor-readout td[data-cursor="a"]:not([data-probe])');

    // the 50 % instant: the waveform is at the 50 % reference level there (IEEE 181 §5.3.3)
    await page.locator('#edges-rx tbody tr:nth-child(1) td:nth-child(2) button').click();
    expect(await tA()).toBe(edge.t50);
    const mid = (m.levels.low + m.levels.high) / 2;
    expect(Math.abs((await rxAtA())! - mid)).toBeLessThanOrEqual(1e-9 * m.levels.amplitude);

    // settling: cursor A at the 50 % instant, B at the settling instant, Δt = the settling time
    await page.locator('#edges-rx tbody tr:nth-child(1) td:nth-child(7) button').click();
    expect(await tA()).toBe(edge.t50);
    expect(await cellValue(page, '#cursor-readout td[data-cursor="b"]:not([data-probe])')).toBe(edge.settling[0].settledAt);
    expect(Math.abs((await cellValue(page, '#cursor-dt'))! - edge.settling[0].time)).toBeLessThanOrEqual(1e-21);

    // the overshoot check: cursor A at the worst overshoot, where rx is the high level plus the overshoot
    await page.locator('#checks tbody tr:nth-child(1) td:nth-child(4) button').click();
    const check = run.summary.checks.results[0];
    const worst = m.edges.find((e: any) => e.overshootPct === check.measured);
    expect(await tA()).toBe(worst.overshootTime);
    expect(Math.abs((await rxAtA())! - (worst.toLevel + worst.overshootV))).toBeLessThanOrEqual(1e-12);
    expect(await page.locator('.cursor-about').first().textContent()).toContain('overshoot');
    await shot(page, 'measured', '#waveforms');
    expect(seen.problems).toEqual([]);
    expect(seen.requests).toEqual([]);
  });
});
