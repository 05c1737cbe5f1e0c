/**
 * Numbers of the notation as written: optional sign, digits, optional fraction, optional exponent
 * (`24`, `-5`, `9.30`, `.5`, `5.`, `1.2e3`, `1E-4`), and thousands separators in the whole part
 * where they cannot be anything else: a first group of one to three digits (not starting with 0)
 * and then groups of exactly three after each comma (`8,745`, `169,100`, `1,234,567.5`). Scanning
 * works on the document text in place; the value comes from the written digits (never guessed),
 * and the resolution is the place value of the last written digit.
 */
import { GROUP_SEPARATOR, GROUP_SIZE, groupAt, groupDigits } from '../text/thousands';
import { PACK_START, internedPackedSlice, packStep } from './intern';

/** A number found at a position, before any check of its value. */
export interface ScannedNumber {
  /** Offset just past the number. */
  end: number;
  /** The number exactly as written. */
  written: string;
  /** Its value, correctly rounded (as `Number()` gives it); ±Infinity when too large. */
  value: number;
  /** Digits after the decimal point. */
  fractionDigits: number;
  /** The written exponent (0 when none). */
  exponent: number;
  /** Place value of the last written digit ({@link resolutionOf}). */
  resolution: number;
  /**
   * The character at {@link end}, or -1 when the scanned range ends there: read by the scan
   * anyway (it is where the number stops), so that the caller need not read it again.
   */
  next: number;
}

/** 1, 10, …, 1e22: the powers of ten that a double holds exactly. */
const EXACT_POW10: readonly number[] = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));

/** `0`–`9`, in one comparison (a character below `0` wraps to a large unsigned number). */
function isDigit(c: number): boolean {
  return (c - 0x30) >>> 0 < 10;
}

/** Whether a number can start at `pos` (a digit, or a sign or point followed by one). */
export function startsNumber(text: string, pos: number, end: number): boolean {
  if (pos >= end) return false;
  let c = text.charCodeAt(pos);
  if (c === 0x2b || c === 0x2d || c === 0x2212) {
    pos++;
    if (pos >= end) return false;
    c = text.charCodeAt(pos);
  }
  if (isDigit(c)) return true;
  return c === 0x2e && pos + 1 < end && isDigit(text.charCodeAt(pos + 1));
}

/**
 * Scans a number starting at `pos` (which must satisfy {@link startsNumber}). Stops after the
 * last character that belongs to it; the caller looks at what follows (a unit, a comma…). The
 * result is written into `into` when given (a parser reading many numbers reuses one object).
 */
export function scanNumber(text: string, pos: number, end: number, into?: ScannedNumber): ScannedNumber {
  const start = pos;
  let c = text.charCodeAt(pos);
  let negative = false;
  // The written text's pack for the intern table, built as each character is read (see `intern.ts`);
  // every character of a number is below 256 but the minus sign `−`.
  let pack = PACK_START;
  const wide = c === 0x2212 ? c : 0;
  if (c === 0x2b || c === 0x2d || c === 0x2212) {
    negative = c !== 0x2b;
    pack = packStep(pack, c);
    pos++;
  }
  // The digits as an integer (exact while there are at most 15 of them).
  let mantissa = 0;
  let digits = 0;
  const first = pos;
  // The loops over digits write `isDigit` and `packStep` out: they run for every number of a note,
  // mostly in the interpreter and the baseline compiler before the engine optimizes this function,
  // where each call costs more than its arithmetic.
  while (pos < end) {
    c = text.charCodeAt(pos);
    if ((c - 0x30) >>> 0 >= 10) break;
    mantissa = mantissa * 10 + (c - 0x30);
    pack = pack * 256 + c;
    digits++;
    pos++;
  }
  // Thousands separators (the rule is `text/thousands.ts`'s): only after a first group of 1–3
  // digits that does not start with 0, and only whole groups (anything else is left to the caller).
  let grouped = false;
  if (digits >= 1 && digits <= GROUP_SIZE && c === 0x2c && text.charCodeAt(first) !== 0x30) {
    while (groupAt(text, pos, end)) {
      pack = packStep(pack, 0x2c);
      for (let i = 1; i <= GROUP_SIZE; i++) {
        const d = text.charCodeAt(pos + i);
        mantissa = mantissa * 10 + (d - 0x30);
        pack = packStep(pack, d);
      }
      digits += GROUP_SIZE;
      pos += GROUP_SIZE + 1;
      grouped = true;
    }
    c = text.charCodeAt(pos);
  }
  // From here `c` is the character at `pos` whenever `pos < end` (the loops stop on it).
  let fractionDigits = 0;
  if (pos < end && c === 0x2e) {
    pack = pack * 256 + 0x2e; // `packStep`, written out as in the loops
    pos++;
    while (pos < end) {
      c = text.charCodeAt(pos);
      if ((c - 0x30) >>> 0 >= 10) break;
      mantissa = mantissa * 10 + (c - 0x30);
      pack = pack * 256 + c;
      digits++;
      pos++;
      fractionDigits++;
    }
  }
  let exponent = 0;
  if (pos < end) {
    if (c === 0x65 || c === 0x45) {
      let q = pos + 1;
      let sign = 1;
      let h = packStep(pack, c);
      const s = text.charCodeAt(q);
      if (s === 0x2b || s === 0x2d) {
        if (s === 0x2d) sign = -1;
        h = packStep(h, s);
        q++;
      }
      if (q < end && isDigit(text.charCodeAt(q))) {
        let e = 0;
        let d = -1;
        while (q < end) {
          d = text.charCodeAt(q);
          if (!isDigit(d)) break;
          // Saturate: a huge exponent gives an infinite value or zero, reported or kept by the caller.
          if (e < 100000) e = e * 10 + (d - 0x30);
          h = packStep(h, d);
          q++;
        }
        exponent = sign * e;
        pos = q;
        pack = h;
        c = d;
      }
    }
  }
  // The character the number stops at (`c`, read by the loop that stopped there), or -1 at the end.
  const next = pos < end ? c : -1;
  const written = internedPackedSlice(text, start, pos, pack, wide);
  // Exact fast path: an integer below 2^53 times or divided by an exact power of ten is rounded
  // once, so it equals the correctly rounded decimal; anything else goes through Number().
  const k = exponent - fractionDigits;
  let value: number;
  if (digits <= 15 && k >= -22 && k <= 22) {
    const magnitude = k >= 0 ? mantissa * (EXACT_POW10[k] as number) : mantissa / (EXACT_POW10[-k] as number);
    value = negative ? -magnitude : magnitude;
  } else {
    const plain = grouped ? written.replaceAll(GROUP_SEPARATOR, '') : written;
    value = Number(text.charCodeAt(start) === 0x2212 ? `-${plain.slice(1)}` : plain);
  }
  // `resolutionOf`, written out (`k` is its exponent): it is asked of every number the parser reads.
  const resolution = k >= -POW10_LIMIT && k <= POW10_LIMIT ? (POW10[k + POW10_LIMIT] as number) : Number(`1e${k}`);
  if (!into) return { end: pos, written, value, fractionDigits, exponent, resolution, next };
  into.end = pos;
  into.written = written;
  into.value = value;
  into.fractionDigits = fractionDigits;
  into.exponent = exponent;
  into.resolution = resolution;
  into.next = next;
  return into;
}

