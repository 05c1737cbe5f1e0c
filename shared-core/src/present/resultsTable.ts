/**
 * The results of one ` ```air ` block (see `./blockResults`) drawn two ways:
 * - {@link resultsTableHtml}: an HTML fragment for the Markdown preview, every piece of note text
 *   escaped, styled by class names only (`dewmark-results…`; the extension's stylesheet maps them
 *   onto the preview's theme colours);
 * - {@link resultsTableMarkdown}: Markdown tables and a list, for writing into the note itself,
 *   escaped so that nothing in them is read as HTML, emphasis, a link, or a code span (a code span
 *   that starts with a statement keyword would be read as a statement).
 * Pure: data in, strings out.
 */
import type { ProblemData, ResultsData } from './blockResults';

/** Escapes text for HTML content and attribute values. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) =>
    c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '"' ? '&quot;' : '&#39;',
  );
}

/**
 * Escapes text for a Markdown table cell or list item: every character that could start markup
 * (emphasis, code, links, HTML, entities, table cells) gets a backslash; line breaks become spaces.
 */
export function escapeMarkdown(text: string): string {
  return text.replace(/\s+/g, ' ').replace(/([\\`*_|[\]<>&#!~])/g, '\\$1');
}

/** The one-line statement of the basis under the tables: unit system, pressure, sign convention. */
function basisText(data: ResultsData): string | null {
  if (data.states.length === 0 && data.processes.length === 0) return null;
  const parts = [`Results in ${data.units}`];
  if (data.pressure) parts[0] += ` at ${data.pressure}`;
  if (data.processes.length > 0) parts.push('heat and water: positive = added to the air');
  if (data.processes.some((p) => !p.hasFlow))
    parts.push(`per ${data.units === 'SI' ? 'kg' : 'lb'} of dry air where a process has no flow`);
  return `${parts.join('; ')}.`;
}

function stateName(s: ResultsData['states'][number]): string {
  return s.detail ? `${s.name} (${s.detail})` : s.name;
}

/** ` NAME:` before a problem's message, unless the message starts by naming its statement. */
function problemSubject(p: ProblemData): string {
  if (!p.subject) return '';
  if (
    p.message.startsWith(`state ${p.subject}:`) ||
    p.message.startsWith(`mix ${p.subject}:`) ||
    p.message.startsWith(`process ${p.subject}:`)
  )
    return '';
  return ` ${p.subject}:`;
}

// ---------------------------------------------------------------------------------------------
// HTML (Markdown preview)
// ---------------------------------------------------------------------------------------------

/** Options of {@link resultsTableHtml}. */
export interface HtmlOptions {
  /** A sentence shown first in the warning colour (e.g. that a written results table is stale). */
  notice?: string;
}

/** The results of one block as an HTML fragment (a `div.dewmark-results`); everything escaped. */
export function resultsTableHtml(data: ResultsData, opts: HtmlOptions = {}): string {
  const out: string[] = [
    '<div class="dewmark-results" role="group" aria-label="Dewmark results of the air block above">',
  ];
  if (opts.notice) out.push(`<p class="dewmark-results-notice">${escapeHtml(opts.notice)}</p>`);
  if (data.states.length > 0) {
    const head = [
      '<th scope="col">state</th>',
      ...data.stateColumns.map(
        (c) =>
          `<th scope="col" class="dewmark-num">${escapeHtml(c.label)} ` +
          `<span class="dewmark-unit">${escapeHtml(c.unit)}</span></th>`,
      ),
    ];
    const rows = data.states.map((s) => {
      const cls = s.status === 'ok' ? '' : ` class="dewmark-${s.status}"`;
      const detail = s.detail ? ` <span class="dewmark-detail">${escapeHtml(s.detail)}</span>` : '';
      const cells = s.values.map((v) => `<td class="dewmark-num">${escapeHtml(v)}</td>`).join('');
      return (
        `<tr${cls}><th scope="row">` +
        `<span class="dewmark-name">${escapeHtml(s.name)}</span>${detail}</th>${cells}</tr>`
      );
    });
    out.push(
      `<table class="dewmark-states"><thead><tr>${head.join('')}</tr></thead><tbody>${rows.join('')}</tbody></table>`,
    );
  }
  if (data.processes.length > 0) {
    const head = ['process', 'kind', 'total', 'sensible', 'latent', 'SHR', 'water'].map(
      (h, i) => `<th scope="col"${i >= 2 ? ' class="dewmark-num"' : ''}>${h}</th>`,
    );
    const rows = data.processes.map((p) => {
      const cells = [p.total, p.sensible, p.latent, p.shr, p.water]
        .map((v) => `<td class="dewmark-num">${escapeHtml(v)}</td>`)
        .join('');
      return (
        `<tr><th scope="row"><span class="dewmark-name">${escapeHtml(p.name)}</span>` +
        ` <span class="dewmark-detail">${escapeHtml(`${p.from} → ${p.to}`)}</span>` +
        `</th><td>${escapeHtml(p.kind)}</td>${cells}</tr>`
      );
    });
    out.push(
      `<table class="dewmark-processes"><thead><tr>${head.join('')}</tr>` +
        `</thead><tbody>${rows.join('')}</tbody></table>`,
    );
  }
  const basis = basisText(data);
  if (basis) out.push(`<p class="dewmark-basis">${escapeHtml(basis)}</p>`);
  if (data.problems.length > 0) {
    const items = data.problems.map(
      (p) =>
        `<li class="dewmark-${p.severity}"><span class="dewmark-severity">${p.severity}</span> ` +
        `<span class="dewmark-code">${escapeHtml(p.code)}</span>${escapeHtml(problemSubject(p))} ` +
        `${escapeHtml(p.message)}</li>`,
    );
    out.push(`<ul class="dewmark-problems">${items.join('')}</ul>`);
  }
  if (data.states.length === 0 && data.processes.length === 0 && data.problems.length === 0) {
    out.push('<p class="dewmark-basis">No states, mixes or processes in this block.</p>');
  }
  out.push('</div>');
  return out.join('');
}

// ---------------------------------------------------------------------------------------------
// Markdown (written into the note)
// ---------------------------------------------------------------------------------------------

/** A Markdown table with padded columns; `right[i]` aligns column i to the right. */
function markdownTable(header: string[], rows: string[][], right: boolean[]): string[] {
  const widths = header.map((h, i) => Math.max(3, h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) =>
    `| ${cells.map((c, i) => (right[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!))).join(' | ')} |`;
  const dashes = widths.map((w, i) => (right[i] ? `${'-'.repeat(w - 1)}:` : `:${'-'.repeat(w - 1)}`));
  const rule = `| ${dashes.join(' | ')} |`;
  return [line(header), rule, ...rows.map(line)];
}

/**
 * A message without the evaluator's "(line 12)" references: a table written into the note must
 * not go stale because prose was added above its block.
 */
function withoutLineNumbers(message: string): string {
  return message.replace(/ \(line \d+\)/g, '');
}

/**
 * The results of one block as Markdown lines (no line breaks inside): the states table, the
 * processes table, the basis line, and the problems as a list, separated by blank lines. Nothing
 * in it depends on where the block is in the note (no line numbers).
 */
export function resultsTableMarkdown(data: ResultsData): string[] {
  const parts: string[][] = [];
  if (data.states.length > 0) {
    const header = ['state', ...data.stateColumns.map((c) => escapeMarkdown(`${c.label} ${c.unit}`))];
    const rows = data.states.map((s) => [escapeMarkdown(stateName(s)), ...s.values.map(escapeMarkdown)]);
    parts.push(markdownTable(header, rows, [false, ...data.stateColumns.map(() => true)]));
  }
  if (data.processes.length > 0) {
    const header = ['process', 'kind', 'total', 'sensible', 'latent', 'SHR', 'water'];
    const rows = data.processes.map((p) => [
      escapeMarkdown(`${p.name}: ${p.from} → ${p.to}`),
      escapeMarkdown(p.kind),
      ...[p.total, p.sensible, p.latent, p.shr, p.water].map(escapeMarkdown),
    ]);
    parts.push(markdownTable(header, rows, [false, false, true, true, true, true, true]));
  }
  const basis = basisText(data);
  if (basis) parts.push([`_${escapeMarkdown(basis)}_`]);
  if (data.problems.length > 0) {
    parts.push(
      data.problems.map(
        (p) =>
          `- **${p.severity}** ${escapeMarkdown(p.code)}${escapeMarkdown(problemSubject(p))} ` +
          escapeMarkdown(withoutLineNumbers(p.message)),
      ),
    );
  }
  if (parts.length === 0) parts.push(['_No states, mixes or processes in this block._']);
  const out: string[] = [];
  parts.forEach((p, i) => {
    if (i > 0) out.push('');
    out.push(...p);
  });
  return out;
}
