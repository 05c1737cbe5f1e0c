/**
 * Processes that define their leaving state, and `recover`, through the notation: each leaving
 * state against an independent hand calculation — properties from PsychroLib 1.1.1 (test oracle),
 * balances of ASHRAE HoF 2017 SI Ch.1 written out here: eq 32 h = 1.006 t + W (2501 + 1.86 t)
 * kJ/kg and its inverse t = (h − 2501 W)/(1.006 + 1.86 W); q = ṁ Δh; adiabatic mixing of the
 * bypassed and saturated air of a coil; h₂ = h₁ + ΔW h_g for steam; the wet-bulb line (eq 33);
 * effectiveness on the smaller capacity rate for heat recovery. Every specification error is
 * checked for its code, the token it underlines and what its message tells the engineer to do.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, processOf, psy, spanText, stateOf, stateResult, withCode } from './evaluate-helpers';
import { createAnalyzer } from '../src/analyze';
import { definition, hover, references, rename } from '../src/service';
import { noteOf, marked, air } from './service-helpers';

const P = 101325;
const tFromHW = (h: number, w: number): number => (h - 2_501_000 * w) / (1006 + 1860 * w);

describe('sensible heater', () => {
  const w1 = psy.GetHumRatioFromRelHum(10, 0.6, P);
  const h1 = psy.GetMoistAirEnthalpy(10, w1);
  it('heat= with the process flow: h₂ = h₁ + q/ṁ, W unchanged (eq 32 inverted)', () => {
    const a = analyse(fence('state MA: db=10C rh=60%', 'process HC: MA -> HCOFF heat=20kW m=2kg/s'));
    const b = stateOf(a, 'HCOFF');
    near(b.db, tFromHW(h1 + 20_000 / 2, w1), { abs: 1e-4 }, 'leaving db');
    near(b.w, w1, { rel: 1e-9 }, 'W');
    near(processOf(a, 'HC').qTotalW, 20_000, { rel: 1e-9 }, 'the process gives back its duty');
    expect(a.diagnostics).toEqual([]);
  });
  it('the flow of a mix by flows carries through the chain (HCOFF gets it, the next process uses it)', () => {
    const a = analyse(
      fence(
        'state OA: db=0C rh=80%',
        'state RA: db=22C rh=40%',
        'mix MA: OA 0.5kg/s + RA 1.5kg/s',
        'process HC: MA -> HCOFF heat=20kW',
        'process RH: HCOFF -> SA dt=+2K',
      ),
    );
    near(stateResult(a, 'HCOFF').massFlowKgS!, 2, { rel: 1e-12 }, 'flow carried');
    const ma = stateOf(a, 'MA');
    near(stateOf(a, 'HCOFF').db, tFromHW(ma.h + 10_000, ma.w), { abs: 1e-4 }, 'by the mix flow');
    near(processOf(a, 'RH').massFlowKgS, 2, { rel: 1e-12 }, 'next process flow');
    near(stateOf(a, 'SA').db, stateOf(a, 'HCOFF').db + 2, { abs: 1e-9 }, 'dt=+2K');
  });
  it('dt= is a difference: dt=9F is 5 K; db= alone keeps W', () => {
    const a = analyse(fence('state MA: db=10C rh=60%', 'process P1: MA -> A1 dt=9F', 'process P2: MA -> A2 db=35C'));
    near(stateOf(a, 'A1').db, 15, { abs: 1e-9 }, 'dt=9F');
    near(stateOf(a, 'A2').db, 35, { abs: 1e-12 }, 'db=35C');
    near(stateOf(a, 'A2').w, w1, { rel: 1e-9 }, 'W unchanged');
  });
  it('heat= without a flow says how to give one', () => {
    const src = fence('state MA: db=10C rh=60%', 'process HC: MA -> HCOFF heat=20kW');
    const d = withCode(analyse(src), 'spec-missing');
    expect(d).toHaveLength(1);
    expect(spanText(src, d[0]!)).toBe('heat=20kW');
    expect(d[0]!.message).toMatch(/m= or q=/);
  });
  it('leaving-state figures on the line are claims about it', () => {
    const ok = analyse(fence('state MA: db=10C rh=60%', 'process HC: MA -> HCOFF heat=20kW m=2kg/s db=19.9C'));
    expect(withCode(ok, 'claim-mismatch')).toEqual([]);
    expect(stateResult(ok, 'HCOFF').claims.map((c) => c.pass)).toEqual([true]);
    const stale = analyse(fence('state MA: db=10C rh=60%', 'process HC: MA -> HCOFF heat=20kW m=2kg/s db=25C'));
    expect(withCode(stale, 'claim-mismatch')).toHaveLength(1);
  });
});

describe('fan', () => {
  it('dp_fan= with eff=: Δt = Δp v / (η cp), motor in the airstream', () => {
    const w = psy.GetHumRatioFromRelHum(13, 0.9, P);
    const v = psy.GetMoistAirVolume(13, w, P);
    const a = analyse(fence('state OFF: db=13C rh=90%', 'process FAN: OFF -> SA dp_fan=750Pa eff=0.62'));
    near(stateOf(a, 'SA').db - 13, (750 * v) / (0.62 * (1006 + 1860 * w)), { abs: 1e-5 }, 'fan rise');
    expect(processOf(a, 'FAN').equipment?.form).toBe('fan');
  });
  it('eff_motor= (motor outside the airstream) scales the rise by the motor efficiency', () => {
    const a = analyse(
      fence(
        'state OFF: db=13C rh=90%',
        'process F1: OFF -> S1 dp_fan=750Pa eff=62%',
        'process F2: OFF -> S2 dp_fan=750Pa eff=0.62 eff_motor=0.9',
      ),
    );
    near(stateOf(a, 'S2').db - 13, 0.9 * (stateOf(a, 'S1').db - 13), { abs: 1e-6 }, 'rise × η_motor');
  });
  it('a fan without its efficiency names the missing key', () => {
    const src = fence('state OFF: db=13C rh=90%', 'process FAN: OFF -> SA dp_fan=750Pa');
    const d = withCode(analyse(src), 'spec-missing');
    expect(d).toHaveLength(1);
    expect(d[0]!.message).toContain('eff=');
  });
});

describe('cooling coil', () => {
  const w1 = psy.GetHumRatioFromRelHum(27, 0.5, P);
  const h1 = psy.GetMoistAirEnthalpy(27, w1);
  const ws = psy.GetSatHumRatio(11, P);
  const hs = psy.GetMoistAirEnthalpy(11, ws);
  it('adp= bf=: leaving = 0.1 × entering + 0.9 × saturated at the ADP (mass and energy)', () => {
    const a = analyse(fence('state MA: db=27C rh=50%', 'process CC: MA -> OFF adp=11C bf=0.1 m=4kg/s'));
    const w2 = 0.1 * w1 + 0.9 * ws;
    const h2 = 0.1 * h1 + 0.9 * hs;
    near(stateOf(a, 'OFF').w, w2, { abs: 1e-8 }, 'W₂');
    near(stateOf(a, 'OFF').db, tFromHW(h2, w2), { abs: 1e-4 }, 'db₂');
    const cc = processOf(a, 'CC');
    near(cc.apparatusDewPointC, 11, { abs: 1e-12 }, 'ADP reported');
    near(cc.bypassFactor, 0.1, { abs: 1e-12 }, 'bf reported');
    near(cc.qTotalW, 4 * (h2 - h1), { rel: 1e-4 }, 'q_total = ṁ Δh');
    expect(cc.processKind).toBe('cooling-dehumidifying');
  });
  it('by leaving db= and rh=: the state as given, with its ADP and bypass factor found', () => {
    const a = analyse(fence('state MA: db=27C rh=50%', 'process CC: MA -> OFF db=13C rh=90% w=8.4g/kg'));
    near(stateOf(a, 'OFF').w, psy.GetHumRatioFromRelHum(13, 0.9, P), { rel: 1e-9 }, 'W from db and rh');
    const cc = processOf(a, 'CC');
    expect(cc.apparatusDewPointC!).toBeLessThan(13);
    expect(cc.bypassFactor!).toBeGreaterThan(0);
    // w= beyond the pair is a claim: 13 °C / 90 % is 8.43 g/kg (PsychroLib), so 8.4 passes.
    expect(stateResult(a, 'OFF').claims.map((c) => `${c.key} ${c.pass}`)).toEqual(['w true']);
  });
  it('adp= without bf= (and the reverse) names the missing key', () => {
    const src = fence('state MA: db=27C rh=50%', 'process CC: MA -> OFF adp=11C');
    const d = withCode(analyse(src), 'spec-missing');
    expect(spanText(src, d[0]!)).toBe('adp=11C');
    expect(d[0]!.message).toContain('bf=');
  });
  it('too dry a leaving state is still an impossible process', () => {
    const a = analyse(fence('state MA: db=24C w=9.3g/kg', 'process CC: MA -> OFF db=23C w=5g/kg'));
    expect(withCode(a, 'impossible-process')).toHaveLength(1);
  });
});

describe('humidifiers', () => {
  it('steam to w=: h₂ = h₁ + ΔW h_g (100 °C steam), water and duty', () => {
    const w1 = psy.GetHumRatioFromRelHum(20, 0.15, P);
    const h1 = psy.GetMoistAirEnthalpy(20, w1);
    const a = analyse(fence('state HC: db=20C rh=15%', 'process HU: HC -> HUOFF steam w=5.65g/kg m=2kg/s'));
    const hg = processOf(a, 'HU').equipment!.steamEnthalpyJkg!;
    near(hg, 2_501_000 + 1860 * 99.974, { abs: 5 }, 'h_g at the boiling point (eq 32 vapour term)');
    near(stateOf(a, 'HUOFF').db, tFromHW(h1 + (0.00565 - w1) * hg, 0.00565), { abs: 1e-4 }, 'db₂');
    near(processOf(a, 'HU').waterKgS, 2 * (0.00565 - w1), { rel: 1e-9 }, 'water = ṁ ΔW');
    // Duty: the steam's enthalpy above liquid water at the leaving dry-bulb (docs: water at t₂).
    const t2 = stateOf(a, 'HUOFF').db;
    near(processOf(a, 'HU').qCoilW, 2 * (0.00565 - w1) * (hg - 4186 * t2), { rel: 1e-4 }, 'duty');
  });
  it('steam to rh=, and p_steam= for a supply pressure', () => {
    const a = analyse(fence('state HC: db=20C rh=15%', 'process HU: HC -> HUOFF steam rh=40% p_steam=200kPa'));
    const s = stateOf(a, 'HUOFF');
    near(psy.GetRelHumFromHumRatio(s.db, s.w, P), 0.4, { abs: 1e-6 }, 'rh₂');
    near(processOf(a, 'HU').equipment!.steamTempC!, 120.2, { abs: 0.1 }, 'from memory: 120.2 °C at 200 kPa');
  });
  it('steam without a target, and a misspelt word, are explained', () => {
    const src = fence(
      'state HC: db=20C rh=15%',
      'process HU: HC -> HUOFF steam',
      'process H2: HC -> H2OFF stem w=5g/kg',
    );
    const a = analyse(src);
    expect(withCode(a, 'spec-missing')[0]!.message).toMatch(/w=.*rh=/);
    const u = withCode(a, 'unknown-key');
    expect(spanText(src, u[0]!)).toBe('stem');
    expect(u[0]!.message).toContain('did you mean steam');
  });
  it('adiabatic eff=0.85 on the wet-bulb line; a target below the wet-bulb is unreachable', () => {
    const w1 = psy.GetHumRatioFromRelHum(35, 0.2, P);
    const wb = psy.GetTWetBulbFromHumRatio(35, w1, P);
    const a = analyse(
      fence(
        'state OA: db=35C rh=20%',
        'process EC: OA -> ECOFF adiabatic eff=0.85',
        `process E2: OA -> E2OFF adiabatic db=${(wb - 1).toFixed(1)}C`,
      ),
    );
    const t2 = 35 - 0.85 * (35 - wb);
    near(stateOf(a, 'ECOFF').db, t2, { abs: 2e-3 }, 'db₂');
    near(stateOf(a, 'ECOFF').w, psy.GetHumRatioFromTWetBulb(t2, wb, P), { abs: 2e-6 }, 'W₂');
    expect(processOf(a, 'EC').processKind).toBe('evaporative-cooling');
    expect(withCode(a, 'spec-unreachable')[0]!.message).toContain('wet-bulb');
  });
});

describe('specification conflicts', () => {
  it('two pieces of equipment on one line', () => {
    const src = fence('state MA: db=27C rh=50%', 'process P: MA -> X heat=5kW adp=11C m=1kg/s');
    const d = withCode(analyse(src), 'spec-conflict');
    expect(d).toHaveLength(1);
    expect(spanText(src, d[0]!)).toBe('adp=11C');
    expect(d[0]!.message).toMatch(/heat=.*adp=.*split/);
  });
  it('heat= with dt=', () => {
    expect(
      withCode(analyse(fence('state MA: db=27C rh=50%', 'process P: MA -> X heat=5kW dt=3K m=1kg/s')), 'spec-conflict'),
    ).toHaveLength(1);
  });
  it('a specification on a process whose leaving state is already defined', () => {
    const src = fence('state MA: db=27C rh=50%', 'state X: db=30C rh=40%', 'process P: MA -> X heat=5kW m=1kg/s');
    const d = withCode(analyse(src), 'spec-conflict');
    expect(d).toHaveLength(1);
    expect(d[0]!.message).toMatch(/already defined.*new name/);
  });
  it('a state defined below a process that defined it is a duplicate', () => {
    const a = analyse(fence('state MA: db=27C rh=50%', 'process P: MA -> X dt=3K', 'state X: db=30C rh=40%'));
    expect(withCode(a, 'duplicate-name')).toHaveLength(1);
  });
  it('a process without a specification to an undefined name still says where to define it', () => {
    const a = analyse(fence('state MA: db=27C rh=50%', 'process P: MA -> X m=1kg/s', 'state X: db=13C rh=90%'));
    expect(withCode(a, 'used-before-defined')).toHaveLength(1);
  });
  it('a leaving state that failed leaves its users with an unresolved-dependency note only', () => {
    const a = analyse(fence('state MA: db=27C rh=50%', 'process P: MA -> X adp=30C bf=0.1', 'process Q: X -> Y dt=1K'));
    expect(withCode(a, 'spec-unreachable')).toHaveLength(1);
    expect(withCode(a, 'unresolved-dependency')).toHaveLength(1);
  });
});

describe('recover', () => {
  const base = ['state OA: db=-10C rh=80%', 'state RA: db=22C rh=30%'];
  it('both leaving states by ε on the smaller capacity rate; listed as two sides', () => {
    const a = analyse(fence(...base, 'recover HX: OA -> OA2 m=2kg/s, RA -> EA2 m=1.6kg/s eff_s=0.70 fog=ok'));
    const oa = stateOf(a, 'OA');
    const ra = stateOf(a, 'RA');
    const c1 = 2 * (1006 + 1860 * oa.w);
    const c2 = 1.6 * (1006 + 1860 * ra.w);
    const q = 0.7 * Math.min(c1, c2) * 32;
    near(stateOf(a, 'OA2').db, -10 + q / c1, { abs: 1e-9 }, 'OA2');
    near(stateOf(a, 'EA2').db, 22 - q / c2, { abs: 1e-9 }, 'EA2');
    const sides = a.items.filter((i) => i.kind === 'process' && i.name === 'HX');
    expect(sides.map((s) => (s.kind === 'process' ? `${s.from}->${s.to}` : ''))).toEqual(['OA->OA2', 'RA->EA2']);
    expect(stateResult(a, 'OA2').definedBy?.name).toBe('HX');
  });
  it('frost on the exhaust side is its own warning; fog=ok keeps it as an info', () => {
    const src = fence(...base, 'recover HX: OA -> OA2 m=2kg/s, RA -> EA2 m=1.6kg/s eff_s=0.70');
    const d = withCode(analyse(src), 'recovery-frost');
    expect(d).toHaveLength(1);
    expect(d[0]!.severity).toBe('warning');
    expect(spanText(src, d[0]!)).toBe('EA2');
    expect(d[0]!.message).toContain('fog=ok');
    expect(d[0]!.message).not.toContain('no coil surface temperature');
    const ok = analyse(fence(...base, 'recover HX: OA -> OA2 m=2kg/s, RA -> EA2 m=1.6kg/s eff_s=0.70 fog=ok'));
    expect(ok.diagnostics.filter((x) => x.severity !== 'info')).toEqual([]);
    expect(withCode(ok, 'recovery-frost')[0]!.severity).toBe('info');
  });
  it('condensation (above 0 °C) has its own code', () => {
    const a = analyse(
      fence(
        'state OA: db=5C rh=80%',
        'state RA: db=22C rh=55%',
        'recover HX: OA -> OA2 m=2kg/s, RA -> EA2 m=2kg/s eff_s=0.7',
      ),
    );
    expect(withCode(a, 'recovery-condensation')).toHaveLength(1);
  });
  it('flows from mixes, latent effectiveness, and the heat recovered as a claim', () => {
    const a = analyse(
      fence(
        'state OA: db=0C rh=80%',
        'state RA: db=22C rh=40%',
        'mix M1: OA 2kg/s + OA 0kg/s',
        'mix M2: RA 1.6kg/s + RA 0kg/s',
        'recover HX: M1 -> S2, M2 -> E2 eff_s=0.7 eff_l=0.6 q_sensible=25.1kW fog=ok',
      ),
    );
    const oa = stateOf(a, 'M1');
    const ra = stateOf(a, 'M2');
    near(stateOf(a, 'S2').w, oa.w + (0.6 * 1.6 * (ra.w - oa.w)) / 2, { abs: 1e-12 }, 'W of the outdoor side');
    const q = 0.7 * 1.6 * (1006 + 1860 * ra.w) * 22;
    expect(Math.abs(q - 25_100)).toBeLessThan(50); // the written claim is the hand figure
    expect(withCode(a, 'claim-mismatch')).toEqual([]);
  });
  it('a missing effectiveness or flow, and a word other than fog=ok, are explained', () => {
    const src = fence(
      ...base,
      'recover HX: OA -> OA2, RA -> EA2 m=1kg/s eff_s=0.7 fog=yes',
      'recover H2: OA -> O3 m=1kg/s, RA -> E3 m=1kg/s',
    );
    const a = analyse(src);
    const missing = withCode(a, 'spec-missing');
    expect(missing.map((d) => spanText(src, d))).toEqual(['OA', 'H2']);
    expect(missing[0]!.message).toMatch(/m=.*q=/);
    expect(missing[1]!.message).toContain('eff_s=');
    expect(withCode(a, 'bad-number')[0]!.message).toContain('fog=ok');
  });
});

describe('propagation through a derived chain', () => {
  it('a changed outdoor state changes every derived state and flags the stale claim downstream', () => {
    const chain = (oa: string, claim = '') =>
      fence(
        `state OA: ${oa}`,
        'state RA: db=24C rh=50%',
        'mix MA: OA 1kg/s + RA 3kg/s',
        `process CC: MA -> OFF adp=11C bf=0.1 ${claim}`,
        'process FAN: OFF -> SA dp_fan=750Pa eff=0.62',
      );
    // The coil load as computed for the first outdoor state, written into the note as a claim.
    const q = Math.abs(processOf(analyse(chain('db=32C wb=22.5C')), 'CC').qTotalW!) / 1000;
    const claim = `q_total=${q.toFixed(1)}kW`;
    const before = analyse(chain('db=32C wb=22.5C', claim));
    expect(withCode(before, 'claim-mismatch')).toEqual([]);
    const after = analyse(chain('db=32C wb=24C', claim));
    for (const n of ['MA', 'OFF', 'SA']) expect(stateOf(after, n).h).not.toBe(stateOf(before, n).h);
    expect(withCode(after, 'claim-mismatch')).toHaveLength(1);
  });
  it('the incremental analyzer gives what analyzeNote gives across edits of a derived chain', () => {
    const an = createAnalyzer();
    const texts = [
      fence(
        'state OA: db=32C wb=22.5C',
        'process CC: OA -> OFF adp=11C bf=0.1',
        'process FAN: OFF -> SA dp_fan=750Pa eff=0.62',
      ),
      fence(
        'state OA: db=32C wb=24C',
        'process CC: OA -> OFF adp=11C bf=0.1',
        'process FAN: OFF -> SA dp_fan=750Pa eff=0.62',
      ),
      fence(
        'state OA: db=32C wb=24C',
        'process CC: OA -> OFF adp=12C bf=0.1',
        'process FAN: OFF -> SA dp_fan=750Pa eff=0.62',
        'recover HX: OA -> O2 m=1kg/s, SA -> S2 m=1kg/s eff_s=0.5',
      ),
    ];
    for (const t of texts) expect(JSON.stringify(an.analyze(t).items)).toBe(JSON.stringify(analyse(t).items));
  });
});

describe('editor features on derived states', () => {
  it('go to definition on a derived name goes to the name after ->; rename and references include it', () => {
    const { text, offsets } = marked(
      air(
        'state MA: db=10C rh=60%',
        'process HC: MA -> HC|OFF dt=5K',
        'process FAN: HCOFF -> SA dp_fan=750Pa eff=0.6',
        'state Z: db=1C rh=50%',
      ),
    );
    const note = noteOf(text);
    const use = text.indexOf('HCOFF ->') + 1;
    const d = definition(note, use)!;
    expect(text.slice(d.nameSpan.start, d.nameSpan.end)).toBe('HCOFF');
    expect(d.nameSpan.start).toBe(offsets[0]! - 2);
    expect(references(note, use, true)!).toHaveLength(2);
    const r = rename(note, use, 'HEATED');
    expect('edits' in r && r.edits.length).toBe(2);
  });
  it('hover shows where a derived state came from, and the coil’s ADP', () => {
    const text = air(
      'state MA: db=27C rh=50%',
      'process CC: MA -> OFF adp=11C bf=0.1 m=4kg/s',
      'process FAN: OFF -> SA dp_fan=750Pa eff=0.62',
    );
    const note = noteOf(text);
    const h = hover(note, text.indexOf('OFF ->') + 1)!.markdown;
    expect(h).toContain('Defined by process CC from MA (`adp=11C bf=0.1`)');
    const hp = hover(note, text.indexOf('CC:') + 1)!.markdown;
    expect(hp).toMatch(/apparatus dew point \| 11\.0 °C/);
    expect(hp).toMatch(/bypass factor \(contact factor\) \| 0\.10* \(0\.90*\)/);
  });
});
