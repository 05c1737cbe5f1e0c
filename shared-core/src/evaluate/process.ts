/**
 * `process NAME: A -> B [m=… | q=…] [claims]`: a steady-flow process between two states at one
 * dry-air mass flow.
 *
 * Per kg of dry air (ASHRAE HoF 2017 SI Ch.1 eq 32, h = 1.006 t + W (2501 + 1.86 t) kJ/kg):
 *   total    Δh = h_B − h_A
 *   sensible Δh_s = (1.006 + 1.86 W_A) (t_B − t_A)   — moist-air cp at the entering W
 *   latent   Δh_l = Δh − Δh_s                          (= (W_B − W_A)(2501 + 1.86 t_B) with eq 32)
 * Water: ṁ (W_B − W_A), positive = added (humidifier), negative = condensate removed.
 * Coil or heater duty: Q = ṁ [Δh − (W_B − W_A) h_water(t_B)], the water leaving (condensate) or
 * entering (humidifier) as liquid at the leaving dry-bulb (frost below 0 °C for condensate).
 */
import { apparatusDewPoint, condensateEnthalpy, liquidWaterEnthalpy } from '../physics';
import type { MoistAirState } from '../physics/types';
import type { ProcessStatement, RecoverStatement } from '../notation/ast';
import type { EvalContext } from './context';
import { deriveLeaving, isSpecOrFlow, specText } from './derive';
import { DERIVE_KEY_NAMES, PROCESS_KEYS } from './keys';
import { enteringState } from './mix';
import type { ReadProp } from './props';
import { readProps } from './props';
import { sourcesOf } from './refs';
import { volumeFlowProp } from './volumeFlow';
import { checkClaim } from './claims';
import type { ClaimResult, ProcessKind, ProcessResult, StateResult } from './types';
import { moistureUnchanged } from './resolution';

/** Specific heat of dry air, kJ/(kg·K) as J/(kg·K) (ASHRAE HoF 2017 SI Ch.1 eq 32). */
const CP_DRY_AIR = 1006;
/** Specific heat of water vapour, J/(kg·K) (ASHRAE HoF 2017 SI Ch.1 eq 32). */
const CP_VAPOUR = 1860;
/** Below this |Δt| the temperature is taken as unchanged, K (0.05 K: half the 0.1 K display step). */
const DT_STILL = 0.05;
/** Below this |ΔW| the moisture is taken as unchanged, kg/kg (0.01 g/kg: the display step). */
const DW_STILL = 1e-5;
/** Below this |Δh| the SHR is not defined, J/kg (one hundredth of a kJ/kg). */
const DH_STILL = 10;

/** Sensible and latent split per kg dry air (see the module comment). */
export function splitSensibleLatent(
  a: MoistAirState,
  b: MoistAirState,
): { total: number; sensible: number; latent: number } {
  const total = b.h - a.h;
  const sensible = (CP_DRY_AIR + CP_VAPOUR * a.w) * (b.db - a.db);
  return { total, sensible, latent: total - sensible };
}

/** Enthalpy of the water that enters (humidifier, liquid) or leaves (condensate, frost below 0 °C) at t °C, J/kg. */
export function waterEnthalpy(tC: number, added: boolean): number {
  try {
    const h = added ? liquidWaterEnthalpy(tC) : condensateEnthalpy(tC);
    return Number.isFinite(h) ? h : 4186 * tC;
  } catch {
    return 4186 * tC;
  }
}

