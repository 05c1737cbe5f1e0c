/**
 * parseNote on well-formed statements of every kind, from fences and code spans: the tree in a
 * compact summary, the statement spans as text, and every node's span read back from the input.
 */
import { describe, expect, it } from 'vitest';
import type { Statement } from '../src/notation/ast';
import { parseNote, parseStatementText } from '../src/notation/parse';
import { statementNodes, statementText as summary } from './notation-helpers';

/** Every node's span must give back its own text; nested spans must lie inside their parents. */
function verifySpans(md: string, st: Statement): void {
  for (const n of statementNodes(st)) {
    const text = md.slice(n.span.start, n.span.end);
    if (n.text !== undefined) expect(text, n.label).toBe(n.text);
    if (n.pattern) expect(text, n.label).toMatch(n.pattern);
    if (n.parent) {
      expect(n.span.start, n.label).toBeGreaterThanOrEqual(n.parent.start);
      expect(n.span.end, n.label).toBeLessThanOrEqual(n.parent.end);
    }
  }
}

/** Statements of `md` (summaries, in order), their span texts when given, and no diagnostics. */
function check(md: string, expected: string[], spans?: string[]): void {
  const parsed = parseNote(md);
  expect(parsed.diagnostics.map((d) => d.message)).toEqual([]);
  expect(parsed.statements.map(summary)).toEqual(expected);
  if (spans) expect(parsed.statements.map((s) => md.slice(s.span.start, s.span.end))).toEqual(spans);
  for (const st of parsed.statements) verifySpans(md, st);
}

describe('statements in air fences', () => {
  it('reads the design example, comments and blank lines skipped', () => {
    const md = [
      '# Plant room',
      '',
      '```air',
      'site: elev=1600m            # sets pressure for what follows',
      'state OA: db=33C wb=23C     # outdoor design',
      '',
      '# a comment line',
      'state RA: db=24C rh=50%',
      'mix MA: OA 25% + RA 75%',
      'state SA: db=13C rh=95%',
      'process CC: MA -> SA q=4.8m3/s',
      '```',
    ].join('\n');
    check(
      md,
      [
        'site: elev=1600m',
        'state OA: db=33C wb=23C',
        'state RA: db=24C rh=50%',
        'mix MA: OA 25% + RA 75%',
        'state SA: db=13C rh=95%',
        'process CC: MA -> SA | q=4.8m3/s',
      ],
      [
        'site: elev=1600m',
        'state OA: db=33C wb=23C',
        'state RA: db=24C rh=50%',
        'mix MA: OA 25% + RA 75%',
        'state SA: db=13C rh=95%',
        'process CC: MA -> SA q=4.8m3/s',
      ],
    );
  });

  it('reads units and pressure directives', () => {
    check('```air\nunits: SI\nunits: IP\nsite: p=84.5kPa\nsite:elev=5000ft\n```', [
      'units: SI',
      'units: IP',
      'site: p=84.5kPa',
      'site: elev=5000ft',
    ]);
  });

  it('reads names with digits, underscores and hyphens, and non-ASCII letters', () => {
    check(
      '```air\nstate AHU-3_off_coil: db=12.5C rh=95%\nstate ' +
        'Zone2b: db=21C w=7g/kg\nstate Außenluft: db=-5C rh=80%\n```',
      ['state AHU-3_off_coil: db=12.5C rh=95%', 'state Zone2b: db=21C w=7g/kg', 'state Außenluft: db=-5C rh=80%'],
    );
  });

  it('reads mixes by fraction, mass flow and volume flow, with claims after the streams', () => {
    check(
      '```air\nmix MA: OA 25% + RA 75% db=26.2C\nmix M2: OA 1.2kg/s + RA ' +
        '3.4kg/s + XA 0.5kg/s\nmix M3: OA 1000L/s+RA 3000L/s\n```',
      [
        'mix MA: OA 25% + RA 75% | db=26.2C',
        'mix M2: OA 1.2kg/s + RA 3.4kg/s + XA 0.5kg/s',
        'mix M3: OA 1000L/s + RA 3000L/s',
      ],
    );
  });

  it('reads processes with -> or →, flows and further claims', () => {
    check('```air\nprocess CC: MA -> SA m=5.6kg/s q_total=98kW\nprocess HU: SA → SB q=2m3/s\nprocess X: A->B\n```', [
      'process CC: MA -> SA | m=5.6kg/s q_total=98kW',
      'process HU: SA -> SB | q=2m3/s',
      'process X: A -> B',
    ]);
  });

  it('reads units with symbols, tolerances and spaces around =', () => {
    check(
      '```air\nstate A: db=24°C rh=50%±2 w=9.30g/kg+-0.05 ' +
        'dp = 12.9C±0.5C\nstate B: db=75.2°F h=28.1Btu/lb v=13.7ft3/lb\n```',
      ['state A: db=24°C rh=50%±2 w=9.30g/kg±0.05 dp=12.9C±0.5C', 'state B: db=75.2°F h=28.1Btu/lb v=13.7ft3/lb'],
    );
  });

  it('keeps keys and units as written (the evaluator checks them)', () => {
    check('```air\nstate A: DB=24c rh=50pct foo=1bar\n```', ['state A: DB=24c rh=50pct foo=1bar']);
  });

  it('reads statements in fences inside lists and block quotes', () => {
    const md = '- Summer:\n\n  ```air\n  state S: db=24C rh=50%\n  ```\n\n> ```air\n> state Q: db=20C rh=40%\n> ```\n';
    check(md, ['state S: db=24C rh=50%', 'state Q: db=20C rh=40%']);
  });

  it('marks fence statements with origin fence and keeps document order', () => {
    const parsed = parseNote('`state A: db=1C`\n\n```air\nstate B: db=2C\n```\n\nthen `state C: db=3C`.\n');
    expect(parsed.statements.map((s) => [s.origin, s.keyword, 'name' in s ? s.name?.text : null])).toEqual([
      ['inline', 'state', 'A'],
      ['fence', 'state', 'B'],
      ['inline', 'state', 'C'],
    ]);
  });
});

