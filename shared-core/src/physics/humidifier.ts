/**
 * Humidifiers (ASHRAE HoF 2017 SI Ch.1: adding water to moist air, and the adiabatic saturation
 * process that defines the thermodynamic wet-bulb).
 *
 * Steam humidifier: the dry-air mass and energy balance with steam of enthalpy h_g added,
 *   W₂ = W₁ + m_w / ṁ,   h₂ = h₁ + (W₂ − W₁) h_g,
 * to a target humidity ratio (or the W that gives a target relative humidity). The steam is
 * saturated at its supply pressure (100 °C, 101.325 kPa, by default); a valve throttles it to the
 * duct without changing its enthalpy. Its enthalpy is taken on the same basis as the moist-air
 * enthalpy (eq 32's vapour term, water from liquid at 0 °C): h_g = 2501 + 1.86 t_sat kJ/kg, so
 * the moist-air balance stays consistent. (Steam tables give about 0.4 % less at 100 °C; the
 * effect on the leaving dry-bulb is a few hundredths of a kelvin.)
 *
 * Adiabatic (evaporative) humidifier or cooler: water recirculating at the wet-bulb evaporates
 * into the air, so the air moves along its thermodynamic wet-bulb line (eqs 33/35:
 * h₂ = h₁ + (W₂ − W₁) h_w(t*), t* constant). Its saturation effectiveness is
 *   ε = (t₁ − t₂) / (t₁ − t*),
 * so t₂ = t₁ − ε (t₁ − t*); or it is taken to a target relative humidity or dry-bulb on that line.
 */
import type { MoistAirState } from './types';
import { boilingPoint } from './saturation';
import { dbFromEnthalpy, relHumFromHumRatio, satHumRatio } from './properties';
import { stateFromDbW } from './state';
import { solveState } from './solve';
import { findRoot } from './roots';
import { fail, ok, pctText, tText, unreachableState, wText, type EquipmentOutcome } from './equipment';
import { msg } from './message';

/** Default steam supply: saturated at 101.325 kPa (100 °C). */
export const DEFAULT_STEAM_PRESSURE_PA = 101325;

/** Saturated steam at `pressurePa` (absolute): its temperature, °C, and enthalpy, J/kg (see the module comment). */
export function steamEnthalpy(pressurePa: number = DEFAULT_STEAM_PRESSURE_PA): { tSat: number; h: number } {
  const tSat = boilingPoint(pressurePa);
  return { tSat, h: 2_501_000 + 1860 * tSat };
}

/** What a humidifier model gives. */
export interface HumidifierResult {
  state: MoistAirState;
  /** Water added per kg of dry air, kg/kg. */
  dw: number;
}

function steamLeaving(a: MoistAirState, w2: number, hSteam: number): MoistAirState {
  return stateFromDbW(dbFromEnthalpy(a.h + (w2 - a.w) * hSteam, w2), w2, a.p);
}

/** Steam to a target humidity ratio `w2` kg/kg, with steam of enthalpy `hSteam` J/kg. */
export function steamToW(a: MoistAirState, w2: number, hSteam: number): EquipmentOutcome<HumidifierResult> {
  if (!(w2 >= a.w)) {
    return fail(
      'unreachable',
      'w',
      msg`the target humidity ratio ${wText(w2)} is below the entering ${wText(a.w)}: steam only adds moisture`,
      'give a target at or above the entering humidity ratio, or dry the air with a coil',
    );
  }
  const t2 = dbFromEnthalpy(a.h + (w2 - a.w) * hSteam, w2);
  const ws = satHumRatio(t2, a.p);
  if (w2 > ws) {
    return fail(
      'unreachable',
      'w',
      msg`the target humidity ratio ${wText(w2)} is above saturation at \
the leaving ${tText(t2)} (${wText(ws)}): the steam would condense as fog`,
      'give a lower target, or heat the air before the humidifier',
    );
  }
  return ok({ state: steamLeaving(a, w2, hSteam), dw: w2 - a.w });
}

/**
 * Why a humidifier cannot reach the target relative humidity `rh2` (fraction) from `a`: outside
 * 0 %–100 %, or below the entering humidity (`how` only adds moisture); undefined when it can.
 */
function targetRhProblem(
  a: MoistAirState,
  rh2: number,
  how: string,
  fix: string,
): EquipmentOutcome<HumidifierResult> | undefined {
  if (!(rh2 > 0 && rh2 <= 1)) {
    return fail(
      'out-of-range',
      'rh',
      msg`the target relative humidity ${pctText(rh2)} is outside 0 % to 100 %`,
      'give a target relative humidity above 0 % and at most 100 %',
    );
  }
  if (rh2 < a.rh - 1e-12) {
    return fail(
      'unreachable',
      'rh',
      msg`the target ${pctText(rh2)} is below the entering \
relative humidity ${pctText(a.rh)}: ${how} only adds moisture`,
      fix,
    );
  }
  return undefined;
}

