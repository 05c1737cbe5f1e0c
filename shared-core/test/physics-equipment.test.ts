/**
 * The equipment models (heaters, fans, coils by ADP and bypass factor, steam and adiabatic
 * humidifiers, heat recovery) against independent hand calculations: state properties from
 * PsychroLib 1.1.1 (test oracle), then the balances of ASHRAE HoF 2017 SI Ch.1 written out here —
 * eq 32 (h = 1.006 t + W (2501 + 1.86 t) kJ/kg) and its inverse t = (h − 2501 W)/(1.006 + 1.86 W),
 * adiabatic mixing (W and h mix linearly by dry-air mass), the adiabatic-saturation balance of
 * eq 33 (h₂ = h₁ + (W₂ − W₁) 4.186 t*), and the steady-flow energy balance q = ṁ Δh.
 */
import { describe, expect, it } from 'vitest';
import {
  adiabaticByEffectiveness,
  adiabaticToDb,
  adiabaticToRh,
  apparatusDewPoint,
  coilFromAdp,
  fanLeaving,
  fanTemperatureRise,
  recoverBetween,
  saturationEffectiveness,
  sensibleByDt,
  sensibleByDuty,
  sensibleToDb,
  solveState,
  steamEnthalpy,
  steamToRh,
  steamToW,
  type EquipmentOutcome,
  type MoistAirState,
} from '../src/physics';
import { si } from './data/psychrolib-oracle';

const P = 101325;
const psy = si();

/** A state from db and rh, through the engine (its properties are checked against PsychroLib elsewhere). */
function st(db: number, rh: number, p = P): MoistAirState {
  const r = solveState({ db, rh }, p);
  if (!r.ok) throw new Error(r.problem.message);
  return r.state;
}

function value<T>(o: EquipmentOutcome<T>): T {
  if (!o.ok) throw new Error(`${o.problem.key}: ${o.problem.message}`);
  return o.value;
}

/** eq 32 solved for t, °C, from h J/kg and W kg/kg. */
const tFromHW = (h: number, w: number): number => (h - 2_501_000 * w) / (1006 + 1860 * w);

const close = (x: number, y: number, tol: number, what: string): void => {
  expect(Math.abs(x - y), `${what}: ${x} vs ${y}`).toBeLessThanOrEqual(tol);
};

describe('sensible heating at constant W (ASHRAE HoF 2017 SI Ch.1 eq 32, q = ṁ Δh)', () => {
  const a = st(10, 0.6);
  const w1 = psy.GetHumRatioFromRelHum(10, 0.6, P); // PsychroLib as oracle
  const h1 = psy.GetMoistAirEnthalpy(10, w1);
  it('by duty: 20 kW into 2 kg/s of dry air', () => {
    const b = value(sensibleByDuty(a, 20_000, 2));
    const t2 = tFromHW(h1 + 20_000 / 2, w1); // q = ṁ (h₂ − h₁), W₂ = W₁
    close(b.db, t2, 1e-6, 'leaving db');
    close(b.w, w1, 1e-12, 'W unchanged');
    close(b.rh, psy.GetRelHumFromHumRatio(t2, w1, P), 1e-7, 'leaving rh (PsychroLib as oracle)');
    // Common practice: 1 kg/s warmed by 1 K takes about 1.02 kW, so 10 kJ/kg is a little under 10 K.
    expect(b.db - 10).toBeGreaterThan(9.6);
    expect(b.db - 10).toBeLessThan(10);
  });
  it('by a temperature rise and to a dry-bulb', () => {
    close(value(sensibleByDt(a, 5)).db, 15, 1e-12, 'dt=+5K');
    close(value(sensibleToDb(a, 35)).db, 35, 1e-12, 'db=35C');
    close(value(sensibleToDb(a, 35)).h, psy.GetMoistAirEnthalpy(35, w1), 1e-6, 'h at 35 °C, same W (PsychroLib)');
  });
  it('cooling below the dew point is not a sensible process', () => {
    const r = sensibleByDt(a, -10); // dew point of 10 °C / 60 % is about 2.6 °C (PsychroLib)
    expect(psy.GetTDewPointFromHumRatio(10, w1, P)).toBeGreaterThan(0);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problem.code).toBe('unreachable');
      expect(r.problem.key).toBe('dt');
      expect(r.problem.message).toContain('dew point');
    }
  });
  it('a non-positive flow is reported, not divided by', () => {
    const r = sensibleByDuty(a, 1000, 0);
    expect(r.ok ? 'ok' : r.problem.code).toBe('out-of-range');
  });
});

