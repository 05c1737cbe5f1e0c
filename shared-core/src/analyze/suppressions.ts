/**
 * What a note and the project decide about its diagnostics, applied after evaluation so that the
 * editor and the command line (both through `finishAnalysis`) agree:
 *
 * - **Ignore comments** acknowledge named diagnostics in the note itself, as an air comment:
 *   - `state X: db=20C wb=25C   # dewmark-ignore wb-above-db` — that code on that line;
 *   - `# dewmark-ignore claim-mismatch` on a line of its own — that code on the next statement line;
 *   - `# dewmark-ignore-block claim-mismatch, fog` anywhere in a fenced block — those codes in the
 *     whole block.
 *   Codes are separated by commas or spaces; ` -- ` starts a free-text reason. An acknowledged
 *   diagnostic leaves the list and is kept in `Analysis.suppressed` (the JSON reports it). A
 *   comment that names no code, or acknowledges nothing where it stands, is itself reported
 *   (`ignore-comment`), so a mistyped code cannot pass unseen.
 * - **Rule severities** from the project configuration (`EvaluateSettings.rules`): a code's
 *   severity changed to error, warning or info, or `off` to drop it.
 *
 * Linear in the note: one scan of the air regions' text for the word, and one pass over the
 * diagnostics with a line lookup each.
 */
import type { CoreDiagnostic, ParsedNote } from '../notation/ast';
import { LineIndex } from '../text/lineIndex';
import type { Span } from '../text/types';
import type { Analysis, RuleSetting, SuppressedDiagnostic } from '../evaluate/types';

/** What the policy reads of an analysis (and sets: `diagnostics`, `suppressed`). */
type PolicyInput = Pick<Analysis, 'settings' | 'diagnostics' | 'suppressed'> & { parsed: Pick<ParsedNote, 'regions'> };

/** The word of an ignore comment. */
export const IGNORE_WORD = 'dewmark-ignore';

/** The diagnostic code of a malformed or unused ignore comment. */
export const IGNORE_COMMENT = 'ignore-comment';

/** One ignore comment of the note. */
interface IgnoreComment {
  span: Span;
  codes: string[];
  justification: string;
  /**
   * `line`: the diagnostics starting on the line that begins at `from`; `region`: those in the
   * region starting at `from`.
   */
  scope: 'line' | 'region';
  from: number;
  used: boolean;
}

const DIRECTIVE = /#\s*dewmark-ignore(-block)?(?![\w-])([^\n]*)/g;
const CODE = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** The end of the line holding `offset` (the offset of its line break, or the text's end). */
function lineEnd(text: string, offset: number): number {
  const nl = text.indexOf('\n', offset);
  return nl < 0 ? text.length : nl;
}

function lineStart(text: string, offset: number): number {
  return text.lastIndexOf('\n', offset - 1) + 1;
}

/** Finds the ignore comments of the note's air regions. */
function ignoreComments(analysis: PolicyInput, text: string, problems: CoreDiagnostic[]): IgnoreComment[] {
  const out: IgnoreComment[] = [];
  for (const region of analysis.parsed.regions) {
    const body = text.slice(region.contentSpan.start, region.contentSpan.end);
    if (!body.includes(IGNORE_WORD)) continue;
    DIRECTIVE.lastIndex = 0;
    for (let m = DIRECTIVE.exec(body); m; m = DIRECTIVE.exec(body)) {
      const at = region.contentSpan.start + m.index;
      const end = Math.min(lineEnd(text, at), region.contentSpan.end);
      const span = { start: at, end: text[end - 1] === '\r' ? end - 1 : end };
      const rest = (m[2] ?? '').replace(/\r$/, '');
      const cut = rest.indexOf(' -- ');
      const list = (cut >= 0 ? rest.slice(0, cut) : rest).trim();
      const justification = cut >= 0 ? rest.slice(cut + 4).trim() : '';
      const codes = list === '' ? [] : list.split(/[\s,]+/).filter((c) => c !== '');
      const bad = codes.filter((c) => !CODE.test(c));
      const word = m[1] ? `${IGNORE_WORD}-block` : IGNORE_WORD;
      if (codes.length === 0 || bad.length > 0) {
        problems.push({
          code: IGNORE_COMMENT,
          severity: 'warning',
          span,
          message:
            codes.length === 0
              ? `'# ${word}' names no diagnostic code; write the code it acknowledges, ` +
                `e.g. '# ${word} claim-mismatch' (the codes are in docs/notation.md)`
              : `'# ${word}': '${bad[0]}' is not a diagnostic code (lower-case words joined by hyphens, ` +
                `e.g. claim-mismatch); separate codes with commas and put a reason after ' -- '`,
        });
        continue;
      }
      let scope: IgnoreComment['scope'] = 'region';
      let from = region.span.start;
      if (!m[1] && region.origin === 'fence') {
        scope = 'line';
        from = lineStart(text, at);
        const before = text.slice(from, at).replace(/^[\s>]*/, '');
        if (before.trim() === '') {
          // A comment on its own line: the next line of the block that holds a statement.
          let next = lineEnd(text, at) + 1;
          while (next < region.contentSpan.end) {
            const e = lineEnd(text, next);
            const content = text.slice(next, e).replace(/^[\s>]*/, '');
            if (content.trim() !== '' && !content.startsWith('#')) break;
            next = e + 1;
          }
          from = next;
        }
      }
      out.push({ span, codes, justification, scope, from, used: false });
    }
  }
  return out;
}

/**
 * The comments by where they apply: line comments by the offset of their line's start, block and
 * inline-span comments by their region's start, so that each diagnostic looks up two short lists.
 */
interface CommentIndex {
  byLine: Map<number, IgnoreComment[]>;
  byRegion: Map<number, IgnoreComment[]>;
  /** Region starts and ends in document order (for the binary search). */
  regions: Span[];
  lines: LineIndex;
}

function indexComments(comments: IgnoreComment[], analysis: PolicyInput, text: string): CommentIndex {
  const idx: CommentIndex = {
    byLine: new Map(),
    byRegion: new Map(),
    regions: analysis.parsed.regions.map((r) => r.span),
    lines: new LineIndex(text),
  };
  for (const c of comments) {
    const map = c.scope === 'line' ? idx.byLine : idx.byRegion;
    const list = map.get(c.from);
    if (list) list.push(c);
    else map.set(c.from, [c]);
  }
  return idx;
}

/** The region holding `offset`, or undefined (regions are in document order and do not overlap). */
function regionAt(regions: Span[], offset: number): Span | undefined {
  let lo = 0;
  let hi = regions.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const r = regions[mid]!;
    if (offset < r.start) hi = mid - 1;
    else if (offset >= r.end) lo = mid + 1;
    else return r;
  }
  return undefined;
}

