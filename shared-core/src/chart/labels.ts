/**
 * Placement of the state labels: each label is a tag beside its point, at the candidate
 * position that overlaps least with other tags, points, drawn lines and the plot edge (greedy,
 * in order of the points from top to bottom). What lies near a candidate comes from a grid
 * (./grid), so the cost grows with the number of labels, not its square.
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

function overlap(a: Box, b: Box): number {
  const w = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

/**
 * At most this many tags, points or lines are weighed against one candidate position: beyond
 * that the spot is hopelessly crowded anyway (a pile of states on one point), and weighing more
 * would make the placement cost grow with the square of the chart.
 */
export const NEAR_LIMIT = 48;

/** Work counters of one placement (items weighed), for the cost tests and the benchmark. */
export interface PlacementStats extends GridStats {
  /** Candidate positions scored. */
  candidates: number;
}

/** Directions in order of preference: right, up-right, down-right, up, down, left, up-left, down-left. */
const DIRS: readonly (readonly [number, number])[] = [
  [1, 0],
  [0.72, -0.72],
  [0.72, 0.72],
  [0, -1],
  [0, 1],
  [-1, 0],
  [-0.72, -0.72],
  [-0.72, 0.72],
];
const RINGS: readonly (readonly [number, number])[] = [
  [0, 9],
  [1, 26],
  [2, 46],
];

/**
 * Places the labels. `markers` are every point's own box (a label should not cover any point),
 * `segments` the mixing lines and process arrows, `bounds` the plot rectangle. Near-linear: each
 * candidate is weighed against what a grid finds near it (at most {@link NEAR_LIMIT} of each kind).
 */
export function placeLabels(
  requests: LabelRequest[],
  markers: Box[],
  segments: [Pixel, Pixel][],
  bounds: { left: number; top: number; right: number; bottom: number },
  stats?: PlacementStats,
): PlacedLabel[] {
  const placed: (PlacedLabel | undefined)[] = new Array(requests.length);
  const taken: Box[] = [];
  const takenGrid = new Grid(bounds, stats);
  const markerGrid = new Grid(bounds, stats);
  for (const m of markers) markerGrid.addBox(m);
  const segmentGrid = new Grid(bounds, stats);
  for (const [a, b] of segments) segmentGrid.addSegment(a, b);
  const samples = segments.map(([a, b]) => samplesOf(a, b));
  const order = requests
    .map((_, i) => i)
    .sort((i, j) => requests[i]!.anchor.y - requests[j]!.anchor.y || requests[i]!.anchor.x - requests[j]!.anchor.x);
  for (const i of order) {
    const req = requests[i]!;
    let best: { box: Box; score: number; leader: boolean } | null = null;
    for (const [ring, dist] of RINGS) {
      for (let k = 0; k < DIRS.length; k++) {
        const [dx, dy] = DIRS[k]!;
        const cx = req.anchor.x + dx * (dist + req.width / 2);
        const cy = req.anchor.y + dy * (dist + req.height / 2);
        const box: Box = { x: cx - req.width / 2, y: cy - req.height / 2, w: req.width, h: req.height };
        if (stats) stats.candidates++;
        let score = ring * 40 + k * 3;
        if (
          box.x < bounds.left + 2 ||
          box.y < bounds.top + 2 ||
          box.x + box.w > bounds.right - 2 ||
          box.y + box.h > bounds.bottom - 2
        )
          score += 100_000;
        // Every term is positive: once the score reaches the best so far, this spot cannot win.
        const bar = best ? best.score : Infinity;
        if (score < bar)
          for (const t of takenGrid.near(box, NEAR_LIMIT).items) {
            score += overlap(box, taken[t]!) * 50;
            if (score >= bar) break;
          }
        if (score < bar)
          for (const m of markerGrid.near(box, NEAR_LIMIT).items) {
            score += overlap(box, markers[m]!) * 80;
            if (score >= bar) break;
          }
        if (score < bar) {
          for (const s of segmentGrid.near(box, NEAR_LIMIT).items) {
            const [a, b] = segments[s]!;
            if (!segmentHitsBox(a, b, box, samples[s]!)) continue;
            score += 150;
            if (score >= bar) break;
          }
        }
        if (score < bar) best = { box, score, leader: ring > 0 };
      }
    }
    const chosen = best!;
    taken.push(chosen.box);
    takenGrid.addBox(chosen.box);
    placed[i] = { box: chosen.box, leader: chosen.leader };
  }
  return placed.map((p) => p!);
}
