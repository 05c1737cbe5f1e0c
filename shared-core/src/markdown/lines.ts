/**
 * The body lines of a code block, kept as two typed arrays of offsets (each line's content start
 * and end) and made into a list of spans only when something reads the block's `lines`.
 *
 * A fence can have many lines (a note of 100,000 states is one fence of 100,000 lines). A reader
 * that goes over them once and keeps nothing of them (the parser handing each statement out as it
 * reads it, `parseNoteStatements`) reads the offsets with {@link lineOffsetsOf} and makes no span
 * for a line; a reader of `lines` gets the spans, made once at its first read and then kept (so
 * every later read gives the same array and the same span objects, as a plain field would).
 */
import type { Span } from '../text/types';

/** Each body line's content start and end (UTF-16 offsets into the document), in order. */
export interface LineOffsets {
  readonly starts: Int32Array;
  readonly ends: Int32Array;
}

/** The offsets behind each object whose `lines` is made on read (see {@link lazyLines}). */
const offsetsOf = new WeakMap<object, LineOffsets>();

/** A new span for each line of `offsets`, in order. */
function spansOf(offsets: LineOffsets): Span[] {
  const { starts, ends } = offsets;
  const lines: Span[] = [];
  for (let i = 0; i < starts.length; i++) lines.push({ start: starts[i] as number, end: ends[i] as number });
  return lines;
}

/** Makes `lines` a plain field of `holder` holding `lines` (its position among the fields stays). */
function settle(holder: object, lines: Span[]): void {
  Object.defineProperty(holder, 'lines', { value: lines, writable: true, enumerable: true, configurable: true });
}

/**
 * Gives `holder` a field `lines` (enumerable, where a `lines` field already is, so the object's
 * fields keep their order) whose spans are made at its first read from `offsets`, or read from
 * `source.lines` when given (two objects that describe the same block share one list). Read or
 * written, the field becomes a plain one, and the offsets are forgotten (the spans hold them).
 */
export function lazyLines(holder: { lines: Span[] }, offsets: LineOffsets, source?: { lines: Span[] }): void {
  offsetsOf.set(holder, offsets);
  Object.defineProperty(holder, 'lines', {
    enumerable: true,
    configurable: true,
    get(this: { lines: Span[] }): Span[] {
      const lines = source ? source.lines : spansOf(offsets);
      offsetsOf.delete(this);
      settle(this, lines);
      return lines;
    },
    set(this: { lines: Span[] }, lines: Span[]) {
      offsetsOf.delete(this);
      settle(this, lines);
    },
  });
}

/**
 * The line offsets behind `holder.lines` while that list is still to be made on read
 * ({@link lazyLines}); undefined once it was read or written, or when it never was one (a reader
 * then reads `lines`).
 */
export function lineOffsetsOf(holder: object): LineOffsets | undefined {
  return offsetsOf.get(holder);
}
