/**
 * The CommonMark parser behind {@link scanMarkdown}: markdown-it with its `commonmark` preset,
 * instrumented to keep exact source positions.
 *
 * COPIED FROM MARKDOWN-IT ({@link MARKDOWN_IT_COPIED_FROM}; `shared-core/test/markdown-it-version.test.ts`
 * fails when the installed version, or one of the functions below as it ships, changes — then
 * compare each copy with the new source and update the copy, the version and the fingerprints):
 * - `cutLine` repeats the column counting of `StateBlock.prototype.getLines`, to know where each
 *   line's piece of a paragraph or code block starts in the source (markdown-it only returns the
 *   joined text);
 * - `isClosingFence` repeats the closing-fence test of the `fence` block rule, to know whether a
 *   fence was closed (markdown-it does not say);
 * - `FastBlockState`'s constructor repeats `StateBlock`'s line table (found with `indexOf`, in
 *   typed arrays), its `getLines` calls markdown-it's own only for lines that may hold a code
 *   span, and its `push` and `FastInlineState`'s `push`/`pushPending` repeat markdown-it's with
 *   a `Token` made by plain assignment (`FastToken`, the same fields as markdown-it's `Token`
 *   constructor). These are for speed: on a long note they were most of the parse time and
 *   allocation (`npm run bench -- parse`).
 * Everything else is markdown-it's own code, called through thin wrappers.
 *
 * markdown-it reports only line numbers for blocks and nothing for inline tokens, so a few of its
 * rules are wrapped (the wrapped rule runs unchanged and decides; the wrapper only records):
 * - `fence` and `code` record, per body line, where the line's content starts once container
 *   prefixes (`> `, list indentation) and the fence's own indentation are removed;
 * - `paragraph`, `heading` and `lheading` record how their inline content string was cut out of
 *   the source (one piece per line), so an offset in that string maps back to the source;
 * - `backticks` records every code span it finds in the top-level inline pass.
 *
 * Only the inline rules that decide where a code span can be are kept (text, escape, backticks,
 * link, image, autolink, html_inline); emphasis, entities and line breaks cannot move a code span
 * and are switched off. Link validation is switched off as well: CommonMark has no notion of an
 * unsafe URL, and a link markdown-it refused would otherwise hide or reveal backticks differently
 * from the spec.
 */
import MarkdownIt from 'markdown-it';

/**
 * The markdown-it version the copies listed above were taken from; the version test compares it
 * with the installed one.
 */
export const MARKDOWN_IT_COPIED_FROM = '15.0.3';
import type { Env, MarkdownIt as Md, StateBlock, StateInline, Token } from 'markdown-it';

/** How a block's inline content string was cut from the source: one piece per source line. */
export interface InlineMap {
  /** Source offset (normalized text) where each line's piece starts. */
  firsts: number[];
  /** Spaces markdown-it inserted before the piece (a tab split by container indentation). */
  pads: number[];
  /** Offset of each piece in the untrimmed content string. */
  pieceStarts: number[];
  /** Source offset of each line's end (the line break position, or the text's end). */
  lineEnds: number[];
  /** Characters trimmed from the start of the untrimmed content string. */
  lead: number;
}

/** A fenced or indented code block as recorded by the wrapped block rules. */
export interface RawCodeBlock {
  kind: 'fence' | 'indented';
  /** First and one-past-last source line of the whole block (markdown-it `map`). */
  startLine: number;
  endLine: number;
  /** Offset of the block's first character (after container prefix and indentation). */
  start: number;
  /** Raw info string (fences only; '' for indented code). */
  info: string;
  /** Fence marker as written (```` ``` ````, `~~~~`); '' for indented code. */
  markup: string;
  closed: boolean;
  /** End of the opening line and of the block's last line, trailing blanks excluded. */
  openEnd: number;
  closeEnd: number;
  /**
   * Per body line: content start offset and line end offset (normalized text). Typed arrays of
   * the block's exact size (outside the garbage-collected heap; a fence can have many lines).
   */
  lineStarts: Int32Array;
  lineEnds: Int32Array;
}

