/**
 * Thermodynamic wet-bulb and dew point (ASHRAE Handbook—Fundamentals 2017 SI, Ch. 1):
 * humidity ratio from dry-bulb and wet-bulb by eq 33 (wet-bulb at or above 0 °C, liquid water on
 * the wick) or eq 35 (below 0 °C, ice), and the inverse by a safeguarded Newton iteration.
 */
import { PsychroError } from './types';
import { SATURATION_ROUNDOFF, TEMP_ROUNDOFF_K, checkHumRatio, checkPressure, pressureBelowSaturation } from './checks';
import { msg, P as fP, T as fT, TL as fTL, W as fW } from './message';
import { EPSILON } from './properties';
import {
  C1,
  C2,
  C3,
  C4,
  C5,
  C6,
  C7,
  C8,
  C9,
  C10,
  C11,
  C12,
  C13,
  ZERO_C_K,
  SWITCH_C,
  T_MAX_C,
  checkTemperature,
  lnPwsIce,
  lnPwsWater,
  noConvergence,
  satTempDeriv,
  satTempRaw,
  PWS_0C,
  PWS_MAX,
} from './saturation';

/** Convergence of the wet-bulb iteration: the returned value is within this of the root, K. */
export const WB_TOLERANCE_K = 1e-6;
const MAX_WB_ITER = 100;
/**
 * A Halley step smaller than this (K) ends the wet-bulb iteration when its curvature term is small
 * too (|c| < 0.005 with c = step·g''/2g'): the error left is then ~ (g''/2g')²·|step|³ < 2.5e-7 ×
 * |step|, i.e. below 3e-9 K (measured below 1e-9 K over −100…200 °C and 1 kPa…1 MPa). Far below
 * the 1e-6 K target on purpose: W from a very dry wet-bulb magnifies its error a thousandfold.
 */
const WB_STEP_DONE = 1e-2;
/** Internal lower limit for wet-bulb brackets of bone-dry air, °C (eq 5 extrapolated below −100 °C). */
const WB_FLOOR_C = -200;

/**
 * Humidity ratio, kg/kg, from eq 33 (wet-bulb ≥ 0 °C) or eq 35 (wet-bulb < 0 °C) without checks;
 * `wsStar` is the saturation humidity ratio at the wet-bulb. May be negative.
 */
export function humRatioEq33(db: number, wb: number, wsStar: number): number {
  return wb >= 0
    ? ((2501 - 2.326 * wb) * wsStar - 1.006 * (db - wb)) / (2501 + 1.86 * db - 4.186 * wb)
    : ((2830 - 0.24 * wb) * wsStar - 1.006 * (db - wb)) / (2830 + 1.86 * db - 2.1 * wb);
}

/**
 * Humidity ratio, kg/kg, from dry-bulb db, thermodynamic wet-bulb wb (°C) and pressure p Pa
 * (eq 33, or eq 35 over ice when wb < 0 °C). Throws `wb-above-db`, `pressure-below-saturation`
 * (pws(wb) ≥ p), `wb-too-low` (the equation gives W < 0) or `out-of-range`: never a clamp.
 */
