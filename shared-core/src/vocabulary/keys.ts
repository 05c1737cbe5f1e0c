/**
 * The one table of the notation's keys: every key that may be written after a statement
 * (`db=`, `p=`, `q_total=`…) and every computed property that is shown without being written
 * (`rho`, `pw`, `mu`). Each row says what the key is, where it may be written, what it measures,
 * how a bare number reads, an example, its field in `dewmark eval --format json`, where hovers
 * and inline hints show it, and whether it defines a state (and so may be taken from another state,
 * shifted by which differences). The evaluator's per-statement key sets, the parser's examples, hovers,
 * hints, completion, the CLI's JSON and the editor setting's list all read this table.
 *
 * Adding a key is adding one row here (and the code that computes or reads its figure).
 *
 * Pure data: the parser imports it for the text of its messages only (examples, the key a reference
 * names, a difference) and still reads no unit; the
 * dimension names are the units module's type, nothing more.
 */
import type { Dimension } from '../units/types';

/** How a number written without a unit is read for a key. */
export type BareRule =
  /** A bare number is an error (`missing-unit`). */
  | 'error'
  /** A bare number is already in the SI base of the dimension (w in kg/kg, shr as a fraction). */
  | 'si';

/** The statements a key may be written in. */
export type KeyStatement = 'state' | 'mix' | 'site' | 'process' | 'supply';

/**
 * What a key is:
 * - `property`: a property of moist air (defines a state, or is a claim about it);
 * - `pressure`: sets the pressure of a state or of the statements after `site:`;
 * - `flow`: the dry-air flow of a process;
 * - `process-claim`: a claim about a process's results;
 * - `process-spec`: the specification of equipment with which a process (or `recover`) defines its
 *   leaving state (`heat=`, `adp=`, `eff_s=`…);
 * - `computed`: shown in hovers, hints or the JSON, never written.
 */
export type KeyKind = 'property' | 'pressure' | 'flow' | 'process-claim' | 'process-spec' | 'computed';

/** One row of the key table. */
export interface KeySpec {
  key: string;
  kind: KeyKind;
  /** The statements it may be written in (none for a computed property). */
  in: readonly KeyStatement[];
  /** What it measures: the units it accepts are the units of this dimension. */
  dimension: Dimension;
  /** How a bare number reads (always `error` for a computed property). */
  bare: BareRule;
  /** What it is, in a few words, for messages and completion (`dry-bulb temperature`). */
  title: string;
  /** One line on what it means, for a hover on the key. */
  description: string;
  /**
   * Examples, each `key=value` that the notation accepts (every
   * one is checked by a test); empty for a computed property.
   */
  examples: readonly string[];
  /** The examples in one phrase for messages: `db=24C or db=75F`. */
  example: string;
  /** The label of its row in a state's hover table (rows in table order); absent when the hover has no row for it. */
  row?: string;
  /** The inline hints may show it (setting `dewmark.inlayHints.properties`): the setting's description of it. */
  hint?: string;
  /**
   * Its field in the JSON of `dewmark eval`: the name and the conversion from the SI base (times
   * `times`, over `over`; 1 when absent). The CLI decides the digits.
   */
  json?: { name: string; times?: number; over?: number };
  /** Another name for the key `aliasOf`, read exactly as it is (`flow=` and `V=` for `q=`). */
  aliasOf?: string;
  /**
   * It can be one of the two properties that define a state, and so it is also what a reference
   * may set and name (`db=OFF.db`): only defining properties are taken from another state.
   */
  defining?: true;
  /**
   * Differences a reference to it may be shifted by, each as written after the + or − sign
   * (`db=OFF.db+0.8K`); absent when a reference to it cannot be shifted.
   */
  differences?: readonly string[];
}

/** `a`, `a or b`, `a, b or c`. */
function alternatives(list: readonly string[]): string {
  if (list.length <= 1) return list[0] ?? '';
  return `${list.slice(0, -1).join(', ')} or ${list[list.length - 1]}`;
}

/** The loads of a supply are the same figures as a process's heat rates (gains of the air). */
const PROCESS_AND_SUPPLY = ['process', 'supply'] as const;
/** Leaving-state properties may also be written on a process that defines its leaving state. */
const STATE_MIX_PROCESS = ['state', 'mix', 'supply', 'process'] as const;

