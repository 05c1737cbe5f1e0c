/**
 * Values as the parser splits them: number (value, text, resolution), unit and tolerance. The
 * resolution is the notation's own definition (place value of the last written digit; half of it
 * is a claim's default tolerance) — not a physical figure, so no published source applies.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { QuantityNode } from '../src/notation/ast';
import { parseNote } from '../src/notation/parse';
import { resolutionOf, scanNumber } from '../src/notation/number';

interface Expected {
  value: number;
  text: string;
  resolution: number;
  unit?: string;
  tol?: number;
  tolUnit?: string;
}

/** The value written after `x=` in a state statement must split as expected. */
function check(written: string, e: Expected): void {
  const md = `\`\`\`air\nstate A: x=${written}\n\`\`\``;
  const parsed = parseNote(md);
  expect(
    parsed.diagnostics.map((d) => d.message),
    written,
  ).toEqual([]);
  const st = parsed.statements[0];
  const v: QuantityNode | null | undefined = st && st.keyword === 'state' ? st.props[0]?.value : undefined;
  expect(v, written).toBeTruthy();
  if (!v) return;
  expect(v.number.value, written).toBe(e.value);
  expect(v.number.text).toBe(e.text);
  expect(v.number.resolution, written).toBe(e.resolution);
  expect(v.unit?.text ?? null).toBe(e.unit ?? null);
  expect(v.tolerance?.number.value ?? null).toBe(e.tol ?? null);
  expect(v.tolerance?.unit?.text ?? null).toBe(e.tolUnit ?? null);
  expect(md.slice(v.span.start, v.span.end)).toBe(written);
}

describe('numbers', () => {
  it('reads integers, fractions and exponents with their resolution', () => {
    check('50', { value: 50, text: '50', resolution: 1 });
    check('9.30', { value: 9.3, text: '9.30', resolution: 0.01 });
    check('1.2e3', { value: 1200, text: '1.2e3', resolution: 100 });
    check('0.0093', { value: 0.0093, text: '0.0093', resolution: 0.0001 });
    check('1200', { value: 1200, text: '1200', resolution: 1 });
    check('1E-4', { value: 0.0001, text: '1E-4', resolution: 0.0001 });
    check('2.50e+2', { value: 250, text: '2.50e+2', resolution: 1 });
  });

  it('accepts .5 and 5., and signs (also the Unicode minus)', () => {
    check('.5', { value: 0.5, text: '.5', resolution: 0.1 });
    check('5.', { value: 5, text: '5.', resolution: 1 });
    check('-5', { value: -5, text: '-5', resolution: 1 });
    check('+5.5', { value: 5.5, text: '+5.5', resolution: 0.1 });
    check('\u22125.5', { value: -5.5, text: '\u22125.5', resolution: 0.1 });
  });

  it('gives the resolution as the nearest double to a power of ten', () => {
    expect(resolutionOf(2, 0)).toBe(0.01);
    expect(resolutionOf(4, 0)).toBe(0.0001);
    expect(resolutionOf(1, 3)).toBe(100);
    expect(resolutionOf(0, -40)).toBe(1e-40);
    expect(scanNumber('12.5e-1x', 0, 8)).toEqual({
      end: 7,
      written: '12.5e-1',
      value: 1.25,
      fractionDigits: 1,
      exponent: -1,
      resolution: 0.01,
      next: 0x78,
    });
    expect(scanNumber('\u22123', 0, 2)).toEqual({
      end: 2,
      written: '\u22123',
      value: -3,
      fractionDigits: 0,
      exponent: 0,
      resolution: 1,
      next: -1,
    });
    // The scan's own resolution is resolutionOf's of what it read, to the bit, near and far from 1.
    for (const text of ['0', '24', '9.30', '0.0093', '1.2e3', '5e-31', '5e30', '5e31', '1.5e-400', '1,234.567']) {
      const n = scanNumber(text, 0, text.length);
      expect(Object.is(n.resolution, resolutionOf(n.fractionDigits, n.exponent))).toBe(true);
    }
    expect(scanNumber('-1234567890123456789.5e-3', 0, 25).value).toBe(Number('-1234567890123456.7895'));
    expect(scanNumber('1e400', 0, 5).value).toBe(Infinity);
    // `next` is the character the number stops at, as the text has it (-1 at the end of the range).
    for (const [text, end, stop] of [
      ['5ex', 1, 'e'],
      ['5e+x', 1, 'e'],
      ['1,234C', 5, 'C'],
      ['1,23C', 1, ','],
      ['2.5%', 3, '%'],
      ['7.', 2, ''],
      ['3e2 ', 3, ' '],
      ['24C rh', 2, 'C'],
    ] as const) {
      const n = scanNumber(text, 0, text.length);
      expect([n.end, n.next]).toEqual([end, stop === '' ? -1 : stop.charCodeAt(0)]);
    }
    expect(scanNumber('24C', 0, 2).next).toBe(-1);
    expect(scanNumber('\u22121234567890123456789', 0, 20).value).toBe(Number('-1234567890123456789'));
  });

  it('gives every number the value Number() gives its text (correct rounding)', () => {
    const digits = fc.string({ unit: fc.constantFrom('0', '1', '2', '5', '7', '9'), minLength: 1, maxLength: 20 });
    const numberText = fc
      .tuple(fc.constantFrom('', '-', '+'), digits, fc.option(digits), fc.option(fc.integer({ min: -40, max: 40 })))
      .map(
        ([sign, int, frac, exp]) => `${sign}${int}${frac === null ? '' : `.${frac}`}${exp === null ? '' : `e${exp}`}`,
      );
    fc.assert(
      fc.property(numberText, (t) => {
        const n = scanNumber(t, 0, t.length);
        expect(n.end).toBe(t.length);
        expect(Object.is(n.value, Number(t))).toBe(true);
      }),
      { seed: 8675309, numRuns: 5000 },
    );
  });
});

describe('units and tolerances', () => {
  it('splits the unit written directly after the number', () => {
    check('24C', { value: 24, text: '24', resolution: 1, unit: 'C' });
    check('24°C', { value: 24, text: '24', resolution: 1, unit: '°C' });
    check('50%', { value: 50, text: '50', resolution: 1, unit: '%' });
    check('9.3g/kg', { value: 9.3, text: '9.3', resolution: 0.1, unit: 'g/kg' });
    check('4.8m3/s', { value: 4.8, text: '4.8', resolution: 0.1, unit: 'm3/s' });
    check('101.325kPa', { value: 101.325, text: '101.325', resolution: 0.001, unit: 'kPa' });
    // An `e` not followed by digits starts the unit.
    check('3em', { value: 3, text: '3', resolution: 1, unit: 'em' });
  });

  it('splits a tolerance written with ± or +-, with or without its own unit', () => {
    check('50%±2', { value: 50, text: '50', resolution: 1, unit: '%', tol: 2 });
    check('50%+-2', { value: 50, text: '50', resolution: 1, unit: '%', tol: 2 });
    check('24C±0.5C', { value: 24, text: '24', resolution: 1, unit: 'C', tol: 0.5, tolUnit: 'C' });
    check('0.0093±0.0001', { value: 0.0093, text: '0.0093', resolution: 0.0001, tol: 0.0001 });
    check('10kW±2%', { value: 10, text: '10', resolution: 1, unit: 'kW', tol: 2, tolUnit: '%' });
  });
});
