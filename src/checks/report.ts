// Check results for people and machines: the terminal table, JUnit XML for CI systems, JSON, and a
// Markdown summary fit for a pull-request comment.
import { toolInfo } from '../output/tool.js';
import type { CheckRow, CheckRunReport, ScenarioReport } from './run.js';

// ---- terminal ---------------------------------------------------------------------------------

function pad(rows: string[][]): string[] {
  const w: number[] = [];
  for (const r of rows) r.forEach((c, j) => (w[j] = Math.max(w[j] ?? 0, [...c].length)));
  return rows.map((r) => r.map((c, j) => c + ' '.repeat(w[j]! - [...c].length)).join('  ').trimEnd());
}

export const TABLE_HEADER = ['scenario', 'probe', 'metric', 'limit', 'measured', 'result'] as const;

/** The results table (scenario, probe, metric, limit, measured, PASS/FAIL), then failures and errors spelled out. */
export function formatCheckTable(report: CheckRunReport): string {
  const rows: string[][] = [[...TABLE_HEADER]];
  for (const s of report.scenarios) {
    if (s.error) rows.push([s.file, '—', '—', '—', '—', 'ERROR']);
    else if (s.rows.length === 0) rows.push([s.file, '—', '—', '—', '—', 'no checks']);
    for (const r of s.rows) rows.push([s.file, r.probe, r.metric, r.limit, r.measuredText, r.pass ? 'PASS' : 'FAIL']);
  }
  const lines = pad(rows);
  lines.splice(1, 0, '-'.repeat(Math.max(...lines.map((l) => [...l].length))));
  const details: string[] = [];
  for (const s of report.scenarios) {
    if (s.error) details.push(`ERROR ${s.file}:`, ...s.error.lines.map((l) => `  ${l}`));
    for (const r of s.rows) if (!r.pass) details.push(`FAIL ${s.file}: ${r.probe} ${r.metric}: ${r.message}`);
    for (const n of s.notes) if (n.startsWith('golden file written')) details.push(`note ${s.file}: ${n}`);
  }
  const t = report.totals;
  const verdict =
    t.errors > 0
      ? `${t.errors} of ${t.scenarios} scenario(s) could not be run; ${t.failed} of ${t.checks} check(s) failed`
      : t.failed > 0
        ? `${t.failed} of ${t.checks} check(s) failed in ${t.failedScenarios} of ${t.scenarios} scenario(s)`
        : `all ${t.checks} check(s) passed in ${t.scenarios} scenario(s)`;
  return [...lines, ...(details.length ? ['', ...details] : []), '', verdict].join('\n') + '\n';
}

// ---- JUnit XML --------------------------------------------------------------------------------

/** Text safe for XML 1.0 attribute values and content (characters XML 1.0 cannot hold are dropped). */
export function xmlEscape(s: string): string {
  return s
    .replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;')
    .replace(/\n/g, '&#10;')
    .replace(/\r/g, '&#13;')
    .replace(/\t/g, '&#9;');
}

