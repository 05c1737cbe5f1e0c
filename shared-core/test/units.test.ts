/**
 * Tests of the units module: the unit table, exact conversion factors (each against its defining
 * constants and naming its source), round trips (property-based, seeded), the Btu/lb enthalpy
 * datum, case-sensitive lookup, suggestions for misspellings, display units and formatting.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createRequire } from 'node:module';
import {
  DIMENSIONS,
  NO_VALUE,
  UNITS,
  baseUnit,
  deltaFromSI,
  deltaToSI,
  describeUnit,
  dimensionTitle,
  displaySymbol,
  displayUnit,
  formatInUnit,
  formatQuantity,
  fromSI,
  lookupUnit,
  suggestUnit,
  toSI,
  unitsOf,
  type Dimension,
  type UnitDef,
  type UnitSystem,
} from '../src/units';

/** The unit with this spelling; fails the test (not silently undefined) when it is missing. */
function unit(symbol: string): UnitDef {
  const u = lookupUnit(symbol);
  if (!u) throw new Error(`unit ${symbol} is missing from the table`);
  return u;
}

/** |a − b| ≤ rel·|b| (or ≤ rel when b is 0). */
function expectRel(actual: number, expected: number, rel: number): void {
  const tol = rel * (expected === 0 ? 1 : Math.abs(expected));
  expect(Math.abs(actual - expected), `${actual} vs ${expected} (rel ${rel})`).toBeLessThanOrEqual(tol);
}

// Exact defining constants — NIST SP 811 (2008) Appendix B (B.8 and footnotes):
const LB = 0.45359237; // kg, avoirdupois pound, exact
const FT = 0.3048; // m, international foot, exact
const INCH = 0.0254; // m, exact
const GN = 9.80665; // m/s², standard acceleration of free fall, exact (pound-force = lb · gn)
const BTU_IT = 1055.05585262; // J, International Table Btu, exact
const GRAIN = 64.79891e-6; // kg, exact
const LITRE = 1e-3; // m³, exact

describe('unit table', () => {
  // Every unit named in the notation design and the flow/power units processes need.
  const required: [spelling: string, canonical: string, dimension: Dimension][] = [
    ['C', 'C', 'temperature'],
    ['°C', 'C', 'temperature'],
    ['F', 'F', 'temperature'],
    ['°F', 'F', 'temperature'],
    ['K', 'K', 'temperature'],
    ['R', 'R', 'temperature'],
    ['°R', 'R', 'temperature'],
    ['Pa', 'Pa', 'pressure'],
    ['kPa', 'kPa', 'pressure'],
    ['hPa', 'hPa', 'pressure'],
    ['mbar', 'mbar', 'pressure'],
    ['bar', 'bar', 'pressure'],
    ['psia', 'psia', 'pressure'],
    ['psi', 'psi', 'pressure'],
    ['inHg', 'inHg', 'pressure'],
    ['inH2O', 'inH2O', 'pressure'],
    ['inwc', 'inH2O', 'pressure'],
    ['atm', 'atm', 'pressure'],
    ['kg/kg', 'kg/kg', 'humidityRatio'],
    ['g/kg', 'g/kg', 'humidityRatio'],
    ['lb/lb', 'lb/lb', 'humidityRatio'],
    ['gr/lb', 'gr/lb', 'humidityRatio'],
    ['kJ/kg', 'kJ/kg', 'enthalpy'],
    ['J/kg', 'J/kg', 'enthalpy'],
    ['Btu/lb', 'Btu/lb', 'enthalpy'],
    ['m3/kg', 'm3/kg', 'specificVolume'],
    ['m³/kg', 'm3/kg', 'specificVolume'],
    ['ft3/lb', 'ft3/lb', 'specificVolume'],
    ['ft³/lb', 'ft3/lb', 'specificVolume'],
    ['m', 'm', 'length'],
    ['ft', 'ft', 'length'],
    ['kg/s', 'kg/s', 'massFlow'],
    ['kg/h', 'kg/h', 'massFlow'],
    ['lb/h', 'lb/h', 'massFlow'],
    ['lb/min', 'lb/min', 'massFlow'],
    ['m3/s', 'm3/s', 'volumeFlow'],
    ['m3/h', 'm3/h', 'volumeFlow'],
    ['L/s', 'L/s', 'volumeFlow'],
    ['l/s', 'L/s', 'volumeFlow'],
    ['cfm', 'cfm', 'volumeFlow'],
    ['W', 'W', 'power'],
    ['kW', 'kW', 'power'],
    ['MW', 'MW', 'power'],
    ['Btu/h', 'Btu/h', 'power'],
    ['Btu/hr', 'Btu/h', 'power'],
    ['MBH', 'MBH', 'power'],
    ['ton', 'ton', 'power'],
    ['TR', 'ton', 'power'],
    ['%', '%', 'fraction'],
    ['kg/m3', 'kg/m3', 'density'],
    ['lb/ft3', 'lb/ft3', 'density'],
  ];
  it.each(required)('%s is the %s unit of %s', (spelling, canonical, dimension) => {
    const u = unit(spelling);
    expect(u.symbol).toBe(canonical);
    expect(u.dimension).toBe(dimension);
  });

  it('no two different units share a spelling, even ignoring case', () => {
    const owner = new Map<string, string>();
    const clashes: string[] = [];
    for (const u of UNITS) {
      for (const s of [u.symbol, ...u.aliases]) {
        const k = s.toLowerCase();
        const prev = owner.get(k);
        if (prev !== undefined && prev !== u.symbol) clashes.push(`${s} (${u.symbol}) vs ${prev}`);
        owner.set(k, u.symbol);
      }
    }
    expect(clashes).toEqual([]);
  });

  // SI bases as documented in units/types.ts.
  const bases: [Dimension, string][] = [
    ['temperature', 'C'],
    ['pressure', 'Pa'],
    ['humidityRatio', 'kg/kg'],
    ['enthalpy', 'J/kg'],
    ['specificVolume', 'm3/kg'],
    ['length', 'm'],
    ['massFlow', 'kg/s'],
    ['volumeFlow', 'm3/s'],
    ['power', 'W'],
    ['density', 'kg/m3'],
  ];
  it.each(bases)('the SI base of %s is %s (scale 1, offset 0)', (d, symbol) => {
    const b = baseUnit(d);
    expect(b.symbol).toBe(symbol);
    expect([b.scale, b.offset]).toEqual([1, 0]);
  });
  it('the fraction base is 1, so 50 % converts to 0.5', () => {
    expect(toSI(50, unit('%'))).toBe(0.5);
  });

  it('offsets are non-zero only for °F, K, °R and Btu/lb (units/types.ts contract)', () => {
    const withOffset = UNITS.filter((u) => u.offset !== 0).map((u) => u.symbol);
    expect(withOffset.sort()).toEqual(['Btu/lb', 'F', 'K', 'R']);
  });

  it.each(UNITS.map((u) => [u.symbol, u] as const))(
    '%s has a title, a positive finite scale and a finite offset',
    (_s, u) => {
      expect(u.title.length).toBeGreaterThan(2);
      expect(Number.isFinite(u.scale) && u.scale > 0).toBe(true);
      expect(Number.isFinite(u.offset)).toBe(true);
    },
  );

  it.each(DIMENSIONS.map((d) => [d]))('unitsOf(%s) lists only that dimension, and every unit is listed once', (d) => {
    const list = unitsOf(d);
    expect(list.length).toBeGreaterThan(0);
    expect(list.every((u) => u.dimension === d)).toBe(true);
  });
  it('unitsOf over all dimensions is exactly the table', () => {
    const all = DIMENSIONS.flatMap((d) => unitsOf(d).map((u) => u.symbol));
    expect(all.sort()).toEqual(UNITS.map((u) => u.symbol).sort());
  });
});

