/**
 * The evaluator's table of names (`nameTable.ts`): every name keeps the value of its first
 * addition, whatever the names and however many, and names written to collide in the table's
 * hash move it to a Map without changing an answer. The names are invented; no figure is checked.
 */
import { describe, expect, it } from 'vitest';
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
