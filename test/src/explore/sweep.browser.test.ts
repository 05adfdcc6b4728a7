// A sweep's explore.html in a real browser (Debian's Chromium through playwright-core): the table lists
// every point, ticking points overlays their waveforms, and the overlaid values are each point's own.
//
// The sweep: a 1 V step from a 50 Ω driver into 10 cm of matched 50 Ω line (5 ns/m), the receiver's
// resistor R swept over 50, 100, 150 Ω. For one round trip (1 ns) the driver sees only the line: its
// pin steps to 1 V · 50/(50 + 50) = 0.5 V whatever R is (the line's input impedance is Z0 until the
// reflection returns). Once the reflection from R has come back and been absorbed by the matched driver,
// every point settles at the divider R/(R + 50 Ω): 0.5, 2/3, 0.75 V (Pozar, Microwave Engineering,
// 4th ed., §2.3 for Γ; the lossless line drops nothing at DC).
//
// LADDERWAVE_SCREENSHOTS=DIR keeps a screenshot in DIR.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulate } from '../../../sim/simulate.js';
import { probeTrace } from '../../../sim/result.js';
import { runSweep, type SweepOutcome } from '../../../src/sweep/index.js';
import { pointNet } from '../../../src/sweep/plan.js';
import { launchBrowser, needBrowser, watchPage, BROWSER_PRESENT, type Browser } from '../../support/browser.js';
import { tempDirs, writeScenario } from '../cli/fixtures.js';

declare const document: any;

const NET = {
  title: 'Explore test: a swept receiver resistor',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '0.1ns', rise: '100ps' }, resistance: '50ohm' },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length: '10cm' }],
  receiver: { parts: [{ r: '50ohm' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '3ns' },
};

const newDir = tempDirs('lw-explore-sweep-');
const SHOTS = process.env.LADDERWAVE_SCREENSHOTS;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });

let browser: Browser | undefined;
let run: { url: string; outcome: SweepOutcome };

beforeAll(async () => {
  if (!BROWSER_PRESENT) return;
  const d = newDir();
  const file = writeScenario(d, 'swept.json', NET);
  const out = join(d, 'out');
  const outcome = await runSweep({ file, vary: ['receiver.parts[0].r=50ohm..150ohm:3'] }, { out, jobs: 1, explore: true });
  run = { url: 'file://' + join(out, 'explore.html'), outcome };
  browser = await launchBrowser();
}, 120_000);
afterAll(async () => browser?.close());

/** Cursor A typed at t; each overlaid point's value there (by its legend name "point N"). */
async function readAt(page: Page, t: number): Promise<Map<string, number>> {
  await page.locator('#cursor-a').fill(String(t));
  await page.locator('#cursor-a').press('Enter');
  const cells = await page.evaluate(() =>
    [...document.querySelectorAll('#cursor-readout td[data-cursor="a"][data-probe]')].map((td: any) => [td.dataset.probe, Number(td.dataset.value)] as [string, number]),
  );
  return new Map(cells);
}