describe('fan heat: Δt = Δp v / (η cp) = Δp / (ρ cp η)', () => {
  const a = st(13, 0.9);
  const w = psy.GetHumRatioFromRelHum(13, 0.9, P);
  const v = psy.GetMoistAirVolume(13, w, P); // per kg dry air (PsychroLib as oracle)
  const cp = 1006 + 1860 * w; // eq 32
  it('motor in the airstream: all the input power heats the air', () => {
    const o = { dpPa: 750, efficiency: 0.62, motorEfficiency: null };
    const dt = (750 * v) / (0.62 * cp);
    close(fanTemperatureRise(a, o), dt, 1e-9, 'Δt');
    close(fanTemperatureRise(a, o), 750 / ((1 / v) * cp * 0.62), 1e-9, 'the same written with ρ = 1/v');
    const b = value(fanLeaving(a, o));
    close(b.db - 13, dt, 1e-6, 'leaving db');
    close(b.w, w, 1e-12, 'W unchanged');
    // Common practice: about 1 K per kPa of total pressure at 60-70 % efficiency.
    expect(dt).toBeGreaterThan(0.9);
    expect(dt).toBeLessThan(1.3);
  });
  it('motor outside the airstream: only the shaft power, η_motor of the input, reaches the air', () => {
    const inside = fanTemperatureRise(a, { dpPa: 750, efficiency: 0.62, motorEfficiency: null });
    const outside = fanTemperatureRise(a, { dpPa: 750, efficiency: 0.62, motorEfficiency: 0.9 });
    close(outside, 0.9 * inside, 1e-12, 'Δt × η_motor');
  });
  it('efficiencies outside 0…1 are refused with the key named', () => {
    const r = fanLeaving(a, { dpPa: 750, efficiency: 62, motorEfficiency: null });
    expect(r.ok ? 'ok' : `${r.problem.code} ${r.problem.key}`).toBe('out-of-range eff');
    const m = fanLeaving(a, { dpPa: 750, efficiency: 0.6, motorEfficiency: 1.5 });
    expect(m.ok ? 'ok' : m.problem.key).toBe('eff_motor');
  });
});

