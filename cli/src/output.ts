/** What `dewmark` prints: diagnostic lines, the JSON documents, and the terminal tables. */
import type { Analysis, CoreDiagnostic, Dimension, ProcessResult, StateResult, UnitSystem } from './core';
import { LineIndex, displaySymbol, displayUnit, jsonFigure, jsonName, processRow, stateRow, waterUnit } from './core';
import { safeLinePath, safeText } from './sanitize';

/** One checked or evaluated file. */
export interface FileResult {
  path: string;
  text: string;
  analysis: Analysis;
  lines: LineIndex;
}

/** A diagnostic with 1-based positions (end exclusive), as printed and as in the JSON. */
export interface DiagnosticJson {
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
  severity: CoreDiagnostic['severity'];
  code: string;
  message: string;
}

/** Builds a {@link FileResult}. */
export function fileResult(path: string, text: string, analysis: Analysis): FileResult {
  return { path, text, analysis, lines: new LineIndex(text) };
}

/** The diagnostic with 1-based line/column positions. */
export function diagnosticJson(f: FileResult, d: CoreDiagnostic): DiagnosticJson {
  const a = f.lines.lineCol(Math.max(0, Math.min(d.span.start, f.text.length)));
  const b = f.lines.lineCol(Math.max(0, Math.min(d.span.end, f.text.length)));
  return {
    line: a.line,
    column: a.column,
    endLine: b.line,
    endColumn: b.column,
    severity: d.severity,
    code: d.code,
    message: d.message,
  };
}

/** `path:line:col: severity[code]: message` (the form CI problem matchers read). */
export function diagnosticLine(f: FileResult, d: CoreDiagnostic): string {
  const j = diagnosticJson(f, d);
  return `${safeLinePath(f.path)}:${j.line}:${j.column}: ${j.severity}[${j.code}]: ${safeText(j.message.replace(/\s*\n\s*/g, ' '))}`;
}

/** Counts of diagnostics by severity. */
export interface Counts {
  errors: number;
  warnings: number;
  infos: number;
}

/** Counts the diagnostics of some files. */
export function countDiagnostics(files: FileResult[]): Counts {
  const c: Counts = { errors: 0, warnings: 0, infos: 0 };
  for (const f of files) {
    for (const d of f.analysis.diagnostics) {
      if (d.severity === 'error') c.errors++;
      else if (d.severity === 'warning') c.warnings++;
      else c.infos++;
    }
  }
  return c;
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** `3 files, 2 errors, 1 warning` (infos and unreadable files only when there are some). */
export function summaryLine(files: number, c: Counts, unreadable = 0): string {
  const parts = [plural(files, 'file'), plural(c.errors, 'error'), plural(c.warnings, 'warning')];
  if (c.infos > 0) parts.push(plural(c.infos, 'info'));
  if (unreadable > 0) parts.push(`${unreadable} could not be read`);
  return parts.join(', ');
}

/** Significant digits of every figure in the JSON: beyond the engine's accuracy, clear of binary noise. */
export const JSON_SIGNIFICANT_DIGITS = 12;

/** 10⁰ … 10²²: the powers of ten a double holds exactly. */
const EXACT_POW10: readonly number[] = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));

/**
 * A figure for the JSON at {@link JSON_SIGNIFICANT_DIGITS} significant digits — never a fixed
 * number of decimals, which would leave a −60 °C dew-point state's humidity ratio (3.3e-6 kg/kg)
 * with two; null stays null (never NaN or Infinity in the JSON). It is the double nearest to
 * `x.toPrecision(12)`: the usual figure (1e-6 ≤ |x| < 1e11) is scaled once to a 12-digit whole
 * number and rounded, and divided back (a quotient of two exact doubles, rounded once, is the
 * double nearest to the decimal); the scaling is exact to 1e-4 of the last digit, so a figure
 * that close to a half (a tie), and any other figure, goes through `toPrecision` itself. (The
 * test of the JSON precision compares the two on a million figures.)
 */
export function roundForJson(x: number | null | undefined): number | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  const a = x < 0 ? -x : x;
  if (a >= 1e-6 && a < 1e11) {
    // Decimals that leave 12 significant digits: 11 − the decimal exponent of a (1 … 17).
    let s = 11 - Math.floor(Math.log10(a));
    let y = a * (EXACT_POW10[s] as number);
    if (y < 1e11) y = a * (EXACT_POW10[++s] as number);
    else if (y >= 1e12) y = a * (EXACT_POW10[--s] as number);
    const frac = y - Math.floor(y);
    if (y >= 1e11 && y < 1e12 && (frac < 0.4999 || frac > 0.5001)) {
      const v = Math.round(y) / (EXACT_POW10[s] as number);
      return x < 0 ? -v : v;
    }
  }
  const v = Number(x.toPrecision(JSON_SIGNIFICANT_DIGITS));
  return Object.is(v, -0) ? 0 : v;
}
const r = roundForJson;