/** Names the process from the directions of the dry-bulb and humidity-ratio changes. */
export function processKindOf(
  a: MoistAirState,
  b: MoistAirState,
  coilPerKg: number,
  sensiblePerKg: number,
  dw = b.w - a.w,
): ProcessKind {
  const dt = b.db - a.db;
  const tUp = dt > DT_STILL;
  const tDown = dt < -DT_STILL;
  const wUp = dw > DW_STILL;
  const wDown = dw < -DW_STILL;
  if (!wUp && !wDown) return tUp ? 'sensible-heating' : tDown ? 'sensible-cooling' : 'no-change';
  if (wDown) return tUp ? 'heating-dehumidifying' : tDown ? 'cooling-dehumidifying' : 'dehumidifying';
  if (tUp) return 'heating-humidifying';
  if (!tDown) return 'humidifying';
  // Cooling while humidifying: evaporative when hardly any heat crosses the boundary.
  return Math.abs(coilPerKg) <= Math.max(500, 0.1 * Math.abs(sensiblePerKg))
    ? 'evaporative-cooling'
    : 'cooling-humidifying';
}

/** What a process statement gives: the state it defines (if it defines one) and the process itself. */
export interface ProcessOutcome {
  leaving: StateResult | null;
  process: ProcessResult | null;
}

/**
 * Evaluates one `process` statement in its natural steps — resolve the two ends (or define the
 * leaving state), the amounts (the dry-air flow), convert (the per-kg and rate figures), the
 * balance check (a coil line must reach saturation), and the claims. `derives` is true when the
 * statement defines its leaving state (the pre-scan decided: a specification and a new name).
 */
export function evaluateProcess(
  ctx: EvalContext,
  stmt: ProcessStatement,
  index: number,
  derives = false,
): ProcessOutcome {
  const none: ProcessOutcome = { leaving: null, process: null };
  const name = stmt.name?.text ?? '';
  const what = name ? `process ${name}` : 'this process';
  // A process that defines its leaving state takes references for that state's properties
  // (`process CC: MA -> OFF w=SA.w rh=95%`); a process between two defined states takes figures.
  const { props, broken } = readProps(ctx, stmt.props, PROCESS_KEYS, what, stmt, index, derives);
  if (!stmt.from || !stmt.to) return none; // the parser reported the syntax
  // Every property that is neither the specification nor the flow is a claim about the results.
  const claimable = props.filter((p) => !isSpecOrFlow(p.prop));

  // 1. Resolve: the entering state, and the leaving one (or a note that a specification cannot apply).
  const from = endpoint(ctx, stmt, index, 'from', what);
  if (!derives) {
    const to = endpoint(ctx, stmt, index, 'to', what);
    specificationUnused(ctx, stmt, props, what);
    if (!from || !to) return none;
    const flow = processFlow(ctx, props, from, what);
    const result = buildProcessResult(ctx, stmt, name, from, to, flow, what);
    balanceCheck(ctx, stmt, result, from, to, what);
    result.claims = processClaims(ctx, claimable, result, what);
    return { leaving: null, process: result };
  }
  if (!from) {
    // The leaving state cannot be defined either; what uses it gets an unresolved-dependency note.
    return none;
  }

  // 2. Amounts: the dry-air flow (a heater by duty needs it to define the leaving state).
  const flow = processFlow(ctx, props, from, what);
  // A specification key that could not be read is reported already; what is left of the
  // specification would only give a second, misleading message (`bf=` without `adp=`).
  if (broken.some((k) => DERIVE_KEY_NAMES.has(k))) return none;

  // Define the leaving state from the specification.
  const derivation = deriveLeaving(ctx, stmt, what, props, from, flow.massFlow);
  if (!derivation) return none;
  const leaving: StateResult = {
    kind: 'state',
    name: stmt.to.text,
    statement: stmt,
    state: derivation.state,
    pressure: from.pressure,
    defining: derivation.defining,
    claims: derivation.claims,
    massFlowKgS: flow.massFlow,
    definedBy: { statement: 'process', name, from: from.name, spec: derivation.equipment.spec, nameSpan: stmt.to.span },
  };
  const sources = sourcesOf(derivation.used);
  if (sources) leaving.sources = sources;

  // 3. Convert, 4. balance, 5. claims.
  const result = buildProcessResult(ctx, stmt, name, from, leaving, flow, what);
  result.equipment = derivation.equipment;
  if (derivation.equipment.form === 'coil' && derivation.adp) {
    // The ADP and bypass factor as specified.
    result.apparatusDewPointC = derivation.adp.adp;
    result.bypassFactor = derivation.adp.bf;
  } else {
    balanceCheck(ctx, stmt, result, from, leaving, what);
  }
  result.claims = processClaims(ctx, claimable, result, what);
  return { leaving, process: result };
}