/**
 * Every key, in the order of completion lists, hover rows and hint keys. One row per key; the
 * `examples` phrase is filled in from the list.
 */
const ROWS = [
  // --- properties of moist air (state lines; claims after a mix) ---
  {
    key: 'db',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'temperature',
    bare: 'error',
    title: 'dry-bulb temperature',
    description: 'dry-bulb temperature',
    examples: ['db=24C', 'db=75F'],
    row: 'dry-bulb',
    hint: 'dry-bulb temperature',
    json: { name: 'db_C' },
    defining: true,
    differences: ['0.8K', '1.5F'],
  },
  {
    key: 'wb',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'temperature',
    bare: 'error',
    title: 'wet-bulb temperature',
    description: 'thermodynamic wet-bulb temperature (over ice below 0 °C)',
    examples: ['wb=24C', 'wb=75F'],
    row: 'wet-bulb',
    hint: 'thermodynamic wet-bulb temperature',
    json: { name: 'wb_C' },
    defining: true,
    differences: ['0.8K', '1.5F'],
  },
  {
    key: 'dp',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'temperature',
    bare: 'error',
    title: 'dew-point temperature',
    description: 'dew-point temperature (frost point below 0 °C)',
    examples: ['dp=24C', 'dp=75F'],
    row: 'dew point',
    hint: 'dew-point temperature',
    json: { name: 'dp_C' },
    defining: true,
    differences: ['0.8K', '1.5F'],
  },
  {
    key: 'rh',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'fraction',
    bare: 'error',
    title: 'relative humidity',
    description: 'relative humidity, in % (a bare number is an error: 50 or 0.5 would be ambiguous)',
    examples: ['rh=50%'],
    row: 'relative humidity',
    hint: 'relative humidity',
    json: { name: 'rh_pct', times: 100 },
    defining: true,
  },
  {
    key: 'w',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'humidityRatio',
    bare: 'si',
    title: 'humidity ratio',
    description: 'humidity ratio: mass of water vapour per mass of dry air (a bare number is kg/kg)',
    examples: ['w=9.3g/kg', 'w=0.0093'],
    row: 'humidity ratio',
    hint: 'humidity ratio',
    json: { name: 'w_kgkg' },
    defining: true,
    differences: ['0.5g/kg'],
  },
  {
    key: 'h',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'enthalpy',
    bare: 'error',
    title: 'specific enthalpy',
    description: 'specific enthalpy per mass of dry air (SI datum dry air 0 at 0 °C; IP datum 0 °F)',
    examples: ['h=47.8kJ/kg', 'h=20.5Btu/lb'],
    row: 'enthalpy',
    hint: 'specific enthalpy per mass of dry air',
    json: { name: 'h_kJkg', over: 1000 },
    defining: true,
    differences: ['2kJ/kg'],
  },
  {
    key: 'v',
    kind: 'property',
    in: STATE_MIX_PROCESS,
    dimension: 'specificVolume',
    bare: 'error',
    title: 'specific volume',
    description: 'specific volume per mass of dry air (a claim only; it does not define a state)',
    examples: ['v=0.854m3/kg', 'v=13.7ft3/lb'],
    row: 'specific volume',
    hint: 'specific volume per mass of dry air',
    json: { name: 'v_m3kg' },
  },
  // --- computed only (shown, never written) ---
  {
    key: 'rho',
    kind: 'computed',
    in: [],
    dimension: 'density',
    bare: 'error',
    title: 'density of the moist air',
    description: 'density of the moist air, (1 + W) / v',
    examples: [],
    row: 'density (moist air)',
    hint: 'density of the moist air',
    json: { name: 'rho_kgm3' },
  },
  {
    key: 'pw',
    kind: 'computed',
    in: [],
    dimension: 'pressure',
    bare: 'error',
    title: 'partial pressure of water vapour',
    description: 'partial pressure of the water vapour in the air',
    examples: [],
    row: 'vapour pressure',
  },
  {
    key: 'mu',
    kind: 'computed',
    in: [],
    dimension: 'fraction',
    bare: 'error',
    title: 'degree of saturation',
    description: 'degree of saturation: W divided by W at saturation at the same dry-bulb and pressure',
    examples: [],
    row: 'degree of saturation',
  },
  // --- pressure (site lines and state lines) ---
  {
    key: 'p',
    kind: 'pressure',
    in: ['state', 'site'],
    dimension: 'pressure',
    bare: 'error',
    title: 'pressure',
    description: 'barometric (absolute) pressure',
    examples: ['p=84kPa', 'p=12.2psia'],
    json: { name: 'p_kPa', over: 1000 },
  },
  {
    key: 'elev',
    kind: 'pressure',
    in: ['state', 'site'],
    dimension: 'length',
    bare: 'error',
    title: 'elevation',
    description: 'site elevation; the pressure follows from the standard atmosphere',
    examples: ['elev=1600m', 'elev=5250ft'],
  },
  // --- processes: the flow, and claims about the results ---
  {
    key: 'm',
    kind: 'flow',
    in: PROCESS_AND_SUPPLY,
    dimension: 'massFlow',
    bare: 'error',
    title: 'dry-air mass flow',
    description: 'dry-air mass flow through the process',
    examples: ['m=5.6kg/s', 'm=44000lb/h'],
    json: { name: 'm_kgs' },
  },
  {
    key: 'q',
    kind: 'flow',
    in: PROCESS_AND_SUPPLY,
    dimension: 'volumeFlow',
    bare: 'error',
    title: 'volume flow at the entering state',
    description: 'volume flow of air at the entering state (of a supply: at the supply state)',
    examples: ['q=4.8m3/s', 'q=4800L/s', 'q=10000cfm'],
    json: { name: 'v_m3s' },
  },
  // Names for the volume flow that cannot be read as a heat rate (q_total, q_sensible…): q= stays.
  {
    key: 'flow',
    kind: 'flow',
    in: PROCESS_AND_SUPPLY,
    dimension: 'volumeFlow',
    bare: 'error',
    aliasOf: 'q',
    title: 'volume flow at the entering state (same as q=)',
    description: 'volume flow of air at the entering state (of a supply: at the supply state); another name for q=',
    examples: ['flow=4.8m3/s', 'flow=8,745cfm'],
  },
  {
    key: 'V',
    kind: 'flow',
    in: PROCESS_AND_SUPPLY,
    dimension: 'volumeFlow',
    bare: 'error',
    aliasOf: 'q',
    title: 'volume flow at the entering state (same as q=)',
    description: 'volume flow of air at the entering state (of a supply: at the supply state); another name for q=',
    examples: ['V=4.8m3/s', 'V=10000cfm'],
  },
  {
    key: 'total',
    kind: 'flow',
    in: ['mix'],
    dimension: 'massFlow',
    bare: 'error',
    title: 'total flow of the mix',
    description:
      'the flow the streams add up to: a dry-air mass flow, or a volume flow ' +
      '(each stream at its own state); one stream may then be written as rest',
    examples: ['total=3.9kg/s', 'total=31000lb/h'],
  },
  {
    key: 'q_total',
    kind: 'process-claim',
    in: ['process'],
    dimension: 'power',
    bare: 'error',
    title: 'total heat rate',
    description: 'claim: total heat rate of the process',
    examples: ['q_total=98kW', 'q_total=334,000Btu/h'],
    json: { name: 'q_total_kW', over: 1000 },
  },
  {
    key: 'q_sensible',
    kind: 'process-claim',
    in: PROCESS_AND_SUPPLY,
    dimension: 'power',
    bare: 'error',
    title: 'sensible heat rate',
    description: 'claim: sensible heat rate',
    examples: ['q_sensible=72kW', 'q_sensible=246,000Btu/h'],
    json: { name: 'q_sensible_kW', over: 1000 },
  },
  {
    key: 'q_latent',
    kind: 'process-claim',
    in: PROCESS_AND_SUPPLY,
    dimension: 'power',
    bare: 'error',
    title: 'latent heat rate',
    description: 'claim: latent heat rate',
    examples: ['q_latent=26kW', 'q_latent=88,700Btu/h'],
    json: { name: 'q_latent_kW', over: 1000 },
  },
  {
    key: 'q_coil',
    kind: 'process-claim',
    in: ['process'],
    dimension: 'power',
    bare: 'error',
    title: 'coil or heater duty (including the water)',
    description: 'claim: coil or heater duty, including the enthalpy of the water leaving or entering',
    examples: ['q_coil=97kW', 'q_coil=331,000Btu/h'],
    json: { name: 'q_coil_kW', over: 1000 },
  },
  {
    key: 'shr',
    kind: 'process-claim',
    in: PROCESS_AND_SUPPLY,
    dimension: 'fraction',
    bare: 'si',
    title: 'sensible heat ratio',
    description: 'claim: sensible heat ratio (sensible / total); a bare number is a fraction',
    examples: ['shr=0.73'],
    json: { name: 'shr' },
  },
  {
    key: 'water',
    kind: 'process-claim',
    in: ['process'],
    dimension: 'massFlow',
    bare: 'error',
    title: 'water added or condensate removed',
    description: 'claim: water added (humidifier) or removed (condensate), as a mass flow',
    examples: ['water=38kg/h', 'water=84lb/h'],
    json: { name: 'water_kgh', times: 3600 },
  },
  // --- equipment of a process that defines its leaving state (see evaluate/derive.ts), and of recover ---
  {
    key: 'heat',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'power',
    bare: 'error',
    title: 'heat added by a sensible heater',
    description: 'heat added to the air by a sensible heater (negative: removed); needs the flow',
    examples: ['heat=20kW', 'heat=68,200Btu/h'],
  },
  {
    key: 'dt',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'temperature',
    bare: 'error',
    title: 'temperature rise of a sensible heater',
    description: 'temperature rise of a sensible heater, a difference (K, °C or °F)',
    examples: ['dt=5K', 'dt=9F'],
  },
  {
    key: 'dp_fan',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'pressure',
    bare: 'error',
    title: 'fan total pressure rise',
    description: 'total pressure rise of a fan (with eff=)',
    examples: ['dp_fan=750Pa', 'dp_fan=3inH2O'],
  },
  {
    key: 'eff',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'fraction',
    bare: 'si',
    title: 'fan efficiency or saturation effectiveness',
    description:
      'total efficiency of a fan (electrical input to air power), ' +
      'or the saturation effectiveness of an adiabatic humidifier',
    examples: ['eff=0.62', 'eff=62%'],
  },
  {
    key: 'eff_motor',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'fraction',
    bare: 'si',
    title: 'motor efficiency (motor outside the airstream)',
    description: 'motor efficiency of a fan whose motor is outside the airstream (only the shaft power heats the air)',
    examples: ['eff_motor=0.92'],
  },
  {
    key: 'adp',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'temperature',
    bare: 'error',
    title: 'apparatus dew point',
    description: 'apparatus dew point of a cooling coil (with bf=)',
    examples: ['adp=11C', 'adp=52F'],
  },
  {
    key: 'bf',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'fraction',
    bare: 'si',
    title: 'bypass factor',
    description: 'bypass factor of a cooling coil; the contact factor is 1 − bf',
    examples: ['bf=0.1'],
  },
  {
    key: 'p_steam',
    kind: 'process-spec',
    in: ['process'],
    dimension: 'pressure',
    bare: 'error',
    title: 'steam supply pressure',
    description: 'absolute pressure of the saturated steam supply of a steam humidifier (default 101.325 kPa, 100 °C)',
    examples: ['p_steam=200kPa', 'p_steam=29psia'],
  },
  {
    key: 'eff_s',
    kind: 'process-spec',
    in: [],
    dimension: 'fraction',
    bare: 'si',
    title: 'sensible effectiveness',
    description: 'sensible effectiveness of a heat recovery, on the smaller capacity rate (recover lines)',
    examples: ['eff_s=0.70'],
  },
  {
    key: 'eff_l',
    kind: 'process-spec',
    in: [],
    dimension: 'fraction',
    bare: 'si',
    title: 'latent effectiveness',
    description: 'latent effectiveness of a heat recovery, on the smaller dry-air flow (recover lines)',
    examples: ['eff_l=0.60'],
  },
] as const satisfies readonly Omit<KeySpec, 'example'>[];

