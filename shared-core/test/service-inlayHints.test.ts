/**
 * Inline hints, as data: a note, the range asked for (`|…|` markers, whole note when absent), and
 * the hints expected — where each goes (the text just before it) and what its label says.
 */
import { describe, expect, it } from 'vitest';
import { inlayHints, type ServiceSettings } from '../src/service';
import { air, hintFigure, marked, near, noteOf } from './service-helpers';

interface ExpectedHint {
  /** The document text just before the hint's position. */
  after: string;
  /** Substrings the label must contain. */
  contains?: string[];
  /** Substrings it must not contain. */
  absent?: string[];
  failed?: boolean;
}

function check(input: string, expected: ExpectedHint[], settings: Partial<ServiceSettings> = {}) {
  const { text, offsets } = marked(input);
  const note = noteOf(text, settings);
  const span = offsets.length >= 2 ? { start: offsets[0]!, end: offsets[1]! } : { start: 0, end: text.length };
  const hints = inlayHints(note, span);
  expect(hints.map((h) => h.label)).toHaveLength(expected.length);
  expected.forEach((e, i) => {
    const h = hints[i]!;
    expect(
      text.slice(0, h.offset).endsWith(e.after),
      `hint ${i} after "${e.after}", got "${text.slice(Math.max(0, h.offset - 30), h.offset)}"`,
    ).toBe(true);
    // Spaces inside a figure are no-break spaces (see the wrapping test); compare the words here.
    const label = h.label.replace(/\u00a0/g, ' ');
    for (const s of e.contains ?? []) expect(label).toContain(s);
    for (const s of e.absent ?? []) expect(label).not.toContain(s);
    if (e.failed !== undefined) expect(h.failed).toBe(e.failed);
    expect(h.label).not.toContain('\n');
  });
  return hints;
}

describe('inline hints', () => {
  it('shows rh, w, h and dp after a state given by db and wb (ASHRAE HoF 2017 SI Ch.1 Example 1)', () => {
    const [h] = check(air('state OA: db=40C wb=20C   # hot, dry intake air'), [
      { after: '# hot, dry intake air', contains: ['rh ', 'w ', 'h ', 'dp '], absent: ['db ', 'wb '], failed: false },
    ]);
    // ASHRAE HoF 2017 SI Ch.1 Example 1, PsychroLib test-suite tolerances, plus half a shown digit.
    const label = h!.label;
    expect(near(hintFigure(label, 'w', 'g/kg')!, 6.5, 0.1 + 0.005)).toBe(true);
    expect(near(hintFigure(label, 'h', 'kJ/kg')!, 56.7, 0.1 + 0.005)).toBe(true);
    expect(near(hintFigure(label, 'dp', '°C')!, 7, 0.5 + 0.05)).toBe(true);
    expect(near(hintFigure(label, 'rh', '%')!, 14, 1 + 0.05)).toBe(true);
  });

  it('leaves out what the note writes and shows wb where dp is written', () => {
    check(air('state RA: db=24C rh=50%'), [{ after: 'rh=50%', contains: ['w ', 'h ', 'dp '], absent: ['rh '] }]);
    check(air('state S: db=24C dp=12C'), [{ after: 'dp=12C', contains: ['wb ', 'rh '], absent: ['dp '] }]);
  });

  it('marks a failed claim with the computed value', () => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1 gives RH 14 % here, so the written 20 % fails.
    check(air('state OA: db=40C wb=20C rh=20%'), [{ after: 'rh=20%', contains: ['✗ rh is'], failed: true }]);
  });

  it('shows only the chosen properties, in IP when the note says so', () => {
    check(
      air('units: IP', 'state A: db=75F rh=50%'),
      [{ after: 'rh=50%', contains: ['v ', 'ft³/lb'], absent: ['w ', 'kJ/kg'] }],
      { hintProperties: ['v'] },
    );
  });

  it('puts the hint of an inline statement after the closing backtick', () => {
    check('The room is held at `state RA: db=24C rh=50%` in summer.\n', [
      { after: '`state RA: db=24C rh=50%`', contains: ['dp '] },
    ]);
  });

  it('gives a mix its mixed state and a process its kind, duty and SHR', () => {
    check(
      air('state A: db=10C w=5g/kg', 'state B: db=30C w=5g/kg', 'mix M: A 50% + B 50%', 'process HC: A -> B m=2kg/s'),
      [
        { after: 'w=5g/kg' },
        { after: 'w=5g/kg' },
        { after: 'B 50%', contains: ['db ', 'rh ', 'w ', 'h '] },
        { after: 'm=2kg/s', contains: ['sensible heating', 'kW added', 'SHR 1.00'] },
      ],
    );
  });

  it('gives only the statements in the requested range, and none for a state that failed', () => {
    check(
      air('state A: db=24C rh=50%', '|state B: db=20C wb=25C', 'state C: db=30C rh=40%|', 'state D: db=10C rh=40%'),
      [{ after: 'rh=40%' }],
    );
  });

  it('shows a process enthalpy change in Btu/lb by scale alone, without the datum offset', () => {
    // Independent computation from ASHRAE HoF 2017 SI Ch.1 eq 32, h = 1.006 t + W (2501 + 1.86 t):
    // A (30 °C, 10 g/kg) 55.748 kJ/kg, B (15 °C, 10 g/kg) 40.379 kJ/kg, so Δh = −15.369 kJ/kg
    // = −6.608 Btu/lb (1 Btu/lb = 2.326 kJ/kg, NIST SP 811). A difference takes no datum shift:
    // with it, the figure would read +1.08.
    const hints = check(air('units: IP', 'state A: db=30C w=10g/kg', 'state B: db=15C w=10g/kg', 'process P: A -> B'), [
      { after: 'w=10g/kg' },
      { after: 'w=10g/kg' },
      { after: 'A -> B', contains: ['Δh '] },
    ]);
    // Shown with the display minus sign, U+2212.
    const m = /Δh[ \u00a0](−?[0-9.]+)[ \u00a0]Btu\/lb/.exec(hints[2]!.label);
    expect(m, hints[2]!.label).not.toBeNull();
    expect(near(Number(m![1]!.replace('−', '-')), -6.608, 0.006)).toBe(true);
  });
  it('a heat recovery line speaks of its first stream, as written (the outdoor air it cools)', () => {
    // Hot outdoor air past a cooler exhaust on a sensible exchanger is cooled: the heat flows from
    // the warmer stream to the colder one (common practice). The line used to show the second
    // stream's process ("sensible heating · … added").
    check(
      air(
        'state OA: db=32C rh=30%',
        'state RA: db=24C rh=50%',
        'recover HX: OA -> OAHX m=1kg/s, RA -> EAHX m=1kg/s eff_s=0.7',
      ),
      [
        { after: 'rh=30%' },
        { after: 'rh=50%' },
        { after: 'eff_s=0.7', contains: ['sensible cooling', 'removed'], absent: ['heating', 'added'] },
      ],
    );
  });
});
