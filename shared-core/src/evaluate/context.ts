/** The evaluator's running state while it walks a note: settings, pressure, names, diagnostics. */
import type { CoreDiagnostic, NameNode, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import type { UnitSystem } from '../units/types';
import { LineIndex } from '../text/lineIndex';
import { solveForNote } from './solve';
import type { EvaluateSettings, EvaluatedItem, PressureBasis } from './types';
import type { MessageText } from '../physics/message';
import type { Dimension } from '../units/types';
import { figureText, messageText, type FigureTextOptions } from './figures';
import { caseFoldedIndex, suggestName, type FoldedIndex } from '../text/suggest';
import type { NameDef, NoteNames } from './names';
import { ForgottenStates } from './forgotten';

export type { NameDef } from './names';

/** Outcome of resolving a reference. */
export type RefOutcome =
  | { ok: true; item: EvaluatedItem; def: NameDef }
  /** Defined earlier but not computable: the statement that defined it already reported why. */
  | { ok: false; failed: true; def: NameDef }
  | { ok: false; failed: false };

/** Mutable state of one evaluation pass. */
export class EvalContext {
  readonly settings: EvaluateSettings;
  readonly diagnostics: CoreDiagnostic[] = [];
  readonly items: EvaluatedItem[] = [];
  /**
   * The items of the names' first definitions (the ones that own them), once an item does not own
   * its name; null while every item does (then they are {@link items}: no second list).
   */
  private ownerItems: EvaluatedItem[] | null = null;
  /** {@link byName} once made (at the first reference resolved, or by the analysis when read). */
  private byNameMap: Map<string, EvaluatedItem> | null = null;
  readonly references: { name: string; span: Span; statement: Statement }[] = [];
  /**
   * The names the note defines: those registered so far (the first definition of each name owns
   * it), and those further down for `used-before-defined` and suggestions. With {@link owners} it
   * is the registry of names.
   */
  readonly names: NoteNames;
  units: UnitSystem;
  unitsSource: 'note' | 'setting' = 'setting';
  unitsSpan: Span | null = null;
  /** The pressure that applies to the statements from here on. */
  site: PressureBasis;
  /**
   * The state solver the statements use: {@link solveForNote}, or a memoizing wrapper of it when
   * an analyzer reuses its previous run (same results either way). It reads its input during the
   * call only and keeps nothing of it.
   */
  solve: typeof solveForNote = solveForNote;
  /** The note's text (for line numbers in messages), and its line index once a message needs it. */
  private readonly text: string | undefined;
  private lines: LineIndex | null = null;
  /** The defined names indexed for "did you mean", built at the first unknown name (one index for all of them). */
  private nameIndex: FoldedIndex | null = null;
  /** Where items go when they are handed out rather than kept (see {@link handingOut}). */
  private sink: ((item: EvaluatedItem) => void) | null = null;
  /** The plain states let go after they were handed out (see `./forgotten`). */
  private forgotten: ForgottenStates | null = null;
  /** The statement being evaluated, and its fence line (−1 for a code span's): set by the evaluation. */
  index = -1;
  lineStart = -1;
  lineEnd = -1;
  /** True while a state let go is evaluated again: its diagnostics were reported the first time. */
  private muted = false;

  /**
   * @param units  the note's unit system: that of its `units:` line when it has one, else the
   *               setting's (found before evaluation, so that every message speaks the note's
   *               units wherever the line stands).
   * @param names  the names the note defines (none registered yet).
   */
  constructor(settings: EvaluateSettings, text: string | undefined, units: UnitSystem, names: NoteNames) {
    this.settings = settings;
    this.names = names;
    this.units = units;
    this.text = typeof text === 'string' ? text : undefined;
    const origin = settings.pressureOrigin === 'default' ? 'default' : settings.pressureOrigin;
    this.site = {
      pa: settings.pressurePa,
      source: 'setting',
      span: null,
      elevationM: null,
      describe: `${origin} ${figureText(settings.pressurePa, 'pressure', units)}`,
      // The origin words end in ", i.e." or ":" when they lead into the figure of `describe`.
      origin:
        settings.pressureOrigin === 'default' ? 'default (no site: line)' : origin.replace(/(,\s*i\.e\.|:)\s*$/, ''),
    };
  }

  /** An SI value as a message shows it, in the note's unit system (`84.556 kPa`, `12.264 psia`). */
  fig(si: number, dimension: Dimension, opts?: FigureTextOptions): string {
    return figureText(si, dimension, this.units, opts);
  }

  /** A message with figures (`physics/message.ts`) in the note's unit system. */
  words(m: MessageText): string {
    return messageText(m, this.units);
  }

  /** Adds a diagnostic. */
  report(d: CoreDiagnostic): void {
    if (!this.muted) this.diagnostics.push(d);
  }

  /**
   * Hands every item to `sink` as it is made instead of keeping it in {@link items}, and lets go
   * of the plain states among them (`./forgotten`), which a reference evaluates again: for a
   * reader that is done with an item once it has it (the command line writing a large note).
   * Called before the first statement, on a context given the note's text (a state let go is read
   * back from it); the analysis is the same, less its items. `expected`: about how many
   * statements the note holds (a guess for the first size of the slots of the states let go).
   */
  handingOut(sink: (item: EvaluatedItem) => void, expected = 0): void {
    this.sink = sink;
    this.forgotten = new ForgottenStates(this.text ?? '', expected);
    this.byNameMap = new Map();
  }

  /** `run()` under the pressure basis `site`, its diagnostics not reported (see `./forgotten`). */
  quietly<T>(site: PressureBasis, run: () => T): T {
    const { site: was, muted } = this;
    this.site = site;
    this.muted = true;
    try {
      return run();
    } finally {
      this.site = was;
      this.muted = muted;
    }
  }

  /** "line 12" when the source text is known, else "" (messages read well either way). */
  lineWord(span: Span): string {
    if (this.text === undefined) return '';
    try {
      this.lines ??= new LineIndex(this.text);
      return `line ${this.lines.lineCol(span.start).line}`;
    } catch {
      return '';
    }
  }

  /** " (line 12)" or "". */
  atLine(span: Span): string {
    const w = this.lineWord(span);
    return w ? ` (${w})` : '';
  }

  /**
   * Registers the name `node` written in statement `index`: true when it is the name's first
   * definition, which owns the name; else reports `duplicate-name` and returns false.
   */
  define(node: NameNode, index: number): boolean {
    if (this.names.define(node, index)) return true;
    this.duplicateName(node);
    return false;
  }

  /** Reports `duplicate-name` for `node`, a name defined above. */
  private duplicateName(node: NameNode): void {
    const name = node.text;
    const first = this.names.firstDef(name)!;
    this.report({
      code: 'duplicate-name',
      severity: 'error',
      message:
        `'${name}' is already defined by the ${first.keyword} ` +
        `statement${this.atLine(first.span)}; rename this one ` +
        `(e.g. '${name}_2') or remove one of the two definitions`,
      span: node.span,
      related: [{ span: first.span, message: `first definition of '${name}'` }],
      data: { name },
    });
  }

  /** Stores an evaluated item (and links it to its name when this statement owns the name). */
  addItem(item: EvaluatedItem, owner: boolean): void {
    if (this.sink) {
      this.sink(item);
      if (!owner) return;
      if (ForgottenStates.canForget(item, this.lineStart))
        this.forgotten!.forget(this.index, this.lineStart, this.lineEnd, this.site);
      else this.byNameMap!.set(item.name, item);
      return;
    }
    this.items.push(item);
    if (!owner) {
      // The first item that does not own its name: the owners are the items before it.
      this.ownerItems ??= this.items.slice(0, this.items.length - 1);
      return;
    }
    this.ownerItems?.push(item);
    // A name has one owner (its first definition), so it is set once.
    this.byNameMap?.set(item.name, item);
  }

  /**
   * The items of the names' first definitions (the ones that own them), in the order they were
   * evaluated: what {@link byName} is made of.
   */
  get owners(): readonly EvaluatedItem[] {
    return this.ownerItems ?? this.items;
  }

  /**
   * Each defined name → its item, for the names whose first definition is evaluated so far. Made
   * at the first call (a note without references never needs it while it is evaluated), then
   * kept up to date.
   */
  byName(): Map<string, EvaluatedItem> {
    this.byNameMap ??= byNameOf(this.owners);
    return this.byNameMap;
  }

  /** {@link byName} when it is made already, else null. */
  byNameIfMade(): Map<string, EvaluatedItem> | null {
    return this.byNameMap;
  }

  /**
   * The item of `name` as a statement at `index` sees it: the item of its first definition when
   * that stands above `index` and was computed, else null.
   */
  itemBefore(name: string, index: number): EvaluatedItem | null {
    const first = this.names.firstIndex(name);
    return first >= 0 && first < index ? (this.ownerItem(name, first) ?? null) : null;
  }

  /**
   * The item of the registered name `name`, first defined by statement `first`: kept, or let go
   * and evaluated again (then kept); undefined when that statement made none.
   */
  ownerItem(name: string, first: number): EvaluatedItem | undefined {
    const item = this.byName().get(name);
    if (item || !this.forgotten) return item;
    const again = this.forgotten.recall(this, first);
    if (again) this.byNameMap!.set(name, again);
    return again ?? undefined;
  }

  /**
   * Resolves a reference at statement `index`. Reports `used-before-defined` (defined later),
   * `unknown-name` (never defined, with a suggestion); a name whose definition failed is returned
   * as `failed` without a new error (no cascades).
   */
  resolve(ref: NameNode, statement: Statement, index: number): RefOutcome {
    this.references.push({ name: ref.text, span: ref.span, statement });
    // The first definition: above (resolved, or failed) or at or below this statement (the
    // definitions are in document order, so no other stands above).
    const first = this.names.firstDef(ref.text);
    if (first && first.statementIndex < index) {
      const item = this.ownerItem(ref.text, first.statementIndex);
      if (item) return { ok: true, item, def: first };
      return { ok: false, failed: true, def: first };
    }
    const later = first;
    if (later) {
      const self = later.statementIndex === index;
      this.report({
        code: 'used-before-defined',
        severity: 'error',
        message: self
          ? `'${ref.text}' refers to the statement that defines it; refer to a state defined above`
          : `'${ref.text}' is used here but defined further down${this.atLine(later.span)}; move ` +
            `its definition above this statement (statements are evaluated in document order)`,
        span: ref.span,
        related: [{ span: later.span, message: `'${ref.text}' is defined here` }],
        data: { name: ref.text },
      });
      return { ok: false, failed: false };
    }
    this.nameIndex ??= caseFoldedIndex(this.names.names());
    const suggestion = suggestName(ref.text, this.nameIndex);
    this.report({
      code: 'unknown-name',
      severity: 'error',
      message: suggestion
        ? `no state is named '${ref.text}'; did you mean '${suggestion}'?`
        : `no state is named '${ref.text}'; define it with a state line above (state ${ref.text}: db=… rh=…)`,
      span: ref.span,
      data: suggestion ? { name: ref.text, suggestion } : { name: ref.text },
    });
    return { ok: false, failed: false };
  }
}

/** Each owner's name → the owner, in the owners' order. */
export function byNameOf(owners: readonly EvaluatedItem[]): Map<string, EvaluatedItem> {
  const map = new Map<string, EvaluatedItem>();
  for (const item of owners) map.set(item.name, item);
  return map;
}
