/**
 * The Markdown preview's results: a markdown-it plugin that puts, under each ` ```air ` block, a
 * compact table of what the block computes (states, mixes, processes) and its errors and failed
 * claims. The whole note is analysed once per render (so names from earlier blocks resolve), with
 * the same settings the language server uses; the HTML comes from the core's escaped builder
 * (`shared-core/src/present/resultsTable`). A block followed by an up-to-date written results
 * table gets nothing more (the written table shows the same figures); a stale one gets the live
 * table with a notice. A note without air blocks is left exactly as markdown-it renders it. A note
 * over the size limit (`dewmark.maxNoteSizeKB`, bounded for the extension host: ./hostLimit) is
 * not evaluated here and gets no tables.
 *
 * No VS Code API here (the extension passes the settings in), so the plugin runs under plain
 * markdown-it in tests.
 */
import { analyzeText, DEFAULT_SERVICE_SETTINGS, type ServiceSettings } from '@dewmark/core/service';
import {
  allBlockResults,
  RESULTS_COMMAND_TITLE,
  resultsTableHtml,
  tableSlots,
  tableState,
  type ResultsData,
} from '@dewmark/core/present';
import { LineIndex } from '@dewmark/core/text';
import { hostBounded } from './hostLimit';

/** The parts of a markdown-it token the plugin reads and writes. */
interface TokenLike {
  type: string;
  info: string;
  map: [number, number] | null;
  level: number;
  content: string;
  block: boolean;
}

/** The parts of a markdown-it core state the plugin uses. */
interface CoreStateLike {
  src: string;
  env: unknown;
  tokens: TokenLike[];
  Token: new (type: string, tag: string, nesting: number) => TokenLike;
}

/** The parts of a markdown-it instance the plugin uses (any markdown-it 12–15 has them). */
export interface MarkdownItLike {
  core: { ruler: { push(name: string, rule: (state: CoreStateLike) => void): void } };
}

/** Options of {@link dewmarkPreviewPlugin}. */
export interface PreviewOptions {
  /**
   * The settings for the note being rendered; `env` is what the renderer was given (VS Code puts
   * `currentDocument` there).
   */
  settings?: (env: unknown) => ServiceSettings;
  /** Called when a note could not be analysed (the preview then shows the note without tables). */
  onError?: (err: unknown) => void;
}

/** Name of the core rule the plugin adds. */
export const PREVIEW_RULE = 'dewmark_results';

/** The first word of a fence's info string. */
function langOf(info: string): string {
  return info.trim().split(/\s+/, 1)[0] ?? '';
}

/** The HTML to add after each fenced block, by the 0-based line of its opening fence. */
function htmlByLine(src: string, settings: ServiceSettings): Map<number, string> {
  const note = analyzeText(src, settings);
  const lines = new LineIndex(src);
  const slots = new Map<number, ReturnType<typeof tableSlots>[number]>();
  if (src.includes('dewmark-results'))
    for (const s of tableSlots(src, note.analysis.parsed.regions)) slots.set(s.region.span.start, s);
  const out = new Map<number, string>();
  for (const { region, data } of allBlockResults(note.analysis)) {
    const table = slots.get(region.span.start)?.table ?? null;
    let notice: string | undefined;
    if (table) {
      const state = tableState(note.analysis, table);
      if (state === 'fresh') continue;
      notice =
        `The results table written below this block is out of date; ` +
        `run "${RESULTS_COMMAND_TITLE}" to refresh it. Current results:`;
    }
    out.set(lines.positionAt(region.span.start).line, html(data, notice));
  }
  return out;
}

/** The HTML of results without a notice, by their (reused, read-only) data. */
const htmlByData = new WeakMap<ResultsData, string>();

function html(data: ResultsData, notice: string | undefined): string {
  if (notice) return `${resultsTableHtml(data, { notice })}\n`;
  let out = htmlByData.get(data);
  if (out === undefined) {
    out = `${resultsTableHtml(data)}\n`;
    htmlByData.set(data, out);
  }
  return out;
}

/**
 * Adds the results tables to a markdown-it instance (VS Code's preview or any other) and returns
 * it, as `extendMarkdownIt` must.
 */
export function dewmarkPreviewPlugin<T extends object>(md: T, opts: PreviewOptions = {}): T {
  let last: { src: string; key: string; html: Map<number, string> } | null = null;
  (md as unknown as MarkdownItLike).core.ruler.push(PREVIEW_RULE, (state) => {
    const fences: number[] = [];
    state.tokens.forEach((t, i) => {
      if (t.type === 'fence' && t.map && langOf(t.info) === 'air') fences.push(i);
    });
    if (fences.length === 0) return;
    let byLine: Map<number, string>;
    try {
      const settings = hostBounded(opts.settings?.(state.env) ?? DEFAULT_SERVICE_SETTINGS);
      const key = JSON.stringify(settings);
      if (last && last.src === state.src && last.key === key) byLine = last.html;
      else {
        byLine = htmlByLine(state.src, settings);
        last = { src: state.src, key, html: byLine };
      }
    } catch (err) {
      opts.onError?.(err);
      return;
    }
    // From the last fence back, so the indices of the earlier ones stay valid.
    for (let k = fences.length - 1; k >= 0; k--) {
      const i = fences[k]!;
      const fence = state.tokens[i]!;
      const content = byLine.get(fence.map![0]);
      if (content === undefined) continue;
      const token = new state.Token('html_block', '', 0);
      token.content = content;
      token.block = true;
      token.level = fence.level;
      state.tokens.splice(i + 1, 0, token);
    }
  });
  return md;
}