/** Steam to a target relative humidity `rh2` (fraction), with steam of enthalpy `hSteam` J/kg. */
export function steamToRh(a: MoistAirState, rh2: number, hSteam: number): EquipmentOutcome<HumidifierResult> {
  const refused = targetRhProblem(
    a,
    rh2,
    'steam',
    'give a target above the entering relative humidity, or dry the air with a coil',
  );
  if (refused) return refused;
  const g = (w: number): number => relHumFromHumRatio(dbFromEnthalpy(a.h + (w - a.w) * hSteam, w), w, a.p) - rh2;
  const g0 = g(a.w);
  if (g0 >= 0) return ok({ state: a, dw: 0 });
  // Bracket: the relative humidity rises with W (the dry-bulb rises only slightly with the steam).
  let hi = Math.max(satHumRatio(a.db, a.p), a.w + 1e-4);
  let ghi = g(hi);
  for (let k = 0; k < 60 && ghi < 0; k++) {
    hi *= 1.5;
    ghi = g(hi);
  }
  if (!(ghi >= 0))
    return fail(
      'unreachable',
      'rh',
      msg`no amount of steam brings this air to ${pctText(rh2)}`,
      'give a lower target relative humidity',
    );
  const w2 = findRoot(g, a.w, hi, g0, ghi, 1e-12);
  if (Number.isNaN(w2))
    return fail(
      'unreachable',
      'rh',
      msg`the humidity ratio for ${pctText(rh2)} could not be found`,
      'give the target as a humidity ratio (w=) instead',
    );
  return ok({ state: steamLeaving(a, w2, hSteam), dw: w2 - a.w });
}

function onWetBulbLine(
  a: MoistAirState,
  input: { db: number } | { rh: number } | { w: number },
  key: string,
): EquipmentOutcome<HumidifierResult> {
  const solved = solveState({ wb: a.wb, ...input }, a.p);
  if (!solved.ok) return unreachableState(key, solved.problem);
  return ok({ state: solved.state, dw: solved.state.w - a.w });
}

/** Adiabatic humidifier with saturation effectiveness `eff` (0…1): t₂ = t₁ − ε (t₁ − t*), on the wet-bulb line. */
export function adiabaticByEffectiveness(a: MoistAirState, eff: number): EquipmentOutcome<HumidifierResult> {
  if (!(eff >= 0 && eff <= 1)) {
    return fail(
      'out-of-range',
      'eff',
      `the saturation effectiveness ${String(eff)} is outside 0 to 1`,
      'give the saturation effectiveness as a fraction from 0 to 1, e.g. eff=0.85 or eff=85%',
    );
  }
  if (eff === 0 || a.db - a.wb <= 0) return ok({ state: a, dw: 0 });
  return onWetBulbLine(a, { db: a.db - eff * (a.db - a.wb) }, 'eff');
}

/** Adiabatic humidifier to a target dry-bulb `db2` °C on the wet-bulb line (t* ≤ t₂ ≤ t₁). */
export function adiabaticToDb(a: MoistAirState, db2: number): EquipmentOutcome<HumidifierResult> {
  if (db2 > a.db) {
    return fail(
      'unreachable',
      'db',
      msg`the target ${tText(db2)} is above the entering dry-bulb ${tText(a.db)}: evaporating water cools the air`,
      'give a target between the entering wet-bulb and dry-bulb',
    );
  }
  if (db2 < a.wb - 1e-9) {
    return fail(
      'unreachable',
      'db',
      msg`the target ${tText(db2)} is below the entering \
wet-bulb ${tText(a.wb)}: evaporation cannot cool air below its wet-bulb`,
      msg`give a target of at least ${tText(a.wb)}`,
    );
  }
  if (db2 === a.db) return ok({ state: a, dw: 0 });
  return onWetBulbLine(a, { db: Math.max(db2, a.wb) }, 'db');
}

/** Adiabatic humidifier to a target relative humidity `rh2` (fraction) on the wet-bulb line. */
export function adiabaticToRh(a: MoistAirState, rh2: number): EquipmentOutcome<HumidifierResult> {
  const refused = targetRhProblem(a, rh2, 'evaporating water', 'give a target above the entering relative humidity');
  if (refused) return refused;
  if (rh2 <= a.rh) return ok({ state: a, dw: 0 });
  return onWetBulbLine(a, { rh: rh2 }, 'rh');
}

/** Adiabatic humidifier to a target humidity ratio `w2` (kg/kg) on the wet-bulb line. */
export function adiabaticToW(a: MoistAirState, w2: number): EquipmentOutcome<HumidifierResult> {
  if (w2 < a.w) {
    return fail(
      'unreachable',
      'w',
      'the target humidity ratio is below the entering one: evaporating water only adds moisture',
      'give a higher target',
    );
  }
  return onWetBulbLine(a, { w: w2 }, 'w');
}

/** Saturation effectiveness of an adiabatic process from `a` to `b`: (t₁ − t₂) / (t₁ − t*), or null when t₁ = t*. */
export function saturationEffectiveness(a: MoistAirState, b: MoistAirState): number | null {
  const d = a.db - a.wb;
  return d > 1e-9 ? (a.db - b.db) / d : null;
}
