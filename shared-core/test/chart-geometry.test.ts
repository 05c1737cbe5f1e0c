/**
 * Geometry of the chart: every pixel comes from the engine through the one mapping `toPixel`.
 * Expected positions are computed with the engine itself (consistency checks, no tabulated
 * figure), except where a test names a published source.
 */
import { describe, expect, it } from 'vitest';
import { chartLayout, fromPixel, renderChartFromData, toPixel, type ChartData, type ChartPoint } from '../src/chart';
import { humRatioFromRelHum, humRatioFromWetBulb, satHumRatio, enthalpy, dbFromEnthalpy } from '../src/physics';
import { curvePath, distanceToRuns, elements, maxTurnDegrees, parsePath } from './chart-helpers';

const P0 = 101_325; // standard sea-level pressure, ASHRAE HoF 2017 SI Ch.1 Table 1 (Z = 0)

function state(name: string, db: number, w: number, extra: Partial<ChartPoint> = {}): ChartPoint {
  return { name, kind: 'state', db, w, ...extra };
}

function data(points: ChartPoint[], extra: Partial<ChartData> = {}): ChartData {
  return { pressurePa: P0, units: 'SI', points, mixes: [], processes: [], infeasible: [], ...extra };
}

function marker(svg: string, name: string): { x: number; y: number; attrs: Record<string, string> } {
  const m = elements(svg, 'circle', 'dmc-marker').find((a) => a['data-name'] === name);
  if (!m) throw new Error(`no marker for ${name}`);
  return { x: Number(m.cx), y: Number(m.cy), attrs: m };
}

describe('the mapping', () => {
  const layout = chartLayout(data([state('A', 24, 0.0093)]));

  it('puts the window corners on the plot corners and inverts exactly', () => {
    const { plot, range } = layout;
    expect(toPixel(layout, range.dbMin, range.wMin)).toEqual({ x: plot.left, y: plot.bottom });
    const tr = toPixel(layout, range.dbMax, range.wMax);
    expect(tr.x).toBeCloseTo(plot.right, 9);
    expect(tr.y).toBeCloseTo(plot.top, 9);
    const back = fromPixel(layout, toPixel(layout, 17.3, 0.0081));
    expect(back.db).toBeCloseTo(17.3, 9);
    expect(back.w).toBeCloseTo(0.0081, 12);
  });

  it('is linear: equal steps of dry-bulb or humidity ratio are equal pixel steps', () => {
    const a = toPixel(layout, 10, 0.005);
    const b = toPixel(layout, 20, 0.01);
    const c = toPixel(layout, 30, 0.015);
    expect(b.x - a.x).toBeCloseTo(c.x - b.x, 9);
    expect(b.y - a.y).toBeCloseTo(c.y - b.y, 9);
    expect(b.y).toBeLessThan(a.y); // humidity ratio points up
  });

  it('places a state marker exactly at the mapped pixel of its (db, w), in SI and in IP', () => {
    for (const units of ['SI', 'IP'] as const) {
      const d = data([state('RA', 24, 0.0093), state('OA', 33, 0.0143), state('W1', -8, 0.0012)], { units });
      const svg = renderChartFromData(d);
      const lay = chartLayout(d);
      for (const p of d.points) {
        const expected = toPixel(lay, p.db, p.w);
        const got = marker(svg, p.name);
        expect(Math.abs(got.x - expected.x)).toBeLessThanOrEqual(0.01);
        expect(Math.abs(got.y - expected.y)).toBeLessThanOrEqual(0.01);
      }
    }
  });
});

