/**
 * The general state solver: any valid defining pair of the notation plus pressure → every
 * property of the state, or a typed problem with a stable code and a fix.
 */
import {
  PsychroError,
  type DefiningKey,
  type MoistAirState,
  type PhysicsProblem,
  type SolveOptions,
  type SolveResult,
  makeProblem,
} from './types';
import {
  msg,
  type MessageText,
  DH as fDH,
  DT as fDT,
  DTL as fDTL,
  H as fH,
  P as fP,
  PL as fPL,
  RH as fRh,
  T as fT,
  TL as fTL,
  W as fW,
} from './message';
import { CP_DA, CP_WV, EPSILON, H_FG0, condensateEnthalpy } from './properties';
import {
  PWS_MAX,
  PWS_MIN,
  T_MAX_C,
  T_MIN_C,
  SWITCH_C,
  ZERO_C_K,
  lnPwsIce,
  lnPwsWater,
  noConvergence,
  satTempFromLn,
  satTempRaw,
} from './saturation';
import { completeState, fogState, pwsAt } from './state';
import { MoistAir, figuresFinite } from './moistAir';
import { humRatioEq33, supersaturatedError, wRoundoff } from './wetbulb';
import { SATURATION_ROUNDOFF, TEMP_ROUNDOFF_K, pressureBelowSaturation } from './checks';
import { findRoot } from './roots';

/** The defining keys in a fixed order (the order problems list them in). */
export const DEFINING_KEYS: readonly DefiningKey[] = ['db', 'wb', 'dp', 'rh', 'w', 'h'];

const NAMES: Record<DefiningKey, string> = {
  db: 'dry-bulb',
  wb: 'wet-bulb',
  dp: 'dew point',
  rh: 'relative humidity',
  w: 'humidity ratio',
  h: 'enthalpy',
};

function problem(
  code: PhysicsProblem['code'],
  message: MessageText,
  fix: MessageText,
  keys: DefiningKey[],
): PsychroError {
  return new PsychroError({ code, message, fix, keys });
}

/** A computed dry-bulb outside −100…200 °C. */
function dbOutOfRange(db: number, keys: DefiningKey[]): PsychroError {
  return problem(
    'out-of-range',
    msg`These figures put the dry-bulb at ${Number.isFinite(db) ? fT(db) : 'an unbounded temperature'}, \
outside the formulation's ${fTL(T_MIN_C)} to ${fTL(T_MAX_C)}.`,
    msg`Check the ${keys.map((k) => NAMES[k]).join(' and ')}; the state they \
describe must have a dry-bulb between ${fTL(T_MIN_C)} and ${fTL(T_MAX_C)}.`,
    keys,
  );
}

/** pws(t) at or above p for a temperature that must be saturated (wb, dp). */
function checkBelowBoiling(t: number, pws: number, p: number, key: DefiningKey): void {
  if (pws >= p) throw pressureBelowSaturation(t, pws, p, [key], NAMES[key]);
}

/** Dry-bulb, °C, from wet-bulb, the saturation humidity ratio at it, and W (eq 33/35 solved for t). */
function dbFromWetBulbW(wb: number, wsStar: number, w: number): number {
  return wb >= 0
    ? ((2501 - 2.326 * wb) * wsStar + 1.006 * wb - w * (2501 - 4.186 * wb)) / (1.006 + 1.86 * w)
    : ((2830 - 0.24 * wb) * wsStar + 1.006 * wb - w * (2830 - 2.1 * wb)) / (1.006 + 1.86 * w);
}

/** Saturation humidity ratio at t (pws(t) < p assumed). */
function wsAt(t: number, p: number): number {
  const pws = pwsAt(t);
  return (EPSILON * pws) / (p - pws);
}

/**
 * The state at (db, w) once w is known, with the fog case and the range checks. `pwKnown` is the
 * vapour pressure when the pair gave it directly (a dew point), NaN otherwise.
 */
function stateAt(
  db: number,
  w: number,
  p: number,
  keys: DefiningKey[],
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
  dp = Number.NaN,
  wb = Number.NaN,
  pwKnown = Number.NaN,
): MoistAirState {
  if (!(db >= T_MIN_C && db <= T_MAX_C)) {
    // A computed dry-bulb a hair outside the range is round-off of its end (a pair such as wb
    // with dp magnifies the last digits of its figures by up to ~100 at high temperatures).
    if (db >= T_MIN_C - RANGE_ROUNDOFF_K && db < T_MIN_C) db = T_MIN_C;
    else if (db > T_MAX_C && db <= T_MAX_C + RANGE_ROUNDOFF_K) db = T_MAX_C;
    else throw dbOutOfRange(db, keys);
  }
  const pwsDb = pwsAt(db);
  let pw = Number.isNaN(pwKnown) ? (p * w) / (EPSILON + w) : pwKnown;
  if (pw > pwsDb) {
    if (pw <= pwsDb * (1 + SATURATION_ROUNDOFF)) {
      // Saturated air whose two figures agree to round-off (db = wb, db = dp, rh = 100 %).
      pw = pwsDb;
      w = (EPSILON * pw) / (p - pw);
    } else {
      // More water than the air can hold as vapour at this dry-bulb.
      const ws = (EPSILON * pwsDb) / (p - pwsDb);
      if (!opts?.allowFog) throw supersaturatedError(db, w, ws, keys);
      warnings.push(fogWarning(db, w, ws, keys));
      return fogState(db, w, p);
    }
  }
  return completeState(db, w, p, pwsDb, pw, Number.NaN, dp, wb);
}

