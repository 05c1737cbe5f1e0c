/**
 * The plain states an evaluation that hands its items out (`EvalContext` with a sink: the command
 * line writing a large note's results as it reads them) has let go, and how to get one back.
 *
 * Such an evaluation keeps no statement and no item of its own, but a later statement may refer
 * to any name above it. A state written on one line of an air fence, with no reference of its
 * own, is a function of that line, the pressure in force there and the settings: so it is let go
 * once handed out, keeping only the line's two offsets and the pressure basis (one slot per
 * statement in typed arrays; each basis once where it comes into force). The first reference to
 * it reads the line again and evaluates it again, without its diagnostics (they were reported the
 * first time), and the result is kept from then on. Every other item (a mix, a process, a state
 * with references, a state written in a code span) is kept as it was made. A note whose states
 * are never referred to thus costs a fixed amount per state, however many there are.
 */
import { parseStatementText } from '../notation/parse';
import type { EvalContext } from './context';
import { evaluateState } from './state';
import type { EvaluatedItem, PressureBasis, StateResult } from './types';

/** Statements the slots are made for at their first doubling, at least; they double as needed. */
const FIRST_SLOTS = 1024;

/** The slots before the first state is let go (none). */
const NO_SLOTS = new Int32Array(0);

/** Statements the slots are made for at the first state let go (see {@link ForgottenStates.forget}). */
const FEW_SLOTS = 64;

/** Plain states let go by their statement index (see the module comment). */
export class ForgottenStates {
  /**
   * Per statement index: the start of its fence line plus one, or 0 when it was not let go (so
   * that the slots are ready as made: zeroed). The slots are made at the first state let go, and
   * made again, for the states the note is expected to hold, some states later (see {@link forget}).
   */
  private starts: Int32Array = NO_SLOTS;
  /** Per statement index: the end of its fence line. */
  private ends: Int32Array = NO_SLOTS;
  /** Per statement index: the place of its pressure basis in {@link bases}. */
  private basisOf: Int32Array = NO_SLOTS;
  /** The pressure bases in force where states were let go, each once. */
  private readonly bases: PressureBasis[] = [];
  /** How many slots are made at the first doubling, at least. */
  private readonly firstSlots: number;

  /**
   * @param expected  about how many statements the note holds (a guess; 0 when unknown): the
   *   slots are made for them at their first doubling, rather than doubled and copied as they fill (room not used
   *   costs address space only: the arrays are made zeroed, and no page of them is written before
   *   a slot on it is).
   */
  constructor(
    private readonly text: string,
    expected = 0,
  ) {
    this.firstSlots = Math.max(FIRST_SLOTS, Math.ceil(expected));
  }

  /**
   * True when `item`, made by a statement whose fence line starts at `lineStart` (−1 for a code
   * span's statement), can be let go: a `state` statement's own result with no reference (see
   * the module comment).
   */
  static canForget(item: EvaluatedItem, lineStart: number): boolean {
    return lineStart >= 0 && item.kind === 'state' && item.statement.keyword === 'state' && item.sources === undefined;
  }

  /** Lets go of the state of statement `index`, written on [lineStart, lineEnd) and evaluated under `basis`. */
  forget(index: number, lineStart: number, lineEnd: number, basis: PressureBasis): void {
    // The slots are made by the same call as a later doubling, first for a few states, then (at
    // the first doubling, some states later) for as many as the note is expected to hold: so the
    // engine has met the call while it collects type feedback for this code (which it does from
    // some calls on, not from the first), and a doubling late in a long note (past the guess)
    // does not throw its optimised code away.
    if (index >= this.starts.length) this.grow(index + 1);
    // The pressure in force changes only forward (at a site: line), so the last basis is the one
    // to compare with; one seen before is listed again, which costs a slot and no search.
    let b = this.bases.length - 1;
    if (b < 0 || this.bases[b] !== basis) b = this.bases.push(basis) - 1;
    this.starts[index] = lineStart + 1;
    this.ends[index] = lineEnd;
    this.basisOf[index] = b;
  }

  /**
   * The state of statement `index` evaluated again in `ctx` (under the pressure it was evaluated
   * under, its diagnostics not reported again), or null when it was not let go.
   */
  recall(ctx: EvalContext, index: number): StateResult | null {
    if (index < 0 || index >= this.starts.length) return null;
    const start = this.starts[index]! - 1;
    if (start < 0) return null;
    const stmt = parseStatementText(this.text, start, this.ends[index]!, 'fence').statement;
    if (stmt?.keyword !== 'state') return null;
    this.starts[index] = 0;
    return ctx.quietly(this.bases[this.basisOf[index]!]!, () => evaluateState(ctx, stmt, index, true));
  }

  /** Makes the slots, or doubles them, for `need` statements at least. */
  private grow(need: number): void {
    let n = this.starts.length === 0 ? FEW_SLOTS : Math.max(this.firstSlots, this.starts.length * 2);
    while (n < need) n *= 2;
    const starts = new Int32Array(n);
    starts.set(this.starts);
    const ends = new Int32Array(n);
    ends.set(this.ends);
    const basisOf = new Int32Array(n);
    basisOf.set(this.basisOf);
    this.starts = starts;
    this.ends = ends;
    this.basisOf = basisOf;
  }
}
