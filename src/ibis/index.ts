// Reading model files of the open I/O buffer model standard (ANSI/EIA-656, "IBIS").
export { parseIbis } from './parse.js';
export { parseIbisNumber } from './numbers.js';
export { ibisBuffer, pick, type Corner, type IbisBuffer, type IbisSelection } from './buffer.js';
export { loadIbisFile } from './load.js';
export * from './types.js';