describe('conversion factors against their exact definitions', () => {
  // [symbol, scale (SI base per unit), offset, source]
  const exact: [string, number, number, string][] = [
    ['C', 1, 0, 'SI base (units/types.ts)'],
    ['F', 1 / 1.8, -32 / 1.8, 'NIST SP 811 (2008) B.9: t/°C = (t/°F − 32)/1.8'],
    ['K', 1, -273.15, 'NIST SP 811 (2008) 4.2.1.1: t/°C = T/K − 273.15'],
    ['R', 1 / 1.8, -273.15, 'NIST SP 811 (2008) B.9: T/K = (T/°R)/1.8'],
    ['Pa', 1, 0, 'SI base'],
    ['kPa', 1e3, 0, 'SI prefix kilo'],
    ['hPa', 1e2, 0, 'SI prefix hecto'],
    ['mbar', 1e2, 0, 'NIST SP 811 (2008) B.8: millibar = 1.0 E+02 Pa (exact)'],
    ['bar', 1e5, 0, 'NIST SP 811 (2008) B.8: bar = 1.0 E+05 Pa (exact)'],
    ['atm', 101325, 0, 'NIST SP 811 (2008) B.8: standard atmosphere = 1.013 25 E+05 Pa (exact)'],
    ['psia', (LB * GN) / INCH ** 2, 0, 'NIST SP 811 (2008) B.8: lbf/in² = lb · gn / in²'],
    ['psi', (LB * GN) / INCH ** 2, 0, 'NIST SP 811 (2008) B.8: lbf/in² (treated as absolute)'],
    ['inHg', 3386.389, 0, 'NIST SP 811 (2008) B.8: inch of mercury, conventional = 3.386 389 E+03 Pa'],
    ['inH2O', 1000 * GN * INCH, 0, 'NIST SP 811 (2008) B.8: inch of water, conventional = 1000 kg/m³ · gn · in'],
    ['kg/kg', 1, 0, 'SI base'],
    ['g/kg', 1e-3, 0, 'SI prefix'],
    ['lb/lb', 1, 0, 'same ratio in any mass unit'],
    ['gr/lb', GRAIN / LB, 0, 'NIST SP 811 (2008) B.8: grain = 6.479 891 E−05 kg (exact) per pound'],
    ['J/kg', 1, 0, 'SI base'],
    ['kJ/kg', 1e3, 0, 'SI prefix'],
    [
      'Btu/lb',
      BTU_IT / LB,
      (-1006 * 160) / 9,
      'NIST SP 811 (2008) B.8 (Btu_IT/lb) and ASHRAE HoF Ch.1 datums (dry air 0 at 0 °F; SI h_da = 1.006 t)',
    ],
    ['m3/kg', 1, 0, 'SI base'],
    ['ft3/lb', FT ** 3 / LB, 0, 'NIST SP 811 (2008) B.8: ft³/lb from ft and lb'],
    ['m', 1, 0, 'SI base'],
    ['ft', FT, 0, 'NIST SP 811 (2008) B.8: foot = 3.048 E−01 m (exact)'],
    ['kg/s', 1, 0, 'SI base'],
    ['kg/h', 1 / 3600, 0, 'hour = 3600 s'],
    ['lb/h', LB / 3600, 0, 'NIST SP 811 (2008) B.8: lb/h from lb'],
    ['lb/min', LB / 60, 0, 'NIST SP 811 (2008) B.8: lb/min from lb'],
    ['m3/s', 1, 0, 'SI base'],
    ['m3/h', 1 / 3600, 0, 'hour = 3600 s'],
    ['L/s', LITRE, 0, 'NIST SP 811 (2008) B.8: litre = 1.0 E−03 m³ (exact)'],
    ['cfm', FT ** 3 / 60, 0, 'NIST SP 811 (2008) B.8: ft³/min from ft'],
    ['W', 1, 0, 'SI base'],
    ['kW', 1e3, 0, 'SI prefix'],
    ['MW', 1e6, 0, 'SI prefix'],
    ['Btu/h', BTU_IT / 3600, 0, 'NIST SP 811 (2008) B.8: Btu_IT/h from Btu_IT'],
    ['MBH', (1000 * BTU_IT) / 3600, 0, 'common practice: MBH = 1000 Btu/h'],
    [
      'ton',
      (12000 * BTU_IT) / 3600,
      0,
      'common practice and NIST SP 811 (2008) B.8: ton of refrigeration = 12 000 Btu_IT/h',
    ],
    ['%', 0.01, 0, 'percent = 0.01'],
    ['kg/m3', 1, 0, 'SI base'],
    ['lb/ft3', LB / FT ** 3, 0, 'NIST SP 811 (2008) B.8: lb/ft³ from lb and ft'],
  ];
  it.each(exact)('%s: scale %d, offset %d (%s)', (symbol, scale, offset) => {
    const u = unit(symbol);
    expectRel(u.scale, scale, 1e-15);
    expect(Math.abs(u.offset - offset)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(offset)));
  });
  it('the table covers every unit', () => {
    expect(exact.map((r) => r[0]).sort()).toEqual(UNITS.map((u) => u.symbol).sort());
  });

  // Factors as printed in NIST SP 811 (2008) Appendix B.8 to 7 significant figures (printed
  // factors quoted from memory; the exact derivations above are the binding check). Tolerance:
  // half a unit in the 7th figure.
  const printed: [string, number][] = [
    ['psi', 6.894757e3],
    ['inHg', 3.386389e3],
    ['inH2O', 2.490889e2],
    ['ft3/lb', 6.242796e-2],
    ['lb/ft3', 1.601846e1],
    ['lb/h', 1.259979e-4],
    ['lb/min', 7.559873e-3],
    ['cfm', 4.719474e-4],
    ['Btu/h', 2.930711e-1],
    ['ton', 3.516853e3],
    ['Btu/lb', 2.326e3],
  ];
  it.each(printed)('%s agrees with the NIST SP 811 (2008) B.8 printed factor %d (from memory)', (symbol, factor) => {
    expectRel(unit(symbol).scale, factor, 5e-7);
  });

  it('Btu_IT/lb is exactly 2326 J/kg (NIST SP 811 (2008) B.8, exact)', () => {
    expectRel(unit('Btu/lb').scale, 2326, 1e-15);
  });
  it('7000 grains make one pound, so 7000 gr/lb = 1 lb/lb (NIST SP 811 (2008) B.8: grain = 1/7000 lb)', () => {
    expectRel(toSI(7000, unit('gr/lb')), toSI(1, unit('lb/lb')), 1e-15);
  });

  // Anchor points: [value, unit, expected SI, abs tolerance, source]
  const anchors: [number, string, number, number, string][] = [
    [32, 'F', 0, 1e-12, 'NIST SP 811 (2008) B.9: ice point 32 °F = 0 °C'],
    [212, 'F', 100, 1e-12, 'NIST SP 811 (2008) B.9: (212 − 32)/1.8 = 100 °C'],
    [-40, 'F', -40, 1e-12, 'NIST SP 811 (2008) B.9: (−40 − 32)/1.8 = −40 °C'],
    [0, 'K', -273.15, 1e-12, 'NIST SP 811 (2008) 4.2.1.1: 0 K = −273.15 °C'],
    [491.67, 'R', 0, 1e-9, 'NIST SP 811 (2008) B.9: 491.67 °R = 273.15 K = 0 °C'],
    [14.696, 'psia', 101325, 3, 'ASHRAE HoF Ch.1 Table 1: sea-level standard pressure 101.325 kPa = 14.696 psia'],
    [29.921, 'inHg', 101325, 3, 'common practice: standard barometer 29.92 inHg'],
    [1, 'atm', 101325, 0, 'NIST SP 811 (2008) B.8 (exact)'],
    [1.01325, 'bar', 101325, 1e-9, 'NIST SP 811 (2008) B.8 (exact)'],
    [1, 'ton', 3516.853, 5e-4, 'NIST SP 811 (2008) B.8: ton of refrigeration = 3.516 853 E+03 W (from memory)'],
    [12, 'MBH', 12000 * (BTU_IT / 3600), 1e-9, 'common practice: 1 ton = 12 MBH = 12 000 Btu/h'],
    [1000, 'L/s', 1, 1e-12, 'NIST SP 811 (2008) B.8: 1000 L = 1 m³'],
    [3600, 'm3/h', 1, 1e-12, 'hour = 3600 s'],
    [5280, 'ft', 1609.344, 1e-9, 'NIST SP 811 (2008) B.8: mile = 1.609 344 E+03 m (exact)'],
  ];
  it.each(anchors)('%d %s = %d in the SI base (%s)', (value, symbol, si, tol) => {
    expect(Math.abs(toSI(value, unit(symbol)) - si)).toBeLessThanOrEqual(tol);
  });
});

