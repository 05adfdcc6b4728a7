// Entry points: scenario file or text → Net, or a ScenarioError listing every problem.
import type { Net } from '../../sim/model.js';
import { fromValue, parseText, type SrcNode } from './parse.js';
import { formatBytes, MAX_SCENARIO_BYTES, readCapped } from './file.js';
import { Problems, ScenarioError, sortProblems, type Problem } from './problems.js';
import { validateScenario } from './validate.js';

export { ScenarioError, formatProblem, type Problem } from './problems.js';

export interface CheckResult {
  /** The net, when there were no problems. */
  net?: Net;
  /** Every problem, in source order. */
  problems: Problem[];
  /** Things that are allowed but probably not meant (e.g. a step from 1V to 1V). */
  warnings: Problem[];
  /** The parsed text with source positions (absent when it could not be parsed). */
  root?: SrcNode;
}

/** Check scenario text (JSON or YAML) without throwing. */
export function checkScenario(text: string, fileName: string): CheckResult {
  const problems = new Problems(fileName);
  const root = parseText(text, problems);
  // Syntax errors leave no tree; duplicate keys are reported but the rest is still checked.
  const net = root ? validateScenario(root, problems) : undefined;
  return { ...finish(problems, net), ...(root ? { root } : {}) };
}

/** Check a scenario given as plain data (e.g. built in code); problems carry no line:col. */
export function checkScenarioValue(value: unknown, fileName = '(scenario)'): CheckResult {
  const problems = new Problems(fileName);
  const net = validateScenario(fromValue(value), problems);
  return finish(problems, net);
}

function finish(problems: Problems, net: Net | undefined): CheckResult {
  const list = sortProblems(problems.errors);
  return list.length === 0 && net ? { net, problems: [], warnings: sortProblems(problems.warnings) } : { problems: list, warnings: sortProblems(problems.warnings) };
}

function orThrow(r: CheckResult): Net {
  if (!r.net) throw new ScenarioError(r.problems, r.warnings);
  return r.net;
}

/** Scenario text (JSON or YAML) → Net; throws ScenarioError listing every problem. `fileName` is used in messages. */
export function parseScenario(text: string, fileName: string): Net {
  return orThrow(checkScenario(text, fileName));
}

/** Plain data → Net; throws ScenarioError listing every problem. */
export function scenarioFromValue(value: unknown, fileName = '(scenario)'): Net {
  return orThrow(checkScenarioValue(value, fileName));
}

/** Read and check a scenario file and also hand back its bytes (for hashing), text and warnings. */
export async function readScenario(path: string): Promise<{ net: Net; text: string; bytes: Buffer; warnings: Problem[]; root: SrcNode }> {
  const read = await readCapped(path, MAX_SCENARIO_BYTES);
  if (!read.ok) {
    const what = read.tooLarge ? `a scenario file of at most ${formatBytes(MAX_SCENARIO_BYTES)}` : 'a readable scenario file';
    throw new ScenarioError([{ file: path, path: '', value: path, expected: `${what} (${read.why})` }]);
  }
  const bytes = read.bytes;
  let text = bytes.toString('utf8');
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1); // byte-order mark
  const r = checkScenario(text, path);
  return { net: orThrow(r), text, bytes, warnings: r.warnings, root: r.root! };
}

/** Read a scenario file (JSON or YAML) → Net; throws ScenarioError listing every problem. */
export async function loadScenario(path: string): Promise<Net> {
  return (await readScenario(path)).net;
}
