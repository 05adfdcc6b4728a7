import { describe, expect, it } from 'vitest';
import { checkScenario, scenarioFromValue, type Problem } from '../../../src/scenario/load.js';
import { formatProblem } from '../../../src/scenario/problems.js';

// A star of two arms off a trunk, one arm carrying a nested open stub (branches to depth 2).
const TREE = `{
  "title": "greenhouse pump bus",
  "driver": { "signal": { "kind": "step", "from": "0V", "to": "3.3V", "rise": "1ns" }, "resistance": "25ohm" },
  "lines": { "trace": { "z0": "50ohm", "delay": "6ns/m" } },
  "route": [
    { "name": "trunk", "line": "trace", "length": "10cm" },
    { "name": "hub", "branch": [
      { "route": [ { "name": "armA", "line": "trace", "length": "5cm" },
                   { "name": "tp", "branch": { "route": [ { "name": "stub", "line": "trace", "length": "1cm" } ], "receiver": { "name": "testpoint" } } },
                   { "name": "armA2", "line": "trace", "length": "5cm" } ],
        "receiver": { "name": "pumpA", "parts": { "c": "4pF" } } },
      { "route": [ { "name": "armB", "line": "trace", "length": "8cm" } ],
        "receiver": { "name": "pumpB", "parts": [ { "r": "100ohm" } ] } }
    ] },
    { "name": "tail", "line": "trace", "length": "2cm" }
  ],
  "receiver": { "name": "ctrl", "parts": { "c": "3pF" } },
  "probes": [
    { "at": "driver" },
    { "at": "ctrl" },
    { "name": "rxB", "at": "pumpB" },
    { "at": "testpoint" },
    { "name": "mid", "at": "stub", "position": "50%" },
    { "name": "j", "at": "hub" }
  ]
}`;

function problems(src: string): Problem[] {
  const r = checkScenario(src, 'tree.json');
  expect(r.net).toBeUndefined();
  return r.problems;
}

describe('branched routes in the scenario format', () => {
  it('reads a star with a nested stub, named receivers and probes inside branches', () => {
    const r = checkScenario(TREE, 'tree.json');
    expect(r.problems).toEqual([]);
    const net = r.net!;
    expect(net.receiverName).toBe('ctrl');
    expect(net.receiver).toEqual([{ r: 0, l: 0, c: 3e-12, rail: 0 }]);
    const hub = net.route[1];
    expect(hub.kind).toBe('branch');
    if (hub.kind !== 'branch') return;
    expect(hub.branches.map((b) => b.receiver.name)).toEqual(['pumpA', 'pumpB']);
    const tp = hub.branches[0].route[1];
    expect(tp.kind === 'branch' && tp.branches[0].receiver).toEqual({ name: 'testpoint', parts: [] });
    expect(net.probes).toEqual([
      { name: 'driver', at: 'driver' },
      { name: 'ctrl', at: 'receiver' },
      { name: 'rxB', at: 'receiver', receiver: 'pumpB' },
      { name: 'testpoint', at: 'receiver', receiver: 'testpoint' },
      { name: 'mid', at: 'line', item: 'stub', position: 0.005 },
      { name: 'j', at: 'branch', item: 'hub' },
    ]);
  });

  it('probes the driver and every receiver when the file has no probes', () => {
    const value = JSON.parse(TREE);
    delete value.probes;
    const net = scenarioFromValue(value);
    expect(net.probes.map((p) => p.name)).toEqual(['driver', 'ctrl', 'testpoint', 'pumpA', 'pumpB']);
  });

  it('refuses a branch without a route, with file, line:col and key path', () => {
    const src = TREE.replace('"route": [ { "name": "armB", "line": "trace", "length": "8cm" } ],', '"route": [],');
    const [p] = problems(src);
    expect(formatProblem(p)).toMatch(/^tree\.json:12:\d+ route\[1\]\.branch\[1\]\.route: \[\] — expected a non-empty list of route items/);
    const missing = problems(TREE.replace('"route": [ { "name": "armB", "line": "trace", "length": "8cm" } ],', ''));
    expect(missing.map((q) => q.path)).toEqual(['route[1].branch[1].route']);
    expect(missing[0].line).toBe(12);
  });

  it('refuses a receiver name used twice, by another receiver or by an item', () => {
    // (the probe at pumpB, now gone, is reported too)
    const twice = problems(TREE.replace('"name": "pumpB"', '"name": "pumpA"')).filter((q) => !q.path.startsWith('probes'));
    expect(twice.map((q) => [q.path, q.line])).toEqual([['route[1].branch[1].receiver.name', 13]]);
    expect(twice[0].expected).toMatch(/a unique receiver name \("pumpA" is also route\[1\]\.branch\[0\]\.receiver's name\)/);
    const asItem = problems(TREE.replace('"name": "pumpB"', '"name": "armA"'));
    expect(asItem[0].expected).toMatch(/items and receivers share one set of names/);
    expect(problems(TREE.replace('"name": "pumpB"', '"name": "receiver"'))[0].expected).toMatch(/other than "driver" and "receiver"/);
  });

  it('needs every branch receiver to be named', () => {
    const p = problems(TREE.replace('"receiver": { "name": "testpoint" }', '"receiver": {}')).filter((q) => !q.path.startsWith('probes'));
    expect(p.map((q) => q.path)).toEqual(['route[1].branch[0].route[1].branch.receiver.name']);
    expect(p[0].expected).toMatch(/every receiver of a branch has a name/);
  });

  it('refuses a probe at a receiver that does not exist, suggesting the closest name', () => {
    const p = problems(TREE.replace('"at": "pumpB"', '"at": "pumpC"'));
    expect(p.map((q) => q.path)).toEqual(['probes[2].at']);
    expect(p[0].expected).toMatch(/receivers: "testpoint", "pumpA", "pumpB", "ctrl".* did you mean "pumpA"\?/);
  });
});
