/**
 * Results tables written into a note below a ` ```air ` block, between two marker comments:
 *
 *     <!-- dewmark-results 1a2b3c4d: generated from the air block above; refresh it, do not edit -->
 *     …tables and list (see ./resultsTable)…
 *     <!-- dewmark-results end -->
 *
 * The start marker follows the block's closing fence with only blank lines between, inside the
 * same container (block quote, list item). The eight hex digits are a checksum of the contents
 * as generated (after {@link normalizeBody}), so a table edited by hand can be told from one whose
 * block changed. This module finds such tables, builds the text of a fresh one, and reports the
 * stale ones (`stale-results-table`). Pure: text and analysis in, data out.
 */
import type { Analysis } from '../evaluate/types';
import type { AirRegion, CoreDiagnostic } from '../notation/ast';
import type { Span } from '../text/types';
import type { UnitSystem } from '../units/types';
import { blockResults, type ResultsData } from './blockResults';
import { resultsTableMarkdown } from './resultsTable';

/** The stable code of the diagnostic for a written results table that no longer matches its block. */
export const STALE_RESULTS_TABLE = 'stale-results-table';

/** The word in both markers. */
export const RESULTS_MARKER_WORD = 'dewmark-results';

/** The end marker, exactly as written. */
export const RESULTS_END_MARKER = `<!-- ${RESULTS_MARKER_WORD} end -->`;

/** The title of the editor command that writes the tables (named in messages). */
export const RESULTS_COMMAND_TITLE = 'Dewmark: Insert or Refresh Results Table';

const START_RE = /^<!--\s*dewmark-results\s+([0-9a-f]{8})\b.*?-->\s*$/;
const END_RE = /^<!--\s*dewmark-results\s+end\s*-->\s*$/;
/** Any line that mentions the marker word in a comment (a damaged or foreign marker). */
const ANY_MARKER_RE = /^<!--\s*dewmark-results\b/;
const FENCE_RE = /^ {0,3}(`{3,}|~{3,})/;
/** A line that opens a list item (CommonMark bullet or ordered marker), up to three columns in. */
const LIST_ITEM_RE = /^( {0,3})([-+*]|\d{1,9}[.)])(?:[ \t]|$)/;

/**
 * Columns of leading indentation (a tab to the next multiple of four). A marker indented four
 * columns or more is in an indented code block (or a paragraph), not an HTML comment of the
 * container: it does not count.
 */
function indentColumns(s: string): number {
  let col = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c === 32) col++;
    else if (c === 9) col += 4 - (col % 4);
    else break;
  }
  return col;
}

/** The start marker for a table whose normalized contents have checksum `hash`. */
export function resultsStartMarker(hash: string): string {
  return `<!-- ${RESULTS_MARKER_WORD} ${hash}: generated from the air block above; refresh it, do not edit -->`;
}

/** 32-bit FNV-1a of the UTF-16 code units, as 8 hex digits (a checksum, not a security hash). */
export function checksum(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

/**
 * The contents of a table as compared: blank lines dropped, each line trimmed, spaces around cell
 * bars and runs of spaces collapsed, and the dashes of a table's delimiter row shortened to one,
 * so a Markdown formatter that realigns the columns does not make a table stale.
 */
export function normalizeBody(lines: readonly string[]): string {
  const out: string[] = [];
  for (const raw of lines) {
    let line = raw.trim();
    if (line === '') continue;
    line = line.replace(/[ \t]+/g, ' ');
    if (line.startsWith('|')) {
      line = line.replace(/ ?\| ?/g, '|');
      if (/^[|:\- ]+$/.test(line)) line = line.replace(/-+/g, '-');
    }
    out.push(line);
  }
  return out.join('\n');
}

/** A results table found below a block. */
export interface WrittenTable {
  /** The block it belongs to. */
  region: AirRegion;
  /** The start marker comment (without the container prefix of its line). */
  start: Span;
  /** The end marker comment; null when it is missing. */
  end: Span | null;
  /** The checksum written in the start marker. */
  writtenHash: string;
  /** The lines between the markers, container prefixes removed (empty when there is no end marker). */
  body: string[];
}

/** Where a block's table goes: after the closing fence, with each line behind the container prefix. */
export interface TableSlot {
  region: AirRegion;
  /** Offset of the end of the closing fence line (where a new table is inserted). */
  insertAt: number;
  /** What starts each line inside the block's container (`> ` in a block quote, spaces in a list item). */
  prefix: string;
  /** The table already there, if any. */
  table: WrittenTable | null;
}

interface Line {
  start: number;
  /** End of the content, before `\r\n` or `\n`. */
  end: number;
  /** Start of the next line (text length at the end). */
  next: number;
}

function lineAt(text: string, start: number): Line {
  const nl = text.indexOf('\n', start);
  const stop = nl < 0 ? text.length : nl;
  const end = stop > start && text.charCodeAt(stop - 1) === 13 ? stop - 1 : stop;
  return { start, end, next: nl < 0 ? text.length : nl + 1 };
}

/** The line's content after the container prefix, or null when the line is outside the container. */
function inside(text: string, line: Line, prefix: string): { content: string; offset: number } | null {
  const raw = text.slice(line.start, line.end);
  if (raw.startsWith(prefix)) return { content: raw.slice(prefix.length), offset: line.start + prefix.length };
  const bare = prefix.trimEnd();
  if (raw.startsWith(bare) && raw.slice(bare.length).trim() === '') return { content: '', offset: line.end };
  return null;
}

/** True when the region is a fence closed by its own closing fence (not one running to the end of its container). */
function closedFence(text: string, region: AirRegion): boolean {
  const open = FENCE_RE.exec(text.slice(region.span.start, region.span.start + 64));
  const lastLineStart = text.lastIndexOf('\n', region.span.end - 1) + 1;
  if (!open?.[1] || lastLineStart <= region.span.start) return false;
  const lastLine = text.slice(lastLineStart, region.span.end);
  const close = /(`{3,}|~{3,})[ \t]*$/.exec(lastLine);
  return (
    !!close?.[1] &&
    close[1][0] === open[1][0] &&
    close[1].length >= open[1].length &&
    lastLine.slice(0, close.index).replace(/[> \t]/g, '') === ''
  );
}

