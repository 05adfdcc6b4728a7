// `ladderwave sparams` as a library function: scenario file → S-parameters of the route (or a stretch
// of it) from the spectral solver's exact line models → a Touchstone file, sparams.png and
// sparams.json in an output folder. Everything that can fail because of the input happens before the
// folder is created; the files are written together (temporary names, then renamed).
import type { Net } from '../../sim/model.js';
import { RunRefused } from '../../sim/errors.js';
import { defaultGrid, gridFrequencies, stretchDelay, type GridSpec } from '../../sim/sparams/grid.js';
import { entry, singularValueTrace, type NetworkData } from '../../sim/sparams/network.js';
import { magnitudeDb } from '../../sim/sparams/measures.js';
import { routeSParameters, selectRoute, type RouteSelection } from '../../sim/sparams/route.js';
import { UsageError } from '../exit-codes.js';
import { formatTouchstone } from '../touchstone/write.js';
import type { NumberFormat } from '../touchstone/options.js';
import { renderSparams } from '../views/sparams.js';
import { checkOutputTarget, readScenarioFile, writeOutputFolder, type LoadedScenario } from './run.js';
import { toolInfo } from './tool.js';

export const SPARAMS_FILES = { touchstone: 'sparams.s2p', png: 'sparams.png', summary: 'sparams.json' } as const;

/** Most frequency points computed (each costs two sweeps of the chain). */
export const MAX_GRID_POINTS = 1_000_000;

export interface SparamsRunOptions {
  /** Reference resistance of both ports (Ω, default 50). */
  z0?: number;
  version?: '1.1' | '2.0';
  format?: NumberFormat;
  /** Grid fields that replace the default grid's. */
  grid?: Partial<GridSpec>;
  selection?: RouteSelection;
  width?: number;
  height?: number;
  onPhase?: (phase: 'load' | 'compute' | 'render' | 'write') => void;
}

export interface SparamsSummary {
  reference: number[];
  grid: { fmin: number; fmax: number; points: number; spacing: 'linear' | 'log' };
  stretch: { from: string; to: string; items: number; delay: number };
  /** Largest |S11| (dB) over the grid and where. */
  worstReturn: { db: number; frequency: number };
  /** |S21| (dB) at the top frequency. */
  insertionAtTop: { db: number; frequency: number };
  /** Largest singular value of S over the grid (≤ 1 for a passive network) and where. */
  largestSingularValue: { value: number; frequency: number };
}

export interface SparamsReport {
  scenario: LoadedScenario;
  outDir: string;
  network: NetworkData;
  summary: SparamsSummary;
  files: string[];
}

/** The grid to use: the default for the stretch with the given fields replaced, checked. */
export function exportGrid(net: Net, options: Pick<SparamsRunOptions, 'grid' | 'selection'> = {}): GridSpec {
  const g: GridSpec = { ...defaultGrid(net, options.selection, options.grid?.fmax), ...options.grid };
  if (!(g.fmax > 0)) throw new UsageError(`the top frequency must be > 0 (got ${g.fmax})`);
  if (!(Number.isInteger(g.points) && g.points >= 2)) throw new UsageError(`the number of points must be a whole number ≥ 2 (got ${g.points})`);
  if (g.spacing === 'log' && g.fmin !== undefined && !(g.fmin > 0 && g.fmin < g.fmax)) throw new UsageError('a log grid needs 0 < fmin < fmax');
  if (g.points > MAX_GRID_POINTS) throw new RunRefused([{ limit: 'frequencyPoints', needed: g.points, allowed: MAX_GRID_POINTS, fit: { points: MAX_GRID_POINTS } }], 'S-parameter export');
  return g;
}

/** S-parameters of the scenario's route and their summary numbers (no files). */
export function computeSparams(net: Net, options: SparamsRunOptions = {}): { network: NetworkData; summary: SparamsSummary } {
  let items;
  try {
    items = selectRoute(net, options.selection);
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
  const grid = exportGrid(net, options);
  const z0 = options.z0 ?? 50;
  const freq = gridFrequencies(grid);
  const network = routeSParameters(net, freq, z0, z0, options.selection);
  return { network, summary: summarize(network, grid, { from: items[0].name, to: items[items.length - 1].name, items: items.length, delay: stretchDelay(net, options.selection) }) };
}

function summarize(network: NetworkData, grid: GridSpec, stretch: SparamsSummary['stretch']): SparamsSummary {
  const f = network.freq;
  const s11 = magnitudeDb(entry(network, 0, 0));
  const s21 = magnitudeDb(entry(network, 1, 0));
  const sv = singularValueTrace(network);
  const argmax = (a: Float64Array) => a.reduce((best, v, k) => (v > a[best] ? k : best), 0);
  const r = argmax(s11);
  const m = argmax(sv);
  return {
    reference: Array.from(network.reference),
    grid: { fmin: f[0], fmax: f[f.length - 1], points: f.length, spacing: grid.spacing },
    stretch,
    worstReturn: { db: s11[r], frequency: f[r] },
    insertionAtTop: { db: s21[s21.length - 1], frequency: f[f.length - 1] },
    largestSingularValue: { value: sv[m], frequency: f[m] },
  };
}

export async function runSparamsFile(file: string, outDir: string, options: SparamsRunOptions = {}): Promise<SparamsReport> {
  options.onPhase?.('load');
  const scenario = await readScenarioFile(file);
  await checkOutputTarget(outDir);
  options.onPhase?.('compute');
  const { network, summary } = computeSparams(scenario.net, options);
  const version = options.version ?? '1.1';
  const { stretch } = summary;
  const comments = [
    `${scenario.net.title}`,
    `S-parameters of route items '${stretch.from}' to '${stretch.to}' (${stretch.items} ${stretch.items === 1 ? 'item' : 'items'}), port 1 at the driver side, port 2 at the receiver side`,
    `computed by ladderwave ${toolInfo().version} from the exact line models (spectral solver); an engineering estimate, not a measurement`,
    `scenario ${file} (sha256 ${scenario.sha256.slice(0, 16)})`,
  ];
  const text = formatTouchstone(network, { version, format: options.format ?? 'RI', comments });
  options.onPhase?.('render');
  const route = scenario.net.route;
  const whole = stretch.from === route[0].name && stretch.to === route[route.length - 1].name;
  const portText = whole ? undefined : `port 1 where '${stretch.from}' begins, port 2 where '${stretch.to}' ends`;
  const png = await renderSparams({ title: `${scenario.net.title}: S-parameters`, network, delay: stretch.delay, portText, width: options.width, height: options.height });
  options.onPhase?.('write');
  const json = JSON.stringify({ tool: toolInfo(), scenario: { file, sha256: scenario.sha256 }, touchstone: { version, file: SPARAMS_FILES.touchstone }, ...summary }, null, 2) + '\n';
  const files = await writeOutputFolder(outDir, [
    { path: SPARAMS_FILES.png, data: png },
    { path: SPARAMS_FILES.touchstone, data: text },
    { path: SPARAMS_FILES.summary, data: json },
  ]);
  return { scenario, outDir, network, summary, files };
}
