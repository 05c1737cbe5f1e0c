/**
 * Units of the air-state notation: the unit table, exact conversions to one SI base per dimension
 * (see `./types` for the bases), display units per unit system, engineering-precision formatting,
 * and "did you mean" suggestions for unknown symbols.
 *
 * Conversion functions are pure arithmetic: callers pass finite numbers (the parser never hands
 * over anything else). Formatting functions accept any number and print a placeholder (`—`) for a
 * non-finite one, so no "NaN" or "Infinity" ever reaches a user.
 *
 * Exact definitions used (NIST SP 811 (2008) Appendix B): lb = 0.45359237 kg, ft = 0.3048 m,
 * in = 0.0254 m, standard gravity 9.80665 m/s², Btu_IT = 1055.05585262 J (so Btu_IT/lb = 2326 J/kg
 * exactly), grain = 1/7000 lb, atm = 101 325 Pa, bar = 100 000 Pa, L = 0.001 m³,
 * conventional inch of mercury = 3386.389 Pa.
 */
import type { Dimension, UnitDef, UnitSystem } from './types';
import { nearest } from '../text/suggest';
import { groupDigits } from '../text/thousands';

export type { Dimension, UnitDef, UnitSystem } from './types';

// ---------------------------------------------------------------------------------------------
// Exact base quantities
// ---------------------------------------------------------------------------------------------

const LB_KG = 0.45359237;
const FT_M = 0.3048;
const IN_M = 0.0254;
const GRAVITY = 9.80665;
const BTU_J = 1055.05585262;
/** Pound-force per square inch in Pa: lb·g_n / in² = 6894.757293168… */
const PSI_PA = (LB_KG * GRAVITY) / (IN_M * IN_M);
const FT3_M3 = FT_M * FT_M * FT_M;
/** Btu_IT per pound in J/kg (exactly 2326; written as the quotient of the two definitions). */
const BTU_PER_LB_J_PER_KG = BTU_J / LB_KG;
const BTU_PER_H_W = BTU_J / 3600;

/**
 * Specific heat of dry air used by the SI enthalpy equation (ASHRAE HoF Ch.1: h_da = 1.006 t,
 * kJ/kg with t in °C), J/(kg·K).
 */
const CP_DRY_AIR_SI = 1006;

/*
 * Enthalpy in Btu/lb: the datum moves as well as the unit.
 *
 * The moist-air convention puts dry air at h = 0 at 0 °C in SI and at 0 °F in I-P; water vapour is
 * counted from liquid water at 0 °C (= 32 °F) in both, so only the dry-air part differs. In the SI
 * datum, dry air at 0 °F (−160/9 °C) has h = 1006 · (−160/9) J/kg ≈ −17 884 J/kg. An I-P figure x
 * Btu/lb is therefore, in the engine's SI datum,
 *
 *     si_J_per_kg = x · 2326 − 1006 · 160/9
 *
 * i.e. scale 2326 J/kg per Btu/lb and offset −17 884.4 J/kg. Example: air at 24 °C / 50 % at sea
 * level has h ≈ 47.81 kJ/kg (0 °C datum); in Btu/lb that is (47 810 + 17 884)/2326 ≈ 28.2 Btu/lb
 * (0 °F datum). Dividing by 2.326 alone would give 20.6 Btu/lb, a figure on neither datum and
 * about 7.7 Btu/lb below what an I-P chart shows. Differences of enthalpy (process Δh, tolerances)
 * convert with the scale alone, so the datum cancels as it should.
 *
 * The I-P chapter's own equation uses 0.240 Btu/(lb·°F) (≈ 1004.8 J/(kg·K)) for dry air, so an
 * enthalpy computed natively in I-P can differ from this exact conversion by a few hundredths of a
 * Btu/lb; the engine computes in SI and converts.
 */
const BTU_PER_LB_OFFSET_J_PER_KG = (-CP_DRY_AIR_SI * 160) / 9;

// ---------------------------------------------------------------------------------------------
// The unit table
// ---------------------------------------------------------------------------------------------

/** How a unit's value is rounded for display by default. */
type Precision = { kind: 'fixed'; decimals: number } | { kind: 'sig'; figures: number; maxDecimals: number };

interface UnitSpec extends UnitDef {
  /** Symbol for display text (`°C`, `m³/kg`); the notation symbol when absent. */
  display?: string;
  precision: Precision;
  /** Extra hover line (how it converts), when the generic "1 X = f Y" line would mislead. */
  note?: string;
}

const fixed = (decimals: number): Precision => ({ kind: 'fixed', decimals });
const sig3 = (maxDecimals: number): Precision => ({ kind: 'sig', figures: 3, maxDecimals });

function u(
  symbol: string,
  aliases: readonly string[],
  dimension: Dimension,
  system: UnitSystem | 'both',
  title: string,
  scale: number,
  offset: number,
  precision: Precision,
  extra: { display?: string; note?: string } = {},
): UnitSpec {
  return Object.freeze({
    symbol,
    aliases: Object.freeze([...aliases]),
    dimension,
    system,
    title,
    scale,
    offset,
    precision,
    ...extra,
  });
}

