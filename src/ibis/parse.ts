// The reader of the open I/O buffer model standard's text format (ANSI/EIA-656, IBIS ver. 5.0+) for the
// subset ladderwave uses: [Component] with [Package] and [Pin] (package R/L/C per pin), [Model] with
// Model_type and C_comp, [Voltage Range], [Pullup], [Pulldown], [GND Clamp], [POWER Clamp], [Ramp],
// [Rising Waveform] and [Falling Waveform] with their fixture subparameters. Every other keyword and
// subparameter is listed in `ignored`; every problem is reported with the file's name, the line and the
// keyword, all of them at once.
import { parseIbisNumber } from './numbers.js';
import { splitSections, tokens, type Section, type SourceLine } from './sections.js';
import {
  IbisError,
  type IbisComponentData,
  type IbisFileData,
  type IbisModelData,
  type IbisModelType,
  type IbisPinData,
  type IbisProblem,
  type IbisRow,
  type IbisTable,
  type IbisWaveformData,
  type RampColumns,
  type Tmm,
} from './types.js';

/** Keywords of the standard that carry only text (read, not listed as ignored). */
const TEXT_KEYWORDS = new Set(['file name', 'file rev', 'date', 'source', 'notes', 'disclaimer', 'copyright', 'manufacturer', 'end']);

/** Keywords that move a table's reference rail; ignoring them changes the model's meaning. */
const REFERENCE_KEYWORDS = new Set(['pullup reference', 'pulldown reference', 'power clamp reference', 'gnd clamp reference']);

const MODEL_TYPES: ReadonlyMap<string, IbisModelType> = new Map([
  ['input', 'Input'],
  ['output', 'Output'],
  ['i/o', 'I/O'],
  ['3-state', '3-state'],
  ['open_drain', 'Open_drain'],
  ['open_sink', 'Open_drain'],
  ['i/o_open_drain', 'Open_drain'],
  ['i/o_open_sink', 'Open_drain'],
]);

export interface Reader {
  data: IbisFileData;
  errors: IbisProblem[];
  component?: IbisComponentData;
  model?: IbisModelData;
}

function problem(r: Reader, line: number, keyword: string, message: string, warning = false): void {
  (warning ? r.data.warnings : r.errors).push({ file: r.data.file, line, keyword, message });
}

/** One number token; NA → undefined when allowed. Problems are recorded and NaN returned. */
export function num(r: Reader, tok: string | undefined, line: number, keyword: string, what: string, allowNA = false): number | undefined {
  if (tok === undefined) {
    problem(r, line, keyword, `${what}: missing — expected a number`);
    return NaN;
  }
  const p = parseIbisNumber(tok);
  if (!p.ok) {
    problem(r, line, keyword, `${what}: "${tok}" — expected a number with an optional suffix (T G M k m u n p f), like 2.5p`);
    return NaN;
  }
  if ('note' in p && p.note) problem(r, line, keyword, `${what}: ${p.note}`, true);
  if (p.value === undefined && !allowNA) {
    problem(r, line, keyword, `${what}: NA — expected a number (NA is allowed only in the min and max columns)`);
    return NaN;
  }
  return p.value;
}

/** typ, min, max from three tokens. */
function tmm(r: Reader, toks: string[], line: number, keyword: string, what: string): Tmm | undefined {
  if (toks.length < 3) {
    problem(r, line, keyword, `${what}: "${toks.join(' ')}" — expected three columns: typ min max (NA allowed for min and max)`);
    return undefined;
  }
  const typ = num(r, toks[0], line, keyword, `${what} typ`)!;
  const min = num(r, toks[1], line, keyword, `${what} min`, true);
  const max = num(r, toks[2], line, keyword, `${what} max`, true);
  return Number.isNaN(typ) ? undefined : { typ, min, max };
}

/** Rows of x, typ, min, max, sorted by x; repeated x is an error. */
function table(r: Reader, s: SourceLine[], keyword: string, line: number, xName: string): IbisTable | undefined {
  const rows: IbisRow[] = [];
  for (const l of s) {
    const t = tokens(l.text);
    if (t.length !== 4) {
      problem(r, l.line, keyword, `row "${l.text.trim()}" — expected 4 columns: ${xName}, typ, min, max`);
      continue;
    }
    const x = num(r, t[0], l.line, keyword, xName)!;
    const v = tmm(r, t.slice(1), l.line, keyword, 'value');
    if (!Number.isNaN(x) && v) rows.push({ x, ...v });
  }
  if (rows.length < 2) {
    problem(r, line, keyword, `${rows.length} usable row${rows.length === 1 ? '' : 's'} — expected a table of at least 2 rows`);
    return undefined;
  }
  rows.sort((a, b) => a.x - b.x);
  for (let k = 1; k < rows.length; k++) {
    if (rows[k].x === rows[k - 1].x) problem(r, line, keyword, `${xName} ${rows[k].x} appears twice — expected each ${xName} once`);
  }
  return { line, rows };
}

