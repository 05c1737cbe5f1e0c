/**
 * The chart window and the single mapping from a state (dry-bulb, humidity ratio) to a pixel.
 * Every position drawn — curves, points, arrows, labels — goes through {@link toPixel}.
 */
import { displayUnit, fromSI, toSI } from '../units';
import type { UnitDef, UnitSystem } from '../units/types';
import { satW } from './engine';
import type { ChartData, ChartLayout, ChartOptions, ChartRange, Pixel } from './types';

/** Default width of the SVG, px. */
export const DEFAULT_WIDTH = 960;
/** Default height of the plot area, px. */
export const DEFAULT_PLOT_HEIGHT = 520;
/** Margins around the plot area, px (the caption block below is added to the height). */
export const MARGIN = { left: 76, right: 30, top: 52, bottom: 58 } as const;

/** Lowest and highest dry-bulb the engine's formulation covers, °C. */
const DB_LIMITS = { min: -100, max: 200 } as const;

/** The display units of the chart's quantities in one unit system. */
export interface ChartUnits {
  temperature: UnitDef;
  humidityRatio: UnitDef;
  enthalpy: UnitDef;
  specificVolume: UnitDef;
  pressure: UnitDef;
}

/** Display units of the chart for a unit system (°C, g/kg, kJ/kg, m³/kg, kPa or °F, gr/lb, Btu/lb, ft³/lb, psia). */
export function chartUnits(system: UnitSystem): ChartUnits {
  return {
    temperature: displayUnit('temperature', system),
    humidityRatio: displayUnit('humidityRatio', system),
    enthalpy: displayUnit('enthalpy', system),
    specificVolume: displayUnit('specificVolume', system),
    pressure: displayUnit('pressure', system),
  };
}

/**
 * A "nice" step (1, 2, 2.5 or 5 × 10^k; without 2.5 when `quarter` is false) close to `span / target`,
 * for ticks and line spacing.
 * Returns 1 for a non-positive or non-finite span.
 */
export function niceStep(span: number, target: number, quarter = true): number {
  if (!(span > 0) || !Number.isFinite(span) || !(target > 0)) return 1;
  const raw = span / target;
  const mag = 10 ** Math.floor(Math.log10(raw));
  for (const m of quarter ? [1, 2, 2.5, 5, 10] : [1, 2, 5, 10]) {
    if (m * mag >= raw * 0.999) return m * mag;
  }
  return 10 * mag;
}

