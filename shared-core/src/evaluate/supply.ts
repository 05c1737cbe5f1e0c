/**
 * `supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C` (or `m=3.9kg/s`, or `q=3.4m3/s` at SA):
 * the supply state and dry-air flow that absorb a room's loads (ASHRAE HoF 2017 SI Ch.1, space
 * heat absorption and moist-air moisture gains), with the same sensible/latent split as a
 * `process` from SA to the room state RA (see process.ts), so that such a process at that flow
 * gives the loads back exactly:
 *
 *   Q_s = ṁ (1006 + 1860 W_S) (t_R − t_S)          sensible: moist-air cp at the entering W
 *   Q_l = ṁ (W_R − W_S) (2 501 000 + 1860 t_R)      latent: the rest of ṁ (h_R − h_S), eq 32
 *
 * (J/kg, °C). Loads are heat gains of the room, positive = added to the air on its way from SA to
 * RA (a heating load is written negative). Given the supply dry-bulb t_S, the two equations give
 *
 *   W_S = (Q_s W_R L − 1006 Q_l Δt) / (Q_s L + 1860 Q_l Δt),  ṁ = Q_s / ((1006 + 1860 W_S) Δt)
 *
 * with L = 2 501 000 + 1860 t_R and Δt = t_R − t_S. Given the dry-air flow ṁ,
 *
 *   W_S = W_R − Q_l / (ṁ L),  t_S = t_R − Q_s / (ṁ (1006 + 1860 W_S));
 *
 * given a volume flow V̇ at the supply state, ṁ = V̇ / v_S, solved by fixed-point iteration on ṁ
 * (v_S depends weakly on ṁ; bounded, `no-convergence` otherwise). Room SHR = Q_s / (Q_s + Q_l).
 */
import type { SupplyStatement } from '../notation/ast';
import { satHumRatio, specificVolume } from '../physics';
import type { Span } from '../text/types';
import type { EvalContext } from './context';
import { SUPPLY_KEYS } from './keys';
import { enteringState } from './mix';
import { msg, P as fP, T as fT, TL as fTL, W as fW, type MessageText } from '../physics/message';
import { problemDiagnostic } from './problems';
import type { ReadProp } from './props';
import { readProps } from './props';
import { isVolumeFlowKey, volumeFlowProp } from './volumeFlow';
import { sourcesOf } from './refs';
import { pressureWord, stateClaims, stateFinite, writtenList } from './state';
import { checkClaim } from './claims';
import type { ClaimResult, StateResult, SupplyFigures } from './types';

/** Specific heat of dry air and of water vapour, J/(kg·K) (ASHRAE HoF 2017 SI Ch.1 eq 32). */
const CP_DRY_AIR = 1006;
const CP_VAPOUR = 1860;
/** Heat of vaporization at 0 °C in eq 32, J/kg. */
const H_FG0 = 2_501_000;
/** Iterations of the volume-flow fixed point (it converges in a handful). */
const MAX_ITERATIONS = 60;

/** The supply state's keys that are claims (everything but the loads, the defining figure and the flow). */
const STATE_CLAIM_KEYS = new Set(['db', 'wb', 'dp', 'rh', 'w', 'h', 'v']);

/** A supply state and flow, or why there is none. */
type Solved =
  | { ok: true; t: number; w: number; m: number }
  | { ok: false; message: MessageText; span: Span; code?: 'supply-infeasible' | 'no-convergence' | 'out-of-range' };

function err(
  message: MessageText,
  span: Span,
  code: 'supply-infeasible' | 'no-convergence' | 'out-of-range' = 'supply-infeasible',
): Solved {
  return { ok: false, message, span, code };
}

