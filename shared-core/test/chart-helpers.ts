/** Helpers for the chart tests: read the SVG text back into numbers (no DOM in unit tests). */
import type { ChartData, ChartPoint, Pixel } from '../src/chart';

/** Standard atmospheric pressure at sea level, Pa (ASHRAE HoF 2017 SI Ch.1 Table 1, Z = 0). */
export const P0 = 101_325;

/** Attributes of every element with a given tag and class, as string maps. */
export function elements(svg: string, tag: string, cls?: string): Record<string, string>[] {
  const out: Record<string, string>[] = [];
  const re = new RegExp(`<${tag}\\b([^>]*)>`, 'g');
  for (let m = re.exec(svg); m; m = re.exec(svg)) {
    const attrs: Record<string, string> = {};
    const are = /([\w:-]+)="([^"]*)"/g;
    for (let a = are.exec(m[1]!); a; a = are.exec(m[1]!)) attrs[a[1]!] = a[2]!;
    if (cls === undefined || (attrs.class ?? '').split(/\s+/).includes(cls)) out.push(attrs);
  }
  return out;
}

/** The runs of a path made of M/L/H/V commands (the renderer writes no others for curves). */
export function parsePath(d: string): Pixel[][] {
  const runs: Pixel[][] = [];
  let cur: Pixel[] = [];
  const re = /([MLHVZ])([^MLHVZ]*)/g;
  let last: Pixel = { x: 0, y: 0 };
  for (let m = re.exec(d); m; m = re.exec(d)) {
    const nums = m[2]!
      .trim()
      .split(/[\s,]+/)
      .filter(Boolean)
      .map(Number);
    switch (m[1]) {
      case 'M':
        if (cur.length > 1) runs.push(cur);
        last = { x: nums[0]!, y: nums[1]! };
        cur = [last];
        break;
      case 'L':
        last = { x: nums[0]!, y: nums[1]! };
        cur.push(last);
        break;
      case 'H':
        last = { x: nums[0]!, y: last.y };
        cur.push(last);
        break;
      case 'V':
        last = { x: last.x, y: nums[0]! };
        cur.push(last);
        break;
      case 'Z':
        break;
    }
  }
  if (cur.length > 1) runs.push(cur);
  return runs;
}

/** Shortest distance from a pixel to a set of polylines, px. */
export function distanceToRuns(p: Pixel, runs: Pixel[][]): number {
  let best = Infinity;
  for (const run of runs) {
    for (let i = 1; i < run.length; i++) {
      const a = run[i - 1]!;
      const b = run[i]!;
      const dx = b.x - a.x;
      const dy = b.y - a.y;
      const len2 = dx * dx + dy * dy;
      const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2));
      best = Math.min(best, Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy)));
    }
  }
  return best;
}

/** Largest change of direction between consecutive segments of the runs, degrees. */
export function maxTurnDegrees(runs: Pixel[][]): number {
  let worst = 0;
  for (const run of runs) {
    for (let i = 2; i < run.length; i++) {
      const a = run[i - 2]!;
      const b = run[i - 1]!;
      const c = run[i]!;
      const a1 = Math.atan2(b.y - a.y, b.x - a.x);
      const a2 = Math.atan2(c.y - b.y, c.x - b.x);
      let d = Math.abs(a2 - a1);
      if (d > Math.PI) d = 2 * Math.PI - d;
      // Ignore degenerate (zero-length) segments left by clipping exactly at a vertex.
      if (Math.hypot(b.x - a.x, b.y - a.y) < 1e-6 || Math.hypot(c.x - b.x, c.y - b.y) < 1e-6) continue;
      worst = Math.max(worst, (d * 180) / Math.PI);
    }
  }
  return worst;
}

/** The path `d` of the curve of a family with a given value (`data-family`, `data-value`). */
export function curvePath(svg: string, family: string, value: string): Pixel[][] {
  const el = elements(svg, 'path').find((a) => a['data-family'] === family && a['data-value'] === value);
  if (!el) throw new Error(`no ${family} curve with value ${value} in the SVG`);
  return parsePath(el.d ?? '');
}

/** Invented states spread over the chart (a fixed pseudo-random walk), every third pair joined by a process. */
export function spread(n: number, seed0 = 12345): ChartData {
  let seed = seed0;
  const rnd = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const points: ChartPoint[] = [];
  for (let i = 0; i < n; i++)
    points.push({ name: `Z${i}`, kind: 'state', db: 5 + rnd() * 30, w: 0.002 + rnd() * 0.012 });
  const processes = [];
  for (let i = 0; i + 1 < n; i += 3) processes.push({ name: `P${i}`, from: `Z${i}`, to: `Z${i + 1}` });
  return { pressurePa: P0, units: 'SI', points, mixes: [], processes, infeasible: [] };
}
