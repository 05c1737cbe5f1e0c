/**
 * The engine against every applicable sourced check value (ASHRAE Handbook—Fundamentals 2017
 * Ch. 1 Tables 1–3 and Example 1 as cited by PsychroLib's test suite, PsychroLib's published Excel
 * values, and values marked "from memory"). Each case carries its id, source and tolerance in
 * `data/check-values.ts`; the test name repeats the id and the source.
 *
 * I-P cases: the engine computes in SI and the test converts with exact constants written here
 * (°F = °C × 1.8 + 32; 1 psi = 6894.757293168 Pa; 1 Btu/lb = 2326 J/kg with the dry-air datum
 * moved from 0 °C to 0 °F, i.e. + 1.006 kJ/(kg·K) × 160/9 K; 1 ft³/lb = 0.062427960576 m³/kg;
 * lb/lb = kg/kg). The I-P chapter rounds its constants separately from the SI chapter, so a few
 * I-P figures need a wider band than the listed one: those are widened in IP_WIDENED with the
 * reason beside each.
 */
import { describe, expect, it } from 'vitest';
import {
  density,
  enthalpy,
  humRatioFromRelHum,
  humRatioFromVapPres,
  humRatioFromWetBulb,
  satHumRatio,
  satVapPres,
  solveState,
  specificVolume,
  stdAtmPressure,
  stdAtmTemperature,
  wetBulbFromHumRatio,
} from '../src/physics';
import { CHECK_CASES, type CheckCase, type Tol } from './data/check-values';

// Exact conversion constants (SI inside, exact conversion for I-P).
const PSI_PA = 6894.757293168;
const BTU_PER_LB_J_PER_KG = 2326;
/** SI enthalpy of dry air at 0 °F: 1.006 kJ/(kg·K) × (−160/9 K), J/kg. */
const DATUM_SHIFT_J_PER_KG = (1006 * 160) / 9;
const FT3_PER_LB_M3_PER_KG = 0.062427960576;
const FT_M = 0.3048;
const toC = (f: number): number => (f - 32) / 1.8;
const toF = (c: number): number => c * 1.8 + 32;
const toBtuPerLb = (hSI: number): number => (hSI + DATUM_SHIFT_J_PER_KG) / BTU_PER_LB_J_PER_KG;

/** Listed tolerances widened for the I-P chapter's separately rounded constants (reason beside each). */
const IP_WIDENED: Record<string, Record<string, Tol>> = {
  // Listed rel 1 % of a figure near zero (−0.286 Btu/lb); the SI eq 30 converted exactly gives
  // −0.289: the I-P eq 32 rounds its constants (0.240, 1061, 0.444) separately. 0.005 Btu/lb abs.
  'PL-IP-HS--4': { hs_Btu_per_lb: { abs: 0.005 } },
  // I-P eq 33 vs SI eq 33 converted: 0.031 % apart (listed 0.03 %). Widened to 0.1 %.
  'PL-IP-XLS-W-WB-ABOVE': { W_lb_per_lb: { rel: 1e-3 } },
  // I-P eq 35 (ice) vs SI eq 35 converted: 0.32 % apart, because W here (1.1 g/kg) is the
  // difference of two nearly equal terms, which magnifies the separately rounded constants. 0.5 %.
  'PL-IP-XLS-W-WB-BELOW': { W_lb_per_lb: { rel: 5e-3 } },
  // I-P eq 32 vs SI eq 30 converted (with the 0 °F datum): 0.074 % apart (listed 0.03 %). 0.1 %.
  'PL-IP-XLS-H': { h_Btu_per_lb: { rel: 1e-3 } },
};

function inp(c: CheckCase, key: string): number {
  const v = c.inputs[key];
  if (v === undefined) throw new Error(`${c.id}: input ${key} missing`);
  return v;
}

