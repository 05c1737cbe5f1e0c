/**
 * The volume flow of a process or a supply: `q=`, or its other names `flow=` and `V=` (the key
 * table's `aliasOf` rows), read exactly as `q=`. One of them is used; a second name on the same
 * line is a `flow-conflict`.
 */
import { findKey } from '../vocabulary/keys';
import type { EvalContext } from './context';
import type { ReadProp } from './props';

/** Whether a written key gives the volume flow (`q`, or a name the key table gives it). */
export function isVolumeFlowKey(key: string): boolean {
  return key === 'q' || findKey(key)?.aliasOf === 'q';
}

/** The volume-flow property written first (reporting every other one as a conflict), or undefined. */
export function volumeFlowProp(ctx: EvalContext, props: readonly ReadProp[], what: string): ReadProp | undefined {
  const volumes = props.filter((p) => isVolumeFlowKey(p.key));
  const q = volumes[0];
  for (const extra of volumes.slice(1)) {
    ctx.report({
      code: 'flow-conflict',
      severity: 'error',
      message:
        `${what}: ${q!.key}= and ${extra.key}= both give the volume flow ` +
        `(${extra.key === 'q' ? q!.key : extra.key}= is another name for q=); keep one (${q!.key}= is used)`,
      span: extra.prop.span,
      related: [{ span: q!.prop.span, message: 'the flow used' }],
    });
  }
  return q;
}