/*
 * Table order matters: within a dimension, units are listed commonest first (SI, then IP). It is
 * the order of completion lists and breaks ties between equally close suggestions.
 */
const SPECS: readonly UnitSpec[] = Object.freeze([
  // temperature (SI base °C)
  u('C', ['°C'], 'temperature', 'SI', 'degree Celsius', 1, 0, fixed(1), { display: '°C' }),
  u('F', ['°F'], 'temperature', 'IP', 'degree Fahrenheit', 5 / 9, -160 / 9, fixed(1), {
    display: '°F',
    note: '°C = (°F − 32) × 5/9; a difference of 1 °F is 5/9 K',
  }),
  u('K', [], 'temperature', 'SI', 'kelvin (absolute temperature)', 1, -273.15, fixed(1), { note: '°C = K − 273.15' }),
  u('R', ['°R'], 'temperature', 'IP', 'degree Rankine (absolute temperature)', 5 / 9, -273.15, fixed(1), {
    display: '°R',
    note: '°C = °R × 5/9 − 273.15 (0 °R is absolute zero)',
  }),

  // pressure (SI base Pa)
  u('kPa', [], 'pressure', 'SI', 'kilopascal', 1000, 0, fixed(3)),
  u('Pa', [], 'pressure', 'SI', 'pascal', 1, 0, fixed(0)),
  u('hPa', [], 'pressure', 'SI', 'hectopascal (= 1 mbar)', 100, 0, fixed(1)),
  u('mbar', [], 'pressure', 'SI', 'millibar (= 1 hPa)', 100, 0, fixed(1)),
  u('bar', [], 'pressure', 'SI', 'bar (= 100 kPa)', 1e5, 0, fixed(5)),
  u('atm', [], 'pressure', 'both', 'standard atmosphere (= 101.325 kPa)', 101325, 0, fixed(5)),
  u('psia', [], 'pressure', 'IP', 'pound-force per square inch, absolute', PSI_PA, 0, fixed(3)),
  u(
    'psi',
    [],
    'pressure',
    'IP',
    'pound-force per square inch, taken as absolute (the same as psia; gauge pressure is not accepted)',
    PSI_PA,
    0,
    fixed(3),
  ),
  u('inHg', [], 'pressure', 'IP', 'inch of mercury, conventional (3386.389 Pa)', 3386.389, 0, fixed(2)),
  // Fan and duct pressures in IP are written in inches of water gauge ("in. w.c."): the
  // conventional inch of water is 1000 kg/m³ × gn × 0.0254 m = 249.08891 Pa.
  u('inH2O', ['inwc'], 'pressure', 'IP', 'inch of water, conventional (249.0889 Pa)', 249.08891, 0, fixed(2)),

  // humidity ratio (SI base kg/kg)
  u('g/kg', [], 'humidityRatio', 'SI', 'gram of water per kilogram of dry air', 1e-3, 0, fixed(2)),
  u('kg/kg', [], 'humidityRatio', 'SI', 'kilogram of water per kilogram of dry air', 1, 0, fixed(5)),
  u('gr/lb', [], 'humidityRatio', 'IP', 'grain of water per pound of dry air (7000 gr = 1 lb)', 1 / 7000, 0, fixed(1)),
  u('lb/lb', [], 'humidityRatio', 'IP', 'pound of water per pound of dry air', 1, 0, fixed(5)),

  // enthalpy (SI base J/kg, dry air 0 at 0 °C)
  u('kJ/kg', [], 'enthalpy', 'SI', 'kilojoule per kilogram of dry air (datum: dry air 0 at 0 °C)', 1000, 0, fixed(2)),
  u('J/kg', [], 'enthalpy', 'SI', 'joule per kilogram of dry air (datum: dry air 0 at 0 °C)', 1, 0, fixed(0)),
  u(
    'Btu/lb',
    [],
    'enthalpy',
    'IP',
    'Btu per pound of dry air (datum: dry air 0 at 0 °F)',
    BTU_PER_LB_J_PER_KG,
    BTU_PER_LB_OFFSET_J_PER_KG,
    fixed(2),
    {
      note:
        'kJ/kg = Btu/lb × 2.326 − 17.884: the dry-air datum moves from 0 °F ' +
        'to 0 °C as well as the unit (a difference converts by × 2.326 alone)',
    },
  ),

  // specific volume (SI base m³/kg dry air)
  u('m3/kg', ['m³/kg'], 'specificVolume', 'SI', 'cubic metre per kilogram of dry air', 1, 0, fixed(4), {
    display: 'm³/kg',
  }),
  u('ft3/lb', ['ft³/lb'], 'specificVolume', 'IP', 'cubic foot per pound of dry air', FT3_M3 / LB_KG, 0, fixed(2), {
    display: 'ft³/lb',
  }),

  // length (SI base m)
  u('m', [], 'length', 'SI', 'metre', 1, 0, fixed(0)),
  u('ft', [], 'length', 'IP', 'foot', FT_M, 0, fixed(0)),

  // mass flow (SI base kg/s)
  u('kg/s', [], 'massFlow', 'SI', 'kilogram per second', 1, 0, sig3(5)),
  u('kg/h', [], 'massFlow', 'SI', 'kilogram per hour', 1 / 3600, 0, sig3(2)),
  u('lb/h', ['lb/hr'], 'massFlow', 'IP', 'pound per hour', LB_KG / 3600, 0, sig3(1)),
  u('lb/min', [], 'massFlow', 'IP', 'pound per minute', LB_KG / 60, 0, sig3(2)),

  // volume flow (SI base m³/s)
  u('m3/s', ['m³/s'], 'volumeFlow', 'SI', 'cubic metre per second', 1, 0, sig3(5), { display: 'm³/s' }),
  u('L/s', ['l/s'], 'volumeFlow', 'SI', 'litre per second', 1e-3, 0, sig3(1)),
  u('m3/h', ['m³/h'], 'volumeFlow', 'SI', 'cubic metre per hour', 1 / 3600, 0, sig3(1), { display: 'm³/h' }),
  u('cfm', ['ft3/min', 'ft³/min'], 'volumeFlow', 'IP', 'cubic foot per minute', FT3_M3 / 60, 0, sig3(0)),

  // power / heat rate (SI base W)
  u('kW', [], 'power', 'SI', 'kilowatt', 1000, 0, sig3(1)),
  u('W', [], 'power', 'SI', 'watt', 1, 0, sig3(0)),
  u('MW', [], 'power', 'SI', 'megawatt', 1e6, 0, sig3(4)),
  u('Btu/h', ['Btu/hr'], 'power', 'IP', 'Btu (IT) per hour', BTU_PER_H_W, 0, sig3(0)),
  u('MBH', ['kBtu/h'], 'power', 'IP', 'thousand Btu per hour (M = 1000, not mega)', 1000 * BTU_PER_H_W, 0, sig3(2)),
  u('ton', ['TR'], 'power', 'IP', 'ton of refrigeration (12 000 Btu/h)', 12000 * BTU_PER_H_W, 0, sig3(2)),

  // fraction (SI base 1)
  u('%', [], 'fraction', 'both', 'percent', 0.01, 0, fixed(1)),

  // density (SI base kg/m³)
  u('kg/m3', ['kg/m³'], 'density', 'SI', 'kilogram per cubic metre', 1, 0, fixed(3), { display: 'kg/m³' }),
  u('lb/ft3', ['lb/ft³'], 'density', 'IP', 'pound per cubic foot', LB_KG / FT3_M3, 0, fixed(4), { display: 'lb/ft³' }),
]);

