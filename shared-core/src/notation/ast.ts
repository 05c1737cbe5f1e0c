/**
 * Syntax tree of the air-state notation. The parser never throws: it returns the statements it
 * could read plus a list of syntax diagnostics. Every node carries its exact source span
 * (UTF-16 offsets into the whole Markdown document). The tree knows nothing of physics or units:
 * unit symbols are kept as written and resolved by the evaluator.
 *
 * A span is never changed in place: two nodes (or a node and its fence line) may share one. The
 * parser builds its common nodes with the classes of `nodes.ts`, which make the spans that follow
 * from their other fields (a key's, a number's, a unit's…) when read: a reader that keeps such a
 * span keeps the object it was given.
 */
import type { DiagnosticCode } from '../vocabulary/codes';
import type { Keyword } from '../markdown/regions';
import type { AirRegion, HeadingNode, StatementOrigin } from '../markdown/types';
import type { Span } from '../text/types';

// The regions, headings and keywords are found by the Markdown layer below; the tree carries them.
export type { AirRegion, HeadingNode, Keyword, StatementOrigin };

/** A number as written, with its value and its precision (for claims). */
export interface NumberNode {
  /** The parsed value (finite, or the parser reports a syntax error instead). */
  value: number;
  /** The digits exactly as written (`9.30`, `-5`, `1.2e3`). */
  text: string;
  /**
   * Place value of the last written digit: `50` → 1, `9.30` → 0.01, `1.2e3` → 100. Half of it is
   * the default claim tolerance.
   */
  resolution: number;
  span: Span;
}

/** A unit symbol as written after a number (`C`, `°F`, `g/kg`, `%`, `m3/s`). */
export interface UnitNode {
  text: string;
  span: Span;
}

/** An explicit tolerance written after a value: `±2`, `+-0.5`, `±0.5C`, `±2%` of a non-% value. */
export interface ToleranceNode {
  number: NumberNode;
  /** Unit of the tolerance when written; otherwise the value's own unit applies. */
  unit: UnitNode | null;
  span: Span;
}

/** A value with an optional unit and tolerance: `24C`, `50%±2`, `0.0093`, `1000L/s`. */
export interface QuantityNode {
  number: NumberNode;
  unit: UnitNode | null;
  tolerance: ToleranceNode | null;
  span: Span;
}

/**
 * A property taken from a state above: `OA.w`, `OFF.db+0.8K`, `RA.db-2F`. The offset is a signed
 * difference (`+`/`-` only; no other arithmetic), its number carrying the sign as written.
 */
export interface PropertyRefNode {
  /** The state (or mix, supply…) named before the dot. */
  state: NameNode;
  /** The property key after the dot, as written. */
  key: { text: string; span: Span };
  /** `+0.8K`: the difference added to the referenced value, or null. */
  offset: QuantityNode | null;
  span: Span;
}

/** `key=value` inside a statement. */
export interface PropertyNode {
  key: string;
  keySpan: Span;
  /**
   * Null when nothing usable follows the `=` (a syntax diagnostic is reported), and for a
   * reference (then {@link ref} is set).
   */
  value: QuantityNode | null;
  span: Span;
  /** `key=NAME.key[±difference]`: the value is another state's property (present only then). */
  ref?: PropertyRefNode;
}

/** A state name (definition or reference). */
export interface NameNode {
  text: string;
  span: Span;
}

interface StatementBase {
  keyword: Keyword;
  keywordSpan: Span;
  origin: StatementOrigin;
  /** The statement from its keyword to its last token (comments excluded). */
  span: Span;
}

/** `site: p=VALUE` or `site: elev=VALUE`. */
export interface SiteStatement extends StatementBase {
  keyword: 'site';
  props: PropertyNode[];
}

/** `units: SI` or `units: IP`. */
export interface UnitsStatement extends StatementBase {
  keyword: 'units';
  /** The word as written (`SI`, `IP`, or something invalid that the evaluator reports); null if missing. */
  system: NameNode | null;
}

