/**
 * States through the whole notation (parse + evaluate): units, pressure basis, the defining pair
 * rule, and the computed figures against published check values (copied here with their source
 * and tolerance; the tests do not read anything outside the project).
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, near, stateOf, stateResult, withCode } from './evaluate-helpers';

interface StateCase {
  name: string;
  source: string;
  lines: string[];
  /** Expected figures of state S, SI (°C, fraction, kg/kg, J/kg, m³/kg, Pa), with tolerances. */
  expected: Partial<
    Record<'db' | 'wb' | 'dp' | 'rh' | 'w' | 'h' | 'v' | 'p', [number, { abs?: number; rel?: number }]>
  >;
}

const cases: StateCase[] = [
  {
    name: 'db 40 °C, wb 20 °C at 101.325 kPa',
    source: 'ASHRAE HoF 2017 SI Ch.1 Example 1 (values as cited in the PsychroLib test suite; check-values PL-SI-EX1)',
    lines: ['site: p=101.325kPa', 'state S: db=40C wb=20C'],
    expected: {
      w: [0.0065, { abs: 0.0001 }],
      dp: [7, { abs: 0.5 }],
      rh: [0.14, { abs: 0.01 }],
      h: [56700, { abs: 100 }],
      v: [0.896, { rel: 0.01 }],
    },
  },
  {
    name: 'db 100 °F, wb 65 °F at 14.696 psia (I-P input)',
    source:
      'ASHRAE HoF 2017 I-P Ch.1 Example 1 (as cited in the PsychroLib ' +
      'test suite; check-values PL-IP-EX1); I-P tolerances as given there',
    lines: ['state S: db=100F wb=65F p=14.696psia'],
    // W 0.00523 lb/lb ±0.0001; dp 40 °F ±1 °F (= 4.444 °C ± 0.556 K); RH 0.13 ±0.01.
    expected: { w: [0.00523, { abs: 0.0001 }], dp: [(40 - 32) / 1.8, { abs: 1 / 1.8 }], rh: [0.13, { abs: 0.01 }] },
  },
  {
    name: 'db 30 °C, wb 25 °C at 95 461 Pa',
    source: 'PsychroLib test suite, test_GetHumRatioFromTWetBulb (check-values PL-SI-XLS-W-WB-ABOVE)',
    lines: ['site: p=95461Pa', 'state S: db=30C wb=25C'],
    expected: { w: [0.0192281274241096, { rel: 0.0003 }] },
  },
  {
    name: 'db −1 °C, wb −5 °C at 95 461 Pa (wet-bulb over ice)',
    source: 'PsychroLib test suite, test_GetHumRatioFromTWetBulb (check-values PL-SI-XLS-W-WB-BELOW)',
    lines: ['site: p=95461Pa', 'state S: db=-1C wb=-5C'],
    expected: { w: [0.00120399819933844, { rel: 0.0003 }] },
  },
  {
    name: 'db 30 °C, w 0.02 kg/kg: enthalpy and volume at 95 461 Pa',
    source:
      'PsychroLib test suite, test_GetMoistAirEnthalpy / ' +
      'test_GetMoistAirVolume (check-values PL-SI-XLS-H, PL-SI-XLS-V)',
    lines: ['site: p=95461Pa', 'state S: db=30C w=0.02'],
    expected: { h: [81316, { rel: 0.0003 }], v: [0.940855374352943, { rel: 0.0003 }] },
  },
  {
    name: 'db 7 °C, rh 61 % at 100 kPa: wet-bulb',
    source: 'PsychroLib test suite, test_GetTWetBulbFromRelHum (check-values PL-SI-WB-RH)',
    lines: ['site: p=100kPa', 'state S: db=7C rh=61%'],
    expected: { wb: [3.92667433781955, { rel: 0.001 }] },
  },
  {
    name: 'site elevation 1000 m → standard-atmosphere pressure',
    source: 'ASHRAE HoF 2017 SI Ch.1 Table 1 (eqs 3, 4; check-values PL-SI-ATM-1000)',
    lines: ['site: elev=1000m', 'state S: db=20C rh=50%'],
    expected: { p: [89875, { abs: 1 }] },
  },
  {
    name: 'state elevation override 4000 m',
    source: 'ASHRAE HoF 2017 SI Ch.1 Table 1 (eqs 3, 4; check-values PL-SI-ATM-4000)',
    lines: ['site: p=101.325kPa', 'state S: db=20C rh=50% elev=4000m'],
    expected: { p: [61640, { abs: 1 }] },
  },
  {
    name: 'site elevation in feet: 3000 ft',
    source: 'ASHRAE HoF 2017 I-P Ch.1 Table 1 (check-values PL-IP-ATM-3000: 13.173 psia, rel 0.002)',
    lines: ['site: elev=3000ft', 'state S: db=70F rh=50%'],
    expected: { p: [13.173 * 6894.757293168361, { rel: 0.002 }] },
  },
];

