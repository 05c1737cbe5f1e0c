/**
 * The parts of the core the CLI uses, in one place. Imported from the core's modules directly
 * (the core has one package entry point, `@dewmark/core`; this adapter keeps the CLI to the
 * evaluator, the units and the line index).
 */
export { analyzeNote } from '../../shared-core/src/evaluate';
export type { Analysis, EvaluateSettings, ProcessResult, StateResult } from '../../shared-core/src/evaluate/types';
export type { CoreDiagnostic } from '../../shared-core/src/notation/ast';
export { LineIndex } from '../../shared-core/src/text/lineIndex';
export { displayUnit, displaySymbol, formatQuantity, lookupUnit, toSI } from '../../shared-core/src/units';
export { stdAtmPressure } from '../../shared-core/src/physics';
export type { Dimension, UnitSystem } from '../../shared-core/src/units/types';
