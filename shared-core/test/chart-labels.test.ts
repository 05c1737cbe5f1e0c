/**
 * Label placement on crowded charts: no two labels' boxes intersect, no label covers a marker,
 * a label moved away from its point has a leader line, every name is either on the chart or
 * listed under it, and the enthalpy lines get their values. The charts are hundreds of invented
 * states (a fixed pseudo-random walk), piles of states on one spot, and the invented-building
 * notes in examples/. Boxes are read back from the SVG (`data-box`, the space each label takes).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import { renderChartCases, renderChartFromData, type ChartPoint } from '../src/chart';
import { textWidth } from '../src/chart/labels';
import { P0, elements, parsePath, spread } from './chart-helpers';

interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
  what: string;
}

/** Every label's box (state tags, ADP labels, line names, family values), from `data-box`. */
function labelBoxes(svg: string): Box[] {
  const out: Box[] = [];
  const re = /<(rect|text)\b([^>]*)\bdata-box="([^"]*)"([^>]*)>/g;
  for (let m = re.exec(svg); m; m = re.exec(svg)) {
    const [x, y, w, h] = m[3]!.split(' ').map(Number) as [number, number, number, number];
    out.push({ x, y, w, h, what: `${m[1]} ${/class="([^"]*)"/.exec(m[2]! + m[4]!)?.[1]} at ${m[3]}` });
  }
  return out;
}

/** Every marker's box: state markers and apparatus dew points (their circles' bounding boxes). */
function markerBoxes(svg: string): Box[] {
  return [...elements(svg, 'circle', 'dmc-marker'), ...elements(svg, 'circle', 'dmc-adp')].map((c) => {
    const r = Number(c.r);
    return { x: Number(c.cx) - r, y: Number(c.cy) - r, w: 2 * r, h: 2 * r, what: `marker ${c['data-name'] ?? 'ADP'}` };
  });
}

function overlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

/** The pairs of boxes that intersect (a sweep along x: boxes sorted by left edge). */
function intersecting(a: Box[], b: Box[] = []): [string, string][] {
  const all = [...a.map((box) => ({ box, set: 0 })), ...b.map((box) => ({ box, set: 1 }))].sort(
    (p, q) => p.box.x - q.box.x,
  );
  const bad: [string, string][] = [];
  for (let i = 0; i < all.length; i++) {
    for (let j = i + 1; j < all.length && all[j]!.box.x < all[i]!.box.x + all[i]!.box.w; j++) {
      const p = all[i]!;
      const q = all[j]!;
      // Labels against labels, and labels against markers (markers may touch each other).
      if (p.set === 1 && q.set === 1) continue;
      if (overlap(p.box, q.box)) bad.push([p.box.what, q.box.what]);
    }
  }
  return bad;
}

/** Checks a chart: no label meets another or a marker; every state is named on the chart or under it. */
function checkChart(svg: string, names: string[]): { tags: number; leaders: number; unlabelled: number } {
  const labels = labelBoxes(svg);
  expect(intersecting(labels)).toEqual([]);
  expect(intersecting(labels, markerBoxes(svg))).toEqual([]);
  const tagText = elements(svg, 'text', 'dmc-tagtext').length;
  const shown = new Set<string>();
  for (const m of svg.matchAll(/<text class="dmc-tagtext"[^>]*>([^<]*)<\/text>/g))
    for (const part of m[1]!.split(', ')) shown.add(part.replace(/ \+\d+$/, '').replace(' · fog', ''));
  const caption = /Not labelled for lack of room \(hover a marker for its name\): ([^<]*)\.</.exec(
    svg.replace(/<\/text>\n<text class="dmc-caption"[^>]*>/g, ' '),
  )?.[1];
  const listed = new Set((caption ?? '').split(', ').filter(Boolean));
  // Points on one spot share a tag ("S0, S1, S2 +297"): the others on that spot are named by it.
  const spot = (c: Record<string, string>) => `${Math.round(Number(c.cx))},${Math.round(Number(c.cy))}`;
  const markers = elements(svg, 'circle', 'dmc-marker');
  const sharedSpots = new Set(markers.filter((c) => shown.has(c['data-name']!)).map(spot));
  const onSharedSpot = new Set(markers.filter((c) => sharedSpots.has(spot(c))).map((c) => c['data-name']!));
  for (const name of names) expect(shown.has(name) || listed.has(name) || onSharedSpot.has(name), name).toBe(true);
  return {
    tags: tagText,
    leaders: elements(svg, 'line', 'dmc-leader').length,
    unlabelled: names.filter((name) => listed.has(name)).length,
  };
}

