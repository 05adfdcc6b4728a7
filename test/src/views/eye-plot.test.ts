// eye.png: the density is drawn where the traces are, the marks sit on the measured values.
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import type { Signal } from '../../../sim/model.js';
import { signalFunction } from '../../../sim/signals.js';
import { hexToRgb, OKABE_ITO, THEME } from '../../../src/render/palette.js';
import { encodePng, Surface } from '../../../src/render/surface.js';
import type { EyeInput } from '../../../src/views/eye.js';
import { drawEye, eyeSubtitle, renderEye } from '../../../src/views/eye-plot.js';
import { measureEye } from '../../../src/views/eye.js';
import { colorBarTicks } from '../../../src/render/heatmap.js';
import { viridis } from '../../../src/render/palette.js';

const UI = 1e-9;
const dt = 10e-12;
// The driver's own waveform as the "probe": an ideal eye of 0 … 1 V (levels exact, no channel).
const bits = Uint8Array.from([1, 1, 0, 1, 0, 0, 1, 0, 1, 1, 1, 0, 0, 0, 1, 0]);
const signal: Signal = { kind: 'bits', low: 0, high: 1, bitTime: UI, rise: 160e-12, fall: 160e-12, start: 0, bits, patternName: 'test' };
const f = signalFunction(signal);
const values = Float64Array.from({ length: 3201 }, (_, i) => f(i * dt)); // two passes of the pattern
const input: EyeInput = { signal, values, dt };

const near = (a: readonly number[], b: readonly number[], tol = 3) => a.every((v, k) => Math.abs(v - b[k]) <= tol);

describe('eye plot', () => {
  it('renders a PNG of the requested size and returns the measurement', async () => {
    const { png, eye } = await renderEye({ title: 'Eye', probe: 'rx', input, width: 900, height: 520 });
    const img = PNG.sync.read(png);
    expect([img.width, img.height]).toEqual([900, 520]);
    expect(eye.eyeHeight!).toBeCloseTo(1, 9); // lowest "1" − highest "0" of an undistorted 0/1 V signal
  });

  it('puts hits on the rails, leaves the open eye empty, and draws the height bar at the sampling instant', () => {
    const s = new Surface(1200, 700);
    const { frame, eye } = drawEye(s, { x: 0, y: 0, w: 1200, h: 700 }, { title: 'Eye', probe: 'rx', input });
    const at = (x: number, y: number) => s.getPixel(Math.floor(x), Math.floor(y));
    const background = hexToRgb(THEME.missing);
    // a rail (1 V) a quarter UI right of the sampling instant is traced (not background)
    const xRail = frame.x.map(eye.samplingOffset + UI / 4);
    expect(near(at(xRail, frame.y.map(1)), background, 0)).toBe(false);
    // the middle of the eye, off the marks, is empty
    expect(near(at(frame.x.map(eye.samplingOffset - UI / 4), frame.y.map(0.75)), background, 0)).toBe(true);
    // the eye-height bar: vermillion on the sampling column between the rails
    const mark = hexToRgb(OKABE_ITO.vermillion);
    const xs = frame.x.map(eye.samplingOffset);
    let hits = 0;
    for (let dx = -1; dx <= 1; dx++) if (near(at(xs + dx, frame.y.map(0.75)), mark, 40)) hits++;
    expect(hits).toBeGreaterThan(0);
    // the encoded image is the surface
    expect(PNG.sync.read(encodePng(s)).width).toBe(1200);
  });

  it('never prints an eye height beside "eye closed": thresholds above the swing give "closed at the thresholds"', () => {
    const closed = measureEye({ ...input, thresholds: { vih: 1.2, vil: 0.3 } });
    expect(closed.open).toBe(false);
    const text = eyeSubtitle('rx', closed);
    expect(text).toMatch(/eye closed at the thresholds/);
    expect(text).not.toMatch(/height/);
    expect(eyeSubtitle('rx', measureEye(input))).toMatch(/eye height 1 V over the sampling window \(±10 % UI\), eye width/);
  });

  it('labels the density colour bar at whole hit counts only', () => {
    const spec = { kind: 'sequential' as const, label: 'Windows', integer: true };
    expect(colorBarTicks(1, 2, spec, 8).values).toEqual([1, 2]);
    const many = colorBarTicks(1, 37, spec, 8);
    expect(many.values.every(Number.isInteger)).toBe(true);
    expect(many.labels.every((l) => /^\d+$/.test(l))).toBe(true);
  });

  it('draws a one-window eye in the darkest colour of the map, so it reads on the light background', () => {
    // the first 3 UI of the pattern: bit 1's window (centred 1.6 UI in, ±1 UI) is the only complete one
    const one: EyeInput = { signal, values: values.subarray(0, 301), dt };
    const s = new Surface(1200, 700);
    const { frame, eye } = drawEye(s, { x: 0, y: 0, w: 1200, h: 700 }, { title: 'Eye', probe: 'rx', input: one });
    expect(eye.windows).toBe(1);
    const dark = viridis(0).map(Math.round);
    // somewhere on the column 0.6 UI right of the sampling instant, on the trace, the darkest colour
    const x = Math.floor(frame.x.map(eye.samplingOffset + 0.6 * UI));
    let found = false;
    for (let y = frame.plot.y; y < frame.plot.y + frame.plot.h; y++) if (near(s.getPixel(x, y), dark, 2)) found = true;
    expect(found).toBe(true);
  });
});
