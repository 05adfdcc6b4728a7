import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import type { Discretization, ProbeRecord } from '../../../sim/result.js';
import { crossing50, probeStats } from '../../../src/output/crossing.js';
import { addSummarySection, buildSummary, sha256Hex, summaryToJson } from '../../../src/output/summary.js';
import { fromMicrostrip } from '../../../sim/lines/freq-model.js';
import { lineOf, net as testNet, stepSignal } from '../../support/nets.js';

describe('first 50 % crossing (analytic linear ramps)', () => {
  it('finds a rising ramp crossing exactly at its midpoint when a sample sits there', () => {
    // 0 → 4 V over samples 0..4 with dt = 0.5 s: the ramp's midpoint is sample 2, t = 1 s.
    expect(crossing50([0, 1, 2, 3, 4], 0.5)).toEqual({ level: 2, time: 1, direction: 'rising' });
  });

  it('interpolates linearly between samples, still exactly at the midpoint', () => {
    // 0 → 3 V over samples 0..3: level 1.5 V halfway between samples 1 and 2, t = 1.5·dt.
    expect(crossing50([0, 1, 2, 3], 0.5)).toEqual({ level: 1.5, time: 0.75, direction: 'rising' });
  });

  it('handles flat tails before and after a ramp, and falling edges', () => {
    // Ramp from sample 2 (3.3 V) to sample 6 (0 V): midpoint at sample 4.
    const v = [3.3, 3.3, 3.3, 2.475, 1.65, 0.825, 0, 0, 0];
    const c = crossing50(v, 1e-9);
    expect(c.direction).toBe('falling');
    expect(c.level).toBe(1.65);
    expect(c.time).toBe(4e-9);
  });

  it('reports the first crossing of a ringing edge, not a later one', () => {
    // Overshoots and rings back below the level before settling at 2.
    const c = crossing50([0, 0.5, 3, 0.5, 2, 2], 1);
    expect(c.level).toBe(1);
    expect(c.time).toBe(1 + 0.5 / 2.5);
  });

  it('gives null with a reason when the record ends where it started', () => {
    const pulse = crossing50([0, 1, 3, 1, 0], 1);
    expect(pulse.time).toBeNull();
    expect(pulse.reason).toMatch(/no net transition/);
    expect(crossing50([], 1).time).toBeNull();
    const unstable = crossing50([0, NaN, 1], 1);
    expect(unstable.time).toBeNull();
    expect(unstable.reason).toMatch(/non-finite/);
  });

  it('with a given level (the settled 50 % of a net), times a pulse by its first arrival', () => {
    // 1.5 V is crossed upward between samples 1 (1 V) and 2 (3 V): at 1 + 0.5/2
    expect(crossing50([0, 1, 3, 1, 0], 1, { level: 1.5, direction: 'rising' })).toEqual({ level: 1.5, time: 1.25, direction: 'rising' });
    // falling: from 3 V down through 2 V between samples 0 and 1
    expect(crossing50([3, 1, 3], 2, { level: 2, direction: 'falling' }).time).toBe(1);
    expect(crossing50([0, 1, 0], 1, { level: 2, direction: 'rising' }).reason).toMatch(/never crosses 2 V upward/);
    expect(crossing50([0, 1], 1, { reason: 'no DC path' })).toEqual({ level: null, time: null, direction: null, reason: 'no DC path' });
  });

  it('computes min, max, initial and final', () => {
    const s = probeStats([1, -2, 5, 4], 0.1);
    expect([s.min, s.max, s.initial, s.final]).toEqual([-2, 5, 1, 4]);
  });
});

