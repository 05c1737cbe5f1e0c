/**
 * A uniform grid over the plot for the label placement's "what is near this box" questions, so
 * placing n labels costs about n look-ups of a few cells each instead of n × n comparisons.
 *
 * The grid covers a fixed rectangle (the plot and a margin) with a bounded number of cells;
 * anything outside it is filed in the edge cells, so a look-up still finds every item that could
 * touch the box asked about (a superset: callers do the exact test). A look-up visits at most
 * `limit` distinct items and says when there were more (a pile of labels on one spot): the cost
 * of one look-up never grows with the chart.
 */
import type { Box } from './labels';
import type { Pixel } from './types';

/** Side of a cell, px (about a label's height: a tag covers a handful of cells). */
const CELL = 32;
/** At most this many cells across or down (a huge plot gets bigger cells, never more of them). */
const MAX_CELLS_PER_SIDE = 128;

/** Work done by look-ups (items visited), for the cost tests and the benchmark. */
export interface GridStats {
  visited: number;
}

/** A grid of item indices over a rectangle. */
export class Grid {
  private readonly x0: number;
  private readonly y0: number;
  private readonly nx: number;
  private readonly ny: number;
  private readonly size: number;
  private readonly cells: (number[] | undefined)[];
  /** The look-up in which each item was last seen (to visit each once per look-up). */
  private seen = new Uint32Array(64);
  private stamp = 0;
  /** Reused by every look-up (its answer is read before the next one). */
  private buffer = new Int32Array(0);
  private count = 0;

  constructor(
    area: { left: number; top: number; right: number; bottom: number },
    private readonly stats?: GridStats,
  ) {
    const margin = 64;
    this.x0 = area.left - margin;
    this.y0 = area.top - margin;
    const w = Math.max(1, area.right - area.left + 2 * margin);
    const h = Math.max(1, area.bottom - area.top + 2 * margin);
    this.size = Math.max(CELL, w / MAX_CELLS_PER_SIDE, h / MAX_CELLS_PER_SIDE);
    this.nx = Math.max(1, Math.ceil(w / this.size));
    this.ny = Math.max(1, Math.ceil(h / this.size));
    this.cells = new Array(this.nx * this.ny);
  }

  private col(x: number): number {
    const c = Math.floor((x - this.x0) / this.size);
    return c < 0 ? 0 : c >= this.nx ? this.nx - 1 : Number.isFinite(c) ? c : 0;
  }

  private row(y: number): number {
    const r = Math.floor((y - this.y0) / this.size);
    return r < 0 ? 0 : r >= this.ny ? this.ny - 1 : Number.isFinite(r) ? r : 0;
  }

  private grow(item: number): void {
    if (item < this.seen.length) return;
    const bigger = new Uint32Array(Math.max(item + 1, this.seen.length * 2));
    bigger.set(this.seen);
    this.seen = bigger;
  }

  private file(cell: number, item: number): void {
    const list = this.cells[cell];
    if (!list) this.cells[cell] = [item];
    else if (list[list.length - 1] !== item) list.push(item);
  }

  /** Files a box; returns its item index (0, 1, 2… in the order added). */
  addBox(b: Box): number {
    const item = this.count++;
    this.grow(item);
    const c1 = this.col(b.x + b.w);
    const r1 = this.row(b.y + b.h);
    for (let r = this.row(b.y); r <= r1; r++)
      for (let c = this.col(b.x); c <= c1; c++) this.file(r * this.nx + c, item);
    return item;
  }

  /**
   * Files a segment by the points {@link segmentHitsBox} tests on it (so a look-up of any box
   * that one of those points lies in finds it); returns its item index.
   */
  addSegment(a: Pixel, b: Pixel): number {
    const item = this.count++;
    this.grow(item);
    const n = samplesOf(a, b);
    for (let i = 0; i <= n; i++) {
      const x = a.x + ((b.x - a.x) * i) / n;
      const y = a.y + ((b.y - a.y) * i) / n;
      this.file(this.row(y) * this.nx + this.col(x), item);
    }
    return item;
  }

  /**
   * The items filed in the cells `b` covers, each once, in the order they were added; at most
   * `limit` of them. `crowded` is true when more were there (the list is then a part only).
   */
  near(b: Box, limit: number): { items: Int32Array; crowded: boolean } {
    this.stamp++;
    if (this.buffer.length < limit) this.buffer = new Int32Array(limit);
    const buf = this.buffer;
    let count = 0;
    const c0 = this.col(b.x);
    const c1 = this.col(b.x + b.w);
    const r1 = this.row(b.y + b.h);
    let crowded = false;
    outer: for (let r = this.row(b.y); r <= r1; r++) {
      for (let c = c0; c <= c1; c++) {
        const list = this.cells[r * this.nx + c];
        if (!list) continue;
        if (this.stats) this.stats.visited += list.length;
        for (let k = 0; k < list.length; k++) {
          const item = list[k]!;
          if (this.seen[item] === this.stamp) continue;
          if (count >= limit) {
            crowded = true;
            break outer;
          }
          this.seen[item] = this.stamp;
          buf[count++] = item;
        }
      }
    }
    // In the order added (typed-array sort: numeric, no comparator).
    const items = buf.subarray(0, count);
    if (count > 1) items.sort();
    return { items, crowded };
  }
}

/** How many steps a segment is sampled in (about one per 3 px, at least 2). */
export function samplesOf(a: Pixel, b: Pixel): number {
  return Math.max(2, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / 3));
}

/**
 * Whether one of the segment's sample points (about every 3 px, ends included) lies in the
 * box, edges included: the sampled test the placement has always used, answered in constant
 * time by clipping the segment to the box and checking only the samples at the ends of the
 * clipped part (those strictly inside it are inside the box).
 */
export function segmentHitsBox(a: Pixel, b: Pixel, r: Box, n: number = samplesOf(a, b)): boolean {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  // Liang–Barsky: the parameter range [t0, t1] of the segment that lies in the box.
  let t0 = 0;
  let t1 = 1;
  const left = a.x - r.x;
  const right = r.x + r.w - a.x;
  const top = a.y - r.y;
  const bottom = r.y + r.h - a.y;
  if (dx === 0) {
    if (left < 0 || right < 0) return false;
  } else if (dx > 0) {
    t0 = Math.max(t0, left / -dx);
    t1 = Math.min(t1, right / dx);
  } else {
    t0 = Math.max(t0, right / dx);
    t1 = Math.min(t1, left / -dx);
  }
  if (dy === 0) {
    if (top < 0 || bottom < 0) return false;
  } else if (dy > 0) {
    t0 = Math.max(t0, top / -dy);
    t1 = Math.min(t1, bottom / dy);
  } else {
    t0 = Math.max(t0, bottom / dy);
    t1 = Math.min(t1, top / -dy);
  }
  const slack = 1e-7;
  if (t0 > t1 + slack) return false;
  const lo = Math.max(0, Math.floor((t0 - slack) * n));
  const hi = Math.min(n, Math.ceil((t1 + slack) * n));
  if (lo > hi) return false;
  // Samples well inside the clipped part are inside the box; near its ends, test exactly.
  if (hi - lo >= 4) return true;
  for (let i = lo; i <= hi; i++) {
    const x = a.x + (dx * i) / n;
    const y = a.y + (dy * i) / n;
    if (x >= r.x && x <= r.x + r.w && y >= r.y && y <= r.y + r.h) return true;
  }
  return false;
}