/** A code span as recorded by the wrapped `backticks` rule: offsets in the inline content string. */
export interface RawCodeSpan {
  start: number;
  end: number;
  ticks: number;
}

/** What one scan collects; kept in markdown-it's `env`, so scans never share state. */
export interface Collector {
  blocks: RawCodeBlock[];
  /** The inline state being tokenized at top level; nested ones (image alt text) are ignored. */
  inlineState: StateInline | null;
  spans: RawCodeSpan[];
  headings: RawHeading[];
  /** Inline tokens that may hold a code span (they have an {@link InlineMap}), in document order. */
  inlines: Token[];
}

/** A heading as recorded by the wrapped `heading`/`lheading` rules. */
export interface RawHeading {
  level: number;
  /** The inline token holding the heading's text. */
  token: Token;
  /** Offset of the heading's first character (after container prefix and indentation). */
  start: number;
  /** Offset just past the heading's last non-blank character (closing `#`s or underline included). */
  end: number;
}

/** Environment object handed to markdown-it. */
export type ScanEnv = Env & { dewmark: Collector };

type BlockRule = (state: StateBlock, startLine: number, endLine: number, silent: boolean) => boolean;
type InlineRule = (state: StateInline, silent: boolean) => boolean;

/**
 * Forgets the tokens a leaf-block rule just pushed (from index `n`), once recorded: nothing reads
 * them back (markdown-it's tight-list marking only looks for paragraphs, which stay in threes or
 * go whole), and a long note's token list would otherwise stay alive through the whole parse.
 */
function dropTokens(state: StateBlock, n: number): void {
  if (state.tokens.length > n) state.tokens.length = n;
}

/** Deepest nesting of containers (and of inline links) followed; deeper content is not read. */
export const MAX_NESTING = 100;

/** Characters at the start of a text whose lines give the first guess of its line count. */
const LINE_SAMPLE = 4096;

/** `a`'s values in a new array of `size` (zeros after them). */
function grown(a: Int32Array, size: number): Int32Array {
  const b = new Int32Array(size);
  b.set(a);
  return b;
}

function isSpace(c: number): boolean {
  return c === 0x20 || c === 0x09;
}

function isAsciiTrimmable(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d;
}

function collectorOf(env: unknown): Collector | null {
  const c = (env as Partial<ScanEnv> | undefined)?.dewmark;
  return c ?? null;
}

/** Spaces put in front of the line by the last {@link cutLine} (a tab split by the indentation). */
let cutPad = 0;

/**
 * Where `state.getLines(line, …, indent, …)` starts cutting `line`; the spaces it puts in front
 * (markdown-it expands a tab that the indentation splits) are left in `cutPad`. Mirrors
 * markdown-it's getLines.
 */
function cutLine(state: StateBlock, line: number, indent: number): number {
  const src = state.src;
  const lineStart = state.bMarks[line] as number;
  const last = (state.eMarks[line] as number) + 1;
  const tShift = state.tShift[line] as number;
  const bsCount = state.bsCount[line] as number;
  let first = lineStart;
  let lineIndent = 0;
  while (first < last && lineIndent < indent) {
    const ch = src.charCodeAt(first);
    if (isSpace(ch)) {
      if (ch === 0x09) lineIndent += 4 - ((lineIndent + bsCount) % 4);
      else lineIndent++;
    } else if (first - lineStart < tShift) lineIndent++;
    else break;
    first++;
  }
  cutPad = lineIndent > indent ? lineIndent - indent : 0;
  return first;
}

