/**
 * Edge behaviour: where PsychroLib (npm psychrolib 1.1.1, observed and listed as the reference
 * list's "edge" cases) is wrong or silent, this engine is right or loud; plus facts of the trade
 * ("common practice") and the saturation curve's switch and range.
 */
import { describe, expect, it } from 'vitest';
import {
  boilingPoint,
  degreeOfSaturation,
  dewPointFromVapPres,
  enthalpy,
  humRatioFromRelHum,
  humRatioFromWetBulb,
  relHumFromHumRatio,
  satHumRatio,
  satVapPres,
  solveState,
  stateFromDbW,
  wetBulbFromHumRatio,
} from '../src/physics';
import { humRatioEq33 } from '../src/physics/wetbulb';
import { SWITCH_C } from '../src/physics/saturation';
import { si } from './data/psychrolib-oracle';
import { codeOf } from './data/physics-helpers';

const PSI_PA = 6894.757293168;
const toC = (f: number): number => (f - 32) / 1.8;

describe('where PsychroLib is wrong, the engine is right (reference list, "edge" cases)', () => {
  // EDGE-SI-WB-ABOVE-BOILING (observed by running npm psychrolib 1.1.1): PsychroLib bisects on
  // [dp, db]; above the boiling point its Ws* clamps to 1e-7 and the bracket walks up to db.
  // The reference list gives 67.617 °C (150 °C) and 92.835 °C (199 °C) for a bracket capped at
  // the boiling point; three decimals are given, so ±0.0005 K.
  it('EDGE-SI-WB-ABOVE-BOILING: 150 °C / 5 % at 101 325 Pa has a wet-bulb of 67.617 °C, not 150 °C', () => {
    const w = humRatioFromRelHum(150, 0.05, 101325);
    const wb = wetBulbFromHumRatio(150, w, 101325);
    expect(Math.abs(wb - 67.617)).toBeLessThanOrEqual(0.0005);
    // The wet-bulb is a root of eq 33: it gives back W.
    expect(Math.abs(humRatioFromWetBulb(150, wb, 101325) - w)).toBeLessThanOrEqual(1e-12);
    // PsychroLib's own answer (the observed defect).
    expect(si().GetTWetBulbFromHumRatio(150, w, 101325)).toBeGreaterThan(149.9);
  });
  it('EDGE-SI-WB-ABOVE-BOILING: 199 °C / 5 % at 101 325 Pa has a wet-bulb of 92.835 °C', () => {
    const r = solveState({ db: 199, rh: 0.05 }, 101325);
    if (!r.ok) throw new Error(r.problem.message);
    expect(Math.abs(r.state.wb - 92.835)).toBeLessThanOrEqual(0.0005);
    expect(r.state.ws).toBe(Number.POSITIVE_INFINITY);
    expect(r.state.mu).toBe(0);
    expect(r.warnings.map((x) => x.code)).toContain('pressure-below-saturation');
  });
  it('EDGE-SI-WB-ABOVE-BOILING: 140 °C / 5 % (below the defect) agrees with PsychroLib to 0.001 K', () => {
    const w = humRatioFromRelHum(140, 0.05, 101325);
    expect(
      Math.abs(wetBulbFromHumRatio(140, w, 101325) - si().GetTWetBulbFromHumRatio(140, w, 101325)),
    ).toBeLessThanOrEqual(0.001);
  });

  // EDGE-SI-W-ZERO: PsychroLib raises W < 1e-7 to 1e-7 everywhere (h 20120.25 J/kg, RH 7e-6).
  it('EDGE-SI-W-ZERO: bone-dry air at 20 °C has h = 1006 × 20 J/kg and rh exactly 0', () => {
    const s = stateFromDbW(20, 0, 101325);
    expect(s.h).toBe(20120);
    expect(s.rh).toBe(0);
    expect(s.pw).toBe(0);
    expect(s.mu).toBe(0);
    expect(s.dp).toBe(Number.NEGATIVE_INFINITY);
    expect(Number.isFinite(s.wb)).toBe(true);
    expect(Math.abs(humRatioFromWetBulb(20, s.wb, 101325))).toBeLessThanOrEqual(1e-15); // its wet-bulb gives W = 0 back
    expect(enthalpy(20, 0)).toBe(20120);
    // PsychroLib's clamp (observed): 0.25 J/kg and 7e-6 too much.
    expect(si().GetMoistAirEnthalpy(20, 0)).toBeGreaterThan(20120.2);
  });
  it('tiny humidity ratios are kept exact (1e-9 kg/kg is not raised to 1e-7)', () => {
    const s = stateFromDbW(20, 1e-9, 101325);
    expect(s.w).toBe(1e-9);
    expect(Math.abs(s.h - (20120 + 1e-9 * (2_501_000 + 1860 * 20)))).toBeLessThanOrEqual(1e-9);
    expect(s.rh).toBeGreaterThan(0);
    expect(s.rh).toBeLessThan(1e-7);
    expect(s.dp).toBeLessThan(-100); // extrapolated frost point of very dry air
    const r = solveState({ db: 20, w: 1e-9 }, 101325);
    expect(r.ok && r.warnings.some((x) => x.code === 'out-of-range' && x.keys.includes('dp'))).toBe(true);
  });

  // EDGE-SI-WS-ABOVE-BOILING: PsychroLib returns Ws = 1e-7 at 100 °C and 110 °C at 101 325 Pa
  // (t_boil = 99.974 °C per the reference list) and μ = W/1e-7 = 100000.
  it('EDGE-SI-WS-ABOVE-BOILING: saturation above the boiling point is an error, not 1e-7', () => {
    expect(codeOf(() => satHumRatio(100, 101325))).toBe('pressure-below-saturation');
    expect(codeOf(() => satHumRatio(110, 101325))).toBe('pressure-below-saturation');
    expect(codeOf(() => degreeOfSaturation(110, 0.01, 101325))).toBe('pressure-below-saturation');
    expect(codeOf(() => humRatioFromRelHum(100, 1, 101325))).toBe('pressure-below-saturation');
    expect(Math.abs(boilingPoint(101325) - 99.974)).toBeLessThanOrEqual(0.0005);
    expect(satHumRatio(99.97, 101325)).toBeGreaterThan(100); // just below: huge but finite
    expect(si().GetSatHumRatio(110, 101325)).toBe(1e-7); // PsychroLib's clamp (observed)
  });

  // EDGE-SI-SUPERSATURATED: PsychroLib returns RH 1.35 with no error and caps dp and wb at db.
  it('EDGE-SI-SUPERSATURATED: 20 °C with 0.02 kg/kg is an error, or a flagged fog state when allowed', () => {
    expect(Math.abs(satHumRatio(20, 101325) - 0.014695)).toBeLessThanOrEqual(5e-7); // Ws(20 °C) per the reference list
    const r = solveState({ db: 20, w: 0.02 }, 101325);
    expect(r.ok ? 'ok' : r.problem.code).toBe('supersaturated');
    if (!r.ok) {
      expect(r.problem.keys).toEqual(['db', 'w']);
      expect(r.problem.fix.length).toBeGreaterThan(10);
    }
    expect(codeOf(() => stateFromDbW(20, 0.02, 101325))).toBe('supersaturated');
    expect(codeOf(() => wetBulbFromHumRatio(20, 0.02, 101325))).toBe('supersaturated');
    const fog = solveState({ db: 20, w: 0.02 }, 101325, { allowFog: true });
    if (!fog.ok) throw new Error(fog.problem.message);
    expect(fog.state.fog).toBe(true);
    expect(fog.state.rh).toBe(1);
    expect(fog.state.wb).toBe(20);
    expect(fog.state.dp).toBe(20);
    expect(fog.state.w).toBe(0.02);
    expect(fog.warnings.map((x) => x.code)).toEqual(['supersaturated']);
    expect(si().GetRelHumFromHumRatio(20, 0.02, 101325)).toBeGreaterThan(1.3); // PsychroLib (observed)
  });

  // EDGE-SI-WB-TOO-LOW: eq 33 gives W = −0.008519405639291119 for 40 °C / 5 °C; PsychroLib returns 1e-7.
  it('EDGE-SI-WB-TOO-LOW: 40 °C db with 5 °C wb is wb-too-low, not 1e-7', () => {
    const pws = satVapPres(5);
    const raw = humRatioEq33(40, 5, (0.621945 * pws) / (101325 - pws));
    expect(Math.abs(raw - -0.008519405639291119)).toBeLessThanOrEqual(1e-12);
    expect(codeOf(() => humRatioFromWetBulb(40, 5, 101325))).toBe('wb-too-low');
    const r = solveState({ db: 40, wb: 5 }, 101325);
    expect(r.ok ? 'ok' : r.problem.code).toBe('wb-too-low');
    if (!r.ok) expect(r.problem.message).toMatch(/bone-dry air/);
    expect(si().GetHumRatioFromTWetBulb(40, 5, 101325)).toBe(1e-7); // PsychroLib (observed)
  });

  // EDGE-SI-PWS-RANGE / EDGE-IP-PWS-RANGE: the formulation holds for −100…200 °C inclusive.
  it('EDGE-SI-PWS-RANGE: −100 °C and 200 °C are accepted, −100.01 °C and 200.01 °C are out-of-range', () => {
    expect(Number.isFinite(satVapPres(-100))).toBe(true);
    expect(Number.isFinite(satVapPres(200))).toBe(true);
    expect(codeOf(() => satVapPres(-100.01))).toBe('out-of-range');
    expect(codeOf(() => satVapPres(200.01))).toBe('out-of-range');
    expect(codeOf(() => satVapPres(Number.NaN))).toBe('out-of-range');
  });
  it('EDGE-IP-PWS-RANGE: −148.1 °F and 392.1 °F are out-of-range', () => {
    expect(codeOf(() => satVapPres(toC(-148.1)))).toBe('out-of-range');
    expect(codeOf(() => satVapPres(toC(392.1)))).toBe('out-of-range');
    expect(Number.isFinite(satVapPres(toC(-148)))).toBe(true);
    expect(Number.isFinite(satVapPres(toC(392)))).toBe(true);
  });

  // EDGE-SI-TRIPLE-SWITCH: eq 5 at 0 °C = 611.1535708907679 Pa (ice, 0 °C being below the triple
  // point); at 0.01 °C eq 5 gives 611.6570243908766 Pa and eq 6 611.6570279346522 Pa (6e-9 apart).
  // The engine switches where the two are exactly equal, 6e-7 K above 0.01 °C.
  it('EDGE-SI-TRIPLE-SWITCH: the ice/water switch is at the triple point and continuous', () => {
    expect(Math.abs(satVapPres(0) - 611.1535708907679) / 611.15).toBeLessThanOrEqual(1e-12);
    const at = satVapPres(0.01);
    expect(Math.abs(at - 611.6570243908766) / at).toBeLessThanOrEqual(1e-12); // still eq 5 at 0.01 °C
    expect(Math.abs(satVapPres(0.0100007) - 611.6570279346522) / at).toBeLessThanOrEqual(1e-7); // eq 6 above the switch
    expect(SWITCH_C).toBeGreaterThan(0.01);
    expect(SWITCH_C).toBeLessThan(0.010001);
    const below = satVapPres(SWITCH_C - 1e-13);
    const above = satVapPres(SWITCH_C);
    expect(Math.abs(below - above) / above).toBeLessThanOrEqual(1e-13);
    // The frost point and dew point either side of the switch invert it.
    expect(Math.abs(dewPointFromVapPres(satVapPres(-0.5)) - -0.5)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(dewPointFromVapPres(satVapPres(0.5)) - 0.5)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(dewPointFromVapPres(at) - 0.01)).toBeLessThanOrEqual(1e-9);
  });
  it('the wet-bulb is right across the triple point (Halley steps do not stop across the switch)', () => {
    for (const wb of [-0.02, -0.005, 0, 0.001, 0.005, 0.0099, 0.01, 0.0101, 0.02]) {
      for (const db of [0.3, 1, 2]) {
        const w = humRatioFromWetBulb(db, wb, 101325);
        const back = wetBulbFromHumRatio(db, w, 101325);
        // Below 0 °C the eq 33 root is preferred where both exist (see physics-psychrolib.test.ts).
        if (wb >= 0) {
          expect(Math.abs(back - wb), `db ${db} wb ${wb}`).toBeLessThanOrEqual(1e-7);
          expect(back, 'an eq 33 root is never below 0 °C').toBeGreaterThanOrEqual(0);
        } else expect(Math.abs(humRatioFromWetBulb(db, back, 101325) - w)).toBeLessThanOrEqual(1e-12);
      }
    }
  });
  it('EDGE-UNITS-UNSET: the engine has no unit-system state; the same call gives the same SI figure', () => {
    expect(satVapPres(20)).toBe(satVapPres(20));
  });
});

