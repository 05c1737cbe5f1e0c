/**
 * Air above the boiling point at its pressure (dryer and oven exhaust) is real air: every
 * property but the saturation humidity ratio exists, so the note computes it. Only a state that
 * needs saturation at that pressure is `pressure-below-saturation`.
 */
import { describe, expect, it } from 'vitest';
import { allFinite } from '../src/evaluate';
import { satVapPres } from '../src/physics';
import { analyse, fence } from './evaluate-helpers';
import type { StateResult } from '../src/evaluate/types';

const P = 101325;

function stateOf(line: string) {
  const a = analyse(fence(line));
  const item = a.items[0] as StateResult;
  return { a, s: item.state };
}

/** W from eq 33 at the wet-bulb (ASHRAE HoF 2017 SI Ch.1 eq 33, with Ws* from eqs 6 and 23). */
function wFromEq33(db: number, wb: number, p: number): number {
  const pws = satVapPres(wb);
  const wsStar = (0.621945 * pws) / (p - pws);
  return ((2501 - 2.326 * wb) * wsStar - 1.006 * (db - wb)) / (2501 + 1.86 * db - 4.186 * wb);
}

describe('states above the boiling point', () => {
  it('computes db=150C rh=5% at 101.325 kPa: wet-bulb ≈ 67.6 °C', () => {
    const { a, s } = stateOf('state HOT: db=150C rh=5%');
    expect(a.diagnostics).toEqual([]);
    expect(s).not.toBeNull();
    // rh = p_w / p_ws(t) (eq 22 with eq 6's p_ws(150 °C) ≈ 476 kPa), W from eq 20: from first principles.
    const pw = 0.05 * satVapPres(150);
    expect(Math.abs(s!.pw - pw)).toBeLessThan(1e-6 * pw);
    expect(Math.abs(s!.w - (0.621945 * pw) / (P - pw))).toBeLessThan(1e-9);
    // Wet-bulb: 67.6 °C (the figure the issue was filed with); the reported root satisfies eq 33.
    expect(Math.abs(s!.wb - 67.6)).toBeLessThan(0.05);
    expect(Math.abs(wFromEq33(150, s!.wb, P) - s!.w)).toBeLessThan(1e-6);
    expect(allFinite(a)).toBe(true);
  });

  it('computes db=101C rh=10% (just above 99.97 °C, the boiling point at 101.325 kPa)', () => {
    const { a, s } = stateOf('state HOT2: db=101C rh=10%');
    expect(a.diagnostics).toEqual([]);
    expect(Math.abs(wFromEq33(101, s!.wb, P) - s!.w)).toBeLessThan(1e-6);
    expect(s!.rh).toBeCloseTo(0.1, 12);
  });

  it('takes claims on such a state and mixes and processes through it', () => {
    const a = analyse(
      fence(
        'state HOT: db=150C rh=5% wb=67.6C',
        'state ROOM: db=24C rh=50%',
        'mix EXH: HOT 20% + ROOM 80%',
        'process DRY: ROOM -> HOT m=1kg/s',
      ),
    );
    expect(a.diagnostics).toEqual([]);
    expect(a.items.every((i) => i.kind === 'process' || (i as StateResult).state !== null)).toBe(true);
    expect(allFinite(a)).toBe(true);
  });

  it('still refuses a state that needs saturation at that pressure', () => {
    // rh·p_ws(90 °C) = 0.8 × 70.1 kPa = 56 kPa > 50 kPa (eq 6): the vapour pressure exceeds the total.
    expect(analyse(fence('state A: db=90C rh=80% p=50kPa')).diagnostics.map((d) => d.code)).toEqual([
      'pressure-below-saturation',
    ]);
    // A dew point or wet-bulb at or above the boiling point needs saturated air there.
    expect(analyse(fence('state B: db=150C dp=101C')).diagnostics.map((d) => d.code)).toEqual([
      'pressure-below-saturation',
    ]);
    expect(analyse(fence('state C: db=150C wb=100C')).diagnostics.map((d) => d.code)).toEqual([
      'pressure-below-saturation',
    ]);
    // The same air at 50 kPa with rh 30 % (p_w = 21 kPa) is real air above the boiling point (81.3 °C there).
    expect(analyse(fence('state D: db=90C rh=30% p=50kPa')).diagnostics).toEqual([]);
  });
});
