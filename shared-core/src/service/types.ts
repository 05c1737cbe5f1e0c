/**
 * Plain-data types of the language service. No editor or protocol types: offsets are UTF-16 code
 * units into the whole document, ranges are {@link Span}s, rich text is a Markdown string.
 */
import type { Analysis, RuleSetting } from '../evaluate/types';
import type { Span } from '../text/types';
import type { UnitSystem } from '../units/types';

/** The properties the inline hints may show, in order: the key table's rows marked `hint`. */
export { HINT_KEYS, type HintKey } from '../vocabulary/keys';
import type { HintKey } from '../vocabulary/keys';

/** The default pressure for notes without a `site:` line: a pressure, or an elevation to convert. */
export type DefaultSite =
  | { kind: 'pressure'; pa: number; written: string }
  | { kind: 'elevation'; m: number; written: string };

/** Editor settings the service honours (a note's own `units:` and `site:` lines win). */
export interface ServiceSettings {
  /** Unit system for results when the note has no `units:` line. */
  units: UnitSystem;
  /** Default barometric pressure or elevation. */
  site: DefaultSite;
  /** Properties the inline hints show, or 'auto' (rh, w, h and dp — wb when dp is written). */
  hintProperties: HintKey[] | 'auto';
  /** Decimals shown beyond each quantity's usual engineering precision (0 = the usual precision). */
  extraDigits: number;
  /** Whether written claims are compared with the computed values. */
  checkClaims: boolean;
  /** Whether hovers also show every figure in the other unit system. */
  secondaryUnits: boolean;
  /**
   * Notes longer than this many KB (1024 characters each) are not evaluated in the editor: they get
   * one info diagnostic saying so, and no hints or hovers (0 = no limit). See `./limits`.
   */
  maxNoteKB: number;
  /** Severity per diagnostic code, or `off` (from the project file `dewmark.json`; see `./projectConfig`). */
  rules?: Readonly<Record<string, RuleSetting>>;
  /**
   * Where the values a project file set came from: per setting, the file's path as the user reads
   * it (relative to the workspace folder, e.g. `calcs/dewmark.json`). A setting not named here is
   * the editor's (or the default), and messages call it `setting dewmark.<name>`.
   */
  sources?: Readonly<Partial<Record<SourcedSetting, string>>>;
  /**
   * Set when the note's project file leaves it out with its `include`/`exclude` patterns (as
   * `dewmark check` does): the file and why. Its problems are then not shown (see `./excluded`).
   */
  excludedBy?: { file: string; why: string };
}

/** The settings a project file can be the source of (`site` stands for `pressure` and `elevation`). */
export type SourcedSetting = 'units' | 'site' | 'checkClaims' | 'precision' | 'inlayHints' | 'rules';

/** A cancellation signal (structurally compatible with an LSP cancellation token). */
export interface CancellationFlag {
  readonly isCancellationRequested: boolean;
}

/** One note, analysed once, that every feature reads. */
export interface Note {
  text: string;
  analysis: Analysis;
  settings: ServiceSettings;
  /** Set when the note is longer than `settings.maxNoteKB`: it was not evaluated (its analysis is empty). */
  limited?: { chars: number; limitChars: number };
}

/** A replacement of one span of the document. */
export interface Edit {
  span: Span;
  newText: string;
}
