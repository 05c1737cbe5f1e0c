/**
 * The whole note as HTML for the review report: its Markdown (headings, prose, tables, lists,
 * images, code) rendered by the set-up of `markdown/render.ts` (the Markdown preview's), with each
 * ` ```air ` block followed by its computed results and each inline statement followed by its
 * figures. Every claim is shown in print as written → computed with its verdict; a comment on a
 * statement's line is shown as that statement's description.
 *
 * Results are placed the way the preview places its tables: a markdown-it core rule finds the
 * `air` fences (by their opening line) and the code spans that hold statements (by their content,
 * in document order) and inserts HTML after them. A statement the rule could not place (the two
 * parsers disagreeing about an unusual code span) is returned in `unplaced`, never dropped.
 *
 * Everything from the note is escaped; raw HTML in the note is shown as text (see
 * `markdown/render.ts`). Images are resolved by the caller (the core reads no files): a resolved
 * image becomes a `data:` URI, anything else a visible placeholder naming the image and why.
 * Pure: text and analysis in, HTML out; linear in the note.
 */
import type { Analysis, EvaluatedItem, ProcessResult, StateResult, SuppressedDiagnostic } from '../evaluate/types';
import { createRenderMarkdownIt, type NoteRenderer, type RenderToken } from '../markdown/render';
import type { AirRegion, CoreDiagnostic, Statement } from '../notation/ast';
import { LineIndex } from '../text/lineIndex';
import type { Span } from '../text/types';
import { displaySymbol, displayUnit } from '../units';
import type { Dimension, UnitSystem } from '../units/types';
import { readFrontMatter, withoutFrontMatter, type FrontMatter } from './frontMatter';
import { escapeHtml } from './resultsTable';
import { claimRow, processRow, stateRow, waterUnit, type StateFigureKey } from './rows';

/** What the caller's image resolver answers for an image's `src` as written. */
export type ImageAnswer = { ok: true; dataUri: string } | { ok: false; reason: string };

/** Options of {@link noteHtml}. */
export interface NoteHtmlOptions {
  /** Resolves an image (a path relative to the note, or a URL) to a `data:` URI; default: none are included. */
  image?: (src: string) => ImageAnswer;
}

/** An image of the note that is not in the report, and why. */
export interface MissingImage {
  src: string;
  reason: string;
}

/** The rendered note. */
export interface NoteHtml {
  /** The note's body as HTML (front matter not included). */
  html: string;
  /** The text of the note's first heading (inline Markdown reduced to its text), or null. */
  title: string | null;
  frontMatter: FrontMatter | null;
  /** HTML of the statements that could not be placed in the text (each with its results), '' when none. */
  unplaced: string;
  /** Images that were not included. */
  missingImages: MissingImage[];
}

/** Per render: what the core rule and the image rule read (markdown-it's `env`). */
interface RenderEnv {
  dewmark: {
    fenceHtml: Map<number, string>;
    /** Inline regions in document order, with their HTML; `placed` set by the rule. */
    inline: { key: string; html: string; placed: boolean }[];
    title: string | null;
    image: NoteHtmlOptions['image'];
    missingImages: MissingImage[];
  };
}

let renderer: NoteRenderer | null = null;

function theRenderer(): NoteRenderer {
  if (renderer) return renderer;
  const md = createRenderMarkdownIt();
  md.core.ruler.push('dewmark_report_results', (state) => {
    const env = (state.env as Partial<RenderEnv>).dewmark;
    if (!env) return;
    placeResults(state.tokens, env, state.Token);
  });
  const defaultImage = md.renderer.rules.image!;
  md.renderer.rules.image = (tokens, idx, options, rawEnv, self) => {
    const env = (rawEnv ?? {}) as Partial<RenderEnv>;
    const token = tokens[idx]!;
    const src = String(token.attrGet('src') ?? '');
    const alt = self.renderInlineAsText(token.children ?? [], options, env);
    const answer: ImageAnswer = env.dewmark?.image
      ? env.dewmark.image(src)
      : { ok: false, reason: 'images are not included' };
    if (answer.ok) {
      token.attrSet('src', answer.dataUri);
      return defaultImage(tokens, idx, options, env, self);
    }
    env.dewmark?.missingImages.push({ src, reason: answer.reason });
    return (
      `<span class="dm-missing-image" role="img" aria-label="${escapeHtml(alt)}">` +
      `[image not included: ${escapeHtml(alt || src)} — <code>${escapeHtml(src)}</code>` +
      `: ${escapeHtml(answer.reason)}]</span>`
    );
  };
  renderer = md;
  return md;
}