/** The comment that acknowledges `d`, if any. */
function coveringComment(idx: CommentIndex, d: CoreDiagnostic): IgnoreComment | undefined {
  const line = idx.lines.lineStart(idx.lines.lineAt(d.span.start));
  const onLine = idx.byLine.get(line)?.find((c) => c.codes.includes(d.code));
  if (onLine) return onLine;
  const region = regionAt(idx.regions, d.span.start);
  return region ? idx.byRegion.get(region.start)?.find((c) => c.codes.includes(d.code)) : undefined;
}

/**
 * Applies the note's ignore comments and the project's rule severities to `analysis` (in place:
 * `diagnostics` is replaced, `suppressed` set). Diagnostic objects are never mutated: a changed
 * severity is a copy, since the incremental analyzer reuses them.
 */
export function applyDiagnosticPolicy(analysis: PolicyInput, text: string): void {
  const rules = analysis.settings.rules;
  const hasRules = rules !== undefined && Object.keys(rules).length > 0;
  const problems: CoreDiagnostic[] = [];
  const comments = text.includes(IGNORE_WORD) ? ignoreComments(analysis, text, problems) : [];
  if (comments.length === 0 && problems.length === 0 && !hasRules) return;
  const idx = comments.length > 0 ? indexComments(comments, analysis, text) : null;
  const kept: CoreDiagnostic[] = [];
  const suppressed: SuppressedDiagnostic[] = [];
  for (const d of analysis.diagnostics) {
    const c = idx ? coveringComment(idx, d) : undefined;
    if (c) {
      c.used = true;
      suppressed.push({ ...d, suppressedBy: c.span, justification: c.justification });
      continue;
    }
    kept.push(d);
  }
  for (const c of comments) {
    if (c.used) continue;
    problems.push({
      code: IGNORE_COMMENT,
      severity: 'info',
      span: c.span,
      message:
        `this ignore comment acknowledges ${c.codes.join(', ')}, but there is no such diagnostic ` +
        `where it applies; remove it, or correct the code (the codes are in docs/notation.md)`,
    });
  }
  let all = kept;
  if (problems.length > 0) all = [...kept, ...problems].sort((a, b) => a.span.start - b.span.start);
  if (hasRules) {
    const out: CoreDiagnostic[] = [];
    for (const d of all) {
      const rule: RuleSetting | undefined = rules![d.code];
      if (rule === undefined || rule === d.severity) out.push(d);
      else if (rule !== 'off') out.push({ ...d, severity: rule });
    }
    all = out;
  }
  analysis.diagnostics = all;
  if (suppressed.length > 0) analysis.suppressed = suppressed;
}
