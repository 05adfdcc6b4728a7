// Which probes sit on a quiet net (a net whose driver holds its level while others switch) and the
// swing their crosstalk is compared with; the "crosstalk" section of summary.json and of the run's
// text. Multi-net scenarios only: a one-net scenario has no quiet neighbour.
import { compileNet } from '../../sim/circuit.js';
import type { Net } from '../../sim/model.js';
import { fastestEdge, nominalLevels } from '../../sim/signals.js';
import type { CrosstalkMeasurement } from '../measure/crosstalk.js';
import type { ProbeMeasurements } from '../measure/index.js';

export interface QuietProbe {
  /** The quiet net's name. */
  net: string;
  /** Where on it: "driver pin", "receiver 'x'", "on line 'y'", "after 'r1'"… */
  place: string;
}

export interface CrosstalkEntry extends CrosstalkMeasurement, QuietProbe {}

/** Probes of quiet nets by name (empty for a one-net scenario or when every driver switches). */
export function quietProbes(net: Net): Map<string, QuietProbe> {
  const out = new Map<string, QuietProbe>();
  if (!net.nets?.length) return out;
  const c = compileNet(net);
  const quiet = c.sources.map((s) => !Number.isFinite(fastestEdge(s.signal)));
  for (const p of c.probes) {
    const node = p.place.kind === 'node' ? p.place.node : c.segments[p.place.segment].from;
    const k = c.nodes[node].net;
    if (!quiet[k]) continue;
    const place = p.place.kind === 'line' ? `on line '${c.segments[p.place.segment].name}'` : node === c.sources[k].node ? 'driver pin' : c.nodes[node].label;
    out.set(p.name, { net: c.sources[k].name, place });
  }
  return out;
}

/** The largest nominal swing among the switching drivers (V); null when none switches. */
export function aggressorSwing(net: Net): number | null {
  const drivers = [net.driver, ...(net.nets ?? []).map((n) => n.driver)];
  let swing = 0;
  for (const d of drivers) {
    if (!Number.isFinite(fastestEdge(d.signal))) continue;
    const { low, high } = nominalLevels(d.signal);
    swing = Math.max(swing, high - low);
  }
  return swing > 0 ? swing : null;
}

/** The summary section: every quiet probe's crosstalk, by probe name; undefined when there is none. */
export function crosstalkSection(net: Net, measurements: Readonly<Record<string, ProbeMeasurements>>): Record<string, CrosstalkEntry> | undefined {
  const quiet = quietProbes(net);
  const out: Record<string, CrosstalkEntry> = Object.create(null);
  for (const [name, q] of quiet) {
    const x = measurements[name]?.crosstalk;
    if (x) out[name] = { ...q, ...x };
  }
  return Object.keys(out).length ? out : undefined;
}
