/**
 * The names a note defines. A statement defines its name; a process also defines its leaving
 * state when it has a specification and that name is not defined above (nor by its own name); a
 * heat recovery (`recover`) also defines both its leaving states. The first definition of a name
 * owns it (a second is `duplicate-name`).
 *
 * Names are registered as the evaluator reaches their statements, in document order, so the
 * registry holds exactly the names defined so far. What the rest of the note defines is needed
 * only for a reference to a name not defined above (`used-before-defined` rather than unknown,
 * and the suggestions of `unknown-name`): the whole note is scanned then, once, by the same rules.
 *
 * Only the first definition of a name matters (a later one never owns it, and a reference
 * resolves to the first or is used before it), so each table keeps, per name, the index of the
 * statement that first defines it — a number, no object per name. The definition itself
 * ({@link NameDef}: the name node's span, the statement's keyword) is read back from that
 * statement when a reference or a message needs it.
 */
import type { NameNode, ProcessStatement, Statement } from '../notation/ast';
import { type NamingStatement, namesSomething } from '../notation/named';
import type { Span } from '../text/types';
import { hasSpecification } from './derive';
import { NameTable } from './nameTable';

/** One name definition (state, mix, supply, process or heat recovery). */
export interface NameDef {
  name: string;
  span: Span;
  statementIndex: number;
  keyword: 'state' | 'mix' | 'process' | 'supply' | 'recover';
}

/**
 * Where {@link NoteNames} reads the statements that define names: the note's list of statements,
 * or (when the evaluator takes the statements one at a time and keeps none, see
 * `EvalContext.handingOut`) the statement that defined a name so far, and the whole list made
 * when a message needs the rest of the note.
 */
export interface NoteStatements {
  /** Statement `index`, which defines `name` (a registered name). */
  defining(name: string, index: number): Statement | undefined;
  /** Every statement of the note. */
  all(): readonly Statement[];
}

/** The {@link NoteStatements} of a list of statements. */
export function statementList(statements: readonly Statement[]): NoteStatements {
  return { defining: (_name, index) => statements[index], all: () => statements };
}

/** The names of a note: those defined so far, and (when asked) those of the whole note. */
export class NoteNames {
  /** Name → index of the statement that first defines it, for the statements registered so far. */
  private readonly registered: NameTable;
  /** The same for the whole note, made at the first question about a name not defined above. */
  private whole: Map<string, number> | null = null;

  /** @param expected  about how many names the note defines (a guess, for the table's first size; 0 when unknown). */
  constructor(
    private readonly statements: NoteStatements,
    expected = 0,
  ) {
    this.registered = new NameTable(expected);
  }

  /**
   * Registers the name `node` written in statement `index` (the evaluator registers every name
   * a statement defines, in the order of {@link scanNote}, before evaluating it). True when it is
   * the name's first definition, which owns the name.
   */
  define(node: NameNode, index: number): boolean {
    return this.registered.add(node.text, index);
  }

  /**
   * True when process `stmt`, whose own name is registered, defines its leaving state: it has a
   * specification and the leaving state's name is not defined above (nor by its own name).
   */
  derivesLeaving(stmt: ProcessStatement): boolean {
    return derives(stmt, this.registered);
  }

  /** Index of the statement that first defines `name` among those registered so far, or -1. */
  firstIndex(name: string): number {
    return this.registered.get(name);
  }

  /**
   * The first definition of `name`: among the names registered so far, else anywhere further
   * down the note; undefined when the note defines no such name.
   */
  firstDef(name: string): NameDef | undefined {
    const first = this.registered.get(name);
    const index = first >= 0 ? first : this.wholeNote().get(name);
    if (index === undefined) return undefined;
    const s = first >= 0 ? this.statements.defining(name, index) : this.statements.all()[index];
    if (!s || !namesSomething(s)) return undefined;
    const node = definingNode(s, name);
    if (!node) return undefined;
    return { name, span: node.span, statementIndex: index, keyword: s.keyword };
  }

  /** Every name the note defines, in the order of their first definitions. */
  names(): IterableIterator<string> {
    return this.wholeNote().keys();
  }

  private wholeNote(): Map<string, number> {
    this.whole ??= scanNote(this.statements.all());
    return this.whole;
  }
}

/**
 * Every name the statements define (name → index of the first statement that defines it), in
 * document order: a statement's name, then a process's leaving state, then a heat recovery's
 * leaving states.
 */
function scanNote(statements: readonly Statement[]): Map<string, number> {
  const first = new Map<string, number>();
  const add = (name: string, index: number): void => {
    if (!first.has(name)) first.set(name, index);
  };
  for (let i = 0; i < statements.length; i++) {
    const s = statements[i]!;
    if (!namesSomething(s) || !s.name) continue;
    add(s.name.text, i);
    if (s.keyword === 'process' && s.to && derives(s, first)) add(s.to.text, i);
    if (s.keyword === 'recover') for (const x of s.streams) if (x.to) add(x.to.text, i);
  }
  return first;
}

/** The rule of {@link NoteNames.derivesLeaving}, against the names `defined` so far. */
function derives(stmt: ProcessStatement, defined: { has(name: string): boolean }): boolean {
  return !!stmt.name && !!stmt.from && !!stmt.to && !defined.has(stmt.to.text) && hasSpecification(stmt);
}

/** The node of statement `s` that defines `name` first, in the order of {@link scanNote}. */
function definingNode(s: NamingStatement, name: string): NameNode | null {
  if (s.name?.text === name) return s.name;
  if (s.keyword === 'process' && s.to?.text === name) return s.to;
  if (s.keyword === 'recover') for (const x of s.streams) if (x.to?.text === name) return x.to;
  return null;
}
