// Draws the views a run asked for (see select.ts), as PNG bytes in memory, from the simulation result
// only. Each view's module is loaded on first use, so a run that draws no view never loads the renderer.
import type { Net } from '../../sim/model.js';
import { probeTraces, type ProbeRecord, type SimResult } from '../../sim/result.js';
import { netThresholds } from '../scenario/checks.js';
import { defaultEyeProbe, eyeInputOf, type EyeInput, type EyeMeasurement } from './eye.js';
import { VIEW_FILES, type ViewName } from './select.js';

export interface DrawnView {
  view: ViewName;
  /** File name inside the output folder. */
  file: string;
  /** Heading for the report. */
  title: string;
  png: Buffer;
}

export interface DrawViewsInput {
  /** The scenario's net, as simulated (with any probes the views added). */
  net: Net;
  result: SimResult;
  /** The probes the user asked for (the waveforms view and the eye use only these). */
  record: ProbeRecord;
  views: readonly ViewName[];
  /** Pixels, for every view (each view's own default when absent). */
  width?: number;
  height?: number;
  /** Eye options: probe (default: the receiver probe), thresholds (default: the scenario's), sampling phase. */
  eye?: EyeViewOptions;
  /** The receiver whose path the bounce view follows on a branched net (default: the main receiver). */
  path?: string;
}

export interface EyeViewOptions {
  probe?: string;
  thresholds?: EyeInput['thresholds'];
  samplingPhase?: number;
  /** Width of the sampling window as a share of the UI (default 0.2). */
  samplingWindow?: number;
}

const HEADINGS: Readonly<Record<ViewName, string>> = {
  waveforms: 'Waveforms at every probe',
  map: 'Voltage along the route (space–time map)',
  bounce: 'Bounce (lattice) diagram',
  eye: 'Eye diagram',
};

/** The probe and the input of the eye view for a run. */
export function eyeInputFor(net: Net, result: SimResult, opts: EyeViewOptions = {}): { probe: string; input: EyeInput } {
  const probe = opts.probe ?? defaultEyeProbe(net);
  if (probe === undefined) throw new RangeError('an eye needs a probe, and the scenario has none');
  const thresholds = opts.thresholds ?? scenarioThresholds(net, probe);
  return { probe, input: eyeInputOf(net, result, probe, { thresholds, samplingPhase: opts.samplingPhase, samplingWindow: opts.samplingWindow }) };
}

/** The logic thresholds the scenario gives for a probe (its own, else the scenario's), if any. */
export function scenarioThresholds(net: Net, probe: string): EyeInput['thresholds'] {
  const t = netThresholds(net, probe);
  return t ? { vih: t.vih, vil: t.vil } : undefined;
}

/** The eye section of summary.json: the probe and the measurement. */
export type EyeSummary = { probe: string } & EyeMeasurement;

export async function drawViews(input: DrawViewsInput): Promise<DrawnView[]> {
  const { net, result, views } = input;
  const size = { width: input.width, height: input.height };
  const userResult: SimResult = { ...result, record: input.record };
  const out: DrawnView[] = [];
  for (const view of views) {
    let png: Buffer;
    switch (view) {
      case 'waveforms': {
        const { renderWaveforms } = await import('../render/waveforms.js');
        const { record } = input;
        png = await renderWaveforms({ title: net.title, dtSample: record.dtSample, names: record.names, values: probeTraces(record), ...size });
        break;
      }
      case 'map': {
        if (!result.routeMap) throw new Error('the map view needs a simulation that recorded the route map');
        const { renderRouteMap } = await import('./map.js');
        png = await renderRouteMap({ title: net.title, routeMap: result.routeMap, ...size });
        break;
      }
      case 'bounce': {
        const { renderBounce } = await import('./bounce.js');
        png = await renderBounce({ title: net.title, net, result, ...size, ...(input.path !== undefined ? { path: input.path } : {}) });
        break;
      }
      case 'eye': {
        const { renderEye } = await import('./eye-plot.js');
        const { probe, input: eyeIn } = eyeInputFor(net, userResult, input.eye);
        png = (await renderEye({ title: net.title, probe, input: eyeIn, ...size })).png;
        break;
      }
    }
    out.push({ view, file: VIEW_FILES[view], title: HEADINGS[view], png });
  }
  return out;
}
