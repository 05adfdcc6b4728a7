// "checks" and "thresholds" in scenario files: what loads, and every problem with its key path,
// value, what was expected and line:col.
import { describe, expect, it } from 'vitest';
import { netChecks, netLevelMethod, netThresholds } from '../../../src/scenario/checks.js';
import { checkScenario, checkScenarioValue } from '../../../src/scenario/load.js';

const BASE = {
  driver: { signal: { kind: 'step', from: '0V', to: '3.3V', start: '1ns', rise: '500ps' }, resistance: '20ohm' },
  route: [{ name: 'trace', line: { z0: '50ohm', delay: '5ns/m' }, length: '10cm' }],
  probes: [
    { name: 'tx', at: 'driver' },
    { name: 'rx', at: 'receiver' },
  ],
};

describe('valid checks and thresholds', () => {
  it('parse limits into SI values and keep file order; probe thresholds override the scenario', () => {
    const r = checkScenarioValue({
      ...BASE,
      probes: [{ name: 'tx', at: 'driver' }, { name: 'rx', at: 'receiver', thresholds: { vih: '1.7V', vil: '0.7V' } }],
      thresholds: 'lvcmos33',
      checks: [
        { probe: 'rx', metric: 'overshoot', max: '10%' },
        { probe: 'rx', metric: 'settling', max: '5ns', band: '3%' },
        { probe: 'rx', metric: 'ringback', max: '200mV' },
        { probe: 'rx', metric: 'delay', min: '100ps', max: 1.2e-9 },
        { probe: 'tx', metric: 'crossings', max: 1, edges: 'rising' },
        { probe: 'rx', metric: 'noiseMarginHigh', min: '0.4V' },
        { probe: 'rx', metric: 'monotonic' },
      ],
    });
    expect(r.problems).toEqual([]);
    const checks = netChecks(r.net!);
    expect(checks.map((c) => c.metric)).toEqual(['overshoot', 'settling', 'ringback', 'delay', 'crossings', 'noiseMarginHigh', 'monotonic']);
    expect(checks[0]!.max).toEqual({ value: 10, unit: '%', text: '10%' });
    expect(checks[1]!.band).toEqual({ value: 3, unit: '%', text: '3%' });
    expect(checks[2]!.max!.value).toBeCloseTo(0.2, 15);
    // A plain number is in SI base units, as for every scenario quantity: 1.2e-9 for a delay is seconds.
    expect(checks[3]!.max).toEqual({ value: 1.2e-9, unit: 's', text: '1.2e-9' });
    expect(checks[3]!.min!.value).toBeCloseTo(1e-10, 22);
    expect(checks[4]!.edges).toBe('rising');
    // JEDEC JESD8C.01 LVCMOS 3.3 V: VIH 2.0 V, VIL 0.8 V (as in src/measure's preset table).
    expect(netThresholds(r.net!, 'tx')).toMatchObject({ vih: 2.0, vil: 0.8, preset: 'lvcmos33' });
    expect(netThresholds(r.net!, 'rx')).toEqual({ vih: 1.7, vil: 0.7 });
  });

  it('a preset at another supply scales VIH/VIL with VDD (0.65/0.35·VDD for 1.8 V LVCMOS)', () => {
    const r = checkScenarioValue({ ...BASE, thresholds: { preset: 'lvcmos18', vdd: '1.71V' } });
    expect(netThresholds(r.net!, 'rx')!.vih).toBeCloseTo(0.65 * 1.71, 12);
    expect(netThresholds(r.net!, 'rx')!.vil).toBeCloseTo(0.35 * 1.71, 12);
  });

  it('a scenario without checks has none (and no extra fields on the net)', () => {
    const r = checkScenarioValue(BASE);
    expect(netChecks(r.net!)).toEqual([]);
    expect(Object.keys(r.net!)).not.toContain('checks');
  });
});

