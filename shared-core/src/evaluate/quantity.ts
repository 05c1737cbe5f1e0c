/**
 * Reading a written quantity (`24C`, `50%±2`, `0.0093`, `1000L/s`) for a key: unit lookup,
 * conversion to the SI base, the claim tolerance, and the diagnostics for missing, unknown or
 * wrong-dimension units.
 */
import { lookupUnit, suggestUnit } from '../units';
import type { Dimension, UnitDef } from '../units/types';
import type { CoreDiagnostic, PropertyNode, QuantityNode, ToleranceNode } from '../notation/ast';
import type { KeySpec } from './keys';
import { significantResolution } from '../notation/number';
import type { ReadProp } from './props';

/** What reading a quantity needs to know of its key (a key-table row, or a mix stream's amount). */
export type QuantitySpec = Pick<KeySpec, 'key' | 'dimension' | 'title' | 'bare' | 'example'>;

/** A quantity converted for its key. */
export interface ResolvedQuantity {
  /** The written value in the SI base of the key's dimension. */
  si: number;
  /** The unit as resolved; null for a bare number read in the SI base (w in kg/kg, shr). */
  unit: UnitDef | null;
  /** The unit as written (`°C`, `g/kg`), or '' for a bare number. */
  unitText: string;
  /** Half-width of the accepted band for a claim, SI (difference, no offset). */
  toleranceSI: number;
  /** True when the tolerance was written (`±2`). */
  explicitTolerance: boolean;
  quantity: QuantityNode;
}

/**
 * A quantity as read: the value, the unit and the band, with the unit as written and whether the
 * band was written read from the quantity itself (so that a figure is one object of four fields).
 */
export class ReadFigure implements ResolvedQuantity {
  // Declared only, set by the constructor (see {@link ReadPropertyFigure}).
  declare readonly si: number;
  declare readonly unit: UnitDef | null;
  declare readonly toleranceSI: number;
  declare readonly quantity: QuantityNode;

  constructor(si: number, unit: UnitDef | null, toleranceSI: number, quantity: QuantityNode) {
    this.si = si;
    this.unit = unit;
    this.toleranceSI = toleranceSI;
    this.quantity = quantity;
  }

  /** The unit as written (a figure read has a unit exactly when one is written), or ''. */
  get unitText(): string {
    return this.quantity.unit?.text ?? '';
  }

  /** True when the tolerance was written (a figure read has a valid one exactly when one is written). */
  get explicitTolerance(): boolean {
    return !!this.quantity.tolerance;
  }
}

/**
 * A statement's property read against its key's row: a {@link ReadProp} that is its own quantity
 * (`q`), so that a property read is one object. It is a class of its own rather than a subclass of
 * {@link ReadFigure}: a derived class's constructor is a second call that the engine makes per
 * object (the base allocates it), and every state reads two of these.
 *
 * Its figures (`si`, `toleranceSI`) are worked out from the written quantity when read, by the
 * same expressions {@link resolveQuantity} checked them with, so they are the same doubles: a
 * field holding a double is a heap object of its own per object (two per property, four per
 * state), and most properties are read for their value once (the defining pair) and for their
 * band never (only a claim has one that is compared).
 */
export class ReadPropertyFigure implements ReadProp, ResolvedQuantity {
  // The fields are declared only (`declare`: no class field definitions), so that a property read
  // is made by its constructor's stores alone: a defined field is first made undefined on every
  // new object by an initializer of its own, a call per object before the engine optimises it.
  declare readonly unit: UnitDef | null;
  declare readonly prop: PropertyNode;
  declare readonly spec: KeySpec;
  /**
   * The key: its row's own string, equal to the key as written (the row was found by it). The
   * row's string is the table's literal, which compares with the literals of the evaluator
   * (`key === 'db'`) at once, where the string read from the note is compared character by
   * character. A field rather than a getter: it is read some five times per state, and before
   * the engine has optimised its readers a getter is a call each time.
   */
  declare readonly key: string;

  /** `unit`: the written value's unit as found (null for a bare number read in the SI base). */
  constructor(unit: UnitDef | null, prop: PropertyNode, spec: KeySpec) {
    this.unit = unit;
    this.prop = prop;
    this.spec = spec;
    this.key = spec.key;
  }

