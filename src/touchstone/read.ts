// Touchstone reader: versions 1.0/1.1 (IBIS Open Forum, Touchstone File Format Specification
// Rev 1.1, 2002) and 2.0 (IBIS Open Forum, Touchstone File Format Specification Version 2.0, 2009).
//
// What each version fixes, as the reader applies it:
//  - 1.x: an option line first (after comments); network data follows; the number of ports is not in
//    the file (it is the n of the .snp extension). 1- and 2-port sets are one line each, 2-port data
//    in the order 11 21 12 22; 3-port and larger sets are one matrix row per line, rows longer than
//    four pairs continued on the next line(s), each row starting on a new line. A 2-port frequency at
//    or below the previous one starts the noise parameters (skipped). Z and Y are normalized to R.
//  - 2.0: [Version] 2.0 first, then the option line and the keywords [Number of Ports],
//    [Two-Port Data Order] (2-port files), [Number of Frequencies], optionally [Number of Noise
//    Frequencies], [Reference], [Matrix Format] (Full, Lower, Upper) and [Begin Information] …
//    [End Information]; then [Network Data], optionally [Noise Data] (skipped), and [End]. Network
//    data may wrap freely. G, H, Y and Z are not normalized (ohms and siemens); S is normalized to
//    [Reference] per port, or to R.
//  - Both: frequencies strictly increasing; MA (magnitude, degrees), DB (20·log10|x|, degrees) or RI.
// [Mixed-Mode Order] is refused (mixed-mode data is not supported yet). Every problem names the file,
// line and column and what was expected there.
import type { NetworkData } from '../../sim/sparams/network.js';
import { closest, Problems, ScenarioError } from '../scenario/problems.js';
import { checkSetCount, decodeSets, MAX_VALUES, type FailFn, type MatrixFormat, type TwoPortOrder } from './decode.js';
import { numberOf, sourceLines, tokensOf, type SourceLine, type Token } from './lines.js';
import { parseOptionLine, type OptionLine, type Parameter } from './options.js';

export { complexOf, MAX_VALUES, type MatrixFormat, type TwoPortOrder } from './decode.js';


export interface TouchstoneData {
  file: string;
  version: '1.1' | '2.0';
  options: OptionLine;
  ports: number;
  /** Frequencies in Hz. */
  freq: Float64Array;
  parameter: Parameter;
  /**
   * One n×n complex matrix per frequency, re/im interleaved, row-major (entry (i, j) of frequency k at
   * 2((k·n + i)·n + j)). S as written; Y in siemens and Z in ohms (1.x values multiplied out of their
   * normalization); G and H as written.
   */
  values: Float64Array;
  /** Reference resistance per port (Ω). */
  reference: Float64Array;
  twoPortOrder?: TwoPortOrder;
  matrixFormat: MatrixFormat;
  /** Noise parameter points found and skipped. */
  noisePoints: number;
  comments: string[];
}

export interface ReadOptions {
  /** File name for messages (and the port count of a 1.x file, from its .snp extension). */
  file: string;
  /** Number of ports of a 1.x file; default from the file name's extension. */
  ports?: number;
}

/** Largest port count read (a guard against a mistyped extension or keyword, not a limit of the format). */
export const MAX_PORTS = 64;

/** The n of a ".snp" file name (".s2p" → 2), if it has one. */
export function portsFromFileName(name: string): number | undefined {
  const m = /\.s(\d+)p$/i.exec(name);
  return m ? Number(m[1]) : undefined;
}

class Fail extends Error {}

/** Reads Touchstone text. Throws ScenarioError listing every problem found. */
export function parseTouchstone(text: string, opts: ReadOptions): TouchstoneData {
  const problems = new Problems(opts.file);
  const lines = sourceLines(text);
  const fail = (path: string, value: unknown, expected: string, at?: { line: number; col: number }): never => {
    problems.add(path, value, expected, at);
    throw new Fail();
  };
  try {
    const data = readStructure(lines, opts, problems, fail);
    if (problems.count === 0) return data;
  } catch (e) {
    if (!(e instanceof Fail)) throw e;
  }
  throw new ScenarioError(problems.sorted());
}

