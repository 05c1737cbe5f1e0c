/**
 * The writer's paths that take less work per state: a state's figures written as one row from an
 * array of doubles (`figures`), line numbers from the four-digit table, and the items' lines
 * counted in the text as they come (no line index of the note). Each is compared with what
 * JSON.stringify writes for the objects the same description builds (ObjectWriter), or with a
 * line count made here independently, on the edges of each path: figures at the ends of the fast
 * range, ties, negatives, zeros and what is not a figure; rows at the top, first in their object
 * and across piece boundaries; line breaks of every kind and items out of document order.
 * (Figures and notes are invented; no figure here is a measured or published value.)
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../../shared-core/src/analyze';
import { evalFileJson, evalFileText, evalNoteText, fileResult, roundForJson } from '../src/output';
import { ObjectWriter, TextWriter, jsonKey, jsonKeyRow } from '../src/jsonWriter';
import { collector, stringifiedAt } from './lib/jsonText';

/** Figures at every edge of the fast path: the ends of its range, ties, binary and decimal exponents, zeros. */
function edgeFigures(): number[] {
  const xs = [1e-6, 9.99999999999e-7, 1e-7, 1.5e-7, 1e11, 99999999999.95, 99999999999.4, 1e11 - 1e-5];
  xs.push(1234567890.125, 2.5, 0.5, 0.125, 101.325, 84.5, 24, 24.5, 0.0093, 3.3e-6, 123456789012.5, 5e-324);
  xs.push(9.9999999999995, 9.99999999999949, 0.99999999999999, 100.000000000049, 1.0000000000005);
  xs.push(0, -0, 1e21, 1e22, Number.MAX_VALUE, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY);
  // Every binary exponent of the fast range (the decimals come from a table by exponent), just
  // below and above each power of two, and each power of ten.
  for (let b = -21; b <= 37; b++) {
    const a = 2 ** b;
    xs.push(a, a * (1 - 2 ** -52), a * (1 + 2 ** -52), a * 1.9999999999);
  }
  for (let k = -7; k <= 12; k++)
    xs.push(10 ** k, 10 ** k * (1 - 1e-13), 10 ** k * (1 + 1e-13), 10 ** k - 10 ** (k - 12) / 2);
  // Figures with trailing zeros after the point, and whole figures of every length.
  for (let k = 0; k < 12; k++) xs.push(1.5 * 10 ** k, 7 * 10 ** (k - 6), 123 * 10 ** (k - 4));
  return [...xs, ...xs.map((x) => -x)];
}

describe('a row of figures from an array of doubles', () => {
  const names = ['p_kPa', 'db_C', 'wb_C', 'dp_C', 'rh_pct', 'w_kgkg', 'h_kJkg', 'v_m3kg', 'rho_kgm3'];
  const row = jsonKeyRow(names.map((n) => jsonKey(`row_${n}`)));

  /** Writes `rows` (each nine figures; NaN for none) as objects of a row each, with a name first or not. */
  const write = (w: TextWriter | ObjectWriter, rows: Float64Array[], named: boolean): void => {
    w.openArray(null);
    for (const xs of rows) {
      w.open(null);
      if (named) w.str(jsonKey('row_name'), 'S');
      w.figures(row, xs);
      w.str(jsonKey('row_after'), 'x');
      w.close();
    }
    w.closeArray();
  };

  it('writes each figure as fig() does and as JSON.stringify writes the rounded figure, at every edge', () => {
    const xs = edgeFigures();
    const rows: Float64Array[] = [];
    for (let i = 0; i < xs.length; i += 9)
      rows.push(Float64Array.from({ length: 9 }, (_, k) => xs[(i + k) % xs.length]!));
    for (const named of [true, false]) {
      for (const depth of [0, 3]) {
        const objects = new ObjectWriter();
        write(objects, rows, named);
        const c = collector();
        const text = new TextWriter(depth, c.take);
        write(text, rows, named);
        text.flush();
        expect(c.text(), `named ${named}, depth ${depth}`).toBe(stringifiedAt(objects.result, depth));
        // NaN and ±Infinity are null in the objects as in the text; every other figure is rounded.
        const first = (objects.result as Record<string, unknown>[])[0]!;
        expect(first[row.keys[0]!.name]).toBe(roundForJson(rows[0]![0]));
      }
    }
  });

  it('writes a figure that repeats after the same line start as one copy, over many pieces', () => {
    // A pressure that never changes, figures that repeat in runs, and ones that change every time:
    // enough rows to cross many pieces (about 64 KB each), so that a kept copy meets a piece's end.
    const rows = Array.from({ length: 20_000 }, (_, i) =>
      Float64Array.of(
        101.325,
        i % 6 < 3 ? 24.5 : i / 7,
        i % 50 === 0 ? Number.NaN : -i / 3,
        i % 2 === 0 ? -0 : 0,
        50,
        0.0093,
        i,
        1 / (i + 1),
        i % 4 < 2 ? 1.2 : 1.25,
      ),
    );
    const objects = new ObjectWriter();
    write(objects, rows, true);
    const c = collector();
    const text = new TextWriter(2, c.take);
    write(text, rows, true);
    text.flush();
    expect(c.pieces.length).toBeGreaterThan(50);
    expect(c.text()).toBe(stringifiedAt(objects.result, 2));
    // The pressure, ±0 and 50 and 0.0093 are copies from the fourth row on, and the repeats of the
    // runs from their third repeat on (counted: the work saved cannot silently go).
    expect(text.copies).toBeGreaterThan(4 * 19_000);
    // The row's figures share their line starts with fig(): once the row has written the same
    // pressure three times after a line start, fig() writing it there is a copy too.
    const one = collector();
    const w = new TextWriter(2, one.take);
    for (let k = 0; k < 3; k++) {
      w.open(null);
      w.figures(row, rows[0]!);
      w.close();
    }
    const before = w.copies;
    w.open(null);
    w.fig(row.keys[0]!, 101.325);
    w.close();
    w.flush();
    expect(w.copies).toBe(before + 1);
  });

  it('writes a row as the top value, first in an object, and with a key too long for the buffer', () => {
    const long = jsonKey(`row_${'k'.repeat(5000)}`);
    const rows = [jsonKeyRow([jsonKey('row_a'), long, jsonKey('row_b')]), row];
    for (const r of rows) {
      const xs = Float64Array.from(r.keys, (_, i) => (i + 1) / 3);
      const objects = new ObjectWriter();
      objects.open(null);
      objects.figures(r, xs);
      objects.close();
      const c = collector();
      const text = new TextWriter(1, c.take);
      text.open(null);
      text.figures(r, xs);
      text.close();
      text.flush();
      expect(c.text()).toBe(stringifiedAt(objects.result, 1));
    }
    // As the top value (no object open) the members have no line of their own, as fig() writes them.
    const top = collector();
    const w = new TextWriter(0, top.take);
    w.figures(jsonKeyRow([jsonKey('row_a')]), Float64Array.of(0.1 + 0.2));
    w.flush();
    expect(top.text()).toBe('0.3');
  });
});

