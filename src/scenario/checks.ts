// "checks", "thresholds" and "levels" in a scenario: pass/fail limits on probe measurements, the
// logic input levels and the state levels they are measured against (see docs/scenario-format.md,
// docs/checks-and-sweeps.md, docs/measurements.md).
//
//   "levels": "settled" | "histogram"                          state levels (default "settled")
//   "thresholds": "lvcmos33"                                   a preset (JEDEC JESD8 family)
//   "thresholds": { "preset": "lvcmos18", "vdd": "1.71V" }      a preset at another supply
//   "thresholds": { "vih": "2.0V", "vil": "0.8V" }             explicit levels
//   "probes": [{ "name": "rx", "at": "receiver", "thresholds": ... }]   per probe (overrides)
//   "checks": [{ "probe": "rx", "metric": "overshoot", "max": "10%" },
//              { "probe": "rx", "metric": "settling", "max": "5ns", "band": "3%" }, ...]
//
// Like the rest of the validator, every problem is reported with its key path, the value and what
// was expected; unknown keys are errors. The results ride on the Net as extra fields (the engine
// ignores them): read them with netChecks / netThresholds.
import type { Net } from '../../sim/model.js';
import {
  METRIC_NAMES,
  METRICS,
  findPreset,
  isMetricName,
  parseCheckLimit,
  presetNames,
  resolveThresholds,
  type CheckLimit,
  type CheckSpec,
  type EdgeSelection,
  type LogicThresholds,
} from '../measure/index.js';
import { POSITIVE } from '../units.js';
import { closest, joinKey, type Pos } from './problems.js';
import type { SrcNode } from './parse.js';
import { Obj, type Reader } from './read.js';
import { keyedRecord } from '../keyed.js';

export const CHECK_KEYS = ['probe', 'metric', 'max', 'min', 'band', 'edges'] as const;
export const THRESHOLD_KEYS = ['preset', 'vdd', 'vih', 'vil'] as const;
export const EDGE_SELECTIONS = ['rising', 'falling', 'all'] as const;

/** Metrics whose value needs logic thresholds on the probe. */
const NEEDS_THRESHOLDS = new Set(['noiseMarginHigh', 'noiseMarginLow', 'delayThreshold', 'ringbackMargin']);

/** A Net as the scenario loader returns it: the engine's Net plus the verification settings. */
export interface CheckedNet extends Net {
  /** Scenario-level checks, in file order (absent: none). */
  checks?: CheckSpec[];
  /** Scenario-level logic thresholds (absent: none). */
  thresholds?: LogicThresholds;
  /** Per-probe thresholds, by probe name (override the scenario's). */
  probeThresholds?: Record<string, LogicThresholds>;
  /** How the probes' state levels are found (absent: "settled"). */
  levels?: LevelMethod;
}

/**
 * "settled": each probe's levels are the net's DC levels for the driver's low and high level;
 * "histogram": the IEEE 181 histogram-mode levels of each probe's own waveform.
 */
export const LEVEL_METHODS = ['settled', 'histogram'] as const;
export type LevelMethod = (typeof LEVEL_METHODS)[number];

/** The state-level method of a loaded scenario ("settled" unless it says "histogram"). */
export function netLevelMethod(net: Net): LevelMethod {
  return (net as CheckedNet).levels ?? 'settled';
}

/** The checks of a loaded scenario ([] when it has none). */
export function netChecks(net: Net): CheckSpec[] {
  return (net as CheckedNet).checks ?? [];
}

/** The logic thresholds that apply to a probe: its own, else the scenario's, else none. */
export function netThresholds(net: Net, probe: string): LogicThresholds | undefined {
  const n = net as CheckedNet;
  const own = n.probeThresholds && Object.prototype.hasOwnProperty.call(n.probeThresholds, probe) ? n.probeThresholds[probe] : undefined;
  return own ?? n.thresholds;
}