/** Every unit of the notation, in table order (commonest first within a dimension). */
export const UNITS: readonly UnitDef[] = SPECS;

const bySpelling = new Map<string, UnitSpec>();
for (const spec of SPECS) {
  for (const s of [spec.symbol, ...spec.aliases]) {
    if (bySpelling.has(s)) throw new Error(`units: spelling "${s}" is listed twice in the unit table`);
    bySpelling.set(s, spec);
  }
}

function specOf(unit: UnitDef): UnitSpec {
  return bySpelling.get(unit.symbol) ?? { ...unit, precision: fixed(3) };
}

/** All dimensions, in the order of the SI-base table in `./types`. */
export const DIMENSIONS: readonly Dimension[] = Object.freeze([
  'temperature',
  'pressure',
  'humidityRatio',
  'enthalpy',
  'specificVolume',
  'length',
  'massFlow',
  'volumeFlow',
  'power',
  'fraction',
  'density',
] as const);

// ---------------------------------------------------------------------------------------------
// Lookup and conversion
// ---------------------------------------------------------------------------------------------

/** The unit written exactly as `symbol` (canonical symbol or alias; case-sensitive), if any. */
export function lookupUnit(symbol: string): UnitDef | undefined {
  return bySpelling.get(symbol);
}

/** The units of one dimension, commonest first (for completion lists). */
export function unitsOf(dimension: Dimension): readonly UnitDef[] {
  return SPECS.filter((s) => s.dimension === dimension);
}

/**
 * The SI base unit of a dimension (scale 1, offset 0: °C, Pa, kg/kg, J/kg, m³/kg, m, kg/s, m³/s, W,
 * kg/m³); for fraction, `%` (the base 1 has no symbol).
 */
export function baseUnit(dimension: Dimension): UnitDef {
  const base = SPECS.find((s) => s.dimension === dimension && s.scale === 1 && s.offset === 0);
  // '%' is the only fraction unit; its base "1" has no symbol of its own.
  return base ?? (SPECS.find((s) => s.dimension === dimension) as UnitSpec);
}

/** A value in `unit` converted to the SI base of its dimension (`value · scale + offset`). */
export function toSI(value: number, unit: UnitDef): number {
  return value * unit.scale + unit.offset;
}

/** A value in the SI base converted to `unit` (exact inverse of {@link toSI}). */
export function fromSI(si: number, unit: UnitDef): number {
  return (si - unit.offset) / unit.scale;
}

