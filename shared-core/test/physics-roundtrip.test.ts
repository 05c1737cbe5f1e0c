/**
 * Round trips through the engine (self-consistency of the ASHRAE Handbook—Fundamentals 2017 SI
 * Ch. 1 equations as implemented; no external figures): (db, rh) → wb → (db, wb) → rh;
 * (db, w) → dp → (db, dp) → w; every valid defining pair of solveState reproduces the state it
 * was taken from; fog states come back from their (w, h). fast-check, fixed seeds.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  condensateEnthalpy,
  dewPointFromHumRatio,
  enthalpy,
  humRatioFromRelHum,
  humRatioFromWetBulb,
  relHumFromHumRatio,
  satHumRatio,
  satVapPres,
  solveState,
  wetBulbFromHumRatio,
  type DefiningKey,
  type MoistAirState,
} from '../src/physics';
import { humRatioFromVapPres } from '../src/physics';

const logUniform = (lo: number, hi: number) =>
  fc.double({ min: Math.log(lo), max: Math.log(hi), noNaN: true }).map((x) => Math.exp(x));

/** States over the whole range: db −100…200 °C, rh 0…1, p 1 kPa…1 MPa, where they exist. */
const anyState = fc
  .record({
    db: fc.double({ min: -100, max: 200, noNaN: true }),
    rh: fc.double({ min: 0, max: 1, noNaN: true }),
    p: logUniform(1000, 1e6),
  })
  .filter(({ db, rh, p }) => rh * satVapPres(db) < p);

describe('round trips', () => {
  it('(db, rh) → wb → (db, wb) → rh, to 1e-9 (seeded)', () => {
    fc.assert(
      fc.property(anyState, ({ db, rh, p }) => {
        const w = humRatioFromRelHum(db, rh, p);
        const wb = wetBulbFromHumRatio(db, w, p);
        fc.pre(wb >= -100); // bone-dry air at −100 °C has its wet-bulb a hair below the range
        const w2 = humRatioFromWetBulb(db, wb, p);
        const rh2 = relHumFromHumRatio(db, w2, p);
        expect(Math.abs(rh2 - rh)).toBeLessThanOrEqual(1e-9);
      }),
      { seed: 7, numRuns: 5000 },
    );
  });

  it('(db, w) → dp → (db, dp) → w, to 1e-9 relative (seeded)', () => {
    fc.assert(
      fc.property(anyState, ({ db, rh, p }) => {
        fc.pre(rh > 0);
        const w = humRatioFromRelHum(db, rh, p);
        const dp = dewPointFromHumRatio(w, p);
        fc.pre(dp >= -100); // a dew point below −100 °C is not a valid input
        const r = solveState({ db, dp }, p);
        if (!r.ok) throw new Error(r.problem.message);
        expect(Math.abs(r.state.w - w) / w).toBeLessThanOrEqual(1e-9);
        expect(r.state.dpFrost).toBe(dp < 0.01);
        expect(r.state.dp).toBeLessThanOrEqual(db);
      }),
      { seed: 8, numRuns: 5000 },
    );
  });

  it('the dew point inverts the saturation curve: pws(dp) = pw to 1e-12 relative, −100…200 °C', () => {
    fc.assert(
      fc.property(fc.double({ min: -100, max: 200, noNaN: true }), (t) => {
        const pws = satVapPres(t);
        const p = 2e6; // above pws(200 °C) so any t is below boiling
        const dp = dewPointFromHumRatio(humRatioFromVapPres(pws, p), p);
        expect(Math.abs(dp - t)).toBeLessThanOrEqual(1e-9);
      }),
      { seed: 9, numRuns: 5000 },
    );
  });
});

// Every valid pair of solveState against the state it was taken from.
const PAIRS: [DefiningKey, DefiningKey][] = [
  ['db', 'wb'],
  ['db', 'dp'],
  ['db', 'rh'],
  ['db', 'w'],
  ['db', 'h'],
  ['wb', 'rh'],
  ['wb', 'w'],
  ['wb', 'dp'],
  ['wb', 'h'],
  ['dp', 'rh'],
  ['dp', 'h'],
  ['rh', 'w'],
  ['rh', 'h'],
  ['w', 'h'],
];

/** Tolerance on the dry-bulb for a pair at a state (wb with h is nearly parallel: looser). */
function dbTol(a: DefiningKey, b: DefiningKey, s: MoistAirState): number {
  if (a === 'wb' && b === 'h') {
    // Along a wet-bulb line h changes by only ~4.186·wb·(Ws* − W)/(db − wb) J/kg per K.
    return 1e-4 / Math.max(Math.abs(s.wb), 0.05);
  }
  return 1e-7;
}

