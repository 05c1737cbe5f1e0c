/**
 * `analyzeNote` for a reader that is done with each item once it has it (the command line writing
 * a large note's results): the items are handed out as they are made and nothing is kept
 * (`evaluate/evaluate.ts` `evaluateHandingOut`), then the note's ignore comments and the project's
 * rule severities apply to the diagnostics, as in `finishAnalysis`.
 */
import type { EvaluateSettings } from '../evaluate/types';
import { evaluateHandingOut, type HandingOut } from '../evaluate/evaluate';
import { RESULTS_MARKER_WORD } from '../present/writtenTables';
import { applyDiagnosticPolicy } from './suppressions';

export type { HandedOutAnalysis, HandingOut } from '../evaluate/evaluate';

/**
 * `analyzeNote` of `text` with its items handed out as they are made, in the order of the
 * analysis's `items` (`HandingOut.run`), instead of kept; the diagnostics are the analysis's. Null
 * for a note that cannot be read so: one with a results table written in it (compared with all
 * the items of its block) or one that may name other units than the settings'.
 */
export function analyzeHandingOut(text: string, settings?: Partial<EvaluateSettings>): HandingOut | null {
  if (text.includes(RESULTS_MARKER_WORD)) return null;
  const evaluation = evaluateHandingOut(text, settings);
  if (!evaluation) return null;
  return {
    units: evaluation.units,
    run: (onItem) => {
      const analysis = evaluation.run(onItem);
      applyDiagnosticPolicy(analysis, text);
      return analysis;
    },
  };
}
