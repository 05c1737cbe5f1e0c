/**
 * The chart's only door to the moist-air engine. Every curve and every point on the chart is
 * computed through these functions, so a state and the curve it should lie on come from the same
 * formulation (ASHRAE Handbook—Fundamentals Ch. 1, ideal gas, ice below 0 °C). SI throughout:
 * °C, Pa, kg/kg, J/kg dry air, m³/kg dry air. Each function returns `null` where the engine
 * refuses the input (outside its range, pressure below saturation…) instead of throwing.
 */
import {
  satHumRatio as engineSatHumRatio,
  humRatioFromVapPres,
  satVapPres,
  enthalpy as engineEnthalpy,
  dbFromEnthalpy as engineDbFromEnthalpy,
  specificVolume as engineSpecificVolume,
  humRatioFromWetBulb as engineHumRatioFromWetBulb,
  boilingPoint as engineBoilingPoint,
} from '../physics';

function guard(f: () => number): number | null {
  try {
    const v = f();
    return Number.isFinite(v) ? v : null;
  } catch {
    return null;
  }
}

/** Humidity ratio at saturation, kg/kg, at dry-bulb `db` (°C) and pressure `p` (Pa). */
export function satW(db: number, p: number): number | null {
  return guard(() => engineSatHumRatio(db, p));
}

/** Humidity ratio, kg/kg, at relative humidity `rh` (fraction) and dry-bulb `db` (°C). */
export function wFromRh(db: number, rh: number, p: number): number | null {
  return guard(() => humRatioFromVapPres(rh * satVapPres(db), p));
}

/** Specific enthalpy, J/kg dry air, of moist air at (db °C, w kg/kg). */
export function enthalpyOf(db: number, w: number): number | null {
  return guard(() => engineEnthalpy(db, w));
}

/** Dry-bulb, °C, at which moist air of humidity ratio `w` has enthalpy `h` (J/kg). */
export function dbAtEnthalpy(h: number, w: number): number | null {
  return guard(() => engineDbFromEnthalpy(h, w));
}

/** Specific volume, m³/kg dry air, at (db °C, w kg/kg, p Pa). */
export function volumeOf(db: number, w: number, p: number): number | null {
  return guard(() => engineSpecificVolume(db, w, p));
}

/** Humidity ratio, kg/kg, of air at dry-bulb `db` with thermodynamic wet-bulb `wb` (°C). */
export function wFromWetBulb(db: number, wb: number, p: number): number | null {
  return guard(() => engineHumRatioFromWetBulb(db, wb, p));
}

/** Boiling point of water at pressure `p`, °C (where saturated air would be all vapour). */
export function boilingPointAt(p: number): number | null {
  return guard(() => engineBoilingPoint(p));
}
