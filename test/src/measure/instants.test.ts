// Where measurements were taken, on a waveform worked by hand (dt = 1 ns, sample i at i ns):
// 0 V until 100 ns, a linear ramp to 1 V at 200 ns, a triangular overshoot peaking at 1.2 V at 230 ns and
// back to 1 V at 260 ns, then 1 V. With state levels 0 V and 1 V (IEEE Std 181-2011 §5.2, histogram
// modes), the reference level instants of a linear ramp are t10 = 110 ns, t50 = 150 ns, t90 = 190 ns
// (§5.3.3); the overshoot peaks at 230 ns; the ±5 % band (1.05 V) is left at 207.5 ns and re-entered for
// good at 230 + 30·(0.15/0.2) = 252.5 ns, the settling instant (§5.8).
import { describe, expect, it } from 'vitest';
import { evaluateChecks } from '../../../src/measure/checks.js';
import { checkAt, edgeMetricAt, probeMetricAt } from '../../../src/measure/instants.js';
import { measureProbe } from '../../../src/measure/summary.js';

const NS = 1e-9;
function wave(i: number): number {
  if (i <= 100) return 0;
  if (i <= 200) return (i - 100) / 100;
  if (i <= 230) return 1 + (0.2 * (i - 200)) / 30;
  if (i <= 260) return 1.2 - (0.2 * (i - 230)) / 30;
  return 1;
}
const values = Float64Array.from({ length: 1001 }, (_, i) => wave(i));
const m = measureProbe(values, NS);
const e = m.edges[0]!;
const close = (x: number | undefined, y: number) => expect(Math.abs(x! - y)).toBeLessThan(1e-6 * NS);

describe('measured instants', () => {
  it('finds the hand-worked edge', () => {
    expect(m.edges.length).toBe(1);
    expect(m.levels!.low).toBe(0);
    expect(m.levels!.high).toBe(1);
  });

  it('gives spans for durations and instants for levels', () => {
    const rise = edgeMetricAt('rise', e)!;
    close(rise.a, 110 * NS);
    close(rise.b, 190 * NS);
    expect(edgeMetricAt('overshoot', e)).toEqual({ a: 230 * NS });
    const settle = edgeMetricAt('settling', e)!;
    close(settle.a, 150 * NS);
    close(settle.b, 252.5 * NS);
    close(settle.b! - settle.a, e.settling[0]!.time!);
  });

  it('gives a probe extreme its sample instant', () => {
    expect(probeMetricAt('max', m)).toEqual({ a: 230 * NS });
    expect(probeMetricAt('min', m)).toEqual({ a: 0 });
    expect(probeMetricAt('final', m)).toEqual({ a: 1000 * NS });
  });

  it('puts a check on its deciding value, not on the edge’s 50 % instant', () => {
    const probes = { rx: m };
    const [over, settling, rise] = evaluateChecks(
      [
        { probe: 'rx', metric: 'overshoot', max: { value: 10, unit: '%', text: '10%' } },
        { probe: 'rx', metric: 'settling', max: { value: 200e-9, unit: 's', text: '200ns' } },
        { probe: 'rx', metric: 'rise', max: { value: 1e-6, unit: 's', text: '1us' } },
      ],
      probes,
    );
    expect(over!.pass).toBe(false); // 20 % overshoot
    expect(checkAt(over!, probes)).toEqual({ a: 230 * NS });
    close(checkAt(settling!, probes)!.b, 252.5 * NS);
    close(checkAt(rise!, probes)!.a, 110 * NS);
  });
});
