/**
 * `dewmark report NOTE.md -o report.html`: one self-contained HTML file for review and sign-off —
 * the states, mixes and processes tables, every diagnostic, the chart inline, the method and its
 * sources, the pressure basis and the caution. No network: inline CSS, inline SVG, no scripts,
 * and a Content-Security-Policy that forbids loading anything.
 */
import { createHash } from 'node:crypto';
import type { Command } from 'commander';
import { renderChart } from '@dewmark/core/chart';
import type { ClaimResult, PressureBasis } from '@dewmark/core/evaluate';
import {
  LineIndex,
  claimFigures,
  displaySymbol,
  displayUnit,
  figure,
  processRow,
  stateRow,
  waterUnit,
  type Analysis,
  type CoreDiagnostic,
  type Dimension,
  type ProcessResult,
  type StateResult,
  type UnitSystem,
} from '../core';
import type { CliIO } from '../run';
import { checkOutputPath, exitCodeOf, readOneNote, writeOutput, wroteLine, type WriteOptions } from './outputFile';

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
}

/** The caution printed at the top and in the footer of every report. */
export const CAUTION =
  'Design aid only. These figures are computed from the values written in the note; they do not replace engineering judgement. ' +
  'Verify them against the applicable codes and standards, and have the design reviewed by a licensed professional engineer before it is used for construction, purchase or commissioning.';

/** The badge beside a name that was not computed, or is in the fog region. */
function badge(status: 'ok' | 'fog' | 'failed'): string {
  return status === 'failed'
    ? ' <span class="badge err">not computed</span>'
    : status === 'fog'
      ? ' <span class="badge warn">fog</span>'
      : '';
}

function sym(dim: Dimension, sys: UnitSystem): string {
  return displaySymbol(displayUnit(dim, sys));
}

function lineOf(lines: LineIndex, text: string, offset: number): number {
  return lines.lineCol(Math.max(0, Math.min(offset, text.length))).line;
}

/** The claims of an item: each judged and shown in the unit it was written in (`shr ✗ 0.873`). */
function claimsCell(claims: ClaimResult[]): string {
  if (claims.length === 0) return '';
  return claims
    .map((c) => {
      const f = claimFigures(c);
      const computed = f ? f.computed.text : c.computedText;
      const band = f ? ` (band ${f.band.text})` : '';
      const title = `${c.key}: written ${c.prop.value?.number.text ?? ''}${c.prop.value?.unit?.text ?? ''}, computed ${computed}${band}`;
      return `<span class="claim ${c.pass ? 'pass' : 'fail'}" title="${escapeHtml(title)}">${escapeHtml(c.key)} ${c.pass ? '✓' : `✗ ${escapeHtml(computed)}`}</span>`;
    })
    .join(' ');
}

function table(id: string, caption: string, header: string[], rows: string[][], numeric: boolean[]): string {
  const th = header.map((h, i) => `<th scope="col"${numeric[i] ? ' class="num"' : ''}>${h}</th>`).join('');
  const body = rows
    .map((r) => `<tr>${r.map((c, i) => `<td${numeric[i] ? ' class="num"' : ''}>${c}</td>`).join('')}</tr>`)
    .join('\n');
  return `<div class="scroll"><table id="${id}"><caption>${caption}</caption><thead><tr>${th}</tr></thead><tbody>\n${body}\n</tbody></table></div>`;
}