describe('coil by apparatus dew point and bypass factor (adiabatic mixing of bypassed and saturated air)', () => {
  const a = st(26, 0.5);
  const w1 = psy.GetHumRatioFromRelHum(26, 0.5, P);
  const h1 = psy.GetMoistAirEnthalpy(26, w1);
  const wsAdp = psy.GetSatHumRatio(11, P); // PsychroLib as oracle
  const hsAdp = psy.GetMoistAirEnthalpy(11, wsAdp);
  it('W₂ = bf W₁ + (1 − bf) W_s(ADP), h₂ = bf h₁ + (1 − bf) h_s(ADP)', () => {
    const r = value(coilFromAdp(a, 11, 0.1));
    const w2 = 0.1 * w1 + 0.9 * wsAdp;
    const h2 = 0.1 * h1 + 0.9 * hsAdp;
    close(r.state.w, w2, 1e-9, 'W₂');
    close(r.state.h, h2, 1e-3, 'h₂');
    close(r.state.db, tFromHW(h2, w2), 1e-6, 'db₂ from eq 32');
    expect(r.dry).toBe(false);
    // Common practice: the leaving dry-bulb is close to bf t₁ + (1 − bf) ADP.
    close(r.state.db, 0.1 * 26 + 0.9 * 11, 0.1, 'db₂ ≈ linear in t');
  });
  it('the reverse finds the same ADP and bypass factor from the leaving state', () => {
    const b = value(coilFromAdp(a, 11, 0.1)).state;
    const r = apparatusDewPoint(a, b, P)!;
    close(r.adp, 11, 1e-6, 'ADP');
    close(r.bf, 0.1, 1e-7, 'bf');
  });
  it('an ADP above the entering dew point leaves the coil dry (W unchanged)', () => {
    const dp = psy.GetTDewPointFromHumRatio(26, w1, P); // about 14.8 °C
    const r = value(coilFromAdp(a, dp + 2, 0.2));
    expect(r.dry).toBe(true);
    close(r.state.w, w1, 1e-12, 'W unchanged');
    close(r.state.h, 0.2 * h1 + 0.8 * psy.GetMoistAirEnthalpy(dp + 2, w1), 1e-3, 'h by mixing');
  });
  it('a bypass factor of 1 or more, or an ADP not below the entering dry-bulb, is refused', () => {
    const r1 = coilFromAdp(a, 11, 1);
    expect(r1.ok ? 'ok' : `${r1.problem.code} ${r1.problem.key}`).toBe('out-of-range bf');
    const r2 = coilFromAdp(a, 30, 0.1);
    expect(r2.ok ? 'ok' : `${r2.problem.code} ${r2.problem.key}`).toBe('unreachable adp');
  });
});

describe('steam humidifier (W₂ = target, h₂ = h₁ + ΔW h_g)', () => {
  const a = st(20, 0.15);
  const w1 = psy.GetHumRatioFromRelHum(20, 0.15, P);
  const h1 = psy.GetMoistAirEnthalpy(20, w1);
  it('saturated steam at 101.325 kPa: 100 °C, h_g = 2501 + 1.86 × 100 kJ/kg (eq 32 vapour term)', () => {
    const s = steamEnthalpy();
    close(s.tSat, 99.97, 0.01, 'boiling point at 101.325 kPa (from memory: 99.97 °C on ITS-90)');
    close(s.h, 2_501_000 + 1860 * s.tSat, 1e-6, 'h_g');
    // From memory: steam tables give 2675.6 kJ/kg for saturated vapour at 100 °C.
    expect(Math.abs(s.h - 2_675_600) / 2_675_600).toBeLessThan(0.005);
    // From memory: saturated steam at 200 kPa is at 120.2 °C.
    close(steamEnthalpy(200_000).tSat, 120.2, 0.1, 't_sat at 200 kPa');
  });
  it('to a target humidity ratio 5.65 g/kg', () => {
    const hg = steamEnthalpy().h;
    const r = value(steamToW(a, 0.00565, hg));
    const h2 = h1 + (0.00565 - w1) * hg;
    close(r.state.w, 0.00565, 1e-12, 'W₂');
    close(r.state.db, tFromHW(h2, 0.00565), 1e-6, 'db₂');
    close(r.dw, 0.00565 - w1, 1e-12, 'water per kg dry air');
    // Steam hotter than the air warms it slightly (common practice: a fraction of a kelvin).
    expect(r.state.db).toBeGreaterThan(20);
    expect(r.state.db).toBeLessThan(21);
  });
  it('to a target relative humidity 40 %', () => {
    const hg = steamEnthalpy().h;
    const r = value(steamToRh(a, 0.4, hg));
    close(psy.GetRelHumFromHumRatio(r.state.db, r.state.w, P), 0.4, 1e-6, 'rh₂ (PsychroLib as oracle)');
    close(r.state.h, h1 + (r.state.w - w1) * hg, 1e-3, 'energy balance');
  });
  it('a target below the entering moisture, or beyond saturation, is refused', () => {
    const hg = steamEnthalpy().h;
    const lo = steamToW(a, 0.001, hg);
    expect(lo.ok ? 'ok' : lo.problem.code).toBe('unreachable');
    const fog = steamToW(a, 0.03, hg);
    expect(fog.ok ? 'ok' : fog.problem.message).toContain('fog');
    const rh = steamToRh(a, 0.1, hg);
    expect(rh.ok ? 'ok' : rh.problem.key).toBe('rh');
  });
});

