/**
 * Property tests (fast-check, fixed seed): evaluating random valid states, mixes and processes
 * never throws and leaves no NaN or Infinity anywhere in the analysis.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyse, fence } from './evaluate-helpers';
import { allFinite } from '../src/evaluate';

const SEED = 20261201;

const temp = fc.double({ min: -40, max: 60, noNaN: true }).map((x) => Math.round(x * 10) / 10);
const rh = fc.integer({ min: 1, max: 100 });
const stateLine = fc.tuple(temp, rh, fc.constantFrom('rh', 'wb', 'dp')).map(([t, r, kind]) => {
  if (kind === 'rh') return `db=${t}C rh=${r}%`;
  // wb / dp a fraction of the way below db (always at or below it).
  const below = Math.round((t - (r / 100) * 15) * 10) / 10;
  return `db=${t}C ${kind}=${below}C`;
});

describe('evaluation yields finite numbers only', () => {
  it('random states, a mix and processes between them', () => {
    fc.assert(
      fc.property(
        fc.array(stateLine, { minLength: 2, maxLength: 6 }),
        fc.integer({ min: 0, max: 100 }),
        fc.constantFrom('SI', 'IP'),
        fc.integer({ min: -400, max: 4000 }),
        (states, pct, units, elev) => {
          const lines = [
            `site: elev=${elev}m`,
            `units: ${units}`,
            ...states.map((s, i) => `state S${i}: ${s} h=50kJ/kg`),
          ];
          lines.push(`mix M: S0 ${pct}% + S1 ${100 - pct}%`);
          lines.push('process P: S0 -> S1 m=2kg/s q_total=10kW shr=0.5 water=1kg/h');
          lines.push('process Q: M -> S1 q=1m3/s');
          const a = analyse(fence(...lines));
          const plain = {
            items: a.items.map((i) => ({ ...i, statement: null })),
            diagnostics: a.diagnostics,
            units: a.units,
          };
          expect(allFinite(plain)).toBe(true);
          for (const d of a.diagnostics) {
            expect(d.message).not.toMatch(/NaN|Infinity/);
          }
        },
      ),
      { seed: SEED, numRuns: 200 },
    );
  });
});