/** How far (K) beyond −100 °C or 200 °C a computed dry-bulb may fall and still count as the end. */
const RANGE_ROUNDOFF_K = 1e-6;

function fogWarning(t: number, w: number, ws: number, keys: DefiningKey[]): PhysicsProblem {
  return makeProblem({
    code: 'supersaturated',
    message: msg`Fog: ${fW(w)} of water is more than saturated air at ${fT(t)} holds as \
vapour (${fW(ws)}); the rest, ${fW(w - ws)}, is suspended ${t < 0 ? 'ice' : 'liquid'}.`,
    fix: 'If fog is not intended, check the figures: the state lies beyond the saturation curve.',
    keys,
  });
}

/**
 * Warnings about a finished state: temperatures extrapolated below the range, no saturation
 * possible. (Each warning is made by a function of its own: cold paths out of this hot one.)
 */
function stateWarnings(s: MoistAirState, warnings: PhysicsProblem[]): void {
  if (s.fog) return;
  // An engine state's figures are read from its array (as in `figuresFinite`: no getter call).
  const f = s instanceof MoistAir ? s.figures : null;
  if ((f ? f[3]! : s.dp) < T_MIN_C - RANGE_ROUNDOFF_K) warnings.push(dewPointBelowRange(s));
  if ((f ? f[2]! : s.wb) < T_MIN_C - RANGE_ROUNDOFF_K) warnings.push(wetBulbBelowRange(s));
  if (!Number.isFinite(f ? f[11]! : s.ws)) warnings.push(cannotSaturate(s));
}

/** `out-of-range`: the dew point of `s` is below the formulation's range (or has none). */
function dewPointBelowRange(s: MoistAirState): PhysicsProblem {
  return makeProblem({
    code: 'out-of-range',
    message:
      s.w === 0
        ? 'Bone-dry air has no dew point (reported as −Infinity).'
        : s.dp === Number.NEGATIVE_INFINITY
          ? // (\u2212: the minus sign, escaped so that the CLI bundle stays ASCII: scripts/ascii-bundle.mjs.)
            msg`The humidity ratio ${fW(s.w)} at ${fP(s.p)} gives a \
vapour pressure too small to have a dew point (reported as \u2212Infinity).`
          : msg`The dew point ${fT(s.dp)} is below ${fTL(T_MIN_C)}: extrapolated from the ice equation.`,
    fix: 'Nothing to fix if the air is meant to be this dry.',
    keys: ['dp'],
  });
}

/** `out-of-range`: the wet-bulb of `s` is below the formulation's range. */
function wetBulbBelowRange(s: MoistAirState): PhysicsProblem {
  return makeProblem({
    code: 'out-of-range',
    message: msg`The wet-bulb ${fT(s.wb)} is below ${fTL(T_MIN_C)}: extrapolated from the ice equation.`,
    fix: 'Nothing to fix if the air is meant to be this cold and dry.',
    keys: ['wb'],
  });
}

/** `pressure-below-saturation`: `s` is at or above the boiling point at its pressure. */
function cannotSaturate(s: MoistAirState): PhysicsProblem {
  return makeProblem({
    code: 'pressure-below-saturation',
    message: msg`The dry-bulb ${fT(s.db)} is at or above the boiling point at ${fP(s.p)}: this air cannot be \
saturated, so the saturation humidity ratio is infinite and the degree of saturation does not exist (given as 0).`,
    fix: 'Nothing to fix if superheated air is meant; otherwise check the pressure.',
    keys: ['db'],
  });
}

/** The warnings of the solve under way (see {@link solveState}). */
const WARNINGS: PhysicsProblem[] = [];

/** The warnings of a result without any: one frozen empty list, shared. */
const NO_WARNINGS = Object.freeze([]) as unknown as PhysicsProblem[];

/**
 * Solve a moist-air state from exactly two defining properties (SI: °C, fraction, kg/kg, J/kg)
 * at pressure p Pa. Valid pairs: db with wb, dp, rh, w or h; wb with rh, w, dp or h (wb+h is
 * ill-conditioned: solved, with a warning); dp with rh or h; rh with w or h; w with h. dp with w
 * is a dependent pair. Never throws for bad input: returns a typed problem instead.
 */
export function solveState(
  input: Partial<Record<DefiningKey, number>>,
  p: number,
  options?: SolveOptions,
): SolveResult {
  // The warnings are collected in one list kept for every solve (a solve calls no other), and a
  // result without any shares the empty list: most states have none, and a list made per solve
  // was one object per state for nothing.
  const warnings = WARNINGS;
  // Left over only by a solve that failed (setting the length is a call into the engine).
  if (warnings.length !== 0) warnings.length = 0;
  try {
    const state = solveOrThrow(input, p, options, warnings);
    // Only absurd figures (a pressure of 1e-320 Pa, a humidity ratio of 1e308) overflow a property.
    const overflow = notFinite(state);
    if (overflow) throw overflowProblem(overflow, p, input);
    stateWarnings(state, warnings);
    return { ok: true, state, warnings: warnings.length === 0 ? NO_WARNINGS : warnings.splice(0) };
  } catch (e) {
    if (e instanceof PsychroError) return { ok: false, problem: e.problem };
    throw e;
  }
}

