// The space–time map as the explore page holds it: the engine's recorded rows and columns unchanged
// (single precision), one path per receiver (a net without branches has one), and the PNG map's colour
// scale so both look alike.
import type { RouteMapRecord } from '../../sim/result.js';
import { colorNormalization } from '../render/heatmap.js';
import { coolWarm } from '../render/palette.js';
import { firstEdgeTransit, idleLevel, mapWindow, pathMap } from '../views/map.js';
import { packF32 } from './pack.js';
import type { MapData, MapPath } from './payload.js';
import { formatSI } from '../units.js';

const hex2 = (x: number): string => Math.round(Math.min(255, Math.max(0, x))).toString(16).padStart(2, '0');

/** The diverging palette of the PNG map as 256 CSS colours. */
export function mapPalette(): string[] {
  const out: string[] = [];
  for (let i = 0; i < 256; i++) {
    const c = coolWarm(i / 255);
    out.push(`#${hex2(c[0])}${hex2(c[1])}${hex2(c[2])}`);
  }
  return out;
}

/**
 * The paths of the map, one per receiver (the main receiver's first), each the engine's columns from the
 * driver pin to its receiver with their distances along that path, its items (branch points among them)
 * and the places where other paths leave it.
 */
export function mapPaths(rm: RouteMapRecord): MapPath[] {
  return rm.paths.map((p) => ({
    receiver: p.receiver,
    columns: Array.from(p.columns),
    positions: Array.from(p.positions),
    items: p.items.map((it) => ({ name: it.name, kind: it.kind, from: it.from, to: it.to })),
    junctions: p.junctions.map((j) => ({ item: j.item, at: j.at, receivers: [...j.receivers] })),
  }));
}

export function mapData(rm: RouteMapRecord): MapData {
  const [rows, columns] = rm.values.shape as [number, number];
  const center = idleLevel(rm);
  // the time view and first instant follow the main path, as the PNG's panels do
  const main = pathMap(rm, 0);
  const window = mapWindow(main).window;
  const transit = firstEdgeTransit(main);
  const norm = colorNormalization(rm.values.data, { kind: 'diverging', label: 'Voltage', unit: 'V', center });
  return {
    dtRow: rm.dtRow,
    rows,
    columns,
    values: packF32(rm.values.data.subarray(rm.values.offset, rm.values.offset + rows * columns)),
    paths: mapPaths(rm),
    window,
    start: transit ? (transit.start + transit.end) / 2 : window[0],
    colors: { center, lo: norm.lo, hi: norm.hi, palette: mapPalette() },
  };
}

/** A sentence for the page about the map's data. */
export function mapNote(m: MapData): string {
  return (
    `Space–time map: the engine's record of the voltage along the ${m.paths.length > 1 ? `net (${m.paths.length} paths, one per receiver)` : 'route'}, ${m.columns} places × ${m.rows} instants ` +
    `(every ${formatSI(m.dtRow, 's')}), held in single precision (7 significant digits); the time slider moves between recorded instants.`
  );
}
