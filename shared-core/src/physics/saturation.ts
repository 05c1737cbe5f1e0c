/**
 * Saturation pressure of water vapour (Hyland–Wexler, ASHRAE Handbook—Fundamentals 2017 SI,
 * Ch. 1 eqs 5 and 6) and its inverse (dew/frost point, boiling point).
 *
 * The two equations meet at the triple point, 0.01 °C (exactly equal 6e-7 K above it); the
 * switch is made there (not at 0 °C, where they differ by 97 ppm) so that the curve is continuous
 * and its inverse well defined. Below 0.01 °C the curve is over ice (frost point), above it over
 * liquid water.
 */
import { PsychroError } from './types';
import { msg, P, PL, T, TL } from './message';

/** 0 °C in kelvin (exact). */
export const ZERO_C_K = 273.15;
/** Triple point of water, °C. */
export const TRIPLE_POINT_C = 0.01;
/** Lowest temperature of the formulation, °C (inclusive). */
export const T_MIN_C = -100;
/** Highest temperature of the formulation, °C (inclusive). */
export const T_MAX_C = 200;

// Eq 5, over ice, −100…0.01 °C (T in K, pws in Pa). Exported for the wet-bulb iteration.
/** Eq 5 coefficient C1. */
export const C1 = -5.6745359e3;
/** Eq 5 coefficient C2. */
export const C2 = 6.3925247;
/** Eq 5 coefficient C3. */
export const C3 = -9.677843e-3;
/** Eq 5 coefficient C4. */
export const C4 = 6.2215701e-7;
/** Eq 5 coefficient C5. */
export const C5 = 2.0747825e-9;
/** Eq 5 coefficient C6. */
export const C6 = -9.484024e-13;
/** Eq 5 coefficient C7. */
export const C7 = 4.1635019;
// Eq 6, over liquid water, 0.01…200 °C.
/** Eq 6 coefficient C8. */
export const C8 = -5.8002206e3;
/** Eq 6 coefficient C9. */
export const C9 = 1.3914993;
/** Eq 6 coefficient C10. */
export const C10 = -4.8640239e-2;
/** Eq 6 coefficient C11. */
export const C11 = 4.1764768e-5;
/** Eq 6 coefficient C12. */
export const C12 = -1.4452093e-8;
/** Eq 6 coefficient C13. */
export const C13 = 6.5459673;

/** ln pws over ice, T in K (eq 5, unchecked). */
export function lnPwsIce(T: number): number {
  return C1 / T + C2 + T * (C3 + T * (C4 + T * (C5 + T * C6))) + C7 * Math.log(T);
}
/** ln pws over water, T in K (eq 6, unchecked). */
export function lnPwsWater(T: number): number {
  return C8 / T + C9 + T * (C10 + T * (C11 + T * C12)) + C13 * Math.log(T);
}
/** d(ln pws)/dT over ice, 1/K. */
export function dLnPwsIce(T: number): number {
  return -C1 / (T * T) + C3 + T * (2 * C4 + T * (3 * C5 + T * 4 * C6)) + C7 / T;
}
/** d(ln pws)/dT over water, 1/K. */
export function dLnPwsWater(T: number): number {
  return -C8 / (T * T) + C10 + T * (2 * C11 + T * 3 * C12) + C13 / T;
}
/** d²(ln pws)/dT² over ice, 1/K². */
export function d2LnPwsIce(T: number): number {
  return (2 * C1) / (T * T * T) + 2 * C4 + T * (6 * C5 + T * 12 * C6) - C7 / (T * T);
}
/** d²(ln pws)/dT² over water, 1/K². */
export function d2LnPwsWater(T: number): number {
  return (2 * C8) / (T * T * T) + 2 * C11 + T * 6 * C12 - C13 / (T * T);
}

/**
 * Where the ice and liquid-water equations meet, °C: 0.0100006 °C, the triple point to within
 * 1e-6 K (eqs 5 and 6 differ by 6e-9 relative at 0.01 °C itself). Switching exactly where they are
 * equal makes the saturation curve continuous to the last digit, so that it has an exact inverse.
 */
