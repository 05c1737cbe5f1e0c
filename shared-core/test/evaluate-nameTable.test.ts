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

describe('name table: numbered names', () => {
  /** The slot (its first word's index in the slots) of each of the first `count` places. */
  function slotsOfPlaces(table: NameTable, count: number): number[] {
    const slots = Reflect.get(table, 'slots') as Int32Array;
    const at = new Array<number>(count).fill(-1);
    for (let w = 0; w < slots.length; w += 2) if (slots[w + 1]! !== 0) at[slots[w + 1]! - 1] = w;
    return at;
  }

  it('gives names numbered in turn hashes one apart, and reads more than nine digits as characters', () => {
    expect(nameHash('S13') - nameHash('S12')).toBe(1);
    expect(nameHash('AHU_7')).toBe(nameHash('AHU_07')); // the same number: told apart by characters
    expect(nameHash('S1023') - nameHash('S0')).toBe(1023);
    // Across a block of 1024 numbers the hash moves elsewhere (the block's number is mixed in).
    expect(Math.abs(nameHash('S1024') - nameHash('S1023'))).toBeGreaterThan(1024);
    // More than nine digits are read as characters: FNV-1a over every code unit.
    const fnv1a = (text: string): number => {
      let h = 0x811c9dc5 | 0;
      for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
      return h;
    };
    expect(nameHash('S1234567890')).toBe(fnv1a('S1234567890'));
    expect(nameHash('OA')).toBe(fnv1a('OA'));
    expect(nameHash('S123456789')).not.toBe(fnv1a('S123456789'));
  });

  it('places names numbered in turn in slots in turn', () => {
    const n = 3000;
    const table = new NameTable(n);
    for (let i = 0; i < n; i++) expect(table.add(`S${i}`, i)).toBe(true);
    const at = slotsOfPlaces(table, n);
    const words = (Reflect.get(table, 'slots') as Int32Array).length;
    // Within a block of 1024 numbers each name's slot follows the one before it (round the end
    // of the slots), unless a name of another block took it first (the blocks stand anywhere).
    let inTurn = 0;
    for (let i = 1; i < n; i++) if (at[i] === (at[i - 1]! + 2) % words) inTurn++;
    expect(inTurn).toBeGreaterThan(0.99 * n);
  });

  it('steps out of a run of taken slots: names meeting one never probe long, and the answers stay', () => {
    // A long run of numbered names (a third of the slots), then other names, many of which have
    // their first slot inside the run: with a step to the next slot they would walk along it,
    // past the longest probe allowed, and the table would turn into a Map.
    const table = new NameTable(60_000);
    for (let i = 0; i < 40_000; i++) table.add(`S${i}`, i);
    const others: string[] = [];
    for (let i = 0; i < 5000; i++) others.push(`T${i}x`, `R${i}_a`);
    others.forEach((name, i) => {
      expect(table.add(name, 40_000 + i)).toBe(true);
    });
    expect(Reflect.get(table, 'map')).toBeNull();
    others.forEach((name, i) => {
      expect(table.get(name)).toBe(40_000 + i);
    });
    for (let i = 0; i < 40_000; i += 97) expect(table.get(`S${i}`)).toBe(i);
  });

  it('keeps its slots, without a Map, for notes numbered in steps, by several stems, or counting down', () => {
    const n = 100_000;
    const patterns: ((i: number) => string)[] = [
      (i) => `S${i}`,
      (i) => `S${i * 8}`,
      (i) => `S${i * 1000}`,
      (i) => `S${i * 1024}`,
      (i) => `S${i * 65_536}`,
      (i) => `S${n - i}`,
      (i) => `S${String(i).padStart(7, '0')}`,
      (i) => `${['OA', 'RA', 'SA', 'AHU', 'Room', 'S', 'MA', 'X_'][i % 8]}${Math.floor(i / 8)}`,
      (i) => `P${i % 100}_${Math.floor(i / 100)}`,
      (i) => `Z${i}x`,
    ];
    for (const name of patterns) {
      const table = new NameTable(n);
      for (let i = 0; i < n; i++) table.add(name(i), i);
      expect(Reflect.get(table, 'map'), name(12345)).toBeNull();
      for (let i = 0; i < n; i += 9973) expect(table.get(name(i))).toBe(i);
    }
  });
});
