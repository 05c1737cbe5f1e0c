/**
 * The statements of an evaluation that hands its items out (`evaluateHandingOut`), taken from the
 * parser a group at a time: the parser hands each statement over as it reads it, and the group
 * keeps up to {@link STATEMENTS_PER_GROUP} of them (with their fence lines) before evaluating them, in order.
 *
 * Evaluating each statement as soon as it is read makes the processor go back and forth between
 * the parser's code and data and the evaluator's (and the state solver's) at every line, and each
 * time find little of the other's left in its caches. Taken a group at a time, each runs over many
 * lines in a row. Nothing else changes: the statements are evaluated in the same order, each
 * once, in the same context, so every item, name and message is the same (the parser keeps no
 * statement and changes none after handing it over: `parseNote` keeps them all). A group is
 * small, so memory stays flat however long the note.
 */
import type { Statement } from '../notation/ast';

/** Statements read before a group is evaluated. */
export const STATEMENTS_PER_GROUP = 64;

/** A group of statements waiting to be evaluated (see the module comment). */
export class StatementGroup {
  private readonly statements: (Statement | undefined)[] = [];
  /** Per statement: its fence line's start and end (−1 for a code span's). */
  private readonly lineStarts = new Int32Array(STATEMENTS_PER_GROUP);
  private readonly lineEnds = new Int32Array(STATEMENTS_PER_GROUP);
  private n = 0;

  /** @param evaluate  evaluates one statement (never throws). */
  constructor(private readonly evaluate: (stmt: Statement, lineStart: number, lineEnd: number) => void) {}

  /** Takes statement `stmt`, written on the fence line [lineStart, lineEnd); evaluates the group when full. */
  add(stmt: Statement, lineStart: number, lineEnd: number): void {
    const k = this.n;
    this.statements[k] = stmt;
    this.lineStarts[k] = lineStart;
    this.lineEnds[k] = lineEnd;
    this.n = k + 1;
    if (this.n === STATEMENTS_PER_GROUP) this.flush();
  }

  /** Evaluates the statements taken so far, in order, and lets them go. */
  flush(): void {
    const n = this.n;
    this.n = 0;
    for (let k = 0; k < n; k++) {
      const stmt = this.statements[k]!;
      this.statements[k] = undefined;
      this.evaluate(stmt, this.lineStarts[k]!, this.lineEnds[k]!);
    }
  }
}
