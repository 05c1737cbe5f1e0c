/**
 * The language service: editor features over one analysed note, as plain data (UTF-16 offsets,
 * spans, strings, Markdown). No editor or protocol types; the server converts.
 *
 * Use: `const note = analyzeText(text, settings)` once per document version, then call the
 * features with the note, an offset or span, and optionally a cancellation flag.
 */
export type { CancellationFlag, DefaultSite, Edit, HintKey, Note, ServiceSettings } from './types';
export { HINT_KEYS } from './types';
export type { Span } from '../text/types';
export type { CoreDiagnostic } from '../notation/ast';
export { DEFAULT_SERVICE_SETTINGS, MAX_EXTRA_DIGITS, readSettings, toEvaluateSettings } from './settings';
export { analyzeText } from './note';
export { hover, type HoverInfo } from './hover';
export { inlayHints, type HintItem } from './inlayHints';
export { completions, type CompletionEntry, type CompletionResult } from './completion';
export { documentSymbols, type OutlineSymbol } from './symbols';
export { definition, prepareRename, references, rename, renameProblem, type DefinitionTarget } from './navigation';
export { codeActions, type FixAction } from './codeActions';
export { countDiagnostics, noteDiagnostics } from './diagnostics';
export { noteStatus, type NoteStatus } from './status';
export {
  countChanges,
  resultsTableActions,
  resultsTableEdits,
  STALE_RESULTS_TABLE,
  type TableChange,
  type TableChangeKind,
  type TablesPlan,
  type TablesScope,
} from './resultsTables';

import { codeActions } from './codeActions';
import { completions } from './completion';
import { countDiagnostics, noteDiagnostics } from './diagnostics';
import { hover } from './hover';
import { inlayHints } from './inlayHints';
import { definition, prepareRename, references, rename } from './navigation';
import { analyzeText } from './note';
import { resultsTableActions, resultsTableEdits } from './resultsTables';
import { noteStatus } from './status';
import { documentSymbols } from './symbols';

/** Every feature of the service in one object (the same functions as the named exports). */
export function createLanguageService() {
  return {
    analyze: analyzeText,
    hover,
    inlayHints,
    completions,
    documentSymbols,
    definition,
    references,
    prepareRename,
    rename,
    codeActions,
    diagnostics: noteDiagnostics,
    countDiagnostics,
    noteStatus,
    resultsTableEdits,
    resultsTableActions,
  } as const;
}

/** The shape returned by {@link createLanguageService}. */
export type LanguageService = ReturnType<typeof createLanguageService>;
