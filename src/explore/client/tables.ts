// The measurement and check tables. A number that was measured at an instant is a button: pressing it
// puts the waveform cursors on that instant (A, and B at the end of a span, so Δt reads the number).
import type { Cell, Instants, Table } from '../payload.js';
import { el } from './dom.js';

function cell(c: Cell, j: number, onInstants: (at: Instants) => void): HTMLElement {
  const attrs: Record<string, string | number | undefined> = { class: c.className, title: c.title };
  if (c.value !== undefined) attrs['data-value'] = c.value === null ? '' : String(c.value);
  let content: Node | string = c.text;
  if (c.at) {
    const at = c.at;
    const b = el('button', { type: 'button', class: 'at', 'data-a': at.a, 'data-b': at.b, title: `Put the cursors on ${at.label}` }, c.text);
    b.addEventListener('click', () => onInstants(at));
    content = b;
  }
  return j === 0 ? el('th', { scope: 'row', ...attrs }, content) : el('td', attrs, content);
}

export function tableElement(t: Table, onInstants: (at: Instants) => void): HTMLElement {
  return el(
    'div',
    { class: 'table-block' },
    el('h3', {}, t.title),
    el(
      'div',
      { class: 'wide' },
      el(
        'table',
        { id: t.id },
        el('thead', {}, el('tr', {}, ...t.head.map((h) => el('th', { scope: 'col' }, h)))),
        el('tbody', {}, ...t.rows.map((r) => el('tr', {}, ...r.map((c, j) => cell(c, j, onInstants))))),
      ),
    ),
    t.caption ? el('p', { class: 'caption' }, t.caption) : null,
  );
}
