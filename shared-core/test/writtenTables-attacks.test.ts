/**
 * Hostile notes against the written results tables: an end marker that is not in the fence's own
 * container (an indented code block, a list item) must not end a table that lost its own, so a
 * refresh never replaces the text in between; and numbering many stale tables costs one pass over
 * the note, not one per table (work counted as string searches, never timed).
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { analyzeNote } from '../src/analyze';
import { RESULTS_END_MARKER, STALE_RESULTS_TABLE, staleTableDiagnostics } from '../src/present/writtenTables';
import { noteDiagnostics, resultsTableEdits } from '../src/service';
import { applyEdits, noteOf } from './service-helpers';

/** An invented note: one block of the level 3 office air handler. */
const NOTE = [
  '# Level 3 office AHU',
  '',
  '```air',
  'state OA: db=31C rh=40%',
  'state RA: db=23C rh=50%',
  '```',
  '',
  'Notes follow.',
  '',
].join('\n');

/** The note with its results table written by the command. */
function withTable(text = NOTE): string {
  return applyEdits(text, resultsTableEdits(noteOf(text), { kind: 'all' }).edits);
}

function staleStates(text: string): string[] {
  return noteDiagnostics(noteOf(text))
    .filter((d) => d.code === STALE_RESULTS_TABLE)
    .map((d) => String(d.data?.state));
}

describe('an end marker outside the fence’s container does not end a table', () => {
  const written = withTable();
  const lost = written.replace(`${RESULTS_END_MARKER}\n`, '');

  it.each([
    [
      'an indented code block',
      'An example of the marker, as code:\n\n    <!-- dewmark-results end -->\n\nMore prose.\n',
    ],
    ['a tab-indented code block', 'As code:\n\n\t<!-- dewmark-results end -->\n'],
    ['a list item (continuation line)', '- a checklist item\n  <!-- dewmark-results end -->\n- another item\n'],
    ['a nested ordered list item', '1. first step\n   - detail\n     <!-- dewmark-results end -->\n'],
  ])('in %s: the table is unterminated and left alone', (_what, tail) => {
    const text = `${lost}${tail}`;
    expect(lost).not.toContain(RESULTS_END_MARKER);
    expect(staleStates(text)).toEqual(['unterminated']);
    const plan = resultsTableEdits(noteOf(text), { kind: 'all' });
    expect(plan.changes.map((c) => c.kind)).toEqual(['unterminated']);
    expect(applyEdits(text, plan.edits)).toBe(text);
  });

  it('a marker in the container, indented up to three spaces, still ends the table', () => {
    const shifted = written.replace(RESULTS_END_MARKER, `   ${RESULTS_END_MARKER}`);
    expect(staleStates(shifted)).toEqual([]);
    // And after a list inside the table (closed by the unindented marker).
    const changed = shifted.replace('state RA: db=23C', 'state RA: db=24C');
    const plan = resultsTableEdits(noteOf(changed), { kind: 'all' });
    expect(plan.changes.map((c) => c.kind)).toEqual(['refresh']);
    expect(applyEdits(changed, plan.edits)).toContain('Notes follow.');
  });
});

describe('many stale tables cost one pass', () => {
  afterEach(() => vi.restoreAllMocks());

  /** A note of `n` blocks, each with a table whose checksum was damaged (stale, reported with its line). */
  function staleNote(n: number): string {
    const blocks: string[] = [];
    for (let i = 0; i < n; i++)
      blocks.push(`Zone ${i}:\n\n\`\`\`air\nstate Z${i}: db=${20 + (i % 5)}C rh=${40 + (i % 7)}%\n\`\`\`\n`);
    return withTable(blocks.join('\n')).replace(/dewmark-results [0-9a-f]{8}:/g, 'dewmark-results 00000000:');
  }

  /** String searches made while checking the tables of `text` (the work that grows with the note). */
  function searches(text: string): { count: number; reported: number } {
    const analysis = analyzeNote(text.replace(/dewmark-results/g, 'dewmark-resultz')); // evaluated without the check
    const spy = vi.spyOn(String.prototype, 'indexOf');
    const reported = staleTableDiagnostics(analysis, text).length;
    const count = spy.mock.calls.length;
    spy.mockRestore();
    return { count, reported };
  }

  it('doubling the tables at most doubles the searches (plus a little)', () => {
    const small = searches(staleNote(150));
    const large = searches(staleNote(300));
    expect(small.reported).toBe(150);
    expect(large.reported).toBe(300);
    // Linear: ~2; one rescan from the top per table (quadratic) gives ~4.
    expect(large.count / small.count).toBeLessThan(2.5);
  });

  it('the messages still name the right lines', () => {
    const text = staleNote(3);
    const lines = text.split('\n');
    const d = staleTableDiagnostics(analyzeNote(text.replace(/dewmark-results/g, 'dewmark-resultz')), text);
    const fenceLines = lines.flatMap((l, i) => (l === '```air' ? [i + 1] : []));
    expect(d.map((x) => /air block at line (\d+)/.exec(x.message)?.[1]).map(Number)).toEqual(fenceLines);
  });
});
