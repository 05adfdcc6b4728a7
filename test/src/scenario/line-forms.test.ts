// The geometry and datasheet LINE forms through the scenario loader: units (mil, oz, dB/100m),
// every problem with its key path, value and expectation, warnings naming the model's range, and
// the resulting LineRLGC against published examples.
import { describe, expect, it } from 'vitest';
import { checkScenario, checkScenarioValue } from '../../../src/scenario/load.js';
import { readLine } from '../../../src/scenario/lines.js';
import { fromValue } from '../../../src/scenario/parse.js';
import { Problems } from '../../../src/scenario/problems.js';
import { Reader } from '../../../src/scenario/read.js';
import { parseQuantity, SPEED_OF_LIGHT } from '../../../src/units.js';
import type { LineRLGC } from '../../../sim/model.js';
import { attenuationDbPerM, dsLossTangent } from '../../../sim/lines/index.js';

const C0 = SPEED_OF_LIGHT;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

function line(value: unknown) {
  const problems = new Problems('t.json');
  const rlgc = readLine(new Reader(problems), fromValue(value), 'lines.t');
  const show = (ps: typeof problems.errors) => ps.map((p) => [p.path, p.value, p.expected] as const);
  return { rlgc, errors: show(problems.errors), warnings: show(problems.warnings) };
}

/** Z0 = √(L′/C′) and ε_eff = (c0·√(L′C′))² of the high-frequency L′, C′ (telegrapher relations). */
const z0Of = (l: LineRLGC) => Math.sqrt(l.l / l.c);
const epsOf = (l: LineRLGC) => (C0 * Math.sqrt(l.l * l.c)) ** 2;

describe('units of the geometric forms', () => {
  it('copper weight: 1 oz = 35 µm, 2 oz = 70 µm, 0.5 oz = 17.5 µm (common practice), as a thickness only', () => {
    expect(parseQuantity('1oz', 'thickness')).toEqual({ ok: true, value: 35e-6 });
    expect(parseQuantity('2oz', 'thickness')).toEqual({ ok: true, value: 70e-6 });
    expect(parseQuantity('0.5oz', 'thickness')).toEqual({ ok: true, value: 17.5e-6 });
    expect(parseQuantity('1.4mil', 'thickness')).toEqual({ ok: true, value: 35.56e-6 }); // 1 mil = 25.4 µm (NIST SP 811)
    expect(parseQuantity('1oz', 'length').ok).toBe(false);
  });

  it('attenuation per length: 4.3 dB/100m = 0.043 dB/m, 1 dB/ft = 1/0.3048 dB/m (NIST SP 811 foot)', () => {
    expect(parseQuantity('4.3dB/100m', 'attenuationPerLength')).toEqual({ ok: true, value: 0.043 });
    expect(rel((parseQuantity('1dB/ft', 'attenuationPerLength') as { value: number }).value, 1 / 0.3048)).toBeLessThan(1e-15);
    expect(rel((parseQuantity('0.1dB/in', 'attenuationPerLength') as { value: number }).value, 0.1 / 0.0254)).toBeLessThan(1e-15);
  });

  it('a mil-and-ounce microstrip: W = 8 mil = 203.2 µm, t = 1 oz = 35 µm; its DC resistance is 1/(σ·W·t) (R = ρℓ/A)', () => {
    const { rlgc, errors } = line({ microstrip: { width: '8mil', height: '8mil', thickness: '1oz', er: 4.3 } });
    expect(errors).toEqual([]);
    expect(rel(rlgc!.r, 1 / (5.8e7 * 203.2e-6 * 35e-6))).toBeLessThan(1e-12);
    expect(rlgc!.wideband).toBeDefined();
    expect(rlgc!.g).toBe(0);
  });
});