describe('round trips (fast-check, seeded)', () => {
  const params = { seed: 20261201, numRuns: 300 };
  const cases = UNITS.map((u) => [u.symbol, u] as const);

  it.each(cases)('%s: fromSI(toSI(x)) = x and toSI(fromSI(s)) = s (exact arithmetic; 1e-12 relative)', (_s, u) => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
        const back = fromSI(toSI(x, u), u);
        const tolUnit = 1e-12 * (1 + Math.abs(x) + Math.abs(u.offset / u.scale));
        const there = toSI(fromSI(x, u), u);
        const tolSI = 1e-12 * (1 + Math.abs(x) + Math.abs(u.offset));
        return Math.abs(back - x) <= tolUnit && Math.abs(there - x) <= tolSI;
      }),
      params,
    );
  });

  it.each(cases)('%s: a difference converts with the scale alone (deltaToSI(a − b) = toSI(a) − toSI(b))', (_s, u) => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        (a, b) => {
          const direct = toSI(a, u) - toSI(b, u);
          const viaDelta = deltaToSI(a - b, u);
          const tol = 1e-11 * (1 + Math.abs(a * u.scale) + Math.abs(b * u.scale) + Math.abs(u.offset));
          const inverse = deltaFromSI(deltaToSI(a - b, u), u);
          return Math.abs(direct - viaDelta) <= tol && Math.abs(inverse - (a - b)) <= 1e-12 * (1 + Math.abs(a - b));
        },
      ),
      params,
    );
  });
});