function statesSection(a: Analysis, lines: LineIndex, text: string): string {
  const sys = a.units;
  const states = a.items.filter((i): i is StateResult => i.kind === 'state');
  if (states.length === 0) return '<p class="none" id="states-none">The note defines no states.</p>';
  const t = (d: Dimension) => escapeHtml(sym(d, sys));
  const header = [
    'name',
    'line',
    `p (${t('pressure')})`,
    `dry-bulb (${t('temperature')})`,
    `wet-bulb (${t('temperature')})`,
    `dew point (${t('temperature')})`,
    'rh (%)',
    `w (${t('humidityRatio')})`,
    `h (${t('enthalpy')})`,
    `v (${t('specificVolume')})`,
    'fixed by',
    'claims',
  ];
  const rows = states.map((s) => {
    const row = stateRow(s, sys);
    const v = row.figures;
    return [
      `<span class="name">${escapeHtml(s.name)}</span>${badge(row.status)}`,
      String(lineOf(lines, text, s.statement.span.start)),
      escapeHtml(v.p.value),
      escapeHtml(v.db.value),
      escapeHtml(v.wb.value) + (row.wbIce ? ' <span class="note" title="over ice">ice</span>' : ''),
      escapeHtml(v.dp.value) + (row.dpFrost ? ' <span class="note" title="frost point">frost</span>' : ''),
      escapeHtml(v.rh.value),
      escapeHtml(v.w.value),
      escapeHtml(v.h.value),
      escapeHtml(v.v.value),
      row.status === 'failed' ? 'see diagnostics' : escapeHtml(s.defining.join(' + ')),
      claimsCell(s.claims),
    ];
  });
  return table('states', 'States', header, rows, [
    false,
    true,
    true,
    true,
    true,
    true,
    true,
    true,
    true,
    true,
    false,
    false,
  ]);
}

function mixesSection(a: Analysis, lines: LineIndex, text: string): string {
  const sys = a.units;
  const mixes = a.items.filter((i): i is StateResult => i.kind === 'mix');
  if (mixes.length === 0) return '<p class="none" id="mixes-none">The note has no mixes.</p>';
  const t = (d: Dimension) => escapeHtml(sym(d, sys));
  const header = [
    'name',
    'line',
    'streams (dry-air mass fraction)',
    `dry-air flow (${t('massFlow')})`,
    `dry-bulb (${t('temperature')})`,
    'rh (%)',
    `w (${t('humidityRatio')})`,
    `h (${t('enthalpy')})`,
    'claims',
  ];
  const rows = mixes.map((m) => {
    const row = stateRow(m, sys);
    const v = row.figures;
    return [
      `<span class="name">${escapeHtml(m.name)}</span>${badge(row.status)}`,
      String(lineOf(lines, text, m.statement.span.start)),
      escapeHtml(row.streams.map((s) => `${s.name} ${s.fraction.text}`).join(' + ')),
      escapeHtml(row.massFlow.value),
      escapeHtml(v.db.value),
      escapeHtml(v.rh.value),
      escapeHtml(v.w.value),
      escapeHtml(v.h.value),
      claimsCell(m.claims),
    ];
  });
  return table('mixes', 'Mixes (adiabatic)', header, rows, [false, true, false, true, true, true, true, true, false]);
}

function processesSection(a: Analysis, lines: LineIndex, text: string): string {
  const sys = a.units;
  const procs = a.items.filter((i): i is ProcessResult => i.kind === 'process');
  if (procs.length === 0) return '<p class="none" id="processes-none">The note has no processes.</p>';
  const t = (d: Dimension) => escapeHtml(sym(d, sys));
  const water = escapeHtml(displaySymbol(waterUnit(sys)));
  const header = [
    'name',
    'line',
    'from → to',
    'kind',
    `dry-air flow (${t('massFlow')})`,
    `total (${t('power')})`,
    `sensible (${t('power')})`,
    `latent (${t('power')})`,
    'SHR',
    `water (${water})`,
    `Δh (${t('enthalpy')})`,
    'claims',
  ];
  const rows = procs.map((p) => {
    const row = processRow(p, sys);
    // Heat and water rates need a flow; without one the table leaves them empty (Δh is per kg).
    const withFlow = (x: { value: string }) => escapeHtml(row.hasFlow ? x.value : '—');
    return [
      `<span class="name">${escapeHtml(p.name)}</span>`,
      String(lineOf(lines, text, p.statement.span.start)),
      `<span class="nowrap">${escapeHtml(p.from)} → ${escapeHtml(p.to)}</span>`,
      escapeHtml(row.kind),
      escapeHtml(row.massFlow.value),
      withFlow(row.total),
      withFlow(row.sensible),
      withFlow(row.latent),
      escapeHtml(row.shr.value),
      withFlow(row.water),
      escapeHtml(row.dh.value),
      claimsCell(p.claims),
    ];
  });
  return table('processes', 'Processes (positive = heat or water added to the air)', header, rows, [
    false,
    true,
    false,
    false,
    true,
    true,
    true,
    true,
    true,
    true,
    true,
    false,
  ]);
}