const content = (lines: SourceLine[]) => lines.filter((l) => l.text !== '');

function readStructure(lines: SourceLine[], opts: ReadOptions, problems: Problems, fail: FailFn): TouchstoneData {
  const comments = lines.filter((l) => l.comment !== undefined).map((l) => l.comment as string);
  const body = content(lines);
  if (body.length === 0) fail('', '(empty)', 'an option line such as "# GHz S MA R 50" (Touchstone 1.x) or "[Version] 2.0"', { line: 1, col: 1 });
  const first = body[0];
  if (first.text.startsWith('[')) return readVersion2(body, opts, problems, fail, comments);
  if (!first.text.startsWith('#')) fail('', first.text, 'the option line ("# GHz S MA R 50") or "[Version] 2.0" as the first line that is not a comment', first);
  return readVersion1(body, opts, problems, fail, comments);
}

// ---- version 1.x ----------------------------------------------------------------------------

function readVersion1(body: SourceLine[], opts: ReadOptions, problems: Problems, fail: FailFn, comments: string[]): TouchstoneData {
  const options = parseOptionLine(body[0], problems);
  const ports = opts.ports ?? portsFromFileName(opts.file);
  if (ports === undefined) {
    fail('', opts.file, 'a file name ending in .sNp (like .s2p) giving the number of ports of a Touchstone 1.x file, or a [Version] 2.0 file with [Number of Ports]');
  }
  checkPorts(ports as number, fail, { line: body[0].line, col: 1 });
  const n = ports as number;
  const tokens: Token[] = [];
  for (const l of body.slice(1)) {
    if (l.text.startsWith('#')) continue; // option lines after the first are ignored (1.1, "Option Line")
    if (l.text.startsWith('[')) fail('', l.text, 'network data: keywords need "[Version] 2.0" as the first line of the file', l);
    tokens.push(...tokensOf(l));
  }
  const perSet = 1 + 2 * n * n;
  // A 2-port set whose frequency is not above the previous one starts the noise data (1.1, "Adding Noise Parameters").
  let end = tokens.length;
  let noisePoints = 0;
  if (n === 2) {
    let prev = -Infinity;
    for (let k = 0; k < tokens.length; k += perSet) {
      const f = numberOf(tokens[k].text);
      if (f <= prev) {
        end = k;
        noisePoints = countNoise(tokens.slice(k), fail);
        break;
      }
      prev = f;
    }
  }
  const sets = checkSetCount(tokens.slice(0, end), perSet, n, fail);
  if (n >= 3) checkRowStarts(tokens, sets, n, fail);
  const reference = new Float64Array(n).fill(options.resistance);
  const { freq, values } = decodeSets(tokens, sets, n, options, problems, n === 2 ? '21_12' : undefined, 'Full');
  normalizeVersion1(values, options);
  return {
    file: opts.file,
    version: '1.1',
    options,
    ports: n,
    freq,
    parameter: options.parameter,
    values,
    reference,
    twoPortOrder: n === 2 ? '21_12' : undefined,
    matrixFormat: 'Full',
    noisePoints,
    comments,
  };
}

function countNoise(tokens: Token[], fail: FailFn): number {
  // each noise line: frequency, minimum noise figure (dB), |Γopt|, angle Γopt, effective noise resistance
  let count = 0;
  let i = 0;
  while (i < tokens.length) {
    let j = i + 1;
    while (j < tokens.length && !tokens[j].first) j++;
    if (j - i !== 5) fail('noise data', tokens.slice(i, j).map((t) => t.text).join(' '), 'five values per noise line: frequency, NFmin (dB), |Γopt|, angle of Γopt, Rn/R', tokens[i]);
    for (let k = i; k < j; k++) if (Number.isNaN(numberOf(tokens[k].text))) fail('noise data', tokens[k].text, 'a number', tokens[k]);
    count++;
    i = j;
  }
  return count;
}

/** 1.x files normalize Z to R and Y to 1/R; undo that so values are in ohms and siemens. */
function normalizeVersion1(values: Float64Array, options: OptionLine): void {
  const f = options.parameter === 'Z' ? options.resistance : options.parameter === 'Y' ? 1 / options.resistance : 1;
  if (f !== 1) for (let k = 0; k < values.length; k++) values[k] *= f;
}

