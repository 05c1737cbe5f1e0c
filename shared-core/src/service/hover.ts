/**
 * Hover: on a state (its name, keyword, values or a reference to it) a compact table of every
 * property with the pressure basis, enthalpy datum, claims and method; on a mix its streams and
 * result; on a process its kind, flows and duties; on a key, unit, keyword or `units:` word what
 * it means in a line or two. Results end with a one-line caution.
 */
import { findKey } from '../vocabulary/keys';
import { boilingPoint, iceWetBulbAlternative } from '../physics';
import type { ClaimResult, EvaluatedItem, ProcessResult, PropertySource, StateResult } from '../evaluate/types';
import type { PropertyNode, Statement } from '../notation/ast';
import type { Span } from '../text/types';
import { describeUnit, figure, lookupUnit, ratioFigure } from '../units';
import type { Dimension, UnitSystem } from '../units/types';
import type { MoistAirState } from '../physics/types';
import { aboveBoilingPoint } from '../evaluate/solve';
import { STATE_FIGURE_DIMENSION } from '../present/rows';
import type { RowKey } from '../vocabulary/keys';
import {
  CAUTION_LINE,
  PROCESS_KIND_TEXT,
  STATE_ROWS,
  datumLine,
  md,
  methodLine,
  otherSystem,
  show,
  showClaim,
  showDifference,
  showHeat,
  showRatio,
  showWaterRate,
} from './format';
import { itemOf, overlaps, propsOf, targetAt } from './note';
import type { CancellationFlag, Note } from './types';

/** What a hover shows: Markdown text and the span it is about. */
export interface HoverInfo {
  markdown: string;
  span: Span;
}

/** One or two lines on each statement keyword. */
const KEYWORD_TEXT: Record<Statement['keyword'], string> = {
  site:
    '`site:` sets the barometric pressure for the statements after it: ' +
    '`p=` a pressure, or `elev=` an elevation (standard atmosphere).',
  units:
    '`units:` chooses the unit system in which this note’s ' +
    'results are shown (`SI` or `IP`); input may mix units freely.',
  state:
    '`state NAME: …` a moist-air state. Two independent properties fix it; `p=`/`elev=` ' +
    'override the site pressure; every further property is a claim, computed and compared.',
  mix:
    '`mix NAME: A X + B Y …` adiabatic mixing of named states by dry-air mass fraction (`30%`), dry-air ' +
    'mass flow (`kg/s`, `lb/h`) or volume flow (`L/s`, `m3/s`, `cfm`) at each stream’s own state.',
  supply:
    '`supply NAME: ROOM q_sensible=… q_latent=… db=…` the supply state and dry-air ' +
    'flow that absorb the room’s sensible and latent gains; give the supply dry-bulb ' +
    '(`db=`) or the flow (`m=` or `q=` at the supply state) and the other follows.',
  process:
    '`process NAME: A -> B [m=… | q=…]` a process between two named states at one dry-air ' +
    'flow: heat rates, sensible heat ratio, moisture added or removed, and the kind of ' +
    'process. When B is a new name, the process defines it from its specification (`heat=`, ' +
    '`dt=`, `db=`, `dp_fan=` with `eff=`, `adp=` with `bf=`, `steam`, `adiabatic`).',
  recover:
    '`recover NAME: A -> A2, B -> B2 eff_s=… [eff_l=…]` heat (and moisture) recovery ' +
    'between two streams, by effectiveness on the smaller capacity rate; defines ' +
    'both leaving states. `fog=ok` accepts condensation or frost on the cooled side.',
};

/** The written text of a property (`rh=45%`). */
function written(note: Note, prop: PropertyNode): string {
  return note.text.slice(prop.span.start, prop.span.end);
}

/**
 * A claim's verdict in a few words, judged and reported in the unit the engineer wrote:
 * `rh=45%` ✓ computed 45.2 % (band ±0.5 %), `shr=0.89` ✗ computed 0.873 (band ±0.005).
 */
function claimVerdict(note: Note, claim: ClaimResult): string {
  const shown = showClaim(note, claim);
  const computed = shown ? shown.computed : claim.computedText;
  const band = shown ? ` (band ${shown.band})` : '';
  return claim.pass
    ? `${code(written(note, claim.prop))} ✓ computed ${computed}${band}`
    : `${code(written(note, claim.prop))} ✗ computed ${computed}${band} — stale claim`;
}

