/**
 * CommonMark structure of a Markdown text with exact UTF-16 source offsets: every fenced code
 * block, indented code block, code span and heading. {@link extractRegions} picks the air regions
 * out of this.
 *
 * The text is handed to markdown-it after a length-preserving normalization, so every offset it
 * reports is also an offset into the original text: `\r\n` → ` \n` (the added space sits where a
 * line ends and is never content: content ranges stop before the `\r`), a lone `\r` → `\n`, NUL →
 * U+FFFD (as CommonMark asks). A leading byte-order mark is not part of the Markdown: it is
 * skipped and offsets are shifted by one.
 *
 * Code span content follows CommonMark, which markdown-it does not quite: line endings become
 * spaces and the leading spaces or tabs of each continuation line are not content (markdown-it
 * keeps those); then one space is stripped from both ends when both are spaces and the content
 * is not all spaces.
 */
import type { Token } from 'markdown-it';
import type { Span } from '../text/types';
import type { HeadingNode } from './types';
import { lazyLines, type LineOffsets } from './lines';
import { createMarkdownIt, type Collector, type InlineMap, type ScanEnv } from './markdownIt';

/** The place of a block's `lines` until {@link lazyLines} makes it a field read from offsets. */
const UNREAD: Span[] = [];

/** A fenced code block (backticks or tildes), closed or running to the end of its container. */
export interface FenceBlock {
  /** From the opening fence to the end of the closing fence (or of the last body line). */
  span: Span;
  /** From the start of the first body line to the end of the last; empty when there is no body. */
  contentSpan: Span;
  /**
   * Each body line's content (container prefixes and fence indentation removed, no line break);
   * made at its first read (until then `lineOffsetsOf` of `./lines` gives the offsets).
   */
  lines: Span[];
  /** The info string, backslash escapes and entities resolved, trimmed. */
  info: string;
  /** First word of the info string ('' when there is none). */
  lang: string;
  /** The opening fence as written (```` ``` ````, `~~~~`…). */
  markup: string;
  /** False when the block runs to the end of its container without a closing fence. */
  closed: boolean;
}

/** An indented code block (never an air region; reported so tests can tell it from a fence). */
export interface IndentedCodeBlock {
  span: Span;
  /** Each line's content after the four columns of indentation. */
  lines: Span[];
}

/** A code span. */
export interface CodeSpan {
  /** The span with its backtick strings. */
  span: Span;
  /**
   * The content's source range: from its first to its last character after the CommonMark
   * single-space stripping, before line endings become spaces (so on several lines it holds the
   * raw line breaks and container prefixes).
   */
  contentSpan: Span;
  /**
   * The content's pieces, one per source line: joined with single spaces they give exactly
   * {@link CodeSpan.content}.
   */
  lines: Span[];
  /** The content as CommonMark defines it. */
  content: string;
}

/** Everything {@link scanMarkdown} finds, each list in document order. */
export interface MarkdownScan {
  fences: FenceBlock[];
  indentedCode: IndentedCodeBlock[];
  codeSpans: CodeSpan[];
  headings: HeadingNode[];
}

let instance: ReturnType<typeof createMarkdownIt> | null = null;

function markdownIt(): ReturnType<typeof createMarkdownIt> {
  if (!instance) instance = createMarkdownIt();
  return instance;
}

const CRLF_OR_CR = /\r\n?/g;

/**
 * The text markdown-it reads and the offset of its start in `text`: same length as `text` minus a
 * BOM, plus a final line break when `text` ends in a line of only blanks without one; and whether
 * `text` holds a carriage return (`hasCR`: only then can a line end in `\r\n`).
 */
export function normalizeForMarkdown(text: string): { src: string; base: number; hasCR: boolean } {
  const base = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let src = base ? text.slice(1) : text;
  const hasCR = src.indexOf('\r') >= 0;
  if (hasCR) src = src.replace(CRLF_OR_CR, (m) => (m.length === 2 ? ' \n' : '\n'));
  if (src.indexOf('\0') >= 0) src = src.replace(/\0/g, '\uFFFD');
  // markdown-it drops a last line of only spaces or tabs that has no line break; a final line
  // break changes nothing else in CommonMark, and offsets before it stay the same.
  let k = src.length;
  while (k > 0 && isSpaceOrTab(src.charCodeAt(k - 1))) k--;
  if (k < src.length && (k === 0 || src.charCodeAt(k - 1) === 10)) src += '\n';
  return { src, base, hasCR };
}

function isSpaceOrTab(c: number): boolean {
  return c === 0x20 || c === 0x09;
}

/** Options of {@link scanMarkdown}. */
export interface ScanOptions {
  /**
   * Only blocks whose inline source passes this test are searched for code spans (a cheap
   * pre-filter: a block can be skipped only when none of its code spans could matter).
   */
  inlineFilter?: (inlineSource: string) => boolean;
}