/** A specification on a process whose leaving state is already defined: it cannot apply (reported once). */
function specificationUnused(ctx: EvalContext, stmt: ProcessStatement, props: ReadProp[], what: string): void {
  const first = stmt.words[0] ?? props.find((p) => DERIVE_KEY_NAMES.has(p.key))?.prop;
  if (!first || !stmt.to) return;
  const def = ctx.names.firstDef(stmt.to.text);
  const where = def ? ctx.atLine(def.span) : '';
  const spanOf = 'text' in first ? first.span : first.span;
  ctx.report({
    code: 'spec-conflict',
    severity: 'error',
    message:
      `${what}: ${stmt.to.text} is already defined${where}, so this process cannot define it ` +
      `from ${specText(stmt) || 'its specification'}. Give the leaving state a new name to have the ` +
      `process define it, or remove the specification to check the process between the two states`,
    span: spanOf,
    ...(def ? { related: [{ span: def.span, message: `${stmt.to.text} is defined here` }] } : {}),
  });
}

/** The dry-air flow of a process, kg/s, and its volume at the entering state, m³/s. */
export interface Flow {
  massFlow: number | null;
  volumeFlow: number | null;
  prop: ReadProp | null;
}

/**
 * Step 2: m=, or q= at the entering state, or the flow the entering state carries (a mix by flows,
 * a state a process defined).
 */
function processFlow(ctx: EvalContext, props: ReadProp[], from: StateResult, what: string): Flow {
  const a = from.state!;
  const m = props.find((p) => p.key === 'm');
  // The volume flow: q=, or its other names flow= and V= (one of them; a second is a conflict).
  const q = volumeFlowProp(ctx, props, what);
  if (m && q) {
    ctx.report({
      code: 'flow-conflict',
      severity: 'error',
      message: `${what}: both m= and ${q.key}= give the flow; keep one (m= is used)`,
      span: q.prop.span,
      related: [{ span: m.prop.span, message: 'the flow used' }],
    });
  }
  const flowProp = m ?? q;
  if (flowProp) {
    if (!(flowProp.q.si > 0) || !Number.isFinite(flowProp.q.si)) {
      ctx.report({
        code: 'out-of-range',
        severity: 'error',
        message:
          `${what}: ${flowProp.key}=${flowProp.q.quantity.number.text}${flowProp.q.unitText} is ` +
          `not a positive flow; give the dry-air flow through the process as a positive figure`,
        span: flowProp.q.quantity.span,
      });
      return { massFlow: null, volumeFlow: null, prop: flowProp };
    }
    if (flowProp === m) return { massFlow: m.q.si, volumeFlow: m.q.si * a.v, prop: m };
    return { massFlow: flowProp.q.si / a.v, volumeFlow: flowProp.q.si, prop: flowProp };
  }
  if (typeof from.massFlowKgS === 'number' && from.massFlowKgS > 0)
    return { massFlow: from.massFlowKgS, volumeFlow: from.massFlowKgS * a.v, prop: null };
  return { massFlow: null, volumeFlow: null, prop: null };
}

