// The interactive explore page of a run or a sweep, and the watch server. Loaded only when asked for
// (`--explore`, `--watch`): a plain run never imports it.
export { buildRunPage, runPageData, type RunPageInput } from './run-page.js';
export { explorePage, EXPLORE_FILE, chartLibrary, CHART_LIBRARY } from './page.js';
export { FULL_DATA_LIMIT, REDUCED_COLUMNS, traceSet, keptIndices } from './traces.js';
export { unpack } from './pack.js';
export type * from './payload.js';
