/**
 * The state solver at the edges of its range: −100 °C and 200 °C, 1 kPa and 1 MPa, saturation and
 * the boiling point at low pressure. Every call returns a state or a typed problem (never throws,
 * never loops); a state satisfies the definitions of its properties; a state solved from any
 * independent pair of its own properties is the same state again; and the iterative solves
 * converge in few iterations (counted, not timed).
 *
 * Sources: the property relations checked are the definitions of ASHRAE HoF 2017 SI Ch.1 (dp ≤ wb ≤
 * db for unsaturated air, 0 ≤ rh ≤ 1, pw = rh·pws, W ≥ 0, eq 32 for h); the round trips are
 * self-consistency (one state, any pair of its properties); boiling points are eq 6 inverted, the
 * pressures of the grid are the edges named by the engine's own range (−100…200 °C) and common
 * practice (1 kPa, a vacuum process; 1 MPa, a compressed-air receiver).
 */
import { describe, expect, it, vi } from 'vitest';
import {
  DEFINING_KEYS,
  PsychroError,
  boilingPoint,
  satVapPres,
  solveState,
  type DefiningKey,
  type MoistAirState,
  type PhysicsCode,
} from '../src/physics';
import { satTempDeriv, satTempFromLn, satTempRaw } from '../src/physics/saturation';
import { wetBulbSolve } from '../src/physics/wetbulb';
import { analyzeNote } from '../src/analyze';
import { allFinite } from '../src/evaluate';

