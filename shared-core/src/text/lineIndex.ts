/**
 * Converts between UTF-16 offsets and line/character positions of one document text.
 *
 * Built once per text in O(length); every look-up is a binary search over the line starts.
 * `\n`, `\r\n` and a lone `\r` all end a line (as LSP counts them). Lines and characters of
 * {@link LineIndex.positionAt} are 0-based UTF-16 (LSP); {@link LineIndex.lineCol} is 1-based
 * (what the CLI prints). Offsets outside the text are clamped, never an error.
 */
import type { LineCol } from './types';

/** A 0-based line and 0-based UTF-16 character, as LSP positions count them. */
export interface LinePosition {
  line: number;
  character: number;
}

/** Offsets ⇄ positions for one document text (see the module comment). */
export class LineIndex {
  /** Length of the indexed text in UTF-16 code units. */
  readonly length: number;
  /** Offset of the first character of each line; `starts[0]` is 0. */
  private readonly starts: number[];
  /** Offset just past each line's content (before its line break, or the text's end). */
  private readonly ends: number[];

  /** Indexes `text` (one pass over it). */
  constructor(text: string) {
    this.length = text.length;
    const starts: number[] = [0];
    const ends: number[] = [];
    if (text.indexOf('\r') < 0) {
      // Fast path: only `\n` breaks, found by the native search.
      let i = text.indexOf('\n');
      while (i >= 0) {
        ends.push(i);
        starts.push(i + 1);
        i = text.indexOf('\n', i + 1);
      }
    } else {
      const n = text.length;
      for (let i = 0; i < n; i++) {
        const c = text.charCodeAt(i);
        if (c === 10) {
          ends.push(i);
          starts.push(i + 1);
        } else if (c === 13) {
          ends.push(i);
          if (i + 1 < n && text.charCodeAt(i + 1) === 10) i++;
          starts.push(i + 1);
        }
      }
    }
    ends.push(text.length);
    this.starts = starts;
    this.ends = ends;
  }

  /** Number of lines (a text ending in a line break has an empty last line; '' has one line). */
  get lineCount(): number {
    return this.starts.length;
  }

  /** Offset of the first character of `line` (0-based; clamped to the document's lines). */
  lineStart(line: number): number {
    return this.starts[this.clampLine(line)] ?? 0;
  }

  /** Offset just past the content of `line`, before its line break (0-based; clamped). */
  lineEnd(line: number): number {
    return this.ends[this.clampLine(line)] ?? this.length;
  }

  /** The 0-based line holding `offset` (clamped to the document). */
  lineAt(offset: number): number {
    const starts = this.starts;
    if (!(offset > 0)) return 0; // also catches NaN
    let lo = 0;
    let hi = starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >>> 1;
      if ((starts[mid] as number) <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** 0-based line and UTF-16 character of `offset` (clamped to `[0, length]`). */
  positionAt(offset: number): LinePosition {
    const o = this.clampOffset(offset);
    const line = this.lineAt(o);
    return { line, character: o - (this.starts[line] as number) };
  }

  /**
   * Offset of a 0-based position. A line past the end gives the text's length, a negative line 0;
   * a character past the line's content stops at the line's end (before its line break).
   */
  offsetAt(position: LinePosition): number {
    const { line, character } = position;
    if (!(line >= 0)) return 0;
    if (line >= this.starts.length) return this.length;
    const l = Math.floor(line);
    const start = this.starts[l] as number;
    const end = this.ends[l] as number;
    if (!(character > 0)) return start;
    return Math.min(start + Math.floor(character), end);
  }

  /** 1-based line and 1-based UTF-16 column of `offset` (clamped), as the CLI prints them. */
  lineCol(offset: number): LineCol {
    const p = this.positionAt(offset);
    return { line: p.line + 1, column: p.character + 1 };
  }

  private clampLine(line: number): number {
    if (!(line > 0)) return 0;
    const last = this.starts.length - 1;
    return line >= last ? last : Math.floor(line);
  }

  private clampOffset(offset: number): number {
    if (!(offset > 0)) return 0;
    return offset >= this.length ? this.length : Math.floor(offset);
  }
}