/** Evaluates one `supply` statement; always returns a result (with `state: null` when it failed). */
export function evaluateSupply(ctx: EvalContext, stmt: SupplyStatement, index: number): StateResult {
  const name = stmt.name?.text ?? '';
  const what = name ? `supply ${name}` : 'this supply';
  const fallback: Span = stmt.name?.span ?? stmt.keywordSpan;
  const read = readProps(ctx, stmt.props, SUPPLY_KEYS, what, stmt, index, true);
  const result: StateResult = {
    kind: 'supply',
    name,
    statement: stmt,
    state: null,
    pressure: ctx.site,
    defining: [],
    claims: [],
  };
  const sources = sourcesOf(read.props);
  if (sources) result.sources = sources;
  // Only the supply temperature may be taken from a state above; the rest are loads, flows and claims.
  let refFailed = false;
  for (const p of read.props) {
    if (p.ref && p.key !== 'db') {
      ctx.report({
        code: 'bad-reference',
        severity: 'error',
        message:
          `${what}: ${p.key}=${p.q.quantity.number.text} cannot be a reference here; a supply ` +
          `takes only its dry-bulb from another state (db=OFF.db+0.8K). Write ${p.key}= as a figure`,
        span: p.prop.span,
      });
      refFailed = true;
    }
  }
  if (!stmt.room) return result; // the parser reported the missing room state
  const room = roomOf(ctx, stmt, index, what);
  if (!room || refFailed || read.broken.length > 0) return result;

  const find = (k: string) => read.props.find((p) => p.key === k);
  const qs = find('q_sensible');
  const ql = find('q_latent');
  if (!qs || !ql) {
    const missing = [qs ? null : 'q_sensible=', ql ? null : 'q_latent='].filter(Boolean).join(' and ');
    const example =
      ctx.units === 'IP'
        ? 'q_sensible=141,600Btu/h q_latent=27,300Btu/h; q_latent=0Btu/h'
        : 'q_sensible=41.5kW q_latent=8kW; q_latent=0kW';
    ctx.report({
      code: 'underspecified',
      severity: 'error',
      message:
        `${what} needs the room's sensible and latent loads: add ${missing} (heat gains, e.g. ${example} ` +
        'when there is no latent load)',
      span: fallback,
    });
    return result;
  }
  const db = find('db');
  const m = find('m');
  // The volume flow at the supply state: q=, or its other names flow= and V=.
  const q = volumeFlowProp(ctx, read.props, what);
  if (m && q) {
    ctx.report({
      code: 'flow-conflict',
      severity: 'error',
      message: `${what}: both m= and ${q.key}= give the flow; keep one`,
      span: q.prop.span,
      related: [{ span: m.prop.span, message: 'the other flow' }],
    });
    return result;
  }
  const flow = m ?? q;
  if (!db && !flow) {
    ctx.report({
      code: 'underspecified',
      severity: 'error',
      message:
        `${what} needs the supply dry-bulb (${ctx.units === 'IP' ? 'db=56.5F' : 'db=13.6C'}) or the ` +
        `dry-air flow (${ctx.units === 'IP' ? 'm=31,000lb/h, or q=7,200cfm' : 'm=3.9kg/s, or q=3.4m3/s'} ` +
        `at the supply state) to find the other`,
      span: fallback,
    });
    return result;
  }
  const p = ctx.site.pa;
  const R = room.state!;
  if (Math.abs(room.pressure.pa - p) > 1e-4 * p) {
    ctx.report({
      code: 'pressure-mismatch',
      severity: 'warning',
      message:
        `${what}: the room state ${room.name} is at ${ctx.fig(room.pressure.pa, 'pressure')} ` +
        `and the supply at ${ctx.fig(p, 'pressure')}; the loads are ` +
        `balanced at the supply's pressure. Put both at one pressure`,
      span: stmt.room.span,
    });
  }
  const Qs = qs.q.si;
  const Ql = ql.q.si;
  const solved = db
    ? fromTemperature(Qs, Ql, R.db, R.w, db.q.si, p, db, what, room.name)
    : flow === m
      ? fromMassFlow(Qs, Ql, R.db, R.w, m!.q.si, p, m!, what)
      : fromVolumeFlow(Qs, Ql, R.db, R.w, q!.q.si, p, q!, what);
  if (!solved.ok) {
    ctx.report({
      code: solved.code ?? 'supply-infeasible',
      severity: 'error',
      message: ctx.words(solved.message),
      span: solved.span,
      related: [{ span: stmt.room.span, message: `room state ${room.name}` }],
    });
    return result;
  }
  const state = solveSupplyState(ctx, solved.t, solved.w, p, what, fallback);
  if (!state) return result;
  result.state = state;
  result.defining = ['db', 'w'];
  result.massFlowKgS = solved.m;
  const total = Qs + Ql;
  const figures: SupplyFigures = {
    room: room.name,
    qSensibleW: Qs,
    qLatentW: Ql,
    shr: Math.abs(total) > 1e-9 * (Math.abs(Qs) + Math.abs(Ql)) && Qs * Ql >= 0 ? Qs / total : null,
    volumeFlowM3S: solved.m * state.v,
    given: db ? 'db' : flow === m ? 'm' : 'q',
  };
  result.supply = figures;
  result.claims = supplyClaims(ctx, read.props, result, figures, db ?? flow!, what);
  return result;
}

/** The room state the supply serves: a computed state or mix above, or null after a diagnostic. */
function roomOf(ctx: EvalContext, stmt: SupplyStatement, index: number, what: string): StateResult | null {
  return enteringState(
    ctx,
    stmt.room!,
    stmt,
    index,
    what,
    'a supply names the room state it serves (state RA: db=24C rh=50%)',
  );
}

