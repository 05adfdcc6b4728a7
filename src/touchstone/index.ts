// Touchstone files (IBIS Open Forum, versions 1.1 and 2.0): read and write.
export { complexOf, MAX_PORTS, MAX_VALUES, parseTouchstone, portsFromFileName, toNetworkData, type MatrixFormat, type ReadOptions, type TouchstoneData, type TwoPortOrder } from './read.js';
export { asciiOnly, formatTouchstone, touchstoneFileName, type WriteOptions } from './write.js';
export { DEFAULT_OPTIONS, type FrequencyUnit, type NumberFormat, type OptionLine, type Parameter } from './options.js';
export { readTouchstoneFile } from './file.js';
