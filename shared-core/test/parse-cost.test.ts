/**
 * The parser's work per statement, counted (never timed): a note of many well-written states is
 * read without copying a key, unit or keyword out of the document for each property, without
 * reading its characters over and over, and without looking anything up in the key table (only a
 * message needs a key's example). The counts are of calls the parser makes
 * (`String.prototype.slice` and `charCodeAt` are wrapped while it runs; the key table's lookup is
 * a spy; calls of the parser's own functions come from V8's precise coverage), so they do not
 * depend on the machine or its load. The objects a parsed note
 * keeps are counted the same way: by walking the tree (every object reachable through the fields of
 * the result), not by measuring the heap.
 */
import { Session } from 'node:inspector/promises';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { assignedFields } from './field-helpers';
import { findKey } from '../src/vocabulary/keys';
import type { ExtractedRegion } from '../src/markdown/regions';
import { parseNote, parseNoteStatements } from '../src/notation/parse';
import { ParsedNumber, ParsedProperty, ParsedQuantity, ParsedState, ParsedUnit } from '../src/notation/nodes';

vi.mock('../src/vocabulary/keys', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../src/vocabulary/keys')>();
  return { ...actual, findKey: vi.fn(actual.findKey) };
});

/** A fence of `n` states of an invented building, each with two properties (demo data). */
function statesNote(n: number): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state P${i}: db=${(i % 40) + 0.5}C rh=${(i % 90) + 5}%`);
  lines.push('```', '');
  return lines.join('\n');
}

/** Runs `fn` with `String.prototype.slice` counted; returns the result and the number of calls. */
function countingSlices<T>(fn: () => T): { result: T; slices: number } {
  const original = String.prototype.slice;
  let slices = 0;
  String.prototype.slice = function (this: string, start?: number, end?: number): string {
    slices++;
    return original.call(this, start, end);
  };
  try {
    return { result: fn(), slices };
  } finally {
    String.prototype.slice = original;
  }
}

/**
 * Distinct objects (arrays included) reachable from `root` through its own fields. A span a node
 * makes when it is read is not a field, and is not counted: it lives only as long as its reader
 * keeps it.
 */
function objectsKept(root: unknown): number {
  const seen = new Set<object>();
  const todo: unknown[] = [root];
  while (todo.length > 0) {
    const v = todo.pop();
    if (typeof v !== 'object' || v === null || seen.has(v)) continue;
    seen.add(v);
    for (const x of Object.values(v)) todo.push(x);
  }
  return seen.size;
}

/** Runs `fn` with `String.prototype.charCodeAt` counted (each read of one character); returns the count. */
function countingCharacterReads(fn: () => void): number {
  const original = String.prototype.charCodeAt;
  let reads = 0;
  String.prototype.charCodeAt = function (this: string, index: number): number {
    reads++;
    return original.call(this, index);
  };
  try {
    fn();
  } finally {
    String.prototype.charCodeAt = original;
  }
  return reads;
}

afterEach(() => {
  vi.mocked(findKey).mockClear();
});

