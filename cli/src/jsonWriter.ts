/**
 * Where a JSON document's members go as a description of its shape writes them, one member at a
 * time: into objects ({@link ObjectWriter}, what tests and other tools read), or straight into
 * the text `JSON.stringify(value, null, 2)` prints for those objects ({@link TextWriter}, what
 * `eval --format json` writes, as UTF-8 bytes: no object per state, no second pass over a tree,
 * no string of the text). The two are
 * driven by the same description (output.ts `writeState`, `writeProcess`, `writeEvalFile`), so
 * the shape has one home; and the figures of both are rounded by {@link roundForJson}.
 */

/** Significant digits of every figure in the JSON: beyond the engine's accuracy, clear of binary noise. */
export const JSON_SIGNIFICANT_DIGITS = 12;

/** 10⁰ … 10²²: the powers of ten a double holds exactly. */
const POW10 = Float64Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));

/**
 * 2²⁷ + 1, and the high halves (26 bits) of the powers of ten in {@link POW10}: Veltkamp's
 * splitting of a double into two halves whose products are exact (see {@link scaledDigits}).
 */
const SPLITTER = 134217729;
const POW10_HIGH = POW10.map((p) => SPLITTER * p - (SPLITTER * p - p));

/** 2³¹ and 2³². */
const TWO_31 = 2147483648;
const TWO_32 = 4294967296;

/**
 * For a binary exponent b (−32 … 36, at index b + 32): 11 − ⌊b·log₁₀2⌋, the decimals that
 * leave 12 significant digits of a figure in [2^b, 2^(b+1)) when its decimal exponent is
 * ⌊b·log₁₀2⌋ (one fewer when it is one more). A table: no multiplication and rounding per figure.
 */
const DECIMALS_OF_EXPONENT = Int8Array.from({ length: 69 }, (_, i) => 11 - Math.floor((i - 32) * Math.log10(2)));

/** The eight ASCII bytes `0.000000` as the little-endian double they spell (see {@link Words}). */
const ZERO_POINT_ZEROS = new DataView(Uint8Array.from('0.000000', (c) => c.charCodeAt(0)).buffer).getFloat64(0, true);

/** The power of ten of the last figure {@link scaledDigits} scaled: the figure is M / 10^scale. */
let scale = 0;

/**
 * The usual figure's 12 significant digits, found without `toPrecision`: for 1e-6 ≤ a < 1e11,
 * a is scaled by 10^s to a 12-digit whole number M (so that the figure is M / 10^s): returns M
 * (below 10¹²; 0 for a = 0, at s = 11) and sets {@link scale} to s (at most 17); −1 for any
 * other a. M is a·10^s rounded half up, as `toPrecision` rounds the exact value of a.
 */
function scaledDigits(a: number): number {
  // Zero is the digits 0 at scale 11 (its text is `0`, as for any M below 10¹¹ at that scale).
  // (Asked first, so that the comparison runs for every figure: a comparison the engine has
  // seen no figure reach would be compiled as a return to the interpreter; see TextWriter.figure.)
  if (a === 0) {
    scale = 11;
    return 0;
  }
  if (!(a >= 1e-6 && a < 1e11)) return -1;
  // Decimals that leave 12 significant digits: 11 − the decimal exponent of a (1 … 17), here
  // from the binary exponent b = ⌊log₂a⌋ (the decimal exponent is ⌊b·log₁₀2⌋ or one more: a
  // lies in [2^b, 2^(b+1)), less than a decade). b is counted from the leading zeros of a's whole
  // part (a below 1 is first scaled by 2³¹, exactly; a above 2³² is given 32, whose decimal
  // exponent, 9, is still a's or one less): no memory is written and read back for a's bits.
  const b = a >= 1 ? (a < TWO_32 ? 31 - Math.clz32(a) : 32) : -Math.clz32(a * TWO_31);
  let s = DECIMALS_OF_EXPONENT[b + 32]!;
  // One decimal fewer when a has one digit more than the table assumes (13 digits scaled); the
  // comparison is taken as a number, so that no branch hangs on which (it is either, by the figure).
  s = (s - +(a * POW10[s]! >= 1e12)) | 0;
  const p = POW10[s]!;
  const y = a * p;
  if (!(y >= 1e11 && y < 1e12)) return -1;
  // y is a·10^s rounded once (10^s is exact), so it is within half a unit of its last place
  // (2⁻¹³ at most here) of the exact product, and its fraction is a whole number of such units:
  // Math.round(y), which rounds a half up, rounds a·10^s correctly unless y's fraction is
  // exactly one half (y − m = −0.5, exact). Then the exact product's error e (y + e = a·10^s
  // exactly: Dekker's product of a's and 10^s's halves) decides: below the half when e < 0.
  // Everything is computed for every figure, with no step taken only at a half: a step first
  // taken after the engine compiled this (a half comes once in some thousands of figures) would
  // send the compiled writer back to the interpreter (see TextWriter.figure). Before, a figure
  // within 1e-4 of a half went through toPrecision.
  let m = Math.round(y);
  const half = y - m === -0.5;
  const c = SPLITTER * a;
  const aHigh = c - (c - a);
  const aLow = a - aHigh;
  const pHigh = POW10_HIGH[s]!;
  const pLow = p - pHigh;
  const e = aHigh * pHigh - y + aHigh * pLow + aLow * pHigh + aLow * pLow;
  const below = e < 0;
  m -= half && below ? 1 : 0;
  // A figure that rounds up to 13 digits (M = 10¹²) is 10¹¹ at one decimal fewer: the same
  // quotient (both are 10^(12 − s) exactly), with 12 digits. Chosen by value, not by a branch of
  // its own, for the reason above.
  const up = m >= 1e12;
  scale = s - (up ? 1 : 0);
  return up ? 1e11 : m;
}

/**
 * A figure for the JSON at {@link JSON_SIGNIFICANT_DIGITS} significant digits — never a fixed
 * number of decimals, which would leave a −60 °C dew-point state's humidity ratio (3.3e-6 kg/kg)
 * with two; null stays null (never NaN or Infinity in the JSON). It is the double nearest to
 * `x.toPrecision(12)`: the usual figure (1e-6 ≤ |x| < 1e11, and 0) is scaled once to a 12-digit whole
 * number and rounded, and divided back (a quotient of two exact doubles, rounded once, is the
 * double nearest to the decimal; a figure at a half of its last digit is rounded by the exact
 * product, see scaledDigits); any other figure goes through `toPrecision` itself. (The
 * test of the JSON precision compares the two on a million figures.)
 */