export const SWITCH_C = ((): number => {
  let T = TRIPLE_POINT_C + ZERO_C_K;
  for (let i = 0; i < 8; i++) T -= (lnPwsIce(T) - lnPwsWater(T)) / (dLnPwsIce(T) - dLnPwsWater(T));
  return T - ZERO_C_K;
})();

/** ln pws at t °C with the triple-point switch, no range check. */
export function lnPwsRaw(tC: number): number {
  const T = tC + ZERO_C_K;
  return tC < SWITCH_C ? lnPwsIce(T) : lnPwsWater(T);
}

/** Saturation pressure at t °C with the triple-point switch, no range check (internal). */
export function pwsRaw(tC: number): number {
  return Math.exp(lnPwsRaw(tC));
}

/** Saturation pressure at the ice/water switch (the triple point), Pa (611.657 Pa). */
export const PWS_TRIPLE = Math.exp(lnPwsWater(SWITCH_C + ZERO_C_K));
/** Saturation pressure at 0 °C on the ice equation (0 °C is below the triple point), Pa. */
export const PWS_0C = Math.exp(lnPwsIce(ZERO_C_K));
/** Saturation pressure at −100 °C (over ice), Pa. */
export const PWS_MIN = Math.exp(lnPwsIce(T_MIN_C + ZERO_C_K));
/** Saturation pressure at 200 °C, Pa. */
export const PWS_MAX = Math.exp(lnPwsWater(T_MAX_C + ZERO_C_K));

/** Throw `out-of-range` unless t is a finite temperature within −100…200 °C. */
export function checkTemperature(tC: number, what: string): void {
  if (!(tC >= T_MIN_C && tC <= T_MAX_C)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: Number.isFinite(tC)
        ? msg`${what} ${T(tC)} is outside the range of the formulation (${TL(T_MIN_C)} to ${TL(T_MAX_C)}).`
        : `${what} is not a finite number (${String(tC)}).`,
      fix: msg`Use a temperature between ${TL(T_MIN_C)} and ${TL(T_MAX_C)}.`,
      keys: [],
    });
  }
}

/**
 * Saturation vapour pressure, Pa, at t °C: over ice below 0.01 °C (eq 5), over liquid water from
 * 0.01 °C (eq 6). Valid −100…200 °C inclusive; otherwise throws `PsychroError` `out-of-range`.
 */
export function satVapPres(tC: number): number {
  checkTemperature(tC, 'Temperature');
  return pwsRaw(tC);
}

/**
 * Scratch outputs of {@link satTempRaw} (module-level so the hot path allocates nothing):
 * d(ln pws)/dT and d²(ln pws)/dT² at the last iterate (within 2e-3 K of the returned
 * temperature), on the branch it used.
 */
export const satTempDeriv = { d1: 0, d2: 0, ice: false };

/**
 * The argument (ln pw) and the result (°C) of the inversion ({@link satTempIteration}), passed in
 * an array of unboxed doubles: a function the engine does not build into its caller takes a
 * double argument, and gives a double result, as a heap object of its own; a store to this array
 * and a load from it allocate nothing, and {@link satTempFromLn}, which fills it, is small enough
 * to be built into its callers.
 */
const SAT_IO = new Float64Array(2);
/** Places in {@link SAT_IO}. */
const IO_Y = 0;
const IO_T = 1;

const MAX_SAT_ITER = 80;

/**
 * Temperature, °C, at which the saturation pressure equals `pw` Pa (pw > 0), by safeguarded
 * Halley/Newton steps on ln pws of eqs 5/6 (bracket 1 K…201 °C, bisection when a step leaves it;
 * converged to better than 1e-9 K). Below the −100 °C end the ice
 * equation is extrapolated (used only for the dew point of extremely dry air). Returns NaN only if
 * the iteration bound is hit, which callers turn into `no-convergence`. pw above pws(200 °C)
 * must be rejected by the caller.
 */
export function satTempRaw(pw: number): number {
  return satTempFromLn(Math.log(pw));
}

/** ln of {@link PWS_TRIPLE}. */
const LN_PWS_TRIPLE = lnPwsWater(SWITCH_C + ZERO_C_K);