const THRESHOLDS_WHAT = `logic thresholds: a preset name (${presetNames().map((n) => `"${n}"`).join(', ')}), {"preset": "lvcmos18", "vdd": "1.71V"} or {"vih": "2.0V", "vil": "0.8V"}`;
const CHECK_WHAT = 'a check like {"probe": "rx", "metric": "overshoot", "max": "10%"}';

/** Reads a "thresholds" value (scenario level or on a probe). */
export function readThresholds(r: Reader, node: SrcNode | undefined, path: string, at?: Pos): LogicThresholds | undefined {
  if (node?.type === 'scalar' && typeof node.value === 'string') {
    const p = findPreset(node.value);
    if (!p) {
      const guess = closest(node.value, presetNames());
      return r.fail(path, node, `${THRESHOLDS_WHAT}${guess ? ` — did you mean "${guess}"?` : ''}`, at);
    }
    return resolveThresholds(p.name);
  }
  const o = r.object(node, path, THRESHOLDS_WHAT, at);
  if (!o) return undefined;
  if (!o.checkKeys(THRESHOLD_KEYS)) return undefined;
  const hasPreset = o.has('preset') || o.has('vdd');
  const hasLevels = o.has('vih') || o.has('vil');
  if (hasPreset && hasLevels) {
    const key = o.has('vih') ? 'vih' : 'vil';
    return r.fail(o.keyPath(key), o.get(key), 'either "preset" (with an optional "vdd") or "vih" and "vil", not both', o.pos);
  }
  if (hasPreset) {
    if (!o.has('preset')) return o.missing('preset', `a preset name (${presetNames().join(', ')}) to go with "vdd"`);
    const name = o.string('preset', `a preset name (${presetNames().join(', ')})`);
    const vdd = o.optQuantity('vdd', { dim: 'voltage', range: POSITIVE, example: '1.8V' });
    if (name === undefined || vdd === undefined) return undefined;
    const p = findPreset(name);
    if (!p) {
      const guess = closest(name, presetNames());
      return r.fail(o.keyPath('preset'), o.get('preset'), `a preset name (${presetNames().join(', ')})${guess ? ` — did you mean "${guess}"?` : ''}`, o.pos);
    }
    return resolveThresholds(vdd === null ? p.name : { preset: p.name, vdd });
  }
  if (!hasLevels) return r.fail(path, node, THRESHOLDS_WHAT, at);
  const vih = o.has('vih') ? o.quantity('vih', { dim: 'voltage', example: '2.0V' }) : o.missing('vih', 'the minimum input voltage read as high, like "2.0V"');
  const vil = o.has('vil') ? o.quantity('vil', { dim: 'voltage', example: '0.8V' }) : o.missing('vil', 'the maximum input voltage read as low, like "0.8V"');
  if (vih === undefined || vil === undefined) return undefined;
  if (!(vil < vih)) return r.fail(o.keyPath('vil'), o.get('vil'), `a "vil" below "vih" (${vih} V)`, o.pos);
  return { vih, vil };
}

function unitWord(u: CheckLimit['unit']): string {
  return u === '%' ? 'a percentage of the swing ("10%")' : u === 'V' ? 'volts ("0.2V")' : u === 's' ? 'a time ("5ns")' : 'a plain count (1)';
}

function limitPhrase(metric: string): string {
  if (!isMetricName(metric)) return 'a limit like "10%", "0.2V", "5ns" or 1';
  return `a limit for "${metric}" in ${METRICS[metric].units.map(unitWord).join(' or ')}`;
}

/**
 * Reads one check. `probes`: the scenario's probe names (undefined when the probes themselves were
 * bad: names are then not checked). `hasThresholds(probe)`: whether thresholds apply to a probe.
 */
