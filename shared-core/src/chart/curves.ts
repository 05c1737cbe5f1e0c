/**
 * The chart's line families, computed through the engine and mapped with {@link toPixel}:
 * saturation, relative humidity, wet-bulb, enthalpy and specific volume. Each curve is sampled
 * adaptively (a segment is split until it is short on screen), then clipped to the plot area.
 */
import { fromSI, toSI } from '../units';
import { boilingPointAt, dbAtEnthalpy, enthalpyOf, satW, volumeOf, wFromRh, wFromWetBulb } from './engine';
import { chartUnits, niceStep, stepsIn, toPixel } from './layout';
import type { ChartLayout, Pixel } from './types';

/** A state on the chart, SI. */
export interface DbW {
  db: number;
  w: number;
}

/** One line of a family: its value (in display units) and its visible runs in pixels. */
export interface ChartCurve {
  family: 'saturation' | 'rh' | 'wetBulb' | 'enthalpy' | 'volume';
  /** The line's value in display units (rh in %, wet-bulb in °C/°F, h in kJ/kg or Btu/lb, v in m³/kg or ft³/lb). */
  value: number;
  /** Visible pieces, each a polyline of at least two pixels. */
  runs: Pixel[][];
}

/** Longest segment on screen before it is split, px. */
const MAX_SEGMENT_PX = 6;
/** Deepest split of one initial segment (2^8 pieces). */
const MAX_DEPTH = 8;

/**
 * Samples a curve given as `t ↦ (db, w)` over [t0, t1], starting from `n` equal steps and
 * splitting any segment longer than {@link MAX_SEGMENT_PX} on screen. Points the engine refuses
 * (`null`) end a run. Returns runs of mapped pixels.
 */
export function sampleCurve(
  layout: ChartLayout,
  f: (t: number) => DbW | null,
  t0: number,
  t1: number,
  n: number,
): Pixel[][] {
  const runs: Pixel[][] = [];
  let run: Pixel[] = [];
  const at = (t: number): Pixel | null => {
    const s = f(t);
    if (!s || !Number.isFinite(s.db) || !Number.isFinite(s.w)) return null;
    return toPixel(layout, s.db, s.w);
  };
  const close = (): void => {
    if (run.length >= 2) runs.push(run);
    run = [];
  };
  const refine = (ta: number, pa: Pixel, tb: number, pb: Pixel, depth: number): void => {
    if (depth < MAX_DEPTH && Math.hypot(pb.x - pa.x, pb.y - pa.y) > MAX_SEGMENT_PX) {
      const tm = (ta + tb) / 2;
      const pm = at(tm);
      if (pm) {
        refine(ta, pa, tm, pm, depth + 1);
        refine(tm, pm, tb, pb, depth + 1);
        return;
      }
    }
    run.push(pb);
  };
  let prevT = t0;
  let prev = at(t0);
  if (prev) run.push(prev);
  for (let i = 1; i <= n; i++) {
    const t = t0 + ((t1 - t0) * i) / n;
    const p = at(t);
    if (!p) {
      close();
    } else if (!prev) {
      run.push(p);
    } else {
      refine(prevT, prev, t, p, 0);
    }
    prev = p;
    prevT = t;
  }
  close();
  return runs.flatMap((r) => clipPolyline(r, layout.plot));
}

/** Clips a polyline to a rectangle (Liang–Barsky per segment); returns the visible pieces. */
export function clipPolyline(
  points: Pixel[],
  rect: { left: number; top: number; right: number; bottom: number },
): Pixel[][] {
  const out: Pixel[][] = [];
  let cur: Pixel[] = [];
  const flush = (): void => {
    if (cur.length >= 2) out.push(cur);
    cur = [];
  };
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    const seg = clipSegment(a, b, rect);
    if (!seg) {
      flush();
      continue;
    }
    const [p, q] = seg;
    const last = cur[cur.length - 1];
    if (!last || Math.abs(last.x - p.x) > 1e-9 || Math.abs(last.y - p.y) > 1e-9) {
      flush();
      cur.push(p);
    }
    cur.push(q);
    if (q !== b) flush();
  }
  flush();
  return out;
}

