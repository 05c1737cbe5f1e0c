/**
 * extractRegions: which fences and code spans are air regions, the per-line content ranges (with
 * container prefixes removed, offsets into the original text), headings, and positions with CRLF,
 * lone CR, a BOM, tabs and characters outside the BMP. Also the places where markdown-it alone
 * would depart from CommonMark (see markdown/markdownIt.ts).
 */
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { createMarkdownIt } from '../src/markdown/markdownIt';
import { extractRegions, startsWithKeyword, type ExtractedRegion } from '../src/markdown/regions';
import { lineOffsetsOf } from '../src/markdown/lines';
import { normalizeForMarkdown, scanMarkdown } from '../src/markdown/scan';

/**
 * One summary per region: `fence|line|line…` (each body line read through its range) or
 * `inline|piece piece…` (the code span's pieces joined by spaces).
 */
function summarize(md: string, r: ExtractedRegion): string {
  const parts = r.lines.map((l) => md.slice(l.start, l.end));
  return r.origin === 'fence' ? ['fence', ...parts].join('|') : `inline|${parts.join(' ')}`;
}

/** Regions of `md` must be exactly `expected`; every range must be well-formed. */
function check(md: string, expected: string[]): void {
  const { regions } = extractRegions(md);
  expect(regions.map((r) => summarize(md, r))).toEqual(expected);
  for (const r of regions) {
    expect(r.span.start).toBeLessThanOrEqual(r.contentSpan.start);
    expect(r.contentSpan.end).toBeLessThanOrEqual(r.span.end);
    for (const l of r.lines) {
      expect(l.start).toBeGreaterThanOrEqual(r.contentSpan.start);
      expect(l.end).toBeLessThanOrEqual(r.contentSpan.end);
      expect(md.slice(l.start, l.end)).not.toMatch(/[\r\n]/);
    }
    const whole = md.slice(r.span.start, r.span.end);
    if (r.origin === 'fence') expect(whole).toMatch(/^(`{3,}|~{3,})/);
    else expect(whole).toMatch(/^`+[\s\S]*`+$/);
  }
}

describe('air fences', () => {
  it('reads every body line of a backtick or tilde fence whose info word is air', () => {
    check('text\n\n```air\nstate A: db=1C\n\nstate B: db=2C\n```\n', ['fence|state A: db=1C||state B: db=2C']);
    check('~~~air\nunits: SI\n~~~\n', ['fence|units: SI']);
    check('````air\n```\nstate A: db=1C\n````\n', ['fence|```|state A: db=1C']);
  });

  it('takes the first word of the info string, exactly', () => {
    check('```air extra words\nunits: SI\n```\n', ['fence|units: SI']);
    check('``` air\nunits: SI\n```\n', ['fence|units: SI']);
    check('```airx\nunits: SI\n```\n```AIR\nunits: SI\n```\n```js air\nx\n```\n', []);
    // Backslash escapes and entities are resolved in the info string.
    check('```&#97;ir\nunits: SI\n```\n', ['fence|units: SI']);
  });

  it('removes the fence indentation and container prefixes from each line', () => {
    check('  ```air\n  state A: db=1C\n    state B: db=2C\n ```\n', ['fence|state A: db=1C|  state B: db=2C']);
    check('> ```air\n> state A: db=1C\n>state B: db=2C\n> ```\n', ['fence|state A: db=1C|state B: db=2C']);
    check('- item\n\n  ```air\n  state A: db=1C\n  ```\n', ['fence|state A: db=1C']);
    check('1. a\n   - b\n\n     ```air\n     state A: db=1C\n     ```\n', ['fence|state A: db=1C']);
    check('> - ```air\n>   state A: db=1C\n>   ```\n', ['fence|state A: db=1C']);
  });

  it('runs an unclosed fence to the end of its container', () => {
    check('```air\nstate A: db=1C\nstate B: db=2C\n', ['fence|state A: db=1C|state B: db=2C']);
    check('> ```air\n> state A: db=1C\n\nstate B: db=2C\n', ['fence|state A: db=1C']);
    check('- ```air\n  state A: db=1C\nafter\n', ['fence|state A: db=1C']);
    const { regions } = extractRegions('```air\nunits: SI\n');
    expect(regions[0]?.origin === 'fence' && regions[0].closed).toBe(false);
  });

  it('never takes indented code for a fence', () => {
    check('    ```air\n    state A: db=1C\n    ```\n', []);
    check('para\n\n\t```air\n\tstate A: db=1C\n', []);
  });

  it('reports an empty fence with no lines', () => {
    const md = 'x\n\n```air\n```\n';
    const { regions } = extractRegions(md);
    expect(regions).toHaveLength(1);
    expect(regions[0]?.lines).toEqual([]);
    expect(regions[0]?.contentSpan.start).toBe(regions[0]?.contentSpan.end);
  });
});