describe('labels on crowded charts', () => {
  for (const n of [60, 300, 800]) {
    it(`${n} states spread over a default-size chart: no label meets another or covers a marker`, () => {
      const d = spread(n);
      const { tags, unlabelled } = checkChart(
        renderChartFromData(d),
        d.points.map((p) => p.name),
      );
      // The placement labels what fits and lists the rest (states on one spot share a tag).
      expect(tags + unlabelled).toBeLessThanOrEqual(n);
      expect(tags + unlabelled).toBeGreaterThanOrEqual(n - 3);
      if (n === 60) expect(unlabelled).toBe(0);
      // 300 states crowd a third of a 960 × 520 px plot: about half get a tag beside them (140 when written).
      if (n === 300) expect(tags).toBeGreaterThan(120);
    });
  }

  it('a label moved away from its point has a leader line to it; one beside its point has none', () => {
    const svg = renderChartFromData(spread(60));
    let moved = 0;
    for (const g of svg.split('<g class="dmc-point"').slice(1)) {
      const c = elements(g, 'circle', 'dmc-marker')[0]!;
      const rect = elements(g, 'rect', 'dmc-tag')[0];
      if (!rect) continue;
      const [x, y, w, h] = rect['data-box']!.split(' ').map(Number) as [number, number, number, number];
      const cx = Number(c.cx);
      const cy = Number(c.cy);
      const gap = Math.hypot(Math.max(x - cx, 0, cx - x - w), Math.max(y - cy, 0, cy - y - h));
      const leader = elements(g, 'line', 'dmc-leader')[0];
      // The first ring sits 9 px from the point (plus the marker); further rings from 26 px.
      if (gap > 20) {
        moved++;
        expect(leader, `${c['data-name']} is ${gap.toFixed(0)} px from its tag`).toBeDefined();
        expect(Number(leader!.x1)).toBe(cx);
        expect(Number(leader!.y1)).toBe(cy);
      } else expect(leader).toBeUndefined();
    }
    expect(moved).toBeGreaterThan(0);
  });

  it('states piled on one spot share one tag that says how many more there are', () => {
    const points: ChartPoint[] = [];
    for (let i = 0; i < 300; i++) points.push({ name: `S${i}`, kind: 'state', db: 24, w: 0.0093 });
    points.push({ name: 'OUT', kind: 'state', db: 32, w: 0.014 });
    const svg = renderChartFromData({ pressurePa: P0, units: 'SI', points, mixes: [], processes: [], infeasible: [] });
    const texts = [...svg.matchAll(/<text class="dmc-tagtext"[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(texts).toEqual(['S0, S1, S2 +297', 'OUT']);
    checkChart(
      svg,
      points.map((p) => p.name),
    );
    // Each state keeps its own marker and tooltip.
    expect(elements(svg, 'circle', 'dmc-marker')).toHaveLength(301);
  });

  const examples = join(__dirname, '..', '..', 'examples');
  for (const file of ['kestrel-ridge-ahu1.md', 'level2-meeting-room-check.md']) {
    for (const grouping of ['section', 'block', 'all'] as const) {
      it(
        `examples/${file}, a chart per ${grouping}: no label ` + `meets another or covers a marker, every state named`,
        () => {
          const text = readFileSync(join(examples, file), 'utf8');
          const analysis = analyzeNote(text, {});
          for (const chart of renderChartCases(analysis, grouping, { source: text })) {
            const names = elements(chart.svg, 'circle', 'dmc-marker').map((c) => c['data-name']!);
            const { unlabelled } = checkChart(chart.svg, names);
            expect(unlabelled).toBe(0);
          }
        },
      );
    }
  }
});

describe('family line values', () => {
  it('labels every enthalpy line that runs a fair way across the plot (40, 70 and 100 kJ/kg among them)', () => {
    const text = readFileSync(join(__dirname, '..', '..', 'examples', 'kestrel-ridge-ahu1.md'), 'utf8');
    const analysis = analyzeNote(text, {});
    const summer = renderChartCases(analysis, 'section', { source: text })[0]!;
    const labelled = new Set(elements(summer.svg, 'text', 'dmc-lbl-h').map((t) => t['data-box']));
    const values = [...summer.svg.matchAll(/<text class="dmc-lbl dmc-lbl-h"[^>]*>([^<]*)<\/text>/g)].map((m) =>
      Number(m[1]!.replace('\u2212', '-')),
    );
    expect(labelled.size).toBe(values.length);
    for (const v of [40, 70, 100]) expect(values).toContain(v);
    // Every enthalpy line with more than 80 px drawn has its value.
    for (const p of elements(summer.svg, 'path', 'dmc-h')) {
      const length = parsePath(p.d!).reduce(
        (sum, run) => sum + run.slice(1).reduce((s, q, i) => s + Math.hypot(q.x - run[i]!.x, q.y - run[i]!.y), 0),
        0,
      );
      if (length > 80)
        expect(values, `h = ${p['data-value']} kJ/kg (${length.toFixed(0)} px)`).toContain(Number(p['data-value']));
    }
  });
});

describe('the heading', () => {
  it('is cut with an ellipsis to fit a narrow chart; the whole title stays in <title>', () => {
    const title = 'harbour-lab-ahu2.md — Harbour Street Lab — AHU-2 outdoor-air check, summer design day';
    const svg = renderChartFromData(spread(3), { width: 480, plotHeight: 260, title });
    const heading = /<text class="dmc-heading"[^>]*>([^<]*)<\/text>/.exec(svg)![1]!;
    expect(heading.endsWith('…')).toBe(true);
    expect(title.startsWith(heading.slice(0, -1).trimEnd())).toBe(true);
    // 15 px type from the plot's left edge (76 px) to 10 px short of the right edge.
    expect(textWidth(heading, 15)).toBeLessThanOrEqual(480 - 76 - 10);
    expect(svg).toContain(`<title id="dmc-title">${title}</title>`);
    // A title that fits is left whole.
    expect(renderChartFromData(spread(3), { title: 'Short' })).toContain('>Short</text>');
  });
});
