// A tiny, strict XML 1.0 parser for tests: elements, attributes, text, the five predefined entities and
// numeric character references, comments and the XML declaration. No DTDs, no namespaces. It throws on
// malformed input (mismatched tags, unquoted or duplicate attributes, a bare "&" or "<", text outside
// the root), so a report that parses here is well-formed.

export interface XmlElement {
  name: string;
  attrs: Record<string, string>;
  children: XmlElement[];
  text: string;
}

const NAME = /[A-Za-z_:][-A-Za-z0-9_:.]*/y;

function decode(s: string, at: number): string {
  return s.replace(/&(#x[0-9A-Fa-f]+|#[0-9]+|[A-Za-z]+);|&/g, (m, ref: string | undefined) => {
    if (!ref) throw new Error(`bare "&" near ${at}`);
    if (ref.startsWith('#x')) return String.fromCodePoint(parseInt(ref.slice(2), 16));
    if (ref.startsWith('#')) return String.fromCodePoint(parseInt(ref.slice(1), 10));
    const named: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };
    if (!(ref in named)) throw new Error(`unknown entity &${ref}; near ${at}`);
    return named[ref]!;
  });
}

export function parseXml(src: string): XmlElement {
  let i = 0;
  const fail = (msg: string): never => {
    throw new Error(`XML: ${msg} at offset ${i}`);
  };
  const skipWs = () => {
    while (i < src.length && /\s/.test(src[i]!)) i++;
  };
  const name = (): string => {
    NAME.lastIndex = i;
    const m = NAME.exec(src);
    if (!m) fail('expected a name');
    i += m![0].length;
    return m![0];
  };
  const skipMisc = () => {
    for (;;) {
      skipWs();
      if (src.startsWith('<!--', i)) {
        const e = src.indexOf('-->', i);
        if (e < 0) fail('unclosed comment');
        i = e + 3;
      } else if (src.startsWith('<?', i)) {
        const e = src.indexOf('?>', i);
        if (e < 0) fail('unclosed processing instruction');
        i = e + 2;
      } else return;
    }
  };
  const element = (): XmlElement => {
    if (src[i] !== '<') fail('expected "<"');
    i++;
    const el: XmlElement = { name: name(), attrs: {}, children: [], text: '' };
    for (;;) {
      skipWs();
      if (src.startsWith('/>', i)) {
        i += 2;
        return el;
      }
      if (src[i] === '>') {
        i++;
        break;
      }
      const an = name();
      skipWs();
      if (src[i] !== '=') fail(`expected "=" after attribute ${an}`);
      i++;
      skipWs();
      const q = src[i];
      if (q !== '"' && q !== "'") fail(`attribute ${an} is not quoted`);
      const end = src.indexOf(q!, i + 1);
      if (end < 0) fail('unclosed attribute value');
      const raw = src.slice(i + 1, end);
      if (raw.includes('<')) fail(`"<" in attribute ${an}`);
      if (an in el.attrs) fail(`duplicate attribute ${an}`);
      el.attrs[an] = decode(raw, i);
      i = end + 1;
    }
    for (;;) {
      if (src.startsWith('</', i)) {
        i += 2;
        const n = name();
        if (n !== el.name) fail(`</${n}> closes <${el.name}>`);
        skipWs();
        if (src[i] !== '>') fail('expected ">"');
        i++;
        return el;
      }
      if (src.startsWith('<!--', i)) {
        skipMisc();
        continue;
      }
      if (src[i] === '<') {
        el.children.push(element());
        continue;
      }
      const next = src.indexOf('<', i);
      if (next < 0) fail(`unclosed element <${el.name}>`);
      el.text += decode(src.slice(i, next), i);
      i = next;
    }
  };
  skipMisc();
  const root = element();
  skipMisc();
  if (i !== src.length) fail('content after the root element');
  return root;
}
