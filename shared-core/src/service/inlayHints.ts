/**
 * Inline hints: after each state or mix, the chosen computed properties the engineer did not
 * write; after each process its kind, total duty, SHR and condensate. Failed claims are marked
 * `✗`. One short line per statement, placed at the end of its line (after the closing backtick
 * of an inline code span).
 */
import type { ProcessResult, StateResult } from '../evaluate/types';
import type { Statement } from '../notation/ast';
import type { Span } from '../text/types';
import {
  PROCESS_KIND_TEXT,
  autoHintKeys,
  rowOf,
  show,
  showClaim,
  showDifference,
  showHeat,
  showRatio,
  showWaterRate,
} from './format';
import { itemOf, lineEnd, propsOf, regionAt, statementsIn } from './note';
import type { CancellationFlag, HintKey, Note } from './types';

/** One inline hint: where it goes, what it says, and a tooltip (Markdown). */
export interface HintItem {
  /** Offset the hint is shown at (end of the statement's line, or after the code span). */
  offset: number;
  label: string;
  tooltip: string;
  /** True when a written claim on the statement failed. */
  failed: boolean;
}

/** Figures shown for a mix when the setting is automatic. */
const MIX_AUTO: HintKey[] = ['db', 'rh', 'w', 'h'];

function stateLabel(note: Note, item: StateResult): { label: string; failed: boolean } | null {
  const state = item.state;
  if (!state) return null;
  const system = note.analysis.units;
  const writtenKeys = new Set(propsOf(item.statement).map((p) => p.key));
  const chosen = note.settings.hintProperties;
  const keys = chosen === 'auto' ? (item.kind === 'mix' ? MIX_AUTO : autoHintKeys(writtenKeys)) : chosen;
  const parts: string[] = [];
  for (const key of keys) {
    if (writtenKeys.has(key)) continue;
    const row = rowOf(key);
    if (!row) continue;
    // Below the triple point the dew point is a frost point (over ice), as the hover says.
    const shownKey = key === 'dp' && state.dpFrost ? 'fp' : key;
    parts.push(`${shownKey} ${show(note, row.value(state), row.dimension, system)}`);
  }
  let failed = false;
  if (note.settings.checkClaims) {
    for (const c of item.claims) {
      if (c.pass) continue;
      failed = true;
      // In the unit the claim was written in, as the hover and the message say it.
      parts.push(`✗ ${c.key} is ${showClaim(note, c)?.computed ?? c.computedText}`);
    }
  }
  if (state.fog) parts.push('fog');
  return parts.length > 0 ? { label: joinFigures(parts), failed } : null;
}

function processLabel(note: Note, item: ProcessResult): { label: string; failed: boolean } {
  const system = note.analysis.units;
  const parts: string[] = [];
  if (item.processKind) parts.push(PROCESS_KIND_TEXT[item.processKind]);
  if (item.qTotalW !== null) {
    parts.push(`${showHeat(note, Math.abs(item.qTotalW), system)} ${item.qTotalW >= 0 ? 'added' : 'removed'}`);
  } else {
    parts.push(`Δh ${showDifference(note, item.dhTotal, 'enthalpy', system)}`);
  }
  if (item.shr !== null) parts.push(`SHR ${showRatio(note, item.shr)}`);
  if (item.waterKgS !== null && item.waterKgS < 0)
    parts.push(`${showWaterRate(note, -item.waterKgS, system)} condensate`);
  else if (item.waterKgS !== null && item.waterKgS > 0)
    parts.push(`${showWaterRate(note, item.waterKgS, system)} water`);
  let failed = false;
  if (note.settings.checkClaims) {
    for (const c of item.claims) {
      if (c.pass) continue;
      failed = true;
      parts.push(`✗ ${c.key} is ${showClaim(note, c)?.computed ?? c.computedText}`);
    }
  }
  return { label: joinFigures(parts), failed };
}

/** A no-break space: keeps a figure's key, number and unit on one line when the editor wraps. */
const NBSP = '\u00a0';

/**
 * The parts of a hint as one label: the spaces inside each part (`dp 12.9 °C`, `98.1 kW removed`)
 * become no-break spaces and the parts are joined with ` · `, so a wrapped line can break only
 * between figures, never inside a number or between a number and its unit.
 */
export function joinFigures(parts: readonly string[]): string {
  return parts.map((p) => p.replace(/ /g, NBSP)).join(' · ');
}

/** Where a statement's hint goes: the end of its line in a fence, after the closing backtick inline. */
function hintOffset(note: Note, statement: Statement): number {
  if (statement.origin === 'inline') {
    const region = regionAt(note, statement.span.start);
    if (region) return region.span.end;
  }
  return lineEnd(note.text, statement.span.end);
}

/**
 * The starts of the parser's errors, ascending: a statement with one inside it is incomplete or
 * malformed as written (`mix M2: OA 1m3/s +`), so it gets no hint — its figures would be those of
 * a statement the note does not say yet.
 */
function parseErrorStarts(note: Note): number[] {
  return note.analysis.parsed.diagnostics
    .filter((d) => d.severity === 'error')
    .map((d) => d.span.start)
    .sort((a, b) => a - b);
}

/** Whether an ascending list holds a value in [from, to]. */
function anyWithin(sorted: readonly number[], from: number, to: number): boolean {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid]! < from) lo = mid + 1;
    else hi = mid;
  }
  return lo < sorted.length && sorted[lo]! <= to;
}

/** The inline hints of the statements that overlap `span`, in document order. */
export function inlayHints(note: Note, span: Span, token?: CancellationFlag): HintItem[] {
  const out: HintItem[] = [];
  const errors = parseErrorStarts(note);
  for (const statement of statementsIn(note, span, true)) {
    if (token?.isCancellationRequested) break;
    if (anyWithin(errors, statement.span.start, statement.span.end)) continue;
    const item = itemOf(note, statement);
    if (!item) continue;
    const r = item.kind === 'process' ? processLabel(note, item) : stateLabel(note, item);
    if (!r) continue;
    const pressure =
      item.kind === 'process' ? '' : ` at ${show(note, item.pressure.pa, 'pressure', note.analysis.units)}`;
    const tooltip =
      `Computed by Dewmark for ${item.kind} **${item.name}**${pressure}. ` +
      `Hover the name for every figure and the claims.`;
    out.push({ offset: hintOffset(note, statement), label: r.label, tooltip, failed: r.failed });
  }
  return out;
}