  /** The written value in the SI base of the key's dimension (see {@link resolveQuantity}). */
  get si(): number {
    const value = this.prop.value!.number.value;
    return this.unit === null ? value : unitToSI(value, this.unit);
  }

  /** The claim's band, SI (see {@link resolveQuantity}). */
  get toleranceSI(): number {
    return toleranceOf(this.prop.value!, this.spec.dimension, this.unit === null ? 1 : this.unit.scale);
  }

  get q(): ResolvedQuantity {
    return this;
  }

  /** The quantity as written: the property's value. */
  get quantity(): QuantityNode {
    return this.prop.value!;
  }

  /** The unit as written (a figure read has a unit exactly when one is written), or ''. */
  get unitText(): string {
    return this.prop.value!.unit?.text ?? '';
  }

  /** True when the tolerance was written (a figure read has a valid one exactly when one is written). */
  get explicitTolerance(): boolean {
    return !!this.prop.value!.tolerance;
  }
}

/** Outcome of reading a quantity: the value, or one diagnostic on the offending token. */
export type QuantityOutcome = { ok: true; value: ResolvedQuantity } | { ok: false; diagnostic: CoreDiagnostic };

/** Converts a value in `unit` to SI (affine: value·scale + offset). */
export function unitToSI(value: number, unit: UnitDef): number {
  return value * unit.scale + unit.offset;
}

/** Calls the units module's suggestion and keeps a symbol string, whatever shape it returns. */
export function suggestSymbol(text: string, dimensions?: Dimension[]): string | null {
  let r: unknown;
  try {
    r = (suggestUnit as (t: string, d?: Dimension[]) => unknown)(text, dimensions);
  } catch {
    return null;
  }
  const pick = (x: unknown): string | null => {
    if (typeof x === 'string') return x;
    if (x && typeof x === 'object' && 'symbol' in x && typeof (x as { symbol: unknown }).symbol === 'string') {
      return (x as { symbol: string }).symbol;
    }
    return null;
  };
  if (Array.isArray(r)) {
    for (const x of r) {
      const s = pick(x);
      if (s) return s;
    }
    return null;
  }
  return pick(r);
}

/** The units looked up last, by a slot of their spelling (a note writes a handful of units, over and over). */
const UNIT_SLOTS = 16;
const unitSpellings: string[] = new Array<string>(UNIT_SLOTS).fill('');
const unitDefs: (UnitDef | undefined)[] = new Array<UnitDef | undefined>(UNIT_SLOTS).fill(undefined);

/**
 * Looks a unit up, tolerating a units module that throws on odd input. The table of units never
 * changes, so the last unit found for each slot is kept and a spelling seen there is not looked
 * up again (one comparison of short strings instead of a look-up per written figure).
 */
export function findUnit(symbol: string): UnitDef | undefined {
  const slot = (symbol.length * 7 + (symbol.length > 0 ? symbol.charCodeAt(symbol.length - 1) : 0)) & (UNIT_SLOTS - 1);
  if (unitSpellings[slot] === symbol) return unitDefs[slot];
  let def: UnitDef | undefined;
  try {
    def = lookupUnit(symbol);
  } catch {
    return undefined;
  }
  if (def) {
    unitSpellings[slot] = symbol;
    unitDefs[slot] = def;
  }
  return def;
}

const DIMENSION_WORDS: Record<Dimension, string> = {
  temperature: 'a temperature',
  pressure: 'a pressure',
  humidityRatio: 'a humidity ratio',
  enthalpy: 'a specific enthalpy',
  specificVolume: 'a specific volume',
  length: 'a length',
  massFlow: 'a mass flow',
  volumeFlow: 'a volume flow',
  power: 'a heat rate',
  fraction: 'a fraction (%)',
  density: 'a density',
};

/** "a temperature", "a mass flow"… for messages. */
export function dimensionWords(d: Dimension): string {
  return DIMENSION_WORDS[d] ?? d;
}

/**
 * Reads `q` as a value of `spec` (one dimension, or `alt` dimensions for mix amounts). Errors:
 * `missing-unit` (a bare number where a unit is needed), `unknown-unit` (not a unit, or a unit of
 * another dimension, with a suggestion), `syntax` for a negative explicit tolerance.
 */
