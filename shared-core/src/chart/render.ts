/**
 * The psychrometric chart as SVG text: data in, a self-contained `<svg>` string out (no DOM, no
 * I/O). Dry-bulb runs to the right, humidity ratio up; the curves are drawn for one pressure and
 * every position comes from the engine through {@link toPixel}.
 */
import { displaySymbol, formatQuantity, fromSI, toSI } from '../units';
import type { UnitSystem } from '../units/types';
import {
  enthalpyLines,
  mixingLine,
  rhCurves,
  saturationCurve,
  volumeLines,
  wetBulbLines,
  type ChartCurve,
} from './curves';
import { chartLayout, chartUnits, niceStep, stepsIn, toPixel } from './layout';
import { Grid } from './grid';
import { NEAR_LIMIT, placeLabels, textWidth, type Box, type PlacedLabel, type PlacementStats } from './labels';
import { chartCss } from './style';
import type { ChartData, ChartFamilies, ChartLayout, ChartOptions, ChartPoint, Pixel } from './types';

/** Radius of a state marker, px. */
export const MARKER_RADIUS = 5;

/** Escapes text for SVG/XML content and attribute values. */
export function escapeXml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A coordinate as SVG text, two decimals; a non-finite value is a programming error caught here. */
function n(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError('chart: non-finite coordinate');
  const r = Math.round(x * 100) / 100;
  return String(r === 0 ? 0 : r);
}

/** A number for a tick or line label: a real minus sign, no binary noise. */
function label(x: number): string {
  const r = Number(x.toPrecision(10));
  const s = String(Math.abs(r) < 1e-12 ? 0 : r);
  return s.startsWith('-') ? `\u2212${s.slice(1)}` : s;
}

/** A polyline as path data; vertices closer than 0.3 px to the previous one are dropped (the last is kept). */
function pathOf(run: Pixel[]): string {
  const kept: Pixel[] = [];
  for (const p of run) {
    const last = kept[kept.length - 1];
    if (!last || Math.hypot(p.x - last.x, p.y - last.y) >= 0.3) kept.push(p);
  }
  const end = run[run.length - 1];
  if (end && kept.length > 1 && kept[kept.length - 1] !== end) kept[kept.length - 1] = end;
  else if (end && kept.length === 1 && run.length > 1) kept.push(end);
  return kept.map((p, i) => `${i === 0 ? 'M' : 'L'}${n(p.x)} ${n(p.y)}`).join('');
}

interface Ctx {
  layout: ChartLayout;
  id: string;
  out: string[];
}

/** Whether a family line's label fits at `at` (inside the plot, clear of the others); takes its place if so. */
function familyLabelFits(
  layout: ChartLayout,
  taken: Box[],
  text: string,
  at: Pixel,
  anchor: 'start' | 'end' | 'middle',
  dy: number,
): boolean {
  const w = textWidth(text, 10);
  const x0 = anchor === 'start' ? at.x : anchor === 'end' ? at.x - w : at.x - w / 2;
  const box: Box = { x: x0 - 2, y: at.y + dy - 9, w: w + 4, h: 12 };
  const { plot } = layout;
  if (box.x < plot.left || box.x + box.w > plot.right || box.y < plot.top || box.y + box.h > plot.bottom) return false;
  for (const t of taken) {
    if (box.x < t.x + t.w && t.x < box.x + box.w && box.y < t.y + t.h && t.y < box.y + box.h) return false;
  }
  taken.push(box);
  return true;
}

/** Points on a curve's last run at the given arc lengths (px) back from its end. */
function pointsBack(c: ChartCurve, distances: number[]): Pixel[] {
  const run = c.runs[c.runs.length - 1];
  if (!run) return [];
  const out: Pixel[] = [];
  let acc = 0;
  let k = 0;
  for (let i = run.length - 1; i > 0 && k < distances.length; i--) {
    const a = run[i]!;
    const b = run[i - 1]!;
    const len = Math.hypot(a.x - b.x, a.y - b.y);
    while (k < distances.length && acc + len >= distances[k]!) {
      const t = len > 0 ? (distances[k]! - acc) / len : 0;
      out.push({ x: a.x + (b.x - a.x) * t, y: a.y + (b.y - a.y) * t });
      k++;
    }
    acc += len;
  }
  return out;
}

function lastPoint(c: ChartCurve): Pixel | undefined {
  const run = c.runs[c.runs.length - 1];
  return run?.[run.length - 1];
}

