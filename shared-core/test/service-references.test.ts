/**
 * Editor features on property references (`w=OA.w`, `db=OFF.db+0.8K`), as data: hover says where
 * a value came from, go-to-definition and find-references work on `OA.w`, rename follows every
 * reference, completion offers `NAME.key` after `key=` and the keys of a state after `NAME.`.
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { completions, definition, hover, prepareRename, references, rename } from '../src/service';
import { air, applyEdits, marked, noteOf, tableValue } from './service-helpers';

/** PsychroLib 1.1.1 (test oracle), SI. */
const psy = createRequire(import.meta.url)('psychrolib') as {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromTWetBulb(t: number, wb: number, p: number): number;
};
psy.SetUnitSystem(psy.SI);

const NOTE = air(
  'state OA: db=32C wb=22.5C',
  'state PH: db=OA.db+8K w=OA.w',
  'state RA: db=24C rh=50%',
  'mix MA: PH 30% + RA 70%',
  'state SA: db=MA.db+0.8K w=MA.w',
);

/** The note with a cursor before the `occurrence`-th `needle` (plus `shift` characters). */
function at(needle: string, shift = 0, occurrence = 0): { text: string; offset: number } {
  let i = -1;
  for (let k = 0; k <= occurrence; k++) i = NOTE.indexOf(needle, i + 1);
  expect(i).toBeGreaterThanOrEqual(0);
  const { text, offsets } = marked(`${NOTE.slice(0, i + shift)}|${NOTE.slice(i + shift)}`);
  return { text, offset: offsets[0]! };
}

function where(text: string, span: { start: number; end: number }): string {
  return `${text.slice(0, span.start).split('\n').length}:${text.slice(span.start, span.end)}`;
}

describe('hover on references', () => {
  it('on the key of OA.w: where the value comes from and its value now, then the state it names', () => {
    const { text, offset } = at('OA.w', 3);
    const h = hover(noteOf(text), offset)!;
    const first = h.markdown.split('\n')[0]!;
    // W from db 32 °C, wb 22.5 °C at 101.325 kPa: PsychroLib GetHumRatioFromTWetBulb (oracle), shown to 0.01 g/kg.
    const w = psy.GetHumRatioFromTWetBulb(32, 22.5, 101325) * 1000;
    expect(first).toBe(`\`w=OA.w\` — w from OA: ${w.toFixed(2)} g/kg`);
    expect(h.markdown).toContain('**state OA**');
    expect(text.slice(h.span.start, h.span.end)).toBe('.w');
  });

  it('with a difference: the difference in the note’s unit system', () => {
    const { text, offset } = at('OA.db+8K', 4);
    expect(hover(noteOf(text), offset)!.markdown.split('\n')[0]).toBe('`db=OA.db+8K` — db from OA + 8.0 K: 40.0 °C');
    const ip = hover(noteOf(text, { units: 'IP' }), offset)!.markdown.split('\n')[0];
    // 8 K = 14.4 °F as a difference; 40 °C = 104 °F (exact definitions, NIST SP 811).
    expect(ip).toBe('`db=OA.db+8K` — db from OA + 14.4 °F: 104.0 °F');
  });

  it('on a state with references: each taken property marked with its source, and a line saying so', () => {
    const { text, offset } = at('PH:', 0);
    const h = hover(noteOf(text), offset)!.markdown;
    expect(h).toMatch(/\| `db` \| 40\.0 \| °C ← OA \|/);
    expect(h).toMatch(/\| `w` \| [\d.]+ \| g\/kg ← OA \|/);
    expect(h).toContain('Taken from states above: db from OA + 8.0 K; w from OA.');
    expect(tableValue(h, 'db')).toBe(40);
  });

  it('on a process that defines its leaving state: the reference is that state’s; its hover names the source', () => {
    const input = air(
      'state RA: db=24C rh=50%',
      'supply SA: RA q_sensible=40kW q_latent=10kW m=4kg/s',
      'process CC: RA -> OFF db=11.5C w=SA.|w',
    );
    const { text, offsets } = marked(input);
    const note = noteOf(text);
    const h = hover(note, offsets[0]!)!;
    const sa = note.analysis.items.find((i) => i.name === 'SA') as { state: { w: number } };
    // The value is SA's computed W (a reference takes the property as it is), shown to 0.01 g/kg.
    expect(h.markdown.split('\n')[0]).toBe(`\`w=SA.w\` — w from SA: ${(sa.state.w * 1000).toFixed(2)} g/kg`);
    expect(h.markdown).toContain('**supply SA**');
    // The leaving state's own hover marks the taken property and the process that defined it.
    const off = hover(note, text.indexOf('OFF') + 1)!.markdown;
    expect(off).toMatch(/\| `w` \| [\d.]+ \| g\/kg ← SA \|/);
    expect(off).toContain('Defined by process CC from RA (`db=11.5C w=SA.w`).');
    const d = definition(note, offsets[0]!);
    expect(d && where(text, d.nameSpan)).toBe('3:SA');
  });

  it('on the state name of a reference: the hover of that state', () => {
    const { text, offset } = at('MA.db', 1);
    expect(hover(noteOf(text), offset)!.markdown.startsWith('| **mix MA** — adiabatic mixing |')).toBe(true);
  });
});

