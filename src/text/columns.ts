// Aligned text columns for terminal output.

export type Align = 'l' | 'r';

/** Pads the cells of `rows` into aligned columns separated by `gap` spaces; trailing spaces trimmed. */
export function alignColumns(rows: readonly (readonly string[])[], align: readonly Align[] = [], gap = 2): string[] {
  const widths: number[] = [];
  for (const row of rows) row.forEach((cell, j) => (widths[j] = Math.max(widths[j] ?? 0, [...cell].length)));
  return rows.map((row) =>
    row
      .map((cell, j) => {
        const pad = ' '.repeat(widths[j] - [...cell].length);
        return align[j] === 'r' ? pad + cell : cell + pad;
      })
      .join(' '.repeat(gap))
      .trimEnd(),
  );
}