/** The engine's figures for a case, keyed like `expected`. */
function compute(c: CheckCase): Record<string, number> {
  const ip = c.units === 'IP';
  const T = (k: string): number => (ip ? toC(inp(c, k)) : inp(c, k));
  const P = (k: string): number => (ip ? inp(c, k) * PSI_PA : inp(c, k));
  switch (c.kind) {
    case 'pws':
      return ip ? { pws_psia: satVapPres(T('t_F')) / PSI_PA } : { pws_Pa: satVapPres(T('t_C')) };
    case 'ws':
      return ip
        ? { Ws_lb_per_lb: satHumRatio(T('t_F'), P('p_psia')) }
        : { Ws_kg_per_kg: satHumRatio(T('t_C'), P('p_Pa')) };
    case 'hs': {
      const t = T(ip ? 't_F' : 't_C');
      const h = enthalpy(t, satHumRatio(t, P(ip ? 'p_psia' : 'p_Pa')));
      return ip ? { hs_Btu_per_lb: toBtuPerLb(h) } : { hs_J_per_kg: h };
    }
    case 'dryAir': {
      const t = T(ip ? 't_F' : 't_C');
      const p = P(ip ? 'p_psia' : 'p_Pa');
      return ip
        ? { hda_Btu_per_lb: toBtuPerLb(enthalpy(t, 0)), vda_ft3_per_lb: specificVolume(t, 0, p) / FT3_PER_LB_M3_PER_KG }
        : { hda_J_per_kg: enthalpy(t, 0), vda_m3_per_kg: specificVolume(t, 0, p), rho_da_kg_per_m3: density(t, 0, p) };
    }
    case 'stdAtm': {
      if (ip) {
        const z = inp(c, 'Z_ft') * FT_M;
        return { p_psia: stdAtmPressure(z) / PSI_PA, t_F: toF(stdAtmTemperature(z)) };
      }
      const z = inp(c, 'Z_m');
      return { p_Pa: stdAtmPressure(z), t_C: stdAtmTemperature(z) };
    }
    case 'wFromPw':
      return ip
        ? { W_lb_per_lb: humRatioFromVapPres(P('pw_psia'), P('p_psia')) }
        : { W_kg_per_kg: humRatioFromVapPres(P('pw_Pa'), P('p_Pa')) };
    case 'wFromWb':
      return ip
        ? { W_lb_per_lb: humRatioFromWetBulb(T('tdb_F'), T('twb_F'), P('p_psia')) }
        : { W_kg_per_kg: humRatioFromWetBulb(T('tdb_C'), T('twb_C'), P('p_Pa')) };
    case 'enthalpy':
      return ip
        ? { h_Btu_per_lb: toBtuPerLb(enthalpy(T('tdb_F'), inp(c, 'W_lb_per_lb'))) }
        : { h_J_per_kg: enthalpy(T('tdb_C'), inp(c, 'W_kg_per_kg')) };
    case 'volume':
      return ip
        ? { v_ft3_per_lb: specificVolume(T('tdb_F'), inp(c, 'W_lb_per_lb'), P('p_psia')) / FT3_PER_LB_M3_PER_KG }
        : { v_m3_per_kg: specificVolume(T('tdb_C'), inp(c, 'W_kg_per_kg'), P('p_Pa')) };
    case 'density':
      return ip
        ? { rho_lb_per_ft3: density(T('tdb_F'), inp(c, 'W_lb_per_lb'), P('p_psia')) * FT3_PER_LB_M3_PER_KG }
        : { rho_kg_per_m3: density(T('tdb_C'), inp(c, 'W_kg_per_kg'), P('p_Pa')) };
    case 'wbFromRh': {
      const db = T('tdb_C');
      const p = P('p_Pa');
      return { twb_C: wetBulbFromHumRatio(db, humRatioFromRelHum(db, inp(c, 'RH'), p), p) };
    }
    case 'example1': {
      const r = ip
        ? solveState({ db: T('tdb_F'), wb: T('twb_F') }, P('p_psia'))
        : solveState({ db: T('tdb_C'), wb: T('twb_C') }, P('p_Pa'));
      if (!r.ok) throw new Error(`${c.id}: ${r.problem.message}`);
      const s = r.state;
      return ip
        ? {
            W_lb_per_lb: s.w,
            tdp_F: toF(s.dp),
            RH: s.rh,
            h_Btu_per_lb: toBtuPerLb(s.h),
            v_ft3_per_lb: s.v / FT3_PER_LB_M3_PER_KG,
          }
        : { W_kg_per_kg: s.w, tdp_C: s.dp, RH: s.rh, h_J_per_kg: s.h, v_m3_per_kg: s.v };
    }
  }
}

