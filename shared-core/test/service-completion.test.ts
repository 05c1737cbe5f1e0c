/**
 * Completion, as data: a note with a `|` cursor, the labels that must (and must not) be offered,
 * and the text the proposals replace.
 */
import { describe, expect, it } from 'vitest';
import { completions } from '../src/service';
import { air, marked, noteOf } from './service-helpers';

interface Expected {
  includes?: string[];
  excludes?: string[];
  /** The labels in this exact order, when the whole list matters. */
  exactly?: string[];
  /** The text the proposals replace. */
  replaces?: string;
}

function check(input: string, expected: Expected | null) {
  const { text, offsets } = marked(input);
  const result = completions(noteOf(text), offsets[0]!);
  if (expected === null) {
    expect(result).toBeNull();
    return;
  }
  expect(result).not.toBeNull();
  const labels = result!.items.map((i) => i.label);
  for (const l of expected.includes ?? []) expect(labels).toContain(l);
  for (const l of expected.excludes ?? []) expect(labels).not.toContain(l);
  if (expected.exactly) expect(labels).toEqual(expected.exactly);
  if (expected.replaces !== undefined)
    expect(text.slice(result!.replace.start, result!.replace.end)).toBe(expected.replaces);
}

describe('completion', () => {
  it('offers the statement keywords at the start of a line', () => {
    check(air('state A: db=24C rh=50%', '|'), {
      exactly: ['state', 'mix', 'process', 'supply', 'recover', 'site', 'units'],
      replaces: '',
    });
    check(air('pro|'), { includes: ['process'], replaces: 'pro' });
  });

  it('offers SI and IP after units:', () => {
    check(air('units: |'), { exactly: ['SI', 'IP'] });
  });

  it('offers the keys not yet written', () => {
    check(air('state A: |'), { includes: ['db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'p', 'elev'] });
    check(air('state A: db=24C |'), { includes: ['rh', 'wb'], excludes: ['db'] });
    check(air('state A: db=24C r|'), { includes: ['rh'], replaces: 'r' });
    check(air('site: |'), { exactly: ['p', 'elev'] });
  });

  it("offers the units of the key's dimension after a number", () => {
    check(air('state A: db=24|'), { exactly: ['C', 'F', 'K', 'R'], replaces: '' });
    check(air('state A: db=24C rh=50|'), { exactly: ['%'] });
    check(air('state A: db=24C w=9.3g|'), {
      includes: ['g/kg', 'gr/lb', 'kg/kg', 'lb/lb'],
      excludes: ['C', 'kJ/kg'],
      replaces: 'g',
    });
    check(air('state A: db=24C rh=50%', 'state B: db=30C rh=40%', 'process P: A -> B q=4.8|'), {
      includes: ['m3/s', 'L/s', 'cfm'],
      excludes: ['kg/s'],
    });
  });

  it('offers the names defined earlier in mixes and processes, never later ones', () => {
    const states = ['state OA: db=33C wb=23C', 'state RA: db=24C rh=50%'];
    check(air(...states, 'mix MA: |', 'state LATER: db=20C rh=50%'), { exactly: ['OA', 'RA'] });
    check(air(...states, 'mix MA: OA 25% + R|'), { includes: ['RA'], replaces: 'R' });
    check(air(...states, 'mix MA: OA 25% + RA 75%', 'process CC: MA -> |'), { exactly: ['OA', 'RA'] }); // not MA itself
    check(air(...states, 'mix MA: OA 25% + RA 75%', 'process CC: |'), { exactly: ['OA', 'RA', 'MA'] });
    check(air(...states, 'process CC: OA -> RA |'), { includes: ['m', 'q', 'q_total', 'shr'] });
  });

  it('offers units for a mix stream amount', () => {
    check(air('state OA: db=33C wb=23C', 'state RA: db=24C rh=50%', 'mix MA: OA 25|'), {
      includes: ['%', 'kg/s', 'L/s', 'cfm'],
    });
  });

  it('offers nothing in prose, in comments, or in other fences', () => {
    check('Some prose |here.\n', null);
    check(air('state A: db=24C rh=50%  # a comm|ent'), null);
    check('```js\nst|\n```\n', null);
  });
});
