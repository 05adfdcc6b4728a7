// The `line` report's sources for a multi-net scenario: every net's lines, coupled items as the
// conductors' self terms, and each coupled section as a section (its modes, Z_odd, Z_even, K_b, K_f).
import { describe, expect, it } from 'vitest';
import { coupledFromMicrostrip } from '../../../sim/coupled/geometry.js';
import { linesFromScenario } from '../../../src/lines-report/sources.js';

const MIL = 25.4e-6;

describe('lines of a scenario with several nets', () => {
  it('lists every net\'s lines, the coupled items as self terms, and the coupled section', async () => {
    const s = await linesFromScenario('scenarios/weather-buoy-clock-crosstalk.json');
    expect(s.lines.map((l) => l.name)).toEqual(['clk_fanout', 'clk_run', 'clk_tail', 'rst_fanout', 'rst_run', 'rst_tail']);
    // the fanout is a microstrip from the file's "lines", described as such (not as constant R′L′G′C′)
    expect(s.lines[0].description).toBeDefined();
    expect(s.lines[1].origin).toMatch(/coupled section 'sensor_bus'/);
    // The section is the scenario's geometry through Kirschning–Jansen (tested in test/sim/lines).
    const { line } = coupledFromMicrostrip({ width: 6 * MIL, spacing: 6 * MIL, height: 4 * MIL, er: 4.2 });
    expect(s.coupled).toHaveLength(1);
    // (bit for bit but for the rounding of "6mil" in the unit parser)
    s.coupled![0].line.l.forEach((x, e) => expect(x / line.l[e]).toBeCloseTo(1, 12));
    s.coupled![0].line.c.forEach((x, e) => expect(x / line.c[e]).toBeCloseTo(1, 12));
    // the self terms of a conductor are the matrices' diagonal
    expect(s.lines[1].rlgc.l).toBe(s.coupled![0].line.l[0]);
    expect(s.lines[1].rlgc.c).toBe(s.coupled![0].line.c[0]);
  });
});
