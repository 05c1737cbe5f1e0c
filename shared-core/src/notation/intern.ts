/**
 * Short strings of a note that recur (keys, units, numbers as written: `db`, `rh`, `C`, `%`,
 * `24`, `50`), shared instead of copied: a note of many statements keeps one `db` rather than one
 * per property, and reading a property allocates nothing for them once seen. A direct-mapped
 * table on a hash of the characters; a miss (or a collision) slices and takes the slot, so the
 * table holds at most {@link INTERN_SLOTS} strings of at most {@link INTERN_MAX_LENGTH} characters,
 * and each call costs a constant amount of work.
 */

/** Size of the table (a power of two). */
const INTERN_SLOTS = 4096;
/** Longest string shared; longer ones are rarely written twice. */
const INTERN_MAX_LENGTH = 8;
const table: string[] = Array.from({ length: INTERN_SLOTS }, () => '');

/** `text.slice(start, end)`, or an equal string returned by an earlier call. */
export function internedSlice(text: string, start: number, end: number): string {
  const length = end - start;
  if (length <= 0 || length > INTERN_MAX_LENGTH) return text.slice(start, end);
  let hash = length;
  for (let i = start; i < end; i++) hash = (Math.imul(hash, 31) + text.charCodeAt(i)) | 0;
  const slot = (hash ^ (hash >>> 12)) & (INTERN_SLOTS - 1);
  const cached = table[slot] as string;
  if (cached.length === length) {
    let i = 0;
    while (i < length && cached.charCodeAt(i) === text.charCodeAt(start + i)) i++;
    if (i === length) return cached;
  }
  const fresh = text.slice(start, end);
  table[slot] = fresh;
  return fresh;
}
