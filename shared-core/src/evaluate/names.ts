/**
 * The names a note defines, found before evaluation (the pre-scan), so that a reference to a name
 * defined further down is `used-before-defined` rather than unknown, and so that the first
 * definition of each name owns it (a second is `duplicate-name`).
 *
 * Only the first definition of a name matters to the evaluator (a later one is a duplicate: it
 * never owns the name, and a reference resolves to the first or is used before it), so the table
 * keeps, per name, the index of the statement that first defines it — a number, no object per
 * name. The definition itself ({@link NameDef}: the name node's span, the statement's keyword) is
 * read back from that statement when a reference or a message needs it.
 */
import type { NameNode, Statement } from '../notation/ast';
import { type NamingStatement, namesSomething } from '../notation/named';
import type { Span } from '../text/types';
import { hasSpecification } from './derive';

/** One name definition found by the pre-scan (state, mix, supply, process or heat recovery). */
export interface NameDef {
  name: string;
  span: Span;
  statementIndex: number;
  keyword: 'state' | 'mix' | 'process' | 'supply' | 'recover';
}

/** The names of a note: where each is first defined, and which processes define their leaving state. */
export class NoteNames {
  /** Name → index of the statement that first defines it, in document order. */
  private readonly first = new Map<string, number>();
  /** Indexes of the process statements that define their leaving state (see {@link scan}). */
  private readonly derives = new Set<number>();
  /**
   * Per statement: 1 when the name written after its keyword is the first definition of that
   * name (it owns the name), so that registering it needs no look-up by name.
   */
  private readonly ownsOwnName: Uint8Array;

  constructor(private readonly statements: readonly Statement[]) {
    this.ownsOwnName = new Uint8Array(statements.length);
  }

  /**
   * The pre-scan: every name a statement defines, in document order. A statement defines its
   * name; a process also defines its leaving state when it has a specification and that name is
   * not defined above; a heat recovery (`recover`) also defines both its leaving states.
   */
  scan(): this {
    const { statements } = this;
    for (let i = 0; i < statements.length; i++) {
      const s = statements[i]!;
      if (!namesSomething(s) || !s.name) continue;
      if (this.add(s.name.text, i)) this.ownsOwnName[i] = 1;
      if (s.keyword === 'process' && s.from && s.to && !this.first.has(s.to.text) && hasSpecification(s)) {
        this.derives.add(i);
        this.add(s.to.text, i);
      }
      if (s.keyword === 'recover') {
        for (const x of s.streams) if (x.to) this.add(x.to.text, i);
      }
    }
    return this;
  }

  /** Records a definition of `name` at statement `index`; true when it is the name's first. */
  private add(name: string, index: number): boolean {
    if (this.first.has(name)) return false;
    this.first.set(name, index);
    return true;
  }

  /** True when process statement `index` defines its leaving state (a specification and a new name). */
  derivesLeaving(index: number): boolean {
    return this.derives.has(index);
  }

  /** Index of the statement that first defines `name`, or -1 when none does. */
  firstIndex(name: string): number {
    return this.first.get(name) ?? -1;
  }

  /** The first definition of `name`, or undefined when the note defines no such name. */
  firstDef(name: string): NameDef | undefined {
    const index = this.first.get(name);
    if (index === undefined) return undefined;
    const s = this.statements[index]!;
    const node = namesSomething(s) ? definingNode(s, name) : null;
    if (!node) return undefined;
    return { name, span: node.span, statementIndex: index, keyword: s.keyword as NameDef['keyword'] };
  }

  /**
   * True when `node`, written in statement `index`, is the first definition of its name (the
   * definition that owns it). A name the pre-scan did not find is recorded now, as owned.
   */
  owns(node: NameNode, index: number): boolean {
    const s = this.statements[index];
    if (s && namesSomething(s) && node === s.name) return this.ownsOwnName[index] === 1;
    const first = this.first.get(node.text);
    if (first === undefined) {
      this.first.set(node.text, index);
      return true;
    }
    if (first !== index) return false;
    // Several names of one statement may be equal (a heat recovery named like its leaving state).
    return !s || !namesSomething(s) || definingNode(s, node.text) === node;
  }

  /** Every defined name, in the order of the first definitions. */
  names(): IterableIterator<string> {
    return this.first.keys();
  }
}

/** The node of statement `s` that defines `name` first, in the pre-scan's order (name, leaving state, streams). */
function definingNode(s: NamingStatement, name: string): NameNode | null {
  if (s.name?.text === name) return s.name;
  if (s.keyword === 'process' && s.to?.text === name) return s.to;
  if (s.keyword === 'recover') for (const x of s.streams) if (x.to?.text === name) return x.to;
  return null;
}
