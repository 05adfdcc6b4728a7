// The report's tables read summary.json: every number cell names its path and value, and its text is
// that value with an SI prefix (BIPM, The International System of Units, 9th ed., table 7).
import { describe, expect, it } from 'vitest';
import { at, checksTable, eyeTable, formatCell, measurementTable, type ReportSummary } from '../../../src/report/tables.js';
import { EYE_MIN_WINDOWS, fewWindowsNote } from '../../../src/views/eye.js';

function cells(html: string): { path: string; value: string; text: string }[] {
  return [...html.matchAll(/data-path="([^"]*)" data-value="([^"]*)">([^<]*)</g)].map((m) => ({ path: m[1], value: m[2], text: m[3] }));
}

describe('measurement table', () => {
  it('without a measurement section: min, max, final and the 50 % crossing from "probes"', () => {
    const summary: ReportSummary = {
      probes: { rx: { min: -0.0123, max: 3.456, final: 3.3, crossing50: { time: 1.2345e-9, level: 1.65 } } },
    };
    const t = measurementTable(summary);
    expect(t.source).toBe('probes');
    const c = cells(t.html);
    expect(c.map((x) => x.path)).toEqual(['probes.rx.min', 'probes.rx.max', 'probes.rx.final', 'probes.rx.crossing50.time']);
    expect(c.map((x) => x.text)).toEqual(['-12.3 mV', '3.456 V', '3.3 V', '1.234 ns']);
    for (const x of c) expect(Number(x.value)).toBe(at(summary, x.path.split('.')));
  });

  it('with measurements: the worst value over the edges, pointing at the edge it came from', () => {
    const edge = (direction: string, d: number, ov: number) => ({ direction, duration1090: d, overshootPct: ov, undershootPct: null, ringbackV: null, settling: [] });
    const summary: ReportSummary = {
      measurements: {
        rx: {
          levels: { low: 0, high: 3.3 },
          edges: [edge('rising', 1e-9, 4), edge('falling', 2e-9, 12.5), edge('rising', 1.5e-9, 3)],
          delays: [{ delay50: 1e-9 }, { delay50: 1.1e-9 }],
          min: -0.1,
          max: 3.7,
          final: 3.3,
        },
      },
    };
    const c = cells(measurementTable(summary).html);
    const byPath = Object.fromEntries(c.map((x) => [x.path, x.text]));
    expect(byPath['measurements.rx.edges.2.duration1090']).toBe('1.5 ns'); // slowest rising edge
    expect(byPath['measurements.rx.edges.1.duration1090']).toBe('2 ns'); // the falling edge
    expect(byPath['measurements.rx.edges.1.overshootPct']).toBe('12.5 %');
    expect(byPath['measurements.rx.delays.1.delay50']).toBe('1.1 ns');
  });

  it('shows a missing value as a dash, and whole counts exactly', () => {
    expect(formatCell(null, 'V')).toBe('—');
    expect(formatCell(123457, '')).toBe('123457');
  });
});

describe('checks table', () => {
  it('says PASS and FAIL in words and counts them', () => {
    const summary: ReportSummary = {
      checks: {
        passed: 1,
        failed: 1,
        results: [
          { probe: 'rx', metric: 'overshoot', limit: 'max 10 %', measuredText: '4 %', pass: true, message: 'ok' },
          { probe: 'rx', metric: 'max', limit: 'max 0.1 V', measuredText: '3.7 V', pass: false, message: '<too high>' },
        ],
      },
    };
    const t = checksTable(summary)!;
    expect([t.passed, t.failed]).toEqual([1, 1]);
    expect(t.html).toContain('>PASS<');
    expect(t.html).toContain('>FAIL<');
    expect(t.html).toContain('&lt;too high&gt;');
  });

  it('is absent without checks', () => {
    expect(checksTable({})).toBeNull();
  });
});

describe('eye table', () => {
  // An eye folded from fewer than EYE_MIN_WINDOWS windows is not one to trust (common practice: a handful
  // of bits shows neither the pattern's worst case nor its spread); the run skips its picture, and the
  // report's table must say so beside the numbers instead of printing them as if they held.
  const eye = (windows: number, notes: Record<string, string>) => ({
    eye: { probe: 'rx', eyeHeight: 3.27, eyeWidth: 61.6e-9, ui: 62.5e-9, windows, open: true, threshold: { level: 1.4 }, samplingWindow: { width: 12.5e-9 }, samplingTime: 34e-9, delay: 2e-9, notes, warnings: [] },
  });
  it('too few windows: the note is in the caption, with the numbers', () => {
    const html = eyeTable(eye(2, { windows: fewWindowsNote(2) }) as ReportSummary) ?? '';
    expect(EYE_MIN_WINDOWS).toBeGreaterThan(2);
    expect(html).toContain(`Note: ${fewWindowsNote(2)}.`);
    expect(html).toContain('data-path="eye.eyeHeight"');
  });
  it('enough windows: no note', () => {
    const html = eyeTable(eye(40, {}) as ReportSummary) ?? '';
    expect(html).not.toContain('Note:');
  });
  it('a closed eye is said once, not again from its note', () => {
    const s = eye(40, { eyeWidth: 'closed: some window is on the wrong side of the threshold at the sampling instant' });
    s.eye.open = false;
    const html = eyeTable(s as ReportSummary) ?? '';
    expect(html).toContain('The eye is closed at the thresholds');
    expect(html).not.toContain('Note: closed');
  });
});

describe('receiversTable', () => {
  it('lists every receiver with its probe and numbers read from summary.json, none for one receiver', async () => {
    const { receiversTable } = await import('../../../src/report/tables.js');
    const summary = {
      receivers: {
        adcA: { probe: 'adcA', recorded: true, min: -0.05, max: 3.4, final: 3.3 },
        tp: { probe: 'tp', recorded: false, min: 0, max: 0.8, final: 0.6 },
      },
    };
    const html = receiversTable(summary as never)!;
    expect(html).toContain('id="receivers"');
    expect(html).toContain('<th scope="row">adcA</th>');
    expect(html).toContain('tp (added for the run)');
    expect(html).toContain('data-path="receivers.tp.max" data-value="0.8"');
    expect(receiversTable({} as never)).toBeNull();
  });
});
