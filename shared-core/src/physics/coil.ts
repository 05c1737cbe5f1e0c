/**
 * Cooling and dehumidifying coils by the apparatus-dew-point / bypass-factor model (ASHRAE HoF
 * 2017 SI Ch.1, adiabatic mixing and the coil energy balance; common practice for coil
 * selection): of the air crossing the coil, a fraction 1 − bf (the contact factor) touches the
 * surface and leaves saturated at the apparatus dew point (ADP); the rest, bf (the bypass factor),
 * passes unchanged. The leaving state is the mixture of the two streams by dry-air mass and
 * energy:
 *   W₂ = bf W₁ + (1 − bf) W_s(ADP),   h₂ = bf h₁ + (1 − bf) h_s(ADP),
 * so it lies on the straight mixing line (straight in h and W) from the entering state to
 * saturation at the ADP. The water beyond W₂ leaves as condensate. When the ADP is at or above
 * the entering dew point the coil stays dry: the contacted air is cooled to the ADP at its own
 * humidity ratio and W₂ = W₁.
 *
 * The reverse, {@link apparatusDewPoint}: for a coil given by its leaving state, where that
 * mixing line, continued in the drying direction, meets saturation; the bypass factor then
 * follows from where the leaving state sits on it.
 */
import type { MoistAirState } from './types';
import { dbFromEnthalpy, enthalpy, satHumRatio } from './properties';
import { stateFromDbW } from './state';
import { fail, ok, tText, type EquipmentOutcome } from './equipment';
import { msg } from './message';

/** Tolerance for reaching the saturation curve along the coil line, kg/kg. */
const SAT_SLACK = 2e-5;

/** What the ADP/bypass-factor model gives. */
export interface CoilResult {
  state: MoistAirState;
  /** True when the ADP is at or above the entering dew point (no water condenses). */
  dry: boolean;
  /** Humidity ratio of saturated air at the ADP, kg/kg. */
  wsAdp: number;
}

/** The air leaving a coil with apparatus dew point `adp` °C and bypass factor `bf` (see the module comment). */
export function coilFromAdp(a: MoistAirState, adp: number, bf: number): EquipmentOutcome<CoilResult> {
  if (!(bf >= 0 && bf < 1)) {
    return fail(
      'out-of-range',
      'bf',
      `the bypass factor ${String(bf)} is outside 0 to 1 (0 = every kg of air touches the coil, 1 = none does)`,
      'give the bypass factor as a fraction from 0 up to (not including) 1, e.g. bf=0.1 (contact factor 0.9)',
    );
  }
  if (!(adp < a.db)) {
    return fail(
      'unreachable',
      'adp',
      msg`the apparatus dew point ${tText(adp)} is not below the \
entering dry-bulb ${tText(a.db)}, so the coil would not cool the air`,
      'give an apparatus dew point below the entering dry-bulb (below its dew point for a coil that dries the air)',
    );
  }
  const ws = satHumRatio(adp, a.p);
  const dry = ws >= a.w;
  const wContact = dry ? a.w : ws;
  const hContact = enthalpy(adp, wContact);
  const w2 = bf * a.w + (1 - bf) * wContact;
  const h2 = bf * a.h + (1 - bf) * hContact;
  return ok({ state: stateFromDbW(dbFromEnthalpy(h2, w2), w2, a.p), dry, wsAdp: ws });
}

/**
 * Where the mixing line from `a` through `b` (straight in h and W), continued beyond `b` in the
 * drying direction, meets the saturation curve: the apparatus dew point, °C, and the bypass
 * factor that puts `b` on that line. Null when moisture is not removed, or when the line never
 * meets saturation before W reaches zero (no coil surface can produce `b` from `a`).
 */
export function apparatusDewPoint(a: MoistAirState, b: MoistAirState, p: number): { adp: number; bf: number } | null {
  const dw = b.w - a.w;
  const dh = b.h - a.h;
  if (!(dw < 0)) return null;
  // Along the line: W(s) = W₁ + s ΔW, h(s) = h₁ + s Δh, t(s) from eq 32; f(s) = W(s) − W_s(t(s)).
  const tAt = (s: number): number => dbFromEnthalpy(a.h + s * dh, Math.max(0, a.w + s * dw));
  const f = (s: number): number => {
    const w = a.w + s * dw;
    if (w < 0) return -Infinity;
    const t = tAt(s);
    if (!(t >= -100 && t <= 200)) return -Infinity;
    try {
      const ws = satHumRatio(t, p);
      return Number.isFinite(ws) ? w - ws : -Infinity;
    } catch {
      return -Infinity;
    }
  };
  if (f(1) >= -SAT_SLACK) return { adp: b.db, bf: 0 };
  // Heating or constant temperature while drying: the line moves away from saturation.
  if (!(b.db - a.db < 0)) return null;
  let hi = a.w / -dw;
  const tHi = tAt(hi);
  if (!(tHi >= -100)) {
    // Stop where the line leaves the formulation's range (−100 °C).
    let lo2 = 1;
    let hi2 = hi;
    for (let k = 0; k < 60; k++) {
      const mid = (lo2 + hi2) / 2;
      if (tAt(mid) >= -100) lo2 = mid;
      else hi2 = mid;
    }
    hi = lo2;
  }
  if (!(hi > 1)) return null;
  // W on the line is linear in s and the saturation humidity ratio is convex in t (nearly linear
  // in s), so f has one maximum: found by golden section, then the first crossing by bisection.
  let lo = 1;
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = hi - g * (hi - lo);
  let x2 = lo + g * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let k = 0; k < 60 && hi - lo > 1e-6 * hi; k++) {
    if (f1 < f2) {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + g * (hi - lo);
      f2 = f(x2);
    } else {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - g * (hi - lo);
      f1 = f(x1);
    }
  }
  const sMax = (lo + hi) / 2;
  if (!(f(sMax) >= -SAT_SLACK)) return null;
  let below = 1;
  let above = sMax;
  if (f(above) < 0) return { adp: tAt(above), bf: 1 - 1 / above };
  for (let k = 0; k < 60 && above - below > 1e-12 * above; k++) {
    const mid = (below + above) / 2;
    if (f(mid) >= 0) above = mid;
    else below = mid;
  }
  return { adp: tAt(above), bf: 1 - 1 / above };
}
