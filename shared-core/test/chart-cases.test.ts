/**
 * Charts per case (a heading section, a block, a named chart, the whole note), the room SHR line
 * of a supply, a coil's apparatus dew point, and IP charts without SI units. The notes are set in
 * an invented building; positions are compared with the evaluator's own states and the engine's
 * saturation curve (consistency, no tabulated figure).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import {
  caseAt,
  chartCases,
  chartDataFromAnalysis,
  chartLayout,
  renderChart,
  renderChartCases,
  toPixel,
} from '../src/chart';
import type { ProcessResult, StateResult } from '../src/evaluate/types';
import { satHumRatio } from '../src/physics';
import { curvePath, distanceToRuns, elements, parsePath } from './chart-helpers';

const NOTE = `# Heron Quay library — AHU-2

\`\`\`air
site: elev=0m
\`\`\`

## Summer

\`\`\`air
state OA: db=31C wb=22C
state RA: db=24C rh=50%
\`\`\`

The coil serves \`mix MA: OA 25% + RA 75%\` as mixed air.

\`\`\`air
process CC: MA -> OFF adp=11C bf=0.1
\`\`\`

## Winter

\`\`\`air
state OA_W: db=-5C rh=80%
process PH: OA_W -> PH_W db=18C
\`\`\`

## Part load

\`\`\`air chart=summer
state RA_P: db=23C rh=55%
\`\`\`

\`\`\`air chart=9lives
state X: db=20C rh=40%
\`\`\`
`;

const names = (statements: { keyword: string; name?: { text: string } | null }[]) =>
  statements.map((s) => s.name?.text ?? s.keyword);

describe('charts per case', () => {
  const analysis = analyzeNote(NOTE, {});

  it('per section by default: one chart per heading, a named chart gathers its blocks, site lines draw nothing', () => {
    const cases = chartCases(analysis, 'section', NOTE);
    expect(cases.map((c) => [c.key, c.title, names(c.statements)])).toEqual([
      ['section:2', 'Summer', ['OA', 'RA', 'MA', 'CC']],
      ['section:3', 'Winter', ['OA_W', 'PH']],
      ['chart:summer', 'chart summer', ['RA_P']],
      ['section:4', 'Part load', ['X']],
    ]);
    // A chart= value that is not a name is reported with the fix, and the block stays with its section.
    expect(cases[3]!.problems[0]).toMatch(
      /^line 33: `chart=9lives` in the fence's info string: a chart name starts with a letter/,
    );
  });

  it('per block: each fence, with a code span joining the fence above it in its section', () => {
    const cases = chartCases(analysis, 'block', NOTE);
    expect(cases.map((c) => [c.title, names(c.statements)])).toEqual([
      ['Summer — block at line 9', ['OA', 'RA', 'MA']],
      ['Summer — block at line 16', ['CC']],
      ['Winter — block at line 22', ['OA_W', 'PH']],
      ['chart summer', ['RA_P']],
      ['Part load — block at line 33', ['X']],
    ]);
  });

  it('all: one chart of every state', () => {
    const cases = chartCases(analysis, 'all', NOTE);
    expect(cases).toHaveLength(1);
    expect(names(cases[0]!.statements)).toEqual(['OA', 'RA', 'MA', 'CC', 'OA_W', 'PH', 'RA_P', 'X']);
  });

  it('the case at a cursor offset: the one whose block holds it, else the one above', () => {
    const cases = chartCases(analysis, 'section', NOTE);
    expect(caseAt(cases, NOTE.indexOf('state RA:'))!.title).toBe('Summer');
    expect(caseAt(cases, NOTE.indexOf('The coil serves'))!.title).toBe('Summer');
    expect(caseAt(cases, NOTE.indexOf('PH_W'))!.title).toBe('Winter');
    expect(caseAt(cases, 0)!.title).toBe('Summer');
    expect(caseAt([], 10)).toBeUndefined();
  });

  it("a case's chart draws its own items, and the states they use from another case muted", () => {
    const cases = chartCases(analysis, 'block', NOTE);
    const coil = chartDataFromAnalysis(analysis, { source: NOTE, statements: cases[1]!.statements });
    expect(coil.processes.map((p) => p.name)).toEqual(['CC']);
    expect(coil.points.map((p) => [p.name, p.context ?? false])).toEqual([
      ['OFF', false],
      ['MA', true],
    ]);
    const svg = renderChart(analysis, { source: NOTE, statements: cases[1]!.statements });
    expect(elements(svg, 'g', 'dmc-point').map((g) => [g['data-name'], g.class])).toEqual([
      ['OFF', 'dmc-point'],
      ['MA', 'dmc-point dmc-context'],
    ]);
  });

  it('renders each case with its own title and id prefix; a bad chart= is listed under its chart', () => {
    const charts = renderChartCases(analysis, 'section', { source: NOTE, title: 'ahu-2.md', idPrefix: 'r' });
    expect(charts.map((c) => /<title id="([^"]*)">([^<]*)</.exec(c.svg)!.slice(1))).toEqual([
      ['r-1-title', 'ahu-2.md — Summer'],
      ['r-2-title', 'ahu-2.md — Winter'],
      ['r-3-title', 'ahu-2.md — chart summer'],
      ['r-4-title', 'ahu-2.md — Part load'],
    ]);
    expect(charts[3]!.svg).toContain('grouping — line 33: `chart=9lives`');
    for (const c of charts) expect(c.svg).toMatch(new RegExp(`<svg [^>]*width="${c.width}" height="${c.height}"`));
  });
});

describe('room SHR line and apparatus dew point', () => {
  const SUPPLY = `\`\`\`air
state RA: db=24C rh=50%
supply SA: RA q_sensible=41.5kW q_latent=8kW db=13.6C
mix MA: OA 25% + RA 75%
state OA: db=31C wb=22C
process CC: RA -> OFF adp=11C bf=0.1
\`\`\`
`;
  const analysis = analyzeNote(SUPPLY, {});
  const svg = renderChart(analysis, { source: SUPPLY });
  const data = chartDataFromAnalysis(analysis, { source: SUPPLY });
  const layout = chartLayout(data);
  const px = (name: string) => {
    const s = (analysis.byName.get(name) as StateResult).state!;
    return toPixel(layout, s.db, s.w);
  };

  it('draws the room SHR line through the room and the supply state, to the saturation curve', () => {
    const line = elements(svg, 'path', 'dmc-shrline');
    expect(line.map((l) => [l['data-supply'], l['data-room']])).toEqual([['SA', 'RA']]);
    const runs = parsePath(line[0]!.d!);
    // The supply-to-room process is straight in h and W (common practice): both states lie on it.
    expect(distanceToRuns(px('RA'), runs)).toBeLessThan(0.5);
    expect(distanceToRuns(px('SA'), runs)).toBeLessThan(0.5);
    // It ends on the saturation curve drawn for the chart.
    const last = runs[runs.length - 1]!.at(-1)!;
    expect(distanceToRuns(last, curvePath(svg, 'saturation', '100'))).toBeLessThan(1.5);
    // Named by the room SHR the evaluator computed: 41.5 / (41.5 + 8) (from the loads written).
    const shr = (analysis.byName.get('SA') as StateResult).supply!.shr!;
    expect(shr).toBeCloseTo(41.5 / 49.5, 10);
    expect(svg).toContain(`>SHR ${shr.toFixed(2)}</text>`);
  });

  it('stops the SHR line where it first meets saturation, never running on through the fog (the examples)', () => {
    const text = readFileSync(join(__dirname, '..', '..', 'examples', 'kestrel-ridge-ahu1.md'), 'utf8');
    const example = analyzeNote(text, {});
    let lines = 0;
    for (const chart of renderChartCases(example, 'section', { source: text })) {
      const root = elements(chart.svg, 'svg')[0]!;
      const [left, top, right, bottom] = root['data-plot']!.split(' ').map(Number) as [number, number, number, number];
      const [dbMin, dbMax, wMin, wMax] = ['data-db-min', 'data-db-max', 'data-w-min', 'data-w-max'].map((k) =>
        Number(root[k]),
      ) as [number, number, number, number];
      const p = Number(root['data-pressure-pa']);
      for (const l of elements(chart.svg, 'path', 'dmc-shrline')) {
        lines++;
        for (const run of parsePath(l.d!))
          for (const q of run) {
            const db = dbMin + ((q.x - left) / (right - left)) * (dbMax - dbMin);
            const w = wMin + ((bottom - q.y) / (bottom - top)) * (wMax - wMin);
            // Within the 0.01 px rounding of the path (about 0.6 µg/kg at this scale).
            expect(w, `SHR line of ${l['data-supply']} at ${db.toFixed(2)} °C`).toBeLessThanOrEqual(
              satHumRatio(db, p) + 2e-6,
            );
          }
      }
    }
    expect(lines).toBe(2);
  });

  it("marks a coil's apparatus dew point on saturation, with the coil line from its leaving state", () => {
    const cc = analysis.byName.get('CC') as ProcessResult;
    // adp=11C as written (the specification), on the saturation curve at the note's pressure.
    expect(cc.apparatusDewPointC).toBe(11);
    const mark = elements(svg, 'circle', 'dmc-adp');
    expect(mark).toHaveLength(1);
    const want = toPixel(layout, 11, satHumRatio(11, 101_325));
    expect(Number(mark[0]!.cx)).toBeCloseTo(want.x, 1);
    expect(Number(mark[0]!.cy)).toBeCloseTo(want.y, 1);
    expect(svg).toContain('>ADP 11.0 °C</text>');
    const coil = parsePath(elements(svg, 'path', 'dmc-coilline')[0]!.d!);
    expect(distanceToRuns(px('OFF'), coil)).toBeLessThan(0.5);
    expect(distanceToRuns(want, coil)).toBeLessThan(0.5);
    // The entering state is on the same line (bypass factor mixing is straight in h and W).
    expect(distanceToRuns(px('RA'), coil)).toBeGreaterThan(0);
    expect(svg).toContain('coil line to its apparatus dew point (ADP)');
  });
});

describe('IP charts speak IP', () => {
  it('no SI unit in the text of an IP chart: axes, legend, captions, ADP and the caption on ice', () => {
    const note = `\`\`\`air
units: IP
state RA: db=75F rh=50%
supply SA: RA q_sensible=120000Btu/h q_latent=30000Btu/h db=55F
process CC: RA -> OFF adp=50F bf=0.1
\`\`\`
`;
    const svg = renderChart(analyzeNote(note, {}), { source: note });
    const text = [...svg.matchAll(/<(text|title|desc)\b[^>]*>([^<]*)</g)].map((m) => m[2]).join(' ');
    // The caption is wrapped into lines: its words are read across them.
    expect(text).toMatch(/\(ideal gas; over ice below\s+32\s+°F\)/);
    expect(text).toContain('ADP 50.0 °F');
    for (const si of ['°C', 'kPa', 'g/kg', 'kJ/kg', 'm³/kg', 'm3/s', ' kW']) expect(text, si).not.toContain(si);
  });
});
