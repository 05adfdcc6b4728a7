import { describe, expect, it } from 'vitest';
import { bufferCurrent, bufferScratch, currentParts, groundClampDiode, powerClampDiode, type BufferModel } from '../../../sim/devices/buffer.js';
import { diodeVoltage, thermalVoltage } from '../../../sim/devices/diode.js';
import { ivAt, ivPoint } from '../../../sim/devices/iv-table.js';
import { deviceStepper, startDevice, stepDevice } from '../../../sim/devices/stepper.js';
import { driveStrengthModel, pushPullModel, receiverModel } from '../../../sim/devices/simple.js';
import { runDelayLine, type LineEnd } from '../../support/delay-line.js';

const oneRisingEdge = { initialHigh: false, times: Float64Array.of(0), rising: Uint8Array.of(1) };

function deviceEnd(model: BufferModel, dt: number, name: string, schedule = oneRisingEdge): LineEnd {
  const st = deviceStepper(model, dt, name, schedule);
  startDevice(st, model.kind === 'input' ? 0 : model.ground, 0);
  // the line's Norton is "current into the line = gV − j": the same sign as the stepper's outside network
  return (n, g, j) => stepDevice(st, n, g, j);
}

describe('device stepper', () => {
  it('a push–pull of two equal resistors is today\'s linear Thevenin driver (1e-9 V), through a line into an open end', () => {
    const r = 33;
    const ramp = 1e-9;
    const dt = 10e-12;
    const model = pushPullModel({ name: 'pp', supply: 3.3, rUp: r, rDown: r, rise: ramp, fall: ramp });
    const open: LineEnd = (_n, g, j) => j / g;
    const dev = runDelayLine(50, 100, 800, 0, deviceEnd(model, dt, 'pp'), open);
    // Thevenin source ramping 0 → 3.3 V over `ramp` behind r: V = (Vs·g_line·r + …) from KCL (Vs − V)/r = gV − j
    const src = (n: number) => 3.3 * Math.min(1, (n * dt) / ramp);
    const thevenin: LineEnd = (n, g, j) => (src(n) / r + j) / (1 / r + g);
    const lin = runDelayLine(50, 100, 800, 0, thevenin, open);
    let worst = 0;
    for (let n = 0; n <= 800; n++) worst = Math.max(worst, Math.abs(dev.va[n] - lin.va[n]), Math.abs(dev.vb[n] - lin.vb[n]));
    expect(worst).toBeLessThan(1e-9);
    expect(Math.max(...lin.vb)).toBeGreaterThan(3); // the open end did reach the high level
  });

  it('Bergeron: plateaus of a nonlinear driver and a clamped receiver on a lossless line follow the load-line intersections (0.5 % of swing)', () => {
    // Bergeron's graphical method (Hall & Heck, Advanced Signal Integrity for High-Speed Digital Designs,
    // Wiley 2009, ch. 2 on nonlinear terminations; chapter from memory): each end's voltage after a wave
    // arrives is where its I/V curve meets the line's load line I = (V − E)/Z0 with E = V_far + Z0·I_far
    // of the wave that left the far end TD before. The intersections are found here by bisection, with
    // the clamp's current from V = n·V_T·ln(1 + I/I_s) + I·R_s — independently of the stepper's Newton.
    const z0 = 50;
    const dt = 5e-12;
    const m = 200; // TD = 1 ns
    const clamp = { is: 1e-15, n: 1, rs: 2, vt: thermalVoltage(300) };
    const drv = driveStrengthModel({ name: 'drv', supply: 3.3, current: 24e-3, rise: 50e-12, fall: 50e-12 });
    const rx: BufferModel = receiverModel({ name: 'rx', supply: 3.3, c: 0, gndClamp: clamp, powerClamp: clamp });
    const steps = 7 * m;
    const run = runDelayLine(z0, m, steps, 0, deviceEnd(drv, dt, 'drv'), deviceEnd(rx, dt, 'rx'));

    const driverOut = (v: number) => -ivAt(drv.pullup!, 3.3 - v); // current the high driver pushes out of its pin
    const diodeI = (vd: number) => {
      if (vd <= 0) return 0;
      let lo = 0;
      let hi = vd / clamp.rs + 1;
      for (let k = 0; k < 200; k++) {
        const mid = (lo + hi) / 2;
        if (diodeVoltage(clamp, mid) < vd) lo = mid;
        else hi = mid;
      }
      return (lo + hi) / 2;
    };
    const rxIn = (v: number) => diodeI(v - 3.3) - diodeI(-v); // current into the receiver's pin
    const intersect = (f: (v: number) => number) => {
      let lo = -10;
      let hi = 10;
      for (let k = 0; k < 200; k++) {
        const mid = (lo + hi) / 2;
        if (f(mid) < 0) lo = mid;
        else hi = mid;
      }
      return (lo + hi) / 2;
    };
    // lattice of load lines: A at 0⁺, B at TD, A at 2TD, …
    let vA = 0, iA = 0, vB = 0, iB = 0;
    const plateaus: Array<{ end: 'A' | 'B'; from: number; v: number }> = [];
    for (let k = 0; k < 6; k++) {
      if (k % 2 === 0) {
        const e = vB + z0 * iB;
        vA = intersect((v) => (v - e) / z0 - driverOut(v)); // driver's output current flows into the line
        iA = (vA - e) / z0;
        plateaus.push({ end: 'A', from: k * m, v: vA });
      } else {
        const e = vA + z0 * iA;
        vB = intersect((v) => rxIn(v) + (v - e) / z0);
        iB = (vB - e) / z0;
        plateaus.push({ end: 'B', from: k * m, v: vB });
      }
    }
    expect(plateaus[1].v).toBeGreaterThan(3.3 + 0.5); // the open end overshoots into the power clamp
    for (const p of plateaus) {
      // mid-plateau: each end holds for 2·TD after a wave arrives
      const n = p.from + m;
      const sim = p.end === 'A' ? run.va[n] : run.vb[n];
      expect(Math.abs(sim - p.v) / 3.3, `${p.end} at step ${n}: simulated ${sim}, load lines ${p.v}`).toBeLessThan(0.005);
    }
  });

  it('records Newton iterations per step and keeps the clamp current within its Shockley law', () => {
    const clamp = { is: 1e-15, n: 1.1, rs: 3, vt: thermalVoltage(300) };
    const rx: BufferModel = { ...receiverModel({ name: 'rx', supply: 3.3, c: 2e-12, gndClamp: clamp, powerClamp: clamp }) };
    const st = deviceStepper(rx, 5e-12, 'rx');
    startDevice(st, 0, 0);
    // a 6 V step through 25 Ω drives the power clamp hard
    let peak = 0;
    for (let n = 1; n <= 400; n++) {
      stepDevice(st, n, 1 / 25, 6 / 25);
      peak = Math.max(peak, st.vPin);
    }
    const i = currentParts(rx, st.vDie, 0, 0).powerClamp;
    expect(i).toBeGreaterThan(0.05);
    expect(Math.abs(st.vDie - 3.3 - diodeVoltage(clamp, i))).toBeLessThan(1e-6);
    expect(st.steps).toBe(400);
    expect(st.maxIterations).toBeGreaterThanOrEqual(1);
    expect(st.iterations / st.steps).toBeLessThan(10);
    expect(bufferCurrent(rx, st.vDie, 0, 0, bufferScratch(), ivPoint()).i).toBeCloseTo(st.iDevice, 12);
    expect(peak).toBeLessThan(6);
  });
});