function clipSegment(
  a: Pixel,
  b: Pixel,
  r: { left: number; top: number; right: number; bottom: number },
): [Pixel, Pixel] | null {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, a.x - r.left],
    [dx, r.right - a.x],
    [-dy, a.y - r.top],
    [dy, r.bottom - a.y],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
    } else {
      const t = q / p;
      if (p < 0) {
        if (t > t1) return null;
        if (t > t0) t0 = t;
      } else {
        if (t < t0) return null;
        if (t < t1) t1 = t;
      }
    }
  }
  const p = t0 === 0 ? a : { x: a.x + t0 * dx, y: a.y + t0 * dy };
  const q = t1 === 1 ? b : { x: a.x + t1 * dx, y: a.y + t1 * dy };
  return [p, q];
}

/** Bounded bisection for an increasing or decreasing `g` with a sign change on [lo, hi]; null without one. */
export function bisect(g: (x: number) => number | null, lo: number, hi: number): number | null {
  let gl = g(lo);
  const gh = g(hi);
  if (gl === null || gh === null) return null;
  if (gl === 0) return lo;
  if (gh === 0) return hi;
  if (Math.sign(gl) === Math.sign(gh)) return null;
  let a = lo;
  let b = hi;
  for (let i = 0; i < 80; i++) {
    const m = (a + b) / 2;
    const gm = g(m);
    if (gm === null) return null;
    if (Math.sign(gm) === Math.sign(gl)) {
      a = m;
      gl = gm;
    } else b = m;
    if (b - a < 1e-10 * Math.max(1, Math.abs(a))) break;
  }
  return (a + b) / 2;
}

/** Highest dry-bulb at which saturated air is still defined at the chart's pressure, °C. */
function warmLimit(layout: ChartLayout): number {
  const bp = boilingPointAt(layout.pressurePa);
  const hi = bp === null ? 200 : Math.min(200, bp - 0.05);
  return Math.min(layout.range.dbMax, hi);
}

/** Number of initial steps across the plot width for the temperature-parametrised curves. */
function widthSteps(layout: ChartLayout): number {
  return Math.max(60, Math.ceil((layout.plot.right - layout.plot.left) / 8));
}

/** The saturation curve (100 % rh). */
export function saturationCurve(layout: ChartLayout): ChartCurve {
  const p = layout.pressurePa;
  const hi = warmLimit(layout);
  const runs = sampleCurve(
    layout,
    (db) => {
      const w = satW(db, p);
      return w === null ? null : { db, w };
    },
    layout.range.dbMin,
    hi,
    widthSteps(layout),
  );
  return { family: 'saturation', value: 100, runs };
}

/** The relative-humidity curves at `percents` (default 10…90 % by 10). */
export function rhCurves(layout: ChartLayout, percents: number[] = [10, 20, 30, 40, 50, 60, 70, 80, 90]): ChartCurve[] {
  const p = layout.pressurePa;
  const hi = warmLimit(layout);
  return percents.map((pct) => ({
    family: 'rh' as const,
    value: pct,
    runs: sampleCurve(
      layout,
      (db) => {
        const w = wFromRh(db, pct / 100, p);
        return w === null ? null : { db, w };
      },
      layout.range.dbMin,
      hi,
      widthSteps(layout),
    ),
  }));
}

/** Spacing of the line families in display units, chosen for the window. */
export function familySteps(layout: ChartLayout): { wetBulb: number; enthalpy: number; volume: number } {
  const u = chartUnits(layout.units);
  const { dbMin, dbMax, wMax } = layout.range;
  const tSpan = fromSI(dbMax, u.temperature) - fromSI(dbMin, u.temperature);
  const h0 = enthalpyOf(dbMin, 0) ?? 0;
  const h1 = enthalpyOf(dbMax, wMax) ?? h0 + 1;
  const hSpan = Math.abs(fromSI(h1, u.enthalpy) - fromSI(h0, u.enthalpy));
  const v0 = volumeOf(dbMin, 0, layout.pressurePa) ?? 0.8;
  const v1 = volumeOf(dbMax, wMax, layout.pressurePa) ?? v0 + 0.1;
  const vSpan = Math.abs(fromSI(v1, u.specificVolume) - fromSI(v0, u.specificVolume));
  return {
    wetBulb: niceStep(tSpan, 14, false),
    enthalpy: niceStep(hSpan, 14),
    volume: niceStep(vSpan, 12, false),
  };
}

