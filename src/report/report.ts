// report.html: one self-contained page per run — the scenario, its route as a schematic strip, the
// views (PNG, inlined as data: URIs), measurements, check verdicts, the discretization and the model's
// limits. No scripts, no external resources (a content security policy forbids them), all text escaped.
import type { Net } from '../../sim/model.js';
import { attr, esc } from './html.js';
import { pngSize } from './png-size.js';
import { routeSvg } from './schematic.js';
import { REPORT_CSS } from './style.js';
import { checksTable, discretizationTables, eyeTable, measurementTable, receiversTable, type ReportSummary } from './tables.js';
import { isBranched } from '../../sim/route-tree.js';

export interface ReportImage {
  /** Heading shown above the image. */
  title: string;
  /** File name of the same image in the output folder. */
  file: string;
  png: Uint8Array;
  caption?: string;
}

export interface ReportInput {
  net: Net;
  /** summary.json as written (parse the JSON text, so the page shows exactly what the file holds). */
  summary: ReportSummary;
  images: readonly ReportImage[];
  /** Animation frames written beside the report, if any. */
  frames?: { count: number; folder: string };
}

/** The file name of the report inside the output folder. */
export const REPORT_FILE = 'report.html';

const CSP = "default-src 'none'; img-src data:; style-src 'unsafe-inline'";

function figure(img: ReportImage): string {
  const { width, height } = pngSize(img.png);
  const b64 = Buffer.from(img.png.buffer, img.png.byteOffset, img.png.byteLength).toString('base64');
  const caption = `${img.caption ? img.caption + ' ' : ''}File: ${img.file} (${width} × ${height} pixels).`;
  return (
    `<figure><h3>${esc(img.title)}</h3>` +
    `<img src="data:image/png;base64,${b64}" width="${width}" height="${height}" alt="${attr(img.title)}" data-file="${attr(img.file)}">` +
    `<figcaption>${esc(caption)}</figcaption></figure>`
  );
}

function limitsSection(): string {
  return `<section id="limits"><h2>Limits and cautions</h2><div class="caution">
<p><strong>These results are engineering estimates.</strong> They are only as good as the line and part values put into
the scenario, and must be confirmed by measurement and by the judgement of the designer responsible for the board.</p>
<ul>
<li>Covered: single-ended, uniform line segments with constant R′, L′, G′, C′ or with frequency-dependent loss fitted
over the run’s band; chains of segments, series and shunt parts (R, L, C); branched nets (T-junctions, stars, daisy chains,
open stubs of any length, each branch ending at a receiver); a linear Thevenin driver; linear receivers made of parts.</li>
<li>Not covered: coupled lines and crosstalk; differential pairs as pairs; non-linear drivers and receivers (no I/V
tables, no clamp diodes); loops (a ring of lines); radiation; the return path is ideal.</li>
<li>The time step and cell lengths are listed above. On lossy or Courant &lt; 1 segments the numerical solution carries
a small dispersion error that shrinks as the cells get shorter (raise <code>cellsPerRise</code> to check).</li>
<li>Eye height and eye width are noise-free: no jitter, crosstalk or receiver noise is included, so a real eye is
smaller.</li>
</ul></div></section>`;
}

/** The whole page as a string. */
export function buildReport(input: ReportInput): string {
  const { net, summary } = input;
  const title = net.title || '(untitled scenario)';
  const sc = summary.scenario ?? {};
  const tool = summary.tool ?? {};
  const meta = [
    sc.file ? `Scenario <code>${esc(sc.file)}</code>` : '',
    sc.sha256 ? `SHA-256 <code>${esc(sc.sha256.slice(0, 16))}…</code>` : '',
    tool.version ? `${esc(tool.name ?? 'ladderwave')} ${esc(tool.version)}` : '',
  ]
    .filter(Boolean)
    .join(' · ');

  const parts: string[] = [];
  parts.push(
    `<header><h1>${esc(title)}</h1>${meta ? `<p class="meta">${meta}</p>` : ''}</header>` +
      (net.description ? `<p class="description">${esc(net.description)}</p>` : ''),
  );
  parts.push(`<section id="route"><h2>Route</h2><div class="strip">${routeSvg(net)}</div>
<p class="muted">From the driver pin (left) to the receiver (right)${isBranched(net) ? '; each branch’s side route is drawn in a row of its own below its branch point, ending at its receiver' : ''}. TD is each segment’s one-way delay at high frequency.
Z0 is √(L′/C′) for a line of constant R′, L′, G′, C′; for a line with frequency-dependent loss it is the quasi-static value
at the frequency shown (the one its description is given at), with R′ at the same frequency, and Z0∞ is its high-frequency limit
(the same figures as <code>ladderwave line</code> and summary.json).</p></section>`);

  const checks = checksTable(summary);
  if (checks) {
    const verdict = checks.failed === 0 ? '<span class="verdict pass">PASS</span>' : '<span class="verdict fail">FAIL</span>';
    parts.push(
      `<section id="checks-section"><h2>Checks</h2><p class="tally">${verdict} — ${checks.passed} passed, ${checks.failed} failed.</p>` +
        `<div class="wide">${checks.html}</div></section>`,
    );
  }

  const receivers = receiversTable(summary);
  if (receivers) {
    parts.push(
      `<section id="receivers-section"><h2>Receivers</h2><div class="wide">${receivers}</div>` +
        `<p class="muted">A probe added for the run is not in probes.csv; its measurements are in summary.json under "receivers".</p></section>`,
    );
  }
  const m = measurementTable(summary);
  parts.push(`<section id="measurements-section"><h2>Measurements</h2><div class="wide">${m.html}</div></section>`);
  const eye = eyeTable(summary);
  if (eye) parts.push(`<section id="eye-section"><h2>Eye</h2>${eye}</section>`);

  if (input.images.length) {
    parts.push(`<section id="views"><h2>Views</h2>${input.images.map(figure).join('')}</section>`);
  }
  if (input.frames && input.frames.count > 0) {
    parts.push(
      `<p class="muted">${input.frames.count} animation frame${input.frames.count === 1 ? '' : 's'} of the voltage along the route are in <code>${esc(input.frames.folder)}/</code>.</p>`,
    );
  }
  parts.push(`<section id="discretization-section"><h2>Discretization</h2>${discretizationTables(summary)}</section>`);
  parts.push(limitsSection());

  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${attr(CSP)}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} — ladderwave report</title>
<style>${REPORT_CSS}</style>
</head>
<body><main>
${parts.join('\n')}
<footer>Written by ${esc(tool.name ?? 'ladderwave')}${tool.version ? ' ' + esc(tool.version) : ''}. This page is self-contained: its images are inlined and it runs no scripts. The numbers above are read from summary.json in the same folder.</footer>
</main></body>
</html>
`;
}
