// Chooses one global time step and an integer cell count per line segment.
// Leapfrog on the telegrapher equations is stable for Courant number v·Δt/Δz ≤ 1 and, on a lossless
// line, exact (dispersion-free) at Courant = 1 (Taflove & Hagness, Computational Electrodynamics, ch. 2).
import { longestPathDelay, type Circuit, type LineSegment } from './circuit.js';
import { fastestVelocity } from './coupled/modes.js';
import { NetError } from './errors.js';
import type { LineRLGC, Net } from './model.js';
import type { Discretization, DtRule, SegmentPlan } from './result.js';
import { receiverDelays } from './route-tree.js';
import { activityEnd, fastestEdge } from './signals.js';

export function lineDelayPerLength(line: LineRLGC): number {
  return Math.sqrt(line.l * line.c);
}

export function lineZ0(line: LineRLGC): number {
  return Math.sqrt(line.l / line.c);
}

/**
 * A segment's delay for the time step: length·√(L′C′), or for a conductor of a coupled section the
 * section's fastest mode (Courant must hold for every mode, and the conductors' self velocities
 * 1/√(L_ii·C_ii) can be slower than the fastest mode's: Paul, Analysis of Multiconductor Transmission
 * Lines, FDTD chapter).
 */
export function segmentDelay(c: Circuit, seg: LineSegment): number {
  if (!seg.coupling) return seg.length * lineDelayPerLength(seg.line);
  const line = c.coupled[seg.coupling.section].line;
  const k = line.k;
  // without coupling the modes are the conductors themselves: the fastest one's delay, computed as for a single line
  if (line.l.every((x, e) => x === 0 || e % (k + 1) === 0) && line.c.every((x, e) => x === 0 || e % (k + 1) === 0)) {
    let td = Infinity;
    for (let j = 0; j < k; j++) td = Math.min(td, seg.length * Math.sqrt(line.l[j * (k + 1)] * line.c[j * (k + 1)]));
    return td;
  }
  return seg.length / fastestVelocity(line);
}

/** The longest one-way delay from the driver pin to a receiver (s): the whole route for a chain. */
export function routeDelay(net: Net): number {
  return Math.max(0, ...receiverDelays(net).values());
}

/** The fastest 10–90 % edge of any source (s); Infinity when every source is constant. */
export function circuitFastestEdge(c: Circuit): number {
  return Math.min(...c.sources.map((s) => fastestEdge(s.signal)));
}

/**
 * Default duration when the scenario gives none: the sources' last ramp, then ten one-way delays of
 * the longest path (five round trips, enough for most reflections to die down) and five rise times.
 */
export function defaultDuration(c: Circuit): number {
  const edge = circuitFastestEdge(c);
  const tail = 10 * longestPathDelay(c) + 5 * (Number.isFinite(edge) ? edge : 0);
  const base = Math.max(...c.sources.map((s) => activityEnd(s.signal)), 0);
  return Math.max(base + tail, base * 1.2, 1e-9);
}

/** Δt from the edge alone (the first rule), before any segment lowers it. */
function edgeRule(c: Circuit): { dt: number; rule: DtRule } {
  const cellsPerRise = c.run.cellsPerRise;
  const signalEdge = circuitFastestEdge(c);
  if (Number.isFinite(signalEdge)) return { dt: signalEdge / cellsPerRise, rule: { rule: 'edge', edge: signalEdge, cellsPerRise } };
  // A constant source has no edge; the longest path's delay then stands in for the rise time.
  const delay = longestPathDelay(c);
  if (delay > 0) return { dt: delay / cellsPerRise, rule: { rule: 'delay', delay, cellsPerRise } };
  return { dt: Infinity, rule: { rule: 'edge', edge: Infinity, cellsPerRise } };
}

/** A line of positive length must have a positive, finite delay, or it would get no cells. */
function checkDelays(c: Circuit): void {
  const bad = c.segments.filter((s) => s.length > 0 && !(s.length * lineDelayPerLength(s.line) > 0 && Number.isFinite(s.length * lineDelayPerLength(s.line))));
  if (bad.length) {
    throw new NetError(
      bad.map((s) => ({
        path: s.name,
        message: `the line gets no cells: its delay ${s.length * lineDelayPerLength(s.line)} s is not a positive finite number (L′ ${s.line.l} H/m, C′ ${s.line.c} F/m)`,
      })),
    );
  }
}

export function discretize(c: Circuit): Discretization {
  checkDelays(c);
  const duration = c.run.duration ?? defaultDuration(c);
  const first = edgeRule(c);
  const dtEdge = first.dt;
  let dt = dtEdge;
  let dtRule = first.rule;
  // Each segment needs at least ceil(TD/dtEdge) cells so that a cell's delay resolves the edge;
  // Δt may not exceed any cell's delay (Courant ≤ 1), so Δt = min over segments of TD / that count.
  for (const seg of c.segments) {
    const td = segmentDelay(c, seg);
    if (td <= 0) continue;
    const minCells = Number.isFinite(dtEdge) ? Math.max(1, Math.ceil(td / dtEdge - 1e-9)) : 1;
    const candidate = td / minCells;
    if (candidate < dt) {
      dt = candidate;
      dtRule = { rule: 'segment', segment: seg.name, delay: td, cells: minCells };
    }
  }
  if (!Number.isFinite(dt)) {
    dt = duration / 1000;
    dtRule = { rule: 'duration', duration, steps: 1000 };
  }
  const segments: SegmentPlan[] = [];
  let cells = 0;
  let merged = 0;
  for (const seg of c.segments) {
    const td = segmentDelay(c, seg);
    // As many cells as Courant ≤ 1 allows: the Courant number is then as close to 1 as it can be.
    const n = td > 0 ? Math.max(1, Math.floor(td / dt + 1e-9)) : 0; // a zero-length line is a plain wire
    segments.push({
      name: seg.name,
      length: seg.length,
      cells: n,
      cellLength: n > 0 ? seg.length / n : 0,
      delay: td,
      z0: lineZ0(seg.line),
      courant: td > 0 ? (n * dt) / td : 0,
      ...(seg.coupling ? { coupled: c.coupled[seg.coupling.section].name } : {}),
    });
    cells += n;
    if (n === 0) merged++;
  }
  const steps = Math.max(1, Math.ceil(duration / dt - 1e-9));
  // Every circuit node, less one per zero-length line (its two ends are one node), plus the interior
  // nodes of every segment (cells − 1 each).
  const interior = segments.reduce((s, p) => s + Math.max(p.cells - 1, 0), 0);
  const nodes = c.nodes.length - merged + interior;
  return { dt, steps, duration, cells, nodes, segments, dtRule };
}