type TokenCtor = new (type: string, tag: string, nesting: RenderToken['nesting']) => RenderToken;

function langOf(info: string): string {
  return info.trim().split(/\s+/, 1)[0] ?? '';
}

/** Code-span content as a key: whitespace runs as one space, trimmed (both parsers agree on this). */
function spanKey(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

/** Inserts the results after air fences and statement code spans; notes the first heading's text. */
function placeResults(tokens: RenderToken[], env: RenderEnv['dewmark'], Token: TokenCtor): void {
  // Inline regions by key → their indices (ascending) and how far they are used; `next` keeps the
  // document order. Each index is passed once, so placing is linear in the note.
  const byKey = new Map<string, { list: number[]; at: number }>();
  env.inline.forEach((r, i) => {
    const entry = byKey.get(r.key);
    if (entry) entry.list.push(i);
    else byKey.set(r.key, { list: [i], at: 0 });
  });
  let next = 0;
  const placeInline = (children: RenderToken[]): void => {
    for (let c = 0; c < children.length; c++) {
      const child = children[c]!;
      if (child.children) placeInline(child.children);
      if (child.type !== 'code_inline') continue;
      const entry = byKey.get(spanKey(child.content));
      if (!entry) continue;
      while (entry.at < entry.list.length && entry.list[entry.at]! < next) entry.at++;
      const i = entry.list[entry.at];
      if (i === undefined) continue;
      entry.at++;
      const region = env.inline[i]!;
      region.placed = true;
      next = i + 1;
      if (!region.html) continue;
      const t = new Token('html_inline', '', 0);
      t.content = region.html;
      children.splice(c + 1, 0, t);
      c++;
    }
  };
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    if (t.type === 'heading_open' && env.title === null) {
      const inline = tokens[i + 1];
      if (inline?.type === 'inline') env.title = textOf(inline.children ?? []).trim() || null;
    }
    if (t.type === 'inline' && t.children) placeInline(t.children);
    if (t.type === 'fence' && t.map && langOf(t.info) === 'air') {
      const html = env.fenceHtml.get(t.map[0]);
      if (html === undefined) continue;
      env.fenceHtml.delete(t.map[0]);
      if (html === '') continue;
      const after = new Token('html_block', '', 0);
      after.content = html;
      after.block = true;
      after.level = t.level;
      tokens.splice(i + 1, 0, after);
      i++;
    }
  }
}

/** The plain text of inline tokens (a heading's words without its Markdown). */
function textOf(children: RenderToken[]): string {
  let s = '';
  for (const c of children) {
    if (c.type === 'text' || c.type === 'code_inline') s += c.content;
    else if (c.type === 'softbreak' || c.type === 'hardbreak') s += ' ';
    else if (c.type === 'image') s += textOf(c.children ?? []);
  }
  return s;
}

// ---------------------------------------------------------------------------------------------
// Results of a region
// ---------------------------------------------------------------------------------------------

/** What the results builders read besides the items. */
interface Ctx {
  text: string;
  lines: LineIndex;
  system: UnitSystem;
}

function unitOf(dim: Dimension, sys: UnitSystem): string {
  return displaySymbol(displayUnit(dim, sys));
}

/** The comment written after a statement on its line (inside its code span, inline), or ''. */
export function statementComment(text: string, statement: Statement, limit: number): string {
  let end = text.indexOf('\n', statement.span.end);
  if (end < 0 || end > limit) end = limit;
  const rest = text.slice(statement.span.end, end).trim();
  if (!rest.startsWith('#')) return '';
  const comment = rest.slice(1).trim();
  // An ignore comment is not a description: the diagnostics it acknowledges are listed instead.
  return /^dewmark-ignore\b/.test(comment) ? '' : comment;
}