/** Wet-bulb lines: from the saturation curve (db = wb) down to dry air or the plot edge. */
export function wetBulbLines(layout: ChartLayout, stepDisplay?: number): ChartCurve[] {
  const u = chartUnits(layout.units);
  const p = layout.pressurePa;
  const step = stepDisplay ?? familySteps(layout).wetBulb;
  const loDisp = fromSI(layout.range.dbMin, u.temperature);
  const hiDisp = fromSI(warmLimit(layout), u.temperature);
  // Lines whose saturation end lies left of the plot can still cross its lower part.
  const reach = fromSI(layout.range.dbMin + 60, u.temperature) - loDisp;
  const out: ChartCurve[] = [];
  for (const wbDisp of stepsIn(loDisp - reach, hiDisp, step)) {
    const wb = toSI(wbDisp, u.temperature);
    if (wb < -100 || wb > 200) continue;
    // Dry-bulb where the line reaches bone-dry air (w = 0), bounded by the warm edge.
    // The engine refuses a negative humidity ratio (`wb-too-low`): read that as "past the dry end".
    const g = (db: number): number | null => wFromWetBulb(db, wb, p);
    const dryEnd = bisect((db) => g(db) ?? -1, wb, Math.min(200, wb + 150));
    const end = Math.min(dryEnd === null ? warmLimit(layout) : dryEnd - 1e-9, layout.range.dbMax + 1);
    if (!(end > wb)) continue;
    const runs = sampleCurve(
      layout,
      (db) => {
        const w = db === wb ? satW(wb, p) : g(db);
        return w === null || w < 0 ? null : { db, w };
      },
      wb,
      end,
      24,
    );
    if (runs.length > 0) out.push({ family: 'wetBulb', value: wbDisp, runs });
  }
  return out;
}

/** Enthalpy lines: from the saturation curve down to dry air, sampled along the humidity ratio. */
export function enthalpyLines(layout: ChartLayout, stepDisplay?: number): ChartCurve[] {
  const u = chartUnits(layout.units);
  const p = layout.pressurePa;
  const step = stepDisplay ?? familySteps(layout).enthalpy;
  const { dbMin, dbMax, wMax } = layout.range;
  const hLo = enthalpyOf(dbMin, 0);
  const hHi = enthalpyOf(dbMax, wMax);
  if (hLo === null || hHi === null) return [];
  const warm = warmLimit(layout);
  const out: ChartCurve[] = [];
  for (const hDisp of stepsIn(fromSI(hLo, u.enthalpy), fromSI(hHi, u.enthalpy), step)) {
    const h = toSI(hDisp, u.enthalpy);
    // Where the line meets saturation: the dry-bulb whose saturated enthalpy is h.
    const dbSat = bisect(
      (db) => {
        const ws = satW(db, p);
        const hs = ws === null ? null : enthalpyOf(db, ws);
        return hs === null ? null : hs - h;
      },
      Math.max(-100, dbMin - 80),
      warm,
    );
    const wTop = dbSat === null ? wMax : Math.min(satW(dbSat, p) ?? wMax, wMax * 1.5);
    const runs = sampleCurve(
      layout,
      (w) => {
        const db = dbAtEnthalpy(h, w);
        return db === null ? null : { db, w };
      },
      wTop,
      0,
      16,
    );
    if (runs.length > 0) out.push({ family: 'enthalpy', value: hDisp, runs });
  }
  return out;
}