/** The problem of a state whose property `overflow` is not finite (see {@link solveState}). */
function overflowProblem(
  overflow: NonNullable<ReturnType<typeof notFinite>>,
  p: number,
  input: Partial<Record<DefiningKey, number>>,
): PsychroError {
  const what = overflow === 'v' ? 'specific volume' : overflow === 'h' ? 'enthalpy' : `property (${overflow})`;
  return problem(
    'out-of-range',
    msg`At ${fP(p)} these figures give a ${what} that is not a finite number.`,
    msg`Check the pressure and the humidity ratio: they are far outside any real air \
(${fPL(101325)} at sea level).`,
    DEFINING_KEYS.filter((k) => input[k] !== undefined),
  );
}

/**
 * The first property of `s` that is finite for any real air (dp and ws may be infinite, see
 * MoistAirState) but is not here, or null: one test of them all (`figuresFinite`), and the
 * property looked for only when one is not (no list or function per state).
 */
function notFinite(s: MoistAirState): 'db' | 'wb' | 'rh' | 'w' | 'h' | 'v' | 'rho' | 'pw' | 'pws' | 'mu' | null {
  return figuresFinite(s, true) ? null : firstNotFinite(s);
}

/** The first property of `s` that {@link notFinite} finds not finite (there is one). */
function firstNotFinite(s: MoistAirState): 'db' | 'wb' | 'rh' | 'w' | 'h' | 'v' | 'rho' | 'pw' | 'pws' | 'mu' | null {
  if (!Number.isFinite(s.db)) return 'db';
  if (!Number.isFinite(s.wb)) return 'wb';
  if (!Number.isFinite(s.rh)) return 'rh';
  if (!Number.isFinite(s.w)) return 'w';
  if (!Number.isFinite(s.h)) return 'h';
  if (!Number.isFinite(s.v)) return 'v';
  if (!Number.isFinite(s.rho)) return 'rho';
  if (!Number.isFinite(s.pw)) return 'pw';
  if (!Number.isFinite(s.pws)) return 'pws';
  if (!Number.isFinite(s.mu)) return 'mu';
  return null;
}

// Bits of the defining keys, in the fixed order of DEFINING_KEYS.
const DB = 1;
const WB = 2;
const DP = 4;
const RH = 8;
const W = 16;
const H = 32;

function keysOf(mask: number): DefiningKey[] {
  const out: DefiningKey[] = [];
  for (let i = 0; i < DEFINING_KEYS.length; i++) if (mask & (1 << i)) out.push(DEFINING_KEYS[i]!);
  return out;
}

function solveOrThrow(
  input: Partial<Record<DefiningKey, number>>,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const db = input.db;
  const wb = input.wb;
  const dp = input.dp;
  const rh = input.rh;
  const w = input.w;
  const h = input.h;
  const mask =
    (db !== undefined ? DB : 0) |
    (wb !== undefined ? WB : 0) |
    (dp !== undefined ? DP : 0) |
    (rh !== undefined ? RH : 0) |
    (w !== undefined ? W : 0) |
    (h !== undefined ? H : 0);
  let n = 0;
  for (let m = mask; m !== 0; m &= m - 1) n++;
  // The problems are made by functions of their own (cold paths out of this hot one: a smaller
  // function is optimised sooner, and compiles in less time).
  if (n !== 2) throw countProblem(mask, n);
  if (!(p > 0 && p < Number.POSITIVE_INFINITY)) throw pressureProblem(p);
  if (db !== undefined) checkValue('db', db);
  if (wb !== undefined) checkValue('wb', wb);
  if (dp !== undefined) checkValue('dp', dp);
  if (rh !== undefined) checkValue('rh', rh);
  if (w !== undefined) checkValue('w', w);
  if (h !== undefined) checkValue('h', h);
  switch (mask) {
    case DB | RH:
      return fromDbRh(db!, rh!, p);
    case DB | WB:
      return fromDbWb(db!, wb!, p, warnings);
    case DB | DP:
      return fromDbDp(db!, dp!, p, opts, warnings);
    case DB | W:
      return stateAt(db!, w!, p, ['db', 'w'], opts, warnings);
    case DB | H:
      return fromDbH(db!, h!, p, opts, warnings);
    case WB | DP:
      return fromWbDp(wb!, dp!, p, opts, warnings);
    case WB | RH:
      return fromWbRh(wb!, rh!, p, opts, warnings);
    case WB | W:
      return fromWbW(wb!, w!, p, opts, warnings);
    case WB | H:
      return fromWbH(wb!, h!, p, opts, warnings);
    case DP | RH:
      return fromDpRh(dp!, rh!, p, opts, warnings);
    case DP | W:
      throw dependentDpW(p);
    case DP | H:
      return fromDpH(dp!, h!, p, opts, warnings);
    case RH | W:
      return fromRhW(rh!, w!, p, opts, warnings);
    case RH | H:
      return fromRhH(rh!, h!, p, opts, warnings);
    default: // W | H
      return fromWH(w!, h!, p, opts, warnings);
  }
}

