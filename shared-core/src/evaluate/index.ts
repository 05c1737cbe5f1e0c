/** The evaluator's public surface. */
export { evaluate } from './evaluate';
export { analyzeNote } from './analyze';
export { createAnalyzer, type Analyzer } from './analyzer';
export { DEFAULT_SETTINGS, STANDARD_PRESSURE_PA, resolveSettings } from './settings';
export { STATE_KEYS, SITE_KEYS, MIX_KEYS, PROCESS_KEYS, DEFINING_KEYS } from './keys';
export type { KeySpec } from './keys';
export { candidatePairs } from './state';
export { splitSensibleLatent, apparatusDewPoint, processKindOf } from './process';
export { allFinite } from './util';
export type * from './types';
