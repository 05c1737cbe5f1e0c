/**
 * `dewmark report NOTE.md -o report.html`: the calc package for review and sign-off, as one
 * self-contained HTML file — a header block (title from the note's first heading, file path, note
 * digest, date), the revision and sign-off block, then the whole note rendered (`noteHtml` in the
 * core: its prose, tables, lists and images, each air block followed by its results, each inline
 * statement by its figures, every claim as written → computed with its verdict), then every
 * diagnostic, the chart, an index of all states and processes, the pressure basis, the method and
 * its sources, and the caution. No network: inline CSS, inline SVG, images as `data:` URIs, no
 * scripts, and a Content-Security-Policy that forbids loading anything. The contract is in
 * docs/report.md.
 */
import type { Command } from 'commander';
import { renderChartCases } from '@dewmark/core/chart';
import type { PressureBasis } from '@dewmark/core/evaluate';
import { itemsResultsHtml, noteHtml, type FrontMatter, type ImageAnswer } from '@dewmark/core/present';
import { crypto } from '../builtins';
import { LineIndex, figure, type Analysis, type CoreDiagnostic } from '../core';
import type { CliIO } from '../run';
import { checkOutputPath, exitCodeOf, readOneNote, writeOutput, wroteLine, type WriteOptions } from './outputFile';
import { safeText } from '../sanitize';
import { resolveImage } from './reportImages';
import { GitProblem, compareNotes, noteAtRevision, type ClaimChange, type ItemChange } from './diff';
import { analyzeNote } from '../core';
import { UsageError, maxNoteBytes, toSettings } from '../settings';
import { BROWSER_NAMES, CHROMIUM_ENV, findChromium, printPdf } from './reportPdf';

/** Escapes text for HTML content and attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** What the report is made from. */
export interface ReportInput {
  /** The note's path as shown. */
  path: string;
  /** The note's full text. */
  text: string;
  analysis: Analysis;
}

/** Options of {@link renderReportHtml}. */
export interface ReportOptions {
  /** When the report was made (ISO text); default now. */
  generatedAt?: string;
  /** Version of dewmark printed in the footer. */
  version?: string;
  /** Resolves an image of the note to a `data:` URI (the CLI reads files relative to the note); default: none. */
  image?: (src: string) => ImageAnswer;
  /** The paper the print stylesheet sets (`@page size`); default: the printer's. */
  page?: PageSize;
  /** What changed since a revision (`--since`), as `dewmark diff` computes it. */
  changes?: ReportChanges;
}

/** The "changes since" of a report: the revision, and the statements with changes (null: the note is new). */
export interface ReportChanges {
  revision: string;
  commit: string;
  items: ItemChange[] | null;
}

/** Paper sizes of the print stylesheet. */
export const PAGE_SIZES = ['a4', 'letter'] as const;
export type PageSize = (typeof PAGE_SIZES)[number];

/** Paper width and height, mm: A4 by ISO 216, Letter 8.5 × 11 in (1 in = 25.4 mm). */
export const PAPER_MM: Readonly<Record<PageSize, readonly [number, number]>> = {
  a4: [210, 297],
  letter: [215.9, 279.4],
};

/** The print margins, mm (the running header and the page numbers sit in the top and bottom ones). */
export const PAGE_MARGIN_MM = { top: 18, right: 15, bottom: 16, left: 15 } as const;

/**
 * The sign-off rows and the front-matter keys that fill them (docs/report.md): a note may start
 * with `prepared_by: …`, `checked_on: …` and so on; a row without them is left blank to fill by hand.
 * The signature is always left blank.
 */
const SIGNOFF = [
  { role: 'prepared by', by: 'prepared_by', on: 'prepared_on' },
  { role: 'checked by', by: 'checked_by', on: 'checked_on' },
  { role: 'approved by (licensed engineer)', by: 'approved_by', on: 'approved_on' },
] as const;

/** The caution printed at the top and in the footer of every report. */
export const CAUTION =
  'Design aid only. These figures are computed from the values ' +
  'written in the note; they do not replace engineering judgement. ' +
  'Verify them against the applicable codes and standards, and have the design reviewed by a ' +
  'licensed professional engineer before it is used for construction, purchase or commissioning.';