export function humRatioFromWetBulb(db: number, wb: number, p: number): number {
  checkTemperature(db, 'Dry-bulb');
  checkTemperature(wb, 'Wet-bulb');
  checkPressure(p);
  if (wb > db && wb <= db + TEMP_ROUNDOFF_K) wb = db; // saturated, up to round-off
  if (wb > db) {
    throw new PsychroError({
      code: 'wb-above-db',
      message: msg`Wet-bulb ${fT(wb)} is above the dry-bulb ${fT(db)}.`,
      fix: 'The wet-bulb is at most the dry-bulb (equal when saturated): check the two figures or swap them.',
      keys: ['db', 'wb'],
    });
  }
  const pws = Math.exp(wb < SWITCH_C ? lnPwsIce(wb + ZERO_C_K) : lnPwsWater(wb + ZERO_C_K));
  if (pws >= p) throw pressureBelowSaturation(wb, pws, p, ['wb'], 'wet-bulb');
  const wsStar = (EPSILON * pws) / (p - pws);
  let w = humRatioEq33(db, wb, wsStar);
  // The wet-bulb of bone-dry air, given to ~1e-9 K, can give W a hair below zero: round-off.
  if (w < 0 && w >= -wRoundoff(wsStar)) w = 0;
  if (w < 0) {
    const min = wetBulbSolve(db, 0, p, 0, Number.NEGATIVE_INFINITY, 0, 0, pwsAt(db));
    throw new PsychroError({
      code: 'wb-too-low',
      message: msg`Wet-bulb ${fT(wb)} is too far below the dry-bulb ${fT(db)}: even bone-dry air at ${fP(p)} ${
        Number.isFinite(min) ? msg`has a wet-bulb of ${fT(min)}` : 'has a higher wet-bulb'
      } (the humidity ratio would be negative).`,
      fix: Number.isFinite(min)
        ? msg`Use a wet-bulb of at least ${fT(min)} at this dry-bulb, or check the dry-bulb.`
        : 'Use a higher wet-bulb, or check the dry-bulb.',
      keys: ['db', 'wb'],
    });
  }
  return w;
}

function pwsAt(tC: number): number {
  const T = tC + ZERO_C_K;
  return Math.exp(tC < SWITCH_C ? lnPwsIce(T) : lnPwsWater(T));
}

/**
 * How far below zero eq 33/35 may put W, kg/kg, and still mean bone-dry air: what a 1e-9 K error
 * in the wet-bulb moves W by (dW/dwb < 0.1·Ws* + 4e-4 per K), so round-off, not a low wet-bulb.
 */
export function wRoundoff(wsStar: number): number {
  return 1e-9 * (wsStar + 4e-4);
}

/**
 * The arguments and the result of the wet-bulb iteration ({@link wetBulbIteration}), passed in one
 * array of unboxed doubles. A function the engine does not build into its caller (the iteration
 * is too large) takes each double argument, and gives its double result, as a heap object of its
 * own: nine per state on the way from the dew point to the wet-bulb. A store to this array and a
 * load from it allocate nothing, and {@link wetBulbSolve}, which fills it, is small enough to be
 * built into its callers. (One iteration runs at a time: it calls nothing that iterates.)
 */
const WB_IO = new Float64Array(9);
/** Places in {@link WB_IO}: the eight arguments of {@link wetBulbSolve}, then the result. */
const IO_DB = 0;
const IO_W = 1;
const IO_P = 2;
const IO_PW = 3;
const IO_DP = 4;
const IO_D1 = 5;
const IO_D2 = 6;
const IO_PWS_DB = 7;
const IO_WB = 8;

/**
 * Wet-bulb, °C, by safeguarded Halley/Newton steps on eq 33/35 (internal, inputs already checked).
 * `pw` is the vapour pressure, `dp` the dew point (−Infinity for bone-dry air), `dpD1`, `dpD2`
 * the first two derivatives of ln pws at (or within 2e-3 K of) the dew point on its branch, and
 * `pwsDb` pws at the dry-bulb. The bracket is [dew point, min(db, boiling point at p)]; a step
 * that leaves it is replaced by bisection. Where the dry-bulb is above 0 °C and the dew point
 * below, eq 33 is used when it has a root at or above 0 °C, and eq 35 (ice) otherwise. Returns
 * NaN if the iteration bound is hit; `maxIter` lowers the bound (tests check the iteration
 * converges well within it).
 */
export function wetBulbSolve(
  db: number,
  w: number,
  p: number,
  pw: number,
  dp: number,
  dpD1: number,
  dpD2: number,
  pwsDb: number,
  maxIter = MAX_WB_ITER,
): number {
  const io = WB_IO;
  io[IO_DB] = db;
  io[IO_W] = w;
  io[IO_P] = p;
  io[IO_PW] = pw;
  io[IO_DP] = dp;
  io[IO_D1] = dpD1;
  io[IO_D2] = dpD2;
  io[IO_PWS_DB] = pwsDb;
  wetBulbIteration(maxIter);
  return io[IO_WB]!;
}

