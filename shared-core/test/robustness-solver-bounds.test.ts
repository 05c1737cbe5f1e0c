/**
 * Every iterative solve is bounded and turns "bound hit" into the typed `no-convergence` problem:
 * each iteration is forced to give up (the module that iterates is replaced by one that reports
 * its bound as hit), and the solver, the evaluator and the language service must answer with a
 * `no-convergence` problem or diagnostic — no exception, no loop, no NaN in the result. Also the
 * bracketed root finder itself stops at its iteration bound on a function it cannot converge on.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';

afterEach(() => {
  vi.doUnmock('../src/physics/roots');
  vi.doUnmock('../src/physics/saturation');
  vi.doUnmock('../src/physics/wetbulb');
  vi.resetModules();
});

const NOTE = [
  '```air',
  'state A: db=24C rh=50%',
  'state B: wb=18C rh=40%',
  'state C: rh=50% h=50kJ/kg',
  'mix M: A 50% + B 50%',
  'process P: A -> M m=1kg/s',
  '```',
  '',
].join('\n');

async function freshEngine() {
  const physics = await import('../src/physics');
  const { allFinite } = await import('../src/evaluate');
  const { analyzeNote } = await import('../src/analyze');
  return { physics, evaluate: { allFinite, analyzeNote } };
}

describe('a solver that hits its bound reports no-convergence', () => {
  it('the bracketed root finder stops at maxIter and returns NaN (callers turn that into no-convergence)', async () => {
    const { findRoot } = await import('../src/physics/roots');
    // Each iteration evaluates the function once: the evaluations count the iterations.
    let calls = 0;
    const counted = (f: (t: number) => number) => (t: number) => {
      calls++;
      return f(t);
    };
    // A sign change with a tolerance no bracket can reach: only the bound stops it.
    const x = findRoot(
      counted((t) => (t < 0.3 ? -1 : 1)),
      0,
      1,
      -1,
      1,
      0,
      25,
    );
    expect(calls).toBe(25);
    // Either the bracket collapsed onto the jump or the bound was hit: never an endless loop.
    expect(Number.isNaN(x) || Math.abs(x - 0.3) < 1e-12).toBe(true);
    calls = 0;
    const y = findRoot(
      counted((t) => Math.sign(t - Math.PI)),
      0,
      10,
      -1,
      1,
      -1,
      7,
    );
    expect(calls).toBe(7);
    expect(y).toBeNaN();
  });

  it('root finder at its bound: wb+rh and rh+h give no-convergence', async () => {
    vi.doMock('../src/physics/roots', () => ({ findRoot: () => Number.NaN }));
    const { physics, evaluate } = await freshEngine();
    const wbRh = physics.solveState({ wb: 18, rh: 0.4 }, 101_325);
    expect(wbRh.ok ? 'solved' : wbRh.problem.code).toBe('no-convergence');
    const rhH = physics.solveState({ rh: 0.5, h: 50_000 }, 101_325);
    expect(rhH.ok ? 'solved' : rhH.problem.code).toBe('no-convergence');
    // db+rh needs no root finder: still solved.
    expect(physics.solveState({ db: 24, rh: 0.5 }, 101_325).ok).toBe(true);
    const a = evaluate.analyzeNote(NOTE);
    expect(evaluate.allFinite(a)).toBe(true);
    const codes = a.diagnostics.map((d) => d.code);
    expect(codes.filter((c) => c === 'no-convergence').length).toBe(2); // B and C
    const b = a.diagnostics.find((d) => d.message.startsWith('state B:'));
    expect(b?.severity).toBe('error');
    expect(b?.message).toMatch(/did not converge/);
  });

  it('saturation-temperature inversion at its bound: dew points and dp pairs give no-convergence', async () => {
    vi.doMock('../src/physics/saturation', async (importOriginal) => {
      const real = await importOriginal<typeof import('../src/physics/saturation')>();
      return { ...real, satTempFromLn: () => Number.NaN, satTempRaw: () => Number.NaN };
    });
    const { physics, evaluate } = await freshEngine();
    const r = physics.solveState({ db: 24, rh: 0.5 }, 101_325);
    expect(r.ok ? 'solved' : r.problem.code).toBe('no-convergence');
    expect(r.ok ? '' : r.problem.message).toMatch(/dew-point/);
    const a = evaluate.analyzeNote(NOTE);
    expect(evaluate.allFinite(a)).toBe(true);
    expect(a.diagnostics.some((d) => d.code === 'no-convergence' && d.message.startsWith('state A:'))).toBe(true);
    // Dependents are not evaluated twice over: a short info, not a second error.
    const mix = a.diagnostics.filter((d) => d.message.startsWith('mix M'));
    expect(mix.length).toBeGreaterThan(0);
    for (const d of mix) expect([d.code, d.severity]).toEqual(['unresolved-dependency', 'info']);
  });

  it('wet-bulb iteration at its bound: every state that needs its wet-bulb gives no-convergence', async () => {
    vi.doMock('../src/physics/wetbulb', async (importOriginal) => {
      const real = await importOriginal<typeof import('../src/physics/wetbulb')>();
      return { ...real, wetBulbSolve: () => Number.NaN };
    });
    const { physics, evaluate } = await freshEngine();
    const r = physics.solveState({ db: 24, rh: 0.5 }, 101_325);
    expect(r.ok ? 'solved' : r.problem.code).toBe('no-convergence');
    expect(r.ok ? '' : r.problem.message).toMatch(/wet-bulb/);
    // A pair that gives the wet-bulb itself does not iterate for it.
    expect(physics.solveState({ db: 24, wb: 17 }, 101_325).ok).toBe(true);
    const a = evaluate.analyzeNote(NOTE);
    expect(evaluate.allFinite(a)).toBe(true);
    expect(a.diagnostics.some((d) => d.code === 'no-convergence' && d.message.startsWith('state A:'))).toBe(true);
  });

  it('the language service answers on a note whose solves all fail (hover, hints, outline)', async () => {
    vi.doMock('../src/physics/roots', () => ({ findRoot: () => Number.NaN }));
    vi.doMock('../src/physics/wetbulb', async (importOriginal) => {
      const real = await importOriginal<typeof import('../src/physics/wetbulb')>();
      return { ...real, wetBulbSolve: () => Number.NaN };
    });
    const service = await import('../src/service');
    const note = service.analyzeText(NOTE, service.DEFAULT_SERVICE_SETTINGS);
    const at = NOTE.indexOf('state B') + 6;
    const h = service.hover(note, at);
    expect(h?.markdown ?? '').not.toMatch(/NaN|Infinity/);
    expect(service.inlayHints(note, { start: 0, end: NOTE.length }).length).toBe(0); // nothing computed, nothing hinted
    expect(service.documentSymbols(note).length).toBeGreaterThan(0);
    expect(service.noteDiagnostics(note).some((d) => d.code === 'no-convergence')).toBe(true);
  });
});
