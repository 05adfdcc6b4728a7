// explore.html of a branched net in a real browser (Debian's Chromium through playwright-core): the
// route section offers one path per receiver, shows the chosen one, and its profile at an instant is
// both the engine's record along that path and the lattice solution of a T of matched lines.
//
// The net: a 1 V step from a 50 Ω driver into 10 cm of 50 Ω line (5 ns/m), a T, then 10 cm on to the
// main receiver and 20 cm to a second one, both 50 Ω. The wave launched is V⁺ = 1 V · 50/(50 + 50) =
// 0.5 V. At the T the incident line sees two 50 Ω lines in parallel, 25 Ω: Γ = (25 − 50)/(25 + 50) =
// −1/3, so both arms carry (1 + Γ)·V⁺ = 1/3 V and −1/6 V returns along the trunk, leaving 1/3 V behind
// it; the matched ends and the matched driver reflect nothing more. Γ = (Z_L − Z0)/(Z_L + Z0): Pozar,
// Microwave Engineering, 4th ed., §2.3; the waves followed one by one as in the lattice (Bergeron)
// method. The same T is checked on the engine's record in test/sim/route-map.test.ts.
//
// LADDERWAVE_SCREENSHOTS=DIR keeps a screenshot of each step in DIR.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulate } from '../../../sim/simulate.js';
import type { RouteMapRecord } from '../../../sim/result.js';
import { runScenarioFile } from '../../../src/index.js';
import { readScenarioFile } from '../../../src/output/run.js';
import { launchBrowser, needBrowser, watchPage, BROWSER_PRESENT, type Browser } from '../../support/browser.js';
import { tempDirs, writeScenario } from '../cli/fixtures.js';

declare const document: any;

const TEE = {
  title: 'Explore test: a T of matched lines',
  driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '100ps', rise: '50ps' }, resistance: '50ohm' },
  lines: { trace: { z0: '50ohm', delay: '5ns/m' } },
  route: [
    { name: 'trunk', line: 'trace', length: '10cm' },
    { name: 'tee', branch: { route: [{ name: 'arm', line: 'trace', length: '20cm' }], receiver: { name: 'far', parts: [{ r: '50ohm' }] } } },
    { name: 'tail', line: 'trace', length: '10cm' },
  ],
  receiver: { name: 'near', parts: [{ r: '50ohm' }] },
  run: { duration: '3ns' },
};

const newDir = tempDirs('lw-explore-tee-');
const SHOTS = process.env.LADDERWAVE_SCREENSHOTS;
if (SHOTS) mkdirSync(SHOTS, { recursive: true });

let browser: Browser | undefined;
let run: { url: string; rm: RouteMapRecord };

beforeAll(async () => {
  if (!BROWSER_PRESENT) return;
  const d = newDir();
  const file = writeScenario(d, 'tee.json', TEE);
  const out = join(d, 'out');
  await runScenarioFile(file, out, { explore: true, views: [] });
  const { net } = await readScenarioFile(file);
  run = { url: 'file://' + join(out, 'explore.html'), rm: simulate(net, { routeMap: {} }).routeMap! };
  browser = await launchBrowser();
}, 120_000);
afterAll(async () => browser?.close());

/** The profile table of path p as the page shows it: column, distance, voltage. */
async function profile(page: Page, p: number): Promise<{ c: number; x: number; v: number }[]> {
  await page.locator(`#path-${p} details`).evaluate((d: any) => (d.open = true));
  return page.evaluate(
    (p: number) =>
      [...document.querySelectorAll(`#profile-table-${p} tbody tr`)].map((tr: any) => ({
        x: Number(tr.cells[0].dataset.value),
        c: Number(tr.cells[1].dataset.column),
        v: Number(tr.cells[1].dataset.value),
      })),
    p,
  );
}

describe('explore.html of a branched net', { timeout: 120_000 }, () => {
  it('offers one path per receiver and shows the chosen one: the engine’s record and the T’s lattice values', async (ctx) => {
    if (!needBrowser(ctx)) return;
    const page = await browser!.context.newPage();
    const seen = watchPage(page, (u) => u === run.url);
    await page.goto(run.url, { waitUntil: 'load' });
    await page.waitForSelector('body[data-ready="true"]');

    const options = await page.locator('#map-path option').evaluateAll((os: any[]) => os.map((o) => [o.value, o.textContent]));
    expect(options).toEqual([
      ['0', 'main path to near'],
      ['1', 'branch to far'],
      ['all', 'every path (2), one under another'],
    ]);
    expect(await page.locator('#path-0').isVisible()).toBe(true);
    expect(await page.locator('#path-1').isVisible()).toBe(false);

    // 0.8 ns after the step's 50 % instant (0.125 ns): the fronts are 6 cm past the T (at 0.1 m, 0.5 ns away)
    const t = 0.925e-9;
    const r = Math.round(t / run.rm.dtRow);
    await page.locator('#map-time').fill(String(r));
    await page.selectOption('#map-path', '1');
    expect(await page.locator('#path-0').isVisible()).toBe(false);
    expect(await page.locator('#path-1').isVisible()).toBe(true);
    expect(await page.locator('#path-1 h3').textContent()).toBe('Branch: driver pin to far');

    for (const p of [0, 1]) {
      const path = run.rm.paths[p];
      const shown = await profile(page, p);
      // the engine's record along this path, in single precision
      expect(shown.map((s) => s.c)).toEqual(Array.from(path.columns));
      shown.forEach((s, k) => {
        expect(s.x).toBe(path.positions[k]);
        expect(s.v).toBe(Math.fround(run.rm.values.get(r, s.c)));
      });
      // the lattice values away from the fronts (a 50 ps edge spans 1 cm of line)
      const tFront = r * run.rm.dtRow - 0.125e-9;
      const reflected = 0.1 - (tFront / 5e-9 - 0.1); // the returning −1/6 V front on the trunk (m)
      const forward = tFront / 5e-9; // the forward front on the arm (m from the driver pin)
      const end = path.positions[path.positions.length - 1];
      const checked = new Map<number, number>();
      for (const s of shown) {
        const want = s.x < reflected - 0.01 ? 0.5 : s.x > reflected + 0.01 && s.x < forward - 0.01 ? 1 / 3 : s.x > forward + 0.01 ? 0 : null;
        if (want === null) continue;
        expect(Math.abs(s.v - want), `path ${p} at ${s.x} m`).toBeLessThan(5e-3);
        checked.set(want, (checked.get(want) ?? 0) + 1);
      }
      expect([...checked.keys()].sort()).toEqual([0, 1 / 3, 0.5]);
      for (const n of checked.values()) expect(n).toBeGreaterThan(3);
      expect(end).toBeCloseTo(p === 0 ? 0.2 : 0.3, 12);
    }
    if (SHOTS) await page.locator('#route').screenshot({ path: join(SHOTS, 'explore-branch-far.png') });

    await page.selectOption('#map-path', 'all');
    expect(await page.locator('#path-0').isVisible()).toBe(true);
    expect(await page.locator('#path-1').isVisible()).toBe(true);
    // the branch point names the path that leaves there, on each path's profile labels (drawn) and in the data
    const junctions = await page.evaluate(() => JSON.parse(document.getElementById('lw-data').textContent).run.map.paths.map((p: any) => p.junctions));
    expect(junctions[0]).toEqual([{ item: 'tee', at: expect.closeTo(0.1, 12), receivers: ['far'] }]);
    expect(seen.problems).toEqual([]);
    expect(seen.requests).toEqual([]);
  });
});
