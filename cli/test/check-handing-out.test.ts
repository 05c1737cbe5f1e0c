/**
 * `dewmark check` prints only diagnostics, so it lets each item go as soon as it is made
 * (`analyzeHandingOut`, as `eval --format json` does). Its text and JSON must be what the whole
 * analysis gives: compared here on every note in the repository (fixtures, examples, docs), in SI
 * and IP and with a project rule, and on notes the whole analysis must read (a results table, IP
 * units named in the note). No figure is checked here.
 */
import { readFileSync } from 'node:fs';
import { relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { repo, repositoryNotes } from './lib/notes';
import { analyzeHandingOut, analyzeNote } from '../../shared-core/src/analyze';
import type { EvaluateSettings } from '../../shared-core/src/evaluate/types';
import { countDiagnostics, diagnosticJson, diagnosticLine, fileResult } from '../src/output';
import { renderFile } from '../src/work';

/** What `check` printed for a note before it let items go: from the whole analysis. */
function wholeCheck(name: string, text: string, settings: Partial<EvaluateSettings>) {
  const f = fileResult(name, text, analyzeNote(text, settings));
  const json: Record<string, unknown> = {
    path: name,
    diagnostics: f.analysis.diagnostics.map((d) => diagnosticJson(f, d)),
  };
  if (f.analysis.suppressed)
    json.suppressed = f.analysis.suppressed.map((d) => ({
      ...diagnosticJson(f, d),
      justification: d.justification,
      ignoreLine: f.lines.lineCol(d.suppressedBy.start).line,
    }));
  return {
    text: f.analysis.diagnostics.map((d) => `${diagnosticLine(f, d)}\n`).join(''),
    json,
    counts: countDiagnostics([f]),
  };
}

describe('check, letting each item go', () => {
  it('prints the diagnostics of the whole analysis for every note in the repository, in SI, IP and with a rule', () => {
    const notes = repositoryNotes();
    expect(notes.length).toBeGreaterThan(50);
    const settingsList: Partial<EvaluateSettings>[] = [
      {},
      { units: 'IP', pressurePa: 95_000, pressureOrigin: 'setting dewmark.pressure' },
      { rules: { 'claim-mismatch': 'warning', 'unknown-name': 'off' } },
    ];
    let letGo = 0;
    let withDiagnostics = 0;
    let withSuppressed = 0;
    for (const path of notes) {
      const text = readFileSync(path, 'utf8');
      const name = relative(repo, path);
      for (const settings of settingsList) {
        const whole = wholeCheck(name, text, settings);
        const asText = renderFile('check-text', name, text, settings);
        const asJson = renderFile('check-json', name, text, settings);
        expect(asText.text, name).toBe(whole.text);
        expect(asJson.json, name).toEqual(whole.json);
        expect(asText.counts, name).toEqual(whole.counts);
        expect(asJson.counts, name).toEqual(whole.counts);
        if (analyzeHandingOut(text, settings)) letGo++;
        if (whole.text) withDiagnostics++;
        if (whole.json.suppressed) withSuppressed++;
      }
    }
    // Most notes take the path that lets items go; the comparison covers diagnostics and ignore comments.
    expect(letGo).toBeGreaterThan(notes.length);
    expect(withDiagnostics).toBeGreaterThan(20);
    expect(withSuppressed).toBeGreaterThan(0);
  });
});
