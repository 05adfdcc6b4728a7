// What the reader keeps of a model file of the open I/O buffer model standard (ANSI/EIA-656, "IBIS"),
// in the file's own terms: typ/min/max columns, tables with their line numbers. Numbers are SI.

export interface IbisProblem {
  file: string;
  line: number;
  /** The keyword (as written, without brackets) the problem belongs to; '' before the first one. */
  keyword: string;
  message: string;
}

/** `mcu.ibs:42 [Pulldown]: row "0.5 2m x NA" — expected 4 numbers (voltage, typ, min, max)` */
export function formatIbisProblem(p: IbisProblem): string {
  return `${p.file}:${p.line}${p.keyword ? ` [${p.keyword}]` : ''}: ${p.message}`;
}

/** A malformed model file: every problem found, one line each. */
export class IbisError extends Error {
  constructor(readonly problems: IbisProblem[]) {
    super(problems.map(formatIbisProblem).join('\n'));
    this.name = 'IbisError';
  }
}

/** A typ/min/max triple; min or max undefined where the file says NA. */
export interface Tmm {
  typ: number;
  min?: number;
  max?: number;
}

/** One row of an I/V or V–t table: the independent value and its typ/min/max columns. */
export interface IbisRow extends Tmm {
  x: number;
}

export interface IbisTable {
  line: number;
  rows: IbisRow[];
}

export interface IbisWaveformData {
  line: number;
  rFixture: number;
  vFixture: number;
  vFixtureMin?: number;
  vFixtureMax?: number;
  cFixture?: number;
  lFixture?: number;
  rDut?: number;
  lDut?: number;
  cDut?: number;
  /** Time (s) against pin voltage. */
  rows: IbisRow[];
}

/** dV and dt of a ramp edge per column; min/max undefined where NA. */
export interface RampColumns {
  typ: [number, number];
  min?: [number, number];
  max?: [number, number];
  line: number;
}

export interface IbisRampData {
  line: number;
  rising?: RampColumns;
  falling?: RampColumns;
  /** R_load (Ω), 50 when absent. */
  rLoad: number;
}

export type IbisModelType = 'Input' | 'Output' | 'I/O' | '3-state' | 'Open_drain';

export interface IbisModelData {
  name: string;
  line: number;
  modelType?: IbisModelType;
  cComp?: Tmm;
  cCompLine?: number;
  voltageRange?: Tmm;
  pullup?: IbisTable;
  pulldown?: IbisTable;
  gndClamp?: IbisTable;
  powerClamp?: IbisTable;
  ramp?: IbisRampData;
  rising: IbisWaveformData[];
  falling: IbisWaveformData[];
}

export interface IbisPinData {
  name: string;
  signal: string;
  model: string;
  line: number;
  r?: number;
  l?: number;
  c?: number;
}

export interface IbisComponentData {
  name: string;
  line: number;
  pkg: { r?: Tmm; l?: Tmm; c?: Tmm };
  pins: Map<string, IbisPinData>;
}

/** A keyword or subparameter the reader does not use, listed so nothing is dropped silently. */
export interface IbisIgnored {
  line: number;
  what: string;
}

export interface IbisFileData {
  file: string;
  version?: string;
  components: Map<string, IbisComponentData>;
  models: Map<string, IbisModelData>;
  ignored: IbisIgnored[];
  warnings: IbisProblem[];
}