/** {@link wetBulbSolve}'s iteration, from and to {@link WB_IO} (see there). */
function wetBulbIteration(maxIter: number): void {
  const io = WB_IO;
  const db = io[IO_DB]!;
  const w = io[IO_W]!;
  const p = io[IO_P]!;
  const pw = io[IO_PW]!;
  const dp = io[IO_DP]!;
  const dpD1 = io[IO_D1]!;
  const dpD2 = io[IO_D2]!;
  const pwsDb = io[IO_PWS_DB]!;
  // Upper end: the dry-bulb, or the boiling point at p when the dry-bulb is above it (where the
  // saturation humidity ratio is infinite); the residual is +∞ there and is never evaluated.
  let hi = db;
  if (pwsDb >= p) {
    if (p > PWS_MAX) {
      io[IO_WB] = Number.NaN;
      return;
    }
    hi = satTempRaw(p);
    if (Number.isNaN(hi)) {
      io[IO_WB] = Number.NaN;
      return;
    }
  }
  let lo = Math.max(dp, WB_FLOOR_C);
  if (lo >= hi) {
    // Saturated air (dp = db up to round-off) or air at its boiling point.
    io[IO_WB] = Math.min(hi, db);
    return;
  }
  const e = EPSILON * p;
  // Branch: ice (eq 35) when the whole bracket is below 0 °C; water (eq 33) when it is above; in
  // between, eq 33 if its residual at 0 °C is ≤ 0 (a root at or above 0 °C exists), else eq 35.
  let ice: boolean;
  if (hi <= 0) ice = true;
  else if (lo >= 0) ice = false;
  else {
    const ws0 = (EPSILON * PWS_0C) / (p - PWS_0C);
    const g0 = 2501 * ws0 - 1.006 * db - w * (2501 + 1.86 * db);
    if (g0 <= 0) {
      ice = false;
      lo = 0;
    } else {
      ice = true;
      hi = 0;
    }
  }
  // The result stays within the branch's bracket: dp ≤ wb ≤ db, and on the side of 0 °C whose
  // equation it solves (so that wbIce and humRatioFromWetBulb agree with it).
  const lo0 = lo;
  const hi0 = ice && hi >= 0 ? -Number.MIN_VALUE : hi;
  // Residual g(t) = (a0 − a1 t)·Ws(t) − 1.006 (db − t) − W (dConst − d1 t), no division by the
  // denominator of eq 33/35 (it is positive), increasing and convex in t.
  const a0 = ice ? 2830 : 2501;
  const a1 = ice ? 0.24 : 2.326;
  const d1 = ice ? 2.1 : 4.186;
  const dConst = (ice ? 2830 : 2501) + 1.86 * db;
  const gConst = 1.006 + d1 * w;

  // The first iterate: the midpoint of the bracket, unless the free first step below lands
  // inside it. (The midpoint is worked out whether it is taken or not, here and in the loop: a
  // step that leaves the bracket is rare, one state in many thousand, and arithmetic that the
  // engine's optimised code meets for the first time, without type feedback, throws that code
  // away, where a choice between two doubles already worked out does not.)
  let t = 0.5 * (lo + hi);
  if (lo === dp && w > 0) {
    // Free first step from the dew point: there pws = pw, Ws = W and the residual is
    // −(db − dp)(1.006 + 1.86 W); its slopes need no exponential.
    const iq = 1 / (p - pw);
    const u1 = pw * dpD1;
    const wsp = e * u1 * iq * iq;
    const wspp = e * (pw * (dpD1 * dpD1 + dpD2) + 2 * u1 * u1 * iq) * iq * iq;
    const g = -(db - dp) * (1.006 + 1.86 * w);
    const a = a0 - a1 * dp;
    const gp = -a1 * w + a * wsp + gConst;
    const gpp = -2 * a1 * wsp + a * wspp;
    const igp = 1 / gp;
    const newton = g * igp;
    const c = 0.5 * newton * gpp * igp;
    const first = dp - (c > -0.5 && c < 0.5 ? newton * (1 + c * (1 + c)) : newton);
    if (first > lo && first < hi) t = first;
  }

  for (let i = 0; i < maxIter; i++) {
    const T = t + ZERO_C_K;
    const x = 1 / T;
    const lnT = Math.log(T);
    let lnPws: number;
    let L1: number;
    let L2: number;
    if (t < SWITCH_C) {
      lnPws = C1 * x + C2 + T * (C3 + T * (C4 + T * (C5 + T * C6))) + C7 * lnT;
      L1 = x * (C7 - C1 * x) + C3 + T * (2 * C4 + T * (3 * C5 + T * 4 * C6));
      L2 = x * x * (2 * C1 * x - C7) + 2 * C4 + T * (6 * C5 + T * 12 * C6);
    } else {
      lnPws = C8 * x + C9 + T * (C10 + T * (C11 + T * C12)) + C13 * lnT;
      L1 = x * (C13 - C8 * x) + C10 + T * (2 * C11 + T * 3 * C12);
      L2 = x * x * (2 * C8 * x - C13) + 2 * C11 + T * 6 * C12;
    }
    const pws = Math.exp(lnPws);
    const q = p - pws;
    let next: number;
    if (q <= 0) {
      // At or above the boiling point (round-off near hi): residual +∞.
      hi = t;
      next = 0.5 * (lo + hi);
    } else {
      const iq = 1 / q;
      const ws = EPSILON * pws * iq;
      const a = a0 - a1 * t;
      const g = a * ws - 1.006 * (db - t) - w * (dConst - d1 * t);
      if (g === 0) {
        io[IO_WB] = t < lo0 ? lo0 : Math.min(t, hi0);
        return;
      }
      if (g < 0) lo = t;
      else hi = t;
      const u1 = pws * L1;
      const wsp = e * u1 * iq * iq;
      const wspp = e * (pws * (L1 * L1 + L2) + 2 * u1 * u1 * iq) * iq * iq;
      const gp = -a1 * ws + a * wsp + gConst;
      const gpp = -2 * a1 * wsp + a * wspp;
      const igp = 1 / gp;
      const newton = g * igp;
      // Halley step, newton·(1 + c + c²) for newton/(1 − c): the same order, one division less.
      const c = 0.5 * newton * gpp * igp;
      const step = c > -0.5 && c < 0.5 ? newton * (1 + c * (1 + c)) : newton;
      next = t - step;
      // The error after a small step is ~ (g''/2g')²·step³, except across the triple point,
      // where the slope of pws jumps (ice below, water above): no stop there.
      if (Math.abs(step) < WB_STEP_DONE && Math.abs(c) < 0.005 && t < SWITCH_C === next < SWITCH_C) {
        // Within the bracket (a last step can overshoot it by round-off).
        io[IO_WB] = next < lo0 ? lo0 : Math.min(next, hi0);
        return;
      }
      const mid = 0.5 * (lo + hi);
      if (!(next > lo && next < hi)) next = mid;
    }
    if (hi - lo < 1e-9) {
      io[IO_WB] = next < lo0 ? lo0 : Math.min(next, hi0);
      return;
    }
    t = next;
  }
  io[IO_WB] = Number.NaN;
}

