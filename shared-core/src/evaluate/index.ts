/** The evaluator's public surface. */
export { evaluate } from './evaluate';
export { resolveSettings } from './settings';
export { STATE_KEYS, SITE_KEYS, MIX_KEYS, PROCESS_KEYS, DEFINING_KEYS } from './keys';
export type { KeySpec } from './keys';
export { allFinite } from './util';
export type * from './types';