describe('explore.html of a sweep', { timeout: 120_000 }, () => {
  it('lists the points, overlays the ticked ones, and reads each point’s own samples', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const page = await browser!.context.newPage();
    const seen = watchPage(page, (u) => u === run.url);
    await page.goto(run.url, { waitUntil: 'load' });
    await page.waitForSelector('body[data-ready="true"]');

    // every point in the table, with its resistor; all three overlaid at first (three points or fewer)
    const rows = await page.evaluate(() =>
      [...document.querySelectorAll('#sweep-points tbody tr')].map((tr: any) => [Number(tr.dataset.point), Number(tr.cells[2].dataset.value), tr.querySelector('input').checked]),
    );
    expect(rows).toEqual([
      [0, 50, true],
      [1, 100, true],
      [2, 150, true],
    ]);
    // the page opens on the sweep's default probe: the receiver
    expect(await page.locator('#sweep-probe').inputValue()).toBe('rx');

    // untick point 1: the legend and the readout hold points 0 and 2
    await page.locator('#point-1').uncheck();
    expect(await page.locator('#sweep-overlay').getAttribute('data-points')).toBe('0,2');
    expect(await page.locator('#sweep-overlay .legend button').allTextContents()).toEqual(['point 0', 'point 2']);

    // each point simulated on its own, for its samples
    const plan = run.outcome.plan;
    const own = [0, 2].map((p) => {
      const r = simulate(pointNet(plan, p)).record;
      return { p, dt: r.dtSample, tx: probeTrace(r, 'tx'), rx: probeTrace(r, 'rx') };
    });
    expect(own[1]!.dt).toBe(own[0]!.dt);

    // the receiver at the end of the run: the divider R/(R + 50 Ω), each value the point's own sample
    const last = own[0]!.rx.length - 1;
    const end = await readAt(page, last * own[0]!.dt);
    expect(Math.abs(end.get('point 0')! - 0.5)).toBeLessThan(1e-6);
    expect(Math.abs(end.get('point 2')! - 0.75)).toBeLessThan(1e-6);
    for (const o of own) expect(end.get(`point ${o.p}`)).toBe(o.rx[last]);

    // the driver pin before the reflection returns: 0.5 V at every point
    await page.selectOption('#sweep-probe', 'tx');
    expect(await page.locator('#sweep-overlay').getAttribute('data-probe')).toBe('tx');
    const k = Math.round(0.8e-9 / own[0]!.dt);
    const early = await readAt(page, k * own[0]!.dt);
    for (const o of own) {
      expect(early.get(`point ${o.p}`)).toBe(o.tx[k]);
      expect(Math.abs(o.tx[k]! - 0.5)).toBeLessThan(1e-6);
    }

    // point 1 back, at the receiver: its divider 2/3
    await page.selectOption('#sweep-probe', 'rx');
    await page.locator('#point-1').check();
    const three = await readAt(page, last * own[0]!.dt);
    expect(Math.abs(three.get('point 1')! - 2 / 3)).toBeLessThan(1e-6);
    if (SHOTS) await page.screenshot({ path: join(SHOTS, 'explore-sweep.png'), fullPage: true });
    expect(seen.problems).toEqual([]);
    expect(seen.requests).toEqual([]);
  });

  it('overlays points with different time steps on the union of their instants, each its own samples there', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const d = newDir();
    const file = writeScenario(d, 'rise.json', NET);
    const out = join(d, 'out');
    const outcome = await runSweep({ file, vary: ['driver.signal.rise=100ps,160ps'] }, { out, jobs: 1, explore: true });
    const own = [0, 1].map((p) => {
      const r = simulate(pointNet(outcome.plan, p)).record;
      return { dt: r.dtSample, rx: probeTrace(r, 'rx') };
    });
    expect(own[0]!.dt).not.toBe(own[1]!.dt); // the cells follow the rise time
    const page = await browser!.context.newPage();
    const url = 'file://' + join(out, 'explore.html');
    const seen = watchPage(page, (u) => u === url);
    await page.goto(url, { waitUntil: 'load' });
    await page.waitForSelector('body[data-ready="true"]');
    expect(await page.locator('#sweep-overlay-about').textContent()).toContain('different time steps');
    // at an instant of point 0 (0.6 ns, on the edge): point 0 reads its own sample, point 1 lies between its two samples around it
    const k = Math.round(0.6e-9 / own[0]!.dt);
    const t = k * own[0]!.dt;
    const v = await readAt(page, t);
    expect(v.get('point 0')).toBe(own[0]!.rx[k]);
    const j = Math.floor(t / own[1]!.dt);
    const [a, b] = [own[1]!.rx[j]!, own[1]!.rx[j + 1]!];
    expect(v.get('point 1')).toBeGreaterThanOrEqual(Math.min(a, b) - 1e-15);
    expect(v.get('point 1')).toBeLessThanOrEqual(Math.max(a, b) + 1e-15);
    expect(Math.abs(v.get('point 1')! - (a + ((t - j * own[1]!.dt) / own[1]!.dt) * (b - a)))).toBeLessThan(1e-12);
    expect(seen.problems).toEqual([]);
    expect(seen.requests).toEqual([]);
  });
});