/** Step 3: the figures of a process from A to B at a flow (per kg of dry air, and rates with a flow). */
export function buildProcessResult(
  ctx: EvalContext,
  stmt: ProcessStatement | RecoverStatement,
  name: string,
  from: StateResult,
  to: StateResult,
  flow: Flow,
  what: string,
): ProcessResult {
  const a = from.state!;
  const b = to.state!;
  if (
    Math.abs(from.pressure.pa - to.pressure.pa) > 1e-4 * from.pressure.pa &&
    stmt.keyword === 'process' &&
    stmt.to &&
    stmt.from
  ) {
    ctx.report({
      code: 'pressure-mismatch',
      severity: 'warning',
      message:
        `${what}: ${from.name} is at ${ctx.fig(from.pressure.pa, 'pressure')} ` +
        `and ${to.name} at ${ctx.fig(to.pressure.pa, 'pressure')}; a process is taken at ` +
        `one pressure, so the figures are approximate. Put both states at one pressure`,
      span: stmt.to.span,
      related: [{ span: stmt.from.span, message: `${from.name}: ${from.pressure.describe}` }],
    });
  }
  let { massFlow, volumeFlow } = flow;
  let { total, sensible, latent } = splitSensibleLatent(a, b);
  // Rounding is not physics: a Δw the written states cannot resolve is no moisture change (not
  // for a leaving state this statement defines: its W is computed, not written).
  const unchanged = to.statement !== stmt && moistureUnchanged(ctx, from, to);
  if (unchanged) {
    total = sensible;
    latent = 0;
  }
  const dw = unchanged ? 0 : b.w - a.w;
  const hWater = waterEnthalpy(b.db, dw > 0);
  const coilPerKg = total - dw * hWater;
  const kind = processKindOf(a, b, coilPerKg, sensible, dw);
  // SHR is a share: given only when sensible and latent act in the same direction (0 ≤ SHR ≤ 1).
  const sameWay =
    sensible * latent >= 0 || Math.abs(dw) <= DW_STILL || Math.abs(latent) <= Math.max(1, 1e-3 * Math.abs(total));
  const shr = Math.abs(total) >= DH_STILL && sameWay ? sensible / total : null;
  // A flow so large that a rate overflows (m=1e308kg/s) gives no figures, only an error.
  if (
    massFlow !== null &&
    ![
      massFlow,
      volumeFlow ?? 0,
      massFlow * total,
      massFlow * sensible,
      massFlow * latent,
      massFlow * dw,
      massFlow * coilPerKg,
    ].every(Number.isFinite)
  ) {
    const fp = flow.prop;
    ctx.report({
      code: 'out-of-range',
      severity: 'error',
      message:
        `${what}: the dry-air ` +
        `flow ${fp ? `${fp.key}=${fp.q.quantity.number.text}${fp.q.unitText}` : ctx.fig(massFlow, 'massFlow')} ` +
        `is too large to compute the heat rates with; give a realistic flow`,
      span: fp ? fp.q.quantity.span : stmt.keywordSpan,
    });
    massFlow = null;
    volumeFlow = null;
  }
  return {
    kind: 'process',
    name,
    statement: stmt,
    from: from.name,
    to: to.name,
    processKind: kind,
    massFlowKgS: massFlow,
    volumeFlowM3S: volumeFlow,
    dhTotal: total,
    dhSensible: sensible,
    dhLatent: latent,
    qTotalW: massFlow === null ? null : massFlow * total,
    qSensibleW: massFlow === null ? null : massFlow * sensible,
    qLatentW: massFlow === null ? null : massFlow * latent,
    shr: shr !== null && Number.isFinite(shr) ? shr : null,
    dw,
    waterKgS: massFlow === null ? null : massFlow * dw,
    qCoilW: massFlow === null ? null : massFlow * coilPerKg,
    claims: [],
    apparatusDewPointC: null,
    ...(unchanged ? { moistureUnchanged: true } : {}),
  };
}