/** The problem of a solver input with `n` (not two) defining properties, those of `mask`. */
function countProblem(mask: number, n: number): PsychroError {
  const given = keysOf(mask);
  if (n < 2) {
    const k1 = given[0];
    const second =
      k1 === 'db' ? 'wb, dp, rh, w or h' : k1 === 'w' || k1 === 'dp' ? 'a temperature (db or wb), rh or h' : 'db or w';
    return problem(
      'underspecified',
      k1 === undefined
        ? 'No defining property is given: a state needs two.'
        : `Only the ${NAMES[k1]} is given: a state needs two defining properties.`,
      k1 === undefined
        ? 'Give two of db, wb, dp, rh, w, h (for example db and rh).'
        : `Add a second property: ${second}.`,
      given,
    );
  }
  return problem(
    'overspecified',
    `${n} defining properties are given (${given.join(', ')}); the solver takes exactly two.`,
    'Pass two of them to the solver and compare the others with the result.',
    given,
  );
}

/** The problem of a solver pressure `p` that is not positive and finite. */
function pressureProblem(p: number): PsychroError {
  return problem(
    'out-of-range',
    `Pressure ${String(p)} Pa is not a positive, finite pressure.`,
    msg`Give the barometric pressure as a positive figure (${fPL(101325)} at sea level), or a site elevation.`,
    [],
  );
}

/** The problem of dew point with humidity ratio at `p`: a dependent pair. */
function dependentDpW(p: number): PsychroError {
  return problem(
    'dependent-pair',
    msg`The dew point and the humidity ratio both fix the moisture content \
(at ${fP(p)} one follows from the other), so together they do not fix the state.`,
    'Replace one of them with a temperature (db or wb), the relative humidity (rh) or the enthalpy (h).',
    ['dp', 'w'],
  );
}

/**
 * Whether the root of f lies within round-off (RANGE_ROUNDOFF_K) beyond the range end x, where
 * f(x) = fx has the wrong sign: judged from the local slope.
 */
function rootWithinRoundoff(f: (x: number) => number, x: number, fx: number): boolean {
  const d = x > 0 ? -1e-3 : 1e-3; // step back into the range
  const slope = (fx - f(x + d)) / -d;
  return Number.isFinite(slope) && slope !== 0 && Math.abs(fx / slope) <= RANGE_ROUNDOFF_K;
}

/**
 * Range and sign checks of one input value: the test, small enough for the engine to build into
 * the solver (the key is a constant there), and the messages only when it fails.
 */
function checkValue(k: DefiningKey, x: number): void {
  if (!valueInRange(k, x)) valueProblem(k, x);
}

/** True when `x` is a usable value of key `k` (what {@link valueProblem} checks, as one test). */
function valueInRange(k: DefiningKey, x: number): boolean {
  if (typeof x !== 'number') return false;
  switch (k) {
    case 'db':
    case 'wb':
    case 'dp':
      return x >= T_MIN_C && x <= T_MAX_C;
    case 'rh':
      return x >= 0 && x <= 1;
    case 'w':
      return x >= 0 && x < Number.POSITIVE_INFINITY;
    default:
      return Number.isFinite(x);
  }
}

/** Throws the problem with the value `x` of key `k` (one that {@link valueInRange} refuses). */
function valueProblem(k: DefiningKey, x: number): void {
  if (typeof x !== 'number' || !Number.isFinite(x)) {
    throw problem(
      'out-of-range',
      `The ${NAMES[k]} ${String(x)} is not a finite number.`,
      `Give the ${NAMES[k]} as a finite number.`,
      [k],
    );
  }
  switch (k) {
    case 'db':
    case 'wb':
    case 'dp':
      if (x < T_MIN_C || x > T_MAX_C) {
        throw problem(
          'out-of-range',
          msg`The ${NAMES[k]} ${fT(x)} is outside the formulation's range (${fTL(T_MIN_C)} to ${fTL(T_MAX_C)}).`,
          msg`Use a ${NAMES[k]} between ${fTL(T_MIN_C)} and ${fTL(T_MAX_C)}.`,
          [k],
        );
      }
      return;
    case 'rh':
      if (x < 0 || x > 1) {
        throw problem(
          'rh-out-of-range',
          msg`The relative humidity ${fRh(x)} is outside 0 % to 100 %.`,
          'Give a relative humidity between 0 % and 100 %.',
          ['rh'],
        );
      }
      return;
    case 'w':
      if (x < 0) {
        throw problem(
          'negative-humidity-ratio',
          msg`The humidity ratio ${fW(x)} is negative.`,
          'A humidity ratio is 0 (bone-dry air) or more.',
          ['w'],
        );
      }
      return;
    case 'h':
      return;
  }
}

function fromDbWb(db: number, wb: number, p: number, warnings: PhysicsProblem[]): MoistAirState {
  const keys: DefiningKey[] = ['db', 'wb'];
  if (wb > db && wb <= db + TEMP_ROUNDOFF_K) wb = db; // saturated, up to round-off
  if (wb > db) {
    throw problem(
      'wb-above-db',
      msg`The wet-bulb ${fT(wb)} is above the dry-bulb ${fT(db)}.`,
      'The wet-bulb is at most the dry-bulb (equal when saturated): check the two figures or swap them.',
      keys,
    );
  }
  const T = wb + ZERO_C_K;
  const pwsWb = Math.exp(wb < SWITCH_C ? lnPwsIce(T) : lnPwsWater(T));
  checkBelowBoiling(wb, pwsWb, p, 'wb');
  const wsWb = (EPSILON * pwsWb) / (p - pwsWb);
  let w = humRatioEq33(db, wb, wsWb);
  if (w < 0 && w >= -wRoundoff(wsWb)) w = 0; // bone-dry air, up to round-off
  if (w < 0) throw wbTooLow(db, wb, p);
  return stateAt(db, w, p, keys, undefined, warnings, Number.NaN, wb);
}

