/**
 * Property tests (fast-check, fixed seeds): parseNote on random text — valid statements, near
 * misses, garbage, characters outside the BMP, CRLF and lone CR, a BOM, long lines, Markdown
 * containers — never throws, and every span it returns lies inside the document with
 * start ≤ end. Valid statements written in random layouts read back exactly.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ParsedNote, Statement } from '../src/notation/ast';
import { parseNote } from '../src/notation/parse';
import { noteSpans as allSpans } from './notation-helpers';

function assertWellFormed(text: string, p: ParsedNote): void {
  for (const [label, s] of allSpans(p)) {
    if (
      !(
        Number.isInteger(s.start) &&
        Number.isInteger(s.end) &&
        s.start >= 0 &&
        s.start <= s.end &&
        s.end <= text.length
      )
    ) {
      throw new Error(`${label} has span ${JSON.stringify(s)} in a text of length ${text.length}`);
    }
  }
  for (const s of p.statements) {
    const nums = 'props' in s ? s.props.map((pr) => pr.value?.number) : [];
    for (const n of nums) if (n && !Number.isFinite(n.value)) throw new Error(`non-finite value ${n.text}`);
  }
  // Statements and regions come in document order.
  for (let i = 1; i < p.statements.length; i++)
    expect((p.statements[i] as Statement).span.start).toBeGreaterThanOrEqual(
      (p.statements[i - 1] as Statement).span.end,
    );
  for (let i = 1; i < p.regions.length; i++)
    expect(p.regions[i]?.span.start).toBeGreaterThanOrEqual(p.regions[i - 1]?.span.end ?? 0);
}

const name = fc.constantFrom('OA', 'RA', 'MA', 'SA', 'AHU-3_off', 'Zone𝔸', 'x1');
const value = fc.constantFrom(
  '24C',
  '50%',
  '50%±2',
  '9.30g/kg',
  '1.2e3',
  '.5',
  '5.',
  '-3C',
  '0.0093',
  '24C+-0.5C',
  '1000L/s',
  '4.8m3/s',
);
const key = fc.constantFrom('db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'p', 'elev', 'q', 'm');
const prop = fc.tuple(key, value).map(([k, v]) => `${k}=${v}`);
const valid = fc.oneof(
  fc.tuple(name, fc.array(prop, { maxLength: 4 })).map(([n, ps]) => `state ${n}: ${ps.join(' ')}`),
  fc.tuple(name, name, value, name, value).map(([m, a, x, b, y]) => `mix ${m}: ${a} ${x} + ${b} ${y}`),
  fc.tuple(name, name, name, prop).map(([p, a, b, pr]) => `process ${p}: ${a} -> ${b} ${pr}`),
  fc.constantFrom('site: elev=1600m', 'units: SI', 'units: IP', 'site: p=84.5kPa'),
);
const nearMiss = fc.constantFrom(
  'stat RA: db=24C',
  'state RA db=24C',
  'state : db=',
  'state 1A: db=1,5C rh=NaN',
  'mix M: OA + RA',
  'mix M: OA 25% RA 75%',
  'process P: A B',
  'process P: -> ',
  'state A: db=24 C rh=50 % ±2',
  'state A: db=1e999 w=Infinity',
  'units: SI IP extra',
  'state A: rh=50%± db=±-2',
  'state A: =5 , db:3',
  'mix M: +',
  'state A: db=24C # comment',
);
const garbage = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.constantFrom(
    '`',
    '``',
    '```',
    '~~~',
    '\t',
    '#',
    '=',
    '+',
    '±',
    '->',
    '→',
    '>',
    '- ',
    '1. ',
    '<div>',
    '<!--',
    '\\',
    '𝔸',
    '\uD800',
    '\u0000',
    '\uFEFF',
  ),
);
const eol = fc.constantFrom('\n', '\r\n', '\r');
const longLine = fc.constantFrom(
  'a'.repeat(3000),
  `state L: ${'db=1C '.repeat(400)}`,
  '`'.repeat(500),
  `\`state X: ${'x'.repeat(2000)}\``,
);

/** A random Markdown note: fences (air and others), code spans, containers, garbage. */
const note = fc
  .tuple(
    fc.boolean(),
    fc.array(
      fc.oneof(
        {
          weight: 3,
          arbitrary: fc
            .tuple(
              fc.constantFrom('```air', '~~~air', '``` air x', '```js'),
              fc.array(fc.oneof(valid, nearMiss, garbage), { maxLength: 6 }),
              fc.boolean(),
            )
            .map(([open, body, closed]) => ({ open, body, closed })),
        },
        { weight: 2, arbitrary: fc.oneof(valid, nearMiss).map((s) => ({ span: s })) },
        { weight: 2, arbitrary: garbage.map((g) => ({ text: g })) },
        { weight: 1, arbitrary: longLine.map((l) => ({ text: l })) },
      ),
      { maxLength: 12 },
    ),
    fc.array(eol, { minLength: 1, maxLength: 3 }),
    fc.constantFrom('', '> ', '- ', '  ', '1. '),
  )
  .map(([bom, parts, eols, prefix]) => {
    const lines: string[] = [];
    for (const part of parts) {
      if ('open' in part) {
        lines.push(part.open, ...part.body);
        if (part.closed) lines.push(part.open.startsWith('~') ? '~~~' : '```');
      } else if ('span' in part) lines.push(`Prose with \`${part.span}\` inside.`);
      else lines.push(part.text);
    }
    let out = '';
    lines.forEach((l, i) => {
      out += (i % 3 === 0 ? prefix : '') + l + (eols[i % eols.length] as string);
    });
    return (bom ? '\uFEFF' : '') + out;
  });

