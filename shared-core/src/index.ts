/**
 * `@dewmark/core`: the pure engine behind the CLI, the language server and the VS Code client.
 * Text and numbers in, plain data out; no editor, protocol or I/O imports (see ARCHITECTURE.md).
 *
 * The common entry points are exported here; each layer is also a subpath of the package
 * (`@dewmark/core/units`, `/physics`, `/notation/parse`, `/evaluate`, `/present/…`, `/service`,
 * `/chart`), which is how the other packages import it.
 */
export { analyzeNote, createAnalyzer, evaluate, DEFAULT_SETTINGS } from './evaluate';
export type { Analyzer } from './evaluate';
export type * from './evaluate/types';
export { parseNote } from './notation/parse';
export type * from './notation/ast';
export { LineIndex } from './text/lineIndex';
export type { Span, LineCol } from './text/types';
export { solveState, stateFromDbW, stdAtmPressure, PsychroError } from './physics';
export type { MoistAirState, DefiningKey, PhysicsCode, PhysicsProblem, SolveResult, SolveOptions } from './physics';
export { lookupUnit, toSI, fromSI, displayUnit, formatQuantity, formatDifference, formatInUnit } from './units';
export type { Dimension, UnitDef, UnitSystem } from './units';
export { renderChart, chartWebviewHtml } from './chart';
export { createLanguageService } from './service';
