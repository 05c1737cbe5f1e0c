/**
 * Turns an {@link Analysis} of a note into chart data: plotted states and mixes, mixing lines,
 * process arrows, and the states that could not be plotted (with the evaluator's reason).
 */
import type { Analysis, EvaluatedItem, ProcessResult, StateResult } from '../evaluate/types';
import type { CoreDiagnostic, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import { satW } from './engine';
import { chartCases, type ChartCase, type ChartGrouping } from './cases';
import { renderChartFromData, renderSizedChart, type SizedChart } from './render';
import type {
  ChartData,
  ChartInfeasible,
  ChartMix,
  ChartOptions,
  ChartPoint,
  ChartProcess,
  ChartShrLine,
} from './types';

/** Options of {@link chartDataFromAnalysis}: the note's text (for line numbers) and a title. */
export interface FromAnalysisOptions {
  /** The note's full text; without it no line numbers are given. */
  source?: string;
  /** Title of the chart (the note's file name, say). */
  title?: string;
  /**
   * Draw only what these statements define (a case of {@link chartCases}: a section, a block,
   * a named chart). States they use but that are defined elsewhere are drawn muted, as context.
   * Without it, the whole note.
   */
  statements?: Iterable<Statement>;
  /** Lines for the flagged list about the grouping itself (a case's `problems`). */
  notes?: string[];
}

/** 1-based lines of offsets in a note: the `\n` positions found once, each look-up a binary search. */
function lineFinder(text: string | undefined): (offset: number) => number | undefined {
  if (text === undefined) return () => undefined;
  const breaks: number[] = [];
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) breaks.push(i);
  return (offset) => {
    const end = Math.min(offset, text.length);
    // The number of line breaks before `end`.
    let lo = 0;
    let hi = breaks.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (breaks[mid]! < end) lo = mid + 1;
      else hi = mid;
    }
    return lo + 1;
  };
}

/**
 * The diagnostics inside a statement's span: a binary search into the note's diagnostics (in
 * document order), then only those that start inside the span are looked at.
 */
function diagnosticFinder(analysis: Analysis): (span: Span) => CoreDiagnostic[] {
  const all = analysis.diagnostics;
  let sorted = true;
  for (let i = 1; i < all.length && sorted; i++) if (all[i - 1]!.span.start > all[i]!.span.start) sorted = false;
  if (!sorted) return (span) => all.filter((d) => within(d.span, span));
  return (span) => {
    let lo = 0;
    let hi = all.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (all[mid]!.span.start < span.start) lo = mid + 1;
      else hi = mid;
    }
    const out: CoreDiagnostic[] = [];
    for (let i = lo; i < all.length && all[i]!.span.start <= span.end; i++)
      if (within(all[i]!.span, span)) out.push(all[i]!);
    return out;
  };
}

function within(inner: Span, outer: Span): boolean {
  return inner.start >= outer.start && inner.end <= outer.end;
}

/**
 * A diagnostic's message shortened for the chart's list: without the leading `state NAME:`
 * (the list names the state), first sentence only; the report has the full text.
 */
function shortReason(d: CoreDiagnostic | undefined, fallback: string): string {
  let m = d?.message.trim() ?? '';
  m = m.replace(/^(state|mix|process|recover)\s+[^:]+:\s*/, '');
  m = m.split(/(?<=[.!?;])\s+(?=[A-Z])/)[0] ?? m;
  if (!m) return fallback;
  return /[.!?]$/.test(m) ? m : `${m.replace(/;$/, '')}.`;
}

/** The pressure most of the chart's states are at (the first state's on a tie); the setting without states. */
function notePressure(analysis: Analysis, items: readonly EvaluatedItem[]): { pa: number; text: string } {
  const states = items.filter((i): i is StateResult => i.kind !== 'process' && i.state !== null);
  if (states.length === 0) {
    return { pa: analysis.settings.pressurePa, text: analysis.settings.pressureOrigin };
  }
  const counts = new Map<number, { n: number; text: string }>();
  for (const s of states) {
    const key = Math.round(s.pressure.pa);
    const c = counts.get(key);
    if (c) c.n++;
    else counts.set(key, { n: 1, text: s.pressure.origin });
  }
  let best: [number, { n: number; text: string }] | undefined;
  for (const e of counts) if (!best || e[1].n > best[1].n) best = e;
  const first = states.find((s) => Math.round(s.pressure.pa) === best![0])!;
  return { pa: first.pressure.pa, text: best![1].text };
}