/** Specific-volume lines: from the saturation curve down to dry air, sampled along the humidity ratio. */
export function volumeLines(layout: ChartLayout, stepDisplay?: number): ChartCurve[] {
  const u = chartUnits(layout.units);
  const p = layout.pressurePa;
  const step = stepDisplay ?? familySteps(layout).volume;
  const { dbMin, dbMax, wMax } = layout.range;
  const vLo = volumeOf(dbMin, 0, p);
  const vHi = volumeOf(dbMax, wMax, p);
  if (vLo === null || vHi === null) return [];
  const warm = warmLimit(layout);
  const out: ChartCurve[] = [];
  for (const vDisp of stepsIn(fromSI(vLo, u.specificVolume), fromSI(vHi, u.specificVolume), step)) {
    const v = toSI(vDisp, u.specificVolume);
    const dbAt = (w: number): number | null =>
      bisect(
        (db) => {
          const vv = volumeOf(db, w, p);
          return vv === null ? null : vv - v;
        },
        -100,
        200,
      );
    const dbSat = bisect(
      (db) => {
        const ws = satW(db, p);
        const vs = ws === null ? null : volumeOf(db, ws, p);
        return vs === null ? null : vs - v;
      },
      Math.max(-100, dbMin - 80),
      warm,
    );
    const wTop = dbSat === null ? wMax : Math.min(satW(dbSat, p) ?? wMax, wMax * 1.5);
    const runs = sampleCurve(
      layout,
      (w) => {
        const db = dbAt(w);
        return db === null ? null : { db, w };
      },
      wTop,
      0,
      12,
    );
    if (runs.length > 0) out.push({ family: 'volume', value: vDisp, runs });
  }
  return out;
}

/**
 * The mixing line between two states: the locus of their adiabatic mixtures, linear in humidity
 * ratio and enthalpy (ASHRAE HoF Ch. 1, adiabatic mixing), mapped point by point.
 */
export function mixingLine(layout: ChartLayout, a: DbW & { h?: number }, b: DbW & { h?: number }): Pixel[][] {
  const ha = a.h ?? enthalpyOf(a.db, a.w);
  const hb = b.h ?? enthalpyOf(b.db, b.w);
  if (ha === null || hb === null) return [];
  const runs = sampleCurve(
    layout,
    (f) => {
      const w = a.w + (b.w - a.w) * f;
      const h = ha + (hb - ha) * f;
      const db = f === 0 ? a.db : f === 1 ? b.db : dbAtEnthalpy(h, w);
      return db === null ? null : { db, w };
    },
    0,
    1,
    8,
  );
  return runs;
}

/**
 * A room's sensible heat ratio line: straight in humidity ratio and enthalpy (the supply-to-room
 * process, like a mixing line) from the room state through the supply state, continued past the
 * supply until it meets the saturation curve, reaches dry air or has run ten times the room–supply
 * distance. Air supplied anywhere on it takes up sensible and latent heat in the room's ratio.
 */
export function roomLine(
  layout: ChartLayout,
  room: DbW & { h?: number },
  supply: DbW & { h?: number },
  pressurePa: number,
): Pixel[][] {
  const hr = room.h ?? enthalpyOf(room.db, room.w);
  const hs = supply.h ?? enthalpyOf(supply.db, supply.w);
  if (hr === null || hs === null) return [];
  const at = (f: number): DbW | null => {
    const w = room.w + (supply.w - room.w) * f;
    if (w < 0) return null;
    const db = f === 0 ? room.db : f === 1 ? supply.db : dbAtEnthalpy(hr + (hs - hr) * f, w);
    return db === null ? null : { db, w };
  };
  // Past the supply: to bone-dry air at most, and no further than ten room–supply lengths.
  let fEnd = 10;
  if (supply.w < room.w) fEnd = Math.min(fEnd, room.w / (room.w - supply.w) - 1e-9);
  const aboveSaturation = (f: number): number | null => {
    const s = at(f);
    const ws = s ? satW(s.db, pressurePa) : null;
    return s && ws !== null ? s.w - ws : null;
  };
  // The first crossing past the supply (the line can leave the fog region again towards very
  // cold, dry air): scan in steps, then bisect the first step whose ends differ in sign.
  const STEPS = 64;
  let prev = 1;
  for (let k = 1; k <= STEPS; k++) {
    const f = 1 + ((fEnd - 1) * k) / STEPS;
    const g = aboveSaturation(f);
    if (g !== null && g >= 0) {
      fEnd = bisect(aboveSaturation, prev, f) ?? f;
      break;
    }
    prev = f;
  }
  return sampleCurve(layout, at, 0, fEnd, 16);
}
