/** `dewmark chart NOTE.md -o chart.svg`: the psychrometric chart of one note as a standalone SVG file. */
import type { Command } from 'commander';
import { renderChart } from '@dewmark/core/chart';
import type { CliIO } from '../run';
import { checkOutputPath, exitCodeOf, readOneNote, writeOutput, wroteLine, type WriteOptions } from './outputFile';

/** The chart of a note as a standalone SVG document (XML declaration, then the `<svg>`). */
export function chartSvgDocument(note: {
  path: string;
  text: string;
  analysis: Parameters<typeof renderChart>[0];
}): string {
  return `<?xml version="1.0" encoding="UTF-8"?>\n${renderChart(note.analysis, { source: note.text, title: `Psychrometric chart — ${note.path}` })}\n`;
}

/** Runs `dewmark chart`. */
export async function runChart(paths: string[], opts: WriteOptions, io: CliIO): Promise<number> {
  const note = await readOneNote(paths, opts, io, 'chart');
  const out = checkOutputPath(opts.output, note, io.cwd, 'chart', 'chart.svg');
  writeOutput(out, opts.output!, chartSvgDocument(note));
  const errors = note.analysis.diagnostics.filter((d) => d.severity === 'error').length;
  io.err(wroteLine(opts.output!, note.path, `${errors} error${errors === 1 ? '' : 's'}`));
  return exitCodeOf(note.analysis);
}

/** Adds the `chart` command to the program. */
export function registerChart(
  prog: Command,
  io: CliIO,
  onResult: (code: number) => void,
  addCommon: (c: Command) => Command,
): void {
  addCommon(
    prog
      .command('chart')
      .description('write the psychrometric chart of a note as an SVG file; exit 1 if the note has errors')
      .argument('<note>', 'one Markdown note (or - for standard input)')
      .option('-o, --output <file>', 'the SVG file to write (never a .md file, never the note itself)'),
  ).action(async (note: string, opts: WriteOptions) => onResult(await runChart([note], opts, io)));
}
