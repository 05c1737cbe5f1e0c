/** The keys each statement takes (views of the one key table, `../vocabulary/keys`) and the rules on defining pairs. */
import type { DefiningKey } from '../physics/types';

import { KEYS, findKey, keysOf, type KeySpec } from '../vocabulary/keys';

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

/**
 * The process keys that define a leaving state: the equipment keys and the leaving state's
 * properties (see `derive.ts`).
 */
export const DERIVE_KEY_NAMES: ReadonlySet<string> = new Set(
  KEYS.filter((k) => k.in.includes('process') && (k.kind === 'process-spec' || k.kind === 'property')).map(
    (k) => k.key,
  ),
);

/** The words a process may carry to name its equipment (`process HU: A -> B steam w=5.65g/kg`). */
export const PROCESS_WORDS: Readonly<Record<string, string>> = {
  steam: 'a steam humidifier: to a target w= or rh=',
  adiabatic: 'an adiabatic (evaporative) humidifier or cooler: eff= (saturation effectiveness), or a target rh= or db=',
};

/**
 * Keys of `recover` (heat recovery between two streams): per
 * stream m=/q=, then the exchanger's (rows of the key table).
 */
export const RECOVER_KEYS: Readonly<Record<string, KeySpec>> = Object.fromEntries(
  ['m', 'q', 'eff_s', 'eff_l', 'q_sensible', 'q_total'].map((k) => [k, findKey(k)!]),
);

/** Word-valued options of `recover`: `fog=ok` acknowledges condensation or frost the design accepts. */
export const RECOVER_WORDS: Readonly<Record<string, readonly string[]>> = { fog: ['ok'] };

/**
 * The state keys that can define a state (v is a claim only; p and elev set the pressure): the table's defining rows.
 */
export const DEFINING_KEYS: readonly DefiningKey[] = KEYS.filter((k) => k.defining).map((k) => k.key as DefiningKey);

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
