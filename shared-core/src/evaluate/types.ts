/**
 * Results of evaluating a parsed note. Data, read and never changed in place (a state is the
 * compact `physics/moistAir.ts`; shared lists are frozen: `./shared.ts`), SI inside (see
 * physics/types.ts for the units); formatting for display happens in the service, the CLI and the
 * chart.
 */
import type { MoistAirState, DefiningKey } from '../physics/types';
import type { UnitSystem } from '../units/types';
import type { Span } from '../text/types';
import type {
  CoreDiagnostic,
  MixStatement,
  ParsedNote,
  ProcessStatement,
  PropertyNode,
  RecoverStatement,
  StateStatement,
  Statement,
  SupplyStatement,
} from '../notation/ast';

/** Settings that an editor or the CLI hands to the evaluator (the note's own directives win). */
export interface EvaluateSettings {
  /** Unit system for results when the note has no `units:` line. Default 'SI'. */
  units: UnitSystem;
  /** Default barometric pressure, Pa, when the note has no `site:` line. Default 101 325. */
  pressurePa: number;
  /** Where the default pressure came from, for hovers ("setting dewmark.pressure", "default"). */
  pressureOrigin: string;
  /** Whether written claims are compared. Default true. */
  checkClaims: boolean;
  /** A diagnostic code's severity changed, or `off` to drop it (the project file's `rules`). */
  rules?: Readonly<Record<string, RuleSetting>>;
}

/** What a project's `rules` may say about a diagnostic code. */
export type RuleSetting = 'error' | 'warning' | 'info' | 'off';

/** A diagnostic that an ignore comment in the note acknowledged (see `./suppressions`). */
export interface SuppressedDiagnostic extends CoreDiagnostic {
  /** The ignore comment that acknowledged it. */
  suppressedBy: Span;
  /** The comment's reason (after ` -- `), or empty. */
  justification: string;
}

/** Where the pressure used for a state came from. */
export interface PressureBasis {
  /** Pa. */
  pa: number;
  /** `site` (a `site:` line), `override` (the state's own p= or elev=), `setting` (editor/CLI default). */
  source: 'site' | 'override' | 'setting';
  /** The site line or override property that set it, when there is one. */
  span: Span | null;
  /** When set from an elevation: the elevation in m. */
  elevationM: number | null;
  /** A short human description: "site line 3: elev=1600m", "default 101.325 kPa". */
  describe: string;
  /**
   * Where it came from in words, without a figure (`site line 3: elev=1600m (standard
   * atmosphere)`, `default (no site: line)`): what hovers, the chart and the report show beside
   * the pressure, which they format in the note's units.
   */
  origin: string;
}

/** Keys a claim can be about (state properties plus process figures). */
export type ClaimKey = string;

/** One written property beyond the defining pair, compared with the computed value. */
export interface ClaimResult {
  key: ClaimKey;
  prop: PropertyNode;
  /** The written value, converted to SI. */
  writtenSI: number;
  /** The computed value, SI. */
  computedSI: number;
  /** Half-width of the accepted band, SI (from the written precision or the explicit ±). */
  toleranceSI: number;
  pass: boolean;
  /** The computed value formatted in the claim's own unit and precision (`17.1C`), for messages and quick fixes. */
  computedText: string;
}

/**
 * A state (from `state`), a mixed state (from `mix`), a supply state (from `supply`), or a state a
 * process or recovery defines.
 */
export interface StateResult {
  kind: 'state' | 'mix' | 'supply';
  name: string;
  statement: StateStatement | MixStatement | SupplyStatement | ProcessStatement | RecoverStatement;
  /** Null when the state could not be computed (its diagnostics say why). */
  state: MoistAirState | null;
  pressure: PressureBasis;
  /** The two defining keys actually used (for a mix: the w and h of the balance). */
  defining: DefiningKey[];
  claims: ClaimResult[];
  /** For a mix: the streams with their dry-air mass fraction (0…1) and mass flow if known. */
  streams?: { name: string; fraction: number; massFlowKgS: number | null }[];
  /**
   * For a mix: total dry-air mass flow, kg/s, when the streams were given as flows; for a supply:
   * its dry-air flow. For a state a process defines: the process's flow (null when it has none).
   */
  massFlowKgS?: number | null;
  /** For a supply: the room loads it absorbs and its flow. */
  supply?: SupplyFigures;
  /**
   * The properties taken from states above (`w=OA.w`, `db=OFF.db+0.8K`), in written order;
   * present only when the statement has references.
   */
  sources?: PropertySource[];
  /**
   * The statement that defines this state from another (a `supply` from its room state, a
   * process or heat recovery from its entering state), for hovers: "from RA via SA".
   */
  definedBy?: {
    statement: string;
    name: string;
    from: string;
    /** For a process or heat recovery: its specification as written (`adp=11C bf=0.1`). */
    spec?: string;
    /** For a process or heat recovery: the defined name as written after `->` (its definition). */
    nameSpan?: Span;
  };
}

/** What a `supply` carries (SI; loads positive = heat gained by the air in the room). */
export interface SupplyFigures {
  /** The room state it serves. */
  room: string;
  qSensibleW: number;
  qLatentW: number;
  /** Room sensible heat ratio Q_s / (Q_s + Q_l); null when undefined (total ~0, opposite signs). */
  shr: number | null;
  /** Volume flow at the supply state, m³/s (the dry-air flow is the result's massFlowKgS). */
  volumeFlowM3S: number;
  /** Which figure was given: the supply dry-bulb, the mass flow or the volume flow. */
  given: 'db' | 'm' | 'q';
}

