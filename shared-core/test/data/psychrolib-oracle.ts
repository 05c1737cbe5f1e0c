/**
 * Typed access to the test oracle, PsychroLib (npm `psychrolib`, a devDependency: tests and
 * benchmarks only, never shipped). PsychroLib keeps its unit system in module-global state, so
 * `si()` and `ip()` set it before handing the library out: call one of them before every use.
 */
import { createRequire } from 'node:module';

/** The part of PsychroLib's API the tests and benchmarks use (SI: °C, Pa; IP: °F, psia). */
export interface PsychroLib {
  SI: number;
  IP: number;
  SetUnitSystem(units: number): void;
  GetSatVapPres(t: number): number;
  GetSatHumRatio(t: number, p: number): number;
  GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
  GetHumRatioFromTWetBulb(db: number, wb: number, p: number): number;
  GetRelHumFromHumRatio(t: number, w: number, p: number): number;
  GetTWetBulbFromHumRatio(db: number, w: number, p: number): number;
  GetTDewPointFromHumRatio(db: number, w: number, p: number): number;
  GetVapPresFromHumRatio(w: number, p: number): number;
  GetMoistAirEnthalpy(t: number, w: number): number;
  GetMoistAirVolume(t: number, w: number, p: number): number;
  GetMoistAirDensity(t: number, w: number, p: number): number;
  GetDegreeOfSaturation(t: number, w: number, p: number): number;
  GetStandardAtmPressure(z: number): number;
  GetStandardAtmTemperature(z: number): number;
  /** [W, wb, dp, pw, h, v, mu] */
  CalcPsychrometricsFromRelHum(db: number, rh: number, p: number): number[];
  /** [W, dp, rh, pw, h, v, mu] */
  CalcPsychrometricsFromTWetBulb(db: number, wb: number, p: number): number[];
}

const require = createRequire(import.meta.url);
const lib = require('psychrolib') as PsychroLib;

/** PsychroLib set to SI (°C, Pa, kg/kg, J/kg, m³/kg). */
export function si(): PsychroLib {
  lib.SetUnitSystem(lib.SI);
  return lib;
}

/** PsychroLib set to IP (°F, psia, lb/lb, Btu/lb, ft³/lb). */
export function ip(): PsychroLib {
  lib.SetUnitSystem(lib.IP);
  return lib;
}