function diagnosticsSection(a: Analysis, lines: LineIndex, text: string): string {
  if (a.diagnostics.length === 0)
    return '<p class="none" id="diagnostics-none">No diagnostics: every statement was read and evaluated without errors or warnings.</p>';
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
  const settingText = `${figure(a.settings.pressurePa, 'pressure', a.units).text} (${escapeHtml(a.settings.pressureOrigin)})`;
  if (bases.size === 0) return `<p id="pressure-basis">No states; the default pressure would be ${settingText}.</p>`;
  const items = [...bases.values()].map(({ basis, names }) => {
    const where =
      basis.span && !/\bline \d+/.test(basis.origin) ? `, line ${lineOf(lines, text, basis.span.start)}` : '';
    const elev =
      basis.elevationM !== null
        ? ' (elevation to pressure by the standard-atmosphere equation, ASHRAE HoF Ch. 1 eq 3)'
        : '';
    return `<li><strong>${figure(basis.pa, 'pressure', a.units).text}</strong> — ${escapeHtml(basis.origin)}${escapeHtml(where)}${escapeHtml(elev)}; used by ${names.map((n) => `<span class="name">${escapeHtml(n)}</span>`).join(', ')}</li>`;
  });
  return `<ul id="pressure-basis">${items.join('\n')}</ul><p class="small">Default when a note has no <code>site:</code> line: ${settingText}. The chart's curves are drawn for the pressure most states use.</p>`;
}

const METHOD = `
<ul id="method">
<li>Moist-air properties follow the psychrometrics chapter of the <cite>ASHRAE Handbook—Fundamentals</cite> (2017, SI edition, Chapter 1), treating dry air and water vapour as ideal gases (the chapter's ideal-gas relations).</li>
<li>Saturation vapour pressure: the chapter's Hyland–Wexler correlations, over ice below 0 °C (0.01 °C, the triple point) and over liquid water above; wet-bulb temperatures below 0 °C are taken over ice and dew points below 0 °C are frost points.</li>
<li>Humidity ratio from vapour pressure, enthalpy (dry air 0 at 0 °C, water from liquid at 0 °C; in IP units the dry-air datum is 0 °F) and specific volume from the chapter's equations; thermodynamic wet-bulb from the chapter's wet-bulb energy balance, solved by a bounded iteration.</li>
<li>Barometric pressure from a <code>site:</code> line, a state's own <code>p=</code>/<code>elev=</code>, or the default; elevation is converted by the standard-atmosphere equation of the same chapter.</li>
<li>Mixing: adiabatic, by dry-air mass and energy balance (humidity ratio and enthalpy mass-weighted); a volume flow is converted to dry-air mass flow at its own stream's specific volume.</li>
<li>Processes: at one dry-air flow; total heat from the enthalpy change, split into sensible and latent parts; moisture added or removed from the humidity-ratio change.</li>
<li>Valid range of the formulation: −100 °C to 200 °C. IP figures are exact conversions of the SI results.</li>
</ul>`;

