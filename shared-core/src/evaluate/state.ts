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
import { solveState } from '../physics';
import type { DefiningKey, MoistAirState, PhysicsProblem } from '../physics/types';
import type { StateStatement } from '../notation/ast';
import type { Span } from '../text/types';
import type { EvalContext } from './context';
import { DEFINING_KEYS, STATE_KEYS, isDefiningKey, isDependentPair, isIllConditionedPair, thirdKindFor } from './keys';
import { pressureFromProps } from './pressure';
import { problemDiagnostic } from './problems';
import type { ReadProp } from './props';
import { readProps } from './props';
import { checkClaim } from './claims';
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
export function writtenList(props: ReadProp[]): string {
  const parts = props.map((p) => `${p.key}=${p.q.quantity.number.text}${p.q.unitText}`);
  if (parts.length <= 1) return parts.join('');
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

/** True when every numeric property of a state is finite (the invariant of results). */
export function stateFinite(s: MoistAirState): boolean {
  return (
    Number.isFinite(s.p) && Number.isFinite(s.db) && Number.isFinite(s.wb) && Number.isFinite(s.dp) && Number.isFinite(s.rh) &&
    Number.isFinite(s.w) && Number.isFinite(s.h) && Number.isFinite(s.v) && Number.isFinite(s.rho) && Number.isFinite(s.pw) &&
    Number.isFinite(s.pws) && Number.isFinite(s.ws) && Number.isFinite(s.mu)
  );
}

/** `a, b or c`. */
function orList(xs: readonly string[]): string {
  return xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} or ${xs[xs.length - 1]}`;
}

/** Candidate defining pairs in order of preference (see the module comment). */
export function candidatePairs(defs: ReadProp[]): [ReadProp, ReadProp][] {
  if (defs.length === 2) {
    // The common case: exactly two defining properties written.
    const a = defs[0]!;
    const b = defs[1]!;
    if (isDependentPair(a.key as DefiningKey, b.key as DefiningKey)) return [];
    return b.key === 'db' ? [[b, a]] : [[a, b]];
  }
  const out: [ReadProp, ReadProp][] = [];
  const db = defs.find((d) => d.key === 'db');
  if (db) {
    for (const d of defs) if (d !== db) out.push([db, d]);
  }
  const ill: [ReadProp, ReadProp][] = [];
  for (let i = 0; i < defs.length; i++) {
    for (let j = i + 1; j < defs.length; j++) {
      const a = defs[i]!;
      const b = defs[j]!;
      if (a.key === 'db' || b.key === 'db') continue;
      const ka = a.key as DefiningKey;
      const kb = b.key as DefiningKey;
      if (isDependentPair(ka, kb)) continue;
      if (isIllConditionedPair(ka, kb)) ill.push([a, b]);
      else out.push([a, b]);
    }
  }
  return [...out, ...ill];
}

/** Compares every claim of a computed state (the properties that did not define it). */
export function stateClaims(ctx: EvalContext, claimsProps: ReadProp[], s: MoistAirState, context: string | (() => string)): ClaimResult[] {
  const out: ClaimResult[] = [];
  if (!ctx.settings.checkClaims) return out;
  for (const c of claimsProps) {
    const computed = stateValue(s, c.key);
    if (computed === null || !Number.isFinite(computed)) continue;
    const { claim, diagnostic } = checkClaim(c.key, c.prop, c.q, computed, context);
    out.push(claim);
    if (diagnostic) ctx.report(diagnostic);
  }
  return out;
}

const NONE: ReadProp[] = [];
const ALLOW_FOG = Object.freeze({ allowFog: true });

function isPressureProp(p: ReadProp): boolean {
  return p.key === 'p' || p.key === 'elev';
}

function isDefiningProp(p: ReadProp): boolean {
  return isDefiningKey(p.key);
}

/**
 * The solver's input for a defining pair, always with the same six fields (absent ones
 * undefined), so that every pair gives the solver an object of one shape.
 */
function pairInput(ka: DefiningKey, va: number, kb: DefiningKey, vb: number): Partial<Record<DefiningKey, number>> {
  const input: Record<DefiningKey, number | undefined> = { db: undefined, wb: undefined, dp: undefined, rh: undefined, w: undefined, h: undefined };
  input[ka] = va;
  input[kb] = vb;
  return input as Partial<Record<DefiningKey, number>>;
}

/** Evaluates one `state` statement; always returns a result (with `state: null` when it failed). */
export function evaluateState(ctx: EvalContext, stmt: StateStatement, owner: boolean): StateResult {
  const name = stmt.name?.text ?? '';
  const what = name ? `state ${name}` : 'this state';
  const fallback: Span = stmt.name?.span ?? stmt.keywordSpan;
  const { props, broken, unknownKeys } = readProps(ctx, stmt.props, STATE_KEYS, what);

  // Pressure: the state's own p= / elev=, else the site pressure.
  let pressure: PressureBasis = ctx.site;
  let pressureFailed = broken.length > 0 && (broken.includes('p') || broken.includes('elev'));
  const override = props.some(isPressureProp) ? props.filter(isPressureProp) : NONE;
  if (override.length > 0) {
    const basis = pressureFromProps(ctx, override, 'override', `${what} own pressure`);
    if (basis) pressure = basis;
    else pressureFailed = true;
  }

  const result: StateResult = { kind: 'state', name, statement: stmt, state: null, pressure, defining: [], claims: [] };
  const defs = props.filter(isDefiningProp);
  if (pressureFailed) return result;

  if (defs.length < 2) {
    // A property that could not be read (bad unit, unknown key) already explains the shortfall.
    const brokenDefining = broken.filter((k) => isDefiningKey(k));
    if (defs.length + brokenDefining.length + unknownKeys >= 2) return result;
    const has = defs.length === 1 ? `only ${writtenList(defs)}` : 'no defining property';
    const hasV = props.some((p) => p.key === 'v');
    ctx.report({
      code: 'underspecified',
      severity: 'error',
      message: `${what} has ${has}: two independent properties fix a state; add ${defs.length === 1 ? 'one more' : 'two'} of ${orList(DEFINING_KEYS.filter((k) => !defs.some((d) => d.key === k)))} (e.g. ${defs[0]?.key === 'db' ? 'rh=50%' : 'db=24C rh=50%'})${hasV ? '; v is checked as a claim but cannot define a state' : ''}`,
      span: fallback,
    });
    return result;
  }

  // The span of each written key, for messages (built only when one is reported).
  let spanMap: Map<string, Span> | null = null;
  const spansByKey = (): Map<string, Span> => (spanMap ??= new Map<string, Span>(props.map((p) => [p.key, p.prop.span])));
  const candidates = candidatePairs(defs);
  if (candidates.length === 0) {
    const a = defs[0]!;
    const b = defs[1]!;
    ctx.report({
      code: 'dependent-pair',
      severity: 'error',
      message: `${what}: ${writtenList(defs)} fix the same thing (the moisture content) twice, so the state is not fixed; add ${thirdKindFor(a.key as DefiningKey, b.key as DefiningKey)}`,
      span: spanOf(spansByKey(), defs),
    });
    return result;
  }

  let lastDependent: PhysicsProblem | null = null;
  for (const [a, b] of candidates) {
    const input = pairInput(a.key as DefiningKey, a.q.si, b.key as DefiningKey, b.q.si);
    let solved: ReturnType<typeof solveState>;
    try {
      solved = ctx.solve(input, pressure.pa, ALLOW_FOG);
    } catch (err) {
      // The engine promises not to throw; if it does, report it as a problem and go on.
      solved = { ok: false, problem: { code: 'no-solution', message: `the engine failed (${err instanceof Error ? err.message : String(err)})`, fix: 'check the figures', keys: [a.key as DefiningKey, b.key as DefiningKey] } };
    }
    if (!solved.ok) {
      if (solved.problem.code === 'dependent-pair') {
        lastDependent = solved.problem;
        continue;
      }
      ctx.report(problemDiagnostic(solved.problem, 'error', spansByKey(), spanOf(spansByKey(), [a, b]), what, pressureRelated(solved.problem, pressure)));
      return result;
    }
    if (!stateFinite(solved.state)) {
      // A property without a finite value (bone-dry air has no dew point; air above the boiling
      // point cannot be saturated): the engine explains it in a warning, reported here as the error.
      const why = solved.warnings.filter((w) => w.code === 'out-of-range' || w.code === 'pressure-below-saturation');
      if (why.length > 0) {
        for (const w of why) {
          ctx.report({
            code: w.code,
            severity: 'error',
            message: `${what}: ${w.message} ${
              w.code === 'pressure-below-saturation'
                ? `Dewmark needs a state that can be saturated: lower the dry-bulb below the boiling point at ${pressureWord(pressure)}, or raise the pressure`
                : 'Dewmark needs every property finite: give a humidity ratio above zero'
            }`,
            span: spanOf(spansByKey(), [a, b]),
          });
        }
      } else {
        ctx.report({ code: 'out-of-range', severity: 'error', message: `${what}: ${writtenList([a, b])} give a state with a property that has no finite value; check the figures`, span: spanOf(spansByKey(), [a, b]) });
      }
      return result;
    }
    result.state = solved.state;
    result.defining = [a.key as DefiningKey, b.key as DefiningKey];
    let illReported = false;
    for (const w of solved.warnings) {
      if (w.code === 'ill-conditioned') illReported = true;
      ctx.report(problemDiagnostic(w, 'warning', spansByKey(), spanOf(spansByKey(), [a, b]), what));
    }
    if (!illReported && isIllConditionedPair(a.key as DefiningKey, b.key as DefiningKey)) {
      ctx.report({
        code: 'ill-conditioned',
        severity: 'warning',
        message: `${what}: ${writtenList([a, b])} are nearly parallel on the chart, so small changes in either move the state a lot; define it with db, dp, rh or w instead`,
        span: spanOf(spansByKey(), [a, b]),
      });
    }
    const claimsProps = props.filter((p) => p !== a && p !== b && p.key !== 'p' && p.key !== 'elev');
    if (claimsProps.length > 0) result.claims = stateClaims(ctx, claimsProps, solved.state, () => `from ${writtenList([a, b])} at ${pressureWord(pressure)}`);
    return result;
  }
  if (lastDependent) {
    ctx.report(problemDiagnostic(lastDependent, 'error', spansByKey(), spanOf(spansByKey(), defs), what));
  }
  return result;
}

/** "83.5 kPa" style text for the pressure a result used. */
export function pressureWord(p: PressureBasis): string {
  return `${(p.pa / 1000).toFixed(3)} kPa`;
}

function spanOf(spansByKey: ReadonlyMap<string, Span>, props: ReadProp[]): Span {
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
