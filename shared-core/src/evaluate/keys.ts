/** The keys each statement takes (views of the one key table, `../vocabulary/keys`) and the rules on defining pairs. */
import type { DefiningKey } from '../physics/types';

import { keysOf } from '../vocabulary/keys';

export type { BareRule, KeySpec } from '../vocabulary/keys';

/** Keys of `state` (and the claims after a `mix`): the rows of the key table written in a state. */
export const STATE_KEYS = keysOf('state');

/** Keys of `site:`. */
export const SITE_KEYS = keysOf('site');

/** Keys that may follow a `mix` (claims about the mixed state). */
export const MIX_KEYS = keysOf('mix');

/** Keys of `process`: the flow (`m=`, `q=`) and the claims about its results. */
export const PROCESS_KEYS = keysOf('process');

/**
 * Keys of `supply`: the room loads (q_sensible, q_latent), the supply dry-bulb or the flow (m, q at
 * the supply state; one of them defines the rest), and claims about the supply state and the room SHR.
 */
export const SUPPLY_KEYS = keysOf('supply');

/** The state keys that can define a state (v is a claim only; p and elev set the pressure). */
export const DEFINING_KEYS: readonly DefiningKey[] = ['db', 'wb', 'dp', 'rh', 'w', 'h'];

/** True when `key` can be one of the two defining properties. */
export function isDefiningKey(key: string): key is DefiningKey {
  return (DEFINING_KEYS as readonly string[]).includes(key);
}

/** True when the two keys fix the same thing (dp with w: both fix the moisture content at a known pressure). */
export function isDependentPair(a: DefiningKey, b: DefiningKey): boolean {
  return a === b || (a === 'dp' && b === 'w') || (a === 'w' && b === 'dp');
}

/** True when the pair is solvable but ill-conditioned (wb with h: nearly parallel on the chart). */
export function isIllConditionedPair(a: DefiningKey, b: DefiningKey): boolean {
  return (a === 'wb' && b === 'h') || (a === 'h' && b === 'wb');
}

/** The keys that, added to a dependent pair, would fix the state. */
export function thirdKindFor(a: DefiningKey, b: DefiningKey): string {
  const moisture = new Set<DefiningKey>(['dp', 'w']);
  if (moisture.has(a) && moisture.has(b)) return 'a temperature (db or wb), rh or h';
  return 'a property of another kind';
}
