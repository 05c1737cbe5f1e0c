/**
 * Short strings of a note that recur (keys, units, numbers as written: `db`, `rh`, `C`, `%`,
 * `24`, `50`), shared instead of copied: a note of many statements keeps one `db` rather than one
 * per property, and reading a property allocates nothing for them once seen. A direct-mapped
 * table on a hash of the characters; a miss (or a collision) slices and takes the slot, so the
 * table holds at most {@link INTERN_SLOTS} strings of at most {@link INTERN_MAX_LENGTH} characters,
 * and each call costs a constant amount of work.
 *
 * A scanner that reads the characters anyway (a key, a number, a unit) folds them into the hash
 * as it goes ({@link hashStep}) and calls {@link internedHashedSlice}, so that the characters are
 * not read once more to hash them.
 */

/** Size of the table (a power of two). */
const INTERN_SLOTS = 4096;
/** Longest string shared; longer ones are rarely written twice. */
const INTERN_MAX_LENGTH = 8;
const table: string[] = Array.from({ length: INTERN_SLOTS }, () => '');
/**
 * Each slot's string again, as its length and its characters ({@link INTERN_MAX_LENGTH} per slot),
 * so that a look-up compares with these contiguous numbers rather than with the string, which
 * lies wherever it was allocated (reading it was most of a look-up's cost).
 */
const slotLengths = new Uint8Array(INTERN_SLOTS);
const slotChars = new Uint16Array(INTERN_SLOTS * INTERN_MAX_LENGTH);

/** The hash of no characters; {@link hashStep} adds one. */
export const HASH_START = 0;

/** The hash of some characters followed by `c` (`hash` is theirs). */
export function hashStep(hash: number, c: number): number {
  return (Math.imul(hash, 31) + c) | 0;
}

/** `text.slice(start, end)`, or an equal string returned by an earlier call. */
export function internedSlice(text: string, start: number, end: number): string {
  if (end - start > INTERN_MAX_LENGTH) return text.slice(start, end);
  let hash = HASH_START;
  for (let i = start; i < end; i++) hash = hashStep(hash, text.charCodeAt(i));
  return internedHashedSlice(text, start, end, hash);
}

/**
 * {@link internedSlice} when the caller has hashed `text[start, end)` already: `hash` is
 * {@link HASH_START} followed by a {@link hashStep} for each character, in order.
 */
export function internedHashedSlice(text: string, start: number, end: number, hash: number): string {
  const length = end - start;
  if (length <= 0 || length > INTERN_MAX_LENGTH) return text.slice(start, end);
  const mixed = hash ^ length;
  const slot = (mixed ^ (mixed >>> 12)) & (INTERN_SLOTS - 1);
  const at = slot * INTERN_MAX_LENGTH;
  if (slotLengths[slot] === length) {
    let i = 0;
    while (i < length && slotChars[at + i] === text.charCodeAt(start + i)) i++;
    if (i === length) return table[slot] as string;
  }
  const fresh = text.slice(start, end);
  table[slot] = fresh;
  slotLengths[slot] = length;
  for (let i = 0; i < length; i++) slotChars[at + i] = text.charCodeAt(start + i);
  return fresh;
}
