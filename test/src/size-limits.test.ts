// --force lifts the advisory limits, never what the machine can hold; and no non-finite voltage
// reaches a file.
import ndarray from 'ndarray';
import { describe, expect, it } from 'vitest';
import { NetError, RunRefused } from '../../sim/errors.js';
import type { SimResult } from '../../sim/result.js';
import { scenarioFromValue } from '../../src/scenario/load.js';
import { finiteOrThrow, machineLimits, simulateSized, SizeRefused } from '../../src/size-limits.js';
import { HUGE, SMALL } from './cli/fixtures.js';

describe('machineLimits', () => {
  it('keeps probe records within 40 % of the memory and one typed array, and steps exactly countable', () => {
    const l = machineLimits(16 * 1024 ** 3);
    expect(l.maxRecordBytes).toBeCloseTo(0.4 * 16 * 1024 ** 3, 0);
    expect(machineLimits(1e15).maxRecordBytes).toBe((2 ** 32 - 1) * 8);
    expect(l.maxCellSteps).toBe(2 ** 53);
  });
});

describe('simulateSized', () => {
  it('refuses an oversized run (RunRefused, exit 3) and runs it with force when the machine can hold it', () => {
    const net = scenarioFromValue(SMALL);
    expect(() => simulateSized(net, { limits: { maxCellSteps: 1000 } })).toThrow(RunRefused);
    expect(simulateSized(net, { limits: { maxCellSteps: 1000 }, force: true }).record.names).toEqual(['tx', 'mid', 'rx']);
  });

  it('refuses even with force a run the machine cannot hold, naming the size and not suggesting --force', () => {
    // 10 ps edges over 100 m for 1 ms: ~1e13 cell-steps and terabytes of records.
    const e = (() => {
      try {
        simulateSized(scenarioFromValue(HUGE), { force: true, machineMemory: 1024 ** 3 });
      } catch (x) {
        return x;
      }
    })();
    expect(e).toBeInstanceOf(SizeRefused);
    expect((e as SizeRefused).hard).toBe(true);
    expect((e as Error).message).toMatch(/^run refused even with --force: it is more than this machine can hold:/);
    expect((e as Error).message).toMatch(/MiB/);
    expect((e as Error).message).not.toMatch(/force overrides/);
  });
});

describe('finiteOrThrow', () => {
  const result = (values: number[]): SimResult =>
    ({ discretization: {} as SimResult['discretization'], record: { names: ['a', 'b'], dtSample: 1e-9, values: ndarray(Float64Array.from(values), [2, 3]) } }) as SimResult;

  it('passes a finite record through', () => {
    const r = result([0, 1, 2, 3, 4, 5]);
    expect(finiteOrThrow(r)).toBe(r);
  });

  it('names the probe and the first instant of a NaN or an infinity', () => {
    expect(() => finiteOrThrow(result([0, 1, 2, 3, NaN, Infinity]))).toThrow(NetError);
    expect(() => finiteOrThrow(result([0, 1, 2, 3, NaN, Infinity]))).toThrow(/probe "b" stops being a finite number at t = 1 ns/);
  });
});
