// Sweeps of branched nets: paths into branches, and --pick over the worst receiver.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runSweep } from '../../../src/sweep/index.js';
import { getAtPath, PathError, withValues } from '../../../src/sweep/paths.js';
import { parseSweepCsv } from '../../../src/sweep/table.js';
import { TempDirs, writeJson } from './fixtures.js';

const tmp = new TempDirs();
afterAll(() => tmp.cleanup());

/**
 * A star: a 50 Ω trunk splits into two 100 Ω arms of equal length with open ends, driven through
 * R_out = 10 Ω and a series resistor "rs". `armB` sets the second arm's length.
 */
function star(armB = '6cm') {
  return {
    title: 'Star of two open arms',
    driver: { signal: { kind: 'step', from: '0V', to: '1V', start: '0.5ns', rise: '200ps' }, resistance: '10ohm' },
    lines: { trunk: { z0: '50ohm', delay: '5ns/m' }, arm: { z0: '100ohm', delay: '5ns/m' } },
    route: [
      { name: 'rs', series: { r: '0ohm' } },
      { name: 'trunk', line: 'trunk', length: '10cm' },
      { name: 'hub', branch: { route: [{ name: 'armB', line: 'arm', length: armB }], receiver: { name: 'rxB' } } },
      { name: 'armA', line: 'arm', length: '6cm' },
    ],
    receiver: { name: 'rxA' },
    run: { duration: '15ns' },
  };
}

describe('sweep paths into branches', () => {
  const value = star();

  it('reach an item inside a branch and a branch receiver, and change only the copy', () => {
    expect(getAtPath(value, 'route.hub.branch.route.armB.length')).toBe('6cm');
    const changed = withValues(value, [{ path: 'route.hub.branch.route.armB.length', value: '2cm' }]) as ReturnType<typeof star>;
    expect(getAtPath(changed, 'route.hub.branch.route.armB.length')).toBe('2cm');
    expect(getAtPath(value, 'route.hub.branch.route.armB.length')).toBe('6cm');
    expect(getAtPath(value, 'route.hub.branch.receiver.name')).toBe('rxB');
  });

  it('name the valid items nearby, and where a name lives when it is elsewhere in the tree', () => {
    expect(() => getAtPath(value, 'route.armB.length')).toThrow(PathError);
    expect(() => getAtPath(value, 'route.armB.length')).toThrow(/no route item named "armB" \(route items: rs, trunk, hub, armA\) — "armB" is at route\.hub\.branch\.route\.armB/);
    expect(() => getAtPath(value, 'route.hub.branch.route.armC.length')).toThrow(/no route item named "armC" in route\[2\]\.branch\.route \(route items: armB\)/);
  });
});

describe('--pick over the worst receiver', () => {
  // Series (source) termination of a star (Johnson & Graham, High-Speed Digital Design, §4 on
  // termination; the junction by the lattice method, Pozar, Microwave Engineering, ch. 2): two 100 Ω
  // arms in parallel match the 50 Ω trunk going out, and the two open ends' reflections, arriving
  // together, see the trunk as 2 × 50 = 100 Ω per arm (even mode), so they pass into the trunk whole.
  // A source end of R_out + rs = 50 Ω absorbs them: the first arrival at each open end is
  // 2·50/(50 + R_total) of the swing, inside ±1 % only for |50 − R_total| ≤ ≈ 1 Ω. The best rs for the
  // worst receiver's settling into ±1 % is 40 Ω, on a 5 Ω grid exactly.
  it('finds the series resistor that matches the trunk for the worst of the two receivers', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'star.json', star());
    const out = join(dir, 'out');
    const o = await runSweep({ file, vary: ['route.rs.series.r=0ohm..100ohm:21'], pick: 'minimize worst.settling[1%] where worst.overshoot<5%' }, { out, jobs: 1 });
    expect(o.result!.pick!.best!.values['route.rs.series.r_ohm']).toBe(40);
  });

  // The worst column of a row is the larger overshoot of the two receivers (by definition), and the
  // pick takes the row where that is smallest. Unequal arms make the receivers differ.
  it('writes worst.* columns as the worse receiver of each row, and picks on them', async () => {
    const dir = tmp.make();
    const file = writeJson(dir, 'star.json', star('2cm'));
    const out = join(dir, 'out');
    const o = await runSweep({ file, vary: ['route.rs.series.r=0ohm..60ohm:7'], pick: 'minimize worst.overshoot_V' }, { out, jobs: 1 });
    const t = parseSweepCsv(readFileSync(join(out, 'sweep.csv'), 'utf8'));
    const col = (n: string) => t.rows.map((r) => r[t.header.indexOf(n)]!);
    const a = col('rxA.overshoot_V');
    const b = col('rxB.overshoot_V');
    const w = col('worst.overshoot_V');
    w.forEach((x, k) => expect(x).toBe(Math.max(a[k], b[k])));
    expect(a.some((x, k) => x !== b[k])).toBe(true);
    const best = w.indexOf(Math.min(...w));
    expect(o.result!.pick!.best!.point).toBe(best);
  });
});