function firstPoint(c: ChartCurve): Pixel | undefined {
  return c.runs[0]?.[0];
}

function drawCurves(ctx: Ctx, curves: ChartCurve[], cls: (c: ChartCurve) => string): void {
  for (const c of curves) {
    const d = c.runs.map(pathOf).join('');
    if (d)
      ctx.out.push(
        `<path class="${cls(c)}" data-family="${c.family}" data-value="${label(c.value).replace('\u2212', '-')}" d="${d}"/>`,
      );
  }
}

function fogRegion(ctx: Ctx, sat: ChartCurve): void {
  const run = sat.runs[0];
  const { plot } = ctx.layout;
  if (!run || run.length < 2) return;
  const first = run[0]!;
  const last = run[run.length - 1]!;
  const pts = [...run];
  if (Math.abs(last.x - plot.right) < 0.5 && last.y > plot.top) pts.push({ x: plot.right, y: plot.top });
  pts.push({ x: plot.left, y: plot.top });
  if (first.x > plot.left + 0.5) pts.push({ x: plot.left, y: first.y });
  ctx.out.push(`<path class="dmc-fog" d="${pathOf(pts)}Z"/>`);
}

function axes(ctx: Ctx): void {
  const { layout, out } = ctx;
  const { plot, range } = layout;
  const u = chartUnits(layout.units);
  const tLo = fromSI(range.dbMin, u.temperature);
  const tHi = fromSI(range.dbMax, u.temperature);
  const tStep = niceStep(tHi - tLo, 12);
  const wLo = fromSI(range.wMin, u.humidityRatio);
  const wHi = fromSI(range.wMax, u.humidityRatio);
  const wStep = niceStep(wHi - wLo, 8);
  const grid: string[] = [];
  const ticks: string[] = [];
  for (const t of stepsIn(tLo, tHi, tStep)) {
    const x = toPixel(layout, toSI(t, u.temperature), range.wMin).x;
    grid.push(`M${n(x)} ${n(plot.top)}V${n(plot.bottom)}`);
    ticks.push(`<line class="dmc-axis" x1="${n(x)}" y1="${n(plot.bottom)}" x2="${n(x)}" y2="${n(plot.bottom + 5)}"/>`);
    ticks.push(
      `<text class="dmc-tick" data-axis="db" x="${n(x)}" y="${n(plot.bottom + 18)}" text-anchor="middle">${label(t)}</text>`,
    );
  }
  for (const w of stepsIn(wLo, wHi, wStep)) {
    const y = toPixel(layout, range.dbMin, toSI(w, u.humidityRatio)).y;
    grid.push(`M${n(plot.left)} ${n(y)}H${n(plot.right)}`);
    ticks.push(`<line class="dmc-axis" x1="${n(plot.left - 5)}" y1="${n(y)}" x2="${n(plot.left)}" y2="${n(y)}"/>`);
    ticks.push(
      `<text class="dmc-tick" data-axis="w" x="${n(plot.left - 8)}" y="${n(y + 3.5)}" text-anchor="end">${label(w)}</text>`,
    );
  }
  out.push(`<path class="dmc-grid" d="${grid.join('')}"/>`);
  ctx.out.push('<g class="dmc-axes">');
  out.push(`<path class="dmc-axis" d="M${n(plot.left)} ${n(plot.top)}V${n(plot.bottom)}H${n(plot.right)}"/>`);
  out.push(...ticks);
  const tSym = displaySymbol(u.temperature);
  const wSym = displaySymbol(u.humidityRatio);
  out.push(
    `<text class="dmc-axis-title" data-axis-title="db" x="${n((plot.left + plot.right) / 2)}" y="${n(plot.bottom + 40)}" text-anchor="middle">Dry-bulb temperature (${escapeXml(tSym)})</text>`,
  );
  const yMid = (plot.top + plot.bottom) / 2;
  out.push(
    `<text class="dmc-axis-title" data-axis-title="w" transform="translate(${n(plot.left - 50)} ${n(yMid)}) rotate(-90)" text-anchor="middle">Humidity ratio (${escapeXml(wSym)} dry air)</text>`,
  );
  out.push('</g>');
}

function pointClass(p: ChartPoint): string {
  return p.fog ? 'fog' : p.kind;
}

