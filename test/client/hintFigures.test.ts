/**
 * The reader the editor suites use on inline-hint labels (test/fixtures/e2e/expected.ts): it must
 * find each figure, allow only the source tolerance plus the shown rounding, and reject the rest.
 * Expected figures: ASHRAE HoF 2017 SI Ch.1 Example 1 (copied in expected.ts with tolerances).
 */
import { describe, expect, it } from 'vitest';
import { checkExample1, readFigure } from '../fixtures/e2e/expected';

describe('hint figure reader', () => {
  it('reads key, number and unit, with the rounding of the shown digits', () => {
    expect(readFigure('rh 14 % · w 6.4 g/kg · h 56.7 kJ/kg · dp 7.4 °C', 'w', 'g/kg')).toMatchObject({
      value: 6.4,
      halfStep: 0.05,
    });
    expect(readFigure('rh\u00a014\u00a0% · dp\u00a0\u22121.5\u00a0°C', 'dp', '°C')).toMatchObject({ value: -1.5 });
    expect(readFigure('rh 14 %', 'h', 'kJ/kg')).toBeNull();
    expect(readFigure('dp 7.4 °F', 'dp', '°C')).toBeNull();
  });

  it('passes figures within the ASHRAE HoF 2017 SI Ch.1 Example 1 tolerances and fails the others', () => {
    expect(checkExample1('rh 14 % · w 6.4 g/kg · h 56.7 kJ/kg · dp 7.4 °C')).toEqual([]);
    expect(checkExample1('rh 14 % · w 6.2 g/kg · h 56.7 kJ/kg · dp 7.4 °C')).toHaveLength(1);
    expect(checkExample1('rh 16 % · w 6.4 g/kg · h 58.1 kJ/kg · dp 7.4 °C')).toHaveLength(2);
    expect(checkExample1('rh 14 % · w 6.4 g/kg')).toHaveLength(2);
  });
});
