/** Barometric pressure: `site:` lines and the per-state `p=` / `elev=` overrides. */
import { stdAtmPressure } from '../physics';
import type { Span } from '../text/types';
import type { EvalContext } from './context';
import type { PressureBasis } from './types';
import type { ReadProp } from './props';
import { problemOf } from './problems';
import { problemTexts } from './figures';

/**
 * Site pressures outside this band are accepted but flagged as
 * unusual (common practice: 30–110 kPa covers inhabited sites).
 */
const USUAL_MIN_PA = 30_000;
const USUAL_MAX_PA = 110_000;

/**
 * The pressure that `p=` or `elev=` among `props` sets, or null when neither is written or the
 * value is unusable (diagnostics reported). With both, `p=` is used and `elev=` gets a warning.
 * @param source  'site' for a site line, 'override' for a state's own pressure.
 * @param label   how the description starts ("site line 3", "own").
 */
export function pressureFromProps(
  ctx: EvalContext,
  props: ReadProp[],
  source: 'site' | 'override',
  label: string,
): PressureBasis | null {
  const p = props.find((x) => x.key === 'p');
  const elev = props.find((x) => x.key === 'elev');
  if (p && elev) {
    ctx.report({
      code: 'pressure-conflict',
      severity: 'warning',
      message:
        `both p= and elev= set the pressure here; p=${p.q.quantity.number.text}${p.q.unitText} ` +
        `is used and elev= is ignored, remove one of them`,
      span: elev.prop.span,
      related: [{ span: p.prop.span, message: 'the pressure used' }],
    });
  }
  if (p) {
    const pa = p.q.si;
    if (!(pa > 0) || !Number.isFinite(pa)) {
      ctx.report({
        code: 'out-of-range',
        severity: 'error',
        message:
          `p=${p.q.quantity.number.text}${p.q.unitText} is not a positive pressure; write the ` +
          `absolute barometric pressure, e.g. ${ctx.units === 'IP' ? 'p=14.696psia' : 'p=101.325kPa'}`,
        span: p.q.quantity.span,
      });
      return null;
    }
    warnUnusual(ctx, pa, p.q.quantity.span, `p=${p.q.quantity.number.text}${p.q.unitText}`);
    return {
      pa,
      source,
      span: p.prop.span,
      elevationM: null,
      describe: `${label}: p=${p.q.quantity.number.text}${p.q.unitText}`,
      origin: `${label}: p=${p.q.quantity.number.text}${p.q.unitText}`,
    };
  }
  if (elev) {
    const z = elev.q.si;
    let pa: number;
    try {
      pa = stdAtmPressure(z);
    } catch (err) {
      const prob = problemOf(err);
      const texts = problemTexts(prob, ctx.units);
      ctx.report({
        code: prob.code,
        severity: 'error',
        message: `elev=${elev.q.quantity.number.text}${elev.q.unitText}: ${texts.message} ${texts.fix}`,
        span: elev.q.quantity.span,
      });
      return null;
    }
    if (!(pa > 0) || !Number.isFinite(pa)) {
      ctx.report({
        code: 'out-of-range',
        severity: 'error',
        message:
          `elev=${elev.q.quantity.number.text}${elev.q.unitText} gives no usable standard-atmosphere ` +
          `pressure; give an elevation between ${ctx.fig(-5000, 'length', { limit: true })} ` +
          `and ${ctx.fig(11000, 'length', { limit: true })}, or the pressure itself with p=`,
        span: elev.q.quantity.span,
      });
      return null;
    }
    warnUnusual(ctx, pa, elev.q.quantity.span, `elev=${elev.q.quantity.number.text}${elev.q.unitText}`);
    return {
      pa,
      source,
      span: elev.prop.span,
      elevationM: z,
      describe:
        `${label}: elev=${elev.q.quantity.number.text}${elev.q.unitText} → ${ctx.fig(pa, 'pressure')} ` +
        `(standard atmosphere)`,
      origin: `${label}: elev=${elev.q.quantity.number.text}${elev.q.unitText} (standard atmosphere)`,
    };
  }
  return null;
}

function warnUnusual(ctx: EvalContext, pa: number, span: Span, written: string): void {
  if (pa >= USUAL_MIN_PA && pa <= USUAL_MAX_PA) return;
  ctx.report({
    code: 'unusual-pressure',
    severity: 'warning',
    message:
      `${written} is ${ctx.fig(pa, 'pressure')}, outside ` +
      `the ${ctx.fig(USUAL_MIN_PA, 'pressure', { limit: true })} ` +
      `to ${ctx.fig(USUAL_MAX_PA, 'pressure', { limit: true })} of inhabited sites; check the ` +
      `unit (${ctx.units === 'IP' ? 'psia, not inHg or psi × 1000?' : 'kPa, not Pa or bar?'})`,
    span,
  });
}
