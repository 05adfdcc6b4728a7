// The `ladderwave` command line: commander setup shared by all commands, and the mapping of
// commander's own usage errors onto exit code 2. Each command lives in commands/<name>.ts and
// registers itself here.
import { Command, CommanderError } from 'commander';
import { toolInfo } from '../output/tool.js';
import { registerLineCommand } from './commands/line.js';
import { registerDeviceCommand } from './commands/device.js';
import { registerRunCommand } from './commands/run.js';
import { registerTdrCommand } from './commands/tdr.js';
import { registerEyeCommand } from './commands/eye.js';
import { registerCheckCommand } from './commands/check.js';
import { registerSweepCommand } from './commands/sweep.js';
import { registerMergeCommand } from './commands/merge.js';
import { registerSparamsCommand } from './commands/sparams.js';
import { registerTameCommand } from './commands/tame.js';
import type { CliContext } from './context.js';
import { EXIT, type ExitCode } from '../exit-codes.js';
import { processIO, type CliIO } from './io.js';
import type { RunLimits } from '../../sim/limits.js';

export function createProgram(ctx: CliContext): Command {
  const program = new Command('ladderwave')
    .description('Time-domain simulation of pulses and digital edges on transmission lines (RLGC ladder, leapfrog FDTD).')
    .version(toolInfo().version, '-V, --version', 'print the version')
    .helpOption('-h, --help', 'show help')
    .helpCommand('help [command]', 'show help for a command')
    .showHelpAfterError('(add --help for usage)')
    // Commander must not exit the process itself: runCli maps its errors onto our exit codes.
    // These settings are inherited by the commands registered below.
    .exitOverride()
    .configureOutput({
      writeOut: (s) => ctx.io.out(s),
      writeErr: (s) => ctx.io.err(s),
    });
  registerRunCommand(program, ctx);
  registerTdrCommand(program, ctx);
  registerEyeCommand(program, ctx);
  registerLineCommand(program, ctx);
  registerDeviceCommand(program, ctx);
  registerCheckCommand(program, ctx);
  registerSweepCommand(program, ctx);
  registerMergeCommand(program, ctx);
  registerSparamsCommand(program, ctx);
  registerTameCommand(program, ctx);
  return program;
}

export interface RunCliOptions {
  io?: CliIO;
  onInterrupt?: CliContext['onInterrupt'];
  /** Lower advisory size limits than the defaults (embedding, tests); --force still lifts them. */
  limits?: Partial<RunLimits>;
}

/** Runs the CLI on `args` (without the node and script paths) and returns the exit code. */
export async function runCli(args: readonly string[], options: RunCliOptions = {}): Promise<ExitCode> {
  const ctx: CliContext = { io: options.io ?? processIO, exitCode: EXIT.ok, onInterrupt: options.onInterrupt, limits: options.limits };
  const program = createProgram(ctx);
  try {
    await program.parseAsync([...args], { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) {
      // --help and --version end with exit code 0; every other commander error is a usage error
      // (unknown option or command, missing argument, no command given).
      return e.exitCode === 0 ? EXIT.ok : EXIT.badInput;
    }
    throw e;
  }
  return ctx.exitCode;
}