/** Builds the chart data of an analysed note (SI, the note's unit system). */
export function chartDataFromAnalysis(analysis: Analysis, options: FromAnalysisOptions = {}): ChartData {
  const points: ChartPoint[] = [];
  const mixes: ChartMix[] = [];
  const processes: ChartProcess[] = [];
  const infeasible: ChartInfeasible[] = [];
  const shrLines: ChartShrLine[] = [];
  const lineOf = lineFinder(options.source);
  const diagnosticsOf = diagnosticFinder(analysis);
  const chosen = options.statements ? new Set(options.statements) : null;
  const items = chosen ? analysis.items.filter((i) => chosen.has(i.statement)) : analysis.items;
  for (const item of items) {
    const span = item.statement.span;
    const line = lineOf(span.start);
    const diags = diagnosticsOf(span);
    if (item.kind === 'process') {
      const pr = item as ProcessResult;
      const adp = adpOf(analysis, pr);
      processes.push({
        name: pr.name,
        from: pr.from,
        to: pr.to,
        kind: pr.processKind,
        flagged: diags.some((d) => d.severity === 'error'),
        ...(line !== undefined ? { line } : {}),
        ...(adp ? { adp } : {}),
      });
      continue;
    }
    const st = item as StateResult;
    if (st.kind === 'supply' && st.supply && st.state) {
      shrLines.push({
        supply: st.name,
        room: st.supply.room,
        shr: st.supply.shr,
        ...(line !== undefined ? { line } : {}),
      });
    }
    if (st.kind === 'mix' && st.streams) {
      mixes.push({ name: st.name, streams: st.streams.map((s) => s.name), ...(line !== undefined ? { line } : {}) });
    }
    if (st.state) {
      const s = st.state;
      points.push({
        name: st.name,
        kind: st.kind,
        db: s.db,
        w: s.w,
        h: s.h,
        pressurePa: s.p,
        fog: s.fog,
        ...(line !== undefined ? { line } : {}),
      });
      if (s.fog) {
        const why = diags.find(
          (d) => d.code === 'supersaturated' || d.code === 'recovery-condensation' || d.code === 'recovery-frost',
        );
        infeasible.push({
          name: st.name,
          plotted: true,
          reason: shortReason(why, 'in the fog region: more water than saturated air holds as vapour.'),
          ...(line !== undefined ? { line } : {}),
        });
      }
    } else {
      const why = diags.find((d) => d.severity === 'error') ?? diags[0];
      infeasible.push({
        name: st.name,
        plotted: false,
        reason: shortReason(why, 'the state could not be computed.'),
        ...(line !== undefined ? { line } : {}),
      });
    }
  }
  // A process whose states could not be computed has no result: list it as not drawn.
  const evaluated = new Set(analysis.items.filter((i) => i.kind === 'process').map((i) => i.statement.span.start));
  for (const st of analysis.parsed.statements) {
    if (chosen && !chosen.has(st)) continue;
    if (evaluated.has(st.span.start) || !('name' in st) || !st.name) continue;
    const line = lineOf(st.span.start);
    const ends = st.keyword === 'process' ? [st] : st.keyword === 'recover' ? st.streams : [];
    for (const x of ends) {
      if (!x.from || !x.to) continue;
      processes.push({
        name: st.name.text,
        from: x.from.text,
        to: x.to.text,
        flagged: true,
        ...(line !== undefined ? { line } : {}),
      });
    }
  }
  if (chosen) addContext(analysis, points, mixes, processes, shrLines, lineOf);
  const pressure = notePressure(analysis, items);
  return {
    pressurePa: pressure.pa,
    pressureText: pressure.text,
    units: analysis.units,
    points,
    mixes,
    processes,
    infeasible,
    ...(shrLines.length > 0 ? { shrLines } : {}),
    ...(options.notes && options.notes.length > 0 ? { notes: options.notes } : {}),
    ...(options.title !== undefined ? { title: options.title } : {}),
  };
}

