/**
 * Bad input gets a typed problem (stable code, message, fix, the keys it is about), never a
 * crash, NaN or hang; valid input never gives NaN, over the whole range of the formulation
 * (ASHRAE Handbook—Fundamentals 2017 SI Ch. 1: −100…200 °C) and p 1 kPa…1 MPa. The expected
 * codes are the engine's contract (physics/types.ts), not external figures.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  DEFINING_KEYS,
  boilingPoint,
  condensateEnthalpy,
  dbFromEnthalpy,
  density,
  dewPointFromHumRatio,
  enthalpy,
  humRatioFromEnthalpy,
  iceEnthalpy,
  liquidWaterEnthalpy,
  specificVolume,
  dewPointFromVapPres,
  humRatioFromVapPres,
  relHumFromHumRatio,
  satHumRatio,
  satVapPres,
  solveState,
  stateFromDbW,
  stateRecord,
  stdAtmPressure,
  vapPresFromHumRatio,
  wetBulbFromHumRatio,
  type DefiningKey,
  type MoistAirState,
  type PhysicsCode,
  type SolveOptions,
} from '../src/physics';
import { findRoot } from '../src/physics/roots';
import { codeOf } from './data/physics-helpers';

const ALL_CODES: PhysicsCode[] = [
  'out-of-range',
  'wb-above-db',
  'dp-above-db',
  'rh-out-of-range',
  'supersaturated',
  'negative-humidity-ratio',
  'enthalpy-too-low',
  'wb-too-low',
  'pressure-below-saturation',
  'dependent-pair',
  'underspecified',
  'overspecified',
  'ill-conditioned',
  'no-solution',
  'no-convergence',
];

type Input = Partial<Record<DefiningKey, number>>;

function problemOf(input: Input, p = 101325, opts?: SolveOptions) {
  const r = solveState(input, p, opts);
  if (r.ok) throw new Error(`expected a problem for ${JSON.stringify(input)} at ${p} Pa, got a state`);
  return r.problem;
}

/** Every numeric field is a number, not NaN; only the documented infinities occur. */
function expectNoNaN(s: MoistAirState, label: string): void {
  for (const [k, v] of Object.entries(stateRecord(s))) {
    if (typeof v === 'boolean') continue;
    expect(typeof v, `${label}: ${k}`).toBe('number');
    expect(Number.isNaN(v), `${label}: ${k} is NaN`).toBe(false);
  }
  for (const k of ['p', 'db', 'wb', 'rh', 'w', 'h', 'v', 'rho', 'pw', 'pws', 'mu'] as const) {
    expect(Number.isFinite(s[k]), `${label}: ${k} = ${s[k]}`).toBe(true);
  }
  if (!Number.isFinite(s.dp)) expect(s.dp === Number.NEGATIVE_INFINITY && s.w === 0, `${label}: dp`).toBe(true);
  if (!Number.isFinite(s.ws)) expect(s.ws === Number.POSITIVE_INFINITY && s.pws >= s.p, `${label}: ws`).toBe(true);
}

