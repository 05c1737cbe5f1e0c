/**
 * Tolerant parser of the air-state notation.
 *
 * {@link parseNote} finds the air regions of a Markdown note (see `markdown/regions`) and reads
 * their statements: one per non-blank line of an ` ```air ` fence, one per keyword code span.
 * {@link parseStatementText} reads one statement from a range of the document. The parser never
 * throws: what it cannot read becomes a diagnostic, and it goes on with the next statement. Every
 * node carries its exact source span (UTF-16 offsets into the whole document).
 *
 * Grammar (spaces and tabs separate tokens; in a code span, line breaks count as spaces):
 *
 *     site: KEY=VALUE …                       units: WORD
 *     state NAME: KEY=VALUE …                 mix NAME: NAME AMOUNT + NAME AMOUNT [+ …] [KEY=VALUE …]
 *     process NAME: NAME -> NAME [KEY=VALUE | WORD …]  (`→` works as well as `->`)
 *     supply NAME: NAME KEY=VALUE …                    (the room state, then loads and db, m or q)
 *     recover NAME: NAME -> NAME [KEY=VALUE …], NAME -> NAME [KEY=VALUE | KEY=WORD …]
 *     VALUE, AMOUNT:  NUMBER[UNIT][±NUMBER[UNIT]]     (`+-` works as well as `±`)
 *     VALUE:   NAME.KEY[(+|-)NUMBER UNIT]          another state's property (`OA.w`, `OFF.db+0.8K`)
 *     AMOUNT:  also `rest` (one stream of a mix: what the others leave of total=, or of 100 %)
 *     NUMBER:  [+|-|−] digits [. digits] [e|E [+|-] digits]    (`.5` and `5.` too)
 *     NAME:    a letter, then letters, digits, `_` or `-`
 *     KEY:     a letter or `_`, then letters, digits or `_`
 *
 * `#` starts a comment that runs to the end of the line (of the code span, inline). Spaces around
 * `=` are accepted. The unit is the run of characters written directly after the number up to a
 * space, `#`, `±`, `+`, `=` or `,`; the parser keeps keys and units as written and does not check
 * them (the evaluator does).
 *
 * Every `null` in the tree (a missing name, value, unit system, state of a process) comes with a
 * diagnostic from the parser, so the evaluator does not need to report it again. Diagnostic codes
 * (all severity `error`) are listed in {@link SYNTAX_CODES}.
 */
import type {
  CoreDiagnostic,
  Keyword,
  MixStatement,
  MixStream,
  NameNode,
  ParsedNote,
  ProcessStatement,
  PropertyNode,
  PropertyRefNode,
  QuantityNode,
  RecoverStatement,
  RecoverStream,
  WordPropertyNode,
  SiteStatement,
  Statement,
  StatementOrigin,
  StateStatement,
  SupplyStatement,
  ToleranceNode,
  UnitsStatement,
} from './ast';
import type { Span } from '../text/types';
import { lineOffsetsOf } from '../markdown/lines';
import { extractRegions, STATEMENT_KEYWORDS, type ExtractedRegion } from '../markdown/regions';
import { PACK_START, internedPackedSlice, internedSlice } from './intern';
import { ParsedNumber, ParsedProperty, ParsedQuantity, ParsedState, ParsedUnit } from './nodes';
import { scanNumber, startsNumber, type ScannedNumber } from './number';
import { differenceExample, findKey, referenceKeyFor } from '../vocabulary/keys';
import { CODES, DIAGNOSTIC_CODES, type CodeFrom } from '../vocabulary/codes';
import { SuggestIndex } from '../text/suggest';

/**
 * The diagnostic codes the parser reports, each with what it means (the registry's parser rows, `vocabulary/codes`).
 */
export const SYNTAX_CODES = Object.freeze(
  Object.fromEntries(
    DIAGNOSTIC_CODES.filter((c) => (CODES[c].from as readonly string[]).includes('parser')).map((c) => [
      c,
      CODES[c].meaning,
    ]),
  ),
) as Readonly<Record<SyntaxCode, string>>;

/** A diagnostic code of the parser. */
export type SyntaxCode = CodeFrom<'parser'>;

/** What {@link parseStatementText} returns. */
export interface StatementParse {
  /** Null for a blank or comment-only range, or when no statement keyword could be read. */
  statement: Statement | null;
  diagnostics: CoreDiagnostic[];
}

/** The statement keywords (found by the Markdown layer, which needs them for code spans). */
export const KEYWORDS: readonly Keyword[] = STATEMENT_KEYWORDS;

// ---------------------------------------------------------------------------------------------
// Character classes

/**
 * Space, tab, line feed, vertical tab, form feed, carriage return, no-break space or byte-order
 * mark. Ordered so that the usual answer, a printable ASCII character, takes one comparison more
 * than the space itself.
 */
function isWs(c: number): boolean {
  return c <= 0x20 ? c === 0x20 || (c >= 0x09 && c <= 0x0d) : c === 0xa0 || c === 0xfeff;
}

/**
 * The character classes below are asked of nearly every character of a note, so each is one
 * expression without a call: `c | 0x20` folds A–Z onto a–z, and `(x - low) >>> 0 < n` tests
 * `low <= x < low + n` in one comparison (a character below `low`, or -1 for none, wraps to a large
 * unsigned number). The loops that read the characters of every statement (its keyword, name,
 * keys, numbers and units, and the blanks between them) write these expressions out instead of
 * calling the functions: a note's first few thousand statements are read by the interpreter and
 * the baseline compiler, where each call costs more than the comparison it makes, and a function
 * called per character is compiled by the optimizing compiler on its own before its callers are.
 */
function isAsciiLetter(c: number): boolean {
  return ((c | 0x20) - 0x61) >>> 0 < 26;
}

function isDigit(c: number): boolean {
  return (c - 0x30) >>> 0 < 10;
}

const LETTER = /^\p{L}/u;

/** Code units taken by a letter at `pos` (a non-ASCII letter may be a surrogate pair), or 0. */
function letterAt(text: string, pos: number, end: number): number {
  if (pos >= end) return 0;
  const c = text.charCodeAt(pos);
  if (isAsciiLetter(c)) return 1;
  if (c < 0x80) return 0;
  const cp = text.codePointAt(pos) ?? c;
  const len = cp > 0xffff ? 2 : 1;
  return pos + len <= end && LETTER.test(String.fromCodePoint(cp)) ? len : 0;
}

/** Whether a key can start with `c` (ASCII letter or `_`). */
function isKeyStart(c: number): boolean {
  return ((c | 0x20) - 0x61) >>> 0 < 26 || c === 0x5f;
}

function isKeyChar(c: number): boolean {
  return ((c | 0x20) - 0x61) >>> 0 < 26 || (c - 0x30) >>> 0 < 10 || c === 0x5f;
}

/**
 * A word of ASCII letters as one number, `code` being that of the letters before `c`: each letter
 * is a digit from 1 to 58 in base 64, so two words of up to eight letters have the same code only
 * when they are the same word, and a longer word's code is larger than any shorter word's. A word
 * is compared with the keywords as one number instead of letter by letter.
 */
function wordCodeStep(code: number, c: number): number {
  return code * 64 + (c - 0x40);
}

/** The code of each keyword ({@link wordCodeStep}), in the order of {@link KEYWORDS}. */
const KEYWORD_CODES: readonly number[] = KEYWORDS.map((kw) => {
  let code = 0;
  for (let i = 0; i < kw.length; i++) code = wordCodeStep(code, kw.charCodeAt(i));
  return code;
});

/** The code of `state`, the common statement's keyword ({@link wordCodeStep}). */
const STATE_CODE = KEYWORD_CODES[KEYWORDS.indexOf('state')] as number;

/** The statement keyword whose code ({@link wordCodeStep}) is `code`, or null. */
function keywordOfCode(code: number): Keyword | null {
  for (let i = 0; i < KEYWORD_CODES.length; i++) if (KEYWORD_CODES[i] === code) return KEYWORDS[i] as Keyword;
  return null;
}

/** The statement keyword written as `text[start, end)`, or null (compared in place: no substring). */
function keywordAt(text: string, start: number, end: number): Keyword | null {
  let code = 0;
  for (let p = start; p < end; p++) {
    const c = text.charCodeAt(p);
    if (!isAsciiLetter(c)) return null;
    code = wordCodeStep(code, c);
  }
  return keywordOfCode(code);
}

