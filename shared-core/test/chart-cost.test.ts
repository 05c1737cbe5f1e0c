/**
 * The chart's cost grows with the number of states, not its square (label placement, process
 * names, line numbers): work is counted — calls of the arithmetic the placement does for every
 * pair it compares, and characters scanned for line numbers — never timed. Doubling the states
 * must about double the work; comparing every label with every other one quadruples it.
 */
import { describe, expect, it } from 'vitest';
import { chartDataFromAnalysis, renderChartFromData, type ChartData, type ChartPoint } from '../src/chart';
import { analyzeNote } from '../src/analyze';
import { MAX_TAG_CANDIDATES } from '../src/chart/labels';
import { P0, elements, spread } from './chart-helpers';

/** Counts calls of `obj[key]` while `run` runs. */
function counting<T extends object>(obj: T, keys: (keyof T)[], run: () => void): number {
  const saved = keys.map((k) => obj[k]);
  let calls = 0;
  keys.forEach((k, i) => {
    const f = saved[i] as unknown as (...a: unknown[]) => unknown;
    (obj as Record<keyof T, unknown>)[k] = function (this: unknown, ...a: unknown[]) {
      calls++;
      return f.apply(this, a);
    };
  });
  try {
    run();
  } finally {
    keys.forEach((k, i) => {
      (obj as Record<keyof T, unknown>)[k] = saved[i];
    });
  }
  return calls;
}

/** `n` states on one spot (a pasted line repeated), each pair joined by a process to one other spot. */
function pile(n: number): ChartData {
  const points: ChartPoint[] = [];
  for (let i = 0; i < n; i++) points.push({ name: `S${i}`, kind: 'state', db: 24, w: 0.0093 });
  points.push({ name: 'OUT', kind: 'state', db: 32, w: 0.014 });
  const processes = [];
  for (let i = 0; i < n; i += 2) processes.push({ name: `P${i}`, from: `S${i}`, to: 'OUT' });
  return { pressurePa: P0, units: 'SI', points, mixes: [], processes, infeasible: [] };
}

describe('chart label placement is near-linear', () => {
  it('states spread over the chart (as densely at both sizes): twice the states, at most ~twice the work', () => {
    // The plot grows with the states (√2 each way), so each tag has as many neighbours at both sizes.
    const work = (n: number) =>
      counting(
        Math,
        ['min', 'max', 'hypot'],
        () =>
          void renderChartFromData(spread(n), {
            width: Math.round(40 * Math.sqrt(n)),
            plotHeight: Math.round(22 * Math.sqrt(n)),
          }),
      );
    const small = work(400);
    const large = work(800);
    expect(large / small).toBeLessThan(2.6);
  });

  it('states piled on one spot: doubling them at most about doubles the comparisons', () => {
    const work = (n: number) => counting(Math, ['min', 'max', 'hypot'], () => void renderChartFromData(pile(n)));
    const small = work(300);
    const large = work(600);
    expect(large / small).toBeLessThan(2.6);
  });

  it('the placement counts its work, and each label tries a bounded number of spots', () => {
    const stats = { visited: 0, candidates: 0 };
    const svg = renderChartFromData(pile(400), {}, stats);
    // 400 states on one spot share one tag (and OUT has its own): at most MAX_TAG_CANDIDATES spots
    // each; each of the 200 process names tries at most 20 spots; each family line's value at most 6.
    const familyLines = elements(svg, 'path').filter((p) => p['data-family']).length;
    expect(stats.candidates).toBeGreaterThanOrEqual(200);
    expect(stats.candidates).toBeLessThanOrEqual(2 * MAX_TAG_CANDIDATES + 200 * 20 + familyLines * 6);
    // Each look-up visits a bounded number of filed entries (a few cells, however many are piled there).
    expect(stats.visited / stats.candidates).toBeLessThan(20 * 48);
  });
});

describe('line numbers and diagnostics of many states', () => {
  it('doubling the statements at most about doubles the characters looked at', () => {
    const note = (n: number) => {
      const lines = ['# Zones (invented)', '', '```air'];
      for (let i = 0; i < n; i++) lines.push(`state Z${i}: db=${20 + (i % 9)}C rh=${30 + (i % 40)}%`);
      lines.push('```', '');
      return lines.join('\n');
    };
    const work = (n: number) => {
      const text = note(n);
      const analysis = analyzeNote(text);
      let data: ChartData | undefined;
      const calls = counting(String.prototype, ['charCodeAt', 'indexOf'], () => {
        data = chartDataFromAnalysis(analysis, { source: text });
      });
      expect(data!.points).toHaveLength(n);
      expect(data!.points[n - 1]!.line).toBe(n + 3);
      return calls;
    };
    const small = work(2000);
    const large = work(4000);
    expect(large / small).toBeLessThan(2.6);
  });
});