/** [input, expected code, keys the problem must name] for every invalid input class. */
const INVALID: [string, Input, PhysicsCode, DefiningKey[], number?, SolveOptions?][] = [
  ['wet-bulb above dry-bulb', { db: 20, wb: 25 }, 'wb-above-db', ['db', 'wb']],
  ['dew point above dry-bulb', { db: 20, dp: 25 }, 'dp-above-db', ['db', 'dp']],
  ['rh above 100 %', { db: 20, rh: 1.2 }, 'rh-out-of-range', ['rh']],
  ['rh below 0', { db: 20, rh: -0.1 }, 'rh-out-of-range', ['rh']],
  ['rh above 100 % with wb', { wb: 10, rh: 2 }, 'rh-out-of-range', ['rh']],
  ['rh above 100 % with h', { rh: 1.01, h: 40000 }, 'rh-out-of-range', ['rh']],
  ['w above saturation at db', { db: 20, w: 0.02 }, 'supersaturated', ['db', 'w']],
  ['w above saturation at wb', { wb: 10, w: 0.02 }, 'supersaturated', ['wb', 'w']],
  ['h above saturated air at db (all vapour)', { db: 20, h: 100000 }, 'supersaturated', ['db', 'h']],
  ['w with h in the fog region', { w: 0.02, h: 50000 }, 'supersaturated', ['w', 'h']],
  ['negative w', { db: 20, w: -0.001 }, 'negative-humidity-ratio', ['w']],
  ['negative w with h', { w: -1, h: 0 }, 'negative-humidity-ratio', ['w']],
  ['h below bone-dry air at db', { db: 20, h: 10000 }, 'enthalpy-too-low', ['db', 'h']],
  ['h below saturated air at the dew point', { dp: 10, h: 10000 }, 'enthalpy-too-low', ['dp', 'h']],
  ['wet-bulb too low for the dry-bulb', { db: 40, wb: 5 }, 'wb-too-low', ['db', 'wb']],
  ['wet-bulb below the dew point', { wb: 10, dp: 12 }, 'wb-too-low', ['wb', 'dp']],
  ['vapour pressure at or above p (db, rh)', { db: 120, rh: 1 }, 'pressure-below-saturation', ['db', 'rh']],
  ['dew point above the boiling point', { db: 150, dp: 105 }, 'pressure-below-saturation', ['dp']],
  ['wet-bulb above the boiling point', { db: 150, wb: 101 }, 'pressure-below-saturation', ['wb']],
  ['wet-bulb above the boiling point with w', { wb: 101, w: 0.1 }, 'pressure-below-saturation', ['wb']],
  ['saturated at a low pressure', { db: 20, rh: 1 }, 'pressure-below-saturation', ['db', 'rh'], 2000],
  ['dry-bulb above 200 °C', { db: 250, rh: 0.5 }, 'out-of-range', ['db']],
  ['dry-bulb below −100 °C', { db: -120, w: 0 }, 'out-of-range', ['db']],
  ['dew point below −100 °C', { db: 20, dp: -101 }, 'out-of-range', ['dp']],
  ['wet-bulb NaN', { db: 20, wb: Number.NaN }, 'out-of-range', ['wb']],
  ['rh infinite', { db: 20, rh: Number.POSITIVE_INFINITY }, 'out-of-range', ['rh']],
  ['h not finite', { db: 20, h: Number.NEGATIVE_INFINITY }, 'out-of-range', ['h']],
  ['computed dry-bulb above 200 °C', { w: 0.01, h: 1e6 }, 'out-of-range', ['w', 'h']],
  ['computed dry-bulb above 200 °C (rh, h)', { rh: 0.001, h: 5e5 }, 'out-of-range', ['rh', 'h']],
  ['pressure 0', { db: 20, rh: 0.5 }, 'out-of-range', [], 0],
  ['pressure negative', { db: 20, rh: 0.5 }, 'out-of-range', [], -101325],
  ['pressure NaN', { db: 20, rh: 0.5 }, 'out-of-range', [], Number.NaN],
  ['pressure infinite', { db: 20, rh: 0.5 }, 'out-of-range', [], Number.POSITIVE_INFINITY],
  ['rh 0 with a dew point', { dp: 10, rh: 0 }, 'no-solution', ['dp', 'rh']],
  ['rh 0 with moisture', { rh: 0, w: 0.01 }, 'no-solution', ['rh', 'w']],
  ['moisture 0 with rh', { rh: 0.5, w: 0 }, 'no-solution', ['rh', 'w']],
  ['h out of reach along a wet-bulb', { wb: 20, h: 10000 }, 'no-solution', ['wb', 'h']],
  ['fog at exactly 0 °C from (db, h)', { db: 0, h: 50000 }, 'no-solution', ['db', 'h'], 101325, { allowFog: true }],
  ['dew point with w', { dp: 10, w: 0.005 }, 'dependent-pair', ['dp', 'w']],
  ['rh 0 with w 0', { rh: 0, w: 0 }, 'dependent-pair', ['rh', 'w']],
  ['nothing given', {}, 'underspecified', []],
  ['one property', { db: 20 }, 'underspecified', ['db']],
  ['three properties', { db: 20, rh: 0.5, w: 0.01 }, 'overspecified', ['db', 'rh', 'w']],
];