// ---------------------------------------------------------------------------------------------
// Suggestions

const KEYWORD_INDEX = new SuggestIndex(KEYWORDS);

function keywordAdvice(word: string): string {
  const lower = word.toLowerCase();
  for (const kw of KEYWORDS) {
    if (lower === kw) return `keywords are lowercase: write '${kw}'`;
  }
  const near = KEYWORD_INDEX.nearest(lower, 2);
  const best: Keyword | null = near ? KEYWORDS[near.index]! : null;
  const bestD = near ? near.distance : 3;
  if (best && bestD <= 1) return `did you mean '${best}'?`;
  for (const kw of KEYWORDS) {
    if (word.length > kw.length && word.startsWith(kw)) {
      return `did you mean '${kw} ${word.slice(kw.length)}'? Put a space after '${kw}'`;
    }
  }
  if (best && bestD === 2 && word.length >= 4) return `did you mean '${best}'?`;
  return (
    "a statement starts with 'site:', 'units:', 'state', 'mix', " +
    "'process', 'supply' or 'recover'; start a note line with '#'"
  );
}

// ---------------------------------------------------------------------------------------------
// The parser of one statement

/** The pieces of a statement read from offsets ({@link StatementParser.parseLine}): none. */
const NO_PIECES: readonly Span[] = [];

class StatementParser {
  private text = '';
  private segs: readonly Span[] = [];
  private seg = 0;
  private pos = 0;
  private end = 0;
  private origin: StatementOrigin = 'fence';
  /** End of the last token consumed (the statement's span ends there). */
  private lastEnd = 0;
  /** A saved cursor, for look-ahead (one level is enough). */
  private savedSeg = 0;
  private savedPos = 0;
  private savedEnd = 0;
  /** The number being read ({@link scanNumber} fills it in place: one object for every number). */
  private readonly scanned: ScannedNumber = {
    end: 0,
    written: '',
    value: 0,
    fractionDigits: 0,
    exponent: 0,
    resolution: 1,
    next: -1,
  };
  /** Scratch stack of the properties being read (see {@link StatementParser.props}); `propTop` is its height. */
  private readonly propStack: PropertyNode[] = [];
  private propTop = 0;
  /**
   * The end of the quantity {@link StatementParser.quantity} read last (its node's `end`, which
   * is found by two getters): its last part's end, known where each part is read.
   */
  private quantityEnd = 0;
  /** What {@link StatementParser.nameTokenEnd} found of the last token it read (see there). */
  private nameTokenPlain = false;
  private nameTokenKeyEnd = -1;
  diagnostics: CoreDiagnostic[] = [];

  parse(text: string, segs: readonly Span[], origin: StatementOrigin, diagnostics: CoreDiagnostic[]): Statement | null {
    this.segs = segs;
    const first = segs[0];
    return this.read(text, first ? first.start : 0, first ? first.end : 0, origin, diagnostics);
  }

  /**
   * {@link parse} of one fence line, `text[start, end)`, given as offsets: no span object stands for
   * the line (so the statement's span is always a new one, never the line's).
   */
  parseLine(text: string, start: number, end: number, diagnostics: CoreDiagnostic[]): Statement | null {
    // No pieces: the cursor never moves on to a next one, and `sharedStmtSpan` finds none to share.
    this.segs = NO_PIECES;
    // `read`, written out: this is the call for every line of a fence.
    this.text = text;
    this.origin = 'fence';
    this.diagnostics = diagnostics;
    this.seg = 0;
    this.pos = start;
    this.end = end;
    this.lastEnd = start;
    return this.statement();
  }

  /** Reads the statement of the piece `text[start, end)`, the first of {@link segs}. */
  private read(
    text: string,
    start: number,
    end: number,
    origin: StatementOrigin,
    diagnostics: CoreDiagnostic[],
  ): Statement | null {
    this.text = text;
    this.origin = origin;
    this.diagnostics = diagnostics;
    this.seg = 0;
    this.pos = start;
    this.end = end;
    this.lastEnd = start;
    return this.statement();
  }

  /**
   * Lets go of what the last statements read refer to (the document's text and pieces, the
   * diagnostics list, the scratch stack's entries), once a caller is done with a run of them: the
   * parser outlives every document, and should not keep the last one alive.
   */
  release(): void {
    this.text = '';
    this.segs = [];
    this.diagnostics = [];
    this.propStack.length = 0;
    this.propTop = 0;
  }

  // --- cursor -------------------------------------------------------------------------------

  /** The next significant character after whitespace, or -1 at the end (or at a comment). */
  private peek(): number {
    // Most calls find the cursor on a significant character already, or on the one space that
    // separates two tokens, or at the end of a statement's only piece: those cases are answered
    // here, in a method short enough to be compiled into its callers; longer runs of blanks are
    // skipped by `peekPast`.
    if (this.pos < this.end) {
      let c = this.text.charCodeAt(this.pos);
      if (c === 0x20 && this.pos + 1 < this.end) c = this.text.charCodeAt(++this.pos);
      // Not a blank (`isWs`, written out): a printable ASCII character is answered by the first test.
      if (c > 0x20 ? c !== 0xa0 && c !== 0xfeff : c !== 0x20 && (c < 0x09 || c > 0x0d)) return c === 0x23 ? -1 : c;
      this.pos++;
    } else if (this.seg + 1 >= this.segs.length) {
      return -1;
    }
    return this.peekPast();
  }

  /**
   * {@link peek} past a blank or at the end of a piece: skips whitespace, moving on to the next
   * piece at the end of one.
   */
  private peekPast(): number {
    for (;;) {
      while (this.pos < this.end) {
        const c = this.text.charCodeAt(this.pos);
        if (c > 0x20 ? c !== 0xa0 && c !== 0xfeff : c !== 0x20 && (c < 0x09 || c > 0x0d)) return c === 0x23 ? -1 : c;
        this.pos++;
      }
      const next = this.segs[this.seg + 1];
      if (!next) return -1;
      this.seg++;
      this.pos = next.start;
      this.end = next.end;
    }
  }

  private charAt(pos: number): number {
    return pos < this.end ? this.text.charCodeAt(pos) : -1;
  }

  private isArrowAt(pos: number): boolean {
    const c = this.charAt(pos);
    return c === 0x2192 || (c === 0x2d && this.charAt(pos + 1) === 0x3e);
  }

  /**
   * End of the run of non-whitespace characters (up to a comment) that starts at the cursor, for
   * messages: the raw token is `text[pos, rawTokenEnd())`.
   */
  private rawTokenEnd(): number {
    const start = this.pos;
    let p = start;
    while (p < this.end) {
      const c = this.text.charCodeAt(p);
      if (isWs(c) || (c === 0x23 && p > start)) break;
      p++;
    }
    if (p === start && p < this.end) p++;
    return p;
  }

  private save(): void {
    this.savedSeg = this.seg;
    this.savedPos = this.pos;
    this.savedEnd = this.end;
  }

  private restore(): void {
    this.seg = this.savedSeg;
    this.pos = this.savedPos;
    this.end = this.savedEnd;
  }

  /**
   * Moves the cursor to `to`, past what was read. Called per token, so the common path of a
   * statement (its keyword, name and colon, each property's key, number and unit) writes these two
   * lines out instead: a call costs the interpreter more than they do.
   */
  private consume(to: number): void {
    this.pos = to;
    if (to > this.lastEnd) this.lastEnd = to;
  }

  private span(start: number, end: number): Span {
    return { start, end };
  }

  private report(code: SyntaxCode, message: string, start: number, end: number): void {
    this.diagnostics.push({ code, severity: 'error', message, span: { start, end: Math.max(start, end) } });
  }

  /** Skips the rest of the statement (after an error that leaves nothing sensible to read). */
  private skipRest(): void {
    for (;;) {
      if (this.peek() < 0) return;
      this.consume(this.rawTokenEnd());
    }
  }

  // --- statements ---------------------------------------------------------------------------

