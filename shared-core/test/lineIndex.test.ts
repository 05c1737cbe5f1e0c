/**
 * LineIndex: offsets ⇄ 0-based LSP positions and 1-based CLI line/columns, with `\n`, `\r\n` and
 * lone `\r` line breaks, a BOM, tabs and characters outside the BMP (UTF-16 code units count).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LineIndex } from '../src/text/lineIndex';

/** Positions worked out by hand: [offset, line, character] for each listed offset of `text`. */
function check(text: string, expected: [offset: number, line: number, character: number][]): void {
  const idx = new LineIndex(text);
  for (const [offset, line, character] of expected) {
    expect(idx.positionAt(offset), `positionAt(${offset}) in ${JSON.stringify(text)}`).toEqual({ line, character });
    expect(idx.lineCol(offset)).toEqual({ line: line + 1, column: character + 1 });
  }
}

/** Line starts by an independent method: split on the three line breaks. */
function naiveStarts(text: string): number[] {
  const starts = [0];
  const re = /\r\n|\r|\n/g;
  for (let m = re.exec(text); m; m = re.exec(text)) starts.push(m.index + m[0].length);
  return starts;
}

describe('LineIndex positions', () => {
  it('counts lines and characters for LF text', () => {
    check('ab\ncd\n', [
      [0, 0, 0],
      [2, 0, 2],
      [3, 1, 0],
      [5, 1, 2],
      [6, 2, 0],
    ]);
  });

  it('treats CRLF as one break and a lone CR as a break', () => {
    check('a\r\nb\rc\nd', [
      [0, 0, 0],
      [1, 0, 1],
      [3, 1, 0],
      [5, 2, 0],
      [7, 3, 0],
      [8, 3, 1],
    ]);
  });

  it('counts a BOM, tabs and surrogate pairs as UTF-16 code units', () => {
    // '\uFEFF' is one unit, '\t' one, '𝔸' (U+1D538) two.
    check('\uFEFF\tx\n𝔸y', [
      [1, 0, 1],
      [2, 0, 2],
      [4, 1, 0],
      [6, 1, 2],
    ]);
  });

  it('clamps offsets outside the text', () => {
    const idx = new LineIndex('ab\ncd');
    expect(idx.positionAt(-5)).toEqual({ line: 0, character: 0 });
    expect(idx.positionAt(99)).toEqual({ line: 1, character: 2 });
    expect(idx.positionAt(Number.NaN)).toEqual({ line: 0, character: 0 });
    expect(idx.lineCol(99)).toEqual({ line: 2, column: 3 });
  });

  it('reports line counts and line starts, including an empty last line', () => {
    expect(new LineIndex('').lineCount).toBe(1);
    expect(new LineIndex('a\n').lineCount).toBe(2);
    expect(new LineIndex('a\r\n\r\nb').lineCount).toBe(3);
    const idx = new LineIndex('a\r\nbb\rccc\n');
    expect([0, 1, 2, 3].map((l) => idx.lineStart(l))).toEqual([0, 3, 6, 10]);
    expect([0, 1, 2, 3].map((l) => idx.lineEnd(l))).toEqual([1, 5, 9, 10]);
    expect(idx.lineStart(-1)).toBe(0);
    expect(idx.lineStart(42)).toBe(10);
  });
});

describe('LineIndex.offsetAt', () => {
  const text = 'ab\r\ncde\nf';
  const idx = new LineIndex(text);

  it('inverts positionAt', () => {
    expect(idx.offsetAt({ line: 1, character: 2 })).toBe(6);
    expect(idx.offsetAt({ line: 2, character: 1 })).toBe(9);
  });

  it('clamps a character past the line end to the end of the content (before the break)', () => {
    expect(idx.offsetAt({ line: 0, character: 10 })).toBe(2);
    expect(idx.offsetAt({ line: 1, character: 10 })).toBe(7);
  });

  it('clamps lines outside the document', () => {
    expect(idx.offsetAt({ line: -1, character: 3 })).toBe(0);
    expect(idx.offsetAt({ line: 7, character: 0 })).toBe(text.length);
    expect(idx.offsetAt({ line: 1, character: -4 })).toBe(4);
  });
});

describe('LineIndex properties', () => {
  const piece = fc.constantFrom('a', 'é', '𝔸', '\t', ' ', '\n', '\r\n', '\r', '\uFEFF', 'xyz');
  const texts = fc.array(piece, { maxLength: 60 }).map((xs) => xs.join(''));

  it('agrees with a naive split on every offset, and round-trips outside CRLF pairs', () => {
    fc.assert(
      fc.property(texts, (text) => {
        const idx = new LineIndex(text);
        const starts = naiveStarts(text);
        expect(idx.lineCount).toBe(starts.length);
        for (let o = 0; o <= text.length; o++) {
          let line = 0;
          while (line + 1 < starts.length && (starts[line + 1] as number) <= o) line++;
          const pos = idx.positionAt(o);
          expect(pos).toEqual({ line, character: o - (starts[line] as number) });
          const insideCrlf = text[o - 1] === '\r' && text[o] === '\n';
          if (!insideCrlf) expect(idx.offsetAt(pos)).toBe(o);
        }
      }),
      { seed: 20240611, numRuns: 300 },
    );
  });
});
