import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { ibisBuffer } from '../../../src/ibis/buffer.js';
import { parseIbis } from '../../../src/ibis/parse.js';
import { bufferCurrent, bufferScratch, currentParts } from '../../../sim/devices/buffer.js';
import { runIntoFixture, waveformAt } from '../../../sim/devices/fixture.js';
import { ivPoint } from '../../../sim/devices/iv-table.js';

// Invented model files written for these tests.
const file = (body: string, cComp = '2pF 1.5pF 3pF') => `[IBIS Ver] 5.1
[Component] TINY-2
[Pin] signal_name model_name R_pin L_pin C_pin
1 OUT drv
[Model] drv
Model_type I/O
C_comp ${cComp}
[Voltage Range] 3.3 3.0 3.6
${body}
[End]
`;
// R_pullup = 40 Ω, R_pulldown = 30 Ω as tables over −3.3 … 6.6 V, in the standard's frames.
const resistive = `[Pulldown]
-3.3 -110m NA NA
6.6 220m NA NA
[Pullup]
-3.3 82.5m NA NA
6.6 -165m NA NA
`;
const ramp = (dvr: string, dvf: string) => `[Ramp]\ndV/dt_r ${dvr}/0.5n NA NA\ndV/dt_f ${dvf}/0.5n NA NA\nR_load = 50\n`;

describe('IBIS model to buffer', () => {
  it('ramp consistency: 1.1000 V and 1.2375 V agree with 40 Ω / 30 Ω tables; 1.0 V (9 % low) gets the checklist warning', () => {
    // The IBIS Quality Specification's ramp check (5 %); numbers worked by hand in test/sim/devices/ramp.test.ts.
    const ok = ibisBuffer(parseIbis(file(resistive + ramp('1.1', '1.2375')), 'ok.ibs'), { model: 'drv' });
    expect(ok.warnings).toEqual([]);
    const off = ibisBuffer(parseIbis(file(resistive + ramp('1.0', '1.2375')), 'off.ibs'), { model: 'drv' });
    expect(off.warnings).toHaveLength(1);
    expect(off.warnings[0]).toMatch(/^off\.ibs:16 \[Ramp\]: dV\/dt_r \(typ\): dV = 1\.0000 V, but the I\/V tables give 1\.1000 V .* 5 %/);
    // 4 % off is inside the allowance
    expect(ibisBuffer(parseIbis(file(resistive + ramp('1.056', '1.2375')), 'near.ibs'), { model: 'drv' }).warnings).toEqual([]);
  });

  it('pull-up rows are supply-relative and currents positive into the pin: the model idles at 3.3 V with the pull-up at 0 A', () => {
    const b = ibisBuffer(parseIbis(file(resistive + ramp('1.1', '1.2375')), 't.ibs'), { model: 'drv' });
    // pin at 0 V = table voltage 3.3 V of the pull-up: 3.3/40 = 82.5 mA out of the pin
    expect(currentParts(b.model, 0, 1, 0).pullup).toBeCloseTo(-0.0825, 12);
    expect(currentParts(b.model, 3.3, 1, 0).pullup).toBeCloseTo(0, 12);
    expect(currentParts(b.model, 3.3, 0, 1).pulldown).toBeCloseTo(0.11, 12);
  });

  it('clamp currents are counted once: with a [GND Clamp] the low driver at −1 V conducts pull-down plus clamp, not more', () => {
    const clamp = '[GND Clamp]\n-3.3 -2.5 NA NA\n-1 -20m NA NA\n-0.5 0 NA NA\n3.3 0 NA NA\n';
    const b = ibisBuffer(parseIbis(file(resistive + clamp + ramp('1.1', '1.2375')), 'c.ibs'), { model: 'drv' });
    const total = bufferCurrent(b.model, -1, 0, 1, bufferScratch(), ivPoint()).i;
    expect(total).toBeCloseTo(-1 / 30 - 0.02, 12);
    expect(bufferCurrent(b.model, -1, 0, 0, bufferScratch(), ivPoint()).i).toBeCloseTo(-0.02, 12);
  });

  it('C_comp min/max are the smallest/largest values: the slow corner takes the largest, the fast one the smallest', () => {
    const data = parseIbis(file(resistive + ramp('1.1', '1.2375')), 'c.ibs');
    expect(ibisBuffer(data, { model: 'drv' }, 'min').model.cComp).toBeCloseTo(3e-12, 24);
    expect(ibisBuffer(data, { model: 'drv' }, 'max').model.cComp).toBeCloseTo(1.5e-12, 24);
    expect(ibisBuffer(data, { model: 'drv' }, 'min').model.supply).toBe(3.0);
    // a file with the columns in corner order instead is warned about and still uses smallest/largest
    const swapped = ibisBuffer(parseIbis(file(resistive + ramp('1.1', '1.2375'), '2pF 3pF 1.5pF'), 's.ibs'), { model: 'drv' }, 'min');
    expect(swapped.model.cComp).toBeCloseTo(3e-12, 24);
    expect(swapped.warnings.join('\n')).toMatch(/min column should hold the smallest value/);
  });

  it('a fixture written with the mega suffix is 50 Ω: R_fixture = 0.00005M', () => {
    const waves = (rf: string) =>
      ['Rising', 'Falling'].map((k) => `[${k} Waveform]\nR_fixture = ${rf}\nV_fixture = 0\n0 ${k === 'Rising' ? 0 : 1.8857} NA NA\n1n ${k === 'Rising' ? 1.8857 : 0} NA NA\n`).join('');
    const f = parseIbis(file(resistive + waves('0.00005M')), 'mega.ibs');
    expect(f.models.get('drv')!.rising[0].rFixture).toBeCloseTo(50, 9);
  });

  it('the invented LUMEN-M4 I/O reproduces its own file waveforms into their fixtures within 1 % of swing, at every corner', () => {
    const data = parseIbis(readFileSync('test/fixtures/ibis/lumen_m4.ibs', 'utf8'), 'lumen_m4.ibs');
    for (const corner of ['typ', 'min', 'max'] as const) {
      const b = ibisBuffer(data, { component: 'LUMEN-M4', pin: '3' }, corner);
      expect(b.warnings).toEqual([]);
      for (const [rising, waves] of [[true, b.data.rising], [false, b.data.falling]] as const) {
        for (const w of waves) {
          const col = (r: (typeof w.rows)[number]) => (corner === 'typ' ? r.typ : r[corner] ?? r.typ);
          const vFix = corner === 'typ' ? w.vFixture : (corner === 'min' ? w.vFixtureMin : w.vFixtureMax) ?? w.vFixture;
          const run = runIntoFixture(b.model, rising, { r: w.rFixture, v: vFix, c: w.cFixture ?? 0 }, 6e-9, 2e-12);
          const swing = Math.abs(col(w.rows[w.rows.length - 1]) - col(w.rows[0]));
          const worst = Math.max(...w.rows.map((r) => Math.abs(waveformAt(run, r.x) - col(r))));
          expect(worst / swing, `${corner} ${rising ? 'rising' : 'falling'} into ${vFix} V`).toBeLessThan(0.01);
        }
      }
    }
  });
});
