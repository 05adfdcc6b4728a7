// A run's probe waveforms decoded from the page's data: the instants held (every sample, or the kept
// ones of a reduced set) and each probe's volts at those instants.
import type { TraceSet } from '../payload.js';
import { unpack } from './packed.js';

export interface Traces {
  names: string[];
  times: Float64Array;
  values: Float64Array[];
  form: TraceSet['form'];
}

export function decodeTraces(t: TraceSet): Traces {
  let times: Float64Array;
  if (t.form === 'full') {
    times = new Float64Array(t.samples);
    for (let i = 0; i < t.samples; i++) times[i] = i * t.dt; // t = i·dt, as probes.csv writes it
  } else {
    const index = unpack(t.index!);
    times = Float64Array.from(index, (i) => i * t.dt);
  }
  const values = t.values.map((p) => {
    const v = unpack(p);
    return v instanceof Float64Array ? v : Float64Array.from(v);
  });
  return { names: t.names, times, values, form: t.form };
}