describe('the body lines of a fence, kept as offsets until read', () => {
  const md = '> ```air\r\n> state A: db=24C\r\n>\r\n>   state B: db=20C\r\n> ```\r\n';

  it('gives the offsets of each line without making its span, then the same spans when read', () => {
    const { regions } = extractRegions(md);
    const region = regions[0] as ExtractedRegion;
    // Not made yet: the field is still the one that makes it.
    expect(Object.getOwnPropertyDescriptor(region, 'lines')?.get).toBeTypeOf('function');
    const offsets = lineOffsetsOf(region);
    expect(offsets && [...offsets.starts].map((s, i) => md.slice(s, offsets.ends[i]))).toEqual([
      'state A: db=24C',
      '',
      '  state B: db=20C',
    ]);
    expect(Object.getOwnPropertyDescriptor(region, 'lines')?.get).toBeTypeOf('function');
    const lines = region.lines;
    expect(lines).toEqual([...(offsets?.starts ?? [])].map((start, i) => ({ start, end: offsets?.ends[i] })));
    // Made once: a plain field from then on, the same array and spans at every read; the offsets
    // are let go (the spans hold them).
    expect(Object.getOwnPropertyDescriptor(region, 'lines')?.value).toBe(lines);
    expect(lineOffsetsOf(region)).toBeUndefined();
    expect(region.lines).toBe(lines);
    expect(Object.keys(region)).toEqual(['origin', 'span', 'contentSpan', 'lines', 'info', 'closed']);
    expect(JSON.parse(JSON.stringify(region)).lines).toEqual(lines);
  });

  it('forgets the offsets when the lines are written', () => {
    const region = extractRegions(md).regions[0] as ExtractedRegion;
    region.lines = [{ start: 0, end: 1 }];
    expect(lineOffsetsOf(region)).toBeUndefined();
    expect(region.lines).toEqual([{ start: 0, end: 1 }]);
  });

  it('has no offsets for a code span or a region built elsewhere', () => {
    const { regions } = extractRegions('`state A: db=24C`\n');
    expect(regions[0]?.origin).toBe('inline');
    expect(lineOffsetsOf(regions[0] as ExtractedRegion)).toBeUndefined();
    expect(lineOffsetsOf({ lines: [] })).toBeUndefined();
  });
});

