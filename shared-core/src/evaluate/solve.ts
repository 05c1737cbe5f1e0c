/**
 * The state solver as the evaluator uses it: the engine's `solveState`, with air above the boiling
 * point at its pressure taken as the real air it is (dryer and oven exhaust: `db=150C rh=5%` at
 * 101.325 kPa). Such air has every property except a saturation humidity ratio, which the engine
 * gives as +Infinity with a warning; a note's results hold only finite numbers, so the result
 * carries `ws = Number.MAX_VALUE` (unbounded) and no warning. A state that needs saturation at
 * that pressure (a wet-bulb or dew point at or above the boiling point, rh·p_ws ≥ p) is still the
 * engine's `pressure-below-saturation` error.
 */
import { solveState } from '../physics';
import { withWs } from '../physics/moistAir';
import type { DefiningKey, MoistAirState, SolveResult } from '../physics/types';

/** True for air at or above the boiling point at its pressure (it cannot be saturated). */
export function aboveBoilingPoint(s: MoistAirState): boolean {
  return !s.fog && s.pws >= s.p;
}

/** {@link solveState} for notes: superheated air is a state like any other (see the module comment). */
export function solveForNote(
  input: Parameters<typeof solveState>[0],
  p: number,
  options?: Parameters<typeof solveState>[2],
): SolveResult {
  const r = solveState(input, p, options);
  if (!r.ok || Number.isFinite(r.state.ws) || !aboveBoilingPoint(r.state)) return r;
  return {
    ok: true,
    state: withWs(r.state, Number.MAX_VALUE),
    warnings: r.warnings.filter((w) => w.code !== 'pressure-below-saturation'),
  };
}

/**
 * A solve that never throws: the engine promises not to, and if it does anyway its failure is a
 * `no-solution` problem with the fix `fix` on the keys `keys`, reported like any other.
 */
export function solveOrProblem(
  solve: typeof solveForNote,
  input: Parameters<typeof solveState>[0],
  pa: number,
  options: Parameters<typeof solveState>[2],
  fix: string,
  keys: DefiningKey[],
): SolveResult {
  try {
    return solve(input, pa, options);
  } catch (err) {
    return {
      ok: false,
      problem: {
        code: 'no-solution',
        message: `the engine failed (${err instanceof Error ? err.message : String(err)})`,
        fix,
        keys,
      },
    };
  }
}
