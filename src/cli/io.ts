// Where the CLI writes. The real CLI uses the process streams; tests pass collectors.
export interface CliIO {
  /** Normal output (stdout): summaries, help, version. */
  out(text: string): void;
  /** Errors and warnings (stderr). */
  err(text: string): void;
}

export const processIO: CliIO = {
  out: (text) => void process.stdout.write(text),
  err: (text) => void process.stderr.write(text),
};
