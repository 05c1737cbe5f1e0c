/**
 * Helpers for the language-service tests: `|` cursor markers, a note analysed with (partial)
 * settings, applying edits, and reading figures out of hover tables and hint labels.
 */
import { analyzeText, DEFAULT_SERVICE_SETTINGS, type Edit, type Note, type ServiceSettings } from '../src/service';

/** The text without its `|` markers, and the offsets where they were. */
export function marked(input: string): { text: string; offsets: number[] } {
  const [first = '', ...rest] = input.split('|');
  const offsets: number[] = [];
  let text = first;
  for (const part of rest) {
    offsets.push(text.length);
    text += part;
  }
  return { text, offsets };
}

/** Analyses `text` with the default settings overridden by `settings`. */
export function noteOf(text: string, settings: Partial<ServiceSettings> = {}): Note {
  return analyzeText(text, { ...DEFAULT_SERVICE_SETTINGS, ...settings });
}

/** A fenced `air` block around the given lines. */
export function air(...lines: string[]): string {
  return ['```air', ...lines, '```', ''].join('\n');
}

/** Applies edits (non-overlapping) to `text`. */
export function applyEdits(text: string, edits: readonly Edit[]): string {
  const sorted = [...edits].sort((a, b) => b.span.start - a.span.start);
  let out = text;
  for (const e of sorted) out = out.slice(0, e.span.start) + e.newText + out.slice(e.span.end);
  return out;
}

/**
 * The number shown for `key` in a state hover's table (`| \`w\` | 6.53 | g/kg | …` → 6.53): the cell
 * after the key's; with `secondary`, the figure in the other unit system (two cells further).
 */
export function tableValue(markdown: string, key: string, secondary = false): number {
  const row = markdown.split('\n').find((l) => l.includes(`| \`${key}\` |`));
  if (!row) throw new Error(`no row for ${key} in:\n${markdown}`);
  const cells = row.split('|').map((c) => c.trim());
  const at = cells.indexOf(`\`${key}\``) + (secondary ? 3 : 1);
  const cell = (cells[at] ?? '').replace('−', '-');
  const m = /^-?\d+(\.\d+)?/.exec(cell);
  if (!m) throw new Error(`no number in the ${secondary ? 'secondary' : 'primary'} cell of ${key} in: ${row}`);
  return Number(m[0]);
}

/**
 * Reads `key <number> <unit>` from a hint label such as `rh 14.0 % · w 6.53 g/kg` (spaces or
 * no-break spaces; minus sign U+2212).
 */
export function hintFigure(label: string, key: string, unit: string): number | null {
  const esc = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const m = new RegExp(`(?:^|· )${esc(key)}[ \u00a0]([-−]?\\d+(?:\\.\\d+)?)[ \u00a0]${esc(unit)}`).exec(label);
  return m ? Number(m[1]!.replace('−', '-')) : null;
}

/** True when |actual − expected| ≤ tol (with a little slack for the shown rounding). */
export function near(actual: number, expected: number, tol: number): boolean {
  return Math.abs(actual - expected) <= tol + 1e-9;
}
