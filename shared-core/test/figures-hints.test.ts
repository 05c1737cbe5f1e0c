/**
 * Inline hints as engineers read them: a frost point is called `fp`, as the hover calls it, and a
 * figure is never split when the editor wraps a long line.
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { inlayHints } from '../src/service';
import { air, hintFigure, near, noteOf } from './service-helpers';

const psy = createRequire(import.meta.url)('psychrolib') as {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetTDewPointFromRelHum(t: number, rh: number): number;
};
psy.SetUnitSystem(psy.SI);

function labels(...lines: string[]): string[] {
  const text = air(...lines);
  return inlayHints(noteOf(text), { start: 0, end: text.length }).map((h) => h.label);
}

describe('frost point in hints', () => {
  it('says fp (not dp) below the triple point, and dp above it', () => {
    const [cold, warm] = labels('state COLD: db=-5C rh=50%', 'state WARM: db=24C rh=50%');
    expect(cold).toMatch(/(^|· )fp\u00a0/);
    expect(cold).not.toMatch(/(^|· )dp\u00a0/);
    // −5 °C at 50 %: frost point from PsychroLib 1.1.1 as oracle (over ice below 0 °C), shown to 0.1 K.
    expect(near(hintFigure(cold!, 'fp', '°C')!, psy.GetTDewPointFromRelHum(-5, 0.5), 0.05 + 0.05)).toBe(true);
    expect(warm).toMatch(/(^|· )dp\u00a0/);
  });
});

describe('hints wrap only between figures', () => {
  it('keeps every figure (key, number, unit, words) together with no-break spaces', () => {
    const all = labels(
      'state OA: db=-12.5C rh=80%',
      'state RA: db=24C rh=50% h=60kJ/kg',
      'mix MA: OA 25% + RA 75%',
      'state OFF: db=12C rh=92%',
      'process CC: MA -> OFF m=4.6kg/s',
      'process HT: OA -> RA m=1kg/s',
    );
    expect(all.length).toBe(6);
    for (const label of all) {
      // An ordinary space appears only in the ' · ' between figures: that is where a wrap may fall.
      for (let i = label.indexOf(' '); i >= 0; i = label.indexOf(' ', i + 1)) {
        expect(
          label[i - 1] === '·' || label[i + 1] === '·',
          `${JSON.stringify(label)} has a breakable space at ${i}`,
        ).toBe(true);
      }
      for (const part of label.split(' · ')) expect(part, label).not.toMatch(/^\u00a0|\u00a0$/);
    }
    // Numbers and units are separated by no-break spaces: 'kW removed', 'kg/h condensate', '✗ h is …'.
    expect(all.join('\n')).toMatch(/\d\u00a0kW\u00a0(removed|added)/);
    expect(all[1]).toMatch(/✗\u00a0h\u00a0is\u00a0/);
  });
});
