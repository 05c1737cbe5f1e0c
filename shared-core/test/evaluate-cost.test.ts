/**
 * The evaluator's work per statement, counted (never timed): the Map look-ups it makes, and the
 * bytes its results hold. A note of n states without references records each name once, in the
 * registry of names, and makes no map of names while it is evaluated (`analysis.byName` is made
 * at its first read, with the same names, order and items); the other look-ups are the units of
 * the written figures. The bytes are the heap's growth between two forced collections (code
 * left out), so they do not depend on the machine's speed or load. The note is invented; no
 * figure is checked here.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { heapBytes } from './heap-helpers';
import { evaluate } from '../src/evaluate/evaluate';
import type { StateResult } from '../src/evaluate/types';
import type { StateStatement } from '../src/notation/ast';
import { parseNote } from '../src/notation/parse';

/** A block of `n` states with distinct names, each from db and rh (invented). */
function statesNote(n: number, extra = ''): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${15 + (i % 10)}C rh=${40 + (i % 30)}%`);
  if (extra) lines.push(extra);
  lines.push('```', '');
  return lines.join('\n');
}

/** Counts the calls of Map's get, has and set and Set's add and has while `run` runs. */
function mapOperations(run: () => void): number {
  let calls = 0;
  const spy = <P extends object>(proto: P, key: keyof P & string): void => {
    const original = proto[key] as (...args: unknown[]) => unknown;
    vi.spyOn(proto, key as never).mockImplementation(function (this: unknown, ...args: unknown[]) {
      calls++;
      return original.apply(this, args);
    } as never);
  };
  spy(Map.prototype, 'get');
  spy(Map.prototype, 'has');
  spy(Map.prototype, 'set');
  spy(Set.prototype, 'add');
  spy(Set.prototype, 'has');
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
  it('makes no Map or Set look-up per state: names go to the name table, units are the ones found last', () => {
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      const parsed = parseNote(text);
      let items = 0;
      const ops = mapOperations(() => {
        items = evaluate(parsed, {}, text).items.length;
      });
      expect(items).toBe(n); // the count does see every state evaluated
      // A state's name is registered in the evaluator's name table (`nameTable.ts`), and the units
      // of its figures come from the last ones found; a handful of look-ups for the whole note.
      // (It was 4 per state: a get and a set to register the name, and one per unit written.)
      expect(ops).toBeLessThanOrEqual(64);
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
    expect(ops).toBeGreaterThanOrEqual(1000); // the count does see the map being made
    // As above, and the map made at the reference (1 per name).
    expect(ops).toBeLessThanOrEqual(1001 + 64);
  });
});

describe('evaluator cost: what the results of a note hold', () => {
  it('holds at most 340 bytes per simple state once evaluated (its result, state and place in the lists)', () => {
    const n = 5000;
    const text = statesNote(n);
    evaluate(parseNote(text), {}, text); // compiled and warm, on the same note, before the count
    /** Heap bytes per state the evaluation holds (a call of its own: nothing of it is held after). */
    const count = (): number => {
      const parsed = parseNote(text);
      const before = heapBytes();
      const analysis = evaluate(parsed, {}, text);
      const bytes = (heapBytes() - before) / n;
      // Read after the count, so the analysis is held while it is made.
      expect(analysis.items).toHaveLength(n);
      expect(analysis.diagnostics).toEqual([]);
      return bytes;
    };
    // The least of three counts: what the engine allocates for itself now and then as code warms
    // (and a collection's sweeping not yet done on a busy machine) adds to one count, never the results.
    const perState = Math.min(count(), count(), count());
    expect(perState).toBeLessThan(340);
  });

  it('shares the empty claims and the defining pair between results, which serialise as lists of their own', () => {
    const text = statesNote(40);
    const items = evaluate(parseNote(text), {}, text).items as StateResult[];
    const [a, b] = [items[0]!, items[1]!];
    expect(a.claims).toBe(b.claims);
    expect(a.defining).toBe(b.defining);
    expect(a.defining).toEqual(['db', 'rh']);
    expect(Object.isFrozen(a.claims) && Object.isFrozen(a.defining)).toBe(true);
    // Serialised, each list is a list of its own (a serialiser that marks an object met twice sees none twice).
    const seen = new WeakSet<object>();
    const lists = JSON.stringify([a.claims, b.claims, a.defining, b.defining], (_k, v: unknown) => {
      if (v && typeof v === 'object') {
        if (seen.has(v)) return '[seen]';
        seen.add(v);
      }
      return v;
    });
    expect(lists).toBe('[[],[],["db","rh"],["db","rh"]]');
  });

  it('reads a line of many properties once over: duplicates are found among the first of each known key', () => {
    // One state line of n unknown keys and then n dry-bulbs (a crafted line, invented figures):
    // each dry-bulb after the first is a duplicate of the first. Looking for that first one
    // among every property before it read the line n² times over.
    const n = 2000;
    const line = `state X: ${'zz=1 '.repeat(n)}${'db=20C '.repeat(n)}rh=50%`;
    const text = `\`\`\`air\n${line}\n\`\`\`\n`;
    const parsed = parseNote(text);
    const stmt = parsed.statements[0] as StateStatement;
    let reads = 0;
    stmt.props = new Proxy(stmt.props, {
      get(target, key, receiver) {
        if (typeof key === 'string' && /^\d+$/.test(key)) reads++;
        return Reflect.get(target, key, receiver);
      },
    });
    const analysis = evaluate(parsed, {}, text);
    expect(stmt.props).toHaveLength(2 * n + 1);
    expect(reads).toBeLessThan(3 * stmt.props.length);
    // The diagnostics are the same: each unknown key, and each later dry-bulb pointing at the first.
    const codes = analysis.diagnostics.map((d) => d.code);
    expect(codes.filter((c) => c === 'unknown-key')).toHaveLength(n);
    const duplicates = analysis.diagnostics.filter((d) => d.code === 'duplicate-key');
    expect(duplicates).toHaveLength(n - 1);
    const firstDb = stmt.props[n]!;
    expect(firstDb.key).toBe('db');
    for (const d of duplicates) expect(d.related?.[0]?.span).toEqual(firstDb.span);
  });
});
