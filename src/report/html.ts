// Escaping and a few small builders for the HTML report. Every piece of text that comes from a scenario
// or a summary goes through `esc` (element content) or `attr` (attribute values), so a title such as
// `<b>&"'` is shown as written and never becomes markup.

/** Escapes text for HTML element content and for SVG text. */
export function esc(text: unknown): string {
  return String(text).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Escapes text for a double-quoted attribute value. */
export function attr(text: unknown): string {
  return esc(text).replace(/\n/g, '&#10;');
}

/** An element with attributes (values escaped) and already-built inner HTML. */
export function el(tag: string, attrs: Record<string, string | number | undefined>, inner = ''): string {
  const a = Object.entries(attrs)
    .filter(([, v]) => v !== undefined)
    .map(([k, v]) => ` ${k}="${attr(v)}"`)
    .join('');
  return `<${tag}${a}>${inner}</${tag}>`;
}
