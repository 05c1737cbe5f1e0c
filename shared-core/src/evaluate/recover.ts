/**
 * `recover NAME: A -> A2 [m=|q=], B -> B2 [m=|q=] eff_s=… [eff_l=…] [fog=ok] [claims]`: heat
 * (and moisture) recovery between two streams (model and equations: `physics/recovery.ts`).
 * Both leaving states are defined here. Each stream's dry-air flow is its own `m=` (or `q=` at
 * its entering state), or the flow its entering state carries (a mix by flows, a supply state, a
 * state a process defined). The exchanger is listed as two processes under its name, one per side
 * (A -> A2 and B -> B2), so tables, hovers and the chart show both.
 *
 * Condensation or frost on the side of the stream being cooled is its own warning
 * (`recovery-condensation`, `recovery-frost`); `fog=ok` on the line accepts it (the note stays
 * as an info).
 */
import { recoverBetween, type MoistAirState } from '../physics';
import type { RecoverStatement, RecoverStream } from '../notation/ast';
import type { Span } from '../text/types';
import { checkClaim } from './claims';
import { problemTexts } from './figures';
import type { EvalContext } from './context';
import { RECOVER_KEYS, RECOVER_WORDS } from './keys';
import { enteringState } from './mix';
import { buildProcessResult } from './process';
import type { ReadProp } from './props';
import { readProps } from './props';
import { problemMessage } from './problems';
import type { ClaimResult, ProcessResult, StateResult } from './types';
import { suggestName } from '../text/suggest';

/**
 * What a recover statement gives: the two leaving states and the two sides of the exchanger (null where they failed).
 */
export interface RecoverOutcome {
  leaving: [StateResult | null, StateResult | null];
  sides: [ProcessResult | null, ProcessResult | null];
}