/** A difference (or tolerance) in `unit` converted to the SI base: scale only, no offset. */
export function deltaToSI(delta: number, unit: UnitDef): number {
  return delta * unit.scale;
}

/** A difference (or tolerance) in the SI base converted to `unit`: scale only, no offset. */
export function deltaFromSI(delta: number, unit: UnitDef): number {
  return delta / unit.scale;
}

// ---------------------------------------------------------------------------------------------
// Display units and descriptions
// ---------------------------------------------------------------------------------------------

const DISPLAY: Record<UnitSystem, Record<Dimension, string>> = {
  SI: {
    temperature: 'C',
    pressure: 'kPa',
    humidityRatio: 'g/kg',
    enthalpy: 'kJ/kg',
    specificVolume: 'm3/kg',
    length: 'm',
    massFlow: 'kg/s',
    volumeFlow: 'm3/s',
    power: 'kW',
    fraction: '%',
    density: 'kg/m3',
  },
  IP: {
    temperature: 'F',
    pressure: 'psia',
    humidityRatio: 'gr/lb',
    enthalpy: 'Btu/lb',
    specificVolume: 'ft3/lb',
    length: 'ft',
    massFlow: 'lb/h',
    volumeFlow: 'cfm',
    power: 'Btu/h',
    fraction: '%',
    density: 'lb/ft3',
  },
};

/**
 * The unit a practising engineer expects results in. SI: °C, kPa, g/kg, kJ/kg, m³/kg, m, kg/s,
 * m³/s, kW, %, kg/m³. IP: °F, psia, gr/lb, Btu/lb, ft³/lb, ft, lb/h, cfm, Btu/h, %, lb/ft³.
 */
export function displayUnit(dimension: Dimension, system: UnitSystem): UnitDef {
  return bySpelling.get(DISPLAY[system][dimension]) as UnitSpec;
}

/** How a unit is written in display text (`°C`, `m³/kg`); the notation symbol otherwise. */
export function displaySymbol(unit: UnitDef): string {
  return specOf(unit).display ?? unit.symbol;
}

const DIMENSION_TITLES: Record<Dimension, string> = {
  temperature: 'temperature (dry-bulb, wet-bulb, dew point)',
  pressure: 'absolute (barometric) pressure',
  humidityRatio: 'humidity ratio: mass of water vapour per mass of dry air',
  enthalpy: 'specific enthalpy per mass of dry air',
  specificVolume: 'specific volume per mass of dry air',
  length: 'length (site elevation)',
  massFlow: 'mass flow rate (dry air, or water added or removed)',
  volumeFlow: 'volume flow rate of air',
  power: 'heat rate (power)',
  fraction: 'fraction in percent (relative humidity, mixing fraction)',
  density: 'density of moist air',
};

/** One-line description of a dimension (`specific enthalpy per mass of dry air`). */
export function dimensionTitle(d: Dimension): string {
  return DIMENSION_TITLES[d];
}

/** A factor printed with up to 10 significant figures and no trailing zeros (`0.3048`, `6894.757293`). */
function factorText(x: number): string {
  return String(Number(x.toPrecision(10)));
}

/**
 * One or two lines for a hover on a unit symbol (canonical or alias): what it is, and how it
 * converts to the engine's SI base. `undefined` for an unknown symbol.
 */
export function describeUnit(symbol: string): string | undefined {
  const spec = bySpelling.get(symbol);
  if (!spec) return undefined;
  const shown = spec.display ?? spec.symbol;
  const head = `${shown} — ${spec.title}; ${DIMENSION_TITLES[spec.dimension]}.`;
  const base = baseUnit(spec.dimension);
  let second: string;
  if (spec.note) second = spec.note;
  else if (spec.dimension === 'fraction') second = '50 % is the fraction 0.5.';
  else if (spec === base) second = 'SI base unit of the engine.';
  else second = `1 ${shown} = ${factorText(spec.scale)} ${displaySymbol(base)}`;
  return `${head}\n${second}`;
}

// ---------------------------------------------------------------------------------------------
// Formatting
// ---------------------------------------------------------------------------------------------

/** Placeholder printed instead of a non-finite number (never "NaN" or "Infinity"). */
export const NO_VALUE = '—';

/** `n · 10^k` computed on the decimal text, so that `1.005 · 10²` is exactly 100.5. */
function shift(n: number, k: number): number {
  const [mantissa, exponent = '0'] = String(n).split('e');
  return Number(`${mantissa}e${Number(exponent) + k}`);
}

/**
 * `x` rounded to `decimals` places (negative: to tens, hundreds…), half away from zero, on the
 * value's shortest decimal text after washing binary noise at 15 significant figures — so 0.05
 * rounds to 0.1 and 0.15 to 0.2 as a reader expects, and 1.005 to 1.01.
 */
function roundDecimal(x: number, decimals: number): number {
  const washed = Number(Math.abs(x).toPrecision(15));
  // At 1e15 and above a double has no fractional digits left to round.
  const r = washed >= 1e15 && decimals >= 0 ? washed : shift(Math.round(shift(washed, decimals)), -decimals);
  if (!Number.isFinite(r)) return x;
  return x < 0 && r !== 0 ? -r : r;
}

