// Chooses one global time step and an integer cell count per line segment.
// Leapfrog on the telegrapher equations is stable for Courant number v·Δt/Δz ≤ 1 and, on a lossless
// line, exact (dispersion-free) at Courant = 1 (Taflove & Hagness, Computational Electrodynamics, ch. 2).
import type { LineRLGC, Net } from './model.js';
import type { Discretization, SegmentPlan } from './result.js';
import { activityEnd, fastestEdge } from './signals.js';

export function lineDelayPerLength(line: LineRLGC): number {
  return Math.sqrt(line.l * line.c);
}

export function lineZ0(line: LineRLGC): number {
  return Math.sqrt(line.l / line.c);
}

/** Total one-way delay of all line segments along the route (s). */
export function routeDelay(net: Net): number {
  let td = 0;
  for (const item of net.route) if (item.kind === 'line') td += item.length * lineDelayPerLength(item.line);
  return td;
}

/**
 * Default duration when the scenario gives none: the signal's last ramp, then ten one-way delays
 * (five round trips, enough for most reflections to die down) and five rise times.
 */
export function defaultDuration(net: Net): number {
  const edge = fastestEdge(net.driver.signal);
  const tail = 10 * routeDelay(net) + 5 * (Number.isFinite(edge) ? edge : 0);
  const base = Math.max(activityEnd(net.driver.signal), 0);
  return Math.max(base + tail, base * 1.2, 1e-9);
}

/** A time for messages: three significant digits with a unit prefix (the engine has no unit library). */
function seconds(t: number): string {
  const units: [number, string][] = [[1, 's'], [1e-3, 'ms'], [1e-6, 'µs'], [1e-9, 'ns'], [1e-12, 'ps'], [1e-15, 'fs']];
  const [scale, unit] = units.find(([s]) => Math.abs(t) >= s) ?? units[units.length - 1];
  return `${Number((t / scale).toPrecision(3))} ${unit}`;
}

export function discretize(net: Net): Discretization {
  const duration = net.run.duration ?? defaultDuration(net);
  const lines = net.route.filter((i) => i.kind === 'line');
  // A constant source has no edge; the route's own delay then stands in for the rise time.
  const signalEdge = fastestEdge(net.driver.signal);
  const edge = Number.isFinite(signalEdge) ? signalEdge : routeDelay(net) || Infinity;
  const dtEdge = Number.isFinite(edge) ? edge / net.run.cellsPerRise : Infinity;
  let dt = dtEdge;
  let dtReason = `${Number.isFinite(signalEdge) ? 'fastest edge' : 'route delay (constant source)'} ${seconds(edge)} / cellsPerRise ${net.run.cellsPerRise}`;
  // Each segment needs at least ceil(TD/dtEdge) cells so that a cell's delay resolves the edge;
  // Δt may not exceed any cell's delay (Courant ≤ 1), so Δt = min over segments of TD / that count.
  for (const item of lines) {
    const td = item.length * lineDelayPerLength(item.line);
    if (td <= 0) continue;
    const minCells = Number.isFinite(dtEdge) ? Math.max(1, Math.ceil(td / dtEdge - 1e-9)) : 1;
    const candidate = td / minCells;
    if (candidate < dt) {
      dt = candidate;
      dtReason = `segment '${item.name}': ${seconds(td)} of delay in ${minCells} cell${minCells > 1 ? 's' : ''} at Courant 1`;
    }
  }
  if (!Number.isFinite(dt)) {
    dt = duration / 1000;
    dtReason = 'constant source and no line: duration / 1000';
  }
  const segments: SegmentPlan[] = [];
  let cells = 0;
  for (const item of lines) {
    const td = item.length * lineDelayPerLength(item.line);
    // As many cells as Courant ≤ 1 allows: the Courant number is then as close to 1 as it can be.
    const n = td > 0 ? Math.max(1, Math.floor(td / dt + 1e-9)) : 0; // a zero-length line is a plain wire
    segments.push({
      name: item.name,
      length: item.length,
      cells: n,
      cellLength: n > 0 ? item.length / n : 0,
      delay: td,
      z0: lineZ0(item.line),
      courant: td > 0 ? (n * dt) / td : 0,
    });
    cells += n;
  }
  const steps = Math.max(1, Math.ceil(duration / dt - 1e-9));
  const seriesCount = net.route.filter((i) => i.kind === 'series').length;
  return { dt, steps, duration, cells, nodes: cells + seriesCount + 1, segments, dtReason };
}