function wbTooLow(db: number, wb: number, p: number): PsychroError {
  let min = Number.NaN;
  try {
    min = stateAt(db, 0, p, ['db'], undefined, []).wb;
  } catch {
    // keep NaN: the message then gives no figure
  }
  return problem(
    'wb-too-low',
    msg`The wet-bulb ${fT(wb)} is too far below the dry-bulb ${fT(db)}: even bone-dry air at ${fP(p)} ${
      Number.isFinite(min) ? msg`has a wet-bulb of ${fT(min)}` : 'has a higher wet-bulb'
    } (the humidity ratio would be negative).`,
    Number.isFinite(min)
      ? msg`Use a wet-bulb of at least ${fT(min)} at this dry-bulb, or check the dry-bulb.`
      : 'Use a higher wet-bulb, or check the dry-bulb.',
    ['db', 'wb'],
  );
}

function fromDbDp(
  db: number,
  dp: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['db', 'dp'];
  if (dp > db && dp <= db + TEMP_ROUNDOFF_K) dp = db; // saturated, up to round-off
  if (dp > db) {
    throw problem(
      'dp-above-db',
      msg`The dew point ${fT(dp)} is above the dry-bulb ${fT(db)}.`,
      'The dew point is at most the dry-bulb (equal when saturated): check the two figures or swap them.',
      keys,
    );
  }
  const pw = pwsAt(dp);
  checkBelowBoiling(dp, pw, p, 'dp');
  const w = (EPSILON * pw) / (p - pw);
  return stateAt(db, w, p, keys, opts, warnings, dp, Number.NaN, pw);
}

function fromDbRh(db: number, rh: number, p: number): MoistAirState {
  const T = db + ZERO_C_K;
  const lnPwsDb = db < SWITCH_C ? lnPwsIce(T) : lnPwsWater(T);
  const pwsDb = Math.exp(lnPwsDb);
  const pw = rh * pwsDb;
  if (pw >= p) throw boilsAtDbRh(db, rh, p, pwsDb, pw);
  const w = (EPSILON * pw) / (p - pw);
  return completeState(db, w, p, pwsDb, pw, lnPwsDb + Math.log(rh), Number.NaN, Number.NaN);
}

/** The problem of db with rh whose vapour pressure `pw` (rh·`pwsDb`) is at or above `p`. */
function boilsAtDbRh(db: number, rh: number, p: number, pwsDb: number, pw: number): PsychroError {
  return problem(
    'pressure-below-saturation',
    msg`At ${fT(db)} and ${fRh(rh)} the vapour pressure would \
be ${fP(pw)}, at or above the total pressure ${fP(p)}: water boils there.`,
    msg`Lower the relative humidity below ${fRh(p / pwsDb)} or the dry-bulb, or raise the pressure.`,
    ['db', 'rh'],
  );
}

function fromDbH(
  db: number,
  h: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['db', 'h'];
  let w = (h - CP_DA * db) / (H_FG0 + CP_WV * db);
  if (w < 0) {
    throw problem(
      'enthalpy-too-low',
      msg`The enthalpy ${fH(h)} is below that of bone-dry air at ${fT(db)} (${fH(CP_DA * db)}).`,
      msg`Use an enthalpy of at least ${fH(CP_DA * db)} at this \
dry-bulb (dry air 0 at ${fTL(0)}), or check the dry-bulb.`,
      keys,
    );
  }
  const pwsDb = pwsAt(db);
  if (pwsDb < p) {
    // Saturated air, up to the round-off of W = (h − 1006 t)/(2501000 + 1860 t) (a difference).
    const ws = (EPSILON * pwsDb) / (p - pwsDb);
    if (w > ws && w - ws <= (1e-14 * (Math.abs(h) + CP_DA * Math.abs(db))) / (H_FG0 + CP_WV * db)) w = ws;
  }
  const pw = (p * w) / (EPSILON + w);
  if (pw > pwsDb && opts?.allowFog) {
    // Fog at db: the enthalpy beyond saturated air is carried by suspended water at db.
    const ws = (EPSILON * pwsDb) / (p - pwsDb);
    const hs = CP_DA * db + ws * (H_FG0 + CP_WV * db);
    const hc = condensateEnthalpy(db);
    const wTotal = hc !== 0 ? ws + (h - hs) / hc : Number.NaN;
    if (!(wTotal >= ws && wTotal < Number.POSITIVE_INFINITY)) {
      throw problem(
        'no-solution',
        msg`The enthalpy ${fH(h)} is above that of saturated air at ${fT(db)} (${fH(hs)}), \
and suspended ${db < 0 ? 'ice' : 'water'} at this temperature cannot make up the difference.`,
        'Check the enthalpy and the dry-bulb, or give the humidity ratio instead of the enthalpy.',
        keys,
      );
    }
    warnings.push(fogWarning(db, wTotal, ws, keys));
    return fogState(db, wTotal, p);
  }
  return stateAt(db, w, p, keys, undefined, warnings);
}