/** `q_sensible=41.5kW` as written, for messages. */
function w(p: ReadProp): string {
  return `${p.key}=${p.q.quantity.number.text}${p.q.unitText}`;
}

/** The supply humidity ratio must be a state: at least zero and at most saturation at t. */
function checkMoisture(t: number, W: number, p: number, span: Span, what: string, how: string): Solved | null {
  if (!(W >= 0)) {
    return err(
      msg`${what}: ${how} needs a supply humidity ratio of ${fW(W)}, below zero: the supply air cannot absorb that \
latent load. Lower the supply temperature or raise the flow (a larger flow takes the moisture up with less drying)`,
      span,
    );
  }
  let ws: number;
  try {
    ws = satHumRatio(t, p);
  } catch {
    return err(
      msg`${what}: ${how} gives a supply dry-bulb of ${fT(t)}, where \
air cannot be saturated at ${fP(p)}; check the loads and the flow`,
      span,
      'out-of-range',
    );
  }
  if (W > ws) {
    return err(
      msg`${what}: ${how} needs a supply humidity ratio of ${fW(W)}, above saturation at ${fT(t)} (${fW(ws)}): \
no supply air can carry it. Raise the supply temperature or the flow, or check the sign of the latent load`,
      span,
    );
  }
  return null;
}

function fromTemperature(
  Qs: number,
  Ql: number,
  tR: number,
  wR: number,
  tS: number,
  p: number,
  db: ReadProp,
  what: string,
  roomName: string,
): Solved {
  const dt = tR - tS;
  const L = H_FG0 + CP_VAPOUR * tR;
  if (Math.abs(dt) < 1e-9 || Math.abs(Qs) < 1e-9) {
    return err(
      Math.abs(Qs) < 1e-9
        ? `${what}: with no sensible load the flow cannot follow from the ` +
            `supply temperature; give the flow (m= or q=) instead of db=`
        : `${what}: ${w(db)} equals the room dry-bulb of ${roomName}, so no flow can carry a ` +
            `sensible load; give a supply temperature below (cooling) or above (heating) the room`,
      db.prop.span,
    );
  }
  if (Qs / dt < 0) {
    const why =
      Qs > 0
        ? msg`a sensible gain needs supply air cooler than ${roomName} (${fT(tR)})`
        : msg`a sensible loss (negative q_sensible) needs supply air warmer than ${roomName} (${fT(tR)})`;
    return err(
      msg`${what}: ${why}; ${w(db)} is not. Check the supply temperature or the sign of the load`,
      db.prop.span,
    );
  }
  const W = (Qs * wR * L - CP_DRY_AIR * Ql * dt) / (Qs * L + CP_VAPOUR * Ql * dt);
  const moisture = checkMoisture(tS, W, p, db.prop.span, what, `${w(db)} with these loads`);
  if (moisture) return moisture;
  const m = Qs / ((CP_DRY_AIR + CP_VAPOUR * W) * dt);
  if (!(m > 0) || !Number.isFinite(m))
    return err(`${what}: the loads and ${w(db)} give no positive flow; check the figures`, db.prop.span);
  return { ok: true, t: tS, w: W, m };
}

/** Supply state for a dry-air mass flow (the flow given, or an iterate of the volume-flow solve). */
function atMassFlow(Qs: number, Ql: number, tR: number, wR: number, m: number): { t: number; w: number } {
  const W = wR - Ql / (m * (H_FG0 + CP_VAPOUR * tR));
  const t = tR - Qs / (m * (CP_DRY_AIR + CP_VAPOUR * W));
  return { t, w: W };
}

function fromMassFlow(
  Qs: number,
  Ql: number,
  tR: number,
  wR: number,
  m: number,
  p: number,
  flow: ReadProp,
  what: string,
): Solved {
  if (!(m > 0) || !Number.isFinite(m))
    return err(
      `${what}: ${w(flow)} is not a positive flow; give the dry-air flow as a positive figure`,
      flow.q.quantity.span,
      'out-of-range',
    );
  const s = atMassFlow(Qs, Ql, tR, wR, m);
  if (!Number.isFinite(s.t) || s.t < -100 || s.t > 200)
    return err(
      msg`${what}: ${w(flow)} gives a supply dry-bulb of ${fT(s.t)}, \
outside ${fTL(-100)} to ${fTL(200)}; the flow is far too small for the loads`,
      flow.prop.span,
      'out-of-range',
    );
  const moisture = checkMoisture(s.t, s.w, p, flow.prop.span, what, `${w(flow)} with these loads`);
  return moisture ?? { ok: true, t: s.t, w: s.w, m };
}

