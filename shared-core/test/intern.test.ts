/**
 * The intern table of the parser (`notation/intern.ts`): whatever a look-up finds or replaces, it
 * returns exactly the characters asked for, and the same string object for the same characters
 * while nothing else took their slot. Strings with a pack (at most six characters below 256) and
 * strings without one (longer, or with a character such as `−` or `³`) share one table, so both
 * are mixed here, with strings that differ only in their length or in one character.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { internedPackedSlice, internedSlice, PACK_START, packStep } from '../src/notation/intern';

/** Characters of every kind a key, unit or number may hold (NUL included: it has a pack too). */
const CHARS = [...'059.,eCdb%/', '\0', '°', 'µ', '³', '−', '\u00ff', '\u0100'];

const shortString = fc.array(fc.constantFrom(...CHARS), { minLength: 0, maxLength: 10 }).map((cs) => cs.join(''));

/** The pack and `wide` of `s` as a scanner computes them while reading it. */
function packed(s: string): { pack: number; wide: number } {
  let pack = PACK_START;
  let wide = 0;
  for (let i = 0; i < s.length; i++) {
    pack = packStep(pack, s.charCodeAt(i));
    wide |= s.charCodeAt(i);
  }
  return { pack, wide };
}

describe('intern table', () => {
  it('returns the characters asked for, by either entry, whatever was looked up before', () => {
    fc.assert(
      fc.property(fc.array(shortString, { minLength: 1, maxLength: 60 }), (words) => {
        for (const w of words) {
          const text = `  ${w} `;
          expect(internedSlice(text, 2, 2 + w.length)).toBe(w);
          const { pack, wide } = packed(w);
          expect(internedPackedSlice(text, 2, 2 + w.length, pack, wide)).toBe(w);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('tells apart strings whose characters give the same digits (`\\0` before a character, lengths)', () => {
    const words = ['5', '\u00005', '\u0000\u00005', '05', '5\u0000', '0,5', '−5', '-5', '5³', '5\u00b3\u0000'];
    for (let round = 0; round < 3; round++) {
      for (const w of words) expect(internedSlice(`[${w}]`, 1, 1 + w.length)).toBe(w);
    }
  });

  it('hands out one string object for the same characters read at different places', () => {
    for (const w of ['db', 'rh', 'C', '%', '15.7', '−3.9', 'kJ/kg', 'm³/h', 'q_latent']) {
      const text = `x=${w} y=${w}`;
      const first = internedSlice(text, 2, 2 + w.length);
      const second = internedSlice(text, 5 + w.length, 5 + 2 * w.length);
      expect(second).toBe(w);
      expect(Object.is(first, second)).toBe(true);
    }
  });

  it('copies strings longer than it keeps, and an empty range is the empty string', () => {
    expect(internedSlice('state LONG_NAME_1', 6, 17)).toBe('LONG_NAME_1');
    expect(internedSlice('abc', 1, 1)).toBe('');
  });

  it('keeps the numbers of a note apart: a second pass over 1,101 distinct figures finds nearly all of them', () => {
    // The figures a note of states writes (one decimal, −10.0 to 100.0), each looked up twice in
    // turn; a look-up that misses the table copies the characters (counted). The table has 4,096
    // slots, so about one figure in ten shares its slot with another (and the two take it from
    // each other at each pass). A slot taken from the characters' own bits folded together made
    // 999 of these 1,101 look-ups miss.
    const words = [...new Set(Array.from({ length: 1101 }, (_, i) => ((i - 100) / 10).toFixed(1)))];
    expect(words).toHaveLength(1101);
    const text = words.join(' ');
    const at: number[] = [];
    for (let i = 0, p = 0; i < words.length; p += (words[i] as string).length + 1, i++) at.push(p);
    const packs = words.map(packed);
    const lookUpAll = (): string[] =>
      words.map((w, i) => {
        const { pack, wide } = packs[i] as { pack: number; wide: number };
        return internedPackedSlice(text, at[i] as number, (at[i] as number) + w.length, pack, wide);
      });
    expect(lookUpAll()).toEqual(words);
    const original = String.prototype.slice;
    let copies = 0;
    let second: string[] = [];
    String.prototype.slice = function (this: string, start?: number, end?: number): string {
      copies++;
      return original.call(this, start, end);
    };
    try {
      second = lookUpAll();
    } finally {
      String.prototype.slice = original;
    }
    expect(second).toEqual(words);
    expect(copies).toBeLessThanOrEqual(150);
  });
});
