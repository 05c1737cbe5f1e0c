/**
 * Display helpers shared by hovers, inline hints, the outline and quick fixes: which property is
 * which, how a figure is shown in a unit system at the chosen precision, and the fixed wording of
 * the method line, the datum lines and the caution footer.
 */
import type { MoistAirState } from '../physics/types';
import type { ClaimResult } from '../evaluate/types';
import { claimFigures, heatFigure, waterFigure } from '../present/rows';
import { figure, ratioFigure } from '../units';
import type { Dimension, UnitDef, UnitSystem } from '../units/types';
import type { HintKey, Note } from './types';
import { ROW_KEYS, keySpec, type RowKey } from '../vocabulary/keys';

/** A property shown for a state: its key, label, dimension and where it is in a computed state. */
export interface PropertyRow {
  key: RowKey;
  label: string;
  dimension: Dimension;
  value: (s: MoistAirState) => number;
  /** A label for the special case (wet-bulb over ice, frost point), when it applies. */
  special?: (s: MoistAirState) => string | null;
}

/** The labels of the special cases: wet-bulb over ice, frost point. */
const SPECIAL: Partial<Record<RowKey, (s: MoistAirState) => string | null>> = {
  wb: (s) => (s.wbIce ? 'wet-bulb (over ice)' : null),
  dp: (s) => (s.dpFrost ? 'frost point' : null),
};

/** Every property of a computed state, in the order the hover table lists them (the key table's rows). */
export const STATE_ROWS: readonly PropertyRow[] = ROW_KEYS.map((key) => {
  const spec = keySpec(key);
  const row: PropertyRow = { key, label: spec.row!, dimension: spec.dimension, value: (s) => s[key] };
  const special = SPECIAL[key];
  if (special) row.special = special;
  return row;
});

/** The row of a key shown in hints and hovers. */
export function rowOf(key: string): PropertyRow | undefined {
  return STATE_ROWS.find((r) => r.key === key);
}

/** The other unit system. */
export function otherSystem(system: UnitSystem): UnitSystem {
  return system === 'SI' ? 'IP' : 'SI';
}

/**
 * An SI figure shown in `system` (or in `unit`), at the usual engineering precision plus the
 * note's extra decimals: `24.0 °C`, `9.31 g/kg`, `— °F` for a missing value. The one formatter of
 * the tables and the report too (`figure` in `units/`).
 */
export function show(note: Note, si: number, dimension: Dimension, system: UnitSystem, unit?: UnitDef): string {
  return figure(si, dimension, system, { unit, extraDigits: note.settings.extraDigits }).text;
}

/** An SI difference (Δh, Δt) shown in `system`: scale only, no datum offset. */
export function showDifference(note: Note, siDelta: number, dimension: Dimension, system: UnitSystem): string {
  return figure(siDelta, dimension, system, { difference: true, extraDigits: note.settings.extraDigits }).text;
}

/** A water rate (condensate or humidifier water) in kg/h or lb/h, as in the results tables. */
export function showWaterRate(note: Note, kgPerS: number, system: UnitSystem): string {
  return waterFigure(kgPerS, system, { extraDigits: note.settings.extraDigits }).text;
}

/** A heat rate in kW or Btu/h, as in the results tables. */
export function showHeat(note: Note, w: number, system: UnitSystem): string {
  return heatFigure(w, system, { extraDigits: note.settings.extraDigits }).text;
}

/** A sensible heat ratio, as in the results tables (`0.73`). */
export function showRatio(note: Note, x: number | null): string {
  return ratioFigure(x, note.settings.extraDigits).text;
}

/**
 * A claim's computed value and band in the unit the engineer wrote it in (`shr=0.89` → `0.889`,
 * `±0.005`), at the note's extra decimals; null for a key of no known dimension.
 */
export function showClaim(note: Note, claim: ClaimResult): { computed: string; band: string } | null {
  const f = claimFigures(claim, { extraDigits: note.settings.extraDigits });
  return f ? { computed: f.computed.text, band: f.band.text } : null;
}

/** The properties the automatic inline hints show: rh, w, h and dp (wb when dp is written). */
export function autoHintKeys(written: ReadonlySet<string>): HintKey[] {
  const keys: HintKey[] = ['rh', 'w', 'h'];
  keys.push(written.has('dp') ? 'wb' : 'dp');
  return keys;
}

export { PROCESS_KIND_TEXT } from '../present/rows';

/** The method line of every state hover (SI wording). */
export const METHOD_LINE = 'Method: ASHRAE Handbook—Fundamentals Ch. 1, ideal-gas; ice below 0 °C.';

/** The method line in a unit system's words (ice below 0 °C, or 32 °F). */
export function methodLine(system: UnitSystem): string {
  return system === 'SI' ? METHOD_LINE : METHOD_LINE.replace('0 °C', '32 °F');
}

/** The one-line caution footer of every result hover. */
export const CAUTION_LINE =
  '_Design aid only; verify against applicable codes and standards and a licensed engineer’s review._';

/** The enthalpy datum of figures shown in a unit system. */
export function datumLine(system: UnitSystem): string {
  return system === 'SI'
    ? 'Enthalpy datum: dry air 0 at 0 °C; water vapour from liquid water at 0 °C.'
    : 'Enthalpy datum: dry air 0 at 0 °F; water vapour from liquid water at 32 °F.';
}

/** Escapes the characters that would break a Markdown table cell or emphasis. */
export function md(text: string): string {
  return text.replace(/([\\`*_|[\]<>])/g, '\\$1');
}