describe('adiabatic humidifier along the thermodynamic wet-bulb line (eq 33)', () => {
  const a = st(35, 0.2);
  const w1 = psy.GetHumRatioFromRelHum(35, 0.2, P);
  const h1 = psy.GetMoistAirEnthalpy(35, w1);
  const wb = psy.GetTWetBulbFromHumRatio(35, w1, P); // PsychroLib as oracle
  it('saturation effectiveness 0.85: t₂ = t₁ − 0.85 (t₁ − t*)', () => {
    const r = value(adiabaticByEffectiveness(a, 0.85));
    const t2 = 35 - 0.85 * (35 - wb);
    close(r.state.db, t2, 2e-3, 'db₂ (wet-bulb to PsychroLib tolerance)');
    close(r.state.w, psy.GetHumRatioFromTWetBulb(t2, wb, P), 2e-6, 'W₂ on the wet-bulb line');
    // eq 33: the water enters at t*, so h₂ = h₁ + (W₂ − W₁) 4.186 t*.
    close(r.state.h, h1 + (r.state.w - w1) * 4186 * wb, 2, 'h₂ by the adiabatic-saturation balance');
    close(saturationEffectiveness(a, r.state)!, 0.85, 1e-9, 'ε back');
  });
  it('to a target relative humidity or dry-bulb on the same line', () => {
    const r = value(adiabaticToRh(a, 0.6));
    close(r.state.rh, 0.6, 1e-9, 'rh₂');
    close(r.state.wb, a.wb, 1e-6, 'same wet-bulb');
    const d = value(adiabaticToDb(a, 24));
    close(d.state.db, 24, 1e-12, 'db₂');
    close(d.state.wb, a.wb, 1e-6, 'same wet-bulb');
  });
  it('below the wet-bulb, above the entering dry-bulb, or an effectiveness above 1 is refused', () => {
    const lo = adiabaticToDb(a, wb - 1);
    expect(lo.ok ? 'ok' : lo.problem.message).toContain('wet-bulb');
    const hi = adiabaticToDb(a, 36);
    expect(hi.ok ? 'ok' : hi.problem.code).toBe('unreachable');
    const e = adiabaticByEffectiveness(a, 1.2);
    expect(e.ok ? 'ok' : `${e.problem.code} ${e.problem.key}`).toBe('out-of-range eff');
  });
});

