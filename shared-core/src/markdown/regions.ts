/**
 * The air regions of a Markdown note: fenced code blocks whose info string's first word is `air`,
 * and code spans whose content starts with a statement keyword (`state `, `mix `, `process `, `recover `,
 * `site:`, `units:` — the keyword followed by whitespace or `:`). Everything else is prose.
 */
import type { Span } from '../text/types';
import { lazyLines, lineOffsetsOf } from './lines';
import { scanMarkdown } from './scan';
import type { AirRegion, HeadingNode } from './types';

/** The statement keywords, in the order the docs list them. */
export const STATEMENT_KEYWORDS = ['site', 'units', 'state', 'mix', 'process', 'supply', 'recover'] as const;

/** A statement keyword, as written. */
export type Keyword = (typeof STATEMENT_KEYWORDS)[number];

/** A ` ```air ` fence. */
export interface FenceRegion extends AirRegion {
  origin: 'fence';
  /**
   * Each body line's content: one statement (or blank, or a comment) per line. Made at its first
   * read (`./lines`); until then `lineOffsetsOf(region)` gives the same lines as offsets.
   */
  lines: Span[];
  /** The whole info string (`air`, or `air` followed by more words). */
  info: string;
  /** False when the fence runs to the end of its container without a closing fence. */
  closed: boolean;
}

/** A code span holding one statement. */
export interface InlineRegion extends AirRegion {
  origin: 'inline';
  /**
   * The statement's pieces, one per source line (container prefixes and continuation indentation
   * left out); the line breaks between them count as spaces.
   */
  lines: Span[];
}

/** Any air region. */
export type ExtractedRegion = FenceRegion | InlineRegion;

/** What {@link extractRegions} returns. */
export interface ExtractedNote {
  /** Air regions in document order. */
  regions: ExtractedRegion[];
  /** Every ATX and setext heading, in document order. */
  headings: HeadingNode[];
}

/** The place of a fence region's `lines` until it is made a field read from offsets (`./lines`). */
const NOT_READ: Span[] = [];

const KEYWORD_ANYWHERE = /state|mix|process|recover|site|units/;

/** Whether `content` starts with a statement keyword followed by whitespace or `:`. */
export function startsWithKeyword(content: string): boolean {
  for (const kw of STATEMENT_KEYWORDS) {
    if (content.startsWith(kw)) {
      const c = content.charCodeAt(kw.length);
      if (c === 0x3a || c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d) return true;
    }
  }
  return false;
}

/** Finds the air regions and the headings of a Markdown text (offsets into `text`). */
export function extractRegions(text: string): ExtractedNote {
  // A keyword code span has its keyword literally in the block's source (no escapes or entities
  // apply inside code spans), so blocks without any keyword need no inline pass.
  const scan = scanMarkdown(text, { inlineFilter: (src) => KEYWORD_ANYWHERE.test(src) });
  const fences: FenceRegion[] = [];
  for (const f of scan.fences) {
    if (f.lang !== 'air') continue;
    const region: FenceRegion = {
      origin: 'fence',
      span: f.span,
      contentSpan: f.contentSpan,
      lines: NOT_READ,
      info: f.info,
      closed: f.closed,
    };
    // The block's lines, made when first read (by either object: they share one list); a reader
    // that only goes over them takes their offsets (`lineOffsetsOf`) and makes no span per line.
    const offsets = lineOffsetsOf(f);
    if (offsets) lazyLines(region, offsets, f);
    else region.lines = f.lines;
    fences.push(region);
  }
  const inline: InlineRegion[] = [];
  for (const c of scan.codeSpans) {
    if (!startsWithKeyword(c.content)) continue;
    inline.push({ origin: 'inline', span: c.span, contentSpan: c.contentSpan, lines: c.lines });
  }
  // Both lists are in document order and never overlap (a code span is never inside a fence).
  const regions: ExtractedRegion[] = [];
  let i = 0;
  let j = 0;
  while (i < fences.length || j < inline.length) {
    const f = fences[i];
    const s = inline[j];
    if (f && (!s || f.span.start < s.span.start)) {
      regions.push(f);
      i++;
    } else if (s) {
      regions.push(s);
      j++;
    }
  }
  return { regions, headings: scan.headings };
}
