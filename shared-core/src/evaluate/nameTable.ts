/**
 * Names → the index of the statement that first defines each: the evaluator's registry of the
 * names defined so far (see `./names`), which every statement that defines a name writes to.
 *
 * A `Map` keyed by the names costs several cache misses per name in a note of many thousand: on
 * its way to a name's slot it compares the name with the names it meets, reading each of them.
 * Here everything is kept in typed arrays, with no object per name: the slots (filled by linear
 * probing), each two 32-bit words side by side, the hash of its name and its name's place plus
 * one (0: an empty slot), and per place the name's characters (one pool of UTF-16 code units)
 * and its value. Registering a name reads its own characters (for the hash), one run of slots
 * and, only when a slot's hash is equal, the other name's characters; a new name's characters
 * are copied to the pool. A slot's hash and place are one 8-byte entry of one array, so a name
 * met in a slot costs one cache miss, not one per array, and the whole 32-bit hash is compared
 * there: two names of a note rarely share one, so the comparison of characters (a branch the
 * engine's optimised code may not have met yet) is next to never taken for a new name. The table
 * doubles when half full, from the hashes alone. Keeping the characters rather than the strings
 * also leaves the garbage collector nothing to trace or move per name.
 *
 * The hash is not keyed, so names could be written to collide: a probe that runs longer than
 * {@link MAX_PROBE} slots moves every name to a `Map` (whose hash is keyed per process), and the
 * table answers from it from then on. Each operation therefore costs at most a bounded number of
 * probes, and a note's names cost time in proportion to their number and length.
 */

/** The longest run of slots a look-up may probe before the table turns into a Map. */
export const MAX_PROBE = 64;

/** Slots of a new table (a power of two). */
export const FIRST_SLOTS = 256;

/** Names a new table has room for before its lists of places grow. */
const FIRST_PLACES = 128;

/** Characters a new table has room for before its pool grows. */
const FIRST_CHARS = 1024;

/**
 * The most slots a table is first made with for the names it expects (2^20: 8 MB of slots); past
 * them it grows as it fills.
 */
const MOST_FIRST_SLOTS = 1 << 20;

/** Characters per expected name that a table first has room for (a name of a note is short: `OA`, `S12`). */
const CHARS_PER_EXPECTED_NAME = 6;

/** FNV-1a over the UTF-16 code units of `s` (32-bit): the table's hash of a name. */
export function nameHash(s: string): number {
  let h = 0x811c9dc5 | 0;
  for (let i = 0; i < s.length; i++) h = Math.imul(h ^ s.charCodeAt(i), 0x01000193);
  return h;
}

/** Name → index of its first definition (see the module comment). */
export class NameTable {
  /**
   * Per slot, two words: at `2·slot` the hash of its name, at `2·slot + 1` its name's place plus
   * one, 0 for an empty slot (see the module comment). Its length is twice the number of slots.
   */
  private slots: Int32Array;
  /** How many names there are (their places are 0 … count − 1, in the order they were added). */
  private count = 0;
  /** Per place: where its name's characters start in {@link chars}; entry `count` is where the next starts. */
  private starts: Int32Array;
  /** Per place: the value of its name. */
  private values: Int32Array;
  /** The characters of the names, one after the other. */
  private chars: Uint16Array;
  /** Every name when probing ran too long (then the only table in use). */
  private map: Map<string, number> | null = null;
  /**
   * The empty slot that ended the last {@link find} of an absent name (where that name goes):
   * its first word's index in {@link slots}.
   */
  private free = 0;

  /**
   * @param expected  about how many names the table will hold (a guess; 0 when unknown). It is
   *   made with room for them (up to {@link MOST_FIRST_SLOTS} slots): a table that doubles as it
   *   fills moves every name at each doubling, twice the work of placing them once, and copies its
   *   lists. Room not used costs address space only: the arrays are made zeroed, and the system
   *   gives memory to a page of them when it is first written.
   */
  constructor(expected = 0) {
    let slots = FIRST_SLOTS;
    while (slots < 2 * expected && slots < MOST_FIRST_SLOTS) slots *= 2;
    const places = Math.max(FIRST_PLACES, slots / 2);
    this.slots = new Int32Array(2 * slots);
    this.starts = new Int32Array(places + 1);
    this.values = new Int32Array(places);
    this.chars = new Uint16Array(Math.max(FIRST_CHARS, places * CHARS_PER_EXPECTED_NAME));
  }

  /** The value of `name`, or -1 when it has none. */
  get(name: string): number {
    if (this.map) return this.map.get(name) ?? -1;
    const place = this.find(name, nameHash(name));
    return place >= 0 ? this.values[place]! : place === -1 ? -1 : (this.map!.get(name) ?? -1);
  }

  /** True when `name` has a value. */
  has(name: string): boolean {
    return this.get(name) !== -1;
  }

