// The watch server without a browser: it binds 127.0.0.1 only, refuses requests addressed to another
// host (a page elsewhere reaching it through a DNS name), serves the page with its event stream, runs
// the scenario again when the file is saved, and on a saved mistake reports the problem with its key
// path while going on watching. Every session here stops by itself within a bounded time.
import { request } from 'node:http';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { startWatch, WATCH_HOST, type WatchSession } from '../../../src/explore/watch.js';
import { SMALL, tempDirs, writeScenario } from '../cli/fixtures.js';

const newDir = tempDirs('lw-watch-');

function get(url: string, host?: string): Promise<{ status: number; type: string; body: string }> {
  return new Promise((ok, fail) => {
    const u = new URL(url);
    const req = request({ hostname: u.hostname, port: u.port, path: u.pathname, headers: host ? { Host: host } : {} }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (body += c));
      res.on('end', () => ok({ status: res.statusCode ?? 0, type: String(res.headers['content-type'] ?? ''), body }));
    });
    req.on('error', fail);
    req.end();
  });
}

/** The first `count` events of the stream (name and parsed data), then the connection is dropped. */
function events(url: string, count: number): Promise<{ event: string; data: any }[]> {
  return new Promise((ok, fail) => {
    const u = new URL('events', url);
    const got: { event: string; data: any }[] = [];
    const req = request({ hostname: u.hostname, port: u.port, path: u.pathname }, (res) => {
      let buf = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => {
        buf += c;
        let k: number;
        while ((k = buf.indexOf('\n\n')) >= 0) {
          const block = buf.slice(0, k);
          buf = buf.slice(k + 2);
          const ev = /^event: (.*)$/m.exec(block)?.[1];
          const data = /^data: (.*)$/m.exec(block)?.[1];
          if (ev && data) got.push({ event: ev, data: JSON.parse(data) });
          if (got.length >= count) {
            req.destroy();
            ok(got);
            return;
          }
        }
      });
    });
    req.on('error', (e) => (got.length >= count ? undefined : fail(e)));
    req.end();
  });
}

describe('watch server', { timeout: 90_000 }, () => {
  it('serves the page on 127.0.0.1, runs on every save, and reports a saved mistake by its key path', async () => {
    const d = newDir();
    const file = writeScenario(d, 'net.json', SMALL);
    let session: WatchSession | undefined;
    try {
      session = await startWatch({ file, outDir: join(d, 'out'), settle: 50, stopAfter: 80_000 });
      expect(session.url).toMatch(new RegExp(`^http://${WATCH_HOST.replace(/\./g, '\\.')}:\\d+/$`));
      expect(session.revision()).toBe(1);
      expect(readFileSync(join(d, 'out', 'explore.html'), 'utf8')).toContain('connect-src &#39;none&#39;'); // the file on disk stays offline

      const page = await get(session.url);
      expect(page.status).toBe(200);
      expect(page.type).toBe('text/html; charset=utf-8');
      expect(page.body).toContain('connect-src &#39;self&#39;');
      expect(page.body).toContain('"live":{"events":"/events","revision":1,"problems":null');

      // another host name for the same address, and other paths, are refused
      expect((await get(session.url, 'attacker.example')).status).toBe(403);
      expect((await get(new URL('probes.csv', session.url).href)).status).toBe(404);

      expect(await events(session.url, 1)).toEqual([{ event: 'run', data: { revision: 1 } }]);

      // a save with a mistake: the problem, with its key path, and the loop goes on
      const next = session.nextRun();
      writeFileSync(file, JSON.stringify({ ...SMALL, route: [{ ...SMALL.route[0], length: '-3in' }] }, null, 2));
      expect(await next).toBe(2);
      const [problems] = await events(session.url, 1);
      expect(problems.event).toBe('problems');
      expect(problems.data.problems).toEqual([expect.objectContaining({ path: 'route[0].length', where: expect.stringMatching(/net\.json:\d+:\d+$/) })]);

      // fixed: runs again
      const fixed = session.nextRun();
      writeFileSync(file, JSON.stringify({ ...SMALL, receiver: { parts: [{ r: '150ohm' }] } }, null, 2));
      expect(await fixed).toBe(3);
      expect(await events(session.url, 1)).toEqual([{ event: 'run', data: { revision: 3 } }]);
    } finally {
      await session?.close();
    }
    await session!.stopped;
  });

  it('stops by itself after its lifetime', async () => {
    const d = newDir();
    const file = writeScenario(d, 'net.json', SMALL);
    const session = await startWatch({ file, outDir: join(d, 'out'), stopAfter: 200 });
    await session.stopped;
    await expect(get(session.url)).rejects.toThrow();
  });
});
