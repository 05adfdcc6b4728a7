// explore.html as text: self-contained (the charting library, its MIT licence and our script inlined), a
// content security policy that forbids every request (connect-src 'none' unless served by a watch
// server), and the scenario's text carried as data, never as markup — a title with '</script>' in it
// cannot end the data element.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { explorePage, EXPLORE_FILE } from '../../../src/explore/page.js';
import { runScenarioFile } from '../../../src/output/run.js';
import { SMALL, tempDirs, writeScenario } from '../cli/fixtures.js';

const newDir = tempDirs('lw-explore-page-');
const TITLE = 'Line </script><script>alert(1)</script> & "quotes"';

/** One run for the whole file. */
let made: ReturnType<typeof makePage> | undefined;
const page = () => (made ??= makePage());

async function makePage() {
  const d = newDir();
  const file = writeScenario(d, 'small.json', { ...SMALL, title: TITLE });
  const report = await runScenarioFile(file, join(d, 'out'), { explore: true });
  return { report, html: readFileSync(join(d, 'out', EXPLORE_FILE), 'utf8') };
}

describe('explore.html', () => {
  it('is written beside the other outputs, before summary.json, with the map recorded', async () => {
    const { report } = await page();
    expect(report.files.map((f) => f.split('/').pop())).toEqual(['probes.csv', 'waveforms.png', EXPLORE_FILE, 'summary.json']);
    expect(report.exploreData?.run?.map).not.toBeNull();
  });

  it('inlines everything and allows no request', async () => {
    const { html } = await page();
    expect(html).toMatch(/<meta http-equiv="Content-Security-Policy" content="default-src &#39;none&#39;;[^"]*connect-src &#39;none&#39;/);
    expect(html).not.toMatch(/<(script|link|img)[^>]+(src|href)=/i);
    expect(html).toContain('Permission is hereby granted, free of charge'); // uPlot's MIT licence text
    expect(html).toContain('/*! https://github.com/leeoniya/uPlot (v1.6.32) */');
  });

  it('carries the scenario text as data only', async () => {
    const { html, report } = await page();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts).toEqual(['<script id="lw-data" type="application/json">', '<script>', '<script>']);
    const json = /<script id="lw-data" type="application\/json">([\s\S]*?)<\/script>/.exec(html)![1];
    const data = JSON.parse(json);
    expect(data.title).toBe(TITLE);
    expect(data).toEqual(JSON.parse(JSON.stringify(report.exploreData)));
    expect(html).toContain(`<title>Line &lt;/script&gt;&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;quotes&quot; — explore</title>`);
  });

  it('lets a watch server’s page talk to that server only', async () => {
    const { report } = await page();
    const html = await explorePage({ ...report.exploreData!, live: { events: '/events', revision: 1, problems: null, failedAt: null } });
    expect(html).toMatch(/connect-src &#39;self&#39;/);
  });
});