function lineOf(f: FileResult, item: StateResult | ProcessResult): number {
  const s = item.statement.name?.span ?? item.statement.span;
  return f.lines.lineCol(s.start).line;
}

/** A state or mix in the JSON shape of the notation's machine-readable output (SI, as the key names). */
export function stateJson(f: FileResult, s: StateResult): Record<string, unknown> {
  const st = s.state;
  const out: Record<string, unknown> = {
    name: s.name,
    line: lineOf(f, s),
    kind: s.kind,
    ok: st !== null,
  };
  // Field names and units come from the key table.
  // (One store per field, each always the same name: much faster than a loop over the names.)
  out[N.p] = r(jsonFigure('p', s.pressure.pa));
  out[N.db] = r(jsonFigure('db', st?.db));
  out[N.wb] = r(jsonFigure('wb', st?.wb));
  out[N.dp] = r(jsonFigure('dp', st?.dp));
  out[N.rh] = r(jsonFigure('rh', st?.rh));
  out[N.w] = r(jsonFigure('w', st?.w));
  out[N.h] = r(jsonFigure('h', st?.h));
  out[N.v] = r(jsonFigure('v', st?.v));
  out[N.rho] = r(jsonFigure('rho', st?.rho));
  out.defining = [...s.defining];
  out.pressure = s.pressure.describe;
  if (s.kind === 'mix') {
    out.streams = (s.streams ?? []).map((x) => ({
      name: x.name,
      fraction: r(x.fraction),
      [jsonName('m')]: r(jsonFigure('m', x.massFlowKgS)),
    }));
    out[jsonName('m')] = r(jsonFigure('m', s.massFlowKgS ?? null));
  }
  if (s.kind === 'supply') {
    const f = s.supply;
    out.room = f?.room ?? null;
    out.q_sensible_kW = r(f ? f.qSensibleW / 1000 : null);
    out.q_latent_kW = r(f ? f.qLatentW / 1000 : null);
    out.shr = r(f?.shr ?? null);
    out.m_kgs = r(s.massFlowKgS ?? null);
    out.v_m3s = r(f?.volumeFlowM3S ?? null);
  }
  // Properties taken from states above: the offset in SI (K, kg/kg, J/kg).
  if (s.sources)
    out.sources = s.sources.map((x) => ({ key: x.key, from: x.from, fromKey: x.fromKey, offset: r(x.offsetSI) }));
  if (s.definedBy?.spec !== undefined) {
    // A state a process or recovery defines: where it came from, and the flow it carries.
    out.defined_by = { [s.definedBy.statement]: s.definedBy.name, from: s.definedBy.from, spec: s.definedBy.spec };
    out.m_kgs = r(s.massFlowKgS ?? null);
  }
  if (s.claims.length > 0) out.claims = s.claims.map((c) => ({ key: c.key, pass: c.pass, computed: c.computedText }));
  return out;
}

/** The JSON field names of a state's pressure and computed properties, from the key table. */
const N = {
  p: jsonName('p'),
  db: jsonName('db'),
  wb: jsonName('wb'),
  dp: jsonName('dp'),
  rh: jsonName('rh'),
  w: jsonName('w'),
  h: jsonName('h'),
  v: jsonName('v'),
  rho: jsonName('rho'),
} as const;

