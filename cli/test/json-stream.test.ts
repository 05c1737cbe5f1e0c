/**
 * `eval --format json` writes its document in pieces of UTF-8 bytes as it is made (about 64 KB at
 * a time, lent from one buffer unless the taker keeps them), without an object per state. The text
 * must stay exactly what `JSON.stringify({ files }, null, 2)` gave before: the fixture snapshots
 * (written by the one-string version) pin it byte for byte; the text of every note in the
 * repository (fixtures, examples, docs) is compared with JSON.stringify of the object form, which
 * comes from the same description of the shape, and the notes compared are checked to hold every
 * part of the shape (mixes, supplies, processes, claims, sources, defined_by, equipment, nulls);
 * the writer is compared with JSON.stringify on values of every kind (escapes, other scripts, long
 * strings, empty containers, nesting) and on a million figures; the command's whole output is
 * compared with the object form on notes that span several pieces. Each piece is decoded on its
 * own (so a piece that split a character would show). The faster rounding of figures is compared
 * with `toPrecision(12)` itself.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repo, repositoryNotes } from './lib/notes';
import { analyzeNote } from '../../shared-core/src/analyze';
import {
  countDiagnostics,
  evalFileJson,
  evalFileText,
  evalNoteText,
  fileResult,
  roundForJson,
  JSON_SIGNIFICANT_DIGITS,
} from '../src/output';
import { TextWriter, jsonKey, pieceText } from '../src/jsonWriter';
import { collector, stringifiedAt } from './lib/jsonText';
import { runCli as dewmark } from './lib/runCli';

const fixtures = join(repo, 'test', 'fixtures');

/** The text a TextWriter writes for `value` at `depth`, joined from its pieces. */
function written(value: unknown, depth: number): string {
  const c = collector();
  const w = new TextWriter(depth, c.take);
  w.value(null, value);
  w.flush();
  return c.text();
}

/** The text `evalFileText` hands out, joined, and the number of pieces. */
function streamed(path: string, text: string, depth: number): { text: string; pieces: number } {
  const c = collector();
  evalFileText(fileResult(path, text, analyzeNote(text)), depth, c.take);
  return { text: c.text(), pieces: c.pieces.length };
}

/** A note of `n` states (invented figures), with a mix, a process and an error every 50 states. */
function bigNote(n: number): string {
  const lines = ['# Many zones (invented)', '', '```air'];
  for (let i = 0; i < n; i++) {
    lines.push(`state Z${i}: db=${18 + (i % 12)}.${i % 10}C rh=${30 + (i % 50)}%`);
    if (i % 50 === 49) lines.push(`state BAD${i}: db=20C wb=${25 + (i % 3)}C`);
    if (i % 100 === 99)
      lines.push(`mix M${i}: Z${i} 30% + Z${i - 1} 70%`, `process P${i}: Z${i - 2} -> M${i} m=1.2kg/s`);
  }
  lines.push('```', '');
  return lines.join('\n');
}

