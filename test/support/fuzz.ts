// A seeded mutation fuzzer over the demo scenarios: each case takes a demo net, applies a few hostile
// or careless edits (absurd magnitudes, wrong types, deleted keys, names of Object.prototype members,
// deep nesting, YAML aliases, damaged text), and picks a command line to run it with. Case k of seed s
// is always the same case (xoshiro128** keyed by seed and case number), so a failure is reproduced by
// its number alone.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { stringify } from 'yaml';
import { Xoshiro128ss } from '../../src/sweep/prng.js';

export interface FuzzCase {
  /** What was done, for the failure message. */
  edits: string[];
  /** The scenario file's text and name. */
  fileName: string;
  text: string;
  /** The command line after `ladderwave`, with FILE and OUT standing for the scenario and output paths. */
  args: string[];
}

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

class Rng {
  constructor(private readonly r: Xoshiro128ss) {}
  int(n: number): number {
    return Math.floor(this.r.nextFloat() * n);
  }
  pick<T>(xs: readonly T[]): T {
    return xs[this.int(xs.length)]!;
  }
  chance(p: number): boolean {
    return this.r.nextFloat() < p;
  }
}

/**
 * The demo scenarios (scenarios/*.json and scenarios/ci/*.json) as plain values, and the branched
 * nets of test/fixtures/scenarios (branched-*.json: a nested stub, probes and checks inside
 * branches), so that receivers, branch items and their names are mutated too.
 */
export function demoScenarios(repo: string): { name: string; value: Json }[] {
  const out: { name: string; value: Json }[] = [];
  const dirs: [string, (f: string) => boolean][] = [
    ['scenarios', (f) => f.endsWith('.json')],
    ['scenarios/ci', (f) => f.endsWith('.json')],
    ['test/fixtures/scenarios', (f) => f.startsWith('branched-') && f.endsWith('.json')],
  ];
  for (const [dir, wanted] of dirs) {
    for (const f of readdirSync(join(repo, dir)).sort()) {
      if (wanted(f)) out.push({ name: f.replace(/\.json$/, ''), value: JSON.parse(readFileSync(join(repo, dir, f), 'utf8')) as Json });
    }
  }
  return out;
}

/** Every place in a value: the path of keys and indices to it. */
function places(v: Json, path: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(path);
  if (Array.isArray(v)) v.forEach((x, i) => places(x, [...path, i], out));
  else if (v !== null && typeof v === 'object') for (const k of Object.keys(v)) places(v[k]!, [...path, k], out);
  return out;
}

function get(v: Json, path: readonly (string | number)[]): Json {
  return path.reduce<Json>((o, k) => (o as Record<string | number, Json>)[k]!, v);
}

function set(v: Json, path: readonly (string | number)[], x: Json | undefined): void {
  const parent = get(v, path.slice(0, -1)) as Record<string | number, Json> | Json[];
  const k = path[path.length - 1]!;
  if (x === undefined) {
    if (Array.isArray(parent)) parent.splice(k as number, 1);
    else delete (parent as Record<string, Json>)[k];
  } else if (Array.isArray(parent)) parent[k as number] = x;
  else Object.defineProperty(parent, k, { value: x, writable: true, enumerable: true, configurable: true });
}

const HOSTILE_SCALARS: Json[] = ['1e308V', '-1e308V', '1e-308s', '1e400ohm', '1e300ohm', '1e-300F', '1e300m', '1e300Hz', '1e300dB/m', '1e-300S/m', 0, -0, -1, 1e308, -1e308, 5e-324, '', '   ', 'NaN', 'Infinity', '-Infinity', null, true, false, 'abc', '3.3.3V', '0ohm', '0s', '1e12ohm', '1e-18F', '1fs', '1000000s', '100km', [], {}, '__proto__', 'constructor'];
const HOSTILE_NAMES = ['__proto__', 'constructor', 'toString', 'hasOwnProperty', 'valueOf', '', ' ', 'a,b', 'a"b', 'driver', 'receiver'];

/** The number of a quantity string scaled by 10^e ("39ohm", e = 300 → "39e300ohm"). */
function extreme(s: string, e: number): string {
  const m = /^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+))(?:[eE][+-]?\d+)?\s*(.*)$/.exec(s);
  return m ? `${m[1]}e${e}${m[2]}` : s;
}

