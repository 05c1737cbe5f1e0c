/**
 * Ignore comments (`# dewmark-ignore CODE`) and rule severities, through `analyzeNote` (what the
 * CLI runs), the incremental analyzer and the language service's diagnostics (what the editor
 * shows): a named diagnostic on the comment's line, on the next statement line, or in the whole
 * block leaves the list and is kept as suppressed; other codes and other lines are untouched; a
 * comment that names no code or acknowledges nothing is reported.
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote, createAnalyzer } from '../src/analyze';
import type { Analysis } from '../src/evaluate/types';
import { analyzeText, DEFAULT_SERVICE_SETTINGS, noteDiagnostics } from '../src/service';
import { LineIndex } from '../src/text/lineIndex';

/** `code@line` of each diagnostic (lines 1-based). */
function codes(text: string, list: { code: string; span: { start: number } }[]): string[] {
  const idx = new LineIndex(text);
  return list.map((d) => `${d.code}@${idx.lineCol(d.span.start).line}`);
}

function check(text: string, rules?: Analysis['settings']['rules']) {
  const a = analyzeNote(text, rules ? { rules } : undefined);
  return { shown: codes(text, a.diagnostics), suppressed: codes(text, a.suppressed ?? []), analysis: a };
}

// Invented notes. `wb=25C` above `db=20C` is an error (wb-above-db); `w=11.0g/kg` with 24C/50% is
// a stale claim (claim-mismatch) — both as the fixture notes under test/fixtures/diagnostics show.
const WB = 'state X: db=20C wb=25C';
const CLAIM = 'state RA: db=24C rh=50% w=11.0g/kg';

