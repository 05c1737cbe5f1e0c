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

/** One name definition found by the pre-scan (state, mix or process). */
export interface NameDef {
  name: string;
  span: Span;
  statementIndex: number;
  keyword: 'state' | 'mix' | 'process' | 'supply' | 'recover';
}

/** A registered name: where it was first defined and, once evaluated, its result. */
export interface Registered {
  def: NameDef;
  item: EvaluatedItem | null;
}

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
  readonly byName = new Map<string, EvaluatedItem>();
  readonly references: { name: string; span: Span; statement: Statement }[] = [];
  /** Names registered so far (first definition wins). */
  readonly registered = new Map<string, Registered>();
  /** Every definition in the note, for `used-before-defined` and suggestions. */
  readonly allDefs = new Map<string, NameDef[]>();
  units: UnitSystem;
  unitsSource: 'note' | 'setting' = 'setting';
  unitsSpan: Span | null = null;
  /** The pressure that applies to the statements from here on. */
  site: PressureBasis;
  /**
   * The state solver the statements use: {@link solveForNote}, or a memoizing wrapper of it when
   * an analyzer reuses its previous run (same results either way).
   */
  solve: typeof solveForNote = solveForNote;
  /** The note's text (for line numbers in messages), and its line index once a message needs it. */
  private readonly text: string | undefined;
  private lines: LineIndex | null = null;
  /** The defined names indexed for "did you mean", built at the first unknown name (one index for all of them). */
  private nameIndex: FoldedIndex | null = null;

  /**
   * @param units  the note's unit system when it has a `units:` line (found before evaluation, so
   *               that every message speaks the note's units wherever the line stands).
   */
  constructor(settings: EvaluateSettings, text: string | undefined, units: UnitSystem = settings.units) {
    this.settings = settings;
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
    this.diagnostics.push(d);
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

  /** Registers a definition; reports `duplicate-name` for a second one. Returns false for a duplicate. */
  define(def: NameDef, nameNode: NameNode): boolean {
    const first = this.registered.get(def.name);
    if (first) {
      this.report({
        code: 'duplicate-name',
        severity: 'error',
        message:
          `'${def.name}' is already defined by the ${first.def.keyword} ` +
          `statement${this.atLine(first.def.span)}; rename this one ` +
          `(e.g. '${def.name}_2') or remove one of the two definitions`,
        span: nameNode.span,
        related: [{ span: first.def.span, message: `first definition of '${def.name}'` }],
        data: { name: def.name },
      });
      return false;
    }
    this.registered.set(def.name, { def, item: null });
    return true;
  }

  /** Stores an evaluated item (and links it to its name when this statement owns the name). */
  addItem(item: EvaluatedItem, owner: boolean): void {
    this.items.push(item);
    if (owner) {
      const reg = this.registered.get(item.name);
      if (reg) reg.item = item;
      if (!this.byName.has(item.name)) this.byName.set(item.name, item);
    }
  }

  /**
   * Resolves a reference at statement `index`. Reports `used-before-defined` (defined later),
   * `unknown-name` (never defined, with a suggestion); a name whose definition failed is returned
   * as `failed` without a new error (no cascades).
   */
  resolve(ref: NameNode, statement: Statement, index: number): RefOutcome {
    this.references.push({ name: ref.text, span: ref.span, statement });
    const reg = this.registered.get(ref.text);
    if (reg && reg.def.statementIndex < index) {
      if (reg.item) return { ok: true, item: reg.item, def: reg.def };
      return { ok: false, failed: true, def: reg.def };
    }
    const defs = this.allDefs.get(ref.text);
    const later = defs?.find((d) => d.statementIndex >= index);
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
    this.nameIndex ??= caseFoldedIndex(this.allDefs.keys());
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
