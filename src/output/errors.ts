// The error of the output writers (exit code 2).

/** The outputs could not be written (a file in the way, a folder not writable, a full disk...). */
export class OutputError extends Error {
  constructor(message: string, cause?: unknown) {
    super(message, { cause });
    this.name = 'OutputError';
  }
}

/**
 * A request the scenario cannot satisfy, such as an eye of a step signal or a TDR step too slow to
 * read the route (exit 2, like bad input).
 */
export class RequestError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'RequestError';
  }
}
