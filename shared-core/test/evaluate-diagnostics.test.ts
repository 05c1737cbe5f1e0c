/**
 * Every evaluator diagnostic: its stable code, severity and the exact token it underlines, with a
 * message that says what to change. Data-driven: `check(lines, expected)`.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, spanText, stateResult, withCode } from './evaluate-helpers';

interface Expected {
  code: string;
  severity: 'error' | 'warning' | 'info';
  /** The text the diagnostic underlines. */
  span: string;
  /** Words the message must contain. */
  says?: string[];
}

function check(lines: string[], e: Expected): void {
  const src = fence(...lines);
  const a = analyse(src);
  const ds = withCode(a, e.code);
  expect(
    ds.length,
    `${e.code} in ${JSON.stringify(a.diagnostics.map((d) => `${d.code}: ${d.message}`))}`,
  ).toBeGreaterThanOrEqual(1);
  const d = ds[0]!;
  expect(d.severity).toBe(e.severity);
  expect(spanText(src, d)).toBe(e.span);
  for (const w of e.says ?? []) expect(d.message).toContain(w);
}

const cases: [string, string[], Expected][] = [
  [
    'wet-bulb above dry-bulb',
    ['state A: db=20C wb=25C'],
    { code: 'wb-above-db', severity: 'error', span: 'db=20C wb=25C' },
  ],
  [
    'dew point above dry-bulb',
    ['state A: db=20C dp=25C'],
    { code: 'dp-above-db', severity: 'error', span: 'db=20C dp=25C' },
  ],
  ['rh above 100 %', ['state A: db=20C rh=120%'], { code: 'rh-out-of-range', severity: 'error', span: 'rh=120%' }],
  ['negative rh', ['state A: db=20C rh=-5%'], { code: 'rh-out-of-range', severity: 'error', span: 'rh=-5%' }],
  [
    'w above saturation (fog)',
    ['state A: db=20C w=20g/kg'],
    { code: 'supersaturated', severity: 'warning', span: 'db=20C w=20g/kg' },
  ],
  [
    'negative w',
    ['state A: db=20C w=-1g/kg'],
    { code: 'negative-humidity-ratio', severity: 'error', span: 'w=-1g/kg' },
  ],
  [
    'enthalpy below bone-dry air',
    ['state A: db=30C h=10kJ/kg'],
    { code: 'enthalpy-too-low', severity: 'error', span: 'db=30C h=10kJ/kg' },
  ],
  [
    'wet-bulb far below dry-bulb',
    ['state A: db=40C wb=5C'],
    { code: 'wb-too-low', severity: 'error', span: 'db=40C wb=5C' },
  ],
  [
    'pressure below saturation',
    ['state A: db=90C rh=80% p=50kPa'],
    { code: 'pressure-below-saturation', severity: 'error', span: 'db=90C rh=80%' },
  ],
  [
    'temperature outside −100…200 °C',
    ['state A: db=250C rh=1%'],
    { code: 'out-of-range', severity: 'error', span: 'db=250C' },
  ],
  [
    'elevation outside the standard atmosphere',
    ['site: elev=20000m'],
    { code: 'out-of-range', severity: 'error', span: '20000m' },
  ],
  [
    'wb with h (ill-conditioned)',
    ['state A: wb=17C h=47.5kJ/kg'],
    { code: 'ill-conditioned', severity: 'warning', span: 'wb=17C h=47.5kJ/kg' },
  ],
  [
    'a pair with no state',
    ['state A: wb=17C h=48kJ/kg'],
    { code: 'no-solution', severity: 'error', span: 'wb=17C h=48kJ/kg' },
  ],
  [
    'missing temperature unit',
    ['state A: db=24 rh=50%'],
    { code: 'missing-unit', severity: 'error', span: '24', says: ['24C', '24F'] },
  ],
  ['bare rh', ['state A: db=24C rh=50'], { code: 'missing-unit', severity: 'error', span: '50', says: ['50%'] }],
  [
    'bare rh as a fraction',
    ['state A: db=24C rh=0.5'],
    { code: 'missing-unit', severity: 'error', span: '0.5', says: ['50%'] },
  ],
  [
    'unknown unit with a suggestion',
    ['state A: db=24degC rh=50%'],
    { code: 'unknown-unit', severity: 'error', span: 'degC', says: ['db=24C'] },
  ],
  [
    'unit of the wrong kind',
    ['state A: db=24kPa rh=50%'],
    { code: 'unknown-unit', severity: 'error', span: 'kPa', says: ['pressure'] },
  ],
  [
    'unknown key with a suggestion',
    ['state A: db=24C rhh=50%'],
    { code: 'unknown-key', severity: 'error', span: 'rhh', says: ['rh'] },
  ],
  ['duplicate key', ['state A: db=24C rh=50% db=25C'], { code: 'duplicate-key', severity: 'error', span: 'db' }],
  [
    'dependent pair',
    ['state A: dp=10C w=7.7g/kg'],
    { code: 'dependent-pair', severity: 'error', span: 'dp=10C w=7.7g/kg', says: ['db or wb'] },
  ],
  ['underspecified', ['state A: db=24C'], { code: 'underspecified', severity: 'error', span: 'A' }],
  ['empty site', ['site:'], { code: 'underspecified', severity: 'error', span: 'site' }],
  [
    'duplicate name',
    ['state A: db=24C rh=50%', 'state A: db=25C rh=50%'],
    { code: 'duplicate-name', severity: 'error', span: 'A' },
  ],
  [
    'unknown one-letter name: no guess, says how to define it',
    ['state A: db=24C rh=50%', 'mix M: Z 50% + A 50%'],
    { code: 'unknown-name', severity: 'error', span: 'Z', says: ['define it with a state line above'] },
  ],
  [
    'unknown name with did-you-mean',
    ['state OA: db=24C rh=50%', 'state RA: db=24C rh=50%', 'mix MA: OX 50% + RA 50%'],
    { code: 'unknown-name', severity: 'error', span: 'OX', says: ["did you mean 'OA'"] },
  ],
  [
    'used before defined',
    ['state RA: db=24C rh=50%', 'mix MA: OA 50% + RA 50%', 'state OA: db=30C rh=40%'],
    { code: 'used-before-defined', severity: 'error', span: 'OA', says: ['line 6'] },
  ],
  [
    'mix fractions',
    ['state OA: db=24C rh=50%', 'state RA: db=24C rh=50%', 'mix MA: OA 50% + RA 40%'],
    { code: 'mix-fractions', severity: 'error', span: '50% + RA 40%', says: ['90 %'] },
  ],
  [
    'mix of fractions and flows',
    ['state OA: db=24C rh=50%', 'state RA: db=24C rh=50%', 'mix MA: OA 50% + RA 1kg/s'],
    { code: 'mix-amounts', severity: 'error', span: 'OA 50% + RA 1kg/s' },
  ],
  [
    'stale claim',
    ['state A: db=24C rh=50% w=5g/kg'],
    { code: 'claim-mismatch', severity: 'warning', span: '5', says: ['g/kg'] },
  ],
  [
    'impossible process',
    ['state A: db=20C w=8g/kg', 'state B: db=30C w=6g/kg', 'process P: A -> B'],
    { code: 'impossible-process', severity: 'error', span: 'B' },
  ],
  [
    'process name used as a state',
    ['state A: db=20C w=8g/kg', 'state B: db=30C w=8g/kg', 'process P: A -> B', 'process Q: P -> B'],
    { code: 'not-a-state', severity: 'error', span: 'P' },
  ],
  [
    'unknown unit system',
    ['units: metric'],
    { code: 'unknown-unit-system', severity: 'error', span: 'metric', says: ['SI'] },
  ],
  [
    'pressure conflict',
    ['site: p=90kPa elev=1000m'],
    { code: 'pressure-conflict', severity: 'warning', span: 'elev=1000m' },
  ],
  ['unusual pressure', ['site: p=101.325Pa'], { code: 'unusual-pressure', severity: 'warning', span: '101.325Pa' }],
  [
    'flow conflict',
    ['state A: db=20C w=8g/kg', 'state B: db=30C w=8g/kg', 'process P: A -> B m=1kg/s q=1m3/s'],
    { code: 'flow-conflict', severity: 'error', span: 'q=1m3/s' },
  ],
  [
    'missing flow for a rate claim',
    ['state A: db=20C w=8g/kg', 'state B: db=30C w=8g/kg', 'process P: A -> B q_total=10kW'],
    { code: 'missing-flow', severity: 'warning', span: 'q_total' },
  ],
  [
    'failed dependency',
    ['state A: db=20C wb=25C', 'state B: db=30C w=8g/kg', 'process P: A -> B'],
    { code: 'unresolved-dependency', severity: 'info', span: 'A' },
  ],
];