describe('line numbers', () => {
  it('writes whole numbers at the edges of the four-digit groups as JSON.stringify does', () => {
    const numbers = [0, 1, 9, 10, 99, 100, 999, 1000, 1001, 9999, 10000, 10001, 10010, 12340000, 99999999];
    numbers.push(100000000, 100000001, 999999999, 1e9, 4.5, -3);
    const key = jsonKey('line');
    const c = collector();
    const w = new TextWriter(0, c.take);
    w.open(null);
    for (const v of numbers) {
      w.open(key);
      w.num(key, v);
      w.str(jsonKey('after'), 'x');
      w.close();
    }
    w.close();
    w.flush();
    const want = numbers.map((v) => `\n  "line": {\n    "line": ${JSON.stringify(v)},\n    "after": "x"\n  }`);
    expect(c.text()).toBe(`{${want.join(',')}\n}`);
  });

  /** A note (invented) with states, a mix and processes among lines of prose, with `eol` line breaks. */
  const note = (eol: string): string =>
    [
      '# Plant room (invented)',
      '',
      'Some prose.',
      '```air',
      'state OA: db=31C rh=45%',
      '',
      'state RA: db=24C rh=50%',
      'state SA: db=13C rh=90%',
      'process COOL: RA -> SA m=1.5kg/s',
      'mix MX: OA 30% + RA 70%',
      'process HEAT: MX -> SA m=1.5kg/s',
      '```',
      'More prose.',
      '```air',
      'state LAST: db=20C rh=40%',
      '```',
      '',
    ].join(eol);

  /** The 1-based line where each name is defined, counted here on the text split at every kind of line break. */
  const definedOn = (text: string): Record<string, number> => {
    const out: Record<string, number> = {};
    text.split(/\r\n|\r|\n/).forEach((line, i) => {
      const m = /^(?:state|mix|process) (\w+):/.exec(line);
      if (m) out[m[1]!] = i + 1;
    });
    return out;
  };

  it('gives each state and process the line it is written on, with any line breaks', () => {
    for (const eol of ['\n', '\r\n', '\r']) {
      const text = note(eol);
      const want = definedOn(text);
      expect(Object.keys(want)).toHaveLength(7);
      const doc = evalFileJson(fileResult('n.md', text, analyzeNote(text))) as {
        states: { name: string; line: number }[];
        processes: { name: string; line: number }[];
      };
      const got: Record<string, number> = {};
      for (const x of [...doc.states, ...doc.processes]) got[x.name] = x.line;
      expect(got, JSON.stringify(eol)).toEqual(want);
      // The text written as the note is evaluated says the same (and needs no line index for it).
      const each = collector();
      const whole = collector();
      expect(evalNoteText('n.md', text, {}, 0, each.take)).not.toBeNull();
      evalFileText(fileResult('n.md', text, analyzeNote(text)), 0, whole.take);
      expect(each.text(), JSON.stringify(eol)).toBe(whole.text());
    }
  });

  it('finds the line of an item behind the last one asked for (items out of document order)', () => {
    const text = note('\n');
    const f = fileResult('n.md', text, analyzeNote(text));
    const want = definedOn(text);
    // The items handed out last first: each is behind the one before.
    const reversed = { ...f, analysis: { ...f.analysis, items: [...f.analysis.items].reverse() } };
    const doc = evalFileJson(reversed) as { states: { name: string; line: number }[] };
    expect(doc.states.map((s) => s.name)).toEqual(['LAST', 'MX', 'SA', 'RA', 'OA']);
    for (const s of doc.states) expect(s.line, s.name).toBe(want[s.name]);
  });
});