function passes(actual: number, expected: number, tol: Tol): boolean {
  const d = Math.abs(actual - expected);
  return (tol.abs !== undefined && d <= tol.abs) || (tol.rel !== undefined && d <= tol.rel * Math.abs(expected));
}

describe('sourced check values', () => {
  it('the data file holds the cases (the loop below cannot be empty)', () => {
    expect(CHECK_CASES.length).toBeGreaterThan(100);
  });
  for (const c of CHECK_CASES) {
    it(`${c.id} — ${c.source}`, () => {
      const actual = compute(c);
      const keys = Object.keys(c.expected);
      expect(keys.length).toBeGreaterThan(0);
      for (const k of keys) {
        const expected = c.expected[k]!;
        const tol = IP_WIDENED[c.id]?.[k] ?? c.tolerance[k];
        expect(tol, `${c.id} ${k}: tolerance`).toBeDefined();
        const a = actual[k];
        expect(a, `${c.id} ${k}: computed`).toBeTypeOf('number');
        expect(
          passes(a!, expected, tol!),
          `${c.id} ${k}: computed ${a} vs expected ${expected} (tolerance ${JSON.stringify(tol)})`,
        ).toBe(true);
      }
    });
  }
});

describe('Example 1 reverse checks', () => {
  // ASHRAE HoF 2017 (SI) Ch.1 Example 1 (40 °C db, 20 °C wb, 101.325 kPa), reverse checks as in
  // the PsychroLib test suite: the wet-bulb recomputed from (db, dew point) and from (db, rh) is
  // 20 °C ± 0.1 K (the handbook's own rounding).
  it('SI: wet-bulb from (40 °C, dew point) and from (40 °C, rh) is 20 °C ± 0.1 K', () => {
    const r = solveState({ db: 40, wb: 20 }, 101325);
    if (!r.ok) throw new Error(r.problem.message);
    const fromDp = solveState({ db: 40, dp: r.state.dp }, 101325);
    const fromRh = solveState({ db: 40, rh: r.state.rh }, 101325);
    if (!fromDp.ok || !fromRh.ok) throw new Error('reverse solve failed');
    expect(Math.abs(fromDp.state.wb - 20)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(fromRh.state.wb - 20)).toBeLessThanOrEqual(0.1);
  });
  // ASHRAE HoF 2017 (I-P) Ch.1 Example 1 (100 °F db, 65 °F wb, 14.696 psia): 65 °F ± 0.1 °F.
  it('I-P: wet-bulb from (100 °F, dew point) and from (100 °F, rh) is 65 °F ± 0.1 °F', () => {
    const p = 14.696 * PSI_PA;
    const r = solveState({ db: toC(100), wb: toC(65) }, p);
    if (!r.ok) throw new Error(r.problem.message);
    const fromDp = solveState({ db: toC(100), dp: r.state.dp }, p);
    const fromRh = solveState({ db: toC(100), rh: r.state.rh }, p);
    if (!fromDp.ok || !fromRh.ok) throw new Error('reverse solve failed');
    expect(Math.abs(toF(fromDp.state.wb) - 65)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(toF(fromRh.state.wb) - 65)).toBeLessThanOrEqual(0.1);
  });
});