/** Builds the {@link InlineMap} of `getLines(begin, end, indent, false)` followed by asciiTrim. */
function inlineMap(state: StateBlock, begin: number, end: number, indent: number): InlineMap {
  const firsts: number[] = [];
  const pads: number[] = [];
  const pieceStarts: number[] = [];
  const lineEnds: number[] = [];
  const src = state.src;
  let at = 0;
  let lead = -1;
  for (let line = begin; line < end; line++) {
    const first = cutLine(state, line, indent);
    const pad = cutPad;
    const eMark = state.eMarks[line] as number;
    const last = line + 1 < end ? eMark + 1 : eMark;
    firsts.push(first);
    pads.push(pad);
    pieceStarts.push(at);
    lineEnds.push(eMark);
    if (lead < 0) {
      let k = first;
      while (k < last && isAsciiTrimmable(src.charCodeAt(k))) k++;
      if (k < last) lead = at + pad + (k - first);
    }
    at += pad + Math.max(0, last - first);
  }
  return { firsts, pads, pieceStarts, lineEnds, lead: Math.max(lead, 0) };
}

function wrapBlock(md: Md, name: string, wrap: (orig: BlockRule) => BlockRule): void {
  const rule = md.block.ruler.__rules__.find((r) => r.name === name);
  if (!rule) throw new Error(`markdown-it has no block rule '${name}'`);
  rule.fn = wrap(rule.fn as BlockRule) as typeof rule.fn;
  md.block.ruler.__cache__ = null;
}

function wrapInline(md: Md, name: string, wrap: (orig: InlineRule) => InlineRule): void {
  const rule = md.inline.ruler.__rules__.find((r) => r.name === name);
  if (!rule) throw new Error(`markdown-it has no inline rule '${name}'`);
  rule.fn = wrap(rule.fn as InlineRule) as typeof rule.fn;
  md.inline.ruler.__cache__ = null;
}

/** Whether the line is a closing fence for `markup` (same test as markdown-it's fence rule). */
function isClosingFence(state: StateBlock, line: number, markup: string): boolean {
  const src = state.src;
  const pos = (state.bMarks[line] as number) + (state.tShift[line] as number);
  const max = state.eMarks[line] as number;
  const marker = markup.charCodeAt(0);
  if (src.charCodeAt(pos) !== marker) return false;
  if ((state.sCount[line] as number) - state.blkIndent >= 4) return false;
  const after = state.skipChars(pos, marker);
  if (after - pos < markup.length) return false;
  return state.skipSpaces(after) >= max;
}

function recordBlock(
  state: StateBlock,
  kind: 'fence' | 'indented',
  token: Token,
  bodyBegin: number,
  bodyEnd: number,
  indent: number,
  closed: boolean,
): void {
  const col = collectorOf(state.env);
  if (!col || !token.map) return;
  const count = Math.max(0, bodyEnd - bodyBegin);
  let lineStarts: Int32Array;
  let lineEnds: Int32Array;
  if (indent === 0) {
    // Nothing to cut (a fence at the start of its container: `cutLine` would give each line's
    // own start and no pad): the lines are the table's, copied at once. A line's start is never
    // past its end (markdown-it's block quote moves it at most to the end), so the `Math.min`
    // below would change nothing. A long note is one such fence of many lines, and this runs once.
    const b = state.bMarks as unknown as Int32Array;
    const e = state.eMarks as unknown as Int32Array;
    lineStarts = b.slice(bodyBegin, bodyBegin + count);
    lineEnds = e.slice(bodyBegin, bodyBegin + count);
  } else {
    lineStarts = new Int32Array(count);
    lineEnds = new Int32Array(count);
    for (let line = bodyBegin; line < bodyEnd; line++) {
      const first = cutLine(state, line, indent);
      const pad = cutPad;
      const eMark = state.eMarks[line] as number;
      // A tab only partly taken by the indentation stays in the content (it is whitespace there).
      lineStarts[line - bodyBegin] = Math.min(pad > 0 ? first - 1 : first, eMark);
      lineEnds[line - bodyBegin] = eMark;
    }
  }
  const startLine = token.map[0];
  const trimmedEnd = (line: number): number => {
    const from = (state.bMarks[line] as number) + (state.tShift[line] as number);
    let e = state.eMarks[line] as number;
    while (e > from && isSpace(state.src.charCodeAt(e - 1))) e--;
    return e;
  };
  col.blocks.push({
    kind,
    startLine,
    endLine: token.map[1],
    start: (state.bMarks[startLine] as number) + (state.tShift[startLine] as number),
    info: token.info,
    markup: token.markup,
    closed,
    openEnd: trimmedEnd(startLine),
    closeEnd: trimmedEnd(Math.max(startLine, token.map[1] - 1)),
    lineStarts,
    lineEnds,
  });
}

