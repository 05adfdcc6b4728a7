// The tool's name and version, read from the package's own package.json. The file is found by
// walking up from this module: `src/output/` when run from source, `dist/src/output/` when built.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export interface ToolInfo {
  name: string;
  version: string;
}

let cached: ToolInfo | undefined;

export function toolInfo(): ToolInfo {
  if (cached) return cached;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    try {
      const pkg = JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) as { name?: string; version?: string };
      if (pkg.name === 'ladderwave' && typeof pkg.version === 'string') {
        cached = { name: pkg.name, version: pkg.version };
        return cached;
      }
    } catch {
      // no package.json here; keep walking up
    }
    const up = dirname(dir);
    if (up === dir) throw new Error('ladderwave: cannot find its own package.json');
    dir = up;
  }
}