/** Place value of the last written digit: `50` → 1, `9.30` → 0.01, `1.2e3` → 100, `0.0093` → 0.0001. */
export function resolutionOf(fractionDigits: number, exponent: number): number {
  const e = exponent - fractionDigits;
  return e >= -POW10_LIMIT && e <= POW10_LIMIT ? (POW10[e + POW10_LIMIT] as number) : Number(`1e${e}`);
}

const POW10_LIMIT = 30;
/**
 * 1e-30 … 1e30, each built from its decimal text: the double nearest to the power of ten (so 0.01, not 10 ** -2).
 * Frozen, the engine keeps each entry as a number object of its own (a table of plain doubles is
 * read out as a new one each time): every number node of a note refers to the table's 0.1 rather
 * than keeping a copy.
 */
const POW10: readonly number[] = Object.freeze(
  Array.from({ length: 2 * POW10_LIMIT + 1 }, (_, i) => Number(`1e${i - POW10_LIMIT}`)),
);

/**
 * Place value of the last *significant* written digit, the usual engineering reading of a figure:
 * trailing zeros of a whole number written without a decimal point or exponent are not
 * significant (`39700` → 100, `169,100` → 100), but at least two significant digits are read
 * (`1000` → 100, `500` → 10, `50` → 1): a single one would accept ±25 % or more. A decimal point
 * (`39700.`), a fraction (`39700.0`) or an exponent (`3.970e4`) marks every written digit as
 * significant, and the result is then {@link resolutionOf}'s. `written` is the number's text.
 */
export function significantResolution(written: string, resolution: number): number {
  let digits = 0;
  let zeros = 0;
  for (let i = 0; i < written.length; i++) {
    const c = written.charCodeAt(i);
    if (isDigit(c)) {
      if (digits > 0 || c !== 0x30) digits++;
      zeros = c === 0x30 ? zeros + 1 : 0;
    } else if (c !== 0x2c && c !== 0x2b && c !== 0x2d && c !== 0x2212) {
      return resolution; // a point or an exponent: every digit counts
    }
  }
  const dropped = Math.min(zeros, Math.max(0, digits - 2));
  return dropped === 0 ? resolution : resolution * (POW10[dropped + POW10_LIMIT] as number);
}

/**
 * A number's text with thousands separators in its whole part (`text/thousands.ts`), in the
 * form {@link scanNumber} reads back to the same value (`277262` → `277,262`, `-1234.5` → `-1,234.5`). Text with an
 * exponent or already grouped is returned unchanged.
 */
export function withThousandsSeparators(text: string): string {
  if (/[eE,]/.test(text)) return text;
  const m = /^([+\-\u2212]?)([0-9]+)(.*)$/.exec(text);
  if (!m) return text;
  const [, sign = '', whole = '', rest = ''] = m;
  return `${sign}${groupDigits(whole)}${rest}`;
}
