// report.html in a real browser: Debian's Chromium, headless, driven by playwright-core (no browser is
// downloaded). The page must load without console errors, decode every image at the size its PNG header
// states (PNG specification, ISO/IEC 15948, IHDR), show its text as written (escaped, no markup from the
// scenario), and show in its tables exactly the numbers in summary.json.
//
// Without /usr/bin/chromium the test is skipped with a reason — unless LADDERWAVE_REQUIRE_BROWSER=1
// (set by .ci/run, which installs the package), where a missing browser is a failure.
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runScenarioFile, type RunReport } from '../../../src/index.js';
import { pngSize } from '../../../src/report/png-size.js';
import { at } from '../../../src/report/tables.js';
import { tempDir, writeScenario } from '../cli/fixtures.js';

// The functions passed to page.evaluate run in the page; this file is type-checked without the DOM
// library (it would leak into the whole project's check), so the page's globals are declared loosely.
declare const document: any;
type PageElement = { dataset: Record<string, string | undefined>; textContent: string | null; id: string };
type PageImage = PageElement & { src: string; naturalWidth: number; naturalHeight: number; decode(): Promise<void> };

const CHROMIUM = '/usr/bin/chromium';
const REQUIRED = process.env.LADDERWAVE_REQUIRE_BROWSER === '1';
const PRESENT = existsSync(CHROMIUM);

const TITLE = 'Report <check> & "quotes"';
const DESCRIPTION = 'A clock over a short trace. <script>document.title = "hacked"</script> Text & symbols stay text.';

/** A 250 MHz clock through a slightly mismatched 10 cm trace into 3 pF: rings a little; 20 unit intervals. */
const SCENARIO = {
  title: TITLE,
  description: DESCRIPTION,
  driver: {
    signal: { kind: 'clock', low: '0V', high: '3.3V', period: '4ns', duty: 0.5, rise: '300ps', fall: '300ps', start: '0.5ns' },
    resistance: '20ohm',
  },
  route: [
    { name: 'rs', series: { r: '22ohm' } },
    { name: 'trace', line: { z0: '50ohm', delay: '6ns/m' }, length: '10cm' },
    { name: 'pad', shunt: [{ c: '0.5pF' }] },
  ],
  receiver: { parts: [{ c: '3pF' }] },
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
  run: { duration: '40ns' },
  checks: [
    { probe: 'rx', metric: 'overshoot', max: '50%' },
    { probe: 'rx', metric: 'max', max: '0.1V' }, // fails on purpose
  ],
};

const dirs: string[] = [];
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

async function writeReport(): Promise<{ out: string; report: RunReport }> {
  const d = tempDir('lw-report-');
  dirs.push(d);
  const file = writeScenario(d, 'clock.json', SCENARIO);
  const out = join(d, 'out');
  const report = await runScenarioFile(file, out, {
    views: ['waveforms', 'map', 'bounce', 'eye'],
    report: true,
  });
  return { out, report };
}

const PREFIX: Record<string, number> = { f: 1e-15, p: 1e-12, n: 1e-9, µ: 1e-6, m: 1e-3, '': 1, k: 1e3, M: 1e6, G: 1e9 };

/** The number a table cell shows: "−12.3 mV" → −0.0123; "12.5 %" → 12.5; "1.0000" → 1. */
function shownNumber(text: string): number {
  const m = /^([-−]?\d+(?:\.\d+)?(?:e[-+]?\d+)?)\s*([fpnµmkMG]?)(Ω\/m|Ω|V|s|m|%|)$/.exec(text.trim());
  if (!m) throw new Error(`not a number with a unit: '${text}'`);
  const prefix = m[3] === '%' || m[3] === '' ? 1 : PREFIX[m[2]];
  const base = Number(m[1].replace('−', '-'));
  return m[3] === '' && m[2] ? base * PREFIX[m[2]] : base * prefix;
}

