/**
 * The evaluator's guarded solve (`src/evaluate/solve.ts` solveOrProblem), which state and mix
 * statements share: a solver that throws becomes a `no-solution` problem carrying the caller's fix
 * and keys, never an exception out of evaluation (ARCHITECTURE.md: evaluation never throws).
 */
import { describe, expect, it } from 'vitest';
import { solveForNote, solveOrProblem } from '../src/evaluate/solve';

describe('solveOrProblem', () => {
  it('passes the solver through when it answers', () => {
    // 24 °C, 50 % at 101.325 kPa: a state (ASHRAE HoF 2017 SI Ch.1, standard sea-level pressure).
    const r = solveOrProblem(solveForNote, { db: 24, rh: 0.5 }, 101325, {}, 'check the figures', ['db', 'rh']);
    expect(r).toEqual(solveForNote({ db: 24, rh: 0.5 }, 101325, {}));
    expect(r.ok).toBe(true);
  });

  it('turns a solver that throws into a no-solution problem with the given fix and keys', () => {
    const throwing = (() => {
      throw new Error('boom');
    }) as unknown as typeof solveForNote;
    const r = solveOrProblem(throwing, { w: 0.01, h: 50000 }, 101325, { allowFog: true }, 'check the streams', []);
    expect(r).toEqual({
      ok: false,
      problem: { code: 'no-solution', message: 'the engine failed (boom)', fix: 'check the streams', keys: [] },
    });
    const s = solveOrProblem(
      (() => {
        throw 'text';
      }) as unknown as typeof solveForNote,
      { db: 24, rh: 0.5 },
      101325,
      {},
      'check the figures',
      ['db', 'rh'],
    );
    expect(s.ok || s.problem).toEqual({
      code: 'no-solution',
      message: 'the engine failed (text)',
      fix: 'check the figures',
      keys: ['db', 'rh'],
    });
  });
});
