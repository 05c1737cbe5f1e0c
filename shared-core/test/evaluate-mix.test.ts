/**
 * Mixing: the mixed state from the dry-air mass and energy balance, checked against an independent
 * computation — stream properties from PsychroLib 1.1.1 (test oracle), the balance and the mixed
 * dry-bulb from first principles with ASHRAE HoF 2017 SI Ch.1 eq 32 (h = 1.006 t + W (2501 + 1.86 t)
 * kJ/kg, solved for t) and the adiabatic-mixing balance (Ch.1, "Adiabatic Mixing of Two Streams of
 * Moist Air": ṁ₁W₁ + ṁ₂W₂ = ṁ₃W₃, ṁ₁h₁ + ṁ₂h₂ = ṁ₃h₃). Volume flows become dry-air mass flows with
 * ṁ = V̇ / v (v from PsychroLib's GetMoistAirVolume, eq 26).
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, psy, stateOf, stateResult, withCode } from './evaluate-helpers';

/** Independent mix: streams given as (db, rh, amount), amounts as mass (kg/s) or volume (m³/s) flows. */
function independentMix(streams: { db: number; rh: number; amount: number; volume: boolean }[], p: number) {
  let m = 0;
  let mw = 0;
  let mh = 0;
  for (const s of streams) {
    const w = psy.GetHumRatioFromRelHum(s.db, s.rh, p);
    const h = psy.GetMoistAirEnthalpy(s.db, w);
    const md = s.volume ? s.amount / psy.GetMoistAirVolume(s.db, w, p) : s.amount;
    m += md;
    mw += md * w;
    mh += md * h;
  }
  const w = mw / m;
  const h = mh / m;
  // eq 32 solved for t (J/kg → kJ/kg).
  const t = (h / 1000 - 2501 * w) / (1.006 + 1.86 * w);
  return { w, h, t, m };
}

