// explore.html: one self-contained interactive page. Every script and style is inlined (the charting
// library uPlot with its licence, our own script, the data as JSON), and a content security policy
// forbids every request the page might otherwise make: opened from disk it reaches nothing outside
// itself. Served by a watch server it may talk to that server alone (connect-src 'self').
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { esc } from '../report/html.js';
import { clientScript } from './client-code.js';
import type { PageData } from './payload.js';
import { EXPLORE_CSS } from './style.js';

/** The file name of the page inside an output folder. */
export const EXPLORE_FILE = 'explore.html';

/** The charting library inlined into the page (a dependency in package.json). */
export const CHART_LIBRARY = { name: 'uPlot', package: 'uplot' } as const;

export interface ChartLibrary {
  version: string;
  script: string;
  css: string;
  licence: string;
}

/** uPlot's minified script, its stylesheet and its licence text, read from the installed package (once per process). */
let library: Promise<ChartLibrary> | undefined;
export function chartLibrary(): Promise<ChartLibrary> {
  library ??= readChartLibrary();
  return library;
}

async function readChartLibrary(): Promise<ChartLibrary> {
  const require = createRequire(import.meta.url);
  const file = (p: string) => readFile(require.resolve(`${CHART_LIBRARY.package}/${p}`), 'utf8');
  const [pkg, script, css, licence] = await Promise.all([file('package.json'), file('dist/uPlot.iife.min.js'), file('dist/uPlot.min.css'), file('LICENSE')]);
  return { version: (JSON.parse(pkg) as { version: string }).version, script, css, licence };
}

/** JSON that is safe inside a <script> element: no '<' (so no '</script>'), no line separators. */
export function scriptJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, '\\u003c').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');
}

/** Script text for a <script> element; refuses text that would end the element early. */
function scriptText(code: string, what: string): string {
  if (/<\/script/i.test(code)) throw new Error(`${what} contains '</script' and cannot be inlined`);
  return code;
}

function csp(live: boolean): string {
  return [
    "default-src 'none'",
    "script-src 'unsafe-inline'",
    "style-src 'unsafe-inline'",
    'img-src data:',
    `connect-src ${live ? "'self'" : "'none'"}`,
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

/** The page as HTML text. */
export async function explorePage(data: PageData): Promise<string> {
  const [lib, client] = await Promise.all([chartLibrary(), clientScript()]);
  const title = `${data.title} — explore`;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${esc(csp(data.live !== undefined))}">
<meta name="generator" content="${esc(`${data.tool.name} ${data.tool.version}`)}">
<title>${esc(title)}</title>
<style>${lib.css}</style>
<style>${EXPLORE_CSS}</style>
</head>
<body>
<main id="app" aria-live="polite"><p class="loading">Building the page…</p>
<noscript><p class="problem">This page needs JavaScript for its charts. The same run's numbers are in summary.json and report.html (run with --report).</p></noscript></main>
<footer>
<p>Made by ${esc(data.tool.name)} ${esc(data.tool.version)} from <code>${esc(data.scenarioFile)}</code>. Results are engineering estimates: confirm them by measurement.</p>
<details><summary>Third-party software in this page: ${CHART_LIBRARY.name} ${esc(lib.version)} (MIT licence)</summary><pre class="licence">${esc(lib.licence)}</pre></details>
</footer>
<script id="lw-data" type="application/json">${scriptJson(data)}</script>
<script>${scriptText(lib.script, CHART_LIBRARY.name)}</script>
<script>${scriptText(client, 'the page script')}</script>
</body>
</html>
`;
}