  private statement(): Statement | null {
    if (this.peek() < 0) return null;
    const start = this.pos;
    // The run of letters, as its word code (`keywordAt`'s reading, in the same pass).
    let p = start;
    let code = 0;
    while (p < this.end) {
      const c = this.text.charCodeAt(p);
      // `isAsciiLetter` and `wordCodeStep`, written out.
      if (((c | 0x20) - 0x61) >>> 0 >= 26) break;
      code = code * 64 + (c - 0x40);
      p++;
    }
    const after = p < this.end ? this.text.charCodeAt(p) : -1; // `charAt`, written out
    // The common statement's keyword is compared here, without a call (its code is the first).
    const keyword =
      after === 0x20 || after < 0 || after === 0x3a || isWs(after)
        ? code === STATE_CODE
          ? 'state'
          : keywordOfCode(code)
        : null;
    if (!keyword) {
      const tokenEnd = this.rawTokenEnd();
      let e = start;
      while (e < tokenEnd && this.text.charCodeAt(e) !== 0x3a) e++;
      if (e === start) e = tokenEnd;
      const shown = this.text.slice(start, e);
      this.report('unknown-keyword', `unknown statement '${shown}': ${keywordAdvice(shown)}`, start, e);
      this.skipRest();
      return null;
    }
    this.pos = p; // `consume`, written out on the common path
    if (p > this.lastEnd) this.lastEnd = p;
    // The common statement makes no keyword span (its node derives it from the statement's start).
    if (keyword === 'state') return this.state(start, p);
    const keywordSpan = this.span(start, p);
    switch (keyword) {
      case 'site':
        return this.site(keywordSpan);
      case 'units':
        return this.units(keywordSpan);
      case 'mix':
        return this.mix(keywordSpan);
      case 'process':
        return this.process(keywordSpan);
      case 'supply':
        return this.supply(keywordSpan);
      case 'recover':
        return this.recover(keywordSpan);
    }
  }

  private stmtSpan(keywordSpan: Span): Span {
    return { start: keywordSpan.start, end: Math.max(keywordSpan.end, this.lastEnd) };
  }

  /**
   * The span of a statement from `start` (its keyword's, which ends at `keywordEnd`) to its last
   * token: the piece it was read from when that is exactly the statement (a fence line without
   * indentation, trailing blanks or a comment), else a new span. Spans are never changed in place,
   * so the line and the statement can share one.
   */
  private sharedStmtSpan(start: number, keywordEnd: number): Span {
    const end = Math.max(keywordEnd, this.lastEnd);
    const piece = this.segs.length === 1 ? this.segs[0] : undefined;
    return piece !== undefined && piece.start === start && piece.end === end ? piece : { start, end };
  }

  private site(keywordSpan: Span): SiteStatement {
    this.colon('site', null, keywordSpan.start);
    const props = this.props();
    return { keyword: 'site', keywordSpan, origin: this.origin, span: this.stmtSpan(keywordSpan), props };
  }

  private units(keywordSpan: Span): UnitsStatement {
    this.colon('units', null, keywordSpan.start);
    let system: NameNode | null = null;
    if (this.peek() < 0) {
      this.report(
        'missing-value',
        "'units:' needs a unit system: write 'units: SI' or 'units: IP'",
        keywordSpan.start,
        this.lastEnd,
      );
    } else {
      const start = this.pos;
      const end = this.rawTokenEnd();
      this.consume(end);
      system = { text: this.text.slice(start, end), span: this.span(start, end) };
      if (this.peek() >= 0) {
        const extraStart = this.pos;
        this.skipRest();
        this.report(
          'syntax',
          `unexpected '${this.text.slice(extraStart, this.lastEnd)}' ` +
            `after the unit system: 'units:' takes one word, SI or IP`,
          extraStart,
          this.lastEnd,
        );
      }
    }
    return { keyword: 'units', keywordSpan, origin: this.origin, span: this.stmtSpan(keywordSpan), system };
  }

  private state(start: number, keywordEnd: number): StateStatement {
    const name = this.definedName('state', start, keywordEnd);
    this.colon('state', name, start, !name);
    const props = this.props();
    return new ParsedState(this.origin, this.sharedStmtSpan(start, keywordEnd), name, props);
  }

  private mix(keywordSpan: Span): MixStatement {
    const name = this.definedName('mix', keywordSpan.start, keywordSpan.end);
    this.colon('mix', name, keywordSpan.start, !name);
    const streams = this.streams(keywordSpan, name?.text ?? 'MA');
    const props = this.props();
    return { keyword: 'mix', keywordSpan, origin: this.origin, span: this.stmtSpan(keywordSpan), name, streams, props };
  }

  private process(keywordSpan: Span): ProcessStatement {
    const name = this.definedName('process', keywordSpan.start, keywordSpan.end, 'process CC: MA -> SA q=4.8m3/s');
    const self = name?.text ?? 'CC';
    this.colon('process', name, keywordSpan.start, !name);
    // Without an arrow, a following name is still read as the leaving state (the arrow is reported).
    const { from, to } = this.arrowPair(keywordSpan, (f) => `process ${self}: ${f ?? 'MA'} -> SA`);
    const words: NameNode[] = [];
    const props = this.props(words);
    return {
      keyword: 'process',
      keywordSpan,
      origin: this.origin,
      span: this.stmtSpan(keywordSpan),
      name,
      from,
      to,
      props,
      words,
    };
  }

  /** `A -> B` of a process or a recover stream: the two names (null where missing, reported). */
  private arrowPair(
    keywordSpan: Span,
    example: (from: string | null) => string,
  ): { from: NameNode | null; to: NameNode | null } {
    const from = this.referencedName('the entering state', example(null), keywordSpan);
    let arrow = false;
    const c = this.peek();
    if (c >= 0 && this.isArrowAt(this.pos)) {
      this.consume(this.pos + (c === 0x2192 ? 1 : 2));
      arrow = true;
    } else if (c === 0x3d && this.charAt(this.pos + 1) === 0x3e) {
      this.report('syntax', "write the arrow as '->' (or '→'), not '=>'", this.pos, this.pos + 2);
      this.consume(this.pos + 2);
      arrow = true;
    } else if (from || this.nameAhead()) {
      const at = c >= 0 ? this.pos : this.lastEnd;
      this.report(
        'syntax',
        `missing '->' between the two states: write ${example(from?.text ?? null)}`,
        from ? from.span.start : at,
        from ? from.span.end : at,
      );
    }
    const to =
      arrow || this.nameAhead()
        ? this.referencedName("the leaving state after '->'", example(from?.text ?? null), keywordSpan)
        : null;
    return { from, to };
  }

  private recover(keywordSpan: Span): RecoverStatement {
    const name = this.definedName('recover', keywordSpan.start, keywordSpan.end);
    const self = name?.text ?? 'HX';
    this.colon('recover', name, keywordSpan.start, !name);
    const streams: RecoverStream[] = [];
    const props: PropertyNode[] = [];
    const options: WordPropertyNode[] = [];
    for (let k = 0; k < 2; k++) {
      const start = this.peek() >= 0 ? this.pos : this.lastEnd;
      const example =
        k === 0
          ? (f: string | null) => `recover ${self}: ${f ?? 'OA'} -> OA2, EA -> EA2 eff_s=0.70`
          : (f: string | null) => `recover ${self}: OA -> OA2, ${f ?? 'EA'} -> EA2 eff_s=0.70`;
      const { from, to } = this.arrowPair(keywordSpan, example);
      const own = this.props(null, true, options);
      props.push(...own);
      streams.push({ from, to, props: own, span: this.span(start, Math.max(start, this.lastEnd)) });
      if (k === 0) {
        if (this.peek() === 0x2c) {
          this.consume(this.pos + 1);
        } else {
          const at = this.peek() >= 0 ? this.pos : this.lastEnd;
          this.report(
            'syntax',
            `a recover statement takes two streams separated by a comma: write ${headExample('recover', name)}`,
            at,
            at,
          );
          break;
        }
      }
    }
    // Anything after the second stream's properties (a third stream, a stray comma) is not read.
    if (this.peek() >= 0) {
      const extraStart = this.pos;
      this.skipRest();
      this.report(
        'syntax',
        `unexpected '${this.text.slice(extraStart, this.lastEnd)}': a recover ` +
          `statement takes exactly two streams, OA -> OA2, EA -> EA2, then its properties`,
        extraStart,
        this.lastEnd,
      );
    }
    return {
      keyword: 'recover',
      keywordSpan,
      origin: this.origin,
      span: this.stmtSpan(keywordSpan),
      name,
      streams,
      props,
      options,
    };
  }