describe('keyword code spans', () => {
  it('takes code spans that start with a keyword and whitespace or a colon', () => {
    check('The room is at `state RA: db=24C rh=50%` in summer.', ['inline|state RA: db=24C rh=50%']);
    check('`site: elev=1600m` and `units: IP` and `mix MA: OA 25% + RA 75%` and `process CC: MA -> SA`', [
      'inline|site: elev=1600m',
      'inline|units: IP',
      'inline|mix MA: OA 25% + RA 75%',
      'inline|process CC: MA -> SA',
    ]);
    check('`state:` `site :`', ['inline|state:', 'inline|site :']);
  });

  it('ignores code spans without a keyword at the start', () => {
    check('`states A` `stateA: db=1C` `State A: db=1C` `x state A:` `state` `site` `unitsSI`', []);
    expect(startsWithKeyword('mix\tM: A 1% + B 99%')).toBe(true);
    expect(startsWithKeyword('mixer')).toBe(false);
  });

  it('follows CommonMark backtick strings and space stripping', () => {
    check('``state A: db=1C``', ['inline|state A: db=1C']);
    check('`` state A: db=`1`C ``', ['inline|state A: db=`1`C']);
    // Only one space is stripped from each end.
    check('`  state A: db=1C  `', []);
    // A backtick string without a matching closer is literal text.
    check('```state A: db=1C`', []);
    check('\\`state A: db=1C`', []);
  });

  it('does not read code spans in HTML blocks, autolinks, raw HTML tags or code blocks', () => {
    check('<div>\n`state A: db=1C`\n</div>\n', []);
    // An autolink holds no spaces: its backticks are part of the URL.
    expect(scanMarkdown('<http://x.example/`a`>').codeSpans).toEqual([]);
    // With spaces it is not an autolink, so the code span is one (as CommonMark says).
    check('<http://x.example/`state A: db=1C`>', ['inline|state A: db=1C']);
    check('<a title="`state A: db=1C`">x</a>', []);
    check('<!-- `state A: db=1C` -->', []);
    check('```\n`state A: db=1C`\n```\n', []);
    check('    `state A: db=1C`\n', []);
  });

  it('keeps a span across lines in pieces without line breaks, prefixes or indentation', () => {
    check('The state `state A:\n   db=1C rh=50%` holds.', ['inline|state A: db=1C rh=50%']);
    check('> The state `state A:\n> db=1C` holds.', ['inline|state A: db=1C']);
    check('- The state `state A:\n  db=1C` holds.', ['inline|state A: db=1C']);
    check('`\nstate A: db=1C\n`', ['inline|state A: db=1C']);
  });

  it('finds spans in headings, lists, quotes, tables and link text', () => {
    check('## Room `state R: db=24C`\n', ['inline|state R: db=24C']);
    check('- `state A: db=1C`\n  - `state B: db=2C`\n', ['inline|state A: db=1C', 'inline|state B: db=2C']);
    check('| a | `state A: db=1C` |\n|---|---|\n', ['inline|state A: db=1C']);
    check('[see `state A: db=1C`](x.md)', ['inline|state A: db=1C']);
  });

  it('orders fences and spans as they appear', () => {
    check('`state A: db=1C`\n\n```air\nstate B: db=2C\n```\n\n`state C: db=3C`\n', [
      'inline|state A: db=1C',
      'fence|state B: db=2C',
      'inline|state C: db=3C',
    ]);
  });
});

describe('positions', () => {
  const base = '# T\n\n> ```air\n> state A: db=1C\n> ```\n\nSee `state B:\n db=2C` now.\n';

  it('are the same text through CRLF, lone CR and a BOM', () => {
    const want = ['fence|state A: db=1C', 'inline|state B: db=2C'];
    check(base, want);
    check(base.replace(/\n/g, '\r\n'), want);
    check(base.replace(/\n/g, '\r'), want);
    check(`\uFEFF${base}`, want);
    check(`\uFEFF${base.replace(/\n/g, '\r\n')}`, want);
  });

  it('count characters outside the BMP as two code units', () => {
    const md = '𝔸𝔹 `state 𝔸: db=1C` 𝔸\n\n```air\n# 𝔸𝔹𝔸\nstate B: db=2C # 𝔸\n```\n';
    check(md, ['inline|state 𝔸: db=1C', 'fence|# 𝔸𝔹𝔸|state B: db=2C # 𝔸']);
    const { regions } = extractRegions(md);
    expect(regions[0]?.contentSpan).toEqual({ start: 6, end: 6 + 'state 𝔸: db=1C'.length });
  });

  it('handle tabs in container indentation', () => {
    check('-\t```air\n\tstate A: db=1C\n\t```\n', ['fence|state A: db=1C']);
    // '>' takes one column of the tab; the fence's indentation (the other two) is removed too.
    check('>\t```air\n>\tstate A: db=1C\n', ['fence|state A: db=1C']);
    check('>\t```air\n>\t\tstate A: db=1C\n', ['fence|\tstate A: db=1C']);
  });

  it('keep NUL characters in place', () => {
    check('```air\nstate A: db=1C\0\n```\n', ['fence|state A: db=1C\0']);
  });
});

