/**
 * Plain-data types of the language service. No editor or protocol types: offsets are UTF-16 code
 * units into the whole document, ranges are {@link Span}s, rich text is a Markdown string.
 */
import type { Analysis } from '../evaluate/types';
import type { Span } from '../text/types';
import type { UnitSystem } from '../units/types';

/** A property that the inline hints may show after a state or mix. */
export type HintKey = 'db' | 'wb' | 'dp' | 'rh' | 'w' | 'h' | 'v' | 'rho';

/** Every key the inline hints accept, in the order they are shown. */
export const HINT_KEYS: readonly HintKey[] = ['db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'rho'];

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
}

/** A cancellation signal (structurally compatible with an LSP cancellation token). */
export interface CancellationFlag {
  readonly isCancellationRequested: boolean;
}

/** One note, analysed once, that every feature reads. */
export interface Note {
  text: string;
  analysis: Analysis;
  settings: ServiceSettings;
}

/** A replacement of one span of the document. */
export interface Edit {
  span: Span;
  newText: string;
}