describe('summary.json', () => {
  const discretization: Discretization = {
    dt: 1e-11,
    steps: 8,
    duration: 8e-11,
    cells: 4,
    nodes: 5,
    segments: [{ name: 'trace', length: 0.1, cells: 4, cellLength: 0.025, delay: 4e-11, z0: 50, courant: 1 }],
    dtRule: { rule: 'edge', edge: 2e-10, cellsPerRise: 20 },
  };
  // Two probes over 5 samples at 2e-11 s: a linear ramp 0 → 2 V and a pulse that returns to 0.
  const record: ProbeRecord = {
    names: ['tx', 'rx'],
    dtSample: 2e-11,
    values: ndarray(new Float64Array([0, 0.5, 1, 1.5, 2, 0, 1, 3, 1, 0]), [2, 5]),
  };
  // the segment's line: 50 Ω, 0.4 ns/m (a constant line: Z0 = √(L′/C′) at every frequency)
  const demoNet = testNet({ signal: stepSignal(1, 1e-10), rs: 50, route: [{ kind: 'line', name: 'trace', line: lineOf(50, 4e-10), length: 0.1 }] });
  const summary = buildSummary({
    scenario: { file: 'nets/demo.json', sha256: sha256Hex('{"title":"t"}'), title: 'Demo net' },
    net: demoNet,
    discretization,
    record,
  });

  it('names the tool and version from package.json and hashes the scenario bytes', async () => {
    const pkg = JSON.parse((await import('node:fs')).readFileSync('package.json', 'utf8'));
    expect(summary.tool).toEqual({ name: 'ladderwave', version: pkg.version });
    // SHA-256 of the bytes {"title":"t"}, computed independently with `sha256sum`.
    expect(summary.scenario).toEqual({
      file: 'nets/demo.json',
      sha256: 'fd32f01954a82d8192431bf0c8d2fe22d8c10a9d62a1f4aad96228b065e6cc65',
      title: 'Demo net',
    });
    expect(summary.format).toBe(1);
  });

  it('holds the discretization and the record layout, each segment with its labelled Z0', () => {
    const { segments, ...rest } = summary.discretization;
    const { segments: planned, ...plan } = discretization;
    // the engine's data, and the rule that set Δt in words
    expect(rest).toEqual({ ...plan, dtReason: 'fastest edge 200 ps / cellsPerRise 20' });
    expect(segments).toEqual([{ ...planned[0], z0: expect.closeTo(50, 12), z0Basis: 'constant', z0At: null, z0HighFrequency: expect.closeTo(50, 12) }]);
    expect(summary.record).toEqual({ samples: 5, dtSample: 2e-11, end: 8e-11 });
  });

  it('gives per-probe min, max, final and the 50 % crossing, keyed by name in probe order', () => {
    expect(Object.keys(summary.probes)).toEqual(['tx', 'rx']);
    expect(summary.probes.tx).toEqual({
      min: 0,
      max: 2,
      initial: 0,
      final: 2,
      crossing50: { level: 1, time: 4e-11, direction: 'rising' },
    });
    expect(summary.probes.rx.max).toBe(3);
    expect(summary.probes.rx.crossing50.time).toBeNull();
    expect(summary.probes.rx.crossing50.reason).toBeTruthy();
  });

  it('takes extra sections from other modules and serializes to plain JSON', () => {
    const s = buildSummary({ scenario: summary.scenario, net: demoNet, discretization, record });
    addSummarySection(s, 'checks', { passed: 1, failed: 0, results: [] });
    expect(() => addSummarySection(s, 'checks', { passed: 0, failed: 0, results: [] })).toThrow(/already/);
    const back = JSON.parse(summaryToJson(s));
    expect(back.checks).toEqual({ passed: 1, failed: 0, results: [] });
    expect(back.probes.rx.crossing50.time).toBeNull();
    expect(summaryToJson(s).endsWith('}\n')).toBe(true);
    expect(Object.keys(back)).toEqual(['format', 'tool', 'scenario', 'discretization', 'record', 'probes', 'checks']);
  });
});

describe('summary.json: a segment’s Z0 is the figure `line` prints', () => {
  it('gives a geometry line’s quasi-static Z0 at its reference frequency and the high-frequency limit, not the engine’s fitted value', () => {
    // FR-4 microstrip, 1 oz on 5 mil: the quasi-static Hammerstad–Jensen Z0 at 1 GHz (what `line` prints
    // first) and √(L∞/C∞) (its "high-frequency limit" line).
    const b = fromMicrostrip({ width: 9 * 25.4e-6, height: 5 * 25.4e-6, thickness: 35e-6, er: 4.1, lossTangent: 0.018, at: 1e9 });
    const line = { r: b.line.rdc, l: b.line.lInf, g: 0, c: b.line.cInf, wideband: b.line };
    const n = testNet({ signal: stepSignal(1, 1e-10), rs: 20, route: [{ kind: 'line', name: 'top', line, length: 0.0254 }] });
    const d: Discretization = {
      dt: 1e-12, steps: 1, duration: 1e-12, cells: 1, nodes: 2, dtRule: { rule: 'duration', duration: 1e-12, steps: 1 },
      segments: [{ name: 'top', length: 0.0254, cells: 1, cellLength: 0.0254, delay: 1e-10, z0: 51.3, courant: 1 }],
    };
    const record: ProbeRecord = { names: ['p'], dtSample: 1e-12, values: ndarray(new Float64Array([0, 1]), [1, 2]) };
    const seg = buildSummary({ scenario: { file: 'f', sha256: 'x', title: 't' }, net: n, discretization: d, record }).discretization.segments[0];
    expect(seg.z0).toBeCloseTo(b.z0, 9);
    expect(seg.z0Basis).toBe('quasi-static');
    expect(seg.z0At).toBe(1e9);
    expect(seg.z0HighFrequency).toBeCloseTo(Math.sqrt(b.line.lInf / b.line.cInf), 9);
  });
});