describe('geometric forms against published examples (through the scenario loader)', () => {
  it('microstrip: Pozar design example, εr 2.20, d = 0.127 cm, W/d = 3.081 → Z0 ≈ 50 Ω, ε_eff ≈ 1.87 (Pozar, Microwave Engineering)', () => {
    // 1 %: Pozar evaluates the simpler Hammerstad 1975 forms, good to about 1 %.
    const { rlgc, errors, warnings } = line({ microstrip: { width: `${3.081 * 0.127}cm`, height: '0.127cm', thickness: 0, er: 2.2, conductor: 'perfect' } });
    expect(errors).toEqual([]);
    expect(warnings).toEqual([]);
    expect(rel(z0Of(rlgc!), 50)).toBeLessThan(0.01);
    expect(rel(epsOf(rlgc!), 1.87)).toBeLessThan(0.01);
    expect(rlgc!.r).toBe(0);
  });

  it('stripline: Pozar example, b = 0.32 cm, εr 2.20, W = 0.266 cm → 50 Ω (Pozar, Microwave Engineering)', () => {
    // 1 %: Pozar's synthesis is a curve fit good to about 1 %.
    const { rlgc, errors } = line({ stripline: { width: '0.266cm', planeSpacing: '0.32cm', thickness: 0, er: 2.2, conductor: 'perfect' } });
    expect(errors).toEqual([]);
    expect(rel(z0Of(rlgc!), 50)).toBeLessThan(0.01);
    expect(rel(epsOf(rlgc!), 2.2)).toBeLessThan(1e-12); // homogeneous dielectric: ε_eff = εr
  });

  it('coax: Z0 = (60/√εr)·ln(D/d) (Pozar; Ulaby) and the Ulaby example εr 2.25, a = 1.2 mm, b = 4.2 mm → 50 Ω, u_p = 2e8 m/s', () => {
    const { rlgc } = line({ coax: { innerDiameter: '1mm', shieldDiameter: '3.5mm', er: 2.25, conductor: 'perfect' } });
    // 0.1 %: the textbook 60 is η0/2π ≈ 59.96.
    expect(rel(z0Of(rlgc!), (60 / 1.5) * Math.log(3.5))).toBeLessThan(1e-3);
    const u = line({ coax: { innerDiameter: '2.4mm', shieldDiameter: '8.4mm', er: 2.25, conductor: 'perfect' } }).rlgc!;
    expect(rel(z0Of(u), 50)).toBeLessThan(0.005); // b rounded to 4.2 mm (4.19 exactly)
    expect(rel(1 / Math.sqrt(u.l * u.c), 2e8)).toBeLessThan(1e-3);
  });

  it('two wires: Z0 = (120/√εr)·acosh(s/d) (Ramo, Whinnery & Van Duzer)', () => {
    const { rlgc } = line({ twoWire: { diameter: '1mm', spacing: '3mm', er: 1, conductor: 'perfect' } });
    expect(rel(z0Of(rlgc!), 120 * Math.acosh(3))).toBeLessThan(1e-3); // 120 vs η0/π
  });

  it('FR-4 microstrip delay about 140–150 ps/in and stripline 170–180 ps/in (common practice, high-speed design handbooks)', () => {
    const ms = line({ microstrip: { width: '8mil', height: '4.5mil', thickness: '0.5oz', er: 4.2, lossTangent: 0.02 } }).rlgc!;
    const sl = line({ stripline: { width: '5mil', planeSpacing: '16mil', thickness: '0.5oz', er: 4.3, lossTangent: 0.02 } }).rlgc!;
    // The loader's L′ and C′ are the high-frequency ones (ε∞ of the wideband dielectric): slightly faster.
    const psPerIn = (l: LineRLGC) => Math.sqrt(l.l * l.c) * 0.0254e12;
    expect(psPerIn(ms)).toBeGreaterThan(133); // 140 − 5 %
    expect(psPerIn(ms)).toBeLessThan(154); // 140 + 10 %
    expect(psPerIn(sl)).toBeGreaterThan(160);
    expect(psPerIn(sl)).toBeLessThan(180);
  });
});

