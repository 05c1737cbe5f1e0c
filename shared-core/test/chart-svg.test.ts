/**
 * The chart's SVG text: accessibility, axis labels with units, no non-finite numbers, flagged
 * (infeasible) states, theming hooks, and escaping. No numerical expected values here except
 * where a comment names the source.
 */
import { describe, expect, it } from 'vitest';
import {
  chartLayout,
  DARK_THEME,
  LIGHT_THEME,
  OWN_COLOURS,
  renderChartFromData,
  VSCODE_THEME_MAP,
  vscodeThemeCss,
  type ChartData,
  type ChartPoint,
} from '../src/chart';
import { humRatioFromRelHum, satHumRatio } from '../src/physics';
import { P0, elements } from './chart-helpers';

function state(name: string, db: number, w: number, extra: Partial<ChartPoint> = {}): ChartPoint {
  return { name, kind: 'state', db, w, ...extra };
}

function data(points: ChartPoint[], extra: Partial<ChartData> = {}): ChartData {
  return { pressurePa: P0, units: 'SI', points, mixes: [], processes: [], infeasible: [], ...extra };
}

const typical = data(
  [
    state('OA', 33, 0.0139),
    state('RA', 24, humRatioFromRelHum(24, 0.5, P0)),
    { name: 'MA', kind: 'mix', db: 26.2, w: 0.0104 },
    state('SA', 13, 0.0089),
  ],
  {
    mixes: [{ name: 'MA', streams: ['OA', 'RA'] }],
    processes: [{ name: 'CC', from: 'MA', to: 'SA', kind: 'cooling-dehumidifying' }],
    title: 'AHU-2 summer design',
  },
);

describe('accessibility', () => {
  it('has a <title> and a <desc> that the svg names with aria-labelledby', () => {
    const svg = renderChartFromData(typical, { idPrefix: 'c1' });
    expect(svg).toMatch(/^<svg [^>]*role="img"[^>]*aria-labelledby="c1-title c1-desc"/);
    expect(svg).toContain('<title id="c1-title">AHU-2 summer design</title>');
    const desc = /<desc id="c1-desc">([^<]*)<\/desc>/.exec(svg)?.[1] ?? '';
    expect(desc).toContain('101.325 kPa');
    for (const name of ['OA', 'RA', 'MA', 'SA']) expect(desc).toContain(name);
    expect(desc).toContain('Process CC: arrow from MA to SA (cooling dehumidifying)');
    expect(desc).toContain('Mixing line of OA and RA through MA');
  });

  it('gives each point its own tooltip title with its position in display units', () => {
    const svg = renderChartFromData(typical);
    expect(svg).toContain('<title>state SA: 13.0 °C, 8.90 g/kg</title>');
    const ip = renderChartFromData({ ...typical, units: 'IP' });
    // 13 °C = 55.4 °F exactly; 0.0089 kg/kg × 7000 = 62.3 gr/lb (exact unit definitions, common practice).
    expect(ip).toContain('<title>state SA: 55.4 °F, 62.3 gr/lb</title>');
  });
});

describe('axes', () => {
  it('labels both axes with their units (SI)', () => {
    const svg = renderChartFromData(typical);
    expect(svg).toContain('>Dry-bulb temperature (°C)</text>');
    expect(svg).toContain('>Humidity ratio (g/kg dry air)</text>');
    expect(svg).toContain('wet-bulb (°C)');
    expect(svg).toContain('enthalpy (kJ/kg)');
    expect(svg).toContain('specific volume (m³/kg)');
  });

  it('labels both axes with their units (IP), ticks in °F and gr/lb', () => {
    const svg = renderChartFromData({ ...typical, units: 'IP' });
    expect(svg).toContain('>Dry-bulb temperature (°F)</text>');
    expect(svg).toContain('>Humidity ratio (gr/lb dry air)</text>');
    expect(svg).toContain('enthalpy (Btu/lb)');
    const dbTicks = elements(svg, 'text').filter((a) => a['data-axis'] === 'db');
    expect(dbTicks.length).toBeGreaterThanOrEqual(5);
  });

  it('puts tick marks at the right places: 0 °C and 10 g/kg ticks sit at the mapped pixels', () => {
    const svg = renderChartFromData(typical);
    const lay = chartLayout(typical);
    const span = lay.range.dbMax - lay.range.dbMin;
    const x0 = lay.plot.left + ((0 - lay.range.dbMin) / span) * (lay.plot.right - lay.plot.left);
    const zero = [...svg.matchAll(/<text class="dmc-tick" data-axis="db" x="([\d.]+)"[^>]*>0<\/text>/g)];
    expect(zero).toHaveLength(1);
    expect(Math.abs(Number(zero[0]![1]) - x0)).toBeLessThan(0.01);
    const ten = [...svg.matchAll(/<text class="dmc-tick" data-axis="w" x="[\d.]+" y="([\d.]+)"[^>]*>10<\/text>/g)];
    expect(ten).toHaveLength(1);
    const y10 = lay.plot.bottom - (0.01 / lay.range.wMax) * (lay.plot.bottom - lay.plot.top);
    expect(Math.abs(Number(ten[0]![1]) - 3.5 - y10)).toBeLessThan(0.01);
  });

  it('writes negative ticks with a real minus sign', () => {
    const svg = renderChartFromData(data([state('cold', -12, 0.001)]));
    expect(svg).toMatch(/data-axis="db"[^>]*>\u221210<\/text>/);
  });
});