/**
 * Where the results table of each fenced block of a note goes, and the table already there. Only
 * closed fences get a slot (an unclosed fence runs to the end of its container).
 */
export function tableSlots(text: string, regions: readonly AirRegion[]): TableSlot[] {
  const fences = regions.filter((r) => r.origin === 'fence');
  const out: TableSlot[] = [];
  const markers: number[] = [];
  for (let at = text.indexOf(RESULTS_MARKER_WORD); at >= 0; at = text.indexOf(RESULTS_MARKER_WORD, at + 1))
    markers.push(at);
  let nextMarker = 0;
  fences.forEach((region, i) => {
    if (!closedFence(text, region)) return;
    const firstLineStart = text.lastIndexOf('\n', region.span.start - 1) + 1;
    // The container prefix as columns: quote markers and blanks kept, list markers blanked. A BOM
    // before the first line is not a column (and `\s` would keep it), so it is dropped.
    const prefix = text
      .slice(firstLineStart, region.span.start)
      .replace(/^\uFEFF/, '')
      .replace(/[^> \t]/g, ' ');
    const slot: TableSlot = { region, insertAt: region.span.end, prefix, table: null };
    out.push(slot);
    const limit = fences[i + 1]?.span.start ?? text.length;
    while (nextMarker < markers.length && markers[nextMarker]! < region.span.end) nextMarker++;
    if (nextMarker >= markers.length || markers[nextMarker]! >= limit) return;
    let line = lineAt(text, lineAt(text, region.span.end).next);
    // Blank lines, then the start marker.
    for (;;) {
      if (line.start >= text.length || line.start >= limit) return;
      const c = inside(text, line, prefix);
      if (!c) return;
      if (c.content.trim() !== '') break;
      line = lineAt(text, line.next);
    }
    const first = inside(text, line, prefix)!;
    const startText = first.content.trimEnd();
    const m = START_RE.exec(startText);
    if (!m) return;
    const table: WrittenTable = {
      region,
      start: { start: first.offset, end: first.offset + startText.length },
      end: null,
      writtenHash: m[1]!,
      body: [],
    };
    slot.table = table;
    const body: string[] = [];
    // The smallest content column of a list item opened inside the table: a line indented that
    // far may belong to the item, so a marker there is not in the fence's container.
    let listColumn = Infinity;
    for (
      line = lineAt(text, line.next);
      line.start < text.length && line.start < limit;
      line = lineAt(text, line.next)
    ) {
      const c = inside(text, line, prefix);
      if (!c) return;
      const t = c.content.trim();
      const indent = indentColumns(c.content);
      if (END_RE.test(t) && indent < 4 && indent < listColumn) {
        const at = c.offset + c.content.indexOf('<');
        table.end = { start: at, end: at + t.length };
        table.body = body;
        return;
      }
      if (ANY_MARKER_RE.test(t) || FENCE_RE.test(c.content)) return;
      const item = LIST_ITEM_RE.exec(c.content);
      if (item) listColumn = Math.min(listColumn, indent + item[2]!.length + 1);
      body.push(c.content);
    }
  });
  return out;
}