describe('states lie on their curves', () => {
  it('a state at 50 % rh lies on the 50 % curve within a pixel (several dry-bulbs, two pressures)', () => {
    for (const p of [P0, 83_400]) {
      const pts = [2, 12, 24, 31, 38].map((db, i) =>
        state(`S${i}`, db, humRatioFromRelHum(db, 0.5, p), { pressurePa: p }),
      );
      const svg = renderChartFromData(data(pts, { pressurePa: p }));
      const curve = curvePath(svg, 'rh', '50');
      for (const s of pts) expect(distanceToRuns(marker(svg, s.name), curve)).toBeLessThan(1);
    }
  });

  it('states at 10 %…90 % rh each lie on their own curve within a pixel, and not on the neighbouring one', () => {
    for (const units of ['SI', 'IP'] as const) {
      for (const pct of [10, 20, 30, 40, 60, 70, 80, 90]) {
        const s = state('X', 27, humRatioFromRelHum(27, pct / 100, P0));
        const svg = renderChartFromData(data([s], { units }));
        const m = marker(svg, 'X');
        expect(distanceToRuns(m, curvePath(svg, 'rh', String(pct)))).toBeLessThan(1);
        expect(distanceToRuns(m, curvePath(svg, 'rh', String(pct === 90 ? 80 : pct + 10)))).toBeGreaterThan(3);
      }
    }
  });

  it('a saturated state lies on the saturation curve; a wet-bulb line passes through a state of that wb', () => {
    const sat = state('S', 18, satHumRatio(18, P0));
    const wbState = state('B', 30, humRatioFromWetBulb(30, 20, P0));
    const svg = renderChartFromData(data([sat, wbState]));
    expect(distanceToRuns(marker(svg, 'S'), curvePath(svg, 'saturation', '100'))).toBeLessThan(1);
    expect(distanceToRuns(marker(svg, 'B'), curvePath(svg, 'wetBulb', '20'))).toBeLessThan(1);
  });

  it('an enthalpy line passes through a state of that enthalpy', () => {
    // 50 kJ/kg at w = 0.008: the dry-bulb from the engine's enthalpy equation.
    const s = state('H', dbFromEnthalpy(50_000, 0.008), 0.008);
    const svg = renderChartFromData(data([s]));
    expect(distanceToRuns(marker(svg, 'H'), curvePath(svg, 'enthalpy', '50'))).toBeLessThan(1);
  });

  it(
    'the saturation curve passes through the tabulated saturation ' +
      'humidity ratios (ASHRAE HoF 2017 SI Ch.1 Table 2, rel 0.5 %)',
    () => {
      const svg = renderChartFromData(data([]));
      const lay = chartLayout(data([]));
      const curve = curvePath(svg, 'saturation', '100');
      // Ws at 101.325 kPa: 5 °C 0.005425, 25 °C 0.020173 (ASHRAE HoF 2017 SI Ch.1 Table 2).
      for (const [db, ws] of [
        [5, 0.005425],
        [25, 0.020173],
      ] as const) {
        const target = toPixel(lay, db, ws);
        const tolPx = (ws * 0.005 * (lay.plot.bottom - lay.plot.top)) / (lay.range.wMax - lay.range.wMin);
        expect(distanceToRuns(target, curve)).toBeLessThanOrEqual(Math.max(tolPx, 0.5));
      }
    },
  );

  it('the mixed point lies on the mixing line of its two streams within a pixel', () => {
    const oa = state('OA', 33, humRatioFromWetBulb(33, 23, P0));
    const ra = state('RA', 24, humRatioFromRelHum(24, 0.5, P0));
    // Adiabatic mixing, 25 % OA by dry-air mass: w and h are mass-weighted (ASHRAE HoF Ch.1 eqs 41–43).
    const wM = 0.25 * oa.w + 0.75 * ra.w;
    const hM = 0.25 * enthalpy(oa.db, oa.w) + 0.75 * enthalpy(ra.db, ra.w);
    const ma: ChartPoint = { name: 'MA', kind: 'mix', db: dbFromEnthalpy(hM, wM), w: wM };
    const svg = renderChartFromData(data([oa, ra, ma], { mixes: [{ name: 'MA', streams: ['OA', 'RA'] }] }));
    const line = elements(svg, 'path', 'dmc-mixline');
    expect(line).toHaveLength(1);
    const runs = parsePath(line[0]!.d!);
    expect(distanceToRuns(marker(svg, 'MA'), runs)).toBeLessThan(1);
    // …and the line runs from one stream to the other.
    const first = runs[0]![0]!;
    const last = runs[runs.length - 1]!.at(-1)!;
    const a = marker(svg, 'OA');
    const b = marker(svg, 'RA');
    expect(Math.hypot(first.x - a.x, first.y - a.y)).toBeLessThan(0.02);
    expect(Math.hypot(last.x - b.x, last.y - b.y)).toBeLessThan(0.02);
  });

  it('a process is an arrow pointing from the entering to the leaving state', () => {
    const ma = state('MA', 26.3, 0.0104);
    const sa = state('SA', 13, 0.0089);
    const svg = renderChartFromData(data([ma, sa], { processes: [{ name: 'CC', from: 'MA', to: 'SA' }] }));
    const shaft = parsePath(elements(svg, 'path', 'dmc-process')[0]!.d!)[0]!;
    const head = parsePath(elements(svg, 'path', 'dmc-arrow')[0]!.d!)[0]!;
    const a = marker(svg, 'MA');
    const b = marker(svg, 'SA');
    const tip = head[0]!;
    // The shaft starts next to MA, the tip sits next to SA (just outside its marker).
    expect(Math.hypot(shaft[0]!.x - a.x, shaft[0]!.y - a.y)).toBeLessThan(10);
    expect(Math.hypot(tip.x - b.x, tip.y - b.y)).toBeLessThan(10);
    expect(Math.hypot(tip.x - a.x, tip.y - a.y)).toBeGreaterThan(Math.hypot(shaft[0]!.x - a.x, shaft[0]!.y - a.y));
    // The tip lies on the straight line from MA to SA.
    expect(distanceToRuns(tip, [[a, b]])).toBeLessThan(0.05);
  });
});

