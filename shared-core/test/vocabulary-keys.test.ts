/**
 * The key table (`src/vocabulary/keys.ts`) is the one home of every key: each example it gives
 * parses, is evaluated without a key or unit problem, and is written in a unit of the key's own
 * dimension; the per-statement key sets, hint keys, hover rows and parser messages are read from
 * it (so a message can no longer suggest `shr=24C`).
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import { DEFINING_KEYS, MIX_KEYS, PROCESS_KEYS, SITE_KEYS, STATE_KEYS, SUPPLY_KEYS } from '../src/evaluate/keys';
import { DEFINING_KEYS as PHYSICS_DEFINING_KEYS } from '../src/physics';
import { parseNote } from '../src/notation/parse';
import type { PropertyNode, Statement } from '../src/notation/ast';
import { STATE_ROWS } from '../src/service/format';
import { HINT_KEYS } from '../src/service/types';
import { lookupUnit } from '../src/units';
import {
  type JsonKey,
  KEYS,
  type KeySpec,
  type KeyStatement,
  jsonField,
  jsonFigure,
  jsonFigureIn,
  jsonFigureOf,
  keySpec,
} from '../src/vocabulary/keys';

/** A note that writes `example` where a key of `statement` goes (A and B are defined states). */
function noteWith(statement: KeyStatement, example: string): string {
  const pair = /^(db|rh)=/.test(example) ? 'wb=17C dp=12C' : 'db=24C rh=50%';
  // A supply needs both loads and its dry-bulb or flow; the example replaces the one of its key.
  const supplyKeys = ['q_sensible=4kW', 'q_latent=1kW', /^(m|q)=/.test(example) ? '' : 'db=13C']
    .filter((x) => x && !x.startsWith(`${example.split('=')[0]!}=`))
    .join(' ');
  const line = {
    state: `state X: ${pair} ${example}`,
    mix: `mix X: A 40% + B 60% ${example}`,
    site: `site: ${example}`,
    process: `process X: A -> B ${example}`,
    supply: `supply X: A ${supplyKeys} ${example}`,
  }[statement];
  // The flow keys need no flow beside them; the other process keys get one.
  const flow = statement === 'process' && !/^(m|q)=/.test(example) ? ' m=2kg/s' : '';
  return ['```air', 'state A: db=30C rh=40%', 'state B: db=20C rh=50%', `${line}${flow}`, '```', ''].join('\n');
}

/** The one message the parser gives on `line` (in an air block). */
function onlyMessage(line: string): string {
  const got = parseNote(['```air', line, '```', ''].join('\n')).diagnostics.map((d) => d.message);
  expect(got.length, line).toBe(1);
  return got[0]!;
}

function propsOf(st: Statement): PropertyNode[] {
  return 'props' in st ? st.props : [];
}

const written = KEYS.flatMap((k) =>
  k.in.flatMap((statement) => k.examples.map((example) => [k.key, statement, example, k] as const)),
);