export function readQuantity(
  prop: { key: string; keySpan: PropertyNode['keySpan'] },
  q: QuantityNode,
  spec: QuantitySpec,
): QuantityOutcome {
  const sink: DiagnosticSink = { diagnostic: null, report: collect };
  const value = resolveQuantity(prop, q, spec, sink);
  return value ? { ok: true, value } : { ok: false, diagnostic: sink.diagnostic! };
}

/** Where {@link resolveQuantity} reports a diagnostic (the evaluator's context, or a collector). */
export interface DiagnosticReport {
  report(d: CoreDiagnostic): void;
}

/** Keeps the one diagnostic of a {@link readQuantity}. */
interface DiagnosticSink extends DiagnosticReport {
  diagnostic: CoreDiagnostic | null;
}

function collect(this: DiagnosticSink, d: CoreDiagnostic): void {
  this.diagnostic = d;
}

/**
 * {@link readQuantity} without an outcome object: the value, or null after reporting the one
 * diagnostic to `out` (what the evaluator reads every written figure with). With `row` (the key
 * table's row of `prop`, a statement's property whose value is `q`), the value is the property
 * read ({@link ReadPropertyFigure}).
 */
export function resolveQuantity(
  prop: { key: string; keySpan: PropertyNode['keySpan'] },
  q: QuantityNode,
  spec: QuantitySpec,
  out: DiagnosticReport,
  row?: KeySpec,
): ResolvedQuantity | null {
  // The rare outcomes (a diagnostic, a written tolerance) are functions of their own, so that this
  // one stays small enough for the engine to build into its callers.
  let unit: UnitDef | null = null;
  let si: number;
  let scale: number;
  if (q.unit === null) {
    if (spec.bare === 'error') return missingUnit(q, spec, out);
    si = q.number.value;
    scale = 1;
  } else {
    const def = findUnit(q.unit.text);
    if (!def || def.dimension !== spec.dimension) return unknownUnit(prop, q, q.unit, spec, def, out);
    unit = def;
    si = unitToSI(q.number.value, def);
    scale = def.scale;
  }
  // A written tolerance that cannot be read is reported; else the band is worked out (the
  // expressions of `toleranceOf`, written out here so that the band is not a double returned
  // from a call).
  if (q.tolerance && !toleranceReadable(prop, q, q.tolerance, spec, out)) return null;
  const toleranceSI = q.tolerance
    ? writtenTolerance(q, q.tolerance, spec.dimension, scale)
    : (claimResolution(q, spec.dimension) / 2) * Math.abs(scale);
  if (!Number.isFinite(si) || !Number.isFinite(toleranceSI)) return tooLarge(prop, q, out);
  // A property read works its figures out again when they are read, by these same expressions.
  return row ? new ReadPropertyFigure(unit, prop as PropertyNode, row) : new ReadFigure(si, unit, toleranceSI, q);
}

/**
 * The band of a claim written as `q` (whose written tolerance, if any, is readable), SI, for a
 * value of `dimension` in a unit of scale `scale`: half a unit of the last significant digit, or
 * the explicit ± figure.
 */
function toleranceOf(q: QuantityNode, dimension: Dimension, scale: number): number {
  return q.tolerance
    ? writtenTolerance(q, q.tolerance, dimension, scale)
    : (claimResolution(q, dimension) / 2) * Math.abs(scale);
}

/** `missing-unit` for `q`, a bare number of a key that needs a unit; null. */
function missingUnit(q: QuantityNode, spec: QuantitySpec, out: DiagnosticReport): null {
  out.report({
    code: 'missing-unit',
    severity: 'error',
    message: missingUnitMessage(spec, q.number.text, q.number.value),
    span: q.number.span,
    data: { key: spec.key, dimension: spec.dimension },
  });
  return null;
}

/** `unknown-unit` for `q`'s unit `u`, not a unit (`def` undefined) or one of another dimension; null. */
function unknownUnit(
  prop: { key: string },
  q: QuantityNode,
  u: NonNullable<QuantityNode['unit']>,
  spec: QuantitySpec,
  def: UnitDef | undefined,
  out: DiagnosticReport,
): null {
  const suggestion = suggestSymbol(u.text, [spec.dimension]);
  const what = def
    ? `'${u.text}' is ${dimensionWords(def.dimension)} unit, but ${spec.key} is ${spec.title}`
    : `'${u.text}' is not a unit Dewmark knows`;
  const fix = suggestion ? `did you mean ${spec.key}=${q.number.text}${suggestion}?` : `write it like ${spec.example}`;
  out.report({
    code: 'unknown-unit',
    severity: 'error',
    message: `${what} (in ${whereText(prop.key, q)}); ${fix}`,
    span: u.span,
    data: suggestion ? { suggestion, key: spec.key } : { key: spec.key },
  });
  return null;
}