describe('enthalpy datums: Btu/lb has dry air 0 at 0 °F, kJ/kg at 0 °C', () => {
  // PsychroLib (devDependency, test oracle only) implements the ASHRAE HoF 2017 Ch.1 equations in
  // both unit systems: SI h = 1.006 t + W(2501 + 1.86 t) kJ/kg, I-P h = 0.240 t + W(1061 + 0.444 t)
  // Btu/lb. The I-P dry-air coefficient 0.240 Btu/(lb·°F) is 1004.8 J/(kg·K), not 1006, so an
  // exact conversion of the SI figure and the I-P equation differ by up to ~0.035 Btu/lb at
  // 50 °C; tolerance 0.05 Btu/lb over −40…60 °C.
  interface Psychro {
    SI: number;
    IP: number;
    SetUnitSystem(system: number): void;
    GetDryAirEnthalpy(t: number): number;
    GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
    GetMoistAirEnthalpy(t: number, w: number): number;
  }
  const psy = createRequire(import.meta.url)('psychrolib') as Psychro;
  const F = unit('F');
  const btu = unit('Btu/lb');
  const kj = unit('kJ/kg');

  it('dry air at 0 °F is 0 Btu/lb = −1.006 × 160/9 = −17.884 kJ/kg on the 0 °C datum (ASHRAE HoF Ch.1)', () => {
    const t0F = toSI(0, F);
    expect(Math.abs(toSI(0, btu) - 1006 * t0F)).toBeLessThan(1e-9);
    expect(Math.abs(fromSI(toSI(0, btu), kj) - -17.884)).toBeLessThan(0.0005);
  });

  it('dry air at 0 °C (0 kJ/kg) is about 7.68 Btu/lb = 0.240 × 32 (ASHRAE HoF 2017 Ch.1 I-P, PsychroLib)', () => {
    psy.SetUnitSystem(psy.IP);
    expect(Math.abs(fromSI(0, btu) - psy.GetDryAirEnthalpy(32))).toBeLessThan(0.02);
  });

  const dryAir: [number][] = [[-40], [-10], [0], [20], [35], [50], [60]];
  it.each(dryAir)(
    'dry air at %d °C: converted SI enthalpy matches the I-P equation ' +
      'within 0.05 Btu/lb (ASHRAE HoF 2017 Ch.1 via PsychroLib)',
    (tC) => {
      psy.SetUnitSystem(psy.SI);
      const hSI = psy.GetDryAirEnthalpy(tC);
      psy.SetUnitSystem(psy.IP);
      const hIP = psy.GetDryAirEnthalpy(fromSI(tC, F));
      expect(Math.abs(fromSI(hSI, btu) - hIP)).toBeLessThan(0.05);
    },
  );

  it(
    '24 °C / 50 % at sea level: about 47.81 kJ/kg and 28.2 Btu/lb, ' +
      'not 20.6 (ASHRAE HoF 2017 Ch.1 via PsychroLib; common practice)',
    () => {
      psy.SetUnitSystem(psy.SI);
      const hSI = psy.GetMoistAirEnthalpy(24, psy.GetHumRatioFromRelHum(24, 0.5, 101325));
      psy.SetUnitSystem(psy.IP);
      const tF = fromSI(24, F);
      const hIP = psy.GetMoistAirEnthalpy(tF, psy.GetHumRatioFromRelHum(tF, 0.5, fromSI(101325, unit('psia'))));

      expect(Math.abs(fromSI(hSI, kj) - 47.81)).toBeLessThan(0.01);
      const converted = fromSI(hSI, btu);
      expect(Math.abs(converted - 28.2)).toBeLessThan(0.1);
      expect(Math.abs(converted - hIP)).toBeLessThan(0.05);
      // The naive unit-only conversion is ~7.7 Btu/lb off: the datum matters.
      expect(Math.abs(hSI / 2326 - 20.6)).toBeLessThan(0.1);
      expect(converted - hSI / 2326).toBeGreaterThan(7.6);
      expect(formatQuantity(hSI, 'enthalpy', 'IP').text).toMatch(/^28\.2\d Btu\/lb$/);
      expect(formatQuantity(hSI, 'enthalpy', 'SI').text).toBe('47.81 kJ/kg');
    },
  );

  it(
    'an enthalpy difference converts without the datum: 23.26 kJ/kg ' +
      'is 10 Btu/lb (NIST SP 811 B.8: 2.326 kJ/kg per Btu/lb)',
    () => {
      expect(Math.abs(deltaFromSI(23260, btu) - 10)).toBeLessThan(1e-12);
      expect(Math.abs(fromSI(23260, btu) - fromSI(0, btu) - 10)).toBeLessThan(1e-12);
    },
  );
});

