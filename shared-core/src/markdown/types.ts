/**
 * What the Markdown layer finds in a note: the regions that hold statements and the headings.
 * The syntax tree (`notation/ast.ts`) re-exports these; they are defined here because the
 * Markdown layer sits below the notation and must not import it.
 */
import type { Span } from '../text/types';

/** Where a statement was found in the Markdown. */
export type StatementOrigin = 'fence' | 'inline';

/** A region of the document that holds statements. */
export interface AirRegion {
  origin: StatementOrigin;
  /** The whole construct: the fence from its opening to closing line, or the code span with its backticks. */
  span: Span;
  /** The content: the fenced block's body, or the code span's content. */
  contentSpan: Span;
  /** A fence's whole info string (`air`, or `air chart=summer`); absent for a code span. */
  info?: string;
}

/** An ATX or setext Markdown heading (for the outline). */
export interface HeadingNode {
  level: number;
  /** The heading's text, trimmed, without the `#` marks. */
  text: string;
  span: Span;
}