describe('the key table', () => {
  it('has one row per key, and every key that can be written has examples', () => {
    const keys = KEYS.map((k) => k.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const k of KEYS) {
      if (k.kind === 'computed') expect(k.in, k.key).toEqual([]);
      else expect(k.examples.length, `${k.key} has an example`).toBeGreaterThan(0);
      for (const e of k.examples) expect(e.startsWith(`${k.key}=`), e).toBe(true);
    }
    expect(written.length).toBeGreaterThan(20);
  });

  it.each(written)(
    "%s: the example in a %s line, '%s', parses with a unit of the key's dimension",
    (key, statement, example, spec: KeySpec) => {
      const parsed = parseNote(noteWith(statement, example));
      expect(parsed.diagnostics).toEqual([]);
      const st = parsed.statements[2]!;
      const prop = propsOf(st).find((p) => p.key === key);
      expect(prop?.value, `${example} is read as a value of ${key}`).toBeTruthy();
      const unit = prop!.value!.unit;
      if (unit === null) expect(spec.bare, `${example} has no unit, so a bare number must be allowed`).toBe('si');
      else expect(lookupUnit(unit.text)?.dimension, `${unit.text} measures ${spec.dimension}`).toBe(spec.dimension);
    },
  );

  it.each(written)(
    '%s: the example in a %s line, %s, is evaluated without a key or unit problem',
    (_key, statement, example) => {
      const a = analyzeNote(noteWith(statement, example));
      const codes = a.diagnostics.map((d) => d.code);
      for (const bad of ['unknown-key', 'unknown-unit', 'missing-unit', 'duplicate-key', 'syntax'])
        expect(codes, example).not.toContain(bad);
    },
  );

  it('gives each statement the keys it takes, in table order', () => {
    expect(Object.keys(STATE_KEYS)).toEqual(['db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'p', 'elev']);
    expect(Object.keys(MIX_KEYS)).toEqual(['db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'total']);
    expect(Object.keys(SITE_KEYS)).toEqual(['p', 'elev']);
    // A process also takes the leaving state's properties and the equipment keys (it may define its leaving state).
    expect(Object.keys(PROCESS_KEYS)).toEqual([
      'db',
      'wb',
      'dp',
      'rh',
      'w',
      'h',
      'v',
      'm',
      'q',
      'flow',
      'V',
      'q_total',
      'q_sensible',
      'q_latent',
      'q_coil',
      'shr',
      'water',
      'heat',
      'dt',
      'dp_fan',
      'eff',
      'eff_motor',
      'adp',
      'bf',
      'p_steam',
    ]);
    expect(Object.keys(SUPPLY_KEYS)).toEqual([
      'db',
      'wb',
      'dp',
      'rh',
      'w',
      'h',
      'v',
      'm',
      'q',
      'flow',
      'V',
      'q_sensible',
      'q_latent',
      'shr',
    ]);
  });

  it('gives the hint keys and the hover rows in their order', () => {
    expect([...HINT_KEYS]).toEqual(['db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'rho']);
    expect(STATE_ROWS.map((r) => [r.key, r.label, r.dimension])).toEqual([
      ['db', 'dry-bulb', 'temperature'],
      ['wb', 'wet-bulb', 'temperature'],
      ['dp', 'dew point', 'temperature'],
      ['rh', 'relative humidity', 'fraction'],
      ['w', 'humidity ratio', 'humidityRatio'],
      ['h', 'enthalpy', 'enthalpy'],
      ['v', 'specific volume', 'specificVolume'],
      ['rho', 'density (moist air)', 'density'],
      ['pw', 'vapour pressure', 'pressure'],
      ['mu', 'degree of saturation', 'fraction'],
    ]);
  });
});

describe("the parser's examples come from the table", () => {
  // These said "e.g. shr=24C" and "e.g. water=24C": the parser kept its own list, which lacked them.
  it.each([
    ['process P: A -> B shr=', 'e.g. shr=0.73'],
    ['process P: A -> B m=2kg/s water=', 'e.g. water=38kg/h'],
    ['process P: A -> B m=2kg/s q_total=abc', 'e.g. q_total=98kW'],
    ['state S: db=24C rh=50% v=', 'e.g. v=0.854m3/kg'],
    ['state S: db=24C h=', 'e.g. h=47.8kJ/kg'],
  ])('%s → %s', (line, says) => {
    const got = onlyMessage(line);
    expect(got).toContain(says);
    expect(got).not.toMatch(/=24C\b/);
  });
});

describe('references read the table: which keys define a state, and the differences they shift by', () => {
  const defining = KEYS.filter((k) => k.defining).map((k) => k.key);

  it('marks the same defining keys as the solver, in its order', () => {
    expect(defining).toEqual([...PHYSICS_DEFINING_KEYS]);
    expect([...DEFINING_KEYS]).toEqual(defining);
  });

  const shifts = KEYS.flatMap((k) => (k.differences ?? []).map((d) => [k.key, d] as const));

  it.each(shifts)('%s: a reference shifted by +%s is evaluated without a problem', (key, difference) => {
    expect(defining, `${key} takes references`).toContain(key);
    // The other defining property of B: the dry-bulb (the relative humidity for the dry-bulb itself).
    const other = key === 'db' ? 'rh=50%' : 'db=24C';
    const note = ['```air', 'state A: db=30C rh=40%', `state B: ${key}=A.${key}+${difference} ${other}`, '```', ''];
    expect(analyzeNote(note.join('\n')).diagnostics).toEqual([]);
  });

  it.each([
    ['state S: db=24C w=OA.w+', `w=OA.w+${keySpec('w').differences![0]}`],
    ['state S: db=24C h=OA.h*2', `OA.h+${keySpec('h').differences![0]}`],
    ['state S: rh=50% db=OA.db-x', `db=OA.db+${keySpec('db').differences![0]}`],
    ['state S: rh=50% dp=OA.', 'write dp=OA.dp'],
    ['process P: A -> B m=OA.', 'write m=OA.db'],
  ])("%s: the parser's message says %s", (line, says) => {
    expect(onlyMessage(line)).toContain(says);
  });

  it('gives a reference no difference where the row has none', () => {
    const note = ['```air', 'state A: db=30C rh=40%', 'state B: rh=A.rh+5% db=24C', '```', ''].join('\n');
    const d = analyzeNote(note).diagnostics;
    expect(d.map((x) => x.code)).toEqual(['bad-reference']);
    expect(d[0]!.message).toContain('a relative humidity takes no difference');
  });
});

describe("the JSON fields' units come from the table", () => {
  it('converts each JSON key by its row, one converter per key, and gives null for no figure', () => {
    const jsonKeys = KEYS.filter((k) => k.json).map((k) => k.key as JsonKey);
    expect(jsonKeys.length).toBeGreaterThan(10);
    for (const key of jsonKeys) {
      const json = keySpec(key).json!;
      const convert = jsonFigureOf(key);
      expect(jsonFigureOf(key), key).toBe(convert); // made once
      for (const si of [0, -0, 1, -12.5, 101325, 0.0093, 1e-7]) {
        const want = (si * (json.times ?? 1)) / (json.over ?? 1);
        expect(convert(si), `${key} ${si}`).toBe(want);
        expect(jsonFigure(key, si), `${key} ${si}`).toBe(want);
        // The same conversion from the field as data (what a writer of many figures applies itself).
        expect(jsonFigureIn(jsonField(key), si), `${key} ${si}`).toBe(want);
      }
      expect(jsonField(key)).toEqual({ name: json.name, times: json.times ?? 1, over: json.over ?? 1 });
      expect(jsonFigureIn(jsonField(key), Number.NaN)).toBeNaN();
      for (const none of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY]) expect(convert(none)).toBeNull();
    }
    // The units the table gives (common practice: 1 kJ/kg = 1000 J/kg, 1 kPa = 1000 Pa, % = fraction × 100).
    expect(jsonFigure('h', 50_300)).toBe(50.3);
    expect(jsonFigure('p', 101_325)).toBe(101.325);
    expect(jsonFigure('rh', 0.5)).toBe(50);
  });
});