  private supply(keywordSpan: Span): SupplyStatement {
    const name = this.definedName('supply', keywordSpan.start, keywordSpan.end);
    this.colon('supply', name, keywordSpan.start, !name);
    const room = this.referencedName('the room state the supply serves', headExample('supply', name), keywordSpan);
    const props = this.props();
    return { keyword: 'supply', keywordSpan, origin: this.origin, span: this.stmtSpan(keywordSpan), name, room, props };
  }

  /**
   * `:` after the statement head (`keyword` and its `name`, from `headStart` to the cursor);
   * reported on the head, not consumed, when missing — unless `quiet` (the missing name was
   * reported and properties follow).
   */
  private colon(keyword: Keyword, name: NameNode | null, headStart: number, quiet = false): void {
    const headEnd = this.lastEnd;
    const c = this.peek();
    if (c === 0x3a) {
      const afterColon = this.pos + 1;
      this.pos = afterColon; // `consume`, written out on the common path
      if (afterColon > this.lastEnd) this.lastEnd = afterColon;
      return;
    }
    if (quiet && (c < 0 || this.keyAhead())) return;
    const head = name ? `${keyword} ${name.text}` : keyword;
    this.report(
      'missing-colon',
      `missing ':' after '${head}': write ${headExample(keyword, name)}`,
      headStart,
      headEnd,
    );
  }

  // --- names --------------------------------------------------------------------------------

  /**
   * End of the name-like token at the cursor (not checked): the token is `text[pos, nameTokenEnd())`.
   * The same reading of its characters tells {@link nameTokenPlain} and {@link nameTokenKeyEnd}.
   */
  private nameTokenEnd(): number {
    const text = this.text;
    const start = this.pos;
    let p = start;
    let keyEnd = -1;
    // The classes of the first character (`isAsciiLetter`, `isKeyStart`), written out.
    const first = p < this.end ? text.charCodeAt(p) : -1;
    const firstIsLetter = ((first | 0x20) - 0x61) >>> 0 < 26;
    let plain = firstIsLetter;
    while (p < this.end) {
      const c = text.charCodeAt(p);
      // `isKeyChar`, written out.
      if (((c | 0x20) - 0x61) >>> 0 < 26 || (c - 0x30) >>> 0 < 10 || c === 0x5f) {
        p++;
        continue;
      }
      if (keyEnd < 0) keyEnd = p;
      // (The usual end of a name, the colon of its statement, is tested first.)
      if (c === 0x3a || isWs(c) || c === 0x3d || c === 0x23 || c === 0x2c || c === 0x2b || c === 0xb1 || c === 0x2192)
        break;
      if (c === 0x2d) {
        if (this.charAt(p + 1) === 0x3e) break;
      } else {
        plain = false;
      }
      p++;
    }
    this.nameTokenPlain = plain;
    this.nameTokenKeyEnd = p > start && (firstIsLetter || first === 0x5f) ? (keyEnd < 0 ? p : keyEnd) : -1;
    return p;
  }

  /**
   * Whether a `key=` starts at the token {@link nameTokenEnd} just read (ending at `end`), as
   * {@link keyAhead} tells, without reading the token again: a key is the token's first run of key
   * characters, and is followed by `=` only when that run is the whole token (the token ends
   * before any space or `=`).
   */
  private keyAtNameToken(end: number): boolean {
    if (this.nameTokenKeyEnd !== end) return false;
    const p = this.spacesEnd(end);
    return this.charAt(p) === 0x3d && this.charAt(p + 1) !== 0x3e; // `=>` is a mistyped arrow
  }

  /**
   * The name `text[start, end)` that {@link nameTokenEnd} just read, checked: a token of ASCII
   * letters, digits, `_` and `-` that starts with a letter was found to keep the naming rule by
   * that reading; any other goes through {@link checkName}.
   */
  private checkedName(start: number, end: number): NameNode | null {
    if (!this.nameTokenPlain) return this.checkName(start, end);
    return { text: this.text.slice(start, end), span: { start, end } };
  }

  /** Checks the name `text[start, end)`: null (and a `bad-name` diagnostic) when it breaks the naming rule. */
  private checkName(start: number, end: number): NameNode | null {
    const text = this.text;
    const first = letterAt(text, start, end);
    let problem: string | null = null;
    if (first === 0) {
      problem = isDigit(text.charCodeAt(start))
        ? 'a name starts with a letter'
        : `a name cannot start with '${String.fromCodePoint(text.codePointAt(start) ?? 0)}'`;
    } else {
      let p = start + first;
      while (p < end) {
        const c = text.charCodeAt(p);
        if (isDigit(c) || c === 0x5f || c === 0x2d) {
          p++;
          continue;
        }
        const l = letterAt(text, p, end);
        if (l === 0) {
          problem = `a name cannot contain '${String.fromCodePoint(text.codePointAt(p) ?? 0)}'`;
          break;
        }
        p += l;
      }
    }
    if (problem) {
      this.report(
        'bad-name',
        `'${text.slice(start, end)}' is not a valid name: ${problem}; ` +
          `use a letter, then letters, digits, '_' or '-' (e.g. AHU-1_off)`,
        start,
        end,
      );
      return null;
    }
    return { text: text.slice(start, end), span: this.span(start, end) };
  }

  /** Whether a `key=` (with optional spaces before `=`, but not `=>`) starts at the cursor. */
  private keyAhead(): boolean {
    if (this.peek() < 0 || !isKeyStart(this.text.charCodeAt(this.pos))) return false;
    let p = this.pos + 1;
    while (p < this.end && isKeyChar(this.text.charCodeAt(p))) p++;
    p = this.spacesEnd(p);
    return this.charAt(p) === 0x3d && this.charAt(p + 1) !== 0x3e; // `=>` is a mistyped arrow
  }

  /** End of the run of spaces and tabs from `p` in the current piece (each character read once). */
  private spacesEnd(p: number): number {
    while (p < this.end) {
      const c = this.text.charCodeAt(p);
      if (c !== 0x20 && c !== 0x09) break;
      p++;
    }
    return p;
  }

  /** Whether the word `rest` (a stream's remainder) is at the cursor, as a word of its own. */
  private restAhead(): boolean {
    if (this.text.slice(this.pos, this.pos + 4) !== 'rest') return false;
    const c = this.charAt(this.pos + 4);
    return c < 0 || isWs(c) || c === 0x2b || c === 0x23;
  }

  /** Whether a name-like token (not a `key=`) starts at the cursor. */
  private nameAhead(): boolean {
    const c = this.peek();
    if (c < 0 || c === 0x3a || c === 0x3d || c === 0x2b || c === 0x2c || c === 0xb1 || this.isArrowAt(this.pos))
      return false;
    if (startsNumber(this.text, this.pos, this.end)) return false;
    return !this.keyAhead();
  }

  /**
   * The name after the keyword; `example` is the statement written out for messages (made only
   * for a message: by default the keyword's {@link headExample}).
   */
  private definedName(keyword: Keyword, keywordStart: number, keywordEnd: number, example?: string): NameNode | null {
    const c = this.peek();
    const start = this.pos;
    const end = c < 0 || c === 0x3a ? start : this.nameTokenEnd();
    // A name followed by its colon, the common case, is no `key=` (asked without a call).
    const colonAfter = end < this.end && this.text.charCodeAt(end) === 0x3a;
    if (c < 0 || c === 0x3a || (!colonAfter && this.keyAtNameToken(end))) {
      const at = c === 0x3a ? this.pos : keywordStart;
      const endAt = c === 0x3a ? this.pos + 1 : keywordEnd;
      this.report(
        'missing-name',
        `'${keyword}' needs a name before ':': write ${example ?? headExample(keyword, null)}`,
        at,
        endAt,
      );
      return null;
    }
    if (end === start) {
      const rawEnd = this.rawTokenEnd();
      this.consume(rawEnd);
      this.report(
        'bad-name',
        `'${this.text.slice(start, rawEnd)}' is not a valid name: use ` +
          `a letter, then letters, digits, '_' or '-' (e.g. ${example ?? headExample(keyword, null)})`,
        start,
        rawEnd,
      );
      return null;
    }
    this.pos = end; // `consume`, written out on the common path
    if (end > this.lastEnd) this.lastEnd = end;
    return this.checkedName(start, end);
  }

