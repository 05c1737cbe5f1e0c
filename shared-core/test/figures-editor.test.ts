/**
 * Editor details: completion puts a space after `:` and `->`, does not offer a process's
 * entering state as its leaving state, offers the keywords on an empty line; an incomplete
 * statement shows no result hint.
 */
import { describe, expect, it } from 'vitest';
import { completions, inlayHints } from '../src/service';
import { air, applyEdits, marked, noteOf } from './service-helpers';

function complete(input: string) {
  const { text, offsets } = marked(input);
  const r = completions(noteOf(text), offsets[0]!);
  return { text, r };
}

/** The text after accepting the proposal labelled `label`. */
function accept(input: string, label: string): string {
  const { text, r } = complete(input);
  const item = r?.items.find((i) => i.label === label);
  expect(item, `${label} among ${JSON.stringify(r?.items.map((i) => i.label))}`).toBeDefined();
  return applyEdits(text, [{ span: r!.replace, newText: item!.insertText }]);
}

describe('completion', () => {
  it('offers the keywords on an empty line of a block, also the first and the last', () => {
    for (const input of [
      air('|'),
      air('state A: db=24C rh=50%', '|'),
      air('|', 'state A: db=24C rh=50%'),
      air('state A: db=24C rh=50%', '', '|', ''),
    ]) {
      const labels = complete(input).r?.items.map((i) => i.label) ?? [];
      for (const k of ['state', 'mix', 'process', 'site', 'units']) expect(labels, input).toContain(k);
      expect(labels.every((l) => /^[a-z]+$/.test(l))).toBe(true); // keywords only
    }
  });

  it('puts a space after the colon when a key or name is taken right after it', () => {
    expect(accept(air('state A:|'), 'db')).toContain('state A: db=');
    expect(accept(air('state A: |'), 'db')).toContain('state A: db=');
    expect(accept(air('site:|'), 'elev')).toContain('site: elev=');
    expect(accept(air('state OA: db=30C rh=40%', 'mix MA:|'), 'OA')).toContain('mix MA: OA');
    expect(accept(air('state OA: db=30C rh=40%', 'process P:|'), 'OA')).toContain('process P: OA');
    expect(accept(air('state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'process P: OA ->|'), 'RA')).toContain(
      'process P: OA -> RA',
    );
  });

  it('does not offer the entering state after MA ->', () => {
    const input = air(
      'state OA: db=30C rh=40%',
      'state RA: db=24C rh=50%',
      'mix MA: OA 25% + RA 75%',
      'process P: MA -> |',
    );
    const labels = complete(input).r!.items.map((i) => i.label);
    expect(labels).toEqual(['OA', 'RA']);
    expect(labels).not.toContain('MA');
  });
});

describe('an incomplete statement shows no result hint', () => {
  it('gives no hint to `mix M2: OA 1m3/s +` and one once the mix is complete', () => {
    const hintsOf = (text: string) => inlayHints(noteOf(text), { start: 0, end: text.length });
    const incomplete = air('state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'mix M2: OA 1m3/s +');
    expect(hintsOf(incomplete)).toHaveLength(2); // OA and RA only
    expect(hintsOf(incomplete.replace('1m3/s +', '1m3/s + RA 3m3/s'))).toHaveLength(3);
    // The same for a property with no value yet.
    expect(hintsOf(air('state OA: db=30C rh=40% h='))).toHaveLength(0);
  });
});