/** Keys that set the pressure or the flow rather than being claims. */
const NOT_CLAIMS = new Set(['p', 'elev', 'm', 'q']);

function claimsBlock(note: Note, item: EvaluatedItem): string[] {
  const claims = item.claims;
  if (!note.settings.checkClaims) {
    const defining = new Set<string>(item.kind === 'process' ? [] : item.defining);
    const written = propsOf(item.statement).some((p) => !defining.has(p.key) && !NOT_CLAIMS.has(p.key));
    const file = note.settings.sources?.checkClaims;
    return written
      ? [
          `Claims: not checked ` +
            `(${file ? `checkClaims is false in ${md(file)}` : 'setting dewmark.checkClaims is off'}).`,
        ]
      : [];
  }
  if (claims.length === 0) return [];
  return ['Claims:', ...claims.map((c) => `- ${claimVerdict(note, c)}`)];
}

function pressureLine(note: Note, item: StateResult, system: UnitSystem): string {
  const p = show(note, item.pressure.pa, 'pressure', system);
  return `Pressure: ${p} — ${md(item.pressure.origin)}`;
}

/** Problems reported on a statement, for a hover on something that could not be computed. */
function problemsOf(note: Note, statement: Statement): string[] {
  return note.analysis.diagnostics
    .filter((d) => d.severity === 'error' && overlaps(d.span, statement.span))
    .map((d) => `- ${md(d.message)}`);
}

/** The dimension of a defining key (the kind a reference's difference is in). */
const SOURCE_DIMENSION: Readonly<Record<string, Dimension>> = Object.fromEntries(
  (['db', 'wb', 'dp', 'rh', 'w', 'h'] as const).map((k) => [k, STATE_FIGURE_DIMENSION[k]]),
);

/** How a state came from another: ` (from RA via SA)` when a statement defined it from one, else ''. */
function viaText(note: Note, name: string): string {
  const item = note.analysis.byName.get(name);
  if (!item || item.kind === 'process' || !item.definedBy) return '';
  return ` (from ${md(item.definedBy.from)} via ${md(item.definedBy.name)})`;
}

/** `w from OA`, `db from OFF + 0.8 K` (and how OFF came about, when a statement defined it from another state). */
function sourceText(note: Note, src: PropertySource, system: UnitSystem): string {
  const dim = SOURCE_DIMENSION[src.fromKey];
  let offset = '';
  if (src.offsetSI !== 0 && dim) {
    // A temperature difference in SI is in kelvin (a °C figure would read as a temperature).
    const text =
      dim === 'temperature' && system === 'SI'
        ? figure(Math.abs(src.offsetSI), dim, system, {
            unit: lookupUnit('K')!,
            difference: true,
            extraDigits: note.settings.extraDigits,
          }).text
        : showDifference(note, Math.abs(src.offsetSI), dim, system);
    offset = ` ${src.offsetSI < 0 ? '−' : '+'} ${text}`;
  }
  const from = src.fromKey === src.key ? md(src.from) : `${md(src.from)}.${src.fromKey}`;
  return `${src.key} from ${from}${offset}${viaText(note, src.from)}`;
}

/** The lines saying where a state's referenced properties came from. */
function sourcesBlock(note: Note, item: StateResult, system: UnitSystem): string[] {
  const lines: string[] = [];
  if (item.definedBy)
    lines.push(
      `Defined by ${md(item.definedBy.statement)} ${md(item.definedBy.name)} ` +
        `from ${md(item.definedBy.from)}${viaText(note, item.definedBy.from)}` +
        `${item.definedBy.spec ? ` (${code(item.definedBy.spec)})` : ''}.`,
    );
  if (item.sources && item.sources.length > 0)
    lines.push(`Taken from states above: ${item.sources.map((s) => sourceText(note, s, system)).join('; ')}.`);
  return lines;
}

/** The pairs of figures of the compact table, two to a row: temperatures and enthalpy left, moisture right. */
const HOVER_PAIRS: readonly (readonly [RowKey, RowKey | null])[] = pairsOf(
  ['db', 'wb', 'dp', 'h', 'rho'],
  ['rh', 'w', 'pw', 'v', 'mu'],
);