function lineOf(lines: LineIndex, text: string, offset: number): number {
  return lines.lineCol(Math.max(0, Math.min(offset, text.length))).line;
}

function table(id: string, caption: string, header: string[], rows: string[][], numeric: boolean[]): string {
  const th = header.map((h, i) => `<th scope="col"${numeric[i] ? ' class="num"' : ''}>${h}</th>`).join('');
  const body = rows
    .map((r) => `<tr>${r.map((c, i) => `<td${numeric[i] ? ' class="num"' : ''}>${c}</td>`).join('')}</tr>`)
    .join('\n');
  return (
    `<table id="${id}"><caption>${caption}</caption><thead>` +
    `<tr>${th}</tr></thead><tbody>\n${body}\n</tbody></table>`
  );
}

function diagnosticsSection(a: Analysis, lines: LineIndex, text: string): string {
  if (a.diagnostics.length === 0)
    return (
      '<p class="none" id="diagnostics-none">No diagnostics: every ' +
      'statement was read and evaluated without errors or warnings.</p>'
    );
  const rows = a.diagnostics.map((d: CoreDiagnostic) => {
    const lc = lines.lineCol(Math.max(0, Math.min(d.span.start, text.length)));
    const snippet = text.slice(d.span.start, Math.min(d.span.end, d.span.start + 80));
    return [
      `${lc.line}:${lc.column}`,
      `<span class="sev ${d.severity}">${d.severity}</span>`,
      `<code>${escapeHtml(d.code)}</code>`,
      escapeHtml(d.message),
      snippet ? `<code>${escapeHtml(snippet)}</code>` : '',
    ];
  });
  return table(
    'diagnostics',
    `Diagnostics (${a.diagnostics.length})`,
    ['line:col', 'severity', 'code', 'message', 'at'],
    rows,
    [true, false, false, false, false],
  );
}

function pressureSection(a: Analysis, lines: LineIndex, text: string): string {
  const bases = new Map<string, { basis: PressureBasis; names: string[] }>();
  for (const item of a.items) {
    if (item.kind === 'process') continue;
    const key = `${Math.round(item.pressure.pa)}|${item.pressure.origin}`;
    const e = bases.get(key);
    if (e) e.names.push(item.name);
    else bases.set(key, { basis: item.pressure, names: [item.name] });
  }
  const settingPressure = figure(a.settings.pressurePa, 'pressure', a.units).text;
  const settingText = `${settingPressure} (${escapeHtml(a.settings.pressureOrigin)})`;
  if (bases.size === 0) return `<p id="pressure-basis">No states; the default pressure would be ${settingText}.</p>`;
  const items = [...bases.values()].map(({ basis, names }) => {
    const where =
      basis.span && !/\bline \d+/.test(basis.origin) ? `, line ${lineOf(lines, text, basis.span.start)}` : '';
    const elev =
      basis.elevationM !== null
        ? ' (elevation to pressure by the standard-atmosphere equation, ASHRAE HoF Ch. 1 eq 3)'
        : '';
    return (
      `<li><strong>${figure(basis.pa, 'pressure', a.units).text}</strong>` +
      ` — ${escapeHtml(basis.origin)}${escapeHtml(where)}${escapeHtml(elev)}; used ` +
      `by ${names.map((n) => `<span class="name">${escapeHtml(n)}</span>`).join(', ')}</li>`
    );
  });
  return (
    `<ul id="pressure-basis">${items.join('\n')}</ul><p class="small">Default when a note has no <code>` +
    `site:</code> line: ${settingText}. The chart's curves are drawn for the pressure most states use.</p>`
  );
}

