/**
 * A note's plain states are written from a skeleton: the fixed text of a state (its keys, its
 * kind, ok, defining keys and pressure description) made once from the state's own description
 * and cut where its name, line and figures go. The text must stay exactly what JSON.stringify
 * writes for the objects the same description builds (ObjectWriter): compared here on elements
 * whose names need escapes, are not ASCII or are too long for the buffer, on figures at every
 * edge, on fixed text that holds a mark the skeleton is cut at, and on notes whose states differ
 * in every way a skeleton is keyed by (computed or not, units, pressure, defining keys) or are not
 * plain (mixes, supplies, sources, claims, states a process defines). How many states are written
 * from a skeleton is counted (the saving cannot silently go). Notes and figures are invented.
 */
import { describe, expect, it, vi } from 'vitest';
import { analyzeNote } from '../../shared-core/src/analyze';
import { evalFileJson, evalFileText, evalNoteText, fileResult } from '../src/output';
import {
  type JsonWriter,
  ObjectWriter,
  type SkeletonMembers,
  TextWriter,
  jsonKey,
  jsonKeyRow,
} from '../src/jsonWriter';
import { collector, stringifiedAt } from './lib/jsonText';

const K = { name: jsonKey('sk_name'), line: jsonKey('sk_line'), kind: jsonKey('sk_kind') };
const K2 = { defining: jsonKey('sk_defining'), note: jsonKey('sk_note') };
const ROW = jsonKeyRow(['a', 'b', 'c', 'd'].map((n) => jsonKey(`sk_${n}`)));

/** An element's members, as a state's are laid out: name, line, a fixed string, the figures, fixed members after. */
const members =
  (note: string): SkeletonMembers =>
  (w: JsonWriter, name: string, line: number, xs: Float64Array): void => {
    w.open(null);
    w.str(K.name, name);
    w.num(K.line, line);
    w.str(K.kind, 'state');
    w.figures(ROW, xs);
    w.strings(K2.defining, ['db', 'rh']);
    w.str(K2.note, note);
    w.close();
  };

interface Element {
  name: string;
  line: number;
  xs: Float64Array;
}

/** The elements' text from a skeleton where the writer can, and JSON.stringify's of their objects. */
function both(elements: Element[], depth: number, note: string): { text: string; want: string; skeletal: number } {
  const write = members(note);
  const objects = new ObjectWriter();
  objects.openArray(null);
  for (const e of elements) write(objects, e.name, e.line, e.xs);
  objects.closeArray();
  const c = collector();
  const w = new TextWriter(depth, c.take);
  w.openArray(null);
  const skeleton = w.skeleton(ROW.keys.length, write, 101.325);
  for (const e of elements) {
    if (skeleton === null || !w.skeletal(skeleton, e.name, e.line, e.xs)) write(w, e.name, e.line, e.xs);
  }
  w.closeArray();
  w.flush();
  return { text: c.text(), want: stringifiedAt(objects.result, depth), skeletal: w.skeletons };
}

