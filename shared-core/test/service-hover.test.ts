/**
 * Hover, as data: each case is a note with a `|` cursor and what the hover must (and must not)
 * say. Figures are checked against published values with the tolerances given beside them.
 */
import { describe, expect, it } from 'vitest';
import { hover, type ServiceSettings } from '../src/service';
import { air, marked, near, noteOf, tableValue } from './service-helpers';

/** A figure the hover table must show: key, expected value, tolerance, and where the value is from. */
interface Figure {
  key: string;
  value: number;
  tol: number;
  source: string;
}

interface Expected {
  /** Substrings the hover must contain. */
  contains?: string[];
  /** Substrings it must not contain. */
  absent?: string[];
  /** Figures read from the table's value column. */
  figures?: Figure[];
  /** The text of the span the hover is about. */
  spanText?: string;
}

function check(input: string, expected: Expected | null, settings: Partial<ServiceSettings> = {}): string {
  const { text, offsets } = marked(input);
  const note = noteOf(text, settings);
  const result = hover(note, offsets[0]!);
  if (expected === null) {
    expect(result).toBeNull();
    return '';
  }
  expect(result, 'a hover').not.toBeNull();
  const md = result!.markdown;
  for (const s of expected.contains ?? []) expect(md).toContain(s);
  for (const s of expected.absent ?? []) expect(md).not.toContain(s);
  for (const f of expected.figures ?? []) {
    const shown = tableValue(md, f.key);
    expect(near(shown, f.value, f.tol), `${f.key} shown ${shown}, expected ${f.value} ± ${f.tol} (${f.source})`).toBe(
      true,
    );
  }
  if (expected.spanText !== undefined) expect(text.slice(result!.span.start, result!.span.end)).toBe(expected.spanText);
  return md;
}

// ASHRAE HoF 2017 SI Ch.1 Example 1 (40 °C db, 20 °C wb, 101.325 kPa), tolerances as the PsychroLib
// test suite uses them for this example: W ±0.0001 kg/kg (= ±0.1 g/kg), dp ±0.5 °C, RH ±0.01,
// h ±100 J/kg (= ±0.1 kJ/kg), v ±1 %. The table shows rounded figures, so half a shown digit is added.
const EX1 = 'ASHRAE HoF 2017 SI Ch.1 Example 1';
const EX1_FIGURES: Figure[] = [
  { key: 'w', value: 6.5, tol: 0.1 + 0.005, source: EX1 },
  { key: 'h', value: 56.7, tol: 0.1 + 0.005, source: EX1 },
  { key: 'dp', value: 7, tol: 0.5 + 0.05, source: EX1 },
  { key: 'rh', value: 14, tol: 1 + 0.05, source: EX1 },
  { key: 'v', value: 0.896, tol: 0.896 * 0.01 + 0.00005, source: EX1 },
];

// ASHRAE HoF 2017 IP Ch.1 Example 1 (100 °F db, 65 °F wb, 14.696 psia), PsychroLib test-suite
// tolerances: W ±0.0001 lb/lb (= ±0.7 gr/lb), dp ±1 °F, RH ±0.01, h ±0.1 Btu/lb, v ±0.01 ft³/lb.
// The engine computes in SI and converts (the IP chapter's constants differ by up to ~0.2 % in W).
const EX1_IP = 'ASHRAE HoF 2017 IP Ch.1 Example 1';
const EX1_IP_FIGURES: Figure[] = [
  { key: 'w', value: 0.00523 * 7000, tol: 0.0001 * 7000 + 0.05, source: EX1_IP },
  { key: 'h', value: 29.8, tol: 0.1 + 0.005, source: EX1_IP },
  { key: 'dp', value: 40, tol: 1 + 0.05, source: EX1_IP },
  { key: 'rh', value: 13, tol: 1 + 0.05, source: EX1_IP },
  { key: 'v', value: 14.22, tol: 0.01 + 0.005, source: EX1_IP },
];

