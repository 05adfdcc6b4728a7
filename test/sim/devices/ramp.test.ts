import { describe, expect, it } from 'vitest';
import { runIntoFixture } from '../../../sim/devices/fixture.js';
import { expectedRampSwing, rampFixture, switchingFromRamp } from '../../../sim/devices/ramp.js';
import { pushPullModel } from '../../../sim/devices/simple.js';

const resistive = pushPullModel({ name: 'r40r30', supply: 3.3, rUp: 40, rDown: 30, rise: 1e-9, fall: 1e-9 });

describe('[Ramp] and its fixture', () => {
  it('a 40 Ω / 30 Ω push–pull at 3.3 V into 50 Ω has 20–80 % swings of 1.1000 V rising and 1.2375 V falling', () => {
    // rising into 50 Ω to ground: 3.3·50/90 = 1.8333 V, × 0.6 = 1.1000 V;
    // falling into 50 Ω to 3.3 V: from 3.3 V to 3.3·30/80 = 1.2375 V, swing 2.0625 V × 0.6 = 1.2375 V
    // (the ramp check of the IBIS Quality Specification's checklist; divider arithmetic by hand)
    expect(expectedRampSwing(resistive, true, 50)).toBeCloseTo(1.1, 10);
    expect(expectedRampSwing(resistive, false, 50)).toBeCloseTo(1.2375, 10);
  });

  it('coefficients from a ramp reproduce its 20–80 % time into the ramp fixture (1 %), with C_comp', () => {
    const m = { ...resistive, cComp: 3e-12 };
    const ramp = { rising: { dv: 1.1, dt: 0.6e-9 }, falling: { dv: 1.2375, dt: 0.8e-9 }, rLoad: 50 };
    const model = { ...m, switching: switchingFromRamp(m, ramp) };
    for (const rising of [true, false]) {
      const run = runIntoFixture(model, rising, rampFixture(m, rising, 50), 3e-9, 1e-12);
      const v0 = run.v[0];
      const v1 = run.v[run.v.length - 1];
      const cross = (frac: number) => {
        const level = v0 + frac * (v1 - v0);
        for (let k = 1; k < run.v.length; k++) {
          if ((run.v[k] - level) * (run.v[k - 1] - level) <= 0 && run.v[k] !== run.v[k - 1]) {
            return run.t[k - 1] + ((level - run.v[k - 1]) / (run.v[k] - run.v[k - 1])) * (run.t[k] - run.t[k - 1]);
          }
        }
        return NaN;
      };
      const dt = cross(0.8) - cross(0.2);
      const edge = rising ? ramp.rising : ramp.falling;
      expect(Math.abs(dt - edge.dt) / edge.dt).toBeLessThan(0.01);
      expect(Math.abs(Math.abs(v1 - v0) * 0.6 - edge.dv) / edge.dv).toBeLessThan(1e-6);
    }
  });
});