  /** Gives `name` the value `value` (≥ 0) unless it has one; true when it was new. */
  add(name: string, value: number): boolean {
    if (this.map) return this.addToMap(name, value);
    const h = nameHash(name);
    const place = this.find(name, h);
    if (place >= 0) return false;
    if (place === -2) return this.addToMap(name, value);
    this.append(name, value);
    if (this.count > this.slots.length >> 2) this.grow(h);
    else {
      // The slot the search ended at, free (no second probe).
      this.slots[this.free] = h;
      this.slots[this.free + 1] = this.count;
    }
    return true;
  }

  /**
   * The place of `name`, of hash `h`; -1 when absent (the empty slot found is {@link free}); -2
   * when the probe ran longer than {@link MAX_PROBE} slots (every name is in {@link map} then).
   */
  private find(name: string, h: number): number {
    const slots = this.slots;
    // `at` is a slot's first word: even, 2·slot (so the slots wrap at `wrap`, their words' count − 2).
    const wrap = slots.length - 2;
    let at = (h << 1) & wrap;
    let probes = 0;
    for (;;) {
      // Everything a probe works out is worked out before the test of an empty slot. While the
      // table is nearly empty (the first few thousand names: while the engine collects type
      // feedback for this code) the first slot probed is nearly always empty; arithmetic met
      // only past a taken slot would be met for the first time by optimised code, which throws
      // itself away on it. Past the test only choices between values already known remain.
      const taken = slots[at + 1]!;
      const sameHash = slots[at] === h;
      const next = (at + 2) & wrap;
      probes++;
      const last = probes === MAX_PROBE;
      if (taken === 0) {
        this.free = at;
        return -1;
      }
      if (sameHash && this.isNameAt(taken - 1, name)) return taken - 1;
      if (last) break;
      at = next;
    }
    this.toMap();
    return -2;
  }

  /** True when the name at `place` is `name`. */
  private isNameAt(place: number, name: string): boolean {
    const start = this.starts[place]!;
    if (this.starts[place + 1]! - start !== name.length) return false;
    const chars = this.chars;
    for (let i = 0; i < name.length; i++) if (chars[start + i] !== name.charCodeAt(i)) return false;
    return true;
  }

  /** The name at `place`, as a string (for the move to a Map only). */
  private nameAt(place: number): string {
    let s = '';
    for (let i = this.starts[place]!; i < this.starts[place + 1]!; i++) s += String.fromCharCode(this.chars[i]!);
    return s;
  }

  /** Adds `name` with `value` at the next place (its characters to the pool). */
  private append(name: string, value: number): void {
    const place = this.count;
    if (place === this.values.length) {
      this.values = grown(this.values, 2 * place);
      this.starts = grown(this.starts, 2 * place + 1);
    }
    const start = this.starts[place]!;
    const end = start + name.length;
    if (end > this.chars.length) {
      let n = 2 * this.chars.length;
      while (n < end) n *= 2;
      const chars = new Uint16Array(n);
      chars.set(this.chars);
      this.chars = chars;
    }
    const chars = this.chars;
    for (let i = 0; i < name.length; i++) chars[start + i] = name.charCodeAt(i);
    this.starts[place + 1] = end;
    this.values[place] = value;
    this.count = place + 1;
  }

  /**
   * Twice the slots, every name placed again from the hash in its slot (the names themselves are
   * not read), and the name just added last (of hash `h`, its slot not taken yet).
   */
  private grow(h: number): void {
    const old = this.slots;
    const slots = new Int32Array(2 * old.length);
    const mask = (slots.length >> 1) - 1;
    for (let at = 0; at < old.length; at += 2) {
      const taken = old[at + 1]!;
      if (taken !== 0) place(slots, mask, old[at]!, taken);
    }
    place(slots, mask, h, this.count);
    this.slots = slots;
  }

  /** Moves every name to {@link map} (see the module comment). */
  private toMap(): void {
    if (this.map) return;
    const map = new Map<string, number>();
    for (let i = 0; i < this.count; i++) map.set(this.nameAt(i), this.values[i]!);
    this.map = map;
  }

  private addToMap(name: string, value: number): boolean {
    const map = this.map!;
    if (map.has(name)) return false;
    map.set(name, value);
    return true;
  }
}

/**
 * Puts the name of hash `h` and place `taken` − 1 in the first empty slot of its run in `slots`
 * (of `mask` + 1 slots).
 */
function place(slots: Int32Array, mask: number, h: number, taken: number): void {
  let slot = h & mask;
  while (slots[2 * slot + 1] !== 0) slot = (slot + 1) & mask;
  slots[2 * slot] = h;
  slots[2 * slot + 1] = taken;
}

/** `a` copied into a new array of `n` elements. */
function grown(a: Int32Array, n: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(n);
  b.set(a);
  return b;
}