/** How a state's position reads in the display units (`24.0 °C, 9.30 g/kg`). */
function positionText(p: { db: number; w: number }, units: UnitSystem): string {
  return `${formatQuantity(p.db, 'temperature', units).text}, ${formatQuantity(p.w, 'humidityRatio', units).text}`;
}

/** The pressures of the points that differ from the chart's by more than 1 Pa. */
function otherPressurePoints(data: ChartData): ChartPoint[] {
  return data.points.filter((p) => p.pressurePa !== undefined && Math.abs(p.pressurePa - data.pressurePa) > 1);
}

function captionLines(data: ChartData): string[] {
  const pText = formatQuantity(data.pressurePa, 'pressure', data.units).text;
  const lines = [
    `Curves drawn for ${pText}${data.pressureText ? ` \u2014 ${data.pressureText}` : ''}; ${data.units} units. Moist-air properties after ASHRAE Handbook\u2014Fundamentals Ch. 1 (ideal gas; over ice below 0 \u00b0C, 32 \u00b0F).`,
  ];
  const others = otherPressurePoints(data);
  if (others.length > 0) {
    lines.push(
      `${others.map((p) => p.name).join(', ')} ${others.length === 1 ? 'is' : 'are'} at another pressure: placed by dry-bulb and humidity ratio; read its other properties from the note, not from these curves.`,
    );
  }
  return lines;
}

function flagLines(data: ChartData): string[] {
  const items = data.infeasible.map(
    (f) =>
      `${f.name}${f.line ? ` (line ${f.line})` : ''} \u2014 ${f.plotted ? 'marked on the chart' : 'not plotted'}: ${f.reason}`,
  );
  const byName = new Set(data.points.map((p) => p.name));
  for (const pr of data.processes) {
    const missing = [pr.from, pr.to].filter((s) => !byName.has(s));
    if (missing.length > 0)
      items.push(
        `process ${pr.name}${pr.line ? ` (line ${pr.line})` : ''} \u2014 not drawn: ${missing.join(' and ')} not plotted.`,
      );
    else if (pr.flagged)
      items.push(
        `process ${pr.name}${pr.line ? ` (line ${pr.line})` : ''} \u2014 drawn dashed: the note's diagnostics flag it.`,
      );
  }
  for (const m of data.mixes) {
    const missing = m.streams.filter((s) => !byName.has(s));
    if (missing.length > 0)
      items.push(
        `mix ${m.name}${m.line ? ` (line ${m.line})` : ''} \u2014 mixing line not drawn: ${missing.join(' and ')} not plotted.`,
      );
  }
  return items;
}

/** Wraps text at about `chars` characters a line. */
function wrap(text: string, chars: number): string[] {
  const words = text.split(' ');
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur && cur.length + 1 + w.length > chars) {
      lines.push(cur);
      cur = w;
    } else cur = cur ? `${cur} ${w}` : w;
  }
  if (cur) lines.push(cur);
  return lines;
}

function describe(data: ChartData, layout: ChartLayout): string {
  const u = chartUnits(data.units);
  const r = layout.range;
  const parts = [
    `Psychrometric chart at ${formatQuantity(data.pressurePa, 'pressure', data.units).text}: dry-bulb temperature from ${formatQuantity(r.dbMin, 'temperature', data.units).text} to ${formatQuantity(r.dbMax, 'temperature', data.units).text} across, humidity ratio from ${label(fromSI(r.wMin, u.humidityRatio))} to ${formatQuantity(r.wMax, 'humidityRatio', data.units).text} up, with the saturation curve, relative-humidity curves from 10 % to 90 %, wet-bulb, enthalpy and specific-volume lines.`,
  ];
  if (data.points.length > 0) {
    parts.push(
      `Points: ${data.points.map((p) => `${p.kind === 'mix' ? 'mixed state ' : ''}${p.name} at ${positionText(p, data.units)}${p.fog ? ' (fog region, physically impossible as vapour)' : ''}`).join('; ')}.`,
    );
  } else parts.push('No states are plotted.');
  for (const m of data.mixes) parts.push(`Mixing line of ${m.streams.join(' and ')} through ${m.name}.`);
  for (const pr of data.processes)
    parts.push(
      `Process ${pr.name}: arrow from ${pr.from} to ${pr.to}${pr.kind ? ` (${pr.kind.replace(/-/g, ' ')})` : ''}.`,
    );
  for (const f of data.infeasible) parts.push(`${f.name}: ${f.plotted ? 'marked' : 'not plotted'}, ${f.reason}`);
  return parts.join(' ');
}