type Row = (typeof ROWS)[number];

/** Every key of the table. */
export type KeyName = Row['key'];

/** A property that the inline hints may show after a state or mix. */
export type HintKey = Extract<Row, { hint: string }>['key'];

/** A computed property with a row in the state hover (its figure is the state's field of that name). */
export type RowKey = Extract<Row, { row: string }>['key'];

/** A key with a field in the JSON of `dewmark eval`. */
export type JsonKey = Extract<Row, { json: object }>['key'];

/** Every key, in table order. */
export const KEYS: readonly KeySpec[] = ROWS.map((r) => Object.freeze({ ...r, example: alternatives(r.examples) }));

const byKey = new Map<string, KeySpec>(KEYS.map((k) => [k.key, k]));

/** The row of a key (typed: a key the table lacks is a compile error). */
export function keySpec(key: KeyName): KeySpec {
  return byKey.get(key)!;
}

/** The row of a written key, or undefined when the table has no such key. */
export function findKey(key: string): KeySpec | undefined {
  return byKey.get(key);
}

/** The keys a statement takes, by key, in table order. */
export function keysOf(statement: KeyStatement): Readonly<Record<string, KeySpec>> {
  const out: Record<string, KeySpec> = {};
  for (const k of KEYS) if (k.in.includes(statement)) out[k.key] = k;
  return Object.freeze(out);
}

