/**
 * Diagnostics of a note as the editor shows them: the parser's and the evaluator's, in document
 * order, with their stable codes and the data quick fixes need. Claim checks follow the settings
 * (the evaluator skips them when `checkClaims` is off).
 */
import type { CoreDiagnostic } from '../notation/ast';
import { excludedDiagnostic } from './excluded';
import { limitDiagnostic } from './limits';
import type { Note } from './types';

/**
 * The diagnostics to report for a note (for a note over the size limit, or one its project file
 * leaves out, the one that says so).
 */
export function noteDiagnostics(note: Note): CoreDiagnostic[] {
  if (note.limited) return [limitDiagnostic(note)];
  if (note.settings.excludedBy) return [excludedDiagnostic(note)];
  if (note.settings.checkClaims) return note.analysis.diagnostics;
  return note.analysis.diagnostics.filter((d) => d.code !== 'claim-mismatch');
}

/** How many errors and warnings a note has (for summaries). */
export function countDiagnostics(note: Note): { errors: number; warnings: number } {
  let errors = 0;
  let warnings = 0;
  for (const d of noteDiagnostics(note)) {
    if (d.severity === 'error') errors++;
    else if (d.severity === 'warning') warnings++;
  }
  return { errors, warnings };
}