/** The legend's entries and their positions, wrapped to the plot width; rows are 18 px apart. */
function legendItems(layout: ChartLayout): { cls: string; text: string; x: number; row: number }[] {
  const u = chartUnits(layout.units);
  const items: [string, string][] = [
    ['dmc-sat', 'saturation'],
    ['dmc-rh', 'relative humidity (%)'],
    ['dmc-wb', `wet-bulb (${displaySymbol(u.temperature)})`],
    ['dmc-h', `enthalpy (${displaySymbol(u.enthalpy)})`],
    ['dmc-v', `specific volume (${displaySymbol(u.specificVolume)})`],
    ['dmc-mixline', 'mixing line'],
    ['dmc-process', 'process'],
  ];
  const out: { cls: string; text: string; x: number; row: number }[] = [];
  let x = layout.plot.left;
  let row = 0;
  for (const [cls, text] of items) {
    const w = 27 + textWidth(text, 11) * 0.92;
    if (x + w > layout.plot.right && x > layout.plot.left) {
      row++;
      x = layout.plot.left;
    }
    out.push({ cls, text, x, row });
    x += w + 20;
  }
  return out;
}

function legend(ctx: Ctx, y: number): void {
  ctx.out.push('<g class="dmc-legend-row">');
  for (const { cls, text, x, row } of legendItems(ctx.layout)) {
    const yy = y + row * 18;
    ctx.out.push(`<line class="${cls}" x1="${n(x)}" y1="${n(yy - 4)}" x2="${n(x + 22)}" y2="${n(yy - 4)}"/>`);
    ctx.out.push(`<text class="dmc-legend" x="${n(x + 27)}" y="${n(yy)}">${escapeXml(text)}</text>`);
  }
  ctx.out.push('</g>');
}

const ALL_FAMILIES: ChartFamilies = { rh: true, wetBulb: true, enthalpy: true, volume: true };

/** A process arrow as drawn: from just outside one marker to just outside the other. */
interface Arrow {
  process: ChartData['processes'][number];
  start: Pixel;
  tip: Pixel;
  /** Where the head meets the shaft. */
  base: Pixel;
  ux: number;
  uy: number;
}

/** Everything the chart measures before anything is placed: sizes, curves and pixel positions. */
interface Measured {
  data: ChartData;
  /** The layout with the full height (plot, legend, captions and flags). */
  layout: ChartLayout;
  id: string;
  title: string;
  nonce: string;
  captions: string[];
  flags: string[];
  legendY: number;
  captionY: number;
  flagsY: number;
  sat: ChartCurve;
  vLines: ChartCurve[];
  hLines: ChartCurve[];
  wbLines: ChartCurve[];
  rh: ChartCurve[];
  /** Each plotted point once (the first of a name), with its pixel. */
  plotted: { p: ChartPoint; px: Pixel }[];
  /** Mixing line runs, by mix name. */
  mixRuns: { name: string; run: Pixel[] }[];
  arrows: Arrow[];
  /** The mixing lines and arrows as straight pieces (labels keep off them). */
  segments: [Pixel, Pixel][];
  /** One name per pair of states joined by arrows ("CC, CC_sched"), placed beside the first arrow. */
  arrowNames: { text: string; start: Pixel; tip: Pixel }[];
}

/** A family line's label as placed. */
interface FamilyText {
  text: string;
  cls: string;
  at: Pixel;
  anchor: 'start' | 'end' | 'middle';
  dy: number;
}

/** Where every label went. */
interface Placed {
  family: FamilyText[];
  tags: PlacedLabel[];
  markers: Box[];
  names: { text: string; box: Box }[];
}

