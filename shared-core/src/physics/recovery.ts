/**
 * Air-to-air heat (and moisture) recovery between two streams, by effectiveness applied to the
 * smaller capacity rate (the ε-definitions of air-to-air energy recovery ventilators, ASHRAE
 * HVAC Systems and Equipment, "Air-to-Air Energy Recovery Equipment"; common practice):
 *
 *   capacity rate C = ṁ cp,  cp = 1006 + 1860 W per kg dry air (ASHRAE HoF 2017 SI Ch.1 eq 32)
 *   sensible heat to stream 1:  q = ε_s C_min (t₂ − t₁)
 *   t₁' = t₁ + q / C₁,   t₂' = t₂ − q / C₂
 *   moisture to stream 1:  m_w = ε_l ṁ_min (W₂ − W₁)
 *   W₁' = W₁ + m_w / ṁ₁,  W₂' = W₂ − m_w / ṁ₂
 *
 * (ṁ per stream in dry air; without ε_l the humidity ratios are unchanged.) With unequal flows
 * the stream with the larger capacity rate changes temperature less.
 *
 * Condensation and frost: the stream being cooled meets, at the exchanger's cold end, a surface
 * between its own leaving temperature and the other stream's entering temperature — taken as their
 * mean (equal film coefficients on both sides; common practice). Water condenses there when the
 * cooled stream's leaving dew point is above that surface temperature, and freezes when the
 * surface is also below 0 °C. A leaving state above saturation is computed as a fog state.
 */
import type { MoistAirState } from './types';
import { solveState } from './solve';
import { dewPointFromHumRatio } from './wetbulb';
import { fail, moistCp, ok, type EquipmentOutcome, flowText, unreachableState } from './equipment';
import { msg } from './message';

/** One stream through the exchanger. */
export interface RecoveryStream {
  state: MoistAirState;
  /** Dry-air mass flow, kg/s. */
  massFlowKgS: number;
}

/** Condensation or frost found on the side of the stream being cooled. */
export interface RecoveryWetting {
  /** Which stream is cooled: 0 for the first, 1 for the second. */
  stream: 0 | 1;
  kind: 'condensation' | 'frost';
  /** The estimated surface temperature at the cold end, °C. */
  surfaceC: number;
  /** The cooled stream's leaving dew point (frost point below 0 °C), °C. */
  dewPointC: number;
}

/** Both leaving states and the exchange. */
export interface RecoveryResult {
  leaving: [MoistAirState, MoistAirState];
  /** Sensible heat into the first stream, W (negative when the first stream is cooled). */
  sensibleW: number;
  /** Water into the first stream, kg/s (negative when it loses moisture). */
  waterKgS: number;
  /** The smaller capacity rate, W/K, and which stream has it. */
  cMin: number;
  minStream: 0 | 1;
  /** Condensation or frost on the cooled side, or null. */
  wetting: RecoveryWetting | null;
}

function leavingState(t: number, w: number, p: number, which: string): EquipmentOutcome<MoistAirState> {
  const solved = solveState({ db: t, w }, p, { allowFog: true });
  if (!solved.ok) return unreachableState(which, solved.problem);
  return ok(solved.state);
}

/** Heat recovery between two streams (see the module comment). `effL` null for a sensible-only exchanger. */
export function recoverBetween(
  s1: RecoveryStream,
  s2: RecoveryStream,
  effS: number,
  effL: number | null,
): EquipmentOutcome<RecoveryResult> {
  if (!(effS >= 0 && effS <= 1)) {
    return fail(
      'out-of-range',
      'eff_s',
      `the sensible effectiveness ${String(effS)} is outside 0 to 1`,
      'give the sensible effectiveness as a fraction from 0 to 1, e.g. eff_s=0.70 or eff_s=70%',
    );
  }
  if (effL !== null && !(effL >= 0 && effL <= 1)) {
    return fail(
      'out-of-range',
      'eff_l',
      `the latent effectiveness ${String(effL)} is outside 0 to 1`,
      'give the latent effectiveness as a fraction from 0 to 1, e.g. ' +
        'eff_l=0.60, or leave it out for a sensible-only exchanger',
    );
  }
  for (const s of [s1, s2]) {
    if (!(s.massFlowKgS > 0) || !Number.isFinite(s.massFlowKgS)) {
      return fail(
        'out-of-range',
        'm',
        msg`a dry-air flow of ${flowText(s.massFlowKgS)} is not a positive flow`,
        'give each stream a positive dry-air flow',
      );
    }
  }
  const a = s1.state;
  const b = s2.state;
  const c1 = s1.massFlowKgS * moistCp(a.w);
  const c2 = s2.massFlowKgS * moistCp(b.w);
  const minStream: 0 | 1 = c1 <= c2 ? 0 : 1;
  const cMin = Math.min(c1, c2);
  const q = effS * cMin * (b.db - a.db);
  const mMin = Math.min(s1.massFlowKgS, s2.massFlowKgS);
  const mw = effL === null ? 0 : effL * mMin * (b.w - a.w);
  const t1 = a.db + q / c1;
  const t2 = b.db - q / c2;
  const w1 = a.w + mw / s1.massFlowKgS;
  const w2 = b.w - mw / s2.massFlowKgS;
  const l1 = leavingState(t1, w1, a.p, 'eff_s');
  if (!l1.ok) return l1;
  const l2 = leavingState(t2, w2, b.p, 'eff_s');
  if (!l2.ok) return l2;
  const leaving: [MoistAirState, MoistAirState] = [l1.value, l2.value];
  // The cooled stream (none when both enter at one temperature) and its cold end.
  let wetting: RecoveryWetting | null = null;
  if (q !== 0) {
    const cooled: 0 | 1 = q > 0 ? 1 : 0;
    const out = leaving[cooled];
    const otherIn = cooled === 0 ? b : a;
    const surfaceC = (out.db + otherIn.db) / 2;
    // A fog state's own dew point is its temperature; the water it carries condenses from its dew point.
    const dewPointC = out.fog ? dewPointFromHumRatio(out.w, out.p) : out.dp;
    if (out.fog || dewPointC > surfaceC) {
      wetting = { stream: cooled, kind: surfaceC < 0 ? 'frost' : 'condensation', surfaceC, dewPointC };
    }
  }
  return ok({ leaving, sensibleW: q, waterKgS: mw, cMin, minStream, wetting });
}
