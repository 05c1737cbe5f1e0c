/**
 * The parser's work per statement, counted (never timed): a note of many well-written states is
 * read without copying a key, unit or keyword out of the document for each property, and without
 * looking anything up in the key table (only a message needs a key's example). The counts are of
 * calls the parser makes (`String.prototype.slice` is wrapped while it runs; the key table's
 * lookup is a spy), so they do not depend on the machine or its load.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { findKey } from '../src/vocabulary/keys';
import { parseNote } from '../src/notation/parse';

vi.mock('../src/vocabulary/keys', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../src/vocabulary/keys')>();
  return { ...actual, findKey: vi.fn(actual.findKey) };
});

/** A fence of `n` states of an invented building, each with two properties (demo data). */
function statesNote(n: number): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state P${i}: db=${(i % 40) + 0.5}C rh=${(i % 90) + 5}%`);
  lines.push('```', '');
  return lines.join('\n');
}

/** Runs `fn` with `String.prototype.slice` counted; returns the result and the number of calls. */
function countingSlices<T>(fn: () => T): { result: T; slices: number } {
  const original = String.prototype.slice;
  let slices = 0;
  String.prototype.slice = function (this: string, start?: number, end?: number): string {
    slices++;
    return original.call(this, start, end);
  };
  try {
    return { result: fn(), slices };
  } finally {
    String.prototype.slice = original;
  }
}

afterEach(() => {
  vi.mocked(findKey).mockClear();
});

describe('parser cost per statement', () => {
  it('copies at most the name and the two numbers of each state out of the document', () => {
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      parseNote(text); // keys and units seen once before
      const { result, slices } = countingSlices(() => parseNote(text));
      expect(result.diagnostics).toEqual([]);
      expect(result.statements).toHaveLength(n);
      const last = result.statements[n - 1];
      expect(last?.keyword === 'state' && last.props.map((p) => p.key)).toEqual(['db', 'rh']);
      // Per state at most its name and its two numbers' texts (a number written before is shared
      // too). Keys (`db`, `rh`), units and the keyword are shared strings; a copy of each per
      // property would make 8 per state.
      expect(slices).toBeLessThanOrEqual(3 * n + 10);
    }
  });

  it('looks nothing up in the key table while reading statements without mistakes', () => {
    const parsed = parseNote(statesNote(1000));
    expect(parsed.diagnostics).toEqual([]);
    expect(vi.mocked(findKey)).not.toHaveBeenCalled();
  });

  it('still gives the key example in a message about a bad number', () => {
    const parsed = parseNote('```air\nstate RA: db=2..4C rh=50%\n```\n');
    expect(parsed.diagnostics.map((d) => d.code)).toEqual(['bad-number']);
    expect(parsed.diagnostics[0]?.message).toContain(`e.g. ${findKey('db')?.examples[0]}`);
    expect(vi.mocked(findKey)).toHaveBeenCalled();
  });
});