/**
 * The minus sign of every figure shown to people (hints, hovers, tables, reports, messages, the
 * chart): U+2212, the typographic minus, as the engine's messages and the chart's labels already
 * wrote it. Text written as notation (a claim's replacement, `formatInUnit`) keeps the ASCII
 * hyphen-minus the writer types; the parser reads both.
 */
export const MINUS = '\u2212';

/** Text of `x` at `decimals` places with the display minus; never "-0", and `—` for a non-finite number. */
function numberText(x: number, decimals: number): string {
  if (!Number.isFinite(x)) return NO_VALUE;
  const r = roundDecimal(x, decimals);
  if (r === 0) return (0).toFixed(Math.max(0, decimals));
  const t = r.toFixed(Math.max(0, Math.min(100, decimals)));
  return r < 0 ? MINUS + t.slice(1) : t;
}

/** Default number of decimals (may be negative: rounding to tens…) for `value` in `unit`. */
function defaultDecimals(spec: UnitSpec, value: number): number {
  const p = spec.precision;
  if (p.kind === 'fixed') return p.decimals;
  if (!Number.isFinite(value) || value === 0) return Math.min(p.maxDecimals, p.figures - 1);
  const washed = Number(Math.abs(value).toPrecision(15));
  let d = p.figures - 1 - Math.floor(Math.log10(washed));
  // 99.96 at 3 figures rounds to 100.0: one figure too many, so drop a place.
  if (Math.abs(roundDecimal(washed, d)) >= 10 ** (p.figures - d)) d -= 1;
  return Math.min(d, p.maxDecimals);
}

/** Decimal places of a place value: 0.01 → 2, 1 → 0, 100 → −2, 0.25 → 2. */
function decimalsOf(resolution: number): number {
  const [mantissa = '', exponent = '0'] = String(resolution).split('e');
  const [intPart = '', frac = ''] = mantissa.split('.');
  let places = frac.length;
  if (places === 0) {
    const trailing = /0*$/.exec(intPart)?.[0].length ?? 0;
    places = intPart.replace(/0+$/, '') === '' ? 0 : -trailing;
  }
  return places - Number(exponent);
}

/** Result of {@link formatQuantity}. */
export interface FormattedQuantity {
  /** Number, a space, and the display symbol: `24.0 °C`, `47.81 kJ/kg`, `— °F` for a non-finite value. */
  text: string;
  /** The number alone: `24.0`. */
  valueText: string;
  /** The unit it is shown in. */
  unit: UnitDef;
}

/**
 * Formats an SI value for display in the unit system's display unit (or `opts.unit`), at
 * engineering precision. `opts.digits` overrides the default number of decimals (0…12).
 *
 * Default precision, and why:
 * - temperatures (°C, °F, K, °R): 0.1 — the resolution of design data and instruments;
 * - % (rh, mixing fractions): 0.1;
 * - g/kg 0.01, kg/kg and lb/lb 0.00001 (the same 0.01 g/kg), gr/lb 0.1 (≈ 0.014 g/kg);
 * - kJ/kg 0.01, Btu/lb 0.01, J/kg 1;
 * - kPa and psia/psi 0.001, Pa 1, hPa/mbar 0.1, bar/atm 0.00001, inHg and inH2O 0.01;
 * - m³/kg 0.0001, ft³/lb 0.01; kg/m³ 0.001, lb/ft³ 0.0001; m and ft 1;
 * - flows and heat rates: 3 significant figures, never finer than kg/s 0.00001, kg/h 0.01,
 *   lb/h 0.1, lb/min 0.01, m³/s 0.00001, L/s and m³/h 0.1, cfm 1, kW 0.1, W 1, MW 0.0001,
 *   Btu/h 1, MBH and ton 0.01 (so 98.07 kW → 98.1 kW, 5.234 kW → 5.2 kW, 334 234 Btu/h → 334 000).
 *
 * Rounding is half away from zero on the decimal value; "-0" is never printed. A non-finite input
 * prints {@link NO_VALUE}. Throws a RangeError if `opts.unit` measures another dimension (a
 * programming error, not a user one).
 */
export function formatQuantity(
  si: number,
  dimension: Dimension,
  system: UnitSystem,
  opts: { digits?: number; unit?: UnitDef } = {},
): FormattedQuantity {
  const unit = opts.unit ?? displayUnit(dimension, system);
  if (unit.dimension !== dimension) {
    throw new RangeError(`formatQuantity: unit ${unit.symbol} measures ${unit.dimension}, not ${dimension}`);
  }
  const spec = specOf(unit);
  const value = Number.isFinite(si) ? fromSI(si, unit) : NaN;
  const decimals =
    opts.digits !== undefined && Number.isFinite(opts.digits)
      ? Math.max(0, Math.min(12, Math.floor(opts.digits)))
      : defaultDecimals(spec, value);
  const valueText = numberText(value, decimals);
  return { text: `${valueText} ${displaySymbol(unit)}`, valueText, unit };
}

