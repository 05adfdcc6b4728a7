// Watch mode: run a scenario, serve its explore page on 127.0.0.1, and run it again whenever the file
// is saved. The page listens to the server's event stream: it reloads after a run, and shows the
// saved file's problems (file, line:column, key path) over the last good result when a run fails —
// the loop goes on either way. Outputs are written by the run pipeline as usual (atomically).
//
// The server binds 127.0.0.1 only, answers only requests whose Host is that address (or localhost)
// and its port, and serves two paths: / (the page) and /events (the event stream).
import { watch, type FSWatcher } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { basename, dirname, resolve } from 'node:path';
import { NetError, RunRefused } from '../../sim/errors.js';
import { OutputError, runScenarioFile, type RunOptions, type RunReport } from '../output/run.js';
import { ScenarioError, showValue } from '../scenario/problems.js';
import { toolInfo } from '../output/tool.js';
import { explorePage } from './page.js';
import type { LiveData, LiveProblem, PageData } from './payload.js';

export const WATCH_HOST = '127.0.0.1';

export interface WatchOptions {
  file: string;
  outDir: string;
  /** Port on 127.0.0.1; 0 (default) takes any free one. */
  port?: number;
  /** The run's options (views, report, size limits…); the explore page is always written. */
  run?: Omit<RunOptions, 'explore'>;
  /** Quiet time after a change before running (ms; editors write a file in several steps). Default 150. */
  settle?: number;
  /** Stop by itself after this long (ms); default: run until close(). */
  stopAfter?: number;
  /** Told about every run and every stop (the CLI prints them). */
  onEvent?: (e: WatchEvent) => void;
}

export type WatchEvent =
  | { kind: 'listening'; url: string }
  | { kind: 'ran'; revision: number; report: RunReport }
  | { kind: 'failed'; revision: number; problems: LiveProblem[]; error: unknown }
  | { kind: 'stopped'; reason: 'closed' | 'time' };

export interface WatchSession {
  /** http://127.0.0.1:PORT/ */
  url: string;
  /** Runs finished so far (good or not). */
  revision(): number;
  /** Resolves after the next run finishes (for tests and tools). */
  nextRun(): Promise<number>;
  /** Stops watching and serving; resolves when everything is closed. */
  close(): Promise<void>;
  /** Resolves when the session has stopped (close(), or stopAfter). */
  stopped: Promise<void>;
}

