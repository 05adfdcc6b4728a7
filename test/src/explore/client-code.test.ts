// The linker that turns the page's client modules into one classic script: the import and export forms
// it accepts, what it refuses, and a linked script that runs (in a Node vm context, standing in for the
// page) with each module evaluated once, in dependency order.
import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { ClientLinkError, clientModules, linkModules, moduleBody, moduleImports } from '../../../src/explore/client-code.js';

const run = (script: string): string[] => {
  const log: string[] = [];
  runInNewContext(script, { log: (s: string) => log.push(s) });
  return log;
};

describe('client module linker', () => {
  it('turns named imports into require and exported declarations into exports', () => {
    const body = moduleBody({
      name: './a.js',
      code: "import { f, g as h } from './b.js';\nexport function one() { return f() + h(); }\nexport const TWO = 2;\nexport class Three {}\nexport {};\n",
    });
    expect(body).toContain("const { f, g: h } = require('./b.js');");
    expect(body).toContain('function one()');
    expect(body).not.toMatch(/^export\s/m);
    expect(body).toContain('exports.one = one;');
    expect(body).toContain('exports.TWO = TWO;');
    expect(body).toContain('exports.Three = Three;');
  });

  it('joins import lists the compiler writes over several lines', () => {
    expect(moduleImports("import {\n  a,\n  b,\n} from './x.js';\nimport { c } from './y.js';\n")).toEqual(['./x.js', './y.js']);
  });

  it('refuses forms it cannot link', () => {
    for (const code of ["export default 3;\n", "import * as x from './b.js';\n", "export { a } from './b.js';\n", "import x from './b.js';\n"]) {
      expect(() => moduleBody({ name: './a.js', code })).toThrow(ClientLinkError);
    }
  });

  it('runs each module once, after the modules it imports', () => {
    const script = linkModules(
      [
        { name: './main.js', code: "import { b } from './b.js';\nimport { c } from './c.js';\nlog('main ' + b() + c());\n" },
        { name: './b.js', code: "import { c } from './c.js';\nlog('b');\nexport function b() { return 'B' + c(); }\n" },
        { name: './c.js', code: "log('c');\nexport function c() { return 'C'; }\n" },
      ],
      './main.js',
    );
    expect(run(script)).toEqual(['c', 'b', 'main BCC']);
  });

  it('refuses a missing module and an import cycle', () => {
    expect(() => linkModules([{ name: './main.js', code: "import { x } from './gone.js';\n" }])).toThrow(/gone\.js/);
    expect(() =>
      linkModules([
        { name: './main.js', code: "import { a } from './a.js';\n" },
        { name: './a.js', code: "import { main } from './main.js';\nexport const a = 1;\n" },
      ]),
    ).toThrow(/cycle/);
  });

  it('links every module of the page (compiled from the sources here)', async () => {
    const mods = await clientModules();
    const names = mods.map((m) => m.name);
    expect(names[0]).toBe('./main.js');
    for (const n of ['./chart.js', './cursors.js', './route-map.js', './tables.js', './live.js']) expect(names).toContain(n);
    const script = linkModules(mods);
    expect(script).not.toMatch(/^\s*(import|export)\b/m);
    expect(() => new Function(script)).not.toThrow(); // valid JavaScript
  });
});