describe('every invalid input class gets a typed problem', () => {
  for (const [label, input, code, keys, p, opts] of INVALID) {
    it(`${label} → ${code}`, () => {
      const prob = problemOf(input, p ?? 101325, opts);
      expect(prob.code).toBe(code);
      expect(prob.keys).toEqual(keys);
      expect(prob.message.length).toBeGreaterThan(20);
      expect(prob.fix.length).toBeGreaterThan(10);
      expect(prob.message).not.toMatch(/undefined/);
      const hasNaN = Number.isNaN(p) || Object.values(input).some((v) => Number.isNaN(v));
      if (!hasNaN) expect(prob.message).not.toMatch(/NaN/);
      for (const k of prob.keys) expect(Object.keys(input)).toContain(k);
    });
  }

  it('dependent pair: the message names the third kind of property to add', () => {
    const prob = problemOf({ dp: 10, w: 0.005 });
    expect(prob.fix).toMatch(/db or wb/);
    expect(prob.fix).toMatch(/\brh\b/);
    expect(prob.fix).toMatch(/\(h\)/);
  });

  it('wet-bulb with enthalpy is solved with an ill-conditioned warning', () => {
    const base = solveState({ db: 30, rh: 0.4 }, 101325);
    if (!base.ok) throw new Error(base.problem.message);
    const r = solveState({ wb: base.state.wb, h: base.state.h }, 101325);
    if (!r.ok) throw new Error(r.problem.message);
    expect(r.warnings.map((x) => x.code)).toEqual(['ill-conditioned']);
    expect(r.warnings[0]!.keys).toEqual(['wb', 'h']);
    expect(Math.abs(r.state.db - 30)).toBeLessThanOrEqual(1e-6);
  });

  it('fog is a warning only when allowed', () => {
    const r = solveState({ w: 0.02, h: 50000 }, 101325, { allowFog: true });
    if (!r.ok) throw new Error(r.problem.message);
    expect(r.state.fog).toBe(true);
    expect(r.state.db).toBeLessThan(dewPointFromHumRatio(0.02, 101325));
    expect(r.warnings.map((x) => x.code)).toEqual(['supersaturated']);
  });

  it('the low-level functions throw PsychroError with the same codes', () => {
    expect(codeOf(() => satVapPres(201))).toBe('out-of-range');
    expect(codeOf(() => satHumRatio(20, 0))).toBe('out-of-range');
    expect(codeOf(() => satHumRatio(101, 101325))).toBe('pressure-below-saturation');
    expect(codeOf(() => humRatioFromVapPres(2000, 1000))).toBe('pressure-below-saturation');
    expect(codeOf(() => humRatioFromVapPres(-1, 101325))).toBe('out-of-range');
    expect(codeOf(() => vapPresFromHumRatio(-0.001, 101325))).toBe('negative-humidity-ratio');
    expect(codeOf(() => relHumFromHumRatio(20, Number.NaN, 101325))).toBe('out-of-range');
    expect(codeOf(() => wetBulbFromHumRatio(20, 0.05, 101325))).toBe('supersaturated');
    expect(codeOf(() => dewPointFromVapPres(2e6))).toBe('out-of-range');
    expect(codeOf(() => dewPointFromVapPres(-1))).toBe('out-of-range');
    expect(codeOf(() => dewPointFromHumRatio(-1, 101325))).toBe('negative-humidity-ratio');
    expect(codeOf(() => boilingPoint(2e6))).toBe('out-of-range');
    expect(codeOf(() => boilingPoint(Number.NaN))).toBe('out-of-range');
    expect(codeOf(() => stateFromDbW(20, -1, 101325))).toBe('negative-humidity-ratio');
    expect(codeOf(() => stdAtmPressure(20000))).toBe('out-of-range');
    expect(codeOf(() => stdAtmPressure(Number.NaN))).toBe('out-of-range');
    // The closed-form helpers check their inputs too: no NaN in, so no NaN out.
    expect(codeOf(() => enthalpy(Number.NaN, 0.01))).toBe('out-of-range');
    expect(codeOf(() => enthalpy(20, -0.01))).toBe('negative-humidity-ratio');
    expect(codeOf(() => dbFromEnthalpy(Number.POSITIVE_INFINITY, 0.01))).toBe('out-of-range');
    expect(codeOf(() => humRatioFromEnthalpy(40000, 300))).toBe('out-of-range');
    expect(codeOf(() => specificVolume(20, 0.01, 0))).toBe('out-of-range');
    expect(codeOf(() => density(20, Number.NaN, 101325))).toBe('out-of-range');
    expect(codeOf(() => condensateEnthalpy(Number.NaN))).toBe('out-of-range');
    expect(codeOf(() => liquidWaterEnthalpy(Number.NaN))).toBe('out-of-range');
    expect(codeOf(() => iceEnthalpy(Number.NaN))).toBe('out-of-range');
  });

  it('iterations are bounded: a root finder that hits its bound says so (NaN → no-convergence), never loops', () => {
    let calls = 0;
    const f = (x: number): number => {
      calls++;
      return Math.exp(x) - 5;
    };
    expect(Number.isNaN(findRoot(f, 0, 10, f(0), f(10), 1e-13, 3))).toBe(true);
    expect(calls).toBe(2 + 3);
    expect(Math.abs(findRoot(f, 0, 10, f(0), f(10)) - Math.log(5))).toBeLessThanOrEqual(1e-12);
  });
});

const logUniform = (lo: number, hi: number) =>
  fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map((x) => Math.exp(x));

const wholeDomain = fc.record({
  db: fc.oneof(fc.constantFrom(-100, 200, 0, 0.01), fc.double({ min: -100, max: 200, noNaN: true })),
  rh: fc.oneof(fc.constantFrom(0, 1), fc.double({ min: 0, max: 1, noNaN: true })),
  p: fc.oneof(fc.constantFrom(1000, 1e6, 101325), logUniform(1000, 1e6)),
});

