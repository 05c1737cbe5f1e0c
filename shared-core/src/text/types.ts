/** Source positions. Offsets are UTF-16 code-unit offsets into the whole document text. */

/** A half-open range `[start, end)` of UTF-16 offsets into the document. */
export interface Span {
  start: number;
  end: number;
}

/** A 1-based line and 1-based UTF-16 column, as the CLI prints them. */
export interface LineCol {
  line: number;
  column: number;
}
