/**
 * Fixture notes: one per feature (`test/fixtures/features/`) and one per diagnostic code
 * (`test/fixtures/diagnostics/<code>.md`). Each note's evaluation, in the `dewmark eval --format
 * json` shape, is kept beside it as `<name>.expected.json` (a vitest file snapshot: refresh with
 * `npx vitest run test/fixtures.test.ts -u` and review the diff). The snapshots pin the SHAPE; the
 * numbers that matter are ALSO checked below against named sources.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { basename, join } from 'node:path';
import { analyzeNote } from '../shared-core/src/analyze';
import type { Analysis, ProcessResult, StateResult } from '../shared-core/src/evaluate/types';
import { evalFileJson, fileResult } from '../cli/src/output';
import {
  DEFAULT_SERVICE_SETTINGS,
  analyzeText,
  noteDiagnostics,
  type ServiceSettings,
} from '../shared-core/src/service';
import { codeSpec, isDiagnosticCode } from '../shared-core/src/vocabulary/codes';

const here = join(__dirname, 'fixtures');

interface Psy {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
  GetMoistAirEnthalpy(t: number, w: number): number;
  GetMoistAirVolume(t: number, w: number, p: number): number;
  GetStandardAtmPressure(z: number): number;
}
/** PsychroLib 1.1.1 (devDependency): the independent oracle for stream properties. */
const psy = createRequire(import.meta.url)('psychrolib') as Psy;
psy.SetUnitSystem(psy.SI);

function notes(dir: string): string[] {
  return readdirSync(join(here, dir))
    .filter((f) => f.endsWith('.md'))
    .sort();
}

function load(dir: string, file: string): { text: string; analysis: Analysis; json: string } {
  const text = readFileSync(join(here, dir, file), 'utf8');
  const analysis = analyzeNote(text);
  const doc = evalFileJson(fileResult(`test/fixtures/${dir}/${file}`, text, analysis));
  return { text, analysis, json: `${JSON.stringify(doc, null, 2)}\n` };
}

function near(
  actual: number | null | undefined,
  expected: number,
  tol: { abs?: number; rel?: number },
  what: string,
): void {
  expect(actual, what).toBeTypeOf('number');
  const band = Math.max(tol.abs ?? 0, (tol.rel ?? 0) * Math.abs(expected));
  expect(Math.abs((actual as number) - expected), `${what}: ${actual} vs ${expected} ±${band}`).toBeLessThanOrEqual(
    band,
  );
}

const state = (a: Analysis, name: string) =>
  (a.items.find((i) => i.name === name && i.kind !== 'process') as StateResult).state!;
const proc = (a: Analysis, name: string) =>
  a.items.find((i) => i.name === name && i.kind === 'process') as ProcessResult;

