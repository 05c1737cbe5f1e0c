/**
 * `dewmark chart NOTE.md -o chart.svg`: the psychrometric charts of one note as a standalone SVG
 * file — one chart per heading section by default (`--per block`: per ```air block; `--per all`:
 * the whole note on one chart), stacked top to bottom in one document.
 */
import { Option, type Command } from 'commander';
import { CHART_GROUPINGS, renderChartCases, type ChartGrouping } from '@dewmark/core/chart';
import type { CliIO } from '../run';
import { UsageError } from '../settings';
import { checkOutputPath, exitCodeOf, readOneNote, writeOutput, wroteLine, type WriteOptions } from './outputFile';

/** Options of `dewmark chart`. */
export interface ChartCommandOptions extends WriteOptions {
  per?: string;
}

/** Space between stacked charts, px. */
const STACK_GAP = 16;

/**
 * The charts of a note as one standalone SVG document (XML declaration, then an `<svg>` holding
 * each chart as a nested `<svg>`, one under the other; a single chart is the document itself).
 */
export function chartSvgDocument(
  note: { path: string; text: string; analysis: Parameters<typeof renderChartCases>[0] },
  grouping: ChartGrouping = 'section',
): { svg: string; charts: number } {
  const charts = renderChartCases(note.analysis, grouping, {
    source: note.text,
    title: `Psychrometric chart — ${note.path}`,
  });
  if (charts.length === 1) return { svg: `<?xml version="1.0" encoding="UTF-8"?>\n${charts[0]!.svg}\n`, charts: 1 };
  const width = Math.max(...charts.map((c) => c.width));
  let y = 0;
  const parts: string[] = [];
  for (const c of charts) {
    parts.push(`<g transform="translate(0 ${y})" data-case="${c.case.key.replace(/[&<>"']/g, '')}">\n${c.svg}\n</g>`);
    y += c.height + STACK_GAP;
  }
  const height = y - STACK_GAP;
  return {
    svg:
      `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" ` +
      `width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" ` +
      `data-charts="${charts.length}">\n${parts.join('\n')}\n</svg>\n`,
    charts: charts.length,
  };
}

/** The grouping an option names, or a usage error saying what is accepted. */
function groupingOf(per: string | undefined): ChartGrouping {
  const g = per ?? 'section';
  if ((CHART_GROUPINGS as readonly string[]).includes(g)) return g as ChartGrouping;
  throw new UsageError(
    `--per ${per}: a chart per section, block or all (one chart of the whole note); for example --per block`,
  );
}

/** Runs `dewmark chart`. */
export async function runChart(paths: string[], opts: ChartCommandOptions, io: CliIO): Promise<number> {
  const grouping = groupingOf(opts.per);
  const note = await readOneNote(paths, opts, io, 'chart');
  const out = checkOutputPath(opts.output, note, io.cwd, 'chart', 'chart.svg');
  const { svg, charts: count } = chartSvgDocument(note, grouping);
  writeOutput(out, opts.output!, svg);
  const errors = note.analysis.diagnostics.filter((d) => d.severity === 'error').length;
  io.err(
    wroteLine(
      opts.output!,
      note.path,
      `${errors} error${errors === 1 ? '' : 's'}; ${count} chart${count === 1 ? '' : 's'}`,
    ),
  );
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
      .option('-o, --output <file>', 'the SVG file to write (never a .md file, never the note itself)')
      .addOption(
        new Option('--per <grouping>', 'one chart per heading section, per ```air block, or all on one chart')
          .choices([...CHART_GROUPINGS])
          .default('section'),
      ),
  ).action(async (note: string, opts: ChartCommandOptions) => onResult(await runChart([note], opts, io)));
}
