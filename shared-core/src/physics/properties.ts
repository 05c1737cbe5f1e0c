/**
 * Closed-form moist-air properties, ASHRAE Handbook—Fundamentals 2017 (SI) Ch. 1, ideal-gas
 * model. Units: °C, Pa, kg/kg, J/kg dry air (dry air 0 at 0 °C, water from liquid at 0 °C),
 * m³/kg dry air.
 */
import { PsychroError } from './types';
import { checkHumRatio, checkPressure, checkRelHum, pressureBelowSaturation } from './checks';
import { msg, P, Z, ZL } from './message';
import { checkTemperature, pwsRaw } from './saturation';

function checkFinite(x: number, what: string): void {
  if (!Number.isFinite(x)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: `${what} ${String(x)} is not a finite number.`,
      fix: `Give the ${what.toLowerCase()} as a finite number.`,
      keys: [],
    });
  }
}

/** Ratio of the molar masses of water and dry air, 18.015268 / 28.966 (eq 20 constant). */
export const EPSILON = 0.621945;
/** Gas constant of dry air, J/(kg·K) (eq 26: 0.287042 kJ/(kg·K)). */
export const R_DA = 287.042;
/** Specific heat of dry air, J/(kg·K) (eq 30: 1.006 kJ/(kg·K)). */
export const CP_DA = 1006;
/** Specific heat of water vapour, J/(kg·K) (eq 30: 1.86 kJ/(kg·K)). */
export const CP_WV = 1860;
/** Enthalpy of saturated vapour at 0 °C from liquid at 0 °C, J/kg (eq 30: 2501 kJ/kg). */
export const H_FG0 = 2_501_000;
/** Specific heat of liquid water, J/(kg·K) (4.186 kJ/(kg·K), eq 33). */
export const CP_W = 4186;
/** Enthalpy of ice at 0 °C from liquid water at 0 °C, J/kg (−333.4 kJ/kg, eq 35 basis). */
export const H_ICE0 = -333_400;
/** Specific heat of ice, J/(kg·K) (2.1 kJ/(kg·K)). */
export const CP_ICE = 2100;

/** Humidity ratio, kg/kg, from the partial vapour pressure pw and total pressure p, Pa (eq 20). */
export function humRatioFromVapPres(pw: number, p: number): number {
  checkPressure(p);
  if (!(pw >= 0 && pw < p)) {
    if (pw >= p) {
      throw new PsychroError({
        code: 'pressure-below-saturation',
        message: msg`Vapour pressure ${P(pw)} is at or above the total pressure ${P(p)}.`,
        fix: 'The partial pressure of the vapour must be below the total pressure.',
        keys: [],
      });
    }
    throw new PsychroError({
      code: 'out-of-range',
      message: `Vapour pressure ${String(pw)} Pa is not a non-negative number.`,
      fix: 'Give a vapour pressure of 0 Pa or more.',
      keys: [],
    });
  }
  return (EPSILON * pw) / (p - pw);
}

/** Partial vapour pressure, Pa, from the humidity ratio w kg/kg and total pressure p Pa (eq 20 inverted). */
export function vapPresFromHumRatio(w: number, p: number): number {
  checkPressure(p);
  checkHumRatio(w);
  return (p * w) / (EPSILON + w);
}

/**
 * Humidity ratio at saturation, kg/kg, at t °C and p Pa (eq 23). Throws
 * `pressure-below-saturation` when pws(t) ≥ p (t at or above the boiling point at p): no clamp.
 */
export function satHumRatio(tC: number, p: number): number {
  checkTemperature(tC, 'Temperature');
  checkPressure(p);
  const pws = pwsRaw(tC);
  if (pws >= p) throw pressureBelowSaturation(tC, pws, p, [], 'temperature');
  return (EPSILON * pws) / (p - pws);
}

/**
 * Relative humidity, fraction, from dry-bulb t °C, humidity ratio w and pressure p Pa (eqs 20, 24).
 * Above 1 for supersaturated input (no clamp; `solveState` reports that as `supersaturated`).
 */
export function relHumFromHumRatio(tC: number, w: number, p: number): number {
  checkTemperature(tC, 'Dry-bulb');
  checkPressure(p);
  checkHumRatio(w);
  return (p * w) / (EPSILON + w) / pwsRaw(tC);
}

/**
 * Humidity ratio, kg/kg, from dry-bulb t °C, relative humidity rh (fraction) and pressure p Pa.
 * Throws `pressure-below-saturation` when rh·pws(t) ≥ p.
 */
