// Which views a run draws: parsing `--views LIST`, the default set, the file each view is written to,
// and which requested views a scenario can have (an eye needs a bits or clock signal).
//
// The TDR profile is not a view of a run: it drives the route from a matched step source in place of the
// driver, which is a different simulation, so it is its own command (`ladderwave tdr`).
import { compileNet } from '../../sim/circuit.js';
import { defaultDuration } from '../../sim/discretize.js';
import type { Net } from '../../sim/model.js';
import { netItems } from '../../sim/route-tree.js';
import { eyeUnavailableReason } from './eye.js';
import { idealiseForLattice } from './idealise.js';
import { UsageError } from '../exit-codes.js';
import { allReceivers } from '../../sim/route-tree.js';

/** Why `path` names no receiver of the net (null when it does, or is not given). */
export function unknownPath(net: Net, path: string | undefined): string | null {
  if (path === undefined) return null;
  const names = allReceivers(net).map((r) => r.name);
  return names.includes(path) ? null : `--path '${path}': no receiver of that name (receivers: ${names.join(', ')})`;
}

export const VIEW_NAMES = ['waveforms', 'map', 'bounce', 'eye'] as const;
export type ViewName = (typeof VIEW_NAMES)[number];

/** Views `ladderwave run` draws when --views is not given. */
export const DEFAULT_RUN_VIEWS: readonly ViewName[] = ['waveforms', 'map'];

/** File written for each view, inside the output folder. */
export const VIEW_FILES: Readonly<Record<ViewName, string>> = {
  waveforms: 'waveforms.png',
  map: 'map.png',
  bounce: 'bounce.png',
  eye: 'eye.png',
};

/** What each view shows (for help texts). */
export const VIEW_DESCRIPTIONS: Readonly<Record<ViewName, string>> = {
  waveforms: 'every probe against time',
  map: 'voltage along the route against time (space–time map)',
  bounce: 'lattice (bounce) diagram beside the waveforms at both ends',
  eye: 'eye diagram at the receiver probe (bits or clock signals)',
};

/** The most frames `--frames` accepts: the route map keeps at most this many time rows by default. */
export const MAX_FRAMES = 900;

export class ViewListError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ViewListError';
  }
}

export function isViewName(s: string): s is ViewName {
  return (VIEW_NAMES as readonly string[]).includes(s);
}

/**
 * Parses a comma-separated list of view names ("waveforms,map", "all", "eye, bounce"), or "none" for
 * no picture at all (probes.csv and summary.json only, for scripts). Names are case-insensitive;
 * repeats are dropped; the result is in the canonical order of VIEW_NAMES. Throws ViewListError
 * naming every unknown entry.
 */
export function parseViewList(text: string): ViewName[] {
  const entries = text
    .split(',')
    .map((s) => s.trim().toLowerCase())
    .filter((s) => s !== '');
  if (entries.length === 0) throw new ViewListError(`--views needs at least one of: ${VIEW_NAMES.join(', ')}, all, none`);
  if (entries.includes('none')) {
    if (entries.some((e) => e !== 'none')) throw new ViewListError(`--views none means no views: give it alone, not with ${entries.filter((e) => e !== 'none').join(', ')}`);
    return [];
  }
  const wanted = new Set<ViewName>();
  const bad: string[] = [];
  for (const e of entries) {
    if (e === 'all') VIEW_NAMES.forEach((v) => wanted.add(v));
    else if (isViewName(e)) wanted.add(e);
    else bad.push(e);
  }
  if (bad.length) {
    const tdr = bad.includes('tdr') ? '; the TDR profile is its own command: ladderwave tdr SCENARIO' : '';
    throw new ViewListError(
      `unknown view${bad.length > 1 ? 's' : ''} ${bad.map((b) => `'${b}'`).join(', ')} in --views (known: ${VIEW_NAMES.join(', ')}, all, none)${tdr}`,
    );
  }
  return VIEW_NAMES.filter((v) => wanted.has(v));
}

/** Parses `--frames N`: a whole number from 1 to MAX_FRAMES. */
export function parseFrameCount(text: string): number {
  const n = Number(text.trim());
  if (!/^\s*\d+\s*$/.test(text) || !Number.isInteger(n) || n < 1 || n > MAX_FRAMES) {
    throw new ViewListError(`--frames must be a whole number from 1 to ${MAX_FRAMES}, not '${text}'`);
  }
  return n;
}

export interface ViewPlan {
  /** The views that will be drawn, in canonical order. */
  views: ViewName[];
  /** Requested views this scenario cannot have, with the reason. */
  skipped: { view: ViewName; reason: string }[];
  /** Views drawn without part of what they usually show, with the reason (the bounce view without its lattice). */
  partial: { view: ViewName; reason: string }[];
  /** Why `--frames` cannot be drawn for this net (null when it can, or none were asked for). */
  framesSkipped: string | null;
  /** The simulation must record the voltage along the route. */
  routeMap: boolean;
}

/** Why the voltage along the route cannot be drawn (map, frames), or null. */
export function routeMapUnavailableReason(net: Net): string | null {
  const length = netItems(net).reduce((a, it) => a + (it.kind === 'line' ? it.length : 0), 0);
  return length > 0 ? null : 'the route has no line segment, so there is no distance along it to draw';
}

/** The views a scenario gets out of the requested ones, and what the simulation must record for them. */
export function planViews(net: Net, requested: readonly ViewName[], frames = 0, path?: string): ViewPlan {
  const unknown = unknownPath(net, path);
  if (unknown) throw new UsageError(unknown);
  const views: ViewName[] = [];
  const skipped: ViewPlan['skipped'] = [];
  const partial: ViewPlan['partial'] = [];
  for (const v of VIEW_NAMES) {
    if (!requested.includes(v)) continue;
    if (v === 'map') {
      const why = routeMapUnavailableReason(net);
      if (why) {
        skipped.push({ view: v, reason: why });
        continue;
      }
    }
    if (v === 'bounce') {
      const refusals = idealiseForLattice(net, net.run.duration ?? defaultDuration(compileNet(net))).refusals;
      if (refusals.length) partial.push({ view: v, reason: `no lattice drawn (only the simulated waveforms at both ends): ${refusals.join('; ')}` });
    }
    if (v === 'eye') {
      const why = eyeUnavailableReason(net.driver.signal);
      if (why) {
        skipped.push({ view: v, reason: why });
        continue;
      }
      if (net.probes.length === 0) {
        skipped.push({ view: v, reason: 'the scenario has no probes' });
        continue;
      }
    }
    views.push(v);
  }
  const framesSkipped = frames > 0 ? routeMapUnavailableReason(net) : null;
  return { views, skipped, partial, framesSkipped, routeMap: views.includes('map') || (frames > 0 && framesSkipped === null) };
}