describe('facts of the trade (common practice)', () => {
  it('common practice: 70 °F db / 58 °F wb at sea level is a little under 50 % rh', () => {
    const r = solveState({ db: toC(70), wb: toC(58) }, 101325);
    if (!r.ok) throw new Error(r.problem.message);
    expect(r.state.rh).toBeLessThan(0.5);
    expect(r.state.rh).toBeGreaterThan(0.45);
  });
  it('common practice: 68 °F / 60 °F is a little over 60 % rh with W ≈ 0.0092–0.0095 lb/lb (to 4 places)', () => {
    const r = solveState({ db: toC(68), wb: toC(60) }, 14.696 * PSI_PA);
    if (!r.ok) throw new Error(r.problem.message);
    expect(r.state.rh).toBeGreaterThan(0.6);
    expect(r.state.rh).toBeLessThan(0.65);
    expect(r.state.w).toBeGreaterThanOrEqual(0.00915);
    expect(r.state.w).toBeLessThan(0.00955);
  });
  it('common practice: cooling 100 °F air at constant W reaches saturation at its dew point', () => {
    const p = 101325;
    const start = solveState({ db: toC(100), rh: 0.4 }, p);
    if (!start.ok) throw new Error(start.problem.message);
    const { w, dp } = start.state;
    const atDp = solveState({ db: dp, w }, p);
    if (!atDp.ok) throw new Error(atDp.problem.message);
    expect(Math.abs(atDp.state.rh - 1)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(atDp.state.wb - dp)).toBeLessThanOrEqual(1e-6);
    expect(relHumFromHumRatio(dp + 0.5, w, p)).toBeLessThan(1);
    const below = solveState({ db: dp - 0.5, w }, p);
    expect(below.ok ? 'ok' : below.problem.code).toBe('supersaturated');
  });
  it('common practice: 24 °C / 50 % at sea level is about 47.8 kJ/kg (about 28.2 Btu/lb with the 0 °F datum)', () => {
    const r = solveState({ db: 24, rh: 0.5 }, 101325);
    if (!r.ok) throw new Error(r.problem.message);
    expect(Math.abs(r.state.h / 1000 - 47.8)).toBeLessThanOrEqual(0.1);
    const btu = (r.state.h + (1006 * 160) / 9) / 2326;
    expect(Math.abs(btu - 28.2)).toBeLessThanOrEqual(0.1);
  });
});
