/**
 * Syntax diagnostics: every parser code, the exact range it marks, a message that says what is
 * wrong and how to fix it, and recovery (what the parser still reads, and the next statement).
 */
import { describe, expect, it } from 'vitest';
import { parseNote, type SYNTAX_CODES } from '../src/notation/parse';
import { statementText as summary } from './notation-helpers';

/** [code, text of the marked range, a fragment the message must contain]. */
type Diag = [code: keyof typeof SYNTAX_CODES, marked: string, says: string];

/** Fence `lines`: the diagnostics (in order) and the statements still read. */
function check(lines: string[], diags: Diag[], statements: string[]): void {
  const md = ['```air', ...lines, '```'].join('\n');
  const parsed = parseNote(md);
  expect(parsed.diagnostics.map((d) => [d.code, md.slice(d.span.start, d.span.end)])).toEqual(
    diags.map(([c, m]) => [c, m]),
  );
  parsed.diagnostics.forEach((d, i) => {
    expect(d.severity).toBe('error');
    expect(d.message).toContain(diags[i]?.[2] ?? '');
  });
  expect(parsed.statements.map(summary)).toEqual(statements);
}

describe('unknown statements', () => {
  it('suggests the keyword for a misspelling, a capital or a missing space', () => {
    check(
      ['stat RA: db=24C', 'State RA: db=24C', 'stateRA: db=24C', 'prosess CC: A -> B', 'mixx M: A 1% + B 99%'],
      [
        ['unknown-keyword', 'stat', "unknown statement 'stat': did you mean 'state'?"],
        ['unknown-keyword', 'State', "keywords are lowercase: write 'state'"],
        ['unknown-keyword', 'stateRA', "did you mean 'state RA'? Put a space after 'state'"],
        ['unknown-keyword', 'prosess', "did you mean 'process'?"],
        ['unknown-keyword', 'mixx', "did you mean 'mix'?"],
      ],
      [],
    );
  });

  it('says what a statement starts with when nothing is close, and reads on', () => {
    check(
      ['the room is at 24C', 'db=24C rh=50%', 'state RA: db=24C'],
      [
        [
          'unknown-keyword',
          'the',
          "a statement starts with 'site:', 'units:', 'state', 'mix', 'process', 'supply' or 'recover'",
        ],
        ['unknown-keyword', 'db=24C', "start a note line with '#'"],
      ],
      ['state RA: db=24C'],
    );
  });
});

describe('names', () => {
  it('reports a missing name and still reads the properties', () => {
    check(
      ['state: db=24C rh=50%', 'state db=24C', 'mix : A 1% + B 99%'],
      [
        ['missing-name', ':', "'state' needs a name before ':': write state RA: db=24C rh=50%"],
        ['missing-name', 'state', "'state' needs a name"],
        ['missing-name', ':', "'mix' needs a name"],
      ],
      ['state ?: db=24C rh=50%', 'state ?: db=24C', 'mix ?: A 1% + B 99%'],
    );
  });

  it('reports a name that breaks the naming rule', () => {
    check(
      ['state 1A: db=24C', 'state A.B: db=24C', 'mix M: O.A 25% + RA 75%', 'process P: A$ -> B'],
      [
        ['bad-name', '1A', "'1A' is not a valid name: a name starts with a letter"],
        ['bad-name', 'A.B', "a name cannot contain '.'"],
        ['bad-name', 'O.A', "a name cannot contain '.'"],
        ['bad-name', 'A$', "a name cannot contain '$'"],
      ],
      ['state ?: db=24C', 'state ?: db=24C', 'mix M: RA 75%', 'process P: ? -> B'],
    );
  });

  it('reports a missing colon on the statement head', () => {
    check(
      ['state RA db=24C', 'site elev=1600m', 'units SI'],
      [
        ['missing-colon', 'state RA', "missing ':' after 'state RA': write state RA: db=24C rh=50%"],
        ['missing-colon', 'site', "missing ':' after 'site'"],
        ['missing-colon', 'units', 'write units: SI'],
      ],
      ['state RA: db=24C', 'site: elev=1600m', 'units: SI'],
    );
  });
});