/**
 * Creates the instrumented markdown-it instance (see the module comment): the commonmark preset
 * with the rules that cannot move a code span switched off, the recording wrappers, the
 * corrections where markdown-it departs from CommonMark, and the faster tokens.
 */
export function createMarkdownIt(): Md {
  const md = new MarkdownIt('commonmark', { maxNesting: MAX_NESTING });
  md.disable(['emphasis', 'entity', 'newline']);
  md.validateLink = () => true;
  md.normalizeLink = (url: string) => url;
  recordCodeBlocks(md);
  recordInlineText(md);
  dropUnreadBlocks(md);
  recordCodeSpans(md);
  keepLookingForHtmlEnds(md);
  hideIndentedQuoteMarkers(md);
  continueParagraphsAfterReferences(md);
  useFastTokens(md);
  return md;
}

/** Fenced and indented code blocks: where each body line's content is, and whether a fence closed. */
function recordCodeBlocks(md: Md): void {
  wrapBlock(md, 'fence', (orig) => (state, startLine, endLine, silent) => {
    const n = state.tokens.length;
    const ok = orig(state, startLine, endLine, silent);
    if (!ok || silent) return ok;
    const token = state.tokens[n];
    if (token && token.type === 'fence') {
      const last = state.line - 1;
      const closed = last > startLine && isClosingFence(state, last, token.markup);
      const indent = state.sCount[startLine] as number;
      recordBlock(state, 'fence', token, startLine + 1, closed ? last : state.line, indent, closed);
    }
    dropTokens(state, n);
    return ok;
  });

  wrapBlock(md, 'code', (orig) => (state, startLine, endLine, silent) => {
    const n = state.tokens.length;
    const ok = orig(state, startLine, endLine, silent);
    if (!ok || silent) return ok;
    const token = state.tokens[n];
    if (token && token.type === 'code_block') {
      recordBlock(state, 'indented', token, startLine, state.line, 4 + state.blkIndent, true);
    }
    dropTokens(state, n);
    return ok;
  });
}

/** Gives a paragraph's or setext heading's inline token its {@link InlineMap} when it may hold a code span. */
function recordInline(state: StateBlock, inlineIndex: number, begin: number, end: number): void {
  const token = state.tokens[inlineIndex];
  if (token?.type !== 'inline') return;
  if (token.content.indexOf('`') < 0) return; // no backtick, no code span: nothing to map
  token.meta = { dewmarkMap: inlineMap(state, begin, end, state.blkIndent) };
  collectorOf(state.env)?.inlines.push(token);
}

/** Records the heading whose `heading_open` token is at `openIndex` (for the outline). */
function recordHeading(state: StateBlock, openIndex: number, startLine: number, lastLine: number): void {
  const col = collectorOf(state.env);
  const open = state.tokens[openIndex];
  const inline = state.tokens[openIndex + 1];
  if (!col || !open || !inline || open.type !== 'heading_open') return;
  const start = (state.bMarks[startLine] as number) + (state.tShift[startLine] as number);
  let end = state.eMarks[lastLine] as number;
  while (end > start && isSpace(state.src.charCodeAt(end - 1))) end--;
  col.headings.push({ level: Number(open.tag.slice(1)) || 1, token: inline, start, end });
}