function needModel(r: Reader, s: Section): IbisModelData | undefined {
  if (!r.model) problem(r, s.line, s.keyword, 'appears outside a [Model] — expected it after a [Model] keyword');
  return r.model;
}

function needComponent(r: Reader, s: Section): IbisComponentData | undefined {
  if (!r.component) problem(r, s.line, s.keyword, 'appears outside a [Component] — expected it after a [Component] keyword');
  return r.component;
}

function readComponent(r: Reader, s: Section): void {
  const name = s.rest.trim();
  if (name === '') problem(r, s.line, s.keyword, 'no component name — expected [Component] NAME');
  if (r.data.components.has(name)) problem(r, s.line, s.keyword, `"${name}" is defined twice — expected unique component names`);
  r.component = { name, line: s.line, pkg: {}, pins: new Map() };
  r.model = undefined;
  r.data.components.set(name, r.component);
  for (const l of s.body) r.data.ignored.push({ line: l.line, what: `text under [Component] "${name}": ${l.text.trim()}` });
}

function readPackage(r: Reader, s: Section): void {
  const c = needComponent(r, s);
  if (!c) return;
  for (const l of s.body) {
    const [name, ...vals] = tokens(l.text);
    const key = name.toLowerCase();
    if (key === 'r_pkg' || key === 'l_pkg' || key === 'c_pkg') {
      const v = tmm(r, vals, l.line, s.keyword, name);
      if (v) c.pkg[key[0] as 'r' | 'l' | 'c'] = v;
    } else r.data.ignored.push({ line: l.line, what: `[Package] ${name}` });
  }
}

function readPins(r: Reader, s: Section): void {
  const c = needComponent(r, s);
  if (!c) return;
  const cols = tokens(s.rest).map((x) => x.toLowerCase());
  const rlc = ['r_pin', 'l_pin', 'c_pin'].map((k) => cols.indexOf(k));
  for (const l of s.body) {
    const t = tokens(l.text);
    if (t.length < 3) {
      problem(r, l.line, s.keyword, `row "${l.text.trim()}" — expected pin_name signal_name model_name [R_pin L_pin C_pin]`);
      continue;
    }
    const pin: IbisPinData = { name: t[0], signal: t[1], model: t[2], line: l.line };
    (['r', 'l', 'c'] as const).forEach((k, i) => {
      const col = rlc[i];
      if (col >= 0 && t[col + 1] !== undefined) {
        const v = num(r, t[col + 1], l.line, s.keyword, `${k.toUpperCase()}_pin of pin ${t[0]}`, true);
        if (v !== undefined && !Number.isNaN(v)) pin[k] = v;
      }
    });
    if (c.pins.has(pin.name)) problem(r, l.line, s.keyword, `pin "${pin.name}" is listed twice — expected each pin once`);
    c.pins.set(pin.name, pin);
  }
}

function readModelHeader(r: Reader, s: Section): void {
  const name = s.rest.trim();
  if (name === '') problem(r, s.line, s.keyword, 'no model name — expected [Model] NAME');
  if (r.data.models.has(name)) problem(r, s.line, s.keyword, `"${name}" is defined twice — expected unique model names`);
  const m: IbisModelData = { name, line: s.line, rising: [], falling: [] };
  r.model = m;
  r.component = undefined;
  r.data.models.set(name, m);
  for (const l of s.body) {
    const [sub, ...vals] = tokens(l.text);
    const key = sub.toLowerCase();
    if (key === 'model_type') {
      const type = MODEL_TYPES.get((vals[0] ?? '').toLowerCase());
      if (type) m.modelType = type;
      else problem(r, l.line, s.keyword, `Model_type "${vals[0] ?? ''}" — expected one of the supported types Input, Output, I/O, 3-state, Open_drain`);
    } else if (key === 'c_comp') {
      m.cComp = tmm(r, vals, l.line, s.keyword, 'C_comp');
      m.cCompLine = l.line;
    } else r.data.ignored.push({ line: l.line, what: `${sub} in [Model] "${name}"` });
  }
}

