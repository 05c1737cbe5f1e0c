/**
 * One analysed note and the lookups every feature shares: the statement, region and syntax node at
 * an offset (binary search over document order), and the evaluated item of a statement.
 */
import { analyzeNote } from '../analyze';
import type { Analyzer } from '../analyze';
import type { EvaluatedItem } from '../evaluate/types';
import type { AirRegion, NameNode, PropertyNode, PropertyRefNode, Statement, UnitNode } from '../notation/ast';
import { namesSomething } from '../notation/named';
import { LineIndex } from '../text/lineIndex';
import type { Span } from '../text/types';
import { limitedNote, overLimit } from './limits';
import { toEvaluateSettings } from './settings';
import type { Note, ServiceSettings } from './types';

/**
 * Parses and evaluates `text` once with the service settings; every feature reads the result. A
 * note over the size limit is not evaluated (see `./limits`).
 */
export function analyzeText(text: string, settings: ServiceSettings): Note {
  if (overLimit(text, settings)) return limitedNote(text, settings);
  return { text, analysis: analyzeNote(text, toEvaluateSettings(settings)), settings };
}

/**
 * {@link analyzeText} through an analyzer that keeps its previous run (`createAnalyzer`, one per
 * open document): the same note, with less work after a small edit.
 */
export function analyzeTextWith(analyzer: Analyzer, text: string, settings: ServiceSettings): Note {
  if (overLimit(text, settings)) {
    analyzer.reset(); // nothing to reuse, and no need to keep the last run of a smaller text
    return limitedNote(text, settings);
  }
  return { text, analysis: analyzer.analyze(text, toEvaluateSettings(settings)), settings };
}

/**
 * {@link analyzeTextWith} in steps (see `Analyzer.analyzeSteps`): pauses now and then, returns
 * the same note. A run not driven to its end changes nothing.
 */
export function* analyzeTextSteps(
  analyzer: Analyzer,
  text: string,
  settings: ServiceSettings,
): Generator<void, Note, void> {
  if (overLimit(text, settings)) {
    analyzer.reset();
    return limitedNote(text, settings);
  }
  return { text, analysis: yield* analyzer.analyzeSteps(text, toEvaluateSettings(settings)), settings };
}

/** True when `offset` lies in `span` or touches its end (a cursor just after a word is on it). */
export function touches(span: Span, offset: number): boolean {
  return span.start <= offset && offset <= span.end;
}

/** True when two spans overlap or touch. */
export function overlaps(a: Span, b: Span): boolean {
  return a.start <= b.end && b.start <= a.end;
}

interface NoteIndex {
  items: Map<Statement, EvaluatedItem>;
}

const indexes = new WeakMap<Note, NoteIndex>();

function indexOf(note: Note): NoteIndex {
  let idx = indexes.get(note);
  if (!idx) {
    const items = new Map<Statement, EvaluatedItem>();
    // One item per statement: its first process if it has one (a process that defines its
    // leaving state also yields that state; a heat recovery yields two states, then one process
    // per stream, and its line speaks of the first stream as written), else its first item.
    for (const item of note.analysis.items) {
      const known = items.get(item.statement);
      if (!known || (known.kind !== 'process' && item.kind === 'process')) items.set(item.statement, item);
    }
    idx = { items };
    indexes.set(note, idx);
  }
  return idx;
}

/** The evaluated item (state, mix or process) of a statement, if it produced one. */
export function itemOf(note: Note, statement: Statement): EvaluatedItem | undefined {
  return indexOf(note).items.get(statement);
}

/** Index of the last element whose `span.start` is at or before `offset` (−1 when none). */
function lastStartingAtOrBefore<T extends { span: Span }>(list: readonly T[], offset: number): number {
  let lo = 0;
  let hi = list.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid]!.span.start <= offset) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

/** The statement whose span holds (or ends at) `offset`. */
export function statementAt(note: Note, offset: number): Statement | undefined {
  const list = note.analysis.parsed.statements;
  const i = lastStartingAtOrBefore(list, offset);
  if (i < 0) return undefined;
  const s = list[i]!;
  return touches(s.span, offset) ? s : undefined;
}

/**
 * The statements that overlap `span`, in document order. With `endExclusive`, a statement that
 * starts exactly at `span.end` is left out (an LSP range up to the start of the next line).
 */
export function statementsIn(note: Note, span: Span, endExclusive = false): Statement[] {
  const list = note.analysis.parsed.statements;
  let i = lastStartingAtOrBefore(list, span.start);
  if (i < 0) i = 0;
  const out: Statement[] = [];
  for (; i < list.length; i++) {
    const s = list[i]!;
    if (s.span.start > span.end || (endExclusive && s.span.start === span.end && span.end > span.start)) break;
    if (overlaps(s.span, span)) out.push(s);
  }
  return out;
}

