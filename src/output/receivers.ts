// The "receivers" section of summary.json for a net with several receivers (a branched route): every
// receiver with the probe that watches it. A receiver without a probe of the user's gets one for the
// run (kept out of probes.csv, like the bounce view's end probes), so every receiver is measured.
import { allReceivers } from '../../sim/route-tree.js';
import type { Net, ProbeSpec } from '../../sim/model.js';
import { probeTrace, type SimResult } from '../../sim/result.js';
import type { ProbeMeasurements } from '../measure/index.js';
import { measureNet } from './measure-net.js';
import { netSettledLevels } from './net-levels.js';
import { probeStats } from './crossing.js';

export interface ReceiverEntry {
  /** The probe at the receiver (the first one, when there are several). */
  probe: string;
  /** Whether that probe is one of the scenario's (in probes.csv and "measurements"); else added for the run. */
  recorded: boolean;
  min: number;
  max: number;
  final: number;
  /** For an added probe: its measurements (a recorded probe's are under "measurements"). */
  measurements?: ProbeMeasurements;
}

function probeAt(probes: readonly ProbeSpec[], receiver: string, main: boolean): ProbeSpec | undefined {
  return probes.find((p) => p.at === 'receiver' && (main ? p.receiver === undefined || p.receiver === receiver : p.receiver === receiver));
}

/** The net with a probe at every receiver that has none (only when it has several receivers). */
export function withReceiverProbes(net: Net): Net {
  const receivers = allReceivers(net);
  if (receivers.length < 2) return net;
  const taken = new Set(net.probes.map((p) => p.name));
  const added: ProbeSpec[] = [];
  receivers.forEach((rx, k) => {
    if (probeAt(net.probes, rx.name, k === 0)) return;
    let name = rx.name;
    for (let n = 2; taken.has(name); n++) name = `${rx.name} (${n})`;
    taken.add(name);
    added.push(k === 0 ? { name, at: 'receiver' } : { name, at: 'receiver', receiver: rx.name });
  });
  return added.length ? { ...net, probes: [...net.probes, ...added] } : net;
}

/** The section, keyed by receiver name (main receiver first); undefined for a net with one receiver. */
export function receiversSection(net: Net, simNet: Net, result: SimResult): Record<string, ReceiverEntry> | undefined {
  const receivers = allReceivers(net);
  if (receivers.length < 2) return undefined;
  const own = new Set(net.probes.map((p) => p.name));
  const out: Record<string, ReceiverEntry> = Object.create(null);
  const added = simNet.probes.filter((p) => !own.has(p.name));
  const extra = added.length ? measureNet(simNet, result, [], netSettledLevels(simNet, result.discretization)).measurements : {};
  receivers.forEach((rx, k) => {
    const p = probeAt(simNet.probes, rx.name, k === 0)!;
    const stats = probeStats(probeTrace(result.record, p.name), result.record.dtSample);
    const entry: ReceiverEntry = { probe: p.name, recorded: own.has(p.name), min: stats.min, max: stats.max, final: stats.final };
    if (!entry.recorded) entry.measurements = extra[p.name];
    out[rx.name] = entry;
  });
  return out;
}