describe('no non-finite numbers, whatever the data', () => {
  const cases: [string, ChartData][] = [
    ['empty SI', data([])],
    ['empty IP', data([], { units: 'IP' })],
    ['typical', typical],
    ['high site (70 kPa)', data([state('A', 20, 0.01)], { pressurePa: 70_000 })],
    ['hot dryer', data([state('D', 95, 0.08)])],
    ['very cold', data([state('F', -60, 0.00001)])],
    ['one state at the engine limit', data([state('L', 199, 0.001)])],
    [
      'fog state',
      data([state('X', 20, satHumRatio(20, P0) * 1.3, { fog: true })], {
        infeasible: [{ name: 'X', plotted: true, reason: 'fog' }],
      }),
    ],
  ];
  for (const [label, d] of cases) {
    it(`${label}: no NaN, Infinity or undefined in the SVG`, () => {
      const svg = renderChartFromData(d);
      expect(svg).not.toMatch(/NaN|Infinity|undefined|null/);
      expect(svg.startsWith('<svg ')).toBe(true);
      expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
      // The saturation curve is visible when saturated air at the cold edge is below the top of the window.
      const { range } = chartLayout(d);
      let hasSaturation = false;
      try {
        hasSaturation = satHumRatio(range.dbMin, d.pressurePa) < range.wMax;
      } catch {
        hasSaturation = false; // above the boiling point: no saturated air at all
      }
      expect(elements(svg, 'path').filter((a) => a['data-family'] === 'saturation')).toHaveLength(
        hasSaturation ? 1 : 0,
      );
    });
  }
});

describe('infeasible states', () => {
  const fogW = satHumRatio(20, P0) * 1.25;
  const d = data([state('RA', 24, 0.0093), state('X1', 20, fogW, { fog: true, line: 9 })], {
    infeasible: [
      { name: 'X1', plotted: true, reason: 'the humidity ratio is above saturation (fog region).', line: 9 },
      { name: 'BAD', plotted: false, reason: 'Wet-bulb 30 °C is above the dry-bulb 25 °C.', line: 11 },
    ],
    processes: [{ name: 'P1', from: 'RA', to: 'BAD' }],
  });
  const svg = renderChartFromData(d);

  it('marks a fog state on the chart with its own marker and tag', () => {
    const m = elements(svg, 'circle', 'dmc-marker').find((a) => a['data-name'] === 'X1')!;
    expect(m['data-infeasible']).toBe('fog');
    expect(m.class).toContain('dmc-marker-fog');
    expect(svg).toContain('>X1 · fog</text>');
    expect(elements(svg, 'path', 'dmc-fogcross')).toHaveLength(1);
    // A feasible state has no such mark.
    const ra = elements(svg, 'circle', 'dmc-marker').find((a) => a['data-name'] === 'RA')!;
    expect(ra['data-infeasible']).toBeUndefined();
  });

  it('lists every flagged state under the chart, with its line and reason, and the process it breaks', () => {
    expect(svg).toContain('>Flagged</text>');
    expect(svg).toContain('X1 (line 9) — marked on the chart: the humidity ratio is above saturation (fog region).');
    expect(svg).toContain('BAD (line 11) — not plotted: Wet-bulb 30 °C is above the dry-bulb 25 °C.');
    expect(svg).toContain('process P1 — not drawn: BAD not plotted.');
    expect(elements(svg, 'circle', 'dmc-marker').some((a) => a['data-name'] === 'BAD')).toBe(false);
  });

  it('draws a flagged process dashed in the warning style', () => {
    const s2 = renderChartFromData(
      data([state('A', 20, 0.006), state('B', 30, 0.004)], {
        processes: [{ name: 'P', from: 'A', to: 'B', flagged: true }],
      }),
    );
    expect(elements(s2, 'path', 'dmc-process')[0]!.class).toContain('dmc-flagged');
    expect(s2).toContain('process P — drawn dashed');
  });
});

