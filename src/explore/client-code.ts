// The explore page's own script, as one text to inline into the page.
//
// The script is written as small TypeScript modules in src/explore/client/ (type-checked against the
// DOM by tsconfig.client.json, compiled by `npm run build` next to this file's compiled form). A page
// cannot load modules from files without a network request, so the modules are linked here into one
// classic script: each module becomes a function of (require, exports), called once on first use.
// The linker understands only the forms the client modules use and refuses anything else:
//   import { a, b as c } from './x.js';      export function f …   export const X …   export class C …
// When running from the TypeScript sources (tests, tsx) the modules are compiled in memory with the
// TypeScript compiler (a development dependency), with the options of tsconfig.client.json.
import { readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';

/** The module the page starts from. */
export const CLIENT_ENTRY = './main.js';

/** A client module the linker cannot turn into a function (an unsupported import or export form). */
export class ClientLinkError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ClientLinkError';
  }
}

export interface ModuleSource {
  /** The specifier the module is imported by, relative to the client folder: './plot.js'. */
  name: string;
  /** Its compiled JavaScript (an ES module). */
  code: string;
}

const IMPORT_LINE = /^import\s*\{([^}]*)\}\s*from\s*'(\.\/[\w-]+\.js)';\s*$/;
const SIDE_EFFECT_IMPORT = /^import\s*'(\.\/[\w-]+\.js)';\s*$/;
const EXPORT_DECL = /^export\s+((?:async\s+)?function\*?|const|let|class)\s+([A-Za-z_$][\w$]*)/;

/** The code with every `import { … } from '…';` on one line (the compiler keeps long lists on several). */
function joinImportLines(code: string): string {
  return code.replace(/^import\s*\{([^}]*)\}\s*from\s*('[^']*');/gm, (_, names: string, from: string) => `import { ${names.replace(/\s+/g, ' ').trim()} } from ${from};`);
}

/** The specifiers a module imports (relative, in the client folder). */
export function moduleImports(code: string): string[] {
  const out: string[] = [];
  for (const line of joinImportLines(code).split('\n')) {
    const m = IMPORT_LINE.exec(line) ?? SIDE_EFFECT_IMPORT.exec(line);
    if (m) out.push(m[m.length - 1]!);
  }
  return out;
}

/** One module's code as the body of a function (require, exports). */
export function moduleBody(mod: ModuleSource): string {
  const exported: string[] = [];
  const lines = joinImportLines(mod.code).split('\n').map((line, i) => {
    const where = `${mod.name}:${i + 1}`;
    if (/^\s*\/\/# sourceMappingURL=/.test(line)) return '';
    const imp = IMPORT_LINE.exec(line);
    if (imp) {
      const names = imp[1]!
        .split(',')
        .map((s) => s.trim())
        .filter(Boolean)
        .map((s) => {
          const m = /^([A-Za-z_$][\w$]*)(?:\s+as\s+([A-Za-z_$][\w$]*))?$/.exec(s);
          if (!m) throw new ClientLinkError(`${where}: cannot link the import '${s}'`);
          return m[2] ? `${m[1]}: ${m[2]}` : m[1];
        });
      return `const { ${names.join(', ')} } = require('${imp[2]}');`;
    }
    const side = SIDE_EFFECT_IMPORT.exec(line);
    if (side) return `require('${side[1]}');`;
    if (/^export\s*\{\s*\};?\s*$/.test(line)) return '';
    const exp = EXPORT_DECL.exec(line);
    if (exp) {
      exported.push(exp[2]!);
      return line.replace(/^export\s+/, '');
    }
    if (/^\s*(import|export)\b/.test(line)) throw new ClientLinkError(`${where}: cannot link '${line.trim().slice(0, 60)}' (use named imports and exported declarations only)`);
    return line;
  });
  return lines.join('\n') + '\n' + exported.map((n) => `exports.${n} = ${n};`).join('\n');
}

/**
 * Links modules into one classic script that runs `entry`. Every module must be given; an import of a
 * missing module or a cycle is a ClientLinkError (nothing in the page may depend on evaluation order
 * beyond plain imports).
 */
export function linkModules(modules: readonly ModuleSource[], entry = CLIENT_ENTRY): string {
  const byName = new Map(modules.map((m) => [m.name, m]));
  // depth-first from the entry: every import present, no cycle
  const state = new Map<string, 'open' | 'done'>();
  const visit = (name: string, from: string): void => {
    const mod = byName.get(name);
    if (!mod) throw new ClientLinkError(`${from} imports ${name}, which is not among the client modules`);
    if (state.get(name) === 'done') return;
    if (state.get(name) === 'open') throw new ClientLinkError(`import cycle through ${name}`);
    state.set(name, 'open');
    for (const dep of moduleImports(mod.code)) visit(dep, name);
    state.set(name, 'done');
  };
  visit(entry, 'the page');
  const defs = modules
    .filter((m) => state.has(m.name))
    .map((m) => `${JSON.stringify(m.name)}: function (require, exports) {\n'use strict';\n${moduleBody(m)}\n}`)
    .join(',\n');
  return (
    `(function () {\n'use strict';\nconst defs = {\n${defs}\n};\nconst done = Object.create(null);\n` +
    `function require(name) {\n  if (!(name in done)) { done[name] = {}; defs[name](require, done[name]); }\n  return done[name];\n}\n` +
    `require(${JSON.stringify(entry)});\n})();\n`
  );
}

/** The client folder next to this module (src/explore/client or dist/src/explore/client). */
function clientFolder(): URL {
  return new URL('./client/', import.meta.url);
}

async function compiledModule(name: string, fromSource: boolean): Promise<ModuleSource> {
  const base = name.replace(/^\.\//, '').replace(/\.js$/, '');
  if (!fromSource) return { name, code: await readFile(new URL(`${base}.js`, clientFolder()), 'utf8') };
  const file = new URL(`${base}.ts`, clientFolder());
  const ts = (await import('typescript')).default;
  const out = ts.transpileModule(await readFile(file, 'utf8'), {
    fileName: fileURLToPath(file),
    compilerOptions: { target: ts.ScriptTarget.ES2022, module: ts.ModuleKind.ES2022, removeComments: true, sourceMap: false },
    reportDiagnostics: false,
  });
  return { name, code: out.outputText };
}

/** The modules reachable from the entry, read from the compiled files (or compiled from the sources). */
export async function clientModules(entry = CLIENT_ENTRY): Promise<ModuleSource[]> {
  const fromSource = import.meta.url.endsWith('.ts');
  const found = new Map<string, ModuleSource>();
  const queue = [entry];
  while (queue.length) {
    const name = queue.shift()!;
    if (found.has(name)) continue;
    const mod = await compiledModule(name, fromSource);
    found.set(name, mod);
    queue.push(...moduleImports(mod.code));
  }
  return [...found.values()];
}

/** The page's script: the client modules linked into one (cached per process: the files do not change). */
let cached: Promise<string> | undefined;
export function clientScript(): Promise<string> {
  cached ??= clientModules().then((mods) => linkModules(mods));
  return cached;
}
