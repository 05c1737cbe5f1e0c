/**
 * Claims: the band is half a unit of the last written digit, or the explicit ± figure; a failed
 * claim is a warning that shows the computed value in the claim's unit and carries quick-fix data.
 * The bands are checked around the evaluator's own computed value (its correctness is checked in
 * evaluate-states against sourced figures), so these tests are about the comparison rule.
 */
import { describe, expect, it } from 'vitest';
import { analyse, fence, spanText, stateResult, withCode } from './evaluate-helpers';
import type { ClaimResult } from '../src/evaluate/types';

/** The computed rh (in %) of db=24C w=9.3g/kg at sea level, through a claim that certainly fails. */
function computedRhPct(): number {
  const a = analyse(fence('state A: db=24C w=9.3g/kg rh=1%'));
  const c = stateResult(a, 'A').claims[0] as ClaimResult;
  return c.computedSI * 100;
}

/** Evaluates a claim on db=24C w=9.3g/kg and returns whether it passed, and the diagnostics. */
function claim(text: string) {
  const src = fence(`state A: db=24C w=9.3g/kg ${text}`);
  const a = analyse(src);
  const c = stateResult(a, 'A').claims[0];
  return { a, c, src };
}

describe('claim bands', () => {
  const rh = computedRhPct();

  it('half a unit of the last digit: integer percent', () => {
    const inside = Math.round(rh); // |rh − round(rh)| ≤ 0.5 by construction
    expect(claim(`rh=${inside}%`).c!.pass).toBe(true);
    expect(claim(`rh=${inside + 1}%`).c!.pass).toBe(Math.abs(rh - (inside + 1)) <= 0.5);
    expect(claim(`rh=${inside + 2}%`).c!.pass).toBe(false);
  });

  it('one more written digit narrows the band tenfold', () => {
    const tenth = Math.round(rh * 10) / 10;
    expect(claim(`rh=${tenth.toFixed(1)}%`).c!.pass).toBe(true);
    expect(claim(`rh=${(tenth + 0.2).toFixed(1)}%`).c!.pass).toBe(false);
    expect(claim(`rh=${(tenth - 0.2).toFixed(1)}%`).c!.pass).toBe(false);
  });

  it('the tolerance is half the resolution (0.5 at 1, 0.05 at 0.1)', () => {
    expect(claim('rh=50%').c!.toleranceSI).toBeCloseTo(0.005, 12);
    expect(claim('rh=50.0%').c!.toleranceSI).toBeCloseTo(0.0005, 12);
    expect(claim('h=47.81kJ/kg').c!.toleranceSI).toBeCloseTo(5, 9);
  });

  it('an explicit ± tolerance replaces the digit rule', () => {
    const off = Math.round(rh) + 3;
    expect(claim(`rh=${off}%`).c!.pass).toBe(false);
    expect(claim(`rh=${off}%±4`).c!.pass).toBe(true);
    expect(claim(`rh=${off}%±4`).c!.toleranceSI).toBeCloseTo(0.04, 12);
  });

  it('a ±% tolerance on a non-% value is relative to the written figure', () => {
    const c = claim('h=50kJ/kg±10%').c!;
    expect(c.toleranceSI).toBeCloseTo(5000, 9);
  });

  it('a tolerance in another unit of the same kind converts as a difference (1 K = 1.8 °F)', () => {
    const a = analyse(fence('state A: db=24C w=9.3g/kg dp=55F±1C'));
    expect(stateResult(a, 'A').claims[0]!.toleranceSI).toBeCloseTo(1, 12);
  });
});

describe('claim-mismatch warnings', () => {
  it('shows the computed value in the claim unit and carries quick-fix data', () => {
    const { a, src } = claim('rh=80%');
    const d = withCode(a, 'claim-mismatch');
    expect(d).toHaveLength(1);
    expect(d[0]!.severity).toBe('warning');
    expect(spanText(src, d[0]!)).toBe('80');
    const data = d[0]!.data as {
      computedText: string;
      replacement: string;
      replaceSpan: { start: number; end: number };
    };
    expect(data.computedText).toMatch(/^\d+\.\d%$/);
    expect(data.computedText).toBe(`${data.replacement}%`);
    expect(src.slice(data.replaceSpan.start, data.replaceSpan.end)).toBe('80');
    expect(d[0]!.message).toContain(data.computedText);
  });

  it('a replaced claim passes', () => {
    const { a } = claim('rh=80%');
    const data = withCode(a, 'claim-mismatch')[0]!.data as { replacement: string };
    expect(claim(`rh=${data.replacement}%`).c!.pass).toBe(true);
  });

  it('claims in °F keep the °F unit in the computed text', () => {
    const src = fence('state A: db=24C w=9.3g/kg dp=40F');
    const a = analyse(src);
    const d = withCode(a, 'claim-mismatch');
    expect(d).toHaveLength(1);
    expect((d[0]!.data as { computedText: string }).computedText).toMatch(/F$/);
  });

  it('checkClaims false compares nothing', () => {
    const a = analyse(fence('state A: db=24C w=9.3g/kg rh=80%'), { checkClaims: false });
    expect(withCode(a, 'claim-mismatch')).toEqual([]);
    expect(stateResult(a, 'A').claims).toEqual([]);
    expect(stateResult(a, 'A').state).not.toBeNull();
  });

  it('a claim with a unit error is reported once and the state is still computed', () => {
    const a = analyse(fence('state A: db=24C w=9.3g/kg h=48kPa'));
    expect(withCode(a, 'unknown-unit')).toHaveLength(1);
    expect(stateResult(a, 'A').state).not.toBeNull();
  });
});
