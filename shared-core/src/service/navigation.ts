/**
 * Go to definition, find references and rename for state, mix and process names within a note.
 * Rename refuses a name that is not a valid name, is a keyword, or is already defined, with a
 * message saying why and where.
 */
import type { EvaluatedItem } from '../evaluate/types';
import type { Keyword, NameNode } from '../notation/ast';
import { namesSomething } from '../notation/named';
import { KEYWORDS } from '../notation/parse';
import type { Span } from '../text/types';
import { lineNumber, targetAt } from './note';
import type { Edit, Note } from './types';

/** Where a name is defined: the name itself and the whole statement. */
export interface DefinitionTarget {
  nameSpan: Span;
  statementSpan: Span;
}

/** How a name is written: a letter, then letters, digits, `_` or `-`. */
const NAME_RE = /^[A-Za-z][A-Za-z0-9_-]*$/;

/** Words that cannot be names because they start statements. */
const RESERVED: readonly Keyword[] = KEYWORDS;

/** The name under the cursor (a definition or a reference), if any. */
function nameAt(note: Note, offset: number): NameNode | undefined {
  const t = targetAt(note, offset);
  if (t?.kind === 'definition' || t?.kind === 'reference') return t.name;
  // On the `.w` of `OA.w`: the state it names.
  if (t?.kind === 'propertyRef') return t.ref.state;
  return undefined;
}

function definitionOf(note: Note, name: string): EvaluatedItem | undefined {
  return note.analysis.byName.get(name);
}

/** Every span where `name` is written as a name: its definitions and the references to it. */
function occurrences(note: Note, name: string, includeDefinitions: boolean): Span[] {
  const spans: Span[] = [];
  if (includeDefinitions) {
    for (const s of note.analysis.parsed.statements) {
      if (namesSomething(s) && s.name?.text === name) spans.push(s.name.span);
    }
  }
  for (const r of note.analysis.references) if (r.name === name) spans.push(r.span);
  return spans.sort((a, b) => a.start - b.start);
}

/** The definition of the name at `offset`, or null when there is none (or no name there). */
export function definition(note: Note, offset: number): DefinitionTarget | null {
  const name = nameAt(note, offset);
  if (!name) return null;
  const item = definitionOf(note, name.text);
  if (!item) return null;
  // A state a process or recovery defines: its name after '->'.
  if (item.kind !== 'process' && item.definedBy?.nameSpan)
    return { nameSpan: item.definedBy.nameSpan, statementSpan: item.statement.span };
  if (!item.statement.name) return null;
  return { nameSpan: item.statement.name.span, statementSpan: item.statement.span };
}

/** Every place the name at `offset` is used (and defined, with `includeDeclaration`), or null. */
export function references(note: Note, offset: number, includeDeclaration: boolean): Span[] | null {
  const name = nameAt(note, offset);
  if (!name) return null;
  return occurrences(note, name.text, includeDeclaration);
}

/** The span and current text of the name a rename would change, or why it cannot be renamed. */
export function prepareRename(
  note: Note,
  offset: number,
): { span: Span; placeholder: string } | { error: string } | null {
  const name = nameAt(note, offset);
  if (!name) {
    const t = targetAt(note, offset);
    if (!t) return null;
    return { error: 'Only the names of states, mixes and processes can be renamed; place the cursor on a name.' };
  }
  return { span: name.span, placeholder: name.text };
}

/** Why `newName` cannot replace `oldName` in this note, or null when it can. */
export function renameProblem(note: Note, oldName: string, newName: string): string | null {
  if (!NAME_RE.test(newName)) {
    return (
      `"${newName}" is not a valid name: start with a letter, ` +
      `then use letters, digits, "_" or "-" (e.g. AHU-3_off_coil).`
    );
  }
  if ((RESERVED as readonly string[]).includes(newName))
    return `"${newName}" is a statement keyword and cannot be a name; choose another name.`;
  if (newName === oldName) return `The name is already "${newName}".`;
  const clash = definitionOf(note, newName);
  const clashSpan =
    clash && clash.kind !== 'process' && clash.definedBy?.nameSpan
      ? clash.definedBy.nameSpan
      : clash?.statement.name?.span;
  if (clash && clashSpan) {
    return (
      `"${newName}" is already defined on line ${lineNumber(note.text, clashSpan.start)} ` +
      `(${clash.kind} ${newName}); choose a name that is not in use.`
    );
  }
  const used = note.analysis.references.find((r) => r.name === newName);
  if (used) {
    return (
      `"${newName}" is already used on line ${lineNumber(note.text, used.span.start)}; ` +
      `renaming to it would join two different names. Choose a name that is not in use.`
    );
  }
  return null;
}

/** The edits that rename the name at `offset` everywhere in the note, or why they cannot. */
export function rename(note: Note, offset: number, newName: string): { edits: Edit[] } | { error: string } {
  const name = nameAt(note, offset);
  if (!name)
    return { error: 'Only the names of states, mixes and processes can be renamed; place the cursor on a name.' };
  const problem = renameProblem(note, name.text, newName);
  if (problem) return { error: problem };
  return { edits: occurrences(note, name.text, true).map((span) => ({ span, newText: newName })) };
}
