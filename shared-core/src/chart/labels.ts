/**
 * Placement of the chart's labels without overlaps. Every label (a state's tag, an apparatus dew
 * point, a process or SHR line name, a family line's value) is a box; a box is placed only where
 * it lies inside the plot, covers no marker and meets no label placed before it. Drawn lines
 * (mixing lines, arrows) are a soft cost: a tag crosses one only when nothing better is free.
 *
 * State tags try spots beside their point first, then rings further out (a leader line joins a
 * tag moved away to its point). A label that finds no free spot within the rings is not drawn;
 * the renderer lists it under the chart, so no name is lost. Coincident points share one tag.
 *
 * What lies near a candidate comes from a grid (./grid) and each look-up weighs at most
 * {@link NEAR_LIMIT} items: a spot with more is taken as not free. Every label tries a bounded
 * number of spots, so the cost grows with the number of labels, not its square.
 */
import { Grid, samplesOf, segmentHitsBox, type GridStats } from './grid';
import type { Pixel } from './types';

/** An axis-aligned box, px. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** A label to place: the point it belongs to and the size of its tag. */
export interface LabelRequest {
  anchor: Pixel;
  width: number;
  height: number;
}

/** Where a label went: its box, and whether it sits far enough away to need a leader line. */
export interface PlacedLabel {
  box: Box;
  leader: boolean;
}