describe('mix by the mass and energy balance', () => {
  it('two streams by dry-air mass fraction at sea level', () => {
    const a = analyse(fence('state OA: db=35C rh=40%', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 70%'));
    const ref = independentMix(
      [
        { db: 35, rh: 0.4, amount: 0.3, volume: false },
        { db: 24, rh: 0.5, amount: 0.7, volume: false },
      ],
      101325,
    );
    const s = stateOf(a, 'MA');
    near(s.w, ref.w, { rel: 0.003 }, 'W (independent: PsychroLib streams + balance)');
    near(s.h, ref.h, { rel: 0.001 }, 'h');
    near(s.db, ref.t, { abs: 0.02 }, 'mixed dry-bulb from eq 32, not a temperature average');
  });

  it('by volume flow at altitude: each stream converted at its own state', () => {
    const p = psy.GetStandardAtmPressure(1600);
    const a = analyse(
      fence(
        'site: elev=1600m',
        'state OA: db=-12C rh=70%',
        'state RA: db=21C rh=30%',
        'mix MA: OA 1.2m3/s + RA 3600L/s',
      ),
    );
    const ref = independentMix(
      [
        { db: -12, rh: 0.7, amount: 1.2, volume: true },
        { db: 21, rh: 0.3, amount: 3.6, volume: true },
      ],
      p,
    );
    const r = stateResult(a, 'MA');
    near(r.massFlowKgS ?? null, ref.m, { rel: 0.001 }, 'total dry-air mass flow Σ V̇/v');
    near(r.state!.w, ref.w, { rel: 0.003 }, 'W');
    near(r.state!.h, ref.h, { rel: 0.002 }, 'h');
    near(r.state!.db, ref.t, { abs: 0.03 }, 'mixed dry-bulb');
    // The cold outdoor air is denser: its dry-air share exceeds its 25 % volume share.
    expect(r.streams![0]!.fraction).toBeGreaterThan(0.25);
    expect(r.kind).toBe('mix');
  });

  it('mass flows in kg/h and lb/h (1 lb = 0.45359237 kg, NIST SP 811)', () => {
    const a = analyse(
      fence('state OA: db=35C rh=40%', 'state RA: db=24C rh=50%', 'mix MA: OA 3600kg/h + RA 7936.641lb/h'),
    );
    const r = stateResult(a, 'MA');
    near(r.massFlowKgS ?? null, 1 + (7936.641 * 0.45359237) / 3600, { rel: 1e-9 }, 'total');
  });

  it('three streams', () => {
    const a = analyse(
      fence(
        'state A: db=10C rh=80%',
        'state B: db=20C rh=50%',
        'state C: db=30C rh=30%',
        'mix M: A 20% + B 30% + C 50%',
      ),
    );
    const ref = independentMix(
      [
        { db: 10, rh: 0.8, amount: 0.2, volume: false },
        { db: 20, rh: 0.5, amount: 0.3, volume: false },
        { db: 30, rh: 0.3, amount: 0.5, volume: false },
      ],
      101325,
    );
    near(stateOf(a, 'M').db, ref.t, { abs: 0.02 }, 'db');
  });

  it('a mixed state in the fog region is a supersaturated warning and still computed', () => {
    // Very cold saturated air with hot humid air: the straight mixing line crosses the saturation
    // curve (ASHRAE HoF 2017 SI Ch.1, mixing: the mixed state can lie in the fog region).
    const a = analyse(fence('state C: db=-10C rh=100%', 'state H: db=40C rh=95%', 'mix M: C 50% + H 50%'));
    const d = withCode(a, 'supersaturated');
    expect(d).toHaveLength(1);
    expect(d[0]!.severity).toBe('warning');
    expect(stateOf(a, 'M').fog).toBe(true);
  });

  it('claims about the mixed state are compared', () => {
    const a = analyse(fence('state OA: db=35C rh=40%', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 70% db=40C'));
    expect(withCode(a, 'claim-mismatch')).toHaveLength(1);
  });
});

describe('mix problems', () => {
  it('fractions that do not add to 100 % say the sum', () => {
    const a = analyse(fence('state OA: db=35C rh=40%', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 60%'));
    const d = withCode(a, 'mix-fractions');
    expect(d).toHaveLength(1);
    expect(d[0]!.message).toContain('90 %');
    expect(stateResult(a, 'MA').state).toBeNull();
  });
  it('a wrong sum is reported even when a stream could not be computed', () => {
    const a = analyse(fence('state OA: db=35C wb=40C', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 60%'));
    expect(withCode(a, 'wb-above-db')).toHaveLength(1);
    const d = withCode(a, 'mix-fractions');
    expect(d).toHaveLength(1);
    expect(d[0]!.message).toContain('90 %');
  });
  it('rounded thirds add up within half a unit of each last digit', () => {
    const a = analyse(
      fence(
        'state A: db=10C rh=80%',
        'state B: db=20C rh=50%',
        'state C: db=30C rh=30%',
        'mix M: A 33.3% + B 33.3% + C 33.3%',
      ),
    );
    expect(withCode(a, 'mix-fractions')).toEqual([]);
    expect(stateResult(a, 'M').state).not.toBeNull();
  });
  it('fractions with flows are refused', () => {
    const a = analyse(fence('state OA: db=35C rh=40%', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 1.2kg/s'));
    expect(withCode(a, 'mix-amounts')).toHaveLength(1);
  });
  it('streams at different pressures: a warning and the mean', () => {
    const a = analyse(
      fence('state OA: db=35C rh=40% p=100kPa', 'state RA: db=24C rh=50% p=90kPa', 'mix MA: OA 50% + RA 50%'),
    );
    expect(withCode(a, 'pressure-mismatch')).toHaveLength(1);
    near(stateResult(a, 'MA').pressure.pa, 95_000, { abs: 1e-6 }, 'mean pressure');
  });
  it('a stream that failed gives an info, not a second error', () => {
    const a = analyse(fence('state OA: db=20C wb=25C', 'state RA: db=24C rh=50%', 'mix MA: OA 30% + RA 70%'));
    expect(a.diagnostics.filter((d) => d.severity === 'error').map((d) => d.code)).toEqual(['wb-above-db']);
    expect(withCode(a, 'unresolved-dependency')).toHaveLength(1);
    expect(withCode(a, 'unresolved-dependency')[0]!.severity).toBe('info');
  });
});