export function humRatioFromRelHum(tC: number, rh: number, p: number): number {
  checkTemperature(tC, 'Dry-bulb');
  checkPressure(p);
  checkRelHum(rh);
  const pw = rh * pwsRaw(tC);
  if (pw >= p) throw pressureBelowSaturation(tC, pw, p, ['db', 'rh'], 'dry-bulb (at this relative humidity)');
  return (EPSILON * pw) / (p - pw);
}

/**
 * Degree of saturation μ = W / Ws (eq 12), fraction, at dry-bulb t °C. Throws
 * `pressure-below-saturation` when t is at or above the boiling point at p (Ws undefined).
 */
export function degreeOfSaturation(tC: number, w: number, p: number): number {
  checkHumRatio(w);
  return w / satHumRatio(tC, p);
}

/** Specific enthalpy of moist air, J/kg dry air, at t °C and humidity ratio w (eq 30). */
export function enthalpy(tC: number, w: number): number {
  checkTemperature(tC, 'Dry-bulb');
  checkHumRatio(w);
  return CP_DA * tC + w * (H_FG0 + CP_WV * tC);
}

/** Dry-bulb, °C, from enthalpy h J/kg and humidity ratio w (eq 30 solved for t; not range-checked). */
export function dbFromEnthalpy(h: number, w: number): number {
  checkFinite(h, 'Enthalpy');
  checkHumRatio(w);
  return (h - H_FG0 * w) / (CP_DA + CP_WV * w);
}

/** Humidity ratio, kg/kg, from enthalpy h J/kg and dry-bulb t °C (eq 30 solved for W; may be negative). */
export function humRatioFromEnthalpy(h: number, tC: number): number {
  checkFinite(h, 'Enthalpy');
  checkTemperature(tC, 'Dry-bulb');
  return (h - CP_DA * tC) / (H_FG0 + CP_WV * tC);
}

/** Specific volume, m³/kg dry air, at t °C, humidity ratio w and pressure p Pa (eq 26). */
export function specificVolume(tC: number, w: number, p: number): number {
  checkTemperature(tC, 'Dry-bulb');
  checkHumRatio(w);
  checkPressure(p);
  return (R_DA * (tC + 273.15) * (1 + 1.607858 * w)) / p;
}

/** Moist-air density, kg/m³: (1 + W) / v (eq 11). */
export function density(tC: number, w: number, p: number): number {
  return (1 + w) / specificVolume(tC, w, p);
}

/** Lowest elevation accepted by the standard-atmosphere equations, m. */
export const ELEV_MIN_M = -5000;
/** Highest elevation accepted (top of the troposphere, where eq 4's lapse rate ends), m. */
export const ELEV_MAX_M = 11000;

function checkElevation(z: number): void {
  if (!(z >= ELEV_MIN_M && z <= ELEV_MAX_M)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: Number.isFinite(z)
        ? msg`Elevation ${Z(z)} is outside the standard-atmosphere \
range used here (${ZL(ELEV_MIN_M)} to ${ZL(ELEV_MAX_M)}).`
        : `Elevation ${String(z)} is not a finite number.`,
      fix: msg`Give an elevation between ${ZL(ELEV_MIN_M)} and ${ZL(ELEV_MAX_M)}, or give the pressure itself.`,
      keys: [],
    });
  }
}

/** Standard-atmosphere barometric pressure, Pa, at elevation z m (eq 3). */
export function stdAtmPressure(z: number): number {
  checkElevation(z);
  return 101325 * (1 - 2.25577e-5 * z) ** 5.2559;
}

/** Standard-atmosphere temperature, °C, at elevation z m (eq 4). */
export function stdAtmTemperature(z: number): number {
  checkElevation(z);
  return 15 - 0.0065 * z;
}

/** Enthalpy of liquid water, J/kg, at t °C (datum liquid at 0 °C): 4.186 t kJ/kg. */
export function liquidWaterEnthalpy(tC: number): number {
  checkFinite(tC, 'Water temperature');
  return CP_W * tC;
}

/** Enthalpy of ice, J/kg, at t °C (datum liquid water at 0 °C): −333.4 + 2.1 t kJ/kg. */
export function iceEnthalpy(tC: number): number {
  checkFinite(tC, 'Ice temperature');
  return H_ICE0 + CP_ICE * tC;
}

/** Enthalpy of condensed water, J/kg, at t °C: ice below 0 °C, liquid from 0 °C. */
export function condensateEnthalpy(tC: number): number {
  checkFinite(tC, 'Water temperature');
  return tC < 0 ? H_ICE0 + CP_ICE * tC : CP_W * tC;
}
