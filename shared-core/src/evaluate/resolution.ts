/**
 * Rounding is not physics: the humidity-ratio resolution of a state as written, and the rule that
 * a process whose Δw is smaller than its two states can tell apart has no moisture change.
 *
 * A state's W follows from its defining figures, each known to half a unit of its last
 * significant digit (the claim band, or the written `±`). Its **moisture resolution** δW is the
 * largest change of W when one moisture figure of the pair — rh, w, dp, wb or h — moves to either
 * edge of its band, the other figure held. The dry-bulb is taken as written: it places the state
 * on the temperature axis and is what a heater or fan changes, not the moisture. A mix's W is
 * computed from the balance of its streams, not written, so its δW is 0.
 *
 * A process from A to B has **no moisture change** when |W_B − W_A| ≤ max(δW_A, δW_B): one of
 * the two states, as written, cannot tell its W from the other's — as when a heater's leaving
 * state is written with a rounded copy of the entering W (`w=8.9g/kg` for 8.86 g/kg). The larger
 * of the two, not their sum, so that a real small change between two coarsely written states is
 * kept. Its Δw is then 0: no latent heat, no water or condensate, and an SHR of 1.
 */
import type { DefiningKey, MoistAirState } from '../physics/types';
import type { PropertyNode } from '../notation/ast';
import type { EvalContext } from './context';
import { STATE_KEYS } from './keys';
import { readQuantity } from './quantity';
import type { EvaluatedItem, StateResult } from './types';

const ALLOW_FOG = Object.freeze({ allowFog: true });

/** Beyond this |ΔW| (kg/kg, 2 g/kg) no written state is coarse enough to hide it: no solve is spent. */
export const MOISTURE_RESOLUTION_CHECKED_BELOW = 2e-3;

/** The SI value and band of a written defining figure, or null when it is not a plain written number. */
function written(prop: PropertyNode | undefined, key: DefiningKey): { si: number; band: number } | null {
  if (!prop?.value || typeof prop.value.number?.value !== 'number') return null;
  const spec = STATE_KEYS[key];
  if (!spec) return null;
  const r = readQuantity(prop, prop.value, spec);
  return r.ok ? { si: r.value.si, band: r.value.toleranceSI } : null;
}

/** δW of a `state` (see the module comment), kg/kg; 0 when its figures are not plain written numbers. */
function stateResolution(ctx: EvalContext, item: StateResult, state: MoistAirState): number {
  if (item.statement.keyword !== 'state' || item.defining.length !== 2) return 0;
  const props = item.statement.props;
  const [ka, kb] = item.defining as [DefiningKey, DefiningKey];
  const a = written(
    props.find((p) => p.key === ka),
    ka,
  );
  const b = written(
    props.find((p) => p.key === kb),
    kb,
  );
  if (!a || !b) return 0;
  let worst = 0;
  for (const [key, fig, other, otherFig] of [
    [ka, a, kb, b],
    [kb, b, ka, a],
  ] as const) {
    if (key === 'db' || !(fig.band > 0)) continue;
    for (const edge of [fig.si - fig.band, fig.si + fig.band]) {
      const r = ctx.solve({ [key]: edge, [other]: otherFig.si }, item.pressure.pa, ALLOW_FOG);
      if (r.ok && Number.isFinite(r.state.w)) worst = Math.max(worst, Math.abs(r.state.w - state.w));
    }
  }
  return worst;
}

/** Each evaluation's figures per item, so a state used by many processes is worked out once. */
const MEMO = new WeakMap<EvalContext, Map<EvaluatedItem, number>>();

/** δW of a state or mix result of this evaluation, kg/kg (see the module comment). */
export function moistureResolution(ctx: EvalContext, item: EvaluatedItem): number {
  let memo = MEMO.get(ctx);
  if (!memo) {
    memo = new Map();
    MEMO.set(ctx, memo);
  }
  const known = memo.get(item);
  if (known !== undefined) return known;
  const r = item.kind === 'state' && item.state ? stateResolution(ctx, item, item.state) : 0;
  memo.set(item, r);
  return r;
}

/**
 * Whether a process from `a` to `b` has no moisture change within the resolution of the written
 * states: 0 < |W_B − W_A| ≤ max(δW_A, δW_B) (an exactly zero Δw needs no rule).
 */
export function moistureUnchanged(ctx: EvalContext, a: StateResult, b: StateResult): boolean {
  if (!a.state || !b.state) return false;
  const dw = Math.abs(b.state.w - a.state.w);
  if (dw === 0 || !(dw < MOISTURE_RESOLUTION_CHECKED_BELOW)) return false;
  return dw <= Math.max(moistureResolution(ctx, a), moistureResolution(ctx, b));
}