describe('eval --format json, written in pieces', () => {
  for (const dir of ['features', 'diagnostics']) {
    const notes = readdirSync(join(fixtures, dir)).filter((f) => f.endsWith('.md'));
    it(`gives every ${dir} fixture byte for byte the JSON of its snapshot (written by the one-string version)`, () => {
      expect(notes.length).toBeGreaterThan(3);
      let compared = 0;
      for (const file of notes) {
        const snapshot = join(fixtures, dir, file.replace(/\.md$/, '.expected.json'));
        let expected: string;
        try {
          expected = readFileSync(snapshot, 'utf8');
        } catch {
          continue; // a fixture whose snapshot is not an eval document
        }
        if (!expected.startsWith('{\n  "path"')) continue;
        const path = `test/fixtures/${dir}/${file}`;
        const text = readFileSync(join(fixtures, dir, file), 'utf8');
        expect(`${streamed(path, text, 0).text}\n`, file).toBe(expected);
        compared++;
      }
      expect(compared).toBeGreaterThan(3);
    });
  }

  it('nests a file at any depth exactly as JSON.stringify does, over several pieces', () => {
    const text = bigNote(700);
    const analysis = analyzeNote(text);
    expect(analysis.items.some((i) => i.kind === 'process')).toBe(true);
    expect(analysis.diagnostics.length).toBeGreaterThan(10);
    const object = evalFileJson(fileResult('big.md', text, analysis));
    for (const depth of [0, 1, 2, 5]) {
      const { text: got, pieces } = streamed('big.md', text, depth);
      // JSON.stringify of the object nested `depth` levels deep (as the only element of arrays).
      let nested: unknown = object;
      for (let k = 0; k < depth; k++) nested = [nested];
      const whole = JSON.stringify(nested, null, 2);
      const inner = whole.slice(whole.indexOf('{'), whole.lastIndexOf('}') + 1);
      expect(got).toBe(inner);
      expect(pieces).toBeGreaterThan(4); // 700 states do not come as one string
    }
  });

  it('prints what stringifying all files at once prints, for several files, none, and an unreadable one', async () => {
    const cwd = join(fixtures, 'features');
    const files = readdirSync(cwd)
      .filter((f) => f.endsWith('.md'))
      .slice(0, 3);
    const r = await dewmark(['eval', '--format', 'json', ...files, 'missing.md'], cwd);
    expect(r.code).toBe(2); // the missing file
    expect(r.err).toContain('missing.md');
    const objects = files.map((f) => {
      const text = readFileSync(join(cwd, f), 'utf8');
      return evalFileJson(fileResult(f, text, analyzeNote(text)));
    });
    expect(r.out).toBe(`${JSON.stringify({ files: objects }, null, 2)}\n`);
    const none = await dewmark(['eval', '--format', 'json', 'missing.md'], cwd);
    expect(none.out).toBe(`${JSON.stringify({ files: [] }, null, 2)}\n`);
  });
});

