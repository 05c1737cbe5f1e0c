/**
 * The one grouping rule (`src/text/thousands.ts`): what display writes (IP figures, `units/`) and
 * what entry reads (`notation/number.ts`) agree, so every grouped figure shown reads back to the
 * number it shows. Grouping by threes with a comma: common practice in US engineering documents.
 */
import { describe, expect, it } from 'vitest';
import { scanNumber, withThousandsSeparators } from '../src/notation/number';
import { groupAt, groupDigits } from '../src/text/thousands';
import { figure } from '../src/units';
import type { Dimension } from '../src/units/types';

describe('the grouping rule', () => {
  it('groups a run of digits by threes from the right', () => {
    expect(groupDigits('1')).toBe('1');
    expect(groupDigits('999')).toBe('999');
    expect(groupDigits('1000')).toBe('1,000');
    expect(groupDigits('277262')).toBe('277,262');
    expect(groupDigits('1234567')).toBe('1,234,567');
  });

  it('reads a group only as a comma and exactly three digits', () => {
    const at = (text: string) => groupAt(text, 1, text.length);
    expect(at('8,745')).toBe(true);
    expect(at('8,745cfm')).toBe(true);
    expect(at('8,745.5')).toBe(true);
    expect(at('8,74')).toBe(false);
    expect(at('8,7456')).toBe(false);
    expect(at('8.745')).toBe(false);
    expect(at('8,7a5')).toBe(false);
    // The end of the range counts, not the end of the text.
    expect(groupAt('8,7456', 1, 5)).toBe(true);
  });
});

describe('display and entry agree on a group', () => {
  /** The number a shown figure's text stands for, without its grouping (U+2212 is a minus). */
  const plain = (text: string) => Number(text.replaceAll(',', '').replace('\u2212', '-'));

  const cases: [Dimension, number][] = [];
  for (const dimension of ['power', 'volumeFlow', 'massFlow', 'pressure', 'enthalpy'] as Dimension[])
    for (const si of [0.5, 12, 1234.5, 98_765, 1_234_567, 3.2e8, -45_678, -0.25]) cases.push([dimension, si]);

  it.each(cases)('an IP %s of %d (SI) is shown grouped and reads back whole', (dimension, si) => {
    const shown = figure(si, dimension, 'IP').value;
    const read = scanNumber(shown, 0, shown.length);
    expect(read.end, `${shown} is read as one number`).toBe(shown.length);
    expect(read.value).toBe(plain(shown));
    // Display groups every whole part of four digits or more; entry reads the same text.
    const whole = shown.replace(/^\u2212/, '').split('.')[0]!;
    expect(whole.includes(','), shown).toBe(whole.replaceAll(',', '').length >= 4);
  });

  it('writes an entered figure grouped the way it shows one', () => {
    for (const [si, dimension] of [
      [11_630, 'power'],
      [4.1, 'volumeFlow'],
    ] as const) {
      const shown = figure(si, dimension, 'IP').value;
      expect(withThousandsSeparators(shown.replaceAll(',', ''))).toBe(shown);
    }
  });
});