function checkRowStarts(tokens: Token[], sets: number, n: number, fail: FailFn): void {
  const perSet = 1 + 2 * n * n;
  for (let s = 0; s < sets; s++) {
    const base = s * perSet;
    if (!tokens[base].first) fail('network data', tokens[base].text, `the frequency of a data set at the start of a line (${n} ports: ${n} rows of ${n} pairs each)`, tokens[base]);
    for (let r = 1; r < n; r++) {
      const t = tokens[base + 1 + 2 * n * r];
      if (!t.first) fail('network data', t.text, `row ${r + 1} of the ${n}×${n} matrix to start on a new line (Touchstone 1.1, "3-port and 4-port Networks")`, t);
    }
  }
}

// ---- version 2.0 ----------------------------------------------------------------------------

const KEYWORDS = [
  'Version',
  'Number of Ports',
  'Two-Port Data Order',
  'Number of Frequencies',
  'Number of Noise Frequencies',
  'Reference',
  'Matrix Format',
  'Mixed-Mode Order',
  'Begin Information',
  'End Information',
  'Network Data',
  'Noise Data',
  'End',
];
const KEYWORD_BY_KEY = new Map(KEYWORDS.map((k) => [k.toLowerCase(), k]));

interface Keyword {
  name: string;
  /** Text after the closing bracket. */
  rest: SourceLine;
  at: SourceLine;
}

function keywordOf(l: SourceLine, fail: FailFn): Keyword | undefined {
  if (!l.text.startsWith('[')) return undefined;
  const close = l.text.indexOf(']');
  if (close < 0) fail('', l.text, 'a keyword in brackets, like "[Number of Ports] 2"', l);
  const raw = l.text.slice(1, close).trim().replace(/\s+/g, ' ');
  const name = KEYWORD_BY_KEY.get(raw.toLowerCase());
  if (!name) {
    const near = closest(raw, KEYWORDS);
    fail('', `[${raw}]`, near ? `a Touchstone 2.0 keyword — did you mean [${near}]?` : `a Touchstone 2.0 keyword: ${KEYWORDS.map((k) => `[${k}]`).join(', ')}`, l);
  }
  const restText = l.text.slice(close + 1);
  const lead = restText.length - restText.trimStart().length;
  return { name: name as string, rest: { line: l.line, text: restText.trim(), col: l.col + close + 1 + lead }, at: l };
}

interface Header {
  ports?: number;
  order?: TwoPortOrder;
  frequencies?: number;
  noiseFrequencies?: number;
  reference?: Float64Array;
  matrixFormat: MatrixFormat;
}

