/** Parse + evaluate in one call. */
import { parseNote } from '../notation/parse';
import type { CoreDiagnostic } from '../notation/ast';
import { staleTableDiagnostics } from '../present/writtenTables';
import { evaluate } from '../evaluate/evaluate';
import { applyDiagnosticPolicy } from './suppressions';
import type { Analysis, EvaluateSettings } from '../evaluate/types';

/**
 * Parses a Markdown note and evaluates it (`parseNote` + {@link evaluate}), with line numbers in
 * messages; then checks the results tables written below its blocks (`stale-results-table`).
 */
export function analyzeNote(text: string, settings?: Partial<EvaluateSettings>): Analysis {
  return finishAnalysis(evaluate(parseNote(text), settings, text), text);
}

/**
 * The checks that follow evaluation (the written results tables), added to `analysis` in
 * document order, then the note's ignore comments and the project's rule severities
 * (`./suppressions`); shared by {@link analyzeNote} and the incremental analyzer.
 */
export function finishAnalysis(analysis: Analysis, text: string): Analysis {
  const stale = staleTableDiagnostics(analysis, text);
  if (stale.length > 0) analysis.diagnostics = mergeInOrder(analysis.diagnostics, stale);
  applyDiagnosticPolicy(analysis, text);
  return analysis;
}

/** Two lists of diagnostics, each in document order, as one list in document order. */
function mergeInOrder(a: CoreDiagnostic[], b: CoreDiagnostic[]): CoreDiagnostic[] {
  const out: CoreDiagnostic[] = [];
  let i = 0;
  let j = 0;
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i]!.span.start <= b[j]!.span.start)) out.push(a[i++]!);
    else out.push(b[j++]!);
  }
  return out;
}
