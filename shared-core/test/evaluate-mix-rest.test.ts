/**
 * Mixes by total and remainder (`mix MA: OA 0.78kg/s + RA rest total=3.9kg/s`): the rest stream
 * takes what the others leave of total= (or of 100 % with fractions), then the usual adiabatic
 * mixing balance (ASHRAE HoF 2017 SI Ch.1, adiabatic mixing of two moist-air streams:
 * ṁ₁W₁ + ṁ₂W₂ = ṁ₃W₃, ṁ₁h₁ + ṁ₂h₂ = ṁ₃h₃) applies. Stream properties and specific volumes from
 * PsychroLib 1.1.1 (test oracle); ṁ = V̇ / v at each stream's own state. Invented building.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, processOf, psy, spanText, stateOf, stateResult, withCode } from './evaluate-helpers';

const P0 = 101325;
const OA = 'state OA: db=32C rh=40%';
const RA = 'state RA: db=24C rh=50%';
const wO = psy.GetHumRatioFromRelHum(32, 0.4, P0);
const wR = psy.GetHumRatioFromRelHum(24, 0.5, P0);

describe('a mix by total and remainder', () => {
  it('mass flows: RA takes 3.9 − 0.78 = 3.12 kg/s, the outdoor-air fraction is 20 %', () => {
    const a = analyse(fence(OA, RA, 'mix MA: OA 0.78kg/s + RA rest total=3.9kg/s'));
    const r = stateResult(a, 'MA');
    expect(a.diagnostics).toEqual([]);
    expect(r.streams!.map((s) => [s.name, s.massFlowKgS])).toEqual([
      ['OA', 0.78],
      ['RA', 3.9 - 0.78],
    ]);
    near(r.streams![0]!.fraction, 0.2, { abs: 1e-12 }, 'outdoor-air fraction 0.78 / 3.9');
    near(r.massFlowKgS!, 3.9, { abs: 1e-12 }, 'total');
    near(stateOf(a, 'MA').w, 0.2 * wO + 0.8 * wR, { rel: 3e-4 }, 'W by the mass balance (PsychroLib streams)');
  });

  it('volume flows: each at its own state, the rest by volume', () => {
    const a = analyse(fence(OA, RA, 'mix MV: OA 0.6m3/s + RA rest total=3.4m3/s'));
    const r = stateResult(a, 'MV');
    const mO = 0.6 / psy.GetMoistAirVolume(32, wO, P0);
    const mR = 2.8 / psy.GetMoistAirVolume(24, wR, P0);
    near(r.streams![0]!.massFlowKgS, mO, { rel: 2e-4 }, 'OA: V̇ / v (PsychroLib eq 26)');
    near(r.streams![1]!.massFlowKgS, mR, { rel: 2e-4 }, 'RA: (3.4 − 0.6) m³/s / v');
    near(r.streams![0]!.fraction, mO / (mO + mR), { rel: 3e-4 }, 'outdoor-air fraction of dry-air mass');
  });

  it('fractions: RA rest is 100 % less the others; with total= the fractions become flows a process takes', () => {
    const a = analyse(
      fence(
        OA,
        RA,
        'mix MF: OA 20% + RA rest',
        'mix MT: OA 20% + RA rest total=3.9kg/s',
        'state OFF: db=13C rh=90%',
        'process CC: MT -> OFF',
      ),
    );
    expect(stateResult(a, 'MF').streams!.map((s) => s.fraction)).toEqual([0.2, 0.8]);
    expect(stateResult(a, 'MF').massFlowKgS).toBeNull();
    expect(stateResult(a, 'MT').streams!.map((s) => s.massFlowKgS)).toEqual([0.2 * 3.9, 0.8 * 3.9]);
    near(processOf(a, 'CC').massFlowKgS, 3.9, { abs: 1e-12 }, 'the process takes the mix total');
    expect(stateOf(a, 'MT').w).toBe(stateOf(a, 'MF').w);
  });

  it('total= beside streams that are all given is a claim on their sum', () => {
    const text = fence(
      OA,
      RA,
      'mix M1: OA 0.78kg/s + RA 3.12kg/s total=3.9kg/s',
      'mix M2: OA 0.78kg/s + RA 3.12kg/s total=4.0kg/s',
    );
    const a = analyse(text);
    expect(stateResult(a, 'M1').claims.map((c) => [c.key, c.pass])).toEqual([['total', true]]);
    expect(stateResult(a, 'M2').claims.map((c) => [c.key, c.pass])).toEqual([['total', false]]);
    const stale = withCode(a, 'claim-mismatch');
    expect(stale.map((d) => spanText(text, d))).toEqual(['4.0']);
    expect(stale[0]!.message).toContain('computed total=3.90kg/s');
  });
});

describe('mixes by remainder that do not add up', () => {
  const cases: [string, string, string, RegExp][] = [
    ['two rest streams', 'mix M: OA rest + RA rest total=3kg/s', 'rest', /only one stream can be the rest/],
    ['rest of flows without a total', 'mix M: OA 1kg/s + RA rest', 'rest', /add total= after the streams/],
    [
      'mass streams against a volume total',
      'mix M: OA 1kg/s + RA rest total=3m3/s',
      '1kg/s + RA rest total=3m3/s',
      /given as mass flows but total= is a volume flow/,
    ],
    [
      'streams that exceed the total',
      'mix M: OA 4kg/s + RA rest total=3.9kg/s',
      'rest total=3.9kg/s',
      /add to 4.00 kg\/s, which leaves (less than )?nothing of total=3.9kg\/s for RA/,
    ],
    ['fractions over 100 %', 'mix M: OA 120% + RA rest', '120%', /add to 120 %, which leaves nothing for RA rest/],
    [
      'fractions with a volume total',
      'mix M: OA 20% + RA rest total=3m3/s',
      '3m3/s',
      /with fractions, give total= as a dry-air mass flow/,
    ],
  ];
  for (const [what, line, underlined, message] of cases) {
    it(what, () => {
      const text = fence(OA, RA, line);
      const a = analyse(text);
      const hits = withCode(a, 'mix-rest');
      expect(
        hits.map((d) => d.message),
        JSON.stringify(a.diagnostics.map((d) => d.message)),
      ).toHaveLength(1);
      expect(spanText(text, hits[0]!)).toBe(underlined);
      expect(hits[0]!.message).toMatch(message);
      expect(stateResult(a, 'M').state).toBeNull();
    });
  }

  it('total= with a unit of another kind, or without one', () => {
    const msgs = (line: string) => analyse(fence(OA, RA, line)).diagnostics.map((d) => `${d.code}: ${d.message}`);
    expect(msgs('mix M: OA 1kg/s + RA rest total=3kW')).toEqual([
      expect.stringMatching(/^unknown-unit: mix M: 'kW' in total= is not a flow unit/),
    ]);
    expect(msgs('mix M: OA 1kg/s + RA rest total=3')).toEqual([
      expect.stringMatching(/^missing-unit: mix M: total=3 has no unit/),
    ]);
  });
});
