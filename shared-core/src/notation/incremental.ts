/**
 * Incremental parsing for an editor: {@link createNoteParser} returns a parser object that keeps
 * its last note and, for the next text, reuses whatever the edit did not touch. The result is
 * always the one {@link parseNote} gives for the same text (property-tested); only the work differs.
 *
 * - The edit is found as the common prefix and suffix of the old and new text.
 * - An edit inside one body line of an ` ```air ` fence that cannot change the Markdown structure
 *   (no line break typed or removed, the line's first non-blank character kept and not a fence
 *   character, so the line can neither close the fence nor leave its container) skips the
 *   Markdown scan: the regions and headings are the old ones, those after the edit moved by its
 *   length change.
 * - Otherwise the Markdown is scanned again, and each statement whose source (a fence line, or a
 *   code span's pieces) lies wholly before or wholly after the edit, with the same span there as
 *   before (moved by the edit's length change), is taken over instead of being parsed again.
 * A statement taken over after the edit is a copy of the old one with every span moved; before
 * the edit it is the old object itself. The caller may learn which old statement each new one
 * came from (`origins`), which is how the evaluator reuses its own work.
 *
 * The parser holds one note (the last one parsed); it is meant to be kept per open document.
 */
import type {
  CoreDiagnostic,
  HeadingNode,
  MixStream,
  NameNode,
  NumberNode,
  ParsedNote,
  PropertyNode,
  QuantityNode,
  Statement,
  StatementOrigin,
  ToleranceNode,
  UnitNode,
} from './ast';
import type { Span } from '../text/types';
import { extractRegions, type ExtractedNote, type ExtractedRegion, type FenceRegion } from '../markdown/regions';
import { ParsedNumber, ParsedProperty, ParsedQuantity, ParsedState, ParsedUnit } from './nodes';
import { parseNote, parseStatementPieces } from './parse';

/** What {@link NoteParser.parse} returns. */
export interface IncrementalParse {
  /** Exactly what `parseNote(text)` returns for the same text. */
  parsed: ParsedNote;
  /**
   * Per statement of `parsed.statements` (same index): the statement of the previous parse it was
   * taken over from (the same object when it did not move), or null when it was parsed from the text.
   */
  origins: (Statement | null)[];
  /** Per statement (same index): how far it moved from its origin, in UTF-16 code units (0 when not). */
  deltas: number[];
  /** True when the text was the previous one and `parsed` is the previous result itself. */
  unchanged: boolean;
}

/** A parser that reuses its previous note (see the module comment). */
export interface NoteParser {
  /** Parses `text`, reusing the previous parse where the edit allows. Never throws. */
  parse(text: string): IncrementalParse;
  /** Forgets the previous note (the next parse starts from scratch). */
  reset(): void;
}

/** One parse unit: a fence line, or a code span's pieces, with what it parsed to. */
interface Unit {
  origin: StatementOrigin;
  pieces: readonly Span[];
  statement: Statement | null;
  diagnostics: CoreDiagnostic[];
}

/** The previous note as the parser keeps it. */
interface Previous {
  text: string;
  parsed: ParsedNote;
  /** The regions as extracted (the same objects as `parsed.regions`). */
  regions: ExtractedRegion[];
  /** Parse units in document order, and for each the index of its region. */
  units: Unit[];
  unitRegion: number[];
}

