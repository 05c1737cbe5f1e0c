/**
 * `eval --format json` keeps full precision: every figure at 12 significant digits, never a fixed
 * number of decimals (a −60 °C dew-point state's humidity ratio is about 1e-5 kg/kg, which 7
 * decimals would leave with two significant figures).
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../../shared-core/src/analyze';
import type { ProcessResult, StateResult } from '../../shared-core/src/evaluate/types';
import { evalFileJson, fileResult, JSON_SIGNIFICANT_DIGITS } from '../src/output';

interface Psy {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromTDewPoint(tdp: number, p: number): number;
}
/** PsychroLib (devDependency) as the independent oracle. */
const psy = createRequire(import.meta.url)('psychrolib') as Psy;
psy.SetUnitSystem(psy.SI);

const NOTE = [
  '```air',
  'state DRY: db=20C dp=-60C',
  'state ROOM: db=21C dp=-40C',
  'process H: DRY -> ROOM m=0.5kg/s',
  '```',
  '',
].join('\n');

function doc() {
  const analysis = analyzeNote(NOTE);
  const json = JSON.parse(JSON.stringify(evalFileJson(fileResult('dry.md', NOTE, analysis)))) as {
    states: Record<string, number | null>[];
    processes: Record<string, number | null>[];
  };
  return { analysis, json };
}

/** Significant digits of a JSON number as printed. */
function significantDigits(x: number): number {
  const m = /^-?0*\.?0*([0-9.]*?)(?:e[-+]?\d+)?$/.exec(String(Math.abs(x)));
  return (m?.[1] ?? '').replace('.', '').replace(/0+$/, '').length;
}

describe('JSON precision', () => {
  it('gives a −60 °C dew-point state its humidity ratio to at least 9 significant digits', () => {
    const { analysis, json } = doc();
    const dry = json.states.find((s) => s.name === ('DRY' as never))!;
    const w = dry.w_kgkg as number;
    // Frost point −60 °C at 101.325 kPa: PsychroLib as oracle (the same Hyland–Wexler ice equation,
    // ASHRAE HoF 2017 SI Ch.1 eq 5).
    const oracle = psy.GetHumRatioFromTDewPoint(-60, 101325);
    expect(Math.abs(w - oracle) / oracle).toBeLessThan(1e-4);
    expect(w).toBeLessThan(2e-5);
    const engine = (analysis.items.find((i) => i.name === 'DRY') as StateResult).state!.w;
    expect(Math.abs(w - engine) / engine).toBeLessThan(1e-11);
    expect(significantDigits(w)).toBeGreaterThanOrEqual(9);
  });

  it('keeps every figure of states and processes to 12 significant digits of the engine value', () => {
    const { analysis, json } = doc();
    const room = (analysis.items.find((i) => i.name === 'ROOM') as StateResult).state!;
    const h = analysis.items.find((i) => i.name === 'H') as ProcessResult;
    const pairs: [number | null | undefined, number][] = [
      [json.states[1]!.w_kgkg, room.w],
      [json.states[1]!.wb_C, room.wb],
      [json.states[1]!.h_kJkg, room.h / 1000],
      [json.states[1]!.v_m3kg, room.v],
      [json.processes[0]!.dw_kgkg, h.dw],
      [json.processes[0]!.q_total_kW, h.qTotalW! / 1000],
      [json.processes[0]!.water_kgh, h.waterKgS! * 3600],
    ];
    const rel = 10 ** -(JSON_SIGNIFICANT_DIGITS - 1);
    for (const [got, want] of pairs) {
      expect(typeof got).toBe('number');
      expect(Math.abs((got as number) - want)).toBeLessThanOrEqual(Math.abs(want) * rel);
    }
  });
});