describe('eval --format json, written without the objects', () => {
  it('gives every note in the repository the text JSON.stringify gives its objects; the notes hold every part', () => {
    const notes = repositoryNotes();
    expect(notes.length).toBeGreaterThan(50);
    // How often each part of the shape occurs in the notes compared (each must, for the comparison to cover it).
    const seen: Record<string, number> = {
      state: 0,
      mix: 0,
      supply: 0,
      process: 0,
      claims: 0,
      sources: 0,
      defined_by: 0,
      equipment: 0,
      wetting: 0,
      bf: 0,
      'failed state': 0,
      'null figure': 0,
      diagnostic: 0,
    };
    const count = (o: Record<string, unknown>): void => {
      for (const [k, v] of Object.entries(o)) {
        if (k in seen && k !== 'state' && k !== 'mix' && k !== 'supply' && k !== 'process') seen[k]!++;
        if (v === null) seen['null figure']!++;
        if (v && typeof v === 'object' && !Array.isArray(v)) count(v as Record<string, unknown>);
      }
    };
    for (const path of notes) {
      const text = readFileSync(path, 'utf8');
      const name = relative(repo, path);
      const f = fileResult(name, text, analyzeNote(text));
      const object = evalFileJson(f) as {
        states: Record<string, unknown>[];
        processes: Record<string, unknown>[];
        diagnostics: unknown[];
      };
      for (const depth of [0, 2]) {
        const c = collector();
        evalFileText(f, depth, c.take);
        expect(c.text(), `${name} at depth ${depth}`).toBe(stringifiedAt(object, depth));
      }
      for (const st of object.states) {
        seen[st.kind as string]!++;
        if (st.ok === false) seen['failed state']!++;
        count(st);
      }
      for (const p of object.processes) {
        seen.process!++;
        count(p);
      }
      seen.diagnostic! += object.diagnostics.length;
    }
    for (const [part, n] of Object.entries(seen)) expect(n, part).toBeGreaterThan(0);
  });

  it('writes each state as it is evaluated, keeping none: the same bytes and counts for every note here', () => {
    const notes = repositoryNotes();
    let handedOut = 0;
    for (const path of notes) {
      const text = readFileSync(path, 'utf8');
      const name = relative(repo, path);
      const f = fileResult(name, text, analyzeNote(text));
      const whole = collector();
      evalFileText(f, 2, whole.take);
      const each = collector();
      const counts = evalNoteText(name, text, {}, 2, each.take);
      // A note with a written results table, or that names IP units, is analysed whole (nothing written here).
      const declined = /units\s*:(?!\s*SI\b)/.test(text) || text.includes('dewmark-results');
      expect(counts === null, `${name} declined`).toBe(declined);
      if (counts === null) {
        expect(each.pieces, name).toHaveLength(0);
        continue;
      }
      handedOut++;
      expect(each.text(), name).toBe(whole.text());
      expect(counts, name).toEqual(countDiagnostics([f]));
    }
    // Most notes are written so, the examples among them.
    expect(handedOut).toBeGreaterThan(notes.length / 2);
    const example = readFileSync(join(repo, 'examples', 'kestrel-ridge-ahu1.md'), 'utf8');
    expect(evalNoteText('x.md', example, {}, 0, collector().take)).not.toBeNull();
  });

  it('writes values of every kind as JSON.stringify does, at any depth', () => {
    const long = `${'a'.repeat(5000)}"\\${'é'.repeat(3000)}`;
    const values: unknown[] = [
      {},
      [],
      [[]],
      { a: {}, b: [], c: [{}], d: [[], [1]] },
      {
        plain: 'RA',
        quote: 'say "hi"',
        backslash: 'a\\b',
        controls: '\u0000\u0001\t\n\r\u001f\u007f',
        other: 'Büro 24 °C, µg, 空調, 🌡',
        lone: '\ud800 and \udc00',
        long,
        empty: '',
        'key "quoted"': 1,
        'clé non ASCII': 2,
        [`k${'x'.repeat(5000)}`]: 3,
        missing: undefined,
        fn: () => 1,
        nothing: null,
        yes: true,
        no: false,
        figures: [0, -0, 1, -1, 0.1, 1e21, 1e-7, 123456789.123, Number.NaN, Number.POSITIVE_INFINITY],
        holes: [undefined, null, () => 1],
      },
      'top',
      42,
      null,
    ];
    for (const v of values)
      for (const depth of [0, 1, 3])
        expect(written(v, depth), `${JSON.stringify(v)?.slice(0, 60)} at ${depth}`).toBe(stringifiedAt(v, depth));
    // A long document comes in pieces of about 64 KB (a write call each: few and large), none much
    // over (and none but the last much under: a string is not begun at the end of a full piece).
    const many = Array.from({ length: 40000 }, (_, i) => ({ name: `Z${i}`, t: 'é'.repeat(i % 7), x: i / 7 }));
    const c = collector();
    const w = new TextWriter(2, c.take);
    w.value(null, many);
    w.flush();
    expect(c.text()).toBe(stringifiedAt(many, 2));
    expect(c.pieces.length).toBeGreaterThan(10);
    for (const p of c.pieces) expect(Buffer.byteLength(p)).toBeLessThan(66_000);
    for (const p of c.pieces.slice(0, -1)) expect(Buffer.byteLength(p)).toBeGreaterThan(60_000);
  });

  it('writes a member whose value repeats after the same line start (copied with it) as JSON.stringify does', () => {
    // Runs of equal values (kept with their line start once they come three times running) and changes,
    // at two depths, with values too long to keep, long strings handed out as pieces of their own,
    // and enough rows for the repeats to cross many pieces.
    const K = {
      name: jsonKey('name'),
      kind: jsonKey('kind'),
      ok: jsonKey('ok'),
      p: jsonKey('p'),
      db: jsonKey('db'),
      defining: jsonKey('defining'),
      text: jsonKey('text'),
      inner: jsonKey('inner'),
    };
    const rows = Array.from({ length: 6000 }, (_, i) => ({
      name: `S${i}`,
      kind: i % 500 < 250 ? 'state' : i % 7 === 0 ? null : 'mix',
      ok: i % 3 !== 0,
      p: i % 40 < 30 ? 101.325 : i % 2 === 0 ? -0 : 0,
      db: i % 4 < 2 ? 24.5 : i % 9 === 0 ? null : 1 / 3,
      defining: i % 100 < 60 ? ['db', 'rh'] : i % 100 < 80 ? [] : Array.from({ length: 30 }, (_, k) => `key${k}`),
      text: i % 1000 < 400 ? 'default 101.325 kPa' : i % 1000 < 700 ? 'é'.repeat(200) : 'x'.repeat(5000),
      inner: { p: 101.325, defining: ['db', 'rh'], ok: i % 5 === 0 },
    }));
    const c = collector();
    const w = new TextWriter(2, c.take);
    w.openArray(null);
    for (const r of rows) {
      w.open(null);
      w.str(K.name, r.name);
      w.str(K.kind, r.kind);
      w.bool(K.ok, r.ok);
      w.fig(K.p, r.p);
      w.fig(K.db, r.db);
      w.strings(K.defining, r.defining);
      w.str(K.text, r.text);
      w.open(K.inner);
      w.fig(K.p, r.inner.p);
      w.strings(K.defining, r.inner.defining);
      w.bool(K.ok, r.inner.ok);
      w.close();
      w.close();
    }
    w.closeArray();
    w.flush();
    const want = rows.map((r) => ({ ...r, p: roundForJson(r.p), db: roundForJson(r.db) }));
    expect(c.pieces.length).toBeGreaterThan(50);
    expect(c.text()).toBe(stringifiedAt(want, 2));
  });

  it('copies a member whose value came three times running after the same line start, and only then', () => {
    // The members of every state that repeat (kind, ok, pressure, its description, defining keys)
    // are written as one copy once kept: counted, so that the saving cannot silently go.
    // What is kept stays with the line starts (keys by depth) from writer to writer: each run has
    // keys and strings of its own, at a depth as shallow as a document's states (a deep line start
    // with its value is too long to keep).
    const run = (rows: number, same: boolean, depth: number): number => {
      const K = { name: jsonKey(`name${depth}`), kind: jsonKey(`kind${depth}`), ok: jsonKey(`ok${depth}`) };
      const p = jsonKey(`p_kPa${depth}`);
      const defining = jsonKey(`defining${depth}`);
      const pressure = jsonKey(`pressure${depth}`);
      const w = new TextWriter(depth, () => false);
      w.openArray(null);
      for (let i = 0; i < rows; i++) {
        w.open(null);
        w.str(K.name, `S${i}`); // never the same: never copied
        w.str(K.kind, same ? 'state' : `k${i}`);
        w.bool(K.ok, true);
        w.fig(p, same ? 101.325 : 90 + i / 7);
        w.strings(defining, same ? [`db${depth}`, `rh${depth}`] : [`db${depth}`, `x${i}`]);
        w.str(pressure, same ? 'default 101.325 kPa' : `p${i}`);
        w.close();
      }
      w.closeArray();
      w.flush();
      return w.copies;
    };
    // A value is kept the third time it comes running (KEEP_RUN), and every later one is a copy
    // (true and false are kept the first time each comes); changing values are written every
    // time, but for the first defining key, an element of its own.
    expect(run(1000, true, 5)).toBe(4 * (1000 - 3) + (1000 - 1));
    expect(run(1000, false, 6)).toBe(1000 - 1 + (1000 - 3));
  });

  it('writes whole numbers (line numbers) and any other number as JSON.stringify does', () => {
    const numbers = [0, -0, 1, 9, 10, 99, 100, 4321, 99999, 100000, 123456789, 999999999, 1e9, 2 ** 31, 2 ** 53];
    numbers.push(-1, -100, 0.5, 1.25, 1e21, 1e-7, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY);
    const key = jsonKey('line');
    const c = collector();
    const w = new TextWriter(0, c.take);
    w.open(null);
    for (const v of numbers) {
      w.openArray(key);
      w.num(null, v);
      w.closeArray();
    }
    w.close();
    w.flush();
    const want = numbers.map((v) => `\n  "line": [\n    ${JSON.stringify([v]).slice(1, -1)}\n  ]`).join(',');
    expect(c.text()).toBe(`{${want}\n}`);
  });

  it('lends one buffer over and over, and takes new memory for each piece the taker keeps', () => {
    const many = Array.from({ length: 20000 }, (_, i) => ({ name: `Z${i}`, t: 'é'.repeat(i % 7), x: i / 7 }));
    const want = stringifiedAt(many, 2);
    // A taker that writes at once (returns false): every piece is the same memory.
    const memories = new Set<ArrayBufferLike>();
    const c = collector();
    const lending = new TextWriter(2, (piece) => {
      memories.add(piece.buffer);
      return c.take(piece);
    });
    lending.value(null, many);
    lending.flush();
    expect(c.text()).toBe(want);
    expect(c.pieces.length).toBeGreaterThan(10);
    expect(memories.size).toBe(1);
    // A taker that keeps every other piece as it is, uncopied (a stream that queues them): what
    // it keeps is never written over, and the pieces it lets go are the same memory again.
    const kept: Uint8Array[] = [];
    const all: (Uint8Array | string)[] = [];
    let n = 0;
    const keeping = new TextWriter(2, (piece) => {
      const keep = n++ % 2 === 0;
      if (keep) kept.push(piece);
      all.push(keep ? piece : pieceText(piece));
      return keep;
    });
    keeping.value(null, many);
    keeping.flush();
    expect(all.map((p) => (typeof p === 'string' ? p : pieceText(p))).join('')).toBe(want);
    expect(new Set(kept.map((p) => p.buffer)).size).toBe(kept.length);
  });

  it('writes a million figures as JSON.stringify writes them rounded, and every edge', () => {
    let s = 20261204;
    const random = () => {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      return s / 4294967296;
    };
    const key = jsonKey('x');
    const check = (xs: number[]): number => {
      const c = collector();
      const w = new TextWriter(1, c.take);
      w.open(null);
      w.openArray(key);
      for (const x of xs) w.fig(null, x);
      w.closeArray();
      w.close();
      w.flush();
      const got = c.text();
      const want = stringifiedAt({ x: xs.map((x) => roundForJson(x)) }, 1);
      if (got === want) return 0;
      // Name the first figure that differs.
      const g = got.split('\n');
      const e = want.split('\n');
      const i = g.findIndex((line, k) => line !== e[k]);
      expect(g[i], `figure ${xs[i - 2]}`).toBe(e[i]);
      return 1;
    };
    let differ = 0;
    for (let batch = 0; batch < 100; batch++) {
      const xs: number[] = [];
      for (let i = 0; i < 10_000; i++) {
        // Magnitudes 1e-9 … 1e13, both signs, and short decimals (figures as written: 24.5, 0.0093).
        const m = random() * 10 ** Math.floor(random() * 23 - 9);
        xs.push(i % 3 === 0 ? Number(m.toPrecision(1 + (i % 14))) : random() < 0.5 ? -m : m);
      }
      differ += check(xs);
    }
    expect(differ).toBe(0);
    // Ties, powers of ten, the edges of the fast range, a rounding up to 13 digits, and what is not a figure.
    const edges = [1234567890.125, -1234567890.125, 0.5, 2.5, 1e-6, 9.99999999999e-7, 1e-7, 1.5e-7, 1e11];
    edges.push(99999999999.95, 999999999999.5, 0.1, 1, 10, 100, 1e-5, 123456789012.5, 5e-324, Number.MAX_VALUE);
    edges.push(-0, 0, 0.000123456789012345, 101.325, 84.5, 9.9999999999995, 9.99999999999949, -0.99999999999999);
    edges.push(1e21, 1e22, -1e-300, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY);
    for (let k = -8; k <= 12; k++) edges.push(10 ** k, -(10 ** k), 10 ** k * (1 - 1e-13), 10 ** k * (1 + 1e-13));
    expect(check(edges)).toBe(0);
  });
});

