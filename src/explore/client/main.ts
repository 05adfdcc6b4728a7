// The explore page's script: reads the data the page carries and builds its sections.
import type { PageData, RunData } from '../payload.js';
import { el, replaceChildren } from './dom.js';
import { startLive } from './live.js';
import { routeSection } from './route-map.js';
import { sweepSection } from './sweep.js';
import { tableElement } from './tables.js';
import { decodeTraces } from './traces.js';
import { waveformSection } from './waveforms.js';

function header(data: PageData, status: HTMLElement): HTMLElement {
  const what = data.kind === 'sweep' ? 'Sweep' : 'Run';
  return el(
    'header',
    {},
    el('h1', {}, data.title),
    el('p', { class: 'meta' }, `${what} of `, el('code', {}, data.scenarioFile), ` · ${data.tool.name} ${data.tool.version} · results are engineering estimates`),
    status,
  );
}

function runSections(run: RunData, data: PageData, main: HTMLElement): void {
  const traces = decodeTraces(run.traces);
  const waves = waveformSection(traces, data.traceColors);
  main.appendChild(waves.element);
  waves.mount();
  if (run.checks || run.tables.length) {
    const tally = run.checks ? el('p', { class: 'tally' }, `${run.checks.passed} passed, ${run.checks.failed} failed.`) : null;
    const sec = el('section', { id: 'numbers' }, el('h2', {}, run.checks ? 'Checks and measurements' : 'Measurements'), tally);
    for (const t of run.tables) sec.appendChild(tableElement(t, (at) => waves.showInstants(at)));
    main.appendChild(sec);
  }
  if (run.map) {
    const route = routeSection(run.map, (t) => waves.setMarker(t));
    main.insertBefore(route.element, main.querySelector('#numbers'));
    route.mount();
  }
}

function start(): void {
  const main = document.getElementById('app')!;
  const data = JSON.parse(document.getElementById('lw-data')!.textContent!) as PageData;
  const status = el('p', { class: 'live-status', id: 'live-status', hidden: !data.live });
  const banner = el('div', { class: 'problems', id: 'problems', role: 'alert', hidden: true });
  replaceChildren(main, header(data, status), banner);
  if (data.live) startLive(data.live, banner, status, data.run !== undefined);
  if (data.run) runSections(data.run, data, main);
  if (data.sweep) sweepSection(data.sweep, data, main);
  if (data.notes.length) main.appendChild(el('section', { id: 'notes' }, el('h2', {}, 'About the data'), el('ul', {}, ...data.notes.map((n) => el('li', {}, n)))));
  document.body.dataset.ready = 'true';
}

try {
  start();
} catch (e) {
  const main = document.getElementById('app');
  if (main) replaceChildren(main, el('p', { class: 'problem' }, `The page could not be built: ${(e as Error).message}`));
  throw e;
}
