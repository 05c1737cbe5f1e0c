/**
 * The language service: editor features over one analysed note, as plain data (UTF-16 offsets,
 * spans, strings, Markdown). No editor or protocol types; the server converts.
 *
 * Use: `const note = analyzeText(text, settings)` once per document version, then call the
 * features with the note, an offset or span, and optionally a cancellation flag.
 */
export type { CancellationFlag, DefaultSite, Edit, HintKey, Note, ServiceSettings, SourcedSetting } from './types';
export { HINT_KEYS } from './types';
export type { Span } from '../text/types';
export type { CoreDiagnostic } from '../notation/ast';
export { DEFAULT_SERVICE_SETTINGS, readSettings, RULE_VALUES, toEvaluateSettings } from './settings';
export {
  findProjectConfig,
  mergeSection,
  parseProjectConfig,
  projectSources,
  readProjectSettings,
  PROJECT_FILE,
  PROJECT_KEYS,
  SETTING_KEYS,
  type ConfigFileSystem,
  type ProjectConfig,
} from './projectConfig';
export { analyzeText, analyzeTextSteps, analyzeTextWith } from './note';
export { hover, type HoverInfo } from './hover';
export { hoverPlainText } from './plainText';
export { inlayHints, type HintItem } from './inlayHints';
export { completions, type CompletionEntry, type CompletionResult } from './completion';
export { documentSymbols, type OutlineSymbol } from './symbols';
export { definition, prepareRename, references, rename, type DefinitionTarget } from './navigation';
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