describe('heat recovery: effectiveness on the smaller capacity rate', () => {
  it('unequal flows, sensible only: both leaving temperatures and the energy balance', () => {
    const oa = st(5, 0.8);
    const ea = st(22, 0.3);
    const r = value(recoverBetween({ state: oa, massFlowKgS: 2.0 }, { state: ea, massFlowKgS: 1.6 }, 0.7, null));
    const c1 = 2.0 * (1006 + 1860 * oa.w); // eq 32 specific heat, per kg dry air
    const c2 = 1.6 * (1006 + 1860 * ea.w);
    const q = 0.7 * Math.min(c1, c2) * (22 - 5);
    close(r.sensibleW, q, 1e-6, 'q');
    close(r.leaving[0].db, 5 + q / c1, 1e-9, 'outdoor air leaving');
    close(r.leaving[1].db, 22 - q / c2, 1e-9, 'exhaust leaving');
    close(c1 * (r.leaving[0].db - 5), c2 * (22 - r.leaving[1].db), 1e-6, 'heat gained = heat given');
    expect(r.minStream).toBe(1);
    close(r.leaving[0].w, oa.w, 1e-15, 'W unchanged');
    // The exhaust (dew point about 3.6 °C) meets a surface at about (10.1 + 5)/2 °C: stays dry.
    expect(r.wetting).toBeNull();
  });
  it('latent effectiveness moves moisture on ṁ_min (W₁′ = W₁ + ε_l ṁ_min (W₂ − W₁)/ṁ₁)', () => {
    const oa = st(0, 0.8);
    const ea = st(22, 0.4);
    const r = value(recoverBetween({ state: oa, massFlowKgS: 2.0 }, { state: ea, massFlowKgS: 1.6 }, 0.7, 0.6));
    const mw = 0.6 * 1.6 * (ea.w - oa.w);
    close(r.waterKgS, mw, 1e-12, 'moisture moved');
    close(r.leaving[0].w, oa.w + mw / 2.0, 1e-12, 'W₁′');
    close(r.leaving[1].w, ea.w - mw / 1.6, 1e-12, 'W₂′');
    close(2.0 * (r.leaving[0].w - oa.w), 1.6 * (ea.w - r.leaving[1].w), 1e-12, 'water balance');
  });
  it('condensation on the exhaust side: its dew point above the cold-end surface', () => {
    const r = value(
      recoverBetween({ state: st(5, 0.8), massFlowKgS: 2 }, { state: st(22, 0.55), massFlowKgS: 2 }, 0.7, null),
    );
    // Exhaust leaves at about 22 − 0.7 × 17 ≈ 10.1 °C; surface ≈ (10.1 + 5)/2 ≈ 7.6 °C; dew point
    // of 22 °C / 55 % ≈ 12.5 °C.
    expect(psy.GetTDewPointFromHumRatio(22, psy.GetHumRatioFromRelHum(22, 0.55, P), P)).toBeGreaterThan(12);
    expect(r.wetting).not.toBeNull();
    expect(r.wetting!.kind).toBe('condensation');
    expect(r.wetting!.stream).toBe(1);
    close(r.wetting!.surfaceC, (r.leaving[1].db + 5) / 2, 1e-12, 'surface temperature');
  });
  it('frost: a cold outdoor stream brings the exhaust below its frost point and the surface below 0 °C', () => {
    const r = value(
      recoverBetween({ state: st(-10, 0.8), massFlowKgS: 2 }, { state: st(22, 0.3), massFlowKgS: 1.6 }, 0.7, null),
    );
    expect(r.wetting?.kind).toBe('frost');
    // Exhaust: 22 − 0.7 × 32 = −0.4 °C, below its dew point: a fog state (more water than vapour can hold).
    close(r.leaving[1].db, 22 - 0.7 * 32, 1e-9, 'exhaust leaving');
    expect(r.leaving[1].fog).toBe(true);
  });
  it('summer: the outdoor air is the cooled stream, and humid outdoor air condenses on its side', () => {
    // 32 °C / 80 % (dew point about 28 °C) leaves at 32 − 0.7 × 8 = 26.4 °C; surface ≈ 25.2 °C.
    const r = value(
      recoverBetween({ state: st(32, 0.8), massFlowKgS: 2 }, { state: st(24, 0.5), massFlowKgS: 2 }, 0.7, null),
    );
    expect(r.sensibleW).toBeLessThan(0);
    expect(r.wetting?.stream).toBe(0);
    expect(r.wetting?.kind).toBe('condensation');
    // 32 °C / 60 % (dew point about 23 °C) stays dry.
    expect(
      value(recoverBetween({ state: st(32, 0.6), massFlowKgS: 2 }, { state: st(24, 0.5), massFlowKgS: 2 }, 0.7, null))
        .wetting,
    ).toBeNull();
  });
  it('effectiveness outside 0…1 is refused', () => {
    const r = recoverBetween({ state: st(0, 0.5), massFlowKgS: 1 }, { state: st(20, 0.5), massFlowKgS: 1 }, 70, null);
    expect(r.ok ? 'ok' : `${r.problem.code} ${r.problem.key}`).toBe('out-of-range eff_s');
  });
});