/** The preferred pairs, then any other row of the key table by itself (a row added later is never lost). */
function pairsOf(left: readonly RowKey[], right: readonly RowKey[]): (readonly [RowKey, RowKey | null])[] {
  const pairs: [RowKey, RowKey | null][] = left.map((k, i) => [k, right[i] ?? null]);
  for (const r of STATE_ROWS) if (!left.includes(r.key) && !right.includes(r.key)) pairs.push([r.key, null]);
  return pairs;
}

/**
 * The degree of saturation has no value at or above the boiling point: air there cannot be
 * saturated, so the saturation humidity ratio Ws it divides by does not exist.
 */
function muUndefined(state: MoistAirState): boolean {
  return aboveBoilingPoint(state);
}

/**
 * The figures of a state first, compact: two figures to a row, each as its key, its value
 * (right-aligned) and its unit (left-aligned) with a short mark — `given`, `✓`/`✗` for a claim,
 * `← OA` for a figure taken from another state, `frost point`, `over ice` — under a header row that
 * names the state, so every figure is in five rows. With secondary units, one figure to a row in
 * both systems. The reasons behind a figure (a wet-bulb with two roots, a degree of saturation that
 * does not exist) follow the table.
 */
function stateTable(note: Note, item: StateResult, system: UnitSystem, title: string): string[] {
  const state = item.state!;
  const secondary = note.settings.secondaryUnits ? otherSystem(system) : null;
  // A mix's w and h come from the balance, not from the note: nothing is marked as given.
  const given = new Set<string>(item.kind === 'state' ? item.defining : []);
  const sources = new Map((item.sources ?? []).map((s) => [s.key, s]));
  const claims = new Map(item.claims.map((c) => [c.key, c]));
  const mark = (key: RowKey): string => {
    const marks: string[] = [];
    if (key === 'dp' && state.dpFrost) marks.push('frost point');
    if (key === 'wb' && state.wbIce) marks.push('over ice');
    const claim = claims.get(key);
    const source = sources.get(key);
    if (source) marks.push(`← ${md(source.from)}`);
    else if (claim && note.settings.checkClaims) marks.push(claim.pass ? '✓' : '✗');
    else if (given.has(key)) marks.push('given');
    return marks.length > 0 ? ` ${marks.join(', ')}` : '';
  };
  const cellsOf = (key: RowKey, sys: UnitSystem): [string, string] => {
    const row = STATE_ROWS.find((r) => r.key === key)!;
    if (key === 'mu' && muUndefined(state)) return ['—', ''];
    const f = figure(row.value(state), row.dimension, sys, { extraDigits: note.settings.extraDigits });
    return [f.value, f.unit];
  };
  const rows: string[] = [];
  if (secondary) {
    rows.push(`| ${title} | ${system} | | ${secondary} | |`, '|:--|--:|:--|--:|:--|');
    for (const r of STATE_ROWS) {
      const [v, u] = cellsOf(r.key, system);
      const [v2, u2] = cellsOf(r.key, secondary);
      rows.push(`| \`${r.key}\` | ${v} | ${u}${mark(r.key)} | ${v2} | ${u2} |`);
    }
  } else {
    rows.push(`| ${title} | | | | | |`, '|:--|--:|:--|:--|--:|:--|');
    for (const [a, b] of HOVER_PAIRS) {
      const [va, ua] = cellsOf(a, system);
      const right = b
        ? (() => {
            const [vb, ub] = cellsOf(b, system);
            return `\`${b}\` | ${vb} | ${ub}${mark(b)}`;
          })()
        : ' | | ';
      rows.push(`| \`${a}\` | ${va} | ${ua}${mark(a)} | ${right} |`);
    }
  }
  if (state.fog)
    rows.push(
      '',
      '⚠ Fog region: the air holds more water than saturated air can carry as vapour; w is the total water.',
    );
  if (muUndefined(state)) {
    let boiling = '';
    try {
      boiling = ` (${show(note, boilingPoint(state.p), 'temperature', system)})`;
    } catch {
      // a pressure without a boiling point in range: the sentence reads without the figure
    }
    rows.push(
      '',
      `\`mu\` —: not defined. The dry-bulb ${show(note, state.db, 'temperature', system)} is at or above ` +
        `the boiling point at ${show(note, state.p, 'pressure', system)}${boiling}: this air cannot be ` +
        `saturated, so it has no saturation humidity ratio Ws to compare W with. Every other figure holds.`,
    );
  }
  // Near 0 °C both wick equations can solve: the one over water is reported, the other shown.
  const iceWb = state.fog ? null : iceWetBulbAlternative(state.db, state.w, state.p, state.wb, state.dp);
  if (iceWb !== null) {
    rows.push(
      '',
      `Wet-bulb: over water (eq 33) ${show(note, state.wb, 'temperature', system)}, ` +
        `reported; over ice (eq 35) ${show(note, iceWb, 'temperature', system)} ` +
        `also solves near ${show(note, 0, 'temperature', system)}.`,
    );
  }
  return rows;
}

