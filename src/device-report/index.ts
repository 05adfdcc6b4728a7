// The `device` command's report as a library: numbers, text and pictures of a buffer model.
export { deviceReport, type DeviceReport, type IvCurveReport, type WaveformReport } from './report.js';
export { formatDeviceReport, si } from './text.js';
export { ivPlot, waveformPlot } from './plots.js';