/** The problems of a failed run as the page lists them. */
export function liveProblems(e: unknown, file: string): LiveProblem[] {
  if (e instanceof ScenarioError) {
    return e.problems.map((p) => ({
      where: p.line !== undefined ? `${p.file}:${p.line}:${p.col ?? 1}` : p.file,
      path: p.path,
      message: `${p.path === '' && typeof p.value === 'string' ? `\`${p.value}\`` : showValue(p.value)} — expected ${p.expected}`,
    }));
  }
  if (e instanceof NetError) return e.problems.map((p) => ({ where: file, path: p.path, message: p.message }));
  if (e instanceof RunRefused || e instanceof OutputError) return [{ where: file, path: '', message: e.message }];
  return [{ where: file, path: '', message: `internal error (a bug in ladderwave): ${e instanceof Error ? e.message : String(e)}` }];
}

/** A page with nothing but the problems, for a scenario that has never run. */
function emptyPage(file: string): PageData {
  const tool = toolInfo();
  return { format: 1, kind: 'run', title: basename(file), scenarioFile: file, tool: { name: tool.name, version: tool.version }, notes: [], traceColors: [] };
}

/** Whether a request is for this server by its own address (a page elsewhere cannot reach it through DNS tricks). */
function ownHost(req: IncomingMessage, port: number): boolean {
  const host = req.headers.host ?? '';
  return host === `${WATCH_HOST}:${port}` || host === `localhost:${port}`;
}

export async function startWatch(opts: WatchOptions): Promise<WatchSession> {
  const file = opts.file;
  const settle = opts.settle ?? 150;
  let revision = 0;
  let good: PageData | null = null;
  let problems: LiveProblem[] | null = null;
  let failedAt: number | null = null;
  let running = false;
  let again = false;
  let closed = false;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const clients = new Set<ServerResponse>();
  const waiting: ((r: number) => void)[] = [];
  let markStopped!: () => void;
  const stopped = new Promise<void>((r) => (markStopped = r));

  const live = (): LiveData => ({ events: '/events', revision, problems, failedAt });
  const send = (res: ServerResponse, event: string, data: unknown) => res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
  const broadcast = (event: string, data: unknown) => clients.forEach((c) => send(c, event, data));
  const state = (res: ServerResponse) => (problems ? send(res, 'problems', { revision, problems, failedAt }) : send(res, 'run', { revision }));

  async function runOnce(): Promise<void> {
    if (running) {
      again = true;
      return;
    }
    running = true;
    broadcast('busy', {});
    try {
      do {
        again = false;
        try {
          const report = await runScenarioFile(file, opts.outDir, { ...opts.run, explore: true });
          good = report.exploreData ?? null;
          problems = null;
          failedAt = null;
          revision++;
          opts.onEvent?.({ kind: 'ran', revision, report });
          broadcast('run', { revision });
        } catch (e) {
          problems = liveProblems(e, file);
          failedAt = Date.now();
          revision++;
          opts.onEvent?.({ kind: 'failed', revision, problems, error: e });
          broadcast('problems', { revision, problems, failedAt });
        }
        waiting.splice(0).forEach((f) => f(revision));
      } while (again && !closed);
    } finally {
      running = false;
    }
  }

  async function page(res: ServerResponse): Promise<void> {
    const html = await explorePage({ ...(good ?? emptyPage(file)), live: live() });
    res.writeHead(200, { 'Content-Type': 'text/html; charset=utf-8', 'Cache-Control': 'no-store', 'X-Content-Type-Options': 'nosniff' });
    res.end(html);
  }

  function events(req: IncomingMessage, res: ServerResponse): void {
    res.writeHead(200, { 'Content-Type': 'text/event-stream', 'Cache-Control': 'no-store', Connection: 'keep-alive' });
    res.write('retry: 1000\n\n');
    clients.add(res);
    state(res);
    req.on('close', () => clients.delete(res));
  }

  const server: Server = createServer((req, res) => {
    const port = (server.address() as AddressInfo).port;
    if (!ownHost(req, port) || req.method !== 'GET') {
      res.writeHead(403, { 'Content-Type': 'text/plain' }).end('forbidden\n');
      return;
    }
    const path = (req.url ?? '/').split('?')[0];
    if (path === '/') {
      page(res).catch((e: unknown) => res.writeHead(500, { 'Content-Type': 'text/plain' }).end(`cannot build the page: ${(e as Error).message}\n`));
    } else if (path === '/events') {
      events(req, res);
    } else {
      res.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found\n');
    }
  });
  await new Promise<void>((ok, fail) => {
    server.once('error', fail);
    server.listen(opts.port ?? 0, WATCH_HOST, () => ok());
  });
  const url = `http://${WATCH_HOST}:${(server.address() as AddressInfo).port}/`;

  // Editors save by writing in place or by writing a new file and renaming it: watch the folder, filter by name.
  const target = basename(file);
  const watcher: FSWatcher = watch(dirname(resolve(file)), (_event, name) => {
    if (closed || (name !== null && name !== target)) return;
    clearTimeout(timer);
    timer = setTimeout(() => void runOnce(), settle);
  });
  const keepAlive = setInterval(() => clients.forEach((c) => c.write(': still here\n\n')), 15_000);
  const lifetime = opts.stopAfter !== undefined ? setTimeout(() => void stop('time'), opts.stopAfter) : undefined;

  async function stop(reason: 'closed' | 'time'): Promise<void> {
    if (closed) return stopped;
    closed = true;
    clearTimeout(timer);
    clearTimeout(lifetime);
    clearInterval(keepAlive);
    watcher.close();
    clients.forEach((c) => c.end());
    clients.clear();
    server.closeAllConnections();
    await new Promise<void>((r) => server.close(() => r()));
    waiting.splice(0).forEach((f) => f(revision));
    opts.onEvent?.({ kind: 'stopped', reason });
    markStopped();
  }

  opts.onEvent?.({ kind: 'listening', url });
  await runOnce();
  return {
    url,
    revision: () => revision,
    nextRun: () => new Promise<number>((r) => (closed ? r(revision) : waiting.push(r))),
    close: () => stop('closed'),
    stopped,
  };
}