describe('lookup is case-sensitive and exact', () => {
  const cases: [string, string | undefined][] = [
    ['kPa', 'kPa'],
    ['KPA', undefined],
    ['kpa', undefined],
    ['Kpa', undefined],
    ['C', 'C'],
    ['c', undefined],
    ['°C', 'C'],
    ['degC', undefined],
    ['F', 'F'],
    ['f', undefined],
    ['K', 'K'],
    ['k', undefined],
    ['g/kg', 'g/kg'],
    ['g/Kg', undefined],
    ['gr/lb', 'gr/lb'],
    ['gr/lbm', undefined],
    ['cfm', 'cfm'],
    ['CFM', undefined],
    ['L/s', 'L/s'],
    ['l/s', 'L/s'],
    ['Btu/hr', 'Btu/h'],
    ['BTU/h', undefined],
    ['btu/lb', undefined],
    ['MBH', 'MBH'],
    ['mbh', undefined],
    ['TR', 'ton'],
    ['tons', undefined],
    ['psig', undefined],
    ['', undefined],
    [' kPa', undefined],
    ['kPa ', undefined],
  ];
  it.each(cases)('lookupUnit(%j) → %s', (text, expected) => {
    expect(lookupUnit(text)?.symbol).toBe(expected);
  });
});

describe('suggestions for unknown units', () => {
  const cases: [string, Dimension[] | undefined, string | undefined][] = [
    ['deg C', undefined, 'C'],
    ['degC', undefined, 'C'],
    ['degF', undefined, 'F'],
    ['deg F', ['temperature'], 'F'],
    ['c', ['temperature'], 'C'],
    ['f', undefined, 'F'],
    ['°K', undefined, 'K'],
    ['Celsius', undefined, 'C'],
    ['kpa', undefined, 'kPa'],
    ['KPA', ['pressure'], 'kPa'],
    ['PSIA', undefined, 'psia'],
    ['g/Kg', undefined, 'g/kg'],
    ['G/KG', ['humidityRatio'], 'g/kg'],
    ['gr/lbm', undefined, 'gr/lb'],
    ['grains/lb', undefined, 'gr/lb'],
    ['g/kg_da', undefined, 'g/kg'],
    ['kj/kg', undefined, 'kJ/kg'],
    ['BTU/LB', undefined, 'Btu/lb'],
    ['btu/hr', undefined, 'Btu/h'],
    ['CFM', undefined, 'cfm'],
    ['l/s', undefined, 'L/s'],
    ['lps', undefined, undefined],
    ['m^3/s', undefined, 'm3/s'],
    ['kgs', undefined, 'kg/s'],
    ['lbs/hr', undefined, 'lb/h'],
    ['tons', undefined, 'ton'],
    ['psai', undefined, 'psia'],
    ['%RH', undefined, '%'],
    ['kw', ['power'], 'kW'],
    // no suggestion: gauge or water-column pressures are not typos of accepted units
    ['psig', undefined, undefined],
    ['inWG', undefined, undefined],
    ['in. w.g.', undefined, undefined],
    // no suggestion: too short or too far to guess
    ['kg', undefined, undefined],
    ['Btu', undefined, undefined],
    ['cmh', undefined, undefined],
    ['xyz', undefined, undefined],
    ['', undefined, undefined],
    // no suggestion: a unit of another dimension is a wrong unit, not a typo
    ['kPa', ['temperature'], undefined],
    ['kJ/kg', ['humidityRatio'], undefined],
    ['kj/kg', ['humidityRatio'], undefined],
    ['c', ['pressure'], undefined],
    ['kpa', [], undefined],
  ];
  it.each(cases)('suggestUnit(%j, %j) → %s', (text, dims, expected) => {
    expect(suggestUnit(text, dims)).toBe(expected);
  });
  it('every suggestion is a canonical symbol that lookupUnit knows', () => {
    for (const [text, dims] of cases) {
      const s = suggestUnit(text, dims);
      if (s !== undefined) expect(lookupUnit(s)?.symbol).toBe(s);
    }
  });
});