describe('problems, each with key path, value and expectation', () => {
  const text = JSON.stringify(
    {
      ...BASE,
      thresholds: { vih: '0.8V', vil: '2.0V' },
      probes: [{ name: 'tx', at: 'driver', thresholds: 'lvcmos34' }, { name: 'rx', at: 'receiver' }],
      checks: [
        { probe: 'rxx', metric: 'overshoot', max: '10%' },
        { probe: 'rx', metric: 'overshot', max: '10%' },
        { probe: 'rx', metric: 'overshoot', max: '5ns' },
        { probe: 'rx', metric: 'settling' },
        { probe: 'rx', metric: 'ringback', max: '0.2V', band: '3%' },
        { probe: 'rx', metric: 'delay', min: '2ns', max: '1ns' },
        { probe: 'rx', metric: 'min', max: '1V', edges: 'rising' },
        { probe: 'rx', metric: 'rise', max: '1ns', lmit: '2ns' },
        { probe: 'rx', metric: 'settling', max: '3ns', band: '-1%' },
        'overshoot < 10%',
      ],
    },
    null,
    2,
  );
  const r = checkScenario(text, 'bad.json');
  const at = (path: string) => r.problems.find((p) => p.path === path);

  it.each([
    ['thresholds.vil', '2.0V', /a "vil" below "vih"/],
    ['probes[0].thresholds', 'lvcmos34', /a preset name .*did you mean "lvcmos33"\?/],
    ['checks[0].probe', 'rxx', /the name of a probe \("tx", "rx"\) — did you mean "rx"\?/],
    ['checks[1].metric', 'overshot', /a metric: one of .* — did you mean "overshoot"\?/],
    ['checks[2].max', '5ns', /a limit for "overshoot" in volts \("0.2V"\) or a percentage of the swing \("10%"\)/],
    ['checks[3]', { probe: 'rx', metric: 'settling' }, /a "max" and\/or "min" limit for "settling" in a time \("5ns"\)/],
    ['checks[4].band', '3%', /no "band" on metric "ringback"/],
    ['checks[5].min', '2ns', /a "min" no larger than "max"/],
    ['checks[6].edges', 'rising', /no "edges" on metric "min"/],
    ['checks[7].lmit', '2ns', /a known key — did you mean "min"\? \(keys here: probe, metric, max, min, band, edges\)/],
    ['checks[8].band', '-1%', /a settling band > 0/],
    ['checks[9]', 'overshoot < 10%', /a check like \{"probe": "rx", "metric": "overshoot", "max": "10%"\}/],
  ])('%s', (path, value, expected) => {
    const p = at(path);
    expect(p, `a problem at ${path}; got ${r.problems.map((x) => x.path).join(', ')}`).toBeDefined();
    expect(p!.value).toEqual(value);
    expect(p!.expected).toMatch(expected);
    expect(p!.line).toBeGreaterThan(0);
  });

  it('reports nothing else', () => {
    expect(r.problems).toHaveLength(12);
    expect(r.net).toBeUndefined();
  });

  it('metrics measured against vih/vil need thresholds', () => {
    const p = checkScenarioValue({ ...BASE, checks: [{ probe: 'rx', metric: 'noiseMarginLow', min: '0.3V' }] }).problems;
    expect(p).toHaveLength(1);
    expect(p[0]!.path).toBe('checks[0].metric');
    expect(p[0]!.expected).toMatch(/"thresholds" on the scenario or on probe "rx"/);
  });

  it('ringbackMargin needs thresholds too', () => {
    const p = checkScenarioValue({ ...BASE, checks: [{ probe: 'rx', metric: 'ringbackMargin', min: '0.3V' }] }).problems;
    expect(p.map((x) => x.path)).toEqual(['checks[0].metric']);
  });

  it('"levels" is "settled" (the default) or "histogram", with a suggestion for a typo', () => {
    expect(netLevelMethod(checkScenarioValue(BASE).net!)).toBe('settled');
    expect(netLevelMethod(checkScenarioValue({ ...BASE, levels: 'histogram' }).net!)).toBe('histogram');
    const p = checkScenarioValue({ ...BASE, levels: 'histgram' }).problems;
    expect(p.map((x) => [x.path, x.value])).toEqual([['levels', 'histgram']]);
    expect(p[0]!.expected).toMatch(/"settled" or "histogram" — did you mean "histogram"\?/);
  });

  it('default probes (no "probes" key) are named driver and receiver', () => {
    const { probes: _, ...noProbes } = BASE;
    expect(checkScenarioValue({ ...noProbes, checks: [{ probe: 'receiver', metric: 'max', max: '4V' }] }).problems).toEqual([]);
  });
});
