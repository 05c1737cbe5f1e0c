/**
 * Results tables written into a note: inserting one below a block, refreshing it between its
 * markers, leaving a current one alone, and the `stale-results-table` warning when the block's
 * results (or the table) changed. Property tests (fast-check, fixed seed) check that an edit
 * touches nothing outside its range and that applying the command twice changes nothing more.
 */
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import {
  checksum,
  normalizeBody,
  RESULTS_END_MARKER,
  STALE_RESULTS_TABLE,
  staleTableDiagnostics,
  tableSlots,
} from '../src/present/writtenTables';
import {
  codeActions,
  noteDiagnostics,
  resultsTableActions,
  resultsTableEdits,
  type Edit,
  type Note,
} from '../src/service';
import { applyEdits, noteOf } from './service-helpers';

const NOTE = [
  '# Plant room 2 — winter humidification',
  '',
  '```air',
  'site: elev=420m',
  'state OA: db=-8C rh=80%',
  'state RA: db=21C rh=35%',
  '```',
  'Mixing box, then the preheat coil:',
  '',
  '```air',
  'mix MA: OA 30% + RA 70%',
  'state PH: db=18C w=4.5g/kg',
  'process HC: MA -> PH m=3kg/s',
  '```',
  '',
  'Supply fan and ducts follow.',
  '',
].join('\n');

function writeAll(text: string, settings = {}): { note: Note; after: string; edits: Edit[] } {
  const note = noteOf(text, settings);
  const plan = resultsTableEdits(note, { kind: 'all' });
  return { note, after: applyEdits(text, plan.edits), edits: plan.edits };
}

function staleCodes(text: string, settings = {}): string[] {
  return noteDiagnostics(noteOf(text, settings))
    .filter((d) => d.code === STALE_RESULTS_TABLE)
    .map((d) => String(d.data?.state));
}