describe('display units', () => {
  const cases: [Dimension, UnitSystem, string, string][] = [
    ['temperature', 'SI', 'C', '°C'],
    ['pressure', 'SI', 'kPa', 'kPa'],
    ['humidityRatio', 'SI', 'g/kg', 'g/kg'],
    ['enthalpy', 'SI', 'kJ/kg', 'kJ/kg'],
    ['specificVolume', 'SI', 'm3/kg', 'm³/kg'],
    ['length', 'SI', 'm', 'm'],
    ['massFlow', 'SI', 'kg/s', 'kg/s'],
    ['volumeFlow', 'SI', 'm3/s', 'm³/s'],
    ['power', 'SI', 'kW', 'kW'],
    ['fraction', 'SI', '%', '%'],
    ['density', 'SI', 'kg/m3', 'kg/m³'],
    ['temperature', 'IP', 'F', '°F'],
    ['pressure', 'IP', 'psia', 'psia'],
    ['humidityRatio', 'IP', 'gr/lb', 'gr/lb'],
    ['enthalpy', 'IP', 'Btu/lb', 'Btu/lb'],
    ['specificVolume', 'IP', 'ft3/lb', 'ft³/lb'],
    ['length', 'IP', 'ft', 'ft'],
    ['massFlow', 'IP', 'lb/h', 'lb/h'],
    ['volumeFlow', 'IP', 'cfm', 'cfm'],
    ['power', 'IP', 'Btu/h', 'Btu/h'],
    ['fraction', 'IP', '%', '%'],
    ['density', 'IP', 'lb/ft3', 'lb/ft³'],
  ];
  it.each(cases)('%s in %s: %s, shown as %s', (d, system, symbol, shown) => {
    const u = displayUnit(d, system);
    expect(u.symbol).toBe(symbol);
    expect(u.dimension).toBe(d);
    expect(displaySymbol(u)).toBe(shown);
  });
  it('every dimension has a display unit in both systems', () => {
    expect(cases.length).toBe(DIMENSIONS.length * 2);
  });
});

