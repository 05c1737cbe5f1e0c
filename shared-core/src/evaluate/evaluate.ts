/**
 * The evaluator: a second pass over the parsed note, in document order. It never throws: every
 * statement is evaluated inside a guard, and a failure becomes a diagnostic on that statement.
 */
import type {
  CoreDiagnostic,
  MixStatement,
  ParsedNote,
  ProcessStatement,
  RecoverStatement,
  Statement,
  StateStatement,
  SupplyStatement,
} from '../notation/ast';
import type { Analysis, EvaluateSettings, EvaluatedItem, PressureBasis, ProcessResult, StateResult } from './types';
import type { UnitSystem } from '../units/types';
import { EvalContext, byNameOf } from './context';
import { NoteNames, statementList, type NoteStatements } from './names';
import { parseNote, parseNoteStatements } from '../notation/parse';
import { SITE_KEYS } from './keys';
import { exampleIn } from './figures';
import { evaluateMix } from './mix';
import { pressureFromProps } from './pressure';
import { evaluateProcess } from './process';
import { evaluateRecover } from './recover';
import { readProps } from './props';
import { resolveSettings } from './settings';
import { evaluateState } from './state';
import { evaluateSupply } from './supply';
import { StatementGroup } from './group';

/** A statement whose result depends on other statements. */
export type DependentStatement = MixStatement | ProcessStatement | StateStatement | SupplyStatement;

/** True when a statement takes a property from another state (`w=OA.w`). */
export function hasReferences(stmt: Statement): boolean {
  return stmt.keyword !== 'units' && stmt.props.some((p) => p.ref !== undefined);
}

/** Orders diagnostics by where they start, then end. */
function bySpan(x: CoreDiagnostic, y: CoreDiagnostic): number {
  return x.span.start - y.span.start || x.span.end - y.span.end;
}

/**
 * The unit system a note reads in: that of its first `units: SI` or `units: IP` line (wherever it
 * stands), else `fallback` (the setting). Known before evaluation, so that every message is
 * written in it.
 */
export function noteUnits(statements: readonly Statement[], fallback: UnitSystem): UnitSystem {
  for (const s of statements) {
    if (s.keyword !== 'units') continue;
    const word = s.system?.text;
    if (word === 'SI' || word === 'IP') return word;
  }
  return fallback;
}

function evaluateSite(ctx: EvalContext, stmt: Extract<Statement, { keyword: 'site' }>, index: number): void {
  const { props, broken } = readProps(ctx, stmt.props, SITE_KEYS, 'site:', stmt, index, false);
  if (props.length === 0) {
    if (broken.length === 0 && stmt.props.length === 0) {
      ctx.report({
        code: 'underspecified',
        severity: 'error',
        message:
          `site: sets nothing; write the pressure (site: ${exampleIn('p', ctx.units)}) ` +
          `or the elevation (site: ${exampleIn('elev', ctx.units)})`,
        span: stmt.keywordSpan,
      });
    }
    return;
  }
  const line = ctx.lineWord(stmt.span);
  const basis = pressureFromProps(ctx, props, 'site', line ? `site ${line}` : 'site');
  if (basis) ctx.site = basis;
}

function evaluateUnits(ctx: EvalContext, stmt: Extract<Statement, { keyword: 'units' }>): void {
  const word = stmt.system;
  if (!word) return; // the parser reported the syntax
  if (word.text !== 'SI' && word.text !== 'IP') {
    const upper = word.text.toUpperCase().replace(/[^A-Z]/g, '');
    const guess =
      upper === 'SI' || upper === 'METRIC'
        ? 'SI'
        : upper === 'IP' || upper === 'US' || upper === 'IMPERIAL'
          ? 'IP'
          : null;
    ctx.report({
      code: 'unknown-unit-system',
      severity: 'error',
      message:
        `'${word.text}' is not a unit system; write units: SI ` +
        `or units: IP${guess ? ` (did you mean ${guess}?)` : ''}`,
      span: word.span,
      data: guess ? { suggestion: guess } : {},
    });
    return;
  }
  if (ctx.unitsSource === 'note' && ctx.units !== word.text) {
    ctx.report({
      code: 'units-conflict',
      severity: 'warning',
      message:
        `a units: ${ctx.units} line is already in this note; ` +
        `results are shown in ${ctx.units}. Keep one units: line`,
      span: word.span,
      related: ctx.unitsSpan ? [{ span: ctx.unitsSpan, message: `units: ${ctx.units}` }] : undefined,
    });
    return;
  }
  if (ctx.unitsSource === 'note') return;
  ctx.units = word.text;
  ctx.unitsSource = 'note';
  ctx.unitsSpan = word.span;
}

