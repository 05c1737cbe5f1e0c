/**
 * Turns an {@link Analysis} of a note into chart data: plotted states and mixes, mixing lines,
 * process arrows, and the states that could not be plotted (with the evaluator's reason).
 */
import type { Analysis, ProcessResult, StateResult } from '../evaluate/types';
import type { CoreDiagnostic } from '../notation/ast';
import type { Span } from '../text/types';
import { renderChartFromData } from './render';
import type { ChartData, ChartInfeasible, ChartMix, ChartOptions, ChartPoint, ChartProcess } from './types';

/** Options of {@link chartDataFromAnalysis}: the note's text (for line numbers) and a title. */
export interface FromAnalysisOptions {
  /** The note's full text; without it no line numbers are given. */
  source?: string;
  /** Title of the chart (the note's file name, say). */
  title?: string;
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

/** The pressure most of the note's states are at (the first state's on a tie); the setting without states. */
function notePressure(analysis: Analysis): { pa: number; text: string } {
  const states = analysis.items.filter((i): i is StateResult => i.kind !== 'process');
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
  const lineOf = lineFinder(options.source);
  const diagnosticsOf = diagnosticFinder(analysis);
  for (const item of analysis.items) {
    const span = item.statement.span;
    const line = lineOf(span.start);
    const diags = diagnosticsOf(span);
    if (item.kind === 'process') {
      const pr = item as ProcessResult;
      processes.push({
        name: pr.name,
        from: pr.from,
        to: pr.to,
        kind: pr.processKind,
        flagged: diags.some((d) => d.severity === 'error'),
        ...(line !== undefined ? { line } : {}),
      });
      continue;
    }
    const st = item as StateResult;
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
  const pressure = notePressure(analysis);
  return {
    pressurePa: pressure.pa,
    pressureText: pressure.text,
    units: analysis.units,
    points,
    mixes,
    processes,
    infeasible,
    ...(options.title !== undefined ? { title: options.title } : {}),
  };
}

/**
 * Renders the chart of an analysed note as SVG text: its states, mixes and processes over the
 * curves for the note's pressure, in the note's unit system.
 */
export function renderChart(analysis: Analysis, options: ChartOptions & FromAnalysisOptions = {}): string {
  const data = chartDataFromAnalysis(analysis, options);
  return renderChartFromData(data, options);
}
