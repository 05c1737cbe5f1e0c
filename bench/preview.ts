/**
 * Benchmark of the results tables: what the Markdown preview plugin adds to a render of the
 * 10 000-line generated note (200 air blocks, under markdown-it 14 as VS Code's preview runs it),
 * what checking 200 written tables adds to parse + evaluate (the stale-results-table check runs on
 * every keystroke in the editor and on every file of `dewmark check`), and the time to compute the
 * edits that write all 200 tables. Runnable alone: `node --import tsx bench/preview.ts`.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dewmarkPreviewPlugin } from '../client/src/preview';
import { analyzeNote } from '../shared-core/src/analyze';
import { evaluate } from '../shared-core/src/evaluate';
import { parseNote } from '../shared-core/src/notation/parse';
import { staleTableDiagnostics } from '../shared-core/src/present/writtenTables';
import { analyzeText, DEFAULT_SERVICE_SETTINGS, resultsTableEdits } from '../shared-core/src/service';
import { goalRow, infoRow, median } from './goals';
import { generateNote } from './notes';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

interface Md {
  render(src: string, env?: object): string;
}
/** markdown-it 14, the major version VS Code's Markdown preview ships (the root's copy). */
const MarkdownIt = createRequire(join(root, 'package.json'))('markdown-it') as new () => Md;

function times(f: () => unknown, runs: number, warmup: number): number[] {
  for (let i = 0; i < warmup; i++) f();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    f();
    out.push(performance.now() - t0);
  }
  return out;
}

/** Runs the benchmark and prints the figures with their goals. */
export async function benchPreview(): Promise<void> {
  const note = generateNote(2000, 10_000);
  const blocks = analyzeNote(note).parsed.regions.filter((r) => r.origin === 'fence').length;
  console.log(`note: ${note.split('\n').length} lines, ${blocks} air blocks`);

  // 1. The preview: a render with the plugin against one without. Each render sees a new text
  //    (one character changes), as the preview does while the user types, so nothing is cached.
  const plain = new MarkdownIt();
  const withPlugin = dewmarkPreviewPlugin(new MarkdownIt());
  let k = 0;
  const edited = () => note.replace('Prose that the reader skips.', `Prose that the reader skips ${k++}.`);
  const base = times(() => plain.render(edited()), 21, 5);
  const ours = times(() => withPlugin.render(edited()), 21, 5);
  console.log(infoRow('preview render without the plugin (median of 21)', median(base), 'ms'));
  console.log(infoRow('preview render with the plugin (median of 21)', median(ours), 'ms'));
  console.log(goalRow('  added by the plugin per render', median(ours) - median(base), 'ms', 40));
  const same = times(() => withPlugin.render(note), 21, 3);
  console.log(infoRow('  same text again (analysis reused), median', median(same) - median(base), 'ms'));
  const prose = note.replace(/```air/g, '```text');
  const noAir = times(() => withPlugin.render(prose), 21, 3);
  const noAirBase = times(() => plain.render(prose), 21, 3);
  console.log(infoRow('  a note without air blocks: added, median', median(noAir) - median(noAirBase), 'ms'));

  // 2. Writing every block's table, and checking 200 written tables in parse + evaluate.
  const analysed = analyzeText(note, DEFAULT_SERVICE_SETTINGS);
  const edits = times(() => resultsTableEdits(analysed, { kind: 'all' }), 11, 3);
  console.log(goalRow(`edits that write all ${blocks} results tables (median of 11)`, median(edits), 'ms', 100));
  let written = note;
  for (const e of resultsTableEdits(analysed, { kind: 'all' }).edits.sort((a, b) => b.span.start - a.span.start)) {
    written = written.slice(0, e.span.start) + e.newText + written.slice(e.span.end);
  }
  const without = times(() => analyzeNote(note), 21, 10);
  const withTables = times(() => analyzeNote(written), 21, 10);
  console.log(infoRow('parse+evaluate, no tables (median of 21)', median(without), 'ms'));
  console.log(infoRow(`parse+evaluate with ${blocks} current tables (median of 21)`, median(withTables), 'ms'));
  // The check alone (the rest of the difference is the longer text: the tables are Markdown to scan).
  const evaluated = evaluate(parseNote(written), {}, written);
  const check = times(() => staleTableDiagnostics(evaluated, written), 21, 10);
  console.log(goalRow(`  of which the stale-table check of ${blocks} tables`, median(check), 'ms', 10));
  const plainEvaluated = evaluate(parseNote(note), {}, note);
  const noMarkers = times(() => staleTableDiagnostics(plainEvaluated, note), 21, 10);
  console.log(infoRow('  the check on the note without tables', median(noMarkers), 'ms', 3));
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await benchPreview();
