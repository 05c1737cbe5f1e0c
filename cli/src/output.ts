/** What `dewmark` prints: diagnostic lines, the JSON documents, and the terminal tables. */
import type {
  Analysis,
  ClaimResult,
  CoreDiagnostic,
  Dimension,
  EvaluatedItem,
  EvaluateSettings,
  ProcessResult,
  StateResult,
  UnitSystem,
} from './core';
import {
  LineIndex,
  analyzeHandingOut,
  displaySymbol,
  displayUnit,
  jsonField,
  jsonFigureIn,
  jsonFigureOf,
  jsonName,
  processRow,
  stateRow,
  waterUnit,
} from './core';
import {
  type JsonSkeleton,
  type JsonWriter,
  ObjectWriter,
  type TakePiece,
  TextWriter,
  jsonKey,
  jsonKeyRow,
  jsonKeys,
} from './jsonWriter';
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

/** What a file's diagnostics are printed with: its path, and its text with the text's line index. */
export type CheckedFile = Pick<FileResult, 'path' | 'text' | 'lines'>;

/** Builds a {@link FileResult}. */
export function fileResult(path: string, text: string, analysis: Analysis): FileResult {
  return { path, text, analysis, lines: new LineIndex(text) };
}

/** The diagnostic with 1-based line/column positions. */
export function diagnosticJson(f: Omit<CheckedFile, 'path'>, d: CoreDiagnostic): DiagnosticJson {
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
export function diagnosticLine(f: CheckedFile, d: CoreDiagnostic): string {
  const j = diagnosticJson(f, d);
  const message = safeText(j.message.replace(/\s*\n\s*/g, ' '));
  return `${safeLinePath(f.path)}:${j.line}:${j.column}: ${j.severity}[${j.code}]: ${message}`;
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
  for (const f of files) addCounts(c, f.analysis.diagnostics);
  return c;
}

/** Counts diagnostics by severity. */
export function diagnosticCounts(diagnostics: readonly CoreDiagnostic[]): Counts {
  const c: Counts = { errors: 0, warnings: 0, infos: 0 };
  addCounts(c, diagnostics);
  return c;
}

function addCounts(c: Counts, diagnostics: readonly CoreDiagnostic[]): void {
  for (const d of diagnostics) {
    if (d.severity === 'error') c.errors++;
    else if (d.severity === 'warning') c.warnings++;
    else c.infos++;
  }
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** `3 files, 2 errors, 1 warning` (infos and unreadable files only when there are some). */
export function summaryLine(files: number, c: Counts, unreadable = 0): string {
  const parts = [plural(files, 'file'), plural(c.errors, 'error'), plural(c.warnings, 'warning')];
  if (c.infos > 0) parts.push(plural(c.infos, 'info'));
  if (unreadable > 0) parts.push(`${unreadable} could not be read`);
  return parts.join(', ');
}

export { JSON_SIGNIFICANT_DIGITS, pieceText, roundForJson, type TakePiece } from './jsonWriter';

function lineOf(f: FileResult, item: StateResult | ProcessResult): number {
  const s = item.statement.name?.span ?? item.statement.span;
  return f.lines.lineCol(s.start).line;
}

/**
 * The 1-based lines of a note's items, taken in document order: the line breaks from the last
 * item to the next are counted in the text by the native search, so that no index of the note's
 * lines need be made for them (a note's items are most of its lines); an item behind the last
 * one, and any item of a text with a line break other than `\n`, is found by the file's line index.
 */
class ItemLines {
  /** Whether every line break of the text is `\n`. */
  private readonly plain: boolean;
  /** The offset last asked for, its 0-based line, and the first `\n` at or after it (−1: none). */
  private offset = 0;
  private line = 0;
  private next: number;
  constructor(private readonly file: CheckedFile) {
    this.plain = file.text.indexOf('\r') < 0;
    this.next = file.text.indexOf('\n');
  }
  of(item: StateResult | ProcessResult): number {
    const offset = (item.statement.name?.span ?? item.statement.span).start;
    if (!this.plain || offset < this.offset) return this.file.lines.lineCol(offset).line;
    const text = this.file.text;
    let line = this.line;
    let i = this.next;
    while (i >= 0 && i < offset) {
      line++;
      i = text.indexOf('\n', i + 1);
    }
    this.offset = offset;
    this.line = line;
    this.next = i;
    return line + 1;
  }
}

/*
 * The JSON shape of states, processes and files: written once, member by member, to a
 * JsonWriter that builds either the objects (stateJson, processJson, evalFileJson) or directly
 * the document's text (evalFileText). Field names and units of the keys' figures come from the
 * key table; every figure goes through roundForJson.
 */

/** A key of the key table that has a JSON field. */
type JsonKeyName = Parameters<typeof jsonName>[0];

/** A key's JSON field: its name, and its figure in the field's unit (both from the key table). */
const keyed = (key: JsonKeyName) => ({ json: jsonKey(jsonName(key)), figure: jsonFigureOf(key) });

/** The JSON field of a flow. */
const N = { m: keyed('m') } as const;

/**
 * The fields of a state's figures, in the JSON's order: its pressure, then its computed
 * properties (names and units from the key table).
 */
const STATE_FIELDS = (['p', 'db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'rho'] as const).map(jsonField);
const STATE_KEYS = jsonKeyRow(STATE_FIELDS.map((f) => jsonKey(f.name)));
/**
 * A state's figures in their fields' units, in the order of {@link STATE_FIELDS}: filled for each
 * state and handed to the writer whole (see {@link JsonWriter.figures}), so that no figure is a
 * boxed double on its way (one array for every state: the writer reads it before it returns).
 */
const stateFigures = new Float64Array(STATE_FIELDS.length);

/** The names of the other fields. */
const K = jsonKeys([
  'accepted',
  'adp_C',
  'bf',
  'claims',
  'computed',
  'defined_by',
  'defining',
  'dh_kJkg',
  'diagnostics',
  'dp_C',
  'dry_coil',
  'dw_kgkg',
  'eff_l',
  'eff_s',
  'equipment',
  'fan_rise_K',
  'form',
  'fraction',
  'from',
  'fromKey',
  'key',
  'kind',
  'line',
  'name',
  'offset',
  'ok',
  'pass',
  'path',
  'pressure',
  'processes',
  'q_latent_kW',
  'q_sensible_kW',
  'room',
  'saturation_effectiveness',
  'shr',
  'sources',
  'spec',
  'states',
  'steam_C',
  'steam_h_kJkg',
  'streams',
  'surface_C',
  'to',
  'units',
  'v_m3s',
  'wetting',
] as const);

/**
 * A state or mix (an object) in the JSON shape of the notation's machine-readable output (SI, as
 * the key names). A plain state written to a TextWriter (`text`), whose fixed members are those
 * of a skeleton made before, is written from it (the same text, see {@link stateSkeletons}).
 */
function writeState(w: JsonWriter, s: StateResult, line: number, text: TextWriter | null): void {
  const st = s.state;
  // One call per field, each always the same name: much faster than a loop over the names.
  // The figures by index in STATE_FIELDS' order; a state not computed has none (NaN: null).
  const u = STATE_FIELDS;
  const xs = stateFigures;
  xs[0] = jsonFigureIn(u[0]!, s.pressure.pa);
  if (st === null) xs.fill(Number.NaN, 1);
  else {
    xs[1] = jsonFigureIn(u[1]!, st.db);
    xs[2] = jsonFigureIn(u[2]!, st.wb);
    xs[3] = jsonFigureIn(u[3]!, st.dp);
    xs[4] = jsonFigureIn(u[4]!, st.rh);
    xs[5] = jsonFigureIn(u[5]!, st.w);
    xs[6] = jsonFigureIn(u[6]!, st.h);
    xs[7] = jsonFigureIn(u[7]!, st.v);
    xs[8] = jsonFigureIn(u[8]!, st.rho);
  }
  if (text !== null && stateSkeletons.write(text, s, line, xs)) return;
  writeStateMembers(w, s, s.name, line, xs);
}

/**
 * The members of {@link writeState}, with the state's name, line and figures (in {@link STATE_FIELDS}' order)
 * given.
 */
function writeStateMembers(w: JsonWriter, s: StateResult, name: string, line: number, xs: Float64Array): void {
  w.open(null);
  w.str(K.name, name);
  w.num(K.line, line);
  w.str(K.kind, s.kind);
  w.bool(K.ok, s.state !== null);
  w.figures(STATE_KEYS, xs);
  w.strings(K.defining, s.defining);
  w.str(K.pressure, s.pressure.describe);
  // The flow a mix, a supply or a process's leaving state carries: one field, where it first comes.
  let flow = false;
  if (s.kind === 'mix') {
    w.openArray(K.streams);
    for (const x of s.streams ?? []) {
      w.open(null);
      w.str(K.name, x.name);
      w.fig(K.fraction, x.fraction);
      w.fig(N.m.json, N.m.figure(x.massFlowKgS));
      w.close();
    }
    w.closeArray();
    w.fig(N.m.json, N.m.figure(s.massFlowKgS ?? null));
    flow = true;
  }
  if (s.kind === 'supply') {
    const f = s.supply;
    w.str(K.room, f?.room ?? null);
    w.fig(K.q_sensible_kW, f ? f.qSensibleW / 1000 : null);
    w.fig(K.q_latent_kW, f ? f.qLatentW / 1000 : null);
    w.fig(K.shr, f?.shr ?? null);
    w.fig(N.m.json, s.massFlowKgS ?? null);
    w.fig(K.v_m3s, f?.volumeFlowM3S ?? null);
    flow = true;
  }
  // Properties taken from states above: the offset in SI (K, kg/kg, J/kg).
  if (s.sources) {
    w.openArray(K.sources);
    for (const x of s.sources) {
      w.open(null);
      w.str(K.key, x.key);
      w.str(K.from, x.from);
      w.str(K.fromKey, x.fromKey);
      w.fig(K.offset, x.offsetSI);
      w.close();
    }
    w.closeArray();
  }
  const by = s.definedBy;
  if (by?.spec !== undefined) {
    // A state a process or recovery defines: where it came from, and the flow it carries.
    w.value(K.defined_by, { [by.statement]: by.name, from: by.from, spec: by.spec });
    if (!flow) w.fig(N.m.json, s.massFlowKgS ?? null);
  }
  writeClaims(w, s.claims);
  w.close();
}

/**
 * Whether every member {@link writeStateMembers} writes for `s` but its name, line and figures
 * depends only on its kind, whether it was computed, its defining keys and its pressure's
 * description (a state with no flow, no sources, no definition by a process and no claims).
 */
const plainState = (s: StateResult): boolean =>
  s.kind === 'state' && s.sources === undefined && s.definedBy?.spec === undefined && s.claims.length === 0;

/** A skeleton of plain states, with what its fixed members were made from. */
interface StateShape {
  /** The depth of the states (that of the array they are written in). */
  readonly depth: number;
  readonly ok: boolean;
  readonly defining: readonly string[];
  readonly describe: string;
  /** Null when no skeleton could be made (the states of this shape are written member by member). */
  readonly skeleton: JsonSkeleton | null;
}

/** At most this many skeletons are kept (the plain states of a run's notes have a few shapes). */
const MAX_STATE_SHAPES = 8;

/**
 * The skeletons of plain states (see {@link JsonSkeleton}), made from {@link writeStateMembers}
 * when a shape comes a second time running, so that a note whose states each have a pressure of
 * their own makes none; kept for the whole run, so that a run of many short notes makes each once.
 */
const stateSkeletons = {
  shapes: [] as StateShape[],
  /** The last plain state whose shape had no skeleton. */
  last: null as StateResult | null,
  /** Writes `s` from its shape's skeleton; false, with nothing written, when it has none (yet). */
  write(w: TextWriter, s: StateResult, line: number, xs: Float64Array): boolean {
    if (!plainState(s)) return false;
    const depth = w.openDepth;
    const ok = s.state !== null;
    const describe = s.pressure.describe;
    const shapes = this.shapes;
    for (let i = 0; i < shapes.length; i++) {
      const shape = shapes[i]!;
      if (
        shape.depth === depth &&
        shape.ok === ok &&
        shape.describe === describe &&
        sameStrings(shape.defining, s.defining)
      ) {
        return shape.skeleton !== null && w.skeletal(shape.skeleton, s.name, line, xs);
      }
    }
    const last = this.last;
    this.last = s;
    if (
      last === null ||
      (last.state !== null) !== ok ||
      last.pressure.describe !== describe ||
      !sameStrings(last.defining, s.defining) ||
      shapes.length >= MAX_STATE_SHAPES
    )
      return false;
    const skeleton = w.skeleton(
      STATE_FIELDS.length,
      (into, name, at, figures) => writeStateMembers(into, s, name, at, figures),
      xs[0]!,
    );
    shapes.push({ depth, ok, defining: [...s.defining], describe, skeleton });
    return skeleton !== null && w.skeletal(skeleton, s.name, line, xs);
  },
};

/** Whether two arrays of strings hold the same strings. */
function sameStrings(a: readonly string[], b: readonly string[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The claims of a state or process, when it has some. */
function writeClaims(w: JsonWriter, claims: readonly ClaimResult[]): void {
  if (claims.length === 0) return;
  w.openArray(K.claims);
  for (const c of claims) {
    w.open(null);
    w.str(K.key, c.key);
    w.bool(K.pass, c.pass);
    w.str(K.computed, c.computedText);
    w.close();
  }
  w.closeArray();
}

/** The figures of a process that keys write (names and units from the key table), in the JSON's order. */
const PROCESS_KEYED = (
  [
    ['m', (p) => p.massFlowKgS],
    ['q_total', (p) => p.qTotalW],
    ['q_sensible', (p) => p.qSensibleW],
    ['q_latent', (p) => p.qLatentW],
    ['shr', (p) => p.shr],
    ['water', (p) => p.waterKgS],
    ['q_coil', (p) => p.qCoilW],
    ['q', (p) => p.volumeFlowM3S],
  ] as const satisfies readonly (readonly [JsonKeyName, (p: ProcessResult) => number | null])[]
).map(([key, si]) => ({ ...keyed(key), si }));

/** A process (an object) in the JSON shape (heat rates in kW and water in kg/h, positive = added to the air). */
function writeProcess(w: JsonWriter, p: ProcessResult, line: number): void {
  w.open(null);
  w.str(K.name, p.name);
  w.num(K.line, line);
  w.str(K.kind, p.processKind);
  w.str(K.from, p.from);
  w.str(K.to, p.to);
  // The keys' fields, then the figures no key writes.
  for (const k of PROCESS_KEYED) w.fig(k.json, k.figure(k.si(p)));
  w.fig(K.dh_kJkg, p.dhTotal / 1000);
  w.fig(K.dw_kgkg, p.dw);
  w.fig(K.adp_C, p.apparatusDewPointC ?? null);
  if (p.bypassFactor !== null && p.bypassFactor !== undefined) w.fig(K.bf, p.bypassFactor);
  const e = p.equipment;
  if (e) {
    w.open(K.equipment);
    w.str(K.form, e.form);
    w.str(K.spec, e.spec);
    if (e.fanRiseK !== undefined) w.fig(K.fan_rise_K, e.fanRiseK);
    if (e.dryCoil !== undefined) w.bool(K.dry_coil, e.dryCoil);
    if (e.saturationEffectiveness !== undefined) w.fig(K.saturation_effectiveness, e.saturationEffectiveness);
    if (e.steamTempC !== undefined) w.fig(K.steam_C, e.steamTempC);
    if (e.steamEnthalpyJkg !== undefined) w.fig(K.steam_h_kJkg, e.steamEnthalpyJkg / 1000);
    if (e.effSensible !== undefined) w.fig(K.eff_s, e.effSensible);
    if (e.effLatent !== undefined) w.fig(K.eff_l, e.effLatent);
    if (e.wetting === null) w.value(K.wetting, null);
    else if (e.wetting !== undefined) {
      w.open(K.wetting);
      w.str(K.kind, e.wetting.kind);
      w.fig(K.surface_C, e.wetting.surfaceC);
      w.fig(K.dp_C, e.wetting.dewPointC);
      w.bool(K.accepted, e.wetting.accepted);
      w.close();
    }
    w.close();
  }
  writeClaims(w, p.claims);
  w.close();
}

/**
 * A file of the `eval --format json` document as its parts come: its items, in document order,
 * handed one at a time to `each` by `items` (which may evaluate the note as it goes), then its
 * diagnostics (read once `items` has returned).
 */
interface EvalFileParts {
  file: CheckedFile;
  units: UnitSystem;
  items(each: (item: EvaluatedItem) => void): void;
  diagnostics(): readonly CoreDiagnostic[];
}

/** The {@link EvalFileParts} of an analysed file. */
function analysedParts(f: FileResult): EvalFileParts {
  return {
    file: f,
    units: f.analysis.units,
    items: (each) => {
      // Indexed: an iterator's result objects are not always optimised away (one per item).
      const items = f.analysis.items;
      for (let i = 0; i < items.length; i++) each(items[i]!);
    },
    diagnostics: () => f.analysis.diagnostics,
  };
}

/**
 * One file of the `eval --format json` document (an object): its states and mixes, written as
 * they come, then its processes and its diagnostics.
 */
function writeEvalFile(w: JsonWriter, parts: EvalFileParts): void {
  const f = parts.file;
  const lines = new ItemLines(f);
  // The processes come after the states: each is kept with its line, found as it comes.
  const processes: ProcessResult[] = [];
  const processLines: number[] = [];
  const text = w instanceof TextWriter ? w : null;
  w.open(null);
  w.str(K.path, f.path);
  w.str(K.units, parts.units);
  w.openArray(K.states);
  parts.items((item) => {
    if (item.kind === 'process') {
      processes.push(item);
      processLines.push(lines.of(item));
    } else writeState(w, item, lines.of(item), text);
  });
  w.closeArray();
  w.openArray(K.processes);
  for (let i = 0; i < processes.length; i++) writeProcess(w, processes[i]!, processLines[i]!);
  w.closeArray();
  w.openArray(K.diagnostics);
  for (const d of parts.diagnostics()) {
    w.value(null, diagnosticJson(f, d));
  }
  w.closeArray();
  w.close();
}

/** The object of {@link writeState}. */
export function stateJson(f: FileResult, s: StateResult): Record<string, unknown> {
  const w = new ObjectWriter();
  writeState(w, s, lineOf(f, s), null);
  return w.result as Record<string, unknown>;
}

/** The object of {@link writeProcess}. */
export function processJson(f: FileResult, p: ProcessResult): Record<string, unknown> {
  const w = new ObjectWriter();
  writeProcess(w, p, lineOf(f, p));
  return w.result as Record<string, unknown>;
}

/** One file of the `eval --format json` document, as objects (see {@link writeEvalFile}). */
export function evalFileJson(f: FileResult): Record<string, unknown> {
  const w = new ObjectWriter();
  writeEvalFile(w, analysedParts(f));
  return w.result as Record<string, unknown>;
}

/**
 * One file of the `eval --format json` document as UTF-8 bytes, lent to `emit` in pieces (about
 * 64 KB each; see {@link TakePiece}), so that a large note's document is never one string or one
 * tree of objects: exactly `JSON.stringify(evalFileJson(f), null, 2)` nested `depth` levels deep
 * (every line after the first indented by `depth` levels), written without making the objects.
 */
export function evalFileText(f: FileResult, depth: number, emit: TakePiece): void {
  const w = new TextWriter(depth, emit);
  writeEvalFile(w, analysedParts(f));
  w.end();
}

/**
 * {@link evalFileText} of the note `text` read at `path`, each state written as soon as it is
 * evaluated and then let go (`analyzeHandingOut`): the same document, and a note of any length
 * costs about as much memory as a short one. Returns the note's diagnostic counts; null, with
 * nothing written, for a note that has to be analysed whole (see `analyzeHandingOut`).
 */
export function evalNoteText(
  path: string,
  text: string,
  settings: Partial<EvaluateSettings>,
  depth: number,
  emit: TakePiece,
): Counts | null {
  const evaluation = analyzeHandingOut(text, settings);
  if (!evaluation) return null;
  let diagnostics: readonly CoreDiagnostic[] = [];
  const w = new TextWriter(depth, emit);
  // The note's line index is made only if a diagnostic needs it (the items' lines are counted).
  let lines: LineIndex | undefined;
  writeEvalFile(w, {
    file: {
      path,
      text,
      get lines() {
        lines ??= new LineIndex(text);
        return lines;
      },
    },
    units: evaluation.units,
    items: (each) => {
      diagnostics = evaluation.run(each).diagnostics;
    },
    diagnostics: () => diagnostics,
  });
  w.end();
  return diagnosticCounts(diagnostics);
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