  /** A state named in a mix stream or a process. */
  private referencedName(role: string, example: string, keywordSpan: Span): NameNode | null {
    if (!this.nameAhead()) {
      const c = this.peek();
      const at = c >= 0 ? this.pos : Math.max(keywordSpan.end, this.lastEnd);
      this.report('missing-name', `${role} is missing: write ${example}`, at, c >= 0 ? this.rawTokenEnd() : at);
      return null;
    }
    const start = this.pos;
    const end = this.nameTokenEnd();
    if (end === start) return null;
    this.consume(end);
    return this.checkedName(start, end);
  }

  // --- mix streams ----------------------------------------------------------------------------

  private streams(keywordSpan: Span, mixName: string): MixStream[] {
    const streams: MixStream[] = [];
    const example = 'OA 25% + RA 75%';
    let expectStream = true;
    let plusAt = -1;
    for (;;) {
      const c = this.peek();
      if (c < 0 || this.keyAhead()) break;
      if (!expectStream) {
        if (c === 0x2b && this.charAt(this.pos + 1) !== 0x2d) {
          plusAt = this.pos;
          this.consume(this.pos + 1);
          expectStream = true;
          continue;
        }
        if (this.nameAhead() && letterAt(this.text, this.pos, this.end) > 0) {
          const end = this.nameTokenEnd();
          const shown = this.text.slice(this.pos, end);
          this.report('syntax', `missing '+' before the stream '${shown}': write ${example}`, this.pos, end);
          expectStream = true;
          continue;
        }
        break;
      }
      // A stream: NAME AMOUNT.
      const streamStart = this.pos;
      let name: NameNode | null = null;
      if (startsNumber(this.text, this.pos, this.end)) {
        this.report(
          'missing-name',
          `a stream starts with the name of a state: write ${example}`,
          this.pos,
          this.rawTokenEnd(),
        );
      } else if (this.nameAhead()) {
        const end = this.nameTokenEnd();
        if (end === streamStart) break;
        this.consume(end);
        name = this.checkedName(streamStart, end);
      } else {
        break;
      }
      let amount: QuantityNode | null = null;
      let rest: Span | null = null;
      if (this.peek() >= 0 && startsNumber(this.text, this.pos, this.end)) {
        amount = this.quantity('stream');
      } else if (this.peek() >= 0 && this.restAhead()) {
        // `RA rest`: the remainder of total= (or of 100 % with fractions).
        rest = this.span(this.pos, this.pos + 4);
        this.consume(this.pos + 4);
      } else if (name) {
        this.report(
          'missing-value',
          `the stream '${name.text}' has no amount: write a dry-air mass fraction, a mass flow ` +
            `or a volume flow, e.g. ${name.text} 25%, ${name.text} 1.2kg/s or ${name.text} 1000L/s`,
          name.span.start,
          name.span.end,
        );
      }
      if (name && rest) streams.push({ name, amount, span: this.span(streamStart, rest.end), rest });
      else if (name)
        streams.push({ name, amount, span: this.span(streamStart, Math.max(name.span.end, amount?.span.end ?? 0)) });
      expectStream = false;
      plusAt = -1;
    }
    if (expectStream && plusAt >= 0) {
      this.report('missing-name', `'+' must be followed by another stream: write ${example}`, plusAt, plusAt + 1);
    } else if (streams.length === 0 && expectStream) {
      const at = this.lastEnd;
      this.report(
        'missing-value',
        `the mix has no streams: write mix ${mixName}: ${example}`,
        keywordSpan.start,
        Math.max(at, keywordSpan.end),
      );
    }
    return streams;
  }

  // --- properties -----------------------------------------------------------------------------

  /**
   * `key=value …` to the end of the statement. `words` collects bare words (`steam`) instead of
   * reporting them; `stopAtComma` ends the list at a comma (a recover's first stream); `options`
   * collects `key=word` (`fog=ok`) instead of reporting the word as a bad number.
   *
   * The properties are collected on the parser's scratch stack ({@link StatementParser.propStack})
   * and copied out at the end into a list of exactly their number: one array per list, none grown.
   */
  private props(
    words: NameNode[] | null = null,
    stopAtComma = false,
    options: WordPropertyNode[] | null = null,
  ): PropertyNode[] {
    const stack = this.propStack;
    const base = this.propTop;
    for (;;) {
      const c = this.peek();
      if (c < 0) break;
      const start = this.pos;
      if (c === 0x2c && stopAtComma) break;
      if (c === 0x2c) {
        this.report('syntax', 'separate properties with spaces, not commas: write db=24C rh=50%', start, start + 1);
        this.consume(start + 1);
        continue;
      }
      if (c === 0x3d) {
        this.consume(start + 1);
        const valueEnd = this.peek() >= 0 && !this.keyAhead() ? this.rawTokenEnd() : -1;
        if (valueEnd >= 0) this.consume(valueEnd);
        this.report(
          'syntax',
          "'=' without a key before it: write key=value, e.g. rh=50%",
          start,
          valueEnd >= 0 ? valueEnd : start + 1,
        );
        continue;
      }
      // `isKeyStart`, written out (see the character classes).
      if (((c | 0x20) - 0x61) >>> 0 < 26 || c === 0x5f) {
        const text = this.text;
        // The key, packed for the intern table as it is read (key characters are ASCII; the pack
        // step is written out, as in the loop below).
        let pack = PACK_START * 256 + c;
        let p = start + 1;
        // `k` is the character at `p` (-1 at the end of the piece): each is read once.
        let k = -1;
        while (p < this.end) {
          k = text.charCodeAt(p);
          // `isKeyChar` and `packStep`, written out.
          if (((k | 0x20) - 0x61) >>> 0 >= 26 && (k - 0x30) >>> 0 >= 10 && k !== 0x5f) break;
          pack = pack * 256 + k;
          p++;
        }
        if (p >= this.end) k = -1;
        const keyEnd = p;
        while (k === 0x20 || k === 0x09) {
          p++;
          k = p < this.end ? text.charCodeAt(p) : -1;
        }
        if (k === 0x3d) {
          const key = internedPackedSlice(text, start, keyEnd, pack, 0);
          const valueStart = p + 1;
          this.pos = valueStart; // `consume`, written out on the common path
          if (valueStart > this.lastEnd) this.lastEnd = valueStart;
          const word = options ? this.wordValue() : null;
          if (word) {
            options!.push({ key, keySpan: this.span(start, keyEnd), word, span: this.span(start, word.span.end) });
            continue;
          }
          // The character right after `=`, the value's first unless blanks come between: a digit
          // (the usual case) needs no call to `peek`, which would answer the same.
          let v = valueStart < this.end ? text.charCodeAt(valueStart) : -1;
          if ((v - 0x30) >>> 0 >= 10) v = this.peek();
          // A digit starts a number: the usual case needs no call.
          if ((v - 0x30) >>> 0 < 10 || (v >= 0 && startsNumber(text, this.pos, this.end))) {
            // The usual value, a number: decided by its first character, which is all that
            // `propertyRef` (a reference starts with a letter) and `value` (a missing value is
            // an end, a comma or a `key=`) would look at before reading it as {@link quantity}.
            const value = this.quantity('prop', key);
            stack[this.propTop++] = new ParsedProperty(key, value, start, value ? this.quantityEnd : p + 1);
            continue;
          }
          const ref = this.propertyRef(key);
          if (ref === 'reported') {
            stack[this.propTop++] = new ParsedProperty(key, null, start, this.lastEnd);
            continue;
          }
          if (ref) {
            const prop = new ParsedProperty(key, null, start, ref.span.end);
            prop.ref = ref;
            stack[this.propTop++] = prop;
            continue;
          }
          // Neither a number nor a reference: reported as a missing value or not a number.
          this.unusableValue(key, start);
          stack[this.propTop++] = new ParsedProperty(key, null, start, p + 1);
          continue;
        }
        const afterKey = this.charAt(keyEnd);
        if (keyEnd < this.end && !isWs(afterKey) && afterKey !== 0x23) {
          // Something glued to the word that is not '=': report the whole token.
          const tokenEnd = this.rawTokenEnd();
          this.consume(tokenEnd);
          const shown = this.text.slice(start, tokenEnd);
          this.report('syntax', `'${shown}' is not a property: write key=value, e.g. db=24C`, start, tokenEnd);
          continue;
        }
        const key = internedPackedSlice(text, start, keyEnd, pack, 0);
        this.consume(keyEnd);
        if (this.peek() >= 0 && startsNumber(this.text, this.pos, this.end)) {
          // `rh 50%`: the '=' is missing; read the value all the same.
          this.report(
            'syntax',
            `missing '=' after '${key}': write ${key}=${this.text.slice(this.pos, this.rawTokenEnd())}`,
            start,
            keyEnd,
          );
          const value = this.quantity('prop');
          stack[this.propTop++] = new ParsedProperty(key, value, start, value ? value.end : keyEnd);
          continue;
        }
        if (words) {
          words.push({ text: key, span: this.span(start, keyEnd) });
          continue;
        }
        this.report('syntax', `'${key}' is not a property: write key=value, e.g. db=24C`, start, keyEnd);
        continue;
      }
      const tokenEnd = this.rawTokenEnd();
      this.consume(tokenEnd);
      this.report(
        'syntax',
        `unexpected '${this.text.slice(start, tokenEnd)}': expected key=value, e.g. db=24C`,
        start,
        tokenEnd,
      );
    }
    // The tree keeps an exact copy (a note's statements stay in memory while it is open, or until
    // the command line's output is written); the scratch entries are left to be overwritten.
    const props = exactList(stack, base, this.propTop);
    this.propTop = base;
    return props;
  }

