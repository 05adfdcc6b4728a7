// sweep.json read back (by `ladderwave merge`): every field the merge uses is checked for its type
// before it is used, so a damaged or hand-edited shard folder is bad input (exit 2) naming the field,
// never a crash. The shape mirrors SweepFile and SweepPlan (run.ts, plan.ts).
import { isMetricName } from '../measure/index.js';
import type { SweepFile } from './run.js';

/** Expected shape of a JSON value. */
type Shape =
  | 'string'
  | 'finite'
  | 'count'
  | 'boolean'
  | 'any'
  | { array: Shape }
  | { object: Readonly<Record<string, Shape>>; optional?: readonly string[] }
  | { nullable: Shape }
  | { oneOf: readonly (string | number)[] }
  | { check: (v: unknown) => boolean; what: string };

const LIMIT: Shape = { object: { value: 'finite', unit: { oneOf: ['V', 's', '%', 'count'] }, text: 'string' }, optional: ['text'] };
const METRIC: Shape = { check: (v) => typeof v === 'string' && isMetricName(v), what: 'a metric name' };

const PLAN: Shape = {
  object: {
    format: { oneOf: [1] },
    scenario: { object: { file: 'string', sha256: 'string', title: 'string' } },
    scenarioValue: { check: (v) => v !== null && typeof v === 'object' && !Array.isArray(v), what: 'the scenario as an object' },
    mode: { oneOf: ['grid', 'montecarlo'] },
    axes: { array: { object: { path: 'string', text: 'string', values: { array: 'finite' }, unit: 'string', spacing: { oneOf: ['linear', 'log', 'list'] } } } },
    spreads: {
      array: {
        object: {
          path: 'string',
          text: 'string',
          distribution: { oneOf: ['uniform', 'normal'] },
          relative: 'boolean',
          amount: 'finite',
          unit: 'string',
          nominal: 'finite',
          valueUnit: 'string',
        },
      },
    },
    samples: 'count',
    seed: 'count',
    points: 'count',
    probes: { array: 'string' },
    defaultProbe: 'string',
    bands: { array: LIMIT },
    columns: { array: { object: { key: 'string', metric: METRIC, unit: { oneOf: ['V', 's', '%', 'count'] }, band: LIMIT, needsThresholds: 'boolean' }, optional: ['band', 'needsThresholds'] } },
    header: { array: 'string' },
    hasChecks: 'boolean',
    pick: { nullable: 'string' },
    metric: 'string',
  },
};

const SWEEP_FILE: Shape = {
  object: {
    format: { oneOf: [1] },
    tool: { object: { name: 'string', version: 'string' } },
    shard: { nullable: { object: { index: 'count', count: 'count' } } },
    rows: 'count',
    result: 'any',
    plan: PLAN,
  },
};

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

function describe(shape: Shape): string {
  if (shape === 'string') return 'a text';
  if (shape === 'finite') return 'a finite number';
  if (shape === 'count') return 'a whole number ≥ 0';
  if (shape === 'boolean') return 'true or false';
  if (shape === 'any') return 'a value';
  if ('array' in shape) return 'a list';
  if ('object' in shape) return 'an object';
  if ('nullable' in shape) return `null or ${describe(shape.nullable)}`;
  if ('oneOf' in shape) return `one of ${shape.oneOf.map((x) => JSON.stringify(x)).join(', ')}`;
  return shape.what;
}

/** The first place where `v` does not have `shape`, as "path: expected …", or undefined. */
function mismatch(v: unknown, shape: Shape, path: string): string | undefined {
  const bad = () => `${path || '(top level)'}: expected ${describe(shape)}`;
  if (shape === 'any') return v === undefined ? bad() : undefined;
  if (shape === 'string') return typeof v === 'string' ? undefined : bad();
  if (shape === 'finite') return typeof v === 'number' && Number.isFinite(v) ? undefined : bad();
  if (shape === 'count') return Number.isSafeInteger(v) && (v as number) >= 0 ? undefined : bad();
  if (shape === 'boolean') return typeof v === 'boolean' ? undefined : bad();
  if ('nullable' in shape) return v === null ? undefined : mismatch(v, shape.nullable, path);
  if ('oneOf' in shape) return shape.oneOf.includes(v as string | number) ? undefined : bad();
  if ('check' in shape) return shape.check(v) ? undefined : bad();
  if ('array' in shape) {
    if (!Array.isArray(v)) return bad();
    for (let i = 0; i < v.length; i++) {
      const m = mismatch(v[i], shape.array, `${path}[${i}]`);
      if (m) return m;
    }
    return undefined;
  }
  if (!isObject(v)) return bad();
  for (const [k, s] of Object.entries(shape.object)) {
    if (!Object.hasOwn(v, k)) {
      if (shape.optional?.includes(k)) continue;
      return `${path ? `${path}.` : ''}${k}: missing (expected ${describe(s)})`;
    }
    const m = mismatch(v[k], s, path ? `${path}.${k}` : k);
    if (m) return m;
  }
  return undefined;
}

/** How the plan's own numbers must agree: the point count, the shard, the header. */
function inconsistency(f: SweepFile): string | undefined {
  const p = f.plan;
  const gridPoints = p.axes.reduce((n, a) => n * a.values.length, 1);
  if (p.mode === 'grid' && (p.axes.length === 0 || p.points !== gridPoints)) return `plan.points: ${p.points}, but the varied values make ${gridPoints} grid points`;
  if (p.mode === 'montecarlo' && (p.spreads.length === 0 || p.points !== p.samples)) return `plan.points: ${p.points}, but plan.samples is ${p.samples}`;
  if (f.shard && !(f.shard.index >= 1 && f.shard.index <= f.shard.count)) return `shard: ${f.shard.index} of ${f.shard.count} (expected K from 1 to N)`;
  if (p.header[0] !== 'point') return 'plan.header: expected "point" as its first column';
  if (!p.probes.includes(p.defaultProbe)) return `plan.defaultProbe: "${p.defaultProbe}" is not one of plan.probes`;
  if (!p.columns.some((c) => c.key === p.metric)) return `plan.metric: "${p.metric}" is not one of plan.columns`;
  const params = p.mode === 'grid' ? p.axes.length : p.spreads.length;
  const width = 1 + params + p.probes.length * p.columns.length + (p.hasChecks ? 2 : 0);
  if (p.header.length !== width) return `plan.header: ${p.header.length} columns, but the plan makes ${width}`;
  if (p.hasChecks && p.header.slice(-2).join(',') !== 'checks_failed,checks_margin') return 'plan.header: expected checks_failed and checks_margin as its last columns';
  return undefined;
}

/** Checks parsed sweep.json text; returns the file, or a message naming the first bad field. */
export function validateSweepFile(value: unknown): { ok: true; file: SweepFile } | { ok: false; message: string } {
  const m = mismatch(value, SWEEP_FILE, '');
  if (m) return { ok: false, message: m };
  const file = value as SweepFile;
  const c = inconsistency(file);
  return c ? { ok: false, message: c } : { ok: true, file };
}