/** Finds the fences, indented code, code spans and headings of a Markdown text. */
export function scanMarkdown(text: string, options: ScanOptions = {}): MarkdownScan {
  const { src, base, hasCR } = normalizeForMarkdown(text);
  const result: MarkdownScan = { fences: [], indentedCode: [], codeSpans: [], headings: [] };
  if (src.length === 0) return result;
  const md = markdownIt();
  const col: Collector = { blocks: [], inlineState: null, spans: [], headings: [], inlines: [] };
  const env: ScanEnv = { dewmark: col };
  const tokens: Token[] = [];
  md.block.parse(src, md, env, tokens);

  /** End of a line's content in the original text (before `\r\n`): `e` is the `\n` offset in src. */
  const contentEnd = (e: number): number => {
    const o = e + base;
    // Without a carriage return in the text (the usual case) no line ends in `\r\n`: nothing to read.
    return hasCR && text.charCodeAt(o - 1) === 13 && text.charCodeAt(o) === 10 ? o - 1 : o;
  };

  for (const b of col.blocks) {
    // The body lines stay two typed arrays of offsets (see `./lines`): moved into the original
    // text here only when it has a BOM or a carriage return (else they are its offsets already,
    // and a start never lies past its end).
    const starts = b.lineStarts;
    const ends = b.lineEnds;
    const count = starts.length;
    if (base !== 0 || hasCR) {
      for (let i = 0; i < count; i++) {
        const end = contentEnd(ends[i] as number);
        starts[i] = Math.min((starts[i] as number) + base, end);
        ends[i] = end;
      }
    }
    const offsets: LineOffsets = { starts, ends };
    const start = b.start + base;
    let end: number;
    if (b.kind === 'fence' && (b.closed || count === 0)) {
      // The closing fence line (or the lone opening line), without trailing blanks.
      end = b.closeEnd + base;
    } else {
      end = count > 0 ? (ends[count - 1] as number) : start;
    }
    if (b.kind === 'indented') {
      const block: IndentedCodeBlock = { span: { start, end }, lines: UNREAD };
      lazyLines(block, offsets);
      result.indentedCode.push(block);
      continue;
    }
    const openEnd = b.openEnd + base;
    const contentSpan =
      count > 0 ? { start: starts[0] as number, end: ends[count - 1] as number } : { start: openEnd, end: openEnd };
    const info = fenceInfo(md, b.info);
    const fence: FenceBlock = {
      span: { start, end },
      contentSpan,
      lines: UNREAD,
      info,
      lang: info === '' ? '' : (info.split(/\s+/)[0] ?? ''),
      markup: b.markup,
      closed: b.closed,
    };
    lazyLines(fence, offsets);
    result.fences.push(fence);
  }

  for (const h of col.headings) {
    const raw = h.token.content;
    const textOut = raw.indexOf('\n') >= 0 ? raw.replace(/[ \t]*\n[ \t]*/g, ' ') : raw;
    result.headings.push({ level: h.level, text: textOut, span: { start: h.start + base, end: h.end + base } });
  }

  for (const token of col.inlines) {
    const map = (token.meta as { dewmarkMap?: InlineMap } | null)?.dewmarkMap;
    if (!map || (options.inlineFilter && !options.inlineFilter(token.content))) continue;
    const state = new md.inline.State(token.content, md, env, []);
    col.inlineState = state;
    col.spans = [];
    md.inline.tokenize(state);
    col.inlineState = null;
    for (const raw of col.spans) {
      const span = codeSpanAt(text, src, base, map, raw.start, raw.end, raw.ticks, contentEnd);
      if (span) result.codeSpans.push(span);
    }
  }
  return result;
}

function fenceInfo(md: ReturnType<typeof createMarkdownIt>, raw: string): string {
  const unescaped = raw.indexOf('\\') >= 0 || raw.indexOf('&') >= 0 ? md.utils.unescapeAll(raw) : raw;
  return unescaped.trim();
}

/** Index of the piece (source line) holding position `j` of the untrimmed content string. */
function pieceAt(map: InlineMap, j: number): number {
  const starts = map.pieceStarts;
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >>> 1;
    if ((starts[mid] as number) <= j) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Source offset (normalized text) of the character at content offset `o`, and its line. */
function toSource(map: InlineMap, o: number): { pos: number; line: number } {
  const j = o + map.lead;
  const i = pieceAt(map, j);
  const k = j - (map.pieceStarts[i] as number) - (map.pads[i] as number);
  return { pos: (map.firsts[i] as number) + Math.max(0, k), line: i };
}

function codeSpanAt(
  text: string,
  src: string,
  base: number,
  map: InlineMap,
  start: number,
  end: number,
  ticks: number,
  contentEnd: (e: number) => number,
): CodeSpan | null {
  if (end - start < 2 * ticks) return null;
  const open = toSource(map, start);
  const close = toSource(map, end - 1); // the last backtick
  const a = open.pos + ticks;
  const b = close.pos + 1 - ticks;
  const pieces: Span[] = [];
  if (open.line === close.line) {
    pieces.push({ start: a + base, end: b + base });
  } else {
    const lineEnd0 = contentEnd(map.lineEnds[open.line] as number);
    pieces.push({ start: Math.min(a + base, lineEnd0), end: lineEnd0 });
    for (let line = open.line + 1; line <= close.line; line++) {
      let s = map.firsts[line] as number;
      const e = line === close.line ? b : (map.lineEnds[line] as number);
      while (s < e && isSpaceOrTab(src.charCodeAt(s))) s++;
      const pieceEnd = line === close.line ? b + base : contentEnd(e);
      pieces.push({ start: Math.min(s + base, pieceEnd), end: pieceEnd });
    }
  }
  let content =
    pieces.length === 1 ? text.slice(a + base, b + base) : pieces.map((p) => text.slice(p.start, p.end)).join(' ');
  if (
    content.length > 1 &&
    content.charCodeAt(0) === 0x20 &&
    content.charCodeAt(content.length - 1) === 0x20 &&
    /[^ ]/.test(content)
  ) {
    content = content.slice(1, -1);
    const first = pieces[0] as Span;
    if (first.start === first.end) pieces.shift();
    else first.start++;
    const last = pieces[pieces.length - 1] as Span;
    if (last.start === last.end) pieces.pop();
    else last.end--;
  }
  const firstPiece = pieces[0] as Span;
  const lastPiece = pieces[pieces.length - 1] as Span;
  return {
    span: { start: open.pos + base, end: close.pos + 1 + base },
    contentSpan: { start: firstPiece.start, end: lastPiece.end },
    lines: pieces,
    content,
  };
}