describe('elements written from a skeleton', () => {
  it('are what JSON.stringify writes, for names that need escapes, other scripts, long names and any figure', () => {
    const names = ['S1', 'a"b', 'back\\slash', 'tab\there', '\u0000nul', 'Zone café', '北区', '😀', 'x'.repeat(5000)];
    names.push('y'.repeat(4096), 'z'.repeat(4097), '');
    const figures = [101.325, 24.5, -0, 0, Number.NaN, 1e-7, 1e11, 99999999999.95, 0.0093, 3.3e-6, -40.125];
    figures.push(Number.POSITIVE_INFINITY, 1234567890.125, 0.99999999999996);
    const lines = [1, 9, 10, 9999, 10000, 123456789, 1e9, 2.5, -3];
    const elements: Element[] = [];
    for (let i = 0; i < 4000; i++) {
      const xs = Float64Array.from({ length: 4 }, (_, k) => figures[(i * 7 + k * 3) % figures.length]!);
      // The first figure is mostly the skeleton's own (its text then goes with the runs).
      if (i % 3 !== 0) xs[0] = 101.325;
      elements.push({ name: names[i % names.length]!, line: lines[i % lines.length]!, xs });
    }
    for (const depth of [0, 1, 4]) {
      const { text, want, skeletal } = both(elements, depth, 'default 101.325 kPa');
      expect(text, `depth ${depth}`).toBe(want);
      // Every element goes through the skeleton (4000 elements cross many pieces too).
      expect(skeletal).toBe(elements.length);
    }
  });

  it('is not made when a fixed member holds the text of a mark, and the elements are written member by member', () => {
    const elements: Element[] = [{ name: 'S', line: 3, xs: Float64Array.of(1, 2, 3, 4) }];
    elements.push({ name: 'T', line: 4, xs: Float64Array.of(101.325, 2.5, 3.5, 4.5) });
    for (const note of ['line 987654321', 'at 975318643.5', '\u0000\u0001\u0002']) {
      const { text, want, skeletal } = both(elements, 2, note);
      expect(text).toBe(want);
      expect(skeletal).toBe(0);
    }
    // A mark's text before its own place (the line's, in the name) does not hide the place.
    const { text, want, skeletal } = both([{ name: '987654321', line: 5, xs: Float64Array.of(1, 2, 3, 4) }], 2, 'n');
    expect(text).toBe(want);
    expect(skeletal).toBe(1);
  });

  it('is not made when the fixed text is longer than a long string, and such elements are written right', () => {
    // Fixed text longer than the buffer's room past a piece (a long description): member by member.
    const elements: Element[] = Array.from({ length: 3 }, (_, i) => ({
      name: `S${i}`,
      line: i,
      xs: Float64Array.of(1, 2, 3, i),
    }));
    for (const note of ['d'.repeat(3000), 'd'.repeat(100_000), 'é'.repeat(50_000)]) {
      const { text, want, skeletal } = both(elements, 2, note);
      expect(text).toBe(want);
      expect(skeletal).toBe(note.length <= 3000 ? 3 : 0);
    }
  });

  it("writes an element's figures and the text between them in one call", () => {
    const c = collector();
    const w = new TextWriter(2, c.take);
    w.openArray(null);
    const skeleton = w.skeleton(4, members('n'), 101.325)!;
    // (A method of the writer's own: counted through its prototype.)
    const run = vi.spyOn(TextWriter.prototype as unknown as { figureRun: () => void }, 'figureRun');
    try {
      for (let i = 0; i < 50; i++)
        w.skeletal(skeleton, `S${i}`, i, Float64Array.of(i % 2 ? 101.325 : 90, i / 7, -i, 0.001 * i));
      expect(run).toHaveBeenCalledTimes(50);
    } finally {
      run.mockRestore();
    }
    w.closeArray();
    w.flush();
    expect(w.skeletons).toBe(50);
  });

  it('writes nothing, and says so, at a depth other than its own or at the top', () => {
    const c = collector();
    const w = new TextWriter(1, c.take);
    w.openArray(null);
    const skeleton = w.skeleton(4, members('n'), 1)!;
    expect(skeleton).not.toBeNull();
    w.open(null);
    expect(w.skeletal(skeleton, 'S', 1, Float64Array.of(1, 2, 3, 4))).toBe(false);
    w.close();
    w.closeArray();
    const top = new TextWriter(2, c.take);
    expect(top.skeletal(skeleton, 'S', 1, Float64Array.of(1, 2, 3, 4))).toBe(false);
    top.flush();
    w.flush();
    expect(c.text()).toBe(stringifiedAt([{}], 1));
  });
});

/** A note of `n` states, each line made by `state(i)`. */
function note(n: number, state: (i: number) => string, head = ''): string {
  const lines = ['# Skeleton test (invented building)', '', '```air', head];
  for (let i = 0; i < n; i++) lines.push(state(i));
  lines.push('```', '');
  return lines.join('\n');
}