function textEscape(s: string): string {
  return s
    .replace(/[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;');
}

function attrs(a: Record<string, string | number>): string {
  return Object.entries(a)
    .map(([k, v]) => ` ${k}="${xmlEscape(String(v))}"`)
    .join('');
}

/** "sd_clk overshoot max 10 %"; a limit that only repeats the metric ("monotonic") is left out. */
function caseName(r: CheckRow): string {
  if (r.kind === 'golden') return `${r.probe} golden (${r.limit})`;
  return r.limit === r.metric || r.limit === '' ? `${r.probe} ${r.metric}` : `${r.probe} ${r.metric} ${r.limit}`;
}

/**
 * JUnit XML as CI systems read it: <testsuites> with one <testsuite> per scenario and one <testcase>
 * per check (a failed check holds a <failure>); a scenario that could not be run is a suite with one
 * test case holding an <error>. Attributes: name, tests, failures, errors, skipped, time on suites;
 * name, classname, time on test cases; message and type on failures and errors.
 */
export function toJUnitXml(report: CheckRunReport): string {
  const t = report.totals;
  const total = (s: ScenarioReport) => (s.error ? 1 : s.rows.length);
  const time = (x: number) => x.toFixed(3);
  const out: string[] = ['<?xml version="1.0" encoding="UTF-8"?>'];
  const allTime = report.scenarios.reduce((a, s) => a + s.seconds, 0);
  out.push(`<testsuites${attrs({ name: 'ladderwave check', tests: report.scenarios.reduce((a, s) => a + total(s), 0), failures: t.failed, errors: t.errors, time: time(allTime) })}>`);
  for (const s of report.scenarios) {
    const failures = s.rows.filter((r) => !r.pass).length;
    const classname = `ladderwave.${s.file.replace(/\.(json|ya?ml)$/i, '').replace(/[\\/]/g, '.')}`;
    out.push(
      `  <testsuite${attrs({ name: s.file, tests: total(s), failures, errors: s.error ? 1 : 0, skipped: 0, time: time(s.seconds) })}>`,
    );
    if (s.title !== null || s.sha256 !== null) {
      out.push('    <properties>');
      if (s.title !== null) out.push(`      <property${attrs({ name: 'title', value: s.title })}/>`);
      if (s.sha256 !== null) out.push(`      <property${attrs({ name: 'sha256', value: s.sha256 })}/>`);
      out.push('    </properties>');
    }
    if (s.error) {
      const msg = s.error.lines[0] ?? 'could not be run';
      out.push(`    <testcase${attrs({ name: 'load and simulate', classname, time: time(s.seconds) })}>`);
      out.push(`      <error${attrs({ message: msg, type: s.error.code === 3 ? 'refused' : s.error.code === 1 ? 'internal' : 'bad-input' })}>${textEscape(s.error.lines.join('\n'))}</error>`);
      out.push('    </testcase>');
    }
    for (const r of s.rows) {
      const head = `    <testcase${attrs({ name: caseName(r), classname, time: '0' })}`;
      if (r.pass) {
        out.push(`${head}/>`);
      } else {
        out.push(`${head}>`);
        out.push(`      <failure${attrs({ message: r.message, type: r.kind === 'golden' ? 'golden' : r.metric })}>${textEscape(`${r.probe} ${r.metric}: measured ${r.measuredText}, limit ${r.limit}\n${r.message}`)}</failure>`);
        out.push('    </testcase>');
      }
    }
    out.push('  </testsuite>');
  }
  out.push('</testsuites>');
  return out.join('\n') + '\n';
}

// ---- JSON -------------------------------------------------------------------------------------

export const CHECK_REPORT_FORMAT = 1;

/** Machine-readable results (pretty JSON with a final newline). */
export function toJsonReport(report: CheckRunReport): string {
  const body = {
    format: CHECK_REPORT_FORMAT,
    tool: toolInfo(),
    verdict: report.exitCode === 0 ? 'pass' : report.totals.errors > 0 ? 'error' : 'fail',
    exitCode: report.exitCode,
    totals: report.totals,
    scenarios: report.scenarios.map((s) => ({
      file: s.file,
      title: s.title,
      sha256: s.sha256,
      verdict: s.verdict,
      error: s.error,
      notes: s.notes,
      seconds: s.seconds,
      checks: s.rows,
    })),
  };
  return JSON.stringify(body, null, 2) + '\n';
}

// ---- Markdown ---------------------------------------------------------------------------------

function mdCell(s: string): string {
  return s.replace(/\\/g, '\\\\').replace(/\|/g, '\\|').replace(/\r?\n/g, '<br>');
}

function mdTable(rows: { s: ScenarioReport; r: CheckRow }[]): string[] {
  const out = ['| scenario | probe | metric | limit | measured | result |', '| --- | --- | --- | --- | ---: | :---: |'];
  for (const { s, r } of rows) {
    out.push(`| ${[s.file, r.probe, r.metric, r.limit, r.measuredText].map((c) => mdCell(c)).join(' | ')} | ${r.pass ? '✅ PASS' : '❌ FAIL'} |`);
  }
  return out;
}

/** A summary for a pull-request comment: the verdict, failures first, then every result folded away. */
export function toMarkdown(report: CheckRunReport): string {
  const t = report.totals;
  const icon = report.exitCode === 0 ? '✅' : '❌';
  const head =
    t.errors > 0
      ? `${icon} **ladderwave check**: ${t.errors} of ${t.scenarios} scenario(s) could not be run, ${t.failed} of ${t.checks} check(s) failed`
      : t.failed > 0
        ? `${icon} **ladderwave check**: ${t.failed} of ${t.checks} check(s) failed in ${t.failedScenarios} of ${t.scenarios} scenario(s)`
        : `${icon} **ladderwave check**: all ${t.checks} check(s) passed in ${t.scenarios} scenario(s)`;
  const out: string[] = [head, ''];
  const errors = report.scenarios.filter((s) => s.error);
  if (errors.length > 0) {
    out.push('### Scenarios that could not be run', '');
    for (const s of errors) {
      out.push(`- \`${mdCell(s.file)}\``);
      for (const l of s.error!.lines) out.push(`  - ${mdCell(l)}`);
    }
    out.push('');
  }
  const failed = report.scenarios.flatMap((s) => s.rows.filter((r) => !r.pass).map((r) => ({ s, r })));
  if (failed.length > 0) {
    out.push('### Failed checks', '', ...mdTable(failed), '');
    for (const { s, r } of failed) out.push(`- \`${mdCell(s.file)}\` ${mdCell(r.probe)} ${mdCell(r.metric)}: ${mdCell(r.message)}`);
    out.push('');
  }
  const all = report.scenarios.flatMap((s) => s.rows.map((r) => ({ s, r })));
  if (all.length > 0) {
    out.push('<details><summary>All results</summary>', '', ...mdTable(all), '', '</details>', '');
  }
  return out.join('\n');
}