/**
 * What an analyzer that keeps its previous run hands to {@link evaluate} (see `analyze/analyzer.ts`): a
 * way to take a state's previous result over, and the solver to use. The analysis is the same
 * with or without it.
 */
export interface EvaluateReuse {
  /**
   * The result of state statement `index`: `compute()` (which evaluates it and reports its
   * diagnostics), or the previous run's result and diagnostics when nothing it depends on changed.
   */
  state(ctx: EvalContext, stmt: StateStatement, index: number, compute: () => StateResult): StateResult;
  /**
   * The result of statement `index` that refers to other statements (a mix, a process, a state
   * with references): `compute()`,
   * or the previous run's when the statement and everything it read of the states it names are
   * unchanged.
   */
  dependent<T extends EvaluatedItem | null>(
    ctx: EvalContext,
    stmt: DependentStatement,
    index: number,
    compute: () => T,
  ): T;
  /** The state solver (a memoizing wrapper of the engine's `solveState`). */
  solve: EvalContext['solve'];
  /** The previous run's pressure basis equal to `basis` when there is one (else `basis`). */
  basis(basis: PressureBasis): PressureBasis;
}

/**
 * Evaluates a parsed note. Statements are taken in document order; the note's `units:` line wins
 * over `settings.units`. Pass the note's `text` to get line numbers in messages. `reuse` is for
 * an analyzer that keeps its previous run (`createAnalyzer`); the result does not depend on it.
 */