function expectSameState(got: MoistAirState, want: MoistAirState, tDb: number, label: string): void {
  const m = (k: string, a: number, b: number) => `${label}: ${k} ${a} vs ${b}`;
  expect(Math.abs(got.db - want.db), m('db', got.db, want.db)).toBeLessThanOrEqual(tDb);
  const scale = Math.max(1, tDb / 1e-7); // the other figures follow the dry-bulb's accuracy
  expect(Math.abs(got.wb - want.wb), m('wb', got.wb, want.wb)).toBeLessThanOrEqual(1e-6 * scale);
  expect(Math.abs(got.dp - want.dp), m('dp', got.dp, want.dp)).toBeLessThanOrEqual(1e-6 * scale);
  expect(Math.abs(got.rh - want.rh), m('rh', got.rh, want.rh)).toBeLessThanOrEqual(1e-8 * scale);
  // W from a wet-bulb is a difference of two terms: an absolute floor of 1e-12 kg/kg.
  expect(Math.abs(got.w - want.w), m('w', got.w, want.w)).toBeLessThanOrEqual(scale * (1e-9 * want.w + 1e-12));
  expect(Math.abs(got.h - want.h), m('h', got.h, want.h)).toBeLessThanOrEqual(1e-4 * scale + 1e-9 * Math.abs(want.h));
  expect(Math.abs(got.v - want.v) / want.v, m('v', got.v, want.v)).toBeLessThanOrEqual(1e-9 * scale);
  expect(Math.abs(got.rho - want.rho) / want.rho, m('rho', got.rho, want.rho)).toBeLessThanOrEqual(1e-9 * scale);
  expect(Math.abs(got.pw - want.pw), m('pw', got.pw, want.pw)).toBeLessThanOrEqual(
    scale * (1e-9 * want.pw + 2e-12 * want.p),
  );
  expect(Math.abs(got.pws - want.pws) / want.pws, m('pws', got.pws, want.pws)).toBeLessThanOrEqual(1e-8 * scale);
  // The flags flip at 0 °C and 0.01 °C: compare them away from those points.
  if (Math.abs(want.wb) > 1e-6 * scale) expect(got.wbIce).toBe(want.wbIce);
  if (Math.abs(want.dp - 0.01) > 1e-6 * scale) expect(got.dpFrost).toBe(want.dpFrost);
  expect(got.fog).toBe(false);
}

const pairState = fc
  .record({
    db: fc.double({ min: -60, max: 150, noNaN: true }),
    rh: fc.double({ min: 0.02, max: 1, noNaN: true }),
    p: logUniform(50_000, 200_000),
  })
  .filter(({ db, rh, p }) => rh * satVapPres(db) < 0.9 * p);

describe('every valid pair of solveState reproduces the state it was taken from', () => {
  for (const [a, b] of PAIRS) {
    it(`${a} + ${b} (seeded)`, () => {
      let checked = 0;
      fc.assert(
        fc.property(pairState, ({ db, rh, p }) => {
          const r0 = solveState({ db, rh }, p);
          if (!r0.ok) throw new Error(r0.problem.message);
          const s = r0.state;
          if (a === 'wb' && b === 'h' && Math.abs(s.wb) < 0.05) return; // h nearly constant along the line
          // saturated: db = wb exactly
          if (s.db - s.wb < 1e-6 && ((a === 'wb' && b === 'h') || (a === 'wb' && b === 'rh'))) return;
          const r = solveState({ [a]: s[a], [b]: s[b] }, p);
          if (!r.ok)
            throw new Error(`${a}+${b} at db ${db}, rh ${rh}, p ${p}: ${r.problem.code}: ${r.problem.message}`);
          expectSameState(r.state, s, dbTol(a, b, s), `${a}+${b} at db ${db}, rh ${rh}, p ${p}`);
          if (a === 'wb' && b === 'h') expect(r.warnings.some((x) => x.code === 'ill-conditioned')).toBe(true);
          checked++;
        }),
        { seed: 100 + PAIRS.findIndex(([x, y]) => x === a && y === b), numRuns: 600 },
      );
      expect(checked).toBeGreaterThan(500);
    });
  }
});

describe('fog states', () => {
  it('a fog state comes back from its (w, h) with allowFog, flagged, with a supersaturated warning (seeded)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -40, max: 60, noNaN: true }),
        fc.double({ min: 1e-4, max: 0.01, noNaN: true }),
        (t, excess) => {
          fc.pre(Math.abs(t) > 1e-3); // at exactly 0 °C ice and water carry different enthalpy
          const p = 101_325;
          const ws = satHumRatio(t, p);
          const wTotal = ws + excess;
          const h = enthalpy(t, ws) + excess * condensateEnthalpy(t);
          const r = solveState({ w: wTotal, h }, p, { allowFog: true });
          if (!r.ok) throw new Error(r.problem.message);
          expect(r.state.fog).toBe(true);
          expect(Math.abs(r.state.db - t)).toBeLessThanOrEqual(1e-7);
          expect(r.state.rh).toBe(1);
          expect(r.state.w).toBe(wTotal);
          expect(Math.abs(r.state.h - h)).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(h)));
          expect(r.warnings.map((x) => x.code)).toContain('supersaturated');
          const strict = solveState({ w: wTotal, h }, p);
          expect(strict.ok ? 'ok' : strict.problem.code).toBe('supersaturated');
        },
      ),
      { seed: 11, numRuns: 1000 },
    );
  });
});