/** A fresh table: its body lines, their normalized form, and the checksum its start marker carries. */
interface Fresh {
  lines: string[];
  /** The body as the command writes it, blank lines around, joined by `\n`. */
  raw: string;
  normalized: string;
  hash: string;
}

/** Fresh tables by their (reused, read-only) results data. */
const freshByData = new WeakMap<ResultsData, Fresh>();

function fresh(analysis: Analysis, region: AirRegion, system?: UnitSystem): Fresh {
  const data = blockResults(analysis, region, system);
  let f = freshByData.get(data);
  if (!f) {
    const lines = resultsTableMarkdown(data);
    const normalized = normalizeBody(lines);
    f = { lines, raw: ['', ...lines, ''].join('\n'), normalized, hash: checksum(normalized) };
    freshByData.set(data, f);
  }
  return f;
}

/** The body lines of a fresh table for `region`, and the checksum its start marker carries. */
export function freshTable(
  analysis: Analysis,
  region: AirRegion,
  system?: UnitSystem,
): { lines: string[]; hash: string } {
  const f = fresh(analysis, region, system);
  return { lines: [...f.lines], hash: f.hash };
}

/** How a written table compares with a fresh one. */
export type TableState = 'fresh' | 'results-changed' | 'edited' | 'checksum' | 'unterminated';

/** Compares a written table with what the block computes now. */
export function tableState(analysis: Analysis, table: WrittenTable, system?: UnitSystem): TableState {
  if (!table.end) return 'unterminated';
  const now = fresh(analysis, table.region, system);
  // As written by the command (the usual case), or else after a formatter's realignment.
  const written = table.body.join('\n') === now.raw ? now.normalized : normalizeBody(table.body);
  if (written === now.normalized) return table.writtenHash === now.hash ? 'fresh' : 'checksum';
  return checksum(written) === table.writtenHash ? 'results-changed' : 'edited';
}

/**
 * 1-based line numbers of increasing offsets, counted by one cursor moving forward through the
 * text (so numbering every table of a note costs one pass, not one pass per table).
 */
class ForwardLines {
  private at = 0;
  private line = 1;
  constructor(private readonly text: string) {}

  /** The line of `offset`; offsets must not decrease between calls. */
  of(offset: number): number {
    for (let i = this.text.indexOf('\n', this.at); i >= 0 && i < offset; i = this.text.indexOf('\n', i + 1)) {
      this.line++;
      this.at = i + 1;
    }
    return this.line;
  }
}

const RUN = `Run "${RESULTS_COMMAND_TITLE}" (or the code action "Refresh the results table") to rewrite it`;

/**
 * A `stale-results-table` warning for every written results table that does not match what its
 * block computes now, on the table's start marker. Cheap when the note holds no marker.
 */
export function staleTableDiagnostics(analysis: Analysis, text: string): CoreDiagnostic[] {
  if (!text.includes(RESULTS_MARKER_WORD)) return [];
  const out: CoreDiagnostic[] = [];
  const lines = new ForwardLines(text);
  for (const slot of tableSlots(text, analysis.parsed.regions)) {
    const table = slot.table;
    if (!table) continue;
    const state = tableState(analysis, table);
    if (state === 'fresh') continue;
    const where = `the results table below the air block at line ${lines.of(slot.region.span.start)}`;
    let message: string;
    switch (state) {
      case 'unterminated':
        message =
          `${where} has no end marker ${RESULTS_END_MARKER}, so it cannot be refreshed. Add that line ` +
          `after the table (or delete the table and its start marker), then run "${RESULTS_COMMAND_TITLE}"`;
        break;
      case 'edited':
        message =
          `${where} was edited by hand: its contents match neither its checksum nor the ` +
          `block's computed results. ${RUN} (hand edits between the markers are replaced)`;
        break;
      case 'checksum':
        message =
          `${where} shows the current results, ` +
          `but the checksum in its start marker ` +
          `does not match them. ${RUN}`;
        break;
      default: {
        message = `${where} is out of date: the block's computed results changed since it was written. ${RUN}`;
        if (analysis.unitsSource === 'setting') {
          const other: UnitSystem = analysis.units === 'SI' ? 'IP' : 'SI';
          if (tableState(analysis, table, other) === 'fresh') {
            message =
              `${where} shows results in ${other}, but this note has no units: line and the ` +
              `unit setting is ${analysis.units}. Add a "units: ${other}" line to the note ` +
              `to keep the table as it is, or ${RUN.charAt(0).toLowerCase()}${RUN.slice(1)}`;
          }
        }
      }
    }
    out.push({ code: STALE_RESULTS_TABLE, severity: 'warning', message, span: table.start, data: { state } });
  }
  return out;
}
