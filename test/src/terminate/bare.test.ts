import { describe, expect, it } from 'vitest';
import { loadScenarioValue } from '../../../src/sweep/plan.js';
import { bareNet } from '../../../src/terminate/bare.js';
import { netFacts } from '../../../src/terminate/net-facts.js';
import type { Obj } from '../../../src/terminate/raw.js';

describe('bareNet', () => {
  it('takes out a series resistor at the driver and a receiver resistor near Z0, and keeps input parts', async () => {
    const series = await loadScenarioValue('scenarios/motor-clock-series.json');
    const b = bareNet(series.value as Obj, series.net, netFacts(series.net));
    // its probe at the resistor's output goes with it
    expect(b.removed).toEqual(['series item rs: 39 Ω', 'probe after_rs (at rs)']);
    expect((b.value.probes as Obj[]).map((p) => p.name)).toEqual(['drv', 'gate_logic']);
    expect((b.value.route as Obj[]).map((i) => i.name)).toEqual(['breakout', 'via1', 'run']);
    const sensor = await loadScenarioValue('scenarios/greenhouse-sensor-cable.json');
    // a 1 kΩ input on a 75 Ω cable is the receiver's own (more than 3·Z0): it stays
    expect(bareNet(sensor.value as Obj, sensor.net, netFacts(sensor.net)).removed).toEqual([]);
    const link = await loadScenarioValue('scenarios/solar-tracker-prbs-link.json');
    const bl = bareNet(link.value as Obj, link.net, netFacts(link.net));
    expect(bl.removed).toHaveLength(1);
    expect(bl.removed[0]).toMatch(/^receiver receiver: 100 Ω to 1\.25 V$/);
    expect((bl.value.receiver as Obj).parts).toEqual([{ c: '6pF' }]);
  });
});