/** A process in the JSON shape (heat rates in kW and water in kg/h, positive = added to the air). */
export function processJson(f: FileResult, p: ProcessResult): Record<string, unknown> {
  const out: Record<string, unknown> = {
    name: p.name,
    line: lineOf(f, p),
    kind: p.processKind,
    from: p.from,
    to: p.to,
  };
  // The keys' fields (names and units from the key table), then the figures no key writes.
  const keyed = [
    ['m', p.massFlowKgS],
    ['q_total', p.qTotalW],
    ['q_sensible', p.qSensibleW],
    ['q_latent', p.qLatentW],
    ['shr', p.shr],
    ['water', p.waterKgS],
    ['q_coil', p.qCoilW],
    ['q', p.volumeFlowM3S],
  ] as const;
  for (const [key, si] of keyed) out[jsonName(key)] = r(jsonFigure(key, si));
  out.dh_kJkg = r(p.dhTotal / 1000);
  out.dw_kgkg = r(p.dw);
  out.adp_C = r(p.apparatusDewPointC ?? null);
  if (p.bypassFactor !== null && p.bypassFactor !== undefined) out.bf = r(p.bypassFactor);
  const e = p.equipment;
  if (e) {
    const eq: Record<string, unknown> = { form: e.form, spec: e.spec };
    if (e.fanRiseK !== undefined) eq.fan_rise_K = r(e.fanRiseK);
    if (e.dryCoil !== undefined) eq.dry_coil = e.dryCoil;
    if (e.saturationEffectiveness !== undefined) eq.saturation_effectiveness = r(e.saturationEffectiveness);
    if (e.steamTempC !== undefined) eq.steam_C = r(e.steamTempC);
    if (e.steamEnthalpyJkg !== undefined) eq.steam_h_kJkg = r(e.steamEnthalpyJkg / 1000);
    if (e.effSensible !== undefined) eq.eff_s = r(e.effSensible);
    if (e.effLatent !== undefined) eq.eff_l = r(e.effLatent);
    if (e.wetting !== undefined)
      eq.wetting =
        e.wetting === null
          ? null
          : {
              kind: e.wetting.kind,
              surface_C: r(e.wetting.surfaceC),
              dp_C: r(e.wetting.dewPointC),
              accepted: e.wetting.accepted,
            };
    out.equipment = eq;
  }
  if (p.claims.length > 0) out.claims = p.claims.map((c) => ({ key: c.key, pass: c.pass, computed: c.computedText }));
  return out;
}

/** One file of the `eval --format json` document. */
export function evalFileJson(f: FileResult): Record<string, unknown> {
  const states: Record<string, unknown>[] = [];
  const processes: Record<string, unknown>[] = [];
  for (const item of f.analysis.items) {
    if (item.kind === 'process') processes.push(processJson(f, item));
    else states.push(stateJson(f, item));
  }
  return {
    path: f.path,
    units: f.analysis.units,
    states,
    processes,
    diagnostics: f.analysis.diagnostics.map((d) => diagnosticJson(f, d)),
  };
}

/**
 * Objects of an array stringified at once: enough to keep JSON.stringify's speed, few enough that
 * the text (about 34 KB for 64 states) stays below V8's large-object size (128 KB), whose strings
 * go straight to the old generation and wait there for a full collection.
 */
const JSON_BATCH = 64;

/**
 * The elements of `values` as `JSON.stringify(array, null, 2)` prints them when the array's
 * elements lie `depth` (≥ 1) levels deep: `A,\n<indent>B…` without the brackets. The batch is
 * wrapped in depth − 1 arrays, stringified in one call, and the wrappers' text cut off.
 */
function elementsText(values: unknown[], depth: number): string {
  let nested: unknown = values;
  let before = '';
  let after = '';
  for (let k = 0; k < depth; k++) {
    if (k > 0) nested = [nested];
    before += `${'  '.repeat(k)}[\n`;
    after = `\n${'  '.repeat(k)}]${after}`;
  }
  before += '  '.repeat(depth);
  const text = JSON.stringify(nested, null, 2);
  return text.slice(before.length, text.length - after.length);
}

/**
 * Writes an array of objects made one by one by `make` (null: none for that element) as
 * `JSON.stringify` prints it with its elements `depth` levels deep, in pieces of
 * {@link JSON_BATCH} elements: at most one batch of objects exists at a time.
 */
function emitArray<T>(
  source: Iterable<T>,
  make: (x: T) => unknown | null,
  depth: number,
  emit: (chunk: string) => void,
): void {
  const lead = `\n${'  '.repeat(depth)}`;
  let batch: unknown[] = [];
  let first = true;
  const flush = (): void => {
    emit(`${first ? '[' : ','}${lead}${elementsText(batch, depth)}`);
    first = false;
    batch = [];
  };
  for (const x of source) {
    const v = make(x);
    if (v === null) continue;
    batch.push(v);
    if (batch.length >= JSON_BATCH) flush();
  }
  if (batch.length > 0) flush();
  emit(first ? '[]' : `\n${'  '.repeat(depth - 1)}]`);
}