describe('diagnostics', () => {
  for (const [name, lines, e] of cases) it(`${e.code}: ${name}`, () => check(lines, e));
});

describe('no cascades', () => {
  it('one failed state gives one error; its users give infos only', () => {
    const a = analyse(
      fence(
        'state A: db=20C wb=25C',
        'state B: db=24C rh=50%',
        'mix M: A 50% + B 50%',
        'process P: A -> B m=1kg/s',
        'process Q: M -> B m=1kg/s',
      ),
    );
    expect(a.diagnostics.filter((d) => d.severity !== 'info').map((d) => d.code)).toEqual(['wb-above-db']);
  });
  it('a bad statement does not stop the ones after it', () => {
    const a = analyse(fence('state A: db=24 rh=50%', 'state B: db=24C rh=50%'));
    expect(stateResult(a, 'B').state).not.toBeNull();
  });
  it('diagnostics are in document order', () => {
    const a = analyse(fence('state B: db=24C rh=50% w=1g/kg', 'state A: db=20C wb=25C'));
    const starts = a.diagnostics.map((d) => d.span.start);
    expect([...starts].sort((x, y) => x - y)).toEqual(starts);
  });
  it('the duplicate points at the first definition', () => {
    const src = fence('state A: db=24C rh=50%', 'state A: db=25C rh=50%');
    const d = withCode(analyse(src), 'duplicate-name')[0]!;
    expect(d.related?.[0]?.span.start).toBe(src.indexOf('A:'));
  });
});
