// The explore page's look: the report's quiet palette, wide charts, compact toolbars, tables whose
// clickable numbers look like links.
export const EXPLORE_CSS = `
:root { --ink: #1f2430; --muted: #5b6472; --rule: #e4e7ec; --panel: #f7f8fa; --accent: #0072B2; --pass: #007a5a; --fail: #b84a00; }
* { box-sizing: border-box; }
body { margin: 0; background: #ffffff; color: var(--ink); font: 14px/1.45 "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; }
main { max-width: 1400px; margin: 0 auto; padding: 20px 28px 24px; }
header { border-bottom: 3px solid var(--accent); padding-bottom: 10px; margin-bottom: 6px; }
h1 { font-size: 23px; line-height: 1.25; margin: 0 0 4px; }
h2 { font-size: 18px; margin: 28px 0 8px; padding-bottom: 4px; border-bottom: 1px solid var(--rule); }
h3 { font-size: 15px; margin: 16px 0 6px; }
p { margin: 4px 0 8px; }
.meta, .help, .caption, .view-range, .cursor-about, .live-status { color: var(--muted); }
.meta { margin: 0; font-size: 13px; }
.help { font-size: 12.5px; max-width: 120ch; }
.view-range { font-size: 12px; margin: 2px 0 6px; font-variant-numeric: tabular-nums; }
.toolbar { display: flex; flex-wrap: wrap; align-items: center; gap: 8px 14px; margin: 6px 0; }
button, select, input { font: inherit; font-size: 13px; }
button { border: 1px solid #c9ced6; background: #ffffff; border-radius: 4px; padding: 3px 10px; cursor: pointer; color: var(--ink); }
button:hover { background: var(--panel); }
button[aria-pressed="true"].chip { background: #eef4fa; border-color: #9bbad6; }
button[aria-pressed="false"].chip { color: var(--muted); text-decoration: line-through; }
.legend { display: flex; flex-wrap: wrap; gap: 6px; }
.swatch { display: inline-block; width: 12px; height: 12px; border-radius: 2px; margin-right: 6px; vertical-align: -1px; }
.chart { position: relative; }
.chart .u-over { cursor: crosshair; }
.chart .u-over:focus { outline: 2px solid #9bbad6; outline-offset: -2px; }
.cursors { background: var(--panel); border: 1px solid var(--rule); border-radius: 6px; padding: 8px 12px; margin-top: 8px; }
.cursor-fields { display: flex; flex-wrap: wrap; gap: 10px 18px; align-items: center; }
input.invalid { border-color: var(--fail); background: #fff3ec; }
table { border-collapse: collapse; margin: 6px 0 8px; font-size: 13px; }
th, td { padding: 4px 9px; border-bottom: 1px solid var(--rule); text-align: left; vertical-align: top; }
thead th { border-bottom: 2px solid #c9ced6; font-weight: 600; white-space: nowrap; }
tbody th { font-weight: 600; white-space: nowrap; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
.readout { background: #ffffff; }
button.at { border: none; background: none; padding: 0; color: var(--accent); text-decoration: underline dotted; text-underline-offset: 3px; font-variant-numeric: tabular-nums; }
button.at:hover { text-decoration: underline; background: none; }
.verdict { font-weight: 700; letter-spacing: 0.04em; }
.verdict.pass { color: var(--pass); }
.verdict.fail { color: var(--fail); }
.wide { overflow-x: auto; }
.tally { font-weight: 600; }
.slider input { width: 320px; vertical-align: middle; }
output { font-variant-numeric: tabular-nums; }
.path { margin-bottom: 14px; }
.profile-table { font-size: 12px; }
.path details > table { display: block; max-height: 340px; overflow-y: auto; }
details summary { cursor: pointer; color: var(--muted); font-size: 13px; }
.problems { background: #fff3ec; border: 2px solid var(--fail); border-radius: 6px; padding: 6px 16px 10px; margin: 12px 0; }
.problems h2 { border: none; margin: 6px 0; color: var(--fail); }
.problems code { background: #ffffff; border: 1px solid #f0d2c0; border-radius: 3px; padding: 0 4px; margin-right: 6px; }
.problem { color: var(--fail); font-weight: 600; }
.loading { color: var(--muted); }
.points td input { margin: 0; }
.points { max-height: 360px; overflow-y: auto; }
.points td.mark { color: var(--pass); font-weight: 600; }
footer { max-width: 1400px; margin: 0 auto 24px; padding: 10px 28px 0; color: var(--muted); font-size: 12px; border-top: 1px solid var(--rule); }
pre.licence { white-space: pre-wrap; font-size: 11.5px; background: var(--panel); padding: 8px; border-radius: 4px; }
`;
