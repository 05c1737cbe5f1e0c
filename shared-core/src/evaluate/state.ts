/**
 * `state NAME: key=value …`: pressure, the defining pair, the solve, and the claims.
 *
 * Rule for the defining pair (documented in docs/notation.md): among the defining properties as
 * written (db wb dp rh w h; v is never defining), take
 *   1. db with the first other defining property written (before or after it), if db is written;
 *   2. otherwise the first pair in written order that is neither dependent (dp with w) nor
 *      ill-conditioned (wb with h);
 *   3. otherwise an ill-conditioned pair (solved, with a warning).
 * Every other property written is a claim.
 */
import type { DefiningKey, MoistAirState, PhysicsProblem } from '../physics/types';
import { figuresFinite } from '../physics/moistAir';
import type { StateStatement } from '../notation/ast';
import type { Span } from '../text/types';
import type { EvalContext } from './context';
import { DEFINING_KEYS, STATE_KEYS, isDefiningKey, isDependentPair, isIllConditionedPair, thirdKindFor } from './keys';
import { pressureFromProps } from './pressure';
import { problemDiagnostic } from './problems';
import { exampleIn, figureText, problemTexts } from './figures';
import type { UnitSystem } from '../units/types';
import type { ReadProp, ReadProps } from './props';
import { isPressureKey, readProps } from './props';
import { sourcesOf } from './refs';
import { solveOrProblem } from './solve';
import { checkClaim } from './claims';
import { appended } from './util';
import { EMPTY, definingPair } from './shared';
import type { ClaimResult, PressureBasis, StateResult } from './types';

/** The value of a state property in SI, for claims. */
export function stateValue(s: MoistAirState, key: string): number | null {
  switch (key) {
    case 'db':
      return s.db;
    case 'wb':
      return s.wb;
    case 'dp':
      return s.dp;
    case 'rh':
      return s.rh;
    case 'w':
      return s.w;
    case 'h':
      return s.h;
    case 'v':
      return s.v;
    default:
      return null;
  }
}