function readCheck(r: Reader, node: SrcNode, path: string, probes: readonly string[] | undefined, hasThresholds: (p: string) => boolean, at?: Pos): CheckSpec | undefined {
  const o = r.object(node, path, CHECK_WHAT, at);
  if (!o) return undefined;
  let ok = o.checkKeys(CHECK_KEYS);

  let probe: string | undefined;
  if (!o.has('probe')) ok = !!o.missing('probe', `the name of a probe${probes ? ` (${probes.map((p) => `"${p}"`).join(', ')})` : ''}`) && ok;
  else {
    probe = o.string('probe', 'a probe name like "rx"');
    if (probe !== undefined && probes && !probes.includes(probe)) {
      const guess = closest(probe, probes);
      r.fail(o.keyPath('probe'), o.get('probe'), `the name of a probe (${probes.map((p) => `"${p}"`).join(', ')})${guess ? ` — did you mean "${guess}"?` : ''}`, o.pos);
      probe = undefined;
    }
    if (probe === undefined) ok = false;
  }

  let metric: string | undefined;
  if (!o.has('metric')) ok = !!o.missing('metric', `a metric: one of ${METRIC_NAMES.join(', ')}`) && ok;
  else {
    metric = o.string('metric', `a metric: one of ${METRIC_NAMES.join(', ')}`);
    if (metric !== undefined && !isMetricName(metric)) {
      const guess = closest(metric, METRIC_NAMES);
      r.fail(o.keyPath('metric'), o.get('metric'), `a metric: one of ${METRIC_NAMES.join(', ')}${guess ? ` — did you mean "${guess}"?` : ''}`, o.pos);
      metric = undefined;
    }
    if (metric === undefined) ok = false;
  }

  const limit = (key: 'max' | 'min'): CheckLimit | undefined | null => {
    if (!o.has(key)) return null;
    const n = o.get(key)!;
    const raw = n.type === 'scalar' && (typeof n.value === 'string' || typeof n.value === 'number') ? n.value : undefined;
    let l: CheckLimit | undefined;
    if (raw !== undefined) {
      try {
        l = parseCheckLimit(raw);
      } catch {
        l = undefined;
      }
    }
    // A plain number is in SI base units, as for scenario quantities, when the metric has one unit.
    const units = metric !== undefined ? METRICS[metric as keyof typeof METRICS].units : undefined;
    if (l && l.unit === 'count' && units && !units.includes('count') && units.length === 1) l = { ...l, unit: units[0]! };
    if (!l || (units !== undefined && !units.includes(l.unit))) {
      return r.fail(o.keyPath(key), n, limitPhrase(metric ?? ''), o.pos);
    }
    return l;
  };
  const max = limit('max');
  const min = limit('min');
  if (max === undefined || min === undefined) ok = false;
  if (metric !== undefined && max === null && min === null && metric !== 'monotonic') {
    r.fail(path, node, `a "max" and/or "min" limit for "${metric}" in ${METRICS[metric as keyof typeof METRICS].units.map(unitWord).join(' or ')}`, at);
    ok = false;
  }
  if (max && min && max.unit === min.unit && min.value > max.value) {
    r.fail(o.keyPath('min'), o.get('min'), `a "min" no larger than "max" (${max.text ?? max.value})`, o.pos);
    ok = false;
  }

  let band: CheckLimit | undefined;
  if (o.has('band')) {
    const n = o.get('band')!;
    const raw = n.type === 'scalar' && (typeof n.value === 'string' || typeof n.value === 'number') ? n.value : undefined;
    let l: CheckLimit | undefined;
    try {
      l = raw === undefined ? undefined : parseCheckLimit(raw);
    } catch {
      l = undefined;
    }
    if (metric !== undefined && metric !== 'settling') {
      r.fail(o.keyPath('band'), n, `no "band" on metric "${metric}" ("band" is the settling band of metric "settling")`, o.pos);
      ok = false;
    } else if (!l || (l.unit !== '%' && l.unit !== 'V') || !(l.value > 0)) {
      r.fail(o.keyPath('band'), n, 'a settling band > 0 as a percentage of the swing ("3%") or in volts ("50mV")', o.pos);
      ok = false;
    } else band = l;
  }

  let edges: EdgeSelection | undefined;
  if (o.has('edges')) {
    const e = o.string('edges', '"rising", "falling" or "all"');
    const kind = metric !== undefined ? METRICS[metric as keyof typeof METRICS].kind : undefined;
    if (e !== undefined && !(EDGE_SELECTIONS as readonly string[]).includes(e)) {
      r.fail(o.keyPath('edges'), o.get('edges'), '"rising", "falling" or "all"', o.pos);
      ok = false;
    } else if (e !== undefined && kind === 'probe') {
      r.fail(o.keyPath('edges'), o.get('edges'), `no "edges" on metric "${metric}" (it is measured over the whole record)`, o.pos);
      ok = false;
    } else if (e === undefined) ok = false;
    else edges = e as EdgeSelection;
  }

  if (ok && probes && probe !== undefined && metric !== undefined && NEEDS_THRESHOLDS.has(metric) && !hasThresholds(probe)) {
    r.fail(o.keyPath('metric'), o.get('metric'), `a metric that needs no logic thresholds, or "thresholds" on the scenario or on probe "${probe}" ("${metric}" is measured against vih/vil)`, o.pos);
    ok = false;
  }
  if (!ok || probe === undefined || metric === undefined) return undefined;
  const spec: CheckSpec = { probe, metric };
  if (max) spec.max = max;
  if (min) spec.min = min;
  if (band) spec.band = band;
  if (edges) spec.edges = edges;
  return spec;
}

