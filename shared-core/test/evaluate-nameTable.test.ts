/**
 * The evaluator's table of names (`nameTable.ts`): every name keeps the value of its first
 * addition, whatever the names and however many, and names written to collide in the table's
 * hash move it to a Map without changing an answer. The names are invented; no figure is checked.
 */
import { describe, expect, it, vi } from 'vitest';
import { FIRST_SLOTS, MAX_PROBE, NameTable, nameHash } from '../src/evaluate/nameTable';

/** Names of many shapes: short, long, accented, astral, with digits (invented). */
function someNames(n: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < n; i++) {
    const base = ['S', 'AHU_', 'Zuluft', 'Ölraum', '𝔸', 'x'][i % 6]!;
    out.push(i % 7 === 0 ? `${base}${i}_${'k'.repeat(i % 40)}` : `${base}${i}`);
  }
  return out;
}

describe('name table', () => {
  it('keeps the first value of each name, answers -1 for others, over many growths', () => {
    const names = someNames(20_000);
    const table = new NameTable();
    names.forEach((name, i) => {
      expect(table.add(name, i)).toBe(true);
    });
    names.forEach((name, i) => {
      expect(table.add(name, i + 1)).toBe(false);
    });
    names.forEach((name, i) => {
      expect(table.get(name)).toBe(i);
      expect(table.has(name)).toBe(true);
    });
    for (const other of ['', 'S20000', 's0', 'S0 ', 'Ölraum3 ']) {
      expect(table.get(other)).toBe(-1);
      expect(table.has(other)).toBe(false);
    }
  });

  it('moves to a Map when names collide in its slots, with the same answers', () => {
    // Names whose hashes share the slot of a new table: more of them than a probe may run.
    const mask = FIRST_SLOTS - 1;
    const target = nameHash('N0') & mask;
    const colliding: string[] = [];
    for (let i = 0; colliding.length < MAX_PROBE + 10; i++)
      if ((nameHash(`N${i}`) & mask) === target) colliding.push(`N${i}`);
    const table = new NameTable();
    colliding.forEach((name, i) => {
      expect(table.add(name, i)).toBe(true);
    });
    expect(table.add('plain', 999)).toBe(true);
    expect(Reflect.get(table, 'map')).toBeInstanceOf(Map); // the probe did run too long
    colliding.forEach((name, i) => {
      expect(table.add(name, 0)).toBe(false);
      expect(table.get(name)).toBe(i);
    });
    expect(table.get('plain')).toBe(999);
    expect(table.get('N-1')).toBe(-1);
  });
});

describe('name table: work per name', () => {
  it("reads a slot's hash and place as one entry, and compares characters only with names of the same hash", () => {
    // Compared characters are work (and, in a long note, a branch met late): a new name is
    // compared only with a name whose whole 32-bit hash is its own, not with one in every few
    // hundred it meets, however full the table.
    const names = someNames(30_000);
    const table = new NameTable(names.length);
    // Two words per slot (hash, place + 1), and no other per-slot array.
    expect(Reflect.get(table, 'slots')).toBeInstanceOf(Int32Array);
    expect(Reflect.get(table, 'marks')).toBeUndefined();
    expect(Reflect.get(table, 'placeOfSlot')).toBeUndefined();
    // Per name: how many names before it have its hash.
    const byHash = new Map<number, number>();
    const earlier = names.map((name) => {
      const h = nameHash(name);
      const n = byHash.get(h) ?? 0;
      byHash.set(h, n + 1);
      return n;
    });
    const proto = NameTable.prototype as unknown as { isNameAt(place: number, name: string): boolean };
    const compare = vi.spyOn(proto, 'isNameAt');
    try {
      names.forEach((name, i) => {
        expect(table.add(name, i)).toBe(true);
      });
      // Each earlier name of the same hash stands in the new name's run of slots (no name is
      // ever removed), so it is compared once; no other is.
      expect(compare).toHaveBeenCalledTimes(earlier.reduce((a, b) => a + b, 0));
      // A name added again, or looked up, is compared with those before it of its hash, then itself.
      for (const i of [0, 123, 4567, names.length - 1]) {
        compare.mockClear();
        expect(table.add(names[i]!, -5)).toBe(false);
        expect(compare).toHaveBeenCalledTimes(earlier[i]! + 1);
        compare.mockClear();
        expect(table.get(names[i]!)).toBe(i);
        expect(compare).toHaveBeenCalledTimes(earlier[i]! + 1);
      }
    } finally {
      compare.mockRestore();
    }
  });
});