describe('parseNote on random text', () => {
  it('never throws and keeps every span inside the document', () => {
    const seen = { statements: 0, diagnostics: 0, inline: 0, fence: 0 };
    fc.assert(
      fc.property(note, (text) => {
        const parsed = parseNote(text);
        assertWellFormed(text, parsed);
        seen.statements += parsed.statements.length;
        seen.diagnostics += parsed.diagnostics.length;
        for (const s of parsed.statements) seen[s.origin]++;
      }),
      { seed: 1234567, numRuns: 600 },
    );
    // The generated notes do exercise both kinds of region, and errors.
    expect(seen.inline).toBeGreaterThan(100);
    expect(seen.fence).toBeGreaterThan(100);
    expect(seen.diagnostics).toBeGreaterThan(100);
  });

  it('never throws on arbitrary strings, including lone surrogates', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (text) => {
        assertWellFormed(text, parseNote(text));
        assertWellFormed(`\`\`\`air\n${text}`, parseNote(`\`\`\`air\n${text}`));
      }),
      { seed: 7654321, numRuns: 600 },
    );
  });

  it('gives every missing part of the tree (a null) a diagnostic within its statement', () => {
    const word = fc.constantFrom(
      'state',
      'mix',
      'process',
      'site:',
      'units:',
      'A',
      'B',
      ':',
      '=',
      'db',
      'db=',
      '24C',
      '25%',
      '+',
      '->',
      '→',
      '±',
      '±2',
      ',',
      '1,5',
      'NaN',
      '',
      '#',
      'x=',
      'q=2',
      '1A',
      'A.B',
      '=>',
      '-',
      '+-',
    );
    const head = fc.constantFrom('state', 'mix', 'process', 'site:', 'units:');
    let withNulls = 0;
    fc.assert(
      fc.property(head, fc.array(word, { maxLength: 10 }), (h, words) => {
        const md = `\`\`\`air\n${h} ${words.join(' ')}\n\`\`\``;
        const parsed = parseNote(md);
        for (const st of parsed.statements) {
          const nulls: string[] = [];
          if ('name' in st && st.name === null) nulls.push('name');
          if (st.keyword === 'units' && st.system === null) nulls.push('system');
          if (st.keyword === 'process' && (!st.from || !st.to)) nulls.push('from/to');
          if ('props' in st) for (const pr of st.props) if (!pr.value) nulls.push(`value of ${pr.key}`);
          if (st.keyword === 'mix') for (const m of st.streams) if (!m.amount) nulls.push('amount');
          if (nulls.length === 0) continue;
          withNulls++;
          const near = parsed.diagnostics.filter((d) => d.span.start >= st.span.start && d.span.start <= st.span.end);
          if (near.length === 0) throw new Error(`${JSON.stringify(md)}: ${nulls.join(', ')} without a diagnostic`);
        }
      }),
      { seed: 99, numRuns: 3000 },
    );
    expect(withNulls).toBeGreaterThan(500);
  });

  it('reads valid statements back without a diagnostic, however they are laid out', () => {
    // [prefix of the fence's first line, prefix of the lines after it]
    const containers = fc.constantFrom(
      ['', ''],
      ['> ', '> '],
      ['- ', '  '],
      ['1. ', '   '],
      ['   ', '   '],
      ['> - ', '>   '],
    );
    fc.assert(
      fc.property(fc.array(valid, { minLength: 1, maxLength: 8 }), eol, containers, (stmts, e, [first, rest]) => {
        const text = [`${first}\`\`\`air`, ...stmts.map((s) => `${rest}${s}   # note`), `${rest}\`\`\``].join(e) + e;
        const parsed = parseNote(text);
        expect(parsed.diagnostics).toEqual([]);
        expect(parsed.statements.map((s) => text.slice(s.span.start, s.span.end))).toEqual(
          stmts.map((s) => s.trimEnd()),
        );
      }),
      { seed: 424242, numRuns: 300 },
    );
  });
});