describe('smooth curves', () => {
  it('saturation and rh curves turn by less than 4° between segments, with segments no longer than 8 px', () => {
    for (const d of [
      data([]),
      data([], { units: 'IP' }),
      data([state('hot', 80, 0.05)]),
      data([state('cold', -30, 0.0002)]),
    ]) {
      const svg = renderChartFromData(d);
      const curves = [
        curvePath(svg, 'saturation', '100'),
        ...[10, 30, 50, 70, 90].map((v) => curvePath(svg, 'rh', String(v))),
      ];
      for (const runs of curves) {
        expect(runs.flat().length).toBeGreaterThan(20);
        expect(maxTurnDegrees(runs)).toBeLessThan(4);
        for (const run of runs) {
          for (let i = 1; i < run.length; i++)
            expect(Math.hypot(run[i]!.x - run[i - 1]!.x, run[i]!.y - run[i - 1]!.y)).toBeLessThanOrEqual(8);
        }
      }
    }
  });

  it('wet-bulb, enthalpy and volume lines are drawn and turn by less than 4° between segments', () => {
    const svg = renderChartFromData(data([]));
    for (const family of ['wetBulb', 'enthalpy', 'volume']) {
      const paths = elements(svg, 'path').filter((a) => a['data-family'] === family);
      expect(paths.length).toBeGreaterThanOrEqual(4);
      for (const p of paths) expect(maxTurnDegrees(parsePath(p.d!))).toBeLessThan(4);
    }
  });

  it('every curve stays inside the plot rectangle', () => {
    const d = data([state('A', 24, 0.0093)]);
    const svg = renderChartFromData(d);
    const { plot } = chartLayout(d);
    for (const p of elements(svg, 'path').filter((a) => a['data-family'])) {
      for (const q of parsePath(p.d!).flat()) {
        expect(q.x).toBeGreaterThanOrEqual(plot.left - 0.01);
        expect(q.x).toBeLessThanOrEqual(plot.right + 0.01);
        expect(q.y).toBeGreaterThanOrEqual(plot.top - 0.01);
        expect(q.y).toBeLessThanOrEqual(plot.bottom + 0.01);
      }
    }
  });
});

describe('the window fits the states', () => {
  it('widens the default window to hold far-off states, and every marker is inside the plot', () => {
    const pts = [state('dryer', 72, 0.045), state('cold', -22, 0.0004), state('room', 22, 0.008)];
    const d = data(pts);
    const svg = renderChartFromData(d);
    const { plot, range } = chartLayout(d);
    expect(range.dbMin).toBeLessThan(-22);
    expect(range.dbMax).toBeGreaterThan(72);
    expect(range.wMax).toBeGreaterThan(0.045);
    for (const p of pts) {
      const m = marker(svg, p.name);
      expect(m.x).toBeGreaterThan(plot.left);
      expect(m.x).toBeLessThan(plot.right);
      expect(m.y).toBeGreaterThan(plot.top);
      expect(m.y).toBeLessThan(plot.bottom);
    }
  });

  it('uses a fixed window when given one', () => {
    const lay = chartLayout(data([]), { range: { dbMin: 10, dbMax: 30, wMax: 0.02 } });
    expect(lay.range).toEqual({ dbMin: 10, dbMax: 30, wMin: 0, wMax: 0.02 });
  });

  it('keeps labels of nearby states apart', () => {
    const pts = [
      state('AA', 24, 0.0093),
      state('BB', 24.4, 0.0094),
      state('CC', 23.7, 0.0091),
      state('DD', 24.2, 0.0096),
    ];
    const svg = renderChartFromData(data(pts));
    const tags = elements(svg, 'rect', 'dmc-tag').map((a) => ({ x: +a.x!, y: +a.y!, w: +a.width!, h: +a.height! }));
    expect(tags).toHaveLength(4);
    for (let i = 0; i < tags.length; i++) {
      for (let j = i + 1; j < tags.length; j++) {
        const a = tags[i]!;
        const b = tags[j]!;
        const overlapX = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
        const overlapY = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
        expect(overlapX > 0 && overlapY > 0).toBe(false);
      }
    }
  });
});