describe('the datasheet form', () => {
  // Conductor loss of a TEM line grows as √f (skin effect, Pozar ch. 2–3): a datasheet whose loss
  // grows by √10 per decade is pure skin effect, fitted exactly.
  it('a √f attenuation is fitted as skin effect alone, to 1 % (skin effect ∝ √f; Pozar)', () => {
    const { rlgc, errors, warnings } = line({
      z0: '50ohm',
      velocity: '0.66c',
      attenuation: [
        { at: '10MHz', loss: '4.3dB/100m' },
        { at: '100MHz', loss: `${4.3 * Math.sqrt(10)}dB/100m` },
        { at: '1GHz', loss: '43dB/100m' },
      ],
    });
    expect(errors).toEqual([]);
    expect(warnings).toEqual([]);
    expect(rlgc!.wideband!.skinK).toBeGreaterThan(0);
    expect(rlgc!.wideband!.dielectric).toBeNull();
    for (const [f, loss] of [[1e7, 0.043], [1e8, 0.043 * Math.sqrt(10)], [1e9, 0.43]]) expect(rel(attenuationDbPerM(rlgc!.wideband!, f), loss)).toBeLessThan(0.01);
    expect(rel(1 / Math.sqrt(rlgc!.l * rlgc!.c), 0.66 * C0)).toBeLessThan(2e-3); // lossless part: v as given
  });

  it('a loss ∝ f is fitted as dielectric loss with tanδ = α·c/(π f √εr) (Pozar, dielectric loss of a TEM line), to 1 %', () => {
    const er = (1 / 0.7) ** 2;
    const tand = 0.001;
    const alpha = (f: number) => ((20 / Math.LN10) * Math.PI * f * Math.sqrt(er) * tand) / C0; // dB/m
    const { rlgc, errors } = line({
      z0: '75ohm',
      delay: `${1 / (0.7 * C0)}s/m`,
      attenuation: [1e8, 3e8, 1e9].map((f) => ({ at: `${f}Hz`, loss: `${alpha(f)}dB/m` })),
    });
    expect(errors).toEqual([]);
    const w = rlgc!.wideband!;
    expect(w.skinK).toBeLessThan(1e-9);
    expect(w.dielectric).not.toBeNull();
    expect(rel(dsLossTangent(w.dielectric!.model, 3e8), tand)).toBeLessThan(0.01);
  });

  it('a known DC resistance "rdc" is kept, not fitted', () => {
    const { rlgc } = line({ z0: '50ohm', velocity: '0.66c', rdc: '0.04ohm/m', attenuation: [{ at: '10MHz', loss: '4.6dB/100m' }, { at: '1GHz', loss: '57dB/100m' }] });
    expect(rlgc!.r).toBe(0.04);
  });

  it('warns when the fit misses a point by more than 5 %, naming the error, at the attenuation list', () => {
    const { rlgc, errors, warnings } = line({
      z0: '50ohm',
      velocity: '0.66c',
      attenuation: [
        { at: '10MHz', loss: '10dB/100m' },
        { at: '100MHz', loss: '3dB/100m' },
        { at: '1GHz', loss: '30dB/100m' },
      ],
    });
    expect(errors).toEqual([]);
    expect(rlgc).toBeDefined();
    expect(warnings).toHaveLength(1);
    expect(warnings[0][0]).toBe('lines.t.attenuation');
    expect(warnings[0][2]).toMatch(/misses a given point by \d+\.\d %/);
  });

  it('warns when there are fewer points than unknowns', () => {
    const { warnings } = line({ z0: '50ohm', velocity: '0.66c', attenuation: [{ at: '100MHz', loss: '14dB/100m' }] });
    expect(warnings.map((w) => w[2]).join('\n')).toMatch(/underdetermined/);
  });
});

