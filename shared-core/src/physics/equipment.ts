/**
 * Shared types of the equipment models (heaters, fans, coils, humidifiers, heat recovery): each
 * model returns its leaving state(s) or a typed reason why the specification cannot be met.
 * Property functions may still throw {@link PsychroError} for a state outside the formulation's
 * range (callers catch it, as for any state).
 */
import {
  M,
  type MessageFigure,
  type MessageParts,
  type MessageText,
  P,
  partsOf,
  problemParts,
  RH,
  siText,
  T,
  W,
  withoutFinalStop,
} from './message';

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
  /** The message and fix as words and figures, when they carry figures (see `./message`). */
  parts?: { message: MessageParts | string; fix: MessageParts | string };
}

/** A model's outcome. */
export type EquipmentOutcome<T> = { ok: true; value: T } | { ok: false; problem: EquipmentProblem };

/** Shorthand for a failed outcome. */
export function fail<T>(
  code: EquipmentProblem['code'],
  key: string,
  message: MessageText,
  fix: MessageText,
): EquipmentOutcome<T> {
  const problem: EquipmentProblem = { code, key, message: siText(message), fix: siText(fix) };
  if (partsOf(message) || partsOf(fix)) problem.parts = { message, fix };
  return { ok: false, problem };
}

/**
 * The `unreachable` outcome of a model whose leaving state the solver refused: the solver's own
 * message (its final stop dropped, the model's words follow it) and fix, about `key`.
 */
export function unreachableState<T>(key: string, problem: Parameters<typeof problemParts>[0]): EquipmentOutcome<T> {
  const { message, fix } = problemParts(problem);
  return fail('unreachable', key, withoutFinalStop(message), fix);
}

/** Shorthand for a successful outcome. */
export function ok<T>(value: T): EquipmentOutcome<T> {
  return { ok: true, value };
}

/**
 * Moist-air specific heat per kg of dry air at humidity ratio
 * w, J/(kg·K): 1006 + 1860 W (ASHRAE HoF 2017 SI Ch.1 eq 32).
 */
export function moistCp(w: number): number {
  return 1006 + 1860 * w;
}

/** A temperature in a message (`12.3 °C` in SI). */
export function tText(t: number): MessageFigure {
  return T(t);
}

/** A humidity ratio in a message (`5.65 g/kg` in SI). */
export function wText(w: number): MessageFigure {
  return W(w);
}

/** A fraction as a percentage in a message (`40.2 %`). */
export function pctText(x: number): MessageFigure {
  return RH(x);
}

/** A dry-air mass flow in a message (`1.2 kg/s` in SI). */
export function flowText(kgs: number): MessageFigure {
  return M(kgs);
}

/** A pressure in a message (`750 Pa` in SI). */
export function pressureText(pa: number): MessageFigure {
  return P(pa);
}