describe('headings', () => {
  /** Headings as [level, text, text of the span]. */
  function checkHeadings(md: string, expected: [number, string, string][]): void {
    const { headings } = extractRegions(md);
    expect(headings.map((h) => [h.level, h.text, md.slice(h.span.start, h.span.end)])).toEqual(expected);
  }

  it('reads ATX headings with their level and trimmed text', () => {
    checkHeadings('# One\n## Two ##\n###   Three   \n####### not\n#five\n', [
      [1, 'One', '# One'],
      [2, 'Two', '## Two ##'],
      [3, 'Three', '###   Three'],
    ]);
  });

  it('reads setext headings, joining their lines', () => {
    checkHeadings('Summer\ncase\n===\n\nWinter\n---\n', [
      [1, 'Summer case', 'Summer\ncase\n==='],
      [2, 'Winter', 'Winter\n---'],
    ]);
  });

  it('reads headings inside containers, not inside code', () => {
    checkHeadings('> # Quoted\n- ## Listed\n\n```\n# code\n```\n', [
      [1, 'Quoted', '# Quoted'],
      [2, 'Listed', '## Listed'],
    ]);
  });

  it('keeps spans exact with CRLF', () => {
    checkHeadings('# A\r\nB\r\n---\r\n', [
      [1, 'A', '# A'],
      [2, 'B', 'B\r\n---'],
    ]);
  });
});

describe('where markdown-it alone departs from CommonMark', () => {
  const blocks = (md: string) => {
    const s = scanMarkdown(md);
    return {
      fences: s.fences.map((f) => f.lines.map((l) => md.slice(l.start, l.end))),
      indented: s.indentedCode.length,
      spans: s.codeSpans.map((c) => c.content),
    };
  };

  it('a `>` after four columns of indentation is not a block-quote marker', () => {
    // CommonMark: the fence inside the quote ends; the next line is indented code outside.
    expect(blocks('> ```air\n    > state A: db=1C\n')).toEqual({ fences: [[]], indented: 1, spans: [] });
  });

  it('lines after a link reference definition continue its paragraph', () => {
    // CommonMark: "    `state A: db=1C`" continues the paragraph (a code span), not indented code.
    expect(blocks('[x]: /url\n    `state A: db=1C`\n')).toEqual({ fences: [], indented: 0, spans: ['state A: db=1C'] });
  });

  it('an HTML comment hides backticks even after an unclosed one later in the paragraph', () => {
    expect(blocks('[a <!--`x`--> b `y` <!--')).toEqual({ fences: [], indented: 0, spans: ['y'] });
  });

  it('continuation-line indentation is not code span content', () => {
    expect(blocks('`a\n   b`')).toEqual({ fences: [], indented: 0, spans: ['a b'] });
  });
});

