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
    // Figures first: the first lines after the title are the table, two figures to a row.
    const lines = plain.split('\n');
    expect(lines[0]).toBe('state RA');
    const rows = lines.slice(1, 6);
    expect(rows.map((l) => l.trim().split(/\s+/)[0])).toEqual(['db', 'wb', 'dp', 'h', 'rho']);
    // Values right-aligned and units left-aligned in their own columns: in every row the left
    // figure's unit starts at one column, and so does the right figure's.
    const unitStarts = (re: RegExp) => new Set(rows.map((l) => l.search(re)));
    expect(unitStarts(/(?<=\d )(°C|kJ\/kg|kg\/m³)/).size, plain).toBe(1);
    expect(unitStarts(/(?<=\d )(%|g\/kg|kPa|m³\/kg)(?!.*\d )/).size, plain).toBe(1);
    // The pressure basis, claims and method come below the figures.
    const at = (s: string) => plain.indexOf(s);
    expect(at('Pressure:')).toBeGreaterThan(at('rho'));
    expect(at('Claims:')).toBeGreaterThan(at('Pressure:'));
    expect(at('Method:')).toBeGreaterThan(at('Claims:'));
    expect(plain).toContain('Design aid only');
  });
});

describe('degree of saturation above the boiling point', () => {
  // At 150 °C the saturation pressure of water is about 476 kPa (ASHRAE HoF 2017 SI Ch.1 eq 6;
  // steam tables give 476.2 kPa, from memory), above 101.325 kPa: air this hot cannot be saturated,
  // so Ws and W/Ws do not exist there.
  const text = air('state HOT: db=150C rh=5%', 'state WARM: db=24C rh=50%');

  it('shows — with the reason in the hover, never 0', () => {
    const note = noteOf(text);
    const md = hover(note, text.indexOf('HOT'))!.markdown;
    expect(md).toContain('| `mu` | — |');
    expect(md).not.toMatch(/`mu` \| 0\.0/);
    expect(md).toMatch(
      /`mu` —: not defined\. The dry-bulb 150\.0 °C is at or above the boiling point at 101\.325 kPa \(100\.0 °C\)/,
    );
    // Below the boiling point it is W/Ws as usual (24 °C / 50 %: about 49 %,
    // ASHRAE HoF 2017 SI Ch.1 eq 12, from first principles).
    const warm = hover(note, text.indexOf('WARM'))!.markdown;
    expect(warm).toMatch(/\| `mu` \| 49\.\d \| % \|/);
    expect(warm).not.toContain('not defined');
  });
});
