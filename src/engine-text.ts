// Words for the engine's data: why Δt has its value, and why a run was refused with what would fit.
// The engine (sim/) hands back plain data; the wording, with units, lives here.
import { RunRefused, type Overrun } from '../sim/errors.js';
import type { DtRule } from '../sim/result.js';
import { formatSI } from './units.js';

const t3 = (s: number) => formatSI(s, 's', 3);

/** Why Δt has the value it has, in words (summary.json's `dtReason`, the terminal and the report). */
export function dtReasonText(rule: DtRule): string {
  switch (rule.rule) {
    case 'edge':
      return Number.isFinite(rule.edge) ? `fastest edge ${t3(rule.edge)} / cellsPerRise ${rule.cellsPerRise}` : `constant source / cellsPerRise ${rule.cellsPerRise}`;
    case 'delay':
      return `route delay (constant source) ${t3(rule.delay)} / cellsPerRise ${rule.cellsPerRise}`;
    case 'segment':
      return `segment '${rule.segment}': ${t3(rule.delay)} of delay in ${rule.cells} cell${rule.cells > 1 ? 's' : ''} at Courant 1`;
    case 'duration':
      return `constant source and no line: duration / ${rule.steps}`;
  }
}

/**
 * A value rounded toward zero to `digits` significant digits, so a suggested limit printed with
 * those digits is never above the one computed (and still fits).
 */
export function roundDown(x: number, digits = 3): number {
  if (!(x > 0) || !Number.isFinite(x)) return x;
  const e = Math.floor(Math.log10(x)) - (digits - 1);
  const r = Math.floor(x / 10 ** e) * 10 ** e;
  return Number(r.toPrecision(digits)) <= x ? Number(r.toPrecision(digits)) : x;
}

export interface RefusalWording {
  /** Leave out advice about these settings (a command that chooses them itself). */
  omit?: readonly ('duration' | 'cellsPerRise' | 'sample')[];
  /** Extra advice lines of the command's own (e.g. a slower TDR step). */
  advice?: readonly string[];
}

function overrunLine(o: Overrun, omit: ReadonlySet<string>): string {
  const or = (parts: (string | undefined)[]) => parts.filter((p): p is string => !!p).join(', or ');
  switch (o.limit) {
    case 'nodes': {
      const fit = or([o.fit.cellsPerRise !== undefined && !omit.has('cellsPerRise') ? `run.cellsPerRise ${o.fit.cellsPerRise} or less would fit` : undefined]);
      return `the net needs ${o.needed} nodes (limit ${o.allowed})${fit ? `; ${fit}` : '; use a slower edge or shorter lines'}`;
    }
    case 'cellSteps': {
      const fit = or([
        o.fit.duration !== undefined && !omit.has('duration') ? `a duration up to ${formatSI(roundDown(o.fit.duration), 's', 3)} would fit` : undefined,
        o.fit.cellsPerRise !== undefined && !omit.has('cellsPerRise') ? `run.cellsPerRise ${o.fit.cellsPerRise} or less` : undefined,
      ]);
      return `${o.steps} steps × ${o.nodes} nodes and lumped work = ${o.needed.toExponential(2)} cell-steps (limit ${o.allowed.toExponential(2)})${fit ? `; ${fit}` : ''}`;
    }
    case 'recordBytes': {
      const fit = or([
        o.fit.sample !== undefined && !omit.has('sample') ? `a sample interval of ${formatSI(o.fit.sample, 's', 4)} or more would fit` : undefined,
        o.fit.probes !== undefined ? `${o.fit.probes} probe${o.fit.probes === 1 ? '' : 's'} or fewer` : undefined,
      ]);
      return `${o.probes} probe${o.probes === 1 ? '' : 's'} × ${o.samples} samples need ${(o.needed / 1024 ** 2).toFixed(0)} MiB of records (limit ${(o.allowed / 1024 ** 2).toFixed(0)} MiB)${fit ? `; ${fit}` : ''}`;
    }
    case 'lumpedSize':
      return `a cluster of lumped parts joined by series parts needs a ${o.needed}-unknown matrix (limit ${o.allowed}); split it with line segments or use fewer parts`;
    case 'frequencyPoints':
      return `${o.needed} frequency points exceed the limit of ${o.allowed}; ${o.allowed} points or fewer would fit`;
    case 'fftPoints':
      return `${o.samples} samples need an FFT of ${o.needed} points (limit ${o.allowed})${o.fit.samples !== undefined ? `; ${o.fit.samples} samples or fewer would fit (a larger sample interval or a shorter run)` : ''}`;
  }
}

/** A refusal a command words its own way (its own advice, settings it chooses itself left out). */
export class AdvisedRefusal extends RunRefused {
  constructor(
    over: RunRefused['over'],
    context: string | undefined,
    readonly wording: RefusalWording,
  ) {
    super(over, context);
  }
}

/** The lines a refused run prints, the first naming what was refused, the last that --force overrides. */
export function refusalLines(e: RunRefused): string[] {
  const wording = e instanceof AdvisedRefusal ? e.wording : {};
  const omit = new Set(wording.omit ?? []);
  return [
    `${e.context ? `${e.context}: ` : ''}run refused before starting:`,
    ...e.over.map((o) => `  ${overrunLine(o, omit)}`),
    ...(wording.advice ?? []).map((a) => `  ${a}`),
    '  (--force overrides these limits)',
  ];
}