describe('the instrumented markdown-it', () => {
  it("builds the same line table as markdown-it's own block state", () => {
    const ours = createMarkdownIt();
    const theirs = new MarkdownIt('commonmark');
    const text = fc
      .array(fc.constantFrom(' ', '\t', '\n', 'a', '>', '- ', '\u00a0'), { maxLength: 40 })
      .map((xs) => xs.join(''));
    fc.assert(
      fc.property(text, (src) => {
        const a = new ours.block.State(src, ours, {}, []);
        const b = new theirs.block.State(src, theirs, {}, []);
        const table = (st: typeof a) =>
          [st.bMarks, st.eMarks, st.tShift, st.sCount, st.bsCount].map((t) => Array.from(t));
        expect(table(a)).toEqual(table(b));
        expect(a.lineMax).toBe(b.lineMax);
      }),
      { seed: 31337, numRuns: 2000 },
    );
  });

  it('builds the same line table on a long text (the tables grow several times)', () => {
    const ours = createMarkdownIt();
    const theirs = new MarkdownIt('commonmark');
    const pieces = ['state A: db=1C', '', '  x', '\tcode', '> q', ' ', '- item', '```air', '~~~'];
    // Long lines first (the first guess of the line count is low), then short ones.
    const head = Array.from({ length: 20 }, (_, i) => `${i % 2 ? '> ' : ''}${'word '.repeat(40)}`);
    const lines = head.concat(Array.from({ length: 6000 }, (_, i) => pieces[(i * 7 + (i >> 3)) % pieces.length] ?? ''));
    for (const src of [lines.join('\n'), `${lines.join('\n')}\n`, `${lines.join('\n')}\n  `]) {
      const a = new ours.block.State(src, ours, {}, []);
      const b = new theirs.block.State(src, theirs, {}, []);
      for (const k of ['bMarks', 'eMarks', 'tShift', 'sCount', 'bsCount'] as const)
        expect(Array.from(a[k]), k).toEqual(Array.from(b[k]));
      expect(a.lineMax).toBe(b.lineMax);
    }
  });

  it('finds the line breaks in one pass: one search per line, and a few for the first 4 KB', () => {
    const md = createMarkdownIt();
    const src = Array.from({ length: 3000 }, (_, i) => `state S${i}: db=${i % 40}C rh=50%`).join('\n');
    const indexOf = String.prototype.indexOf;
    let searches = 0;
    String.prototype.indexOf = function (this: string, ...args: [string, number?]) {
      if (args[0] === '\n') searches++;
      return indexOf.apply(this, args);
    };
    try {
      new md.block.State(src, md, {}, []);
    } finally {
      String.prototype.indexOf = indexOf;
    }
    // (Counting the lines first was twice as many.)
    expect(searches).toBeGreaterThanOrEqual(3000);
    expect(searches).toBeLessThanOrEqual(3000 + 4096 / 20);
  });

  it('keeps the line tables small however the first 4 KB of a text read', () => {
    // Line breaks only at the start, then long lines: the first guess of the line count is capped.
    const md = createMarkdownIt();
    const src = `${'\n'.repeat(4096)}${'x'.repeat(200_000)}`;
    const state = new md.block.State(src, md, {}, []);
    const table = state.bMarks as unknown as Int32Array;
    expect(table.buffer.byteLength / 4).toBeLessThanOrEqual((src.length >> 4) + 16);
    expect(state.lineMax).toBe(4097);
  });

  it("gives each fence's body lines as stock markdown-it cuts them, in containers too", () => {
    // Fences at the start of their container (their lines copied from the line table at once)
    // and indented or list fences (each line cut): the lines read back must join into stock
    // markdown-it's fence content. Without tabs, where markdown-it turns a split tab into spaces.
    const stock = new MarkdownIt('commonmark');
    const doc = fc
      .array(
        fc.constantFrom('> ', '>', '```', '~~~', '```air', ' ', '  ', '- ', '1. ', 'x', 'state A', '\n', '\n', '\n'),
        {
          maxLength: 60,
        },
      )
      .map((xs) => xs.join(''));
    fc.assert(
      fc.property(doc, (md) => {
        type T = { type: string; content: string };
        // (The last line of the text has no line break in markdown-it's content; stock markdown-it
        // reads the text as the scan hands it over, a last line of blanks kept.)
        const want = (stock.parse(normalizeForMarkdown(md).src, {}) as T[])
          .filter((t) => t.type === 'fence')
          .map((t) => t.content.replace(/\n$/, ''));
        const got = scanMarkdown(md).fences.map((f) => f.lines.map((l) => md.slice(l.start, l.end)).join('\n'));
        expect(got, JSON.stringify(md)).toEqual(want);
      }),
      { seed: 4242, numRuns: 3000 },
    );
  });

  it('finds the fences, headings and code spans that stock markdown-it finds', () => {
    const stock = new MarkdownIt('commonmark');
    const samples = [
      '# T\n\n- a\n  > b `c`\n\n```air\nstate A: db=1C\n```\n',
      'p\n\n    code\n\n<div>\nx `no`\n</div>\n\n***\n\n[r]: /u\n',
      'Setext `x`\nheading\n===\n\nplain\n---\n\n> quoted `s`\n> more\n\n~~~ air  x\nfence `t`\n~~~\n',
      '1. one `a`\n2. two\n\n   ```js\n   x\n   ```\n\n## Tail ``b`` ##\n',
    ];
    for (const md of samples) {
      type T = { type: string; info: string; content: string; children: T[] | null };
      const tokens = stock.parse(md, {}) as T[];
      const want = {
        fences: tokens.filter((t) => t.type === 'fence').map((t) => [t.info.trim().split(/\s+/)[0] ?? '', t.content]),
        indented: tokens.filter((t) => t.type === 'code_block').length,
        headings: tokens.flatMap((t, i) =>
          t.type === 'heading_open' ? [tokens[i + 1]?.content.replace(/\n/g, ' ')] : [],
        ),
        spans: tokens.flatMap((t) => (t.children ?? []).filter((c) => c.type === 'code_inline').map((c) => c.content)),
      };
      const scan = scanMarkdown(md);
      const got = {
        fences: scan.fences.map((f) => [f.lang, f.lines.map((l) => `${md.slice(l.start, l.end)}\n`).join('')]),
        indented: scan.indentedCode.length,
        headings: scan.headings.map((h) => h.text),
        spans: scan.codeSpans.map((c) => c.content),
      };
      expect(got, JSON.stringify(md)).toEqual(want);
    }
  });
});
