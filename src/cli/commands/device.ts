// `ladderwave device MODEL_FILE [--model NAME | --component NAME --pin PIN] [--corner typ|min|max] [--out DIR]`
//
// Prints a buffer model of an IBIS file (the open I/O buffer model standard): its numbers, warnings and
// ignored parts, its I/V tables in the pin's frame, and its switching waveforms beside the model's own
// reproduction into their fixtures; writes iv.png and waveforms.png.
import type { Command } from 'commander';
import { join } from 'node:path';
import { deviceReport, formatDeviceReport, ivPlot, waveformPlot } from '../../device-report/index.js';
import { examples } from '../help.js';
import { ibisBuffer, loadIbisFile, IbisError, type Corner, type IbisSelection } from '../../ibis/index.js';
import { writeOutputFolder, type FolderEntry } from '../../output/folder.js';
import type { CliContext } from '../context.js';
import { describeFailure, EXIT, UsageError, type ExitCode } from '../../exit-codes.js';

/** Files the device command writes in its output folder. */
export const DEVICE_FILES = { iv: 'iv.png', waveforms: 'waveforms.png' } as const;

export interface DeviceCommandOptions {
  model?: string;
  component?: string;
  pin?: string;
  corner?: string;
  out?: string;
  plots?: boolean;
  quiet?: boolean;
}

function selection(opts: DeviceCommandOptions, models: string[]): IbisSelection {
  if (opts.model !== undefined) {
    if (opts.component !== undefined || opts.pin !== undefined) throw new UsageError('give either --model, or --component with --pin, not both');
    return { model: opts.model };
  }
  if (opts.component !== undefined || opts.pin !== undefined) {
    if (opts.component === undefined || opts.pin === undefined) throw new UsageError('--component and --pin go together');
    return { component: opts.component, pin: opts.pin };
  }
  if (models.length === 1) return { model: models[0] };
  throw new UsageError(`the file has ${models.length} models (${models.map((m) => `"${m}"`).join(', ')}): choose one with --model, or a pin with --component and --pin`);
}

export async function deviceCommand(file: string, opts: DeviceCommandOptions, ctx: CliContext): Promise<ExitCode> {
  const { io } = ctx;
  try {
    const corner = (opts.corner ?? 'typ') as Corner;
    if (!['typ', 'min', 'max'].includes(corner)) throw new UsageError(`--corner "${opts.corner}": expected typ, min or max`);
    const data = await loadIbisFile(file);
    let buffer;
    try {
      buffer = ibisBuffer(data, selection(opts, [...data.models.keys()]), corner);
    } catch (e) {
      if (e instanceof RangeError) throw new UsageError(e.message);
      throw e;
    }
    const report = deviceReport(buffer);
    io.out(formatDeviceReport(report, !opts.quiet));
    if (opts.plots !== false) {
      const dir = opts.out ?? join('out', `device-${buffer.data.name}-${corner}`);
      // One folder replaced as a whole, like every command's (src/output/folder.ts).
      const entries: FolderEntry[] = [{ path: DEVICE_FILES.iv, data: await ivPlot(report) }];
      if (report.waveforms.length) entries.push({ path: DEVICE_FILES.waveforms, data: await waveformPlot(report) });
      for (const f of await writeOutputFolder(dir, entries)) io.out(`wrote ${f}\n`);
    }
    return EXIT.ok;
  } catch (e) {
    if (e instanceof IbisError) {
      io.err(e.problems.length > 1 ? `${file}: ${e.problems.length} problems\n` : '');
      io.err(e.message + '\n');
      return EXIT.badInput;
    }
    const f = describeFailure(e);
    io.err(f.lines.map((l) => `${e instanceof UsageError ? 'ladderwave device: ' : ''}${l}\n`).join(''));
    return f.code;
  }
}

export function registerDeviceCommand(program: Command, ctx: CliContext): void {
  program
    .command('device')
    .summary('print and plot a buffer model of an IBIS file: I/V tables and switching waveforms')
    .description(
      'Read a model file of the open I/O buffer model standard (IBIS, ANSI/EIA-656; the subset in docs/devices.md) ' +
        'and print one model (or the model of one component pin) at a corner: its supply, C_comp, package, ' +
        'warnings and the parts of the file not used, its I/V tables as current into the pin against pin voltage, ' +
        'and its switching waveforms beside the model\'s own run into the same fixtures. Writes iv.png and ' +
        'waveforms.png to --out (default out/device-MODEL-CORNER).\n' +
        'Exit codes: 0 ok, 2 bad input or usage (a malformed file lists every problem with its line), 1 internal error.',
    )
    .addHelpText('after', examples(['ladderwave device scenarios/models/orchard_sram.ibs --model dq_io --corner max']))
    .argument('<file>', 'IBIS model file (.ibs)')
    .option('-m, --model <name>', 'the [Model] to show')
    .option('-c, --component <name>', 'the [Component] whose pin to show (with --pin: uses the pin\'s package R/L/C)')
    .option('-p, --pin <pin>', 'the pin name under [Pin]')
    .option('--corner <corner>', 'typ, min (slow, weak) or max (fast, strong)', 'typ')
    .option('-o, --out <dir>', 'folder for iv.png and waveforms.png')
    .option('--no-plots', 'print only, write no pictures')
    .option('-q, --quiet', 'do not list the ignored parts of the file')
    .action(async (file: string, opts: DeviceCommandOptions) => {
      ctx.exitCode = await deviceCommand(file, opts, ctx);
    });
}