/** Evaluates one `recover` statement (see the module comment). */
export function evaluateRecover(ctx: EvalContext, stmt: RecoverStatement, index: number): RecoverOutcome {
  const none: RecoverOutcome = { leaving: [null, null], sides: [null, null] };
  const name = stmt.name?.text ?? '';
  const what = name ? `recover ${name}` : 'this recover';

  // Options: fog=ok.
  let fogOk = false;
  for (const o of stmt.options) {
    const allowed = Object.hasOwn(RECOVER_WORDS, o.key) ? RECOVER_WORDS[o.key]! : null;
    if (allowed?.includes(o.word.text)) {
      fogOk = true;
      continue;
    }
    const suggestion = allowed
      ? null
      : suggestName(o.key, [...Object.keys(RECOVER_KEYS), ...Object.keys(RECOVER_WORDS)]);
    ctx.report({
      code: allowed ? 'bad-number' : 'unknown-key',
      severity: 'error',
      message: allowed
        ? `${o.key}=${o.word.text}: write ${o.key}=${allowed.join(' or ')} ` +
          `(accepts condensation or frost in the exchanger), or leave it out`
        : `'${o.word.text}' is not a number: write ${o.key}= followed by a number ` +
          `and its unit${suggestion ? ` (or did you mean ${suggestion}=?)` : ''}; ` +
          `the only word a recover takes is fog=ok`,
      span: allowed ? o.word.span : o.span,
    });
  }

  // Each stream's own properties (its flow), and the exchanger's (the rest, from either stream).
  const own: ReadProp[][] = [];
  const shared: ReadProp[] = [];
  for (const stream of stmt.streams) {
    const { props } = readProps(ctx, stream.props, RECOVER_KEYS, what, stmt, index, false);
    own.push(props.filter((p) => p.key === 'm' || p.key === 'q'));
    for (const p of props) {
      if (p.key === 'm' || p.key === 'q') continue;
      const first = shared.find((x) => x.key === p.key);
      if (first) {
        ctx.report({
          code: 'duplicate-key',
          severity: 'error',
          message: `${p.key}= is written twice in ${what}; the first one is used, remove one of them`,
          span: p.prop.keySpan,
          related: [{ span: first.prop.span, message: `first ${p.key}=` }],
        });
        continue;
      }
      shared.push(p);
    }
  }
  if (stmt.streams.length < 2 || stmt.streams.some((x) => !x.from || !x.to)) return none; // the parser reported it

  // Resolve the entering states.
  const froms: (StateResult | null)[] = stmt.streams.map((x) => entering(ctx, stmt, index, x, what));
  const effS = shared.find((p) => p.key === 'eff_s');
  const effL = shared.find((p) => p.key === 'eff_l') ?? null;
  if (!effS) {
    ctx.report({
      code: 'spec-missing',
      severity: 'error',
      message:
        `${what} needs the exchanger's sensible effectiveness: add eff_s= ` +
        `(e.g. eff_s=0.70), and eff_l= for one that also moves moisture`,
      span: stmt.name?.span ?? stmt.keywordSpan,
    });
    return none;
  }
  if (!froms[0] || !froms[1]) return none;

  // Flows.
  const f0 = streamFlow(ctx, stmt.streams[0]!, own[0]!, froms[0], what);
  const f1 = streamFlow(ctx, stmt.streams[1]!, own[1]!, froms[1], what);
  if (f0 === null || f1 === null) return none;
  const flows: [number, number] = [f0, f1];

  const a = froms[0].state!;
  const b = froms[1].state!;
  const r = recoverBetween(
    { state: a, massFlowKgS: flows[0] },
    { state: b, massFlowKgS: flows[1] },
    effS.q.si,
    effL ? effL.q.si : null,
  );
  if (!r.ok) {
    const p = shared.find((x) => x.key === r.problem.key);
    const texts = problemTexts(r.problem, ctx.units);
    ctx.report({
      code: r.problem.code === 'unreachable' ? 'spec-unreachable' : 'out-of-range',
      severity: 'error',
      message: problemMessage(what, texts),
      span: p ? p.prop.span : effS.prop.span,
    });
    return none;
  }
  const spec = [effS, ...(effL ? [effL] : [])]
    .map((p) => `${p.key}=${p.q.quantity.number.text}${p.q.unitText}`)
    .join(' ');
  const leaving = stmt.streams.map(
    (x, k): StateResult => ({
      kind: 'state',
      name: x.to!.text,
      statement: stmt,
      state: r.value.leaving[k]!,
      pressure: froms[k]!.pressure,
      defining: [],
      claims: [],
      massFlowKgS: flows[k]!,
      definedBy: { statement: 'recover', name, from: froms[k]!.name, spec, nameSpan: x.to!.span },
    }),
  ) as [StateResult, StateResult];

  // Condensation or frost on the cooled side.
  const wet = r.value.wetting;
  let wetting: NonNullable<ProcessResult['equipment']>['wetting'] = null;
  if (wet) {
    wetting = { kind: wet.kind, surfaceC: wet.surfaceC, dewPointC: wet.dewPointC, accepted: fogOk };
    const cooled = stmt.streams[wet.stream]!;
    const other = stmt.streams[1 - wet.stream]!;
    const out = r.value.leaving[wet.stream];
    const what2 = wet.kind === 'frost' ? 'frost forms' : 'water condenses';
    const advice =
      wet.kind === 'frost'
        ? 'plan frost protection (preheat the outdoor air, a bypass or a defrost cycle) or a lower effectiveness'
        : 'give that side a drain pan and drain, or a lower effectiveness';
    ctx.report({
      code: wet.kind === 'frost' ? 'recovery-frost' : 'recovery-condensation',
      severity: fogOk ? 'info' : 'warning',
      message:
        `${what}: ${what2} on the ${cooled.from!.text} side: ` +
        `${cooled.to!.text} leaves at ${ctx.fig(out.db, 'temperature')} ` +
        `with a ${out.dpFrost ? 'frost' : 'dew'} point of ${ctx.fig(wet.dewPointC, 'temperature')}` +
        `${out.fog ? ' (a fog state: more water than the air can hold as vapour)' : ''}, ` +
        `while the surface at the cold end is about ${ctx.fig(wet.surfaceC, 'temperature')} ` +
        `(the mean of ${cooled.to!.text} and the entering ${other.from!.text}). ` +
        `${fogOk ? 'Accepted by fog=ok.' : `Either ${advice}, or write fog=ok on the line if the design accepts it`}`,
      span: cooled.to!.span,
      related: [{ span: other.from!.span, message: `the colder entering stream ${other.from!.text}` }],
      data: { accepted: fogOk },
    });
  }

  // The two sides as processes, with the exchanger's figures.
  const sides = stmt.streams.map((_stream, k) => {
    const side = buildProcessResult(
      ctx,
      stmt,
      name,
      froms[k]!,
      leaving[k]!,
      { massFlow: flows[k]!, volumeFlow: flows[k]! * froms[k]!.state!.v, prop: null },
      what,
    );
    side.equipment = {
      form: 'recovery',
      spec,
      effSensible: effS.q.si,
      effLatent: effL ? effL.q.si : null,
      wetting: wet && wet.stream === k ? wetting : null,
    };
    return side;
  }) as [ProcessResult, ProcessResult];

  // Claims: the heat recovered (magnitudes of the exchange into the first stream).
  const claims: ClaimResult[] = [];
  if (ctx.settings.checkClaims) {
    for (const c of shared) {
      if (c.key !== 'q_sensible' && c.key !== 'q_total') continue;
      const computed = c.key === 'q_sensible' ? r.value.sensibleW : (sides[0].qTotalW ?? 0);
      const v = c.q.si >= 0 ? Math.abs(computed) : computed;
      const { claim, diagnostic } = checkClaim(
        c.key,
        c.prop,
        c.q,
        v,
        () => `recovered between ${froms[0]!.name} and ${froms[1]!.name}`,
      );
      claims.push(claim);
      if (diagnostic) ctx.report(diagnostic);
    }
  }
  sides[0].claims = claims;
  return { leaving, sides };
}

