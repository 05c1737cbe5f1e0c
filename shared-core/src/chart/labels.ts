/**
 * Placement of the state labels: each label is a tag beside its point, at the candidate
 * position that overlaps least with other tags, points, drawn lines and the plot edge (greedy,
 * in order of the points from top to bottom).
 */
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

function segmentHitsBox(a: Pixel, b: Pixel, r: Box): boolean {
  // Sample the segment; boxes are small and segments few, so this is plenty.
  const n = Math.max(2, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / 3));
  for (let i = 0; i <= n; i++) {
    const x = a.x + ((b.x - a.x) * i) / n;
    const y = a.y + ((b.y - a.y) * i) / n;
    if (x >= r.x && x <= r.x + r.w && y >= r.y && y <= r.y + r.h) return true;
  }
  return false;
}

/**
 * Places the labels. `markers` are every point's own box (a label should not cover any point),
 * `segments` the mixing lines and process arrows, `bounds` the plot rectangle.
 */
export function placeLabels(
  requests: LabelRequest[],
  markers: Box[],
  segments: [Pixel, Pixel][],
  bounds: { left: number; top: number; right: number; bottom: number },
): PlacedLabel[] {
  const placed: (PlacedLabel | undefined)[] = new Array(requests.length);
  const taken: Box[] = [];
  const order = requests.map((_, i) => i).sort((i, j) => requests[i]!.anchor.y - requests[j]!.anchor.y || requests[i]!.anchor.x - requests[j]!.anchor.x);
  // Directions in order of preference: right, up-right, down-right, up, down, left, up-left, down-left.
  const dirs: [number, number][] = [
    [1, 0], [0.72, -0.72], [0.72, 0.72], [0, -1], [0, 1], [-1, 0], [-0.72, -0.72], [-0.72, 0.72],
  ];
  for (const i of order) {
    const req = requests[i]!;
    let best: { box: Box; score: number; leader: boolean } | null = null;
    for (const [ring, dist] of [[0, 9], [1, 26], [2, 46]] as const) {
      dirs.forEach(([dx, dy], k) => {
        const cx = req.anchor.x + dx * (dist + req.width / 2) ;
        const cy = req.anchor.y + dy * (dist + req.height / 2);
        const box: Box = { x: cx - req.width / 2, y: cy - req.height / 2, w: req.width, h: req.height };
        let score = ring * 40 + k * 3;
        if (box.x < bounds.left + 2 || box.y < bounds.top + 2 || box.x + box.w > bounds.right - 2 || box.y + box.h > bounds.bottom - 2) score += 100_000;
        for (const t of taken) score += overlap(box, t) * 50;
        for (const m of markers) score += overlap(box, m) * 80;
        for (const [a, b] of segments) if (segmentHitsBox(a, b, box)) score += 150;
        if (!best || score < best.score) best = { box, score, leader: ring > 0 };
      });
    }
    const chosen = best!;
    taken.push(chosen.box);
    placed[i] = { box: chosen.box, leader: chosen.leader };
  }
  return placed.map((p) => p!);
}