/** Every key the inline hints accept, in the order they are shown. */
export const HINT_KEYS: readonly HintKey[] = KEYS.filter((k) => k.hint !== undefined).map((k) => k.key as HintKey);

/** The rows of a state's hover table, in order. */
export const ROW_KEYS: readonly RowKey[] = KEYS.filter((k) => k.row !== undefined).map((k) => k.key as RowKey);

/** The first example of a key (`db=24C`), for short messages; a neutral one for a key the table lacks. */
export function firstExample(key: string): string {
  return byKey.get(key)?.examples[0] ?? 'db=24C';
}

/** The key a reference written after `key=` most likely names: the key itself when it is defining, else `db`. */
export function referenceKeyFor(key: string): string {
  return byKey.get(key)?.defining ? key : 'db';
}

/**
 * The first difference a reference to `key` may be shifted by (`0.8K`, `0.5g/kg`), for messages;
 * the dry-bulb's for a key whose references take no difference or that the table lacks.
 */
export function differenceExample(key: string): string {
  return byKey.get(key)?.differences?.[0] ?? byKey.get('db')!.differences![0]!;
}

/** A figure in the unit of a key's JSON field (`h` in kJ/kg, `rh` in %); null for a missing or non-finite figure. */
export function jsonFigure(key: JsonKey, si: number | null | undefined): number | null {
  return jsonFigureOf(key)(si);
}