function entering(
  ctx: EvalContext,
  stmt: RecoverStatement,
  index: number,
  x: RecoverStream,
  what: string,
): StateResult | null {
  return enteringState(
    ctx,
    x.from!,
    stmt,
    index,
    what,
    'each stream of a recover goes from a state (or mix) to a new state',
  );
}

/** A stream's dry-air flow: its m= or q= (at its entering state), or the flow its entering state carries. */
function streamFlow(
  ctx: EvalContext,
  x: RecoverStream,
  props: ReadProp[],
  from: StateResult,
  what: string,
): number | null {
  const m = props.find((p) => p.key === 'm');
  const q = props.find((p) => p.key === 'q');
  const state = from.state as MoistAirState;
  if (m && q) {
    ctx.report({
      code: 'flow-conflict',
      severity: 'error',
      message: `${what}: both m= and q= give the flow of ${from.name}; keep one (m= is used)`,
      span: q.prop.span,
      related: [{ span: m.prop.span, message: 'the flow used' }],
    });
  }
  const p = m ?? q;
  if (p) {
    if (!(p.q.si > 0) || !Number.isFinite(p.q.si)) {
      ctx.report({
        code: 'out-of-range',
        severity: 'error',
        message:
          `${what}: ${p.key}=${p.q.quantity.number.text}${p.q.unitText} is not a ` +
          `positive flow; give the dry-air flow of ${from.name} as a positive figure`,
        span: p.q.quantity.span,
      });
      return null;
    }
    return p === m ? p.q.si : p.q.si / state.v;
  }
  if (typeof from.massFlowKgS === 'number' && from.massFlowKgS > 0) return from.massFlowKgS;
  const span: Span = x.from!.span;
  ctx.report({
    code: 'spec-missing',
    severity: 'error',
    message:
      `${what}: the flow of ${from.name} is not known: write it after the stream (${from.name} ` +
      `-> ${x.to!.text} ${ctx.units === 'IP' ? 'm=9,500lb/h or q=2,100cfm' : 'm=1.2kg/s or q=1.0m3/s'}), ` +
      `or let the stream leave a mix by flows`,
    span,
  });
  return null;
}