/** Paragraphs and headings: how their inline text was cut from the source, and the headings themselves. */
function recordInlineText(md: Md): void {
  wrapBlock(md, 'paragraph', (orig) => (state, startLine, endLine, silent) => {
    const n = state.tokens.length;
    const ok = orig(state, startLine, endLine, silent);
    if (ok && !silent) {
      recordInline(state, n + 1, startLine, state.line);
      dropTokens(state, n);
    }
    return ok;
  });

  wrapBlock(md, 'lheading', (orig) => (state, startLine, endLine, silent) => {
    const n = state.tokens.length;
    const fast = state as StateBlock & { keepText?: boolean };
    const keep = fast.keepText;
    fast.keepText = true;
    let ok: boolean;
    try {
      ok = orig(state, startLine, endLine, silent);
    } finally {
      fast.keepText = keep;
    }
    if (ok && !silent) {
      recordInline(state, n + 1, startLine, state.line - 1);
      recordHeading(state, n, startLine, state.line - 1);
      dropTokens(state, n);
    }
    return ok;
  });

  wrapBlock(md, 'heading', (orig) => (state, startLine, endLine, silent) => {
    const n = state.tokens.length;
    const ok = orig(state, startLine, endLine, silent);
    if (!ok || silent) return ok;
    const token = state.tokens[n + 1];
    if (token && token.type === 'inline' && token.content.indexOf('`') >= 0) {
      const src = state.src;
      let pos = (state.bMarks[startLine] as number) + (state.tShift[startLine] as number);
      while (src.charCodeAt(pos) === 0x23) pos++;
      const max = state.eMarks[startLine] as number;
      while (pos < max && isAsciiTrimmable(src.charCodeAt(pos))) pos++;
      const map: InlineMap = { firsts: [pos], pads: [0], pieceStarts: [0], lineEnds: [max], lead: 0 };
      token.meta = { dewmarkMap: map };
      collectorOf(state.env)?.inlines.push(token);
    }
    recordHeading(state, n, startLine, startLine);
    dropTokens(state, n);
    return ok;
  });
}

/** HTML blocks and thematic breaks hold no code span: their tokens are dropped at once. */
function dropUnreadBlocks(md: Md): void {
  for (const name of ['html_block', 'hr']) {
    wrapBlock(md, name, (orig) => (state, startLine, endLine, silent) => {
      const n = state.tokens.length;
      const ok = orig(state, startLine, endLine, silent);
      if (ok && !silent) dropTokens(state, n);
      return ok;
    });
  }
}

/** Every code span of the top-level inline pass, as offsets in the inline content string. */
function recordCodeSpans(md: Md): void {
  wrapInline(md, 'backticks', (orig) => (state, silent) => {
    const start = state.pos;
    const n = state.tokens.length;
    const ok = orig(state, silent);
    if (ok && !silent) {
      const col = collectorOf(state.env);
      const last = state.tokens[state.tokens.length - 1];
      if (col && col.inlineState === state && state.tokens.length > n && last && last.type === 'code_inline') {
        col.spans.push({ start, end: state.pos, ticks: last.markup.length });
      }
    }
    return ok;
  });
}

/**
 * markdown-it stops looking for HTML comments, processing instructions, declarations and CDATA
 * for the rest of a paragraph once one of them had no end, even of another kind or found during
 * a look-ahead past the current position (a link label scan); CommonMark has no such rule.
 * Remember instead, per kind, the first position from which the end is known to be missing.
 */
function keepLookingForHtmlEnds(md: Md): void {
  const noEndFrom = new WeakMap<StateInline, Map<string, number>>();
  wrapInline(md, 'html_inline', (orig) => (state, silent) => {
    const pos = state.pos;
    const term = specialTerminator(state.src, pos);
    if (term === null) return orig(state, silent);
    let known = noEndFrom.get(state);
    const from = known?.get(term);
    if (from !== undefined && from <= pos) return false;
    state.skipHtmlSpecial = false;
    const ok = orig(state, silent);
    if (state.skipHtmlSpecial) {
      if (!known) {
        known = new Map();
        noEndFrom.set(state, known);
      }
      known.set(term, pos);
      state.skipHtmlSpecial = false;
    }
    return ok;
  });
}