describe('problems are listed with key path, value and what was expected', () => {
  it('bad values in a microstrip, all of them at once', () => {
    const { errors } = line({ microstrip: { width: '8mol', height: '-5mil', thickness: '1oz', er: 0.5, conductor: 'silver', roughness: '-1um', at: '10Hz' } });
    expect(errors).toEqual([
      ['lines.t.microstrip.er', 0.5, 'a number ≥ 1 like "4.3"'],
      ['lines.t.microstrip.at', '10Hz', 'a frequency between 1kHz and 1THz like "1GHz"'],
      ['lines.t.microstrip.conductor', 'silver', 'a conductor: "copper" or "perfect", or {"conductivity": "5.8e7S/m"}'],
      ['lines.t.microstrip.roughness', '-1um', 'a length ≥ 0 like "0.5um"'],
      ['lines.t.microstrip.width', '8mol', 'a length > 0 like "5mil" — did you mean "8mil"?'], // one letter off (units.ts suggestUnits)
      ['lines.t.microstrip.height', '-5mil', 'a length > 0 like "5mil"'],
    ]);
  });

  it('a typo is an unknown key with a suggestion; a missing key names what is needed', () => {
    const { errors } = line({ microstrip: { widht: '8mil', height: '5mil', thickness: '1oz', er: 4.3 } });
    expect(errors[0]).toEqual(['lines.t.microstrip.widht', '8mil', expect.stringContaining('did you mean "width"?')]);
    const missing = line({ stripline: { width: '5mil', thickness: '1oz', er: 4.3 } }).errors;
    expect(missing).toEqual([['lines.t.stripline.planeSpacing', undefined, 'a length > 0 like "1mm"']]);
  });

  it('relations between keys: strip inside its planes, shield around the inner conductor, wires apart, a thickness for a lossy strip', () => {
    expect(line({ stripline: { width: '5mil', planeSpacing: '16mil', thickness: '20mil', er: 4.3 } }).errors).toEqual([
      ['lines.t.stripline.thickness', '20mil', 'a thickness less than planeSpacing 406.4 µm (the strip sits between the planes)'],
    ]);
    expect(line({ coax: { innerDiameter: '3mm', shieldDiameter: '2mm', er: 2.25 } }).errors).toEqual([
      ['lines.t.coax.shieldDiameter', '2mm', 'a shield diameter larger than innerDiameter 3 mm'],
    ]);
    expect(line({ twoWire: { diameter: '1mm', spacing: '1mm', er: 1 } }).errors[0][0]).toBe('lines.t.twoWire.spacing');
    expect(line({ microstrip: { width: '8mil', height: '5mil', thickness: 0, er: 4.3 } }).errors).toEqual([
      ['lines.t.microstrip.thickness', 0, expect.stringContaining('a lossy conductor needs one')],
    ]);
  });

  it('a loss tangent beyond the causal (Djordjevic–Sarkar) limit, and a bad conductivity', () => {
    const tan = line({ microstrip: { width: '8mil', height: '5mil', thickness: '1oz', er: 4.3, lossTangent: 0.5 } }).errors;
    expect(tan).toEqual([['lines.t.microstrip.lossTangent', 0.5, expect.stringMatching(/^a smaller loss tangent \(for er 4\.3 at 1 GHz .* at most 0\.1\d\d\)$/)]]);
    const sigma = line({ coax: { innerDiameter: '1mm', shieldDiameter: '3mm', er: 2.25, conductor: { conductivity: '-1S/m' } } }).errors;
    expect(sigma).toEqual([['lines.t.coax.conductor.conductivity', '-1S/m', 'a conductivity > 0 like "5.8e7S/m"']]);
  });

  it('the constant loss keys "r"/"g" do not go with a geometry, and a line is given one way only', () => {
    expect(line({ microstrip: { width: '8mil', height: '5mil', thickness: '1oz', er: 4.3 }, r: '1ohm/m' }).errors.map((e) => e[0])).toEqual(['lines.t.r']);
    const two = line({ microstrip: { width: '8mil', height: '5mil', thickness: '1oz', er: 4.3 }, coax: { innerDiameter: '1mm', shieldDiameter: '3mm', er: 2 } }).errors;
    expect(two).toHaveLength(1);
    expect(two[0][2]).toMatch(/^a line given one way only: it is given both as microstrip and as coax/);
  });

  it('datasheet problems: empty list, a loss without "per length", a frequency twice, faster than light', () => {
    expect(line({ z0: '50ohm', velocity: '0.66c', attenuation: [] }).errors[0].slice(0, 2)).toEqual(['lines.t.attenuation', []]);
    expect(line({ z0: '50ohm', velocity: '0.66c', attenuation: [{ at: '10MHz', loss: '4dB' }] }).errors).toEqual([
      ['lines.t.attenuation[0].loss', '4dB', 'an attenuation per length > 0 like "14dB/100m"'],
    ]);
    const twice = line({ z0: '50ohm', velocity: '0.66c', attenuation: [{ at: '10MHz', loss: '4dB/100m' }, { at: '10MHz', loss: '5dB/100m' }] }).errors;
    expect(twice).toEqual([['lines.t.attenuation[1].at', '10MHz', 'a frequency not given twice (lines.t.attenuation[0] is also at 10 MHz)']]);
    expect(line({ z0: '50ohm', velocity: '1.005c', attenuation: [{ at: '10MHz', loss: '4dB/100m' }] }).errors[0][0]).toBe('lines.t.velocity');
  });
});

