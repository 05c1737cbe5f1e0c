/**
 * The incremental analyzer: {@link createAnalyzer} returns an object that the caller keeps (one
 * per open document — the language server does), whose `analyze(text, settings)` gives exactly
 * what `analyzeNote(text, settings)` gives while reusing its previous run:
 * - the parser reuses the statements the edit did not touch (`notation/incremental.ts`);
 * - a `state` statement taken over from the previous parse, under the same pressure basis and
 *   settings, takes its previous result and diagnostics over (moved with the statement when the
 *   edit changed the length of the text before it) instead of being evaluated again: its result
 *   depends on nothing else (mixes and processes, which depend on other statements, are evaluated
 *   every time);
 * - state solves are memoized by their inputs (defining keys, values, pressure, options), keeping
 *   the entries the last run used.
 * The same text with the same settings returns the previous analysis object itself. Results are
 * shared with the previous analysis where they are equal, so neither may be mutated by callers.
 * Everything that must stay stateless (the CLI, tests) uses `analyzeNote`.
 */
import { solveForNote } from '../evaluate/solve';
import type { SolveOptions, SolveResult } from '../physics/types';
import type { CoreDiagnostic, NameNode, PropertyNode, StateStatement, Statement } from '../notation/ast';
import { createNoteParser } from '../notation/incremental';
import type { Span } from '../text/types';
import { finishAnalysis } from './analyze';
import type { EvalContext } from '../evaluate/context';
import { evaluateSteps, noteUnits, type DependentStatement, type EvaluateReuse } from '../evaluate/evaluate';
import { resolveSettings } from '../evaluate/settings';
import type {
  Analysis,
  ClaimResult,
  EvaluateSettings,
  EvaluatedItem,
  PressureBasis,
  StateResult,
} from '../evaluate/types';

/** An analyzer that keeps its last run (see the module comment). */
export interface Analyzer {
  /** Parses and evaluates `text`: the same result as `analyzeNote(text, settings)`. Never throws. */
  analyze(text: string, settings?: Partial<EvaluateSettings>): Analysis;
  /**
   * {@link Analyzer.analyze} in steps: pauses after parsing and every few hundred statements,
   * and returns the same analysis. A run that is not driven to its end changes nothing (the
   * next run reuses the last finished one); only one run may be in progress at a time.
   */
  analyzeSteps(text: string, settings?: Partial<EvaluateSettings>): Generator<void, Analysis, void>;
  /** Forgets the previous run (the next analysis starts from scratch). */
  reset(): void;
}

/** A state's evaluation as the previous run left it. */
interface StateEntry {
  statement: StateStatement;
  result: StateResult;
  /** The diagnostics its evaluation reported, in order. */
  diagnostics: CoreDiagnostic[];
  /** The pressure basis in force when it was evaluated. */
  site: PressureBasis;
}

/** A mix's or process's evaluation as the previous run left it (only when every name it refers to resolved). */
interface DependentEntry {
  statement: DependentStatement;
  result: EvaluatedItem | null;
  diagnostics: CoreDiagnostic[];
  site: PressureBasis;
  /** The items its names resolved to, in the order it resolved them. */
  deps: EvaluatedItem[];
}