function mutate(v: Json, rng: Rng): string {
  const all = places(v).filter((p) => p.length > 0);
  if (all.length === 0) return 'nothing left to change';
  const p = rng.pick(all);
  const here = get(v, p);
  const at = p.join('.');
  switch (rng.int(10)) {
    case 8:
    case 9: {
      // A value that stays valid but moves: a quantity scaled by a few decades, or a short run.
      if (typeof here === 'string' && /^\s*[+-]?(?:\d|\.\d)/.test(here)) {
        const e = rng.pick([-6, -3, -1, 1, 3, 6]);
        set(v, p, extreme(here, e));
        return `${at} ×1e${e}`;
      }
      const run = get(v, ['run']);
      if (run !== null && typeof run === 'object' && !Array.isArray(run)) {
        (run as Record<string, Json>).duration = rng.pick(['5ns', '20ns', '1us']);
        return `run.duration = ${(run as Record<string, Json>).duration}`;
      }
      return mutate(v, rng);
    }
    case 0: {
      const x = rng.pick(HOSTILE_SCALARS);
      set(v, p, structuredClone(x));
      return `${at} = ${JSON.stringify(x)}`;
    }
    case 1: {
      if (typeof here !== 'string') return mutate(v, rng);
      const e = rng.pick([300, 100, 30, 12, -12, -30, -100, -300, 400]);
      set(v, p, extreme(here, e));
      return `${at} ×1e${e}`;
    }
    case 2:
      set(v, p, undefined);
      return `delete ${at}`;
    case 3: {
      // A name where the user names something: probe, route item, line, check's probe.
      const names = all.filter((q) => q[q.length - 1] === 'name' || q[q.length - 1] === 'probe' || q[q.length - 1] === 'at' || (q[0] === 'lines' && q.length === 2));
      if (names.length === 0) return mutate(v, rng);
      const q = rng.pick(names);
      const n = rng.pick(HOSTILE_NAMES);
      const linesValue = get(v, ['lines']);
      if (q[0] === 'lines' && q.length === 2 && linesValue !== null && typeof linesValue === 'object' && !Array.isArray(linesValue)) {
        const lines = linesValue as Record<string, Json>;
        const old = q[1] as string;
        const body = lines[old]!;
        delete lines[old];
        Object.defineProperty(lines, n, { value: body, writable: true, enumerable: true, configurable: true });
        return `line ${old} renamed ${JSON.stringify(n)}`;
      }
      set(v, q, n);
      return `${q.join('.')} = ${JSON.stringify(n)}`;
    }
    case 4: {
      // Repeat a list item (many probes, many parts): kept small, a few dozen at most.
      const lists = all.filter((q) => Array.isArray(get(v, q)) && (get(v, q) as Json[]).length > 0);
      if (lists.length === 0) return mutate(v, rng);
      const q = rng.pick(lists);
      const list = get(v, q) as Json[];
      const times = rng.pick([2, 5, 40]);
      const item = list[rng.int(list.length)]!;
      for (let i = 0; i < times; i++) list.push(structuredClone(item));
      return `${q.join('.')} += ${times} copies`;
    }
    case 5: {
      let x: Json = here;
      const depth = rng.pick([3, 70, 300]);
      for (let i = 0; i < depth; i++) x = [x];
      set(v, p, x);
      return `${at} nested ${depth} deep`;
    }
    case 6: {
      // A value of another type.
      const x: Json = typeof here === 'string' ? Number.parseFloat(here) || 0 : typeof here === 'number' ? String(here) : Array.isArray(here) ? { ...here } : here !== null && typeof here === 'object' ? Object.values(here) : 'x';
      set(v, p, x);
      return `${at} retyped`;
    }
    default: {
      // An unknown key beside known ones.
      const objects = all.filter((q) => { const o = get(v, q); return o !== null && typeof o === 'object' && !Array.isArray(o); });
      if (objects.length === 0) return mutate(v, rng);
      const q = rng.pick(objects);
      const k = rng.pick(['__proto__', 'constructor', 'lenght', 'extra']);
      Object.defineProperty(get(v, q) as object, k, { value: rng.pick(HOSTILE_SCALARS), writable: true, enumerable: true, configurable: true });
      return `${q.join('.')}.${k} added`;
    }
  }
}

