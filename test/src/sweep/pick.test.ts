// The --pick grammar: parsing, resolution against a sweep's columns, errors with positions, selection.
import { describe, expect, it } from 'vitest';
import { metricColumns } from '../../../src/sweep/columns.js';
import { parsePick, parsePickSyntax, pickBands, PickError, selectBest, tokenize, type PickContext } from '../../../src/sweep/pick.js';

const columns = metricColumns([{ value: 1, unit: '%', text: '1%' }]);
const ctx: PickContext = {
  probes: ['tx', 'rx', 'rx 2'],
  defaultProbe: 'rx',
  columns,
  params: [{ path: 'route.rs.series.r', column: 'route.rs.series.r_ohm', unit: 'ohm' }],
};

describe('--pick grammar', () => {
  it('reads the example of the docs', () => {
    const p = parsePick('minimize settling where overshoot<10% and ringback<0.2V', ctx);
    expect(p.direction).toBe('minimize');
    expect(p.objective.column).toBe('rx.settling_s');
    expect(p.conditions.map((c) => [c.ref.column, c.op, c.value])).toEqual([
      ['rx.overshoot_pct', '<', 10],
      ['rx.ringback_V', '<', 0.2],
    ]);
  });

  it('a condition unit chooses the variant; probes, bands, column keys and varied paths are refs', () => {
    const p = parsePick('MAXIMIZE tx.ringback WHERE overshoot <= 0.3V AND settling[1%] < 5ns and "rx 2".rise>=100ps and route.rs.series.r >= 20ohm', ctx);
    expect(p.direction).toBe('maximize');
    expect(p.objective.column).toBe('tx.ringback_V');
    expect(p.conditions.map((c) => [c.ref.column, c.op, c.value])).toEqual([
      ['rx.overshoot_V', '<=', 0.3],
      ['rx.settling_1pct_s', '<', 5e-9],
      ['rx 2.rise_s', '>=', 1e-10],
      ['route.rs.series.r_ohm', '>=', 20],
    ]);
    expect(parsePick('minimize overshoot_V', ctx).objective.column).toBe('rx.overshoot_V');
    expect(parsePick('min route.rs.series.r where overshoot ≤ 2%', ctx).objective.kind).toBe('param');
  });

  it('reports the settling bands it needs measured', () => {
    expect(pickBands(parsePickSyntax('minimize settling[2%] where rx.settling[20mV] < 3ns'))).toEqual([
      { value: 2, unit: '%', text: '2%' },
      { value: 0.02, unit: 'V', text: '20mV' },
    ]);
  });

  it('tokenizes operators without spaces', () => {
    expect(tokenize('a<=1V').map((t) => t.text)).toEqual(['a', '<=', '1V', '']);
  });

  // Each error names the problem and its position (0-based here; the message says column N, 1-based).
  it.each([
    ['', 0, /empty --pick/],
    ['reduce settling', 0, /expected "minimize" or "maximize"/],
    ['minimize', 8, /expected what to minimize/],
    ['minimize settling when overshoot<10%', 18, /expected "where" or the end/],
    ['minimize settling where', 23, /expected a condition/],
    ['minimize settling where overshoot 10%', 34, /expected <, <=, > or >=/],
    ['minimize settling where overshoot<', 34, /expected a value/],
    ['minimize settling where overshoot<10% ringback<1V', 38, /expected "and" or the end/],
    ['minimize settling where overshoot=10%', 33, /"=" is not an operator/],
    ['minimize setling', 9, /neither a metric .* — did you mean "settling"\?/],
    ['minimize rx3.settling', 9, /no probe named "rx3"/],
    ['minimize settling where overshoot<5ns', 34, /overshoot is compared in V or %, not s/],
    ['minimize settling where overshoot<ten', 34, /"ten" is not a value/],
    ['minimize preshoot', 9, /"preshoot" is not measured in sweeps/],
    ['minimize rise[1%]', 13, /a band in brackets goes with "settling"/],
    ['minimize settling where "rx<1V', 24, /quote is not closed/],
  ])('%j → error at %i', (text, pos, msg) => {
    try {
      parsePick(text, ctx);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(PickError);
      const pe = e as PickError;
      expect(pe.reason).toMatch(msg);
      expect(pe.position).toBe(pos);
      // The message repeats the text with a caret under the position.
      const lines = pe.message.split('\n');
      expect(lines[1]).toBe(`  ${text}`);
      expect(lines[2]!.indexOf('^')).toBe(pos + 2);
    }
  });
});

describe('selection', () => {
  const header = ['point', 'route.rs.series.r_ohm', 'rx.settling_s', 'rx.overshoot_pct'];
  const rows = [
    [0, 0, 5e-9, 40],
    [1, 10, 2e-9, 12],
    [2, 20, 1e-9, 6],
    [3, 30, 1e-9, 2], // ties with point 2 on settling; point 2 fails overshoot<5%
    [4, 40, null, 0], // settling not measurable: never chosen
    [5, 50, 3e-9, 0],
  ];
  it('smallest objective among the rows meeting every condition; ties to the lower point', () => {
    const p = parsePick('minimize settling where overshoot<5%', ctx);
    const o = selectBest(p, header, rows);
    expect(o.row).toBe(3);
    expect(o.objective).toBe(1e-9);
    expect(o.holds).toEqual([3]);
    expect(o.feasible).toBe(2);
    expect(selectBest(parsePick('minimize settling', ctx), header, rows).row).toBe(2);
    expect(selectBest(parsePick('maximize route.rs.series.r where overshoot<5%', ctx), header, rows).row).toBe(5);
  });
  it('none when no row meets the conditions', () => {
    const o = selectBest(parsePick('minimize settling where overshoot<0%', ctx), header, rows);
    expect(o.row).toBeNull();
    expect(o.feasible).toBe(0);
  });
});