describe('formatQuantity: engineering precision, no -0, no NaN', () => {
  // [SI value, dimension, system, expected text, source of the number]
  const cases: [number, Dimension, UnitSystem, string, string][] = [
    [24, 'temperature', 'SI', '24.0 °C', 'project precision: temperatures to 0.1'],
    [24, 'temperature', 'IP', '75.2 °F', 'NIST SP 811 B.9: 24 × 1.8 + 32 = 75.2'],
    [-160 / 9, 'temperature', 'IP', '0.0 °F', 'NIST SP 811 B.9: 0 °F exactly; never "-0.0"'],
    [-40, 'temperature', 'IP', '−40.0 °F', 'NIST SP 811 B.9: −40 °C = −40 °F'],
    [-1e-9, 'temperature', 'SI', '0.0 °C', 'no "-0.0"'],
    [-0.04, 'temperature', 'SI', '0.0 °C', 'no "-0.0" after rounding'],
    [-0.05, 'temperature', 'SI', '−0.1 °C', 'half away from zero'],
    [0.05, 'temperature', 'SI', '0.1 °C', 'half away from zero (0.05 is not 0.0499…)'],
    [0.15, 'temperature', 'SI', '0.2 °C', 'half away from zero (0.15 is stored as 0.1499…)'],
    [0.0005, 'fraction', 'SI', '0.1 %', 'half away from zero: 0.05 %'],
    [0.496, 'fraction', 'SI', '49.6 %', 'project precision: rh to 0.1 %'],
    [1, 'fraction', 'IP', '100.0 %', 'percent'],
    [0.009299, 'humidityRatio', 'SI', '9.30 g/kg', 'project precision: g/kg to 0.01'],
    [0.009299, 'humidityRatio', 'IP', '65.1 gr/lb', '7000 gr/lb per lb/lb (NIST SP 811 B.8)'],
    [1005, 'enthalpy', 'SI', '1.01 kJ/kg', 'half away from zero: 1.005 (a binary-rounding trap)'],
    [2675, 'enthalpy', 'SI', '2.68 kJ/kg', 'half away from zero: 2.675 (a binary-rounding trap)'],
    [-17884.444444444445, 'enthalpy', 'IP', '0.00 Btu/lb', 'ASHRAE HoF Ch.1 datum: dry air at 0 °F'],
    [47810, 'enthalpy', 'IP', '28.24 Btu/lb', 'ASHRAE HoF Ch.1 datums: (47 810 + 17 884.4)/2326 = 28.2435'],
    [101325, 'pressure', 'SI', '101.325 kPa', 'standard atmosphere, 0.001 kPa'],
    [101325, 'pressure', 'IP', '14.696 psia', 'ASHRAE HoF Ch.1 Table 1: 14.696 psia'],
    [0.8544, 'specificVolume', 'SI', '0.8544 m³/kg', 'project precision: 4 decimals'],
    [0.8544, 'specificVolume', 'IP', '13.69 ft³/lb', 'NIST SP 811 B.8 ft³/lb, 2 decimals'],
    [1.184, 'density', 'SI', '1.184 kg/m³', 'project precision: 3 decimals'],
    [1600, 'length', 'IP', '5249 ft', '1600 / 0.3048 = 5249.3 (NIST SP 811 B.8)'],
    [98070, 'power', 'SI', '98.1 kW', 'project precision: 3 significant figures'],
    [5234, 'power', 'SI', '5.2 kW', 'project precision: never finer than 0.1 kW'],
    [99960, 'power', 'SI', '100 kW', '3 significant figures after rounding up'],
    [1234500, 'power', 'SI', '1230 kW', '3 significant figures'],
    [40, 'power', 'SI', '0.0 kW', 'below the 0.1 kW step'],
    [-26200, 'power', 'SI', '−26.2 kW', 'negative heat rate (cooling)'],
    [3516.8528420666667, 'power', 'IP', '12000 Btu/h', 'common practice: 1 ton = 12 000 Btu/h'],
    [5.6, 'massFlow', 'SI', '5.60 kg/s', '3 significant figures'],
    [0.0107, 'massFlow', 'SI', '0.0107 kg/s', '3 significant figures (condensate)'],
    [5.6, 'massFlow', 'IP', '44400 lb/h', '5.6 × 3600 / 0.45359237 = 44 445 (NIST SP 811 B.8)'],
    [4.8, 'volumeFlow', 'SI', '4.80 m³/s', '3 significant figures'],
    [4.8, 'volumeFlow', 'IP', '10200 cfm', '4.8 / 4.719474e−4 = 10 171 (NIST SP 811 B.8)'],
    [0, 'volumeFlow', 'SI', '0.00 m³/s', 'zero at 3 significant figures'],
  ];
  it.each(cases)('%d (%s, %s) → %j (%s)', (si, d, system, text) => {
    const f = formatQuantity(si, d, system);
    expect(f.text).toBe(text);
    expect(f.text.startsWith(f.valueText)).toBe(true);
    expect(f.unit).toBe(displayUnit(d, system));
  });

  const nonFinite: [number][] = [[NaN], [Infinity], [-Infinity]];
  it.each(nonFinite)('%d prints the placeholder, never NaN or Infinity', (x) => {
    for (const d of DIMENSIONS) {
      for (const system of ['SI', 'IP'] as const) {
        const f = formatQuantity(x, d, system);
        expect(f.valueText).toBe(NO_VALUE);
        expect(f.text).not.toMatch(/NaN|Infinity/);
      }
    }
  });

  it('no result ever prints NaN, Infinity or "-0" (fast-check, seeded)', () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: false }),
        fc.constantFrom(...DIMENSIONS),
        fc.constantFrom<UnitSystem>('SI', 'IP'),
        (x, d, system) => {
          const t = formatQuantity(x, d, system).valueText;
          return !/NaN|Infinity/.test(t) && !/^-0(\.0*)?$/.test(t);
        },
      ),
      { seed: 20261201, numRuns: 2000 },
    );
  });

  it('digits overrides the decimals; unit overrides the display unit', () => {
    expect(formatQuantity(24, 'temperature', 'SI', { digits: 3 }).text).toBe('24.000 °C');
    expect(formatQuantity(24, 'temperature', 'SI', { unit: unit('K') }).text).toBe('297.2 K'); // NIST SP 811 4.2.1.1
    expect(formatQuantity(0.0107, 'massFlow', 'SI', { unit: unit('kg/h') }).text).toBe('38.5 kg/h'); // 0.0107 × 3600
    // 98.07 kW / 3.516853 kW = 27.89 (NIST SP 811 B.8)
    expect(formatQuantity(98070, 'power', 'IP', { unit: unit('ton') }).text).toBe('27.9 ton');
  });

  it('a unit of another dimension is a programming error (RangeError), not a silent mis-format', () => {
    expect(() => formatQuantity(24, 'temperature', 'SI', { unit: unit('kPa') })).toThrow(RangeError);
  });
});