const METHOD = `
<ul id="method">
<li>Moist-air properties follow the psychrometrics chapter of the <cite>ASHRAE Handbook—Fundamentals</cite> (2017, \
SI edition, Chapter 1), treating dry air and water vapour as ideal gases (the chapter's ideal-gas relations).</li>
<li>Saturation vapour pressure: the chapter's Hyland–Wexler correlations, over ice below \
0 °C (0.01 °C, the triple point) and over liquid water above; wet-bulb temperatures \
below 0 °C are taken over ice and dew points below 0 °C are frost points.</li>
<li>Humidity ratio from vapour pressure, enthalpy (dry air 0 at 0 °C, water from liquid at 0 \
°C; in IP units the dry-air datum is 0 °F) and specific volume from the chapter's equations; \
thermodynamic wet-bulb from the chapter's wet-bulb energy balance, solved by a bounded iteration.</li>
<li>Barometric pressure from a <code>site:</code> line, a state's own <code>p=</code>/<code>elev=</code>, \
or the default; elevation is converted by the standard-atmosphere equation of the same chapter.</li>
<li>Mixing: adiabatic, by dry-air mass and energy balance (humidity ratio and enthalpy mass-weighted); \
a volume flow is converted to dry-air mass flow at its own stream's specific volume.</li>
<li>Processes: at one dry-air flow; total heat from the enthalpy change, split into \
sensible and latent parts; moisture added or removed from the humidity-ratio change.</li>
<li>Valid range of the formulation: −100 °C to 200 °C. IP figures are exact conversions of the SI results.</li>
</ul>`;

/** CSS text for a `content:` string: quotes, backslashes, `<` and controls as CSS escapes. */
export function cssString(s: string): string {
  let out = '';
  for (const c of s) {
    const code = c.charCodeAt(0);
    out += code < 0x20 || code === 0x7f || `"'\\<>&`.includes(c) ? `\\${code.toString(16)} ` : c;
  }
  return `"${out}"`;
}