/** Data-driven check: evaluate the lines and compare state S with the expected figures. */
function check(c: StateCase): void {
  const a = analyse(fence(...c.lines));
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  expect(errors, 'no errors').toEqual([]);
  const s = stateOf(a, 'S');
  for (const [key, [value, tol]] of Object.entries(c.expected)) {
    near((s as unknown as Record<string, number>)[key], value, tol!, `${key} (${c.source})`);
  }
}

describe('states against sourced check values', () => {
  for (const c of cases) it(`${c.name} — ${c.source}`, () => check(c));
});

describe('pressure basis', () => {
  it('records site, override and setting with a description', () => {
    const text = fence(
      'state A: db=20C rh=50%',
      'site: elev=1600m',
      'state B: db=20C rh=50%',
      'state C: db=20C rh=50% p=90kPa',
    );
    const a = analyse(text, { pressurePa: 95_000, pressureOrigin: 'setting dewmark.pressure' });
    expect(stateResult(a, 'A').pressure).toMatchObject({ source: 'setting', pa: 95_000 });
    expect(stateResult(a, 'A').pressure.describe).toContain('setting dewmark.pressure');
    const b = stateResult(a, 'B').pressure;
    expect(b).toMatchObject({ source: 'site', elevationM: 1600 });
    expect(b.describe).toMatch(/site line 5: elev=1600m/);
    expect(stateResult(a, 'C').pressure).toMatchObject({ source: 'override', pa: 90_000 });
  });

  it('p= and elev= together: p= wins with a warning', () => {
    const a = analyse(fence('state A: db=20C rh=50% p=90kPa elev=1600m'));
    expect(stateResult(a, 'A').pressure.pa).toBe(90_000);
    expect(withCode(a, 'pressure-conflict')).toHaveLength(1);
  });
});

describe('defining pair selection', () => {
  const pairOf = (props: string) => stateResult(analyse(fence(`state A: ${props}`)), 'A').defining;
  it('prefers db with the first other defining key, wherever db stands', () => {
    expect(pairOf('db=24C rh=50%')).toEqual(['db', 'rh']);
    expect(pairOf('rh=50% w=9g/kg db=24C')).toEqual(['db', 'rh']);
    expect(pairOf('w=9.3g/kg db=24C rh=50%')).toEqual(['db', 'w']);
  });
  it('without db: the first non-dependent, well-conditioned pair in written order', () => {
    expect(pairOf('dp=10C w=7.7g/kg rh=50%')).toEqual(['dp', 'rh']);
    expect(pairOf('wb=17C h=48kJ/kg rh=50%')).toEqual(['wb', 'rh']);
  });
  it('v never defines a state', () => {
    const a = analyse(fence('state A: db=24C v=0.85m3/kg'));
    expect(withCode(a, 'underspecified')).toHaveLength(1);
    expect(withCode(a, 'underspecified')[0]!.message).toContain('v is checked as a claim');
  });
  it('an ill-conditioned pair is solved with a warning', () => {
    const a = analyse(fence('state A: wb=17C h=47.5kJ/kg'));
    expect(stateResult(a, 'A').state).not.toBeNull();
    expect(withCode(a, 'ill-conditioned').length).toBeGreaterThanOrEqual(1);
    expect(withCode(a, 'ill-conditioned')[0]!.severity).toBe('warning');
  });
});

describe('units', () => {
  it('a units: line wins over the setting', () => {
    const a = analyse(fence('units: IP', 'state A: db=75F rh=50%'), { units: 'SI' });
    expect(a.units).toBe('IP');
    expect(a.unitsSource).toBe('note');
  });
  it('the setting applies without a units: line', () => {
    const a = analyse(fence('state A: db=24C rh=50%'), { units: 'IP' });
    expect(a.units).toBe('IP');
    expect(a.unitsSource).toBe('setting');
  });
  it('°F input equals the °C figure (exact conversion: 75.2 °F = 24 °C)', () => {
    const a = analyse(fence('state A: db=75.2F rh=50%', 'state B: db=24C rh=50%'));
    near(stateOf(a, 'A').w, stateOf(a, 'B').w, { rel: 1e-12 }, 'w');
  });
  it('a bare w is kg/kg; g/kg and gr/lb convert (7000 gr = 1 lb, NIST SP 811)', () => {
    const a = analyse(fence('state A: db=24C w=0.0093', 'state B: db=24C w=9.3g/kg', 'state C: db=24C w=65.1gr/lb'));
    near(stateOf(a, 'A').w, 0.0093, { abs: 1e-15 }, 'bare w');
    near(stateOf(a, 'B').w, 0.0093, { abs: 1e-15 }, 'g/kg');
    near(stateOf(a, 'C').w, 65.1 / 7000, { abs: 1e-15 }, 'gr/lb');
  });
  it(
    'Btu/lb enthalpy moves the datum: 28.2 Btu/lb ≈ 47.8 kJ/kg ' +
      '(units module doc: kJ/kg = Btu/lb × 2.326 − 17.884)',
    () => {
      const a = analyse(fence('state A: db=24C h=28.2Btu/lb'));
      near(stateOf(a, 'A').h, 28.2 * 2326 - (1006 * 160) / 9, { abs: 1e-6 }, 'h');
    },
  );
});