/** The head of a supply's hover: the room loads, the room SHR and the flow it takes to absorb them. */
function supplyHead(note: Note, item: StateResult, system: UnitSystem): string[] {
  const out = [
    `**supply ${md(item.name)}** — supply air for the loads ` +
      `of ${md((item.statement.keyword === 'supply' && item.statement.room?.text) || '?')}`,
  ];
  const f = item.supply;
  if (!f || item.massFlowKgS === undefined || item.massFlowKgS === null) return out;
  const volumeUnit = system === 'SI' ? (f.volumeFlowM3S < 1 ? 'L/s' : 'm3/s') : 'cfm';
  const givenText = f.given === 'db' ? 'supply dry-bulb' : f.given === 'm' ? 'dry-air mass flow' : 'volume flow';
  out.push(
    '',
    '| | |',
    '|---|--:|',
    `| room sensible gain | ${show(note, f.qSensibleW, 'power', system)} |`,
    `| room latent gain | ${show(note, f.qLatentW, 'power', system)} |`,
    `| room SHR | ${f.shr === null ? '—' : showRatio(note, f.shr)} |`,
    `| dry-air flow | ${show(note, item.massFlowKgS, 'massFlow', system)}${f.given === 'm' ? ' (given)' : ''} |`,
    `| volume flow at ${md(item.name)} | ${show(note, f.volumeFlowM3S, 'volumeFlow', system, lookupUnit(volumeUnit))}` +
      `${f.given === 'q' ? ' (given)' : ''} |`,
    '',
    `Found from the ${givenText} and the loads; a process from ${md(item.name)} to ${md(f.room)} at this flow ` +
      `gives the loads back (sensible with the moist-air cp at ${md(item.name)}'s W).`,
  );
  return out;
}

function stateHover(note: Note, item: StateResult): string {
  const system = note.analysis.units;
  const out: string[] = [];
  const name = md(item.name);
  if (!item.state) {
    out.push(`**${item.kind} ${name}**`, '', 'Not computed:', ...problemsOf(note, item.statement));
    return out.join('\n');
  }
  // Figures first: the table opens the hover (for a supply, after the loads it was found from).
  if (item.kind === 'supply') out.push(...supplyHead(note, item, system), '');
  const title =
    item.kind === 'mix'
      ? `**mix ${name}** — adiabatic mixing`
      : item.kind === 'supply'
        ? `supply state ${name}`
        : `**state ${name}**`;
  out.push(...stateTable(note, item, system, title));
  if (item.kind === 'mix' && item.streams && item.streams.length > 0) {
    out.push('', '| stream | dry-air fraction | dry-air flow |', '|:--|--:|--:|');
    for (const s of item.streams) {
      const flow = s.massFlowKgS === null ? '—' : show(note, s.massFlowKgS, 'massFlow', system);
      out.push(`| ${md(s.name)} | ${show(note, s.fraction, 'fraction', system)} | ${flow} |`);
    }
    if (item.massFlowKgS !== undefined && item.massFlowKgS !== null)
      out.push(`| total | | ${show(note, item.massFlowKgS, 'massFlow', system)} |`);
  }
  const sources = sourcesBlock(note, item, system);
  if (sources.length > 0) out.push('', ...sources);
  out.push('', pressureLine(note, item, system));
  const claims = claimsBlock(note, item);
  if (claims.length > 0) out.push('', ...claims);
  const datum = [datumLine(system), ...(note.settings.secondaryUnits ? [datumLine(otherSystem(system))] : [])];
  out.push('', `${methodLine(system)} ${datum.join(' ')}`, '', '---', CAUTION_LINE);
  return out.join('\n');
}