describe('hover on a state', () => {
  it(`shows every property of ${EX1} with its pressure basis, datum, method and caution`, () => {
    check(air('state O|A: db=40C wb=20C'), {
      spanText: 'OA',
      figures: EX1_FIGURES,
      contains: [
        '**state OA**',
        'Pressure: 101.325 kPa',
        'Enthalpy datum: dry air 0 at 0 °C; water vapour from liquid water at 0 °C.',
        'Method: ASHRAE Handbook—Fundamentals Ch. 1, ideal-gas; ice below 0 °C.',
        'Design aid only; verify against applicable codes and standards and a licensed engineer’s review.',
        // Figures first, value and unit in their own columns, two figures to a row.
        '| **state OA** | | | | | |',
        '| `db` | 40.0 | °C given | `rh` |',
        '| `wb` | 20.0 | °C given | `w` |',
      ],
    });
  });

  it(`shows ${EX1_IP} in IP units with the 0 °F datum and the state's own pressure`, () => {
    check(air('units: IP', 'state I|P1: db=100F wb=65F p=14.696psia'), {
      figures: EX1_IP_FIGURES,
      contains: [
        'Pressure: 14.696 psia',
        'Enthalpy datum: dry air 0 at 0 °F; water vapour from liquid water at 32 °F.',
        'gr/lb',
        'Btu/lb',
      ],
      absent: ['kJ/kg'],
    });
  });

  it('gives the pressure of a site elevation (ASHRAE HoF 2017 SI Ch.1 Table 1: 1000 m → 89 875 Pa ± 1 Pa)', () => {
    const md = check(air('site: elev=1000m', 'state S|1: db=20C rh=50%'), { contains: ['site'] });
    const m = /Pressure: (\d+\.\d+) kPa/.exec(md);
    expect(m).not.toBeNull();
    expect(near(Number(m![1]), 89.875, 0.001 + 0.0005)).toBe(true);
  });

  it('shows the pressure a site line sets (ASHRAE HoF 2017 SI Ch.1 Table 1: 1000 m → 89 875 Pa)', () => {
    const md = check(air('site: elev=10|00m', 'state S1: db=20C rh=50%'), {
      contains: ['**site** — ', 'standard atmosphere', 'psia'],
    });
    expect(near(Number(/— (\d+\.\d+) kPa/.exec(md)![1]), 89.875, 0.001 + 0.0005)).toBe(true);
  });

  it('shows the hover from the keyword and from a value too', () => {
    check(air('sta|te OA: db=40C wb=20C'), { contains: ['**state OA**'], figures: EX1_FIGURES.slice(0, 1) });
    check(air('state OA: db=4|0C wb=20C'), { contains: ['**state OA**'], spanText: '40C' });
  });

  it('marks claims with their verdicts: rh=14%±1 agrees with Example 1, rh=20% is stale', () => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1 gives RH 14 % for this state, so ±1 % holds and 20 % cannot.
    check(air('state O|A: db=40C wb=20C rh=14%±1'), { contains: ['| % ✓ |', '`rh=14%±1` ✓ computed'] });
    check(air('state O|A: db=40C wb=20C rh=20%'), {
      contains: ['| % ✗ |', '`rh=20%` ✗ computed', 'stale claim'],
    });
  });

  it('says claims are not checked when the setting is off', () => {
    check(
      air('state O|A: db=40C wb=20C rh=20%'),
      { contains: ['Claims: not checked'], absent: ['✗'] },
      { checkClaims: false },
    );
  });

  it('shows the other unit system as a second column on request', () => {
    const md = check(
      air('state O|A: db=40C wb=20C'),
      { contains: ['| **state OA** | SI | | IP | |', '°F', 'Btu/lb', 'dry air 0 at 0 °F'] },
      { secondaryUnits: true },
    );
    // 40 °C is exactly 104 °F (°F = °C × 9/5 + 32, by definition).
    expect(tableValue(md, 'db', true)).toBe(104);
  });

  it('shows more decimals with the precision setting', () => {
    check(air('state O|A: db=40C wb=20C'), { contains: ['| `db` | 40.00 | °C given |'] }, { extraDigits: 1 });
  });

  it('says why a state could not be computed', () => {
    check(air('state L|OG7: db=20C wb=25C'), { contains: ['Not computed', 'wet-bulb'], absent: ['| `w` |'] });
  });
});