/** The keyword of the statement an item is the primary result of (a process defines a state too). */
function isPrimary(item: EvaluatedItem): boolean {
  const kw = item.statement.keyword;
  return item.kind === 'process' ? kw === 'process' || kw === 'recover' : kw === item.kind;
}

const STATE_COLUMNS: { key: StateFigureKey; label: string; dim: Dimension | null }[] = [
  { key: 'db', label: 'db', dim: 'temperature' },
  { key: 'wb', label: 'wb', dim: 'temperature' },
  { key: 'dp', label: 'dp', dim: 'temperature' },
  { key: 'rh', label: 'rh', dim: null },
  { key: 'w', label: 'w', dim: 'humidityRatio' },
  { key: 'h', label: 'h', dim: 'enthalpy' },
  { key: 'v', label: 'v', dim: 'specificVolume' },
];

function claimsHtml(item: EvaluatedItem, ctx: Ctx): string {
  if (item.claims.length === 0) return '';
  const parts = item.claims.map((c) => {
    const row = claimRow(c, ctx.text);
    return `<span class="dm-claim ${row.pass ? 'pass' : 'fail'}">${escapeHtml(row.text)}</span>`;
  });
  return `<span class="dm-claims">claims: ${parts.join('; ')}</span>`;
}

function aboutRow(parts: string[], colspan: number): string {
  const shown = parts.filter((p) => p !== '');
  if (shown.length === 0) return '';
  return `<tr class="dm-about"><td colspan="${colspan}">${shown.join(' <span class="dm-sep">·</span> ')}</td></tr>`;
}

function description(item: EvaluatedItem, ctx: Ctx, limit: number): string {
  if (!isPrimary(item)) return '';
  const c = statementComment(ctx.text, item.statement, limit);
  return c ? `<span class="dm-desc">${escapeHtml(c)}</span>` : '';
}

function lineNote(item: EvaluatedItem, ctx: Ctx, withLine: boolean): string {
  return withLine ? `<span class="dm-line">line ${ctx.lines.lineCol(item.statement.span.start).line}</span>` : '';
}

function statesTable(
  states: StateResult[],
  ctx: Ctx,
  limitOf: (s: Statement) => number,
  withLine: boolean,
  id: string | undefined,
): string {
  const sys = ctx.system;
  const rows = states.map((s) => ({ item: s, row: stateRow(s, sys) }));
  const pressures = new Set(rows.map((r) => r.row.figures.p.text));
  const cols =
    pressures.size > 1
      ? [{ key: 'p' as const, label: 'p', dim: 'pressure' as Dimension }, ...STATE_COLUMNS]
      : STATE_COLUMNS;
  const head = cols
    .map(
      (c) =>
        `<th scope="col" class="num">${c.label} ` +
        `<span class="dm-unit">${escapeHtml(c.dim ? unitOf(c.dim, sys) : '%')}</span></th>`,
    )
    .join('');
  const n = cols.length + 1;
  const bodies = rows.map(({ item, row }) => {
    const cells = cols
      .map((c) => {
        let v = escapeHtml(row.figures[c.key].value);
        if (c.key === 'wb' && row.wbIce) v += ' <span class="dm-note">ice</span>';
        if (c.key === 'dp' && row.dpFrost) v += ' <span class="dm-note">frost</span>';
        return `<td class="num">${v}</td>`;
      })
      .join('');
    const facts: string[] = [];
    if (item.kind === 'mix') {
      const streams = row.streams.map((x) => `${x.name} ${x.fraction.text}`).join(' + ');
      facts.push(`mix of ${streams || 'its streams'}`);
    }
    if (item.kind === 'supply') facts.push('supply air');
    if ((item.kind === 'mix' || item.kind === 'supply') && row.massFlow.value !== '—')
      facts.push(`dry-air flow ${row.massFlow.text}`);
    if (row.origin) facts.push(row.origin);
    if (row.status === 'ok' || row.status === 'fog') facts.push(`fixed by ${row.defining.join(' + ')}`);
    if (row.status === 'fog') facts.push('fog: above saturation');
    if (row.status === 'failed') facts.push('not computed: see the problems below');
    const status = row.status === 'ok' ? '' : ` dm-${row.status}`;
    return `<tbody class="dm-item${status}"><tr><th scope="row" \
class="dm-name">${escapeHtml(item.name)}</th>${cells}</tr>${aboutRow(
      [
        description(item, ctx, limitOf(item.statement)),
        escapeHtml(facts.join('; ')),
        claimsHtml(item, ctx),
        lineNote(item, ctx, withLine),
      ],
      n,
    )}</tbody>`;
  });
  const at = pressures.size === 1 ? ` at ${escapeHtml([...pressures][0]!)}` : '';
  return (
    `<table${id ? ` id="${id}"` : ''} class="dm-table dm-states"><caption>States and mixes${at}</caption>` +
    `<thead><tr><th scope="col">state</th>${head}</tr></thead>${bodies.join('')}</table>`
  );
}

