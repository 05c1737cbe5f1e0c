/**
 * Custom requests shared by the language server and its clients. Plain method names and JSON
 * shapes only, so a client can use them without importing the server.
 */

/** Method of the "check every note in the workspace" request (work-done progress supported). */
export const CHECK_WORKSPACE_METHOD = 'dewmark/checkWorkspace';

/** Parameters of {@link CHECK_WORKSPACE_METHOD}; a client may pass a work-done token. */
export interface CheckWorkspaceParams {
  workDoneToken?: string | number;
}

/** One Markdown note read by {@link CHECK_WORKSPACE_METHOD}. */
export interface CheckedNote {
  uri: string;
  errors: number;
  warnings: number;
  /** Statements found in the note (states, mixes, processes, site and units lines). */
  statements: number;
}

/**
 * Result of {@link CHECK_WORKSPACE_METHOD}: the notes that hold statements or problems (a fence
 * whose only line does not parse has no statement but an error), and the totals. The files are
 * the ones `dewmark check <folder>` reads for each workspace folder, so the totals agree.
 */
export interface CheckWorkspaceResult {
  notes: CheckedNote[];
  /** Markdown files read, including those without statements. */
  filesRead: number;
  errors: number;
  warnings: number;
  /** Files that could not be read (binary, not UTF-8, …), with the reason. */
  unreadable: { uri: string; reason: string }[];
  /** Workspace folders not searched (not on this machine's file system), with the reason. */
  skippedFolders: { uri: string; reason: string }[];
  /**
   * Markdown files their project file `dewmark.json` leaves out (include/exclude), as `dewmark
   * check` does: not read, no diagnostics, not counted in `filesRead`; `reason` names the file and pattern.
   */
  excluded: { uri: string; reason: string }[];
}

/** Method of the note-status request: unit system and pressure basis of one open note. */
export const NOTE_STATUS_METHOD = 'dewmark/noteStatus';

/** Parameters of {@link NOTE_STATUS_METHOD}. */
export interface NoteStatusParams {
  textDocument: { uri: string };
}

/** A zero-based LSP position (UTF-16). */
export interface WirePosition {
  line: number;
  character: number;
}

/** Result of {@link NOTE_STATUS_METHOD} (null for a document that is not open). */
export interface NoteStatusResult {
  units: 'SI' | 'IP';
  /** `note` when a `units:` line sets it, `setting` when dewmark.units (or a project file) does. */
  unitsSource: 'note' | 'setting';
  /**
   * With `setting`: the project file `dewmark.json` that sets the units (its path relative to the
   * workspace folder), when one does — the editor setting dewmark.units then does not apply.
   */
  unitsFile?: string;
  /** The range of the `SI`/`IP` word of the note's `units:` line, when it has one. */
  unitsValueRange: { start: WirePosition; end: WirePosition } | null;
  /** Short label of the pressure basis ("101.325 kPa", "site 83.4 kPa"). */
  pressureLabel: string;
  /** One sentence on where the pressure comes from. */
  pressureDescribe: string;
}

/** The settings section the server reads through `workspace/configuration`. */
export const SETTINGS_SECTION = 'dewmark';

/** The `source` of every diagnostic the server reports. */
export const DIAGNOSTIC_SOURCE = 'dewmark';

/**
 * `workspace/executeCommand` command that computes the results tables of a note: the edit that
 * inserts or refreshes the Markdown table below one ` ```air ` block (the one at `position`) or
 * below every block (`all`). The server only answers with the edit; the client applies it.
 */
export const RESULTS_TABLE_COMMAND = 'dewmark.server.resultsTables';

/** The one argument of {@link RESULTS_TABLE_COMMAND}. */
export interface ResultsTableParams {
  textDocument: { uri: string };
  /** The block at this position (in the block, or in its written table). */
  position?: WirePosition;
  /** Every block of the note (wins over `position`). */
  all?: boolean;
}

/** Result of {@link RESULTS_TABLE_COMMAND} (null for a document that is not open). */
export interface ResultsTableResult {
  /** An LSP WorkspaceEdit (versioned when the client supports it); null when nothing changes. */
  edit: unknown;
  /** Blocks looked at (0 when `position` is in no fenced air block). */
  blocks: number;
  inserted: number;
  refreshed: number;
  unchanged: number;
  /** Tables whose end marker is missing (left alone; their diagnostic says how to fix them). */
  unterminated: number;
  /** The document version the edit is for. */
  version: number;
}

export { SERVER_EXEC_ARGV } from './nodeOptions';
export { READ_FILES_MAX, READ_FILES_METHOD, type ReadFilesParams, type ReadFilesResult } from './browserHost';
