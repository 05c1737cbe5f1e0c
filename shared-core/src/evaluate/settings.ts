/** Default evaluator settings and how partial settings are completed. */
import type { EvaluateSettings } from './types';

/** Standard sea-level pressure, Pa (ASHRAE HoF 2017 SI Ch.1 Table 1, Z = 0). */
export const STANDARD_PRESSURE_PA = 101_325;

/** The settings used when nothing else is given: SI, 101.325 kPa, claims checked. */
export const DEFAULT_SETTINGS: Readonly<EvaluateSettings> = Object.freeze({
  units: 'SI',
  pressurePa: STANDARD_PRESSURE_PA,
  pressureOrigin: 'default',
  checkClaims: true,
});

/** Completes partial settings with the defaults; an unusable pressure falls back to the default. */
export function resolveSettings(partial?: Partial<EvaluateSettings>): EvaluateSettings {
  const s: EvaluateSettings = { ...DEFAULT_SETTINGS, ...(partial ?? {}) };
  if (s.units !== 'SI' && s.units !== 'IP') s.units = 'SI';
  if (typeof s.pressurePa !== 'number' || !Number.isFinite(s.pressurePa) || s.pressurePa <= 0) {
    s.pressurePa = STANDARD_PRESSURE_PA;
    s.pressureOrigin = 'default';
  }
  if (typeof s.pressureOrigin !== 'string' || s.pressureOrigin === '') s.pressureOrigin = 'setting';
  s.checkClaims = s.checkClaims !== false;
  return s;
}