/**
 * markdown-it departs from CommonMark around block quotes in two ways, both corrected here by
 * hiding a line's first character from the block-quote rule while it runs (its indentation is
 * pointed one whitespace earlier, so no block start is seen there and the line is lazy text):
 * - a `>` after four or more columns of indentation is taken as a block-quote marker;
 * - a lazy line of an outer quote reaches an inner one without its indentation, so a line like
 *   `    # x` could end the inner quote as a heading.
 */
function hideIndentedQuoteMarkers(md: Md): void {
  wrapBlock(md, 'blockquote', (orig) => (state, startLine, endLine, silent) => {
    if (silent) return orig(state, startLine, endLine, silent);
    const hidden: number[] = [];
    const src = state.src;
    // A block quote never runs past a blank line, so neither does this look-ahead.
    for (let line = startLine + 1; line < endLine && !state.isEmpty(line); line++) {
      const sCount = state.sCount[line] as number;
      const pos = (state.bMarks[line] as number) + (state.tShift[line] as number);
      const hide =
        sCount >= 0 ? sCount - state.blkIndent >= 4 && src.charCodeAt(pos) === 0x3e : indentColumns(state, line) >= 4;
      if (hide && (state.tShift[line] as number) > 0) {
        hidden.push(line, state.tShift[line] as number);
        state.tShift[line] = (state.tShift[line] as number) - 1;
      }
    }
    try {
      return orig(state, startLine, endLine, silent);
    } finally {
      for (let i = 0; i < hidden.length; i += 2) state.tShift[hidden[i] as number] = hidden[i + 1] as number;
    }
  });
}

/**
 * CommonMark reads link reference definitions from the start of a paragraph, so the lines after
 * them that would continue that paragraph (indented lines, `2.` lists, HTML that cannot
 * interrupt a paragraph…) are still paragraph text; markdown-it starts a fresh block there.
 */
function continueParagraphsAfterReferences(md: Md): void {
  const ruleFn = (name: string): BlockRule => {
    const rule = md.block.ruler.__rules__.find((r) => r.name === name);
    if (!rule) throw new Error(`markdown-it has no block rule '${name}'`);
    return rule.fn as BlockRule;
  };
  wrapBlock(md, 'reference', (orig) => {
    const reference: BlockRule = (state, startLine, endLine, silent) => {
      const ok = orig(state, startLine, endLine, silent);
      if (!ok || silent) return ok;
      const line = state.line;
      if (line >= endLine || state.isEmpty(line) || !continuesParagraph(state, line, endLine)) return ok;
      const saved = state.sCount[line] as number;
      state.sCount[line] = state.blkIndent;
      try {
        if (!reference(state, line, endLine, false) && !ruleFn('lheading')(state, line, endLine, false)) {
          ruleFn('paragraph')(state, line, endLine, false);
        }
      } finally {
        state.sCount[line] = saved;
      }
      return ok;
    };
    return reference;
  });
}

/**
 * markdown-it's bundled Token constructor defines each field with `Object.defineProperty`, which
 * costs more than all the rest of block parsing on a long note. Tokens made here have the same
 * fields, initial values and prototype, set by plain assignment. The state classes of this
 * instance only are replaced by subclasses whose `push`/`pushPending` are otherwise unchanged
 * copies of markdown-it's (other markdown-it instances in the process are not touched).
 */
