// The text `ladderwave sweep` and `ladderwave merge` print after writing their outputs.
import { formatSI } from '../measure/index.js';
import type { SweepOutcome } from './run.js';

const UNIT_TEXT: Record<string, string> = { pct: '%', ohm: 'Ω' };

/** A column value for people: "38 Ω", "1.234 ns", "4.2 %", "3". */
export function formatColumnValue(column: string, v: number | null): string {
  if (v === null) return 'n/a';
  const m = /_([A-Za-z%/]+)$/.exec(column);
  const unit = m ? m[1]! : '';
  if (unit === 'pct') return `${Number(v.toPrecision(4))} %`;
  if (unit === '' || column === 'point' || column.endsWith('checks_failed')) return String(Number(v.toPrecision(6)));
  if (column === 'checks_margin') return `${v >= 0 ? '+' : ''}${Number((100 * v).toPrecision(3))} % of the limit`;
  return formatSI(v, UNIT_TEXT[unit] ?? unit);
}

export function formatSweepReport(o: SweepOutcome, info: { jobs?: number; seconds?: number } = {}): string {
  const { plan } = o;
  const lines: string[] = [];
  const what =
    plan.mode === 'grid'
      ? plan.axes.map((a) => `${a.path}: ${a.values.length} value(s)`).join(' × ')
      : `${plan.points} samples of ${plan.spreads.map((s) => s.text).join(', ')} (seed ${plan.seed})`;
  const extra = [info.jobs ? `${info.jobs} worker(s)` : '', info.seconds !== undefined ? `${info.seconds.toFixed(1)} s` : ''].filter(Boolean).join(', ');
  lines.push(`${plan.scenario.title}`);
  lines.push(`  sweep    ${plan.scenario.file}: ${o.shard ? `shard ${o.shard.index}/${o.shard.count}, ${o.rows.length} of ${plan.points} points` : `${plan.points} points`} (${what})${extra ? `; ${extra}` : ''}`);
  const pick = o.result?.pick;
  if (pick) {
    if (pick.best) {
      lines.push(`  best     point ${pick.best.point} for "${pick.text}"`);
      for (const a of plan.axes) {
        const c = plan.header.find((h) => h === a.path || h.startsWith(`${a.path}_`))!;
        lines.push(`           ${a.path} = ${formatColumnValue(c, pick.best.values[c] ?? null)}`);
      }
      lines.push(`           ${pick.objective} = ${formatColumnValue(pick.objective, pick.best.objective)}`);
    } else {
      lines.push(`  best     none: no point meets every condition of "${pick.text}"`);
    }
    for (const c of pick.conditions) lines.push(`           ${c.text} holds at ${c.holds} of ${o.rows.length} points`);
  }
  const y = o.result?.yield;
  if (y) {
    lines.push(`  yield    ${y.passed} of ${y.samples} samples pass every check (${Number((100 * y.fraction).toPrecision(4))} %)`);
    if (y.worst) {
      const params = plan.spreads.map((s) => {
        const c = plan.header.find((h) => h === s.path || h.startsWith(`${s.path}_`))!;
        return `${s.path} = ${formatColumnValue(c, y.worst!.values[c] ?? null)}`;
      });
      const m = y.worst.margin;
      const c = y.worst.check;
      const which = c ? ` ${c.metric} at ${c.probe}: ${c.measuredText} against ${c.limit}` : '';
      const how =
        m === null
          ? `a check could not be measured${which ? `:${which}` : ''}`
          : y.worst.failed
            ? `${y.worst.failed} check(s) fail; the worst,${which || ' one check'}, by ${Number((100 * m).toPrecision(3))} % of its limit`
            : `every check passes; the closest,${which || ' one check'}, is ${Number((-100 * m).toPrecision(3))} % of its limit inside it`;
      lines.push(`  worst    sample ${y.worst.point} (${params.join(', ')}): ${how}`);
    }
  }
  lines.push(...o.files.map((f, i) => `  ${i === 0 ? 'wrote' : '     '}    ${f}`));
  return lines.join('\n') + '\n';
}