const CSS = `
:root{color-scheme:light dark;--bg:#f7f4ee;--fg:#26222c;--muted:#6e6877;--card:#fffdf8;--line:#e3ddd2;--accent:#23408e;--err:#b3261e;--warn:#a05a00;--ok:#1f7a4d;--caution-bg:#fff4e0;--caution-line:#d99a2b}
@media (prefers-color-scheme:dark){:root{--bg:#15151b;--fg:#ece8f2;--muted:#a59fb0;--card:#1d1c24;--line:#34313f;--accent:#8fb0ff;--err:#ff8a80;--warn:#ffb74d;--ok:#7fd6a5;--caution-bg:#2e2616;--caution-line:#a8781f}}
*{box-sizing:border-box}
body{margin:0;background:var(--bg);color:var(--fg);font:14px/1.5 "Inter","Noto Sans","DejaVu Sans",system-ui,sans-serif;font-variant-numeric:tabular-nums}
main{max-width:1120px;margin:0 auto;padding:28px 24px 48px}
h1{font-size:22px;margin:0 0 4px;font-weight:700;letter-spacing:-.01em}
h2{font-size:16px;margin:32px 0 10px;padding-bottom:4px;border-bottom:2px solid var(--line);color:var(--accent)}
.meta{color:var(--muted);margin:0 0 16px}
.caution{background:var(--caution-bg);border-left:5px solid var(--caution-line);padding:10px 14px;border-radius:4px;margin:16px 0}
.summary{display:flex;gap:10px;flex-wrap:wrap;margin:12px 0}
.summary span{background:var(--card);border:1px solid var(--line);border-radius:14px;padding:2px 12px}
.summary .errors{border-color:var(--err);color:var(--err);font-weight:600}
.summary .warnings{border-color:var(--warn);color:var(--warn)}
.summary .clean{border-color:var(--ok);color:var(--ok);font-weight:600}
table{border-collapse:collapse;width:100%;background:var(--card);margin:6px 0 10px;font-size:13px}
caption{text-align:left;font-weight:600;padding:4px 0;color:var(--muted)}
th,td{border-bottom:1px solid var(--line);padding:5px 8px;vertical-align:top;text-align:left}
th{font-weight:600;background:color-mix(in srgb,var(--card) 85%,var(--line))}
.num{text-align:right;white-space:nowrap}
.name{font-weight:650}
.badge{font-size:11px;border-radius:8px;padding:0 6px;border:1px solid}
.badge.err{color:var(--err)}.badge.warn{color:var(--warn)}
.note{font-size:11px;color:var(--muted)}
.nowrap{white-space:nowrap}
.scroll{overflow-x:auto}
.claim{display:inline-block;font-size:12px;border-radius:8px;padding:0 6px;margin:1px 0;border:1px solid var(--line)}
.claim.pass{color:var(--ok)}.claim.fail{color:var(--warn);border-color:var(--warn)}
.sev{font-weight:650}.sev.error{color:var(--err)}.sev.warning{color:var(--warn)}.sev.info{color:var(--muted)}
.chart{background:var(--card);border:1px solid var(--line);border-radius:6px;padding:8px;margin:0;overflow-x:auto}
.chart svg{display:block;max-width:100%;height:auto}
.none{color:var(--muted);font-style:italic}
.small{font-size:12px;color:var(--muted)}
.signoff td{height:34px}
footer{margin-top:36px;color:var(--muted);font-size:12px;border-top:1px solid var(--line);padding-top:10px}
@media print{body{background:#fff;color:#000}.chart{break-inside:avoid}h2{break-after:avoid}}
`;