describe('no NaN for any valid input', () => {
  it('(db, rh) over −100…200 °C, 0…100 %, 1 kPa…1 MPa: no NaN state, or pressure-below-saturation (seeded)', () => {
    fc.assert(
      fc.property(wholeDomain, ({ db, rh, p }) => {
        const r = solveState({ db, rh }, p);
        if (rh * satVapPres(db) >= p) {
          expect(r.ok ? 'ok' : r.problem.code).toBe('pressure-below-saturation');
          return;
        }
        if (!r.ok) throw new Error(`${db}, ${rh}, ${p}: ${r.problem.message}`);
        expectNoNaN(r.state, `db ${db} rh ${rh} p ${p}`);
      }),
      { seed: 42, numRuns: 20000 },
    );
  });

  it('every pair taken from such a state: a state without NaN, or a typed problem (seeded)', () => {
    const codes = new Map<string, number>();
    fc.assert(
      fc.property(wholeDomain, ({ db, rh, p }) => {
        const r0 = solveState({ db, rh }, p);
        if (!r0.ok) return;
        const s = r0.state;
        for (let i = 0; i < DEFINING_KEYS.length; i++) {
          for (let j = i + 1; j < DEFINING_KEYS.length; j++) {
            const a = DEFINING_KEYS[i]!;
            const b = DEFINING_KEYS[j]!;
            const r = solveState({ [a]: s[a], [b]: s[b] }, p);
            const label = `${a}+${b} from db ${db} rh ${rh} p ${p}`;
            if (r.ok) {
              expectNoNaN(r.state, label);
              continue;
            }
            codes.set(`${a}+${b}:${r.problem.code}`, (codes.get(`${a}+${b}:${r.problem.code}`) ?? 0) + 1);
            expect(ALL_CODES).toContain(r.problem.code);
            expect(r.problem.message).not.toMatch(/NaN|undefined/);
            // The only problems a real state's own figures may meet: the dependent pair, an input
            // outside −100…200 °C (dp or wb of very dry air), dp = −∞ of bone-dry air, and wb
            // with h where they are (nearly) parallel.
            const allowed =
              (a === 'dp' && b === 'w' && r.problem.code === 'dependent-pair') ||
              (r.problem.code === 'out-of-range' && (s.dp < -100 || s.wb < -100)) ||
              (a === 'wb' && b === 'h' && ['dependent-pair', 'no-solution'].includes(r.problem.code)) ||
              (a === 'rh' && b === 'w' && s.w === 0);
            expect(allowed, `${label}: ${r.problem.code}: ${r.problem.message}`).toBe(true);
          }
        }
      }),
      { seed: 43, numRuns: 3000 },
    );
    expect(codes.size).toBeGreaterThan(0); // at least the dependent pair was met
    // 3000 seeded states × 15 pairs: over a minute when the machine is shared; time is not what this checks.
  }, 300_000);

  it('random raw pairs (valid or not) never throw and never give NaN: a state or a typed problem (seeded)', () => {
    const value = (k: DefiningKey) =>
      k === 'rh'
        ? fc.double({ min: -0.5, max: 1.5, noNaN: false })
        : k === 'w'
          ? fc.oneof(fc.double({ min: -0.01, max: 0.1 }), logUniform(1e-12, 10))
          : k === 'h'
            ? fc.double({ min: -2e5, max: 2e6 })
            : fc.double({ min: -150, max: 250 });
    const pair = fc
      .tuple(fc.integer({ min: 0, max: 5 }), fc.integer({ min: 0, max: 5 }))
      .filter(([i, j]) => i < j)
      .chain(([i, j]) => {
        const a = DEFINING_KEYS[i]!;
        const b = DEFINING_KEYS[j]!;
        return fc.record({
          a: fc.constant(a),
          b: fc.constant(b),
          va: value(a),
          vb: value(b),
          p: logUniform(500, 2e6),
          fog: fc.boolean(),
        });
      });
    fc.assert(
      fc.property(pair, ({ a, b, va, vb, p, fog }) => {
        const r = solveState({ [a]: va, [b]: vb }, p, { allowFog: fog });
        if (r.ok) {
          if (r.state.fog) {
            for (const [k, v] of Object.entries(stateRecord(r.state)))
              if (typeof v === 'number') expect(Number.isFinite(v), k).toBe(true);
          } else expectNoNaN(r.state, `${a}=${va} ${b}=${vb} p=${p}`);
          for (const x of r.warnings) expect(ALL_CODES).toContain(x.code);
        } else {
          expect(ALL_CODES).toContain(r.problem.code);
          expect(r.problem.code).not.toBe('no-convergence');
          expect(r.problem.message.length).toBeGreaterThan(10);
          expect(r.problem.fix.length).toBeGreaterThan(5);
        }
      }),
      { seed: 44, numRuns: 20000 },
    );
  });
});
