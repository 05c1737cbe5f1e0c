/**
 * The chart of an analysed note: which items become points, lines, arrows and flagged entries,
 * with line numbers, and at which pressure the curves are drawn. The note is set in an invented
 * building; positions are compared with the evaluator's own states (consistency, no tabulated figure).
 */
import { describe, expect, it } from 'vitest';
import { chartDataFromAnalysis, chartLayout, renderChart, toPixel } from '../src/chart';
import { analyzeNote } from '../src/analyze';
import type { StateResult } from '../src/evaluate/types';
import { stdAtmPressure } from '../src/physics';
import { elements } from './chart-helpers';

const NOTE = `# Alder Street Depot — make-up air unit

\`\`\`air
site: elev=1600m
state OA: db=31C wb=19C
state RA: db=23C rh=45%
mix MA: OA 40% + RA 60%
state SA: db=14C rh=90%
process CC: MA -> SA q=2.1m3/s
state BAD: db=25C wb=30C
state FOG: db=20C w=25g/kg
process P2: RA -> BAD
\`\`\`
`;

describe('chart data from an analysed note', () => {
  const analysis = analyzeNote(NOTE, {});
  const data = chartDataFromAnalysis(analysis, { source: NOTE, title: 'depot.md' });

  it('plots computed states and mixes, with their source lines', () => {
    expect(data.points.map((p) => [p.name, p.kind, p.line])).toEqual([
      ['OA', 'state', 5],
      ['RA', 'state', 6],
      ['MA', 'mix', 7],
      ['SA', 'state', 8],
      ['FOG', 'state', 11],
    ]);
    // Each point is the evaluator's state, unchanged.
    for (const p of data.points) {
      const item = analysis.byName.get(p.name) as StateResult;
      expect(p.db).toBe(item.state!.db);
      expect(p.w).toBe(item.state!.w);
    }
  });

  it('draws the mix as a mixing line and the processes as arrows', () => {
    expect(data.mixes).toEqual([{ name: 'MA', streams: ['OA', 'RA'], line: 7 }]);
    // P2 has no result (BAD could not be computed) but is still listed, from its statement.
    expect(data.processes.map((p) => [p.name, p.from, p.to, p.flagged])).toEqual([
      ['CC', 'MA', 'SA', false],
      ['P2', 'RA', 'BAD', true],
    ]);
    const svg = renderChart(analysis, { source: NOTE });
    expect(elements(svg, 'path', 'dmc-mixline').length).toBeGreaterThanOrEqual(1);
    expect(elements(svg, 'g', 'dmc-process-group').map((g) => g['data-process'])).toEqual(['CC']);
  });

  it("lists the state that could not be computed with the evaluator's message, and marks the fog state", () => {
    const bad = data.infeasible.find((f) => f.name === 'BAD')!;
    expect(bad.plotted).toBe(false);
    expect(bad.line).toBe(10);
    const wbDiag = analysis.diagnostics.find((d) => d.code === 'wb-above-db')!;
    // The evaluator's message, first sentence, without the leading "state BAD:".
    expect(bad.reason).toBe('The wet-bulb 30.0 °C is above the dry-bulb 25.0 °C.');
    expect(wbDiag.message).toContain(bad.reason);
    const fog = data.infeasible.find((f) => f.name === 'FOG')!;
    expect(fog.plotted).toBe(true);
    expect(data.points.find((p) => p.name === 'FOG')!.fog).toBe(true);
    const svg = renderChart(analysis, { source: NOTE });
    expect(svg).toContain('BAD (line 10) — not plotted:');
    expect(svg).toContain('process P2 (line 12) — not drawn: BAD not plotted.');
    expect(elements(svg, 'circle', 'dmc-marker').find((m) => m['data-name'] === 'FOG')!['data-infeasible']).toBe('fog');
  });

  it('draws the curves for the site pressure and says so in the caption', () => {
    const p = stdAtmPressure(1600); // standard atmosphere, ASHRAE HoF 2017 SI Ch.1 eq 3 (the engine's own)
    expect(data.pressurePa).toBeCloseTo(p, 6);
    const svg = renderChart(analysis, { source: NOTE });
    expect(svg).toMatch(/data-pressure-pa="8\d{4}(\.\d+)?"/);
    expect(svg).toContain(`Curves drawn for ${(p / 1000).toFixed(3)} kPa`);
  });

  it("places each marker at the mapped pixel of the evaluator's state", () => {
    const svg = renderChart(analysis, { source: NOTE });
    const layout = chartLayout(data);
    for (const m of elements(svg, 'circle', 'dmc-marker')) {
      const s = (analysis.byName.get(m['data-name']!) as StateResult).state!;
      const want = toPixel(layout, s.db, s.w);
      expect(Math.abs(Number(m.cx) - want.x)).toBeLessThanOrEqual(0.01);
      expect(Math.abs(Number(m.cy) - want.y)).toBeLessThanOrEqual(0.01);
    }
  });

  it("follows the note's unit system", () => {
    const ip = analyzeNote(`\`\`\`air\nunits: IP\nstate RA: db=75F rh=50%\n\`\`\`\n`, {});
    const svg = renderChart(ip);
    expect(svg).toContain('>Dry-bulb temperature (°F)</text>');
    expect(svg).toContain('>Humidity ratio (gr/lb dry air)</text>');
  });
});