describe('warnings name the range of validity', () => {
  it('everyday geometry does not warn: 1 oz copper on 4 and 5 mil of FR-4 (microstrip) and between planes 10 mil apart (stripline)', () => {
    // 1 oz = 35 µm (IPC, common practice); 4–5 mil prepreg under a surface trace and 1 oz inner layers
    // are the common PCB stack-ups (common practice). No user-facing message says "from memory".
    for (const [w, h] of [['7mil', '4mil'], ['9mil', '5mil']]) {
      const { errors, warnings } = line({ microstrip: { width: w, height: h, thickness: '1oz', er: 4.1, lossTangent: 0.018, at: '1GHz' } });
      expect(errors).toEqual([]);
      expect(warnings).toEqual([]);
    }
    const { warnings } = line({ stripline: { width: '5mil', planeSpacing: '10mil', thickness: '1oz', er: 4.1 } });
    expect(warnings).toEqual([]);
    const wide = line({ stripline: { width: '200mil', planeSpacing: '10mil', thickness: '1oz', er: 4.1 } });
    expect(wide.warnings).toHaveLength(1);
    expect(wide.warnings[0][2]).not.toMatch(/memory/);
  });

  it('microstrip W/h = 200 is outside Hammerstad–Jensen 0.01 ≤ W/h ≤ 100 (their stated 0.2 % range)', () => {
    const { rlgc, errors, warnings } = line({ microstrip: { width: '200mm', height: '1mm', thickness: '35um', er: 4.3 } });
    expect(errors).toEqual([]);
    expect(rlgc).toBeDefined();
    expect(warnings).toHaveLength(1);
    expect(warnings[0][0]).toBe('lines.t.microstrip');
    expect(warnings[0][2]).toMatch(/W\/h = 200 is outside 0\.01 ≤ W\/h ≤ 100 \(Hammerstad–Jensen 1980/);
  });

  it('a scenario file reports the warning with its line:col, and still loads', () => {
    const text = [
      'driver: { signal: { kind: step, from: 0V, to: 1V, rise: 100ps }, resistance: 50ohm }',
      'lines:',
      '  wide:',
      '    stripline: { width: 300mm, planeSpacing: 1mm, thickness: 35um, er: 4.3 }',
      'route: [ { name: a, line: wide, length: 1in } ]',
    ].join('\n');
    const r = checkScenario(text, 'w.yaml');
    expect(r.problems).toEqual([]);
    expect(r.net).toBeDefined();
    expect(r.warnings).toHaveLength(1);
    expect(r.warnings[0]).toMatchObject({ path: 'lines.wide.stripline', line: 4, col: 16 });
    expect(r.warnings[0].expected).toMatch(/stripline: W'\/\(b − t\) = .* is outside 0 ≤ W'\/\(b − t\) ≤ 10/);
  });

  it('inline lines in route items work like named ones', () => {
    const r = checkScenarioValue({
      driver: { signal: { kind: 'step', from: '0V', to: '1V', rise: '100ps' }, resistance: '50ohm' },
      route: [{ name: 'cable', line: { coax: { innerDiameter: '0.9mm', shieldDiameter: '2.95mm', er: 2.25, lossTangent: 2e-4 } }, length: '10m' }],
    });
    expect(r.problems).toEqual([]);
    const item = r.net!.route[0];
    expect(item.kind === 'line' && item.line.wideband?.dielectric).toBeTruthy();
  });
});