function readVoltageRange(r: Reader, s: Section): void {
  const m = needModel(r, s);
  if (m) m.voltageRange = tmm(r, tokens(s.rest), s.line, s.keyword, 'supply voltage');
}

function readTable(r: Reader, s: Section, field: 'pullup' | 'pulldown' | 'gndClamp' | 'powerClamp'): void {
  const m = needModel(r, s);
  if (!m) return;
  if (m[field]) problem(r, s.line, s.keyword, `a second [${s.keyword}] in model "${m.name}" — expected one`);
  m[field] = table(r, s.body, s.keyword, s.line, 'voltage');
}

/** "1.1/0.6n" → [1.1, 0.6e-9]; NA → undefined. */
function rampPair(r: Reader, tok: string, line: number, keyword: string, what: string): [number, number] | undefined {
  if (/^na$/i.test(tok)) return undefined;
  const parts = tok.split('/');
  if (parts.length !== 2) {
    problem(r, line, keyword, `${what}: "${tok}" — expected dV/dt as a fraction like 1.1/0.6n`);
    return undefined;
  }
  const dv = num(r, parts[0], line, keyword, `${what} dV`)!;
  const dt = num(r, parts[1], line, keyword, `${what} dt`)!;
  if (!(dt > 0) || Number.isNaN(dv)) {
    if (!Number.isNaN(dt)) problem(r, line, keyword, `${what}: dt = ${parts[1]} — expected a time > 0`);
    return undefined;
  }
  return [Math.abs(dv), dt];
}

function readRamp(r: Reader, s: Section): void {
  const m = needModel(r, s);
  if (!m) return;
  m.ramp = { line: s.line, rLoad: 50 };
  for (const l of s.body) {
    const [name, ...vals] = tokens(l.text);
    const key = name.toLowerCase();
    if (key === 'r_load') {
      const v = num(r, vals[0], l.line, s.keyword, 'R_load')!;
      if (v > 0) m.ramp.rLoad = v;
      else if (!Number.isNaN(v)) problem(r, l.line, s.keyword, `R_load = ${vals[0]} — expected a resistance > 0`);
    } else if (key === 'dv/dt_r' || key === 'dv/dt_f') {
      if (vals.length !== 3) {
        problem(r, l.line, s.keyword, `${name}: "${vals.join(' ')}" — expected three columns typ min max, each dV/dt like 1.1/0.6n or NA`);
        continue;
      }
      const typ = rampPair(r, vals[0], l.line, s.keyword, `${name} typ`);
      if (!typ) {
        if (/^na$/i.test(vals[0])) problem(r, l.line, s.keyword, `${name} typ: NA — expected a value in the typ column`);
        continue;
      }
      const cols: RampColumns = { typ, min: rampPair(r, vals[1], l.line, s.keyword, `${name} min`), max: rampPair(r, vals[2], l.line, s.keyword, `${name} max`), line: l.line };
      if (key === 'dv/dt_r') m.ramp.rising = cols;
      else m.ramp.falling = cols;
    } else r.data.ignored.push({ line: l.line, what: `${name} in [Ramp] of model "${m.name}"` });
  }
}

const FIXTURE_KEYS: ReadonlyMap<string, keyof IbisWaveformData> = new Map([
  ['r_fixture', 'rFixture'],
  ['v_fixture', 'vFixture'],
  ['v_fixture_min', 'vFixtureMin'],
  ['v_fixture_max', 'vFixtureMax'],
  ['c_fixture', 'cFixture'],
  ['l_fixture', 'lFixture'],
  ['r_dut', 'rDut'],
  ['l_dut', 'lDut'],
  ['c_dut', 'cDut'],
] as Array<[string, keyof IbisWaveformData]>);

function readWaveform(r: Reader, s: Section, rising: boolean): void {
  const m = needModel(r, s);
  if (!m) return;
  const w: Partial<IbisWaveformData> & { rows: IbisRow[] } = { line: s.line, rows: [] };
  const rows: SourceLine[] = [];
  for (const l of s.body) {
    const t = tokens(l.text);
    const field = FIXTURE_KEYS.get(t[0].toLowerCase());
    if (field) (w as Record<string, unknown>)[field] = num(r, t[1], l.line, s.keyword, t[0]);
    else if (/^[A-Za-z]/.test(t[0]) && !/^na$/i.test(t[0])) r.data.ignored.push({ line: l.line, what: `${t[0]} in [${s.keyword}] of model "${m.name}"` });
    else rows.push(l);
  }
  if (w.rFixture === undefined) problem(r, s.line, s.keyword, 'no R_fixture — expected R_fixture = <ohms>');
  if (w.vFixture === undefined) problem(r, s.line, s.keyword, 'no V_fixture — expected V_fixture = <volts>');
  const t = table(r, rows, s.keyword, s.line, 'time');
  if (!t || w.rFixture === undefined || w.vFixture === undefined) return;
  if (!(w.rFixture > 0)) problem(r, s.line, s.keyword, `R_fixture = ${w.rFixture} — expected a resistance > 0`);
  const wave = { ...w, rows: t.rows } as IbisWaveformData;
  (rising ? m.rising : m.falling).push(wave);
}