// Starting points for the inversion: 1/T as a polynomial in u = (ln pws − mid)·scale, a
// least-squares fit made for this engine to eqs 5/6 themselves (water: 0.01…36.85, 36.85…96.85,
// 96.85…200 °C, worst 6.5e-4 K; ice: −100…0.01 °C, worst 8.9e-5 K). Only a first guess: the
// Halley iteration below does the actual inversion of the equations.
const GY0 = 6.416171713551421; // ln pws at 0.01 °C
const GY1 = 8.737102753363601; // at 36.85 °C
const GY2 = 11.413491153938935; // at 96.85 °C
const GY3 = 14.25703352731739; // at 200 °C
const GYI = -6.567645292806496; // at −100 °C

function guessInvT(y: number): number {
  let u: number;
  if (y >= GY0) {
    if (y < GY1) {
      u = (y - 7.576637233457511) * 0.8617231471736656;
      return (
        0.0034451345199924465 +
        u *
          (-0.0002174303096452615 +
            u * (-1.7983726044819174e-6 + u * (-9.551399527181867e-8 + u * -3.87062174950644e-9)))
      );
    }
    if (y < GY2) {
      u = (y - 10.075296953651268) * 0.7472756942041996;
      return (
        0.0029676010251883235 +
        u *
          (-0.00026136604374233947 +
            u * (-3.3456079386734327e-6 + u * (-1.8608092334361122e-7 + u * -8.4626308269835e-10)))
      );
    }
    u = (y - 12.835262340628162) * 0.7033480558349375;
    return (
      0.0024127506823277706 +
      u *
        (-0.00029464257190804145 + u * (-4.753454335582181e-6 + u * (3.551067758243745e-8 + u * 1.015997045790273e-7)))
    );
  }
  u = (y - -0.0757367925244008) * 0.1540379073359624;
  return (
    0.004716631267717025 +
    u *
      (-0.0010564463114664938 +
        u *
          (1.7491470919235039e-6 +
            u * (-7.184624671311322e-7 + u * (-2.8042142705221276e-7 + u * -7.592484644638091e-8))))
  );
}

/**
 * As {@link satTempRaw}, from y = ln(pw) (saves a logarithm when the caller has it). `maxIter`
 * lowers the iteration bound (tests check the inversion converges well within it).
 */
export function satTempFromLn(y: number, maxIter = MAX_SAT_ITER): number {
  SAT_IO[IO_Y] = y;
  satTempIteration(maxIter);
  return SAT_IO[IO_T]!;
}