/** Creates a parser that keeps its last note and reuses it for the next text. */
export function createNoteParser(): NoteParser {
  let prev: Previous | null = null;
  return {
    parse(text: string): IncrementalParse {
      if (prev && prev.text === text) {
        const statements = prev.parsed.statements;
        return { parsed: prev.parsed, origins: statements.slice(), deltas: statements.map(() => 0), unchanged: true };
      }
      const edit = prev ? findEdit(prev.text, text) : null;
      const fast = prev && edit ? fenceLineEdit(prev, text, edit) : null;
      const next = fast ?? rescan(prev, text, edit);
      prev = next.keep;
      return { parsed: next.keep.parsed, origins: next.origins, deltas: next.deltas, unchanged: false };
    },
    reset(): void {
      prev = null;
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Finding the edit

/** The changed range: old `[start, oldEnd)` became new `[start, newEnd)`; `delta` = length change. */
interface Edit {
  start: number;
  oldEnd: number;
  newEnd: number;
  delta: number;
}

/** Below this many characters the search for the first difference goes one character at a time. */
const LINEAR = 32;

/**
 * The smallest range that differs between `a` and `b`: the common prefix, then the common suffix
 * of what is left. Both are found by halving, comparing whole substrings (which the engine does
 * as a block compare), so a large note costs about one pass over its text.
 */
export function findEdit(a: string, b: string): Edit {
  const n = Math.min(a.length, b.length);
  // Prefix: a[0, lo) equals b[0, lo), and the first difference is before hi.
  let lo = 0;
  let hi = n;
  while (hi - lo > LINEAR) {
    const mid = lo + ((hi - lo) >>> 1);
    if (a.substring(lo, mid) === b.substring(lo, mid)) lo = mid;
    else hi = mid;
  }
  while (lo < n && a.charCodeAt(lo) === b.charCodeAt(lo)) lo++;
  const start = lo;
  // Suffix of the rest: the last s characters agree, at most `room` of them.
  const room = n - start;
  let s = 0;
  let sHi = room;
  while (sHi - s > LINEAR) {
    const mid = s + ((sHi - s) >>> 1);
    if (a.substring(a.length - mid, a.length - s) === b.substring(b.length - mid, b.length - s)) s = mid;
    else sHi = mid;
  }
  while (s < room && a.charCodeAt(a.length - 1 - s) === b.charCodeAt(b.length - 1 - s)) s++;
  return { start, oldEnd: a.length - s, newEnd: b.length - s, delta: b.length - a.length };
}

// ---------------------------------------------------------------------------------------------
// Moving nodes

function shiftSpan(s: Span, d: number): Span {
  return { start: s.start + d, end: s.end + d };
}

function shiftName(n: NameNode | null, d: number): NameNode | null {
  return n === null ? null : { text: n.text, span: shiftSpan(n.span, d) };
}

// Numbers, units, quantities, properties and state statements are built as the parser builds
// them (`nodes.ts`), so that a moved statement equals the one a fresh parse gives.

function shiftNumber(n: NumberNode, d: number): ParsedNumber {
  return new ParsedNumber(n.value, n.text, n.resolution, n.span.start + d);
}

function shiftUnit(u: UnitNode | null, d: number): ParsedUnit | null {
  return u === null ? null : new ParsedUnit(u.text, u.span.start + d);
}

function shiftTolerance(t: ToleranceNode | null, d: number): ToleranceNode | null {
  return t === null
    ? null
    : { number: shiftNumber(t.number, d), unit: shiftUnit(t.unit, d), span: shiftSpan(t.span, d) };
}

function shiftQuantity(q: QuantityNode | null, d: number): ParsedQuantity | null {
  return q === null
    ? null
    : new ParsedQuantity(shiftNumber(q.number, d), shiftUnit(q.unit, d), shiftTolerance(q.tolerance, d));
}

function shiftProps(props: PropertyNode[], d: number): PropertyNode[] {
  const out: PropertyNode[] = new Array<PropertyNode>(props.length);
  for (let i = 0; i < props.length; i++) {
    const p = props[i]!;
    const span = p.span;
    const moved = new ParsedProperty(p.key, shiftQuantity(p.value, d), span.start + d, span.end + d);
    out[i] = moved;
    if (p.ref) {
      const r = p.ref;
      moved.ref = {
        state: shiftName(r.state, d)!,
        key: { text: r.key.text, span: shiftSpan(r.key.span, d) },
        offset: shiftQuantity(r.offset, d),
        span: shiftSpan(r.span, d),
      };
    }
  }
  return out;
}

function shiftStreams(streams: MixStream[], d: number): MixStream[] {
  return streams.map((s) =>
    s.rest
      ? {
          name: shiftName(s.name, d)!,
          amount: shiftQuantity(s.amount, d),
          span: shiftSpan(s.span, d),
          rest: shiftSpan(s.rest, d),
        }
      : { name: shiftName(s.name, d)!, amount: shiftQuantity(s.amount, d), span: shiftSpan(s.span, d) },
  );
}

/** A copy of a statement with every span moved by `d` (the shape the parser builds, key order included). */
export function shiftStatement(s: Statement, d: number): Statement {
  const keywordSpan = shiftSpan(s.keywordSpan, d);
  const span = shiftSpan(s.span, d);
  switch (s.keyword) {
    case 'site':
      return { keyword: 'site', keywordSpan, origin: s.origin, span, props: shiftProps(s.props, d) };
    case 'units':
      return { keyword: 'units', keywordSpan, origin: s.origin, span, system: shiftName(s.system, d) };
    case 'state':
      return new ParsedState(s.origin, span, shiftName(s.name, d), shiftProps(s.props, d));
    case 'mix':
      return {
        keyword: 'mix',
        keywordSpan,
        origin: s.origin,
        span,
        name: shiftName(s.name, d),
        streams: shiftStreams(s.streams, d),
        props: shiftProps(s.props, d),
      };
    case 'supply':
      return {
        keyword: 'supply',
        keywordSpan,
        origin: s.origin,
        span,
        name: shiftName(s.name, d),
        room: shiftName(s.room, d),
        props: shiftProps(s.props, d),
      };
    case 'process':
      return {
        keyword: 'process',
        keywordSpan,
        origin: s.origin,
        span,
        name: shiftName(s.name, d),
        from: shiftName(s.from, d),
        to: shiftName(s.to, d),
        props: shiftProps(s.props, d),
        words: s.words.map((w) => shiftName(w, d)!),
      };
    case 'recover': {
      const streams = s.streams.map((x) => ({
        from: shiftName(x.from, d),
        to: shiftName(x.to, d),
        props: shiftProps(x.props, d),
        span: shiftSpan(x.span, d),
      }));
      return {
        keyword: 'recover',
        keywordSpan,
        origin: s.origin,
        span,
        name: shiftName(s.name, d),
        streams,
        props: streams.flatMap((x) => x.props),
        options: s.options.map((o) => ({
          key: o.key,
          keySpan: shiftSpan(o.keySpan, d),
          word: shiftName(o.word, d)!,
          span: shiftSpan(o.span, d),
        })),
      };
    }
  }
}

/** A copy of a diagnostic with its spans moved by `d`. */
function shiftDiagnostic(x: CoreDiagnostic, d: number): CoreDiagnostic {
  const out: CoreDiagnostic = { ...x, span: shiftSpan(x.span, d) };
  if (x.related) out.related = x.related.map((r) => ({ ...r, span: shiftSpan(r.span, d) }));
  return out;
}

function shiftUnitOf(u: Unit, pieces: readonly Span[], d: number): Unit {
  return {
    origin: u.origin,
    pieces,
    statement: u.statement === null ? null : shiftStatement(u.statement, d),
    diagnostics: u.diagnostics.length === 0 ? u.diagnostics : u.diagnostics.map((x) => shiftDiagnostic(x, d)),
  };
}

function shiftRegion(r: ExtractedRegion, d: number): ExtractedRegion {
  const lines = r.lines.map((l) => shiftSpan(l, d));
  if (r.origin === 'fence') {
    return {
      origin: 'fence',
      span: shiftSpan(r.span, d),
      contentSpan: shiftSpan(r.contentSpan, d),
      lines,
      info: r.info,
      closed: r.closed,
    };
  }
  return { origin: 'inline', span: shiftSpan(r.span, d), contentSpan: shiftSpan(r.contentSpan, d), lines };
}

function shiftHeading(h: HeadingNode, d: number): HeadingNode {
  return { level: h.level, text: h.text, span: shiftSpan(h.span, d) };
}

// ---------------------------------------------------------------------------------------------
// Building the result

interface Built {
  keep: Previous;
  origins: (Statement | null)[];
  deltas: number[];
}

/** Per unit: the old statement its statement was taken over from (or null), and how far it moved. */
interface UnitOrigins {
  from: (Statement | null)[];
  delta: number[];
}

function newOrigins(): UnitOrigins {
  return { from: [], delta: [] };
}

function addOrigin(o: UnitOrigins, from: Statement | null, delta: number): void {
  o.from.push(from);
  o.delta.push(delta);
}

function parseUnit(text: string, origin: StatementOrigin, pieces: readonly Span[]): Unit {
  const r = parseStatementPieces(text, pieces, origin);
  return { origin, pieces, statement: r.statement, diagnostics: r.diagnostics };
}

/** Assembles the ParsedNote from units (and records where each statement came from). */
function assemble(
  text: string,
  regions: ExtractedRegion[],
  headings: HeadingNode[],
  units: Unit[],
  unitRegion: number[],
  unitOrigins: UnitOrigins,
): Built {
  const statements: Statement[] = [];
  const diagnostics: CoreDiagnostic[] = [];
  const origins: (Statement | null)[] = [];
  const deltas: number[] = [];
  for (let i = 0; i < units.length; i++) {
    const u = units[i]!;
    for (const x of u.diagnostics) diagnostics.push(x);
    if (u.statement) {
      statements.push(u.statement);
      origins.push(unitOrigins.from[i] ?? null);
      deltas.push(unitOrigins.delta[i] ?? 0);
    }
  }
  const parsed: ParsedNote = { regions, headings, statements, diagnostics };
  return { keep: { text, parsed, regions, units, unitRegion }, origins, deltas };
}

/** Index of the last unit whose first piece starts at or before `offset` (−1 when none). */
function unitAtOrBefore(units: readonly Unit[], offset: number): number {
  let lo = 0;
  let hi = units.length - 1;
  let found = -1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const first = units[mid]!.pieces[0];
    if (first !== undefined && first.start <= offset) {
      found = mid;
      lo = mid + 1;
    } else hi = mid - 1;
  }
  return found;
}

function isBlank(c: number): boolean {
  return c === 0x20 || c === 0x09;
}

/**
 * The fast path: an edit inside one body line of an air fence that leaves the Markdown structure
 * as it was (see the module comment). Null when the edit is not of that kind.
 */
function fenceLineEdit(prev: Previous, text: string, edit: Edit): Built | null {
  const ui = unitAtOrBefore(prev.units, edit.start);
  if (ui < 0) return null;
  const unit = prev.units[ui]!;
  if (unit.origin !== 'fence' || unit.pieces.length !== 1) return null;
  const line = unit.pieces[0]!;
  if (!(line.start <= edit.start && edit.oldEnd <= line.end)) return null;
  const old = prev.text;
  // The first non-blank character of the line must stay, and must not be a fence character.
  let f = line.start;
  while (f < line.end && isBlank(old.charCodeAt(f))) f++;
  if (f >= line.end || edit.start <= f) return null;
  const first = old.charCodeAt(f);
  if (first === 0x60 || first === 0x7e) return null;
  // No line break typed (none can be removed: the old range lies inside the line's content).
  for (let i = edit.start; i < edit.newEnd; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x0a || c === 0x0d) return null;
  }
  const d = edit.delta;
  const ri = prev.unitRegion[ui]!;
  const region = prev.regions[ri] as FenceRegion;

  // Regions: the edited fence gets its edited line (and those after it) moved; later regions move.
  let regions: ExtractedRegion[];
  const newLine: Span = { start: line.start, end: line.end + d };
  const li = region.lines.indexOf(line);
  if (li < 0) return null;
  let newLines: Span[];
  if (d === 0) {
    newLines = region.lines;
    regions = prev.regions;
  } else {
    newLines = region.lines.slice(0, li);
    newLines.push(newLine);
    for (let k = li + 1; k < region.lines.length; k++) newLines.push(shiftSpan(region.lines[k]!, d));
    const edited: FenceRegion = {
      origin: 'fence',
      span: { start: region.span.start, end: region.span.end + d },
      contentSpan: { start: region.contentSpan.start, end: region.contentSpan.end + d },
      lines: newLines,
      info: region.info,
      closed: region.closed,
    };
    regions = prev.regions.slice(0, ri);
    regions.push(edited);
    for (let k = ri + 1; k < prev.regions.length; k++) regions.push(shiftRegion(prev.regions[k]!, d));
  }
  const headings =
    d === 0
      ? prev.parsed.headings
      : prev.parsed.headings.map((h) => (h.span.start >= edit.oldEnd ? shiftHeading(h, d) : h));

  // Units: those before the edited line are kept, the edited line is parsed, those after move.
  const units: Unit[] = prev.units.slice(0, ui);
  const unitOrigins = newOrigins();
  for (let k = 0; k < ui; k++) {
    const s = prev.units[k]!.statement;
    addOrigin(unitOrigins, s, 0);
  }
  units.push(parseUnit(text, 'fence', [d === 0 ? line : newLine]));
  addOrigin(unitOrigins, null, 0);
  // The moved units take their pieces from the regions just built, walked in the same order as
  // the units were made (each fence line, each code span).
  let k = ui + 1;
  const move = (pieces: readonly Span[]): boolean => {
    const u = prev.units[k++];
    if (!u) return false;
    const st = u.statement;
    if (d === 0) {
      units.push(u);
      addOrigin(unitOrigins, st, 0);
    } else {
      units.push(shiftUnitOf(u, pieces, d));
      addOrigin(unitOrigins, st, d);
    }
    return true;
  };
  for (let l = li + 1; l < newLines.length; l++) if (!move([newLines[l]!])) return null;
  for (let r = ri + 1; r < regions.length; r++) {
    const reg = regions[r]!;
    if (reg.origin === 'inline') {
      if (!move(reg.lines)) return null;
    } else for (const l of reg.lines) if (!move([l])) return null;
  }
  if (k !== prev.units.length) return null;
  return assemble(text, regions, headings, units, prev.unitRegion, unitOrigins);
}

/** The general path: scan the Markdown again, take over the statements the edit did not touch. */
function rescan(prev: Previous | null, text: string, edit: Edit | null): Built {
  let extracted: ExtractedNote;
  try {
    extracted = extractRegions(text);
  } catch {
    // parseNote turns the failure into its diagnostic; keep that result and nothing to reuse.
    const parsed = parseNote(text);
    return {
      keep: { text, parsed, regions: [], units: [], unitRegion: [] },
      origins: parsed.statements.map(() => null),
      deltas: parsed.statements.map(() => 0),
    };
  }
  const units: Unit[] = [];
  const unitRegion: number[] = [];
  const unitOrigins = newOrigins();
  const take = (origin: StatementOrigin, pieces: readonly Span[], ri: number): void => {
    unitRegion.push(ri);
    const reused = prev && edit ? reuse(prev, edit, origin, pieces) : null;
    if (reused) {
      units.push(reused.unit);
      addOrigin(unitOrigins, reused.unit.statement ? reused.from : null, reused.delta);
      return;
    }
    units.push(parseUnit(text, origin, pieces));
    addOrigin(unitOrigins, null, 0);
  };
  extracted.regions.forEach((region, ri) => {
    if (region.origin === 'inline') take('inline', region.lines, ri);
    else for (const line of region.lines) take('fence', [line], ri);
  });
  return assemble(text, extracted.regions, extracted.headings, units, unitRegion, unitOrigins);
}

/**
 * The previous unit with the same source as `pieces`, wholly before the edit (same offsets) or
 * wholly after it (offsets moved by the edit's length change), moved to its new place; else null.
 * One character of margin on each side keeps a look at a neighbouring character out of question.
 */
function reuse(
  prev: Previous,
  edit: Edit,
  origin: StatementOrigin,
  pieces: readonly Span[],
): { unit: Unit; from: Statement | null; delta: number } | null {
  const first = pieces[0];
  const last = pieces[pieces.length - 1];
  if (!first || !last) return null;
  let d: number;
  if (last.end < edit.start) d = 0;
  else if (first.start > edit.newEnd) d = edit.delta;
  else return null;
  const oldStart = first.start - d;
  const i = unitAtOrBefore(prev.units, oldStart);
  if (i < 0) return null;
  const u = prev.units[i]!;
  if (u.origin !== origin || u.pieces.length !== pieces.length) return null;
  for (let k = 0; k < pieces.length; k++) {
    const a = u.pieces[k]!;
    const b = pieces[k]!;
    if (a.start + d !== b.start || a.end + d !== b.end) return null;
  }
  if (d === 0) return { unit: { ...u, pieces }, from: u.statement, delta: 0 };
  return { unit: shiftUnitOf(u, pieces, d), from: u.statement, delta: d };
}
