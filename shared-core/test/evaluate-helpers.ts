/**
 * Helpers of the evaluator tests: analyse a note, find items and diagnostics, compare within a
 * tolerance, and an independent oracle (PsychroLib, a devDependency used by tests only).
 */
import { expect } from 'vitest';
import { createRequire } from 'node:module';
import { analyzeNote } from '../src/analyze';
import type { Analysis, EvaluateSettings, ProcessResult, StateResult } from '../src/evaluate/types';
import type { CoreDiagnostic } from '../src/notation/ast';

/** PsychroLib 1.1.1 (npm), SI units: the test oracle. */
export interface PsychroLibSI {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
  GetHumRatioFromTWetBulb(t: number, wb: number, p: number): number;
  GetMoistAirEnthalpy(t: number, w: number): number;
  GetMoistAirVolume(t: number, w: number, p: number): number;
  GetTDryBulbFromEnthalpyAndHumRatio(h: number, w: number): number;
  GetHumRatioFromEnthalpyAndTDryBulb(h: number, t: number): number;
  GetRelHumFromHumRatio(t: number, w: number, p: number): number;
  GetSatHumRatio(t: number, p: number): number;
  GetStandardAtmPressure(z: number): number;
  GetTWetBulbFromHumRatio(t: number, w: number, p: number): number;
}

const require = createRequire(import.meta.url);
/** The oracle, set to SI. */
export const psy = require('psychrolib') as PsychroLibSI;
psy.SetUnitSystem(psy.SI);

/** Parses and evaluates a note. */
export function analyse(text: string, settings?: Partial<EvaluateSettings>): Analysis {
  return analyzeNote(text, settings);
}

/** Wraps statements in an `air` fence. */
export function fence(...lines: string[]): string {
  return ['# test', '', '```air', ...lines, '```', ''].join('\n');
}

/** The state or mix named `name` (fails the test when absent or not computed). */
export function stateOf(a: Analysis, name: string): NonNullable<StateResult['state']> {
  const item = a.items.find((i) => i.name === name && i.kind !== 'process') as StateResult | undefined;
  expect(item, `state ${name} exists`).toBeDefined();
  expect(
    item!.state,
    `state ${name} is computed; diagnostics: ${JSON.stringify(a.diagnostics.map((d) => d.message))}`,
  ).not.toBeNull();
  return item!.state!;
}

/** The StateResult named `name`. */
export function stateResult(a: Analysis, name: string): StateResult {
  const item = a.items.find((i) => i.name === name && i.kind !== 'process') as StateResult | undefined;
  expect(item, `state ${name} exists`).toBeDefined();
  return item!;
}

/** The process named `name`. */
export function processOf(a: Analysis, name: string): ProcessResult {
  const item = a.items.find((i) => i.name === name && i.kind === 'process') as ProcessResult | undefined;
  expect(
    item,
    `process ${name} exists; diagnostics: ${JSON.stringify(a.diagnostics.map((d) => d.message))}`,
  ).toBeDefined();
  return item!;
}

/** The diagnostics with a code. */
export function withCode(a: Analysis, code: string): CoreDiagnostic[] {
  return a.diagnostics.filter((d) => d.code === code);
}

/** The text a diagnostic underlines. */
export function spanText(text: string, d: CoreDiagnostic): string {
  return text.slice(d.span.start, d.span.end);
}

/** Asserts |actual − expected| ≤ abs, or ≤ rel·|expected| (the check-values tolerance semantics). */
export function near(
  actual: number | null | undefined,
  expected: number,
  tol: { abs?: number; rel?: number },
  what = '',
): void {
  expect(actual, `${what} is a number`).toBeTypeOf('number');
  const a = actual as number;
  const band = Math.max(tol.abs ?? 0, (tol.rel ?? 0) * Math.abs(expected));
  expect(Math.abs(a - expected), `${what}: ${a} vs ${expected} (±${band})`).toBeLessThanOrEqual(band);
}
