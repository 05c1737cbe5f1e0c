/**
 * Parts of results that many results hold alike, made once and shared: the empty list (of claims,
 * of defining keys), and the list of defining keys of each pair. They are frozen (no reader changes a result's lists;
 * one that did would throw rather than change every result), and each serialises as a fresh copy
 * of itself (`toJSON`), so that a result's JSON text is the same as with a list of its own,
 * whatever a serialiser does with an object it meets twice.
 */
import type { DefiningKey } from '../physics/types';
import { DEFINING_KEYS } from './keys';

/** A copy of the list it is called on (its JSON). */
function copyOfList(this: readonly unknown[]): unknown[] {
  return this.slice();
}

/** `items` frozen, serialising as a copy of itself (see the module comment). */
function sharedList<T>(items: T[]): T[] {
  Object.defineProperty(items, 'toJSON', { value: copyOfList });
  return Object.freeze(items) as T[];
}

/** The empty list: the claims of a result without claims, the defining keys of a state not solved. */
export const EMPTY: never[] = sharedList<never>([]);

/** The pairs by the keys' places in DEFINING_KEYS (first key's place × 6 + second's). */
const PAIRS: DefiningKey[][] = [];
for (const a of DEFINING_KEYS) for (const b of DEFINING_KEYS) PAIRS.push(sharedList([a, b]));
if (DEFINING_KEYS.join() !== 'db,wb,dp,rh,w,h') throw new Error('shared.ts: placeOf follows DEFINING_KEYS');

/** The place of a defining key in DEFINING_KEYS (a switch: no search per result). */
function placeOf(k: DefiningKey): number {
  switch (k) {
    case 'db':
      return 0;
    case 'wb':
      return 1;
    case 'dp':
      return 2;
    case 'rh':
      return 3;
    case 'w':
      return 4;
    default:
      return 5;
  }
}

/** The list `[a, b]` of a result's two defining keys (shared by every result of that pair, in that order). */
export function definingPair(a: DefiningKey, b: DefiningKey): DefiningKey[] {
  return PAIRS[placeOf(a) * 6 + placeOf(b)]!;
}