function processesTable(
  procs: ProcessResult[],
  ctx: Ctx,
  limitOf: (s: Statement) => number,
  withLine: boolean,
  id: string | undefined,
): string {
  const sys = ctx.system;
  const head = ['process', 'kind', 'dry-air flow', 'total', 'sensible', 'latent', 'SHR', 'water']
    .map((h, i) => `<th scope="col"${i >= 2 ? ' class="num"' : ''}>${h}</th>`)
    .join('');
  const bodies = procs.map((p) => {
    const row = processRow(p, sys);
    const cells = [row.massFlow, row.total, row.sensible, row.latent, row.shr, row.water]
      .map((f) => `<td class="num">${escapeHtml(f.text)}</td>`)
      .join('');
    const facts: string[] = [];
    if (!row.hasFlow)
      facts.push(
        `no flow given: heat per ${sys === 'SI' ? 'kg' : 'lb'} of dry air, water as the humidity-ratio change`,
      );
    else if (row.coil.value !== '—') facts.push(`coil or heater duty with the water's enthalpy ${row.coil.text}`);
    if (row.volumeFlow.value !== '—') facts.push(`volume flow ${row.volumeFlow.text}`);
    return `<tbody class="dm-item"><tr><th scope="row" class="dm-name">${escapeHtml(p.name)}<br>\
<span class="dm-from">${escapeHtml(`${p.from} → ${p.to}`)}</span>\
</th><td>${escapeHtml(row.kindWithAdp)}</td>${cells}</tr>${aboutRow(
      [
        description(p, ctx, limitOf(p.statement)),
        escapeHtml(facts.join('; ')),
        claimsHtml(p, ctx),
        lineNote(p, ctx, withLine),
      ],
      8,
    )}</tbody>`;
  });
  const water = escapeHtml(displaySymbol(waterUnit(sys)));
  return (
    `<table${id ? ` id="${id}"` : ''} class="dm-table dm-processes">` +
    `<caption>Processes (positive = heat or water added to the air; water ` +
    `in ${water})</caption><thead><tr>${head}</tr></thead>${bodies.join('')}</table>`
  );
}

function problemsHtml(
  problems: readonly CoreDiagnostic[],
  acknowledged: readonly SuppressedDiagnostic[],
  ctx: Ctx,
): string {
  if (problems.length === 0 && acknowledged.length === 0) return '';
  const at = (d: CoreDiagnostic) => `line ${ctx.lines.lineCol(d.span.start).line}`;
  const items = problems.map(
    (d) =>
      `<li class="dm-${d.severity}"><strong>${d.severity}</strong> ` +
      `<code>${escapeHtml(d.code)}</code> (${at(d)}): ${escapeHtml(d.message)}</li>`,
  );
  for (const d of acknowledged)
    items.push(
      `<li class="dm-acknowledged"><strong>acknowledged</strong> <code>${escapeHtml(d.code)}</code> (${at(d)}): ` +
        `${escapeHtml(d.message)}${d.justification ? ` — reason given: ${escapeHtml(d.justification)}` : ''}</li>`,
    );
  return `<ul class="dm-problems">${items.join('')}</ul>`;
}

