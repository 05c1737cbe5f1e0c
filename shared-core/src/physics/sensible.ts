/**
 * Sensible heating and cooling at constant humidity ratio (heaters, reheat and preheat coils,
 * fans), ASHRAE HoF 2017 SI Ch.1 eq 32 (h = 1.006 t + W (2501 + 1.86 t) kJ/kg) and the
 * steady-flow energy balance per kg of dry air: q = ṁ (h₂ − h₁) with W₂ = W₁.
 *
 * Fan heat: all the electrical power a fan draws ends up as heat in the air that flows through
 * it when the motor sits in the airstream. The power is V̇ Δp / η (η = the fan's total efficiency
 * from electrical input to air power, motor and drive included), and per kg of dry air, with
 * V̇ = ṁ v (v per kg dry air, eq 26):
 *   Δh = Δp v / η,  so  Δt = Δp v / (η cp) = Δp / (ρ cp η)   with ρ = 1/v and cp = 1006 + 1860 W.
 * With the motor outside the airstream its own losses leave elsewhere: only the shaft power
 * reaches the air, Δh = Δp v η_motor / η (η_motor the motor's efficiency, drive included).
 */
import type { MoistAirState } from './types';
import { dbFromEnthalpy } from './properties';
import { stateFromDbW } from './state';
import { fail, moistCp, ok, tText, type EquipmentOutcome, flowText, pressureText } from './equipment';
import { msg } from './message';

/**
 * The state at dry-bulb `db2` with the humidity ratio of `a` (a sensible heater or cooler). A
 * dry-bulb below the dew point of `a` is `unreachable`: cooling air below its dew point condenses
 * water, which a coil model describes (`key` names the input to blame).
 */
export function sensibleToDb(a: MoistAirState, db2: number, key = 'db'): EquipmentOutcome<MoistAirState> {
  if (a.w > 0 && db2 < a.dp) {
    return fail(
      'unreachable',
      key,
      msg`this would cool the air to ${tText(db2)}, below its dew point ${tText(a.dp)}: \
water would condense, so the humidity ratio could not stay the same`,
      'a sensible heater or cooler keeps the humidity ratio; for a cooling coil that ' +
        'dries the air give its leaving state (db= with rh= or w=) or adp= with bf=',
    );
  }
  return ok(stateFromDbW(db2, a.w, a.p));
}

/** Sensible heating (or cooling, negative) by `dt` kelvin at constant humidity ratio. */
export function sensibleByDt(a: MoistAirState, dt: number): EquipmentOutcome<MoistAirState> {
  return sensibleToDb(a, a.db + dt, 'dt');
}

/**
 * Sensible heating by a heat rate `dutyW` (W, positive = added) into `massFlowKgS` kg/s of dry
 * air: h₂ = h₁ + q / ṁ, W₂ = W₁, and t₂ from eq 32 solved for t.
 */
export function sensibleByDuty(a: MoistAirState, dutyW: number, massFlowKgS: number): EquipmentOutcome<MoistAirState> {
  if (!(massFlowKgS > 0) || !Number.isFinite(massFlowKgS)) {
    return fail(
      'out-of-range',
      'heat',
      msg`the dry-air flow ${flowText(massFlowKgS)} is not a positive flow`,
      'give the process a positive dry-air flow (m= or q=)',
    );
  }
  const h2 = a.h + dutyW / massFlowKgS;
  return sensibleToDb(a, dbFromEnthalpy(h2, a.w), 'heat');
}

/** Options of the fan model. */
export interface FanOptions {
  /** Total pressure rise of the fan, Pa. */
  dpPa: number;
  /** Total efficiency, electrical input to air power (fan, drive and motor), 0 < η ≤ 1. */
  efficiency: number;
  /**
   * The motor's efficiency when the motor is outside the airstream (its losses leave elsewhere);
   * null when the motor is in the airstream (all input power heats the air).
   */
  motorEfficiency: number | null;
}

/** Heat a fan adds per kg of dry air, J/kg (see the module comment). */
export function fanHeatPerKg(a: MoistAirState, o: FanOptions): number {
  return (o.dpPa * a.v * (o.motorEfficiency ?? 1)) / o.efficiency;
}

/** Temperature rise through a fan, K: Δp v η_motor / (η cp) (see the module comment). */
export function fanTemperatureRise(a: MoistAirState, o: FanOptions): number {
  return fanHeatPerKg(a, o) / moistCp(a.w);
}

/** The air leaving a fan: W unchanged, h₂ = h₁ + Δp v η_motor / η. */
export function fanLeaving(a: MoistAirState, o: FanOptions): EquipmentOutcome<MoistAirState> {
  if (!(o.dpPa >= 0) || !Number.isFinite(o.dpPa)) {
    return fail(
      'out-of-range',
      'dp_fan',
      msg`the fan pressure rise ${pressureText(o.dpPa)} is not a pressure rise of 0 or more`,
      'give the fan total pressure rise as a positive figure, e.g. dp_fan=750Pa',
    );
  }
  if (!(o.efficiency > 0 && o.efficiency <= 1)) {
    return fail(
      'out-of-range',
      'eff',
      `the fan efficiency ${String(o.efficiency)} is outside 0 to 1`,
      'give the total fan efficiency as a fraction above 0 and at most 1, e.g. eff=0.62 or eff=62%',
    );
  }
  if (o.motorEfficiency !== null && !(o.motorEfficiency > 0 && o.motorEfficiency <= 1)) {
    return fail(
      'out-of-range',
      'eff_motor',
      `the motor efficiency ${String(o.motorEfficiency)} is outside 0 to 1`,
      'give the motor efficiency as a fraction above 0 and at most 1, e.g. eff_motor=0.92',
    );
  }
  const h2 = a.h + fanHeatPerKg(a, o);
  return ok(stateFromDbW(dbFromEnthalpy(h2, a.w), a.w, a.p));
}