  /** A value that is a plain word of letters (`ok` in `fog=ok`), consumed; null (nothing consumed) otherwise. */
  private wordValue(): NameNode | null {
    const c = this.peek();
    if (c < 0 || !isAsciiLetter(c)) return null;
    let p = this.pos;
    while (p < this.end && isAsciiLetter(this.text.charCodeAt(p))) p++;
    const next = this.charAt(p);
    if (p < this.end && !isWs(next) && next !== 0x23 && next !== 0x2c) return null;
    const start = this.pos;
    this.consume(p);
    return { text: this.text.slice(start, p), span: this.span(start, p) };
  }

  /**
   * Reports the value after `key=` that is neither a number nor a reference (those are read
   * before this is called): a missing value, or a word that is not a number (consumed).
   */
  private unusableValue(key: string, keyStart: number): void {
    const eq = this.lastEnd;
    const c = this.peek();
    if (c < 0 || c === 0x2c || this.keyAhead()) {
      this.report(
        'missing-value',
        `'${key}=' has no value: write a number with its unit, e.g. ${exampleFor(key)}`,
        keyStart,
        eq,
      );
      return;
    }
    const tStart = this.pos;
    const tEnd = this.rawTokenEnd();
    this.consume(tEnd);
    const word = this.text.slice(tStart, tEnd);
    const lower = word.toLowerCase().replace(/^[+\-−]/, '');
    const why =
      lower === 'nan' || lower.startsWith('inf') ? `'${word}' is not a finite number` : `'${word}' is not a number`;
    const nameLike = letterAt(this.text, tStart, tEnd) > 0 && !/[.=]/.test(word);
    const orRef = nameLike ? `, or another state's property: ${key}=${word}.${referenceKeyFor(key)}` : '';
    this.report(
      'bad-number',
      `${why}: write ${key}= followed by a decimal number and its unit, e.g. ${exampleFor(key)}${orRef}`,
      tStart,
      tEnd,
    );
  }

