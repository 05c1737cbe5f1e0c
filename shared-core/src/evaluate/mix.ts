/**
 * `mix NAME: A X + B Y [+ …] [claims]`: adiabatic mixing of named states by dry-air mass and
 * energy balance (ASHRAE HoF 2017 SI Ch.1, adiabatic mixing of two moist-air streams):
 *   W = Σ ṁ·W / Σ ṁ,  h = Σ ṁ·h / Σ ṁ,  then the state from (W, h) at the streams' pressure.
 * Amounts are dry-air mass fractions (%), dry-air mass flows, or volume flows taken at each
 * stream's own state (ṁ = V̇ / v, v per kg of dry air).
 */
import type { MoistAirState } from '../physics/types';
import type { CoreDiagnostic, MixStatement, NameNode, PropertyNode, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import { lookupUnit } from '../units';
import type { EvalContext } from './context';
import { MIX_KEYS } from './keys';
import { problemDiagnostic } from './problems';
import { readProps } from './props';
import { dimensionWords, findUnit, readQuantity, suggestSymbol, type ResolvedQuantity } from './quantity';
import { checkClaim } from './claims';
import { exampleIn } from './figures';
import { solveOrProblem } from './solve';
import { stateClaims, stateFinite } from './state';
import type { ClaimResult, PressureBasis, StateResult } from './types';
import { formatSig, spanUnion } from './util';

/** Streams whose pressures differ by more than this fraction get a `pressure-mismatch` warning. */
const PRESSURE_SLACK = 1e-4;

type AmountKind = 'fraction' | 'massFlow' | 'volumeFlow';

/** A stream's amount as read (for `rest`, filled in from total= or 100 % once every amount is read). */
interface Amount {
  name: string;
  amountSpan: Span;
  kind: AmountKind;
  /** Fraction 0…1, kg/s or m³/s. */
  si: number;
  /** Half a unit of the last written digit, in SI (0 for a rest). */
  halfResolution: number;
  /** Written as `rest`. */
  rest: boolean;
}

/** A stream whose state and amount could both be read. */
interface StreamRead {
  name: string;
  span: Span;
  state: StateResult;
  /** Its amount (kind and figure final once the rest and total= are applied). */
  amount: Amount;
}

/** `total=3.9kg/s` or `total=3.4m3/s`: the flow a mix's streams add up to. */
interface Total {
  kind: 'massFlow' | 'volumeFlow';
  si: number;
  prop: PropertyNode;
  q: ResolvedQuantity;
}

/** The streams as read (step 1). */
interface StreamsRead {
  /** The streams whose state and amount could both be read. */
  streams: StreamRead[];
  /**
   * Every amount that could be read, whether or not its state could: the fractions are checked
   * even when a stream's state failed, so a wrong sum is not hidden behind another error.
   */
  amounts: Amount[];
  /** An amount could not be read (reported). */
  amountFailed: boolean;
  /** A stream's state or amount could not be read (reported). */
  failed: boolean;
}

/** Each stream's share of the mixed air (step 3). */
interface DryAirFlows {
  /** Dry-air mass flow of each stream, kg/s (its fraction when the amounts are fractions). */
  mass: number[];
  /** Their sum. */
  totalMass: number;
  /** Each stream's fraction of the dry-air mass. */
  fractions: number[];
}

/**
 * Evaluates one `mix` statement; always returns a result (with `state: null` when it failed).
 * The steps: read the claims and total=, resolve the streams (names and amounts), check the
 * amounts (rest, kinds, the sum of fractions, total=), convert them to dry-air mass flows, one
 * pressure, the mass and energy balance, the solve, and the claims.
 */
export function evaluateMix(ctx: EvalContext, stmt: MixStatement, index: number, owner: boolean): StateResult {
  void owner;
  const name = stmt.name?.text ?? '';
  const what = name ? `mix ${name}` : 'this mix';
  const fallback: Span = stmt.name?.span ?? stmt.keywordSpan;
  const result: StateResult = {
    kind: 'mix',
    name,
    statement: stmt,
    state: null,
    pressure: ctx.site,
    defining: ['w', 'h'],
    claims: [],
    streams: [],
    massFlowKgS: null,
  };
  // total= takes a mass or a volume flow, so it is read apart from the claims.
  const totalProp = stmt.props.find((p) => p.key === 'total');
  const claimProps = readProps(
    ctx,
    totalProp ? stmt.props.filter((p) => p.key !== 'total') : stmt.props,
    MIX_KEYS,
    what,
    stmt,
    index,
    false,
  );
  const total = totalProp ? readTotal(ctx, totalProp, what, stmt) : null;

  if (stmt.streams.length === 0) {
    ctx.report({
      code: 'underspecified',
      severity: 'error',
      message: `${what} has no streams; write them like mix ${name || 'MA'}: OA 25% + RA 75%`,
      span: fallback,
    });
    return result;
  }
  const read = readStreams(ctx, stmt, index, what);
  if (totalProp && !total) return result;
  if (!checkAmounts(ctx, stmt, read, total, what)) return result;
  const { streams, amounts } = read;
  if (read.failed || streams.length === 0) return result;
  const flows = dryAirFlows(ctx, streams, what);
  if (!flows) return result;
  const { mass, totalMass, fractions } = flows;
  const pressure = mixPressure(ctx, streams, fractions, what);
  result.pressure = pressure;

  const { w, h } = mixBalance(streams, fractions);
  const isFlow = !streams.some((s) => s.amount.kind === 'fraction');
  result.streams = streams.map((s, i) => ({
    name: s.name,
    fraction: fractions[i]!,
    massFlowKgS: isFlow ? mass[i]! : null,
  }));
  result.massFlowKgS = isFlow ? totalMass : null;
  // total= beside streams that are all given (no rest): a claim about their sum.
  const totalClaim =
    total && isFlow && !amounts.some((a) => a.rest) && ctx.settings.checkClaims
      ? totalFlowClaim(ctx, total, streams, flows)
      : null;

  const state = solveMix(ctx, w, h, pressure, streams, what, fallback);
  if (!state) return result;
  result.state = state;
  if (claimProps.props.length > 0) {
    result.claims = stateClaims(
      ctx,
      claimProps.props,
      state,
      () =>
        `from the mass and energy balance ` +
        `of ${streams.map((s, i) => `${s.name} ${formatSig(fractions[i]! * 100, 3)} %`).join(' + ')}`,
    );
  }
  if (totalClaim) result.claims = [...result.claims, totalClaim];
  return result;
}

/**
 * Step 1: every stream's name (a computed state defined above) and its amount, each reported when it cannot be read.
 */
function readStreams(ctx: EvalContext, stmt: MixStatement, index: number, what: string): StreamsRead {
  const out: StreamsRead = { streams: [], amounts: [], amountFailed: false, failed: false };
  for (const s of stmt.streams) {
    const ref = ctx.resolve(s.name, stmt, index);
    let state: StateResult | null = null;
    if (ref.ok) {
      if (ref.item.kind === 'process') {
        ctx.report({
          code: 'not-a-state',
          severity: 'error',
          message: `'${s.name.text}' is a process, not a state; a mix takes states (state or mix names)`,
          span: s.name.span,
          related: [{ span: ref.def.span, message: `process ${s.name.text}` }],
        });
        out.failed = true;
      } else if (ref.item.state === null) {
        ctx.report(dependencyInfo(what, s.name.text, s.name.span, ref.def.span));
        out.failed = true;
      } else state = ref.item;
    } else {
      if (ref.failed) ctx.report(dependencyInfo(what, s.name.text, s.name.span, ref.def.span));
      out.failed = true;
    }
    const read = s.rest
      ? { kind: 'fraction' as const, si: 0, halfResolution: 0, span: s.rest }
      : readAmount(ctx, s.amount, s.span, s.name.text, what);
    if (!read) {
      out.failed = true;
      out.amountFailed = true;
      continue;
    }
    const amount: Amount = {
      name: s.name.text,
      amountSpan: read.span,
      kind: read.kind,
      si: read.si,
      halfResolution: read.halfResolution,
      rest: s.rest !== undefined,
    };
    out.amounts.push(amount);
    if (state) out.streams.push({ name: s.name.text, span: s.span, state, amount });
  }
  return out;
}

/**
 * Step 2: the amounts together — the rest stream takes what the others leave of total= (or of
 * 100 %); fractions and flows do not mix; fractions add to 100 % (within half a unit of the last
 * digit of each); fractions with a total become dry-air mass flows. False after a diagnostic.
 */
function checkAmounts(
  ctx: EvalContext,
  stmt: MixStatement,
  read: StreamsRead,
  total: Total | null,
  what: string,
): boolean {
  const { amounts, amountFailed } = read;
  if (!amountFailed && !resolveRest(ctx, amounts, total, what)) return false;
  // Fractions and flows do not mix.
  const allAmountKinds = new Set<AmountKind>();
  for (const s of stmt.streams) {
    const k = s.amount?.unit ? amountKindOf(s.amount.unit.text) : null;
    if (k) allAmountKinds.add(k);
  }
  if (allAmountKinds.has('fraction') && (allAmountKinds.has('massFlow') || allAmountKinds.has('volumeFlow'))) {
    const flows =
      ctx.units === 'IP'
        ? 'OA 2,500cfm + RA 7,500cfm, or mass flows such as 9,500lb/h'
        : 'OA 1.2kg/s + RA 3.6kg/s, or volume flows such as 1000L/s';
    ctx.report({
      code: 'mix-amounts',
      severity: 'error',
      message:
        `${what} mixes fractions (%) with flows; give every stream as a dry-air mass fraction (OA 25% + RA 75%) ` +
        `or every stream as a flow (${flows})`,
      span: spanUnion(...stmt.streams.map((s) => s.span)),
    });
    return false;
  }
  if (!amountFailed && amounts.length > 0 && amounts.every((a) => a.kind === 'fraction')) {
    if (!checkFractionSum(ctx, amounts, what)) return false;
  }
  // Fractions with a total: dry-air mass flows.
  return amountFailed || !total || applyTotal(ctx, amounts, total, what);
}

/**
 * Fractions are not negative and add to 100 % (within half a unit of the last digit of each); false after a diagnostic.
 */
function checkFractionSum(ctx: EvalContext, amounts: Amount[], what: string): boolean {
  const sum = amounts.reduce((a, s) => a + s.si, 0);
  const slack = amounts.reduce((a, s) => a + s.halfResolution, 0) + 1e-9;
  const negative = amounts.find((s) => s.si < 0);
  if (negative) {
    ctx.report({
      code: 'mix-fractions',
      severity: 'error',
      message: `${what}: the fraction of ${negative.name} is negative; fractions are between 0 % and 100 %`,
      span: negative.amountSpan,
    });
    return false;
  }
  if (Math.abs(sum - 1) > slack) {
    ctx.report({
      code: 'mix-fractions',
      severity: 'error',
      message:
        `${what}: the fractions add to ${formatSig(sum * 100, 6)} %, not 100 %; ` +
        `change them so they add to 100 % (the fractions are of dry-air mass)`,
      span: spanUnion(...amounts.map((s) => s.amountSpan)),
      data: { sumPct: sum * 100 },
    });
    return false;
  }
  return true;
}

/**
 * Step 3: the dry-air mass flow of each stream (a volume flow at the stream's own state, ṁ = V̇ / v)
 * and its fraction of the whole; null after a diagnostic (no flow at all, an overflow, a negative flow).
 */
function dryAirFlows(ctx: EvalContext, streams: StreamRead[], what: string): DryAirFlows | null {
  const mass: number[] = streams.map((s) => {
    if (s.amount.kind === 'volumeFlow') return s.amount.si / s.state.state!.v;
    return s.amount.si;
  });
  const totalMass = mass.reduce((a, m) => a + m, 0);
  if (!(totalMass > 0) || !Number.isFinite(totalMass)) {
    const why = Number.isFinite(totalMass)
      ? 'the streams add to no flow at all; give at least one stream a positive amount'
      : 'the stream flows are too large to add up; give realistic amounts';
    ctx.report({
      code: 'mix-fractions',
      severity: 'error',
      message: `${what}: ${why}`,
      span: spanUnion(...streams.map((s) => s.amount.amountSpan)),
    });
    return null;
  }
  const fractions = mass.map((m) => m / totalMass);
  if (fractions.some((f) => f < 0)) {
    ctx.report({
      code: 'mix-fractions',
      severity: 'error',
      message: `${what}: a stream has a negative flow; flows are positive figures`,
      span: spanUnion(...streams.map((s) => s.amount.amountSpan)),
    });
    return null;
  }
  return { mass, totalMass, fractions };
}

/**
 * Step 4: one pressure for all the streams — the first stream's, or the dry-air-mass-weighted mean
 * with a `pressure-mismatch` warning when they differ.
 */
function mixPressure(ctx: EvalContext, streams: StreamRead[], fractions: number[], what: string): PressureBasis {
  const pMean = streams.reduce((a, s, i) => a + fractions[i]! * s.state.pressure.pa, 0);
  const pMin = Math.min(...streams.map((s) => s.state.pressure.pa));
  const pMax = Math.max(...streams.map((s) => s.state.pressure.pa));
  const first = streams[0]!.state.pressure;
  if (!(pMax - pMin > PRESSURE_SLACK * pMean)) return first;
  ctx.report({
    code: 'pressure-mismatch',
    severity: 'warning',
    message:
      `${what}: the streams are at different pressures (${ctx.fig(pMin, 'pressure')} ` +
      `to ${ctx.fig(pMax, 'pressure')}); the mix is computed at their ` +
      `mean, ${ctx.fig(pMean, 'pressure')}. Put all streams at one pressure (one site: line)`,
    span: spanUnion(...streams.map((s) => s.span)),
  });
  return {
    pa: pMean,
    source: first.source,
    span: null,
    elevationM: null,
    describe: `mean of the streams' pressures, ${ctx.fig(pMean, 'pressure')}`,
    origin: "mean of the streams' pressures",
  };
}

/** Step 5: the mass and energy balance over the dry-air fractions, W = Σ x·W and h = Σ x·h. */
function mixBalance(streams: StreamRead[], fractions: number[]): { w: number; h: number } {
  let w = 0;
  let h = 0;
  streams.forEach((s, i) => {
    w += fractions[i]! * s.state.state!.w;
    h += fractions[i]! * s.state.state!.h;
  });
  return { w, h };
}

/**
 * total= beside streams given as flows (no rest): a claim about their sum (mass flows, or volume
 * flows each at its own state).
 */
function totalFlowClaim(ctx: EvalContext, total: Total, streams: StreamRead[], flows: DryAirFlows): ClaimResult {
  const { mass, totalMass } = flows;
  const computed =
    total.kind === 'massFlow' ? totalMass : streams.reduce((a, s, i) => a + mass[i]! * s.state.state!.v, 0);
  const { claim, diagnostic } = checkClaim(
    'total',
    total.prop,
    total.q,
    computed,
    () =>
      `as the sum of the streams' ` +
      (total.kind === 'massFlow' ? 'dry-air mass flows' : 'volume flows, each at its own state'),
  );
  if (diagnostic) ctx.report(diagnostic);
  return claim;
}

/**
 * Step 6: the mixed state from (W, h) at the mix pressure, with the engine's problem, a
 * non-finite state or the fog warning reported; null when there is no state.
 */
function solveMix(
  ctx: EvalContext,
  w: number,
  h: number,
  pressure: PressureBasis,
  streams: StreamRead[],
  what: string,
  fallback: Span,
): MoistAirState | null {
  const solved = solveOrProblem(ctx.solve, { w, h }, pressure.pa, { allowFog: true }, 'check the streams', []);
  const spans = new Map<string, Span>();
  if (!solved.ok) {
    ctx.report(
      problemDiagnostic(
        solved.problem,
        ctx.units,
        'error',
        spans,
        fallback,
        `${what} (W = ${ctx.fig(w, 'humidityRatio')}, h = ${ctx.fig(h, 'enthalpy')})`,
      ),
    );
    return null;
  }
  if (!stateFinite(solved.state)) {
    ctx.report({
      code: 'no-solution',
      severity: 'error',
      message: `${what}: the mixed state could not be computed; check the streams`,
      span: spanUnion(...streams.map((s) => s.span)),
    });
    return null;
  }
  for (const warn of solved.warnings) {
    if (warn.code === 'supersaturated') {
      ctx.report({
        code: 'supersaturated',
        severity: 'warning',
        message:
          `${what}: the mixed state lies in the fog region (W = ${ctx.fig(w, 'humidityRatio')} is above ` +
          `saturation at the mixed dry-bulb ${ctx.fig(solved.state.db, 'temperature')}): water would ` +
          `condense as mist in the mixing box. Preheat the colder stream, or change the proportions`,
        span: fallback,
        related: streams.map((s) => ({ span: s.span, message: `stream ${s.name}` })),
      });
    } else {
      ctx.report(problemDiagnostic(warn, ctx.units, 'warning', spans, fallback, what));
    }
  }
  return solved.state;
}

/** `total=`: a dry-air mass flow or a volume flow, positive; null after a diagnostic. */
function readTotal(ctx: EvalContext, prop: PropertyNode, what: string, stmt: MixStatement): Total | null {
  if (prop.ref) {
    ctx.references.push({ name: prop.ref.state.text, span: prop.ref.state.span, statement: stmt });
    ctx.report({
      code: 'bad-reference',
      severity: 'error',
      message:
        `${what}: total= takes a figure, not a reference; write ` +
        `the total flow, e.g. ${exampleIn('total', ctx.units)}`,
      span: prop.ref.span,
    });
    return null;
  }
  const value = prop.value;
  if (!value) return null; // the parser reported it
  const kinds =
    ctx.units === 'IP'
      ? 'a dry-air mass flow (lb/h, lb/min, kg/s) or a volume flow (cfm, m3/s, L/s)'
      : 'a dry-air mass flow (kg/s, kg/h, lb/h) or a volume flow (m3/s, L/s, cfm)';
  if (!value.unit) {
    ctx.report({
      code: 'missing-unit',
      severity: 'error',
      message:
        `${what}: total=${value.number.text} has no unit; the total is ${kinds}, ` +
        `e.g. total=${value.number.text}${ctx.units === 'IP' ? 'lb/h' : 'kg/s'}`,
      span: value.number.span,
    });
    return null;
  }
  const kind = amountKindOf(value.unit.text);
  if (kind !== 'massFlow' && kind !== 'volumeFlow') {
    const sug = kind ? null : suggestSymbol(value.unit.text, ['massFlow', 'volumeFlow']);
    ctx.report({
      code: 'unknown-unit',
      severity: 'error',
      message:
        `${what}: '${value.unit.text}' in total= is not a flow unit; the total ` +
        `is ${kinds}${sug ? ` (did you mean total=${value.number.text}${sug}?)` : ''}`,
      span: value.unit.span,
      data: sug ? { suggestion: sug } : {},
    });
    return null;
  }
  const r = readQuantity(prop, value, { ...MIX_KEYS.total!, dimension: kind });
  if (!r.ok) {
    ctx.report(r.diagnostic);
    return null;
  }
  if (!(r.value.si > 0) || !Number.isFinite(r.value.si)) {
    ctx.report({
      code: 'out-of-range',
      severity: 'error',
      message:
        `${what}: total=${value.number.text}${value.unit.text} is ` +
        `not a positive flow; give the total as a positive figure`,
      span: value.span,
    });
    return null;
  }
  return { kind, si: r.value.si, prop, q: r.value };
}

/** "1.2 kg/s" or "0.9 m³/s" (lb/h, cfm in an IP note) for messages. */
function flowText(ctx: EvalContext, si: number, kind: AmountKind): string {
  return ctx.fig(si, kind === 'fraction' ? 'fraction' : kind);
}

/**
 * The amount of the `rest` stream: 100 % less the fractions given, or total= less the flows given
 * (of the total's kind: mass flows against a mass total, volume flows against a volume total).
 * False after a `mix-rest` error.
 */
function resolveRest(ctx: EvalContext, amounts: Amount[], total: Total | null, what: string): boolean {
  const rests = amounts.filter((a) => a.rest);
  if (rests.length === 0) return true;
  const restError = (message: string, span: Span): false => {
    ctx.report({ code: 'mix-rest', severity: 'error', message: `${what}: ${message}`, span });
    return false;
  };
  if (rests.length > 1)
    return restError(
      `only one stream can be the rest (${rests.map((r) => `${r.name} rest`).join(', ')}); give the others an amount`,
      spanUnion(...rests.slice(1).map((r) => r.amountSpan)),
    );
  const rest = rests[0]!;
  const given = amounts.filter((a) => !a.rest);
  const sum = given.reduce((a, g) => a + g.si, 0);
  const slack = given.reduce((a, g) => a + g.halfResolution, 0) + 1e-9;
  if (given.every((g) => g.kind === 'fraction')) {
    if (sum > 1 + slack)
      return restError(
        `the fractions given add to ${formatSig(sum * 100, 6)} %, which leaves ` +
          `nothing for ${rest.name} rest; make them add to less than 100 %`,
        spanUnion(...given.map((g) => g.amountSpan)),
      );
    rest.kind = 'fraction';
    rest.si = Math.max(0, 1 - sum);
    return true;
  }
  if (!total)
    return restError(
      `${rest.name} rest is what the other streams leave of the total: add total= ` +
        `after the streams (a mass flow such as ${exampleIn('total', ctx.units)}, or a ` +
        `volume flow such as ${ctx.units === 'IP' ? 'total=7,200cfm' : 'total=3.4m3/s'})`,
      rest.amountSpan,
    );
  const other = given.find((g) => g.kind !== total.kind);
  if (other) {
    return restError(
      `the streams are given as ${other.kind === 'massFlow' ? 'mass flows' : 'volume flows'} ` +
        `but total= is a ${total.kind === 'massFlow' ? 'mass flow' : 'volume flow'}; ` +
        `give the total in the streams' kind so the rest can be taken from it`,
      spanUnion(other.amountSpan, total.q.quantity.span),
    );
  }
  const left = total.si - sum;
  if (!(left > slack)) {
    return restError(
      `the streams given add to ${flowText(ctx, sum, total.kind)}, ` +
        `which leaves ${left < -slack ? 'less than ' : ''}nothing of ` +
        `total=${total.q.quantity.number.text}${total.q.unitText} ` +
        `for ${rest.name}; make the total larger than the streams given`,
      spanUnion(rest.amountSpan, total.q.quantity.span),
    );
  }
  rest.kind = total.kind;
  rest.si = left;
  return true;
}

/** Fractions with total= (a mass flow): each stream's dry-air mass flow. False after a `mix-rest` error. */
function applyTotal(ctx: EvalContext, amounts: Amount[], total: Total, what: string): boolean {
  if (amounts.length === 0 || !amounts.every((a) => a.kind === 'fraction')) return true;
  if (total.kind !== 'massFlow') {
    ctx.report({
      code: 'mix-rest',
      severity: 'error',
      message:
        `${what}: with fractions, give total= as a dry-air mass flow ` +
        `(${exampleIn('total', ctx.units)}): the fractions are of dry-air mass, so a volume ` +
        `total would need a state to convert at; or give the streams as volume flows`,
      span: total.q.quantity.span,
    });
    return false;
  }
  for (const a of amounts) {
    a.kind = 'massFlow';
    a.si *= total.si;
  }
  return true;
}

function amountKindOf(unitText: string): AmountKind | null {
  const u = lookupUnit(unitText);
  if (!u) return null;
  if (u.dimension === 'fraction') return 'fraction';
  if (u.dimension === 'massFlow') return 'massFlow';
  if (u.dimension === 'volumeFlow') return 'volumeFlow';
  return null;
}

function readAmount(
  ctx: EvalContext,
  amount: MixStatement['streams'][number]['amount'],
  streamSpan: Span,
  streamName: string,
  what: string,
): { kind: AmountKind; si: number; halfResolution: number; span: Span } | null {
  if (!amount) return null; // the parser reports a stream without an amount (missing-value)
  if (!amount.unit) {
    ctx.report({
      code: 'missing-unit',
      severity: 'error',
      message:
        `${what}: the amount ${amount.number.text} of ${streamName} has no unit; write a fraction ` +
        `(${amount.number.text}%), a mass flow (${amount.number.text}${ctx.units === 'IP' ? 'lb/h' : 'kg/s'}) ` +
        `or a volume flow (${amount.number.text}${ctx.units === 'IP' ? 'cfm' : 'm3/s'})`,
      span: amount.number.span,
    });
    return null;
  }
  const kind = amountKindOf(amount.unit.text);
  if (!kind) {
    const u = amount.unit.text;
    const def = findUnit(u);
    const sug = def ? null : suggestSymbol(u, ['fraction', 'massFlow', 'volumeFlow']);
    const kinds =
      ctx.units === 'IP'
        ? 'a dry-air mass fraction (%), a dry-air mass flow (lb/h, lb/min, kg/s) or a volume flow (cfm, m3/s, L/s)'
        : 'a dry-air mass fraction (%), a dry-air mass flow (kg/s, kg/h, lb/h) or a volume flow (m3/s, m3/h, L/s, cfm)';
    ctx.report({
      code: 'unknown-unit',
      severity: 'error',
      message: def
        ? `${what}: '${u}' after ${streamName} is ${dimensionWords(def.dimension)} unit; a stream amount is ${kinds}`
        : `${what}: '${u}' after ${streamName} is not a unit Dewmark ` +
          `knows; ${sug ? `did you mean ${streamName} ${amount.number.text}${sug}? ` : ''}a ` +
          `stream amount is ${kinds}`,
      span: amount.unit.span,
      data: sug ? { suggestion: sug } : {},
    });
    return null;
  }
  const dim = kind === 'fraction' ? 'fraction' : kind;
  const r = readQuantity({ key: streamName, keySpan: streamSpan }, amount, {
    key: streamName,
    dimension: dim,
    title: 'a stream amount',
    bare: 'error',
    example: `${streamName} 25%`,
  });
  if (!r.ok) {
    ctx.report(r.diagnostic);
    return null;
  }
  const unit = r.value.unit;
  const halfResolution = (amount.number.resolution / 2) * (unit ? Math.abs(unit.scale) : 1);
  return { kind, si: r.value.si, halfResolution, span: amount.span };
}

/** The short info on a reference to a state that could not be computed (instead of a second error). */
export function dependencyInfo(what: string, ref: string, span: Span, defSpan: Span): CoreDiagnostic {
  return {
    code: 'unresolved-dependency',
    severity: 'info',
    message: `${what} is not computed because ${ref} could not be computed (see the problem reported there)`,
    span,
    related: [{ span: defSpan, message: `${ref} is defined here` }],
  };
}

/**
 * The computed state (or mix) a statement takes in under `node`, or null after one diagnostic: an
 * unknown or later name (reported by the context), a process name (`not-a-state`, ending with
 * `usage`, which says what the statement expects there), or a state that failed (an info).
 */
export function enteringState(
  ctx: EvalContext,
  node: NameNode,
  stmt: Statement,
  index: number,
  what: string,
  usage: string,
): StateResult | null {
  const ref = ctx.resolve(node, stmt, index);
  if (!ref.ok) {
    if (ref.failed) ctx.report(dependencyInfo(what, node.text, node.span, ref.def.span));
    return null;
  }
  if (ref.item.kind === 'process') {
    ctx.report({
      code: 'not-a-state',
      severity: 'error',
      message: `'${node.text}' is a process, not a state; ${usage}`,
      span: node.span,
      related: [{ span: ref.def.span, message: `process ${node.text}` }],
    });
    return null;
  }
  if (ref.item.state === null) {
    ctx.report(dependencyInfo(what, node.text, node.span, ref.def.span));
    return null;
  }
  return ref.item;
}
