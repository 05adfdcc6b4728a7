// ladderwave's own small plotting library: PNG line plots and heat maps.
// Plot functions take plain data (typed arrays, names, units) and return PNG bytes.
export { renderWaveforms, drawWaveforms, type WaveformsSpec } from './waveforms.js';
export { linePlot, drawLinePlot, lineDomains, alignedColumns, type LinePlotSpec, type LineSeries, type ImageSize } from './lineplot.js';
export { heatMap, drawHeatMap, colorNormalization, colorBarTicks, type HeatMapSpec, type Grid2D, type ColorScaleSpec } from './heatmap.js';
export { type Marker, type Annotation, type LegendEntry, drawLegend, drawMarkerLines, drawMarkerLabels, drawAnnotations, fitText } from './marks.js';
export { buildFrame, drawFrameBackground, drawFrameForeground, TYPE, type AxisSpec, type Frame, type FrameSpec } from './frame.js';
export { Surface, encodePng, clipSegment, dashRuns, type Rect, type TextStyle, type LineStyle, type TextMetrics } from './surface.js';
export { linearScale, extent, padDomain, type LinearScale } from './scale.js';
export {
  axisTicks,
  axisTitle,
  formatSi,
  niceStep,
  tickValues,
  engineeringExponent,
  siPrefix,
  targetTickCount,
  MINUS,
  type AxisTicks,
} from './ticks.js';
export { reduceTrace, columnEnvelope, columnOf, type Polyline, type SampleX, type ColumnEnvelope } from './reduce.js';
export {
  OKABE_ITO,
  TRACE_COLORS,
  TRACE_DASHES,
  traceStyle,
  coolWarm,
  viridis,
  tableColorMap,
  hexToRgb,
  rgbToHex,
  COOL_WARM_TABLE,
  VIRIDIS_TABLE,
  THEME,
  type RGB,
  type ColorMap,
  type TraceStyle,
} from './palette.js';
export { layoutFrame, layoutLegend, SPACING, type FrameLayout, type FrameLayoutInput } from './layout.js';
export { fontFamily, dejavuPath } from './fonts.js';
