// Which views a net gets: the map and frames need a line to draw distance along; the bounce view is
// drawn without a lattice where the idealisation would mislead (src/views/idealise.ts), and says so.
import { describe, expect, it } from 'vitest';
import { planViews } from '../../../src/views/select.js';
import { lineOf, net, part, stepSignal } from '../../support/nets.js';

describe('planViews', () => {
  it('skips the map and the frames of a route without a line, with the reason', () => {
    const n = net({ signal: stepSignal(1, 1e-9), rs: 50, route: [{ kind: 'series', name: 'r1', part: part({ r: 100 }) }], receiver: [part({ r: 100 })] });
    const plan = planViews(n, ['waveforms', 'map'], 3);
    expect(plan.views).toEqual(['waveforms']);
    expect(plan.skipped).toEqual([{ view: 'map', reason: expect.stringMatching(/no line segment/) }]);
    expect(plan.framesSkipped).toMatch(/no line segment/);
    expect(plan.routeMap).toBe(false);
  });

  it('marks the bounce view partial where no honest lattice exists (an AC termination with τ ≈ the round trip), not where one does', () => {
    // 100 Ω pair, TD 5 ns: round trip 10 ns; R + C = 100 Ω + 100 pF behind 100 Ω: τ = 200 Ω·100 pF = 20 ns
    const route = [{ kind: 'line' as const, name: 'pair', line: lineOf(100, 5e-9), length: 1 }];
    const ac = net({ signal: stepSignal(3.3, 0.5e-9, 1e-9), rs: 15, route, receiver: [part({ r: 100, c: 100e-12 })], duration: 80e-9 });
    const plan = planViews(ac, ['bounce'], 0);
    expect(plan.views).toEqual(['bounce']);
    expect(plan.partial).toEqual([{ view: 'bounce', reason: expect.stringMatching(/no lattice drawn .*the receiver \(C 100 pF; τ ≈ 20 ns/) }]);
    const matched = net({ signal: stepSignal(3.3, 0.5e-9, 1e-9), rs: 15, route, receiver: [part({ r: 100 })], duration: 80e-9 });
    expect(planViews(matched, ['bounce'], 0).partial).toEqual([]);
  });
});

describe('--path on a branched net', () => {
  it('is a usage error naming the receivers when no receiver has that name', async () => {
    const { planViews } = await import('../../../src/views/select.js');
    const { UsageError } = await import('../../../src/exit-codes.js');
    const { branch, line, lineOf, net, stepSignal } = await import('../../support/nets.js');
    const n = net({ signal: stepSignal(1, 1e-10), rs: 50, route: [line('a', lineOf(50, 5e-9), 0.1), branch('t', { route: [line('b', lineOf(50, 5e-9), 0.1)], receiver: 'rb' })] });
    expect(() => planViews(n, ['bounce'], 0, 'rx9')).toThrow(UsageError);
    expect(() => planViews(n, ['bounce'], 0, 'rx9')).toThrow(/--path 'rx9': no receiver of that name \(receivers: receiver, rb\)/);
    expect(planViews(n, ['bounce'], 0, 'rb').views).toEqual(['bounce']);
  });
});
