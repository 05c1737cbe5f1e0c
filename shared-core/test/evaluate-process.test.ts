/**
 * Processes: heat rates, the sensible/latent split, water and the coil duty, checked against an
 * independent computation from first principles — state properties from PsychroLib 1.1.1 (test
 * oracle), then ASHRAE HoF 2017 SI Ch.1: Δh from eq 32, the steady-flow energy balance of a coil
 * with condensate (Ch.1, "Cooling of Moist Air": q = ṁ[(h₁ − h₂) − (W₁ − W₂) h_w2]) with the
 * liquid-water enthalpy h_w = 4.186 t kJ/kg (Ch.1 eq for saturated liquid water, common practice
 * constant), and the split documented in docs/notation.md (sensible = (1.006 + 1.86 W₁) Δt).
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, processOf, psy, spanText, withCode } from './evaluate-helpers';

function props(db: number, rh: number, p: number) {
  const w = psy.GetHumRatioFromRelHum(db, rh, p);
  return { db, w, h: psy.GetMoistAirEnthalpy(db, w), v: psy.GetMoistAirVolume(db, w, p) };
}

describe('cooling and dehumidifying coil', () => {
  // Entering 27 °C / 50 %, leaving 13 °C / 90 %, 4.8 m³/s at the entering state, sea level.
  const p = 101325;
  const a1 = props(27, 0.5, p);
  const b1 = props(13, 0.9, p);
  const m = 4.8 / a1.v;
  const dh = b1.h - a1.h;
  const sens = (1006 + 1860 * a1.w) * (b1.db - a1.db);
  const qCoil = m * (dh - (b1.w - a1.w) * 4186 * b1.db);
  const text = fence('state E: db=27C rh=50%', 'state L: db=13C rh=90%', 'process CC: E -> L q=4.8m3/s');
  const r = processOf(analyse(text), 'CC');

  it('dry-air mass flow from the volume flow at the entering state (ṁ = V̇ / v, eq 26)', () =>
    near(r.massFlowKgS, m, { rel: 0.001 }, 'ṁ'));
  it('total heat rate ṁ Δh (eq 32)', () => near(r.qTotalW, m * dh, { rel: 0.003 }, 'q_total'));
  it('sensible heat rate ṁ (1.006 + 1.86 W₁) Δt', () => near(r.qSensibleW, m * sens, { rel: 0.002 }, 'q_sensible'));
  it('latent = total − sensible', () => near(r.qLatentW, m * (dh - sens), { rel: 0.01 }, 'q_latent'));
  it('SHR = sensible / total', () => near(r.shr, sens / dh, { rel: 0.005 }, 'shr'));
  it('condensate ṁ ΔW (negative: removed)', () => near(r.waterKgS, m * (b1.w - a1.w), { rel: 0.005 }, 'water'));
  it('coil duty includes the condensate enthalpy at the leaving temperature (Ch.1 cooling-coil balance)', () => {
    near(r.qCoilW, qCoil, { rel: 0.003 }, 'q_coil');
    // The condensate carries heat away, so the coil removes slightly less than the air loses.
    expect(Math.abs(r.qCoilW!)).toBeLessThan(Math.abs(r.qTotalW!));
  });
  it('is named cooling-dehumidifying, with an apparatus dew point below the entering dew point', () => {
    expect(r.processKind).toBe('cooling-dehumidifying');
    expect(r.apparatusDewPointC).not.toBeNull();
    expect(r.apparatusDewPointC!).toBeLessThan(13);
  });
  it('m= gives the same result as the equivalent q=', () => {
    const r2 = processOf(
      analyse(fence('state E: db=27C rh=50%', 'state L: db=13C rh=90%', `process CC: E -> L m=${r.massFlowKgS}kg/s`)),
      'CC',
    );
    near(r2.qTotalW, r.qTotalW!, { rel: 1e-9 }, 'same q_total');
  });
});

describe('other process kinds', () => {
  const kindOf = (...lines: string[]) => processOf(analyse(fence(...lines)), 'P');
  it('sensible heating: latent ≈ 0, SHR ≈ 1', () => {
    const r = kindOf('state A: db=10C w=5g/kg', 'state B: db=30C w=5g/kg', 'process P: A -> B m=1kg/s');
    expect(r.processKind).toBe('sensible-heating');
    near(r.dhLatent, 0, { abs: 1e-6 }, 'latent');
    near(r.shr, 1, { abs: 1e-9 }, 'shr');
    // Independent: (1.006 + 1.86 × 0.005) kJ/(kg·K) × 20 K × 1 kg/s (eq 32).
    near(r.qTotalW, (1006 + 1860 * 0.005) * 20, { rel: 1e-9 }, 'q');
  });
  it('evaporative (adiabatic) humidifier along a wet-bulb line: duty about zero', () => {
    // B: 20 °C at the enthalpy of A (PsychroLib, independent) — an adiabatic saturation path.
    const wA = psy.GetHumRatioFromRelHum(30, 0.2, 101325);
    const wB = psy.GetHumRatioFromEnthalpyAndTDryBulb(psy.GetMoistAirEnthalpy(30, wA), 20);
    const r = kindOf(
      'state A: db=30C rh=20%',
      `state B: db=20C w=${(wB * 1000).toFixed(4)}g/kg`,
      'process P: A -> B m=1kg/s',
    );
    expect(r.processKind).toBe('evaporative-cooling');
    expect(r.waterKgS!).toBeGreaterThan(0);
  });
  it('steam humidification at constant dry-bulb', () => {
    const r = kindOf('state A: db=22C rh=20%', 'state B: db=22C rh=45%', 'process P: A -> B m=2kg/s');
    expect(r.processKind).toBe('humidifying');
    // Water added ṁ ΔW with ΔW from PsychroLib (independent).
    const dw = psy.GetHumRatioFromRelHum(22, 0.45, 101325) - psy.GetHumRatioFromRelHum(22, 0.2, 101325);
    near(r.waterKgS, 2 * dw, { rel: 0.005 }, 'water');
  });
  it('without a flow only per-kg figures are known', () => {
    const r = kindOf('state A: db=10C w=5g/kg', 'state B: db=30C w=5g/kg', 'process P: A -> B');
    expect(r.qTotalW).toBeNull();
    expect(r.dhTotal).toBeGreaterThan(0);
  });
  it('a process leaving a mix by flows takes its flow', () => {
    const a = analyse(
      fence(
        'state A: db=30C rh=40%',
        'state B: db=24C rh=50%',
        'mix M: A 1kg/s + B 3kg/s',
        'state C: db=14C rh=90%',
        'process P: M -> C',
      ),
    );
    near(processOf(a, 'P').massFlowKgS, 4, { rel: 1e-12 }, 'ṁ');
  });
});

describe('impossible processes', () => {
  it('moisture removed while heating', () => {
    const src = fence('state A: db=20C w=8g/kg', 'state B: db=30C w=6g/kg', 'process P: A -> B m=1kg/s');
    const a = analyse(src);
    const d = withCode(a, 'impossible-process');
    expect(d).toHaveLength(1);
    expect(d[0]!.severity).toBe('error');
    expect(spanText(src, d[0]!)).toBe('B');
  });
  it('too dry for its temperature: the coil line never meets saturation', () => {
    const a = analyse(fence('state A: db=24C w=9.3g/kg', 'state B: db=23C w=5g/kg', 'process P: A -> B m=1kg/s'));
    expect(withCode(a, 'impossible-process')).toHaveLength(1);
  });
  it('an ordinary coil is not flagged', () => {
    const a = analyse(fence('state A: db=27C rh=50%', 'state B: db=13C rh=90%', 'process P: A -> B m=1kg/s'));
    expect(withCode(a, 'impossible-process')).toEqual([]);
  });
});

describe('process claims', () => {
  const base = ['state E: db=27C rh=50%', 'state L: db=13C rh=90%'];
  it('positive figures compare as magnitudes; a stale one warns with the computed value', () => {
    const r = processOf(analyse(fence(...base, 'process CC: E -> L m=5kg/s')), 'CC');
    const q = Math.abs(r.qTotalW!) / 1000;
    const ok = analyse(
      fence(
        ...base,
        `process CC: E -> L m=5kg/s q_total=${q.toFixed(1)}kW shr=${r.shr!.toFixed(2)} ` +
          `water=${(Math.abs(r.waterKgS!) * 3600).toFixed(1)}kg/h`,
      ),
    );
    expect(withCode(ok, 'claim-mismatch')).toEqual([]);
    expect(processOf(ok, 'CC').claims.map((c) => c.pass)).toEqual([true, true, true]);
    const stale = analyse(fence(...base, `process CC: E -> L m=5kg/s q_total=${(q + 5).toFixed(1)}kW`));
    expect(withCode(stale, 'claim-mismatch')).toHaveLength(1);
    expect(withCode(stale, 'claim-mismatch')[0]!.message).toContain(`${q.toFixed(1)}kW`);
  });
  it('rate claims without a flow warn', () => {
    const a = analyse(fence(...base, 'process CC: E -> L q_total=98kW'));
    expect(withCode(a, 'missing-flow')).toHaveLength(1);
  });
  it('m= and q= together are an error', () => {
    const a = analyse(fence(...base, 'process CC: E -> L m=5kg/s q=4m3/s'));
    expect(withCode(a, 'flow-conflict')).toHaveLength(1);
  });
});
