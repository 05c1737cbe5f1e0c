/**
 * Propagation through references (property-based, fast-check, fixed seeds): in a chain written
 * with references (outdoor air → preheated air → mixed air → supply air, the preheater's process), every
 * figure is written as a fine claim from a first analysis; then one upstream input is changed.
 * Afterwards
 * - every figure that depends on the changed input has changed, and every claim on it fails
 *   (no downstream claim passes on a stale value);
 * - every figure that does not depend on it is unchanged, and its claims still pass;
 * - the incremental analyzer, fed the edit, gives the same analysis as a fresh one.
 * No figure here has a published source: the test is about what changes, not about values (the
 * values of each form are checked against sources in evaluate-references.test.ts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeNote, createAnalyzer } from '../src/analyze';
import type { Analysis, ProcessResult, StateResult } from '../src/evaluate/types';

interface Inputs {
  oaDb: number;
  oaWb: number;
  heat: number;
  raDb: number;
  raRh: number;
  oaPct: number;
  rise: number;
}

/** A difference with its sign (`+2`, `-1`, `+0`). */
function signed(v: number): string {
  return v < 0 ? `${v}` : `+${v}`;
}

/** The chain; `claims` holds the written claims per statement name ('' for none). */
function chain(x: Inputs, claims: Record<string, string> = {}): string {
  const c = (n: string) => (claims[n] ? ` ${claims[n]}` : '');
  return [
    '```air',
    `state OA: db=${x.oaDb}C wb=${x.oaWb}C${c('OA')}`,
    `state PRE: db=OA.db${signed(x.heat)}K w=OA.w${c('PRE')}`,
    `state RA: db=${x.raDb}C rh=${x.raRh}%${c('RA')}`,
    `mix MA: PRE ${x.oaPct}% + RA ${100 - x.oaPct}%${c('MA')}`,
    `state SA: db=MA.db${signed(x.rise)}K w=MA.w${c('SA')}`,
    `process HC: OA -> PRE m=2kg/s${c('HC')}`,
    '```',
    '',
  ].join('\n');
}

/** Which statements depend on each input (by the references and streams of the chain). */
const DEPENDENTS: Record<keyof Inputs, string[]> = {
  oaDb: ['OA', 'PRE', 'MA', 'SA', 'HC'],
  oaWb: ['OA', 'PRE', 'MA', 'SA', 'HC'],
  heat: ['PRE', 'MA', 'SA', 'HC'],
  raDb: ['RA', 'MA', 'SA'],
  raRh: ['RA', 'MA', 'SA'],
  oaPct: ['MA', 'SA'],
  rise: ['SA'],
};
const NAMES = ['OA', 'PRE', 'RA', 'MA', 'SA', 'HC'];

/** The figures of an item that the claims pin: h (and db, w for states), q_total for the process. */
function figures(a: Analysis, name: string): number[] {
  const item = a.items.find((i) => i.name === name)!;
  if (item.kind === 'process') return [(item as ProcessResult).qTotalW!];
  const s = (item as StateResult).state!;
  return [s.h, s.db, s.w];
}

/** Fine claims of every figure (h to 0.1 J/kg, db to 1e-5 K, w to 1e-6 g/kg, q_total to 0.01 W). */
function claimsOf(a: Analysis): Record<string, string> {
  const out: Record<string, string> = {};
  for (const n of NAMES) {
    const f = figures(a, n);
    const item = a.items.find((i) => i.name === n)!;
    if (item.kind === 'process') out[n] = `q_total=${f[0]!.toFixed(2)}W`;
    else {
      // A state does not claim the properties that define it (a mix's come from its balance).
      const defining = new Set(item.kind === 'state' ? (item as StateResult).defining : []);
      const parts = [`h=${(f[0]! / 1000).toFixed(4)}kJ/kg`];
      if (!defining.has('db')) parts.push(`db=${f[1]!.toFixed(5)}C`);
      if (!defining.has('w')) parts.push(`w=${(f[2]! * 1000).toFixed(6)}g/kg`);
      out[n] = parts.join(' ');
    }
  }
  return out;
}

const inputs = fc.record({
  oaDb: fc.integer({ min: 26, max: 36 }),
  oaWb: fc.integer({ min: 16, max: 22 }),
  heat: fc.integer({ min: 1, max: 8 }),
  raDb: fc.integer({ min: 22, max: 26 }),
  raRh: fc.integer({ min: 40, max: 60 }),
  oaPct: fc.integer({ min: 10, max: 60 }),
  rise: fc.integer({ min: 1, max: 4 }),
});
const change = fc.record({
  input: fc.constantFrom<keyof Inputs>('oaDb', 'oaWb', 'heat', 'raDb', 'raRh', 'oaPct', 'rise'),
  by: fc.constantFrom(-2, -1, 1, 2),
});

describe('a change upstream reaches every figure downstream', () => {
  it('changes every dependent figure, fails every stale claim, leaves the rest alone (and the analyzer agrees)', () => {
    fc.assert(
      fc.property(inputs, change, (x, ch) => {
        const base = analyzeNote(chain(x));
        expect(base.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
        const claims = claimsOf(base);
        const written = chain(x, claims);
        const analyzer = createAnalyzer();
        const before = analyzer.analyze(written);
        // Every claim passes before the change (the claims are the figures themselves).
        expect(before.diagnostics.filter((d) => d.code === 'claim-mismatch')).toEqual([]);

        const y = { ...x, [ch.input]: x[ch.input] + ch.by };
        const after = analyzeNote(chain(y, claims));
        expect(analyzer.analyze(chain(y, claims))).toStrictEqual(after);
        const stale = new Set(
          after.diagnostics
            .filter((d) => d.code === 'claim-mismatch')
            .map(
              (d) =>
                after.items.find((i) => i.statement.span.start <= d.span.start && d.span.end <= i.statement.span.end)!
                  .name,
            ),
        );
        for (const n of NAMES) {
          const dependent = DEPENDENTS[ch.input].includes(n);
          const was = figures(base, n);
          const now = figures(after, n);
          if (dependent) {
            expect(now[0], `${n} depends on ${ch.input}`).not.toBe(was[0]);
            expect(stale.has(n), `${n}'s claims are stale after ${ch.input} ${ch.by}`).toBe(true);
          } else {
            expect(now, `${n} does not depend on ${ch.input}`).toEqual(was);
            expect(stale.has(n), `${n}'s claims still hold`).toBe(false);
          }
        }
      }),
      { seed: 1107, numRuns: 60 },
    );
  });

  it('every claim of a dependent state on a reference fails, not only one of them', () => {
    const x: Inputs = { oaDb: 32, oaWb: 20, heat: 4, raDb: 24, raRh: 50, oaPct: 30, rise: 2 };
    const claims = claimsOf(analyzeNote(chain(x)));
    const after = analyzeNote(chain({ ...x, oaWb: 21 }, claims));
    const pre = after.items.find((i) => i.name === 'PRE') as StateResult;
    // PRE is defined by db and w (both references); h is its one claim, and it is stale.
    expect(pre.defining).toEqual(['db', 'w']);
    expect(pre.claims.map((c) => [c.key, c.pass])).toEqual([['h', false]]);
    const ma = after.items.find((i) => i.name === 'MA') as StateResult;
    expect(ma.claims.map((c) => [c.key, c.pass])).toEqual([
      ['h', false],
      ['db', false],
      ['w', false],
    ]);
  });
});