/** Rows for the equipment of a process that defined its leaving state, and the coil's ADP. */
function equipmentRows(note: Note, item: ProcessResult, system: UnitSystem): [string, string][] {
  const rows: [string, string][] = [];
  const e = item.equipment;
  // A plain ratio at `decimals` places (plus the note's extra digits), by the one figure formatter.
  const plain = (x: number, decimals: number): string =>
    ratioFigure(x, decimals - 2 + (note.settings.extraDigits ?? 0)).text;
  if (item.apparatusDewPointC !== null && item.apparatusDewPointC !== undefined) {
    rows.push(['apparatus dew point', show(note, item.apparatusDewPointC, 'temperature', system)]);
    if (item.bypassFactor !== null && item.bypassFactor !== undefined)
      rows.push([
        'bypass factor (contact factor)',
        `${plain(item.bypassFactor, 3)} (${plain(1 - item.bypassFactor, 3)})`,
      ]);
  }
  if (!e) return rows;
  if (e.fanRiseK !== undefined)
    rows.push(['fan temperature rise', showDifference(note, e.fanRiseK, 'temperature', system)]);
  if (e.dryCoil) rows.push(['coil surface', 'dry (ADP at or above the entering dew point)']);
  if (e.saturationEffectiveness !== undefined && e.saturationEffectiveness !== null)
    rows.push(['saturation effectiveness', plain(e.saturationEffectiveness, 3)]);
  if (e.steamTempC !== undefined)
    rows.push([
      'steam supply',
      `saturated at ${show(note, e.steamTempC, 'temperature', system)}, ` +
        `h ${show(note, e.steamEnthalpyJkg ?? 0, 'enthalpy', system)}`,
    ]);
  if (e.effSensible !== undefined) {
    rows.push([
      'effectiveness',
      `sensible ${plain(e.effSensible, 2)}` +
        `${e.effLatent !== null && e.effLatent !== undefined ? `, latent ${plain(e.effLatent, 2)}` : ''} ` +
        '(on the smaller capacity rate)',
    ]);
  }
  if (e.wetting) {
    rows.push([
      e.wetting.kind === 'frost' ? 'frost' : 'condensation',
      `surface about ${show(note, e.wetting.surfaceC, 'temperature', system)}, ` +
        `dew point ${show(note, e.wetting.dewPointC, 'temperature', system)}` +
        `${e.wetting.accepted ? ' (accepted: fog=ok)' : ''}`,
    ]);
  }
  return rows;
}

/** A magnitude with the sign of `x` in front (`+1.2 …`, `−1.2 …`, none for zero). */
function signed(x: number, magnitude: string): string {
  if (/^0(\.0*)? /.test(magnitude)) return magnitude;
  return `${x < 0 ? '−' : '+'}${magnitude}`;
}

/** Text as a Markdown code span (longer fences when it holds backticks). */
function code(text: string): string {
  const fence = text.includes('`') ? '``' : '`';
  return `${fence}${text.includes('`') ? ` ${text} ` : text}${fence}`;
}

function heat(note: Note, w: number | null, system: UnitSystem): string {
  if (w === null) return '—';
  const mag = showHeat(note, Math.abs(w), system);
  if (Math.abs(w) < 1e-9) return mag;
  return `${mag} ${w > 0 ? 'added' : 'removed'}`;
}