const CSS = `
:root{color-scheme:light dark;--bg:#f7f4ee;--fg:#26222c;--muted:#6e6877;--card:#fffdf8;--line:#e3ddd2;\
--accent:#23408e;--err:#b3261e;--warn:#a05a00;--ok:#1f7a4d;--caution-bg:#fff4e0;--caution-line:#d99a2b;--code:#f1ede4}
@media (prefers-color-scheme:dark){:root{--bg:#15151b;--fg:#ece8f2;--muted:#a59fb0;--card:#1d1c24;--line:#34313f;\
--accent:#8fb0ff;--err:#ff8a80;--warn:#ffb74d;--ok:#7fd6a5;--caution-bg:#2e2616;--caution-line:#a8781f;--code:#24232c}}
*{box-sizing:border-box}
body{margin:0;overflow-wrap:break-word;background:var(--bg);color:var(--fg);font:14px/1.5 \
"Inter","Noto Sans","DejaVu Sans",system-ui,sans-serif;font-variant-numeric:tabular-nums}
main{max-width:1120px;margin:0 auto;padding:28px 24px 48px}
h1{font-size:22px;margin:0 0 8px;font-weight:700;letter-spacing:-.01em}
h2.part{font-size:16px;margin:32px 0 10px;padding-bottom:4px;border-bottom:2px solid var(--line);color:var(--accent)}
.caution{background:var(--caution-bg);border-left:5px solid \
var(--caution-line);padding:10px 14px;border-radius:4px;margin:16px 0}
.summary{display:flex;gap:10px;flex-wrap:wrap;margin:12px 0}
.summary span{background:var(--card);border:1px solid var(--line);border-radius:14px;padding:2px 12px}
.summary .errors{border-color:var(--err);color:var(--err);font-weight:600}
.summary .warnings{border-color:var(--warn);color:var(--warn)}
.summary .clean{border-color:var(--ok);color:var(--ok);font-weight:600}
table{border-collapse:collapse;max-width:100%;background:var(--card);margin:6px 0 10px;font-size:13px}
caption{text-align:left;font-weight:600;padding:4px 0;color:var(--muted)}
th,td{border-bottom:1px solid var(--line);padding:4px 7px;vertical-align:top;text-align:left;overflow-wrap:anywhere}
th{font-weight:600;background:color-mix(in srgb,var(--card) 85%,var(--line))}
.num{text-align:right;white-space:nowrap}
code,pre{font-family:"DejaVu Sans Mono","Noto Sans Mono",ui-monospace,monospace;font-size:.92em}
pre{background:var(--code);border:1px solid var(--line);border-radius:4px;\
padding:8px 10px;white-space:pre-wrap;overflow-wrap:anywhere}
:not(pre)>code{background:var(--code);border-radius:3px;padding:0 3px;overflow-wrap:anywhere}
img,svg{max-width:100%;height:auto}
#docinfo,#signoff{width:100%}
#docinfo th{width:11em}
#signoff td{height:34px}
#signoff td:first-child{width:14em}
.note-body{background:var(--card);border:1px solid var(--line);border-radius:6px;padding:4px 22px 12px}
.note-body h1{font-size:20px;margin:18px 0 8px}.note-body h2{font-size:17px;\
margin:22px 0 8px;color:var(--accent)}.note-body h3{font-size:15px}
.note-body table{width:auto}
.note-body blockquote{margin:8px 0;padding:0 12px;border-left:4px solid var(--line);color:var(--muted)}
.dm-results{margin:-4px 0 14px;padding:6px 10px;border-left:4px solid var(--accent);background:var(--bg)}
.dm-table,.note-body .dm-table{width:100%}
.dm-table caption{font-size:12px}
.dm-unit{font-weight:400;color:var(--muted);white-space:nowrap}
.dm-item{break-inside:avoid}
.dm-about td{font-size:12px;color:var(--fg);border-bottom:1px solid var(--line);padding-top:0}
.dm-item tr:first-child th,.dm-item tr:first-child td{border-bottom:none}
.dm-from{font-weight:400;color:var(--muted)}
.dm-desc{font-style:italic}
.dm-sep,.dm-line,.dm-note{color:var(--muted)}
.dm-claim.pass{color:var(--ok)}.dm-claim.fail{color:var(--warn);font-weight:650}
.dm-failed th{color:var(--err)}
.dm-problems{margin:4px 0;padding-left:20px;font-size:12.5px}
.dm-error strong{color:var(--err)}.dm-warning strong{color:var(--warn)}\
.dm-info strong,.dm-acknowledged strong{color:var(--muted)}
.dm-inline{font-size:.9em;color:var(--muted)}
.dm-inline .dm-claim.fail{color:var(--warn)}
.dm-missing-image{display:inline-block;border:1px dashed var(--warn);padding:2px 6px;color:var(--warn)}
.sev{font-weight:650}.sev.error{color:var(--err)}.sev.warning{color:var(--warn)}.sev.info{color:var(--muted)}
.name{font-weight:650}
.chart{background:var(--card);border:1px solid var(--line);border-radius:6px;padding:8px;margin:0 0 12px;max-width:100%}
.chart figcaption{font-weight:650;margin:0 0 4px}
.chart svg{display:block;max-width:100%;height:auto}
.none{color:var(--muted);font-style:italic}
.small{font-size:12px;color:var(--muted)}
footer{margin-top:36px;color:var(--muted);font-size:12px;border-top:1px solid var(--line);padding-top:10px}
@media print{
:root{--bg:#fff;--fg:#000;--muted:#4a4650;--card:#fff;--line:#bbb;\
--accent:#1a2f6b;--code:#f4f4f4;--caution-bg:#fff;color-scheme:light}
body{font-size:9.5pt;line-height:1.4;background:#fff;color:#000}
main{max-width:none;margin:0;padding:0}
h1{font-size:16pt}
h2.part{font-size:12pt;margin:18pt 0 6pt;break-after:avoid}
.note-body{border:none;padding:0}
.note-body h1,.note-body h2,.note-body h3,.note-body h4{break-after:avoid}
table{font-size:8.5pt}
th,td{padding:2.5pt 4pt}
.dm-about td{font-size:8pt}
thead{display:table-header-group}
tr,.dm-item,img,.chart,pre{break-inside:avoid}
.chart{border:none;padding:0}
.summary span{border-color:#999}
a{color:inherit}
a[href^="http"]::after{content:" (" attr(href) ")";font-size:.85em;overflow-wrap:anywhere}
footer{break-inside:avoid}
}
`;

/**
 * The print page rules: margins, the running header (the title, and the note's digest) and page
 * numbers in the page-margin boxes, and the paper size when one was chosen.
 */