/**
 * Thermodynamic wet-bulb, °C, from dry-bulb db °C, humidity ratio w kg/kg and pressure p Pa:
 * safeguarded Newton (Halley) steps on eq 33/35, bracketed by [dew point, min(db, boiling point
 * at p)], bisection when a step leaves the bracket, converged to better than 1e-8 K. In the narrow
 * band of W, near a 0 °C wet-bulb, where eq 33 (water) and eq 35 (ice) both have a root, the eq 33
 * root is returned. Throws `supersaturated` (w above saturation at db),
 * `negative-humidity-ratio`, `out-of-range` or `no-convergence`.
 */
export function wetBulbFromHumRatio(db: number, w: number, p: number): number {
  checkTemperature(db, 'Dry-bulb');
  checkPressure(p);
  checkHumRatio(w);
  let pw = (p * w) / (EPSILON + w);
  const Tdb = db + ZERO_C_K;
  const pwsDb = Math.exp(db < SWITCH_C ? lnPwsIce(Tdb) : lnPwsWater(Tdb));
  if (pw > pwsDb) {
    if (pw > pwsDb * (1 + SATURATION_ROUNDOFF))
      throw supersaturatedError(db, w, (EPSILON * pwsDb) / (p - pwsDb), ['db', 'w']);
    pw = pwsDb; // saturated, up to round-off
  }
  let dp = Number.NEGATIVE_INFINITY;
  let d1 = 0;
  let d2 = 0;
  if (pw > 0) {
    dp = satTempRaw(pw);
    if (Number.isNaN(dp)) throw noConvergence('dew-point');
    d1 = satTempDeriv.d1;
    d2 = satTempDeriv.d2;
  }
  const wb = wetBulbSolve(db, w, p, pw, dp, d1, d2, pwsDb);
  if (Number.isNaN(wb)) throw noConvergence('wet-bulb');
  return wb;
}