/** Measure: the layout and its height, the curves, and every point, line and arrow in pixels. */
function measureChart(data: ChartData, options: ChartOptions): Measured {
  const layout = chartLayout(data, options);
  const id = (options.idPrefix ?? 'dmc').replace(/[^A-Za-z0-9_-]/g, '') || 'dmc';
  const families = { ...ALL_FAMILIES, ...(options.families ?? {}) };
  const { plot } = layout;

  // Caption block below the plot: legend, caption lines, flagged items.
  const captions = captionLines(data).flatMap((l) => wrap(l, Math.floor((layout.width - plot.left - 20) / 6)));
  const flags = flagLines(data).flatMap((l) => wrap(l, Math.floor((layout.width - plot.left - 40) / 6)));
  let y = plot.bottom + 64;
  const legendY = y;
  y += 20 + 18 * Math.max(0, ...legendItems(layout).map((i) => i.row));
  const captionY = y;
  y += captions.length * 15;
  const flagsY = y + 6;
  if (flags.length > 0) y = flagsY + 16 + flags.length * 15;
  const full: ChartLayout = { ...layout, height: Math.ceil(y + 12) };

  const pos = new Map<string, { p: ChartPoint; px: Pixel }>();
  for (const p of data.points) {
    if (!pos.has(p.name)) pos.set(p.name, { p, px: toPixel(layout, p.db, p.w) });
  }
  const segments: [Pixel, Pixel][] = [];
  const mixRuns: { name: string; run: Pixel[] }[] = [];
  for (const m of data.mixes) {
    const mixed = pos.get(m.name);
    const streams = m.streams.map((s) => pos.get(s));
    if (!mixed || streams.some((s) => !s)) continue;
    const ends = streams.length === 2 ? [[streams[0]!, streams[1]!]] : streams.map((s) => [s!, mixed]);
    for (const [a, b] of ends) {
      for (const run of mixingLine(layout, a!.p, b!.p)) {
        mixRuns.push({ name: m.name, run });
        for (let i = 1; i < run.length; i++) segments.push([run[i - 1]!, run[i]!]);
      }
    }
  }
  const arrows: Arrow[] = [];
  const arrowNames: { text: string; start: Pixel; tip: Pixel }[] = [];
  const nameOfPair = new Map<string, { text: string; start: Pixel; tip: Pixel }>();
  for (const pr of data.processes) {
    const a = pos.get(pr.from);
    const b = pos.get(pr.to);
    if (!a || !b) continue;
    const dx = b.px.x - a.px.x;
    const dy = b.px.y - a.px.y;
    const len = Math.hypot(dx, dy);
    if (len < 1e-6) continue;
    const ux = dx / len;
    const uy = dy / len;
    const gap = MARKER_RADIUS + 3;
    const start = len > 2 * gap + 4 ? { x: a.px.x + ux * gap, y: a.px.y + uy * gap } : a.px;
    const tip = len > 2 * gap + 4 ? { x: b.px.x - ux * gap, y: b.px.y - uy * gap } : b.px;
    const head = 10;
    arrows.push({ process: pr, start, tip, base: { x: tip.x - ux * head, y: tip.y - uy * head }, ux, uy });
    // Processes between the same two states share one arrow name ("CC, CC_sched").
    const key = `${pr.from}\u0000${pr.to}`;
    const same = nameOfPair.get(key);
    if (same) same.text += `, ${pr.name}`;
    else {
      const entry = { text: pr.name, start, tip };
      nameOfPair.set(key, entry);
      arrowNames.push(entry);
    }
    segments.push([start, tip]);
  }
  return {
    data,
    layout: full,
    id,
    title: options.title ?? data.title ?? 'Psychrometric chart',
    nonce: options.styleNonce && /^[A-Za-z0-9+/=_-]+$/.test(options.styleNonce) ? ` nonce="${options.styleNonce}"` : '',
    captions,
    flags,
    legendY,
    captionY,
    flagsY,
    sat: saturationCurve(layout),
    vLines: families.volume ? volumeLines(layout) : [],
    hLines: families.enthalpy ? enthalpyLines(layout) : [],
    wbLines: families.wetBulb ? wetBulbLines(layout) : [],
    rh: families.rh ? rhCurves(layout) : [],
    plotted: [...pos.values()],
    mixRuns,
    arrows,
    segments,
    arrowNames,
  };
}

/** The text of a state's tag. */
function tagText(p: ChartPoint): string {
  return p.fog ? `${p.name} \u00b7 fog` : p.name;
}

/**
 * Place: the family lines' labels (rh and saturation at their upper end, wet-bulb at saturation,
 * enthalpy at their lower-right end, volume above the dry-bulb axis), then the state tags, then
 * the process names beside their arrows, clear of the tags, the points and each other.
 */
