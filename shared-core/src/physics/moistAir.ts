/**
 * The engine's {@link MoistAirState}: a compact object that reads like the plain one.
 *
 * A plain object of thirteen figures holds each figure as a separate heap number (V8 boxes a
 * double-valued field), so a state was 16 fields and 13 boxes, ~350 bytes, copied by the garbage
 * collector as 14 objects. Here the thirteen figures live in one array of unboxed doubles (one
 * backing store) and the three flags are read from them or stored as one boolean: ~190 bytes in
 * 3 objects. The figures are the same doubles the engine computed (stored and read back as they
 * are), readers use the same property names (getters), and `JSON.stringify` gives the plain
 * object's text (see {@link MoistAir.toJSON}). Its own enumerable properties are the array of
 * figures and `fog`, so two states compare equal (deep equality) exactly when their figures and
 * fog flag do.
 */
import type { MoistAirState } from './types';
import { SWITCH_C } from './saturation';

/** The names of a state's figures, in the order of {@link MoistAir.figures} (and of the plain object's fields). */
export const STATE_FIGURES = ['p', 'db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'rho', 'pw', 'pws', 'ws', 'mu'] as const;

/** A state's fields as a plain object (own data properties, the fields of {@link MoistAirState}). */
export type MoistAirRecord = { [K in keyof MoistAirState]: MoistAirState[K] };

/** A moist-air state (see the module comment); build it with {@link moistAir}. */
export class MoistAir implements MoistAirState {
  // The fields are declared only (`declare`: no class field definitions), so that a state is
  // made by its constructor's two stores alone: a defined field is first made undefined on every
  // new object by an initializer of its own, a call per state before the engine optimises it.
  /** The figures in the order of {@link STATE_FIGURES}, SI (see {@link MoistAirState} for each). */
  declare readonly figures: readonly number[];
  /** True when the state lies in the fog region. */
  declare readonly fog: boolean;

  constructor(figures: readonly number[], fog: boolean) {
    this.figures = figures;
    this.fog = fog;
  }

  get p(): number {
    return this.figures[0]!;
  }
  get db(): number {
    return this.figures[1]!;
  }
  get wb(): number {
    return this.figures[2]!;
  }
  get dp(): number {
    return this.figures[3]!;
  }
  get rh(): number {
    return this.figures[4]!;
  }
  get w(): number {
    return this.figures[5]!;
  }
  get h(): number {
    return this.figures[6]!;
  }
  get v(): number {
    return this.figures[7]!;
  }
  get rho(): number {
    return this.figures[8]!;
  }
  get pw(): number {
    return this.figures[9]!;
  }
  get pws(): number {
    return this.figures[10]!;
  }
  get ws(): number {
    return this.figures[11]!;
  }
  get mu(): number {
    return this.figures[12]!;
  }
  /** The wet-bulb is over ice: below 0 °C (as every state the engine makes has it). */
  get wbIce(): boolean {
    return this.figures[2]! < 0;
  }
  /** The dew point is a frost point: below the triple point's switch (as every state the engine makes has it). */
  get dpFrost(): boolean {
    return this.figures[3]! < SWITCH_C;
  }

  /** The state as a plain object: what `JSON.stringify` writes (the same text as the plain state's). */
  toJSON(): MoistAirRecord {
    return stateRecord(this);
  }
}

/**
 * A state from its thirteen figures (in the order of {@link STATE_FIGURES}) and its fog flag. The
 * figures are taken as given; the flags wbIce (wb below 0 °C) and dpFrost (dp below the triple
 * point) follow from them.
 */
export function moistAir(
  p: number,
  db: number,
  wb: number,
  dp: number,
  rh: number,
  w: number,
  h: number,
  v: number,
  rho: number,
  pw: number,
  pws: number,
  ws: number,
  mu: number,
  fog: boolean,
): MoistAirState {
  return new MoistAir([p, db, wb, dp, rh, w, h, v, rho, pw, pws, ws, mu], fog);
}

/**
 * True when every figure of state `s` is finite, or (`realOnly`) every figure but the pressure,
 * the dew point and the saturation humidity ratio (the others are finite for any real air; see
 * {@link MoistAirState}). A {@link MoistAir}'s figures are read from its array, with no getter
 * called per figure: every state solved is tested, and before the engine has optimised the test
 * each getter is a call of its own. x·0 is 0 for a finite x and NaN for an infinite or NaN one,
 * so one sum tests them all.
 */
export function figuresFinite(s: MoistAirState, realOnly: boolean): boolean {
  if (!(s instanceof MoistAir)) return eachFigureFinite(s, realOnly);
  const f = s.figures;
  const real =
    f[1]! * 0 +
    f[2]! * 0 +
    f[4]! * 0 +
    f[5]! * 0 +
    f[6]! * 0 +
    f[7]! * 0 +
    f[8]! * 0 +
    f[9]! * 0 +
    f[10]! * 0 +
    f[12]! * 0;
  return (realOnly ? real : real + f[0]! * 0 + f[3]! * 0 + f[11]! * 0) === 0;
}

/** {@link figuresFinite} for a state of another kind, figure by figure. */
function eachFigureFinite(s: MoistAirState, realOnly: boolean): boolean {
  return (
    (realOnly || (Number.isFinite(s.p) && Number.isFinite(s.dp) && Number.isFinite(s.ws))) &&
    Number.isFinite(s.db) &&
    Number.isFinite(s.wb) &&
    Number.isFinite(s.rh) &&
    Number.isFinite(s.w) &&
    Number.isFinite(s.h) &&
    Number.isFinite(s.v) &&
    Number.isFinite(s.rho) &&
    Number.isFinite(s.pw) &&
    Number.isFinite(s.pws) &&
    Number.isFinite(s.mu)
  );
}

/** `s` with another saturation humidity ratio (every other figure, and the degree of saturation, as they are). */
export function withWs(s: MoistAirState, ws: number): MoistAirState {
  return moistAir(s.p, s.db, s.wb, s.dp, s.rh, s.w, s.h, s.v, s.rho, s.pw, s.pws, ws, s.mu, s.fog);
}

/** Every field of a state as a plain object, in the engine's order (for serialisation and for listing the fields). */
export function stateRecord(s: MoistAirState): MoistAirRecord {
  return {
    p: s.p,
    db: s.db,
    wb: s.wb,
    dp: s.dp,
    rh: s.rh,
    w: s.w,
    h: s.h,
    v: s.v,
    rho: s.rho,
    pw: s.pw,
    pws: s.pws,
    ws: s.ws,
    mu: s.mu,
    wbIce: s.wbIce,
    dpFrost: s.dpFrost,
    fog: s.fog,
  };
}