describe('statements in code spans', () => {
  it('reads a statement in prose', () => {
    check(
      'The room is held at `state RA: db=24C rh=50%` in summer.',
      ['state RA: db=24C rh=50%'],
      ['state RA: db=24C rh=50%'],
    );
  });

  it('reads a comment to the end of the span', () => {
    check('See `state RA: db=24C rh=50% # summer` here.', ['state RA: db=24C rh=50%'], ['state RA: db=24C rh=50%']);
  });

  it('reads a span over several lines, in a block quote too', () => {
    check('We keep `state RA:\ndb=24C rh=50%` all year.', ['state RA: db=24C rh=50%'], ['state RA:\ndb=24C rh=50%']);
    check(
      '> We keep `state RA:\r\n> db=24C\r\n> rh=50%` all year.',
      ['state RA: db=24C rh=50%'],
      ['state RA:\r\n> db=24C\r\n> rh=50%'],
    );
  });

  it('reads spans with longer backtick strings', () => {
    check('``state RA: db=24C rh=50%`` and `` units: IP ``', ['state RA: db=24C rh=50%', 'units: IP']);
  });
});

describe('positions', () => {
  it('are exact after a BOM, CRLF and characters outside the BMP', () => {
    const md = '\uFEFF# 𝔸 note\r\n\r\n```air\r\nstate 𝔸1: db=24C rh=50% # 𝔸\r\n```\r\n';
    check(md, ['state 𝔸1: db=24C rh=50%'], ['state 𝔸1: db=24C rh=50%']);
    const st = parseNote(md).statements[0];
    expect(st?.span.start).toBe(md.indexOf('state'));
  });

  it('are exact with tabs between tokens', () => {
    check('```air\nstate\tA:\tdb=24C\trh=50%\n```', ['state A: db=24C rh=50%'], ['state\tA:\tdb=24C\trh=50%']);
  });
});

describe('the tree as data', () => {
  it('writes a state as JSON with every span, in the order of the tree types', () => {
    // The nodes make some spans when read (notation/nodes.ts); their JSON is the documented shape.
    const md = '```air\nstate A: db=1.5C±0.2 rh=50% w=B.w\n```\n';
    const st = parseNote(md).statements[0];
    const span = (start: number, end: number) => ({ start, end });
    const number = (value: number, text: string, resolution: number, start: number) => ({
      value,
      text,
      resolution,
      span: span(start, start + text.length),
    });
    const unit = (text: string, start: number) => ({ text, span: span(start, start + text.length) });
    const expected = {
      keyword: 'state',
      keywordSpan: span(7, 12),
      origin: 'fence',
      span: span(7, 40),
      name: { text: 'A', span: span(13, 14) },
      props: [
        {
          key: 'db',
          keySpan: span(16, 18),
          value: {
            number: number(1.5, '1.5', 0.1, 19),
            unit: unit('C', 22),
            tolerance: { number: number(0.2, '0.2', 0.1, 24), unit: null, span: span(23, 27) },
            span: span(19, 27),
          },
          span: span(16, 27),
        },
        {
          key: 'rh',
          keySpan: span(28, 30),
          value: { number: number(50, '50', 1, 31), unit: unit('%', 33), tolerance: null, span: span(31, 34) },
          span: span(28, 34),
        },
        {
          key: 'w',
          keySpan: span(35, 36),
          value: null,
          span: span(35, 40),
          ref: {
            state: { text: 'B', span: span(37, 38) },
            key: { text: 'w', span: span(39, 40) },
            offset: null,
            span: span(37, 40),
          },
        },
      ],
    };
    // The same text, key order included.
    expect(JSON.stringify(st)).toBe(JSON.stringify(expected));
  });

  it('makes a new span each time one is read, never changing the node', () => {
    const st = parseNote('```air\nstate A: db=24C\n```\n').statements[0];
    const prop = st?.keyword === 'state' ? st.props[0] : undefined;
    const first = prop?.keySpan;
    expect(first).toEqual({ start: 16, end: 18 });
    if (first) first.start = 0;
    expect(prop?.keySpan).toEqual({ start: 16, end: 18 });
    expect(prop?.value?.span).toEqual({ start: 19, end: 22 });
  });
});

describe('parseStatementText', () => {
  const text = 'xx state A: db=1C rh=2% # c\nyy';

  it('reads one statement from a range of the document, with document offsets', () => {
    const r = parseStatementText(text, 3, 27, 'fence');
    expect(r.diagnostics).toEqual([]);
    expect(r.statement && summary(r.statement)).toBe('state A: db=1C rh=2%');
    expect(r.statement?.span).toEqual({ start: 3, end: 23 });
    expect(r.statement?.origin).toBe('fence');
  });

  it('gives null for blank and comment-only ranges', () => {
    expect(parseStatementText('   ', 0, 3, 'fence')).toEqual({ statement: null, diagnostics: [] });
    expect(parseStatementText('  # only a note', 0, 15, 'fence')).toEqual({ statement: null, diagnostics: [] });
  });

  it('clamps a range outside the text', () => {
    const r = parseStatementText('units: SI', -4, 99, 'inline');
    expect(r.statement && summary(r.statement)).toBe('units: SI');
  });
});