/** Text-level damage: truncation, a byte-order mark, an alias bomb, a recursive alias, garbage. */
function damageText(text: string, yaml: boolean, rng: Rng): { text: string; edit: string } {
  switch (rng.int(5)) {
    case 0: {
      const n = rng.int(text.length);
      return { text: text.slice(0, n), edit: `truncated at ${n}` };
    }
    case 1:
      return { text: '\ufeff' + text, edit: 'byte-order mark' };
    case 2:
      if (!yaml) return { text: text + '\u0000\u0001', edit: 'binary tail' };
      return {
        text: text + 'x1: &a [a,a,a,a,a,a,a,a,a,a]\nx2: &b [*a,*a,*a,*a,*a,*a,*a,*a,*a,*a]\nx3: &c [*b,*b,*b,*b,*b,*b,*b,*b,*b,*b]\nx4: &d [*c,*c,*c,*c,*c,*c,*c,*c,*c,*c]\nx5: [*d,*d,*d,*d,*d,*d,*d,*d,*d,*d,*d,*d]\n',
        edit: 'alias bomb',
      };
    case 3:
      return yaml ? { text: text + 'x9: &r [*r]\n', edit: 'recursive alias' } : { text: '['.repeat(5000) + text, edit: '5000 brackets' };
    default:
      return { text: text.replace(/[:,]/, ''), edit: 'a separator removed' };
  }
}

/** A command line for the case: mostly runs without pictures, and every verb now and then. */
function commandLine(rng: Rng, value: Json): string[] {
  const probe = (() => {
    const probes = (value as { probes?: Json })?.probes;
    const first = Array.isArray(probes) ? (probes[0] as { name?: Json } | undefined)?.name : undefined;
    return typeof first === 'string' ? first : 'receiver';
  })();
  const r = rng.int(100);
  if (r < 50) return ['run', 'FILE', '--views', 'none', '--out', 'OUT', '-q'];
  if (r < 58) return ['run', 'FILE', '--views', rng.pick(['waveforms', 'bounce', 'eye']), '--out', 'OUT', '-q'];
  if (r < 70) return ['check', 'FILE', '--json', 'OUT/check.json', '-q'];
  if (r < 78) return ['line', 'FILE', '--json', ...(rng.chance(0.3) ? ['--freq', rng.pick(['1e300Hz', '1GHz', '0Hz', '-1Hz', '1THz'])] : [])];
  if (r < 84) return ['tdr', 'FILE', '--out', 'OUT', '-q', ...(rng.chance(0.4) ? ['--rise', rng.pick(['1s', '1fs', '1e-308s', '35ps', '1ns'])] : []), ...(rng.chance(0.2) ? ['--z0', rng.pick(['2.2e-308ohm', '50ohm', '1e300ohm'])] : [])];
  if (r < 88) return ['eye', 'FILE', '--out', 'OUT', '-q', ...(rng.chance(0.3) ? ['--probe', probe] : [])];
  if (r < 90) return ['sparams', 'FILE', '--out', 'OUT', '-q', ...(rng.chance(0.3) ? ['--points', rng.pick(['201', '1', '1e9', 'x'])] : [])];
  if (r < 96) {
    const vary = rng.pick(['driver.resistance=10ohm,20ohm', 'driver.resistance=1e400..1:2', 'driver.resistance=1e300ohm..1ohm:2', 'run.cellsPerRise=4,8', 'nope.x=1,2', 'route.hub.branch[0].route.armA.length=1cm,20cm', 'route.hub.branch[1].receiver.parts[0].r=1e-300ohm,50ohm']);
    return ['sweep', 'FILE', '--vary', vary, '--out', 'OUT', '-q', '-j', '1'];
  }
  return ['run', 'FILE', '--views', 'none', '--force', '--out', 'OUT', '-q'];
}

/** Case `k` of the run seeded with `seed`. */
export function fuzzCase(demos: readonly { name: string; value: Json }[], seed: number, k: number): FuzzCase {
  const rng = new Rng(Xoshiro128ss.forSample(seed, k));
  // A quarter of the cases start from a net with branches (receivers, branch items and their names).
  const branched = demos.filter((d) => JSON.stringify(d.value).includes('"branch"'));
  const demo = branched.length && rng.chance(0.25) ? rng.pick(branched) : rng.pick(demos);
  const value = structuredClone(demo.value);
  const edits: string[] = [`from ${demo.name}`];
  const n = 1 + rng.int(3);
  for (let i = 0; i < n; i++) edits.push(mutate(value, rng));
  const yaml = rng.chance(0.3);
  let text = yaml ? stringify(value) : JSON.stringify(value, null, rng.chance(0.5) ? 2 : 0);
  if (rng.chance(0.15)) {
    const d = damageText(text, yaml, rng);
    text = d.text;
    edits.push(d.edit);
  }
  return { edits, fileName: `${demo.name}-${k}.${yaml ? 'yaml' : 'json'}`, text, args: commandLine(rng, value) };
}
