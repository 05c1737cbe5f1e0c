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
  roomLine,
  saturationCurve,
  volumeLines,
  wetBulbLines,
  type ChartCurve,
} from './curves';
import { chartLayout, chartUnits, niceStep, stepsIn, toPixel } from './layout';
import { LabelSpace, placeTags, textWidth, type Box, type PlacedLabel, type PlacementStats } from './labels';
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
        `<path class="${cls(c)}" data-family="${c.family}" ` +
          `data-value="${label(c.value).replace('\u2212', '-')}" d="${d}"/>`,
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
      `<text class="dmc-tick" data-axis="db" x="${n(x)}" ` +
        `y="${n(plot.bottom + 18)}" text-anchor="middle">${label(t)}</text>`,
    );
  }
  for (const w of stepsIn(wLo, wHi, wStep)) {
    const y = toPixel(layout, range.dbMin, toSI(w, u.humidityRatio)).y;
    grid.push(`M${n(plot.left)} ${n(y)}H${n(plot.right)}`);
    ticks.push(`<line class="dmc-axis" x1="${n(plot.left - 5)}" y1="${n(y)}" x2="${n(plot.left)}" y2="${n(y)}"/>`);
    ticks.push(
      `<text class="dmc-tick" data-axis="w" x="${n(plot.left - 8)}" ` +
        `y="${n(y + 3.5)}" text-anchor="end">${label(w)}</text>`,
    );
  }
  out.push(`<path class="dmc-grid" d="${grid.join('')}"/>`);
  ctx.out.push('<g class="dmc-axes">');
  out.push(`<path class="dmc-axis" d="M${n(plot.left)} ${n(plot.top)}V${n(plot.bottom)}H${n(plot.right)}"/>`);
  out.push(...ticks);
  const tSym = displaySymbol(u.temperature);
  const wSym = displaySymbol(u.humidityRatio);
  out.push(
    `<text class="dmc-axis-title" data-axis-title="db" x="${n((plot.left + plot.right) / 2)}" ` +
      `y="${n(plot.bottom + 40)}" text-anchor="middle">Dry-bulb temperature (${escapeXml(tSym)})</text>`,
  );
  const yMid = (plot.top + plot.bottom) / 2;
  out.push(
    `<text class="dmc-axis-title" data-axis-title="w" ` +
      `transform="translate(${n(plot.left - 50)} ${n(yMid)}) rotate(-90)" ` +
      `text-anchor="middle">Humidity ratio (${escapeXml(wSym)} dry air)</text>`,
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
    `Curves drawn for ${pText}${data.pressureText ? ` \u2014 ${data.pressureText}` : ''}; ${data.units} ` +
      `units. Moist-air properties after ASHRAE Handbook\u2014Fundamentals Ch. 1 (ideal gas; ` +
      `over ice below ${formatQuantity(0, 'temperature', data.units, { digits: 0 }).text}).`,
  ];
  const others = otherPressurePoints(data);
  if (others.length > 0) {
    lines.push(
      `${others.map((p) => p.name).join(', ')} ${others.length === 1 ? 'is' : 'are'} ` +
        `at another pressure: placed by dry-bulb and humidity ratio; ` +
        `read its other properties from the note, not from these curves.`,
    );
  }
  return lines;
}