/** Sourced numeric checks per feature fixture. */
const sourced: Record<string, (a: Analysis) => void> = {
  'state-ashrae-example.md': (a) => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1 (as cited in the PsychroLib test suite; check-values PL-SI-EX1).
    const s = state(a, 'S');
    near(s.w, 0.0065, { abs: 0.0001 }, 'W');
    near(s.dp, 7, { abs: 0.5 }, 'dew point');
    near(s.rh, 0.14, { abs: 0.01 }, 'rh');
    near(s.h, 56700, { abs: 100 }, 'h');
    near(s.v, 0.896, { rel: 0.01 }, 'v');
    expect(a.diagnostics.filter((d) => d.code === 'claim-mismatch')).toEqual([]);
  },
  'state-units-ip.md': (a) => {
    // ASHRAE HoF 2017 I-P Ch.1 Example 1 (as cited in the PsychroLib test suite; check-values PL-IP-EX1).
    const s = state(a, 'S');
    near(s.w, 0.00523, { abs: 0.0001 }, 'W');
    near(s.dp, (40 - 32) / 1.8, { abs: 1 / 1.8 }, 'dew point 40 °F ±1 °F');
    near(s.rh, 0.13, { abs: 0.01 }, 'rh');
    // h 29.8 Btu/lb ±0.1 on the I-P datum (dry air 0 at 0 °F): Btu/lb = (J/kg + 1006·160/9) / 2326
    // (exact unit definitions, NIST SP 811); v 14.22 ft³/lb ±0.01 (1 ft³/lb = 0.3048³/0.45359237 m³/kg).
    near((s.h + (1006 * 160) / 9) / 2326, 29.8, { abs: 0.1 }, 'h, Btu/lb');
    near(s.v / (0.3048 ** 3 / 0.45359237), 14.22, { abs: 0.01 }, 'v, ft³/lb');
    expect(a.units).toBe('IP');
  },
  'ip-cafe-wing.md': (a) => {
    // An IP note of the invented building: no tool-made diagnostics at all (every claim is the
    // engineer's figure in IP, with thousands separators and MBH).
    expect(a.units).toBe('IP');
    expect(a.diagnostics).toEqual([]);
    // ASHRAE HoF 2017 IP Ch.1 eq 3 / Table 1: 5000 ft → 12.228 psia (from memory; 1 psia = 6894.757 Pa, NIST SP 811).
    near(state(a, 'RA').p / 6894.757293168, 12.228, { abs: 0.001 }, 'p at 5000 ft, psia');
    // PsychroLib 1.1.1 as oracle (SI): W of the café at 75 °F / 50 % at that pressure, in gr/lb.
    const p = psy.GetStandardAtmPressure(5000 * 0.3048);
    near(state(a, 'RA').w * 7000, psy.GetHumRatioFromRelHum((75 - 32) / 1.8, 0.5, p) * 7000, { abs: 0.05 }, 'W, gr/lb');
  },
  'site-elevation.md': (a) => {
    // ASHRAE HoF 2017 SI Ch.1 Table 1 (check-values PL-SI-ATM-0, -1000, -4000; ±1 Pa).
    near(state(a, 'SEA').p, 101325, { abs: 1 }, 'sea level');
    near(state(a, 'HILL').p, 89875, { abs: 1 }, '1000 m');
    near(state(a, 'PEAK').p, 61640, { abs: 1 }, '4000 m');
    near(state(a, 'GAUGE').p, 89900, { abs: 1e-6 }, 'override');
  },
  'mix-fractions.md': (a) => {
    // Independent computation: PsychroLib stream properties, ASHRAE HoF 2017 SI Ch.1 adiabatic-mixing
    // balance and eq 32 solved for t.
    const w1 = psy.GetHumRatioFromRelHum(35, 0.4, 101325);
    const w2 = psy.GetHumRatioFromRelHum(24, 0.5, 101325);
    const w = 0.3 * w1 + 0.7 * w2;
    const h = 0.3 * psy.GetMoistAirEnthalpy(35, w1) + 0.7 * psy.GetMoistAirEnthalpy(24, w2);
    const s = state(a, 'MA');
    near(s.w, w, { rel: 0.003 }, 'W');
    near(s.h, h, { rel: 0.001 }, 'h');
    near(s.db, (h / 1000 - 2501 * w) / (1.006 + 1.86 * w), { abs: 0.02 }, 'db');
  },
  'mix-volume-altitude.md': (a) => {
    // Independent computation: PsychroLib (standard atmosphere, W, h, v at each stream), ṁ = V̇ / v,
    // ASHRAE HoF 2017 SI Ch.1 adiabatic-mixing balance.
    const p = psy.GetStandardAtmPressure(1600);
    const wO = psy.GetHumRatioFromRelHum(-12, 0.7, p);
    const wR = psy.GetHumRatioFromRelHum(21, 0.3, p);
    const mO = 1.2 / psy.GetMoistAirVolume(-12, wO, p);
    const mR = 3.6 / psy.GetMoistAirVolume(21, wR, p);
    const w = (mO * wO + mR * wR) / (mO + mR);
    const h = (mO * psy.GetMoistAirEnthalpy(-12, wO) + mR * psy.GetMoistAirEnthalpy(21, wR)) / (mO + mR);
    const r = a.items.find((i) => i.name === 'MA') as StateResult;
    near(r.massFlowKgS ?? null, mO + mR, { rel: 0.001 }, 'dry-air flow');
    near(r.state!.w, w, { rel: 0.003 }, 'W');
    near(r.state!.h, h, { rel: 0.002 }, 'h');
  },
  'process-cooling-coil.md': (a) => {
    // Independent computation: PsychroLib states; ASHRAE HoF 2017 SI Ch.1 cooling-coil energy balance
    // q = ṁ[(h₂ − h₁) − (W₂ − W₁) h_w2], h_w = 4.186 t kJ/kg; sensible (1.006 + 1.86 W₁) Δt (docs/notation.md).
    const p = 101325;
    const w1 = psy.GetHumRatioFromRelHum(27, 0.5, p);
    const w2 = psy.GetHumRatioFromRelHum(13, 0.9, p);
    const h1 = psy.GetMoistAirEnthalpy(27, w1);
    const h2 = psy.GetMoistAirEnthalpy(13, w2);
    const m = 4.8 / psy.GetMoistAirVolume(27, w1, p);
    const r = proc(a, 'CC');
    near(r.massFlowKgS, m, { rel: 0.001 }, 'ṁ');
    near(r.qTotalW, m * (h2 - h1), { rel: 0.003 }, 'q_total');
    near(r.qSensibleW, m * (1006 + 1860 * w1) * (13 - 27), { rel: 0.002 }, 'q_sensible');
    near(r.waterKgS, m * (w2 - w1), { rel: 0.005 }, 'condensate');
    near(r.qCoilW, m * (h2 - h1 - (w2 - w1) * 4186 * 13), { rel: 0.003 }, 'coil duty');
  },
  'process-humidifier.md': (a) => {
    // Independent: eq 32 with the written W (4 and 7 g/kg) — sensible heating 2 kg/s × (1.006 + 1.86 × 0.004) × 12 K,
    // steam humidification water 2 kg/s × 0.003 kg/kg.
    near(proc(a, 'HC').qTotalW, 2 * (1006 + 1860 * 0.004) * 12, { rel: 1e-9 }, 'heating');
    near(proc(a, 'HUM').waterKgS, 2 * 0.003, { rel: 1e-9 }, 'water added');
    expect(proc(a, 'HUM').processKind).toBe('humidifying');
  },
  'process-derived-chain.md': (a) => {
    // Coil by ADP and bypass factor: adiabatic mixing of 10 % bypassed air with 90 % saturated at
    // 11 °C (ASHRAE HoF 2017 SI Ch.1 mixing; saturated W from PsychroLib as oracle).
    const ma = state(a, 'MA');
    const ws = psy.GetHumRatioFromRelHum(11, 1, 101325);
    const w2 = 0.1 * ma.w + 0.9 * ws;
    const h2 = 0.1 * ma.h + 0.9 * psy.GetMoistAirEnthalpy(11, ws);
    near(state(a, 'OFF').w, w2, { abs: 1e-8 }, 'OFF w');
    near(state(a, 'OFF').db, (h2 - 2501000 * w2) / (1006 + 1860 * w2), { abs: 1e-4 }, 'OFF db (eq 32 inverted)');
    // Fan: Δt = Δp v / (η (1.006 + 1.86 W)) with v from PsychroLib.
    const off = state(a, 'OFF');
    near(
      state(a, 'SA').db - off.db,
      (750 * psy.GetMoistAirVolume(off.db, off.w, 101325)) / (0.62 * (1006 + 1860 * off.w)),
      { abs: 1e-5 },
      'fan rise',
    );
    // Reheat by duty into the mix's 4 kg/s: Δh = 8 kW / 4 kg/s.
    near(state(a, 'SA2').h - state(a, 'SA').h, 2000, { abs: 1e-6 }, 'reheat Δh');
    // Recovery at equal flows: t₂ = −5 + 0.65 × 26 × C_exhaust/C_min… (C_min is the drier outdoor stream).
    const c1 = 1006 + 1860 * state(a, 'WOA').w;
    const c2 = 1006 + 1860 * state(a, 'WRA').w;
    near(state(a, 'WOA2').db, -5 + (0.65 * Math.min(c1, c2) * 26) / c1, { abs: 1e-9 }, 'WOA2');
    // Steam: h₂ = h₁ + ΔW (2501 + 1.86 t_sat) kJ/kg at 101.325 kPa.
    const ph = state(a, 'PHOFF');
    near(state(a, 'HUOFF').h, ph.h + (0.00565 - ph.w) * (2501000 + 1860 * 99.974), { abs: 1 }, 'steam balance');
    expect(a.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
  },
  'results-table.md': (a) => {
    // Current results tables add no diagnostic; the pressure they state is the standard atmosphere
    // at 250 m (ASHRAE HoF 2017 SI Ch.1 eq 3: p = 101.325 (1 − 2.25577e−5 Z)^5.2559 kPa).
    expect(a.diagnostics).toEqual([]);
    near(state(a, 'OA').p, 101325 * (1 - 2.25577e-5 * 250) ** 5.2559, { abs: 1 }, 'p at 250 m');
  },
};

