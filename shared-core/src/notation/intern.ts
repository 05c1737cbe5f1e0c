/**
 * Short strings of a note that recur (keys, units, numbers as written: `db`, `rh`, `C`, `%`,
 * `24`, `50`), shared instead of copied: a note of many statements keeps one `db` rather than one
 * per property, and reading a property allocates nothing for them once seen. A direct-mapped
 * table; a miss (or a collision) slices and takes the slot, so the table holds at most
 * {@link INTERN_SLOTS} strings of at most {@link INTERN_MAX_LENGTH} characters, and each call
 * costs a constant amount of work.
 *
 * A string of at most {@link PACK_MAX_LENGTH} characters below 256 (nearly every key, unit and
 * number) is also one exact number, its *pack* ({@link packStep}): the table keeps each slot's
 * pack, and a look-up compares one number instead of the characters. A scanner that reads the
 * characters anyway (a key, a number, a unit) packs them as it goes and calls
 * {@link internedPackedSlice}, so that they are not read again. Any other string is hashed and
 * compared character by character.
 */

/** Bits of a slot number. */
const SLOT_BITS = 12;
/** Size of the table. */
const INTERN_SLOTS = 2 ** SLOT_BITS;
/** Longest string shared; longer ones are rarely written twice. */
const INTERN_MAX_LENGTH = 8;
/** Longest string that has a pack: 6 characters of 8 bits and the length stay below 2^53. */
const PACK_MAX_LENGTH = 6;
/** 2^48: the pack's length digit (above the six character bytes). */
const PACK_LENGTH_UNIT = 2 ** 48;
const table: string[] = Array.from({ length: INTERN_SLOTS }, () => '');
/** Each slot's pack with its length (see {@link internedPackedSlice}), or -1 for a string that has none. */
const slotPacks = new Float64Array(INTERN_SLOTS).fill(-1);

/** The pack of no characters; {@link packStep} adds one. */
export const PACK_START = 0;

/**
 * The pack of some characters followed by `c` (`pack` is theirs): base 256, exact while there are
 * at most {@link PACK_MAX_LENGTH} characters and each is below 256. A scanner also keeps the
 * bitwise or of the characters (`wide`), which tells whether one is 256 or above.
 */
export function packStep(pack: number, c: number): number {
  return pack * 256 + c;
}

/**
 * The slot of a 32-bit hash: the top {@link SLOT_BITS} bits of its product with 2^32 divided by the
 * golden ratio (multiplicative hashing), where every bit of the hash counts. (Folding the hash's
 * own bits onto each other, as before, put the last and the fourth-last character of a number in
 * the same bits: `23.7` and `73.2` shared a slot, and a note's numbers missed the table about
 * six times in ten.)
 */
function slotOfHash(hash: number): number {
  return Math.imul(hash, 0x9e3779b1) >>> (32 - SLOT_BITS);
}

/** `text.slice(start, end)`, or an equal string returned by an earlier call. */
export function internedSlice(text: string, start: number, end: number): string {
  const length = end - start;
  if (length <= 0 || length > INTERN_MAX_LENGTH) return text.slice(start, end);
  // Too long for a pack: hashed (reading the characters once).
  if (length > PACK_MAX_LENGTH) return internedByCharacters(text, start, end);
  let pack = PACK_START;
  let wide = 0;
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    pack = packStep(pack, c);
    wide |= c;
  }
  return internedPackedSlice(text, start, end, pack, wide);
}

/**
 * {@link internedSlice} when the caller has read `text[start, end)` already: `pack` is
 * {@link PACK_START} followed by a {@link packStep} for each character, in order, and `wide` the
 * bitwise or of the characters.
 */
export function internedPackedSlice(text: string, start: number, end: number, pack: number, wide: number): string {
  const length = end - start;
  if (length <= 0 || length > INTERN_MAX_LENGTH) return text.slice(start, end);
  if (length > PACK_MAX_LENGTH || wide > 0xff) return internedByCharacters(text, start, end);
  // The pack with the string's length above its characters (equal only for equal strings), and
  // its slot from its low and high 32 bits (`| 0` keeps the low 32 bits of an integer-valued
  // double, and multiplying by 2^-32 is exact; a `%` would cost a division). Written out here
  // rather than in helpers of their own: this runs for most keys, numbers and units of a note,
  // and each call costs the interpreter more than the arithmetic, before the engine compiles it.
  const key = pack + length * PACK_LENGTH_UNIT;
  // `slotOfHash`, written out too.
  const slot = Math.imul((key | 0) ^ Math.imul((key * 2 ** -32) | 0, 0x85ebca6b), 0x9e3779b1) >>> (32 - SLOT_BITS);
  if (slotPacks[slot] === key) return table[slot] as string;
  const fresh = text.slice(start, end);
  table[slot] = fresh;
  slotPacks[slot] = key;
  return fresh;
}

/** The look-up of a string that has no pack: its slot from a hash, compared character by character. */
function internedByCharacters(text: string, start: number, end: number): string {
  const length = end - start;
  let hash = length;
  for (let i = start; i < end; i++) hash = (Math.imul(hash, 31) + text.charCodeAt(i)) | 0;
  const slot = slotOfHash(hash);
  const cached = table[slot] as string;
  if ((slotPacks[slot] as number) < 0 && cached.length === length) {
    let i = 0;
    while (i < length && cached.charCodeAt(i) === text.charCodeAt(start + i)) i++;
    if (i === length) return cached;
  }
  const fresh = text.slice(start, end);
  table[slot] = fresh;
  slotPacks[slot] = -1;
  return fresh;
}