/** Step 4: moisture removed — the coil line must reach the saturation curve (an apparatus dew point). */
function balanceCheck(
  ctx: EvalContext,
  stmt: ProcessStatement,
  result: ProcessResult,
  from: StateResult,
  to: StateResult,
  what: string,
): void {
  const a = from.state!;
  const b = to.state!;
  const dw = result.dw;
  if (!(dw < -DW_STILL) || !stmt.to || !stmt.from) return;
  // The apparatus dew point is physics' (`physics/coil.ts`): where the coil line from A through B,
  // continued in the drying direction, meets saturation; null when it never does before W reaches zero.
  const line = apparatusDewPoint(a, b, (from.pressure.pa + to.pressure.pa) / 2);
  result.apparatusDewPointC = line?.adp ?? null;
  result.bypassFactor = line?.bf ?? null;
  if (line) return;
  const heating = b.db - a.db > -DT_STILL;
  ctx.report({
    code: 'impossible-process',
    severity: 'error',
    message: heating
      ? `${what}: moisture is removed (${ctx.fig(-dw, 'humidityRatio', { difference: true })}) while the air ` +
        `is ${b.db - a.db > DT_STILL ? 'heated' : 'kept at the same temperature'}; a coil can only dry air ` +
        `by cooling part of it below its dew point (${ctx.fig(a.dp, 'temperature')} for ${from.name}), which ` +
        `lowers the dry-bulb. Check ${to.name}: its dry-bulb should be lower, or its humidity ratio higher`
      : `${what}: ${to.name} is too dry for its temperature: the line from ${from.name} ` +
        `through ${to.name} never meets the saturation curve, so no coil surface temperature ` +
        `can give this state (coil air leaves between the entering state and saturation ` +
        `at the surface). Lower ${to.name}'s dry-bulb or raise its humidity ratio`,
    span: stmt.to.span,
    related: [{ span: stmt.from.span, message: `entering state ${from.name}` }],
    data: { from: from.name, to: to.name },
  });
}

function endpoint(
  ctx: EvalContext,
  stmt: ProcessStatement,
  index: number,
  end: 'from' | 'to',
  what: string,
): StateResult | null {
  return enteringState(ctx, stmt[end]!, stmt, index, what, 'a process goes from one state (or mix) to another');
}

/** The computed figure a process claim is compared with, SI, signed (positive = added to the air). */
function processFigure(r: ProcessResult, key: string): number | null {
  switch (key) {
    case 'q_total':
      return r.qTotalW;
    case 'q_sensible':
      return r.qSensibleW;
    case 'q_latent':
      return r.qLatentW;
    case 'q_coil':
      return r.qCoilW;
    case 'water':
      return r.waterKgS;
    case 'shr':
      return r.shr;
    default:
      return null;
  }
}

/**
 * Compares process claims. Heat-rate and water claims written as positive figures are compared as
 * magnitudes (a cooling coil's `q_total=98kW` means 98 kW removed); a written negative figure is
 * compared with the signed value (positive = added to the air).
 */
function processClaims(ctx: EvalContext, claims: ReadProp[], r: ProcessResult, what: string): ClaimResult[] {
  const out: ClaimResult[] = [];
  if (!ctx.settings.checkClaims) return out;
  for (const c of claims) {
    const signed = processFigure(r, c.key);
    if (signed === null) {
      const needsFlow = c.key !== 'shr';
      ctx.report({
        code: needsFlow ? 'missing-flow' : 'claim-undefined',
        severity: 'warning',
        message: needsFlow
          ? `${what}: ${c.key}= cannot be checked without a dry-air flow; add m=… (mass) or q=… (volume at ${r.from})`
          : `${what}: the sensible heat ratio is not defined here (the total heat is about zero, or sensible ` +
            `and latent heat act in opposite directions, as in an evaporative humidifier); remove shr=`,
        span: c.prop.keySpan,
      });
      continue;
    }
    const computed = c.key !== 'shr' && c.q.si >= 0 ? Math.abs(signed) : signed;
    const { claim, diagnostic } = checkClaim(
      c.key,
      c.prop,
      c.q,
      computed,
      () =>
        `for ${r.from} -> ${r.to}${r.massFlowKgS !== null ? ` at ${ctx.fig(r.massFlowKgS, 'massFlow')} dry air` : ''}`,
    );
    out.push(claim);
    if (diagnostic) ctx.report(diagnostic);
  }
  return out;
}