/** `state NAME: key=value …`. */
export interface StateStatement extends StatementBase {
  keyword: 'state';
  name: NameNode | null;
  props: PropertyNode[];
}

/** One stream of a mix: `OA 25%`, `RA 1.2kg/s`, `OA 1000L/s`, `RA rest`. */
export interface MixStream {
  name: NameNode;
  /** Null for a stream written without an amount (reported) and for a `rest` stream. */
  amount: QuantityNode | null;
  span: Span;
  /** The word `rest`: this stream is what the others leave of `total=` (or of 100 %); present only then. */
  rest?: Span;
}

/** `mix NAME: A X + B Y [+ …]`, optionally followed by claims `key=value` about the result. */
export interface MixStatement extends StatementBase {
  keyword: 'mix';
  name: NameNode | null;
  streams: MixStream[];
  /** Properties written after the streams, e.g. `mix MA: OA 25% + RA 75% db=26.2C` (claims). */
  props: PropertyNode[];
}

/** `process NAME: A -> B [m=… | q=…]` and further claims such as `q_total=98kW`. */
export interface ProcessStatement extends StatementBase {
  keyword: 'process';
  name: NameNode | null;
  from: NameNode | null;
  to: NameNode | null;
  /** `m=`/`q=` and any other `key=value` written after the arrow, in order. */
  props: PropertyNode[];
  /** Bare words written among the properties (`steam`, `adiabatic`): the kind of equipment. */
  words: NameNode[];
}

/** A word written as a value: `fog=ok`. */
export interface WordPropertyNode {
  key: string;
  keySpan: Span;
  word: NameNode;
  span: Span;
}

/** One stream of a `recover`: `OA -> OA2 [m=… | q=…]`. */
export interface RecoverStream {
  from: NameNode | null;
  to: NameNode | null;
  /** The properties written after this stream (up to the comma), in order. */
  props: PropertyNode[];
  span: Span;
}

/** `recover NAME: A -> A2 [flow], B -> B2 [flow] eff_s=… [eff_l=…] [fog=ok]`: heat recovery between two streams. */
export interface RecoverStatement extends StatementBase {
  keyword: 'recover';
  name: NameNode | null;
  streams: RecoverStream[];
  /** Every property written, in order (the streams' own, concatenated; the same nodes). */
  props: PropertyNode[];
  /** Word-valued options (`fog=ok`). */
  options: WordPropertyNode[];
}

/**
 * `supply NAME: ROOM q_sensible=… q_latent=… (db=… | m=… | q=…) [claims]`: the supply state and
 * dry-air flow that absorb the loads of the room state ROOM.
 */
export interface SupplyStatement extends StatementBase {
  keyword: 'supply';
  name: NameNode | null;
  /** The room state the supply air serves. */
  room: NameNode | null;
  props: PropertyNode[];
}

/** Any statement. */
export type Statement =
  | SiteStatement
  | UnitsStatement
  | StateStatement
  | MixStatement
  | ProcessStatement
  | SupplyStatement
  | RecoverStatement;

/** A diagnostic as the core reports it (LSP-free). */
export interface CoreDiagnostic {
  /** Stable code (`syntax`, `missing-unit`, `wb-above-db`…): a code of the registry (`vocabulary/codes`). */
  code: DiagnosticCode;
  severity: 'error' | 'warning' | 'info';
  /** What is wrong, where, and how to fix it. */
  message: string;
  span: Span;
  /** Other places that explain this one (the first definition of a duplicated name…). */
  related?: { span: Span; message: string }[];
  /** Plain data a quick fix needs (e.g. the computed value for a stale claim). */
  data?: Record<string, unknown>;
}

/** What the parser returns for one document. */
export interface ParsedNote {
  regions: AirRegion[];
  headings: HeadingNode[];
  statements: Statement[];
  /** Syntax diagnostics (code `syntax` or more specific), in document order. */
  diagnostics: CoreDiagnostic[];
}