/**
 * Formats a difference (a change of enthalpy, a temperature rise) like {@link formatQuantity}, but
 * converted by the unit's scale alone: a datum offset (°F, Btu/lb) does not apply to a difference,
 * so a Δh of −22.47 kJ/kg is −9.66 Btu/lb, never −1.97.
 */
export function formatDifference(
  siDelta: number,
  dimension: Dimension,
  system: UnitSystem,
  opts: { digits?: number; unit?: UnitDef } = {},
): FormattedQuantity {
  const unit = opts.unit ?? displayUnit(dimension, system);
  const formatted = formatQuantity(siDelta, dimension, system, { ...opts, unit: { ...unit, offset: 0 } });
  return { ...formatted, unit };
}

/**
 * Formats an SI value in `unit` in notation form — the number immediately followed by the symbol
 * (`49.6%`, `9.31g/kg`, `75.2F`). Used to show a computed value beside a claim: pass the claim's
 * `resolution` (place value of its last written digit, e.g. 0.01 for `9.30`) and the symbol as the
 * claim wrote it (`written`, e.g. `°C`; default the canonical symbol). The value is shown at the
 * finer of the claim's resolution and the unit's default precision, so `rh=50%` shows `49.6%`
 * and `db=24.00C` shows `23.98C`. A non-finite value prints `—` followed by the symbol.
 */
export function formatInUnit(si: number, unit: UnitDef, resolution?: number, written?: string): string {
  const spec = specOf(unit);
  const value = Number.isFinite(si) ? fromSI(si, unit) : NaN;
  let decimals = defaultDecimals(spec, value);
  if (resolution !== undefined && Number.isFinite(resolution) && resolution > 0) {
    decimals = Math.max(decimals, Math.min(12, decimalsOf(resolution)));
  }
  // Notation text: the ASCII minus the writer types.
  return `${numberText(value, decimals).replace(MINUS, '-')}${written ?? unit.symbol}`;
}

// ---------------------------------------------------------------------------------------------
// Figures: the one formatter of every figure shown to people
// ---------------------------------------------------------------------------------------------

/**
 * A figure as shown: the number, the unit it is shown in, and both together. Hints, hovers, the
 * preview and Markdown tables, the terminal tables of `dewmark eval` and the HTML report all take
 * their figures from {@link figure} (through the results rows of `present/rows`), so one figure
 * reads the same everywhere.
 */
export interface Figure {
  /** The number alone (`24.0`, `0.0033`, `−5.2`, `39,700`), or `—` when there is none. */
  value: string;
  /** The unit as displayed (`°C`, `g/kg`, `Btu/h`); '' for a plain ratio or a bare claim. */
  unit: string;
  /** Number, a space and the unit (`24.0 °C`); the number alone when the unit is ''. */
  text: string;
  /** Decimal places shown (0 when rounded to tens or more). */
  decimals: number;
}

/** Options of {@link figure}. */
export interface FigureOptions {
  /** Show it in this unit instead of the unit system's display unit. */
  unit?: UnitDef;
  /** Decimals added to the usual precision (the editor setting `dewmark.extraDigits`), 0 by default. */
  extraDigits?: number;
  /**
   * A difference, or a rate that comes from one (Δh, a heat rate, water added): converted by the
   * unit's scale alone (no datum offset), and never stretched to significant figures, since below
   * the resolution of its inputs a difference is noise, not a value.
   */
  difference?: boolean;
}

/**
 * Dimensions whose zero is physical (no air, no water, no flow): a small non-zero value of these is
 * shown to {@link MIN_SIGNIFICANT} significant figures rather than rounded to zero by the unit's
 * fixed decimals. Temperatures and enthalpies are not among them: their zero is a datum, and a
 * tenth of a degree is their resolution whatever the value.
 */
const KEEPS_SIGNIFICANT: ReadonlySet<Dimension> = new Set<Dimension>([
  'humidityRatio',
  'fraction',
  'pressure',
  'massFlow',
  'volumeFlow',
  'power',
  'density',
  'specificVolume',
]);

/** Significant figures a small non-zero figure keeps (a −60 °C dew point: w 0.0033 g/kg, not 0.00). */
export const MIN_SIGNIFICANT = 2;

/** Decimals that show `value` (non-zero) to `figures` significant figures. */
function decimalsForSignificant(value: number, figures: number): number {
  const washed = Number(Math.abs(value).toPrecision(15));
  return figures - 1 - Math.floor(Math.log10(washed));
}

/**
 * `12345.6` → `12,345.6`: thousands separated as `text/thousands.ts` says (IP figures, as US
 * engineering documents write them).
 */
function groupThousands(text: string): string {
  const m = /^(\D*)(\d{4,})(.*)$/.exec(text);
  if (!m) return text;
  return `${m[1]}${groupDigits(m[2]!)}${m[3]}`;
}

function clampDecimals(d: number): number {
  return Math.max(-15, Math.min(12, d));
}

