import { describe, expect, it } from 'vitest';
import { RunDiverged } from '../../sim/errors.js';
import { simulate } from '../../sim/simulate.js';
import { lineOf, net, part, stepSignal } from '../support/nets.js';

describe('runaway guard', () => {
  // A negative resistance is an active element outside the model (the validator refuses it; a net
  // built in code can still hold one). −100 Ω ∥ 400 Ω = −133 Ω at the end of a 50 Ω line reflects with
  // Γ = (−133 − 50)/(−133 + 50) = 2.2, and a 1 MΩ source end with Γ ≈ +1, so each round trip multiplies
  // the wave by 2.2 (lattice method, Johnson & Graham, High-Speed Digital Design, ch. 4): it grows
  // without bound, and the run must stop with the time and the place.
  it('stops a run whose values grow without bound, naming the time and the place', () => {
    const n = net({
      signal: stepSignal(1, 0.1e-9),
      rs: 1e6,
      route: [{ kind: 'line', name: 't', line: lineOf(50, 5e-9), length: 0.1 }],
      receiver: [part({ r: -100 }), part({ r: 400 })],
      duration: 400e-9,
    });
    let err: unknown;
    try {
      simulate(n);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RunDiverged);
    const d = err as RunDiverged;
    expect(d.time).toBeGreaterThan(0);
    expect(d.time).toBeLessThan(400e-9);
    expect(d.message).toMatch(/stopped at t = .* s/);
    expect(d.likelyCause).toMatch(/runaway growth|infinite/);
  });
});
