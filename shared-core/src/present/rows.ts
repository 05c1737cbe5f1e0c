/**
 * The results rows: every figure of a state, mix or process, formatted once, with its unit and
 * precision (see `figure` in `units/`). The three tables that show results are thin renderers of
 * these rows — the preview and the Markdown tables written into a note (`./blockResults`,
 * `./resultsTable`), the terminal tables of `dewmark eval` and the HTML report (`cli/`) — and the
 * hints and hovers take their figures from the same functions, so a figure reads the same in all
 * of them: the same unit, the same precision, the same minus sign, the same words for a kind.
 * Pure: results in, strings out.
 */
import type { ClaimResult, ProcessKind, ProcessResult, StateResult } from '../evaluate/types';
import {
  bandFigure,
  claimFigure,
  displaySymbol,
  displayUnit,
  figure,
  lookupUnit,
  noFigure,
  ratioFigure,
  type Figure,
} from '../units';
import type { Dimension, UnitDef, UnitSystem } from '../units/types';
import { findKey } from '../vocabulary/keys';
import { aboveBoilingPoint } from '../evaluate/solve';

export type { Figure } from '../units';

/** Words for each kind of process (hovers, hints, preview, written and terminal tables, report). */
export const PROCESS_KIND_TEXT: Record<ProcessKind, string> = {
  'sensible-heating': 'sensible heating',
  'sensible-cooling': 'sensible cooling',
  'cooling-dehumidifying': 'cooling and dehumidifying',
  'heating-humidifying': 'heating and humidifying',
  'heating-dehumidifying': 'heating and dehumidifying',
  'cooling-humidifying': 'cooling and humidifying',
  'evaporative-cooling': 'evaporative cooling',
  humidifying: 'humidifying',
  dehumidifying: 'dehumidifying',
  'no-change': 'no change of state',
};

/** The kind of a process in words, `—` when it is not known. */
export function processKindText(kind: ProcessKind | null): string {
  return kind ? PROCESS_KIND_TEXT[kind] : '—';
}

/** The figures of a state row, by property key. */
export type StateFigureKey = 'p' | 'db' | 'wb' | 'dp' | 'rh' | 'w' | 'h' | 'v' | 'rho' | 'pw' | 'mu';

/** What each figure of a state measures. */
export const STATE_FIGURE_DIMENSION: Readonly<Record<StateFigureKey, Dimension>> = {
  p: 'pressure',
  db: 'temperature',
  wb: 'temperature',
  dp: 'temperature',
  rh: 'fraction',
  w: 'humidityRatio',
  h: 'enthalpy',
  v: 'specificVolume',
  rho: 'density',
  pw: 'pressure',
  mu: 'fraction',
};

/** Options of the rows. */
export interface RowOptions {
  /** Decimals added to every figure's usual precision (the editor setting `dewmark.extraDigits`). */
  extraDigits?: number;
}

/** One state or mix, every figure formatted. */
export interface StateRow {
  kind: StateResult['kind'];
  name: string;
  /** `ok`, `fog` (supersaturated, still computed) or `failed` (not computed: see the problems). */
  status: 'ok' | 'fog' | 'failed';
  /** Every property; `—` figures when the state was not computed (the pressure is always known). */
  figures: Readonly<Record<StateFigureKey, Figure>>;
  /** The wet-bulb is over ice; the dew point is a frost point. */
  wbIce: boolean;
  dpFrost: boolean;
  /** The two properties that fixed the state (for a mix, those of the balance). */
  defining: readonly string[];
  /** For a mix: each stream's dry-air mass fraction and flow (`—` when given as fractions). */
  streams: readonly { name: string; fraction: Figure; flow: Figure }[];
  /** For a mix given by flows: the total dry-air flow; `—` otherwise. */
  massFlow: Figure;
  /** For a state a process or heat recovery defines: `from A via HX`; null otherwise. */
  origin: string | null;
  /**
   * Where the state came from, in a few words (the terminal table's "from" column): the streams
   * of a mix (`OA 25.0 % + RA 75.0 %`), a supply's room and flow (`supply from RA loads, 4.60 kg/s`),
   * the statement that defined it from another state (`CC from MA`, `HX from OA`), or the
   * properties that fixed it, each taken one named with its state (`db+wb`, `db, w from OA`,
   * `db+w from MA`); `not computed` when it failed.
   */
  source: string;
}

