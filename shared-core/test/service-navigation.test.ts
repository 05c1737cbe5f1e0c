/**
 * Definition, references and rename, as data: a note with a `|` cursor and the texts (with their
 * line numbers) the feature must point at, or the note after a rename.
 */
import { describe, expect, it } from 'vitest';
import { definition, prepareRename, references, rename } from '../src/service';
import { air, applyEdits, marked, noteOf } from './service-helpers';

const NOTE = air(
  'state OA: db=33C wb=23C',
  'state RA: db=24C rh=50%',
  'mix MA: OA 25% + RA 75%',
  'state SA: db=13C rh=95%',
  'process CC: MA -> SA q=4.8m3/s',
  'process RH: SA -> RA m=1kg/s',
);

/** `line:text` of a span (1-based line) for readable expectations. */
function where(text: string, span: { start: number; end: number }): string {
  return `${text.slice(0, span.start).split('\n').length}:${text.slice(span.start, span.end)}`;
}

function at(needle: string, occurrence = 0): { text: string; offset: number } {
  let i = -1;
  for (let k = 0; k <= occurrence; k++) i = NOTE.indexOf(needle, i + 1);
  const { text, offsets } = marked(`${NOTE.slice(0, i)}|${NOTE.slice(i)}`);
  return { text, offset: offsets[0]! };
}

describe('definition and references', () => {
  it('goes from a reference to the definition', () => {
    const { text, offset } = at('SA -> RA');
    const d = definition(noteOf(text), offset);
    expect(d && where(text, d.nameSpan)).toBe('5:SA');
    expect(d && text.slice(d.statementSpan.start, d.statementSpan.end)).toBe('state SA: db=13C rh=95%');
  });

  it('finds every use of a name, with or without its definition', () => {
    const { text, offset } = at('RA:');
    const note = noteOf(text);
    expect(references(note, offset, true)!.map((s) => where(text, s))).toEqual(['3:RA', '4:RA', '7:RA']);
    expect(references(note, offset, false)!.map((s) => where(text, s))).toEqual(['4:RA', '7:RA']);
  });

  it('finds nothing away from names', () => {
    const { text, offset } = at('db=33C');
    expect(definition(noteOf(text), offset)).toBeNull();
    expect(references(noteOf(text), offset, true)).toBeNull();
  });
});

describe('rename', () => {
  it('renames the definition and every reference, touching only the names', () => {
    const { text, offset } = at('MA ->');
    const note = noteOf(text);
    expect(prepareRename(note, offset)).toEqual({ span: expect.any(Object), placeholder: 'MA' });
    const r = rename(note, offset, 'AHU-1_mixed');
    expect('edits' in r).toBe(true);
    if (!('edits' in r)) return;
    for (const e of r.edits) expect(text.slice(e.span.start, e.span.end)).toBe('MA');
    const after = applyEdits(text, r.edits);
    expect(after).toContain('mix AHU-1_mixed: OA 25% + RA 75%');
    expect(after).toContain('process CC: AHU-1_mixed -> SA q=4.8m3/s');
    expect(after).not.toMatch(/\bMA\b/);
  });

  it.each([
    ['3way', 'is not a valid name'],
    ['with space', 'is not a valid name'],
    ['state', 'is a statement keyword'],
    ['SA', 'is already defined on line 5'],
    ['OA', 'is already defined on line 2'],
  ])('refuses the new name %s: %s', (newName, message) => {
    const { text, offset } = at('RA:');
    const r = rename(noteOf(text), offset, newName);
    expect('error' in r && r.error).toContain(message);
  });

  it('refuses a name used for an undefined reference, and a cursor away from names', () => {
    const text = air('state A: db=24C rh=50%', 'mix M: A 50% + GHOST 50%');
    expect(rename(noteOf(text), text.indexOf('A:'), 'GHOST')).toEqual({
      error: expect.stringContaining('already used on line 3'),
    });
    const off = prepareRename(noteOf(text), text.indexOf('24C'));
    expect(off && 'error' in off && off.error).toContain('Only the names');
  });
});