function readVersion2(body: SourceLine[], opts: ReadOptions, problems: Problems, fail: FailFn, comments: string[]): TouchstoneData {
  const version = keywordOf(body[0], fail) as Keyword;
  if (version.name !== 'Version') fail('', body[0].text, '"[Version] 2.0" (the first keyword of a 2.0 file) or an option line', body[0]);
  if (version.rest.text !== '2.0') fail('[Version]', version.rest.text, '2.0 (this reader knows versions 1.x, without [Version], and 2.0)', version.rest);
  if (body.length < 2 || !body[1].text.startsWith('#')) fail('', body[1]?.text, 'the option line ("# GHz S MA R 50") right after [Version]', body[1] ?? body[0]);
  const options = parseOptionLine(body[1], problems);
  const h: Header = { matrixFormat: 'Full' };
  let i = readHeader(body, 2, h, fail);
  const dataAt = body[i - 1];
  if (h.ports === undefined) fail('[Number of Ports]', undefined, 'the [Number of Ports] keyword before [Network Data]', dataAt);
  const n = h.ports as number;
  if (n === 2 && h.order === undefined) fail('[Two-Port Data Order]', undefined, '[Two-Port Data Order] 12_21 or 21_12 in a 2-port file', dataAt);
  if (h.frequencies === undefined) fail('[Number of Frequencies]', undefined, 'the [Number of Frequencies] keyword before [Network Data]', dataAt);
  if ((h.matrixFormat !== 'Full') && options.parameter !== 'S' && options.parameter !== 'Y' && options.parameter !== 'Z') {
    fail('[Matrix Format]', h.matrixFormat, 'Full for G- and H-parameters (Lower and Upper describe symmetric matrices)', dataAt);
  }
  const nf = h.frequencies as number;
  if (nf * n * n > MAX_VALUES) fail('[Number of Frequencies]', nf, `at most ${Math.floor(MAX_VALUES / (n * n))} frequencies for ${n} ports (${MAX_VALUES} values)`, dataAt);
  // network data up to the next keyword
  const tokens: Token[] = [];
  for (; i < body.length && !body[i].text.startsWith('['); i++) tokens.push(...tokensOf(body[i]));
  const pairs = h.matrixFormat === 'Full' ? n * n : (n * (n + 1)) / 2;
  const perSet = 1 + 2 * pairs;
  if (tokens.length !== nf * perSet) {
    const got = tokens.length;
    const where = got > nf * perSet ? tokens[nf * perSet] : (tokens[got - 1] ?? dataAt);
    fail('[Network Data]', got, `${nf} frequencies × ${perSet} values (frequency + ${pairs} pairs) = ${nf * perSet} numbers, as [Number of Frequencies] ${nf} and [Number of Ports] ${n} say`, where);
  }
  const noisePoints = readTail(body, i, h, n, fail);
  const reference = h.reference ?? new Float64Array(n).fill(options.resistance);
  const { freq, values } = decodeSets(tokens, nf, n, options, problems, n === 2 ? h.order : undefined, h.matrixFormat);
  return {
    file: opts.file,
    version: '2.0',
    options,
    ports: n,
    freq,
    parameter: options.parameter,
    values,
    reference,
    twoPortOrder: n === 2 ? h.order : undefined,
    matrixFormat: h.matrixFormat,
    noisePoints,
    comments,
  };
}

/** Reads the keywords between the option line and [Network Data]; returns the index after [Network Data]. */
function readHeader(body: SourceLine[], start: number, h: Header, fail: FailFn): number {
  const seen = new Set<string>();
  for (let i = start; i < body.length; i++) {
    const l = body[i];
    if (l.text.startsWith('#')) fail('', l.text, 'one option line only', l);
    const k = keywordOf(l, fail);
    if (!k) fail('', l.text, 'a keyword such as [Number of Ports] — network data starts after [Network Data]', l);
    const kw = k as Keyword;
    if (seen.has(kw.name) && kw.name !== 'Begin Information') fail(`[${kw.name}]`, kw.at.text, `[${kw.name}] once only`, kw.at);
    seen.add(kw.name);
    switch (kw.name) {
      case 'Number of Ports':
        h.ports = integerArg(kw, 1, fail);
        checkPorts(h.ports, fail, kw.rest);
        break;
      case 'Two-Port Data Order':
        if (kw.rest.text !== '12_21' && kw.rest.text !== '21_12') fail('[Two-Port Data Order]', kw.rest.text, '12_21 or 21_12', kw.rest);
        h.order = kw.rest.text as TwoPortOrder;
        break;
      case 'Number of Frequencies':
        h.frequencies = integerArg(kw, 1, fail);
        break;
      case 'Number of Noise Frequencies':
        h.noiseFrequencies = integerArg(kw, 1, fail);
        break;
      case 'Reference':
        i = readReference(body, i, kw, h, fail);
        break;
      case 'Matrix Format': {
        const v = kw.rest.text.toLowerCase();
        if (v !== 'full' && v !== 'lower' && v !== 'upper') fail('[Matrix Format]', kw.rest.text, 'Full, Lower or Upper', kw.rest);
        h.matrixFormat = v === 'full' ? 'Full' : v === 'lower' ? 'Lower' : 'Upper';
        break;
      }
      case 'Mixed-Mode Order':
        fail('[Mixed-Mode Order]', kw.rest.text, 'single-ended network data: mixed-mode files are not supported yet', kw.at);
        break;
      case 'Begin Information':
        while (i + 1 < body.length && keywordOf(body[i + 1], fail)?.name !== 'End Information') i++;
        if (i + 1 >= body.length) fail('[Begin Information]', kw.at.text, 'a matching [End Information]', kw.at);
        i++;
        break;
      case 'Network Data':
        return i + 1;
      default:
        fail(`[${kw.name}]`, kw.at.text, '[Network Data] before this keyword', kw.at);
    }
  }
  return fail('[Network Data]', undefined, 'a [Network Data] keyword followed by the network data', body[body.length - 1]);
}