/** The whole report as one HTML document (no scripts, no external resources). */
export function renderReportHtml(input: ReportInput, opts: ReportOptions = {}): string {
  const { analysis: a, text, path } = input;
  const lines = new LineIndex(text);
  const errors = a.diagnostics.filter((d) => d.severity === 'error').length;
  const warnings = a.diagnostics.filter((d) => d.severity === 'warning').length;
  const infos = a.diagnostics.length - errors - warnings;
  const nStates = a.items.filter((i) => i.kind === 'state').length;
  const nMixes = a.items.filter((i) => i.kind === 'mix').length;
  const nProcs = a.items.filter((i) => i.kind === 'process').length;
  const generated = opts.generatedAt ?? new Date().toISOString();
  const digest = createHash('sha256').update(text, 'utf8').digest('hex');
  const title = `Dewmark review report — ${path}`;
  const chart = renderChart(a, { source: text, title: `Psychrometric chart — ${path}`, idPrefix: 'report-chart' });
  const plural = (n: number, w: string) => `${n} ${w}${n === 1 ? '' : 's'}`;
  const summary = [
    `<span>${plural(nStates, 'state')}</span>`,
    `${`<span>${plural(nMixes, 'mix')}`.replace(/mixs/, 'mixes')}</span>`,
    `${`<span>${plural(nProcs, 'process')}`.replace(/processs/, 'processes')}</span>`,
    errors > 0 ? `<span class="errors">${plural(errors, 'error')}</span>` : `<span class="clean">no errors</span>`,
    `<span class="${warnings > 0 ? 'warnings' : ''}">${plural(warnings, 'warning')}</span>`,
    ...(infos > 0 ? [`<span>${plural(infos, 'note')}</span>`] : []),
  ].join('');
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="dewmark ${escapeHtml(opts.version ?? '')}">
<title>${escapeHtml(title)}</title>
<style>${CSS}</style>
</head>
<body>
<main>
<header>
<h1>${escapeHtml(title)}</h1>
<p class="meta">Results in ${a.units} units (${a.unitsSource === 'note' ? 'set by the note' : 'default setting'}) · generated ${escapeHtml(generated)} · note SHA-256 <code id="note-digest">${digest}</code></p>
<p class="caution" id="caution" role="note"><strong>Caution.</strong> ${escapeHtml(CAUTION)}</p>
<div class="summary" id="summary">${summary}</div>
</header>
<section aria-labelledby="h-diagnostics"><h2 id="h-diagnostics">Diagnostics</h2>
${diagnosticsSection(a, lines, text)}
</section>
<section aria-labelledby="h-chart"><h2 id="h-chart">Chart</h2>
<figure class="chart" id="chart">${chart}</figure>
</section>
<section aria-labelledby="h-states"><h2 id="h-states">States</h2>
${statesSection(a, lines, text)}
</section>
<section aria-labelledby="h-mixes"><h2 id="h-mixes">Mixes</h2>
${mixesSection(a, lines, text)}
</section>
<section aria-labelledby="h-processes"><h2 id="h-processes">Processes</h2>
${processesSection(a, lines, text)}
</section>
<section aria-labelledby="h-pressure"><h2 id="h-pressure">Pressure basis</h2>
${pressureSection(a, lines, text)}
</section>
<section aria-labelledby="h-method"><h2 id="h-method">Method and sources</h2>
${METHOD}
</section>
<section aria-labelledby="h-signoff"><h2 id="h-signoff">Review</h2>
<table class="signoff" id="signoff"><thead><tr><th scope="col">role</th><th scope="col">name</th><th scope="col">signature</th><th scope="col">date</th></tr></thead>
<tbody><tr><td>prepared by</td><td></td><td></td><td></td></tr><tr><td>checked by</td><td></td><td></td><td></td></tr><tr><td>approved by (licensed engineer)</td><td></td><td></td><td></td></tr></tbody></table>
</section>
<footer><p>Made by dewmark${opts.version ? ` ${escapeHtml(opts.version)}` : ''} from <code>${escapeHtml(path)}</code>. ${escapeHtml(CAUTION)}</p></footer>
</main>
</body>
</html>
`;
}

/** Runs `dewmark report`. */
export async function runReport(paths: string[], opts: WriteOptions, io: CliIO, version: string): Promise<number> {
  const note = await readOneNote(paths, opts, io, 'report');
  const out = checkOutputPath(opts.output, note, io.cwd, 'report', 'report.html');
  writeOutput(out, opts.output!, renderReportHtml(note, { version }));
  const errors = note.analysis.diagnostics.filter((d) => d.severity === 'error').length;
  io.err(
    wroteLine(
      opts.output!,
      note.path,
      `${errors} error${errors === 1 ? '' : 's'}, ${note.analysis.diagnostics.length - errors} other diagnostic${note.analysis.diagnostics.length - errors === 1 ? '' : 's'}`,
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
        'write one self-contained HTML review report of a note (tables, diagnostics, chart, method); exit 1 if the note has errors',
      )
      .argument('<note>', 'one Markdown note (or - for standard input)')
      .option('-o, --output <file>', 'the HTML file to write (never a .md file, never the note itself)'),
  ).action(async (note: string, opts: WriteOptions) => onResult(await runReport([note], opts, io, version)));
}