export function roundForJson(x: number | null | undefined): number | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  const m = scaledDigits(x < 0 ? -x : x);
  if (m >= 0) {
    const v = m / POW10[scale]!;
    return x < 0 ? -v : v;
  }
  const v = Number(x.toPrecision(JSON_SIGNIFICANT_DIGITS));
  return Object.is(v, -0) ? 0 : v;
}

/** A string or key at most this long is written into the buffer; a longer one is handed out on its own. */
const LONG_TEXT = 4096;

/** A member's name, with the text a writer puts before its value (`"name": `, as UTF-8). */
export interface JsonKey {
  readonly name: string;
  readonly text: Uint8Array;
  /** Whether the text is too long for a {@link TextWriter}'s buffer (it is written as a piece of its own). */
  readonly long: boolean;
  /** The line starts with this key that a {@link TextWriter} has written, by depth (made as needed). */
  readonly leads: Lead[];
}

/** The keys made so far, by name (one key per name for every writer and every document). */
const KEYS = new Map<string, JsonKey>();
/** At most this many keys are kept. */
const MAX_KEYS = 1024;

/** The key of a member named `name` (made once per name: a document's keys are a few dozen). */
export function jsonKey(name: string): JsonKey {
  let key = KEYS.get(name);
  if (key === undefined) {
    const text = Buffer.from(`${JSON.stringify(name)}: `, 'utf8');
    key = { name, text, long: text.length > LONG_TEXT, leads: [] };
    // The keys written are the document's few dozen names; a plain value's keys are kept too, up to a bound.
    if (KEYS.size < MAX_KEYS) KEYS.set(name, key);
  }
  return key;
}

/** Keys for names written in the code: `K.name`, `K.line` … */
export function jsonKeys<const T extends readonly string[]>(names: T): { readonly [N in T[number]]: JsonKey } {
  return Object.fromEntries(names.map((n) => [n, jsonKey(n)])) as { [N in T[number]]: JsonKey };
}

/**
 * Keys of members that are written one after another ({@link JsonWriter.figures}): their line
 * starts are looked up once per row, not once per member.
 */
export interface JsonKeyRow {
  readonly keys: readonly JsonKey[];
  /** Whether some key is too long for a {@link TextWriter}'s buffer (its line start is written as text). */
  readonly long: boolean;
  /** The keys' line starts, by depth and whether the first comes first in its object (made as needed). */
  readonly leads: Lead[][];
}

/** The row of `keys` (make it once, and write it many times). */
export function jsonKeyRow(keys: readonly JsonKey[]): JsonKeyRow {
  return { keys: [...keys], long: keys.some((k) => k.long), leads: [] };
}

/** Receives the members of a JSON document in order (keys of one object never repeat). */
export interface JsonWriter {
  /** A figure (a member, or an element when `key` is null), rounded by {@link roundForJson}. */
  fig(key: JsonKey | null, x: number | null | undefined): void;
  /**
   * Members that are figures, one after another: `row.keys[i]`'s is `xs[i]` (NaN for null), each
   * as {@link fig} writes it. (Several at once, from an array of doubles: no figure is a boxed
   * double on its way, and their line starts are looked up once for all.)
   */
  figures(row: JsonKeyRow, xs: Float64Array): void;
  /** A number as it is (a line number); NaN and ±Infinity are written as null. */
  num(key: JsonKey | null, v: number): void;
  /** A string member; an undefined value leaves the member out (as JSON.stringify does). */
  str(key: JsonKey | null, v: string | null | undefined): void;
  bool(key: JsonKey | null, v: boolean): void;
  /** An array of strings (names and keys). */
  strings(key: JsonKey | null, v: readonly string[]): void;
  /** Any plain JSON value (objects, arrays, strings, numbers, booleans, null; undefined leaves it out). */
  value(key: JsonKey | null, v: unknown): void;
  /** Starts an object member or element; its members follow until {@link close}. */
  open(key: JsonKey | null): void;
  close(): void;
  /** Starts an array member or element; its elements (key null) follow until {@link closeArray}. */
  openArray(key: JsonKey | null): void;
  closeArray(): void;
}

/** Builds the objects and arrays the members describe (the value is {@link ObjectWriter.result}). */
export class ObjectWriter implements JsonWriter {
  /** The value of the first member or element written at the top. */
  result: unknown = undefined;
  private readonly stack: (Record<string, unknown> | unknown[])[] = [];

  private put(key: JsonKey | null, v: unknown): void {
    const top = this.stack[this.stack.length - 1];
    if (top === undefined) this.result = v;
    else if (Array.isArray(top)) top.push(v);
    else if (key !== null) top[key.name] = v;
  }
  fig(key: JsonKey | null, x: number | null | undefined): void {
    this.put(key, roundForJson(x));
  }
  figures(row: JsonKeyRow, xs: Float64Array): void {
    const keys = row.keys;
    for (let i = 0; i < keys.length; i++) this.put(keys[i]!, roundForJson(xs[i]));
  }
  num(key: JsonKey | null, v: number): void {
    this.put(key, Number.isFinite(v) ? v : null);
  }
  str(key: JsonKey | null, v: string | null | undefined): void {
    if (v !== undefined || key === null) this.put(key, v ?? null);
  }
  bool(key: JsonKey | null, v: boolean): void {
    this.put(key, v);
  }
  strings(key: JsonKey | null, v: readonly string[]): void {
    this.put(key, [...v]);
  }
  value(key: JsonKey | null, v: unknown): void {
    if (v !== undefined || key === null) this.put(key, v ?? null);
  }
  open(key: JsonKey | null): void {
    const o: Record<string, unknown> = {};
    this.put(key, o);
    this.stack.push(o);
  }
  close(): void {
    this.stack.pop();
  }
  openArray(key: JsonKey | null): void {
    const a: unknown[] = [];
    this.put(key, a);
    this.stack.push(a);
  }
  closeArray(): void {
    this.stack.pop();
  }
}