function fromWbDp(
  wb: number,
  dp: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['wb', 'dp'];
  if (dp > wb && dp <= wb + TEMP_ROUNDOFF_K) dp = wb; // saturated, up to round-off
  if (dp > wb) {
    throw problem(
      'wb-too-low',
      msg`The wet-bulb ${fT(wb)} is below the dew point ${fT(dp)}; \
the wet-bulb always lies between the dew point and the dry-bulb.`,
      'Check the two figures (are they swapped?).',
      keys,
    );
  }
  const pwsWb = pwsAt(wb);
  checkBelowBoiling(wb, pwsWb, p, 'wb');
  const pw = pwsAt(dp);
  const w = (EPSILON * pw) / (p - pw);
  const db = dbFromWetBulbW(wb, (EPSILON * pwsWb) / (p - pwsWb), w);
  return stateAt(Math.max(db, wb), w, p, keys, opts, warnings, dp, wb, pw);
}

function fromWbW(
  wb: number,
  w: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['wb', 'w'];
  const pwsWb = pwsAt(wb);
  checkBelowBoiling(wb, pwsWb, p, 'wb');
  const wsWb = (EPSILON * pwsWb) / (p - pwsWb);
  if (w > wsWb * (1 + SATURATION_ROUNDOFF)) {
    if (!opts?.allowFog) {
      throw problem(
        'supersaturated',
        msg`The humidity ratio ${fW(w)} is above saturation at the wet-bulb ${fT(wb)} \
(${fW(wsWb)}): no air with this much vapour has so low a wet-bulb (it would be fog).`,
        msg`Use a humidity ratio of at most ${fW(wsWb)} with this wet-bulb, or a higher wet-bulb.`,
        keys,
      );
    }
    warnings.push(fogWarning(wb, w, wsWb, keys));
    return fogState(wb, w, p);
  }
  const db = dbFromWetBulbW(wb, wsWb, w);
  return stateAt(Math.max(db, wb), w, p, keys, opts, warnings, Number.NaN, wb);
}

/** The dry-bulb of bone-dry air with wet-bulb wb (the largest dry-bulb that wb allows). */
function dbMaxForWetBulb(wb: number, wsWb: number): number {
  return dbFromWetBulbW(wb, wsWb, 0);
}

function fromWbRh(
  wb: number,
  rh: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['wb', 'rh'];
  const pwsWb = pwsAt(wb);
  checkBelowBoiling(wb, pwsWb, p, 'wb');
  const wsWb = (EPSILON * pwsWb) / (p - pwsWb);
  if (rh === 1) return stateAt(wb, wsWb, p, keys, opts, warnings, Number.NaN, wb);
  const dbMax = dbMaxForWetBulb(wb, wsWb);
  if (rh === 0) return stateAt(dbMax, 0, p, keys, opts, warnings, Number.NaN, wb);
  // rh along the wet-bulb line falls from 1 at db = wb to 0 at dbMax.
  const wAt = (db: number): number => humRatioEq33(db, wb, wsWb);
  const f = (db: number): number => {
    const w = wAt(db);
    return (p * w) / (EPSILON + w) / pwsAt(db) - rh;
  };
  const hi = Math.min(dbMax, T_MAX_C);
  const fHi = f(hi);
  if (fHi > 0) {
    if (!rootWithinRoundoff(f, hi, fHi)) throw dbOutOfRange(Number.POSITIVE_INFINITY, keys);
    return stateAt(hi, Math.max(0, wAt(hi)), p, keys, opts, warnings, Number.NaN, wb);
  }
  const db = findRoot(f, wb, hi, 1 - rh, fHi);
  if (Number.isNaN(db)) throw noConvergence('dry-bulb (from wb and rh)');
  return stateAt(db, Math.max(0, wAt(db)), p, keys, opts, warnings, Number.NaN, wb);
}