/** A property of a state taken from another state's property: `w=OA.w`, `db=OFF.db+0.8K`. */
export interface PropertySource {
  /** The key it sets here. */
  key: string;
  /** The state it comes from, and that state's property. */
  from: string;
  fromKey: string;
  /** The difference added, SI (K, kg/kg, J/kg); 0 when none was written. */
  offsetSI: number;
  /** The value used, SI. */
  valueSI: number;
}

/** What the equipment of a process that defines its leaving state was, and what it found. */
export interface EquipmentResult {
  /**
   * `heater`, `fan`, `coil` (by ADP and bypass factor), `leaving` (by the leaving state's
   * properties), `steam`, `adiabatic`, `recovery`.
   */
  form: 'heater' | 'fan' | 'coil' | 'leaving' | 'steam' | 'adiabatic' | 'recovery';
  /** The specification as written. */
  spec: string;
  /** Fan: temperature rise, K. */
  fanRiseK?: number;
  /** Coil by ADP: true when the ADP is at or above the entering dew point (no water condenses). */
  dryCoil?: boolean;
  /** Adiabatic humidifier: saturation effectiveness (0…1). */
  saturationEffectiveness?: number | null;
  /** Steam humidifier: supply temperature, °C, and enthalpy, J/kg. */
  steamTempC?: number;
  steamEnthalpyJkg?: number;
  /** Heat recovery: effectivenesses, the other stream, and condensation or frost on this side. */
  effSensible?: number;
  effLatent?: number | null;
  wetting?: { kind: 'condensation' | 'frost'; surfaceC: number; dewPointC: number; accepted: boolean } | null;
}

/** The kind of process, named from the direction of temperature and moisture change. */
export type ProcessKind =
  | 'sensible-heating'
  | 'sensible-cooling'
  | 'cooling-dehumidifying'
  | 'heating-humidifying'
  | 'heating-dehumidifying'
  | 'cooling-humidifying' // incl. evaporative cooling when the enthalpy stays ~constant
  | 'evaporative-cooling'
  | 'humidifying'
  | 'dehumidifying'
  | 'no-change';

/** A `process` between two named states at one dry-air flow. */
export interface ProcessResult {
  kind: 'process';
  name: string;
  statement: ProcessStatement | RecoverStatement;
  from: string;
  to: string;
  processKind: ProcessKind | null;
  /** Dry-air mass flow, kg/s; null when no flow was given (then only per-kg figures are known). */
  massFlowKgS: number | null;
  /** Volume flow at the entering state, m³/s, when known. */
  volumeFlowM3S: number | null;
  /** Per kg dry air: total, sensible and latent enthalpy change, J/kg (positive = heat added). */
  dhTotal: number;
  dhSensible: number;
  dhLatent: number;
  /** Heat rates, W (positive = added to the air), null without a flow. */
  qTotalW: number | null;
  qSensibleW: number | null;
  qLatentW: number | null;
  /** Sensible heat ratio (sensible / total), null when the total is ~0. */
  shr: number | null;
  /** Humidity ratio change, kg/kg (positive = moisture added). */
  dw: number;
  /** Water added (positive) or removed as condensate (negative), kg/s; null without a flow. */
  waterKgS: number | null;
  /**
   * Heat rate at the coil or heater including the enthalpy of the water leaving as condensate or
   * entering as humidifier water, W (positive = heat added). Null without a flow.
   */
  qCoilW: number | null;
  claims: ClaimResult[];
  /**
   * For moisture removed: where the line from the entering through the leaving state meets the
   * saturation curve (apparatus dew point), °C; null when it does not or moisture is not removed.
   */
  apparatusDewPointC?: number | null;
  /**
   * True when the two states' humidity ratios differ by less than their written figures can
   * resolve (see `resolution.ts`): `dw`, the latent heat and the water are then 0 and the SHR 1.
   */
  moistureUnchanged?: boolean;
  /**
   * With the apparatus dew point: the bypass factor that puts
   * the leaving state on the coil line (contact factor 1 − bf).
   */
  bypassFactor?: number | null;
  /** For a process that defined its leaving state (or one side of a heat recovery): its equipment. */
  equipment?: EquipmentResult;
}

/** Result of one statement (site/units statements have no result of their own). */
export type EvaluatedItem = StateResult | ProcessResult;

/** Everything the evaluator knows about one note. */
export interface Analysis {
  parsed: ParsedNote;
  /** Unit system for display (a `units:` line wins over the settings). */
  units: UnitSystem;
  /** Where the unit system came from. */
  unitsSource: 'note' | 'setting';
  settings: EvaluateSettings;
  /** States, mixes and processes in document order. */
  items: EvaluatedItem[];
  /** Defined names → their item (first definition wins). */
  byName: Map<string, EvaluatedItem>;
  /** Every name reference (mix streams, process from/to) with the name it points to. */
  references: { name: string; span: Span; statement: Statement }[];
  /** Parse and evaluation diagnostics together, in document order (less those acknowledged by ignore comments). */
  diagnostics: CoreDiagnostic[];
  /** Diagnostics that ignore comments acknowledged, in document order; absent when there are none. */
  suppressed?: SuppressedDiagnostic[];
}