export function evaluate(
  parsed: ParsedNote,
  settings?: Partial<EvaluateSettings>,
  text?: string,
  reuse?: EvaluateReuse,
): Analysis {
  const steps = evaluateSteps(parsed, settings, text, reuse);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/**
 * Evaluates statement `index` into `ctx`: registers the names it defines and stores its items.
 * (No function is made here per statement: the analyzer's `reuse` gets its `compute` from the
 * helpers below, so a note evaluated without it makes none.)
 */
function evaluateStatement(ctx: EvalContext, stmt: Statement, index: number, reuse: EvaluateReuse | undefined): void {
  switch (stmt.keyword) {
    case 'site':
      evaluateSite(ctx, stmt, index);
      if (reuse) ctx.site = reuse.basis(ctx.site);
      return;
    case 'units':
      evaluateUnits(ctx, stmt);
      return;
    case 'state': {
      // Without a usable name the parser has reported the statement; evaluating the rest
      // would only add a second diagnostic for the same line.
      if (!stmt.name) return;
      const owner = ctx.define(stmt.name, index);
      const item = reuse ? reusedState(reuse, ctx, stmt, index, owner) : evaluateState(ctx, stmt, index, owner);
      ctx.addItem(item, owner);
      return;
    }
    case 'mix': {
      if (!stmt.name) return;
      const owner = ctx.define(stmt.name, index);
      const item = reuse ? reusedMix(reuse, ctx, stmt, index, owner) : evaluateMix(ctx, stmt, index, owner);
      ctx.addItem(item, owner);
      return;
    }
    case 'supply': {
      if (!stmt.name) return;
      const owner = ctx.define(stmt.name, index);
      const item = reuse ? reusedSupply(reuse, ctx, stmt, index) : evaluateSupply(ctx, stmt, index);
      ctx.addItem(item, owner);
      return;
    }
    case 'process':
      evaluateProcessStatement(ctx, stmt, index, reuse);
      return;
    case 'recover':
      evaluateRecoverStatement(ctx, stmt, index);
      return;
    default:
      return;
  }
}

/** A `process` statement (the `process` case of {@link evaluateStatement}). */
function evaluateProcessStatement(
  ctx: EvalContext,
  stmt: ProcessStatement,
  index: number,
  reuse: EvaluateReuse | undefined,
): void {
  if (!stmt.name) return;
  const owner = ctx.define(stmt.name, index);
  if (stmt.to && ctx.names.derivesLeaving(stmt)) {
    // It defines its leaving state too (evaluated every time: it is cheap, and what it
    // defines is new on every run).
    const toOwner = ctx.define(stmt.to, index);
    const out = evaluateProcess(ctx, stmt, index, true);
    // The name it defines is listed with the references (rename and find-references see it).
    ctx.references.push({ name: stmt.to.text, span: stmt.to.span, statement: stmt });
    if (out.leaving) ctx.addItem(out.leaving, toOwner);
    if (out.process) ctx.addItem(out.process, owner);
    return;
  }
  const item = reuse ? reusedProcess(reuse, ctx, stmt, index) : evaluateProcess(ctx, stmt, index).process;
  if (item) ctx.addItem(item, owner);
}

/** A `recover` statement (the `recover` case of {@link evaluateStatement}). */
function evaluateRecoverStatement(ctx: EvalContext, stmt: RecoverStatement, index: number): void {
  if (!stmt.name) return;
  const owner = ctx.define(stmt.name, index);
  const toOwners: boolean[] = [];
  for (const x of stmt.streams) toOwners.push(x.to ? ctx.define(x.to, index) : false);
  const out = evaluateRecover(ctx, stmt, index);
  for (const x of stmt.streams) if (x.to) ctx.references.push({ name: x.to.text, span: x.to.span, statement: stmt });
  for (let k = 0; k < out.leaving.length; k++) {
    const l = out.leaving[k];
    if (l) ctx.addItem(l, toOwners[k] ?? false);
  }
  // The exchanger is registered under its name by its first side; the second side is listed as well.
  for (let k = 0; k < out.sides.length; k++) {
    const side = out.sides[k];
    if (side) ctx.addItem(side, owner && k === 0);
  }
}

/** A state through the analyzer's reuse: a state with references depends on the states it names, like a mix. */
function reusedState(
  reuse: EvaluateReuse,
  ctx: EvalContext,
  stmt: StateStatement,
  index: number,
  owner: boolean,
): StateResult {
  const compute = (): StateResult => evaluateState(ctx, stmt, index, owner);
  return hasReferences(stmt) ? reuse.dependent(ctx, stmt, index, compute) : reuse.state(ctx, stmt, index, compute);
}

/** A mix through the analyzer's reuse. */
function reusedMix(
  reuse: EvaluateReuse,
  ctx: EvalContext,
  stmt: MixStatement,
  index: number,
  owner: boolean,
): StateResult {
  return reuse.dependent(ctx, stmt, index, () => evaluateMix(ctx, stmt, index, owner));
}

/** A supply through the analyzer's reuse. */
function reusedSupply(reuse: EvaluateReuse, ctx: EvalContext, stmt: SupplyStatement, index: number): StateResult {
  return reuse.dependent(ctx, stmt, index, () => evaluateSupply(ctx, stmt, index));
}

/** A process between two states defined above, through the analyzer's reuse. */
function reusedProcess(
  reuse: EvaluateReuse,
  ctx: EvalContext,
  stmt: ProcessStatement,
  index: number,
): ProcessResult | null {
  return reuse.dependent(ctx, stmt, index, () => evaluateProcess(ctx, stmt, index).process);
}

/** Statements evaluated between two pauses of {@link evaluateSteps}. */
export const STATEMENTS_PER_STEP = 256;

/**
 * Evaluates statement `index` into `ctx` inside a guard: a failure becomes a diagnostic on the
 * statement. `lineStart` and `lineEnd` are its fence line's offsets (−1 for a code span's), which
 * an evaluation handing its items out needs to let a plain state go (`./forgotten`).
 */
function evaluateGuarded(
  ctx: EvalContext,
  stmt: Statement,
  index: number,
  reuse: EvaluateReuse | undefined,
  lineStart = -1,
  lineEnd = -1,
): void {
  ctx.index = index;
  ctx.lineStart = lineStart;
  ctx.lineEnd = lineEnd;
  try {
    evaluateStatement(ctx, stmt, index, reuse);
  } catch (err) {
    ctx.report({
      code: 'internal-error',
      severity: 'error',
      message:
        `this statement could not be evaluated ` +
        `(${err instanceof Error ? err.message : String(err)}); please report it with the note`,
      span: (stmt as Statement).span ?? { start: 0, end: 0 },
    });
  }
}

/** The evaluation's diagnostics after the parser's, in document order. */
function allDiagnostics(parsed: readonly CoreDiagnostic[], ctx: EvalContext): CoreDiagnostic[] {
  // The sort is stable, so diagnostics at one span keep the order they were made in.
  return parsed.concat(ctx.diagnostics).sort(bySpan);
}

/**
 * {@link evaluate} in steps: a generator that pauses after every {@link STATEMENTS_PER_STEP}
 * statements (so a caller, the language server, can serve other work in between) and returns
 * the analysis. Driven to the end it is exactly `evaluate`.
 */
export function* evaluateSteps(
  parsed: ParsedNote,
  settings?: Partial<EvaluateSettings>,
  text?: string,
  reuse?: EvaluateReuse,
): Generator<void, Analysis, void> {
  const resolved = resolveSettings(settings);
  const statements = Array.isArray(parsed?.statements) ? parsed.statements : [];
  const ctx = new EvalContext(
    resolved,
    text,
    noteUnits(statements, resolved.units),
    // Each statement defines a name or two at most, most of them one or none.
    new NoteNames(statementList(statements), statements.length),
  );
  if (reuse) {
    ctx.solve = reuse.solve;
    ctx.site = reuse.basis(ctx.site);
  }

  for (let index = 0; index < statements.length; index++) {
    if (index > 0 && index % STATEMENTS_PER_STEP === 0) yield;
    evaluateGuarded(ctx, statements[index]!, index, reuse);
  }

  const diagnostics = allDiagnostics(Array.isArray(parsed?.diagnostics) ? parsed.diagnostics : [], ctx);
  const made = ctx.byNameIfMade();
  const owners = ctx.owners;
  return {
    parsed,
    units: ctx.units,
    unitsSource: ctx.unitsSource,
    settings: resolved,
    items: ctx.items,
    // The map of names, made at its first read unless evaluation made it (for a reference): a
    // reader that never looks a name up (the command line's output) never pays for it. After
    // that read it is a plain property holding the map.
    get byName(): Map<string, EvaluatedItem> {
      const map = made ?? byNameOf(owners);
      Object.defineProperty(this, 'byName', { value: map, writable: true, enumerable: true, configurable: true });
      return map;
    },
    set byName(map: Map<string, EvaluatedItem>) {
      Object.defineProperty(this, 'byName', { value: map, writable: true, enumerable: true, configurable: true });
    },
    references: ctx.references,
    diagnostics,
  };
}

/**
 * What {@link evaluateHandingOut} returns: the analysis less what it handed out (its items, and the
 * statements of `parsed`) and less the map of names and the references (an evaluation that keeps
 * no item has neither).
 */
export interface HandedOutAnalysis extends Omit<Analysis, 'parsed' | 'items' | 'byName' | 'references'> {
  parsed: Pick<ParsedNote, 'regions' | 'headings'>;
}

/**
 * `units` followed by a colon and the word after it: every `units:` statement has them (a keyword
 * is written as it is, and neither a fence nor a code span knows escapes).
 */
const UNITS_WRITTEN = /units\s*:\s*(\w*)/g;

/**
 * True when every `units:` the note may hold names `units` (or none is written): then the note's
 * unit system is `units` from its first statement on, wherever its `units:` line stands.
 */
function unitsAgree(text: string, units: UnitSystem): boolean {
  // Most notes write no `units`: one search for the word (a scan for its first character) tells
  // so, where the pattern tries a match at every character of the note.
  if (!text.includes('units')) return true;
  UNITS_WRITTEN.lastIndex = 0;
  for (let m = UNITS_WRITTEN.exec(text); m; m = UNITS_WRITTEN.exec(text)) if (m[1] !== units) return false;
  return true;
}

/**
 * A note to be evaluated one statement at a time ({@link evaluateHandingOut}), its unit system
 * known before the first statement.
 */
export interface HandingOut {
  /**
   * The unit system of every message and pressure description: the settings', which the note's
   * `units:` line (if any) names too.
   */
  units: UnitSystem;
  /**
   * Parses and evaluates the note, handing each item (state, mix, supply, process) to `onItem`
   * as soon as it is made, in the order of `evaluate(parseNote(text)).items`, and keeping
   * neither the statements nor the items (a later reference reads what it needs again:
   * `./forgotten`). Call it once.
   */
  run(onItem: (item: EvaluatedItem) => void): HandedOutAnalysis;
}

/**
 * The same evaluation as {@link evaluate}, for a reader that is done with each item once it has
 * it: memory stays flat however long the note. The note's unit system must be known before its
 * first statement (it is in every message and pressure description), and a `units:` line may
 * stand anywhere: so a note that may name other units than the settings' is not evaluated so
 * (null; {@link evaluate} reads it).
 */
export function evaluateHandingOut(text: string, settings?: Partial<EvaluateSettings>): HandingOut | null {
  const resolved = resolveSettings(settings);
  if (!unitsAgree(text, resolved.units)) return null;
  return { units: resolved.units, run: (onItem) => runHandingOut(text, resolved, onItem) };
}

/**
 * The characters of a note per statement (and name it defines), about, where it holds many (a
 * state line, `state S12: db=24C rh=50%`, is some thirty): a guess at how many a note holds from
 * its length alone, for the first size of the registry of names (see `NameTable`) and of the
 * slots of the states let go (`./forgotten`). A note of prose holds fewer; the guess only saves
 * their doublings, and costs address space only when too high.
 */
const CHARACTERS_PER_NAME = 32;

function runHandingOut(
  text: string,
  resolved: EvaluateSettings,
  onItem: (item: EvaluatedItem) => void,
): HandedOutAnalysis {
  let statements: readonly Statement[] | null = null;
  // Every statement of the note, read again only when a message needs the rest of the note (a
  // name used before its definition, an unknown name's suggestions, a duplicate name).
  const all = (): readonly Statement[] => (statements ??= parseNote(text).statements);
  const source: NoteStatements = {
    defining: (name, index) => ctx.ownerItem(name, index)?.statement ?? all()[index],
    all,
  };
  const expected = text.length / CHARACTERS_PER_NAME;
  const ctx: EvalContext = new EvalContext(resolved, text, resolved.units, new NoteNames(source, expected));
  ctx.handingOut(onItem, expected);
  const parseDiagnostics: CoreDiagnostic[] = [];
  let index = 0;
  // The statements are evaluated a group at a time, in order (see `./group`).
  const group = new StatementGroup((stmt, lineStart, lineEnd) =>
    evaluateGuarded(ctx, stmt, index++, undefined, lineStart, lineEnd),
  );
  const parsed = parseNoteStatements(
    text,
    (stmt, lineStart, lineEnd) => group.add(stmt, lineStart, lineEnd),
    parseDiagnostics,
  );
  group.flush();
  return {
    parsed,
    units: ctx.units,
    unitsSource: ctx.unitsSource,
    settings: resolved,
    diagnostics: allDiagnostics(parseDiagnostics, ctx),
  };
}