describe('ignore comments', () => {
  it('a comment after a statement acknowledges that code on that line only', () => {
    const text = [
      '```air',
      `${WB}   # dewmark-ignore wb-above-db -- measured, sensor swap pending`,
      `state Y: db=21C wb=26C`,
      '```',
      '',
    ].join('\n');
    const r = check(text);
    expect(r.shown).toEqual(['wb-above-db@3']);
    expect(r.suppressed).toEqual(['wb-above-db@2']);
    expect(r.analysis.suppressed![0]!.justification).toBe('measured, sensor swap pending');
    expect(text.slice(r.analysis.suppressed![0]!.suppressedBy.start, r.analysis.suppressed![0]!.suppressedBy.end)).toBe(
      '# dewmark-ignore wb-above-db -- measured, sensor swap pending',
    );
  });

  it('another code on the same line is not acknowledged', () => {
    const text = ['```air', `${CLAIM}   # dewmark-ignore wb-above-db`, '```', ''].join('\n');
    const r = check(text);
    expect(r.shown).toEqual(['claim-mismatch@2', 'ignore-comment@2']);
    expect(r.suppressed).toEqual([]);
  });

  it('a comment on its own line applies to the next statement line (blank and comment lines skipped)', () => {
    const text = [
      '```air',
      '# dewmark-ignore claim-mismatch',
      '',
      '# the next line was measured',
      CLAIM,
      CLAIM.replace('RA', 'RB'),
      '```',
      '',
    ].join('\n');
    const r = check(text);
    expect(r.suppressed).toEqual(['claim-mismatch@5']);
    expect(r.shown).toEqual(['claim-mismatch@6']);
  });

  it('dewmark-ignore-block acknowledges the codes in its whole fenced block, and not in the next block', () => {
    const block = ['```air', CLAIM, '# dewmark-ignore-block claim-mismatch, wb-above-db', WB, '```'];
    const text = [...block, '', '```air', CLAIM.replace('RA', 'RC'), '```', ''].join('\n');
    const r = check(text);
    expect(r.suppressed).toEqual(['claim-mismatch@2', 'wb-above-db@4']);
    expect(r.shown).toEqual(['claim-mismatch@8']);
  });

  it('works in an inline code span, for that span', () => {
    const text = `The room \`${CLAIM} # dewmark-ignore claim-mismatch\` and \`${CLAIM.replace('RA', 'RB')}\`.\n`;
    const r = check(text);
    expect(r.suppressed).toEqual(['claim-mismatch@1']);
    expect(r.shown).toEqual(['claim-mismatch@1']);
    expect(r.analysis.diagnostics[0]!.span.start).toBeGreaterThan(text.indexOf('RB'));
  });

  it('a comment that names no code, or a malformed one, is a warning that says how to write it', () => {
    const bare = check(['```air', `${WB}  # dewmark-ignore`, '```', ''].join('\n'));
    expect(bare.shown).toEqual(['wb-above-db@2', 'ignore-comment@2']);
    const d = bare.analysis.diagnostics.find((x) => x.code === 'ignore-comment')!;
    expect(d.severity).toBe('warning');
    expect(d.message).toContain("e.g. '# dewmark-ignore claim-mismatch'");
    const bad = check(['```air', `${WB}  # dewmark-ignore Wb_Above_Db`, '```', ''].join('\n'));
    expect(bad.analysis.diagnostics.find((x) => x.code === 'ignore-comment')!.message).toContain(
      "'Wb_Above_Db' is not a diagnostic code",
    );
  });

  it('a comment that acknowledges nothing where it stands (a mistyped code) is an info', () => {
    const r = check(['```air', `${WB}  # dewmark-ignore wb-above-dp`, '```', ''].join('\n'));
    expect(r.shown).toEqual(['wb-above-db@2', 'ignore-comment@2']);
    const d = r.analysis.diagnostics.find((x) => x.code === 'ignore-comment')!;
    expect(d.severity).toBe('info');
    expect(d.message).toContain('acknowledges wb-above-dp, but there is no such diagnostic where it applies');
  });

  it('prose that mentions the word outside an air block is not a comment', () => {
    const text = [
      'Write `# dewmark-ignore CODE` in a block to acknowledge a diagnostic.',
      '',
      '```air',
      WB,
      '```',
      '',
    ].join('\n');
    expect(check(text).shown).toEqual(['wb-above-db@4']);
  });

  it('the editor shows what the command line reports: the service diagnostics equal the analysis diagnostics', () => {
    const text = ['```air', `${WB}   # dewmark-ignore wb-above-db`, CLAIM, '```', ''].join('\n');
    const cli = analyzeNote(text).diagnostics.map((d) => d.code);
    const editor = noteDiagnostics(analyzeText(text, DEFAULT_SERVICE_SETTINGS)).map((d) => d.code);
    expect(editor).toEqual(cli);
    expect(editor).toEqual(['claim-mismatch']);
  });

  it('the incremental analyzer gives the same lists after each edit', () => {
    const an = createAnalyzer();
    let text = ['```air', `${WB}   # dewmark-ignore wb-above-db`, CLAIM, '```', ''].join('\n');
    const steps = [
      (t: string) => t.replace('# dewmark-ignore wb-above-db', '# dewmark-ignore wb-above-db, claim-mismatch'),
      (t: string) => t.replace(CLAIM, `${CLAIM}  # dewmark-ignore claim-mismatch`),
      (t: string) => t.replace('db=20C', 'db=20.5C'),
      (t: string) => t.replace(/ +# dewmark-ignore wb-above-db, claim-mismatch/, ''),
    ];
    for (const step of steps) {
      text = step(text);
      const inc = an.analyze(text);
      const fresh = analyzeNote(text);
      expect(codes(text, inc.diagnostics)).toEqual(codes(text, fresh.diagnostics));
      expect(codes(text, inc.suppressed ?? [])).toEqual(codes(text, fresh.suppressed ?? []));
    }
  });
});

describe('rule severities', () => {
  it("change a code's severity or turn it off, leaving the other codes alone", () => {
    const text = ['```air', WB, CLAIM, '```', ''].join('\n');
    const up = check(text, { 'claim-mismatch': 'error' }).analysis.diagnostics;
    expect(up.map((d) => `${d.code}:${d.severity}`)).toEqual(['wb-above-db:error', 'claim-mismatch:error']);
    const off = check(text, { 'claim-mismatch': 'off' }).analysis.diagnostics;
    expect(off.map((d) => d.code)).toEqual(['wb-above-db']);
  });

  it('never change the diagnostic objects the incremental analyzer keeps, and apply when only the rules change', () => {
    const an = createAnalyzer();
    const text = ['```air', WB, CLAIM, '```', ''].join('\n');
    const plain = an.analyze(text);
    const warning = plain.diagnostics.find((d) => d.code === 'claim-mismatch')!;
    const strict = an.analyze(text, { rules: { 'claim-mismatch': 'error' } });
    expect(strict.diagnostics.find((d) => d.code === 'claim-mismatch')!.severity).toBe('error');
    expect(warning.severity).toBe('warning');
    expect(an.analyze(text).diagnostics.find((d) => d.code === 'claim-mismatch')!.severity).toBe('warning');
  });
});
