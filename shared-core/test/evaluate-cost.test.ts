/**
 * The evaluator's work per statement, counted (never timed): the Map look-ups it makes. A note of
 * n states without references records each name once, in the registry of names, and makes no
 * map of names while it is evaluated (`analysis.byName` is made at its first read, with the same
 * names, order and items); the other look-ups are the units of the written figures. The note is
 * invented; no figure is checked here.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { evaluate } from '../src/evaluate/evaluate';
import type { StateResult } from '../src/evaluate/types';
import { parseNote } from '../src/notation/parse';

/** A block of `n` states with distinct names, each from db and rh (invented). */
function statesNote(n: number, extra = ''): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${15 + (i % 10)}C rh=${40 + (i % 30)}%`);
  if (extra) lines.push(extra);
  lines.push('```', '');
  return lines.join('\n');
}

/** Counts the calls of Map's get, has and set while `run` runs. */
function mapOperations(run: () => void): number {
  let calls = 0;
  for (const key of ['get', 'has', 'set'] as const) {
    const original = Map.prototype[key] as (...args: unknown[]) => unknown;
    vi.spyOn(Map.prototype, key).mockImplementation(function (this: Map<unknown, unknown>, ...args: unknown[]) {
      calls++;
      return original.apply(this, args);
    } as never);
  }
  try {
    run();
  } finally {
    vi.restoreAllMocks();
  }
  return calls;
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe('evaluator cost: the names of a note', () => {
  it('makes four Map look-ups per state: two to register its name, one per unit written', () => {
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      const parsed = parseNote(text);
      let items = 0;
      const ops = mapOperations(() => {
        items = evaluate(parsed, {}, text).items.length;
      });
      expect(items).toBe(n); // the count does see every state evaluated
      expect(ops).toBeGreaterThanOrEqual(n); // every name is recorded
      // A get and a set to register each name, and the unit of db= and of rh=; storing the item
      // looks nothing up (it was 5 more per state: a second table of names and the map of names).
      expect(ops).toBeLessThanOrEqual(4 * n + 64);
    }
  });

  it('makes the map of names at its first read: the same names in order, each its first definition', () => {
    const text = statesNote(300, 'state S7: db=30C rh=20%\nstate T: db=21C w=S3.w');
    const analysis = evaluate(parseNote(text), {}, text);
    const names = [...analysis.byName.keys()];
    expect(names.length).toBe(301);
    expect(names[0]).toBe('S0');
    expect(names[300]).toBe('T');
    // The duplicate S7 is not its owner: the first S7 is.
    const s7 = analysis.byName.get('S7') as StateResult;
    expect(s7).toBe(analysis.items[7]);
    expect(analysis.items[300]!.name).toBe('S7');
    expect(analysis.diagnostics.map((d) => d.code)).toContain('duplicate-name');
    // One map, however often it is read; and it can be replaced like any property.
    expect(analysis.byName).toBe(analysis.byName);
    const replaced = new Map();
    analysis.byName = replaced;
    expect(analysis.byName).toBe(replaced);
  });

  it('makes the map of names once for a note with references, while it is evaluated', () => {
    const text = statesNote(1000, 'state T: db=21C w=S3.w');
    const parsed = parseNote(text);
    let analysis: ReturnType<typeof evaluate> | null = null;
    const ops = mapOperations(() => {
      analysis = evaluate(parsed, {}, text);
    });
    expect(analysis!.byName.get('T')).toBe(analysis!.items[1000]);
    // As above, and the map made at the reference (1 per name).
    expect(ops).toBeLessThanOrEqual(5 * 1001 + 64);
  });
});
