/**
 * Diagnostics as the editor gets them: the evaluator's codes, spans on the offending token, and
 * claim warnings only while claims are checked.
 */
import { describe, expect, it } from 'vitest';
import { countDiagnostics, noteDiagnostics } from '../src/service';
import { air, noteOf } from './service-helpers';

function codes(text: string, checkClaims = true): string[] {
  return noteDiagnostics(noteOf(text, { checkClaims })).map((d) => `${d.code}@${text.slice(d.span.start, d.span.end)}`);
}

describe('diagnostics', () => {
  it('reports a missing unit on the number and an impossible state', () => {
    expect(codes(air('state A: db=24 rh=50%'))).toEqual(['missing-unit@24']);
    expect(codes(air('state LOG7: db=20C wb=25C')).map((c) => c.split('@')[0])).toEqual(['wb-above-db']);
  });

  it('reports a stale claim only while claims are checked', () => {
    // ASHRAE HoF 2017 SI Ch.1 Example 1: RH 14 % at 40 °C db / 20 °C wb, so rh=20% is stale.
    const text = air('state OA: db=40C wb=20C rh=20%');
    expect(codes(text)).toEqual(['claim-mismatch@20']);
    expect(codes(text, false)).toEqual([]);
  });

  it('counts errors and warnings', () => {
    const note = noteOf(air('state A: db=24 rh=50%', 'state OA: db=40C wb=20C rh=20%'));
    expect(countDiagnostics(note)).toEqual({ errors: 1, warnings: 1 });
  });

  it('has nothing to say about a note without statements', () => {
    expect(codes('# Just prose\n\nNo air here.\n')).toEqual([]);
  });
});