function useFastTokens(md: Md): void {
  const TokenClass = new md.core.State('', md, {}).Token;
  type Fields = { -readonly [K in keyof Token]: Token[K] };
  function FastToken(this: Fields, type: string, tag: string, nesting: Token['nesting']): void {
    this.map = null;
    this.level = 0;
    this.children = null;
    this.content = '';
    this.markup = '';
    this.info = '';
    this.block = false;
    this.hidden = false;
    this.type = type;
    this.tag = tag;
    this.attrs = null;
    this.nesting = nesting;
    this.meta = null;
  }
  FastToken.prototype = TokenClass.prototype;
  const make = FastToken as unknown as new (type: string, tag: string, nesting: Token['nesting']) => Token;

  class FastBlockState extends md.block.State {
    /**
     * Same line table as markdown-it's constructor (bMarks, eMarks, tShift, sCount, bsCount and
     * the sentinel line, including its quirk of dropping a last line of only blanks that has no
     * line break), found with the native `indexOf` instead of a loop over every character.
     */
    constructor(src: string, mdIn: Md, env: Env, tokens: Token[]) {
      super('', mdIn, env, tokens);
      const len = src.length;
      // The five tables are typed arrays (their storage is outside the garbage-collected heap;
      // markdown-it only ever indexes them, and every value is an integer between -1 and the
      // text's length). They start at the line count that the text's first few kilobytes
      // suggest for the whole, and a quarter more (a note's lines are much alike), and grow by half
      // when full (a native copy; at most a third of a table is then unused, and only while the
      // note is parsed), rather than the lines being counted first: that was a second pass of one
      // `indexOf` per line, and this constructor runs once per note, mostly before it is optimised.
      const sampleEnd = Math.min(len, LINE_SAMPLE);
      let sampled = 1;
      for (let i = src.indexOf('\n'); i >= 0 && i < sampleEnd; i = src.indexOf('\n', i + 1)) sampled++;
      // (Never more than a line per 16 characters at first: a text whose start is dense with
      // line breaks cannot make the tables large; shorter lines throughout grow them.)
      let size = Math.min(Math.ceil((1.25 * sampled * len) / Math.max(sampleEnd, 1)), len >> 4) + 16;
      let bMarks: Int32Array = new Int32Array(size);
      let eMarks: Int32Array = new Int32Array(size);
      let tShift: Int32Array = new Int32Array(size);
      let sCount: Int32Array = new Int32Array(size);
      let bsCount: Int32Array = new Int32Array(size);
      let n = 0;
      let start = 0;
      while (start < len) {
        const nl = src.indexOf('\n', start);
        const lineEnd = nl < 0 ? len : nl;
        let p = start;
        let offset = 0;
        for (; p < lineEnd; p++) {
          const c = src.charCodeAt(p);
          if (c === 0x20) offset++;
          else if (c === 0x09) offset += 4 - (offset % 4);
          else break;
        }
        if (nl < 0 && p === lineEnd) break;
        if (n + 1 >= size) {
          // Room for this line and the sentinel line after the last one.
          size += size >> 1;
          bMarks = grown(bMarks, size);
          eMarks = grown(eMarks, size);
          tShift = grown(tShift, size);
          sCount = grown(sCount, size);
          bsCount = grown(bsCount, size);
        }
        bMarks[n] = start;
        eMarks[n] = lineEnd;
        // A line that starts with no blank (most lines) keeps the zeros the new tables hold, as
        // bsCount always does: two stores fewer per line, while this loop runs in the interpreter.
        if (p > start) {
          tShift[n] = p - start;
          sCount[n] = offset;
        }
        n++;
        if (nl < 0) break;
        start = nl + 1;
      }
      bMarks[n] = len;
      eMarks[n] = len;
      tShift[n] = 0;
      sCount[n] = 0;
      bsCount[n] = 0;
      n++;
      const table = (a: Int32Array): number[] => a.subarray(0, n) as unknown as number[];
      this.src = src;
      this.bMarks = table(bMarks);
      this.eMarks = table(eMarks);
      this.tShift = table(tShift);
      this.sCount = table(sCount);
      this.bsCount = table(bsCount);
      this.lineMax = n - 1;
    }

    /** While set, getLines always builds the text (a setext heading's text is kept for the outline). */
    keepText = false;
    /** The first backtick at or after `tickFrom` (-1: none), for {@link getLines}. */
    private tickFrom = Number.POSITIVE_INFINITY;
    private tickAt = -1;

    /**
     * markdown-it's getLines, except that it returns '' for lines holding no backtick: the text of
     * paragraphs and code blocks is never read here unless a code span may be in it, and building
     * it for every block of a long note is a large share of all allocation.
     */
    override getLines(begin: number, end: number, indent: number, keepLastLF: boolean): string {
      if (!this.keepText && begin < end) {
        const a = this.bMarks[begin] as number;
        if (a < this.tickFrom || (this.tickAt >= 0 && this.tickAt < a)) {
          this.tickFrom = a;
          this.tickAt = this.src.indexOf('`', a);
        }
        if (this.tickAt < 0 || this.tickAt >= (this.eMarks[end - 1] as number)) return '';
      }
      return super.getLines(begin, end, indent, keepLastLF);
    }

    override push(type: string, tag: string, nesting: Token['nesting']): Token {
      const token = new make(type, tag, nesting);
      token.block = true;
      if (nesting < 0) this.level--;
      token.level = this.level;
      if (nesting > 0) this.level++;
      this.tokens.push(token);
      return token;
    }
  }

  class FastInlineState extends md.inline.State {
    override pushPending(): Token {
      const token = new make('text', '', 0);
      token.content = this.pending;
      token.level = this.pendingLevel;
      this.tokens.push(token);
      this.pending = '';
      return token;
    }

    override push(type: string, tag: string, nesting: Token['nesting']): Token {
      if (this.pending) this.pushPending();
      const token = new make(type, tag, nesting);
      let tokenMeta: StateInline['tokens_meta'][number];
      if (nesting < 0) {
        this.level--;
        this.delimiters = this._prev_delimiters.pop() ?? [];
      }
      token.level = this.level;
      if (nesting > 0) {
        this.level++;
        this._prev_delimiters.push(this.delimiters);
        this.delimiters = [];
        tokenMeta = { delimiters: this.delimiters };
      }
      this.pendingLevel = this.level;
      this.tokens.push(token);
      this.tokens_meta.push(tokenMeta);
      return token;
    }
  }

  md.block.State = FastBlockState;
  md.inline.State = FastInlineState;
}

