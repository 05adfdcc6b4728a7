import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseIbis } from '../../../src/ibis/parse.js';
import { IbisError } from '../../../src/ibis/types.js';

// Small invented model files, written by hand for these tests.
const minimal = (body: string) => `[IBIS Ver] 5.1
[Component] TINY-1
[Pin] signal_name model_name R_pin L_pin C_pin
1 OUT drv 0.2 2nH 0.5pF
[Model] drv
Model_type Output
C_comp 2pF 1.5pF 3pF
[Voltage Range] 3.3 3.0 3.6
${body}
[End]
`;

const resistiveTables = `[Pulldown]
-3.3 -0.11 NA NA
3.3 0.11 NA NA
[Pullup]
-3.3 0.0825 NA NA
3.3 -0.0825 NA NA
`;

describe('IBIS reader', () => {
  it('reads components, pins with their package R/L/C, models, tables and ramps; keywords case-insensitively', () => {
    const f = parseIbis(minimal(resistiveTables.replace('[Pulldown]', '[pulldown]').replace('[Pullup]', '[PULL_UP]'.replace('_', '')) + '[Ramp]\ndV/dt_r 1.1/0.5n NA NA\ndV/dt_f 1.2375/0.5n NA NA\nR_load = 50\n'), 'tiny.ibs');
    const pin = f.components.get('TINY-1')!.pins.get('1')!;
    expect(pin).toMatchObject({ model: 'drv', r: 0.2, l: 2e-9 });
    expect(pin.c).toBeCloseTo(0.5e-12, 24);
    const m = f.models.get('drv')!;
    expect(m.modelType).toBe('Output');
    expect(m.voltageRange).toEqual({ typ: 3.3, min: 3.0, max: 3.6 });
    expect(m.pulldown!.rows).toHaveLength(2);
    expect(m.ramp!.rising!.typ).toEqual([1.1, 0.5e-9]);
    expect(m.ramp!.rLoad).toBe(50);
  });

  it('honours [Comment Char] and treats the spaces and underscores of keywords alike', () => {
    const text = minimal(resistiveTables.replace('[Pulldown]', '[Pulldown]  # a comment now').replace('[Pullup]', '# whole-line comment\n[Pullup]') + '[Ramp]\ndV/dt_r 1.1/0.5n NA NA # note\ndV/dt_f 1.2375/0.5n NA NA\n').replace('[IBIS Ver] 5.1', '[IBIS Ver] 5.1\n[Comment Char] #_char');
    const f = parseIbis(text.replace('[Voltage Range]', '[Voltage_Range]'), 'cc.ibs');
    expect(f.models.get('drv')!.pulldown!.rows).toHaveLength(2);
    expect(f.models.get('drv')!.voltageRange!.typ).toBe(3.3);
  });

  it('lists what it does not use instead of dropping it, and warns when a reference keyword moves a rail', () => {
    const f = parseIbis(minimal(resistiveTables + '[Ramp]\ndV/dt_r 1.1/0.5n NA NA\ndV/dt_f 1.2375/0.5n NA NA\n[Temperature Range] 50 100 0\n[Pullup Reference] 2.5 2.3 2.7\n').replace('C_comp', 'Vinl = 0.8\nC_comp'), 'ign.ibs');
    const what = f.ignored.map((x) => x.what);
    expect(what).toEqual(expect.arrayContaining(['[Temperature Range]', '[Pullup Reference]', 'Vinl in [Model] "drv"']));
    expect(f.warnings.map((w) => w.message).join('\n')).toMatch(/reference rail/);
  });

  it('reports every problem at once with file name, line number and keyword', () => {
    const bad = minimal('[Pulldown]\n-3.3 -0.11 NA NA\n0.5 2..5m NA NA\n3.3 0.11\n[Pullup]\n0 NA NA NA\n1 -1m NA NA\n[Ramp]\ndV/dt_r 1.1 NA NA\n');
    try {
      parseIbis(bad, 'bad.ibs');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(IbisError);
      const msg = (e as Error).message.split('\n');
      expect(msg).toEqual(
        expect.arrayContaining([
          'bad.ibs:11 [Pulldown]: value typ: "2..5m" — expected a number with an optional suffix (T G M k m u n p f), like 2.5p',
          'bad.ibs:12 [Pulldown]: row "3.3 0.11" — expected 4 columns: voltage, typ, min, max',
          'bad.ibs:14 [Pullup]: value typ: NA — expected a number (NA is allowed only in the min and max columns)',
          'bad.ibs:17 [Ramp]: dV/dt_r typ: "1.1" — expected dV/dt as a fraction like 1.1/0.6n',
        ]),
      );
      expect(msg.some((l) => /^bad\.ibs:5 \[Model\]: model "drv": a driver needs a \[Ramp\] dV\/dt_f or a \[Falling Waveform\]/.test(l))).toBe(true);
    }
  });

  it('refuses a pin that names a model the file lacks, and a Model_type outside the subset', () => {
    const text = minimal(resistiveTables).replace('1 OUT drv', '1 OUT drvx').replace('Model_type Output', 'Model_type Series');
    expect(() => parseIbis(text, 'm.ibs')).toThrowError(/m\.ibs:4 \[Pin\]: pin "1" uses model "drvx", which the file does not define/);
    expect(() => parseIbis(text, 'm.ibs')).toThrowError(/Model_type "Series" — expected one of the supported types/);
  });

  it('reads the invented LUMEN-M4 test file: three models, waveforms with their fixtures', () => {
    const f = parseIbis(readFileSync('test/fixtures/ibis/lumen_m4.ibs', 'utf8'), 'lumen_m4.ibs');
    expect([...f.models.keys()]).toEqual(['gpio_8ma', 'clk_ramp', 'in_schmitt']);
    const g = f.models.get('gpio_8ma')!;
    expect(g.rising).toHaveLength(2);
    expect(g.falling[1]).toMatchObject({ rFixture: 50, vFixture: 3.3, vFixtureMin: 3.0, vFixtureMax: 3.6 });
    expect(g.cComp).toEqual({ typ: 3e-12, min: 2.4e-12, max: 3.6e-12 });
    expect(f.ignored.map((x) => x.what)).toContain('[Diff Pin]');
  });
});
