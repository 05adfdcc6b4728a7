// Escaping in the report: the five characters the HTML standard gives named character references
// (WHATWG HTML Living Standard, "Named character references": &amp; &lt; &gt; &quot; and &#39; for ').
import { describe, expect, it } from 'vitest';
import { attr, el, esc } from '../../../src/report/html.js';

describe('escaping', () => {
  it('replaces & < > " and \' with character references, and nothing else', () => {
    expect(esc(`<script>alert("x") & 'y'</script>`)).toBe('&lt;script&gt;alert(&quot;x&quot;) &amp; &#39;y&#39;&lt;/script&gt;');
    expect(esc('Z0 55 Ω · 1.5 ns — ok')).toBe('Z0 55 Ω · 1.5 ns — ok');
    expect(esc(42)).toBe('42');
  });

  it('keeps attribute values on one line and inside their quotes', () => {
    expect(attr('a"b\nc')).toBe('a&quot;b&#10;c');
    expect(el('td', { 'data-path': 'probes.<x>.min', class: undefined }, 'v')).toBe('<td data-path="probes.&lt;x&gt;.min">v</td>');
  });
});
