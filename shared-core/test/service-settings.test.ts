/**
 * Settings as clients send them: defaults when absent, every bad value named and replaced, nested
 * or dotted keys, and the pressure an elevation implies.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_SERVICE_SETTINGS, readSettings, toEvaluateSettings } from '../src/service';

describe('settings', () => {
  it('uses the defaults for null, undefined or an empty object', () => {
    for (const raw of [null, undefined, {}])
      expect(readSettings(raw)).toEqual({ settings: DEFAULT_SERVICE_SETTINGS, problems: [] });
    // ASHRAE HoF 2017 SI Ch.1 Table 1, Z = 0
    expect(toEvaluateSettings(DEFAULT_SERVICE_SETTINGS).pressurePa).toBe(101325);
  });

  it('reads every setting, nested or with dotted keys', () => {
    const nested = readSettings({
      units: 'IP',
      pressure: '14.696 psia',
      inlayHints: { properties: ['v', 'rh'] },
      precision: 2,
      checkClaims: false,
      hover: { secondaryUnits: true },
    });
    const dotted = readSettings({
      units: 'IP',
      pressure: '14.696 psia',
      'inlayHints.properties': ['v', 'rh'],
      precision: 2,
      checkClaims: false,
      'hover.secondaryUnits': true,
    });
    expect(nested).toEqual(dotted);
    expect(nested.problems).toEqual([]);
    expect(nested.settings).toMatchObject({
      units: 'IP',
      hintProperties: ['v', 'rh'],
      extraDigits: 2,
      checkClaims: false,
      secondaryUnits: true,
    });
    // 14.696 psia × 6894.757 Pa/psi (NIST SP 811: lbf/in² exact from lb, g_n and in) = 101 325 Pa within 0.5 Pa.
    expect(Math.abs(toEvaluateSettings(nested.settings).pressurePa - 101325)).toBeLessThan(0.5);
    expect(toEvaluateSettings(nested.settings).pressureOrigin).toContain('setting dewmark.pressure = 14.696 psia');
  });

  it('turns an elevation into a standard-atmosphere pressure, and the elevation wins', () => {
    const { settings, problems } = readSettings({ pressure: '90 kPa', elevation: '1000 m' });
    expect(problems).toEqual([]);
    const e = toEvaluateSettings(settings);
    // ASHRAE HoF 2017 SI Ch.1 Table 1: 1000 m → 89 875 Pa (± 1 Pa).
    expect(Math.abs(e.pressurePa - 89875)).toBeLessThanOrEqual(1);
    expect(e.pressureOrigin).toContain('dewmark.elevation = 1000 m');
  });

  it.each([
    [{ units: 'metric' }, 'dewmark.units must be "SI" or "IP"'],
    [{ pressure: '101.325' }, 'has no unit'],
    [{ pressure: '101 kJ/kg' }, 'is not a unit of pressure'],
    [{ pressure: 'high' }, 'is not a number with a unit'],
    [{ elevation: '20000 m' }, 'dewmark.elevation'],
    [{ inlayHints: { properties: ['rh', 'enthalpy'] } }, '"enthalpy" is not one of'],
    [{ precision: 9 }, 'from 0 to 4'],
    [{ checkClaims: 'yes' }, 'must be true or false'],
    [42, 'must be an object'],
  ])('names a bad value and uses the default: %j', (raw, message) => {
    const { settings, problems } = readSettings(raw);
    expect(problems.join(' ')).toContain(message);
    expect(settings.units === 'SI' || settings.units === 'IP').toBe(true);
  });
});