/** The end marker markdown-it looks for after `<!--`, `<![CDATA[`, `<?` or `<!X` at `pos`, else null. */
function specialTerminator(src: string, pos: number): string | null {
  if (src.charCodeAt(pos) !== 0x3c) return null;
  const next = src.charCodeAt(pos + 1);
  if (next === 0x3f) return '?>';
  if (next !== 0x21) return null;
  if (src.startsWith('<!--', pos)) return '-->';
  if (src.startsWith('<![CDATA[', pos)) return ']]>';
  const third = src.charCodeAt(pos + 2);
  return (third >= 0x41 && third <= 0x5a) || (third >= 0x61 && third <= 0x7a) ? '>' : null;
}

/** Columns of indentation of a line from its (current) start, tabs to multiples of four. */
function indentColumns(state: StateBlock, line: number): number {
  const src = state.src;
  const end = state.eMarks[line] as number;
  const bs = state.bsCount[line] as number;
  let col = 0;
  for (let pos = state.bMarks[line] as number; pos < end; pos++) {
    const c = src.charCodeAt(pos);
    if (c === 0x20) col++;
    else if (c === 0x09) col += 4 - ((col + bs) % 4);
    else break;
  }
  return col;
}

/** Whether `line` would continue an open paragraph (no block start can interrupt it there). */
function continuesParagraph(state: StateBlock, line: number, endLine: number): boolean {
  const sCount = state.sCount[line] as number;
  if (sCount < 0 || sCount - state.blkIndent > 3) return true;
  const rules = state.md.block.ruler.getRules('paragraph');
  const oldParent = state.parentType;
  state.parentType = 'paragraph';
  try {
    for (const rule of rules) if (rule(state, line, endLine, true)) return false;
  } finally {
    state.parentType = oldParent;
  }
  return true;
}