describe('rounding figures for the JSON', () => {
  /** What the JSON held before: toPrecision(12) read back, without a negative zero. */
  const slow = (x: number): number | null => {
    if (!Number.isFinite(x)) return null;
    const v = Number(x.toPrecision(JSON_SIGNIFICANT_DIGITS));
    return Object.is(v, -0) ? 0 : v;
  };

  it('equals toPrecision(12) read back on a million figures of every magnitude and on ties', () => {
    let s = 20261203;
    const random = () => {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      return s / 4294967296;
    };
    let differ = 0;
    for (let i = 0; i < 1_000_000; i++) {
      // Magnitudes 1e-9 … 1e13, both signs, and short decimals (figures as written: 24.5, 0.0093).
      const m = random() * 10 ** Math.floor(random() * 23 - 9);
      const x = i % 3 === 0 ? Number(m.toPrecision(1 + (i % 14))) : random() < 0.5 ? -m : m;
      if (!Object.is(roundForJson(x), slow(x))) differ++;
    }
    expect(differ).toBe(0);
    // Exact binary ties at the 12th digit (toPrecision takes the larger magnitude), powers of ten
    // and the edges of the fast range.
    const edges = [
      1234567890.125,
      -1234567890.125,
      0.5,
      2.5,
      1e-6,
      9.99999999999e-7,
      1e11,
      99999999999.95,
      999999999999.5,
      0.1,
      1,
      10,
      100,
      1e-5,
      123456789012.5,
      5e-324,
      Number.MAX_VALUE,
      -0,
      0,
      0.000123456789012345,
      101.325,
      84.5,
    ];
    for (const x of edges) expect(roundForJson(x), String(x)).toBe(slow(x));
    for (const x of [Number.NaN, Number.POSITIVE_INFINITY, null, undefined]) expect(roundForJson(x)).toBeNull();
  });
});
