// The HTML report: one self-contained page per run (see report.ts).
export { buildReport, REPORT_FILE, type ReportImage, type ReportInput } from './report.js';
export { routeSvg, describePart, describeSignal } from './schematic.js';
export { measurementTable, checksTable, eyeTable, discretizationTables, formatCell, at, type ReportSummary } from './tables.js';
export { esc, attr } from './html.js';
export { pngSize } from './png-size.js';