describe('formatInUnit: a computed value in the claim’s unit and precision, notation form', () => {
  // [SI value, unit, resolution of the claim, symbol as written, expected]
  const cases: [number, string, number | undefined, string | undefined, string][] = [
    [0.496, '%', 1, undefined, '49.6%'], // claim rh=50% → the finer default 0.1 % wins
    [0.00931, 'g/kg', 0.01, undefined, '9.31g/kg'], // claim w=9.30g/kg
    [23.98, 'C', 0.01, '°C', '23.98°C'], // claim db=24.00°C
    [23.98, 'C', 1, undefined, '24.0C'], // claim db=24C → default 0.1
    [23.98, 'C', undefined, undefined, '24.0C'],
    [24, 'F', 0.1, undefined, '75.2F'], // NIST SP 811 B.9
    [101325, 'kPa', 0.1, undefined, '101.325kPa'],
    [4.8, 'cfm', 1, undefined, '10171cfm'], // 4.8 / 4.719474e−4 (NIST SP 811 B.8), claim to 1 cfm
    [4.8, 'cfm', 100, undefined, '10200cfm'], // claim 1.0e4cfm → 3 significant figures
    [0.009299, 'kg/kg', 0.000001, undefined, '0.009299kg/kg'],
    [47810, 'Btu/lb', 0.1, undefined, '28.24Btu/lb'], // ASHRAE HoF Ch.1 datums, see above
    [-0.0001, 'C', 0.1, undefined, '0.0C'], // never "-0.0"
    [NaN, '%', 1, undefined, '—%'],
    [Infinity, 'kW', undefined, undefined, '—kW'],
  ];
  it.each(cases)('%d in %s at resolution %s (written %s) → %j', (si, symbol, resolution, written, expected) => {
    expect(formatInUnit(si, unit(symbol), resolution, written)).toBe(expected);
  });
});

describe('descriptions for hovers', () => {
  it.each(DIMENSIONS.map((d) => [d]))('dimensionTitle(%s) is one non-empty line', (d) => {
    const t = dimensionTitle(d);
    expect(t.length).toBeGreaterThan(5);
    expect(t).not.toContain('\n');
  });
  it('dimension titles are distinct', () => {
    expect(new Set(DIMENSIONS.map(dimensionTitle)).size).toBe(DIMENSIONS.length);
  });

  const spellings = UNITS.flatMap((u) => [u.symbol, ...u.aliases].map((s) => [s, u] as const));
  it.each(spellings)('describeUnit(%j) gives two lines naming the unit and its dimension', (s, u) => {
    const text = describeUnit(s);
    expect(text).toBeDefined();
    const lines = (text ?? '').split('\n');
    expect(lines.length).toBe(2);
    expect(lines[0]).toContain(displaySymbol(u));
    expect(lines[0]).toContain(u.title);
    expect(lines[0]).toContain(dimensionTitle(u.dimension));
  });

  const notes: [string, string][] = [
    ['Btu/lb', '0 °F'],
    ['Btu/lb', '2.326'],
    ['F', '5/9'],
    ['psi', 'absolute'],
    ['ft', '0.3048 m'], // NIST SP 811 B.8, exact
    ['cfm', '0.0004719474'], // NIST SP 811 B.8
    ['kPa', '1000 Pa'],
    ['C', 'SI base'],
  ];
  it.each(notes)('describeUnit(%j) mentions %j', (s, fragment) => {
    expect(describeUnit(s)).toContain(fragment);
  });
  it('describeUnit of an unknown symbol is undefined', () => {
    expect(describeUnit('KPA')).toBeUndefined();
    expect(describeUnit('')).toBeUndefined();
  });
});
