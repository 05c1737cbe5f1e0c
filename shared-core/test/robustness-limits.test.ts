/**
 * The editor's size limit (`dewmark.maxNoteSizeKB`, service/limits.ts): a note longer than the
 * limit is not evaluated; it gets one info diagnostic that says how large it is, what the limit is
 * and what to do, and every feature finds nothing in it. At or under the limit, and with the limit
 * off (0), the note is evaluated as usual. The figures of the default are in bench/robustness.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  analyzeText,
  codeActions,
  completions,
  countDiagnostics,
  DEFAULT_SERVICE_SETTINGS,
  documentSymbols,
  hover,
  inlayHints,
  noteDiagnostics,
  noteStatus,
  readSettings,
} from '../src/service';
import { allFinite } from '../src/evaluate';

const BLOCK = '```air\nstate RA: db=24C rh=50%\nstate OA: db=32C wb=23C\nmix MA: OA 30% + RA 70%\n```\n';

/** A note of exactly `chars` characters: the block, then prose. */
function noteOf(chars: number): string {
  return BLOCK + 'x'.repeat(chars - BLOCK.length);
}

describe('notes over the size limit', () => {
  const s = { ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 1 };

  it('at the limit the note is evaluated; one character more and it is not', () => {
    const at = analyzeText(noteOf(1024), s);
    expect(at.limited).toBeUndefined();
    expect(at.analysis.items.length).toBe(3);
    const over = analyzeText(noteOf(1025), s);
    expect(over.limited).toEqual({ chars: 1025, limitChars: 1024 });
    expect(over.analysis.items).toEqual([]);
    expect(over.analysis.parsed.statements).toEqual([]);
  });

  it('one info diagnostic says how large the note is, the limit and what to do', () => {
    const text = noteOf(5000);
    const n = analyzeText(text, s);
    const d = noteDiagnostics(n);
    expect(d.length).toBe(1);
    expect(d[0]).toMatchObject({ code: 'note-too-large', severity: 'info' });
    expect(d[0]!.message).toContain('5 KB');
    expect(d[0]!.message).toContain('dewmark.maxNoteSizeKB = 1');
    expect(d[0]!.message).toContain('dewmark check');
    expect(d[0]!.span.start).toBe(0);
    expect(d[0]!.span.end).toBe(text.indexOf('\n')); // the first line, not the whole note
    expect(countDiagnostics(n)).toEqual({ errors: 0, warnings: 0 });
  });

  it('every feature answers, with nothing: no hover, hints, completion, symbols or fixes', () => {
    const text = noteOf(5000);
    const n = analyzeText(text, s);
    const inName = text.indexOf('RA');
    expect(hover(n, inName)).toBeNull();
    expect(inlayHints(n, { start: 0, end: text.length })).toEqual([]);
    expect(completions(n, text.indexOf('db=') + 5)).toBeNull();
    expect(documentSymbols(n)).toEqual([]);
    expect(codeActions(n, { start: 0, end: text.length })).toEqual([]);
    expect(noteStatus(n).unitsSource).toBe('setting');
    expect(allFinite(n.analysis)).toBe(true);
  });

  it('0 means no limit; the default is 2048 KB (2 MB)', () => {
    const off = analyzeText(noteOf(5000), { ...s, maxNoteKB: 0 });
    expect(off.limited).toBeUndefined();
    expect(off.analysis.items.length).toBe(3);
    expect(DEFAULT_SERVICE_SETTINGS.maxNoteKB).toBe(2048);
    expect(analyzeText(noteOf(5000), DEFAULT_SERVICE_SETTINGS).limited).toBeUndefined();
  });

  it('the setting is read from dewmark.maxNoteSizeKB; a bad value is named and the default used', () => {
    expect(readSettings({ maxNoteSizeKB: 512 })).toEqual({
      settings: { ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 512 },
      problems: [],
    });
    expect(readSettings({ maxNoteSizeKB: 0 }).settings.maxNoteKB).toBe(0);
    for (const bad of [-1, 1.5, '2048', true, Number.NaN]) {
      const r = readSettings({ maxNoteSizeKB: bad });
      expect(r.settings.maxNoteKB, JSON.stringify(bad)).toBe(2048);
      expect(r.problems.length, JSON.stringify(bad)).toBe(1);
      expect(r.problems[0]).toContain('dewmark.maxNoteSizeKB');
    }
  });

  it('the size counts characters as the editor does (UTF-16 units): 600 emoji are 1200', () => {
    const text = BLOCK + '😀'.repeat(600);
    expect(text.length).toBeGreaterThan(1024);
    expect(analyzeText(text, s).limited?.chars).toBe(text.length);
  });
});