function processHover(note: Note, item: ProcessResult, footer = true): string {
  const system = note.analysis.units;
  const kind = item.processKind ? PROCESS_KIND_TEXT[item.processKind] : 'kind unknown';
  const keyword = item.statement.keyword === 'recover' ? 'recover' : 'process';
  const out = [`**${keyword} ${md(item.name)}** — ${kind}, ${md(item.from)} → ${md(item.to)}`, ''];
  if (item.equipment) out.push(`Defines ${md(item.to)} from ${code(item.equipment.spec)}.`, '');
  const rows: [string, string][] = [];
  if (item.massFlowKgS !== null) {
    let flow = show(note, item.massFlowKgS, 'massFlow', system);
    if (item.volumeFlowM3S !== null)
      flow += ` (${show(note, item.volumeFlowM3S, 'volumeFlow', system)} at ${md(item.from)})`;
    rows.push(['dry-air flow', flow]);
    rows.push(['total heat', heat(note, item.qTotalW, system)]);
    rows.push(['sensible heat', heat(note, item.qSensibleW, system)]);
    if (!item.moistureUnchanged) rows.push(['latent heat', heat(note, item.qLatentW, system)]);
  } else {
    rows.push(['dry-air flow', 'not given (add `m=` or `q=` for heat rates)']);
  }
  rows.push(['sensible heat ratio', item.shr === null ? '— (no net heat)' : showRatio(note, item.shr)]);
  rows.push([
    'Δh per kg dry air',
    signed(item.dhTotal, showDifference(note, Math.abs(item.dhTotal), 'enthalpy', system)),
  ]);
  const perKgW = showDifference(note, Math.abs(item.dw), 'humidityRatio', system);
  if (item.moistureUnchanged) {
    rows.push(['Δw', 'no moisture change (the two humidity ratios differ by less than their written figures resolve)']);
  } else {
    rows.push(['Δw', `${signed(item.dw, perKgW)}${item.dw < 0 ? ' (removed)' : item.dw > 0 ? ' (added)' : ''}`]);
  }
  if (item.waterKgS !== null && !item.moistureUnchanged) {
    const rate = showWaterRate(note, Math.abs(item.waterKgS), system);
    rows.push([item.waterKgS < 0 ? 'condensate' : 'water added', item.waterKgS === 0 ? '—' : rate]);
  }
  if (item.qCoilW !== null) rows.push(['coil duty incl. water', heat(note, item.qCoilW, system)]);
  rows.push(...equipmentRows(note, item, system));
  out.push('| | |', '|---|--:|', ...rows.map(([a, b]) => `| ${a} | ${b} |`));
  const claims = claimsBlock(note, item);
  if (claims.length > 0) out.push('', ...claims);
  if (!footer) return out.join('\n');
  out.push('', 'Heat rates are positive when heat is added to the air; steady flow, one dry-air flow.');
  out.push('', methodLine(system), '', '---', CAUTION_LINE);
  return out.join('\n');
}

/** A heat recovery: both sides, one after the other, with one footer. */
function recoverHover(note: Note, item: ProcessResult): string {
  const sides = note.analysis.items.filter(
    (i): i is ProcessResult => i.kind === 'process' && i.statement === item.statement,
  );
  if (sides.length < 2) return processHover(note, item);
  return [
    ...sides.slice(0, -1).map((x) => processHover(note, x, false)),
    processHover(note, sides[sides.length - 1]!),
  ].join('\n\n');
}

/** The hover of an evaluated item (state, mix or process). */
export function itemHover(note: Note, item: EvaluatedItem): string {
  if (item.kind === 'process')
    return item.statement.keyword === 'recover' ? recoverHover(note, item) : processHover(note, item);
  return stateHover(note, item);
}

/** A site line: the pressure it sets, as the first state after it uses it. */
function siteHover(note: Note, statement: Statement): string {
  const system = note.analysis.units;
  const user = note.analysis.items.find(
    (i): i is StateResult =>
      i.kind !== 'process' &&
      i.pressure.source === 'site' &&
      i.pressure.span !== null &&
      overlaps(i.pressure.span, statement.span),
  );
  if (!user) return KEYWORD_TEXT.site;
  const p = user.pressure;
  const lines = [
    `**site** — ${show(note, p.pa, 'pressure', system)} ` +
      `(${show(note, p.pa, 'pressure', otherSystem(system))}) for the statements after it`,
  ];
  if (p.elevationM !== null)
    lines.push(
      '',
      `From the elevation ${show(note, p.elevationM, 'length', system)} ` +
        `by the standard atmosphere (ASHRAE Handbook—Fundamentals Ch. 1).`,
    );
  lines.push('', md(p.origin));
  return lines.join('\n');
}

