// The space–time map as the explore page holds it: the engine's recorded rows and columns unchanged
// (single precision), one path per receiver, and the PNG map's colour scale so both look alike.
import type { RouteMapRecord } from '../../sim/result.js';
import { colorNormalization } from '../render/heatmap.js';
import { coolWarm } from '../render/palette.js';
import { firstEdgeTransit, idleLevel, mapWindow } from '../views/map.js';
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

/** The paths of the map: a route without branches is one path, driver pin to receiver, every column in order. */
export function mapPaths(rm: RouteMapRecord): MapPath[] {
  const n = rm.positions.length;
  return [
    {
      receiver: 'receiver',
      columns: Array.from({ length: n }, (_, i) => i),
      positions: Array.from(rm.positions),
      items: rm.items.map((it) => ({ name: it.name, kind: it.kind, from: it.from, to: it.to })),
    },
  ];
}

export function mapData(rm: RouteMapRecord): MapData {
  const [rows, columns] = rm.values.shape as [number, number];
  const center = idleLevel(rm);
  const window = mapWindow(rm).window;
  const transit = firstEdgeTransit(rm);
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
    `Space–time map: the engine's record of the voltage along the route, ${m.columns} places × ${m.rows} instants ` +
    `(every ${formatSI(m.dtRow, 's')}), held in single precision (7 significant digits); the time slider moves between recorded instants.`
  );
}