/** Creates an analyzer that reuses its previous run for the next text. */
export function createAnalyzer(): Analyzer {
  const parser = createNoteParser();
  let last: { text: string; settings: EvaluateSettings; analysis: Analysis } | null = null;
  let states = new Map<Statement, StateEntry>();
  let dependents = new Map<Statement, DependentEntry>();
  let solves = new Map<string, SolveResult>();
  let bases: PressureBasis[] = [];
  function* analyzeSteps(text: string, settings?: Partial<EvaluateSettings>): Generator<void, Analysis, void> {
    const resolved = resolveSettings(settings);
    if (
      last &&
      last.text === text &&
      sameSettings(last.settings, resolved) &&
      sameRules(last.settings.rules, resolved.rules)
    )
      return last.analysis;
    const { parsed, origins, deltas } = parser.parse(text);
    // Messages are written in the note's unit system: when a units: line changes it, nothing is reused.
    const fresh =
      !last ||
      !sameSettings(last.settings, resolved) ||
      noteUnits(parsed.statements, resolved.units) !== last.analysis.units;
    yield;
    const reuse = fresh
      ? new Reuse(new Map(), new Map(), solves, [], origins, deltas)
      : new Reuse(states, dependents, solves, bases, origins, deltas);
    const analysis = finishAnalysis(yield* evaluateSteps(parsed, settings, text, reuse), text);
    states = reuse.nextStates;
    dependents = reuse.nextDependents;
    solves = reuse.nextSolves;
    bases = reuse.nextBases;
    last = { text, settings: resolved, analysis };
    return analysis;
  }
  return {
    analyze(text: string, settings?: Partial<EvaluateSettings>): Analysis {
      const steps = analyzeSteps(text, settings);
      for (;;) {
        const r = steps.next();
        if (r.done) return r.value;
      }
    },
    analyzeSteps,
    reset(): void {
      parser.reset();
      last = null;
      states = new Map();
      dependents = new Map();
      solves = new Map();
      bases = [];
    },
  };
}

function sameSettings(a: EvaluateSettings, b: EvaluateSettings): boolean {
  return (
    a.units === b.units &&
    Object.is(a.pressurePa, b.pressurePa) &&
    a.pressureOrigin === b.pressureOrigin &&
    a.checkClaims === b.checkClaims
  );
}

/** Rule severities only change what `finishAnalysis` does with the diagnostics, not the evaluation. */
function sameRules(a: EvaluateSettings['rules'], b: EvaluateSettings['rules']): boolean {
  if (a === b) return true;
  const ka = Object.keys(a ?? {});
  if (ka.length !== Object.keys(b ?? {}).length) return false;
  return ka.every((k) => a![k] === b?.[k]);
}

function sameSpan(a: Span | null, b: Span | null): boolean {
  return a === b || (a !== null && b !== null && a.start === b.start && a.end === b.end);
}

function sameBasis(a: PressureBasis, b: PressureBasis): boolean {
  return (
    a === b ||
    (Object.is(a.pa, b.pa) &&
      a.source === b.source &&
      Object.is(a.elevationM, b.elevationM) &&
      a.describe === b.describe &&
      sameSpan(a.span, b.span))
  );
}

/** A number as a memo key: exact (the shortest text that reads back as the same double), −0 kept apart. */
function numKey(v: number): string {
  return Object.is(v, -0) ? '-0' : String(v);
}

/** The reuse hooks of one run: reads the previous run's memo, fills the next one. */
class Reuse implements EvaluateReuse {
  readonly nextStates = new Map<Statement, StateEntry>();
  readonly nextDependents = new Map<Statement, DependentEntry>();
  readonly nextSolves = new Map<string, SolveResult>();
  readonly nextBases: PressureBasis[] = [];

  constructor(
    private readonly prevStates: ReadonlyMap<Statement, StateEntry>,
    private readonly prevDependents: ReadonlyMap<Statement, DependentEntry>,
    private readonly prevSolves: ReadonlyMap<string, SolveResult>,
    private readonly prevBases: readonly PressureBasis[],
    private readonly origins: readonly (Statement | null)[],
    private readonly deltas: readonly number[],
  ) {}

  /** The previous run's basis equal to `b` (so that results under it can be taken over as they are). */
  basis(b: PressureBasis): PressureBasis {
    // A note holds a handful of site lines: a linear search is enough.
    const same = this.prevBases.find((x) => sameBasis(x, b)) ?? this.nextBases.find((x) => sameBasis(x, b));
    const out = same ?? b;
    if (!this.nextBases.includes(out)) this.nextBases.push(out);
    return out;
  }