/** Every code the engine documents (physics/types.ts PhysicsCode). */
const CODES: readonly PhysicsCode[] = [
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

/** The edge pressures, Pa: 1 kPa, 30 kPa (the usual lower bound), sea level, 1 MPa. */
const PRESSURES = [1000, 30_000, 101_325, 1_000_000];
/** Dry-bulbs at and next to the ends of the range, the triple point and the sea-level boiling point, °C. */
const TEMPS = [-100, -99.999, -60, -0.001, 0, 0.01, 0.02, 25, 99.97, 100, 150, 199.999, 200];
/** Relative humidities from bone-dry to saturated, and a hair below saturation. */
const RHS = [0, 1e-9, 0.01, 0.5, 0.999999, 1 - 1e-12, 1];

/**
 * Iterations of the bracketed root finder, maximum over every call while `counting` is set: each
 * iteration evaluates the function once, so the module is wrapped to count the evaluations.
 */
const roots = vi.hoisted(() => ({ counting: false, most: 0 }));
vi.mock('../src/physics/roots', async (importOriginal) => {
  const real = await importOriginal<typeof import('../src/physics/roots')>();
  return {
    ...real,
    findRoot: (f: (x: number) => number, ...rest: [number, number, number, number, number?, number?]) => {
      let n = 0;
      const x = real.findRoot(
        (t) => {
          n++;
          return f(t);
        },
        ...rest,
      );
      if (roots.counting) roots.most = Math.max(roots.most, n);
      return x;
    },
  };
});

/**
 * The states the grid tests solved (their saturation and wet-bulb solves are checked against a lower bound at the end).
 */
const solved: MoistAirState[] = [];

function solve(input: Partial<Record<DefiningKey, number>>, p: number, record = true): ReturnType<typeof solveState> {
  let r: ReturnType<typeof solveState>;
  roots.counting = record;
  try {
    r = solveState(input, p, { allowFog: true });
  } catch (err) {
    throw new Error(`solveState threw for ${JSON.stringify(input)} at ${p} Pa: ${String(err)}`);
  } finally {
    roots.counting = false;
  }
  if (record && r.ok) solved.push(r.state);
  return r;
}

/**
 * Whether the solve `run(bound)` gives the same answer under `bound` as under its own bound (it
 * converged within `bound`).
 */
function convergesWithin(bound: number, run: (maxIter?: number) => number): boolean {
  const full = run();
  return Number.isNaN(full) || Object.is(run(bound), full);
}

/** Checks a solved state against the definitions of its properties (ASHRAE HoF 2017 SI Ch.1). */
function checkDefinitions(s: MoistAirState, what: string): void {
  for (const k of ['p', 'db', 'wb', 'rh', 'w', 'h', 'v', 'rho', 'pw', 'pws', 'mu'] as const) {
    expect(Number.isFinite(s[k]), `${what}: ${k} = ${s[k]} is finite`).toBe(true);
  }
  // Documented non-finite values: −∞ dew point of bone-dry air, +∞ Ws at or above the boiling point.
  expect(Number.isFinite(s.dp) || (s.dp === -Infinity && s.pw === 0), `${what}: dp = ${s.dp}`).toBe(true);
  expect(Number.isFinite(s.ws) || (s.ws === Infinity && s.pws >= s.p), `${what}: ws = ${s.ws}`).toBe(true);
  expect(s.w, `${what}: W ≥ 0`).toBeGreaterThanOrEqual(0);
  if (s.fog) return;
  expect(s.rh, `${what}: rh ≥ 0`).toBeGreaterThanOrEqual(0);
  expect(s.rh, `${what}: rh ≤ 1`).toBeLessThanOrEqual(1 + 1e-12);
  expect(s.wb, `${what}: wb ≤ db`).toBeLessThanOrEqual(s.db + 1e-9);
  if (Number.isFinite(s.dp)) expect(s.dp, `${what}: dp ≤ wb`).toBeLessThanOrEqual(s.wb + 1e-6);
  expect(Math.abs(s.pw - s.rh * s.pws), `${what}: pw = rh·pws`).toBeLessThanOrEqual(1e-9 * Math.max(1, s.pws));
  // Eq 32: h = 1.006 t + W (2501 + 1.86 t), kJ/kg.
  const h = 1006 * s.db + s.w * (2_501_000 + 1860 * s.db);
  expect(Math.abs(s.h - h), `${what}: eq 32`).toBeLessThanOrEqual(1e-6 * Math.max(1000, Math.abs(h)));
}

/** A problem has a documented code, a message and a fix; no NaN/Infinity in them unless an input was one. */
function expectTyped(r: ReturnType<typeof solveState>, what: string, inputsFinite = true): void {
  if (r.ok) return;
  expect(CODES, `${what}: code ${r.problem.code}`).toContain(r.problem.code);
  expect(r.problem.message.length, `${what}: message`).toBeGreaterThan(10);
  expect(r.problem.fix.length, `${what}: fix`).toBeGreaterThan(5);
  if (inputsFinite) {
    expect(`${r.problem.message} ${r.problem.fix}`, `${what}: no non-finite figure in the message`).not.toMatch(
      /NaN|(?<!reported as −)Infinity|undefined/,
    );
  }
}

describe('every solve at the edges returns a state or a typed problem', () => {
  it('db with rh over −100…200 °C and 1 kPa…1 MPa: states obey their definitions', () => {
    let states = 0;
    let problems = 0;
    for (const p of PRESSURES) {
      for (const db of TEMPS) {
        for (const rh of RHS) {
          const what = `db=${db} rh=${rh} p=${p}`;
          const r = solve({ db, rh }, p);
          expectTyped(r, what);
          if (r.ok) {
            states++;
            checkDefinitions(r.state, what);
          } else problems++;
        }
      }
    }
    // At 1 kPa most of the grid is above the boiling point (6.97 °C): those are typed problems.
    expect(states).toBeGreaterThan(200);
    expect(problems).toBeGreaterThan(10);
  });

  it('a state solved from any independent pair of its own properties is the same state (self-consistency)', () => {
    const pairs: [DefiningKey, DefiningKey][] = [];
    for (let i = 0; i < DEFINING_KEYS.length; i++)
      for (let j = i + 1; j < DEFINING_KEYS.length; j++) pairs.push([DEFINING_KEYS[i]!, DEFINING_KEYS[j]!]);
    let trips = 0;
    for (const p of PRESSURES) {
      for (const db of TEMPS) {
        for (const rh of [0.01, 0.5, 0.999999, 1]) {
          const base = solve({ db, rh }, p);
          if (!base.ok || !Number.isFinite(base.state.dp) || !Number.isFinite(base.state.ws)) continue;
          const s = base.state;
          for (const [a, b] of pairs) {
            const what = `${a}+${b} from db=${db} rh=${rh} p=${p}`;
            const r = solve({ [a]: s[a], [b]: s[b] }, p);
            expectTyped(r, what);
            if (!r.ok && (s[a] < -100 || s[b] < -100)) {
              // A wet-bulb or dew point below −100 °C (extrapolated in the base state) is not accepted as input.
              expect(r.problem.code, what).toBe('out-of-range');
              continue;
            }
            if (a === 'dp' && b === 'w') {
              expect(r.ok ? 'solved' : r.problem.code, what).toBe('dependent-pair');
              continue;
            }
            if (!r.ok) {
              // Saturated air: db, wb and dp coincide, so a pair of two of them fixes nothing more.
              const saturatedPair = rh === 1 && ['db', 'wb', 'dp'].includes(a) && ['db', 'wb', 'dp', 'rh'].includes(b);
              // wb with h is nearly parallel; at the extremes of the
              // range the pair may be declared dependent or unsolvable.
              const weakPair = a === 'wb' && b === 'h';
              expect(saturatedPair || weakPair, `${what}: ${r.problem.code}: ${r.problem.message}`).toBe(true);
              continue;
            }
            trips++;
            checkDefinitions(r.state, what);
            // wb+h magnifies the round-off of h by 1/(dh/ddb along the wet-bulb): looser there.
            const tolT = a === 'wb' && b === 'h' ? 0.05 : 2e-5;
            expect(Math.abs(r.state.db - s.db), `${what}: db ${r.state.db} vs ${s.db}`).toBeLessThanOrEqual(tolT);
            expect(Math.abs(r.state.w - s.w), `${what}: w ${r.state.w} vs ${s.w}`).toBeLessThanOrEqual(
              Math.max(1e-9, 1e-5 * s.w) + (tolT > 1e-3 ? 1e-4 * s.w : 0),
            );
          }
        }
      }
    }
    expect(trips).toBeGreaterThan(1000);
  });

  it('near the boiling point at 1 kPa: at, just below and just above it (eq 6 inverted)', () => {
    const p = 1000;
    const tb = boilingPoint(p);
    expect(Math.abs(satVapPres(tb) - p)).toBeLessThan(1e-6 * p); // eq 6 at the computed boiling point
    for (const dt of [-1, -1e-3, -1e-9, 0, 1e-9, 1e-3, 1, 50, 150]) {
      const db = tb + dt;
      if (db > 200) continue;
      for (const rh of [0, 0.1, 0.9, 1]) {
        const r = solve({ db, rh }, p);
        expectTyped(r, `db=${db} rh=${rh} at 1 kPa`);
        if (r.ok) checkDefinitions(r.state, `db=${db} rh=${rh} at 1 kPa`);
        else if (dt > 0 && rh > 0)
          expect(['pressure-below-saturation', 'out-of-range', 'rh-out-of-range']).toContain(r.problem.code);
      }
      // Wet-bulb and dew point at or above the boiling point: the air cannot be saturated there.
      const wb = solve({ db: Math.min(200, db + 20), wb: db }, p);
      expectTyped(wb, `wb=${db} at 1 kPa`);
      if (dt >= 0)
        expect(wb.ok ? 'solved' : wb.problem.code, `wb at or above boiling (dt=${dt})`).toBe(
          'pressure-below-saturation',
        );
      const dp = solve({ db: Math.min(200, db + 20), dp: db }, p);
      expectTyped(dp, `dp=${db} at 1 kPa`);
      if (dt >= 0)
        expect(dp.ok ? 'solved' : dp.problem.code, `dp at or above boiling (dt=${dt})`).toBe(
          'pressure-below-saturation',
        );
    }
  });

  it('hot dry air at 1 kPa has a wet-bulb below the boiling point (the bracket stops there)', () => {
    const p = 1000;
    const tb = boilingPoint(p);
    for (const db of [tb + 1, 50, 120, 200]) {
      for (const w of [0, 1e-6, 1e-3]) {
        const r = solve({ db, w }, p);
        expectTyped(r, `db=${db} w=${w} at 1 kPa`);
        if (!r.ok) continue;
        expect(r.state.wb, `wb of db=${db} w=${w}`).toBeLessThanOrEqual(tb + 1e-9);
        expect(r.state.ws).toBe(Infinity); // documented: saturation impossible at or above the boiling point
      }
    }
  });

  it('saturation from both sides: rh, wb, dp and w a hair above it are typed problems or round-off, never NaN', () => {
    for (const p of PRESSURES) {
      for (const db of [-100, -40, 0.01, 25, 60, 99, 150, 200]) {
        const sat = solve({ db, rh: 1 }, p);
        if (!sat.ok) {
          expect(sat.problem.code, `saturated at db=${db} p=${p}`).toBe('pressure-below-saturation');
          continue;
        }
        const ws = sat.state.w;
        for (const f of [1 - 1e-9, 1 - 1e-13, 1, 1 + 1e-13, 1 + 1e-9, 1.01]) {
          const r = solve({ db, w: ws * f }, p);
          expectTyped(r, `w=ws×${f}`);
          expect(r.ok, `w = ws×${f} at db=${db} p=${p} (fog allowed)`).toBe(true);
          if (r.ok) {
            checkDefinitions(r.state, `w=ws×${f}`);
            expect(r.state.fog, `fog flag for w = ws×${f}`).toBe(f > 1 + 1e-12);
          }
        }
        for (const d of [-1e-6, -1e-10, 0, 1e-10, 1e-6]) {
          for (const key of ['wb', 'dp'] as const) {
            const r = solve({ db, [key]: db + d }, p);
            expectTyped(r, `${key}=db${d >= 0 ? '+' : ''}${d}`);
            if (db + d < -100) expect(r.ok ? 'solved' : r.problem.code).toBe('out-of-range');
            else if (d <= 1e-10)
              expect(r.ok, `${key} = db + ${d} at db=${db} p=${p}: ${r.ok ? '' : r.problem.message}`).toBe(true);
            else expect(r.ok ? 'solved' : r.problem.code).toBe(key === 'wb' ? 'wb-above-db' : 'dp-above-db');
          }
        }
        const over = solve({ db, rh: 1 + 1e-9 }, p);
        expect(over.ok ? 'solved' : over.problem.code).toBe('rh-out-of-range');
      }
    }
  });

  it('−100 °C and 200 °C are accepted; a hair outside is out-of-range, as is a computed dry-bulb outside', () => {
    for (const p of [1000, 101_325, 1_000_000]) {
      expect(solve({ db: -100, rh: 0.5 }, p).ok).toBe(true);
      const hot = solve({ db: 200, rh: 0.001 }, p);
      expectTyped(hot, '200 °C');
      const outLo = solve({ db: -100.001, rh: 0.5 }, p);
      const outHi = solve({ db: 200.001, rh: 0.001 }, p);
      expect(outLo.ok ? 'solved' : outLo.problem.code).toBe('out-of-range');
      expect(outHi.ok ? 'solved' : outHi.problem.code).toBe('out-of-range');
      // A pair that puts the dry-bulb outside the range: bone-dry air with a very low enthalpy.
      const cold = solve({ w: 0, h: -1e6 }, p);
      expect(cold.ok ? 'solved' : cold.problem.code).toBe('out-of-range');
      const hotH = solve({ w: 0, h: 1e6 }, p);
      expect(hotH.ok ? 'solved' : hotH.problem.code).toBe('out-of-range');
    }
  });

  it('non-finite and absurd inputs are typed problems (NaN, ±Infinity, 1e308, −0, p of 0 and 1e-320 Pa)', () => {
    const values = [Number.NaN, Infinity, -Infinity, 1e308, -1e308, -0, 5e-324];
    for (const p of [0, -1, 1e-320, Number.NaN, Infinity, 1e308, 101_325]) {
      for (const [a, b] of [
        ['db', 'rh'],
        ['db', 'wb'],
        ['db', 'w'],
        ['rh', 'h'],
        ['w', 'h'],
        ['wb', 'rh'],
        ['dp', 'h'],
      ] as const) {
        for (const x of values) {
          // Not counted in the convergence figures: these are far outside any real air.
          const r1 = solve({ [a]: x, [b]: 0.5 }, p, false);
          const r2 = solve({ [a]: 20, [b]: x }, p, false);
          for (const r of [r1, r2]) {
            expectTyped(r, `${a}/${b} with ${x} at ${p} Pa`, Number.isFinite(x) && Number.isFinite(p));
            if (r.ok) checkDefinitions(r.state, `${a}/${b} with ${x} at ${p} Pa`);
          }
        }
      }
    }
  });

  it('the iterative solves converge in few iterations at every edge (over the states of all the tests above)', () => {
    // Runs after the grid tests in this file. Hard bounds are 80 (saturation inversion), 100
    // (wet-bulb) and 200 (bracketed root); convergence takes far fewer: each saturation and
    // wet-bulb solve of those states gives the same result under the lower bound, and the root
    // finder (counted while the grid ran) used at most 120.
    const extra = solve({ wb: 30, rh: 0.2 }, 101_325);
    expect(extra.ok).toBe(true);
    expect(solved.length).toBeGreaterThan(500);
    const slowSat: string[] = [];
    const slowWb: string[] = [];
    let wbSolves = 0;
    for (const s of solved) {
      for (const pw of [s.pw, s.pws]) {
        if (pw > 0 && !convergesWithin(20, (bound) => satTempFromLn(Math.log(pw), bound))) slowSat.push(`pw ${pw} Pa`);
      }
      // The wet-bulb solve as wetBulbFromHumRatio starts it: from the dew point and its slopes.
      if (!(s.pw > 0 && s.pws < s.p)) continue;
      const dp = satTempRaw(s.pw);
      const { d1, d2 } = satTempDeriv;
      wbSolves++;
      if (!convergesWithin(40, (bound) => wetBulbSolve(s.db, s.w, s.p, s.pw, dp, d1, d2, s.pws, bound)))
        slowWb.push(`db ${s.db} w ${s.w} p ${s.p}`);
    }
    console.log(`[solvers] ${solved.length} states; most bracketed-root iterations ${roots.most}`);
    expect(wbSolves).toBeGreaterThan(300);
    expect(slowSat).toEqual([]);
    expect(slowWb).toEqual([]);
    expect(roots.most).toBeGreaterThan(0);
    expect(roots.most).toBeLessThanOrEqual(120);
  });

  it('the lower-bound check can fail: a solve cut short is told apart', () => {
    // 24 °C, 50 % at sea level (a state of the grid's kind); no iteration allowed: not converged.
    const r = solveState({ db: 24, rh: 0.5 }, 101_325);
    if (!r.ok) throw new Error(r.problem.message);
    const s = r.state;
    const dp = satTempRaw(s.pw);
    const { d1, d2 } = satTempDeriv;
    const wb = (bound?: number) => wetBulbSolve(s.db, s.w, s.p, s.pw, dp, d1, d2, s.pws, bound);
    expect(convergesWithin(0, wb)).toBe(false);
    expect(convergesWithin(40, wb)).toBe(true);
    expect(convergesWithin(0, (bound) => satTempFromLn(Math.log(s.pw), bound))).toBe(false);
  });
});

describe('the evaluator at the edges: a diagnostic, never an exception or a non-finite result', () => {
  it('notes at 1 kPa and 1 MPa, −100 °C and 200 °C, near saturation and boiling', () => {
    const lines = [
      'site: p=1kPa',
      'state A: db=6.9C rh=99.9999%',
      'state B: db=7C rh=100%',
      'state C: db=50C wb=6.9C',
      'state D: db=200C w=0',
      'state E: db=-100C rh=100%',
      'site: p=1000kPa',
      'state F: db=200C rh=100%',
      'state G: db=-100C dp=-100C',
      'state H: db=179C rh=100%',
      'mix M: F 50% + G 50%',
      'process P: G -> F m=1kg/s',
    ];
    const a = analyzeNote(['```air', ...lines, '```', ''].join('\n'));
    expect(allFinite(a)).toBe(true);
    for (const d of a.diagnostics) expect(d.message, d.code).not.toMatch(/NaN|(?<!reported as −)Infinity|undefined/);
    const computed = a.items.filter((i) => i.kind !== 'process' && i.state !== null).map((i) => i.name);
    // Valid: below the 6.97 °C boiling point at 1 kPa, −100 °C saturated, 200 °C air at 1 MPa (pws(200 °C) = 1.555 MPa
    // is above 1 MPa, so 200 °C cannot be saturated there: F is an error), dp = db = −100 °C, 179 °C saturated at 1 MPa
    // (below its 179.9 °C boiling point, eq 6). C is real air above the boiling point (50 °C at 1 kPa) whose wet-bulb,
    // 6.9 °C, is below it: computed.
    expect(computed).toEqual(['A', 'C', 'E', 'G', 'H']);
    const codes = (name: string) =>
      a.diagnostics.filter((d) => d.message.startsWith(`state ${name}:`)).map((d) => d.code);
    expect(codes('B')).toEqual(['pressure-below-saturation']); // 7 °C is above the boiling point at 1 kPa
    expect(codes('C')).toEqual([]);
    expect(codes('F')).toEqual(['pressure-below-saturation']);
    expect(codes('E')).toEqual([]); // no warning about its own dew point at −100 °C
    expect(a.diagnostics.filter((d) => d.code === 'unresolved-dependency').length).toBe(2); // the mix and process of F
  });

  it('PsychroError carries a typed problem (what the evaluator turns into a diagnostic)', () => {
    try {
      boilingPoint(1e-9);
      expect.fail('boilingPoint(1e-9 Pa) should throw');
    } catch (e) {
      expect(e).toBeInstanceOf(PsychroError);
      expect((e as PsychroError).code).toBe('out-of-range');
    }
  });
});
