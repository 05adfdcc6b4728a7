// Watch mode: the page served by `ladderwave run --watch` listens to its server. When a run finishes
// the page reloads; when the saved scenario has problems, they are listed at the top of the page,
// over the last good result (or alone, when nothing has run yet), until a good save.
import type { LiveData, LiveProblem } from '../payload.js';
import { el, replaceChildren } from './dom.js';

function problemList(problems: LiveProblem[], failedAt: number | null, hasResult: boolean): HTMLElement[] {
  const when = failedAt ? ` (read at ${new Date(failedAt).toLocaleTimeString()})` : '';
  const below = hasResult ? 'Below is the last run that worked.' : 'Nothing has run yet.';
  return [
    el('h2', {}, `The scenario file has ${problems.length === 1 ? 'a problem' : `${problems.length} problems`}${when}`),
    el('p', {}, `${below} Fix the file and save it; the page reloads by itself.`),
    el(
      'ul',
      {},
      ...problems.map((p) =>
        el('li', { class: 'problem-item', 'data-path': p.path }, el('code', { class: 'where' }, p.where), p.path ? el('code', { class: 'key-path' }, p.path) : null, ' ', p.message),
      ),
    ),
  ];
}

/** `hasResult`: the page shows a run (the last good one) under the problems. */
export function startLive(live: LiveData, banner: HTMLElement, status: HTMLElement, hasResult: boolean): void {
  const show = (problems: LiveProblem[] | null, failedAt: number | null): void => {
    banner.hidden = !problems || problems.length === 0;
    if (problems && problems.length) replaceChildren(banner, ...problemList(problems, failedAt, hasResult));
  };
  show(live.problems, live.failedAt);
  const watching = 'Watching the scenario file: saving it runs it again.';
  status.textContent = watching;
  const events = new EventSource(live.events);
  events.addEventListener('run', (e) => {
    const m = JSON.parse((e as MessageEvent<string>).data) as { revision: number };
    if (m.revision !== live.revision) location.reload();
    else status.textContent = watching;
  });
  events.addEventListener('problems', (e) => {
    const m = JSON.parse((e as MessageEvent<string>).data) as { revision: number; problems: LiveProblem[]; failedAt: number };
    live.revision = m.revision;
    show(m.problems, m.failedAt);
    status.textContent = watching;
  });
  events.addEventListener('busy', () => (status.textContent = 'Running the saved scenario…'));
  events.addEventListener('error', () => (status.textContent = 'Lost the watch server (stopped?). The page shows the last result.'));
  events.addEventListener('open', () => (status.textContent = watching));
}