/** {@link satTempFromLn}'s iteration, from and to {@link SAT_IO} (see there). */
function satTempIteration(maxIter: number): void {
  const y = SAT_IO[IO_Y]!;
  const ice = y < LN_PWS_TRIPLE;
  satTempDeriv.ice = ice;
  // Iterate in kelvin, keeping x = 1/T alongside T (the first guess gives x directly).
  let lo: number;
  let hi: number;
  if (ice) {
    lo = 1;
    hi = SWITCH_C + ZERO_C_K;
  } else {
    lo = SWITCH_C + ZERO_C_K;
    hi = T_MAX_C + 1 + ZERO_C_K;
  }
  let T: number;
  let x: number;
  if (y >= GYI && y <= GY3) {
    x = guessInvT(y);
    T = 1 / x;
  } else {
    // Far below −100 °C (extremely dry air): a Magnus-type guess over ice; above 200 °C: 200 °C.
    const a = y - 6.41543;
    T = ice ? (272.62 * a) / (22.46 - a) + ZERO_C_K : T_MAX_C + ZERO_C_K;
    x = 1 / T;
  }
  if (!(T > lo && T < hi)) {
    T = 0.5 * (lo + hi);
    x = 1 / T;
  }
  for (let i = 0; i < maxIter; i++) {
    const lnT = Math.log(T);
    let f: number;
    let d1: number;
    let d2: number;
    if (ice) {
      f = C1 * x + C2 + T * (C3 + T * (C4 + T * (C5 + T * C6))) + C7 * lnT - y;
      d1 = x * (C7 - C1 * x) + C3 + T * (2 * C4 + T * (3 * C5 + T * 4 * C6));
      d2 = x * x * (2 * C1 * x - C7) + 2 * C4 + T * (6 * C5 + T * 12 * C6);
    } else {
      f = C8 * x + C9 + T * (C10 + T * (C11 + T * C12)) + C13 * lnT - y;
      d1 = x * (C13 - C8 * x) + C10 + T * (2 * C11 + T * 3 * C12);
      d2 = x * x * (2 * C8 * x - C13) + 2 * C11 + T * 6 * C12;
    }
    if (f < 0) lo = T;
    else if (f > 0) hi = T;
    // Halley step, newton·(1 + c + c²) for newton/(1 − c): the same order, one division less.
    const inv = 1 / d1;
    const newton = f * inv;
    const c = 0.5 * newton * d2 * inv;
    const step = c > -0.5 && c < 0.5 ? newton * (1 + c * (1 + c)) : newton;
    let next = T - step;
    // Halley's error after a step s is ~ C s³ with C < 1e-2 K⁻² on this range: < 1e-10 K here.
    const done = Math.abs(step) < 2e-3;
    // The midpoint is worked out whether it is taken or not (see `wetBulbIteration`).
    const mid = 0.5 * (lo + hi);
    if (!done && !(next > lo && next < hi)) next = mid;
    if (done || hi - lo < 1e-12) {
      // Slopes at the last iterate (within 2e-3 K of the root): only a starting aid for callers.
      satTempDeriv.d1 = d1;
      satTempDeriv.d2 = d2;
      SAT_IO[IO_T] = next - ZERO_C_K;
      return;
    }
    T = next;
    x = 1 / T;
  }
  SAT_IO[IO_T] = Number.NaN;
}

/**
 * Dew point (frost point below the triple point), °C, from the partial vapour pressure pw Pa, by
 * inverting eqs 5/6 (not the chapter's regression formulas). pw = 0 (bone-dry air) gives
 * −Infinity; a frost point below −100 °C is the extrapolated ice equation. Throws `out-of-range`
 * for negative or non-finite pw or pw above pws(200 °C).
 */
export function dewPointFromVapPres(pw: number): number {
  if (!(pw >= 0 && pw <= PWS_MAX)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: !(pw >= 0)
        ? `Vapour pressure ${String(pw)} Pa is not a non-negative number.`
        : msg`Vapour pressure ${P(pw)} is above the saturation pressure at ${TL(T_MAX_C)} \
(${PL(PWS_MAX)}): the dew point would be above the formulation's range.`,
      fix: msg`Give a vapour pressure between 0 and ${PL(PWS_MAX)}.`,
      keys: [],
    });
  }
  if (pw === 0) return Number.NEGATIVE_INFINITY;
  const t = satTempRaw(pw);
  if (Number.isNaN(t)) throw noConvergence('dew point');
  return t;
}

/**
 * Boiling point, °C, at total pressure p Pa: the temperature at which pws = p (eq 6 inverted;
 * below 611.657 Pa it is the sublimation point on eq 5). Throws `out-of-range` when p is not
 * between pws(−100 °C) and pws(200 °C).
 */
export function boilingPoint(p: number): number {
  if (!(p >= PWS_MIN && p <= PWS_MAX)) {
    throw new PsychroError({
      code: 'out-of-range',
      message: msg`Pressure ${Number.isFinite(p) ? P(p) : String(p)} \
has no boiling point within ${TL(T_MIN_C)} to ${TL(T_MAX_C)}.`,
      fix: msg`Use a pressure between ${PL(PWS_MIN)} and ${PL(PWS_MAX)}.`,
      keys: [],
    });
  }
  const t = satTempRaw(p);
  if (Number.isNaN(t)) throw noConvergence('boiling point');
  return t;
}

/** A `no-convergence` error for an iterative solve that hit its bound. */
export function noConvergence(what: string): PsychroError {
  return new PsychroError({
    code: 'no-convergence',
    message: `The ${what} iteration did not converge within its bound.`,
    fix: 'This should not happen for valid input; please report the input figures.',
    keys: [],
  });
}
