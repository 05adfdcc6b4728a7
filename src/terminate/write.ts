// The winning option as a scenario file beside the original: "<name>.tamed-<option>.json", or with
// "-2", "-3" … when that name is taken. Opened with O_EXCL, so no existing file is ever overwritten.
// The file is the bare net with the option's parts at their rounded values, and the probes,
// thresholds and checks the advisor judged it by, so `ladderwave check` passes it in CI as it passed here.
import { open } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import type { Advice, OptionResult } from './advise.js';
import { partText } from './report.js';
import { cloneValue } from './raw.js';

/** The best option that adds or changes parts (not the scenario as given). */
export function winner(a: Advice): OptionResult | undefined {
  return a.options.find((o) => o.id !== 'as-given');
}

export function winnerValue(a: Advice, o: OptionResult): Record<string, unknown> {
  const v = cloneValue(o.value);
  const title = typeof a.original.title === 'string' ? a.original.title : a.title;
  v.title = `${title} — ${o.title} ${partText(o)}`;
  const why = `Termination chosen by ladderwave tame (${a.objective.text}; ${a.series} values) from ${basename(a.file)}.`;
  v.description = typeof a.original.description === 'string' ? `${a.original.description} ${why}` : why;
  return v;
}

/** Writes the winner beside the scenario; returns the path written. */
export async function writeWinner(a: Advice, o: OptionResult, dir = dirname(a.file)): Promise<string> {
  const b = basename(a.file);
  const ext = extname(b);
  const stem = ext && ext !== b ? b.slice(0, -ext.length) : b;
  const text = JSON.stringify(winnerValue(a, o), null, 2) + '\n';
  for (let k = 1; k < 1000; k++) {
    const path = join(dir, `${stem}.tamed-${o.id}${k === 1 ? '' : `-${k}`}.json`);
    try {
      const h = await open(path, 'wx');
      try {
        await h.writeFile(text);
      } finally {
        await h.close();
      }
      return path;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    }
  }
  throw new Error(`no free file name for the winning scenario beside ${a.file}`);
}
