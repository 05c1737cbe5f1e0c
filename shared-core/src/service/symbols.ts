/**
 * The outline: states, mixes, processes and site lines, nested under the Markdown heading they
 * appear beneath (headings nest by level). A heading's span runs to the next heading of the same
 * or a higher level, so it holds everything listed under it.
 */
import type { HeadingNode } from '../notation/ast';
import type { Span } from '../text/types';
import { PROCESS_KIND_TEXT, show } from './format';
import { itemOf } from './note';
import type { CancellationFlag, Note } from './types';

/** One entry of the outline. */
export interface OutlineSymbol {
  name: string;
  kind: 'heading' | 'state' | 'mix' | 'process' | 'supply' | 'site';
  detail: string;
  /** The whole construct (statement, or heading with its section). */
  span: Span;
  /** The part to select and reveal (the name, or the heading line). */
  selectionSpan: Span;
  children: OutlineSymbol[];
}

function statementSymbols(note: Note, token?: CancellationFlag): OutlineSymbol[] {
  const out: OutlineSymbol[] = [];
  const system = note.analysis.units;
  for (const statement of note.analysis.parsed.statements) {
    if (token?.isCancellationRequested) break;
    if (statement.keyword === 'site') {
      const text = note.text.slice(statement.span.start, statement.span.end);
      out.push({
        name: 'site',
        kind: 'site',
        detail: text.replace(/^site:\s*/, ''),
        span: statement.span,
        selectionSpan: statement.keywordSpan,
        children: [],
      });
      continue;
    }
    if (statement.keyword === 'units' || !statement.name) continue;
    const item = itemOf(note, statement);
    let detail = 'not computed';
    if (item?.kind === 'process') {
      detail = `${item.from} → ${item.to}`;
      if (item.processKind) detail += `, ${PROCESS_KIND_TEXT[item.processKind]}`;
      if (item.qTotalW !== null) detail += `, ${show(note, Math.abs(item.qTotalW), 'power', system)}`;
    } else if (item?.state) {
      detail =
        `${show(note, item.state.db, 'temperature', system)} ` +
        `db, ${show(note, item.state.rh, 'fraction', system)} rh`;
    }
    out.push({
      name: statement.name.text,
      kind: statement.keyword === 'recover' ? 'process' : statement.keyword,
      detail,
      span: statement.span,
      selectionSpan: statement.name.span,
      children: [],
    });
  }
  return out;
}

/** The outline of a note: headings (nested by level) with the statements under each. */
export function documentSymbols(note: Note, token?: CancellationFlag): OutlineSymbol[] {
  const statements = statementSymbols(note, token);
  const headings: readonly HeadingNode[] = note.analysis.parsed.headings;
  if (headings.length === 0) return statements;

  const roots: OutlineSymbol[] = [];
  const stack: { level: number; symbol: OutlineSymbol }[] = [];
  const end = note.text.length;
  // Each heading's section ends where the next heading of the same or a higher level starts.
  const sectionEnd = headings.map((h, i) => {
    for (let j = i + 1; j < headings.length; j++) if (headings[j]!.level <= h.level) return headings[j]!.span.start;
    return end;
  });
  let si = 0;
  const place = (sym: OutlineSymbol): void => {
    const parent = stack[stack.length - 1];
    (parent ? parent.symbol.children : roots).push(sym);
  };
  headings.forEach((h, i) => {
    while (si < statements.length && statements[si]!.span.start < h.span.start) {
      // Statements before this heading belong to the innermost open section that holds them.
      while (stack.length > 0 && stack[stack.length - 1]!.symbol.span.end <= statements[si]!.span.start) stack.pop();
      place(statements[si++]!);
    }
    while (stack.length > 0 && stack[stack.length - 1]!.level >= h.level) stack.pop();
    while (stack.length > 0 && stack[stack.length - 1]!.symbol.span.end <= h.span.start) stack.pop();
    const sym: OutlineSymbol = {
      name: h.text || '(untitled heading)',
      kind: 'heading',
      detail: '#'.repeat(h.level),
      span: { start: h.span.start, end: Math.max(h.span.end, sectionEnd[i]!) },
      selectionSpan: h.span,
      children: [],
    };
    place(sym);
    stack.push({ level: h.level, symbol: sym });
  });
  while (si < statements.length) {
    while (stack.length > 0 && stack[stack.length - 1]!.symbol.span.end <= statements[si]!.span.start) stack.pop();
    place(statements[si++]!);
  }
  return roots;
}