function flagLines(data: ChartData): string[] {
  const items = (data.notes ?? []).map((n) => `grouping \u2014 ${n}`);
  items.push(
    ...data.infeasible.map(
      (f) =>
        `${f.name}${f.line ? ` (line ${f.line})` : ''} ` +
        `\u2014 ${f.plotted ? 'marked on the chart' : 'not plotted'}: ${f.reason}`,
    ),
  );
  const byName = new Set(data.points.map((p) => p.name));
  for (const pr of data.processes) {
    const missing = [pr.from, pr.to].filter((s) => !byName.has(s));
    if (missing.length > 0)
      items.push(
        `process ${pr.name}${pr.line ? ` (line ${pr.line})` : ''} ` +
          `\u2014 not drawn: ${missing.join(' and ')} not plotted.`,
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
        `mix ${m.name}${m.line ? ` (line ${m.line})` : ''} \u2014 ` +
          `mixing line not drawn: ${missing.join(' and ')} not plotted.`,
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
    `Psychrometric chart at ${formatQuantity(data.pressurePa, 'pressure', data.units).text}: ` +
      `dry-bulb temperature from ${formatQuantity(r.dbMin, 'temperature', data.units).text} ` +
      `to ${formatQuantity(r.dbMax, 'temperature', data.units).text} across, ` +
      `humidity ratio from ${label(fromSI(r.wMin, u.humidityRatio))} ` +
      `to ${formatQuantity(r.wMax, 'humidityRatio', data.units).text} up, with the saturation curve, ` +
      `relative-humidity curves from 10 % to 90 %, wet-bulb, enthalpy and specific-volume lines.`,
  ];
  if (data.points.length > 0) {
    const point = (p: ChartPoint) =>
      `${p.kind === 'mix' ? 'mixed state ' : ''}${p.name} at ${positionText(p, data.units)}` +
      `${p.fog ? ' (fog region, physically impossible as vapour)' : ''}`;
    parts.push(`Points: ${data.points.map(point).join('; ')}.`);
  } else parts.push('No states are plotted.');
  for (const m of data.mixes) parts.push(`Mixing line of ${m.streams.join(' and ')} through ${m.name}.`);
  for (const pr of data.processes)
    parts.push(
      `Process ${pr.name}: arrow from ${pr.from} to ${pr.to}${pr.kind ? ` (${pr.kind.replace(/-/g, ' ')})` : ''}` +
        `${pr.adp ? `, apparatus dew point ${formatQuantity(pr.adp.db, 'temperature', data.units).text}` : ''}.`,
    );
  for (const l of data.shrLines ?? [])
    parts.push(
      `Room SHR line of supply ${l.supply} through ${l.room}${l.shr === null ? '' : ` (SHR ${l.shr.toFixed(2)})`}.`,
    );
  for (const f of data.infeasible) parts.push(`${f.name}: ${f.plotted ? 'marked' : 'not plotted'}, ${f.reason}`);
  return parts.join(' ');
}

/** The legend's entries and their positions, wrapped to the plot width; rows are 18 px apart. */
function legendItems(
  layout: ChartLayout,
  extras: { shr: boolean; adp: boolean },
): { cls: string; text: string; x: number; row: number }[] {
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
  if (extras.shr) items.push(['dmc-shrline', 'room SHR line']);
  if (extras.adp) items.push(['dmc-coilline', 'coil line to its apparatus dew point (ADP)']);
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

function legend(ctx: Ctx, y: number, extras: { shr: boolean; adp: boolean }): void {
  ctx.out.push('<g class="dmc-legend-row">');
  for (const { cls, text, x, row } of legendItems(ctx.layout, extras)) {
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

/** A coil's apparatus dew point as drawn: its mark on saturation and the coil line from the leaving state. */
interface AdpMark {
  px: Pixel;
  text: string;
  processes: string[];
  run: Pixel[][];
}

/** A room SHR line as drawn. */
interface ShrMark {
  supply: string;
  room: string;
  text: string;
  runs: Pixel[][];
}

/** A name written beside a straight piece (an arrow, an SHR line). */
interface LineName {
  text: string;
  start: Pixel;
  tip: Pixel;
  cls: string;
}

/** Coincident points share one tag: the points of each tag, by index into `plotted`. */
interface TagGroup {
  members: number[];
  text: string;
}

/** Everything the chart measures before anything is placed: sizes, curves and pixel positions. */
interface Measured {
  data: ChartData;
  /** The layout of the plot (the full height is known once the labels are placed). */
  layout: ChartLayout;
  id: string;
  title: string;
  nonce: string;
  sat: ChartCurve;
  vLines: ChartCurve[];
  hLines: ChartCurve[];
  wbLines: ChartCurve[];
  rh: ChartCurve[];
  /** Each plotted point once (the first of a name), with its pixel. */
  plotted: { p: ChartPoint; px: Pixel }[];
  tagGroups: TagGroup[];
  /** Mixing line runs, by mix name. */
  mixRuns: { name: string; run: Pixel[] }[];
  arrows: Arrow[];
  adps: AdpMark[];
  shrs: ShrMark[];
  /** The mixing lines, arrows, coil and SHR lines as straight pieces (labels keep off them). */
  segments: [Pixel, Pixel][];
  /** Names beside lines: one per pair of states joined by arrows ("CC, CC_sched"), and each SHR line's ratio. */
  lineNames: LineName[];
}

/** A family line's label as placed. */
interface FamilyText {
  text: string;
  cls: string;
  at: Pixel;
  anchor: 'start' | 'end' | 'middle';
  dy: number;
  box: Box;
}

/** Where every label went (null: no free spot; the name is listed under the chart instead). */
interface Placed {
  family: FamilyText[];
  /** One per tag group. */
  tags: (PlacedLabel | null)[];
  adpTags: (PlacedLabel | null)[];
  names: ({ text: string; cls: string; box: Box } | null)[];
  /** Names that found no free spot, for the caption. */
  unlabelled: string[];
}

/** The caption block under the plot, laid out once the labels are placed. */
interface CaptionBlock {
  layout: ChartLayout;
  captions: string[];
  flags: string[];
  legendY: number;
  captionY: number;
  flagsY: number;
  extras: { shr: boolean; adp: boolean };
}

/** Most names written in one shared tag before "+N". */
const TAG_NAMES = 3;

/** The pieces of a run, for the labels to keep off. */
function pushSegments(segments: [Pixel, Pixel][], run: Pixel[]): void {
  for (let i = 1; i < run.length; i++) segments.push([run[i - 1]!, run[i]!]);
}

/** Measure: the layout, the curves, and every point, line and arrow in pixels. */
function measureChart(data: ChartData, options: ChartOptions): Measured {
  const layout = chartLayout(data, options);
  const id = (options.idPrefix ?? 'dmc').replace(/[^A-Za-z0-9_-]/g, '') || 'dmc';
  const families = { ...ALL_FAMILIES, ...(options.families ?? {}) };

  const pos = new Map<string, { p: ChartPoint; px: Pixel }>();
  for (const p of data.points) {
    if (!pos.has(p.name)) pos.set(p.name, { p, px: toPixel(layout, p.db, p.w) });
  }
  const plotted = [...pos.values()];
  // Points on one spot (within a pixel) share a tag.
  const bySpot = new Map<string, TagGroup>();
  const tagGroups: TagGroup[] = [];
  plotted.forEach(({ px }, i) => {
    const key = `${Math.round(px.x)},${Math.round(px.y)}`;
    const g = bySpot.get(key);
    if (g) g.members.push(i);
    else {
      const fresh = { members: [i], text: '' };
      bySpot.set(key, fresh);
      tagGroups.push(fresh);
    }
  });
  for (const g of tagGroups) {
    const names = g.members.slice(0, TAG_NAMES).map((i) => tagText(plotted[i]!.p));
    g.text = names.join(', ') + (g.members.length > TAG_NAMES ? ` +${g.members.length - TAG_NAMES}` : '');
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
        pushSegments(segments, run);
      }
    }
  }
  const arrows: Arrow[] = [];
  const lineNames: LineName[] = [];
  const nameOfPair = new Map<string, LineName>();
  const adpBySpot = new Map<string, AdpMark>();
  for (const pr of data.processes) {
    const a = pos.get(pr.from);
    const b = pos.get(pr.to);
    if (!a || !b) continue;
    if (pr.adp) {
      const px = toPixel(layout, pr.adp.db, pr.adp.w);
      const key = `${Math.round(px.x)},${Math.round(px.y)}`;
      const same = adpBySpot.get(key);
      if (same) same.processes.push(pr.name);
      else {
        const run = mixingLine(layout, b.p, pr.adp);
        for (const r of run) pushSegments(segments, r);
        adpBySpot.set(key, {
          px,
          text: `ADP ${formatQuantity(pr.adp.db, 'temperature', data.units).text}`,
          processes: [pr.name],
          run,
        });
      }
    }
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
      const entry = { text: pr.name, start, tip, cls: 'dmc-process-name' };
      nameOfPair.set(key, entry);
      lineNames.push(entry);
    }
    segments.push([start, tip]);
  }
  const shrs: ShrMark[] = [];
  for (const l of data.shrLines ?? []) {
    const room = pos.get(l.room);
    const supply = pos.get(l.supply);
    if (!room || !supply) continue;
    const runs = roomLine(layout, room.p, supply.p, supply.p.pressurePa ?? data.pressurePa);
    if (runs.length === 0) continue;
    for (const r of runs) pushSegments(segments, r);
    const text = l.shr === null ? `${l.supply} room line` : `SHR ${l.shr.toFixed(2)}`;
    shrs.push({ supply: l.supply, room: l.room, text, runs });
    const last = runs[runs.length - 1]!;
    lineNames.push({ text, start: room.px, tip: last[last.length - 1]!, cls: 'dmc-shr-name' });
  }
  return {
    data,
    layout,
    id,
    title: options.title ?? data.title ?? 'Psychrometric chart',
    nonce: options.styleNonce && /^[A-Za-z0-9+/=_-]+$/.test(options.styleNonce) ? ` nonce="${options.styleNonce}"` : '',
    sat: saturationCurve(layout),
    vLines: families.volume ? volumeLines(layout) : [],
    hLines: families.enthalpy ? enthalpyLines(layout) : [],
    wbLines: families.wetBulb ? wetBulbLines(layout) : [],
    rh: families.rh ? rhCurves(layout) : [],
    plotted,
    tagGroups,
    mixRuns,
    arrows,
    adps: [...adpBySpot.values()],
    shrs,
    segments,
    lineNames,
  };
}

/** The text of a state's tag. */
function tagText(p: ChartPoint): string {
  return p.fog ? `${p.name} \u00b7 fog` : p.name;
}

/** A marker's box: what no label may cover. */
function markerBox(px: Pixel, r: number): Box {
  return { x: px.x - r - 2, y: px.y - r - 2, w: 2 * r + 4, h: 2 * r + 4 };
}

/** The box of a family label's text (10 px type) written at `at` with an anchor and a baseline offset. */
function familyBox(text: string, at: Pixel, anchor: FamilyText['anchor'], dy: number): Box {
  const w = textWidth(text, 10);
  const x0 = anchor === 'start' ? at.x : anchor === 'end' ? at.x - w : at.x - w / 2;
  return { x: x0 - 2, y: at.y + dy - 9, w: w + 4, h: 12 };
}

/** Spots along a straight piece for its name: fractions along it, and offsets to either side. */
const NAME_SPOTS: readonly (readonly [number, number])[] = [
  [0.5, 12],
  [0.35, 12],
  [0.65, 12],
  [0.2, 12],
  [0.8, 12],
  [0.5, 24],
  [0.35, 24],
  [0.65, 24],
  [0.5, 38],
  [0.5, 54],
];

/**
 * Place: the state tags first (beside their points, or further out with a leader), then the
 * apparatus dew points, the names beside arrows and SHR lines, and last the family lines' values
 * (rh and saturation at their upper end, wet-bulb at saturation, enthalpy at their lower-right
 * end, volume above the dry-bulb axis; each tries spots further along its line when one is taken).
 * No label overlaps another or covers a marker; one with no free spot is listed instead.
 */
function placeChart(m: Measured, stats?: PlacementStats): Placed {
  const { plot } = m.layout;
  const space = new LabelSpace(plot, stats);
  for (const { px } of m.plotted) space.block(markerBox(px, MARKER_RADIUS));
  for (const a of m.adps) space.block(markerBox(a.px, ADP_RADIUS));
  for (const [a, b] of m.segments) space.addSegment(a, b);
  const unlabelled: string[] = [];

  const tags = placeTags(
    space,
    m.tagGroups.map((g) => ({
      anchor: m.plotted[g.members[0]!]!.px,
      width: textWidth(g.text, 11) + 12,
      height: 18,
    })),
  );
  tags.forEach((t, i) => {
    if (!t) unlabelled.push(...m.tagGroups[i]!.members.map((k) => m.plotted[k]!.p.name));
  });
  const adpTags = placeTags(
    space,
    m.adps.map((a) => ({ anchor: a.px, width: textWidth(a.text, 10) + 8, height: 14 })),
  );
  adpTags.forEach((t, i) => {
    if (!t) unlabelled.push(`${m.adps[i]!.text} (${m.adps[i]!.processes.join(', ')})`);
  });

  const names = m.lineNames.map((r) => {
    const dx = r.tip.x - r.start.x;
    const dy = r.tip.y - r.start.y;
    const len = Math.hypot(dx, dy) || 1;
    const w = textWidth(r.text, 10.5);
    function* spots(): Generator<Box> {
      for (const [t, off] of NAME_SPOTS) {
        for (const side of [1, -1]) {
          const cx = r.start.x + dx * t + (side * dy * off) / len;
          const cy = r.start.y + dy * t - (side * dx * off) / len;
          yield { x: cx - w / 2, y: cy - 7, w, h: 13 };
        }
      }
    }
    const box = space.takeFirst(spots());
    if (!box) unlabelled.push(r.text);
    return box ? { text: r.text, cls: r.cls, box } : null;
  });

  const family: FamilyText[] = [];
  const tryLabel = (
    text: string,
    cls: string,
    spots: { at: Pixel; anchor: FamilyText['anchor']; dy: number }[],
  ): void => {
    for (const s of spots) {
      const box = familyBox(text, s.at, s.anchor, s.dy);
      space.count();
      if (!space.free(box)) continue;
      space.block(box);
      family.push({ text, cls, ...s, box });
      return;
    }
  };
  const upperEnd = (c: ChartCurve, text: string, cls: string): void => {
    const p = lastPoint(c);
    if (!p) return;
    if (p.y <= plot.top + 1) {
      // Exits through the top: beside the curve just below the edge, or further down the curve.
      tryLabel(
        text,
        cls,
        [p, ...pointsBack(c, [22, 44, 66, 88])].map((q) => ({
          at: { x: q.x + 4, y: Math.max(q.y, plot.top) },
          anchor: 'start' as const,
          dy: 12,
        })),
      );
    } else {
      tryLabel(
        text,
        cls,
        [p, ...pointsBack(c, [30, 60, 90])].map((q) => ({
          at: { x: Math.min(q.x, plot.right) - 4, y: q.y },
          anchor: 'end' as const,
          dy: -4,
        })),
      );
    }
  };
  upperEnd(m.sat, '100%', 'dmc-lbl-sat');
  for (const c of m.rh) upperEnd(c, `${c.value}%`, 'dmc-lbl-rh');
  for (const c of m.hLines) {
    const p = lastPoint(c);
    if (!p) continue;
    const text = label(c.value);
    if (p.x >= plot.right - 1) {
      // Leaves through the right edge: under the line at the edge, or further up the line.
      tryLabel(text, 'dmc-lbl-h', [
        { at: { x: plot.right - 4, y: p.y }, anchor: 'end', dy: 12 },
        ...pointsBack(c, [40, 80, 120, 160]).map((q) => ({ at: q, anchor: 'middle' as const, dy: 12 })),
      ]);
    } else if (p.y >= plot.bottom - 1)
      tryLabel(text, 'dmc-lbl-h', [
        { at: { x: p.x + 3, y: plot.bottom }, anchor: 'start', dy: -4 },
        ...pointsBack(c, [40, 80]).map((q) => ({ at: q, anchor: 'start' as const, dy: -4 })),
      ]);
  }
  for (const c of m.wbLines) {
    const p = firstPoint(c);
    if (p && p.x > plot.left + 1 && p.y > plot.top + 1)
      tryLabel(label(c.value), 'dmc-lbl-wb', [{ at: { x: p.x - 3, y: p.y }, anchor: 'end', dy: -3 }]);
  }
  for (const c of m.vLines) {
    const p = lastPoint(c);
    if (p && p.y >= plot.bottom - 1)
      tryLabel(label(c.value), 'dmc-lbl-v', [{ at: { x: p.x - 3, y: plot.bottom }, anchor: 'end', dy: -16 }]);
  }
  return { family, tags, adpTags, names, unlabelled };
}

/** Radius of an apparatus dew point's mark, px. */
const ADP_RADIUS = 4;

/** Lay out the caption block under the plot: legend, caption lines, flagged items. */
function captionBlock(m: Measured, placed: Placed): CaptionBlock {
  const { layout, data } = m;
  const { plot } = layout;
  const lines = captionLines(data);
  if (placed.unlabelled.length > 0)
    lines.push(`Not labelled for lack of room (hover a marker for its name): ${placed.unlabelled.join(', ')}.`);
  const captions = lines.flatMap((l) => wrap(l, Math.floor((layout.width - plot.left - 20) / 6)));
  const flags = flagLines(data).flatMap((l) => wrap(l, Math.floor((layout.width - plot.left - 40) / 6)));
  const extras = { shr: m.shrs.length > 0, adp: m.adps.length > 0 };
  let y = plot.bottom + 64;
  const legendY = y;
  y += 20 + 18 * Math.max(0, ...legendItems(layout, extras).map((i) => i.row));
  const captionY = y;
  y += captions.length * 15;
  const flagsY = y + 6;
  if (flags.length > 0) y = flagsY + 16 + flags.length * 15;
  return { layout: { ...layout, height: Math.ceil(y + 12) }, captions, flags, legendY, captionY, flagsY, extras };
}

/** A box as a `data-box` attribute value (`x y w h`): the space the label takes, for tests and hosts. */
function boxAttr(b: Box): string {
  return `${n(b.x)} ${n(b.y)} ${n(b.w)} ${n(b.h)}`;
}

/** Draw: the SVG text of a measured and placed chart, and its size. */
function drawChart(m: Measured, placed: Placed): SizedChart {
  const { data, id } = m;
  const cap = captionBlock(m, placed);
  const full = cap.layout;
  const { plot } = full;
  const height = full.height;
  const ctx: Ctx = { layout: full, id, out: [] };
  const out = ctx.out;
  const range = full.range;
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" class="dmc" role="img" ` +
      `aria-labelledby="${id}-title ${id}-desc" width="${full.width}" height="${height}" ` +
      `viewBox="0 0 ${full.width} ${height}" data-pressure-pa="${n(data.pressurePa)}" ` +
      `data-units="${data.units}" data-db-min="${range.dbMin}" ` +
      `data-db-max="${range.dbMax}" data-w-min="${range.wMin}" data-w-max="${range.wMax}" ` +
      `data-plot="${plot.left} ${plot.top} ${plot.right} ${plot.bottom}">`,
  );
  out.push(`<title id="${id}-title">${escapeXml(m.title)}</title>`);
  out.push(`<desc id="${id}-desc">${escapeXml(describe(data, full))}</desc>`);
  out.push(`<style${m.nonce}>${chartCss()}</style>`);
  out.push(
    `<defs><clipPath id="${id}-clip"><rect x="${n(plot.left)}" y="${n(plot.top)}" ` +
      `width="${n(plot.right - plot.left)}" height="${n(plot.bottom - plot.top)}"/></clipPath></defs>`,
  );
  out.push(`<rect class="dmc-page" x="0" y="0" width="${full.width}" height="${height}"/>`);
  out.push(
    `<text class="dmc-heading" x="${n(plot.left)}" ` +
      `y="24">${escapeXml(fitText(m.title, 15, full.width - plot.left - 10))}</text>`,
  );
  const subtitle =
    `${formatQuantity(data.pressurePa, 'pressure', data.units).text} \u00b7 ${data.units} ` +
    '\u00b7 dry-bulb against humidity ratio';
  out.push(`<text class="dmc-sub" x="${n(plot.left)}" y="41">${escapeXml(subtitle)}</text>`);
  out.push(
    `<rect class="dmc-panel" x="${n(plot.left)}" y="${n(plot.top)}" ` +
      `width="${n(plot.right - plot.left)}" height="${n(plot.bottom - plot.top)}"/>`,
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
      `<text class="dmc-lbl ${f.cls}" data-box="${boxAttr(f.box)}" x="${n(f.at.x)}" ` +
        `y="${n(f.at.y + f.dy)}" text-anchor="${f.anchor}">${escapeXml(f.text)}</text>`,
    );
  }
  out.push('</g>');

  out.push(`<g class="dmc-overlay" clip-path="url(#${id}-clip)">`);
  for (const s of m.shrs) {
    out.push(
      `<path class="dmc-shrline" data-supply="${escapeXml(s.supply)}" ` +
        `data-room="${escapeXml(s.room)}" d="${s.runs.map(pathOf).join('')}"/>`,
    );
  }
  for (const a of m.adps) {
    if (a.run.length > 0)
      out.push(
        `<path class="dmc-coilline" data-process="${escapeXml(a.processes.join(' '))}" ` +
          `d="${a.run.map(pathOf).join('')}"/>`,
      );
  }
  for (const r of m.mixRuns)
    out.push(`<path class="dmc-mixline" data-mix="${escapeXml(r.name)}" d="${pathOf(r.run)}"/>`);
  for (const { process: pr, start, tip, base, ux, uy } of m.arrows) {
    const flagged = pr.flagged ? ' dmc-flagged' : '';
    out.push(
      `<g class="dmc-process-group" data-process="${escapeXml(pr.name)}" ` +
        `data-from="${escapeXml(pr.from)}" data-to="${escapeXml(pr.to)}">`,
    );
    out.push(`<path class="dmc-process${flagged}" d="M${n(start.x)} ${n(start.y)}L${n(base.x)} ${n(base.y)}"/>`);
    out.push(
      `<path class="${pr.flagged ? 'dmc-arrow-flag' : 'dmc-arrow'}" d="M${n(tip.x)} ${n(tip.y)}` +
        `L${n(base.x - uy * 4.5)} ${n(base.y + ux * 4.5)}L${n(base.x + uy * 4.5)} ${n(base.y - ux * 4.5)}Z"/>`,
    );
    out.push('</g>');
  }
  out.push('</g>');

  out.push('<g class="dmc-adps">');
  m.adps.forEach((a, i) => {
    out.push(`<g class="dmc-adp-group" data-process="${escapeXml(a.processes.join(' '))}">`);
    out.push(`<title>${escapeXml(`${a.text}: apparatus dew point of ${a.processes.join(', ')}`)}</title>`);
    const lp = placed.adpTags[i];
    if (lp?.leader) out.push(leaderLine(a.px, lp.box));
    out.push(`<circle class="dmc-adp" cx="${n(a.px.x)}" cy="${n(a.px.y)}" r="${ADP_RADIUS}"/>`);
    if (lp)
      out.push(
        `<text class="dmc-adp-label" data-box="${boxAttr(lp.box)}" x="${n(lp.box.x + lp.box.w / 2)}" ` +
          `y="${n(lp.box.y + lp.box.h / 2 + 3.5)}" text-anchor="middle">${escapeXml(a.text)}</text>`,
      );
    out.push('</g>');
  });
  out.push('</g>');

  out.push('<g class="dmc-points">');
  const tagOf = new Map<number, { group: TagGroup; placed: PlacedLabel | null }>();
  m.tagGroups.forEach((g, i) => {
    tagOf.set(g.members[0]!, { group: g, placed: placed.tags[i] ?? null });
  });
  m.plotted.forEach(({ p, px }, i) => {
    const kind = pointClass(p);
    const where = positionText(p, data.units);
    out.push(`<g class="dmc-point${p.context ? ' dmc-context' : ''}" data-name="${escapeXml(p.name)}">`);
    const title =
      `${p.kind === 'mix' ? 'mix' : 'state'} ${p.name}: ${where}` +
      `${p.fog ? ' \u2014 fog region (infeasible as vapour)' : ''}` +
      `${p.context ? ' (defined in another part of the note)' : ''}`;
    out.push(`<title>${escapeXml(title)}</title>`);
    const tag = tagOf.get(i);
    const lp = tag?.placed;
    if (lp?.leader) out.push(leaderLine(px, lp.box));
    out.push(
      `<circle class="dmc-marker dmc-marker-${kind}" data-name="${escapeXml(p.name)}" ` +
        `data-kind="${p.kind}"${p.fog ? ' data-infeasible="fog"' : ''} data-db="${p.db}" ` +
        `data-w="${p.w}" cx="${n(px.x)}" cy="${n(px.y)}" r="${MARKER_RADIUS}"/>`,
    );
    if (p.fog) {
      const k = MARKER_RADIUS * 0.6;
      out.push(
        `<path class="dmc-fogcross" d="M${n(px.x - k)} ${n(px.y - k)}L${n(px.x + k)} ${n(px.y + k)}` +
          `M${n(px.x - k)} ${n(px.y + k)}L${n(px.x + k)} ${n(px.y - k)}"/>`,
      );
    }
    if (tag && lp) {
      out.push(
        `<rect class="dmc-tag${p.kind === 'mix' ? ' dmc-tag-mix' : ''}${p.fog ? ' dmc-tag-fog' : ''}" ` +
          `data-box="${boxAttr(lp.box)}" x="${n(lp.box.x)}" y="${n(lp.box.y)}" ` +
          `width="${n(lp.box.w)}" height="${n(lp.box.h)}" rx="9"/>`,
      );
      out.push(
        `<text class="dmc-tagtext" x="${n(lp.box.x + lp.box.w / 2)}" ` +
          `y="${n(lp.box.y + lp.box.h / 2 + 4)}" text-anchor="middle">${escapeXml(tag.group.text)}</text>`,
      );
    }
    out.push('</g>');
  });
  out.push('</g>');

  out.push('<g class="dmc-process-names">');
  for (const name of placed.names) {
    if (!name) continue;
    const { text, cls, box } = name;
    out.push(
      `<text class="${cls}" data-box="${boxAttr(box)}" x="${n(box.x + box.w / 2)}" ` +
        `y="${n(box.y + 10)}" text-anchor="middle">${escapeXml(text)}</text>`,
    );
  }
  out.push('</g>');

  legend(ctx, cap.legendY, cap.extras);
  cap.captions.forEach((line, i) => {
    out.push(
      `<text class="dmc-caption" data-caption="${i}" x="${n(plot.left)}" ` +
        `y="${n(cap.captionY + i * 15)}">${escapeXml(line)}</text>`,
    );
  });
  if (cap.flags.length > 0) {
    out.push(
      `<g class="dmc-flags"><text class="dmc-flag-title" x="${n(plot.left)}" y="${n(cap.flagsY + 4)}">Flagged</text>`,
    );
    cap.flags.forEach((line, i) => {
      out.push(
        `<text class="dmc-flag-item" x="${n(plot.left + 12)}" ` +
          `y="${n(cap.flagsY + 20 + i * 15)}">${escapeXml(line)}</text>`,
      );
    });
    out.push('</g>');
  }
  out.push('</svg>');
  return { svg: out.join('\n'), width: full.width, height };
}