describe('inserting results tables', () => {
  const { after, edits } = writeAll(NOTE);

  it('inserts one table per block right after its closing fence, between the markers', () => {
    expect(edits).toHaveLength(2);
    for (const e of edits) expect(e.span.start).toBe(e.span.end);
    const starts = after.split('\n').filter((l) => l.startsWith('<!-- dewmark-results '));
    expect(starts.filter((l) => l === RESULTS_END_MARKER)).toHaveLength(2);
    expect(starts.filter((l) => /^<!-- dewmark-results [0-9a-f]{8}: /.test(l))).toHaveLength(2);
    // The first table sits after a blank line below the first fence, and a blank line keeps the prose apart.
    expect(after).toMatch(/```\n\n<!-- dewmark-results [0-9a-f]{8}: generated[^\n]*-->\n\n\| state +\| db °C/);
    expect(after).toContain(`${RESULTS_END_MARKER}\n\nMixing box, then the preheat coil:`);
  });

  it('keeps every character of the note outside the inserted text', () => {
    let rest = after;
    for (const e of [...edits].sort((a, b) => b.span.start - a.span.start)) {
      const at =
        e.span.start + edits.filter((x) => x.span.start < e.span.start).reduce((n, x) => n + x.newText.length, 0);
      rest = rest.slice(0, at) + rest.slice(at + e.newText.length);
    }
    expect(rest).toBe(NOTE);
  });

  it('adds no statement, error or warning, and names from the first block resolve in the second table', () => {
    const before = analyzeNote(NOTE);
    const a = analyzeNote(after);
    expect(a.parsed.statements.length).toBe(before.parsed.statements.length);
    expect(a.diagnostics.map((d) => d.code)).toEqual(before.diagnostics.map((d) => d.code));
    expect(after).toMatch(/\| MA \(mix: OA 30.0 % \+ RA 70.0 %\) +\| +−?\d/);
    // PH's w=4.5g/kg is MA's 4.45 g/kg rounded: a preheat coil, no moisture change (docs/notation.md).
    expect(after).toMatch(/\| HC: MA → PH \| sensible heating/);
  });

  it('writes Markdown that renders as tables, with the markers as HTML comments', () => {
    const tokens = new MarkdownIt('commonmark').enable('table').parse(after, {});
    expect(tokens.filter((t) => t.type === 'table_open')).toHaveLength(3); // states, states, processes
    const comments = tokens.filter((t) => t.type === 'html_block').map((t) => t.content.trim());
    expect(comments.every((c) => c.startsWith('<!--') && c.endsWith('-->'))).toBe(true);
    expect(comments).toHaveLength(4);
  });

  it('does nothing the second time: the tables are current', () => {
    const again = resultsTableEdits(noteOf(after), { kind: 'all' });
    expect(again.edits).toEqual([]);
    expect(again.changes.map((c) => c.kind)).toEqual(['unchanged', 'unchanged']);
    expect(staleCodes(after)).toEqual([]);
  });

  it('writes only the block at the cursor, from inside the block or from its table', () => {
    const inSecond = NOTE.indexOf('mix MA');
    const one = resultsTableEdits(noteOf(NOTE), { kind: 'at', offset: inSecond });
    expect(one.changes.map((c) => c.kind)).toEqual(['insert']);
    expect(one.edits[0]!.span.start).toBe(NOTE.indexOf('```\n\nSupply') + 3);
    const inTable = after.indexOf('| RA ');
    expect(resultsTableEdits(noteOf(after), { kind: 'at', offset: inTable }).changes.map((c) => c.kind)).toEqual([
      'unchanged',
    ]);
    expect(resultsTableEdits(noteOf(NOTE), { kind: 'at', offset: NOTE.indexOf('Supply fan') }).changes).toEqual([]);
  });

  it("keeps the note's CRLF line endings", () => {
    const crlf = NOTE.replace(/\n/g, '\r\n');
    const w = writeAll(crlf);
    expect(w.after.replace(/\r\n/g, '')).not.toContain('\n');
    expect(w.after.replace(/\r\n/g, '\n')).toBe(after);
    expect(resultsTableEdits(noteOf(w.after), { kind: 'all' }).edits).toEqual([]);
  });

  it('writes the table inside the block quote or list item that holds the block', () => {
    const quoted = '> Design day:\n>\n> ```air\n> state OA: db=35C rh=40%\n> ```\n> More text.\n';
    const q = writeAll(quoted).after;
    expect(q).toContain('> ```\n>\n> <!-- dewmark-results ');
    expect(q).toContain(`> ${RESULTS_END_MARKER}\n>\n> More text.`);
    const tokens = new MarkdownIt().parse(q, {});
    const inQuote = tokens.slice(
      tokens.findIndex((t) => t.type === 'blockquote_open'),
      tokens.findIndex((t) => t.type === 'blockquote_close'),
    );
    expect(inQuote.some((t) => t.type === 'table_open')).toBe(true);
    expect(resultsTableEdits(noteOf(q), { kind: 'all' }).edits).toEqual([]);

    const listed = '- AHU-7:\n\n  ```air\n  state SA: db=13C rh=90%\n  ```\n- AHU-8\n';
    const l = writeAll(listed).after;
    expect(l).toContain('  ```\n\n  <!-- dewmark-results ');
    const lt = new MarkdownIt().parse(l, {});
    const firstItem = lt.slice(
      lt.findIndex((t) => t.type === 'list_item_open'),
      lt.findIndex((t) => t.type === 'list_item_close'),
    );
    expect(firstItem.some((t) => t.type === 'table_open')).toBe(true);
    expect(resultsTableEdits(noteOf(l), { kind: 'all' }).edits).toEqual([]);
  });

  it('gives no table to a fence left open to the end of the note, or to inline statements', () => {
    expect(resultsTableEdits(noteOf('```air\nstate A: db=20C rh=50%\n'), { kind: 'all' }).changes).toEqual([]);
    expect(
      resultsTableEdits(noteOf('The room is `state RA: db=24C rh=50%` in summer.\n'), { kind: 'all' }).changes,
    ).toEqual([]);
  });
});

describe('stale tables', () => {
  const { after } = writeAll(NOTE);
  const changedInput = after.replace('state RA: db=21C rh=35%', 'state RA: db=22C rh=35%');

  it('reports a table whose block computes other results now, on its start marker, with the command to run', () => {
    const note = noteOf(changedInput);
    const stale = noteDiagnostics(note).filter((d) => d.code === STALE_RESULTS_TABLE);
    // Both tables: RA is in the first block, and the mix in the second uses it.
    expect(stale.map((d) => d.data?.state)).toEqual(['results-changed', 'results-changed']);
    const fenceLines = changedInput.split('\n').flatMap((l, i) => (l === '```air' ? [i + 1] : []));
    stale.forEach((d, i) => {
      expect(d.severity).toBe('warning');
      expect(changedInput.slice(d.span.start, d.span.end)).toMatch(/^<!-- dewmark-results [0-9a-f]{8}: .*-->$/);
      expect(d.message).toContain(`below the air block at line ${fenceLines[i]} is out of date`);
      expect(d.message).toContain('Dewmark: Insert or Refresh Results Table');
    });
  });

  it('does not go stale when prose is added above a block (the written table holds no line numbers)', () => {
    const dup = writeAll(
      '```air\nstate A: db=20C rh=50%\nstate A: db=21C rh=50%\nmix M: A 50% + Z 50%\nstate Z: db=30C rh=20%\n```\n',
    ).after;
    expect(dup).toContain('duplicate-name');
    expect(dup).not.toMatch(/\(line \d+\)/);
    expect(staleCodes(`An introduction.\n\nWith two paragraphs.\n\n${dup}`)).toEqual([]);
  });

  it(
    'offers "Refresh the results table" on the warning; it ' +
      'replaces only the marked text, and then the note is clean',
    () => {
      const note = noteOf(changedInput);
      const d = noteDiagnostics(note).find((x) => x.code === STALE_RESULTS_TABLE)!;
      const fix = codeActions(note, d.span).find((a) => a.title === 'Refresh the results table below this air block');
      expect(fix?.kind).toBe('quickfix');
      expect(fix?.diagnostic).toBe(d);
      const e = fix!.edits[0]!;
      expect(changedInput.slice(e.span.start, e.span.end).startsWith('<!-- dewmark-results')).toBe(true);
      expect(changedInput.slice(e.span.start, e.span.end).endsWith(RESULTS_END_MARKER)).toBe(true);
      const fixed = applyEdits(changedInput, fix!.edits);
      expect(fixed.slice(0, e.span.start)).toBe(changedInput.slice(0, e.span.start));
      expect(fixed.slice(fixed.length - (changedInput.length - e.span.end))).toBe(changedInput.slice(e.span.end));
      expect(staleCodes(fixed)).toEqual(['results-changed']); // the other table is still stale
      expect(staleCodes(writeAll(fixed).after)).toEqual([]);
    },
  );

  it('tells a table edited by hand from one whose block changed', () => {
    const edited = after.replace(/\| OA( +)\|/, '| OA*$1|');
    expect(staleCodes(edited)).toEqual(['edited']);
    const msg = noteDiagnostics(noteOf(edited)).find((d) => d.code === STALE_RESULTS_TABLE)!.message;
    expect(msg).toContain('was edited by hand');
  });

  it('reports a checksum that does not match current contents', () => {
    const hash = /<!-- dewmark-results ([0-9a-f]{8})/.exec(after)![1]!;
    expect(staleCodes(after.replace(hash, hash === '00000000' ? '11111111' : '00000000'))).toEqual(['checksum']);
  });

  it('accepts a table realigned by a Markdown formatter (padding and delimiter dashes)', () => {
    const realigned = after.replace(/ {2,}/g, ' ').replace(/-{3,}/g, '---');
    expect(realigned).not.toBe(after);
    expect(staleCodes(realigned)).toEqual([]);
    expect(resultsTableEdits(noteOf(realigned), { kind: 'all' }).edits).toEqual([]);
  });

  it('reports a table without its end marker, and leaves it alone', () => {
    const cut = after.replace(RESULTS_END_MARKER, 'the end marker was deleted');
    expect(staleCodes(cut)).toEqual(['unterminated']);
    const plan = resultsTableEdits(noteOf(cut), { kind: 'all' });
    expect(plan.changes.map((c) => c.kind)).toEqual(['unterminated', 'unchanged']);
    expect(plan.edits).toEqual([]);
    const msg = noteDiagnostics(noteOf(cut)).find((d) => d.code === STALE_RESULTS_TABLE)!.message;
    expect(msg).toContain(`has no end marker ${RESULTS_END_MARKER}`);
  });

  it('says so when a table was written in the other unit system and the note has no units: line', () => {
    const ip = writeAll(NOTE, { units: 'IP' }).after;
    expect(staleCodes(ip, { units: 'IP' })).toEqual([]);
    const d = noteDiagnostics(noteOf(ip)).filter((x) => x.code === STALE_RESULTS_TABLE);
    expect(d).toHaveLength(2);
    expect(d[0]!.message).toContain('shows results in IP, but this note has no units: line and the unit setting is SI');
    expect(d[0]!.message).toContain('"units: IP"');
  });

  it('ignores markers that do not follow an air block (an example in another fence, prose between)', () => {
    const example =
      `Example:\n\n\`\`\`\`markdown\n\`\`\`air\nstate A: db=20C rh=50%\n\`\`\`\n\n<!-- ` +
      `dewmark-results 00000000: x -->\n${RESULTS_END_MARKER}\n\`\`\`\`\n`;
    expect(staleCodes(example)).toEqual([]);
    const apart = after.replace(
      '```\n\n<!-- dewmark-results',
      '```\n\nA paragraph in between.\n\n<!-- dewmark-results',
    );
    expect(tableSlots(apart, analyzeNote(apart).parsed.regions)[0]!.table).toBeNull();
  });

  it('costs nothing for a note without markers', () => {
    expect(staleTableDiagnostics(analyzeNote(NOTE), NOTE)).toEqual([]);
  });
});

describe('source actions', () => {
  it("offers this block's table and every block's tables", () => {
    const note = noteOf(NOTE);
    const at = NOTE.indexOf('state OA');
    const actions = resultsTableActions(note, { start: at, end: at });
    expect(actions.map((a) => [a.kind, a.title])).toEqual([
      ['source', 'Insert a results table below this air block'],
      ['source', 'Insert or refresh the results tables of every air block (2 to insert)'],
    ]);
    expect(resultsTableActions(noteOf('No air here.\n'), { start: 0, end: 0 })).toEqual([]);
  });
});

describe('properties', () => {
  const line = fc.constantFrom(
    'state A: db=24C rh=50%',
    'state B: db=30C wb=20C',
    'mix M: A 40% + B 60%',
    'process P: A -> B m=2kg/s',
    'state X: db=20C wb=25C',
    'state A: db=26C rh=45%',
    '# a comment',
    '',
  );
  const block = fc.array(line, { minLength: 0, maxLength: 4 }).map((ls) => ['```air', ...ls, '```'].join('\n'));
  const prose = fc.constantFrom(
    'Some prose.',
    '',
    '> quoted',
    '- item',
    '| a | b |\n| - | - |\n| 1 | 2 |',
    '<!-- a comment -->',
  );
  const note = fc
    .array(fc.oneof(block, prose), { minLength: 1, maxLength: 6 })
    .chain((parts) => fc.constantFrom('\n', '\r\n').map((eol) => `${parts.join('\n\n')}\n`.replace(/\n/g, eol)));

  it('an edit changes nothing outside its range, and a second run has nothing left to do', () => {
    fc.assert(
      fc.property(note, fc.nat(), (text, pick) => {
        const n = noteOf(text);
        const scopes = [{ kind: 'all' as const }, { kind: 'at' as const, offset: pick % (text.length + 1) }];
        for (const scope of scopes) {
          const plan = resultsTableEdits(n, scope);
          const sorted = [...plan.edits].sort((a, b) => a.span.start - b.span.start);
          // Outside the edited ranges the new text is the old text, byte for byte.
          let shift = 0;
          let prevEnd = 0;
          const after = applyEdits(text, plan.edits);
          for (const e of sorted) {
            expect(after.slice(prevEnd + shift, e.span.start + shift)).toBe(text.slice(prevEnd, e.span.start));
            shift += e.newText.length - (e.span.end - e.span.start);
            prevEnd = e.span.end;
          }
          expect(after.slice(prevEnd + shift)).toBe(text.slice(prevEnd));
          // Twice is the same as once.
          const again = resultsTableEdits(noteOf(after), { kind: 'all' });
          if (scope.kind === 'all') expect(again.edits).toEqual([]);
          expect(
            applyEdits(after, resultsTableEdits(noteOf(after), scope.kind === 'all' ? scope : { kind: 'all' }).edits),
          ).toBe(applyEdits(after, again.edits));
          // The written tables add no statement and are current.
          expect(analyzeNote(after).parsed.statements.length).toBe(n.analysis.parsed.statements.length);
          if (scope.kind === 'all') expect(staleCodes(after)).toEqual([]);
        }
      }),
      { seed: 20240611, numRuns: 150 },
    );
  });

  it('the checksum is the FNV-1a of the normalized body (stable across runs)', () => {
    // FNV-1a 32-bit test vectors (the algorithm's published reference values): "" → 811c9dc5, "a" → e40c292c.
    expect(checksum('')).toBe('811c9dc5');
    expect(checksum('a')).toBe('e40c292c');
    expect(normalizeBody(['', '|  a  |  b |', '| :---- | ---: |', '  text  here '])).toBe('|a|b|\n|:-|-:|\ntext here');
  });
});

describe('a note that starts with a byte-order mark', () => {
  it('writes no BOM into the table lines, and writing twice changes nothing', () => {
    // Found by the robustness fuzzing (edits property, some seeds): the BOM was taken as part of
    // the first block's container prefix and copied onto every table line.
    for (const text of ['\uFEFF- ```air\n  ```\n\n   ```air\n```', '\uFEFF```air\nstate A: db=20C rh=50%\n```\n']) {
      const once = writeAll(text).after;
      expect(once.indexOf('\uFEFF', 1), JSON.stringify(once)).toBe(-1);
      expect(writeAll(once).edits).toEqual([]);
    }
  });
});