/** The `supersaturated` error: w above the saturation humidity ratio ws at db. */
export function supersaturatedError(
  db: number,
  w: number,
  ws: number,
  keys: ('db' | 'w' | 'wb' | 'h' | 'rh' | 'dp')[],
): PsychroError {
  return new PsychroError({
    code: 'supersaturated',
    message: msg`Humidity ratio ${fW(w)} is above saturation at ${fT(db)} (${fW(ws)}): that is fog, not humid air.`,
    fix: msg`Use a humidity ratio of at most ${fW(ws)} at this dry-bulb, or a higher dry-bulb.`,
    keys,
  });
}

/**
 * Dew point (frost point below 0.01 °C), °C, from humidity ratio w kg/kg and pressure p Pa, by
 * inverting eqs 5/6. W = 0 gives −Infinity. Throws `negative-humidity-ratio` or `out-of-range`.
 */
export function dewPointFromHumRatio(w: number, p: number): number {
  checkPressure(p);
  checkHumRatio(w);
  const pw = (p * w) / (EPSILON + w);
  if (pw === 0) return Number.NEGATIVE_INFINITY;
  if (pw > PWS_MAX) {
    throw new PsychroError({
      code: 'out-of-range',
      message: msg`Humidity ratio ${fW(w)} at ${fP(p)} puts the dew point above ${fTL(T_MAX_C)}.`,
      fix: 'Use a lower humidity ratio or pressure.',
      keys: ['w'],
    });
  }
  const dp = satTempRaw(pw);
  if (Number.isNaN(dp)) throw noConvergence('dew-point');
  return dp;
}

/**
 * The other wet-bulb near 0 °C: where {@link wetBulbFromHumRatio} reports the root of eq 33 (a wick
 * of liquid water, at or above 0 °C), eq 35 (a wick of ice) can have a root too, just below 0 °C.
 * Returns that ice root, °C, or null when eq 35 has none below 0 °C (or the reported wet-bulb is
 * already over ice). `wb` is the reported wet-bulb and `dp` the dew point; bisection, at most 80
 * halvings of a bracket under 0.5 K wide, to 1e-9 K.
 */
export function iceWetBulbAlternative(db: number, w: number, p: number, wb: number, dp: number): number | null {
  if (!(wb >= 0) || !(db > 0) || !(w >= 0)) return null;
  // W from eq 35 rises with the wet-bulb; the root, if any, lies between the dew point and 0 °C.
  const f = (t: number): number => {
    const pws = Math.exp(lnPwsIce(t + ZERO_C_K));
    if (!(pws < p)) return Number.NaN;
    return humRatioEq33(db, t, (EPSILON * pws) / (p - pws)) - w;
  };
  let hi = -Number.MIN_VALUE;
  const fHi = f(hi);
  if (!(fHi > 0)) return null;
  let lo = Math.max(Number.isFinite(dp) ? dp : -100, -100, -ICE_ROOT_WINDOW_K);
  if (!(lo < hi)) return null;
  if (!(f(lo) < 0)) return null;
  for (let i = 0; i < 80 && hi - lo > 1e-9; i++) {
    const mid = 0.5 * (lo + hi);
    const fm = f(mid);
    if (!Number.isFinite(fm)) return null;
    if (fm > 0) hi = mid;
    else lo = mid;
  }
  return 0.5 * (lo + hi);
}

/** How far below 0 °C the other (ice) root of a wet-bulb near 0 °C is looked for, K. */
const ICE_ROOT_WINDOW_K = 5;