function placeChart(m: Measured, stats?: PlacementStats): Placed {
  const { plot } = m.layout;
  const family: FamilyText[] = [];
  const taken: Box[] = [];
  const tryLabel = (text: string, cls: string, at: Pixel, anchor: FamilyText['anchor'], dy: number): boolean => {
    if (!familyLabelFits(m.layout, taken, text, at, anchor, dy)) return false;
    family.push({ text, cls, at, anchor, dy });
    return true;
  };
  const upperEnd = (c: ChartCurve, text: string, cls: string): void => {
    const p = lastPoint(c);
    if (!p) return;
    if (p.y <= plot.top + 1) {
      // Exits through the top: beside the curve just below the edge, or further down the curve.
      for (const q of [p, ...pointsBack(c, [22, 44, 66])]) {
        if (tryLabel(text, cls, { x: q.x + 4, y: Math.max(q.y, plot.top) }, 'start', 12)) return;
      }
    } else {
      for (const q of [p, ...pointsBack(c, [30, 60])]) {
        if (tryLabel(text, cls, { x: Math.min(q.x, plot.right) - 4, y: q.y }, 'end', -4)) return;
      }
    }
  };
  upperEnd(m.sat, '100%', 'dmc-lbl-sat');
  for (const c of m.rh) upperEnd(c, `${c.value}%`, 'dmc-lbl-rh');
  for (const c of m.wbLines) {
    const p = firstPoint(c);
    if (p && p.x > plot.left + 1 && p.y > plot.top + 1)
      tryLabel(label(c.value), 'dmc-lbl-wb', { x: p.x - 3, y: p.y }, 'end', -3);
  }
  for (const c of m.hLines) {
    const p = lastPoint(c);
    if (!p) continue;
    if (p.x >= plot.right - 1) tryLabel(label(c.value), 'dmc-lbl-h', { x: plot.right - 4, y: p.y }, 'end', 12);
    else if (p.y >= plot.bottom - 1) tryLabel(label(c.value), 'dmc-lbl-h', { x: p.x + 3, y: plot.bottom }, 'start', -4);
  }
  for (const c of m.vLines) {
    const p = lastPoint(c);
    if (p && p.y >= plot.bottom - 1) tryLabel(label(c.value), 'dmc-lbl-v', { x: p.x - 3, y: plot.bottom }, 'end', -16);
  }

  const markers: Box[] = m.plotted.map(({ px }) => ({
    x: px.x - MARKER_RADIUS - 2,
    y: px.y - MARKER_RADIUS - 2,
    w: 2 * MARKER_RADIUS + 4,
    h: 2 * MARKER_RADIUS + 4,
  }));
  const tags = placeLabels(
    m.plotted.map(({ p, px }) => ({ anchor: px, width: textWidth(tagText(p), 11) + 12, height: 18 })),
    markers,
    m.segments,
    plot,
    stats,
  );

  const blocked = new Grid(plot, stats);
  const blockedBoxes: Box[] = [];
  const block = (b: Box): void => {
    blockedBoxes.push(b);
    blocked.addBox(b);
  };
  for (const b of markers) block(b);
  for (const t of tags) block(t.box);
  const names: { text: string; box: Box }[] = [];
  for (const r of m.arrowNames) {
    const dx = r.tip.x - r.start.x;
    const dy = r.tip.y - r.start.y;
    const len = Math.hypot(dx, dy) || 1;
    const w = textWidth(r.text, 10.5);
    let chosen: Box | null = null;
    for (const [t, off] of [
      [0.5, 12],
      [0.35, 12],
      [0.65, 12],
      [0.2, 12],
      [0.8, 12],
      [0.5, 24],
      [0.5, 38],
      [0.5, 54],
    ] as const) {
      for (const side of [1, -1]) {
        const cx = r.start.x + dx * t + (side * dy * off) / len;
        const cy = r.start.y + dy * t - (side * dx * off) / len;
        const box: Box = { x: cx - w / 2, y: cy - 7, w, h: 13 };
        if (stats) stats.candidates++;
        const inside =
          box.x >= plot.left && box.y >= plot.top && box.x + box.w <= plot.right && box.y + box.h <= plot.bottom;
        if (!inside) continue;
        // A spot with more boxes near it than the look-up weighs is taken (it is crowded).
        const near = blocked.near(box, NEAR_LIMIT);
        const free =
          !near.crowded &&
          near.items.every((i) => {
            const b = blockedBoxes[i]!;
            return box.x >= b.x + b.w || b.x >= box.x + box.w || box.y >= b.y + b.h || b.y >= box.y + box.h;
          });
        if (free) {
          chosen = box;
          break;
        }
      }
      if (chosen) break;
    }
    if (!chosen) {
      const cx = r.start.x + dx / 2 + (dy * 12) / len;
      const cy = r.start.y + dy / 2 - (dx * 12) / len;
      chosen = { x: cx - w / 2, y: cy - 7, w, h: 13 };
    }
    block(chosen);
    names.push({ text: r.text, box: chosen });
  }
  return { family, tags, markers, names };
}