describe('caption and theming', () => {
  it('says which pressure the curves are for, and names states at another pressure', () => {
    const d = data([state('A', 20, 0.006), state('B', 22, 0.007, { pressurePa: 83_000 })], {
      pressureText: 'site line 2: elev=0m',
    });
    const svg = renderChartFromData(d);
    expect(svg).toContain('Curves drawn for 101.325 kPa — site line 2: elev=0m;');
    expect(svg).toMatch(/B is at another pressure/);
    expect(svg).toContain('ASHRAE Handbook—Fundamentals Ch. 1');
  });

  it('styles with custom properties a host can override, and has a dark variant under prefers-color-scheme', () => {
    const svg = renderChartFromData(typical);
    // Internal defaults are set on the chart; the public --dm-chart-* names are only read, so an
    // ancestor's value (a VS Code webview's theme mapping) wins.
    expect(svg).toContain('--dmc-sat:');
    expect(svg).not.toMatch(/--dm-chart-[a-z]+:/);
    expect(svg).toMatch(/@media \(prefers-color-scheme:dark\)\{\.dmc\{[^}]*--dmc-panel:/);
    expect(svg).toContain('stroke:var(--dm-chart-sat,var(--dmc-sat))');
  });

  it('maps every chart colour but the fog and the SHR line to a VS Code theme variable for webviews', () => {
    expect([...Object.keys(VSCODE_THEME_MAP), ...OWN_COLOURS].sort()).toEqual(Object.keys(LIGHT_THEME).sort());
    expect(Object.keys(DARK_THEME).sort()).toEqual(Object.keys(LIGHT_THEME).sort());
    const css = vscodeThemeCss();
    expect(css).toContain('--dm-chart-sat:var(--vscode-charts-blue);');
    expect(css).toContain('--dm-chart-ink:var(--vscode-editor-foreground);');
    for (const k of Object.keys(VSCODE_THEME_MAP)) expect(css).toContain(`${k}:var(--vscode-`);
  });

  it('gives the region above saturation one colour, in the SVG file and in the webview (light and dark)', () => {
    const svg = renderChartFromData(typical);
    const css = vscodeThemeCss();
    // The fog is filled with the chart's own colour, which the webview does not remap to a theme colour…
    expect(svg).toContain('.dmc .dmc-fog{fill:var(--dm-chart-fog,var(--dmc-fog))}');
    expect(css).not.toContain('--dm-chart-fog:');
    // …but sets from the same palette as the SVG, chosen by the editor theme's kind.
    expect(svg).toContain(`--dmc-fog:${LIGHT_THEME['--dm-chart-fog']};`);
    expect(css).toMatch(
      new RegExp(`body\\.vscode-light \\.dmc[^{]*\\{[^}]*--dmc-fog:${LIGHT_THEME['--dm-chart-fog']};`),
    );
    expect(css).toMatch(new RegExp(`body\\.vscode-dark \\.dmc[^{]*\\{[^}]*--dmc-fog:${DARK_THEME['--dm-chart-fog']};`));
  });

  it('escapes names and titles', () => {
    const svg = renderChartFromData(data([state('A<&>"', 20, 0.006)], { title: 'x < y & "z"' }));
    expect(svg).toContain('<title id="dmc-title">x &lt; y &amp; &quot;z&quot;</title>');
    expect(svg).toContain('data-name="A&lt;&amp;&gt;&quot;"');
    expect(svg).not.toContain('A<&>"');
  });

  it('keeps ids apart with idPrefix so two charts can share a page', () => {
    const a = renderChartFromData(typical, { idPrefix: 'one' });
    const b = renderChartFromData(typical, { idPrefix: 'two' });
    expect(a).toContain('id="one-clip"');
    expect(b).toContain('id="two-clip"');
    expect(b).not.toContain('one-');
  });
});