function statementHover(note: Note, statement: Statement, span: Span): HoverInfo | null {
  const item = itemOf(note, statement);
  if (item) return { markdown: itemHover(note, item), span };
  if (statement.keyword === 'site') return { markdown: siteHover(note, statement), span };
  if (statement.keyword === 'units') return { markdown: KEYWORD_TEXT.units, span };
  const problems = problemsOf(note, statement);
  const name = 'name' in statement && statement.name ? ` ${md(statement.name.text)}` : '';
  const head = `**${statement.keyword}${name}** — not computed`;
  return { markdown: [head, '', ...problems].join('\n'), span };
}

/**
 * On `.w` of `w=OA.w` (or its difference): where the value comes from and what it is now, then
 * the hover of the state it names.
 */
function propertyRefHover(note: Note, statement: Statement, prop: PropertyNode, span: Span): HoverInfo {
  const system = note.analysis.units;
  let item = itemOf(note, statement);
  // On a process that defines its leaving state, the references are that state's.
  if (item?.kind === 'process' && statement.keyword === 'process' && statement.to) {
    const leaving = note.analysis.byName.get(statement.to.text);
    item = leaving?.statement === statement ? leaving : undefined;
  }
  const src = item && item.kind !== 'process' ? item.sources?.find((s) => s.key === prop.key) : undefined;
  const written = code(note.text.slice(prop.span.start, prop.span.end));
  const dim = SOURCE_DIMENSION[prop.key];
  if (!src || !dim) {
    const problems = problemsOf(note, statement);
    return { markdown: [`${written} — not taken: the reference could not be used`, '', ...problems].join('\n'), span };
  }
  const lines = [`${written} — ${sourceText(note, src, system)}: ${show(note, src.valueSI, dim, system)}`];
  const from = note.analysis.byName.get(src.from);
  if (from) lines.push('', '---', '', itemHover(note, from));
  return { markdown: lines.join('\n'), span };
}

/** The hover at `offset`, or null where there is nothing to say. */
export function hover(note: Note, offset: number, token?: CancellationFlag): HoverInfo | null {
  if (token?.isCancellationRequested) return null;
  const target = targetAt(note, offset);
  if (!target) return null;
  switch (target.kind) {
    case 'keyword': {
      const item = itemOf(note, target.statement);
      if (item) return { markdown: itemHover(note, item), span: target.span };
      return { markdown: KEYWORD_TEXT[target.statement.keyword], span: target.span };
    }
    case 'definition':
      return statementHover(note, target.statement, target.name.span);
    case 'reference': {
      const item = note.analysis.byName.get(target.name.text);
      if (!item || item.statement.span.start > target.statement.span.start) {
        return {
          markdown:
            `\`${md(target.name.text)}\` is not defined before ` +
            `this line (names must be defined earlier in the note).`,
          span: target.name.span,
        };
      }
      return { markdown: itemHover(note, item), span: target.name.span };
    }
    case 'key': {
      const key = target.prop.key;
      const spec = findKey(key);
      // A computed property (rho, pw, mu) is not a key that can be written: no hover on it.
      const text = spec && spec.in.length > 0 ? spec.description : undefined;
      if (!text) return null;
      return { markdown: `\`${md(key)}\` — ${text}.`, span: target.span };
    }
    case 'unit': {
      const text = describeUnit(target.unit.text);
      if (!text) return null;
      return { markdown: text.split('\n').map(md).join('  \n'), span: target.unit.span };
    }
    case 'system': {
      const sys = target.name.text;
      if (sys !== 'SI' && sys !== 'IP') return null;
      const units =
        sys === 'SI'
          ? '°C, kPa, g/kg, kJ/kg, m³/kg, kg/s, m³/s, kW'
          : '°F, psia, gr/lb, Btu/lb, ft³/lb, lb/h, cfm, Btu/h';
      return {
        markdown: `Results of this note are shown in ${sys} units (${units}).\n\n${datumLine(sys)}`,
        span: target.name.span,
      };
    }
    case 'value':
      return statementHover(note, target.statement, target.span);
    case 'propertyRef':
      return propertyRefHover(note, target.statement, target.prop, target.span);
    case 'statement':
      return statementHover(note, target.statement, target.statement.span);
  }
}
