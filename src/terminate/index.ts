export { advise, type Advice, type AdviseRequest, type OptionResult, type MonteCarlo } from './advise.js';
export { adviceJson, adviceMarkdown, formatAdviceTable, optionRows, type OptionRow } from './report.js';
export { renderAdvicePlot } from './plot.js';
export { winner, winnerValue, writeWinner } from './write.js';
export { OBJECTIVES, parseObjective, type ObjectiveName } from './objective.js';
export { TOPOLOGIES, type TopologyId } from './topologies.js';
export { neighbours, membersBetween, parseSeriesName, seriesMantissas, SERIES_NAMES, type SeriesName } from './eseries.js';
