/**
 * The outline, as data: a note and the expected tree of `kind name` entries (children indented).
 */
import { describe, expect, it } from 'vitest';
import { documentSymbols, type OutlineSymbol } from '../src/service';
import { air, noteOf } from './service-helpers';

/** The outline as lines `kind name`, two spaces of indent per level. */
function outline(symbols: OutlineSymbol[], depth = 0): string[] {
  return symbols.flatMap((s) => [`${'  '.repeat(depth)}${s.kind} ${s.name}`, ...outline(s.children, depth + 1)]);
}

function check(text: string, expected: string[]) {
  const symbols = documentSymbols(noteOf(text));
  expect(outline(symbols)).toEqual(expected);
  // Every child lies inside its parent, and the selection inside the symbol (LSP requires both).
  const walk = (list: OutlineSymbol[], parent?: OutlineSymbol) => {
    for (const s of list) {
      expect(s.selectionSpan.start).toBeGreaterThanOrEqual(s.span.start);
      expect(s.selectionSpan.end).toBeLessThanOrEqual(s.span.end);
      if (parent) {
        expect(s.span.start).toBeGreaterThanOrEqual(parent.span.start);
        expect(s.span.end).toBeLessThanOrEqual(parent.span.end);
      }
      walk(s.children, s);
    }
  };
  walk(symbols);
  return symbols;
}

describe('outline', () => {
  it('lists states, mixes and processes under the headings they appear beneath', () => {
    const text = [
      '# AHU-1',
      '',
      '## Design states',
      air('site: elev=1600m', 'state OA: db=33C wb=23C', 'state RA: db=24C rh=50%'),
      '## Mixing and coil',
      air('mix MA: OA 25% + RA 75%', 'state SA: db=13C rh=95%', 'process CC: MA -> SA q=4.8m3/s'),
      '# Notes',
      'The room is held at `state RM: db=22C rh=45%` overnight.',
      '',
    ].join('\n');
    check(text, [
      'heading AHU-1',
      '  heading Design states',
      '    site site',
      '    state OA',
      '    state RA',
      '  heading Mixing and coil',
      '    mix MA',
      '    state SA',
      '    process CC',
      'heading Notes',
      '  state RM',
    ]);
  });

  it('gives each entry a short detail', () => {
    const symbols = check(air('state A: db=10C w=5g/kg', 'state B: db=30C w=5g/kg', 'process HC: A -> B m=2kg/s'), [
      'state A',
      'state B',
      'process HC',
    ]);
    expect(symbols[0]!.detail).toContain('10.0 °C db');
    expect(symbols[2]!.detail).toContain('A → B, sensible heating');
  });

  it('keeps statements before the first heading at the top level', () => {
    check([air('state A: db=24C rh=50%'), '# Later', air('state B: db=20C rh=40%')].join('\n'), [
      'state A',
      'heading Later',
      '  state B',
    ]);
  });
});
