/**
 * The problems of a block name their statement (the subject). One block with thousands of
 * problems must cost as many steps as statements and problems together, not their product: the
 * test counts the reads of the note's statements (the list handed in is wrapped), never the time.
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import type { Analysis } from '../src/evaluate/types';
import type { Statement } from '../src/notation/ast';
import { blockResults } from '../src/present/blockResults';

/** The analysis with its statement list wrapped so that every element read is counted. */
function counted(analysis: Analysis): { analysis: Analysis; reads: () => number } {
  let reads = 0;
  const statements = new Proxy(analysis.parsed.statements, {
    get(target, key, receiver) {
      if (typeof key === 'string' && /^\d+$/.test(key)) reads++;
      return Reflect.get(target, key, receiver) as unknown;
    },
  }) as Statement[];
  return { analysis: { ...analysis, parsed: { ...analysis.parsed, statements } }, reads: () => reads };
}

/** A block of `n` states whose wet bulb is above the dry bulb (one error each, common practice: wb ≤ db). */
function erroneousBlock(n: number, tag: string): string {
  const lines = [`# ${tag} (invented)`, '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state ${tag}${i}: db=20C wb=${25 + (i % 5)}C`);
  lines.push('```', '');
  return lines.join('\n');
}

describe('block results: the subject of each problem', () => {
  it('walks the statements once for a block with thousands of problems', () => {
    for (const n of [1000, 4000]) {
      const plain = analyzeNote(erroneousBlock(n, `Z${n}x`));
      const { analysis, reads } = counted(plain);
      const data = blockResults(analysis, plain.parsed.regions[0]!);
      expect(data.problems.length).toBe(n);
      // Every problem names its own state.
      data.problems.forEach((p, i) => {
        expect(p.subject).toBe(`Z${n}x${i}`);
      });
      // Linear: a few reads per statement and per problem (the old rescan read n²/2, 8 million for 4000).
      expect(reads()).toBeLessThanOrEqual(6 * (n + data.problems.length) + 64);
      expect(reads()).toBeGreaterThanOrEqual(n); // the count does see the reads
    }
  });

  it(
    'names the statement a problem lies in, none for a problem ' +
      'outside every statement, and the last of touching ones',
    () => {
      const text = [
        '```air',
        'state A: db=20C wb=25C',
        'state : db=20C rh=50%',
        'state B: db=20C rh=150%',
        'units: XY',
        'state C: db=21C rh=40% h=99kJ/kg',
        '```',
        '',
      ].join('\n');
      const analysis = analyzeNote(text);
      const data = blockResults(analysis, analysis.parsed.regions[0]!);
      const subjects = data.problems.map((p) => `${p.code}:${p.subject ?? '-'}`);
      // The unnamed state and the units line have no name: their problems have no subject.
      expect(subjects).toEqual(expect.arrayContaining(['missing-name:-', 'unknown-unit-system:-', 'claim-mismatch:C']));
      expect(subjects.find((s) => s.endsWith(':A'))).toBeDefined();
      expect(subjects.find((s) => s.endsWith(':B'))).toBeDefined();
      // Same subjects as reading every statement for every problem (the definition).
      const statements = analysis.parsed.statements;
      const expected = analysis.diagnostics
        .filter((d) => d.severity !== 'info')
        .map((d) => {
          let subject: string | null = null;
          for (const s of statements) {
            if (s.span.start > d.span.start) break;
            if (d.span.start <= s.span.end) subject = 'name' in s && s.name ? s.name.text : null;
          }
          return `${d.code}:${subject ?? '-'}`;
        });
      expect(subjects).toEqual(expected);
    },
  );
});