/**
 * A key's JSON field as data: its name, and the factors of its unit, from the key's row (1 when
 * the row gives none): its figure is {@link jsonFigureIn}.
 */
export interface JsonField {
  readonly name: string;
  readonly times: number;
  readonly over: number;
}

/** The fields of {@link jsonField}, by key (made as asked). */
const fieldOf = new Map<JsonKey, JsonField>();

/** A key's JSON field (its row looked up once). */
export function jsonField(key: JsonKey): JsonField {
  let f = fieldOf.get(key);
  if (f === undefined) {
    const json: NonNullable<KeySpec['json']> = keySpec(key).json!;
    f = Object.freeze({ name: json.name, times: json.times ?? 1, over: json.over ?? 1 });
    fieldOf.set(key, f);
  }
  return f;
}

/**
 * A figure in the unit of a JSON field, from the SI base: (si × times) / over — the one home of
 * that conversion (NaN and ±Infinity stay so). Small, so that a writer of many figures that keeps
 * them in a Float64Array has it inlined: no call and no boxed double per figure.
 */
export function jsonFigureIn(field: JsonField, si: number): number {
  return (si * field.times) / field.over;
}

/** The converters of {@link jsonFigureOf}, by key (made as asked). */
const figureOf = new Map<JsonKey, (si: number | null | undefined) => number | null>();

/**
 * {@link jsonFigure} of one key, its row looked up once: the key's figures in the unit of its JSON
 * field, for writing the key's figure of many states.
 */
export function jsonFigureOf(key: JsonKey): (si: number | null | undefined) => number | null {
  let f = figureOf.get(key);
  if (f === undefined) {
    const field = jsonField(key);
    f = (si) => (si === null || si === undefined || !Number.isFinite(si) ? null : jsonFigureIn(field, si));
    figureOf.set(key, f);
  }
  return f;
}

/** The JSON field name of a key. */
export function jsonName(key: JsonKey): string {
  return jsonField(key).name;
}