/** `db=24C and rh=50%`, for messages. */
export function writtenList(props: readonly ReadProp[]): string {
  const parts = props.map((p) => `${p.key}=${p.q.quantity.number.text}${p.q.unitText}`);
  if (parts.length <= 1) return parts.join('');
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

/** True when every numeric property of a state is finite (the invariant of results). */
export function stateFinite(s: MoistAirState): boolean {
  return figuresFinite(s, false);
}

/** `a, b or c`. */
function orList(xs: readonly string[]): string {
  return xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} or ${xs[xs.length - 1]}`;
}

/**
 * Candidate defining pairs in order of preference (see the module comment), as one flat list:
 * pair k is `[list[2k], list[2k + 1]]`. For the common case, two defining properties written
 * with db first, it is `defs` itself (no list is made).
 */
export function candidatePairs(defs: readonly ReadProp[]): readonly ReadProp[] {
  if (defs.length === 2) {
    // The common case: exactly two defining properties written.
    const a = defs[0]!;
    const b = defs[1]!;
    if (isDependentPair(a.key as DefiningKey, b.key as DefiningKey)) return NO_PROPS;
    return b.key === 'db' ? [b, a] : defs;
  }
  const out: ReadProp[] = [];
  const db = defs.find((d) => d.key === 'db');
  if (db) {
    for (const d of defs) if (d !== db) out.push(db, d);
  }
  const ill: ReadProp[] = [];
  for (let i = 0; i < defs.length; i++) {
    for (let j = i + 1; j < defs.length; j++) {
      const a = defs[i]!;
      const b = defs[j]!;
      if (a.key === 'db' || b.key === 'db') continue;
      const ka = a.key as DefiningKey;
      const kb = b.key as DefiningKey;
      if (isDependentPair(ka, kb)) continue;
      if (isIllConditionedPair(ka, kb)) ill.push(a, b);
      else out.push(a, b);
    }
  }
  return out.concat(ill);
}

/** The candidate pairs (flat, as {@link candidatePairs} gives them) that hold every one of `refs`. */
export function pairsHolding(pairs: readonly ReadProp[], refs: readonly ReadProp[]): readonly ReadProp[] {
  if (refs.length === 0) return pairs;
  const out: ReadProp[] = [];
  for (let k = 0; k + 1 < pairs.length; k += 2) {
    const a = pairs[k]!;
    const b = pairs[k + 1]!;
    if (refs.every((r) => r === a || r === b)) out.push(a, b);
  }
  return out;
}

/** Compares every claim of a computed state (the properties that did not define it). */
export function stateClaims(
  ctx: EvalContext,
  claimsProps: ReadProp[],
  s: MoistAirState,
  context: string | (() => string),
): ClaimResult[] {
  if (!ctx.settings.checkClaims) return EMPTY;
  const out: ClaimResult[] = [];
  for (const c of claimsProps) {
    const computed = stateValue(s, c.key);
    if (computed === null || !Number.isFinite(computed)) continue;
    const { claim, diagnostic } = checkClaim(c.key, c.prop, c.q, computed, context);
    out.push(claim);
    if (diagnostic) ctx.report(diagnostic);
  }
  return out;
}

const ALLOW_FOG = Object.freeze({ allowFog: true });

function isPressureProp(p: ReadProp): boolean {
  return isPressureKey(p.key);
}

/** True for a property that can define the state (its row of the key table says so: db wb dp rh w h). */
function isDefiningProp(p: ReadProp): boolean {
  return p.spec.defining === true;
}

/** True for a property taken from another state (`w=OA.w`). */
function isReference(p: ReadProp): boolean {
  return p.ref !== undefined;
}

/**
 * The solver's input for the pair `ka`=`va`, `kb`=`vb` (and nothing else), always with the same
 * six fields (absent ones undefined), so that every pair gives the solver an object of one shape.
 * It is made for each solve, not kept and filled anew: a figure stored to a field is a number
 * object of its own, made just before, and storing it to an object made long before (one the
 * garbage collector has moved to its old generation) records the store in the old generation's
 * list of pointers to new objects, a call per figure; an object made just before needs no record.
 * (A solver reads its input during the call and keeps nothing of it.)
 */
function pairInput(ka: DefiningKey, va: number, kb: DefiningKey, vb: number): Partial<Record<DefiningKey, number>> {
  const input: Record<DefiningKey, number | undefined> = {
    db: undefined,
    wb: undefined,
    dp: undefined,
    rh: undefined,
    w: undefined,
    h: undefined,
  };
  setInput(input, ka, va);
  setInput(input, kb, vb);
  return input as Partial<Record<DefiningKey, number>>;
}

/**
 * `input[k] = v`, written as one store per key: a store under a key chosen at run time goes
 * through the engine's generic look-up, where a store to a named field is one write.
 */
function setInput(input: Record<DefiningKey, number | undefined>, k: DefiningKey, v: number): void {
  switch (k) {
    case 'db':
      input.db = v;
      return;
    case 'wb':
      input.wb = v;
      return;
    case 'dp':
      input.dp = v;
      return;
    case 'rh':
      input.rh = v;
      return;
    case 'w':
      input.w = v;
      return;
    default:
      input.h = v;
  }
}

/**
 * Evaluates one `state` statement; always returns a result (with `state: null` when it failed).
 * The steps: read the properties (references resolved), the pressure, the defining pair, the
 * solve, the claims. The result is built once, from what the steps found.
 */
export function evaluateState(ctx: EvalContext, stmt: StateStatement, index: number, owner: boolean): StateResult {
  void owner;
  const name = stmt.name?.text ?? '';
  // The words of the state in messages (`stateWhat`) are made only when a message is.
  const read = readProps(ctx, stmt.props, STATE_KEYS, stateWhat, stmt, index, true);
  const { props } = read;
  // The site's pressure, unless the state sets its own (or could not read it).
  let pressure = ctx.site;
  let failed = false;
  if (read.broken.length > 0 || read.pressure > 0)
    ({ pressure, failed } = statePressure(ctx, props, read.broken, stateWhat(stmt)));
  const candidates = failed ? null : definingCandidates(ctx, props, read, stmt);
  const state = candidates ? solveFirstPair(ctx, candidates, pressure, stmt) : null;
  // The pair it was solved from: candidates `solvedAt` and `solvedAt + 1`, its keys `solvedKeys`
  // (read before anything else solves a state).
  const a = state ? candidates![solvedAt]! : null;
  const b = state ? candidates![solvedAt + 1]! : null;
  const result: StateResult = {
    kind: 'state',
    name,
    statement: stmt,
    state,
    pressure,
    defining: state ? solvedKeys : EMPTY,
    claims: state && a && b ? claimsBeyondPair(ctx, props, a, b, state, pressure) : EMPTY,
  };
  if (read.references > 0) {
    const sources = sourcesOf(props);
    if (sources) result.sources = sources;
  }
  return result;
}

/** A state statement as messages name it: `state OA`, or `this state` when it has no name. */
function stateWhat(stmt: StateStatement): string {
  const name = stmt.name?.text ?? '';
  return name ? `state ${name}` : 'this state';
}

/** The claims of a solved state: every property written beyond its defining pair and its pressure. */
function claimsBeyondPair(
  ctx: EvalContext,
  props: ReadProp[],
  a: ReadProp,
  b: ReadProp,
  state: MoistAirState,
  pressure: PressureBasis,
): ClaimResult[] {
  // The pair is two of the properties: with no other, there is no claim.
  if (props.length === 2) return EMPTY;
  let claimsProps: ReadProp[] | null = null;
  for (const p of props) if (p !== a && p !== b && !isPressureProp(p)) claimsProps = appended(claimsProps, p);
  if (!claimsProps) return EMPTY;
  return stateClaims(
    ctx,
    claimsProps,
    state,
    () => `from ${writtenList([a, b])} at ${pressureWord(pressure, ctx.units)}`,
  );
}

/**
 * The pressure of a state: its own p= / elev=, else the site pressure; `failed` when the override could not be read.
 */
function statePressure(
  ctx: EvalContext,
  props: ReadProp[],
  broken: readonly string[],
  what: string,
): { pressure: PressureBasis; failed: boolean } {
  let pressure: PressureBasis = ctx.site;
  let failed = broken.includes('p') || broken.includes('elev');
  const override = props.filter(isPressureProp);
  if (override.length > 0) {
    const basis = pressureFromProps(ctx, override, 'override', `${what} own pressure`);
    if (basis) pressure = basis;
    else failed = true;
  }
  return { pressure, failed };
}

/**
 * The candidate defining pairs in order of preference, or null after a diagnostic (too few
 * properties, a dependent pair). A reference always defines: only pairs holding every reference
 * are candidates, so at most two references fit on one state. (The diagnostics are functions of
 * their own, so that this one stays small enough for the engine to build into its caller.)
 */
function definingCandidates(
  ctx: EvalContext,
  props: ReadProp[],
  read: ReadProps,
  stmt: StateStatement,
): readonly ReadProp[] | null {
  const defs = read.defining === props.length ? props : props.filter(isDefiningProp);
  if (defs.length < 2) {
    underspecified(ctx, props, defs, read, stateWhat(stmt), stmt.name?.span ?? stmt.keywordSpan);
    return null;
  }
  const refs = read.references > 0 && defs.some(isReference) ? defs.filter(isReference) : NO_PROPS;
  if (refs.length > 2) {
    tooManyReferences(ctx, refs, stateWhat(stmt));
    return null;
  }
  const candidates = pairsHolding(candidatePairs(defs), refs);
  if (candidates.length === 0) {
    noIndependentPair(ctx, defs, refs, stateWhat(stmt));
    return null;
  }
  return candidates;
}

/**
 * `underspecified` for a state with fewer than two defining properties `defs`, reported on
 * `fallback`, unless a property that could not be read (bad unit, unknown key) already explains
 * the shortfall.
 */
function underspecified(
  ctx: EvalContext,
  props: ReadProp[],
  defs: ReadProp[],
  read: ReadProps,
  what: string,
  fallback: Span,
): void {
  const brokenDefining = read.broken.filter((k) => isDefiningKey(k));
  if (defs.length + brokenDefining.length + read.unknownKeys >= 2) return;
  const has = defs.length === 1 ? `only ${writtenList(defs)}` : 'no defining property';
  const hasV = props.some((p) => p.key === 'v');
  const missing = orList(DEFINING_KEYS.filter((k) => !defs.some((d) => d.key === k)));
  const example = defs[0]?.key === 'db' ? 'rh=50%' : `${exampleIn('db', ctx.units)} rh=50%`;
  ctx.report({
    code: 'underspecified',
    severity: 'error',
    message:
      `${what} has ${has}: two independent properties fix a state; ` +
      `add ${defs.length === 1 ? 'one more' : 'two'} of ${missing} (e.g. ${example})` +
      `${hasV ? '; v is checked as a claim but cannot define a state' : ''}`,
    span: fallback,
  });
}

/** `bad-reference` for a state with more than two references `refs` (a reference always defines). */
function tooManyReferences(ctx: EvalContext, refs: readonly ReadProp[], what: string): void {
  ctx.report({
    code: 'bad-reference',
    severity: 'error',
    message:
      `${what}: ${writtenList(refs)} are ${refs.length} properties taken from other states, ` +
      `but two fix a state and a reference always defines; write the others as figures (claims)`,
    span: spanOf(new Map(), refs.slice(2)),
  });
}

/** `dependent-pair` for a state whose defining properties `defs` (holding `refs`) give no candidate pair. */
function noIndependentPair(ctx: EvalContext, defs: ReadProp[], refs: readonly ReadProp[], what: string): void {
  const [a, b] = refs.length === 2 ? [refs[0]!, refs[1]!] : [defs[0]!, defs[1]!];
  const pair = refs.length === 2 ? refs : defs;
  ctx.report({
    code: 'dependent-pair',
    severity: 'error',
    message:
      `${what}: ${writtenList(pair)} fix the same thing (the moisture content) twice, so the state is not fixed; ` +
      `add ${thirdKindFor(a.key as DefiningKey, b.key as DefiningKey)}` +
      `${refs.length > 0 ? ' (a reference always defines)' : ''}`,
    span: spanOf(new Map(), pair),
  });
}

/** No properties (shared, never written to). */
const NO_PROPS: readonly ReadProp[] = [];

/**
 * Where the pair that {@link solveFirstPair} solved its state from stands in its candidates (the
 * pair is `candidates[solvedAt]`, `candidates[solvedAt + 1]`): set by it, read by its caller
 * right after. (The state is the one result of the call; the pair's place is a number beside it
 * rather than an object of three fields made per state.)
 */
let solvedAt = -1;
/** The list of that pair's keys (`definingPair`), found once for the solve and the result. */
let solvedKeys: DefiningKey[] = EMPTY;

/** The span of each written key of the candidates, for messages (built only when one is reported). */
function spansOfCandidates(candidates: readonly ReadProp[]): Map<string, Span> {
  return new Map<string, Span>(allOf(candidates).map((p) => [p.key, p.prop.span]));
}

/** Every property of the candidates, once. */
function allOf(candidates: readonly ReadProp[]): ReadProp[] {
  return [...new Set<ReadProp>(candidates)];
}

/**
 * Solves the first candidate pair that is not dependent at the state's pressure (reporting the
 * engine's warnings, and its problem when the pair gives no state): the state, its pair's place
 * in {@link solvedAt} and its keys in {@link solvedKeys}; null when none gives one.
 * (The reports are functions of their own, so that this one stays small enough for the engine to
 * build into its caller.)
 */
function solveFirstPair(
  ctx: EvalContext,
  candidates: readonly ReadProp[],
  pressure: PressureBasis,
  stmt: StateStatement,
): MoistAirState | null {
  let lastDependent: PhysicsProblem | null = null;
  for (let k = 0; k + 1 < candidates.length; k += 2) {
    const a = candidates[k]!;
    const b = candidates[k + 1]!;
    const ka = a.key as DefiningKey;
    const kb = b.key as DefiningKey;
    const keys = definingPair(ka, kb);
    const solved = solveOrProblem(
      ctx.solve,
      pairInput(ka, a.q.si, kb, b.q.si),
      pressure.pa,
      ALLOW_FOG,
      'check the figures',
      keys,
    );
    if (!solved.ok) {
      if (solved.problem.code === 'dependent-pair') {
        lastDependent = solved.problem;
        continue;
      }
      reportProblem(ctx, solved.problem, candidates, [a, b], pressure, stateWhat(stmt));
      return null;
    }
    if (!stateFinite(solved.state)) {
      const span = spanOf(spansOfCandidates(candidates), [a, b]);
      reportNotFinite(ctx, solved.warnings, a, b, span, pressure, stateWhat(stmt));
      return null;
    }
    if (solved.warnings.length > 0 || isIllConditionedPair(ka, kb))
      reportWarnings(ctx, solved.warnings, candidates, a, b, stateWhat(stmt));
    solvedAt = k;
    solvedKeys = keys;
    return solved.state;
  }
  if (lastDependent) reportProblem(ctx, lastDependent, candidates, allOf(candidates), null, stateWhat(stmt));
  return null;
}

/**
 * The engine's problem with the candidate pairs, an error on the properties `on`; with the
 * pressure used when it is the pressure's problem (`pressure` given).
 */
function reportProblem(
  ctx: EvalContext,
  problem: PhysicsProblem,
  candidates: readonly ReadProp[],
  on: readonly ReadProp[],
  pressure: PressureBasis | null,
  what: string,
): void {
  const spans = spansOfCandidates(candidates);
  ctx.report(
    problemDiagnostic(
      problem,
      ctx.units,
      'error',
      spans,
      spanOf(spans, on),
      what,
      pressure ? pressureRelated(problem, pressure) : undefined,
    ),
  );
}

/**
 * The engine's warnings on the state solved from `a` and `b`, and `ill-conditioned` for an
 * ill-conditioned pair the engine did not warn about.
 */
function reportWarnings(
  ctx: EvalContext,
  warnings: readonly PhysicsProblem[],
  candidates: readonly ReadProp[],
  a: ReadProp,
  b: ReadProp,
  what: string,
): void {
  const spans = spansOfCandidates(candidates);
  let illReported = false;
  for (const w of warnings) {
    if (w.code === 'ill-conditioned') illReported = true;
    ctx.report(problemDiagnostic(w, ctx.units, 'warning', spans, spanOf(spans, [a, b]), what));
  }
  if (!illReported && isIllConditionedPair(a.key as DefiningKey, b.key as DefiningKey)) {
    ctx.report({
      code: 'ill-conditioned',
      severity: 'warning',
      message:
        `${what}: ${writtenList([a, b])} are nearly parallel on the chart, so small ` +
        `changes in either move the state a lot; define it with db, dp, rh or w instead`,
      span: spanOf(spans, [a, b]),
    });
  }
}

/**
 * A state with a property without a finite value (bone-dry air has no dew point; air above the
 * boiling point cannot be saturated): the engine explains it in a warning, reported as the error.
 */
function reportNotFinite(
  ctx: EvalContext,
  warnings: readonly PhysicsProblem[],
  a: ReadProp,
  b: ReadProp,
  span: Span,
  pressure: PressureBasis,
  what: string,
): void {
  const why = warnings.filter((w) => w.code === 'out-of-range' || w.code === 'pressure-below-saturation');
  if (why.length === 0) {
    const pairText = writtenList([a, b]);
    ctx.report({
      code: 'out-of-range',
      severity: 'error',
      message: `${what}: ${pairText} give a state with a property that has no finite value; check the figures`,
      span,
    });
    return;
  }
  for (const w of why) {
    ctx.report({
      code: w.code,
      severity: 'error',
      message: `${what}: ${problemTexts(w, ctx.units).message} ${
        w.code === 'pressure-below-saturation'
          ? 'Dewmark needs a state that can be saturated: lower the dry-bulb below the boiling point ' +
            `at ${pressureWord(pressure, ctx.units)}, or raise the pressure`
          : 'Dewmark needs every property finite: give a humidity ratio above zero'
      }`,
      span,
    });
  }
}

/** The pressure a result used, in the note's unit system (`83.523 kPa`, `12.114 psia`). */
export function pressureWord(p: PressureBasis, system: UnitSystem): string {
  return figureText(p.pa, 'pressure', system);
}

function spanOf(spansByKey: ReadonlyMap<string, Span>, props: readonly ReadProp[]): Span {
  let start = Infinity;
  let end = -Infinity;
  for (const p of props) {
    const s = spansByKey.get(p.key) ?? p.prop.span;
    start = Math.min(start, s.start);
    end = Math.max(end, s.end);
  }
  return Number.isFinite(start) ? { start, end } : { start: 0, end: 0 };
}

function pressureRelated(problem: PhysicsProblem, basis: PressureBasis): { span: Span; message: string }[] | undefined {
  if (problem.code !== 'pressure-below-saturation' && problem.code !== 'out-of-range') return undefined;
  if (!basis.span) return undefined;
  return [{ span: basis.span, message: `pressure used: ${basis.describe}` }];
}