function fromWbH(
  wb: number,
  h: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['wb', 'h'];
  const pwsWb = pwsAt(wb);
  checkBelowBoiling(wb, pwsWb, p, 'wb');
  const wsWb = (EPSILON * pwsWb) / (p - pwsWb);
  const dbMax = Math.min(dbMaxForWetBulb(wb, wsWb), T_MAX_C);
  const hAt = (db: number): number => {
    const w = humRatioEq33(db, wb, wsWb);
    return CP_DA * db + w * (H_FG0 + CP_WV * db);
  };
  const f = (db: number): number => hAt(db) - h;
  const fLo = f(wb);
  const fHi = f(dbMax);
  const hLo = fLo + h;
  const hHi = fHi + h;
  const spread = Math.abs(hHi - hLo);
  if (spread <= 1e-9 * Math.max(1, Math.abs(h)) && Math.abs(fLo) <= 1e-6 * Math.max(1000, Math.abs(h))) {
    throw problem(
      'dependent-pair',
      msg`At a wet-bulb of ${fT(wb)} the enthalpy is the same \
(${fH(hLo)}) for every dry-bulb, so the two do not fix the state.`,
      'Replace the enthalpy with the dry-bulb, the relative humidity or the humidity ratio.',
      keys,
    );
  }
  if (fLo * fHi > 0) {
    const [lo, hi2] = hLo < hHi ? [hLo, hHi] : [hHi, hLo];
    throw problem(
      'no-solution',
      msg`No air with a wet-bulb of ${fT(wb)} has an enthalpy of ${fH(h)}: \
along that wet-bulb the enthalpy only ranges from ${fH(lo)} to ${fH(hi2)}.`,
      'Check the enthalpy; the wet-bulb and the enthalpy are nearly ' +
        'redundant, so prefer the dry-bulb, rh or w with the wet-bulb.',
      keys,
    );
  }
  const db = findRoot(f, wb, dbMax, fLo, fHi);
  if (Number.isNaN(db)) throw noConvergence('dry-bulb (from wb and h)');
  const slope = Math.abs(hHi - hLo) / Math.max(dbMax - wb, 1e-9); // J/kg per K along the wet-bulb line
  warnings.push(
    makeProblem({
      code: 'ill-conditioned',
      message: msg`Wet-bulb and enthalpy are nearly parallel on the chart: along this \
wet-bulb the enthalpy changes by only about ${fDH(10 * slope)} per ${fDTL(10)} of dry-bulb${
        slope > 0 ? msg`, so an error of ${fDH(100)} in h moves the dry-bulb by about ${fDT(100 / slope)}.` : '.'
      }`,
      fix: 'Prefer the dry-bulb, rh or w together with the wet-bulb.',
      keys,
    }),
  );
  return stateAt(db, Math.max(0, humRatioEq33(db, wb, wsWb)), p, keys, opts, warnings, Number.NaN, wb);
}

function fromDpRh(
  dp: number,
  rh: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['dp', 'rh'];
  const pw = pwsAt(dp);
  checkBelowBoiling(dp, pw, p, 'dp');
  if (rh === 0) {
    throw problem(
      'no-solution',
      msg`A relative humidity of 0 % means bone-dry air, which \
has no dew point; it cannot go with a dew point of ${fT(dp)}.`,
      'Give a relative humidity above 0 %, or replace the dew point with a dry-bulb.',
      keys,
    );
  }
  const pwsDb = pw / rh;
  if (pwsDb > PWS_MAX * (1 + SATURATION_ROUNDOFF)) throw dbOutOfRange(Number.POSITIVE_INFINITY, keys);
  const db = rh === 1 ? dp : satTempRaw(pwsDb);
  if (Number.isNaN(db)) throw noConvergence('dry-bulb (from dp and rh)');
  const w = (EPSILON * pw) / (p - pw);
  return stateAt(Math.max(db, dp), w, p, keys, opts, warnings, dp, Number.NaN, pw);
}

function fromDpH(
  dp: number,
  h: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['dp', 'h'];
  const pw = pwsAt(dp);
  checkBelowBoiling(dp, pw, p, 'dp');
  const w = (EPSILON * pw) / (p - pw);
  let db = (h - H_FG0 * w) / (CP_DA + CP_WV * w);
  const hs = CP_DA * dp + w * (H_FG0 + CP_WV * dp);
  // Saturated air, up to the round-off of h (relative 1e-11: W itself came from a dew point).
  if (db < dp && h >= hs - (1e-11 * Math.abs(hs) + 1e-6)) db = dp;
  if (db < dp) {
    throw problem(
      'enthalpy-too-low',
      msg`The enthalpy ${fH(h)} is below that of saturated air at the dew \
point ${fT(dp)} (${fH(hs)}): the dry-bulb would be below the dew point.`,
      msg`Use an enthalpy of at least ${fH(hs)} with this dew point.`,
      keys,
    );
  }
  return stateAt(db, w, p, keys, opts, warnings, dp, Number.NaN, pw);
}

function fromRhW(
  rh: number,
  w: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['rh', 'w'];
  if (rh === 0 || w === 0) {
    if (rh === 0 && w === 0) {
      throw problem(
        'dependent-pair',
        'A relative humidity of 0 % and a humidity ratio of 0 both say ' +
          'only that the air is bone-dry; they do not fix its temperature.',
        'Replace one of them with a temperature (db or wb) or the enthalpy (h).',
        keys,
      );
    }
    throw problem(
      'no-solution',
      rh === 0
        ? msg`A relative humidity of 0 % means bone-dry air, but the humidity ratio is ${fW(w)}.`
        : msg`A humidity ratio of 0 means bone-dry air, but the relative humidity is ${fRh(rh)}.`,
      'Check the two figures, or replace one with a temperature.',
      keys,
    );
  }
  const pw = (p * w) / (EPSILON + w);
  const pwsDb = pw / rh;
  if (pwsDb > PWS_MAX * (1 + SATURATION_ROUNDOFF) || pwsDb < PWS_MIN * (1 - SATURATION_ROUNDOFF))
    throw dbOutOfRange(pwsDb > PWS_MAX ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY, keys);
  const db = satTempFromLn(Math.log(pwsDb));
  if (Number.isNaN(db)) throw noConvergence('dry-bulb (from rh and w)');
  return stateAt(db, w, p, keys, opts, warnings);
}

