/**
 * Assembly of a complete {@link MoistAirState} from dry-bulb, humidity ratio and pressure (the
 * dew point and wet-bulb solved when not already known), and of fog states.
 */
import type { MoistAirState } from './types';
import { SATURATION_ROUNDOFF, checkHumRatio, checkPressure } from './checks';
import { CP_DA, CP_WV, EPSILON, H_FG0, R_DA, condensateEnthalpy } from './properties';
import {
  ZERO_C_K,
  SWITCH_C,
  checkTemperature,
  dLnPwsIce,
  dLnPwsWater,
  d2LnPwsIce,
  d2LnPwsWater,
  lnPwsIce,
  lnPwsWater,
  noConvergence,
  satTempDeriv,
  satTempFromLn,
} from './saturation';
import { supersaturatedError, wetBulbSolve } from './wetbulb';
import { moistAir } from './moistAir';

/**
 * Every property of unsaturated (or exactly saturated) air from db °C, w kg/kg and p Pa, with
 * pwsDb = pws(db) and pw = p w / (0.621945 + w) already computed and w ≤ Ws(db) already
 * checked. `lnPw` is ln(pw) when known (NaN otherwise); `dp` and `wb` are used as given when not
 * NaN (they were inputs), else solved. Throws `no-convergence` if a solve hits its bound.
 */
export function completeState(
  db: number,
  w: number,
  p: number,
  pwsDb: number,
  pw: number,
  lnPw: number,
  dp: number,
  wb: number,
): MoistAirState {
  const io = COMPLETE_IN;
  io[IN_DB] = db;
  io[IN_W] = w;
  io[IN_P] = p;
  io[IN_PWS_DB] = pwsDb;
  io[IN_PW] = pw;
  io[IN_LN_PW] = lnPw;
  io[IN_DP] = dp;
  io[IN_WB] = wb;
  return completeFromInput();
}

/**
 * The arguments of {@link completeState}, passed to its work ({@link completeFromInput}) in one
 * array of unboxed doubles: a function the engine does not build into its caller takes each
 * double argument as a heap object of its own (most of the eight here are computed just before
 * the call), where a store to this array and a load from it allocate nothing. completeState,
 * which fills it, is small enough to be built into its callers. (One state is completed at a
 * time: the work reads its arguments first and completes no other state.)
 */
const COMPLETE_IN = new Float64Array(8);
/** Places in {@link COMPLETE_IN}, in the order of {@link completeState}'s parameters. */
const IN_DB = 0;
const IN_W = 1;
const IN_P = 2;
const IN_PWS_DB = 3;
const IN_PW = 4;
const IN_LN_PW = 5;
const IN_DP = 6;
const IN_WB = 7;

/** {@link completeState} from its arguments in {@link COMPLETE_IN} (see there). */
function completeFromInput(): MoistAirState {
  const io = COMPLETE_IN;
  const db = io[IN_DB]!;
  const w = io[IN_W]!;
  const p = io[IN_P]!;
  const pwsDb = io[IN_PWS_DB]!;
  const pw = io[IN_PW]!;
  const lnPw = io[IN_LN_PW]!;
  let dp = io[IN_DP]!;
  let wb = io[IN_WB]!;
  let d1 = 0;
  let d2 = 0;
  if (pw > 0) {
    if (Number.isNaN(dp)) {
      dp = satTempFromLn(Number.isNaN(lnPw) ? Math.log(pw) : lnPw);
      if (Number.isNaN(dp)) throw noConvergence('dew-point');
      if (dp > db) dp = db; // saturated air: the inversion's last-digit round-off
      d1 = satTempDeriv.d1;
      d2 = satTempDeriv.d2;
    } else if (Number.isNaN(wb)) {
      const T = dp + ZERO_C_K;
      d1 = dp < SWITCH_C ? dLnPwsIce(T) : dLnPwsWater(T);
      d2 = dp < SWITCH_C ? d2LnPwsIce(T) : d2LnPwsWater(T);
    }
  } else {
    dp = Number.NEGATIVE_INFINITY;
  }
  if (Number.isNaN(wb)) {
    wb = wetBulbSolve(db, w, p, pw, dp, d1, d2, pwsDb);
    if (Number.isNaN(wb)) throw noConvergence('wet-bulb');
  }
  const ws = pwsDb < p ? (EPSILON * pwsDb) / (p - pwsDb) : Number.POSITIVE_INFINITY;
  const v = (R_DA * (db + ZERO_C_K) * (1 + 1.607858 * w)) / p;
  return moistAir(
    p,
    db,
    wb,
    dp,
    pw / pwsDb,
    w,
    CP_DA * db + w * (H_FG0 + CP_WV * db),
    v,
    (1 + w) / v,
    pw,
    pwsDb,
    ws,
    w / ws,
    false,
  );
}

/** pws at t °C with the triple-point switch (no range check). */
export function pwsAt(tC: number): number {
  const T = tC + ZERO_C_K;
  return Math.exp(tC < SWITCH_C ? lnPwsIce(T) : lnPwsWater(T));
}

/**
 * A fog state at t °C: saturated air plus (wTotal − Ws) kg/kg of suspended water (ice below
 * 0 °C) at the same temperature. `w` is the total water, `h` includes the suspended water,
 * `v` is the gas volume per kg dry air, `rho` counts the suspended water, `mu` = wTotal / Ws.
 * Needs pws(t) < p and wTotal ≥ Ws(t) (checked by callers).
 */
export function fogState(t: number, wTotal: number, p: number): MoistAirState {
  const pws = pwsAt(t);
  const ws = (EPSILON * pws) / (p - pws);
  const v = (R_DA * (t + ZERO_C_K) * (1 + 1.607858 * ws)) / p;
  return moistAir(
    p,
    t,
    t,
    t,
    1,
    wTotal,
    CP_DA * t + ws * (H_FG0 + CP_WV * t) + (wTotal - ws) * condensateEnthalpy(t),
    v,
    (1 + wTotal) / v,
    pws,
    pws,
    ws,
    wTotal / ws,
    true,
  );
}

/**
 * Every property of moist air from dry-bulb db °C, humidity ratio w kg/kg and pressure p Pa
 * (used for mixes). Throws `PsychroError`: `out-of-range`, `negative-humidity-ratio`,
 * `supersaturated` (w above saturation at db: use `solveState` with `allowFog` for a fog
 * state), or `no-convergence`.
 */
export function stateFromDbW(db: number, w: number, p: number): MoistAirState {
  checkTemperature(db, 'Dry-bulb');
  checkPressure(p);
  checkHumRatio(w);
  const pwsDb = pwsAt(db);
  let pw = (p * w) / (EPSILON + w);
  if (pw > pwsDb) {
    if (pw > pwsDb * (1 + SATURATION_ROUNDOFF))
      throw supersaturatedError(db, w, (EPSILON * pwsDb) / (p - pwsDb), ['db', 'w']);
    pw = pwsDb; // saturated, up to round-off
  }
  return completeState(db, w, p, pwsDb, pw, Number.NaN, Number.NaN, Number.NaN);
}