/**
 * The apparatus dew point of a process that removes moisture, on the saturation curve at its
 * entering state's pressure.
 */
function adpOf(analysis: Analysis, pr: ProcessResult): { db: number; w: number } | undefined {
  const db = pr.apparatusDewPointC;
  if (db === null || db === undefined || !Number.isFinite(db)) return undefined;
  const from = analysis.byName.get(pr.from);
  const p = from && from.kind !== 'process' && from.state ? from.state.p : analysis.settings.pressurePa;
  const w = satW(db, p);
  return w === null ? undefined : { db, w };
}

/**
 * The states a chart's statements use but that another case defines (a process's entering state,
 * a mix's streams, a supply's room), added as muted context points so every arrow and line has
 * both ends.
 */
function addContext(
  analysis: Analysis,
  points: ChartPoint[],
  mixes: ChartMix[],
  processes: ChartProcess[],
  shrLines: ChartShrLine[],
  lineOf: (offset: number) => number | undefined,
): void {
  const have = new Set(points.map((p) => p.name));
  const wanted: string[] = [];
  for (const m of mixes) wanted.push(...m.streams);
  for (const pr of processes) wanted.push(pr.from, pr.to);
  for (const s of shrLines) wanted.push(s.room);
  for (const name of wanted) {
    if (have.has(name)) continue;
    have.add(name);
    const item = analysis.byName.get(name);
    if (!item || item.kind === 'process' || !item.state) continue;
    const line = lineOf(item.statement.span.start);
    points.push({
      name,
      kind: item.kind,
      db: item.state.db,
      w: item.state.w,
      h: item.state.h,
      pressurePa: item.state.p,
      fog: item.state.fog,
      context: true,
      ...(line !== undefined ? { line } : {}),
    });
  }
}

/**
 * Renders the chart of an analysed note as SVG text: its states, mixes and processes over the
 * curves for the note's pressure, in the note's unit system.
 */
export function renderChart(analysis: Analysis, options: ChartOptions & FromAnalysisOptions = {}): string {
  const data = chartDataFromAnalysis(analysis, options);
  return renderChartFromData(data, options);
}

/** One chart of {@link renderChartCases}: its case and the rendered SVG with its size. */
export interface CaseChart extends SizedChart {
  case: ChartCase;
}

/**
 * The charts of a note, one per case of the grouping (see {@link chartCases}): each titled
 * `TITLE — case title` (just TITLE when there is one chart) and with its own id prefix (`PREFIX-1`, `PREFIX-2`…, so
 * they can share a page). A note with nothing to draw gives one chart of the whole note (empty but for its curves).
 */
export function renderChartCases(
  analysis: Analysis,
  grouping: ChartGrouping,
  options: ChartOptions & FromAnalysisOptions = {},
): CaseChart[] {
  const cases = chartCases(analysis, grouping, options.source);
  const prefix = options.idPrefix ?? 'dmc';
  if (cases.length === 0) {
    const all: ChartCase = { key: 'all', title: 'all states', statements: [], spans: [], problems: [] };
    return [{ case: all, ...renderSizedChart(chartDataFromAnalysis(analysis, options), options) }];
  }
  return cases.map((c, i) => {
    // One chart for the whole note keeps the plain title.
    const whole = grouping === 'all' || cases.length === 1;
    const title = options.title ? (whole ? options.title : `${options.title} \u2014 ${c.title}`) : c.title;
    const opts = {
      ...options,
      title,
      idPrefix: cases.length === 1 ? prefix : `${prefix}-${i + 1}`,
      statements: c.statements,
      notes: [...(options.notes ?? []), ...c.problems],
    };
    return { case: c, ...renderSizedChart(chartDataFromAnalysis(analysis, opts), opts) };
  });
}