function fromRhH(
  rh: number,
  h: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['rh', 'h'];
  const wAt = (db: number): number => {
    const pw = rh * pwsAt(db);
    return pw < p ? (EPSILON * pw) / (p - pw) : Number.POSITIVE_INFINITY;
  };
  // h rises with db along a line of constant rh (both terms grow).
  const f = (db: number): number => {
    const w = wAt(db);
    return CP_DA * db + w * (H_FG0 + CP_WV * db) - h;
  };
  const fLo = f(T_MIN_C);
  if (fLo === Number.POSITIVE_INFINITY) {
    // rh·pws reaches p even at −100 °C: no temperature in range gives air at this rh.
    throw problem(
      'pressure-below-saturation',
      msg`At ${fP(p)}, air at ${fRh(rh)} would have a vapour pressure at or \
above the total pressure even at ${fTL(T_MIN_C)} (${fP(rh * pwsAt(T_MIN_C))}).`,
      msg`Check the pressure and its unit (${fPL(101325)} at sea level).`,
      keys,
    );
  }
  if (fLo > 0 && rootWithinRoundoff(f, T_MIN_C, fLo)) return stateAt(T_MIN_C, wAt(T_MIN_C), p, keys, opts, warnings);
  if (fLo > 0) {
    throw problem(
      'out-of-range',
      msg`The enthalpy ${fH(h)} at ${fRh(rh)} would need a dry-bulb below ${fTL(T_MIN_C)}.`,
      msg`Use an enthalpy of at least ${fH(fLo + h)} at this relative humidity.`,
      keys,
    );
  }
  // Upper end: 200 °C, or just below the dry-bulb at which rh·pws reaches p (W → ∞ there).
  let hi = T_MAX_C;
  let fHi = f(hi);
  if (!Number.isFinite(fHi)) {
    let lo = T_MIN_C;
    hi = satTempRaw(p / rh);
    for (let i = 0; i < 200; i++) {
      const m = 0.5 * (lo + hi);
      const fm = f(m);
      if (fm <= 0) lo = m;
      else if (Number.isFinite(fm)) {
        hi = m;
        fHi = fm;
        break;
      } else hi = m;
    }
    if (!Number.isFinite(fHi)) throw noConvergence('dry-bulb (from rh and h)');
  }
  if (fHi < 0) {
    if (!rootWithinRoundoff(f, hi, fHi)) throw dbOutOfRange(Number.POSITIVE_INFINITY, keys);
    return stateAt(hi, wAt(hi), p, keys, opts, warnings);
  }
  const db = findRoot(f, T_MIN_C, hi, fLo, fHi);
  if (Number.isNaN(db)) throw noConvergence('dry-bulb (from rh and h)');
  return stateAt(db, wAt(db), p, keys, opts, warnings);
}

function fromWH(
  w: number,
  h: number,
  p: number,
  opts: SolveOptions | undefined,
  warnings: PhysicsProblem[],
): MoistAirState {
  const keys: DefiningKey[] = ['w', 'h'];
  const db = (h - H_FG0 * w) / (CP_DA + CP_WV * w);
  const pw = (p * w) / (EPSILON + w);
  // Unsaturated if the dry-bulb from eq 30 is at or above the dew point of w.
  const tCheck = db < T_MIN_C ? T_MIN_C : Math.min(db, T_MAX_C);
  const unsaturated = pw <= PWS_MIN || pw <= pwsAt(tCheck) * (1 + SATURATION_ROUNDOFF);
  if (unsaturated || db > T_MAX_C) return stateAt(db, w, p, keys, opts, warnings);
  if (pw > PWS_MAX) throw dbOutOfRange(db, keys);
  const tSat = satTempRaw(pw); // dew point of the total water
  if (Number.isNaN(tSat)) throw noConvergence('dew point');
  const hSat = CP_DA * tSat + w * (H_FG0 + CP_WV * tSat);
  // Saturated air at its dew point, up to the round-off of h.
  if (h >= hSat - (1e-13 * (Math.abs(hSat) + CP_DA * Math.abs(tSat)) + 1e-9))
    return stateAt(tSat, w, p, keys, opts, warnings);
  if (!opts?.allowFog) {
    throw problem(
      'supersaturated',
      msg`The humidity ratio ${fW(w)} with the enthalpy ${fH(h)} lies in the fog region: saturated air with that \
much water has ${fH(hSat)} at its dew point ${fT(tSat)}, so there is more water than the air can hold as vapour.`,
      msg`Use an enthalpy of at least ${fH(hSat)} with this humidity ratio, or allow fog.`,
      keys,
    );
  }
  // Fog: energy balance h = hs(t) + (W − Ws(t))·h_condensate(t) for t below the dew point of W.
  const f = (t: number): number => {
    const ws = wsAt(t, p);
    return CP_DA * t + ws * (H_FG0 + CP_WV * t) + (w - ws) * condensateEnthalpy(t) - h;
  };
  const fLo = f(T_MIN_C);
  if (fLo > 0) {
    throw problem(
      'out-of-range',
      msg`The enthalpy ${fH(h)} with ${fW(w)} of water would need a fog temperature below ${fTL(T_MIN_C)}.`,
      'Check the enthalpy and the humidity ratio.',
      keys,
    );
  }
  const fHi = hSat - h;
  const t = findRoot(f, T_MIN_C, tSat, fLo, fHi);
  if (Number.isNaN(t)) throw noConvergence('fog temperature');
  const ws = wsAt(t, p);
  warnings.push(fogWarning(t, w, ws, keys));
  return fogState(t, Math.max(w, ws), p);
}