  readonly solve = (input: Parameters<typeof solveForNote>[0], p: number, options?: SolveOptions): SolveResult => {
    let key = `${numKey(p)}|${options?.allowFog === true ? 1 : 0}`;
    for (const k in input) {
      const v = input[k as keyof typeof input];
      if (v !== undefined) key += `|${k}=${numKey(v)}`;
    }
    let r = this.nextSolves.get(key) ?? this.prevSolves.get(key);
    if (!r) r = solveForNote(input, p, options);
    this.nextSolves.set(key, r);
    return r;
  };

  state(ctx: EvalContext, stmt: StateStatement, index: number, compute: () => StateResult): StateResult {
    const origin = this.origins[index];
    const entry = origin ? this.prevStates.get(origin) : undefined;
    if (entry && sameBasis(entry.site, ctx.site)) {
      const delta = this.deltas[index] ?? 0;
      if (delta === 0 && stmt === entry.statement && entry.site === ctx.site) {
        // Unchanged, under the very same basis: the entry as it is.
        for (const d of entry.diagnostics) ctx.report(d);
        this.nextStates.set(stmt, entry);
        return entry.result;
      }
      const moved = relocate(entry, stmt, delta, ctx.site);
      if (moved) {
        for (const d of moved.diagnostics) ctx.report(d);
        this.nextStates.set(stmt, {
          statement: stmt,
          result: moved.result,
          diagnostics: moved.diagnostics,
          site: ctx.site,
        });
        return moved.result;
      }
    }
    const before = ctx.diagnostics.length;
    const result = compute();
    this.nextStates.set(stmt, { statement: stmt, result, diagnostics: ctx.diagnostics.slice(before), site: ctx.site });
    return result;
  }

  dependent<T extends EvaluatedItem | null>(
    ctx: EvalContext,
    stmt: DependentStatement,
    index: number,
    compute: () => T,
  ): T {
    const origin = this.origins[index];
    const entry = origin ? this.prevDependents.get(origin) : undefined;
    if (entry && sameBasis(entry.site, ctx.site)) {
      const deps = currentDeps(ctx, entry, index);
      const refs = deps ? names(stmt) : null;
      const moved =
        refs && refs.length === entry.deps.length
          ? relocateDependent(entry, stmt, this.deltas[index] ?? 0, ctx.site)
          : null;
      if (deps && refs && moved) {
        // What its evaluation did: resolve each name (a reference each), report its diagnostics.
        for (const n of refs) ctx.references.push({ name: n.text, span: n.span, statement: stmt });
        for (const d of moved.diagnostics) ctx.report(d);
        const unchanged =
          stmt === entry.statement &&
          moved.result === entry.result &&
          entry.site === ctx.site &&
          deps.every((x, i) => x === entry.deps[i]);
        this.nextDependents.set(
          stmt,
          unchanged
            ? entry
            : { statement: stmt, result: moved.result, diagnostics: moved.diagnostics, site: ctx.site, deps },
        );
        return moved.result as T;
      }
    }
    const before = ctx.diagnostics.length;
    const refsBefore = ctx.references.length;
    const result = compute();
    // Kept for the next run only when every name resolved to a computed item.
    const deps: EvaluatedItem[] = [];
    for (let i = refsBefore; i < ctx.references.length; i++) {
      const item = ctx.itemBefore(ctx.references[i]!.name, index);
      if (!item) return result;
      deps.push(item);
    }
    this.nextDependents.set(stmt, {
      statement: stmt,
      result,
      diagnostics: ctx.diagnostics.slice(before),
      site: ctx.site,
      deps,
    });
    return result;
  }
}

/**
 * The names a dependent statement resolves, in the order its evaluation resolves them: the
 * references in its properties (one each, in written order), then a mix's streams or a process's
 * two states.
 */
