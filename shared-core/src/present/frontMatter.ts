/**
 * A note's front matter: the block that many Markdown tools read as metadata — a first line `---`,
 * then `key: value` lines, closed by a line `---` or `...`. Only flat one-line `key: value` pairs
 * are read (keys of letters, digits, `_` and `-`; a value in matching quotes loses them); any
 * other line is kept as written in `other`, so nothing in it is lost. Without a closing line, or
 * when the first line inside is not a `key:` line, the first `---` is an ordinary thematic break
 * and there is no front matter. Pure; linear in the text.
 */

/** The front matter of a note (see the module comment). */
export interface FrontMatter {
  /** 0-based line of the closing `---` or `...`: lines 0 to this one are the front matter. */
  lastLine: number;
  /** The flat `key: value` pairs, in written order. */
  fields: { key: string; value: string }[];
  /** Lines between the fences that are not a flat pair (nested values, lists, comments), as written. */
  other: string[];
}

const PAIR = /^([A-Za-z][\w-]*)[ \t]*:(?:[ \t]+(.*?))?[ \t]*$/;

function unquote(v: string): string {
  if (v.length >= 2 && ((v.startsWith('"') && v.endsWith('"')) || (v.startsWith("'") && v.endsWith("'"))))
    return v.slice(1, -1);
  return v;
}

/** The note's front matter, or null when it has none. */
export function readFrontMatter(text: string): FrontMatter | null {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n?|\n/);
  if (lines[0]?.trimEnd() !== '---') return null;
  // A rule followed by prose is not front matter: the first line inside must be a `key:` line.
  const first = lines.slice(1).find((l) => l.trim() !== '');
  if (first === undefined || !/^[A-Za-z][\w-]*[ \t]*:/.test(first)) return null;
  const fields: FrontMatter['fields'] = [];
  const other: string[] = [];
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i]!;
    const t = line.trimEnd();
    if (t === '---' || t === '...') return { lastLine: i, fields, other };
    if (t === '') continue;
    const m = PAIR.exec(line);
    if (m && m[2] !== undefined && m[2] !== '') fields.push({ key: m[1]!, value: unquote(m[2]) });
    else other.push(line);
  }
  return null;
}

/** `text` with the front matter's lines emptied (line count unchanged), for a Markdown renderer. */
export function withoutFrontMatter(text: string, fm: FrontMatter | null): string {
  if (!fm) return text;
  const lines = text.split(/(\r\n?|\n)/);
  // split with a capture keeps the breaks at the odd indices: line k is at index 2k.
  for (let k = 0; k <= fm.lastLine && 2 * k < lines.length; k++) lines[2 * k] = '';
  return lines.join('');
}
