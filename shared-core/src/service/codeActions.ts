/**
 * Code actions. Quick fixes keyed on diagnostic codes — `missing-unit` on a temperature (add °C
 * or °F), `wb-above-db` (swap the two values), `claim-mismatch` (write the computed value),
 * `unknown-unit` with a suggestion (use it) — and one rewrite: convert a statement's written
 * values to the other unit system. Every edit replaces only the token it is about. A
 * `stale-results-table` warning gets "refresh the table" (see `./resultsTables`, which also has
 * the source actions that write the tables).
 */
import { PROCESS_KEYS, RECOVER_KEYS, SITE_KEYS, STATE_KEYS, type KeySpec } from '../evaluate/keys';
import type { ClaimResult } from '../evaluate/types';
import type { CoreDiagnostic, PropertyNode, QuantityNode, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import { deltaFromSI, displayUnit, formatInUnit, lookupUnit, toSI } from '../units';
import type { Dimension, UnitDef, UnitSystem } from '../units/types';
import { itemOf, overlaps, propsOf, statementAt, statementsIn } from './note';
import { staleTableFix } from './resultsTables';
import type { CancellationFlag, Edit, Note } from './types';

/** One code action as plain data. */
export interface FixAction {
  title: string;
  /**
   * `quickfix` fixes a diagnostic; `refactor` rewrites without
   * one; `source` writes into the whole note (results tables).
   */
  kind: 'quickfix' | 'refactor' | 'source';
  edits: Edit[];
  /** The diagnostic this action fixes, when it is a quick fix. */
  diagnostic?: CoreDiagnostic;
  /** The fix to apply when the editor applies "the" fix. */
  preferred?: boolean;
}

const TEMPERATURE_UNITS: { symbol: string; shown: string; system: UnitSystem }[] = [
  { symbol: 'C', shown: '°C', system: 'SI' },
  { symbol: 'F', shown: '°F', system: 'IP' },
];

/** Dimensions whose values are flows or powers: converted to 4 significant figures, not the display default. */
const FLOW_LIKE = new Set<Dimension>(['massFlow', 'volumeFlow', 'power']);

function specOf(statement: Statement, key: string): KeySpec | undefined {
  if (statement.keyword === 'site') return SITE_KEYS[key];
  if (statement.keyword === 'process') return PROCESS_KEYS[key];
  if (statement.keyword === 'recover') return RECOVER_KEYS[key];
  return STATE_KEYS[key];
}

function text(note: Note, span: Span): string {
  return note.text.slice(span.start, span.end);
}

/** The value and unit of a quantity, without its tolerance. */
function valueSpan(q: QuantityNode): Span {
  return { start: q.number.span.start, end: q.unit?.span.end ?? q.number.span.end };
}

function propWithValueIn(statement: Statement, span: Span): PropertyNode | undefined {
  return propsOf(statement).find((p) => p.value !== null && overlaps(p.value.span, span));
}

function addUnitFixes(note: Note, d: CoreDiagnostic): FixAction[] {
  const statement = statementAt(note, d.span.start);
  if (!statement) return [];
  const prop = propWithValueIn(statement, d.span);
  if (!prop?.value || prop.value.unit) return [];
  if (specOf(statement, prop.key)?.dimension !== 'temperature') return [];
  const at = prop.value.number.span.end;
  return TEMPERATURE_UNITS.map((u) => ({
    title: `Add unit ${u.shown}: ${prop.key}=${prop.value!.number.text}${u.symbol}`,
    kind: 'quickfix' as const,
    edits: [{ span: { start: at, end: at }, newText: u.symbol }],
    diagnostic: d,
    preferred: u.system === note.analysis.units,
  }));
}

function swapWetBulbFix(note: Note, d: CoreDiagnostic): FixAction[] {
  const statement = statementAt(note, d.span.start);
  if (statement?.keyword !== 'state') return [];
  const db = statement.props.find((p) => p.key === 'db')?.value;
  const wb = statement.props.find((p) => p.key === 'wb')?.value;
  if (!db || !wb) return [];
  const dbText = text(note, db.span);
  const wbText = text(note, wb.span);
  return [
    {
      title: `Swap the dry-bulb and wet-bulb values (db=${wbText}, wb=${dbText})`,
      kind: 'quickfix',
      edits: [
        { span: db.span, newText: wbText },
        { span: wb.span, newText: dbText },
      ],
      diagnostic: d,
      preferred: true,
    },
  ];
}

function isSpan(x: unknown): x is Span {
  return (
    typeof x === 'object' && x !== null && typeof (x as Span).start === 'number' && typeof (x as Span).end === 'number'
  );
}

function staleClaimFix(note: Note, d: CoreDiagnostic): FixAction[] {
  const data = d.data ?? {};
  let span: Span | null = isSpan(data.replaceSpan) ? data.replaceSpan : null;
  let replacement = typeof data.replacement === 'string' ? data.replacement : null;
  let shown = typeof data.computedText === 'string' ? data.computedText : replacement;
  if (!span || replacement === null) {
    // Without the evaluator's data, find the failed claim on the diagnostic's span.
    const statement = statementAt(note, d.span.start);
    const item = statement ? itemOf(note, statement) : undefined;
    const claim: ClaimResult | undefined = item?.claims.find(
      (c) => !c.pass && c.prop.value && overlaps(c.prop.value.span, d.span),
    );
    if (!claim?.prop.value) return [];
    span = valueSpan(claim.prop.value);
    replacement = claim.computedText;
    shown = claim.computedText;
  }
  const statement = statementAt(note, span.start);
  const prop = statement ? propWithValueIn(statement, span) : undefined;
  return [
    {
      title: `Replace the stale claim ${prop ? text(note, prop.span) : text(note, span)} with the computed ${shown}`,
      kind: 'quickfix',
      edits: [{ span, newText: replacement }],
      diagnostic: d,
      preferred: true,
    },
  ];
}

function suggestedUnitFix(note: Note, d: CoreDiagnostic): FixAction[] {
  const suggestion = d.data?.suggestion;
  if (typeof suggestion !== 'string' || !lookupUnit(suggestion)) return [];
  return [
    {
      title: `Change unit '${text(note, d.span)}' to '${suggestion}'`,
      kind: 'quickfix',
      edits: [{ span: d.span, newText: suggestion }],
      diagnostic: d,
      preferred: true,
    },
  ];
}

/** A value converted to `target`'s display unit for its dimension, in notation form (`75.2F`). */
function convertedText(si: number, target: UnitDef): string {
  let resolution: number | undefined;
  if (FLOW_LIKE.has(target.dimension)) {
    const v = Math.abs((si - target.offset) / target.scale);
    if (v > 0 && Number.isFinite(v)) resolution = 10 ** (Math.floor(Math.log10(v)) - 3);
  }
  return formatInUnit(si, target, resolution, target.symbol);
}

/** A tolerance figure at two significant figures (`0.9`, `0.05`). */
function toleranceText(delta: number): string {
  return String(Number(delta.toPrecision(2)));
}

/**
 * The edit that rewrites one written quantity in `system`, or null when it is already in that
 * system, has no unit of a system (%), or cannot be read.
 */
function convertQuantity(
  q: QuantityNode,
  spec: KeySpec | null,
  dimension: Dimension,
  system: UnitSystem,
  claim: ClaimResult | undefined,
  after = '',
): Edit | null {
  let unit: UnitDef | undefined;
  if (q.unit) unit = lookupUnit(q.unit.text);
  else if (spec?.bare === 'si' && dimension === 'humidityRatio') unit = lookupUnit('kg/kg');
  if (!unit || unit.dimension !== dimension || unit.system === 'both') return null;
  if (q.unit && unit.system === system) return null;
  const target = displayUnit(dimension, system);
  const si = toSI(q.number.value, unit);
  // A value that overflows in the other unit (1e308 kg/s in lb/h), or whose rounded figure could
  // overflow when read back (beyond 1e300 in SI), is left as written.
  if (!(Math.abs(si) <= 1e300) || !Number.isFinite((si - target.offset) / target.scale)) return null;
  // A tolerance follows that could not be read (`0C±NaN`): a band added here would double it.
  if (!q.tolerance && (after.startsWith('±') || after.startsWith('+-'))) return null;
  let newText = convertedText(si, target);
  let span = valueSpan(q);
  const t = q.tolerance;
  if (t && !(t.unit?.text === '%' && dimension !== 'fraction')) {
    // An absolute tolerance is rewritten in the new unit; a relative one (±2% of a value) stays.
    const tUnit = t.unit ? lookupUnit(t.unit.text) : unit;
    if (!tUnit) return null;
    newText += `±${toleranceText(deltaFromSI(t.number.value * tUnit.scale, target))}`;
    span = q.span;
  } else if (!t && claim) {
    // A claim's band came from its written digits; keep the same band explicitly.
    newText += `±${toleranceText(deltaFromSI(claim.toleranceSI, target))}`;
  }
  return { span, newText };
}

function convertStatement(note: Note, statement: Statement, system: UnitSystem): Edit[] {
  const edits: Edit[] = [];
  const item = itemOf(note, statement);
  const claims = new Map<PropertyNode, ClaimResult>();
  for (const c of item?.claims ?? []) claims.set(c.prop, c);
  if (statement.keyword === 'mix') {
    for (const stream of statement.streams) {
      const q = stream.amount;
      const unit = q?.unit ? lookupUnit(q.unit.text) : undefined;
      if (!q || !unit) continue;
      const e = convertQuantity(
        q,
        null,
        unit.dimension,
        system,
        undefined,
        note.text.slice(q.span.end, q.span.end + 2),
      );
      if (e) edits.push(e);
    }
  }
  for (const prop of propsOf(statement)) {
    const spec = specOf(statement, prop.key);
    if (!prop.value || !spec) continue;
    const e = convertQuantity(
      prop.value,
      spec,
      spec.dimension,
      system,
      claims.get(prop),
      note.text.slice(prop.value.span.end, prop.value.span.end + 2),
    );
    if (e) edits.push(e);
  }
  return edits;
}

function conversionActions(note: Note, span: Span): FixAction[] {
  const out: FixAction[] = [];
  for (const statement of statementsIn(note, span)) {
    if (statement.keyword === 'units') continue;
    const label =
      'name' in statement && statement.name ? `${statement.keyword} ${statement.name.text}` : statement.keyword;
    for (const system of ['SI', 'IP'] as const) {
      const edits = convertStatement(note, statement, system);
      if (edits.length === 0) continue;
      const units = system === 'SI' ? '°C, g/kg, kJ/kg, kPa…' : '°F, gr/lb, Btu/lb, psia…';
      out.push({ title: `Convert the written values of ${label} to ${system} (${units})`, kind: 'refactor', edits });
    }
  }
  return out;
}

/** Quick fixes for the diagnostics that overlap `span`, then the unit-system rewrites there. */
export function codeActions(note: Note, span: Span, token?: CancellationFlag): FixAction[] {
  const out: FixAction[] = [];
  for (const d of note.analysis.diagnostics) {
    if (token?.isCancellationRequested) return out;
    if (!overlaps(d.span, span)) continue;
    switch (d.code) {
      case 'missing-unit':
        out.push(...addUnitFixes(note, d));
        break;
      case 'wb-above-db':
        out.push(...swapWetBulbFix(note, d));
        break;
      case 'claim-mismatch':
        out.push(...staleClaimFix(note, d));
        break;
      case 'unknown-unit':
        out.push(...suggestedUnitFix(note, d));
        break;
      case 'stale-results-table':
        out.push(...staleTableFix(note, d));
        break;
    }
  }
  out.push(...conversionActions(note, span));
  return out;
}