function fromVolumeFlow(
  Qs: number,
  Ql: number,
  tR: number,
  wR: number,
  V: number,
  p: number,
  flow: ReadProp,
  what: string,
): Solved {
  if (!(V > 0) || !Number.isFinite(V))
    return err(
      `${what}: ${w(flow)} is not a positive flow; give the volume flow at the supply state as a positive figure`,
      flow.q.quantity.span,
      'out-of-range',
    );
  // Start from the room state's specific volume; each step re-takes v at the supply state found.
  let m = V / specificVolume(tR, Math.max(wR, 0), p);
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const s = atMassFlow(Qs, Ql, tR, wR, m);
    if (!Number.isFinite(s.t) || s.t < -100 || s.t > 200 || !(s.w >= 0))
      return fromMassFlow(Qs, Ql, tR, wR, m, p, flow, what);
    const next = V / specificVolume(s.t, s.w, p);
    if (Math.abs(next - m) <= 1e-13 * m) {
      const moisture = checkMoisture(s.t, s.w, p, flow.prop.span, what, `${w(flow)} with these loads`);
      return moisture ?? { ok: true, t: s.t, w: s.w, m: next };
    }
    m = next;
  }
  return err(
    `${what}: the supply state for ${w(flow)} did not settle in ${MAX_ITERATIONS} ` +
      `steps (should never happen); give the mass flow m= instead`,
    flow.prop.span,
    'no-convergence',
  );
}

/** The supply state from its dry-bulb and humidity ratio at the supply pressure. */
function solveSupplyState(
  ctx: EvalContext,
  t: number,
  W: number,
  p: number,
  what: string,
  span: Span,
): StateResult['state'] {
  const solved = ctx.solve({ db: t, w: W }, p, { allowFog: false });
  if (!solved.ok) {
    ctx.report(
      problemDiagnostic(
        solved.problem,
        ctx.units,
        'error',
        new Map(),
        span,
        `${what} (db ${ctx.fig(t, 'temperature')}, W ${ctx.fig(W, 'humidityRatio')})`,
      ),
    );
    return null;
  }
  if (!stateFinite(solved.state)) {
    ctx.report({
      code: 'out-of-range',
      severity: 'error',
      message:
        `${what}: the supply state (db ${ctx.fig(t, 'temperature')}, ` +
        `W ${ctx.fig(W, 'humidityRatio')}) has a property without a finite value; check the loads`,
      span,
    });
    return null;
  }
  return solved.state;
}

/** Claims of a supply: its state's properties, the flow not used to define it, and the room SHR. */
function supplyClaims(
  ctx: EvalContext,
  props: ReadProp[],
  r: StateResult,
  f: SupplyFigures,
  defining: ReadProp,
  what: string,
): ClaimResult[] {
  const state = r.state!;
  const stateProps = props.filter((p) => STATE_CLAIM_KEYS.has(p.key) && p !== defining);
  const out =
    stateProps.length > 0
      ? stateClaims(
          ctx,
          stateProps,
          state,
          () => `for the loads of ${f.room} with ${writtenList([defining])} at ${pressureWord(r.pressure, ctx.units)}`,
        )
      : [];
  if (!ctx.settings.checkClaims) return out;
  // A second name for the volume flow is a conflict (reported), not a second claim.
  const volume = props.find((p) => isVolumeFlowKey(p.key));
  for (const p of props) {
    if (p === defining || STATE_CLAIM_KEYS.has(p.key) || p.key === 'q_sensible' || p.key === 'q_latent') continue;
    if (isVolumeFlowKey(p.key) && p !== volume) continue;
    let computed: number | null = null;
    if (p.key === 'm') computed = r.massFlowKgS ?? null;
    else if (isVolumeFlowKey(p.key)) computed = f.volumeFlowM3S;
    else if (p.key === 'shr') computed = f.shr;
    if (computed === null) {
      ctx.report({
        code: 'claim-undefined',
        severity: 'warning',
        message:
          `${what}: the room SHR is not defined here (the total load is about ` +
          `zero, or the sensible and latent loads have opposite signs); remove shr=`,
        span: p.prop.keySpan,
      });
      continue;
    }
    const { claim, diagnostic } = checkClaim(
      p.key,
      p.prop,
      p.q,
      computed,
      () => `for the loads of ${f.room} with ${writtenList([defining])}`,
    );
    out.push(claim);
    if (diagnostic) ctx.report(diagnostic);
  }
  return out;
}