/** Builds a figure from the number text and the unit shown. */
function makeFigure(value: string, unit: string, decimals: number): Figure {
  return { value, unit, text: unit ? `${value} ${unit}` : value, decimals: Math.max(0, decimals) };
}

/** The figure of nothing (a property that could not be computed). */
export function noFigure(unit = ''): Figure {
  return makeFigure(NO_VALUE, unit, 0);
}

/**
 * An SI value as shown to people in `system`'s display unit (or `opts.unit`):
 * - at the unit's engineering precision (see {@link formatQuantity} for the table), plus
 *   `opts.extraDigits` decimals;
 * - a small non-zero absolute value of a quantity whose zero is physical (humidity ratio, rh,
 *   pressures, flows, heat rates) keeps {@link MIN_SIGNIFICANT} significant figures where the fixed
 *   decimals would round it away (`0.0033 g/kg`, not `0.00`); differences never do;
 * - negative numbers carry {@link MINUS} (U+2212); "-0" is never shown;
 * - in IP, thousands are separated by commas (`39,700 Btu/h`, `8,745 cfm`); SI figures are not
 *   grouped (a comma is the decimal sign in much of the SI world);
 * - a missing or non-finite value shows `—`.
 */
export function figure(
  si: number | null | undefined,
  dimension: Dimension,
  system: UnitSystem,
  opts: FigureOptions = {},
): Figure {
  const unit = opts.unit ?? displayUnit(dimension, system);
  if (unit.dimension !== dimension)
    throw new RangeError(`figure: unit ${unit.symbol} measures ${unit.dimension}, not ${dimension}`);
  const shown = displaySymbol(unit);
  if (si === null || si === undefined || !Number.isFinite(si)) return noFigure(shown);
  const spec = specOf(unit);
  const value = opts.difference ? si / unit.scale : fromSI(si, unit);
  if (!Number.isFinite(value)) return noFigure(shown);
  let decimals = defaultDecimals(spec, value);
  if (!opts.difference && value !== 0 && KEEPS_SIGNIFICANT.has(dimension)) {
    decimals = Math.max(decimals, decimalsForSignificant(value, MIN_SIGNIFICANT));
  }
  const extra =
    opts.extraDigits !== undefined && Number.isFinite(opts.extraDigits) ? Math.max(0, Math.floor(opts.extraDigits)) : 0;
  if (extra > 0) decimals = Math.max(0, decimals) + extra;
  decimals = clampDecimals(decimals);
  let text = numberText(value, decimals);
  if (system === 'IP') text = groupThousands(text);
  return makeFigure(text, shown, decimals);
}

/** A plain ratio (the sensible heat ratio): two decimals plus `extraDigits`, no unit. */
export function ratioFigure(x: number | null | undefined, extraDigits = 0): Figure {
  if (x === null || x === undefined || !Number.isFinite(x)) return noFigure();
  const decimals = 2 + Math.max(0, Math.floor(Number.isFinite(extraDigits) ? extraDigits : 0));
  return makeFigure(numberText(x, decimals), '', decimals);
}

/**
 * A computed value shown in the unit a claim was written in (`rh=45%` → `49.6 %`, `db=75F` →
 * `75.2 °F`, a bare `shr=0.89` → `0.889`, a bare `w=0.0093` → `0.00931`): at the finer of the
 * written precision (`resolution`, the place value of the last written digit) and the usual
 * precision of that unit. `written` null means a bare number, read in the SI base of `dimension`;
 * its usual precision is the SI display unit's, carried over to the base (`%` at 0.1 is a
 * fraction at 0.001).
 */
export function claimFigure(
  si: number,
  dimension: Dimension,
  written: UnitDef | null,
  resolution: number | undefined,
  extraDigits = 0,
): Figure {
  const inUnit = written && written.dimension === dimension ? written : null;
  let shown: string;
  let value: number;
  let decimals: number;
  if (inUnit) {
    shown = displaySymbol(inUnit);
    value = Number.isFinite(si) ? fromSI(si, inUnit) : NaN;
    decimals = defaultDecimals(specOf(inUnit), value);
  } else {
    const display = displayUnit(dimension, 'SI');
    shown = '';
    value = si;
    const inDisplay = Number.isFinite(si) ? fromSI(si, display) : NaN;
    decimals = defaultDecimals(specOf(display), inDisplay) + Math.round(-Math.log10(display.scale));
  }
  if (!Number.isFinite(value)) return noFigure(shown);
  if (value !== 0 && KEEPS_SIGNIFICANT.has(dimension))
    decimals = Math.max(decimals, decimalsForSignificant(value, MIN_SIGNIFICANT));
  if (resolution !== undefined && Number.isFinite(resolution) && resolution > 0)
    decimals = Math.max(decimals, decimalsOf(resolution));
  if (extraDigits > 0) decimals = Math.max(0, decimals) + Math.floor(extraDigits);
  decimals = clampDecimals(decimals);
  return makeFigure(numberText(value, decimals), shown, decimals);
}

/**
 * The half-width of a claim's band in the unit it was written in (`±0.5 °C`, `±0.005` for a bare
 * ratio): a difference, so scale only; two significant figures at most.
 */