/**
 * Takes a piece of a document's text: UTF-8 bytes, whole characters. The bytes are lent: the
 * writer writes on over them once the call returns, unless it returns true, saying that it keeps
 * them (a stream that could not write them at once); the writer then goes on in new memory.
 */
export type TakePiece = (piece: Uint8Array) => boolean | undefined;

/** A piece's text (see {@link TakePiece}). */
export function pieceText(piece: Uint8Array): string {
  return Buffer.from(piece.buffer, piece.byteOffset, piece.byteLength).toString('utf8');
}

/**
 * Bytes of text a {@link TextWriter} hands out at a time (about): 64 KB, the size of a pipe's buffer
 * on Linux; each piece costs a write call (some thousands of instructions in Node before the system
 * call), so fewer, larger pieces are less work.
 */
const PIECE_BYTES = 1 << 16;

/** Whether `c` (a UTF-16 code unit) is written in a JSON string as itself, and in one byte. */
const plainAscii = (c: number): boolean => c >= 0x20 && c < 0x7f && c !== 0x22 && c !== 0x5c;

/** A lead and the value after it are kept as one {@link Words} when they are at most this many bytes. */
const KEPT_BYTES = 128;

/**
 * Bytes made once, to go into the buffer eight bytes at a time, as the little-endian doubles
 * they spell (the last may carry up to seven bytes past the end, which the next write covers).
 * Only bytes below 0x80 (ASCII) are held so: such a double's exponent is below 0x7ff, so it is
 * never a NaN, whose bits a copy need not keep; any other bytes go four at a time as 32-bit
 * words. (Eight bytes a time are fewer writes: a state's text is mostly these.)
 */
interface Words {
  /** The bytes as doubles, or null when some byte is not ASCII. */
  readonly doubles: Float64Array | null;
  /** The bytes as 32-bit words, when they are not ASCII (else empty). */
  readonly words: Int32Array;
  readonly length: number;
}

const NO_WORDS = new Int32Array(0);

function wordsOf(bytes: Uint8Array): Words {
  let ascii = true;
  for (let i = 0; i < bytes.length; i++) if (bytes[i]! >= 0x80) ascii = false;
  if (ascii) {
    const padded = new Uint8Array((bytes.length + 7) & ~7);
    padded.set(bytes);
    // (The doubles are read from the bytes as the buffer's DataView writes them: little-endian.)
    const view = new DataView(padded.buffer);
    const doubles = new Float64Array(padded.length >> 3);
    for (let i = 0; i < doubles.length; i++) doubles[i] = view.getFloat64(8 * i, true);
    return { doubles, words: NO_WORDS, length: bytes.length };
  }
  const words = new Int32Array((bytes.length + 3) >> 2);
  for (let i = 0; i < bytes.length; i++) words[i >> 2]! |= bytes[i]! << (8 * (i & 3));
  return { doubles: null, words, length: bytes.length };
}

/**
 * How many times running a string, figure or array of strings comes after the same line start
 * before it is kept with it ({@link Lead}): three, not two. The second time is a note's second
 * state, before the engine has begun to record what the writer's methods do (it does once a
 * method has run for a while); the step that keeps a value would then be first recorded when
 * some later value repeats, after the method is compiled, and that sends the compiled method
 * back to the interpreter, to be compiled again. The third time comes after the recording has
 * begun. (A value that repeats is written out once more before it is copied.)
 */
const KEEP_RUN = 3;

/**
 * The start of a member's line (`,`, the line break, the indentation and the key) or of an array
 * element's, as {@link Words}; and the last value written after it, kept with the lead as one
 * {@link Words} once the same value came {@link KEEP_RUN} times running. A state's members come at the same depth
 * with the same key every time, and many of their values repeat from state to state (the
 * pressure and its description, the kind, `ok`, the defining keys): such a member is then one
 * copy of bytes made once, with no figure's digits to find and no string to read. The bytes kept
 * are those the value was just written as, so the text is the same.
 */
class Lead implements Words {
  readonly doubles: Float64Array | null;
  readonly words: Int32Array;
  readonly length: number;
  /** The last string, figure and array of strings written after this lead (NaN: none yet). */
  lastString: string | null = null;
  lastFigure = Number.NaN;
  lastStrings: readonly string[] | null = null;
  /** How many times running the last string, figure and array of strings came. */
  stringRun = 0;
  figureRun = 0;
  stringsRun = 0;
  /** The value kept with the lead (it came {@link KEEP_RUN} times running), and the lead with its text. */
  keptString: string | null = null;
  withString: Words | null = null;
  keptFigure = Number.NaN;
  withFigure: Words | null = null;
  keptStrings: readonly string[] | null = null;
  withStrings: Words | null = null;
  withTrue: Words | null = null;
  withFalse: Words | null = null;
  constructor(bytes: Uint8Array) {
    const w = wordsOf(bytes);
    this.doubles = w.doubles;
    this.words = w.words;
    this.length = w.length;
  }
}

