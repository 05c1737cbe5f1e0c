/** Claims: a written figure beyond what defines a result, compared with the computed value. */
import type { CoreDiagnostic, PropertyNode } from '../notation/ast';
import type { ClaimResult } from './types';
import type { ResolvedQuantity } from './quantity';
import { formatInUnit } from '../units';
import { formatAtResolution } from './util';
import { withThousandsSeparators } from '../notation/number';

/** Relative slack added to every band so that a value exactly on the edge passes despite rounding. */
const EDGE_SLACK = 1e-9;

/**
 * The computed value in the claim's own unit, at the finer of the written precision and the
 * unit's display precision, without the unit (`rh=50%` → `49.6`).
 */
export function computedNumberText(computedSI: number, q: ResolvedQuantity): string {
  const text = q.unit
    ? formatInUnit(computedSI, q.unit, q.quantity.number.resolution, '')
    : formatAtResolution(computedSI, q.quantity.number.resolution);
  // Written with thousands separators (`169,100`): the replacement keeps them (`171,420`).
  return q.quantity.number.text.includes(',') ? withThousandsSeparators(text) : text;
}

/** Whether the written value agrees with the computed one within the band. */
export function claimPasses(writtenSI: number, computedSI: number, toleranceSI: number): boolean {
  const diff = Math.abs(writtenSI - computedSI);
  const slack = EDGE_SLACK * Math.max(Math.abs(writtenSI), Math.abs(computedSI), toleranceSI) + 1e-15;
  return diff <= toleranceSI + slack;
}

/**
 * Compares a claim and returns its result, plus a `claim-mismatch` warning when it fails. The
 * warning's data holds what a quick fix needs: `computedText` (`17.1C`), `replacement` (`17.1`,
 * the new digits) and `replaceSpan` (the written number's span).
 * @param context  what the computed value follows from, e.g. "from db=24C and rh=50%" (or a
 *                 function that builds it, called only for a failed claim).
 */
export function checkClaim(
  key: string,
  prop: PropertyNode,
  q: ResolvedQuantity,
  computedSI: number,
  context: string | (() => string),
): { claim: ClaimResult; diagnostic: CoreDiagnostic | null } {
  const pass = Number.isFinite(computedSI) && claimPasses(q.si, computedSI, q.toleranceSI);
  if (pass) {
    // A passing claim shows the computed value at its own written precision (cheap, and it is
    // what the writer would see rounded the same way).
    const inUnit = q.unit ? (computedSI - q.unit.offset) / q.unit.scale : computedSI;
    const claim: ClaimResult = {
      key,
      prop,
      writtenSI: q.si,
      computedSI,
      toleranceSI: q.toleranceSI,
      pass,
      computedText: `${formatAtResolution(inUnit, q.quantity.number.resolution)}${q.unitText}`,
    };
    return { claim, diagnostic: null };
  }
  const replacement = computedNumberText(computedSI, q);
  const computedText = `${replacement}${q.unitText}`;
  const claim: ClaimResult = {
    key,
    prop,
    writtenSI: q.si,
    computedSI: Number.isFinite(computedSI) ? computedSI : 0,
    toleranceSI: q.toleranceSI,
    pass,
    computedText,
  };
  if (typeof context === 'function') context = context();
  const written = `${key}=${q.quantity.number.text}${q.unitText}`;
  const digitBand = (q.quantity.number.resolution / 2) * Math.abs(q.unit?.scale ?? 1);
  const band = q.explicitTolerance
    ? 'outside its written tolerance'
    : q.toleranceSI > digitBand * (1 + 1e-9)
      ? 'more than half a unit of its last significant digit away (trailing zeros of a whole number do not count)'
      : 'more than half a unit of its last digit away';
  const diagnostic: CoreDiagnostic = {
    code: 'claim-mismatch',
    severity: 'warning',
    message:
      `stale claim ${written}: computed ${key}=${computedText} ${context}, ${band}; ` +
      `update it to ${computedText} or check the figures it follows from`,
    span: q.quantity.number.span,
    data: {
      key,
      computedText,
      replacement,
      replaceSpan: { ...q.quantity.number.span },
      writtenSI: q.si,
      computedSI: claim.computedSI,
      toleranceSI: q.toleranceSI,
    },
  };
  return { claim, diagnostic };
}
