/**
 * The computed results of one ` ```air ` block as plain, already formatted data: the rows of its
 * states and mixes, its processes and its problems (errors, warnings, failed claims), in the
 * note's unit system. The figures come from the results rows (`./rows`); this module only picks
 * the preview's columns from them. The Markdown preview's table and the results table written into a note are
 * both drawn from this (see `./resultsTable`). Pure: analysis in, strings out. The data holds no
 * source positions, so equal results give equal data, and formatted results are reused (treat
 * the returned objects as read-only).
 */
import type { Analysis, EvaluatedItem, ProcessResult, StateResult } from '../evaluate/types';
import type { AirRegion, CoreDiagnostic, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import { displaySymbol, displayUnit } from '../units';
import type { Dimension, UnitSystem } from '../units/types';
import type { KeyName } from '../vocabulary/keys';
import { processRow, stateRow, type ProcessRow, type StateRow } from './rows';

/** A column of the states table: its key (a row of the key table), the label shown, and the unit of its figures. */
export interface ResultsColumn {
  key: Extract<KeyName, 'p' | 'db' | 'wb' | 'dp' | 'rh' | 'w' | 'h'>;
  label: string;
  unit: string;
}

/** One state or mix of a block. */
export interface StateRowData {
  name: string;
  kind: 'state' | 'mix' | 'supply';
  /** `ok`, `fog` (supersaturated, still computed) or `failed` (not computed: see the problems). */
  status: 'ok' | 'fog' | 'failed';
  /** What the name cell adds: the streams of a mix, `fog`, `not computed`; null for a plain state. */
  detail: string | null;
  /** One figure per column of {@link ResultsData.stateColumns}, `—` when there is none. */
  values: string[];
}

/** One process of a block; rates with their unit (per kg of dry air when the flow is unknown). */
export interface ProcessRowData {
  name: string;
  from: string;
  to: string;
  /** The kind in words (`cooling and dehumidifying`), `—` when unknown. */
  kind: string;
  total: string;
  sensible: string;
  latent: string;
  shr: string;
  water: string;
  /** False when the figures are per kg of dry air (no flow was given). */
  hasFlow: boolean;
}

/** An error or warning reported inside a block. */
export interface ProblemData {
  severity: 'error' | 'warning';
  code: string;
  /** The name of the statement it is about, when it has one. */
  subject: string | null;
  /** The message on one line. */
  message: string;
}

/** Everything the results of one block show. */
export interface ResultsData {
  units: UnitSystem;
  /** The columns of the states table (a pressure column only when the block's states differ in pressure). */
  stateColumns: ResultsColumn[];
  states: StateRowData[];
  processes: ProcessRowData[];
  problems: ProblemData[];
  /** The pressure of every state of the block when they share one (`101.325 kPa`), else null. */
  pressure: string | null;
}

/** The results of one fenced block, with the block. */
export interface BlockResults {
  region: AirRegion;
  data: ResultsData;
}

export { PROCESS_KIND_TEXT } from './rows';

function symbolOf(dimension: Dimension, system: UnitSystem): string {
  return displaySymbol(displayUnit(dimension, system));
}

/** The state-table columns for a unit system (with or without the pressure column). */
export function stateColumns(system: UnitSystem, withPressure: boolean): ResultsColumn[] {
  const t = symbolOf('temperature', system);
  const cols: ResultsColumn[] = [
    { key: 'db', label: 'db', unit: t },
    { key: 'wb', label: 'wb', unit: t },
    { key: 'dp', label: 'dp', unit: t },
    { key: 'rh', label: 'rh', unit: '%' },
    { key: 'w', label: 'w', unit: symbolOf('humidityRatio', system) },
    { key: 'h', label: 'h', unit: symbolOf('enthalpy', system) },
  ];
  return withPressure ? [{ key: 'p', label: 'p', unit: symbolOf('pressure', system) }, ...cols] : cols;
}

/** The preview's view of a state row: the columns' figures and the words beside the name. */
function stateRowData(row: StateRow, cols: ResultsColumn[]): StateRowData {
  const details: string[] = [];
  if (row.kind === 'mix') {
    const streams = row.streams.map((x) => `${x.name} ${x.fraction.text}`).join(' + ');
    details.push(streams ? `mix: ${streams}` : 'mix');
  }
  if (row.origin) details.push(row.origin);
  if (row.status === 'fog') details.push('fog');
  if (row.status === 'failed') details.push('not computed');
  return {
    name: row.name,
    kind: row.kind,
    status: row.status,
    detail: details.length > 0 ? details.join('; ') : null,
    values: cols.map((c) => row.figures[c.key].value),
  };
}

/** The preview's view of a process row: figures with their units (per unit mass of dry air without a flow). */
function processRowData(row: ProcessRow): ProcessRowData {
  return {
    name: row.name,
    from: row.from,
    to: row.to,
    kind: row.kindWithAdp,
    total: row.total.text,
    sensible: row.sensible.text,
    latent: row.latent.text,
    shr: row.shr.text,
    water: row.water.text,
    hasFlow: row.hasFlow,
  };
}

function nameOf(statement: Statement): string | null {
  return 'name' in statement && statement.name ? statement.name.text : null;
}

/** Index of the first element whose span (as `spanOf` gives it) starts at or after `offset`. */
function firstAtOrAfter<T>(list: readonly T[], offset: number, spanOf: (x: T) => Span): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (spanOf(list[mid]!).start < offset) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The subject of a problem: the name of the last statement (from `from` on) that starts at or
 * before the problem's offset and reaches it. Problems come in document order, so one cursor
 * walks the statements once for all the problems of a block (a block with thousands of problems
 * costs as many steps as statements and problems together, not their product). The statements
 * of a note do not overlap; should they, the statements before the cursor's are searched too, as
 * far as one of them could still reach the offset.
 */
class SubjectFinder {
  /** The block's first statement. */
  private readonly start: number;
  /** Statements [start, next) start at or before the last offset asked. */
  private next: number;
  /** The furthest end of the statements passed before the last one (−1: none). */
  private reachBefore = -1;
  private lastOffset = Number.NEGATIVE_INFINITY;
  constructor(
    private readonly statements: readonly Statement[],
    from: number,
  ) {
    this.start = firstAtOrAfter(statements, from, (x) => x.span);
    this.next = this.start;
  }

  at(offset: number): string | null {
    if (offset < this.lastOffset) {
      // Out of order: start again from the block's first statement.
      this.next = this.start;
      this.reachBefore = -1;
    }
    this.lastOffset = offset;
    const list = this.statements;
    while (this.next < list.length && list[this.next]!.span.start <= offset) {
      if (this.next > this.start) this.reachBefore = Math.max(this.reachBefore, list[this.next - 1]!.span.end);
      this.next++;
    }
    const last = this.next - 1;
    if (last < this.start) return null;
    const s = list[last]!;
    if (offset <= s.span.end) return nameOf(s);
    if (this.reachBefore < offset) return null;
    // Overlapping statements: the last earlier one that reaches the offset.
    for (let k = last - 1; k >= this.start; k--) {
      const t = list[k]!;
      if (t.span.start <= offset && offset <= t.span.end) return nameOf(t);
    }
    return null;
  }
}

/**
 * Everything the shown results of some items depend on, as one string: the unit system, each
 * item's figures at full precision, and the problems. Equal keys give equal results, so the
 * formatted results can be reused from one analysis to the next (the editor analyses the note on
 * every keystroke, and formatting is the dear part).
 */
function resultsKey(system: UnitSystem, items: readonly EvaluatedItem[], problems: readonly ProblemData[]): string {
  const parts: (string | number | null | undefined | boolean)[] = [system];
  for (const item of items) {
    if (item.kind === 'process') {
      const p = item;
      parts.push(
        'P',
        p.name,
        p.from,
        p.to,
        p.processKind,
        p.massFlowKgS,
        p.qTotalW,
        p.qSensibleW,
        p.qLatentW,
        p.dhTotal,
        p.dhSensible,
        p.dhLatent,
        p.shr,
        p.waterKgS,
        p.dw,
        p.apparatusDewPointC,
      );
    } else {
      const st = item.state;
      parts.push(
        item.kind,
        item.name,
        item.pressure.pa,
        item.definedBy ? `${item.definedBy.from}>${item.definedBy.name}` : '',
      );
      if (st) parts.push(st.db, st.wb, st.dp, st.rh, st.w, st.h, st.fog);
      else parts.push('-');
      for (const x of item.streams ?? []) parts.push(x.name, x.fraction);
    }
  }
  for (const p of problems) parts.push('!', p.severity, p.code, p.subject, p.message);
  return parts.join('\u0001');
}

/** Formatted results by {@link resultsKey} (bounded; the oldest entries go first). */
const formatted = new Map<string, ResultsData>();
const FORMATTED_MAX = 4096;

/** The results of the items, statements and diagnostics that lie in `span`, shown in `system`. */
function resultsIn(analysis: Analysis, span: Span, system: UnitSystem): ResultsData {
  const items: EvaluatedItem[] = [];
  for (let i = firstAtOrAfter(analysis.items, span.start, (x) => x.statement.span); i < analysis.items.length; i++) {
    const item = analysis.items[i]!;
    if (item.statement.span.start > span.end) break;
    items.push(item);
  }
  const problems: ProblemData[] = [];
  const subjects = new SubjectFinder(analysis.parsed.statements, span.start);
  for (let i = firstAtOrAfter(analysis.diagnostics, span.start, (x) => x.span); i < analysis.diagnostics.length; i++) {
    const d: CoreDiagnostic = analysis.diagnostics[i]!;
    if (d.span.start > span.end) break;
    if (d.severity === 'info') continue;
    const subject = subjects.at(d.span.start);
    problems.push({ severity: d.severity, code: d.code, subject, message: d.message.replace(/\s+/g, ' ').trim() });
  }
  const key = resultsKey(system, items, problems);
  const known = formatted.get(key);
  if (known) return known;
  const data = formatResults(system, items, problems);
  if (formatted.size >= FORMATTED_MAX) formatted.delete(formatted.keys().next().value!);
  formatted.set(key, data);
  return data;
}

function formatResults(system: UnitSystem, items: readonly EvaluatedItem[], problems: ProblemData[]): ResultsData {
  const stateRows = items.filter((i): i is StateResult => i.kind !== 'process').map((s) => stateRow(s, system));
  const pressures = new Set(stateRows.map((s) => s.figures.p.text));
  const cols = stateColumns(system, pressures.size > 1);
  return {
    units: system,
    stateColumns: cols,
    states: stateRows.map((s) => stateRowData(s, cols)),
    processes: items
      .filter((i): i is ProcessResult => i.kind === 'process')
      .map((p) => processRowData(processRow(p, system))),
    problems,
    pressure: pressures.size === 1 ? [...pressures][0]! : null,
  };
}

/** The results of one fenced block (`region` from `analysis.parsed.regions`), in `system` (default: the note's). */
export function blockResults(analysis: Analysis, region: AirRegion, system: UnitSystem = analysis.units): ResultsData {
  return resultsIn(analysis, region.span, system);
}

/** The results of every fenced ` ```air ` block of a note, in document order (inline code spans have none). */
export function allBlockResults(analysis: Analysis, system: UnitSystem = analysis.units): BlockResults[] {
  return analysis.parsed.regions
    .filter((r) => r.origin === 'fence')
    .map((region) => ({ region, data: resultsIn(analysis, region.span, system) }));
}

/** True when a block has nothing to show (no states, processes or problems). */
export function isEmptyResults(data: ResultsData): boolean {
  return data.states.length === 0 && data.processes.length === 0 && data.problems.length === 0;
}