/** One process, every figure formatted (positive = added to the air). */
export interface ProcessRow {
  name: string;
  from: string;
  to: string;
  /** The kind in words (`cooling and dehumidifying`), `—` when unknown. */
  kind: string;
  /**
   * The kind with the apparatus dew point when there is one (`cooling and dehumidifying, ADP
   * 9.4 °C`), for the results tables.
   */
  kindWithAdp: string;
  /** False when no flow was given: the heat and water figures are then per unit mass of dry air. */
  hasFlow: boolean;
  massFlow: Figure;
  volumeFlow: Figure;
  /** Heat rates (kW, Btu/h), or enthalpy changes per unit mass of dry air without a flow. */
  total: Figure;
  sensible: Figure;
  latent: Figure;
  /** Sensible heat ratio, a plain ratio at two decimals. */
  shr: Figure;
  /** Water added (+) or condensate (−) in kg/h or lb/h, or the humidity-ratio change without a flow. */
  water: Figure;
  /** Coil or heater duty including the water's enthalpy; `—` without a flow. */
  coil: Figure;
  /** Enthalpy and humidity-ratio change per unit mass of dry air. */
  dh: Figure;
  dw: Figure;
  /** Apparatus dew point, when moisture is removed and the line meets saturation. */
  adp: Figure;
}

/** The unit of water rates (condensate, humidifier water): kg/h in SI, lb/h in IP. */
export function waterUnit(system: UnitSystem): UnitDef {
  return lookupUnit(system === 'SI' ? 'kg/h' : 'lb/h')!;
}

/** A heat rate, W (a rate from an enthalpy difference). */
export function heatFigure(w: number | null | undefined, system: UnitSystem, opts: RowOptions = {}): Figure {
  return figure(w, 'power', system, { difference: true, extraDigits: opts.extraDigits });
}

/** A water rate, kg/s, in kg/h or lb/h. */
export function waterFigure(kgPerS: number | null | undefined, system: UnitSystem, opts: RowOptions = {}): Figure {
  return figure(kgPerS, 'massFlow', system, {
    unit: waterUnit(system),
    difference: true,
    extraDigits: opts.extraDigits,
  });
}

/** One figure of a state property, SI in. */
export function stateFigure(
  key: StateFigureKey,
  si: number | null | undefined,
  system: UnitSystem,
  opts: RowOptions = {},
): Figure {
  return figure(si, STATE_FIGURE_DIMENSION[key], system, { extraDigits: opts.extraDigits });
}

/** The row of a state or mix in `system`. */
export function stateRow(item: StateResult, system: UnitSystem, opts: RowOptions = {}): StateRow {
  const st = item.state;
  const f = (key: StateFigureKey, si: number | undefined): Figure => stateFigure(key, si, system, opts);
  const figures: Record<StateFigureKey, Figure> = {
    p: f('p', item.pressure.pa),
    db: f('db', st?.db),
    wb: f('wb', st?.wb),
    dp: f('dp', st?.dp),
    rh: f('rh', st?.rh),
    w: f('w', st?.w),
    h: f('h', st?.h),
    v: f('v', st?.v),
    rho: f('rho', st?.rho),
    pw: f('pw', st?.pw),
    // Not defined at or above the boiling point (no saturation humidity ratio): shown as —, never 0.
    mu: f('mu', st && !aboveBoilingPoint(st) ? st.mu : undefined),
  };
  const massFlow = (kgS: number | null | undefined): Figure =>
    figure(kgS, 'massFlow', system, { extraDigits: opts.extraDigits });
  const streams = (item.streams ?? []).map((s) => ({
    name: s.name,
    fraction: figure(s.fraction, 'fraction', system, { extraDigits: opts.extraDigits }),
    flow: massFlow(s.massFlowKgS),
  }));
  return {
    kind: item.kind,
    name: item.name,
    status: st === null ? 'failed' : st.fog ? 'fog' : 'ok',
    figures,
    wbIce: st?.wbIce ?? false,
    dpFrost: st?.dpFrost ?? false,
    defining: item.defining,
    streams,
    massFlow: massFlow(item.massFlowKgS),
    origin: item.definedBy ? `from ${item.definedBy.from} via ${item.definedBy.name}` : null,
    source: sourceText(item, streams, massFlow(item.massFlowKgS)),
  };
}

/** The `source` of a state row (see {@link StateRow.source}). */
function sourceText(item: StateResult, streams: StateRow['streams'], flow: Figure): string {
  if (item.state === null) return 'not computed';
  if (item.kind === 'mix') return streams.map((x) => `${x.name} ${x.fraction.text}`).join(' + ');
  if (item.kind === 'supply') {
    const room = item.supply?.room;
    return room ? `supply from ${room} loads, ${flow.text}` : 'supply';
  }
  if (item.definedBy) return `${item.definedBy.name} from ${item.definedBy.from}`;
  // The defining properties; those taken from a state above named with it, runs from one state joined.
  const from = (key: string) => item.sources?.find((x) => x.key === key)?.from ?? null;
  const parts: { keys: string[]; from: string | null }[] = [];
  for (const key of item.defining) {
    const f = from(key);
    const last = parts[parts.length - 1];
    if (last && last.from === f) last.keys.push(key);
    else parts.push({ keys: [key], from: f });
  }
  if (parts.length === 1) {
    const only = parts[0]!;
    return only.from ? `${only.keys.join('+')} from ${only.from}` : only.keys.join('+');
  }
  return parts.map((x) => (x.from ? `${x.keys.join('+')} from ${x.from}` : x.keys.join('+'))).join(', ');
}