/** The fenced block or code span whose content holds `offset` (an empty fence body included). */
export function regionAt(note: Note, offset: number): AirRegion | undefined {
  const list = note.analysis.parsed.regions;
  const i = lastStartingAtOrBefore(list, offset);
  if (i < 0) return undefined;
  const r = list[i]!;
  return touches(r.contentSpan, offset) ? r : undefined;
}

/** What lies under the cursor inside a statement. */
export type Target =
  | { kind: 'keyword'; statement: Statement; span: Span }
  | { kind: 'definition'; statement: Statement; name: NameNode }
  | { kind: 'reference'; statement: Statement; name: NameNode }
  | { kind: 'key'; statement: Statement; prop: PropertyNode; span: Span }
  | { kind: 'unit'; statement: Statement; unit: UnitNode; prop: PropertyNode | null }
  | { kind: 'value'; statement: Statement; prop: PropertyNode; span: Span }
  /** The `.key` (or difference) part of a property reference `OA.w+…` (its name part is a `reference`). */
  | { kind: 'propertyRef'; statement: Statement; prop: PropertyNode; ref: PropertyRefNode; span: Span }
  | { kind: 'system'; statement: Statement; name: NameNode }
  | { kind: 'statement'; statement: Statement };

/**
 * The names a statement refers to or defines after '->' (mix streams, process ends, recover
 * streams, the states of property references).
 */
export function referencesOf(statement: Statement): NameNode[] {
  const out: NameNode[] = [];
  if (statement.keyword === 'mix') for (const s of statement.streams) out.push(s.name);
  if (statement.keyword === 'process') for (const n of [statement.from, statement.to]) if (n) out.push(n);
  if (statement.keyword === 'supply' && statement.room) out.push(statement.room);
  if (statement.keyword === 'recover')
    for (const x of statement.streams) for (const n of [x.from, x.to]) if (n) out.push(n);
  if (statement.keyword !== 'units') for (const p of statement.props) if (p.ref) out.push(p.ref.state);
  return out;
}

/** The properties written in a statement (for a mix: its claims; for a process: flow and claims). */
export function propsOf(statement: Statement): PropertyNode[] {
  return statement.keyword === 'units' ? [] : statement.props;
}

/** The syntax node at `offset`, most specific first; undefined outside every statement. */
export function targetAt(note: Note, offset: number): Target | undefined {
  const statement = statementAt(note, offset);
  if (!statement) return undefined;
  if (touches(statement.keywordSpan, offset)) return { kind: 'keyword', statement, span: statement.keywordSpan };
  if (statement.keyword === 'units') {
    if (statement.system && touches(statement.system.span, offset))
      return { kind: 'system', statement, name: statement.system };
    return { kind: 'statement', statement };
  }
  if (namesSomething(statement) && statement.name) {
    if (touches(statement.name.span, offset)) return { kind: 'definition', statement, name: statement.name };
  }
  for (const ref of referencesOf(statement)) {
    if (touches(ref.span, offset)) return { kind: 'reference', statement, name: ref };
  }
  if (statement.keyword === 'mix') {
    for (const stream of statement.streams) {
      const unit = stream.amount?.unit;
      if (unit && touches(unit.span, offset)) return { kind: 'unit', statement, unit, prop: null };
    }
  }
  for (const prop of propsOf(statement)) {
    if (!touches(prop.span, offset)) continue;
    if (touches(prop.keySpan, offset)) return { kind: 'key', statement, prop, span: prop.keySpan };
    if (prop.ref) {
      const ref = prop.ref;
      if (ref.offset?.unit && touches(ref.offset.unit.span, offset))
        return { kind: 'unit', statement, unit: ref.offset.unit, prop };
      return { kind: 'propertyRef', statement, prop, ref, span: { start: ref.state.span.end, end: ref.span.end } };
    }
    const v = prop.value;
    if (v?.unit && touches(v.unit.span, offset)) return { kind: 'unit', statement, unit: v.unit, prop };
    if (v?.tolerance?.unit && touches(v.tolerance.unit.span, offset))
      return { kind: 'unit', statement, unit: v.tolerance.unit, prop };
    return { kind: 'value', statement, prop, span: v?.span ?? prop.span };
  }
  return { kind: 'statement', statement };
}

/**
 * The offset where the line holding `offset` ends (before `\r\n`, `\n` or a lone `\r`, as the
 * Markdown reader splits lines).
 */
export function lineEnd(text: string, offset: number): number {
  const nl = text.indexOf('\n', offset);
  const end = nl < 0 ? text.length : nl;
  for (let i = offset; i < end; i++) if (text.charCodeAt(i) === 13) return i;
  return end;
}

/** The offset where the line holding `offset` starts (after `\n` or a lone `\r`). */
export function lineStart(text: string, offset: number): number {
  const nl = text.lastIndexOf('\n', offset - 1) + 1;
  for (let i = offset; i > nl; i--) if (text.charCodeAt(i - 1) === 13) return i;
  return nl;
}

/** The 1-based line number of `offset` (for messages). */
export function lineNumber(text: string, offset: number): number {
  return new LineIndex(text).lineCol(offset).line;
}
