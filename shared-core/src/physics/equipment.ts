/**
 * Shared types of the equipment models (heaters, fans, coils, humidifiers, heat recovery): each
 * model returns its leaving state(s) or a typed reason why the specification cannot be met.
 * Property functions may still throw {@link PsychroError} for a state outside the formulation's
 * range (callers catch it, as for any state).
 */
/** Why an equipment specification cannot be met, in the words of the engineer's input. */
export interface EquipmentProblem {
  /**
   * `unreachable`: the target lies where this kind of equipment cannot take the air (steam to a
   * lower humidity, an evaporative cooler below the wet-bulb…); `out-of-range`: a parameter outside
   * its meaning (an efficiency above 1, a bypass factor of 1 or more…).
   */
  code: 'unreachable' | 'out-of-range';
  /** What is wrong, with the figures. */
  message: string;
  /** What would fix it. */
  fix: string;
  /** The specification key the problem is about (`adp`, `bf`, `eff`, `rh`…). */
  key: string;
}

/** A model's outcome. */
export type EquipmentOutcome<T> = { ok: true; value: T } | { ok: false; problem: EquipmentProblem };

/** Shorthand for a failed outcome. */
export function fail<T>(
  code: EquipmentProblem['code'],
  key: string,
  message: string,
  fix: string,
): EquipmentOutcome<T> {
  return { ok: false, problem: { code, key, message, fix } };
}

/** Shorthand for a successful outcome. */
export function ok<T>(value: T): EquipmentOutcome<T> {
  return { ok: true, value };
}

/** Moist-air specific heat per kg of dry air at humidity ratio w, J/(kg·K): 1006 + 1860 W (ASHRAE HoF 2017 SI Ch.1 eq 32). */
export function moistCp(w: number): number {
  return 1006 + 1860 * w;
}

/** A temperature for messages: `12.3 °C`. */
export function tText(t: number): string {
  return `${Number(t.toFixed(2))} °C`;
}

/** A humidity ratio for messages: `5.65 g/kg`. */
export function wText(w: number): string {
  return `${Number((w * 1000).toPrecision(4))} g/kg`;
}

/** A fraction as a percentage for messages: `40.2 %`. */
export function pctText(x: number): string {
  return `${Number((x * 100).toPrecision(4))} %`;
}
