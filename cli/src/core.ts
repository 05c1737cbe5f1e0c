/**
 * The parts of the core the CLI uses, in one place: the analysis, the evaluator's result types,
 * the units, the line index and the results-table edits (for `fix`), each from its layer's entry
 * point (`@dewmark/core/<layer>`).
 */
export { analyzeHandingOut, analyzeNote, type HandedOutAnalysis, type HandingOut } from '@dewmark/core/analyze';
export type {
  Analysis,
  ClaimResult,
  EvaluateSettings,
  EvaluatedItem,
  ProcessResult,
  StateResult,
} from '@dewmark/core/evaluate';
export type { CoreDiagnostic } from '@dewmark/core/notation';
export { LineIndex } from '@dewmark/core/text';
export { displayUnit, displaySymbol, figure, lookupUnit, toSI } from '@dewmark/core/units';
export { claimFigures, processRow, stateRow, waterUnit } from '@dewmark/core/present';
export { stdAtmPressure } from '@dewmark/core/physics';
export {
  DEFAULT_SERVICE_SETTINGS,
  findProjectConfig,
  readProjectSettings,
  readSettings,
  resultsTableEdits,
  toEvaluateSettings,
  type ConfigFileSystem,
  type ProjectConfig,
} from '@dewmark/core/service';
export type { Dimension, UnitSystem } from '@dewmark/core/units';
export { jsonField, jsonFigureIn, jsonFigureOf, jsonName } from '@dewmark/core/vocabulary';