/** The row of a process in `system`. */
export function processRow(p: ProcessResult, system: UnitSystem, opts: RowOptions = {}): ProcessRow {
  const hasFlow = p.massFlowKgS !== null;
  const extraDigits = opts.extraDigits;
  const perKg = (j: number): Figure => figure(j, 'enthalpy', system, { difference: true, extraDigits });
  const rate = (w: number | null, perKgJ: number): Figure => (hasFlow ? heatFigure(w, system, opts) : perKg(perKgJ));
  const dw = figure(p.dw, 'humidityRatio', system, { difference: true, extraDigits });
  const adp = figure(p.apparatusDewPointC ?? null, 'temperature', system, { extraDigits });
  const kind = processKindText(p.processKind);
  return {
    name: p.name,
    from: p.from,
    to: p.to,
    kind,
    kindWithAdp: Number.isFinite(p.apparatusDewPointC ?? NaN) ? `${kind}, ADP ${adp.text}` : kind,
    hasFlow,
    massFlow: figure(p.massFlowKgS, 'massFlow', system, { extraDigits }),
    volumeFlow: figure(p.volumeFlowM3S, 'volumeFlow', system, { extraDigits }),
    total: rate(p.qTotalW, p.dhTotal),
    sensible: rate(p.qSensibleW, p.dhSensible),
    latent: rate(p.qLatentW, p.dhLatent),
    shr: ratioFigure(p.shr, extraDigits),
    water: hasFlow ? waterFigure(p.waterKgS, system, opts) : dw,
    coil: hasFlow ? heatFigure(p.qCoilW, system, opts) : noFigure(displaySymbol(displayUnit('power', system))),
    dh: perKg(p.dhTotal),
    dw,
    adp,
  };
}

/** The unit a claim was written in; null for a bare number (read in the SI base of its key). */
export function claimUnit(claim: ClaimResult): UnitDef | null {
  const text = claim.prop.value?.unit?.text;
  return text ? (lookupUnit(text) ?? null) : null;
}

/** What a claim's key measures, from the key table; undefined for an unknown key. */
export function claimDimension(key: string): Dimension | undefined {
  return findKey(key)?.dimension;
}

/**
 * A claim's computed value and band, in the unit the engineer wrote it in and at the finer of the
 * written precision and that unit's usual one (`shr=0.89` → computed `0.889`, band `±0.005`;
 * `rh=45%` → `49.6 %`, `±0.5 %`). Null for a key of no known dimension.
 */
export function claimFigures(claim: ClaimResult, opts: RowOptions = {}): { computed: Figure; band: Figure } | null {
  const dimension = claimDimension(claim.key);
  if (!dimension) return null;
  const unit = claimUnit(claim);
  const inUnit = unit && unit.dimension === dimension ? unit : null;
  return {
    computed: claimFigure(
      claim.computedSI,
      dimension,
      inUnit,
      claim.prop.value?.number.resolution,
      opts.extraDigits ?? 0,
    ),
    band: bandFigure(claim.toleranceSI, inUnit),
  };
}

/** A claim as a reviewer reads it: as written, the computed value, the band, the verdict. */
export interface ClaimRow {
  key: string;
  /** The claim as written in the note, spaces collapsed (`rh=50%`, `w = 9.9 g/kg`). */
  written: string;
  /** The computed value in the unit and precision the claim was written in (`49.6 %`). */
  computed: string;
  /** The accepted band around the written value (`±0.5 %`), '' when the key has no known dimension. */
  band: string;
  pass: boolean;
  /** `written → computed ✓ within band` or `… ✗ outside band`: the whole claim in one line of print. */
  text: string;
}

/** The row of a claim, its written form read from the note's text `source`. */
export function claimRow(claim: ClaimResult, source: string, opts: RowOptions = {}): ClaimRow {
  const f = claimFigures(claim, opts);
  const written = source.slice(claim.prop.span.start, claim.prop.span.end).replace(/\s+/g, ' ').trim();
  const computed = f ? f.computed.text : claim.computedText;
  const band = f ? f.band.text : '';
  const verdict = claim.pass ? '✓' : '✗';
  const within = band ? ` ${claim.pass ? 'within' : 'outside'} ${band}` : claim.pass ? ' agrees' : ' differs';
  return {
    key: claim.key,
    written,
    computed,
    band,
    pass: claim.pass,
    text: `${written} → ${computed} ${verdict}${within}`,
  };
}