/** Multiples of `step` in [lo, hi] (inclusive, with a small tolerance), without binary noise. */
export function stepsIn(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  if (!(step > 0) || !Number.isFinite(lo) || !Number.isFinite(hi)) return out;
  const eps = step * 1e-9;
  const first = Math.ceil((lo - eps) / step);
  const last = Math.floor((hi + eps) / step);
  for (let k = first; k <= last && out.length < 1000; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/** Defaults of the window, in display units of each system: dry-bulb span and humidity-ratio top. */
const DEFAULTS: Record<UnitSystem, { dbLo: number; dbHi: number; wTop: number; dbPad: number; dbMinSpan: number }> = {
  // °C, °C, g/kg, K, K — common practice for comfort air conditioning charts.
  SI: { dbLo: -5, dbHi: 45, wTop: 30, dbPad: 5, dbMinSpan: 30 },
  // °F, °F, gr/lb, °F, °F
  IP: { dbLo: 25, dbHi: 115, wTop: 200, dbPad: 10, dbMinSpan: 55 },
};

/**
 * The SI window fitted to the plotted states: the default window, widened to hold every state
 * with a margin, edges on tick multiples; `fixed` parts (SI) win.
 */
export function fitRange(data: ChartData, fixed: Partial<ChartRange> = {}): ChartRange {
  const u = chartUnits(data.units);
  const d = DEFAULTS[data.units];
  const pts = data.points.filter((p) => Number.isFinite(p.db) && Number.isFinite(p.w));
  const dbDisp = pts.map((p) => fromSI(p.db, u.temperature));
  const wDisp = pts.map((p) => fromSI(p.w, u.humidityRatio));

  let lo = d.dbLo;
  let hi = d.dbHi;
  if (dbDisp.length > 0) {
    const minS = Math.min(...dbDisp);
    const maxS = Math.max(...dbDisp);
    // Shrink the default towards the states when they sit well inside it, but keep a minimum span.
    lo = Math.min(minS - d.dbPad, Math.max(d.dbLo, maxS + d.dbPad - d.dbMinSpan * 1.5));
    hi = Math.max(maxS + d.dbPad, Math.min(d.dbHi, lo + d.dbMinSpan * 1.5));
    if (hi - lo < d.dbMinSpan) hi = lo + d.dbMinSpan;
  }
  const dbStep = niceStep(hi - lo, 10);
  lo = Math.floor(lo / dbStep) * dbStep;
  hi = Math.ceil(hi / dbStep) * dbStep;
  const limLo = fromSI(DB_LIMITS.min, u.temperature);
  const limHi = fromSI(DB_LIMITS.max, u.temperature);
  lo = Math.max(lo, limLo);
  hi = Math.min(hi, limHi);

  const dbMin = fixed.dbMin ?? toSI(lo, u.temperature);
  const dbMax = fixed.dbMax ?? toSI(hi, u.temperature);

  // Top of the humidity-ratio axis: the default, or less when saturation at the warm edge is lower
  // (a winter chart), or more to hold the states.
  let top = d.wTop;
  const wsHi = satW(dbMax, data.pressurePa);
  if (wsHi !== null) top = Math.min(top, fromSI(wsHi, u.humidityRatio) * 1.05);
  if (wDisp.length > 0) top = Math.max(top, Math.max(...wDisp) * 1.15);
  if (!(top > 0)) top = d.wTop;
  const wStep = niceStep(top, 8);
  top = Math.ceil(top / wStep) * wStep;
  const wMax = fixed.wMax ?? toSI(top, u.humidityRatio);
  const wMin = fixed.wMin ?? 0;
  return { dbMin, dbMax: dbMax > dbMin ? dbMax : dbMin + 1, wMin, wMax: wMax > wMin ? wMax : wMin + 0.001 };
}

/** The layout of a chart: SVG width, plot rectangle and SI window (the caption height is added by the renderer). */
export function chartLayout(data: ChartData, options: ChartOptions = {}): ChartLayout {
  const width = options.width ?? DEFAULT_WIDTH;
  const plotHeight = options.plotHeight ?? DEFAULT_PLOT_HEIGHT;
  const plot = {
    left: MARGIN.left,
    top: MARGIN.top,
    right: width - MARGIN.right,
    bottom: MARGIN.top + plotHeight,
  };
  return {
    width,
    height: plot.bottom + MARGIN.bottom,
    plot,
    range: fitRange(data, options.range),
    pressurePa: data.pressurePa,
    units: data.units,
  };
}

/**
 * THE mapping of the chart: dry-bulb `db` (°C) and humidity ratio `w` (kg/kg) to a pixel of the
 * SVG. Linear in both (so linear in °F and gr/lb too); the humidity-ratio axis points up.
 */
export function toPixel(layout: ChartLayout, db: number, w: number): Pixel {
  const { plot, range } = layout;
  return {
    x: plot.left + ((db - range.dbMin) / (range.dbMax - range.dbMin)) * (plot.right - plot.left),
    y: plot.bottom - ((w - range.wMin) / (range.wMax - range.wMin)) * (plot.bottom - plot.top),
  };
}

/** Inverse of {@link toPixel}: the (db °C, w kg/kg) at a pixel. */
export function fromPixel(layout: ChartLayout, px: Pixel): { db: number; w: number } {
  const { plot, range } = layout;
  return {
    db: range.dbMin + ((px.x - plot.left) / (plot.right - plot.left)) * (range.dbMax - range.dbMin),
    w: range.wMin + ((plot.bottom - px.y) / (plot.bottom - plot.top)) * (range.wMax - range.wMin),
  };
}
