/**
 * References between states (`w=OA.w`, `db=OFF.db+0.8K`): the value is the referenced state's
 * computed property plus the written difference, and it defines the state. Figures are checked
 * against an independent computation: stream properties from PsychroLib 1.1.1 (test oracle),
 * differences converted with the exact unit definitions (NIST SP 811 (2008) Appendix B: a
 * difference of 1 °F is 5/9 K; 1 Btu/lb is 2.326 kJ/kg), pressures from the standard atmosphere
 * (ASHRAE HoF 2017 SI Ch.1 eq 3). Every state and mix here is of an invented building.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, processOf, psy, spanText, stateOf, stateResult, withCode } from './evaluate-helpers';

const P0 = 101325;

describe('a reference takes the computed property of a state above', () => {
  it('w=OA.w: the humidity ratio of the outdoor air, at another dry-bulb', () => {
    const a = analyse(fence('state OA: db=32C wb=22.5C', 'state PH: db=40C w=OA.w'));
    // PsychroLib as oracle: W from dry-bulb and wet-bulb (ASHRAE HoF 2017 SI Ch.1 eq 33/35).
    const w = psy.GetHumRatioFromTWetBulb(32, 22.5, P0);
    const s = stateOf(a, 'PH');
    near(s.w, w, { rel: 2e-4 }, 'W taken from OA (PsychroLib GetHumRatioFromTWetBulb)');
    near(s.db, 40, { abs: 1e-12 }, 'db as written');
    near(s.rh, psy.GetRelHumFromHumRatio(40, w, P0), { abs: 2e-4 }, 'rh at 40 °C with that W (PsychroLib)');
    near(s.h, psy.GetMoistAirEnthalpy(40, w), { rel: 2e-4 }, 'h, eq 32 (PsychroLib)');
    expect(stateResult(a, 'PH').defining).toEqual(['db', 'w']);
    expect(stateResult(a, 'PH').sources).toEqual([
      { key: 'w', from: 'OA', fromKey: 'w', offsetSI: 0, valueSI: stateOf(a, 'OA').w },
    ]);
    expect(a.diagnostics).toEqual([]);
  });

  it('db=OFF.db+0.8K, a difference in °F, in g/kg and in Btu/lb', () => {
    const a = analyse(
      fence(
        'state OFF: db=12.5C rh=95%',
        'state SA: db=OFF.db+0.8K w=OFF.w',
        'state SB: db=OFF.db+1.8F w=OFF.w',
        'state SC: db=OFF.db-2K w=OFF.w-0.5g/kg',
        'state SD: db=20C h=OFF.h+1Btu/lb',
      ),
    );
    const off = stateOf(a, 'OFF');
    near(off.w, psy.GetHumRatioFromRelHum(12.5, 0.95, P0), { rel: 2e-4 }, 'OFF W (PsychroLib)');
    near(stateOf(a, 'SA').db, 12.5 + 0.8, { abs: 1e-12 }, '+0.8 K');
    // 1.8 °F × 5/9 = 1.0 K (NIST SP 811 exact definition of the degree Fahrenheit).
    near(stateOf(a, 'SB').db, 12.5 + 1.0, { abs: 1e-12 }, '+1.8 °F is +1.0 K');
    near(stateOf(a, 'SC').db, 10.5, { abs: 1e-12 }, '−2 K');
    near(stateOf(a, 'SC').w, off.w - 0.0005, { abs: 1e-15 }, '−0.5 g/kg');
    // 1 Btu/lb = 2326 J/kg as a difference (no datum shift for a difference; NIST SP 811).
    near(stateOf(a, 'SD').h, off.h + 2326, { abs: 1e-9 }, '+1 Btu/lb is +2.326 kJ/kg');
    expect(stateResult(a, 'SA').sources?.map((s) => [s.key, s.from, s.offsetSI])).toEqual([
      ['db', 'OFF', 0.8],
      ['w', 'OFF', 0],
    ]);
  });

  it('takes a property of a mix, and a property of another kind of the same dimension (dp=RA.db)', () => {
    const a = analyse(
      fence(
        'state OA: db=30C rh=40%',
        'state RA: db=24C rh=50%',
        'mix MA: OA 25% + RA 75%',
        'state MB: db=MA.db w=MA.w',
        'state SAT: db=RA.db dp=RA.db',
      ),
    );
    const ma = stateOf(a, 'MA');
    near(stateOf(a, 'MB').db, ma.db, { abs: 1e-12 }, 'db of the mix');
    near(stateOf(a, 'MB').h, ma.h, { rel: 1e-9 }, 'same (db, W) gives the same h');
    // Dew point equal to the dry-bulb: saturated air (rh 100 %, ASHRAE HoF 2017 SI Ch.1 definition of dew point).
    near(stateOf(a, 'SAT').rh, 1, { abs: 1e-6 }, 'saturated');
  });

  it('is computed at the referencing state’s own pressure (its site line), not the referenced one’s', () => {
    const a = analyse(fence('state OA: db=30C rh=40%', 'site: elev=1600m', 'state IN: db=24C w=OA.w'));
    const p = psy.GetStandardAtmPressure(1600);
    const w = psy.GetHumRatioFromRelHum(30, 0.4, P0);
    near(stateOf(a, 'IN').p, p, { abs: 1 }, 'standard atmosphere at 1600 m (eq 3)');
    near(
      stateOf(a, 'IN').rh,
      psy.GetRelHumFromHumRatio(24, w, p),
      { abs: 2e-4 },
      'rh at 1600 m for the sea-level W (PsychroLib)',
    );
  });

  it('always defines: a written figure beside two other properties becomes the claim', () => {
    const text = fence('state OA: db=32C wb=22.5C', 'state X: db=24C rh=50% w=OA.w');
    const a = analyse(text);
    const r = stateResult(a, 'X');
    expect(r.defining).toEqual(['db', 'w']);
    expect(r.claims.map((c) => [c.key, c.pass])).toEqual([['rh', false]]);
    const stale = withCode(a, 'claim-mismatch');
    expect(stale).toHaveLength(1);
    expect(stale[0]!.message).toContain('from db=24C and w=OA.w');
    // rh at 24 °C for OA's W (PsychroLib): the figure the quick fix offers.
    const rh = psy.GetRelHumFromHumRatio(24, psy.GetHumRatioFromTWetBulb(32, 22.5, P0), P0) * 100;
    expect(stale[0]!.data?.computedText).toBe(`${rh.toFixed(1)}%`);
  });
});

describe('bad references get one clear error each, on the offending token', () => {
  const cases: [string, string[], string, string, RegExp][] = [
    [
      'unknown state, with a suggestion',
      ['state OA: db=30C rh=40%', 'state X: db=20C w=OAA.w'],
      'unknown-name',
      'OAA',
      /did you mean 'OA'/,
    ],
    [
      'defined further down',
      ['state X: db=20C w=LATER.w', 'state LATER: db=10C rh=50%'],
      'used-before-defined',
      'LATER',
      /defined further down \(line 5\).*move its definition above/,
    ],
    ['itself', ['state X: db=20C w=X.w'], 'used-before-defined', 'X', /refers to the statement that defines it/],
    [
      'a process',
      ['state A: db=30C rh=40%', 'state B: db=20C rh=60%', 'process P: A -> B m=1kg/s', 'state X: db=20C w=P.w'],
      'not-a-state',
      'P',
      /is a process, not a state/,
    ],
    [
      'another kind',
      ['state OA: db=30C rh=40%', 'state X: db=20C w=OA.db'],
      'bad-reference',
      'db',
      /OA\.db is a temperature, but w is a humidity ratio.*w=OA\.w/,
    ],
    [
      'a key that is not a property',
      ['state OA: db=30C rh=40%', 'state X: db=20C w=OA.q'],
      'bad-reference',
      'q',
      /'q' is not a property of OA/,
    ],
    [
      'v cannot be referenced',
      ['state OA: db=30C rh=40%', 'state X: db=20C w=OA.v'],
      'bad-reference',
      'v',
      /'v' cannot be referenced/,
    ],
    [
      'a difference in °C',
      ['state OA: db=30C rh=40%', 'state X: db=OA.db+2C w=OA.w'],
      'bad-reference',
      'C',
      /write a temperature difference in K \(\+2K/,
    ],
    [
      'a difference without a unit',
      ['state OA: db=30C rh=40%', 'state X: db=OA.db+2 w=OA.w'],
      'missing-unit',
      '+2',
      /has no unit.*\+0\.8K or \+1\.5F/,
    ],
    [
      'a difference in another dimension',
      ['state OA: db=30C rh=40%', 'state X: db=30C w=OA.w+2K'],
      'bad-reference',
      'K',
      /'K' is not a unit of humidity ratio.*\+0\.5g\/kg/,
    ],
    [
      'a difference on rh',
      ['state OA: db=30C rh=40%', 'state X: db=30C rh=OA.rh+5%'],
      'bad-reference',
      '+5%',
      new RegExp(
        /a relative humidity takes no difference: '\+5%' could mean 5 percentage points or 5 % of OA's figure/.source +
          /.*rh=45%.*w=OA\.w\+0\.5g\/kg or dp=OA\.dp\+0\.8K/.source,
      ),
    ],
    [
      'a process’s leaving values: the message names its leaving state',
      ['state A: db=30C rh=40%', 'state B: db=20C rh=60%', 'process P: A -> B m=1kg/s', 'state X: db=P.db w=A.w'],
      'not-a-state',
      'P',
      /'P' is a process, not a state; db=P\.db must name a state.*the air leaving P is B, so write db=B\.db/,
    ],
    [
      'a process’s own figure (its apparatus dew point)',
      ['state A: db=30C rh=60%', 'process CC: A -> OFF m=1kg/s adp=10C bf=0.1', 'state X: db=CC.adp rh=100%'],
      'not-a-state',
      'CC',
      new RegExp(
        /the air leaving CC is OFF, so write db=OFF\.db\. /.source +
          /A process's own figures \(its apparatus dew point, heat rates, water, flow\) /.source +
          /are not taken by reference: write the figure itself/.source,
      ),
    ],
    [
      'a tolerance',
      ['state OA: db=30C rh=40%', 'state X: db=OA.db+2K±1 w=OA.w'],
      'bad-reference',
      '±1',
      /takes no tolerance/,
    ],
    [
      'in a mix claim',
      ['state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'mix M: OA 50% + RA 50% db=OA.db'],
      'bad-reference',
      'OA.db',
      /mix M takes figures only/,
    ],
    [
      'in a process figure',
      ['state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'process P: OA -> RA m=OA.w'],
      'bad-reference',
      'OA.w',
      /process P goes between two states defined above.*a reference defines a state.*give the leaving state a new name/,
    ],
    [
      'on a process that defines its leaving state, beside the equipment (it could only be a claim)',
      ['state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'process HC: RA -> HCOFF m=1kg/s heat=2kW db=OA.db'],
      'bad-reference',
      'db=OA.db',
      /db=OA\.db would be a claim about HCOFF, which heat=2kW already fixes.*write db= as a figure/,
    ],
    [
      'in the specification of a process (only the leaving state’s properties)',
      ['state OA: db=30C rh=40%', 'state RA: db=24C rh=50%', 'process CC: RA -> OFF adp=OA.dp bf=0.1'],
      'bad-reference',
      'adp',
      /only db, wb, dp, rh, w, h can be taken from another state; write adp= as a figure/,
    ],
    [
      'three references',
      ['state OA: db=30C rh=40%', 'state X: db=OA.db rh=OA.rh w=OA.w'],
      'bad-reference',
      'w=OA.w',
      /3 properties taken from other states/,
    ],
    [
      'two references that fix the same thing',
      ['state OA: db=30C rh=40%', 'state X: dp=OA.dp w=OA.w db=20C'],
      'dependent-pair',
      'dp=OA.dp w=OA.w',
      /a reference always defines/,
    ],
    [
      'a reference on the pressure',
      ['state OA: db=30C rh=40%', 'state X: db=20C rh=50% p=OA.p'],
      'bad-reference',
      'p',
      /only db, wb, dp, rh, w, h can be taken from another state/,
    ],
  ];
  for (const [what, lines, code, underlined, message] of cases) {
    it(what, () => {
      const text = fence(...lines);
      const a = analyse(text);
      const hits = withCode(a, code);
      expect(
        hits.map((d) => d.message),
        JSON.stringify(a.diagnostics.map((d) => d.message)),
      ).toHaveLength(1);
      expect(spanText(text, hits[0]!)).toBe(underlined);
      expect(hits[0]!.message).toMatch(message);
      expect(a.diagnostics.filter((d) => d.severity === 'error')).toHaveLength(1);
    });
  }

  it('a reference to a state that failed is a short info, not a second error', () => {
    const a = analyse(fence('state OA: db=30C wb=35C', 'state X: db=20C w=OA.w'));
    expect(withCode(a, 'wb-above-db')).toHaveLength(1);
    expect(withCode(a, 'unresolved-dependency').map((d) => d.severity)).toEqual(['info']);
    expect(stateResult(a, 'X').state).toBeNull();
  });

  it('parse errors of malformed references say how to write one', () => {
    const text = fence(
      'state OA: db=30C rh=40%',
      'state X: db=OA. w=OA',
      'state Y: db=OA.db*2 w=OA.w',
      'state Z: db=OA.db+ w=OA.w',
    );
    const a = analyse(text);
    const msgs = a.diagnostics.map((d) => `${d.code} ${spanText(text, d)}: ${d.message}`);
    expect(msgs).toEqual([
      "missing-value OA.: 'OA.' names no property after the dot: write db=OA.db (a property of OA)",
      "bad-number OA: 'OA' is not a number: write w= followed by a decimal " +
        "number and its unit, e.g. w=9.3g/kg, or another state's property: w=OA.w",
      "syntax OA.db*2: 'OA.db*2' is not a property reference: write OA.db, or add " +
        'or subtract a difference with its unit (OA.db+0.8K); no other arithmetic',
      "missing-value +: '+' needs a difference after the sign: write db=OA.db+0.8K (+ or − a difference with its unit)",
    ]);
  });
});

describe('a process that defines its leaving state takes references for that state', () => {
  // The design chain of an invented exhibition hall: the coil dries the mixed air to the supply
  // air's moisture content, the heater warms to a temperature taken from another state.
  const chain = (oaWb: string) =>
    fence(
      `state OA: db=32C wb=${oaWb}`,
      'state RA: db=24C rh=50%',
      'mix MA: OA 1kg/s + RA 3kg/s',
      'supply SA: RA q_sensible=40kW q_latent=10kW m=4kg/s',
      'process CC: MA -> OFF db=11.5C w=SA.w',
      'process RH: OFF -> RHOFF db=SA.db-0.5K',
      'process HU: RA -> HUOFF steam w=SA.w+1g/kg',
    );

  it('the leaving state takes the referenced value exactly, and its sources name the state', () => {
    const a = analyse(chain('16.5C'));
    expect(a.diagnostics).toEqual([]);
    const sa = stateOf(a, 'SA');
    const off = stateResult(a, 'OFF');
    // A reference is the referenced state's computed property (docs/notation.md, References).
    expect(off.state!.w).toBe(sa.w);
    near(off.state!.db, 11.5, { abs: 1e-12 }, 'db as written');
    expect(off.defining).toEqual(['db', 'w']);
    expect(off.sources).toEqual([{ key: 'w', from: 'SA', fromKey: 'w', offsetSI: 0, valueSI: sa.w }]);
    expect(off.definedBy?.spec).toBe('db=11.5C w=SA.w');
    // A heater by leaving dry-bulb keeps W (ASHRAE HoF 2017 SI Ch.1: sensible heating, W unchanged).
    const rh = stateResult(a, 'RHOFF');
    near(rh.state!.db, sa.db - 0.5, { abs: 1e-12 }, 'SA.db − 0.5 K');
    expect(rh.state!.w).toBe(off.state!.w);
    expect(rh.sources?.map((x) => [x.key, x.from, x.offsetSI])).toEqual([['db', 'SA', -0.5]]);
    // A steam humidifier to a target W: the leaving W is the target (docs/notation.md, steam humidifier).
    near(stateOf(a, 'HUOFF').w, sa.w + 0.001, { abs: 1e-15 }, 'SA.w + 1 g/kg');
    // The coil takes the mix's flow (1 + 3 kg/s) and removes W_MA − W_OFF of water per kg of dry air
    // (dry-air mass balance, ASHRAE HoF 2017 SI Ch.1 "moist-air cooling and dehumidification").
    const cc = processOf(a, 'CC');
    near(cc.massFlowKgS!, 4, { abs: 1e-12 }, 'mix flow');
    near(cc.waterKgS!, 4 * (sa.w - stateOf(a, 'MA').w), { rel: 1e-12 }, 'ṁ ΔW');
  });

  it('a change upstream changes the leaving state and the processes after it', () => {
    const before = analyse(chain('16.5C'));
    const after = analyse(chain('20C'));
    // OA feeds MA, so the coil's duty moves; OFF itself is fixed by db= and SA.w, which OA does not reach.
    expect(processOf(after, 'CC').qTotalW).not.toBe(processOf(before, 'CC').qTotalW);
    expect(stateOf(after, 'OFF').w).toBe(stateOf(before, 'OFF').w);
    // A room state change reaches SA, then OFF, RHOFF and HUOFF through the references.
    const drier = analyse(chain('16.5C').replace('state RA: db=24C rh=50%', 'state RA: db=24C rh=48%'));
    expect(drier.diagnostics).toEqual([]);
    for (const n of ['SA', 'OFF', 'RHOFF', 'HUOFF']) expect(stateOf(drier, n).h, n).not.toBe(stateOf(before, n).h);
  });
});
