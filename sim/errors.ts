// Errors the engine raises. Each carries data enough for the application to word one line per problem.

export interface NetProblem {
  /** Key path in the scenario, e.g. `route[2]` or `receiver`, or the item's name. */
  path: string;
  message: string;
}

/** The net cannot be simulated as described (for example an ideal source shorted by a zero-ohm part). */
export class NetError extends Error {
  constructor(readonly problems: NetProblem[]) {
    super(problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
    this.name = 'NetError';
  }
}

/**
 * One size limit a run would exceed, with what would fit. `fit` holds values that would run with
 * everything else unchanged; a field is absent when no such value exists.
 */
export type Overrun =
  | { limit: 'nodes'; needed: number; allowed: number; fit: { cellsPerRise?: number } }
  | { limit: 'cellSteps'; needed: number; allowed: number; steps: number; nodes: number; fit: { duration?: number; cellsPerRise?: number } }
  | { limit: 'recordBytes'; needed: number; allowed: number; probes: number; samples: number; fit: { sample?: number; probes?: number } }
  | { limit: 'lumpedSize'; needed: number; allowed: number; fit: Record<string, never> }
  | { limit: 'fftPoints'; needed: number; allowed: number; samples: number; fit: { samples?: number } }
  | { limit: 'frequencyPoints'; needed: number; allowed: number; fit: { points?: number } };

/** Plain English for an overrun, for library users who print `message`; the CLI words them itself (src/). */
function describe(o: Overrun): string {
  switch (o.limit) {
    case 'nodes':
      return `the net needs ${o.needed} nodes (limit ${o.allowed})`;
    case 'cellSteps':
      return `${o.steps} steps × ${o.nodes} nodes = ${o.needed.toExponential(2)} cell-steps (limit ${o.allowed.toExponential(2)})`;
    case 'recordBytes':
      return `probe records need ${(o.needed / 1024 ** 2).toFixed(0)} MiB (limit ${(o.allowed / 1024 ** 2).toFixed(0)} MiB)`;
    case 'lumpedSize':
      return `a cluster of lumped parts needs a ${o.needed}-unknown matrix (limit ${o.allowed})`;
    case 'fftPoints':
      return `${o.samples} samples need an FFT of ${o.needed} points (limit ${o.allowed})`;
    case 'frequencyPoints':
      return `${o.needed} frequency points (limit ${o.allowed})`;
  }
}

/**
 * The run would exceed size limits (`over` lists each); `force` overrides them. `context` names what
 * was refused when it is not a plain run (a sweep point, the spectral cross-check).
 */
export class RunRefused extends Error {
  constructor(
    readonly over: Overrun[],
    readonly context?: string,
  ) {
    super(`${context ? `${context}: ` : ''}run refused before starting: ${over.map(describe).join('; ')}`);
    this.name = 'RunRefused';
  }
}

/**
 * The time loop met a non-finite value or a runaway growth and stopped: at time `time` (s), at
 * `where` (a probe or node), with the value seen and the likely cause.
 */
export class RunDiverged extends NetError {
  constructor(
    readonly time: number,
    readonly where: string,
    readonly value: number,
    readonly likelyCause: string,
  ) {
    super([{ path: where, message: `the simulation stopped at t = ${time.toExponential(3)} s: ${value} V at ${where}; ${likelyCause}` }]);
    this.name = 'RunDiverged';
  }
}