function pageCss(title: string, path: string, page: PageSize | undefined): string {
  const size = page ? `size:${PAPER_MM[page][0]}mm ${PAPER_MM[page][1]}mm;` : '';
  const m = PAGE_MARGIN_MM;
  const box = 'font:8pt "Inter","Noto Sans","DejaVu Sans",sans-serif;color:#555';
  return (
    `@page{${size}margin:${m.top}mm ${m.right}mm ${m.bottom}mm ${m.left}mm;` +
    `@top-left{content:${cssString(title)};${box};vertical-align:bottom;padding-bottom:3mm}` +
    `@top-right{content:${cssString(path)};${box};vertical-align:bottom;padding-bottom:3mm}` +
    `@bottom-left{content:"Design aid only \\2014  verify before use";${box}}` +
    `@bottom-right{content:"Page " counter(page) " of " counter(pages);${box}}}`
  );
}

function frontMatterRows(fm: FrontMatter | null): string {
  if (!fm) return '';
  const used = new Set<string>(SIGNOFF.flatMap((r) => [r.by, r.on]));
  const rows = fm.fields
    .filter((f) => !used.has(f.key))
    .map((f) => `<tr><th scope="row">${escapeHtml(f.key)}</th><td>${escapeHtml(f.value)}</td></tr>`);
  if (fm.other.length > 0)
    rows.push(
      `<tr><th scope="row">front matter (not read)</th><td><pre>${escapeHtml(fm.other.join('\n'))}</pre></td></tr>`,
    );
  return rows.join('');
}