/**
 * `text` cut to fit `width` px at `fontSize` (an ellipsis ends a cut text; the full text stays in
 * the SVG's `<title>`), so a long heading never runs off a narrow chart.
 */
export function fitText(text: string, fontSize: number, width: number): string {
  if (textWidth(text, fontSize) <= width) return text;
  const chars = [...text];
  let lo = 0;
  let hi = chars.length;
  while (lo < hi) {
    const mid = (lo + hi + 1) >>> 1;
    if (textWidth(`${chars.slice(0, mid).join('').trimEnd()}\u2026`, fontSize) <= width) lo = mid;
    else hi = mid - 1;
  }
  return `${chars.slice(0, lo).join('').trimEnd()}\u2026`;
}

/** A leader line from a point to the nearest point of its label's box. */
function leaderLine(px: Pixel, box: Box): string {
  const bx = Math.max(box.x, Math.min(px.x, box.x + box.w));
  const by = Math.max(box.y, Math.min(px.y, box.y + box.h));
  return `<line class="dmc-leader" x1="${n(px.x)}" y1="${n(px.y)}" x2="${n(bx)}" y2="${n(by)}"/>`;
}

/**
 * Renders a chart from plain data (SI). Returns one `<svg>` element as text, with its own
 * stylesheet, `<title>` and `<desc>`. Markers carry `data-name`, `data-kind`, `data-db` (°C) and
 * `data-w` (kg/kg), and every label its box as `data-box`, so tests and hosts can find them.
 * Three steps: measure (layout, curves, pixels), place (labels, near-linear, no overlaps), draw
 * (the SVG text). `stats`, when given, counts the placement's work (for the cost tests and the
 * benchmark).
 */
export function renderChartFromData(data: ChartData, options: ChartOptions = {}, stats?: PlacementStats): string {
  return renderSizedChart(data, options, stats).svg;
}

/** A rendered chart and its size in CSS px (the `<svg>`'s width and height). */
export interface SizedChart {
  svg: string;
  width: number;
  height: number;
}

/** {@link renderChartFromData}, with the size of the SVG (to stack several charts in one document). */
export function renderSizedChart(data: ChartData, options: ChartOptions = {}, stats?: PlacementStats): SizedChart {
  const measured = measureChart(data, options);
  return drawChart(measured, placeChart(measured, stats));
}
