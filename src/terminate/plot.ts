// tame.png: the receiver waveforms of the top options overlaid, one panel per receiver (the worst
// receivers first when there are more than four), with the logic thresholds marked.
import type { Net } from '../../sim/model.js';
import { probeTrace } from '../../sim/result.js';
import { simulate } from '../../sim/simulate.js';
import { drawLinePlot } from '../render/lineplot.js';
import { encodePng, Surface } from '../render/surface.js';
import { netThresholds } from '../scenario/checks.js';
import { checkScenarioValue } from '../scenario/load.js';
import { ScenarioError } from '../scenario/problems.js';
import { drawTitleBlock } from '../views/panels.js';
import type { Advice, OptionResult } from './advise.js';
import { partText } from './report.js';

const MAX_PANELS = 4;

function netOf(o: OptionResult): Net {
  const r = checkScenarioValue(o.value, o.title);
  if (!r.net) throw new ScenarioError(r.problems, r.warnings);
  return r.net;
}

/** Receivers to draw: all of them, or the four that are worst most often among the top options. */
function panelReceivers(a: Advice, top: readonly OptionResult[]): number[] {
  const n = a.facts.receivers.length;
  if (n <= MAX_PANELS) return Array.from({ length: n }, (_, i) => i);
  const count = new Map<number, number>();
  for (const o of top) count.set(o.score.worst, (count.get(o.score.worst) ?? 0) + 1);
  const order = Array.from({ length: n }, (_, i) => i).sort((x, y) => (count.get(y) ?? 0) - (count.get(x) ?? 0) || x - y);
  return order.slice(0, MAX_PANELS).sort((x, y) => x - y);
}

export async function renderAdvicePlot(a: Advice, topCount = 3): Promise<Buffer> {
  const top = a.options.slice(0, topCount);
  const runs = top.map((o) => {
    const net = netOf(o);
    return { o, net, result: simulate(net) };
  });
  const panels = panelReceivers(a, top);
  const width = 1200;
  const panelH = 420;
  const s = new Surface(width, 90 + panelH * panels.length);
  const used = drawTitleBlock(s, { x: 20, y: 14, w: width - 40, h: 80 }, `Termination options: ${a.title}`, `Receiver waveforms of the ${top.length} best options (${a.objective.text}; ${a.series} values)`);
  panels.forEach((ri, k) => {
    const probe = a.receiverProbes[ri]!;
    const t = netThresholds(runs[0]!.net, probe);
    drawLinePlot(s, { x: 0, y: 14 + used + k * panelH, w: width, h: panelH - 10 }, {
      title: `at ${a.facts.receivers[ri]!.name}`,
      x: { label: 'Time', unit: 's' },
      y: { label: 'Voltage', unit: 'V' },
      series: runs.map(({ o, result }, j) => ({ name: `${j + 1}. ${o.title} ${partText(o)}`, values: probeTrace(result.record, probe), dx: result.record.dtSample })),
      markers: t ? [{ axis: 'y' as const, at: t.vih, label: 'VIH' }, { axis: 'y' as const, at: t.vil, label: 'VIL' }] : [],
      legend: 'below',
      legendTitle: 'Options',
    });
  });
  return encodePng(s);
}