export function bandFigure(toleranceSI: number, written: UnitDef | null): Figure {
  const scale = written ? written.scale : 1;
  const shown = written ? displaySymbol(written) : '';
  const t = toleranceSI / scale;
  if (!Number.isFinite(t)) return noFigure(shown);
  const r = Number(t.toPrecision(2));
  const decimals = Math.max(0, Math.min(12, decimalsOf(r)));
  return makeFigure(`±${numberText(r, decimals)}`, shown, decimals);
}

// ---------------------------------------------------------------------------------------------
// Suggestions for unknown units
// ---------------------------------------------------------------------------------------------

/**
 * Folds a spelling to a comparison key: case, spaces, dots, underscores, carets, degree signs
 * and "deg" dropped; superscripts to digits; spelled-out names and common variants (`hr`, `lbm`,
 * `lbs`, `sec`, `grains`) to the notation's forms.
 */
function foldKey(text: string): string {
  let k = text.replace(/[º˚]/g, '°').normalize('NFKC').toLowerCase();
  k = k.replace(/[\s._^°]/g, '');
  const words: [RegExp, string][] = [
    [/degrees?/g, ''],
    [/deg/g, ''],
    [/celsius|centigrade/g, 'c'],
    [/fahrenheit/g, 'f'],
    [/kelvin/g, 'k'],
    [/rankine/g, 'r'],
    [/percent|pct/g, '%'],
    [/%rh|rh%/g, '%'],
    [/grains?/g, 'gr'],
    [/pounds?|lbm|lbs/g, 'lb'],
    [/hours?|hrs?/g, 'h'],
    [/seconds?|secs?/g, 's'],
    [/litres?|liters?/g, 'l'],
    [/\(?dryair\)?|\(da\)/g, ''],
    [/kgda/g, 'kg'],
    [/lbda/g, 'lb'],
  ];
  for (const [re, to] of words) k = k.replace(re, to);
  return k;
}

/** Gauge and water-column pressures look like accepted symbols but are not: never suggest for them. */
const NO_SUGGESTION = new Set([
  'psig',
  'kpag',
  'barg',
  'pag',
  'inwg',
  'inwc',
  'inh2o',
  'inaq',
  'mmh2o',
  'mmwg',
  'mmhg',
]);

/** Every spelling of every unit folded for comparison (`foldKey` without `/`), with its unit, in table order. */
let looseSpellings: { spec: UnitSpec; loose: string }[] | null = null;

function spellingsFolded(): { spec: UnitSpec; loose: string }[] {
  looseSpellings ??= SPECS.flatMap((spec) =>
    [spec.symbol, ...spec.aliases].map((s) => ({ spec, loose: foldKey(s).replace(/\//g, '') })),
  );
  return looseSpellings;
}

/**
 * The canonical symbol the writer probably meant by an unknown unit `text`, for "unknown unit"
 * messages: an exact or alias spelling, then a case-insensitive or variant spelling (`kpa`,
 * `deg C`, `degF`, `c`, `g/Kg`, `gr/lbm`, `CFM`, `Btu/hr`), then a close misspelling (edit
 * distance 1 for 4–5 characters, 2 for longer; none for shorter ones). Only units of `dimensions`
 * are suggested when given; a spelling of a unit of another dimension (`kJ/kg` for a humidity
 * ratio) gets no suggestion, since it is a wrong unit rather than a typo. `undefined` when nothing
 * is close, and always for gauge or water-column pressures (`psig`, `inWG`), which are not a typo
 * for an accepted unit.
 */
export function suggestUnit(text: string, dimensions?: readonly Dimension[]): string | undefined {
  const candidates = dimensions ? SPECS.filter((s) => dimensions.includes(s.dimension)) : SPECS;
  if (candidates.length === 0) return undefined;
  // A spelling of a unit of another dimension is a wrong unit, not a typo: no suggestion.
  const pick = (spec: UnitSpec): string | undefined => (candidates.includes(spec) ? spec.symbol : undefined);
  const exact = bySpelling.get(text);
  if (exact) return pick(exact);

  const key = foldKey(text);
  if (key === '' || NO_SUGGESTION.has(key)) return undefined;
  const loose = (s: string): string => s.replace(/\//g, '');
  for (const spec of SPECS) {
    for (const s of [spec.symbol, ...spec.aliases]) if (foldKey(s) === key) return pick(spec);
  }
  const looseKey = loose(key);
  for (const spec of SPECS) {
    for (const s of [spec.symbol, ...spec.aliases]) if (loose(foldKey(s)) === looseKey) return pick(spec);
  }

  const limit = looseKey.length <= 3 ? 0 : looseKey.length <= 5 ? 1 : 2;
  if (limit === 0) return undefined;
  // The nearest spelling of a unit of the wanted dimensions (ties: the unit listed first).
  const spellings = spellingsFolded().filter((x) => candidates.includes(x.spec));
  const near = nearest(
    looseKey,
    spellings.map((x) => x.loose),
    limit,
  );
  return near ? spellings[near.index]!.spec.symbol : undefined;
}
