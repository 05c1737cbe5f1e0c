/**
 * Hovers as plain text, for an editor that does not announce Markdown in its hover content
 * formats: tables become aligned columns (numbers right-aligned where the table says so), and
 * emphasis, code spans and escapes are dropped, so nothing shows as raw pipes or asterisks.
 */

/** Splits a Markdown table row into its cells (a `\|` inside a cell is not a separator). */
function cells(row: string): string[] {
  const inner = row
    .trim()
    .replace(/^\|/, '')
    .replace(/(?<!\\)\|$/, '');
  return inner.split(/(?<!\\)\|/).map((c) => inline(c.trim()));
}

/** A delimiter row (`|---|--:|`). */
function isDelimiter(row: string): boolean {
  return /^\|?(\s*:?-+:?\s*\|)+\s*:?-*:?\s*$/.test(row.trim());
}

/** Inline Markdown as the words it shows: code spans, strong and emphasis markers, escapes. */
function inline(text: string): string {
  return text
    .replace(/(`+)\s?(.*?)\s?\1/g, '$2')
    .replace(/\*\*(.+?)\*\*/g, '$1')
    .replace(/(^|[\s(])_(\S(?:.*?\S)?)_(?=$|[\s).,;:])/g, '$1$2')
    .replace(/\\([\\`*_|[\]<>#+\-.!])/g, '$1');
}

function table(rows: string[]): string[] {
  const delimiter = rows.find(isDelimiter);
  // Columns the delimiter row aligns right (`--:`).
  const right = delimiter
    ? delimiter
        .trim()
        .replace(/^\||\|$/g, '')
        .split('|')
        .map((c) => c.trim().endsWith(':'))
    : [];
  const body = rows.filter((r) => !isDelimiter(r)).map(cells);
  const n = Math.max(...body.map((r) => r.length));
  const widths = Array.from({ length: n }, (_, i) => Math.max(...body.map((r) => (r[i] ?? '').length)));
  return body
    .filter((r) => r.some((c) => c !== ''))
    .map((r) =>
      widths
        .map((w, i) => (right[i] ? (r[i] ?? '').padStart(w) : (r[i] ?? '').padEnd(w)))
        .join('  ')
        .replace(/\s+$/, ''),
    );
}

/** The plain-text form of a hover's Markdown (see the module comment). */
export function hoverPlainText(markdown: string): string {
  const lines = markdown.split('\n');
  const out: string[] = [];
  for (let i = 0; i < lines.length; ) {
    if (lines[i]!.trimStart().startsWith('|')) {
      const rows: string[] = [];
      while (i < lines.length && lines[i]!.trimStart().startsWith('|')) rows.push(lines[i++]!);
      out.push(...table(rows));
      continue;
    }
    const line = lines[i++]!;
    out.push(/^\s*(-{3,}|\*{3,}|_{3,})\s*$/.test(line) ? '—'.repeat(20) : inline(line));
  }
  return out.join('\n');
}
