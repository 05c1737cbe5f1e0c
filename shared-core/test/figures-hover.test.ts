/**
 * Hover details: the other wet-bulb near 0 °C (eq 33 over water is reported, eq 35 over ice shown
 * when it solves too) and the plain-text hover for editors that do not take Markdown.
 */
import { describe, expect, it } from 'vitest';
import { iceWetBulbAlternative, satVapPres, solveState } from '../src/physics';
import { hover, hoverPlainText } from '../src/service';
import { air, noteOf } from './service-helpers';

const P = 101325;

/** W from eq 33 (water, wb ≥ 0) or eq 35 (ice, wb < 0): ASHRAE HoF 2017 SI Ch.1, from first principles. */
function wFromWetBulb(db: number, wb: number, ice: boolean): number {
  const pws = satVapPres(wb);
  const ws = (0.621945 * pws) / (P - pws);
  return ice
    ? ((2830 - 0.24 * wb) * ws - 1.006 * (db - wb)) / (2830 + 1.86 * db - 2.1 * wb)
    : ((2501 - 2.326 * wb) * ws - 1.006 * (db - wb)) / (2501 + 1.86 * db - 4.186 * wb);
}

describe('two wet-bulbs near 0 °C', () => {
  // At 5 °C, eq 33 at 0 °C gives W = 1.771 g/kg and eq 35 just below 0 °C gives 2.005 g/kg (from
  // first principles): any W between has a root of each, the water one at or above 0 °C.
  it('reports the root over water and finds the one over ice', () => {
    const r = solveState({ db: 5, w: 0.0019 }, P);
    if (!r.ok) throw new Error(r.problem.message);
    const s = r.state;
    expect(s.wb).toBeGreaterThanOrEqual(0);
    expect(s.wbIce).toBe(false);
    expect(Math.abs(wFromWetBulb(5, s.wb, false) - 0.0019)).toBeLessThan(1e-9);
    const ice = iceWetBulbAlternative(5, 0.0019, P, s.wb, s.dp)!;
    expect(ice).toBeLessThan(0);
    expect(Math.abs(wFromWetBulb(5, ice, true) - 0.0019)).toBeLessThan(1e-9);
  });

  it('has no other root away from 0 °C or when eq 35 has none', () => {
    const warm = solveState({ db: 24, rh: 0.5 }, P);
    if (!warm.ok) throw new Error('24 °C / 50 %');
    expect(iceWetBulbAlternative(24, warm.state.w, P, warm.state.wb, warm.state.dp)).toBeNull();
    // W = 1.6 g/kg at 5 °C is below what eq 33 gives at 0 °C: one root, over ice.
    const dry = solveState({ db: 5, w: 0.0016 }, P);
    if (!dry.ok) throw new Error('5 °C, 1.6 g/kg');
    expect(dry.state.wb).toBeLessThan(0);
    expect(iceWetBulbAlternative(5, 0.0016, P, dry.state.wb, dry.state.dp)).toBeNull();
  });

  it('states which one is reported and shows the other in the hover', () => {
    const text = air('state NEAR0: db=5C w=1.9g/kg', 'state WARM: db=24C rh=50%');
    const note = noteOf(text);
    const md = hover(note, text.indexOf('NEAR0'))!.markdown;
    expect(md).toMatch(/over water \(eq 33\)/);
    expect(md).toMatch(/over ice \(eq 35\) [-−]0\.\d/);
    expect(hover(note, text.indexOf('WARM'))!.markdown).not.toContain('eq 35');
  });
});

describe('plain-text hover', () => {
  it('turns tables into aligned columns and drops Markdown marks', () => {
    const text = air('state RA: db=24C rh=50% h=48kJ/kg');
    const md = hover(noteOf(text), text.indexOf('RA'))!.markdown;
    const plain = hoverPlainText(md);
    expect(plain).not.toMatch(/\||\*\*|`|\\/);
    expect(plain).toContain('state RA');
    // The values are right-aligned in one column: each ends where the others end.
    const ends = [' °C', ' g/kg', ' kJ/kg'].map((unit) => {
      const row = plain.split('\n').find((l) => l.includes(unit) && !l.includes('datum'))!;
      return row.indexOf(unit) + unit.length;
    });
    expect(new Set(ends).size, plain).toBe(1);
    expect(plain).toContain('Design aid only');
  });
});