describe('report.html in headless Chromium', { timeout: 120_000 }, () => {
  it('loads without console errors, decodes every image at its size, and matches summary.json', async (ctx) => {
    if (!PRESENT) {
      if (REQUIRED) throw new Error(`LADDERWAVE_REQUIRE_BROWSER=1 but ${CHROMIUM} is missing (apt-get install chromium)`);
      ctx.skip(`${CHROMIUM} not found: install Debian's chromium package to test the report in a real browser`);
      return;
    }
    const { chromium } = await import('playwright-core');
    const { out, report } = await writeReport();
    expect(report.files.map((f) => f.slice(out.length + 1))).toEqual([
      'probes.csv',
      'waveforms.png',
      'map.png',
      'bounce.png',
      'eye.png',
      'report.html',
      'summary.json',
    ]);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));

    const profile = mkdtempSync(join(tmpdir(), 'lw-chromium-'));
    dirs.push(profile);
    const browser = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
    try {
      const page = await browser.newPage();
      const problems: string[] = [];
      page.on('console', (m) => {
        if (m.type() === 'error') problems.push(`console: ${m.text()}`);
      });
      page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
      page.on('requestfailed', (r) => problems.push(`request failed: ${r.url().slice(0, 80)}`));
      await page.goto('file://' + join(out, 'report.html'), { waitUntil: 'load' });

      // Every image decodes, at the size of the PNG file of the same name in the output folder.
      const images = await page.evaluate(async () =>
        Promise.all(
          [...(document.images as PageImage[])].map(async (img) => {
            let decoded = true;
            await img.decode().catch(() => (decoded = false));
            return { file: img.dataset.file ?? '', decoded, w: img.naturalWidth, h: img.naturalHeight, external: !img.src.startsWith('data:image/png;base64,') };
          }),
        ),
      );
      expect(images.map((i) => i.file)).toEqual(['waveforms.png', 'map.png', 'bounce.png', 'eye.png']);
      for (const img of images) {
        const size = pngSize(readFileSync(join(out, img.file)));
        expect(img).toEqual({ file: img.file, decoded: true, w: size.width, h: size.height, external: false });
      }

      // The scenario's text is shown as written and runs nothing.
      const text = await page.evaluate(() => ({
        title: document.title,
        h1: document.querySelector('h1')?.textContent,
        description: document.querySelector('.description')?.textContent,
        scripts: document.scripts.length,
        svgText: document.querySelector('svg.route')?.textContent ?? '',
      }));
      expect(text.h1).toBe(TITLE);
      expect(text.title.startsWith(TITLE)).toBe(true);
      expect(text.description).toBe(DESCRIPTION);
      expect(text.scripts).toBe(0);
      expect(text.svgText).toContain('trace');
      expect(text.svgText).toContain('Z0 50 Ω');

      // Every number cell: its value is the one at its path in summary.json, and its text shows that value.
      const cells = await page.evaluate(() =>
        [...(document.querySelectorAll('[data-path]') as PageElement[])].map((c) => ({ path: c.dataset.path!, value: c.dataset.value!, text: c.textContent! })),
      );
      const tables = new Set(await page.evaluate(() => [...(document.querySelectorAll('table') as PageElement[])].map((t) => t.id)));
      expect([...tables]).toEqual(['checks', 'measurements', 'eye', 'discretization', 'segments']);
      expect(cells.filter((c) => c.path.startsWith('measurements.')).length).toBeGreaterThanOrEqual(2 * 6);
      for (const c of cells) {
        const expected = at(summary, c.path.split('.').map((k: string) => (/^\d+$/.test(k) ? Number(k) : k)));
        if (c.value === '') {
          expect(expected ?? null, c.path).toBeNull();
          expect(c.text, c.path).toBe('—');
          continue;
        }
        expect(Number(c.value), c.path).toBe(expected);
        const shown = shownNumber(c.text);
        // four significant digits (counts exact, Courant to four decimals)
        expect(Math.abs(shown - (expected as number)), `${c.path}: '${c.text}'`).toBeLessThanOrEqual(Math.abs(expected as number) * 5e-4 + 5e-5 * (c.path.endsWith('courant') ? 1 : 0) + 1e-30);
      }

      // Checks: one row per result, PASS/FAIL as in summary.json.
      const verdicts = await page.evaluate(() => [...(document.querySelectorAll('#checks tbody tr td.verdict') as PageElement[])].map((td) => td.textContent));
      expect(verdicts).toEqual(summary.checks.results.map((r: { pass: boolean }) => (r.pass ? 'PASS' : 'FAIL')));
      expect(verdicts).toContain('FAIL');

      expect(problems).toEqual([]);
    } finally {
      await browser.close();
    }
  });
});
