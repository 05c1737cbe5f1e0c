/**
 * Input checks shared by the property functions: each throws a {@link PsychroError} with a stable
 * code, the offending figure and a fix.
 */
import { PsychroError, type DefiningKey } from './types';
import { msg, P, RH, T, W } from './message';

/** Throw `out-of-range` unless p is a positive, finite pressure in Pa. */
export function checkPressure(p: number): void {
  if (!(p > 0 && p < Number.POSITIVE_INFINITY)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: `Pressure ${String(p)} Pa is not a positive, finite pressure.`,
      fix: 'Give the barometric pressure as a positive figure (101.325 kPa at sea level), or a site elevation.',
      keys: [],
    });
  }
}

/** Throw `negative-humidity-ratio` (or `out-of-range` when not finite) unless w ≥ 0. */
export function checkHumRatio(w: number, keys: DefiningKey[] = ['w']): void {
  if (!(w >= 0 && w < Number.POSITIVE_INFINITY)) {
    if (Number.isFinite(w)) {
      throw new PsychroError({
        code: 'negative-humidity-ratio',
        message: msg`Humidity ratio ${W(w)} is negative.`,
        fix: 'A humidity ratio is 0 (bone-dry air) or more.',
        keys,
      });
    }
    throw new PsychroError({
      code: 'out-of-range',
      message: `Humidity ratio ${String(w)} is not a finite number.`,
      fix: 'Give a finite humidity ratio, 0 or more.',
      keys,
    });
  }
}

/** Throw `rh-out-of-range` unless 0 ≤ rh ≤ 1. */
export function checkRelHum(rh: number, keys: DefiningKey[] = ['rh']): void {
  if (!(rh >= 0 && rh <= 1)) {
    throw new PsychroError({
      code: 'rh-out-of-range',
      message: Number.isFinite(rh)
        ? msg`Relative humidity ${RH(rh)} is outside 0 % to 100 %.`
        : `Relative humidity ${String(rh)} is not a finite number.`,
      fix: 'Give a relative humidity between 0 % and 100 %.',
      keys,
    });
  }
}

/** The `pressure-below-saturation` error: total pressure p at or below the saturation pressure that t needs. */
export function pressureBelowSaturation(
  tC: number,
  pws: number,
  p: number,
  keys: DefiningKey[],
  what: string,
): PsychroError {
  return new PsychroError({
    code: 'pressure-below-saturation',
    message: msg`The saturation pressure at ${what} ${T(tC)} (${P(pws)}) is at or \
above the total pressure ${P(p)}: water boils there, so air cannot be saturated.`,
    fix: msg`Raise the pressure above ${P(pws)}, or use a lower ${what}.`,
    keys,
  });
}

/**
 * Relative excess of the vapour pressure over saturation still taken as exactly saturated: the
 * last-digit round-off of figures computed from one another (db = wb, db = dp, rh = 100 %).
 */
export const SATURATION_ROUNDOFF = 1e-12;

/** A temperature this far (K) above another that must not exceed it is round-off of equality. */
export const TEMP_ROUNDOFF_K = 1e-9;
