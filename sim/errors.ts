// Errors the engine raises. Both carry enough for the application to print one line per problem.

export interface NetProblem {
  /** Key path in the scenario, e.g. `route[2]` or `receiver`. */
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

/** The run would exceed a size limit; `force` overrides. */
export class RunRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'RunRefused';
  }
}