describe('hover on references, mixes and processes', () => {
  it('shows the referenced state on a name in a mix', () => {
    check(air('state OA: db=40C wb=20C', 'state RA: db=24C rh=50%', 'mix MA: O|A 50% + RA 50%'), {
      contains: ['**state OA**'],
      spanText: 'OA',
      figures: EX1_FIGURES.slice(0, 2),
    });
  });

  it('shows a mix as streams and result; equal dry-air masses give the mean humidity ratio', () => {
    const text = air('state A: db=40C wb=20C', 'state B: db=24C rh=50%', 'mix M: A 50% + B 50%');
    const note = noteOf(text);
    const at = (needle: string) => text.indexOf(needle);
    const wA = tableValue(hover(note, at('A:'))!.markdown, 'w');
    const wB = tableValue(hover(note, at('B:'))!.markdown, 'w');
    const mix = hover(note, at('M:'))!.markdown;
    expect(mix).toContain('**mix M** — adiabatic mixing');
    expect(mix).toContain('| A | 50.0 % |');
    // Water balance of adiabatic mixing (ASHRAE HoF 2017 SI Ch.1, mixing of two moist-air streams):
    // W_mix = (m_A W_A + m_B W_B) / (m_A + m_B); with equal
    // dry-air masses, the mean (± rounding of three shown figures).
    expect(near(tableValue(mix, 'w'), (wA + wB) / 2, 0.015)).toBe(true);
  });

  it('shows a process: kind, flow, duties and SHR; the total is ṁ·(h_B − h_A)', () => {
    const text = air('state A: db=10C w=5g/kg', 'state B: db=30C w=5g/kg', 'process HC: A -> B m=2kg/s');
    const note = noteOf(text);
    const hA = tableValue(hover(note, text.indexOf('A:'))!.markdown, 'h');
    const hB = tableValue(hover(note, text.indexOf('B:'))!.markdown, 'h');
    const md = hover(note, text.indexOf('HC'))!.markdown;
    expect(md).toContain('**process HC** — sensible heating, A → B');
    expect(md).toContain('dry-air flow | 2.00 kg/s');
    // Steady-flow energy balance (from first principles): Q = ṁ (h_B − h_A), here 2 kg/s × Δh kJ/kg in kW.
    const total = /total heat \| ([\d.]+) kW added/.exec(md);
    expect(total).not.toBeNull();
    expect(near(Number(total![1]), 2 * (hB - hA), 0.05 + 2 * 0.01)).toBe(true);
    // Same humidity ratio in and out: no latent heat, SHR 1 (definition of the sensible heat ratio).
    expect(md).toContain('sensible heat ratio | 1.00');
    expect(md).toContain(METHOD);
  });
});

const METHOD = 'Method: ASHRAE Handbook—Fundamentals Ch. 1, ideal-gas; ice below 0 °C.';

describe('hover on keys, units and words', () => {
  it('explains a property key in one line', () => {
    check(air('state OA: w|b=20C db=40C'), {
      contains: ['`wb` — thermodynamic wet-bulb temperature (over ice below 0 °C).'],
      spanText: 'wb',
    });
  });

  it('explains a unit with its conversion', () => {
    check(air('state OA: db=40|C wb=20C'), { contains: ['degree Celsius'], spanText: 'C' });
    check(air('state X: db=75F h=28|Btu/lb'), { contains: ['Btu per pound of dry air', '0 °F'], spanText: 'Btu/lb' });
  });

  it('explains the units: line', () => {
    check(air('units: I|P', 'state A: db=75F rh=50%'), { contains: ['IP units', 'dry air 0 at 0 °F'] });
  });

  it('says nothing in prose or outside statements', () => {
    check('Plain pro|se about the air handler.\n', null);
    check(`${air('state A: db=24C rh=50%')}\nSome te|xt.\n`, null);
  });

  it('says a name is not defined before its use', () => {
    check(air('mix M: Q|Q 50% + RR 50%'), { contains: ['is not defined before this line'] });
  });
});