/**
 * Reads "thresholds" (top level and on each probe) and "checks". `probeNames` are the names of the
 * validated probes in file order (undefined when the probes had problems). Returns the fields to put
 * on the Net, or undefined after reporting problems.
 */
export function readVerification(
  r: Reader,
  top: Obj,
  probeNames: readonly string[] | undefined,
): Pick<CheckedNet, 'checks' | 'thresholds' | 'probeThresholds' | 'levels'> | undefined {
  let ok = true;
  const out: Pick<CheckedNet, 'checks' | 'thresholds' | 'probeThresholds' | 'levels'> = {};
  if (top.has('levels')) {
    const what = `how the state levels are found: ${LEVEL_METHODS.map((m) => `"${m}"`).join(' or ')}`;
    const m = top.string('levels', what);
    if (m !== undefined && (LEVEL_METHODS as readonly string[]).includes(m)) out.levels = m as LevelMethod;
    else {
      if (m !== undefined) {
        const guess = closest(m, LEVEL_METHODS);
        r.fail(top.keyPath('levels'), top.get('levels'), `${what}${guess ? ` — did you mean "${guess}"?` : ''}`, top.pos);
      }
      ok = false;
    }
  }
  if (top.has('thresholds')) {
    const t = readThresholds(r, top.get('thresholds'), top.keyPath('thresholds'), top.pos);
    if (t) out.thresholds = t;
    else ok = false;
  }
  // Per-probe thresholds: the probe readers accept the key; its value is read here.
  const probesNode = top.get('probes');
  if (probesNode?.type === 'seq') {
    probesNode.items.forEach((item, i) => {
      if (item.type !== 'map') return;
      const e = item.entries.find((x) => x.key === 'thresholds');
      if (!e) return;
      const path = joinKey(`probes[${i}]`, 'thresholds');
      const t = readThresholds(r, e.value, path, e.keyPos ?? item.pos);
      if (!t) {
        ok = false;
        return;
      }
      const name = probeNames?.[i];
      if (name !== undefined) (out.probeThresholds ??= keyedRecord<LogicThresholds>())[name] = t;
    });
  }
  if (top.has('checks')) {
    const what = `a list of checks like [${CHECK_WHAT.replace(/^a check like /, '')}]`;
    const seq = r.list(top.get('checks'), 'checks', what, top.pos);
    if (!seq) ok = false;
    else {
      const has = (p: string): boolean => out.thresholds !== undefined || (out.probeThresholds !== undefined && Object.prototype.hasOwnProperty.call(out.probeThresholds, p));
      const checks: CheckSpec[] = [];
      for (const it of Obj.items(seq, 'checks')) {
        const c = readCheck(r, it.node, it.path, probeNames, has, seq.pos);
        if (c) checks.push(c);
        else ok = false;
      }
      out.checks = checks;
    }
  }
  return ok ? out : undefined;
}
