// The report's look: light, quiet, one column, system fonts, thin rules, verdicts in words and colour.
export const REPORT_CSS = `
:root { --ink: #1f2430; --muted: #5b6472; --rule: #e4e7ec; --panel: #f7f8fa; --accent: #0072B2; --pass: #007a5a; --fail: #b84a00; }
* { box-sizing: border-box; }
body { margin: 0; background: #ffffff; color: var(--ink);
  font: 15px/1.5 "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; }
main { max-width: 1240px; margin: 0 auto; padding: 28px 32px 48px; }
header { border-bottom: 3px solid var(--accent); padding-bottom: 14px; margin-bottom: 8px; }
h1 { font-size: 26px; line-height: 1.25; margin: 0 0 6px; }
h2 { font-size: 19px; margin: 34px 0 10px; padding-bottom: 4px; border-bottom: 1px solid var(--rule); }
h3 { font-size: 16px; margin: 20px 0 8px; }
p { margin: 6px 0 10px; max-width: 80ch; }
.muted, .meta { color: var(--muted); }
.meta { font-size: 13px; margin: 0; }
.meta code { font-size: 12px; }
.description { font-size: 16px; }
.strip { overflow-x: auto; background: var(--panel); border: 1px solid var(--rule); border-radius: 6px; padding: 8px; }
svg.route { display: block; font: 12px "DejaVu Sans", Helvetica, Arial, sans-serif; fill: var(--ink); }
svg.route text.muted { fill: var(--muted); }
figure { margin: 18px 0 26px; }
figure img { display: block; max-width: 100%; height: auto; border: 1px solid var(--rule); border-radius: 4px; }
figcaption { color: var(--muted); font-size: 13px; margin-top: 6px; }
table { border-collapse: collapse; margin: 8px 0 14px; font-size: 13.5px; }
caption { caption-side: bottom; text-align: left; color: var(--muted); font-size: 12.5px; padding-top: 6px; max-width: 100ch; }
th, td { padding: 5px 9px; border-bottom: 1px solid var(--rule); text-align: left; vertical-align: top; }
thead th { border-bottom: 2px solid #c9ced6; font-weight: 600; white-space: nowrap; }
tbody th { font-weight: 600; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
.wide { overflow-x: auto; }
.verdict { font-weight: 700; letter-spacing: 0.04em; }
.verdict.pass { color: var(--pass); }
.verdict.fail { color: var(--fail); }
.tally { font-weight: 600; }
.caution { background: #fff8e6; border: 1px solid #f0d9a0; border-radius: 6px; padding: 10px 16px; }
.caution p, .caution ul { margin: 6px 0; }
ul { margin: 6px 0 10px; padding-left: 22px; }
footer { margin-top: 36px; color: var(--muted); font-size: 12.5px; border-top: 1px solid var(--rule); padding-top: 10px; }
`;