type Handler = (r: Reader, s: Section) => void;

const HANDLERS: ReadonlyMap<string, Handler> = new Map<string, Handler>([
  ['ibis ver', (r, s) => (r.data.version = s.rest)],
  ['component', readComponent],
  ['package', readPackage],
  ['pin', readPins],
  ['model', readModelHeader],
  ['voltage range', readVoltageRange],
  ['pullup', (r, s) => readTable(r, s, 'pullup')],
  ['pulldown', (r, s) => readTable(r, s, 'pulldown')],
  ['gnd clamp', (r, s) => readTable(r, s, 'gndClamp')],
  ['power clamp', (r, s) => readTable(r, s, 'powerClamp')],
  ['ramp', readRamp],
  ['rising waveform', (r, s) => readWaveform(r, s, true)],
  ['falling waveform', (r, s) => readWaveform(r, s, false)],
]);

/** Reads a model file's text. Throws IbisError listing every problem; warnings and ignored parts are in the result. */
export function parseIbis(text: string, file: string): IbisFileData {
  const r: Reader = { data: { file, components: new Map(), models: new Map(), ignored: [], warnings: [] }, errors: [] };
  const split = splitSections(text);
  for (const l of split.stray) problem(r, l.line, '', `text before the first keyword: "${l.text.trim()}" — expected a [keyword] first (comments start with the comment character)`);
  for (const l of split.badCommentChar) problem(r, l.line, 'Comment Char', `"${l.text.trim()}" — expected a character followed by _char, like [Comment Char] #_char`);
  for (const s of split.sections) {
    const h = HANDLERS.get(s.key);
    if (h) h(r, s);
    else if (TEXT_KEYWORDS.has(s.key)) continue;
    else {
      r.data.ignored.push({ line: s.line, what: `[${s.keyword}]` });
      if (REFERENCE_KEYWORDS.has(s.key)) problem(r, s.line, s.keyword, 'moves a table\'s reference rail away from [Voltage Range] and is not supported: the tables are read against [Voltage Range] and ground', true);
    }
  }
  checkModels(r);
  if (r.errors.length > 0) throw new IbisError(r.errors);
  return r.data;
}

function checkModels(r: Reader): void {
  for (const m of r.data.models.values()) {
    const where = (msg: string) => problem(r, m.line, 'Model', `model "${m.name}": ${msg}`);
    if (!m.modelType) where('no Model_type — expected Model_type Input, Output, I/O, 3-state or Open_drain');
    if (!m.cComp) where('no C_comp — expected C_comp typ min max');
    if (!m.voltageRange) where('no [Voltage Range] — expected [Voltage Range] typ min max (the reference keywords are not supported)');
    const drives = m.modelType !== undefined && m.modelType !== 'Input';
    if (drives && !m.pulldown) where(`Model_type ${m.modelType} needs a [Pulldown] table`);
    if (drives && m.modelType !== 'Open_drain' && !m.pullup) where(`Model_type ${m.modelType} needs a [Pullup] table`);
    if (drives && !m.ramp?.rising && m.rising.length === 0) where('a driver needs a [Ramp] dV/dt_r or a [Rising Waveform]');
    if (drives && !m.ramp?.falling && m.falling.length === 0) where('a driver needs a [Ramp] dV/dt_f or a [Falling Waveform]');
  }
  for (const c of r.data.components.values()) {
    for (const p of c.pins.values()) {
      if (/^(power|gnd|nc)$/i.test(p.model)) continue;
      if (!r.data.models.has(p.model)) problem(r, p.line, 'Pin', `pin "${p.name}" uses model "${p.model}", which the file does not define — expected one of ${[...r.data.models.keys()].map((k) => `"${k}"`).join(', ') || 'its [Model] names'}`);
    }
  }
}
