import { describe, expect, it } from 'vitest';
import { pairMetrics } from '../../../sim/coupled/modes.js';
import { checkScenario } from '../../../src/scenario/load.js';
import { formatProblem } from '../../../src/scenario/problems.js';

// Two nets sharing one coupled section (an invented pair: a pump-controller clock beside its fault line).
function scenario(coupled: string, extra = '', vicItem = '{ "name": "b", "coupled": "pair", "length": "5cm" }'): string {
  return `{
  "title": "pump controller pair",
  "nets": {
    "clk": { "driver": { "signal": { "kind": "step", "from": "0V", "to": "1V", "rise": "100ps" }, "resistance": "50ohm" },
             "route": [ { "name": "a", "coupled": "pair", "length": "5cm" } ], "receiver": { "parts": { "r": "50ohm" } } },
    "fault": { "driver": { "level": "1.8V", "resistance": "50ohm" },
               "route": [ ${vicItem} ], "receiver": { "name": "faultRx", "parts": { "r": "50ohm" } } }
  },
  "coupled": { "pair": ${coupled} }${extra}
}`;
}

const MATRICES = `{ "conductors": ["a", "b"], "l": [["300nH/m", "45nH/m"], ["45nH/m", "300nH/m"]], "c": [["120pF/m", "-12pF/m"], ["-12pF/m", "120pF/m"]] }`;

function messages(src: string): string[] {
  const r = checkScenario(src, 'pair.json');
  expect(r.net).toBeUndefined();
  return r.problems.map(formatProblem);
}

describe('multi-net scenarios with coupled sections', () => {
  it('reads nets, a quiet driver, a coupled section and the default probes', () => {
    const { net, problems } = checkScenario(scenario(MATRICES), 'pair.json');
    expect(problems).toEqual([]);
    expect(net!.netName).toBe('clk');
    expect(net!.receiverName).toBe('clk');
    expect(net!.nets!.map((n) => [n.name, n.receiverName])).toEqual([['fault', 'faultRx']]);
    expect(net!.nets![0].driver.signal).toMatchObject({ kind: 'step', from: 1.8, to: 1.8 });
    expect(net!.coupled![0].conductors).toEqual(['a', 'b']);
    expect(Array.from(net!.coupled![0].line.c)).toEqual([120e-12, -12e-12, -12e-12, 120e-12]);
    // each coupled item carries its conductor's self terms
    expect(net!.route[0]).toMatchObject({ kind: 'line', name: 'a', length: 0.05, line: { l: 300e-9, c: 120e-12 } });
    expect(net!.probes.map((p) => p.name)).toEqual(['clk.driver', 'fault.driver', 'clk', 'faultRx']);
    expect(net!.probes[1]).toEqual({ name: 'fault.driver', at: 'driver', net: 'fault' });
  });

  // Odd/even input of a symmetric pair: Z = √((L11 ∓ L12)/(C11 ∓ C12)) per mode (Pozar, Microwave
  // Engineering, coupled lines), so the modes given must come back from the matrices built from them.
  it('reads odd and even modes and gives back the same Z_odd, Z_even and delays', () => {
    const { net, problems } = checkScenario(scenario(`{ "conductors": ["a", "b"], "modes": { "zOdd": "45ohm", "zEven": "56ohm", "delayOdd": "150ps/in", "delayEven": "160ps/in" } }`), 'pair.json');
    expect(problems).toEqual([]);
    const p = pairMetrics(net!.coupled![0].line);
    expect(p.zOdd).toBeCloseTo(45, 9);
    expect(p.zEven).toBeCloseTo(56, 9);
    expect(1 / p.velocityOdd!).toBeCloseTo(150e-12 / 0.0254, 18);
  });

  it('reads an edge-coupled microstrip geometry', () => {
    const { net, problems } = checkScenario(scenario(`{ "conductors": ["a", "b"], "microstrip": { "width": "6mil", "spacing": "6mil", "height": "4mil", "er": 4.2 } }`), 'pair.json');
    expect(problems).toEqual([]);
    const p = pairMetrics(net!.coupled![0].line);
    expect(p.zOdd).toBeLessThan(p.zEven);
  });

  it('refuses a conductor that is not a coupled item, a section not named, a wrong convention and two descriptions, with key paths', () => {
    const wrongC = MATRICES.replace(/-12pF\/m/g, '12pF/m');
    expect(messages(scenario(wrongC)).join('\n')).toMatch(/coupled\.pair\.c\[0\]\[1\].*mutual|coupled\.pair\.c.*convention/i);
    expect(messages(scenario(MATRICES, '', '{ "name": "b", "line": { "z0": "50ohm", "delay": "6ns/m" }, "length": "5cm" }')).join('\n')).toMatch(
      /coupled\.pair\.conductors\[1\]: "b" — expected a line item written as \{"name": "b", "coupled": "pair"/,
    );
    expect(messages(scenario(MATRICES, '', '{ "name": "b", "coupled": "pear", "length": "5cm" }')).join('\n')).toMatch(/nets\.fault\.route\[0\]\.coupled: "pear" — expected the name of a section in "coupled" \("pair"\) — did you mean "pair"\?/);
    expect(messages(scenario(MATRICES.replace('"conductors"', '"modes": {}, "conductors"'))).join('\n')).toMatch(/coupled\.pair: .*one description of the section, not "l"\/"c" and "modes"/);
  });

  it('refuses a driver with both signal and level, and "net" on a probe that is not at a driver', () => {
    const src = scenario(MATRICES, `, "probes": [ { "at": "driver", "net": "nope" }, { "at": "faultRx", "net": "fault" } ]`).replace('"level": "1.8V"', '"level": "1.8V", "signal": { "kind": "step", "from": "0V", "to": "1V", "rise": "1ns" }');
    const text = messages(src).join('\n');
    expect(text).toMatch(/nets\.fault\.driver\.level: .*either "signal" or "level"/);
    expect(text).toMatch(/probes\[0\]\.net: "nope" — expected the name of a net \("clk", "fault"\)/);
    expect(text).toMatch(/probes\[1\]\.net: .*no "net" on a probe at receiver "faultRx"/);
  });

  it('refuses top-level driver and route beside "nets"', () => {
    const src = scenario(MATRICES, `, "driver": { "level": "0V", "resistance": "1ohm" }`);
    expect(messages(src).join('\n')).toMatch(/^pair\.json:\d+:\d+ driver: .*a known key/m);
  });
});
