/**
 * Names → the index of the statement that first defines each: the evaluator's registry of the
 * names defined so far (see `./names`), which every statement that defines a name writes to.
 *
 * A `Map` keyed by the names costs several cache misses per name in a note of many thousand: on
 * its way to a name's slot it compares the name with the names it meets, reading each of them.
 * Here the slots are two typed arrays, each name's hash and the place of the name in the list of
 * names, filled by linear probing: registering a name reads its own characters (for the hash),
 * one run of slots and, only when two hashes are equal, the other name. The table doubles when
 * half full, from the hashes alone.
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

/** FNV-1a over the UTF-16 code units of `s` (32-bit): the table's hash of a name. */
export function nameHash(s: string): number {
  let h = 0x811c9dc5 | 0;
  for (let i = 0; i < s.length; i++) h = Math.imul(h ^ s.charCodeAt(i), 0x01000193);
  return h;
}

/** Name → index of its first definition (see the module comment). */
export class NameTable {
  /** The names, in the order they were added. */
  private readonly names: string[] = [];
  /** The value of each name, in the same order. */
  private readonly values: number[] = [];
  /** Per slot: the place in {@link names} plus one, or 0 for an empty slot. */
  private places = new Int32Array(FIRST_SLOTS);
  /** Per slot: the hash of its name. */
  private hashes = new Int32Array(FIRST_SLOTS);
  /** Every name when probing ran too long (then the only table in use). */
  private map: Map<string, number> | null = null;

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
    this.names.push(name);
    this.values.push(value);
    if (this.names.length * 2 > this.places.length) this.grow();
    else this.put(h, this.names.length);
    return true;
  }

  /**
   * The place of `name` in {@link names}; -1 when absent; -2 when the probe ran longer than
   * {@link MAX_PROBE} slots (every name is in {@link map} then).
   */
  private find(name: string, h: number): number {
    const places = this.places;
    const mask = places.length - 1;
    let slot = h & mask;
    for (let probe = 0; probe < MAX_PROBE; probe++) {
      const p = places[slot]!;
      if (p === 0) return -1;
      if (this.hashes[slot] === h && this.names[p - 1] === name) return p - 1;
      slot = (slot + 1) & mask;
    }
    this.toMap();
    return -2;
  }

  /**
   * Puts place `p` (plus one) with hash `h` in the first free slot of its run (no check for a long
   * run: {@link find} came first).
   */
  private put(h: number, p: number): void {
    const places = this.places;
    const mask = places.length - 1;
    let slot = h & mask;
    while (places[slot] !== 0) slot = (slot + 1) & mask;
    places[slot] = p;
    this.hashes[slot] = h;
  }

  /** Twice the slots, refilled from the stored hashes (the names themselves are not read). */
  private grow(): void {
    const oldPlaces = this.places;
    const oldHashes = this.hashes;
    this.places = new Int32Array(oldPlaces.length * 2);
    this.hashes = new Int32Array(oldPlaces.length * 2);
    for (let slot = 0; slot < oldPlaces.length; slot++) {
      const p = oldPlaces[slot]!;
      if (p !== 0) this.put(oldHashes[slot]!, p);
    }
    // The name just added, whose slot is not taken yet.
    const last = this.names.length;
    this.put(nameHash(this.names[last - 1]!), last);
  }

  /** Moves every name to {@link map} (see the module comment). */
  private toMap(): void {
    if (this.map) return;
    const map = new Map<string, number>();
    for (let i = 0; i < this.names.length; i++) map.set(this.names[i]!, this.values[i]!);
    this.map = map;
  }

  private addToMap(name: string, value: number): boolean {
    const map = this.map!;
    if (map.has(name)) return false;
    map.set(name, value);
    return true;
  }
}