/**
 * The band of a claim written with its tolerance `t` (`±2`, `±2%`, `±0.5K`), SI, for a value of
 * `dimension` in a unit of scale `scale`; `t` is readable ({@link toleranceReadable}).
 */
function writtenTolerance(q: QuantityNode, t: ToleranceNode, dimension: Dimension, scale: number): number {
  const tv = t.number.value;
  if (t.unit === null) return tv * Math.abs(scale);
  // ±2% of a non-% value: a relative band around the written figure in its own unit.
  if (t.unit.text === '%' && dimension !== 'fraction') return (tv / 100) * Math.abs(q.number.value) * Math.abs(scale);
  return tv * Math.abs(findUnit(t.unit.text)!.scale);
}

/** True when the tolerance `t` written in `q` can be read; else reports why and returns false. */
function toleranceReadable(
  prop: { key: string },
  q: QuantityNode,
  t: ToleranceNode,
  spec: QuantitySpec,
  out: DiagnosticReport,
): boolean {
  const tv = t.number.value;
  if (!(tv >= 0) || !Number.isFinite(tv)) {
    out.report({
      code: 'syntax',
      severity: 'error',
      message:
        `the tolerance in ${whereText(prop.key, q)}±${t.number.text} ` + 'must be a positive figure; write it like ±2',
      span: t.span,
    });
    return false;
  }
  if (t.unit === null) return true;
  if (t.unit.text === '%' && spec.dimension !== 'fraction') return true;
  const tdef = findUnit(t.unit.text);
  if (!tdef || tdef.dimension !== spec.dimension) {
    out.report({
      code: 'unknown-unit',
      severity: 'error',
      message:
        `the tolerance unit '${t.unit.text}' in ${whereText(prop.key, q)} ` +
        `does not fit ${spec.title}; write the tolerance in the value's unit ` +
        `(±${t.number.text}) or as a percentage of it (±${t.number.text}%)`,
      span: t.unit.span,
    });
    return false;
  }
  return true;
}

/** `out-of-range` for a figure (or its band) too large to use; null. */
function tooLarge(prop: { key: string }, q: QuantityNode, out: DiagnosticReport): null {
  out.report({
    code: 'out-of-range',
    severity: 'error',
    message: `${whereText(prop.key, q)} is too large to use; check the figure`,
    span: q.span,
  });
  return null;
}

/**
 * The place value of the last significant digit of a written figure, whose half is a claim's
 * default band. Trailing zeros of a whole number are not significant unless marked (see
 * {@link significantResolution}), except in temperatures — a point on a scale whose zero is
 * arbitrary, so `20C` and `120F` are read to the degree — and percentages, read to 1 % at least
 * (`rh=50%`, `rh=100%`).
 */
export function claimResolution(q: QuantityNode, dimension: Dimension): number {
  if (dimension === 'temperature' || dimension === 'fraction') return q.number.resolution;
  return significantResolution(q.number.text, q.number.resolution);
}

/** `db=24C` as written, for messages. */
function whereText(key: string, q: QuantityNode): string {
  return `${key}=${q.number.text}${q.unit?.text ?? ''}`;
}

function missingUnitMessage(spec: QuantitySpec, numText: string, value: number): string {
  switch (spec.dimension) {
    case 'temperature':
      return (
        `${spec.key}=${numText} has no unit: Dewmark does not guess between ` +
        `°C and °F; write ${spec.key}=${numText}C or ${spec.key}=${numText}F`
      );
    case 'fraction':
      return (
        `${spec.key}=${numText} has no unit: a bare relative ` +
        `humidity is ambiguous (50 or 0.5?); write it in percent, ` +
        `e.g. ${spec.key}=${value > 0 && value <= 1 ? `${+(value * 100).toPrecision(6)}%` : `${numText}%`}`
      );
    default:
      return `${spec.key}=${numText} has no unit; ${spec.title} needs one, e.g. ${spec.example}`;
  }
}