describe('parser cost per statement', () => {
  it('copies at most the name and the two numbers of each state out of the document', () => {
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      parseNote(text); // keys and units seen once before
      const { result, slices } = countingSlices(() => parseNote(text));
      expect(result.diagnostics).toEqual([]);
      expect(result.statements).toHaveLength(n);
      const last = result.statements[n - 1];
      expect(last?.keyword === 'state' && last.props.map((p) => p.key)).toEqual(['db', 'rh']);
      // Per state at most its name and its two numbers' texts (a number written before is shared
      // too). Keys (`db`, `rh`), units and the keyword are shared strings; a copy of each per
      // property would make 8 per state.
      expect(slices).toBeLessThanOrEqual(3 * n + 10);
    }
  });

  it('keeps at most 13 objects for each simple state, the span of its line shared with the statement', () => {
    // Per state: the statement, its name and the name's span, its property list, and for each of
    // its two properties the property, its quantity, number and unit (12); the fence keeps the
    // line's span, which is the statement's own. Spans that follow from a node's fields (the
    // keyword's, a key's, a number's, a unit's, a quantity's, a property's) are made when read.
    // A span object stored per node made 25.
    const empty = objectsKept(parseNote(statesNote(0)));
    for (const n of [500, 2000]) {
      const parsed = parseNote(statesNote(n));
      expect(parsed.statements).toHaveLength(n);
      expect(objectsKept(parsed) - empty).toBeLessThanOrEqual(13 * n);
      const fence = parsed.regions[0] as ExtractedRegion;
      expect(parsed.statements.filter((st, i) => st.span === fence.lines[i])).toHaveLength(n);
    }
  });

  it('reads the characters of a note of simple states fewer than 1.75 times each, Markdown included', () => {
    // Each token is read once where it is scanned (a key, a number and its unit are packed for the
    // intern table as they are read, a name is checked as its end is found), plus the few look-aheads
    // the grammar needs (the character after a token, the next token after blanks). Reading a
    // token again for each question asked of it (is it a key=? where does it end? is it a valid
    // name? its hash?) made about 4.7 reads per character; reading the blanks after a value again
    // for its tolerance, and the character after a number again for its unit, about 1.9; now it is
    // about 1.57.
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      parseNote(text); // compiled and the intern table filled before counting
      const reads = countingCharacterReads(() => parseNote(text));
      expect(reads).toBeLessThan(1.75 * text.length);
    }
  });

  it('hands the statements of a fence out without making a span for each line', () => {
    // The fence's lines are read from their offsets (`markdown/lines`): the region's list of line
    // spans is never made, and each statement handed out has a span of its own (gone with it).
    for (const n of [500, 2000]) {
      const text = statesNote(n);
      const lines: [number, number][] = [];
      const spans = new Set<object>();
      const { regions } = parseNoteStatements(
        text,
        (st, lineStart, lineEnd) => {
          lines.push([lineStart, lineEnd]);
          spans.add(st.span);
        },
        [],
      );
      expect(lines).toHaveLength(n);
      expect(spans.size).toBe(n);
      const fence = regions[0] as ExtractedRegion;
      expect(Object.getOwnPropertyDescriptor(fence, 'lines')?.get).toBeTypeOf('function');
      // Read afterwards, the lines are those the statements were handed out with, and none of
      // them is a statement's span.
      expect(fence.lines.map((l) => [l.start, l.end])).toEqual(lines);
      expect(fence.lines.filter((l) => spans.has(l))).toEqual([]);
    }
  });

  it('looks nothing up in the key table while reading statements without mistakes', () => {
    const parsed = parseNote(statesNote(1000));
    expect(parsed.diagnostics).toEqual([]);
    expect(vi.mocked(findKey)).not.toHaveBeenCalled();
  });

  it('calls fewer than 44 of its own functions per simple state, none of them per character', async () => {
    // A note's first few thousand statements are read by the interpreter and the baseline
    // compiler, where a call costs more than the comparison a character class makes: the loops
    // over a statement's characters write the classes out, and its common path the cursor's move
    // past each token, the unit's loop, the keyword and name checks, a number's resolution and a
    // quantity's end. Counted by V8's precise coverage (calls of each function of the parser's
    // modules, by name). Calling a class or pack step per character made about 139 calls per
    // state; now it is 41.
    const perCharacter = new Set(['isWs', 'isKeyChar', 'isKeyStart', 'isAsciiLetter', 'isDigit', 'packStep']);
    perCharacter.add('wordCodeStep').add('endsUnit').add('slotOfHash');
    const session = new Session();
    session.connect();
    try {
      await session.post('Profiler.enable');
      for (const n of [1000, 3000]) {
        const text = statesNote(n);
        await session.post('Profiler.startPreciseCoverage', { callCount: true, detailed: false });
        // Taking the coverage resets the counts: the calls of the tests before are not counted.
        await session.post('Profiler.takePreciseCoverage');
        let read = 0;
        parseNoteStatements(text, () => read++, []);
        const { result } = await session.post('Profiler.takePreciseCoverage');
        await session.post('Profiler.stopPreciseCoverage');
        expect(read).toBe(n);
        let calls = 0;
        let classCalls = 0;
        for (const script of result) {
          if (!/notation\/(parse|number|intern|nodes)\.ts/.test(script.url)) continue;
          for (const f of script.functions) {
            // Nameless: the module itself, and the getters through which the test runner's
            // module system reads a binding that another module imports (the bundle has none).
            if (f.functionName === '') continue;
            const count = f.ranges[0]?.count ?? 0;
            calls += count;
            if (perCharacter.has(f.functionName)) classCalls += count;
          }
        }
        expect(calls).toBeGreaterThan(n); // the count sees the parser at all
        expect(calls).toBeLessThan(44 * n);
        expect(classCalls).toBeLessThanOrEqual(1 * n);
      }
    } finally {
      session.disconnect();
    }
  });

  it('still gives the key example in a message about a bad number', () => {
    const parsed = parseNote('```air\nstate RA: db=2..4C rh=50%\n```\n');
    expect(parsed.diagnostics.map((d) => d.code)).toEqual(['bad-number']);
    expect(parsed.diagnostics[0]?.message).toContain(`e.g. ${findKey('db')?.examples[0]}`);
    expect(vi.mocked(findKey)).toHaveBeenCalled();
  });
});

describe('the nodes of a statement', () => {
  it('sets each field once, in the order of the interfaces, with no field defined before the constructor', () => {
    const number = new ParsedNumber(24, '24', 1, 10);
    const unit = new ParsedUnit('C', 12);
    const quantity = new ParsedQuantity(number, unit, null);
    const cases: [object, readonly string[], () => object][] = [
      [ParsedNumber.prototype, ['value', 'text', 'resolution', 'at'], () => new ParsedNumber(24, '24', 1, 10)],
      [ParsedUnit.prototype, ['text', 'at'], () => new ParsedUnit('C', 12)],
      [ParsedQuantity.prototype, ['number', 'unit', 'tolerance'], () => new ParsedQuantity(number, unit, null)],
      [ParsedProperty.prototype, ['key', 'value', 'at', 'end'], () => new ParsedProperty('db', quantity, 7, 13)],
      [
        ParsedState.prototype,
        ['keyword', 'origin', 'span', 'name', 'props'],
        () => new ParsedState('fence', { start: 0, end: 13 }, null, []),
      ],
    ];
    for (const [proto, names, make] of cases) {
      expect(assignedFields(proto, names, make)).toEqual({ set: names.length, keys: [...names] });
    }
  });
});