function names(stmt: DependentStatement): NameNode[] {
  const out: NameNode[] = [];
  for (const p of stmt.props) if (p.ref) out.push(p.ref.state);
  if (stmt.keyword === 'mix') for (const s of stmt.streams) out.push(s.name);
  else if (stmt.keyword === 'process' && stmt.from && stmt.to) out.push(stmt.from, stmt.to);
  else if (stmt.keyword === 'supply' && stmt.room) out.push(stmt.room);
  return out;
}

/**
 * The items the entry's names resolve to now, when each gives its evaluation exactly what it read
 * before (the same kind, name, state and pressure objects, the same flow); else null.
 */
function currentDeps(ctx: EvalContext, entry: DependentEntry, index: number): EvaluatedItem[] | null {
  const out: EvaluatedItem[] = [];
  for (const old of entry.deps) {
    const cur = ctx.itemBefore(old.name, index);
    if (!cur || !readsTheSame(cur, old)) return null;
    out.push(cur);
  }
  return out;
}

function readsTheSame(a: EvaluatedItem, b: EvaluatedItem): boolean {
  if (a === b) return true;
  if (a.kind === 'process' || b.kind === 'process') return false;
  return (
    a.kind === b.kind &&
    a.name === b.name &&
    a.state === b.state &&
    a.pressure === b.pressure &&
    Object.is(a.massFlowKgS, b.massFlowKgS)
  );
}

/**
 * The claims of an old statement for its moved copy: each claim's property node is the one at the
 * same place in `to`. Null when a claim's property is not among `from` (then it cannot be mapped).
 */
function movedClaims(
  claims: readonly ClaimResult[],
  from: readonly PropertyNode[],
  to: readonly PropertyNode[],
): ClaimResult[] | null {
  const out: ClaimResult[] = [];
  for (const c of claims) {
    const i = from.indexOf(c.prop);
    if (i < 0) return null;
    // The shape the evaluator builds (checkClaim), key order included.
    out.push({
      key: c.key,
      prop: to[i]!,
      writtenSI: c.writtenSI,
      computedSI: c.computedSI,
      toleranceSI: c.toleranceSI,
      pass: c.pass,
      computedText: c.computedText,
    });
  }
  return out;
}

/**
 * The previous result and diagnostics of a mix or process for `stmt` (its old statement moved by
 * `d`). Every span must lie inside the old statement (one pointing elsewhere, such as a related
 * definition, makes it evaluate again). Null when something cannot be mapped.
 */
function relocateDependent(
  entry: DependentEntry,
  stmt: DependentStatement,
  d: number,
  site: PressureBasis,
): { result: EvaluatedItem | null; diagnostics: CoreDiagnostic[] } | null {
  const from = entry.statement;
  if (from.keyword !== stmt.keyword || from.props.length !== stmt.props.length) return null;
  const within = from.span;
  let failed = false;
  const move = (s: Span): Span => {
    if (s.start >= within.start && s.end <= within.end) return d === 0 ? s : { start: s.start + d, end: s.end + d };
    failed = true;
    return s;
  };
  const same = d === 0 && stmt === from;
  if (same && !entry.diagnostics.every((x) => diagnosticInside(x, within))) return null;
  const diagnostics = same ? entry.diagnostics : entry.diagnostics.map((x) => moveDiagnostic(x, move));
  const old = entry.result;
  let result: EvaluatedItem | null = null;
  if (same && (!old || old.kind === 'process' || old.pressure !== entry.site || site === entry.site)) {
    // Not moved, nothing to map: the old result as it is.
    result = old;
  } else if (old) {
    const claims = movedClaims(old.claims, from.props, stmt.props);
    if (!claims) return null;
    if (old.kind === 'process') {
      if (stmt.keyword !== 'process') return null;
      result = { ...old, statement: stmt, claims };
    } else if (old.kind === 'state' || old.kind === 'supply') {
      if (stmt.keyword !== old.kind) return null;
      // The pressure is the site's, or the state's own override (a span inside the statement).
      const pressure =
        old.pressure === entry.site
          ? site
          : old.pressure.span
            ? { ...old.pressure, span: move(old.pressure.span) }
            : old.pressure;
      result = { ...old, statement: stmt, pressure, claims };
    } else {
      if (stmt.keyword !== 'mix' || old.kind !== 'mix') return null;
      // The pressure is the site's (when it failed early), a stream's (the same object now), or
      // a mean basis of its own (no span).
      if (
        old.pressure !== entry.site &&
        old.pressure.span !== null &&
        !entry.deps.some((x) => x.kind !== 'process' && x.pressure === old.pressure)
      )
        return null;
      result = { ...old, statement: stmt, pressure: old.pressure === entry.site ? site : old.pressure, claims };
    }
  }
  return failed ? null : { result, diagnostics };
}

