// The lexical layer of a Touchstone file: lines with comments split off, and the numeric tokens of
// data lines with their positions, so every error can name its line and column.
//   Touchstone File Format Specification 1.1 (IBIS Open Forum, 2002), "General Syntax Rules": files
//   are case-insensitive; a comment starts at "!" and runs to the end of the line.
//   Version 2.0 (IBIS Open Forum, 2009) keeps both rules.

export interface SourceLine {
  /** 1-based line number. */
  line: number;
  /** Text before any "!", trimmed at the end. */
  text: string;
  /** Column (1-based) of the first non-blank character of `text`. */
  col: number;
  /** The comment after "!", if any (without the "!"). */
  comment?: string;
}

export interface Token {
  text: string;
  line: number;
  col: number;
  /** True for the first token of its line. */
  first: boolean;
}

/** Splits text into lines (LF, CR/LF or CR) with comments separated. */
export function sourceLines(text: string): SourceLine[] {
  const raw = text.split(/\r\n|\r|\n/);
  return raw.map((l, i) => {
    const bang = l.indexOf('!');
    const body = (bang >= 0 ? l.slice(0, bang) : l).replace(/\s+$/, '');
    const lead = body.length - body.trimStart().length;
    const out: SourceLine = { line: i + 1, text: body.trim(), col: lead + 1 };
    if (bang >= 0) out.comment = l.slice(bang + 1);
    return out;
  });
}

/** Whitespace-separated tokens of one line with their columns. */
export function tokensOf(l: SourceLine): Token[] {
  const out: Token[] = [];
  const re = /\S+/g;
  let m: RegExpExecArray | null;
  const offset = l.col - 1;
  while ((m = re.exec(l.text)) !== null) out.push({ text: m[0], line: l.line, col: offset + m.index + 1, first: out.length === 0 });
  return out;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The value of a numeric token, or NaN when it is not a number in the file's notation. */
export function numberOf(text: string): number {
  if (!NUMBER.test(text)) return NaN;
  return Number(text);
}
