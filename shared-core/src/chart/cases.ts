/**
 * Charts per case: which statements of a note are drawn together. By default each heading's
 * section is one chart (summer, winter, part load…); per block, each ` ```air ` fence is one; or
 * the whole note on one chart. A fence's info string can group blocks by name whatever the
 * grouping: ` ```air chart=summer ` puts the block on the chart named `summer`, with every other
 * block of that name. A statement in running prose (a code span) joins the chart of the nearest
 * fence above it in its section, else the one below it, else its section's.
 *
 * One pass over the statements, the regions and the headings, each in document order: linear.
 */
import type { AirRegion, HeadingNode, Statement } from '../notation/ast';
import type { Analysis } from '../evaluate/types';
import type { Span } from '../text/types';

/** How statements are grouped into charts. */
export type ChartGrouping = 'section' | 'block' | 'all';

/** The groupings, in the order the CLI and the docs list them (the first is the default). */
export const CHART_GROUPINGS: readonly ChartGrouping[] = ['section', 'block', 'all'];

/** One chart of a note: a set of statements drawn together. */
export interface ChartCase {
  /**
   * Stable within a note: `all`, `chart:NAME`, `section:N` (0 = before the first heading) or
   * `block:N` (1-based fence number).
   */
  key: string;
  /** What the chart shows, in words: the heading, `chart summer`, `block at line 12`. */
  title: string;
  /** The statements drawn (their states, mixes, processes and supplies), in document order. */
  statements: Statement[];
  /** The source ranges the case covers (its fences and code spans): the editor's chart follows the cursor into them. */
  spans: Span[];
  /** Problems with the grouping as written (a `chart=` without a name), for the chart's flagged list. */
  problems: string[];
}

/** A name as the notation writes names: a letter, then letters, digits, `_` or `-`. */
const CHART_NAME = /^[A-Za-z][A-Za-z0-9_-]*$/;

/** The `chart=NAME` option of a fence's info string (`air chart=summer`): the name, or a problem. */
export function chartOption(info: string | undefined): { name: string | null; problem: string | null } {
  if (!info) return { name: null, problem: null };
  const words = info.split(/\s+/).slice(1);
  let name: string | null = null;
  for (const w of words) {
    if (!/^chart\s*=/.test(w) && w !== 'chart') continue;
    const value = w.replace(/^chart\s*=?/, '');
    if (!CHART_NAME.test(value))
      return {
        name: null,
        problem:
          `\`${w}\` in the fence's info string: a chart name starts with a letter, then letters, ` +
          `digits, _ or - (\`\`\`air chart=summer); the block is drawn with its section.`,
      };
    name = value;
  }
  return { name, problem: null };
}

/**
 * 1-based lines of offsets asked in increasing order (each call counts on from the last; a smaller offset starts over).
 */
function lineCounter(text: string | undefined): (offset: number) => number | undefined {
  if (text === undefined) return () => undefined;
  let pos = 0;
  let line = 1;
  return (offset) => {
    if (offset < pos) {
      pos = 0;
      line = 1;
    }
    for (let i = text.indexOf('\n', pos); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) line++;
    pos = offset;
    return line;
  };
}

/**
 * The charts of an analysed note for a grouping, in the order their first statements appear.
 * Cases without any statement that draws something (a block of `site:` and `units:` lines only)
 * are left out. `source` (the note's text) gives block titles their line numbers.
 */