function integerArg(kw: Keyword, min: number, fail: FailFn): number {
  const v = numberOf(kw.rest.text);
  if (!(Number.isInteger(v) && v >= min)) fail(`[${kw.name}]`, kw.rest.text, `a whole number ≥ ${min}`, kw.rest);
  return v;
}

function checkPorts(n: number, fail: FailFn, at: { line: number; col: number }): void {
  if (!(Number.isInteger(n) && n >= 1 && n <= MAX_PORTS)) fail('number of ports', n, `a whole number from 1 to ${MAX_PORTS}`, at);
}

/** [Reference]: one positive resistance per port, on the keyword's line and the lines after it. */
function readReference(body: SourceLine[], i: number, kw: Keyword, h: Header, fail: FailFn): number {
  if (h.ports === undefined) fail('[Reference]', kw.at.text, '[Number of Ports] before [Reference]', kw.at);
  const n = h.ports as number;
  const tokens = tokensOf(kw.rest);
  let j = i;
  while (tokens.length < n && j + 1 < body.length && !body[j + 1].text.startsWith('[')) tokens.push(...tokensOf(body[++j]));
  if (tokens.length !== n) fail('[Reference]', tokens.map((t) => t.text).join(' '), `${n} reference resistances (one per port)`, tokens[n] ?? kw.at);
  h.reference = new Float64Array(n);
  tokens.forEach((t, p) => {
    const v = numberOf(t.text);
    if (!(v > 0)) fail('[Reference]', t.text, 'a positive resistance in ohms', t);
    (h.reference as Float64Array)[p] = v;
  });
  return j;
}

/** [Noise Data] (skipped, counted) and the required [End]. Returns the number of noise points. */
function readTail(body: SourceLine[], i: number, h: Header, n: number, fail: FailFn): number {
  let noise = 0;
  const last = body[body.length - 1];
  if (i >= body.length) fail('[End]', undefined, 'the [End] keyword after the network data', last);
  let k = keywordOf(body[i], fail) as Keyword;
  if (k.name === 'Noise Data') {
    if (n !== 2) fail('[Noise Data]', k.at.text, 'noise data in 2-port files only', k.at);
    if (h.noiseFrequencies === undefined) fail('[Number of Noise Frequencies]', undefined, '[Number of Noise Frequencies] before [Network Data] when the file has [Noise Data]', k.at);
    const tokens: Token[] = [];
    for (i++; i < body.length && !body[i].text.startsWith('['); i++) tokens.push(...tokensOf(body[i]));
    if (tokens.length !== 5 * (h.noiseFrequencies as number)) fail('[Noise Data]', tokens.length, `${h.noiseFrequencies} noise frequencies × 5 values`, tokens[tokens.length - 1] ?? k.at);
    noise = h.noiseFrequencies as number;
    if (i >= body.length) fail('[End]', undefined, 'the [End] keyword after the noise data', last);
    k = keywordOf(body[i], fail) as Keyword;
  }
  if (k.name !== 'End') fail(`[${k.name}]`, k.at.text, '[End] (or [Noise Data]) after the network data', k.at);
  return noise;
}

/** The file's data as a NetworkData (S, Y or Z). G- and H-parameter files are refused. */
export function toNetworkData(t: TouchstoneData): NetworkData {
  if (t.parameter !== 'S' && t.parameter !== 'Y' && t.parameter !== 'Z') {
    throw new ScenarioError([
      { file: t.file, path: 'option line', value: t.parameter, expected: 'S-, Y- or Z-parameters: G- and H-parameter files are read but not converted' },
    ]);
  }
  return { ports: t.ports, freq: t.freq, kind: t.parameter, data: t.values, reference: t.reference };
}