  /**
   * `NAME.KEY[+DIFFERENCE]` at the cursor, right after `key=`: another state's property, optionally
   * shifted by a signed difference. Null when the value is not written as a reference (a name
   * followed by a dot); `'reported'` when a malformed reference was reported and skipped.
   */
  private propertyRef(key: string): PropertyRefNode | 'reported' | null {
    if (this.peek() < 0) return null;
    const start = this.pos;
    const first = letterAt(this.text, start, this.end);
    if (first === 0) return null;
    let p = start + first;
    while (p < this.end) {
      const c = this.text.charCodeAt(p);
      if (isDigit(c) || c === 0x5f || c === 0x2d) {
        p++;
        continue;
      }
      const l = letterAt(this.text, p, this.end);
      if (l === 0) break;
      p += l;
    }
    if (this.charAt(p) !== 0x2e) return null;
    const state: NameNode = { text: this.text.slice(start, p), span: this.span(start, p) };
    const keyStart = p + 1;
    let q = keyStart;
    if (q < this.end && isKeyStart(this.text.charCodeAt(q))) {
      q++;
      while (q < this.end && isKeyChar(this.text.charCodeAt(q))) q++;
    }
    if (q === keyStart) {
      const tStart = this.pos;
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'missing-value',
        `'${this.text.slice(tStart, tEnd)}' names no property after the dot: ` +
          `write ${key}=${state.text}.${referenceKeyFor(key)} (a property of ${state.text})`,
        tStart,
        tEnd,
      );
      return 'reported';
    }
    this.consume(q);
    const refKey = { text: this.text.slice(keyStart, q), span: this.span(keyStart, q) };
    let offset: QuantityNode | null = null;
    const c = this.charAt(q);
    if ((c === 0x2b || c === 0x2d || c === 0x2212) && startsNumber(this.text, q, this.end)) {
      offset = this.quantity('prop', key);
      if (!offset) return 'reported'; // a malformed number
    } else if (c === 0x2b || c === 0x2d || c === 0x2212) {
      // `OA.db+` or `OA.db+x`: a sign without a number.
      const tStart = this.pos;
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'missing-value',
        `'${this.text.slice(tStart, tEnd)}' needs a difference after the sign: ` +
          `write ${key}=${state.text}.${refKey.text}+${differenceExample(refKey.text)} ` +
          `(+ or − a difference with its unit)`,
        tStart,
        tEnd,
      );
      return 'reported';
    }
    const end = offset ? offset.span.end : q;
    // Glued on: the cursor is still where the reference ends (a quantity leaves it at the next
    // token, past any blanks) on a character that is neither a blank nor a comment.
    const after = this.charAt(this.pos);
    if (this.pos === end && this.pos < this.end && !isWs(after) && after !== 0x23) {
      // Something glued on (`OA.w*2`, `OA.w.x`): only + or − a difference may follow.
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'syntax',
        `'${this.text.slice(start, tEnd)}' is not a property reference: ` +
          `write ${state.text}.${refKey.text}, or add or subtract a difference with its unit ` +
          `(${state.text}.${refKey.text}+${differenceExample(refKey.text)}); no other arithmetic`,
        start,
        tEnd,
      );
      return 'reported';
    }
    return { state, key: refKey, offset, span: this.span(start, end) };
  }

  /** NUMBER[UNIT][±NUMBER[UNIT]] at the cursor (which starts a number). */
  private quantity(context: 'prop' | 'stream', key?: string): ParsedQuantity | null {
    const number = this.number(key);
    if (!number) return null;
    // What is written apart from the number (reported) is read by methods of its own, out of this
    // one, which stays short enough for the engine to compile it into its callers.
    // The scan of the number read the character after it: the unit's first, if there is one.
    const unit = this.attachedUnit(this.scanned.next) ?? this.detachedUnitNode(number, context);
    // The next significant character, read once: a tolerance sign right here (`24C±0.5`) or after
    // blanks (`24C ±0.5`, reported); anything else is the next token, where the cursor is left for
    // the caller (which would skip the same blanks to read it).
    const partEnd = this.pos;
    const c = this.peek();
    let tolerance: ToleranceNode | null = null;
    if (c === 0xb1 || (c === 0x2b && this.charAt(this.pos + 1) === 0x2d)) {
      tolerance = this.pos === partEnd ? this.tolerance() : this.detachedTolerance(number, unit);
    }
    this.quantityEnd = tolerance ? tolerance.span.end : partEnd;
    return new ParsedQuantity(number, unit, tolerance);
  }

  /** A unit written apart from its number (`24 C`), reported and consumed; null when none is. */
  private detachedUnitNode(number: ParsedNumber, context: 'prop' | 'stream'): ParsedUnit | null {
    const detachedEnd = this.detachedUnit(context);
    if (detachedEnd < 0) return null;
    // The cursor is at the unit's start.
    const detachedStart = this.pos;
    const written = internedSlice(this.text, detachedStart, detachedEnd);
    this.report(
      'value-spacing',
      `write the unit directly after the number, e.g. ${number.text}${written} (no space)`,
      number.at,
      detachedEnd,
    );
    this.consume(detachedEnd);
    return new ParsedUnit(written, detachedStart);
  }

  /** A tolerance written after blanks (`24C ±0.5`; the cursor is at its sign), reported and read. */
  private detachedTolerance(number: ParsedNumber, unit: ParsedUnit | null): ToleranceNode | null {
    const at = this.pos;
    const written = `${number.text}${unit?.text ?? ''}`;
    const tolerance = this.tolerance();
    this.report(
      'value-spacing',
      `write the tolerance directly after the value, ` +
        `e.g. ${written}${this.text.slice(at, this.lastEnd).replace(/\s+/g, '')} (no space)`,
      at,
      this.lastEnd,
    );
    return tolerance;
  }

  /** A number at the cursor; null (with a `bad-number` diagnostic, token skipped) when malformed. */
  private number(key?: string): ParsedNumber | null {
    const start = this.pos;
    const n = scanNumber(this.text, start, this.end, this.scanned);
    const next = n.next;
    const value = n.value;
    const resolution = n.resolution;
    // One test for anything that may be wrong; the messages are in `numberProblem`, out of this
    // method, which stays short enough for the engine to compile it into its callers.
    if (
      next === 0x2c ||
      next === 0x2e ||
      (next - 0x30) >>> 0 < 10 || // `isDigit`, written out
      !Number.isFinite(value) ||
      !Number.isFinite(resolution)
    ) {
      if (this.numberProblem(start, n.end, next, value, resolution, key)) return null;
    }
    const numberEnd = n.end;
    this.pos = numberEnd; // `consume`, written out on the common path
    if (numberEnd > this.lastEnd) this.lastEnd = numberEnd;
    return new ParsedNumber(value, n.written, resolution, start);
  }

  /**
   * Reports what is wrong with the number scanned from `start` to `end` (followed by `next`, with
   * this value and resolution) and skips its token; false, with nothing done, when it is fine
   * after all (a comma that is not followed by a digit ends the number).
   */
  private numberProblem(
    start: number,
    end: number,
    next: number,
    value: number,
    resolution: number,
    key: string | undefined,
  ): boolean {
    if (next === 0x2c && isDigit(this.charAt(end + 1))) {
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      const shown = this.text.slice(start, tEnd);
      this.report('bad-number', commaMessage(shown), start, tEnd);
      return true;
    }
    if (next === 0x2e || isDigit(next)) {
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'bad-number',
        `'${this.text.slice(start, tEnd)}' is not a number: write ` +
          `one decimal number,${numberExample(key, ' e.g. 24.5')}`,
        start,
        tEnd,
      );
      return true;
    }
    if (!Number.isFinite(value)) {
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'bad-number',
        `'${this.text.slice(start, end)}' is too large: write a finite number,${numberExample(key, ' e.g. 1.2e3')}`,
        start,
        tEnd,
      );
      return true;
    }
    if (!Number.isFinite(resolution)) {
      // A finite value with a huge exponent (0e400): its last digit stands for more than a double holds.
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'bad-number',
        `'${this.text.slice(start, end)}' has an exponent too large to compute ` +
          `with: write the number without it,${numberExample(key, ' e.g. 0')}`,
        start,
        tEnd,
      );
      return true;
    }
    return false;
  }

  /**
   * End of the unit written directly at `pos` (`pos` itself when there is none): the run of
   * characters up to one that ends a unit (and any token of a value), a blank, `#`, `+`, `,`, `=`
   * or `±`. The test is split at `=` (the highest ASCII one of them) so that a letter of a unit is
   * answered in a few comparisons. {@link attachedUnit}, which reads nearly every unit of a note,
   * makes the same test in its own loop (packing the unit for the intern table as it goes).
   */
  private unitEnd(pos: number): number {
    const text = this.text;
    let p = pos;
    let c = this.charAt(pos);
    while (
      c > 0x3d
        ? c !== 0xb1 && c !== 0xa0 && c !== 0xfeff
        : c >= 0 && c !== 0x20 && (c < 0x09 || c > 0x0d) && c !== 0x23 && c !== 0x2b && c !== 0x2c && c !== 0x3d
    ) {
      p++;
      c = p < this.end ? text.charCodeAt(p) : -1;
    }
    return p;
  }

  /**
   * A unit separated from its number by spaces (`24 C`): a token that looks like a unit, is not a
   * `key=` and (in a mix) is not the next stream's name followed by its amount. Returns the
   * unit's end with the cursor moved to its start, or -1 with the cursor unchanged.
   */
  private detachedUnit(context: 'prop' | 'stream'): number {
    this.save();
    const from = this.pos;
    const c = this.peek();
    if (c < 0 || this.pos === from) {
      this.restore();
      return -1;
    }
    const startsLikeUnit =
      c === 0x25 ||
      c === 0xb0 ||
      c === 0xb5 ||
      c === 0x3bc ||
      c === 0x2030 ||
      letterAt(this.text, this.pos, this.end) > 0;
    if (!startsLikeUnit || this.keyAhead() || this.isArrowAt(this.pos)) {
      this.restore();
      return -1;
    }
    const uStart = this.pos;
    const uEnd = this.unitEnd(uStart);
    if (uEnd === uStart) {
      this.restore();
      return -1;
    }
    // What follows the candidate: a number means it was a name or key with its value.
    this.pos = uEnd;
    const next = this.peek();
    const followedByNumber = next >= 0 && startsNumber(this.text, this.pos, this.end);
    const followedByEq = next === 0x3d;
    this.restore();
    if (followedByNumber || followedByEq) return -1;
    if (context === 'stream' && keywordAt(this.text, uStart, uEnd) !== null) return -1;
    // Make the cursor point at the candidate for the caller.
    this.peek();
    if (this.pos !== uStart) {
      this.restore();
      return -1;
    }
    return uEnd;
  }

  /** Length of a tolerance sign at `pos` (`±` → 1, `+-` → 2), or 0. */
  private toleranceAt(pos: number): number {
    const c = this.charAt(pos);
    if (c === 0xb1) return 1;
    if (c === 0x2b && this.charAt(pos + 1) === 0x2d) return 2;
    return 0;
  }

  /** `±NUMBER[UNIT]` at the cursor. */
  private tolerance(): ToleranceNode | null {
    const start = this.pos;
    const signLen = this.toleranceAt(start);
    this.consume(start + signLen);
    const c = this.charAt(this.pos);
    if (c === 0x2b || c === 0x2d || c === 0x2212) {
      const tStart = this.pos;
      const tEnd = this.rawTokenEnd();
      this.consume(tEnd);
      this.report(
        'bad-number',
        `write the tolerance without a sign, e.g. ±${this.text.slice(tStart + 1, tEnd)}`,
        start,
        tEnd,
      );
      return null;
    }
    if (!startsNumber(this.text, this.pos, this.end)) {
      this.report(
        'missing-value',
        `'${this.text.slice(start, start + signLen)}' needs a number after it, e.g. rh=50%±2`,
        start,
        start + signLen,
      );
      const unitEnd = this.unitEnd(this.pos);
      if (unitEnd > this.pos) this.consume(unitEnd);
      return null;
    }
    const number = this.number();
    if (!number) return null;
    const unit = this.attachedUnit(this.scanned.next);
    return { number, unit, span: this.span(start, unit ? unit.end : number.end) };
  }

  /**
   * The unit written directly after a number, at the cursor (consumed), or null when none is;
   * `first` is the character at the cursor (-1 at the end of the piece), which the number's scan read.
   */
  private attachedUnit(first: number): ParsedUnit | null {
    const unitStart = this.pos;
    // `unitEnd`'s loop, written out (this is nearly every unit of a note): the one reading of the
    // unit's characters finds its end and makes its pack for the intern table (pack step written
    // out too, see the character classes).
    const text = this.text;
    let unitEnd = unitStart;
    let c = first;
    let pack = PACK_START;
    let wide = 0;
    while (
      c > 0x3d
        ? c !== 0xb1 && c !== 0xa0 && c !== 0xfeff
        : c >= 0 && c !== 0x20 && (c < 0x09 || c > 0x0d) && c !== 0x23 && c !== 0x2b && c !== 0x2c && c !== 0x3d
    ) {
      pack = pack * 256 + c;
      wide |= c;
      unitEnd++;
      c = unitEnd < this.end ? text.charCodeAt(unitEnd) : -1;
    }
    if (unitEnd === unitStart) return null;
    this.pos = unitEnd; // `consume`, written out on the common path
    if (unitEnd > this.lastEnd) this.lastEnd = unitEnd;
    return new ParsedUnit(internedPackedSlice(text, unitStart, unitEnd, pack, wide), unitStart);
  }
}

