/**
 * The "from" column of `dewmark eval`'s states table says where each state came from: the
 * properties that fixed it (and the state each reference took its value from), a mix's streams, a
 * supply's room and flow, or the process or heat recovery that defined it from another state. Its
 * text is the results row's (`shared-core/src/present/rows.ts`), so it reads as the rest of the
 * figures do. No figure here needs a published source: the test is about words and layout (the
 * flows shown are the engine's own, formatted at three significant figures, docs/notation.md).
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../../shared-core/src/analyze';
import { fileResult, statesTable } from '../src/output';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** The "from" cell of each row of the states table, by state name (the last column). */
function fromColumn(text: string): Map<string, string> {
  const table = statesTable(fileResult('note.md', text, analyzeNote(text)))!;
  const lines = table.split('\n');
  const start = lines[0]!.indexOf('from');
  expect(start).toBeGreaterThan(0);
  const out = new Map<string, string>();
  for (const line of lines.slice(2)) out.set(line.split(' ')[0]!, line.slice(start));
  return out;
}

const air = (...lines: string[]) => ['```air', ...lines, '```', ''].join('\n');

describe('the from column of dewmark eval', () => {
  it('names the source of every state of a chain, with the supply flow and its unit', () => {
    const from = fromColumn(
      air(
        'state OA: db=32C wb=22.5C',
        'state RA: db=24C rh=50%',
        'state PH: db=OA.db+8K w=OA.w',
        'state DRY: db=20C w=OA.w',
        'state X: db=RA.db dp=OA.dp',
        'supply SA: RA q_sensible=40kW q_latent=10kW m=4kg/s',
        'recover HX: OA -> OAHX m=1kg/s, RA -> EAHX m=1kg/s eff_s=0.7',
        'mix MA: OAHX 1kg/s + RA rest total=4kg/s',
        'process CC: MA -> OFF db=12C w=SA.w',
        'process FAN: OFF -> FANOFF dp_fan=750Pa eff=0.62',
        'state BAD: db=20C wb=25C',
      ),
    );
    expect(Object.fromEntries(from)).toEqual({
      OA: 'db+wb',
      RA: 'db+rh',
      PH: 'db+w from OA',
      DRY: 'db, w from OA',
      X: 'db from RA, dp from OA',
      // 4 kg/s at three significant figures (docs/notation.md, "How figures are shown").
      SA: 'supply from RA loads, 4.00 kg/s',
      OAHX: 'HX from OA',
      EAHX: 'HX from RA',
      MA: 'OAHX 25.0 % + RA 75.0 %',
      OFF: 'CC from MA',
      FANOFF: 'FAN from OFF',
      BAD: 'not computed (see diagnostics)',
    });
  });

  it('shows the supply flow in the note’s units (lb/h in an IP note), never a bare number', () => {
    const from = fromColumn(
      air('units: IP', 'state RA: db=75F rh=50%', 'supply SA: RA q_sensible=120000Btu/h q_latent=20000Btu/h db=55F'),
    );
    expect(from.get('SA')).toMatch(/^supply from RA loads, [\d,]+ lb\/h$/);
  });

  it('on the demo note: every state has a source, and no line of the table is longer than 120 characters', () => {
    const text = readFileSync(join(root, 'examples', 'kestrel-ridge-ahu1.md'), 'utf8');
    const table = statesTable(fileResult('demo.md', text, analyzeNote(text)))!;
    for (const [name, cell] of fromColumn(text)) expect(cell.trim(), name).not.toBe('');
    for (const line of table.split('\n')) expect(line.length, line).toBeLessThanOrEqual(120);
  });
});