/**
 * The previous result and diagnostics of `entry` for `stmt`, which is the entry's statement moved
 * by `d` (or the same object when `d` is 0), under the pressure basis `site`. Spans inside the
 * old statement move with it; those outside it (the site line) stay. Null when the result holds
 * something this cannot map (then the state is evaluated again).
 */
function relocate(
  entry: StateEntry,
  stmt: StateStatement,
  d: number,
  site: PressureBasis,
): { result: StateResult; diagnostics: CoreDiagnostic[] } | null {
  const old = entry.result;
  const onSite = old.pressure === entry.site;
  if (d === 0 && stmt === entry.statement) {
    return { result: onSite ? { ...old, pressure: site } : old, diagnostics: entry.diagnostics };
  }
  const from = entry.statement;
  if (from.props.length !== stmt.props.length) return null;
  const within = from.span;
  let failed = false;
  const move = (s: Span): Span => {
    if (s.start >= within.start && s.end <= within.end) return { start: s.start + d, end: s.end + d };
    if (s.end < within.start || s.start > within.end) return s;
    failed = true;
    return s;
  };
  const claims = movedClaims(old.claims, from.props, stmt.props);
  if (!claims) return null;
  let pressure: PressureBasis = site;
  if (!onSite) pressure = old.pressure.span ? { ...old.pressure, span: move(old.pressure.span) } : { ...old.pressure };
  if (old.kind !== 'state' || old.streams !== undefined || old.massFlowKgS !== undefined) return null;
  // The shape evaluateState builds, key order included (the arrays are shared: results are not mutated).
  const result: StateResult = {
    kind: 'state',
    name: old.name,
    statement: stmt,
    state: old.state,
    pressure,
    defining: old.defining,
    claims,
  };
  const diagnostics = entry.diagnostics.map((x) => moveDiagnostic(x, move));
  return failed ? null : { result, diagnostics };
}

function inside(s: Span, within: Span): boolean {
  return s.start >= within.start && s.end <= within.end;
}

/** Whether every span of a diagnostic (its own, related ones, any in its data) lies inside `within`. */
function diagnosticInside(x: CoreDiagnostic, within: Span): boolean {
  if (!inside(x.span, within)) return false;
  if (x.related && !x.related.every((r) => inside(r.span, within))) return false;
  if (x.data) for (const v of Object.values(x.data)) if (isSpan(v) && !inside(v, within)) return false;
  return true;
}

function isSpan(v: unknown): v is Span {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const o = v as Record<string, unknown>;
  return typeof o.start === 'number' && typeof o.end === 'number' && Object.keys(o).length === 2;
}

/** A copy of a diagnostic with its span, related spans and any span in its data moved by `move`. */
function moveDiagnostic(x: CoreDiagnostic, move: (s: Span) => Span): CoreDiagnostic {
  const out: CoreDiagnostic = { ...x, span: move(x.span) };
  if (x.related) out.related = x.related.map((r) => ({ ...r, span: move(r.span) }));
  if (x.data) {
    const data: Record<string, unknown> = {};
    for (const k of Object.keys(x.data)) {
      const v = x.data[k];
      data[k] = isSpan(v) ? move(v) : v;
    }
    out.data = data;
  }
  return out;
}
