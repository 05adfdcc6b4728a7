// Building the page's elements without markup strings: text is always set as text, never parsed.

type Attrs = Record<string, string | number | boolean | undefined | null>;
type Child = Node | string | number | null | undefined | false;

/** An element with attributes (false/null/undefined left out, true as an empty attribute) and children. */
export function el<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Attrs = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === undefined || v === null || v === false) continue;
    e.setAttribute(k, v === true ? '' : String(v));
  }
  append(e, ...children);
  return e;
}

/** Appends children (strings become text nodes). */
export function append(parent: Node, ...children: Child[]): void {
  for (const c of children) {
    if (c === null || c === undefined || c === false) continue;
    parent.appendChild(typeof c === 'string' || typeof c === 'number' ? document.createTextNode(String(c)) : c);
  }
}

/** Replaces an element's children. */
export function replaceChildren(parent: Element, ...children: Child[]): void {
  while (parent.firstChild) parent.removeChild(parent.firstChild);
  append(parent, ...children);
}

/** A section with a heading and an id. */
export function section(id: string, title: string, ...children: Child[]): HTMLElement {
  return el('section', { id }, el('h2', {}, title), ...children);
}

/** Width available inside an element (at least `min` pixels). */
export function innerWidth(e: Element, min = 320): number {
  const w = e.getBoundingClientRect().width;
  return Math.max(min, Math.floor(w));
}