describe('a note written from skeletons', () => {
  /**
   * The note's eval text both ways (evalFileText, and evalNoteText where the note can be handed
   * out) against JSON.stringify; the states written from a skeleton.
   */
  function check(text: string): number {
    const spy = vi.spyOn(TextWriter.prototype, 'skeletal');
    try {
      const object = evalFileJson(fileResult('n.md', text, analyzeNote(text)));
      const c = collector();
      evalFileText(fileResult('n.md', text, analyzeNote(text)), 2, c.take);
      expect(c.text()).toBe(stringifiedAt(object, 2));
      const fromFile = spy.mock.results.filter((r) => r.value === true).length;
      const d = collector();
      if (evalNoteText('n.md', text, {}, 2, d.take) !== null) {
        expect(d.text()).toBe(stringifiedAt(object, 2));
        // The same states go through a skeleton the second way, and the first too now that the
        // shapes are made (skeletons are kept for the run).
        expect(spy.mock.results.filter((r) => r.value === true).length).toBeGreaterThanOrEqual(2 * fromFile);
      } else expect(d.text()).toBe('');
      return fromFile;
    } finally {
      spy.mockRestore();
    }
  }

  it('writes all but the first of many plain states from one skeleton (made at the second, kept for the run)', () => {
    const n = 600;
    const text = note(n, (i) => `state S${i}: db=${(i % 40) - 5}.${i % 10}C rh=${10 + (i % 85)}%`);
    expect(check(text)).toBeGreaterThanOrEqual(n - 1);
    // Once made, the first state of the next note is written from it too.
    expect(check(text)).toBe(n);
  });

  it('is the same text for states that fail, in I-P units, at other pressures, with other defining keys', () => {
    const mixed = (i: number): string => {
      switch (i % 7) {
        case 0:
          return `state F${i}: db=20C wb=${25 + (i % 3)}C`; // wet bulb above dry bulb: not computed
        case 1:
          return `state P${i}: db=20C rh=50% p=${90 + (i % 5)}kPa`; // a pressure of its own
        case 2:
          return `state W${i}: db=${20 + (i % 5)}C w=${5 + (i % 4)}g/kg`;
        default:
          return `state S${i}: db=${(i % 30) + 1}C rh=${20 + (i % 70)}%`;
      }
    };
    const si = check(note(700, mixed));
    const ip = check(note(700, (i) => `state I${i}: db=${60 + (i % 30)}F rh=${20 + (i % 70)}%`, 'units: IP'));
    const failing = check(note(300, (i) => `state F${i}: db=20C wb=${25 + (i % 3)}C`));
    // Plain states in runs of the same shape go through a skeleton; the alternating shapes make
    // at most a few, and states of a pressure of their own none.
    expect(si).toBeGreaterThan(300);
    expect(ip).toBeGreaterThanOrEqual(700 - 1);
    expect(failing).toBeGreaterThanOrEqual(300 - 1);
  });

  it('is the same text among states that are not plain (mixes, supplies, sources, claims, process outputs)', () => {
    const text = note(400, (i) => {
      const s = `state S${i}: db=${(i % 30) + 1}C rh=${20 + (i % 70)}%`;
      if (i % 10 === 3) return `${s}\nstate R${i}: db=S${i}.db+1K w=S${i}.w`;
      if (i % 10 === 5) return `${s}\nmix M${i}: S${i} 30% + S${i - 1} 70%`;
      if (i % 10 === 7) return `state C${i}: db=24C w=9.3g/kg rh=49%`;
      if (i % 10 === 9) return `${s}\nprocess H${i}: S${i} -> HOT${i} db=40C m=1kg/s`;
      return s;
    });
    const analysis = analyzeNote(text);
    const kinds = new Set(analysis.items.map((item) => item.kind));
    expect(kinds).toEqual(new Set(['state', 'mix', 'process']));
    expect(analysis.items.some((item) => item.kind !== 'process' && item.claims.length > 0)).toBe(true);
    expect(analysis.items.some((item) => item.kind !== 'process' && item.sources !== undefined)).toBe(true);
    expect(analysis.items.some((item) => item.kind !== 'process' && item.definedBy?.spec !== undefined)).toBe(true);
    expect(check(text)).toBeGreaterThan(100);
  });
});

describe('the buffer of a writer that has ended', () => {
  const text = note(3, (i) => `state S${i}: db=2${i}C rh=50%`);
  const file = () => fileResult('n.md', text, analyzeNote(text));

  it("is the next writer's (no new memory per note), unless the taker kept a piece of it", () => {
    const buffers: ArrayBufferLike[] = [];
    const lend = (piece: Uint8Array): boolean => {
      buffers.push(piece.buffer);
      return false;
    };
    evalFileText(file(), 2, lend);
    evalFileText(file(), 2, lend);
    evalNoteText('n.md', text, {}, 2, lend);
    expect(buffers.length).toBe(3);
    expect(new Set(buffers).size).toBe(1);
    // A taker that keeps its piece: the writer goes on in new memory, and the kept bytes stay as
    // they were while later notes are written.
    let kept: Uint8Array | null = null;
    evalFileText(file(), 2, (piece) => {
      kept = piece;
      return true;
    });
    const copy = Buffer.from(kept!).toString('latin1');
    const after: ArrayBufferLike[] = [];
    for (let k = 0; k < 3; k++)
      evalFileText(file(), 2, (piece) => {
        after.push(piece.buffer);
        return false;
      });
    expect(after).not.toContain(kept!.buffer);
    expect(Buffer.from(kept!).toString('latin1')).toBe(copy);
    expect(copy).toBe(stringifiedAt(evalFileJson(file()), 2));
  });
});
