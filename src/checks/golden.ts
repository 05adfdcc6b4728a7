// Golden waveforms: each probe of a run compared with a stored CSV (the probes.csv format:
// `time_s,<probe>,…`) within a tolerance band in volts, allowing a small time shift.
//
// Definition. With v the simulated probe, g the golden one (linearly interpolated between its
// samples), S the allowed shift and T the run's sample instants:
//
//     E = min over |s| ≤ S of  max over t in T (where t − s lies within the golden record) |v(t) − g(t − s)|
//
// and the probe passes when E ≤ the tolerance. The shifts searched are the multiples of
// δ = min(Δt_run, Δt_golden) in [−S, S] (and ±S itself); if that would be more than 401 shifts, δ is
// S/200 instead. E, the shift that gave it and the instant of the largest difference are reported.
import { readCapped } from '../scenario/file.js';
import { basename, extname, join } from 'node:path';
import { formatSI } from '../measure/index.js';

export interface GoldenRecord {
  names: string[];
  times: Float64Array;
  columns: Float64Array[];
}

export class GoldenFormatError extends Error {}

/** Parses a probes.csv-style file. Throws GoldenFormatError naming the line. */
export function parseGoldenCsv(text: string, file = 'golden file'): GoldenRecord {
  const lines = text.split(/\r?\n/);
  while (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  if (lines.length < 3) throw new GoldenFormatError(`${file}: expected a header "time_s,<probe>,…" and at least two rows`);
  const unquote = (s: string) => (s.startsWith('"') && s.endsWith('"') ? s.slice(1, -1).replace(/""/g, '"') : s);
  const header = lines[0]!.split(',').map(unquote);
  if (header[0] !== 'time_s' || header.length < 2) throw new GoldenFormatError(`${file}:1: expected a header "time_s,<probe>,…", found "${lines[0]!.slice(0, 60)}"`);
  const names = header.slice(1);
  const n = lines.length - 1;
  const times = new Float64Array(n);
  const columns = names.map(() => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const cells = lines[i + 1]!.split(',');
    if (cells.length !== header.length) throw new GoldenFormatError(`${file}:${i + 2}: ${cells.length} values, the header has ${header.length}`);
    for (let j = 0; j < cells.length; j++) {
      const x = Number(cells[j]);
      if (cells[j]!.trim() === '' || !Number.isFinite(x)) throw new GoldenFormatError(`${file}:${i + 2}: "${cells[j]}" is not a number`);
      if (j === 0) times[i] = x;
      else columns[j - 1]![i] = x;
    }
    if (i > 0 && !(times[i]! > times[i - 1]!)) throw new GoldenFormatError(`${file}:${i + 2}: times must increase`);
  }
  return { names, times, columns };
}

export interface CompareOptions {
  /** Tolerance band (V). */
  tolerance: number;
  /** Largest time shift allowed (s), ≥ 0. */
  shift: number;
}

export interface WaveformDifference {
  /** E: the smallest, over the shifts tried, of the largest absolute difference (V). */
  maxDiff: number;
  /** The shift s (s) that gave it: the run matches the golden waveform delayed by s. */
  shift: number;
  /** Instant (s, run time) of the largest difference at that shift. */
  time: number;
  /** Number of run samples compared at that shift. */
  compared: number;
}

/** The shifts tried for a largest shift S (see the file comment). */
export function shiftGrid(S: number, dtRun: number, dtGolden: number): number[] {
  if (!(S > 0)) return [0];
  let delta = Math.min(dtRun, dtGolden);
  if (!(delta > 0) || S / delta > 200) delta = S / 200;
  const k = Math.floor(S / delta + 1e-9);
  const out: number[] = [];
  for (let i = -k; i <= k; i++) out.push(i * delta);
  if (out[0]! > -S) out.unshift(-S);
  if (out[out.length - 1]! < S) out.push(S);
  return out;
}

/** Largest |v(t) − g(t − s)| over the run samples whose shifted time lies in the golden record. */
function diffAtShift(v: ArrayLike<number>, dt: number, gt: Float64Array, gv: Float64Array, s: number): { max: number; time: number; compared: number } {
  const g0 = gt[0]!;
  const g1 = gt[gt.length - 1]!;
  const eps = 1e-9 * Math.max(dt, g1 - g0);
  let j = 0;
  let max = 0;
  let time = NaN;
  let compared = 0;
  for (let i = 0; i < v.length; i++) {
    const t = i * dt;
    const u = t - s;
    if (u < g0 - eps || u > g1 + eps) continue;
    while (j < gt.length - 2 && gt[j + 1]! < u) j++;
    const ta = gt[j]!;
    const tb = gt[j + 1]!;
    const f = Math.min(1, Math.max(0, (u - ta) / (tb - ta)));
    const g = gv[j]! + f * (gv[j + 1]! - gv[j]!);
    const d = Math.abs(v[i]! - g);
    compared++;
    if (d > max || Number.isNaN(time)) {
      max = Math.max(max, d);
      time = t;
    }
  }
  return { max, time, compared };
}

export function compareWaveform(v: ArrayLike<number>, dt: number, golden: { times: Float64Array; values: Float64Array }, opts: CompareOptions): WaveformDifference {
  const gt = golden.times;
  const dtg = (gt[gt.length - 1]! - gt[0]!) / Math.max(1, gt.length - 1);
  let best: WaveformDifference | undefined;
  for (const s of shiftGrid(opts.shift, dt, dtg)) {
    const d = diffAtShift(v, dt, gt, golden.values, s);
    if (d.compared === 0) continue;
    // Ties go to the smallest |shift| (then the earlier one).
    if (!best || d.max < best.maxDiff || (d.max === best.maxDiff && Math.abs(s) < Math.abs(best.shift))) {
      best = { maxDiff: d.max, shift: s, time: d.time, compared: d.compared };
    }
  }
  return best ?? { maxDiff: Infinity, shift: 0, time: 0, compared: 0 };
}

/** `nets/clock.json` → `clock`. */
export function scenarioBaseName(file: string): string {
  const base = basename(file);
  const ext = extname(base);
  return ext && ext !== base ? base.slice(0, -ext.length) : base;
}

/** Where a scenario's golden waveforms live: `<dir>/<scenario name>.csv`. */
export function goldenPath(dir: string, scenarioFile: string): string {
  return join(dir, `${scenarioBaseName(scenarioFile)}.csv`);
}

export interface GoldenCheck {
  probe: string;
  pass: boolean;
  /** "±10 mV, shift ≤ 20 ps" */
  limit: string;
  /** E (V), or null when there was nothing to compare. */
  measured: number | null;
  measuredText: string;
  message: string;
  /** The best shift (s), when compared. */
  shift: number | null;
  /** Run time (s) of the largest difference, when compared. */
  time: number | null;
}

export function describeGoldenLimit(o: CompareOptions): string {
  return `±${formatSI(o.tolerance, 'V')}, shift ≤ ${formatSI(o.shift, 's')}`;
}

/**
 * Compares every probe of a run with the golden record. Probes missing from the golden file fail;
 * a golden record whose time span differs from the run's fails every probe (the scenario changed:
 * update the golden file on purpose).
 */
export function compareWithGolden(
  run: { names: readonly string[]; dt: number; rows: readonly ArrayLike<number>[] },
  golden: GoldenRecord,
  opts: CompareOptions,
  fixHint: string,
): GoldenCheck[] {
  const limit = describeGoldenLimit(opts);
  const samples = run.rows[0]?.length ?? 0;
  const runEnd = (samples - 1) * run.dt;
  const gEnd = golden.times[golden.times.length - 1]!;
  const gStart = golden.times[0]!;
  const dtg = (gEnd - gStart) / Math.max(1, golden.times.length - 1);
  const spanOk = Math.abs(gEnd - runEnd) <= Math.max(run.dt, dtg) * 1.0001 && Math.abs(gStart) <= Math.max(run.dt, dtg) * 1.0001;
  return run.names.map((probe, p) => {
    const base = { probe, limit, shift: null, time: null } as const;
    const gi = golden.names.indexOf(probe);
    if (gi < 0) {
      return { ...base, pass: false, measured: null, measuredText: 'n/a', message: `probe "${probe}" is not in the golden file (it has ${golden.names.join(', ')}); ${fixHint}` };
    }
    if (!spanOk) {
      return {
        ...base,
        pass: false,
        measured: null,
        measuredText: 'n/a',
        message: `the golden record spans ${formatSI(gStart, 's')} … ${formatSI(gEnd, 's')}, this run 0 s … ${formatSI(runEnd, 's')}; ${fixHint}`,
      };
    }
    const d = compareWaveform(run.rows[p]!, run.dt, { times: golden.times, values: golden.columns[gi]! }, opts);
    const pass = d.maxDiff <= opts.tolerance;
    const at = `largest difference ${formatSI(d.maxDiff, 'V')} at ${formatSI(d.time, 's')} with the run shifted by ${formatSI(d.shift, 's')}`;
    return {
      ...base,
      pass,
      measured: d.maxDiff,
      measuredText: formatSI(d.maxDiff, 'V'),
      shift: d.shift,
      time: d.time,
      message: pass ? `within ±${formatSI(opts.tolerance, 'V')}: ${at}` : `outside ±${formatSI(opts.tolerance, 'V')}: ${at}; if the change is intended, ${fixHint}`,
    };
  });
}

/** Largest golden file read: 256 MiB (a golden file is a probes.csv; JavaScript strings end near 512 MiB). */
export const MAX_GOLDEN_BYTES = 256 * 1024 ** 2;

/**
 * Reads a golden file; undefined when it does not exist. Throws GoldenFormatError when it is
 * unreadable, too large or not a probes.csv. A leading byte-order mark is ignored, as in scenarios.
 */
export async function readGolden(path: string): Promise<GoldenRecord | undefined> {
  const read = await readCapped(path, MAX_GOLDEN_BYTES);
  if (!read.ok) {
    if (read.why === 'no such file') return undefined;
    throw new GoldenFormatError(`${path}: cannot read it (${read.why})`);
  }
  let text = read.bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  return parseGoldenCsv(text, path);
}
