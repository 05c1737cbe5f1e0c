/**
 * Public types of the moist-air engine. Everything is SI inside:
 * temperatures in °C, pressures in Pa, humidity ratio in kg water per kg dry air,
 * enthalpy in J per kg dry air (dry air 0 at 0 °C, water from liquid at 0 °C),
 * specific volume in m³ per kg dry air, density in kg moist air per m³,
 * relative humidity and degree of saturation as fractions (0…1).
 */
import type { CodeFrom } from '../vocabulary/codes';
import { partsOf, siText, type MessageParts, type MessageText } from './message';

/** Keys of the properties that can define a state (two of them fix it, with pressure). */
export type DefiningKey = 'db' | 'wb' | 'dp' | 'rh' | 'w' | 'h';

/** Stable error and warning codes of the engine: the registry's rows reported by the engine (`vocabulary/codes`). */
export type PhysicsCode = CodeFrom<'engine'>;

/** A typed failure of the engine: stable code, what is wrong, and what would fix it. */
export interface PhysicsProblem {
  code: PhysicsCode;
  /** What is wrong, in one sentence, with the offending figures. */
  message: string;
  /** What the engineer could change to make the input valid. */
  fix: string;
  /** The defining keys the problem is about (so a caller can point at the right token). */
  keys: DefiningKey[];
  /**
   * The message and fix as words and figures (see `./message`), when they carry figures: a caller
   * that shows them in another unit system renders these instead of the SI `message` and `fix`.
   */
  parts?: { message: MessageParts | string; fix: MessageParts | string };
}

/** A problem as the engine builds it: message and fix as SI text or as parts with figures. */
export interface ProblemInput {
  code: PhysicsCode;
  message: MessageText;
  fix: MessageText;
  keys: DefiningKey[];
}

/** A {@link PhysicsProblem} from its words and figures: SI text, and the parts when there are figures. */
export function makeProblem(input: ProblemInput): PhysicsProblem {
  const problem: PhysicsProblem = {
    code: input.code,
    message: siText(input.message),
    fix: siText(input.fix),
    keys: input.keys,
  };
  if (partsOf(input.message) || partsOf(input.fix)) problem.parts = { message: input.message, fix: input.fix };
  return problem;
}

/** Error thrown by the low-level property functions; carries a {@link PhysicsProblem}. */
export class PsychroError extends Error {
  readonly problem: PhysicsProblem;
  constructor(input: ProblemInput | PhysicsProblem) {
    const problem = 'parts' in input && input.parts ? (input as PhysicsProblem) : makeProblem(input);
    super(problem.message);
    this.name = 'PsychroError';
    this.problem = problem;
  }
  /** Stable code of the problem. */
  get code(): PhysicsCode {
    return this.problem.code;
  }
}

/** Every property of a moist-air state, SI (see module comment for the units). */
export interface MoistAirState {
  /** Total (barometric) pressure, Pa. */
  p: number;
  /** Dry-bulb temperature, °C. */
  db: number;
  /** Thermodynamic wet-bulb temperature, °C (over ice when below 0 °C, see `wbIce`). */
  wb: number;
  /**
   * Dew-point temperature, °C (frost point below the triple point, see `dpFrost`). −Infinity for
   * bone-dry air (W = 0); below −100 °C it is the ice equation extrapolated (the solver warns).
   */
  dp: number;
  /** Relative humidity, fraction 0…1. */
  rh: number;
  /** Humidity ratio, kg water / kg dry air. For a fog state: the total water, vapour plus suspended liquid. */
  w: number;
  /** Specific enthalpy, J / kg dry air. */
  h: number;
  /** Specific volume, m³ / kg dry air. */
  v: number;
  /** Moist-air density, kg / m³ ((1 + W) / v). */
  rho: number;
  /** Partial pressure of water vapour, Pa. */
  pw: number;
  /** Saturation vapour pressure at the dry-bulb, Pa. */
  pws: number;
  /**
   * Humidity ratio at saturation at the dry-bulb and pressure, kg/kg. +Infinity when the dry-bulb
   * is at or above the boiling point at p (the air cannot be saturated; the solver warns).
   */
  ws: number;
  /**
   * Degree of saturation, fraction (W / Ws). Not defined when Ws is infinite (a dry-bulb at or above
   * the boiling point): given as 0 there so that every field is a number; never show it as a figure.
   */
  mu: number;
  /** True when the wet-bulb is below 0 °C and so was computed over ice. */
  wbIce: boolean;
  /**
   * True when the dew point is a frost point (over ice): below the triple point, 0.01 °C, where the
   * saturation curve switches from the ice equation to the liquid-water one.
   */
  dpFrost: boolean;
  /** True when the state lies in the fog region (more water than saturated air can hold as vapour). */
  fog: boolean;
}

/** Options of the general state solver. */
export interface SolveOptions {
  /**
   * Accept a humidity ratio above saturation and return a fog state (flag `fog`, with a
   * `supersaturated` warning) instead of the `supersaturated` error. Default false.
   */
  allowFog?: boolean;
}

/** Result of the general state solver: a state (plus warnings) or a typed problem. */
export type SolveResult =
  | { ok: true; state: MoistAirState; warnings: PhysicsProblem[] }
  | { ok: false; problem: PhysicsProblem };
