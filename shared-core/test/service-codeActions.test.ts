/**
 * Code actions, as data: a note with a `|…|` range, the action to take (by title), and the note
 * after its edits. Each edit must replace only the token it is about.
 */
import { describe, expect, it } from 'vitest';
import { codeActions, hover, noteDiagnostics, type FixAction, type Note } from '../src/service';
import { air, applyEdits, marked, near, noteOf, tableValue } from './service-helpers';

function actionsAt(input: string): { text: string; note: Note; actions: FixAction[] } {
  const { text, offsets } = marked(input);
  const note = noteOf(text);
  const span = { start: offsets[0]!, end: offsets[1] ?? offsets[0]! };
  return { text, note, actions: codeActions(note, span) };
}

/** Applies the action whose title starts with `title` and returns the new text. */
function check(input: string, title: string, expected: string, kind: FixAction['kind'] = 'quickfix'): string {
  const { text, actions } = actionsAt(input);
  const action = actions.find((a) => a.title.startsWith(title));
  expect(action, `an action "${title}" among ${JSON.stringify(actions.map((a) => a.title))}`).toBeDefined();
  expect(action!.kind).toBe(kind);
  // Edits never overlap and never reach beyond the statement's line.
  const sorted = [...action!.edits].sort((a, b) => a.span.start - b.span.start);
  for (let i = 1; i < sorted.length; i++) expect(sorted[i]!.span.start).toBeGreaterThanOrEqual(sorted[i - 1]!.span.end);
  for (const e of sorted) expect(text.slice(e.span.start, e.span.end)).not.toContain('\n');
  const after = applyEdits(text, action!.edits);
  expect(after).toContain(expected);
  return after;
}

describe('quick fixes', () => {
  it('adds a missing temperature unit, °C or °F, at the number only', () => {
    check(air('state A: db=2|4 rh=50%'), 'Add unit °C', 'state A: db=24C rh=50%');
    check(air('state A: db=2|4 rh=50%'), 'Add unit °F', 'state A: db=24F rh=50%');
    const { actions } = actionsAt(air('units: IP', 'state A: db=7|5 rh=50%'));
    expect(actions.find((a) => a.preferred)?.title).toContain('°F');
  });

  it('swaps a wet-bulb written above the dry-bulb', () => {
    const after = check(
      air('state LOG7: db=20C wb=2|5C   # as copied'),
      'Swap the dry-bulb and wet-bulb values',
      'state LOG7: db=25C wb=20C   # as copied',
    );
    expect(noteDiagnostics(noteOf(after)).filter((d) => d.code === 'wb-above-db')).toEqual([]);
  });

  it('replaces a stale claim with the computed value, after which the claim holds', () => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1: RH 14 % for 40 °C db / 20 °C wb, so rh=20% is stale.
    const after = check(
      air('state OA: db=40C wb=20C rh=2|0%'),
      'Replace the stale claim',
      'state OA: db=40C wb=20C rh=1',
    );
    expect(noteDiagnostics(noteOf(after)).filter((d) => d.code === 'claim-mismatch')).toEqual([]);
  });

  it('offers a suggested unit for a misspelt one', () => {
    check(air('state A: db=24C w=9.3g/K|g'), "Change unit 'g/Kg' to 'g/kg'", 'state A: db=24C w=9.3g/kg');
  });
});

describe('convert to the other unit system', () => {
  it('rewrites SI values in IP and back; the state stays the same within rounding', () => {
    const input = air('state R|A: db=24C rh=50%');
    // 24 °C = 75.2 °F exactly (°F = °C × 9/5 + 32, by definition).
    const ip = check(input, 'Convert the written values of state RA to IP', 'state RA: db=75.2F rh=50%', 'refactor');
    const si = check(
      ip.replace('state RA', 'state R|A'),
      'Convert the written values of state RA to SI',
      'state RA: db=24.0C rh=50%',
      'refactor',
    );
    const w = (text: string) => tableValue(hover(noteOf(text), text.indexOf('RA'))!.markdown, 'w');
    expect(near(w(ip), w(input.replace('|', '')), 0.01)).toBe(true);
    expect(near(w(si), w(input.replace('|', '')), 0.01)).toBe(true);
  });

  it('keeps a claim’s band when its unit changes, so a holding claim still holds', () => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1: h = 56.7 kJ/kg ± 0.1 for 40 °C db / 20 °C wb.
    const ip = check(
      air('state O|A: db=40C wb=20C h=56.7kJ/kg±0.1'),
      'Convert the written values of state OA to IP',
      'Btu/lb±',
      'refactor',
    );
    expect(ip).toContain('db=104.0F');
    expect(noteDiagnostics(noteOf(ip)).filter((d) => d.code === 'claim-mismatch')).toEqual([]);
  });

  it('converts flows with four significant figures and leaves percentages alone', () => {
    const text = air('state OA: db=33C wb=23C', 'state RA: db=24C rh=50%', 'mix M|A: OA 1000L/s + RA 3000L/s');
    // 1 cfm = 0.3048³ m³ / 60 s = 0.47194745 L/s exactly, so 1000 L/s = 2118.88 cfm.
    check(text, 'Convert the written values of mix MA to IP', 'mix MA: OA 2119cfm + RA 6357cfm', 'refactor');
  });
});