describe('definition, references and rename through OA.w', () => {
  it('goes to the definition from the name and from the key of a reference', () => {
    for (const shift of [0, 1, 3]) {
      const { text, offset } = at('OA.w', shift);
      const d = definition(noteOf(text), offset);
      expect(d && where(text, d.nameSpan)).toBe('2:OA');
    }
  });

  it('finds every reference of a state, references in property values included', () => {
    const { text, offset } = at('OA:');
    expect(references(noteOf(text), offset, true)!.map((s) => where(text, s))).toEqual(['2:OA', '3:OA', '3:OA']);
    const ma = at('MA:');
    expect(references(noteOf(ma.text), ma.offset, false)!.map((s) => where(ma.text, s))).toEqual(['6:MA', '6:MA']);
  });

  it('renames a state everywhere, inside references too, and the note still evaluates the same', () => {
    const { text, offset } = at('OA.w', 3);
    const note = noteOf(text);
    expect(prepareRename(note, offset)).toEqual({ span: expect.any(Object), placeholder: 'OA' });
    const r = rename(note, offset, 'OUT-1');
    expect('edits' in r).toBe(true);
    if (!('edits' in r)) return;
    const renamed = applyEdits(text, r.edits);
    expect(renamed).toContain('state OUT-1: db=32C wb=22.5C');
    expect(renamed).toContain('state PH: db=OUT-1.db+8K w=OUT-1.w');
    const before = noteOf(text).analysis;
    const after = noteOf(renamed).analysis;
    expect(after.diagnostics).toEqual([]);
    const ph = (a: typeof before) => a.items.find((i) => i.name === 'PH');
    expect(
      ph(after)?.kind === 'state' && ph(after)?.kind === ph(before)?.kind && (ph(after) as { state: unknown }).state,
    ).toEqual((ph(before) as { state: unknown }).state);
  });

  it('refuses a rename onto a name in use', () => {
    const { text, offset } = at('OA.w', 3);
    const r = rename(noteOf(text), offset, 'RA');
    expect(r).toEqual({ error: expect.stringMatching(/"RA" is already defined on line 4/) });
  });
});

describe('completion of references', () => {
  function labels(input: string) {
    const { text, offsets } = marked(input);
    const r = completions(noteOf(text), offsets[0]!);
    return r
      ? {
          labels: r.items.map((i) => i.label),
          replaced: text.slice(r.replace.start, r.replace.end),
          details: r.items.map((i) => i.detail),
        }
      : null;
  }

  it('after key=: the states above, as NAME.key', () => {
    const r = labels(air('state OA: db=32C wb=22.5C', 'mix M: OA 50% + OA 50%', 'state X: db=20C w=|'));
    expect(r?.labels).toEqual(['OA.w', 'M.w']);
    expect(r?.details[0]).toMatch(/^w of OA = \d+\.\d\d g\/kg$/);
    const typed = labels(air('state OA: db=32C wb=22.5C', 'state X: db=20C w=O|'));
    expect(typed).toMatchObject({ labels: ['OA.w'], replaced: 'O' });
  });

  it('after NAME.: the keys of that state of the kind being set, with their values', () => {
    const r = labels(air('state OA: db=32C wb=22.5C', 'state X: db=OA.|'));
    expect(r?.labels).toEqual(['db', 'wb', 'dp']);
    expect(r?.details[0]).toBe('dry-bulb temperature of OA = 32.0 °C');
    expect(labels(air('state OA: db=32C wb=22.5C', 'state X: db=20C w=OA.|'))?.labels).toEqual(['w']);
  });

  it('offers no state defined below, and none after a name that is not a state', () => {
    expect(labels(air('state X: db=20C w=|', 'state OA: db=32C wb=22.5C'))).toBeNull();
    expect(labels(air('state OA: db=32C wb=22.5C', 'state X: db=20C w=NOPE.|'))).toBeNull();
  });
});

describe('supply in the editor', () => {
  it('hover shows the room loads, the room SHR, the flow as mass and volume, then the supply state', () => {
    const { text, offsets } = marked(
      air('state RA: db=24C rh=50%', 'supply S|A: RA q_sensible=41.5kW q_latent=8kW db=13.6C'),
    );
    const h = hover(noteOf(text), offsets[0]!)!.markdown;
    expect(h).toContain('**supply SA** — supply air for the loads of RA');
    expect(h).toContain('| room sensible gain | 41.5 kW |');
    // Room SHR 41.5 / (41.5 + 8) = 0.838 (arithmetic).
    expect(h).toContain('| room SHR | 0.84 |');
    expect(h).toMatch(/\| dry-air flow \| 3\.91 kg\/s \|/);
    expect(h).toMatch(/\| volume flow at SA \| 3\.22 m³\/s \|/);
    expect(tableValue(h, 'db')).toBe(13.6);
    const ip = hover(noteOf(text, { units: 'IP' }), offsets[0]!)!.markdown;
    expect(ip).toMatch(/\| volume flow at SA \| [\d,]+ cfm \|/);
  });

  it('completion: the room state after the colon, then the supply keys', () => {
    const names = completions(
      noteOf(marked(air('state RA: db=24C rh=50%', 'supply SA: |')).text),
      marked(air('state RA: db=24C rh=50%', 'supply SA: |')).offsets[0]!,
    );
    expect(names?.items.map((i) => i.label)).toEqual(['RA']);
    const { text, offsets } = marked(air('state RA: db=24C rh=50%', 'supply SA: RA |'));
    expect(completions(noteOf(text), offsets[0]!)?.items.map((i) => i.label)).toEqual(
      expect.arrayContaining(['q_sensible', 'q_latent', 'db', 'm', 'q', 'shr']),
    );
  });

  it('rename of the room state follows into the supply line', () => {
    const { text, offsets } = marked(
      air('state R|A: db=24C rh=50%', 'supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C'),
    );
    const r = rename(noteOf(text), offsets[0]!, 'ROOM-1');
    expect('edits' in r && applyEdits(text, r.edits)).toContain('supply SA: ROOM-1 q_sensible');
  });
});