function signoffSection(fm: FrontMatter | null): string {
  const get = (key: string) => fm?.fields.find((f) => f.key === key)?.value ?? '';
  const revision = get('revision');
  const filled = SIGNOFF.some((r) => get(r.by) !== '' || get(r.on) !== '');
  const rows = SIGNOFF.map(
    (r) => `<tr><td>${r.role}</td><td>${escapeHtml(get(r.by))}</td><td></td><td>${escapeHtml(get(r.on))}</td></tr>`,
  ).join('');
  const source = filled ? ' — names and dates from the note\u2019s front matter; signatures by hand' : '';
  const caption = `Revision ${revision ? escapeHtml(revision) : '______'}${source}`;
  return (
    `<table class="signoff" id="signoff"><caption>${caption}</caption><thead><tr>` +
    `<th scope="col">role</th><th scope="col">name</th><th scope="col">signature</th>` +
    `<th scope="col">date</th></tr></thead><tbody>${rows}</tbody></table>`
  );
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

function claimVerdict(side: ClaimChange['old']): string {
  return side === null ? 'absent' : `${side.pass ? '✓' : '✗'} ${side.computed}`;
}

function claimChangeText(c: ClaimChange): string {
  const same = c.old !== null && c.new !== null && c.old.pass === c.new.pass && c.old.computed === c.new.computed;
  const verdict = same ? `still ${claimVerdict(c.new)}` : `${claimVerdict(c.old)} → ${claimVerdict(c.new)}`;
  return `${c.written} (line ${c.line}): ${verdict}`;
}

/** The "changes since REV" section: each figure `dewmark diff` lists, old → new, with its claims. */
function changesSection(ch: ReportChanges): string {
  const rev = escapeHtml(ch.revision);
  const at = `${rev} (commit <code>${escapeHtml(ch.commit.slice(0, 12))}</code>)`;
  if (ch.items === null)
    return `<p id="changes-summary">The note is not in ${at}: it was added since, so every figure is new.</p>`;
  if (ch.items.length === 0)
    return `<p id="changes-summary">Compared with ${at}: no computed figure or claim changed.</p>`;
  const figures = ch.items.reduce((n, it) => n + it.figures.length, 0);
  const count = (status: ItemChange['status']) => ch.items!.filter((i) => i.status === status).length;
  const rows: string[] = [];
  for (const it of ch.items) {
    const line = `<span class="dm-line">line ${it.line}</span>`;
    const who = `${it.kind} <span class="name">${escapeHtml(it.name)}</span> ${line}`;
    if (it.status !== 'changed') {
      rows.push(
        `<tr><td>${who}</td><td colspan="4">${it.status === 'added' ? 'added' : 'removed'} since ${rev}</td></tr>`,
      );
      continue;
    }
    for (const f of it.figures)
      rows.push(
        `<tr><td>${who}</td><td><code>${escapeHtml(f.key)}</code></td>` +
          `<td class="num">${escapeHtml(f.old)}</td><td class="num">${escapeHtml(f.new)}</td>` +
          `<td>${f.claims.map((c) => escapeHtml(claimChangeText(c))).join('<br>')}</td></tr>`,
      );
    if (it.claims.length > 0)
      rows.push(
        `<tr><td>${who}</td><td>—</td><td></td><td></td>` +
          `<td>${it.claims.map((c) => escapeHtml(claimChangeText(c))).join('<br>')}</td></tr>`,
      );
  }
  const summary =
    `Compared with ${at}: ${plural(count('changed'), 'statement', 'statements')} changed ` +
    `(${plural(figures, 'figure', 'figures')}), ${count('added')} added, ${count('removed')} ` +
    `removed. Figures are compared as displayed, as <code>dewmark diff</code> compares them.`;
  return (
    `<p id="changes-summary">${summary}</p><table id="changes" class="dm-table"><thead><tr>` +
    `<th scope="col">statement</th><th scope="col">figure</th><th scope="col" class="num">` +
    `at ${rev}</th><th scope="col" class="num">now</th><th scope="col">claims on it (as ` +
    `written: verdict then → now)</th></tr></thead><tbody>${rows.join('')}</tbody></table>`
  );
}

/** The whole report as one HTML document (no scripts, no external resources). */
export function renderReportHtml(input: ReportInput, opts: ReportOptions = {}): string {
  const { analysis: a, text, path } = input;
  const lines = new LineIndex(text);
  const errors = a.diagnostics.filter((d) => d.severity === 'error').length;
  const warnings = a.diagnostics.filter((d) => d.severity === 'warning').length;
  const infos = a.diagnostics.length - errors - warnings;
  const nStates = a.items.filter((i) => i.kind !== 'process').length;
  const nProcs = a.items.filter((i) => i.kind === 'process').length;
  const claims = a.items.flatMap((i) => i.claims);
  const failedClaims = claims.filter((c) => !c.pass).length;
  const generated = opts.generatedAt ?? new Date().toISOString();
  const digest = crypto().createHash('sha256').update(text, 'utf8').digest('hex');
  const body = noteHtml(text, a, { image: opts.image });
  const fmTitle = body.frontMatter?.fields.find((f) => f.key === 'title')?.value;
  const title = body.title ?? fmTitle ?? path;
  // One chart per heading section (the cases a reader compares: summer, winter, part load), as
  // `dewmark chart` draws by default; a note with one section keeps one chart with the plain title.
  const charts = renderChartCases(a, 'section', {
    source: text,
    title: `Psychrometric chart — ${title}`,
    idPrefix: 'report-chart',
  });
  const chart = charts
    .map((c, i) => {
      const caption = charts.length > 1 ? `<figcaption>${escapeHtml(c.case.title)}</figcaption>` : '';
      return `<figure class="chart" id="chart-${i + 1}">${caption}${c.svg}</figure>`;
    })
    .join('\n');
  const summary = [
    `<span>${plural(nStates, 'state or mix', 'states and mixes')}</span>`,
    `<span>${plural(nProcs, 'process', 'processes')}</span>`,
    `<span class="${failedClaims > 0 ? 'warnings' : ''}">${plural(claims.length, 'claim', 'claims')}` +
      `${claims.length > 0 ? `, ${failedClaims} outside its band` : ''}</span>`,
    errors > 0
      ? `<span class="errors">${plural(errors, 'error', 'errors')}</span>`
      : `<span class="clean">no errors</span>`,
    `<span class="${warnings > 0 ? 'warnings' : ''}">${plural(warnings, 'warning', 'warnings')}</span>`,
    ...(infos > 0 ? [`<span>${plural(infos, 'note', 'notes')}</span>`] : []),
  ].join('');
  const index = itemsResultsHtml(a, text, a.items, [], [], {
    withLine: true,
    lines,
    ids: { states: 'states', processes: 'processes' },
  });
  const unitsWhy = a.unitsSource === 'note' ? 'set by the note' : 'default setting';
  const changes = opts.changes
    ? `<section aria-labelledby="h-changes"><h2 class="part" id="h-changes">` +
      `Changes since ${escapeHtml(opts.changes.revision)}</h2>\n${changesSection(opts.changes)}\n</section>\n`
    : '';
  const unplaced = body.unplaced
    ? `<div id="unplaced"><p class="small">These statements could not be placed in the text above; ` +
      `here they are with their results:</p>${body.unplaced}</div>`
    : '';
  const missingImages =
    body.missingImages.length > 0
      ? `<p class="small" id="missing-images">${plural(body.missingImages.length, 'image was', 'images were')} ` +
        'not included (marked in the text).</p>'
      : '';
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="dewmark ${escapeHtml(opts.version ?? '')}">
<title>${escapeHtml(title)}</title>
<style>${CSS}${pageCss(title, path, opts.page)}</style>
</head>
<body>
<main>
<header id="report-header">
<h1 id="title">${escapeHtml(title)}</h1>
<table id="docinfo"><tbody>
<tr><th scope="row">note</th><td><code id="note-path">${escapeHtml(path)}</code></td></tr>
<tr><th scope="row">note SHA-256</th><td><code id="note-digest">${digest}</code></td></tr>
<tr><th scope="row">report made</th><td id="report-date">${escapeHtml(generated)}</td></tr>
<tr><th scope="row">results</th><td>${a.units} units (${unitsWhy}); made \
by dewmark${opts.version ? ` ${escapeHtml(opts.version)}` : ''}</td></tr>
${frontMatterRows(body.frontMatter)}
</tbody></table>
<p class="caution" id="caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION)}</p>
<div class="summary" id="summary">${summary}</div>
</header>
<section aria-labelledby="h-signoff"><h2 class="part" id="h-signoff">Revision and sign-off</h2>
${signoffSection(body.frontMatter)}
</section>
${changes}<section aria-labelledby="h-note"><h2 class="part" id="h-note">The note, with its computed results</h2>
<p class="small">Each air block is followed by what it computes; each statement written in the text is followed \
by its figures in brackets. A claim reads <em>as written → computed</em>, ✓ within its band or ✗ outside it.</p>
<article class="note-body" id="note">
${body.html}
</article>
${unplaced}
${missingImages}
</section>
<section aria-labelledby="h-diagnostics"><h2 class="part" id="h-diagnostics">Diagnostics</h2>
${diagnosticsSection(a, lines, text)}
</section>
<section aria-labelledby="h-chart"><h2 class="part" id="h-chart">${charts.length > 1 ? 'Charts' : 'Chart'}</h2>
<div class="charts" id="chart">${chart}</div>
</section>
<section aria-labelledby="h-index"><h2 class="part" id="h-index">Index of states, mixes and processes</h2>
${index || '<p class="none" id="index-none">The note defines no states, mixes or processes.</p>'}
</section>
<section aria-labelledby="h-pressure"><h2 class="part" id="h-pressure">Pressure basis</h2>
${pressureSection(a, lines, text)}
</section>
<section aria-labelledby="h-method"><h2 class="part" id="h-method">Method and sources</h2>
${METHOD}
</section>
<footer><p>Made by dewmark${opts.version ? ` ${escapeHtml(opts.version)}` : ''} from <code>${escapeHtml(path)}</code> \
(SHA-256 ${digest.slice(0, 12)}…) on ${escapeHtml(generated)}. ${escapeHtml(CAUTION)}</p></footer>
</main>
</body>
</html>
`;
}

/** Options of `dewmark report`. */
export interface ReportCommandOptions extends WriteOptions {
  since?: string;
  pdf?: boolean;
  page?: string;
  chromium?: string;
}

/** Runs `dewmark report`. */
export async function runReport(
  paths: string[],
  opts: ReportCommandOptions,
  io: CliIO,
  version: string,
): Promise<number> {
  const page = opts.page?.toLowerCase();
  if (page !== undefined && !(PAGE_SIZES as readonly string[]).includes(page))
    throw new UsageError(`--page must be ${PAGE_SIZES.join(' or ')}, not '${opts.page}'`);
  if (opts.chromium !== undefined && !opts.pdf)
    throw new UsageError('--chromium names the browser that prints --pdf; add --pdf, or leave --chromium out');
  const note = await readOneNote(paths, opts, io, 'report');
  const out = checkOutputPath(opts.output, note, io.cwd, 'report', opts.pdf ? 'report.pdf' : 'report.html');
  let chromium = '';
  if (opts.pdf) {
    const found = findChromium(opts.chromium);
    if (!found.ok) {
      io.err(`dewmark: ${safeText(found.message)}\n`);
      return 2;
    }
    chromium = found.path;
  }
  let changes: ReportChanges | undefined;
  if (opts.since !== undefined) {
    if (note.abs === null)
      throw new UsageError(
        '--since compares the note with its version at a git revision, ' +
          'and standard input has none; give the note by its path',
      );
    try {
      const then = await noteAtRevision(opts.since, note.abs, note.path, io.cwd, maxNoteBytes(opts));
      const items =
        then.text === null
          ? null
          : compareNotes(then.text, analyzeNote(then.text, toSettings(opts)), note.text, note.analysis);
      changes = { revision: then.revision, commit: then.commit, items };
    } catch (err) {
      if (!(err instanceof GitProblem)) throw err;
      io.err(`dewmark: ${safeText(err.message)}\n`);
      return 2;
    }
  }
  const missing: string[] = [];
  const html = renderReportHtml(note, {
    version,
    changes,
    // A PDF needs a paper size; A4 unless --page says otherwise.
    page: (page as PageSize | undefined) ?? (opts.pdf ? 'a4' : undefined),
    image: (src) => {
      const answer = resolveImage(src, note.abs);
      if (!answer.ok) missing.push(`dewmark: image '${safeText(src)}' not included: ${answer.reason}\n`);
      return answer;
    },
  });
  if (opts.pdf) {
    const printed = await printPdf(chromium, html);
    if (!printed.ok) {
      io.err(`dewmark: ${safeText(printed.message)}\n`);
      return 2;
    }
    writeOutput(out, opts.output!, printed.pdf);
  } else writeOutput(out, opts.output!, html);
  for (const m of missing) io.err(m);
  const errors = note.analysis.diagnostics.filter((d) => d.severity === 'error').length;
  io.err(
    wroteLine(
      opts.output!,
      note.path,
      `${errors} error${errors === 1 ? '' : 's'}, ${note.analysis.diagnostics.length - errors} ` +
        `other diagnostic${note.analysis.diagnostics.length - errors === 1 ? '' : 's'}`,
    ),
  );
  return exitCodeOf(note.analysis);
}

/** Adds the `report` command to the program. */
export function registerReport(
  prog: Command,
  io: CliIO,
  onResult: (code: number) => void,
  addCommon: (c: Command) => Command,
  version: string,
): void {
  addCommon(
    prog
      .command('report')
      .description(
        'write one self-contained HTML review report of a note: the whole note with its results, ' +
          'claims, diagnostics, chart and sign-off block (docs/report.md); exit 1 if the note has errors',
      )
      .argument('<note>', 'one Markdown note (or - for standard input)')
      .option(
        '-o, --output <file>',
        'the HTML (or, with --pdf, PDF) file to write (never a .md file, never the note itself)',
      )
      .option(
        '--since <rev>',
        'add a section of the figures that changed since a git revision (as dewmark diff REV lists them)',
      )
      .option('--page <size>', "paper for print: a4 or letter (default: the printer's; a4 with --pdf)")
      .option('--pdf', 'write a PDF, printed by a headless Chromium or Chrome that is installed')
      .option(
        '--chromium <path>',
        `the Chromium or Chrome program for --pdf (default: $${CHROMIUM_ENV}, else ${BROWSER_NAMES[0]} on PATH)`,
      ),
  ).action(async (note: string, opts: ReportCommandOptions) => onResult(await runReport([note], opts, io, version)));
}
