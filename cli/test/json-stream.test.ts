/**
 * `eval --format json` writes its document in pieces as it is made (a few hundred states at a
 * time) instead of stringifying one tree of the whole run. The text must stay exactly what
 * `JSON.stringify({ files }, null, 2)` gave before: the fixture snapshots (written by the
 * one-string version) pin it byte for byte, and the command's whole output is compared with the
 * object form on notes that span several pieces. The faster rounding of figures is compared with
 * `toPrecision(12)` itself.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../../shared-core/src/analyze';
import { evalFileJson, evalFileText, fileResult, roundForJson, JSON_SIGNIFICANT_DIGITS } from '../src/output';
import { runCli as dewmark } from './lib/runCli';

const fixtures = join(__dirname, '..', '..', 'test', 'fixtures');

/** The text `evalFileText` hands out, joined, and the number of pieces. */
function streamed(path: string, text: string, depth: number): { text: string; pieces: number } {
  const pieces: string[] = [];
  evalFileText(fileResult(path, text, analyzeNote(text)), depth, (c) => pieces.push(c));
  return { text: pieces.join(''), pieces: pieces.length };
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