/** The results of some items (a block's, or every item of the note) as an HTML fragment. */
export function itemsResultsHtml(
  analysis: Analysis,
  text: string,
  items: readonly EvaluatedItem[],
  problems: readonly CoreDiagnostic[],
  acknowledged: readonly SuppressedDiagnostic[],
  opts: {
    /** Show each statement's line (for an index of the whole note). */
    withLine?: boolean;
    /** Where a statement's comment may end at the latest (the end of its code span, inline). */
    limitOf?: (s: Statement) => number;
    lines?: LineIndex;
    /** `id` attributes of the states and processes tables. */
    ids?: { states: string; processes: string };
  } = {},
): string {
  const ctx: Ctx = { text, lines: opts.lines ?? new LineIndex(text), system: analysis.units };
  const regions = analysis.parsed.regions;
  const limitOf =
    opts.limitOf ??
    ((st: Statement) => {
      const r = regions[regionAt(regions, st.span.start)];
      return r ? (r.origin === 'inline' ? r.contentSpan.end : r.span.end) : text.length;
    });
  const states = items.filter((i): i is StateResult => i.kind !== 'process');
  const procs = items.filter((i): i is ProcessResult => i.kind === 'process');
  const out: string[] = [];
  if (states.length > 0) out.push(statesTable(states, ctx, limitOf, opts.withLine === true, opts.ids?.states));
  if (procs.length > 0) out.push(processesTable(procs, ctx, limitOf, opts.withLine === true, opts.ids?.processes));
  out.push(problemsHtml(problems, acknowledged, ctx));
  return out.join('');
}

/** The figures of an inline statement, on one line of print: `→ wb 15.6 °C · dp 10.8 °C …`. */
function inlineItemText(item: EvaluatedItem, ctx: Ctx): string {
  const parts: string[] = [];
  if (item.kind === 'process') {
    const row = processRow(item, ctx.system);
    parts.push(`${escapeHtml(item.name)}: ${escapeHtml(row.kindWithAdp)}`);
    const figs: [string, { text: string; value: string }][] = [
      ['total', row.total],
      ['sensible', row.sensible],
      ['latent', row.latent],
      ['SHR', row.shr],
      ['water', row.water],
    ];
    for (const [label, f] of figs) if (f.value !== '—') parts.push(`${label} ${escapeHtml(f.text)}`);
  } else {
    const row = stateRow(item, ctx.system);
    const skip = new Set<string>([...item.defining, ...item.claims.map((c) => c.key)]);
    const shown = STATE_COLUMNS.filter((c) => c.key !== 'v' && !skip.has(c.key)).map(
      (c) => `${c.key === 'dp' && row.dpFrost ? 'fp' : c.label} ${escapeHtml(row.figures[c.key].text)}`,
    );
    parts.push(`${escapeHtml(item.name)}${shown.length > 0 ? `: ${shown.join(' · ')}` : ''}`);
    if (row.status === 'fog') parts.push('fog');
    if (row.status === 'failed') parts.push('not computed');
  }
  for (const c of item.claims) {
    const r = claimRow(c, ctx.text);
    parts.push(`<span class="dm-claim ${r.pass ? 'pass' : 'fail'}">${escapeHtml(r.text)}</span>`);
  }
  return parts.join(' · ');
}

function inlineHtml(items: readonly EvaluatedItem[], problems: readonly CoreDiagnostic[], ctx: Ctx): string {
  const parts = items.map((i) => inlineItemText(i, ctx));
  for (const d of problems)
    parts.push(
      `<span class="dm-${d.severity}"><strong>${d.severity}</strong> ` +
        `<code>${escapeHtml(d.code)}</code>: ${escapeHtml(d.message)}</span>`,
    );
  if (parts.length === 0) return '';
  return ` <span class="dm-inline">[→ ${parts.join('; ')}]</span>`;
}

