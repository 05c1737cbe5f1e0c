/**
 * The JSON writer's usual lines take the same steps whatever their values, so that the engine,
 * which compiles a method from the steps it has seen taken, is never sent back to the interpreter
 * by a value first met after that (a zero, a figure that rounds up to 13 digits, a figure at a
 * half of its 12th digit, a figure whose last four digits are zeros, a line number of five
 * digits or more, an empty array at the end of the document). What can be counted is pinned
 * here: the figures that take the slow way
 * (`toPrecision`, counted by wrapping it), and the text of every such value, compared with
 * JSON.stringify. (No time is measured.)
 */
import { describe, expect, it } from 'vitest';
import { ObjectWriter, TextWriter, jsonKey, jsonKeyRow, roundForJson } from '../src/jsonWriter';
import { collector, stringifiedAt } from './lib/jsonText';

/** Runs `fn` with `Number.prototype.toPrecision` counted; returns the number of calls. */
function countingToPrecision(fn: () => void): number {
  const original = Number.prototype.toPrecision;
  let calls = 0;
  Number.prototype.toPrecision = function (this: number, precision?: number): string {
    calls++;
    return original.call(this, precision);
  };
  try {
    fn();
  } finally {
    Number.prototype.toPrecision = original;
  }
  return calls;
}

/** The text of `xs` as one array member `x` of an object at `depth`, with fig(). */
function figuresText(xs: readonly number[], depth: number): string {
  const c = collector();
  const w = new TextWriter(depth, c.take);
  w.open(null);
  w.openArray(jsonKey('x'));
  for (const x of xs) w.fig(null, x);
  w.closeArray();
  w.close();
  w.flush();
  return c.text();
}

describe('figures that once took the slow way', () => {
  // Zero (either sign), and figures whose 12 digits round up to 13 (…99999999999|5 and above).
  const zeros = [0, -0, 0, -0];
  const roundingUp = [9.9999999999995, 99.9999999999996, 0.99999999999996, 999999.9999999, -9.99999999999951e-5];
  // Figures at or next to a half of their 12th digit: exact binary halves (toPrecision rounds them
  // up), and the doubles either side of decimal halves, whose scaled value is exactly a half.
  const halves = [1234567890.125, -1234567890.125, 84.5, 0.5, 2.5, 123456789012.5 / 10];
  for (let k = 0; k < 400; k++) {
    const x = (100000000000 + 7919 * k + 0.5) / 10 ** (1 + (k % 16));
    halves.push(x, -x);
  }

  it('writes them without toPrecision, as JSON.stringify writes them rounded', () => {
    const xs = [...zeros, ...roundingUp, ...halves];
    let text = '';
    const calls = countingToPrecision(() => {
      text = figuresText(xs, 1);
    });
    expect(calls).toBe(0);
    expect(text).toBe(stringifiedAt({ x: xs.map((x) => roundForJson(x)) }, 1));
    // roundForJson gives the same doubles as toPrecision(12) read back (no negative zero), without it.
    let rounded: (number | null)[] = [];
    expect(countingToPrecision(() => (rounded = xs.map((x) => roundForJson(x))))).toBe(0);
    const original = Number.prototype.toPrecision;
    expect(rounded).toEqual(xs.map((x) => Number(original.call(x, 12)) || 0));
    expect(rounded.slice(0, 4).every((v) => Object.is(v, 0))).toBe(true);
  });

  it('still takes it for a figure out of the usual range, and writes null for no figure', () => {
    // 1e-7 and 1e11 (out of range), NaN (null).
    const xs = [1e-7, 1e11, Number.NaN];
    let text = '';
    const calls = countingToPrecision(() => {
      text = figuresText(xs, 1);
    });
    expect(calls).toBe(2);
    expect(text).toBe(stringifiedAt({ x: xs.map((x) => roundForJson(x)) }, 1));
  });

  it('writes figures whose last groups of four digits are zeros, in a row and alone', () => {
    // Trailing zeros in the last group, the last two groups, all three, and none.
    const xs = [101.325, 66, 1.5, 0.00731170748835, 123456780000, 12345678.9, 0.000120000001, 0.1];
    const row = jsonKeyRow(xs.map((_, i) => jsonKey(`z${i}`)));
    const c = collector();
    const w = new TextWriter(2, c.take);
    const o = new ObjectWriter();
    for (const writer of [w, o]) {
      writer.openArray(null);
      for (let k = 0; k < 3; k++) {
        writer.open(null);
        writer.figures(row, Float64Array.from(xs));
        writer.close();
      }
      writer.closeArray();
    }
    w.flush();
    expect(c.text()).toBe(stringifiedAt(o.result, 2));
  });
});

describe('figures below 1', () => {
  it('write `0.` and their zeros at once, for every count of zeros the fast range has (none to five)', () => {
    // `0.000000` goes as eight bytes and the digits over the zeros not needed: figures with 0 … 5
    // zeros after the point, either sign, with all 12 digits and with trailing zeros dropped.
    const xs: number[] = [];
    for (let k = 1; k <= 6; k++) {
      const unit = 10 ** -k;
      xs.push(unit, 1.23456789012 * unit, 9.99999999999 * unit, 1.5 * unit, 7.0000000001 * unit);
    }
    xs.push(1e-6, 9.99999999999e-7, 0.999999999999, 0.1, 0.5);
    const all = [...xs, ...xs.map((x) => -x)];
    expect(figuresText(all, 3)).toBe(stringifiedAt({ x: all.map((x) => roundForJson(x)) }, 3));
  });
});

describe('line numbers and the ends of objects and arrays', () => {
  it('writes line numbers of one to nine digits as JSON.stringify does', () => {
    const lines = [1, 9, 10, 99, 100, 999, 1000, 9999, 10000, 10001, 99999, 100000, 1234567, 99999999, 100000000];
    const c = collector();
    const w = new TextWriter(0, c.take);
    w.open(null);
    w.openArray(jsonKey('line'));
    for (const n of lines) w.num(null, n);
    w.closeArray();
    w.close();
    w.flush();
    expect(c.text()).toBe(JSON.stringify({ line: lines }, null, 2));
  });

  it('ends empty and full objects and arrays at every depth, beyond those made ahead too', () => {
    // Nested twelve deep: each level holds an empty object, an empty array, and the next level.
    let value: unknown = { last: [] };
    for (let k = 0; k < 12; k++) value = { empty: {}, none: [], next: value, list: [{}, []] };
    for (const depth of [0, 1, 5]) {
      const c = collector();
      const w = new TextWriter(depth, c.take);
      // Written member by member (open/close), as the document's shape is.
      const put = (key: string | null, v: unknown): void => {
        const k = key === null ? null : jsonKey(key);
        if (Array.isArray(v)) {
          w.openArray(k);
          for (const x of v) put(null, x);
          w.closeArray();
        } else {
          w.open(k);
          for (const [name, x] of Object.entries(v as object)) put(name, x);
          w.close();
        }
      };
      put(null, value);
      w.flush();
      expect(c.text()).toBe(stringifiedAt(value, depth));
    }
  });
});