describe('feature fixtures', () => {
  for (const file of notes('features')) {
    it(file, async () => {
      const { analysis, json } = load('features', file);
      await expect(json).toMatchFileSnapshot(join(here, 'features', file.replace(/\.md$/, '.expected.json')));
      sourced[file]?.(analysis);
    });
  }
  it('every numeric feature fixture has sourced checks', () => {
    const numeric = notes('features').filter((f) => /^(state|site|mix|process)-/.test(f));
    expect(numeric.filter((f) => !sourced[f])).toEqual([]);
  });
});

describe('diagnostic fixtures', () => {
  for (const file of notes('diagnostics')) {
    const code = basename(file, '.md');
    it(code, async () => {
      if (isDiagnosticCode(code) && codeSpec(code).fixture === 'editor') {
        // An editor-only code: the note through the editor service, with the settings of its first line.
        const text = readFileSync(join(here, 'diagnostics', file), 'utf8');
        const settings = JSON.parse(
          /^<!-- fixture settings: (\{.*\}) -->/.exec(text)?.[1] ?? '{}',
        ) as Partial<ServiceSettings>;
        const diagnostics = noteDiagnostics(analyzeText(text, { ...DEFAULT_SERVICE_SETTINGS, ...settings }));
        expect(diagnostics.filter((d) => d.code === code).length, `${code} reported`).toBeGreaterThanOrEqual(1);
        const shown = diagnostics.map((d) => ({ code: d.code, severity: d.severity, message: d.message }));
        await expect(`${JSON.stringify(shown, null, 2)}\n`).toMatchFileSnapshot(
          join(here, 'diagnostics', file.replace(/\.md$/, '.expected.json')),
        );
        return;
      }
      const { analysis, json, text } = load('diagnostics', file);
      const hits = analysis.diagnostics.filter((d) => d.code === code);
      expect(hits.length, `${code} reported`).toBeGreaterThanOrEqual(1);
      for (const d of hits) {
        expect(d.span.end).toBeGreaterThanOrEqual(d.span.start); // a missing token may be a point span
        expect(d.span.end).toBeLessThanOrEqual(text.length);
        expect(d.message.length).toBeGreaterThan(20);
      }
      await expect(json).toMatchFileSnapshot(join(here, 'diagnostics', file.replace(/\.md$/, '.expected.json')));
    });
  }
});
