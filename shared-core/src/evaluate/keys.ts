/** The property keys of each statement: what they measure, how a bare number reads, examples. */
import type { Dimension } from '../units/types';
import type { DefiningKey } from '../physics/types';

/** How a number written without a unit is read for a key. */
export type BareRule =
  /** A bare number is an error (`missing-unit`). */
  | 'error'
  /** A bare number is already in the SI base of the dimension (w in kg/kg, shr as a fraction). */
  | 'si';

/** What the evaluator knows about one key. */
export interface KeySpec {
  key: string;
  dimension: Dimension;
  title: string;
  bare: BareRule;
  /** Examples for messages (`24C or 75F`). */
  example: string;
}

const T = (key: string, title: string): KeySpec => ({ key, dimension: 'temperature', title, bare: 'error', example: `${key}=24C or ${key}=75F` });

/** Keys of `state` (and the claims after a `mix`). */
export const STATE_KEYS: Readonly<Record<string, KeySpec>> = {
  db: T('db', 'dry-bulb temperature'),
  wb: T('wb', 'wet-bulb temperature'),
  dp: T('dp', 'dew-point temperature'),
  rh: { key: 'rh', dimension: 'fraction', title: 'relative humidity', bare: 'error', example: 'rh=50%' },
  w: { key: 'w', dimension: 'humidityRatio', title: 'humidity ratio', bare: 'si', example: 'w=9.3g/kg or w=0.0093' },
  h: { key: 'h', dimension: 'enthalpy', title: 'specific enthalpy', bare: 'error', example: 'h=47.8kJ/kg or h=20.5Btu/lb' },
  v: { key: 'v', dimension: 'specificVolume', title: 'specific volume', bare: 'error', example: 'v=0.854m3/kg or v=13.7ft3/lb' },
  p: { key: 'p', dimension: 'pressure', title: 'pressure', bare: 'error', example: 'p=84kPa or p=12.2psia' },
  elev: { key: 'elev', dimension: 'length', title: 'elevation', bare: 'error', example: 'elev=1600m or elev=5250ft' },
};

/** Keys of `site:`. */
export const SITE_KEYS: Readonly<Record<string, KeySpec>> = {
  p: STATE_KEYS.p!,
  elev: STATE_KEYS.elev!,
};

/** Keys that may follow a `mix` (claims about the mixed state). */
export const MIX_KEYS: Readonly<Record<string, KeySpec>> = {
  db: STATE_KEYS.db!,
  wb: STATE_KEYS.wb!,
  dp: STATE_KEYS.dp!,
  rh: STATE_KEYS.rh!,
  w: STATE_KEYS.w!,
  h: STATE_KEYS.h!,
  v: STATE_KEYS.v!,
};

/** Keys of `process`: the flow (`m=`, `q=`) and the claims about its results. */
export const PROCESS_KEYS: Readonly<Record<string, KeySpec>> = {
  m: { key: 'm', dimension: 'massFlow', title: 'dry-air mass flow', bare: 'error', example: 'm=5.6kg/s or m=44000lb/h' },
  q: { key: 'q', dimension: 'volumeFlow', title: 'volume flow at the entering state', bare: 'error', example: 'q=4.8m3/s, q=4800L/s or q=10000cfm' },
  q_total: { key: 'q_total', dimension: 'power', title: 'total heat rate', bare: 'error', example: 'q_total=98kW' },
  q_sensible: { key: 'q_sensible', dimension: 'power', title: 'sensible heat rate', bare: 'error', example: 'q_sensible=72kW' },
  q_latent: { key: 'q_latent', dimension: 'power', title: 'latent heat rate', bare: 'error', example: 'q_latent=26kW' },
  q_coil: { key: 'q_coil', dimension: 'power', title: 'coil or heater duty (including the water)', bare: 'error', example: 'q_coil=97kW' },
  shr: { key: 'shr', dimension: 'fraction', title: 'sensible heat ratio', bare: 'si', example: 'shr=0.73' },
  water: { key: 'water', dimension: 'massFlow', title: 'water added or condensate removed', bare: 'error', example: 'water=38kg/h' },
};

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
