/**
 * Names → the index of the statement that first defines each: the evaluator's registry of the
 * names defined so far (see `./names`), which every statement that defines a name writes to.
 *
 * A `Map` keyed by the names costs several cache misses per name in a note of many thousand: on
 * its way to a name's slot it compares the name with the names it meets, reading each of them.
 * Here everything is kept in typed arrays, with no object per name: the slots (a byte each that
 * marks the hash of its name, and its name's place; filled by linear probing), and per place the
 * name's hash, its characters (one pool of UTF-16 code units) and its value. Registering a name
 * reads its own characters (for the hash), one run of marks and, only when a mark is equal, that
 * slot's place and hash and, when the hashes are equal too, the other name's characters; a new
 * name's characters are copied to the pool. The table doubles when half full, from the hashes
 * alone. Keeping the characters rather than the strings also leaves the garbage collector nothing
 * to trace or move per name.
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
 * The most slots a table is first made with for the names it expects (2^20: 5 MB); past them it
 * grows as it fills.
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

/**
 * The mark of a hash in the slot it takes (1 … 255; 0 marks an empty slot): its top eight bits,
 * which the slot's number (the low bits) does not hold.
 */
function markOf(h: number): number {
  return h >>> 24 || 1;
}

/** Name → index of its first definition (see the module comment). */
export class NameTable {
  /**
   * Per slot, one byte: the mark of the hash of its name ({@link markOf}), 0 for an empty slot.
   * The run of slots a name is looked for in is read here, in a quarter of the memory of the
   * places, which stays in the processor's cache for a table of many thousand names; the slot's
   * place is read only when the marks are equal (a new name meets an equal mark about once in
   * 255 slots).
   */
  private marks: Uint8Array;
  /** Per slot: the place of its name (when its mark is not 0). */
  private placeOfSlot: Int32Array;
  /** How many names there are (their places are 0 … count − 1, in the order they were added). */
  private count = 0;
  /** Per place: the hash of its name (the table doubles from these, without reading the names). */
  private hashes: Int32Array;
  /** Per place: where its name's characters start in {@link chars}; entry `count` is where the next starts. */
  private starts: Int32Array;
  /** Per place: the value of its name. */
  private values: Int32Array;
  /** The characters of the names, one after the other. */
  private chars: Uint16Array;
  /** Every name when probing ran too long (then the only table in use). */
  private map: Map<string, number> | null = null;
  /** The empty slot that ended the last {@link find} of an absent name (where that name goes). */
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
    this.marks = new Uint8Array(slots);
    this.placeOfSlot = new Int32Array(slots);
    this.hashes = new Int32Array(places);
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
    this.append(name, h, value);
    if (this.count * 2 > this.marks.length) this.grow();
    else {
      // The slot the search ended at, free (no second probe).
      this.marks[this.free] = markOf(h);
      this.placeOfSlot[this.free] = this.count - 1;
    }
    return true;
  }

  /**
   * The place of `name`; -1 when absent (the empty slot found is {@link free}); -2 when the probe
   * ran longer than {@link MAX_PROBE} slots (every name is in {@link map} then).
   */
  private find(name: string, h: number): number {
    const marks = this.marks;
    const mask = marks.length - 1;
    const mark = markOf(h);
    let slot = h & mask;
    for (let probe = 0; probe < MAX_PROBE; probe++) {
      const m = marks[slot]!;
      if (m === 0) {
        this.free = slot;
        return -1;
      }
      if (m === mark) {
        const p = this.placeOfSlot[slot]!;
        if (this.hashes[p] === h && this.isNameAt(p, name)) return p;
      }
      slot = (slot + 1) & mask;
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

  /** Adds `name`, of hash `h`, with `value` at the next place (its characters to the pool). */
  private append(name: string, h: number, value: number): void {
    const place = this.count;
    if (place === this.values.length) {
      this.values = grown(this.values, 2 * place);
      this.hashes = grown(this.hashes, 2 * place);
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
    this.hashes[place] = h;
    this.values[place] = value;
    this.count = place + 1;
  }

  /**
   * Twice the slots, every name placed again from its stored hash (the names themselves are not
   * read), in the order of their places (the name just added last, its slot not taken yet).
   */
  private grow(): void {
    const n = this.marks.length * 2;
    const marks = new Uint8Array(n);
    const placeOfSlot = new Int32Array(n);
    const mask = n - 1;
    for (let p = 0; p < this.count; p++) {
      const h = this.hashes[p]!;
      let slot = h & mask;
      while (marks[slot] !== 0) slot = (slot + 1) & mask;
      marks[slot] = markOf(h);
      placeOfSlot[slot] = p;
    }
    this.marks = marks;
    this.placeOfSlot = placeOfSlot;
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

/** `a` copied into a new array of `n` elements. */
function grown(a: Int32Array, n: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(n);
  b.set(a);
  return b;
}
