/**
 * The parts of the core the CLI uses, in one place. Imported from the core's modules directly
 * (the core has one package entry point, `@dewmark/core`; this adapter keeps the CLI to the
 * evaluator, the units and the line index).
 */
export { analyzeNote } from '@dewmark/core/evaluate';
export type { Analysis, EvaluateSettings, ProcessResult, StateResult } from '@dewmark/core/evaluate/types';
export type { CoreDiagnostic } from '@dewmark/core/notation/ast';
export { LineIndex } from '@dewmark/core/text/lineIndex';
export { displayUnit, displaySymbol, formatQuantity, lookupUnit, toSI } from '@dewmark/core/units';
export { stdAtmPressure } from '@dewmark/core/physics';
export type { Dimension, UnitSystem } from '@dewmark/core/units/types';