/** Rough width of a text run in px at `fontSize` (no DOM to measure with; errs on the wide side). */
export function textWidth(text: string, fontSize: number): number {
  let em = 0;
  for (const ch of text) {
    if (/[ilI.,:;'|!·]/.test(ch)) em += 0.3;
    else if (/[mwMW%]/.test(ch)) em += 0.9;
    else if (/[A-Z0-9_-]/.test(ch)) em += 0.68;
    else em += 0.58;
  }
  return em * fontSize;
}

/** Whether two boxes overlap (touching edges do not). */
export function boxesOverlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

/**
 * At most this many boxes or lines are weighed against one candidate position: beyond that the
 * spot is hopelessly crowded anyway (a pile of states on one point), and weighing more would make
 * the placement cost grow with the square of the chart.
 */
export const NEAR_LIMIT = 48;

/** Work counters of one placement (items weighed), for the cost tests and the benchmark. */
export interface PlacementStats extends GridStats {
  /** Candidate positions scored. */
  candidates: number;
}

/** A rectangle (the plot). */
export interface Bounds {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

/**
 * The space labels are placed in: the plot, the boxes nothing may cover (markers and the labels
 * placed so far) and the lines labels should keep off.
 */
export class LabelSpace {
  private readonly boxes: Box[] = [];
  private readonly boxGrid: Grid;
  private readonly segments: [Pixel, Pixel][] = [];
  private readonly samples: number[] = [];
  private readonly segmentGrid: Grid;

  constructor(
    readonly bounds: Bounds,
    private readonly stats?: PlacementStats,
  ) {
    this.boxGrid = new Grid(bounds, stats);
    this.segmentGrid = new Grid(bounds, stats);
  }

  /** A box no label may cover (a marker, or a label just placed). */
  block(b: Box): void {
    this.boxes.push(b);
    this.boxGrid.addBox(b);
  }

  /** A line labels should keep off where they can. */
  addSegment(a: Pixel, b: Pixel): void {
    this.segments.push([a, b]);
    this.samples.push(samplesOf(a, b));
    this.segmentGrid.addSegment(a, b);
  }

  /** Counts a candidate (for the cost tests). */
  count(): void {
    if (this.stats) this.stats.candidates++;
  }

  /** Whether `b` lies inside the plot (2 px in from its edges). */
  inside(b: Box): boolean {
    const r = this.bounds;
    return b.x >= r.left + 2 && b.y >= r.top + 2 && b.x + b.w <= r.right - 2 && b.y + b.h <= r.bottom - 2;
  }

  /** Whether `b` is inside the plot and overlaps no blocked box (a spot too crowded to weigh is not free). */
  free(b: Box): boolean {
    if (!this.inside(b)) return false;
    const near = this.boxGrid.near(b, NEAR_LIMIT);
    if (near.crowded) return false;
    for (const i of near.items) if (boxesOverlap(b, this.boxes[i]!)) return false;
    return true;
  }

  /** How many lines cross `b` (at most `limit` counted). */
  crossings(b: Box, limit: number): number {
    let hits = 0;
    for (const s of this.segmentGrid.near(b, NEAR_LIMIT).items) {
      const [a, c] = this.segments[s]!;
      if (segmentHitsBox(a, c, b, this.samples[s]!) && ++hits >= limit) break;
    }
    return hits;
  }

  /** Takes the first free spot of `candidates` (each placed by its top-left corner); null when none is free. */
  takeFirst(candidates: Iterable<Box>): Box | null {
    for (const b of candidates) {
      this.count();
      if (this.free(b)) {
        this.block(b);
        return b;
      }
    }
    return null;
  }
}

/** Directions in order of preference: right, up-right, down-right, up, down, left, up-left, down-left. */
const DIRS8: readonly (readonly [number, number])[] = [
  [1, 0],
  [0.72, -0.72],
  [0.72, 0.72],
  [0, -1],
  [0, 1],
  [-1, 0],
  [-0.72, -0.72],
  [-0.72, 0.72],
];
/** Sixteen directions for the far rings (the eight above, then the ones between them). */
const DIRS16: readonly (readonly [number, number])[] = [
  ...DIRS8,
  [0.92, -0.38],
  [0.92, 0.38],
  [0.38, -0.92],
  [0.38, 0.92],
  [-0.38, -0.92],
  [-0.38, 0.92],
  [-0.92, -0.38],
  [-0.92, 0.38],
];
/** Rings of candidate spots: the gap between the point and the tag, px, and the directions tried. */
const RINGS: readonly { gap: number; dirs: readonly (readonly [number, number])[] }[] = [
  { gap: 9, dirs: DIRS8 },
  { gap: 26, dirs: DIRS8 },
  { gap: 46, dirs: DIRS8 },
  { gap: 72, dirs: DIRS16 },
  { gap: 104, dirs: DIRS16 },
  { gap: 144, dirs: DIRS16 },
  { gap: 196, dirs: DIRS16 },
];
/** Candidate spots one tag may try at most (the cost bound per label). */
export const MAX_TAG_CANDIDATES = RINGS.reduce((n, r) => n + r.dirs.length, 0);
/** Cost of moving one ring out, and of a line crossing the tag (a tag crosses a line rather than move 4 rings out). */
const RING_COST = 40;
const CROSSING_COST = 150;

/**
 * Places the tags of points, in order from the top of the chart down. Each takes the free spot
 * of least cost (rings out, then direction, then lines crossed); null when no spot is free.
 * Markers must already be blocked in `space`; each placed tag is blocked in turn.
 */
export function placeTags(space: LabelSpace, requests: readonly LabelRequest[]): (PlacedLabel | null)[] {
  const placed: (PlacedLabel | null)[] = new Array(requests.length).fill(null);
  const order = requests
    .map((_, i) => i)
    .sort((i, j) => requests[i]!.anchor.y - requests[j]!.anchor.y || requests[i]!.anchor.x - requests[j]!.anchor.x);
  for (const i of order) {
    const req = requests[i]!;
    let best: { box: Box; score: number; ring: number } | null = null;
    for (let ring = 0; ring < RINGS.length; ring++) {
      // No spot further out can beat one found already.
      if (best && best.score <= ring * RING_COST) break;
      const { gap, dirs } = RINGS[ring]!;
      for (let k = 0; k < dirs.length; k++) {
        const [dx, dy] = dirs[k]!;
        const cx = req.anchor.x + dx * (gap + req.width / 2);
        const cy = req.anchor.y + dy * (gap + req.height / 2);
        const box: Box = { x: cx - req.width / 2, y: cy - req.height / 2, w: req.width, h: req.height };
        space.count();
        const base = ring * RING_COST + k * 3;
        if (best && base >= best.score) continue;
        if (!space.free(box)) continue;
        const score = base + CROSSING_COST * space.crossings(box, 3);
        if (!best || score < best.score) best = { box, score, ring };
      }
    }
    if (!best) continue;
    space.block(best.box);
    placed[i] = { box: best.box, leader: best.ring > 0 };
  }
  return placed;
}