/** Whether two arrays of strings hold the same strings. */
function sameStrings(a: readonly string[], b: readonly string[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The line starts of array elements (no key), by depth and whether a comma comes first. */
const ELEMENT_LEADS: Lead[] = [];
/**
 * The ends of objects and arrays, by depth, bracket and whether they are empty: the last line (a
 * line break, the indentation, the bracket), or the bracket alone after the opening one.
 */
const CLOSE_LEADS: Words[] = [];

/** The start of a member's line at `depth`: `,` unless `first`, the line break, the indentation, the key. */
function leadOf(key: JsonKey | null, depth: number, first: boolean): Lead {
  const leads = key === null ? ELEMENT_LEADS : key.leads;
  const i = 2 * depth + (first ? 0 : 1);
  let lead = leads[i];
  if (lead === undefined) {
    const start = Buffer.from(`${first ? '' : ','}\n${'  '.repeat(depth)}`, 'latin1');
    lead = new Lead(key === null ? start : Buffer.concat([start, key.text]));
    leads[i] = lead;
  }
  return lead;
}

/** The end of an object (`}`) or array (`]`) whose members were at depth + 1 (none when `empty`). */
function closeOf(depth: number, bracket: '}' | ']', empty: boolean): Words {
  const lead = CLOSE_LEADS[closeIndex(depth, bracket, empty)];
  return lead !== undefined ? lead : makeClose(depth, bracket, empty);
}

function closeIndex(depth: number, bracket: '}' | ']', empty: boolean): number {
  return 4 * depth + (bracket === '}' ? 0 : 2) + (empty ? 1 : 0);
}

/** {@link closeOf}'s bytes, made and kept. */
function makeClose(depth: number, bracket: '}' | ']', empty: boolean): Words {
  const lead = wordsOf(Buffer.from(empty ? bracket : `\n${'  '.repeat(depth)}${bracket}`, 'latin1'));
  CLOSE_LEADS[closeIndex(depth, bracket, empty)] = lead;
  return lead;
}

/**
 * Closing lines made before any is written, for documents this deep: a line made while the
 * document is written would be a path that the compiled writer had never seen taken (the last
 * lines of the document come after it is compiled), which sends it back to the interpreter.
 */
const CLOSES_MADE_AHEAD = 8;

/** Makes the closing lines of depths below {@link CLOSES_MADE_AHEAD} (once, by the first writer). */
function makeClosesAhead(): void {
  if (CLOSE_LEADS.length >= 4 * CLOSES_MADE_AHEAD) return;
  for (let depth = 0; depth < CLOSES_MADE_AHEAD; depth++) {
    for (const bracket of ['}', ']'] as const) {
      if (CLOSE_LEADS[closeIndex(depth, bracket, false)] === undefined) makeClose(depth, bracket, false);
      if (CLOSE_LEADS[closeIndex(depth, bracket, true)] === undefined) makeClose(depth, bracket, true);
    }
  }
}

/**
 * The four ASCII digits of 0 … 9999 (with leading zeros) as little-endian words (the first digit
 * lowest), and the zeros each ends with (4 for 0).
 */
interface FourDigits {
  readonly words: Int32Array;
  readonly zeros: Uint8Array;
}
let fourDigitTables: FourDigits | null = null;

/**
 * The four-digit tables, made by the first writer (no cost for a command that writes no JSON text).
 * This runs once per command, before any optimisation: it is a hundred steps, not ten thousand
 * (which the interpreter would run long enough for the engine to compile the loop on its own).
 */
function fourDigits(): FourDigits {
  if (fourDigitTables) return fourDigitTables;
  // The two-digit pairs 00 … 99 (each after a mark), and the zeros each ends with (2 for 00).
  let marked = '';
  const pairZeros = new Uint8Array(100);
  for (let i = 0; i < 100; i++) {
    const tens = (i / 10) | 0;
    const ones = i - 10 * tens;
    marked += `|${tens}${ones}`;
    pairZeros[i] = ones !== 0 ? 0 : tens !== 0 ? 1 : 2;
  }
  // The text of 0000 … 9999, a hundred at a time: the first pair put at each mark of the hundred
  // pairs (one native replacement each), read as little-endian words (the first digit lowest).
  let text = '';
  const zeros = new Uint8Array(10000);
  for (let high = 0; high < 100; high++) {
    const tens = (high / 10) | 0;
    text += marked.replaceAll('|', `${tens}${high - 10 * tens}`);
    // A number ends with its last pair's zeros, or two more than the first pair's when the last is 00.
    zeros.set(pairZeros, 100 * high);
    zeros[100 * high] = 2 + pairZeros[high]!;
  }
  const bytes = Buffer.from(text, 'latin1');
  const words = new Int32Array(10000);
  // The bytes copied in are the little-endian words on a little-endian machine; read one by one elsewhere.
  if (new Uint8Array(Uint16Array.of(1).buffer)[0] === 1) new Uint8Array(words.buffer).set(bytes);
  else {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    for (let i = 0; i < 10000; i++) words[i] = view.getInt32(4 * i, true);
  }
  fourDigitTables = { words, zeros };
  return fourDigitTables;
}

/**
 * The text of an object, an element of an array at `depth`, whose members are the same from one
 * element to the next but for a name, a line number and some figures (a note's plain states):
 * the bytes before the name, between these values and after the last figure, made once as
 * {@link Words} from the object's own description (see {@link jsonSkeleton}), so that an element
 * is written as a dozen runs of bytes and its values ({@link TextWriter.skeletal}).
 */
export interface JsonSkeleton {
  readonly depth: number;
  /** The text before the name, with the element's line start (its comma, and without for the first element). */
  readonly head: Words;
  readonly headFirst: Words;
  /** The text after the name, after the line number, and after each figure. */
  readonly runs: readonly Words[];
  /** The text after each figure (runs from the third on, by figure). */
  readonly afterFigures: readonly Words[];
  readonly figures: number;
  /** The first figure the skeleton was made for, and the text after the line number to the second figure with it. */
  readonly firstFigure: number;
  readonly withFirst: Words;
  /** The most bytes an element takes but for its name's (the fixed text, the longest line number and figures). */
  readonly bytes: number;
}

/** Writes an object's members (its name, line and figures given) to a writer, at its top. */
export type SkeletonMembers = (w: JsonWriter, name: string, line: number, xs: Float64Array) => void;

/**
 * The values a skeleton is made with: text that the fixed members are checked not to hold (a
 * name of control characters, a nine-digit line, figures of ten digits).
 */
const MARK_NAME = '\u0000\u0001\u0002';
const MARK_LINE = 987654321;
const markFigure = (i: number): number => 975318642.5 + i;

/** The most bytes a figure's text takes (`-0.00000123456789012`, `-1.23456789012e+21`), and a line number's. */
const MAX_FIGURE_BYTES = 24;
const MAX_LINE_BYTES = 10;

/**
 * The skeleton of the objects `members` writes, at `depth`, with `figures` figures: made by
 * writing them once with marks for the values and cutting the text at the marks. Null when a
 * mark's text is not found exactly once, in order (some fixed member held it), or when the
 * fixed text is longer than {@link LONG_TEXT} bytes: the caller then writes each object member
 * by member.
 */
export function jsonSkeleton(
  depth: number,
  figures: number,
  members: SkeletonMembers,
  firstFigure: number,
): JsonSkeleton | null {
  const pieces: Uint8Array[] = [];
  const w = new TextWriter(depth, (piece) => {
    pieces.push(piece.slice());
    return false;
  });
  members(
    w,
    MARK_NAME,
    MARK_LINE,
    Float64Array.from({ length: figures }, (_, i) => markFigure(i)),
  );
  w.flush();
  const text = Buffer.concat(pieces);
  const marks = [JSON.stringify(MARK_NAME), `${MARK_LINE}`];
  for (let i = 0; i < figures; i++) marks.push(`${roundForJson(markFigure(i))}`);
  const cut: Uint8Array[] = [];
  let from = 0;
  for (const mark of marks) {
    const at = text.indexOf(mark, from, 'latin1');
    if (at < 0 || text.lastIndexOf(mark, undefined, 'latin1') !== at) return null;
    cut.push(text.subarray(from, at));
    from = at + mark.length;
  }
  cut.push(text.subarray(from));
  const lead = (first: boolean) => Buffer.concat([Buffer.from(`${first ? '' : ','}\n${'  '.repeat(depth)}`), cut[0]!]);
  const head = lead(false);
  let bytes = head.length + MAX_LINE_BYTES + 2 + figures * MAX_FIGURE_BYTES;
  for (let i = 1; i < cut.length; i++) bytes += cut[i]!.length;
  // An element's fixed text goes into the buffer whole: one longer than a long string (which the
  // buffer has room for past a piece's end) is written member by member, its long values as pieces.
  if (bytes > LONG_TEXT) return null;
  // (The first figure's text as figure() writes it: JSON.stringify's of the rounded figure. No
  // figure, NaN, is kept as NaN, which no figure equals: the runs are then never used.)
  const usual = Number.isFinite(firstFigure) ? firstFigure : Number.NaN;
  const first = Buffer.from(`${roundForJson(usual)}`, 'latin1');
  const runs = cut.slice(1).map(wordsOf);
  return {
    depth,
    head: wordsOf(head),
    headFirst: wordsOf(lead(true)),
    runs,
    afterFigures: runs.slice(2),
    figures,
    bytes,
    firstFigure: usual,
    withFirst: wordsOf(Buffer.concat([cut[2]!, first, cut[3]!])),
  };
}

/** The buffer a writer gave back when it ended, for the next one (see TextWriter.end). */
let spareMemory: [Buffer, DataView] | null = null;
/**
 * An ended writer's buffer: none (a write after the end goes nowhere, or throws, rather than into the next
 * writer's).
 */
const ENDED = Buffer.alloc(0);

/**
 * Writes the text `JSON.stringify(value, null, 2)` prints, as if the value were nested `depth`
 * levels deep (its lines indented by `depth` levels; the first is not indented: it follows
 * whatever came before), as UTF-8 bytes into a buffer that is lent to `emit` every
 * {@link PIECE_BYTES} bytes or so and by {@link TextWriter.flush} (see {@link TakePiece}) — no
 * string per member, no object per state, and no string of the text. Figures are written from
 * their 12 digits (see {@link TextWriter.fig}); a member whose value is the one last written
 * after the same line start is copied whole (see {@link Lead}).
 */
export class TextWriter implements JsonWriter {
  private buf: Buffer;
  private view: DataView;
  private pos = 0;
  /** The depth of the members of the open object or array (that of the top value before any). */
  private depth: number;
  /** Whether the open object or array has no member yet. */
  private first = true;
  /** Whether nothing is open: the next value is the top one and has no line of its own. */
  private top = true;
  /** Pieces handed out so far (bytes written since a count are all in the buffer while it is unchanged). */
  private pieces = 0;
  /** Members written as one copy of bytes kept with their line start (see {@link Lead}): work saved, for tests. */
  copies = 0;
  /** Elements written from a {@link JsonSkeleton} (see {@link skeletal}): for tests. */
  skeletons = 0;
  /** The four ASCII digits of 0 … 9999 as words, and the zeros they end with (see {@link fourDigits}). */
  private readonly digitWords: Int32Array;
  private readonly digitZeros: Uint8Array;
  /** The figure {@link fig} writes, as {@link figures} reads it. */
  private readonly one = new Float64Array(1);

  constructor(
    depth: number,
    private readonly emit: TakePiece,
  ) {
    this.depth = depth;
    [this.buf, this.view] = TextWriter.memory();
    const digits = fourDigits();
    this.digitWords = digits.words;
    this.digitZeros = digits.zeros;
    makeClosesAhead();
  }

  /**
   * A buffer with room for a piece and the longest text written into it at once: the one a
   * writer that has ended gave back ({@link end}), else new (zeroed) memory, so that a run of
   * many short notes does not make a buffer for each.
   */
  private static memory(): [Buffer, DataView] {
    const spare = spareMemory;
    if (spare !== null) {
      spareMemory = null;
      return spare;
    }
    const bytes = new ArrayBuffer(PIECE_BYTES + LONG_TEXT * 4 + 1024);
    return [Buffer.from(bytes), new DataView(bytes)];
  }

  /**
   * Hands out the rest of the text ({@link flush}) and gives the buffer back for the next writer:
   * the taker holds none of it then (a piece it kept was in memory the writer had let go). Nothing
   * may be written after.
   */
  end(): void {
    this.flush();
    spareMemory = [this.buf, this.view];
    this.buf = ENDED;
    this.view = new DataView(ENDED.buffer, ENDED.byteOffset, 0);
  }

  /**
   * Hands out a piece when the buffer is nearly full (there is room after {@link PIECE_BYTES}
   * for a line start and a short value). One method for every writer of a line, so that its call
   * of {@link flush}, made every few hundred lines, has been seen made by the time any of them is
   * compiled (a call never seen made is compiled as a return to the interpreter).
   */
  private room(): void {
    if (this.pos > PIECE_BYTES) this.flush();
  }

  /** Lends out the text written since the last piece. */
  flush(): void {
    if (this.pos === 0) return;
    this.pieces++;
    const kept = this.emit(this.buf.subarray(0, this.pos));
    this.pos = 0;
    if (kept === true) [this.buf, this.view] = TextWriter.memory();
  }

  /** Writes any text as UTF-8 (a long one handed out as a piece of its own). */
  private text(t: string): void {
    if (t.length > LONG_TEXT) {
      this.flush();
      this.pieces++;
      this.emit(Buffer.from(t, 'utf8'));
      return;
    }
    if (this.pos + t.length * 3 > PIECE_BYTES) this.flush();
    this.pos += this.buf.write(t, this.pos, 'utf8');
  }

  /** Writes ASCII text (a number's text, a literal). */
  private ascii(t: string): void {
    const buf = this.buf;
    let p = this.pos;
    for (let i = 0; i < t.length; i++) buf[p++] = t.charCodeAt(i);
    this.pos = p;
  }

  /** Writes bytes made once (see {@link Words}). */
  private words(w: Words): void {
    const view = this.view;
    const p = this.pos;
    const doubles = w.doubles;
    if (doubles !== null) {
      // Most are three doubles or fewer (a line start and a short value): those without a loop.
      const n = doubles.length;
      view.setFloat64(p, doubles[0]!, true);
      if (n > 1) {
        view.setFloat64(p + 8, doubles[1]!, true);
        if (n > 2) {
          view.setFloat64(p + 16, doubles[2]!, true);
          for (let i = 3; i < n; i++) view.setFloat64(p + 8 * i, doubles[i]!, true);
        }
      }
    } else {
      const words = w.words;
      for (let i = 0; i < words.length; i++) view.setInt32(p + 4 * i, words[i]!, true);
    }
    this.pos = p + w.length;
  }

  /**
   * The line start of the next member (its key's, or an element's), not yet written, with room
   * for a short value after it (a figure, a literal, a bracket): hands out a piece first when the
   * buffer is nearly full. Null when there is no lead to write: before the top value, and for a
   * key too long for the buffer (whose line start this writes itself).
   */
  private member(key: JsonKey | null): Lead | null {
    this.room();
    const first = this.first;
    this.first = false;
    if (first && this.top) {
      this.top = false;
      return null;
    }
    if (key?.long) {
      this.text(`${first ? '' : ','}\n${'  '.repeat(this.depth)}${JSON.stringify(key.name)}: `);
      return null;
    }
    return leadOf(key, this.depth, first);
  }

  /** Writes the line start of the next member (see {@link member}). */
  private begin(key: JsonKey | null): void {
    const lead = this.member(key);
    if (lead !== null) this.words(lead);
  }

  /**
   * The bytes from `start` to here (a lead and its value) as {@link Words}, when they are few
   * enough to keep and all still in the buffer (no piece handed out since `pieces` was read).
   */
  private kept(start: number, pieces: number): Words | null {
    if (pieces !== this.pieces || this.pos - start > KEPT_BYTES) return null;
    return wordsOf(this.buf.subarray(start, this.pos));
  }

  /**
   * An element whose text is `skeleton`'s with `name`, `line` and the figures `xs` in its places
   * (see {@link JsonSkeleton}): the fixed text between them goes as a few runs of bytes made once,
   * with one check of the buffer's room for the whole element, no line start looked up and no
   * value compared with the last. False, with nothing written, when the writer is not at the
   * skeleton's depth inside an array (the caller writes the element member by member).
   */
  /** The depth of the members of the open object or array. */
  get openDepth(): number {
    return this.depth;
  }

  /**
   * The skeleton of the elements `members` writes, at the depth of this writer's open array (see
   * {@link jsonSkeleton}).
   */
  skeleton(figures: number, members: SkeletonMembers, firstFigure: number): JsonSkeleton | null {
    return jsonSkeleton(this.depth, figures, members, firstFigure);
  }

  skeletal(skeleton: JsonSkeleton, name: string, line: number, xs: Float64Array): boolean {
    if (this.top || skeleton.depth !== this.depth) return false;
    // The most bytes the element can take: its fixed text, the longest line number and figures
    // (counted in the skeleton), and the name (one that is not plain ASCII goes through text(),
    // which finds its own room).
    if (this.pos + skeleton.bytes + Math.min(name.length, LONG_TEXT) > PIECE_BYTES) this.flush();
    const runs = skeleton.runs;
    this.words(this.first ? skeleton.headFirst : skeleton.head);
    this.first = false;
    this.string(name);
    this.words(runs[0]!);
    this.number(line);
    // The first figure, when it is the skeleton's (a note's pressure), goes with the runs around it.
    const usual = xs[0] === skeleton.firstFigure;
    this.words(usual ? skeleton.withFirst : runs[1]!);
    this.figureRun(xs, usual ? 1 : 0, skeleton.figures, skeleton.afterFigures);
    this.skeletons++;
    return true;
  }

  /** One figure, as {@link figures} writes it (the figure goes there in {@link one}). */
  fig(key: JsonKey | null, x: number | null | undefined): void {
    const one = this.one;
    one[0] = x === null || x === undefined ? Number.NaN : x;
    this.figureMember(key, one, 0);
  }

  figures(row: JsonKeyRow, xs: Float64Array): void {
    const keys = row.keys;
    const n = keys.length;
    if ((this.first && this.top) || row.long) {
      // (The top value, or a key too long for the buffer: member by member, as fig does.)
      for (let i = 0; i < n; i++) this.figureMember(keys[i]!, xs, i);
      return;
    }
    // The keys' line starts at this depth, found once (as member() would find each).
    const at = 2 * this.depth + (this.first ? 0 : 1);
    let leads = row.leads[at];
    if (leads === undefined) {
      leads = keys.map((key, i) => leadOf(key, this.depth, i === 0 && this.first));
      row.leads[at] = leads;
    }
    this.first = false;
    for (let i = 0; i < n; i++) {
      this.room();
      this.figureAfter(leads[i]!, xs, i);
    }
  }

  /** The member of `key` whose figure is `xs[i]` (see {@link figureAfter}). */
  private figureMember(key: JsonKey | null, xs: Float64Array, i: number): void {
    const lead = this.member(key);
    if (lead === null) this.figure(xs, i);
    else this.figureAfter(lead, xs, i);
  }

  /**
   * The line start `lead` and the figure `xs[i]`'s JSON text (see {@link figure}); the same
   * figure as the last one after this line start is copied with the lead (doubles that are equal
   * have one text: ±0 both write 0). The figure is read from the array, not passed: a double
   * passed to a call that is not inlined is boxed (a heap object).
   */
  private figureAfter(lead: Lead, xs: Float64Array, i: number): void {
    const x = xs[i]!;
    if (x === lead.keptFigure) {
      this.words(lead.withFigure!);
      this.copies++;
      return;
    }
    const start = this.pos;
    const pieces = this.pieces;
    this.words(lead);
    this.figure(xs, i);
    // (NaN, null, is never equal to the last figure: it is never kept.)
    if (x !== lead.lastFigure) {
      lead.lastFigure = x;
      lead.figureRun = 1;
    } else if (++lead.figureRun >= KEEP_RUN) {
      lead.withFigure = this.kept(start, pieces);
      if (lead.withFigure !== null) lead.keptFigure = x;
    }
  }

  /**
   * A figure's JSON text, from the 12 digits M of {@link scaledDigits} (the figure is M / 10^s):
   * the digits with the point s places from the right, trailing zeros after the point dropped,
   * and `0.` and zeros before a figure below 1. That is the shortest decimal that reads back as
   * the rounded figure (no other decimal of 12 digits or fewer lies within a unit of its last
   * place), in the positional form JSON uses from 1e-7 to 1e21: so exactly what
   * `JSON.stringify(roundForJson(x))` writes. Any other figure goes through those two, in
   * {@link figureText}. (x is `xs[i]`; NaN and ±Infinity write null.)
   *
   * Every figure of the usual kind runs the same steps, with no branch taken by some figures
   * only: a step that the engine has seen no figure take when it compiles this method is compiled
   * as a return to the interpreter, and the method is compiled again once a figure takes it.
   */
  private figure(xs: Float64Array, i: number): void {
    this.figureRun(xs, i, i + 1, null);
  }

  /**
   * The figures `xs[from]` … `xs[to − 1]` as {@link figure} writes each, each followed by
   * `after[i]` when given (a skeleton's text after each figure): one call for a state's figures,
   * the buffer and tables read once for all.
   */
  private figureRun(xs: Float64Array, from: number, to: number, after: readonly Words[] | null): void {
    const buf = this.buf;
    const view = this.view;
    const digits = this.digitWords;
    const digitZeros = this.digitZeros;
    for (let i = from; i < to; i++) {
      const x = xs[i]!;
      const m = scaledDigits(x < 0 ? -x : x);
      if (m < 0) this.figureText(x);
      else {
        const s = scale;
        // M's first four digits (1000 … 9999) by a multiplication, which may be one off when M is
        // about a multiple of 10⁸: then the rest (exact: whole numbers below 2⁵³) says so.
        let g1 = Math.floor(m * 1e-8) | 0;
        let rest = m - g1 * 1e8;
        if (rest < 0) {
          g1 = (g1 - 1) | 0;
          rest += 1e8;
        } else if (rest >= 1e8) {
          g1 = (g1 + 1) | 0;
          rest -= 1e8;
        }
        rest |= 0;
        const g2 = (rest / 10000) | 0;
        const g3 = (rest - g2 * 10000) | 0;
        // The zeros M ends with (the text drops those after the point): those of its last group
        // that is not 0000, from the table, and four for each 0000 after it (both tests made for
        // every figure, and one look-up: see above).
        const last3 = g3 !== 0;
        const last2 = g2 !== 0;
        const zeros = (last3 ? 0 : last2 ? 4 : 8) + digitZeros[last3 ? g3 : last2 ? g2 : g1]!;
        let p = this.pos;
        if (x < 0) buf[p++] = 0x2d; // -
        if (s < 12) {
          // 12 − s digits before the point: the digits are written one byte on, and those moved back.
          view.setInt32(p + 1, digits[g1]!, true);
          view.setInt32(p + 5, digits[g2]!, true);
          view.setInt32(p + 9, digits[g3]!, true);
          const point = (p + 12 - s) | 0;
          for (let k = p; k < point; k++) buf[k] = buf[k + 1]!;
          buf[point] = 0x2e; // .
          // Digits after the point that are kept: those of the s decimals that are not trailing zeros.
          this.pos = s > zeros ? (point + 1 + s - zeros) | 0 : point;
        } else {
          // Below 1: `0.`, s − 12 zeros (at most 5: the figure is at least 1e-6), the digits. The
          // eight bytes `0.000000` go at once; the digits are written over the zeros not needed.
          view.setFloat64(p, ZERO_POINT_ZEROS, true);
          p = (p + s - 10) | 0;
          view.setInt32(p, digits[g1]!, true);
          view.setInt32(p + 4, digits[g2]!, true);
          view.setInt32(p + 8, digits[g3]!, true);
          this.pos = (p + 12 - zeros) | 0;
        }
      }
      if (after !== null) this.words(after[i]!);
    }
  }

  /** A figure's text the slow way (see {@link figure}): null, or beyond the usual range. */
  private figureText(x: number): void {
    this.ascii(Number.isFinite(x) ? `${roundForJson(x)}` : 'null');
  }
  num(key: JsonKey | null, v: number): void {
    this.begin(key);
    this.number(v);
  }

  /** A number's text as it is (see {@link num}). */
  private number(v: number): void {
    if (v >= 0 && v < 1e9 && Number.isInteger(v)) this.whole(v | 0);
    else this.ascii(Number.isFinite(v) ? `${v}` : 'null');
  }

  /**
   * Writes a whole number 0 ≤ n < 10⁹ (a line number) as its digits: those below 10⁸ as one or
   * two groups of four from the table (the first without its leading zeros), any other digit by digit.
   */
  private whole(n: number): void {
    const view = this.view;
    const digits = this.digitWords;
    let p = this.pos;
    if (n < 100000000) {
      const high = (n / 10000) | 0;
      const low = (n - high * 10000) | 0;
      const first = high === 0 ? low : high;
      // The first group's digits, its leading zeros shifted out (the bytes past them are written
      // over by what follows: the buffer has room for four).
      const length = first < 10 ? 1 : first < 100 ? 2 : first < 1000 ? 3 : 4;
      view.setInt32(p, digits[first]! >>> (32 - 8 * length), true);
      p += length;
      // The second group: always written (past the end when there is none, where it is written
      // over), so that a line number of five digits, first met long after this method is
      // compiled, takes no step of its own (see figure).
      view.setInt32(p, digits[low]!, true);
      this.pos = p + (high !== 0 ? 4 : 0);
      return;
    }
    let length = 1;
    for (let t = n; t >= 10; t = (t / 10) | 0) length++;
    const buf = this.buf;
    p = (p + length) | 0;
    this.pos = p;
    let rest = n;
    do {
      buf[--p] = 0x30 + (rest % 10);
      rest = (rest / 10) | 0;
    } while (rest > 0);
  }

  /**
   * A string member or element; the same string as the last one after this line start (every
   * state's pressure description and kind) is copied with the lead.
   */
  str(key: JsonKey | null, v: string | null | undefined): void {
    if (v === undefined && key !== null) return;
    const lead = this.member(key);
    if (lead === null) {
      this.string(v);
      return;
    }
    if (v === lead.keptString && v !== null) {
      this.words(lead.withString!);
      this.copies++;
      return;
    }
    const start = this.pos;
    const pieces = this.pieces;
    this.words(lead);
    this.string(v);
    // (A string too long to keep is not remembered either: no long string is held on to.)
    if (typeof v !== 'string' || v.length > KEPT_BYTES) return;
    if (v !== lead.lastString) {
      lead.lastString = v;
      lead.stringRun = 1;
    } else if (++lead.stringRun >= KEEP_RUN) {
      lead.withString = this.kept(start, pieces);
      if (lead.withString !== null) lead.keptString = v;
    }
  }

  /** Writes a string's JSON text (null for null or undefined). */
  private string(v: string | null | undefined): void {
    if (v === null || v === undefined) {
      this.ascii('null');
      return;
    }
    const n = v.length;
    if (n <= LONG_TEXT) {
      // The usual name or key: printable ASCII, written as it is between quotes.
      const buf = this.buf;
      let p = this.pos;
      buf[p++] = 0x22;
      let i = 0;
      for (; i < n; i++) {
        const c = v.charCodeAt(i);
        if (!plainAscii(c)) break;
        buf[p++] = c;
      }
      if (i === n) {
        buf[p++] = 0x22;
        this.pos = p;
        return;
      }
    }
    // Anything else (escapes, other characters, a long string) as JSON.stringify writes it.
    this.text(JSON.stringify(v));
  }
  bool(key: JsonKey | null, v: boolean): void {
    const lead = this.member(key);
    if (lead === null) {
      this.ascii(v ? 'true' : 'false');
      return;
    }
    // A lead followed by true or false is kept with each the first time (the members written are few).
    const kept = v ? lead.withTrue : lead.withFalse;
    if (kept !== null) {
      this.words(kept);
      this.copies++;
      return;
    }
    const start = this.pos;
    const pieces = this.pieces;
    this.words(lead);
    this.ascii(v ? 'true' : 'false');
    if (v) lead.withTrue = this.kept(start, pieces);
    else lead.withFalse = this.kept(start, pieces);
  }

  /**
   * An array of strings; the same strings as the last array after this member's line start (a
   * state's defining keys) are copied whole, with the lead, the brackets and the indentation.
   */
  strings(key: JsonKey | null, v: readonly string[]): void {
    const lead = this.member(key);
    if (lead !== null && lead.keptStrings !== null && sameStrings(v, lead.keptStrings)) {
      this.words(lead.withStrings!);
      this.copies++;
      return;
    }
    const start = this.pos;
    const pieces = this.pieces;
    if (lead !== null) this.words(lead);
    if (v.length === 0) this.ascii('[]');
    else {
      this.enter(0x5b); // [
      // By index: an iterator's result objects are not always optimised away (one per name).
      for (let i = 0; i < v.length; i++) this.str(null, v[i]!);
      this.closeArray();
    }
    if (lead === null) return;
    // Only an array short enough to keep is remembered (and copied: the caller's may change).
    if (pieces !== this.pieces || this.pos - start > KEPT_BYTES) lead.lastStrings = null;
    else if (lead.lastStrings === null || !sameStrings(v, lead.lastStrings)) {
      lead.lastStrings = [...v];
      lead.stringsRun = 1;
    } else if (++lead.stringsRun >= KEEP_RUN) {
      lead.withStrings = this.kept(start, pieces);
      lead.keptStrings = lead.lastStrings;
    }
  }
  value(key: JsonKey | null, v: unknown): void {
    if (v === undefined || typeof v === 'function' || typeof v === 'symbol') {
      if (key === null) {
        this.begin(null);
        this.ascii('null');
      }
      return;
    }
    if (v === null || typeof v !== 'object') {
      if (typeof v === 'string') this.str(key, v);
      else {
        this.begin(key);
        this.ascii(JSON.stringify(v));
      }
      return;
    }
    if (Array.isArray(v)) {
      if (v.length === 0) {
        this.begin(key);
        this.ascii('[]');
        return;
      }
      this.openArray(key);
      for (const x of v) this.value(null, x);
      this.closeArray();
      return;
    }
    const o = v as Record<string, unknown>;
    this.open(key);
    for (const k of Object.keys(o)) this.value(jsonKey(k), o[k]);
    this.close();
  }
  open(key: JsonKey | null): void {
    this.begin(key);
    this.enter(0x7b); // {
  }
  close(): void {
    this.leave('}');
  }
  openArray(key: JsonKey | null): void {
    this.begin(key);
    this.enter(0x5b); // [
  }
  /** Writes an opening bracket (after its line start): its members follow, one level deeper. */
  private enter(bracket: number): void {
    this.buf[this.pos++] = bracket;
    this.depth++;
    this.first = true;
  }
  closeArray(): void {
    this.leave(']');
  }
  private leave(bracket: '}' | ']'): void {
    this.depth--;
    this.room();
    // An empty one's bracket is one of the ends too, so that every end takes the same steps (the
    // empty arrays come last in the document, after this is compiled: see figure).
    this.words(closeOf(this.depth, bracket, this.first));
    this.first = false;
  }
}