/** Draw: the SVG text of a measured and placed chart. */
function drawChart(m: Measured, placed: Placed): string {
  const { data, layout: full, id } = m;
  const { plot } = full;
  const height = full.height;
  const ctx: Ctx = { layout: full, id, out: [] };
  const out = ctx.out;
  const range = full.range;
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" class="dmc" role="img" aria-labelledby="${id}-title ${id}-desc" width="${full.width}" height="${height}" viewBox="0 0 ${full.width} ${height}" data-pressure-pa="${n(data.pressurePa)}" data-units="${data.units}" data-db-min="${range.dbMin}" data-db-max="${range.dbMax}" data-w-min="${range.wMin}" data-w-max="${range.wMax}" data-plot="${plot.left} ${plot.top} ${plot.right} ${plot.bottom}">`,
  );
  out.push(`<title id="${id}-title">${escapeXml(m.title)}</title>`);
  out.push(`<desc id="${id}-desc">${escapeXml(describe(data, full))}</desc>`);
  out.push(`<style${m.nonce}>${chartCss()}</style>`);
  out.push(
    `<defs><clipPath id="${id}-clip"><rect x="${n(plot.left)}" y="${n(plot.top)}" width="${n(plot.right - plot.left)}" height="${n(plot.bottom - plot.top)}"/></clipPath></defs>`,
  );
  out.push(`<rect class="dmc-page" x="0" y="0" width="${full.width}" height="${height}"/>`);
  out.push(`<text class="dmc-heading" x="${n(plot.left)}" y="24">${escapeXml(m.title)}</text>`);
  out.push(
    `<text class="dmc-sub" x="${n(plot.left)}" y="41">${escapeXml(`${formatQuantity(data.pressurePa, 'pressure', data.units).text} \u00b7 ${data.units} \u00b7 dry-bulb against humidity ratio`)}</text>`,
  );
  out.push(
    `<rect class="dmc-panel" x="${n(plot.left)}" y="${n(plot.top)}" width="${n(plot.right - plot.left)}" height="${n(plot.bottom - plot.top)}"/>`,
  );

  out.push(`<g clip-path="url(#${id}-clip)">`);
  fogRegion(ctx, m.sat);
  out.push('</g>');
  axes(ctx);

  out.push(`<g class="dmc-lines" clip-path="url(#${id}-clip)">`);
  drawCurves(ctx, m.vLines, () => 'dmc-v');
  drawCurves(ctx, m.hLines, () => 'dmc-h');
  drawCurves(ctx, m.wbLines, () => 'dmc-wb');
  drawCurves(ctx, m.rh, (c) => `dmc-rh dmc-rh-${c.value}`);
  drawCurves(ctx, [m.sat], () => 'dmc-sat');
  out.push('</g>');

  out.push('<g class="dmc-line-labels">');
  for (const f of placed.family) {
    out.push(
      `<text class="dmc-lbl ${f.cls}" x="${n(f.at.x)}" y="${n(f.at.y + f.dy)}" text-anchor="${f.anchor}">${escapeXml(f.text)}</text>`,
    );
  }
  out.push('</g>');

  out.push(`<g class="dmc-overlay" clip-path="url(#${id}-clip)">`);
  for (const r of m.mixRuns)
    out.push(`<path class="dmc-mixline" data-mix="${escapeXml(r.name)}" d="${pathOf(r.run)}"/>`);
  for (const { process: pr, start, tip, base, ux, uy } of m.arrows) {
    const flagged = pr.flagged ? ' dmc-flagged' : '';
    out.push(
      `<g class="dmc-process-group" data-process="${escapeXml(pr.name)}" data-from="${escapeXml(pr.from)}" data-to="${escapeXml(pr.to)}">`,
    );
    out.push(`<path class="dmc-process${flagged}" d="M${n(start.x)} ${n(start.y)}L${n(base.x)} ${n(base.y)}"/>`);
    out.push(
      `<path class="${pr.flagged ? 'dmc-arrow-flag' : 'dmc-arrow'}" d="M${n(tip.x)} ${n(tip.y)}L${n(base.x - uy * 4.5)} ${n(base.y + ux * 4.5)}L${n(base.x + uy * 4.5)} ${n(base.y - ux * 4.5)}Z"/>`,
    );
    out.push('</g>');
  }
  out.push('</g>');

  out.push('<g class="dmc-points">');
  m.plotted.forEach(({ p, px }, i) => {
    const kind = pointClass(p);
    const where = positionText(p, data.units);
    out.push(`<g class="dmc-point" data-name="${escapeXml(p.name)}">`);
    out.push(
      `<title>${escapeXml(`${p.kind === 'mix' ? 'mix' : 'state'} ${p.name}: ${where}${p.fog ? ' \u2014 fog region (infeasible as vapour)' : ''}`)}</title>`,
    );
    const lp = placed.tags[i]!;
    if (lp.leader) {
      const bx = Math.max(lp.box.x, Math.min(px.x, lp.box.x + lp.box.w));
      const by = Math.max(lp.box.y, Math.min(px.y, lp.box.y + lp.box.h));
      out.push(`<line class="dmc-leader" x1="${n(px.x)}" y1="${n(px.y)}" x2="${n(bx)}" y2="${n(by)}"/>`);
    }
    out.push(
      `<circle class="dmc-marker dmc-marker-${kind}" data-name="${escapeXml(p.name)}" data-kind="${p.kind}"${p.fog ? ' data-infeasible="fog"' : ''} data-db="${p.db}" data-w="${p.w}" cx="${n(px.x)}" cy="${n(px.y)}" r="${MARKER_RADIUS}"/>`,
    );
    if (p.fog) {
      const k = MARKER_RADIUS * 0.6;
      out.push(
        `<path class="dmc-fogcross" d="M${n(px.x - k)} ${n(px.y - k)}L${n(px.x + k)} ${n(px.y + k)}M${n(px.x - k)} ${n(px.y + k)}L${n(px.x + k)} ${n(px.y - k)}"/>`,
      );
    }
    out.push(
      `<rect class="dmc-tag${p.kind === 'mix' ? ' dmc-tag-mix' : ''}${p.fog ? ' dmc-tag-fog' : ''}" x="${n(lp.box.x)}" y="${n(lp.box.y)}" width="${n(lp.box.w)}" height="${n(lp.box.h)}" rx="9"/>`,
    );
    out.push(
      `<text class="dmc-tagtext" x="${n(lp.box.x + lp.box.w / 2)}" y="${n(lp.box.y + lp.box.h / 2 + 4)}" text-anchor="middle">${escapeXml(tagText(p))}</text>`,
    );
    out.push('</g>');
  });
  out.push('</g>');

  out.push('<g class="dmc-process-names">');
  for (const { text, box } of placed.names) {
    out.push(
      `<text class="dmc-process-name" x="${n(box.x + box.w / 2)}" y="${n(box.y + 10)}" text-anchor="middle">${escapeXml(text)}</text>`,
    );
  }
  out.push('</g>');

  legend(ctx, m.legendY);
  m.captions.forEach((line, i) => {
    out.push(
      `<text class="dmc-caption" data-caption="${i}" x="${n(plot.left)}" y="${n(m.captionY + i * 15)}">${escapeXml(line)}</text>`,
    );
  });
  if (m.flags.length > 0) {
    out.push(
      `<g class="dmc-flags"><text class="dmc-flag-title" x="${n(plot.left)}" y="${n(m.flagsY + 4)}">Flagged</text>`,
    );
    m.flags.forEach((line, i) => {
      out.push(
        `<text class="dmc-flag-item" x="${n(plot.left + 12)}" y="${n(m.flagsY + 20 + i * 15)}">${escapeXml(line)}</text>`,
      );
    });
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('\n');
}

/**
 * Renders a chart from plain data (SI). Returns one `<svg>` element as text, with its own
 * stylesheet, `<title>` and `<desc>`. Markers carry `data-name`, `data-kind`, `data-db` (°C) and
 * `data-w` (kg/kg) so tests and hosts can find them. Three steps: measure (layout, curves,
 * pixels), place (labels, near-linear), draw (the SVG text). `stats`, when given, counts the
 * placement's work (for the cost tests and the benchmark).
 */
export function renderChartFromData(data: ChartData, options: ChartOptions = {}, stats?: PlacementStats): string {
  const measured = measureChart(data, options);
  return drawChart(measured, placeChart(measured, stats));
}
