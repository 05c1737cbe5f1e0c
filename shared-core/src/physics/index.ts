/**
 * The moist-air engine: ASHRAE Handbook—Fundamentals 2017 (SI) Chapter 1, ideal-gas model.
 *
 * SI inside: °C, Pa, kg water per kg dry air, J per kg dry air (dry air 0 at 0 °C, water from
 * liquid at 0 °C), m³ per kg dry air, fractions for rh and μ.
 *
 * IP figures are NOT computed with the chapter's I-P equations. They are the SI results converted
 * with exact factors (°F = °C × 1.8 + 32; 1 psi = 6894.757293168 Pa; 1 Btu/lb = 2326 J/kg with the
 * dry-air datum moved from 0 °C to 0 °F, i.e. 1.006 kJ/(kg·K) × 160/9 K ≈ 17.884 kJ/kg;
 * 1 ft³/lb = 0.062427960576 m³/kg; lb/lb = kg/kg). One formulation therefore serves both unit
 * systems and a state is the same physical state whichever units it is shown in. The I-P chapter
 * rounds its constants separately, so its published I-P figures can differ from ours by up to
 * about 0.2 % in humidity ratio; the tests say so beside each I-P check.
 *
 * Low-level functions throw {@link PsychroError} (with a stable code and a fix) on bad input;
 * {@link solveState} never throws for bad input and returns a typed problem instead.
 */
export * from './types';
export {
  satVapPres,
  dewPointFromVapPres,
  boilingPoint,
  TRIPLE_POINT_C,
  T_MIN_C,
  T_MAX_C,
} from './saturation';
export {
  humRatioFromVapPres,
  vapPresFromHumRatio,
  satHumRatio,
  relHumFromHumRatio,
  humRatioFromRelHum,
  degreeOfSaturation,
  enthalpy,
  dbFromEnthalpy,
  humRatioFromEnthalpy,
  specificVolume,
  density,
  stdAtmPressure,
  stdAtmTemperature,
  liquidWaterEnthalpy,
  iceEnthalpy,
  condensateEnthalpy,
  ELEV_MIN_M,
  ELEV_MAX_M,
} from './properties';
export {
  humRatioFromWetBulb,
  wetBulbFromHumRatio,
  dewPointFromHumRatio,
  iceWetBulbAlternative,
  WB_TOLERANCE_K,
} from './wetbulb';
export { stateFromDbW } from './state';
export { MoistAir, STATE_FIGURES, stateRecord, type MoistAirRecord } from './moistAir';
export { solveState, DEFINING_KEYS } from './solve';
export { fail as equipmentFailure, moistCp, type EquipmentOutcome, type EquipmentProblem } from './equipment';
export {
  sensibleToDb,
  sensibleByDt,
  sensibleByDuty,
  fanHeatPerKg,
  fanTemperatureRise,
  fanLeaving,
  type FanOptions,
} from './sensible';
export { coilFromAdp, apparatusDewPoint, type CoilResult } from './coil';
export {
  steamEnthalpy,
  steamToW,
  steamToRh,
  adiabaticByEffectiveness,
  adiabaticToDb,
  adiabaticToRh,
  adiabaticToW,
  saturationEffectiveness,
  DEFAULT_STEAM_PRESSURE_PA,
  type HumidifierResult,
} from './humidifier';
export { recoverBetween, type RecoveryStream, type RecoveryResult, type RecoveryWetting } from './recovery';
