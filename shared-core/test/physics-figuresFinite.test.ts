/**
 * The finiteness test of a state's figures (`figuresFinite` in physics/moistAir.ts), which every
 * solve and every state result passes through: the same answer as testing the figures one by one,
 * for every figure made infinite or NaN in turn, and, for the engine's own states, read from
 * the array of figures with no getter called (work counted, never timed). The figures are
 * invented; no physical value is checked here.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { MoistAir, STATE_FIGURES, figuresFinite, moistAir, stateRecord } from '../src/physics/moistAir';
import { solveState } from '../src/physics';
import { stateFinite } from '../src/evaluate/state';

/** An invented state's thirteen figures, each finite, in the order of STATE_FIGURES. */
const FIGURES = [101325, 24, 17.1, 12.9, 0.5, 0.0093, 47.8e3, 0.855, 1.18, 1.49e3, 2.98e3, 0.0188, 0.49];

/** The state of `figures` (as the engine builds one). */
function stateOf(figures: readonly number[]) {
  const f = figures;
  return moistAir(f[0]!, f[1]!, f[2]!, f[3]!, f[4]!, f[5]!, f[6]!, f[7]!, f[8]!, f[9]!, f[10]!, f[11]!, f[12]!, false);
}

/** The answer figure by figure: every figure finite, or (`realOnly`) every one but p, dp and ws. */
function oneByOne(figures: readonly number[], realOnly: boolean): boolean {
  return STATE_FIGURES.every(
    (name, k) => (realOnly && ['p', 'dp', 'ws'].includes(name)) || Number.isFinite(figures[k]),
  );
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe("a state's figures tested for finiteness", () => {
  it('gives the answer of the figures tested one by one, with each figure not finite in turn', () => {
    for (const bad of [Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, Number.NaN]) {
      for (let k = 0; k < FIGURES.length; k++) {
        const figures = FIGURES.slice();
        figures[k] = bad;
        const s = stateOf(figures);
        // A plain object of the same fields takes the path figure by figure.
        const plain = stateRecord(s);
        for (const realOnly of [true, false]) {
          const expected = oneByOne(figures, realOnly);
          expect(figuresFinite(s, realOnly), `${STATE_FIGURES[k]}=${bad} realOnly=${realOnly}`).toBe(expected);
          expect(figuresFinite(plain, realOnly)).toBe(expected);
        }
        expect(stateFinite(s)).toBe(false);
      }
    }
    expect(figuresFinite(stateOf(FIGURES), false)).toBe(true);
    // Negative and zero figures are finite (x·0 is −0 or 0).
    expect(figuresFinite(stateOf(FIGURES.map((x) => -x)), false)).toBe(true);
    expect(figuresFinite(stateOf(FIGURES.map(() => 0)), false)).toBe(true);
  });

  it("reads an engine state's figures from its array: no getter called by the solve's checks or the result's", () => {
    const solved = solveState({ db: 24, rh: 0.5 }, 101325);
    expect(solved.ok).toBe(true);
    const state = (solved as { state: unknown }).state as MoistAir;
    expect(state).toBeInstanceOf(MoistAir);
    const getters = STATE_FIGURES.map((name) => vi.spyOn(MoistAir.prototype, name, 'get'));
    expect(stateFinite(state)).toBe(true);
    for (const g of getters) expect(g).not.toHaveBeenCalled();
    // A solve checks its state and looks for warnings (dp, wb, ws) without a getter either.
    const again = solveState({ db: 24, rh: 0.5 }, 101325);
    expect(again.ok).toBe(true);
    const called = STATE_FIGURES.filter((_, k) => getters[k]!.mock.calls.length > 0);
    expect(called).toEqual([]);
  });
});
