// Human-readable text for the terminal: aligned tables and the per-scenario run summary.
import type { RunReport } from '../output/run.js';
import type { CheckResult } from '../measure/index.js';
import { dtReasonText } from '../engine-text.js';
import { formatSI } from '../units.js';
import { alignColumns as table } from '../text/columns.js';

export { alignColumns as table, type Align } from '../text/columns.js';

/** Label column on the left, content lines on the right; continuation lines indented under the content. */
function section(label: string, lines: string[], labelWidth: number): string[] {
  return lines.map((l, i) => `  ${(i === 0 ? label : '').padEnd(labelWidth)}  ${l}`.trimEnd());
}

const si = (value: number, unit: string) => formatSI(value, unit, 4);

/** The checks' verdict ("2 of 3 FAIL", "all 3 PASS") and each failing check: probe, metric, limit and why. */
export function checkLines(checks: readonly CheckResult[]): string[] {
  const failed = checks.filter((c) => !c.pass);
  if (failed.length === 0) return [`all ${checks.length} PASS`];
  return [`${failed.length} of ${checks.length} FAIL`, ...failed.map((c) => `FAIL ${c.probe} ${c.metric} ${c.limit}: ${c.message}`)];
}

/** The summary printed after a scenario has run (without --quiet). */
export function formatRunReport(report: RunReport): string {
  const { net } = report.scenario;
  const d = report.result.discretization;
  const lw = 9;
  const lines: string[] = [net.title || '(untitled)'];
  lines.push(...section('scenario', [report.scenario.file], lw));
  lines.push(...section('Δt', [`${si(d.dt, 's')}  (${dtReasonText(d.dtRule)})`], lw));
  if (d.segments.length) {
    const rows = d.segments.map((s) => [s.name, si(s.length, 'm'), `${s.cells} cells`, `Courant ${s.courant.toFixed(4)}`]);
    lines.push(...section('segments', table(rows, ['l', 'r', 'r', 'l']), lw));
  } else {
    lines.push(...section('segments', ['none (lumped parts only)'], lw));
  }
  const wall = report.wallTime;
  lines.push(
    ...section(
      'steps',
      [`${d.steps} steps × ${d.nodes} nodes to ${si(d.duration, 's')}, ${si(wall.simulate, 's')} simulating, ${si(wall.total, 's')} in all`],
      lw,
    ),
  );
  // "50 % at": the first crossing of the source's 50 % level through the probe's DC divider (blank when
  // the probe does not follow the source, or never crosses in the run).
  const probeRows = Object.entries(report.summary.probes).map(([name, s]) => [
    name,
    si(s.min, 'V'),
    si(s.max, 'V'),
    si(s.final, 'V'),
    s.crossing50.time === null ? '' : si(s.crossing50.time, 's'),
  ]);
  lines.push(...section('probes', table([['', 'min', 'max', 'final', '50 % at'], ...probeRows], ['l', 'r', 'r', 'r', 'r']), lw));
  if (report.checks.length > 0) lines.push(...section('checks', checkLines(report.checks), lw));
  const receivers = report.summary.receivers;
  if (receivers) {
    const rows = Object.entries(receivers).map(([name, r]) => [name, r.recorded ? r.probe : `${r.probe} (added)`, si(r.min, 'V'), si(r.max, 'V'), si(r.final, 'V')]);
    lines.push(...section('receivers', table([['', 'probe', 'min', 'max', 'final'], ...rows], ['l', 'l', 'r', 'r', 'r']), lw));
  }
  const crosstalk = report.summary.crosstalk;
  if (crosstalk) {
    const entries = Object.entries(crosstalk);
    const swing = entries[0][1].aggressorSwingV;
    const head = ['', 'net', 'at', 'rest', 'peak', swing === null ? '' : `of ${si(swing, 'V')}`, 'at time'];
    const rows = entries.map(([name, x]) => [name, x.net, x.place, si(x.restV, 'V'), `${x.peakV >= 0 ? '+' : ''}${si(x.peakV, 'V')}`, x.peakPct === null ? '' : `${x.peakPct.toFixed(2)} %`, si(x.peakTime, 's')]);
    lines.push(...section('crosstalk', [...table([head, ...rows], ['l', 'l', 'l', 'r', 'r', 'r', 'r']), 'quiet nets: largest departure from the resting level, % of the largest aggressor swing (an engineering estimate)'], lw));
  }
  lines.push(...section('wrote', report.files, lw));
  return lines.join('\n') + '\n';
}
