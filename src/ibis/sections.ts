// Splitting a model file into keyword sections. Rules of the open I/O buffer model standard (IBIS ver.
// 5.0+, "General syntax rules and guidelines"): a keyword is enclosed in square brackets at the start of
// a line; keywords are case-insensitive and a space and an underscore in them are equivalent; the comment
// character (default "|", changed by [Comment Char] "#_char") starts a comment anywhere on a line.

export interface SourceLine {
  line: number;
  text: string;
}

export interface Section {
  /** Normalized keyword: lower case, underscores as spaces, single spaces. */
  key: string;
  /** As written, for messages. */
  keyword: string;
  line: number;
  /** Text after the closing bracket on the keyword's line. */
  rest: string;
  body: SourceLine[];
}

export function normalizeKeyword(k: string): string {
  return k.trim().toLowerCase().replace(/[_\s]+/g, ' ');
}

export interface Split {
  sections: Section[];
  /** Non-comment text before the first keyword. */
  stray: SourceLine[];
  badCommentChar: SourceLine[];
}

const COMMENT_CHAR = /^\[comment[ _]char\]\s*(\S*)/i;

export function splitSections(text: string): Split {
  const lines = text.split(/\r\n|\r|\n/);
  const sections: Section[] = [];
  const stray: SourceLine[] = [];
  const badCommentChar: SourceLine[] = [];
  let comment = '|';
  lines.forEach((raw, idx) => {
    const line = idx + 1;
    const cc = COMMENT_CHAR.exec(raw);
    if (cc) {
      const m = /^([^\sA-Za-z0-9])_char$/i.exec(cc[1]);
      if (m) comment = m[1];
      else badCommentChar.push({ line, text: raw });
      return;
    }
    const cut = raw.indexOf(comment);
    const textPart = (cut >= 0 ? raw.slice(0, cut) : raw).replace(/\s+$/, '');
    if (textPart.trim() === '') return;
    if (textPart.startsWith('[')) {
      const close = textPart.indexOf(']');
      if (close > 0) {
        const keyword = textPart.slice(1, close).trim();
        sections.push({ key: normalizeKeyword(keyword), keyword, line, rest: textPart.slice(close + 1).trim(), body: [] });
        return;
      }
    }
    const current = sections[sections.length - 1];
    if (current) current.body.push({ line, text: textPart });
    else stray.push({ line, text: textPart });
  });
  return { sections, stray, badCommentChar };
}

/** Whitespace-separated tokens; "a = b" becomes ["a", "b"] (an equals sign between name and value). */
export function tokens(text: string): string[] {
  return text.replace(/=/g, ' ').trim().split(/\s+/).filter((t) => t !== '');
}