// ---------------------------------------------------------------------------------------------
// The note
// ---------------------------------------------------------------------------------------------

/** Index of the region (sorted, disjoint) holding `offset`, or -1. */
function regionAt(regions: readonly AirRegion[], offset: number): number {
  let lo = 0;
  let hi = regions.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const s: Span = regions[mid]!.span;
    if (offset < s.start) hi = mid - 1;
    else if (offset > s.end) lo = mid + 1;
    else return mid;
  }
  return -1;
}

/** The note rendered with its results (see the module comment). */
export function noteHtml(text: string, analysis: Analysis, opts: NoteHtmlOptions = {}): NoteHtml {
  const lines = new LineIndex(text);
  const ctx: Ctx = { text, lines, system: analysis.units };
  const regions = analysis.parsed.regions;
  const items: EvaluatedItem[][] = regions.map(() => []);
  const problems: CoreDiagnostic[][] = regions.map(() => []);
  const acknowledged: SuppressedDiagnostic[][] = regions.map(() => []);
  for (const item of analysis.items) {
    const r = regionAt(regions, item.statement.span.start);
    if (r >= 0) items[r]!.push(item);
  }
  for (const d of analysis.diagnostics) {
    const r = regionAt(regions, d.span.start);
    if (r >= 0) problems[r]!.push(d);
  }
  for (const d of analysis.suppressed ?? []) {
    const r = regionAt(regions, d.span.start);
    if (r >= 0) acknowledged[r]!.push(d);
  }

  const fenceHtml = new Map<number, string>();
  const fenceRegion = new Map<number, number>();
  const inline: RenderEnv['dewmark']['inline'] = [];
  const inlineRegion: number[] = [];
  regions.forEach((region, r) => {
    const limit = region.origin === 'inline' ? region.contentSpan.end : region.span.end;
    if (region.origin === 'fence') {
      const body = itemsResultsHtml(analysis, text, items[r]!, problems[r]!, acknowledged[r]!, {
        lines,
        limitOf: () => limit,
      });
      const line = lines.positionAt(region.span.start).line;
      // A block of only site: or units: lines computes nothing to show.
      fenceHtml.set(
        line,
        body === ''
          ? ''
          : `<div class="dm-results" role="group" aria-label="Results of the air block above">${body}</div>\n`,
      );
      fenceRegion.set(line, r);
    } else {
      inline.push({
        key: spanKey(text.slice(region.contentSpan.start, region.contentSpan.end)),
        html: inlineHtml(items[r]!, problems[r]!, ctx),
        placed: false,
      });
      inlineRegion.push(r);
    }
  });

  const fm = readFrontMatter(text);
  const env: RenderEnv = { dewmark: { fenceHtml, inline, title: null, image: opts.image, missingImages: [] } };
  const html = theRenderer().render(withoutFrontMatter(text, fm), env as unknown as Record<string, unknown>);

  // Whatever the rule could not place, with its source and results, so that nothing is lost.
  const left: string[] = [];
  const leftRegions: number[] = [...fenceHtml.keys()].map((line) => fenceRegion.get(line)!);
  inline.forEach((x, i) => {
    if (!x.placed) leftRegions.push(inlineRegion[i]!);
  });
  leftRegions.sort((a, b) => a - b);
  for (const r of leftRegions) {
    const region = regions[r]!;
    const source = text.slice(region.contentSpan.start, region.contentSpan.end);
    const results = itemsResultsHtml(analysis, text, items[r]!, problems[r]!, acknowledged[r]!, {
      lines,
      limitOf: () => region.span.end,
    });
    left.push(
      `<div class="dm-unplaced"><p>Line ${lines.lineCol(region.span.start).line}:</p>` +
        `<pre><code>${escapeHtml(source)}</code></pre><div class="dm-results">${results}</div></div>`,
    );
  }
  return {
    html,
    title: env.dewmark.title,
    frontMatter: fm,
    unplaced: left.join('\n'),
    missingImages: env.dewmark.missingImages,
  };
}
