/**
 * The one "did you mean" engine (`src/text/suggest.ts`): the suggestions it makes for ordinary
 * typos (names, keys, keywords, units), none for a one-letter name, the same answer with the
 * index and the band as a plain full scan, and a bounded cost — counted in operations, never
 * timed — on the inputs that made suggestions quadratic: a 50,000-letter name next to a similar
 * unknown one, and thousands of short unknown names against thousands of defined ones.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyzeNote } from '../src/analyze';
import { suggestUnit } from '../src/units';
import {
  MAX_SUGGEST_LENGTH,
  MAX_VERIFIED,
  SuggestIndex,
  caseFoldedIndex,
  distanceWithin,
  nameTolerance,
  nearest,
  suggestName,
  type SuggestWork,
} from '../src/text/suggest';

/** The full optimal-string-alignment distance, the textbook way (the reference for the band). */
function fullDistance(a: string, b: string): number {
  const d: number[][] = [];
  for (let i = 0; i <= a.length; i++) d.push([i]);
  for (let j = 1; j <= b.length; j++) d[0]![j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      let v = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) v = Math.min(v, d[i - 2]![j - 2]! + 1);
      d[i]![j] = v;
    }
  }
  return d[a.length]![b.length]!;
}

/** The reference suggestion: scan every candidate with the full distance, same rules as the engine. */
function referenceName(word: string, candidates: readonly string[]): string | null {
  if (word.length === 0 || word.length > MAX_SUGGEST_LENGTH) return null;
  const lower = word.toLowerCase();
  for (const c of candidates) if (c !== word && c.toLowerCase() === lower) return c;
  let best: string | null = null;
  let bestD = Infinity;
  for (const c of candidates) {
    if (c === word || c.length > MAX_SUGGEST_LENGTH) continue;
    const d = fullDistance(lower, c.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  return best !== null && bestD <= nameTolerance(word.length) ? best : null;
}

function fence(lines: string[]): string {
  return ['```air', ...lines, '```', ''].join('\n');
}

describe('suggestions for ordinary typos', () => {
  const names = ['OA', 'RA', 'MA', 'OFF', 'SUPPLY', 'AHU-1_off', 'Room'];
  it.each([
    ['oa', 'OA'], // case only
    ['RAA', 'RA'],
    ['SUPLY', 'SUPPLY'],
    ['SUPPYL', 'SUPPLY'], // two neighbours swapped: one edit
    ['AO', 'OA'], // the names' old engine counted a swap as two edits, too many for a two-letter name
    ['AHU-1_of', 'AHU-1_off'],
    ['room', 'Room'],
    ['Roon', 'Room'],
  ])('%s → %s', (word, expected) => {
    expect(suggestName(word, names)).toBe(expected);
  });

  it.each([
    ['Z'], // one letter: replacing its only letter is no typo (Z is not a misspelt A)
    ['Q'],
    ['XYZ'],
    ['COOLINGCOIL'],
  ])('%s → none', (word) => {
    expect(suggestName(word, [...names, 'A'])).toBeNull();
  });

  it('never suggests the word itself', () => {
    expect(suggestName('SUPPLY', ['SUPPLY', 'Room'])).toBeNull();
    expect(suggestName('SUPPLY', ['SUPPLY', 'supply'])).toBe('supply');
  });

  it('in a note: unknown names, keys, keywords and units', () => {
    const a = analyzeNote(
      fence([
        'state OA: db=24C rhh=50%',
        'state RA: db=24C rh=50%',
        'Process X: OA -> RA',
        'state B: db=24degC rh=50%',
        'process P: RAA -> OA',
        'process Z1: Q -> OA',
      ]),
    );
    const says = (code: string) => a.diagnostics.filter((d) => d.code === code).map((d) => d.message);
    expect(says('unknown-key').join()).toContain('did you mean rh=…?');
    expect(says('unknown-keyword').join()).toContain("keywords are lowercase: write 'process'");
    expect(says('unknown-unit').join()).toContain('did you mean db=24C?');
    expect(says('unknown-name')).toEqual([
      "no state is named 'RAA'; did you mean 'RA'?",
      expect.stringContaining("no state is named 'Q'; define it"),
    ]);
  });

  it('units keep their own tolerance (none up to three letters) through the same engine', () => {
    expect(suggestUnit('kJ/kgg', ['enthalpy'])).toBe('kJ/kg');
    expect(suggestUnit('Btu/lbb', ['enthalpy'])).toBe('Btu/lb');
    expect(suggestUnit('kPs', ['pressure'])).toBeUndefined();
  });
});

describe('the index and the band give the answer of a full scan', () => {
  const word = fc.stringMatching(/^[A-Za-z][A-Za-z0-9_-]{0,9}$/);
  it('for random words and names (few names: scanned; many: indexed)', () => {
    fc.assert(
      fc.property(fc.array(word, { minLength: 0, maxLength: 80 }), word, (names, w) => {
        // Names that differ from the word by an edit or two, so that the answer is often a name.
        const near = names.slice(0, 5).map((n, i) => (i % 2 === 0 ? w + n.slice(0, 1) : w.slice(0, -1) + n.slice(-1)));
        const all = [...names, ...near];
        expect(suggestName(w, all)).toBe(referenceName(w, all));
      }),
      { seed: 20261203, numRuns: 400 },
    );
  });

  it('the banded distance equals the full one up to its bound', () => {
    fc.assert(
      fc.property(
        fc.stringMatching(/^[ab]{0,12}$/),
        fc.stringMatching(/^[ab]{0,12}$/),
        fc.integer({ min: 0, max: 3 }),
        (a, b, k) => {
          const full = fullDistance(a, b);
          expect(distanceWithin(a, b, k)).toBe(full <= k ? full : k + 1);
        },
      ),
      { seed: 7, numRuns: 2000 },
    );
  });
});

describe('bounded cost, counted in operations', () => {
  it('a 50,000-letter name and a similar unknown one: nothing is compared', () => {
    const long = `N${'ab'.repeat(25_000)}`;
    const similar = `${long.slice(0, -1)}x`;
    const work: SuggestWork = { ops: 0 };
    const index = caseFoldedIndex([long, 'OA', 'RA'], work);
    expect(suggestName(similar, index, work)).toBeNull();
    // A full distance would fill 50,000² cells; the length cap leaves the index of three names.
    expect(work.ops).toBeLessThan(100);
    // And the other way round: an ordinary word against the long name skips it unread.
    const w2: SuggestWork = { ops: 0 };
    expect(nearest('OA', [long], 2, w2)).toBeNull();
    expect(w2.ops).toBeLessThanOrEqual(1);
  });

  it('the same in a note: no suggestion, and the rest of the note is evaluated', () => {
    const long = `N${'ab'.repeat(25_000)}`;
    const a = analyzeNote(fence([`state ${long}: db=24C rh=50%`, `process P: ${long.slice(0, -1)}x -> ${long}`]));
    const unknown = a.diagnostics.filter((d) => d.code === 'unknown-name');
    expect(unknown.length).toBe(1);
    expect(unknown[0]!.message).not.toContain('did you mean');
    expect(a.items.some((i) => i.name === long && i.kind === 'state' && i.state !== null)).toBe(true);
  });

  it('4,000 short unknown names against 8,000 names: linear, not 4,000 × 8,000', () => {
    const names: string[] = [];
    for (let i = 0; i < 4000; i++) names.push(`S${i}`, `P${i}`);
    const work: SuggestWork = { ops: 0 };
    const index = caseFoldedIndex(names, work);
    const built = work.ops;
    let suggested = 0;
    for (let i = 0; i < 4000; i++) if (suggestName(`Q${i}x`, index, work) !== null) suggested++;
    // Each look-up is bounded by its deletions and MAX_VERIFIED banded distances of short words.
    const perLookup = (work.ops - built) / 4000;
    expect(perLookup).toBeLessThan(MAX_VERIFIED * 5 * 8 + 100);
    // A scan would measure each of the 8,000 names for every unknown name: 32 million distances.
    expect(work.ops).toBeLessThan(4000 * 8000);
    expect(work.ops).toBeLessThan(40 * (names.length + 4000) * 10);
    expect(suggested).toBeGreaterThan(3000); // Q12x is two edits from S12 or P12
  });

  it('many names within two edits of the word: at most MAX_VERIFIED are measured', () => {
    const names = Array.from(
      { length: 5000 },
      (_, i) => `A${String.fromCharCode(0x41 + (i % 26))}${String.fromCharCode(0x41 + (Math.floor(i / 26) % 26))}`,
    );
    const index = new SuggestIndex(names);
    const work: SuggestWork = { ops: 0 };
    index.nearest('aaa', 2, work);
    expect(work.ops).toBeLessThan(MAX_VERIFIED * 5 * 3 + 50);
  });
});