export function chartCases(analysis: Analysis, grouping: ChartGrouping = 'section', source?: string): ChartCase[] {
  const { regions, headings, statements } = analysis.parsed;
  if (grouping === 'all') {
    const drawn = statements.filter(draws);
    if (drawn.length === 0) return [];
    return [{ key: 'all', title: 'all states', statements: drawn, spans: regions.map((r) => r.span), problems: [] }];
  }
  const lineOf = lineCounter(source);
  // Each region's section (index of the heading above it, 0 before the first) and fence group.
  const sectionOf = sectionFinder(headings);
  interface RegionGroup {
    region: AirRegion;
    section: number;
    /** The group key of a fence; null for a code span until it is resolved. */
    key: string | null;
    title: string;
    problem: string | null;
  }
  const groups: RegionGroup[] = [];
  let fenceNo = 0;
  for (const region of regions) {
    const section = sectionOf(region.span.start);
    const sectionTitle = section === 0 ? 'before the first heading' : headings[section - 1]!.text;
    if (region.origin !== 'fence') {
      groups.push({ region, section, key: null, title: sectionTitle, problem: null });
      continue;
    }
    fenceNo++;
    const opt = chartOption(region.info);
    if (opt.name) groups.push({ region, section, key: `chart:${opt.name}`, title: `chart ${opt.name}`, problem: null });
    else if (grouping === 'block') {
      const line = lineOf(region.span.start);
      const title = `${sectionTitle} \u2014 block ${line === undefined ? fenceNo : `at line ${line}`}`;
      groups.push({ region, section, key: `block:${fenceNo}`, title, problem: opt.problem });
    } else groups.push({ region, section, key: `section:${section}`, title: sectionTitle, problem: opt.problem });
  }
  // A code span takes the group of the nearest fence above it in its section, else below it, else its section's.
  let above: RegionGroup | null = null;
  for (const g of groups) {
    if (g.region.origin === 'fence') above = g;
    else if (above && above.section === g.section) {
      g.key = above.key;
      g.title = above.title;
    }
  }
  let below: RegionGroup | null = null;
  for (let i = groups.length - 1; i >= 0; i--) {
    const g = groups[i]!;
    if (g.region.origin === 'fence') below = g;
    else if (g.key === null) {
      if (below && below.section === g.section) {
        g.key = below.key;
        g.title = below.title;
      } else g.key = `section:${g.section}`;
    }
  }
  // Statements to their region's group (both lists in document order: one walk).
  const cases = new Map<string, ChartCase>();
  const caseOf = (g: RegionGroup): ChartCase => {
    let c = cases.get(g.key!);
    if (!c) {
      c = { key: g.key!, title: g.title, statements: [], spans: [], problems: [] };
      cases.set(g.key!, c);
    }
    return c;
  };
  let r = 0;
  for (const g of groups) {
    const c = caseOf(g);
    c.spans.push(g.region.span);
    if (g.problem) c.problems.push(`line ${lineOf(g.region.span.start) ?? '?'}: ${g.problem}`);
  }
  for (const st of statements) {
    while (r < groups.length && groups[r]!.region.span.end < st.span.start) r++;
    const g = groups[r];
    if (!g || g.region.span.start > st.span.start) continue;
    if (draws(st)) caseOf(g).statements.push(st);
  }
  return [...cases.values()].filter((c) => c.statements.length > 0);
}

/** Whether a statement puts something on the chart (a state, mix, process, supply or recovery). */
function draws(st: Statement): boolean {
  return st.keyword !== 'site' && st.keyword !== 'units';
}

/** The section (1-based heading index, 0 before the first heading) of increasing offsets. */
function sectionFinder(headings: HeadingNode[]): (offset: number) => number {
  let h = 0;
  return (offset) => {
    if (h > 0 && headings[h - 1]!.span.start > offset) h = 0;
    while (h < headings.length && headings[h]!.span.start <= offset) h++;
    return h;
  };
}

/**
 * The case whose source holds `offset` (the editor's cursor), else the nearest case above it,
 * else the first. Binary search over the cases' spans sorted once.
 */
export function caseAt(cases: readonly ChartCase[], offset: number): ChartCase | undefined {
  const spans: { span: Span; c: ChartCase }[] = [];
  for (const c of cases) for (const span of c.spans) spans.push({ span, c });
  spans.sort((a, b) => a.span.start - b.span.start);
  let lo = 0;
  let hi = spans.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (spans[mid]!.span.start <= offset) lo = mid + 1;
    else hi = mid;
  }
  return lo > 0 ? spans[lo - 1]!.c : cases[0];
}
