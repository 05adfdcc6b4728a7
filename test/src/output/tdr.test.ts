import { describe, expect, it } from 'vitest';
import { defaultTdrRise, DEFAULT_TDR_RISE } from '../../../src/output/tdr.js';
import { lineOf, net, stepSignal } from '../../support/nets.js';

describe('default TDR step', () => {
  // Distance resolution of a TDR is about v·t_r/4 (common practice): the default edge keeps it
  // a small fraction of the route while the run stays small.
  it('is 35 ps on board-sized routes and the one-way delay / 400 on long ones', () => {
    const board = net({ signal: stepSignal(1, 1e-9), rs: 50, route: [{ kind: 'line', name: 't', line: lineOf(50, 6e-9), length: 0.3 }] });
    expect(defaultTdrRise(board)).toBe(DEFAULT_TDR_RISE);
    const cable = net({ signal: stepSignal(1, 1e-9), rs: 50, route: [{ kind: 'line', name: 'c', line: lineOf(50, 5e-9), length: 60 }] });
    expect(defaultTdrRise(cable)).toBeCloseTo((60 * 5e-9) / 400, 20);
  });
});