/**
 * The message for a number with a comma that is not a thousands separator. A decimal point is
 * proposed only where the comma can be nothing else: one comma followed by one or two digits
 * (`24,5`, `0,75`) or after a zero whole part (`0,0093`). Otherwise no figure is proposed, since a
 * guess could change its magnitude (`1234,567` may be 1234.567 or 1,234,567; `1,2345` 12,345).
 */
function commaMessage(shown: string): string {
  const m = /^[+\-\u2212]?[0-9]*(?:[.,][0-9]*)*/.exec(shown);
  const numeric = m ? m[0] : shown;
  const commas = numeric.split(',').length - 1;
  const after = /,([0-9]*)$/.exec(numeric)?.[1] ?? '';
  const whole = numeric.replace(/^[+\-\u2212]/, '').split(',')[0] ?? '';
  if (commas === 1 && !numeric.includes('.') && after.length > 0 && (after.length < 3 || /^0*$/.test(whole))) {
    return (
      `'${shown}' is not a number: use a decimal point, not a comma ` +
      `(${shown.replace(',', '.')}); a comma is read only as a thousands separator (8,745)`
    );
  }
  return (
    `'${shown}' is not a number: a comma is read only as a thousands ` +
    `separator, between groups of three digits after a first group of one to ` +
    `three (8,745 or 1,234,567.5); for a decimal fraction write a point (24.5)`
  );
}

/**
 * A new array of `items[from, to)`. Short lists are written as array literals: V8 learns from
 * where a literal is created that its arrays outlive the parse, and allocates them with the rest of
 * the tree instead of copying them out of the young generation later (`slice` gives no such hint).
 */
function exactList<T>(items: readonly T[], from: number, to: number): T[] {
  switch (to - from) {
    case 0:
      return [];
    case 1:
      return [items[from] as T];
    case 2:
      return [items[from] as T, items[from + 1] as T];
    case 3:
      return [items[from] as T, items[from + 1] as T, items[from + 2] as T];
    default:
      return items.slice(from, to);
  }
}

/** What follows `NAME: ` in a statement's example, by keyword (site and units have no name). */
const HEAD_EXAMPLES: Readonly<Record<Keyword, { name: string; rest: string }>> = {
  site: { name: '', rest: 'elev=1600m' },
  units: { name: '', rest: 'SI' },
  state: { name: 'RA', rest: 'db=24C rh=50%' },
  mix: { name: 'MA', rest: 'OA 25% + RA 75%' },
  process: { name: 'CC', rest: 'MA -> SA' },
  supply: { name: 'SA', rest: 'RA q_sensible=41.5kW q_latent=8kW db=13.6C' },
  recover: { name: 'HX', rest: 'OA -> OA2, EA -> EA2 eff_s=0.70' },
};

/** A whole statement of this keyword for a message (`state RA: db=24C rh=50%`), with its name when it has one. */
function headExample(keyword: Keyword, name: NameNode | null): string {
  const example = HEAD_EXAMPLES[keyword];
  if (example.name === '') return `${keyword}: ${example.rest}`;
  return `${keyword} ${name ? name.text : example.name}: ${example.rest}`;
}

/** ` e.g. ` and the key's example for a number's message, or `fallback` when the number has no key. */
function numberExample(key: string | undefined, fallback: string): string {
  return key ? ` e.g. ${exampleFor(key)}` : fallback;
}

/** The first example of a key from the key table (`db=24C`, `shr=0.73`); `key=24C` for a key the table lacks. */
function exampleFor(key: string): string {
  return findKey(key)?.examples[0] ?? `${key}=24C`;
}

// ---------------------------------------------------------------------------------------------
// Public API

const shared = new StatementParser();

/**
 * Reads one statement from `text[start, end)` (offsets into the whole document). A blank or
 * comment-only range gives `statement: null` and no diagnostics.
 */
export function parseStatementText(text: string, start: number, end: number, origin: StatementOrigin): StatementParse {
  const s = Math.max(0, Math.min(start, text.length));
  const e = Math.max(s, Math.min(end, text.length));
  return parseStatementPieces(text, [{ start: s, end: e }], origin);
}

/**
 * Reads one statement written in several pieces of the document (a code span over several lines:
 * the gaps between pieces count as spaces). Pieces must be in order and inside the text.
 */
export function parseStatementPieces(text: string, pieces: readonly Span[], origin: StatementOrigin): StatementParse {
  const diagnostics: CoreDiagnostic[] = [];
  const statement = shared.parse(text, pieces, origin, diagnostics);
  shared.release();
  return { statement, diagnostics };
}

/**
 * Where {@link parseNoteStatements} hands each statement as it is read: the statement, and for a
 * fence's line the line's span (`lineStart`, `lineEnd`: {@link parseStatementText} of that range
 * reads the same statement again); −1 for both for a code span's statement.
 */
export type StatementSink = (statement: Statement, lineStart: number, lineEnd: number) => void;

/**
 * Reads the statements of `region` into `onStatement`. A fence's lines are read from their offsets
 * (`markdown/lines`), making no span per line, unless `shareLines`: then each line's span is made
 * (the region's `lines`) and a statement that is exactly its line shares the line's span (a note
 * whose statements are all kept keeps one span for both).
 */
function regionStatements(
  text: string,
  region: ExtractedRegion,
  onStatement: StatementSink,
  diagnostics: CoreDiagnostic[],
  shareLines: boolean,
): void {
  if (region.origin === 'inline') {
    const st = shared.parse(text, region.lines, 'inline', diagnostics);
    if (st) onStatement(st, -1, -1);
    return;
  }
  const offsets = shareLines ? undefined : lineOffsetsOf(region);
  if (offsets) {
    const { starts, ends } = offsets;
    for (let i = 0; i < starts.length; i++) {
      const start = starts[i] as number;
      const end = ends[i] as number;
      const st = shared.parseLine(text, start, end, diagnostics);
      if (st) onStatement(st, start, end);
    }
    return;
  }
  const one: Span[] = [{ start: 0, end: 0 }];
  for (const line of region.lines) {
    one[0] = line;
    const st = shared.parse(text, one, 'fence', diagnostics);
    if (st) onStatement(st, line.start, line.end);
  }
}

/**
 * {@link parseNote} that hands each statement to `onStatement` as it is read, in document order,
 * instead of keeping them (so that a reader which is done with a statement lets it go). The
 * parser's diagnostics go to `diagnostics`. Never throws; `onStatement` may read other statements
 * of the text meanwhile ({@link parseStatementText}).
 */
export function parseNoteStatements(
  text: string,
  onStatement: StatementSink,
  diagnostics: CoreDiagnostic[],
): Pick<ParsedNote, 'regions' | 'headings'> {
  return readNote(text, onStatement, diagnostics, false);
}

/** {@link parseNoteStatements}; `shareLines` as for {@link regionStatements}. */
function readNote(
  text: string,
  onStatement: StatementSink,
  diagnostics: CoreDiagnostic[],
  shareLines: boolean,
): Pick<ParsedNote, 'regions' | 'headings'> {
  let extracted: ReturnType<typeof extractRegions>;
  try {
    extracted = extractRegions(text);
  } catch (err) {
    // The Markdown library failed on this text: report it rather than crash the editor or CLI.
    diagnostics.push({
      code: 'syntax',
      severity: 'error',
      message:
        `could not read the Markdown structure of this note ` +
        `(${err instanceof Error ? err.message : String(err)}); ` +
        `no statement was read — please report this with the note`,
      span: { start: 0, end: 0 },
    });
    return { regions: [], headings: [] };
  }
  try {
    for (const region of extracted.regions) regionStatements(text, region, onStatement, diagnostics, shareLines);
  } finally {
    shared.release();
  }
  return { regions: extracted.regions, headings: extracted.headings };
}

/** Finds the air regions of a Markdown note and parses their statements (never throws). */
export function parseNote(text: string): ParsedNote {
  const statements: Statement[] = [];
  const diagnostics: CoreDiagnostic[] = [];
  // The statements are all kept: each shares its fence line's span when it is exactly its line.
  const { regions, headings } = readNote(text, (st) => statements.push(st), diagnostics, true);
  return { regions, headings, statements, diagnostics };
}