/**
 * One file of the `eval --format json` document as text, handed to `emit` in pieces (a few
 * hundred states, processes or diagnostics each), so that a large note's document is never one
 * string or one tree of objects: exactly `JSON.stringify(evalFileJson(f), null, 2)` nested
 * `depth` levels deep (every line after the first indented by `depth` levels).
 */
export function evalFileText(f: FileResult, depth: number, emit: (chunk: string) => void): void {
  const field = `\n${'  '.repeat(depth + 1)}`;
  emit(
    `{${field}"path": ${JSON.stringify(f.path)},${field}"units": ${JSON.stringify(f.analysis.units)},${field}"states": `,
  );
  const items = f.analysis.items;
  emitArray(items, (i) => (i.kind === 'process' ? null : stateJson(f, i)), depth + 2, emit);
  emit(`,${field}"processes": `);
  emitArray(items, (i) => (i.kind === 'process' ? processJson(f, i) : null), depth + 2, emit);
  emit(`,${field}"diagnostics": `);
  emitArray(f.analysis.diagnostics, (d) => diagnosticJson(f, d), depth + 2, emit);
  emit(`\n${'  '.repeat(depth)}}`);
}

// ---------------------------------------------------------------------------------------------
// Tables
// ---------------------------------------------------------------------------------------------

/** Lays out rows as aligned columns (numbers right-aligned). */
export function renderTable(header: string[], rows: string[][], numeric: boolean[]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((row) => (row[i] ?? '').length)));
  const fmt = (cells: string[]) =>
    cells
      .map((c, i) => (numeric[i] ? c.padStart(widths[i]!) : c.padEnd(widths[i]!)))
      .join('  ')
      .replace(/\s+$/, '');
  return [fmt(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(fmt)].join('\n');
}

function sym(dim: Dimension, sys: UnitSystem): string {
  return displaySymbol(displayUnit(dim, sys));
}

/*
 * The tables are a thin renderer of the results rows (`@dewmark/core/present/rows`): every figure
 * comes formatted from there, as in the preview, the hovers and the report.
 */

/** The states and mixes of a file as a table in the note's unit system. */
export function statesTable(f: FileResult): string | null {
  const sys = f.analysis.units;
  const states = f.analysis.items.filter((i): i is StateResult => i.kind !== 'process');
  if (states.length === 0) return null;
  const header = [
    'name',
    'line',
    'kind',
    `p ${sym('pressure', sys)}`,
    `db ${sym('temperature', sys)}`,
    `wb ${sym('temperature', sys)}`,
    `dp ${sym('temperature', sys)}`,
    'rh %',
    `w ${sym('humidityRatio', sys)}`,
    `h ${sym('enthalpy', sys)}`,
    `v ${sym('specificVolume', sys)}`,
    'from',
  ];
  const rows = states.map((s) => {
    const row = stateRow(s, sys);
    const v = row.figures;
    return [
      s.name,
      String(lineOf(f, s)),
      s.kind,
      v.p.value,
      v.db.value,
      v.wb.value,
      v.dp.value,
      v.rh.value,
      v.w.value,
      v.h.value,
      v.v.value,
      row.status === 'failed' ? 'not computed (see diagnostics)' : row.source,
    ];
  });
  return renderTable(header, rows, [false, true, false, true, true, true, true, true, true, true, true, false]);
}

/** The processes of a file as a table in the note's unit system (heat and water only with a flow). */
export function processesTable(f: FileResult): string | null {
  const sys = f.analysis.units;
  const procs = f.analysis.items.filter((i): i is ProcessResult => i.kind === 'process');
  if (procs.length === 0) return null;
  const power = sym('power', sys);
  const header = [
    'name',
    'line',
    'path',
    'kind',
    `m ${sym('massFlow', sys)}`,
    `total ${power}`,
    `sensible ${power}`,
    `latent ${power}`,
    'SHR',
    `water ${displaySymbol(waterUnit(sys))}`,
    `coil ${power}`,
  ];
  const rows = procs.map((p) => {
    const row = processRow(p, sys);
    const withFlow = (x: { value: string }) => (row.hasFlow ? x.value : '—');
    return [
      p.name,
      String(lineOf(f, p)),
      `${p.from} -> ${p.to}`,
      row.kind,
      row.massFlow.value,
      withFlow(row.total),
      withFlow(row.sensible),
      withFlow(row.latent),
      row.shr.value,
      withFlow(row.water),
      withFlow(row.coil),
    ];
  });
  return renderTable(header, rows, [false, true, false, false, true, true, true, true, true, true, true]);
}