describe('values', () => {
  it('reports a key without value', () => {
    check(
      ['state A: db= rh=50%', 'state B: db=24C h=', 'state C: w=,'],
      [
        ['missing-value', 'db=', "'db=' has no value: write a number with its unit, e.g. db=24C"],
        ['missing-value', 'h=', 'e.g. h=47.8kJ/kg'],
        ['missing-value', 'w=', "'w=' has no value"],
        ['syntax', ',', 'separate properties with spaces, not commas'],
      ],
      ['state A: db=? rh=50%', 'state B: db=24C h=?', 'state C: w=?'],
    );
  });

  it('reports a decimal comma, non-finite and malformed numbers', () => {
    check(
      ['state A: db=1,5C rh=NaN', 'state B: db=Infinity w=1e999 h=abc', 'state C: db=1.2.3C rh=-inf'],
      [
        ['bad-number', '1,5C', "'1,5C' is not a number: use a decimal point, not a comma (1.5C)"],
        ['bad-number', 'NaN', "'NaN' is not a finite number"],
        ['bad-number', 'Infinity', "'Infinity' is not a finite number"],
        ['bad-number', '1e999', "'1e999' is too large: write a finite number"],
        ['bad-number', 'abc', "'abc' is not a number: write h= followed by a decimal number and its unit"],
        ['bad-number', '1.2.3C', "'1.2.3C' is not a number"],
        ['bad-number', '-inf', "'-inf' is not a finite number"],
      ],
      ['state A: db=? rh=?', 'state B: db=? w=? h=?', 'state C: db=? rh=?'],
    );
  });

  it('reads a unit or tolerance written after a space, and says to write it directly', () => {
    check(
      ['state A: db=24 C rh=50 %', 'state B: rh=50% ±2', 'process P: A -> B m=5 kg/s'],
      [
        ['value-spacing', '24 C', 'write the unit directly after the number, e.g. 24C'],
        ['value-spacing', '50 %', 'e.g. 50%'],
        ['value-spacing', '±2', 'write the tolerance directly after the value, e.g. 50%±2'],
        ['value-spacing', '5 kg/s', 'e.g. 5kg/s'],
      ],
      ['state A: db=24C rh=50%', 'state B: rh=50%±2', 'process P: A -> B | m=5kg/s'],
    );
  });

  it('does not take the next key or stream for a unit', () => {
    check(
      ['state A: w=0.0093 rh=50%', 'mix M: A 0.25 + B 0.75'],
      [],
      ['state A: w=0.0093 rh=50%', 'mix M: A 0.25 + B 0.75'],
    );
  });

  it('reports tolerances without a number or with a sign', () => {
    check(
      ['state A: rh=50%± db=24C', 'state B: rh=50%±-2'],
      [
        ['missing-value', '±', "'±' needs a number after it, e.g. rh=50%±2"],
        ['bad-number', '±-2', 'write the tolerance without a sign, e.g. ±2'],
      ],
      ['state A: rh=50% db=24C', 'state B: rh=50%'],
    );
  });

  it('reports stray tokens, a missing = and a lone =', () => {
    check(
      ['state A: db=24C summer', 'state B: rh 50%', 'state C: =5 db=1C', 'state D: db:24C'],
      [
        ['syntax', 'summer', "'summer' is not a property: write key=value, e.g. db=24C"],
        ['syntax', 'rh', "missing '=' after 'rh': write rh=50%"],
        ['syntax', '=5', "'=' without a key before it"],
        ['syntax', 'db:24C', "'db:24C' is not a property"],
      ],
      ['state A: db=24C', 'state B: rh=50%', 'state C: db=1C', 'state D: '],
    );
  });
});

describe('mixes', () => {
  it('reports a stream without amount, a missing + and a trailing +', () => {
    check(
      ['mix M: OA + RA 75%', 'mix N: OA 25% RA 75%', 'mix P: OA 25% +'],
      [
        [
          'missing-value',
          'OA',
          "the stream 'OA' has no amount: write a dry-air mass fraction, a mass flow or a volume flow, e.g. OA 25%",
        ],
        ['syntax', 'RA', "missing '+' before the stream 'RA': write OA 25% + RA 75%"],
        ['missing-name', '+', "'+' must be followed by another stream"],
      ],
      ['mix M: OA ? + RA 75%', 'mix N: OA 25% + RA 75%', 'mix P: OA 25%'],
    );
  });

  it('reports a mix without streams and a stream without a name', () => {
    check(
      ['mix M:', 'mix N: 25% + RA 75%'],
      [
        ['missing-value', 'mix M:', 'the mix has no streams'],
        ['missing-name', '25%', 'a stream starts with the name of a state'],
      ],
      ['mix M: ', 'mix N: RA 75%'],
    );
  });
});

describe('processes', () => {
  it('reports missing states and a missing or wrong arrow', () => {
    check(
      ['process P: -> SA', 'process Q: MA ->', 'process R: MA SA', 'process S: MA => SA', 'process T: q=2m3/s'],
      [
        ['missing-name', '->', 'the entering state is missing'],
        ['missing-name', '', "the leaving state after '->' is missing"],
        ['syntax', 'MA', "missing '->' between the two states"],
        ['syntax', '=>', "write the arrow as '->' (or '→'), not '=>'"],
        ['missing-name', 'q=2m3/s', 'the entering state is missing'],
      ],
      [
        'process P: ? -> SA',
        'process Q: MA -> ?',
        'process R: MA -> SA',
        'process S: MA -> SA',
        'process T: ? -> ? | q=2m3/s',
      ],
    );
  });
});

describe('units directive', () => {
  it('reports a missing or extra word', () => {
    check(
      ['units:', 'units: SI IP'],
      [
        ['missing-value', 'units:', "'units:' needs a unit system: write 'units: SI' or 'units: IP'"],
        ['syntax', 'IP', "'units:' takes one word, SI or IP"],
      ],
      ['units: ?', 'units: SI'],
    );
  });
});

describe('recovery across a note', () => {
  it('reports each bad statement and reads every good one', () => {
    const md = 'Text `state A: db=1,5C` more.\n\n```air\nstat B: db=1C\nstate C: db=2C\n```\n\n`state D: db=3C`\n';
    const parsed = parseNote(md);
    expect(parsed.diagnostics.map((d) => d.code)).toEqual(['bad-number', 'unknown-keyword']);
    expect(parsed.statements.map(summary)).toEqual(['state A: db=?', 'state C: db=2C', 'state D: db=3C']);
    // Diagnostics are in document order.
    const starts = parsed.diagnostics.map((d) => d.span.start);
    expect([...starts].sort((a, b) => a - b)).toEqual(starts);
  });
});
