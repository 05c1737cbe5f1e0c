/**
 * "Insert or refresh results table": the edits that write a Markdown table of each ` ```air `
 * block's computed results below the block, between the marker comments of
 * `present/writtenTables`, so the figures stay readable where the extension does not run (a code
 * host's web view). A block without a table gets one inserted after its closing fence; a block
 * with one gets the text from its start marker to its end marker replaced, and nothing else; a
 * table that is already current (also after a formatter realigned it) is left alone, so applying
 * the edits twice changes nothing the second time. Pure: the note in, edits out.
 */
import {
  freshTable,
  RESULTS_END_MARKER,
  resultsStartMarker,
  STALE_RESULTS_TABLE,
  tableSlots,
  tableState,
  type TableSlot,
} from '../present/writtenTables';
import type { CoreDiagnostic } from '../notation/ast';
import type { Span } from '../text/types';
import type { FixAction } from './codeActions';
import type { CancellationFlag, Edit, Note } from './types';

/** What the command does to one block. */
export type TableChangeKind = 'insert' | 'refresh' | 'unchanged' | 'unterminated';

/** The change to one block's table. */
export interface TableChange {
  /** The fenced block (its span, opening to closing fence). */
  block: Span;
  kind: TableChangeKind;
  /** The edit, for `insert` and `refresh`. */
  edit: Edit | null;
}

/** The plan for some blocks: one change per block, and the edits to apply (in document order). */
export interface TablesPlan {
  changes: TableChange[];
  edits: Edit[];
}

/** Which blocks: every fenced block, or the one at an offset (in the block or in its table). */
export type TablesScope = { kind: 'all' } | { kind: 'at'; offset: number };

function eolOf(text: string): string {
  return text.includes('\r\n') ? '\r\n' : '\n';
}

/** The lines of a whole table (start marker to end marker), without the first line's prefix. */
function tableText(note: Note, slot: TableSlot): string {
  const { lines, hash } = freshTable(note.analysis, slot.region);
  const bare = slot.prefix.trimEnd();
  const withPrefix = (l: string) => (l === '' ? bare : slot.prefix + l);
  return [resultsStartMarker(hash), ...['', ...lines, ''].map(withPrefix), slot.prefix + RESULTS_END_MARKER].join(
    eolOf(note.text),
  );
}

/** True when the line after `offset`'s line holds something other than blanks (and the container prefix). */
function nextLineHasText(text: string, offset: number, prefix: string): boolean {
  const nl = text.indexOf('\n', offset);
  if (nl < 0) return false;
  const end = text.indexOf('\n', nl + 1);
  const line = text.slice(nl + 1, end < 0 ? text.length : end).replace(/\r$/, '');
  const bare = prefix.trimEnd();
  const rest = line.startsWith(bare) ? line.slice(bare.length) : line;
  return rest.trim() !== '';
}

/** The change for one block. */
function changeFor(note: Note, slot: TableSlot): TableChange {
  const block = slot.region.span;
  const table = slot.table;
  if (!table) {
    const eol = eolOf(note.text);
    const bare = slot.prefix.trimEnd();
    let newText = `${eol}${bare}${eol}${slot.prefix}${tableText(note, slot)}`;
    if (nextLineHasText(note.text, slot.insertAt, slot.prefix)) newText += `${eol}${bare}`;
    return { block, kind: 'insert', edit: { span: { start: slot.insertAt, end: slot.insertAt }, newText } };
  }
  if (!table.end) return { block, kind: 'unterminated', edit: null };
  if (tableState(note.analysis, table) === 'fresh') return { block, kind: 'unchanged', edit: null };
  return {
    block,
    kind: 'refresh',
    edit: { span: { start: table.start.start, end: table.end.end }, newText: tableText(note, slot) },
  };
}

function slotsOf(note: Note): TableSlot[] {
  return tableSlots(note.text, note.analysis.parsed.regions);
}

/** The slot whose block, or whose written table, holds `offset`. */
function slotAt(slots: readonly TableSlot[], offset: number): TableSlot | undefined {
  return slots.find((s) => {
    if (s.region.span.start <= offset && offset <= s.region.span.end) return true;
    const t = s.table;
    return t !== null && t.start.start <= offset && offset <= (t.end ?? t.start).end;
  });
}

/** The edits that insert or refresh the results tables of the blocks in `scope`. */
export function resultsTableEdits(note: Note, scope: TablesScope, token?: CancellationFlag): TablesPlan {
  const slots = slotsOf(note);
  const chosen =
    scope.kind === 'all' ? slots : [slotAt(slots, scope.offset)].filter((s): s is TableSlot => s !== undefined);
  const changes: TableChange[] = [];
  for (const slot of chosen) {
    if (token?.isCancellationRequested) break;
    changes.push(changeFor(note, slot));
  }
  return { changes, edits: changes.flatMap((c) => (c.edit ? [c.edit] : [])) };
}

/** Counts of a plan's changes by kind. */
export function countChanges(plan: TablesPlan): Record<TableChangeKind, number> {
  const out: Record<TableChangeKind, number> = { insert: 0, refresh: 0, unchanged: 0, unterminated: 0 };
  for (const c of plan.changes) out[c.kind]++;
  return out;
}

/** The quick fix of a `stale-results-table` diagnostic: refresh that table. */
export function staleTableFix(note: Note, d: CoreDiagnostic): FixAction[] {
  const slot = slotsOf(note).find((s) => s.table !== null && s.table.start.start === d.span.start);
  if (!slot) return [];
  const change = changeFor(note, slot);
  if (!change.edit) return [];
  return [
    {
      title: 'Refresh the results table below this air block',
      kind: 'quickfix',
      edits: [change.edit],
      diagnostic: d,
      preferred: true,
    },
  ];
}

/** The source actions at `span`: write this block's table, and write every block's table. */
export function resultsTableActions(note: Note, span: Span, token?: CancellationFlag): FixAction[] {
  const slots = slotsOf(note);
  if (slots.length === 0) return [];
  const out: FixAction[] = [];
  const here = slotAt(slots, span.start);
  if (here) {
    const c = changeFor(note, here);
    if (c.edit) {
      const title =
        c.kind === 'insert'
          ? 'Insert a results table below this air block'
          : 'Refresh the results table below this air block';
      out.push({ title, kind: 'source', edits: [c.edit] });
    }
  }
  if (token?.isCancellationRequested) return out;
  const all = resultsTableEdits(note, { kind: 'all' }, token);
  const n = countChanges(all);
  if (all.edits.length > 0 && !(here && all.edits.length === 1 && out.length === 1)) {
    const what = [n.insert > 0 ? `${n.insert} to insert` : '', n.refresh > 0 ? `${n.refresh} to refresh` : '']
      .filter(Boolean)
      .join(', ');
    out.push({
      title: `Insert or refresh the results tables of every air block (${what})`,
      kind: 'source',
      edits: all.edits,
    });
  }
  return out;
}

export { STALE_RESULTS_TABLE };
