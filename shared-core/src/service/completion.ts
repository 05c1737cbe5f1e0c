/**
 * Completion inside `air` fences and keyword code spans: statement keywords at the start of a
 * statement, `SI`/`IP` after `units:`, property keys where a key may go, units after a number
 * (those of the key's dimension), and the names of states and mixes defined earlier where a mix
 * or process names its streams or ends.
 */
import { MIX_KEYS, PROCESS_KEYS, SITE_KEYS, STATE_KEYS, SUPPLY_KEYS, type KeySpec } from '../evaluate/keys';
import type { Span } from '../text/types';
import { describeUnit, dimensionTitle, unitsOf } from '../units';
import type { Dimension } from '../units/types';
import { show } from './format';
import { lineStart, regionAt } from './note';
import type { CancellationFlag, Note } from './types';

/** One completion proposal. */
export interface CompletionEntry {
  label: string;
  kind: 'keyword' | 'key' | 'unit' | 'name' | 'value';
  /** The text that replaces {@link CompletionResult.replace}. */
  insertText: string;
  detail?: string;
  /** Markdown. */
  documentation?: string;
  filterText?: string;
}

/** Proposals and the span they replace (the partly typed word). */
export interface CompletionResult {
  items: CompletionEntry[];
  replace: Span;
}

const KEYWORDS: CompletionEntry[] = [
  { label: 'state', kind: 'keyword', insertText: 'state ', detail: 'a moist-air state: state NAME: db=… rh=…' },
  { label: 'mix', kind: 'keyword', insertText: 'mix ', detail: 'adiabatic mixing: mix NAME: A 30% + B 70%' },
  { label: 'process', kind: 'keyword', insertText: 'process ', detail: 'a process: process NAME: A -> B m=…' },
  {
    label: 'supply',
    kind: 'keyword',
    insertText: 'supply ',
    detail: 'supply air from room loads: supply NAME: ROOM q_sensible=… q_latent=… db=…',
  },
  {
    label: 'recover',
    kind: 'keyword',
    insertText: 'recover ',
    detail: 'heat recovery: recover NAME: A -> A2, B -> B2 eff_s=…',
  },
  { label: 'site', kind: 'keyword', insertText: 'site: ', detail: 'pressure for what follows: site: elev=… or p=…' },
  { label: 'units', kind: 'keyword', insertText: 'units: ', detail: 'unit system of the results: units: SI or IP' },
];

const SYSTEMS: CompletionEntry[] = [
  { label: 'SI', kind: 'value', insertText: 'SI', detail: 'results in °C, kPa, g/kg, kJ/kg, m³/kg' },
  { label: 'IP', kind: 'value', insertText: 'IP', detail: 'results in °F, psia, gr/lb, Btu/lb, ft³/lb' },
];

/** Dimensions a mix stream's amount may have. */
const STREAM_DIMENSIONS: Dimension[] = ['fraction', 'massFlow', 'volumeFlow'];

// Each digit has one place to go, and no digit or point may follow: a long run of digits (a
// pasted 1e4-digit number) is matched in linear time instead of being split every possible way.
const NUMBER = String.raw`[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?(?![\d.])`;
const NAME = '[A-Za-z][A-Za-z0-9_-]*';
/** A name that starts a word (not the tail of a longer name: linear time on long words). */
const WORD_NAME = `(?<![A-Za-z0-9_-])${NAME}`;

/** `key=NUMBER unit-so-far` at the end of the text before the cursor. */
const AFTER_NUMBER = new RegExp(String.raw`(?:^|\s)([A-Za-z_]+)=${NUMBER}(\S*)$`);
/** A key being typed (or about to be) after whitespace or `:`. */
const KEY_SO_FAR = /(?:^|[\s:])([A-Za-z_]*)$/;

function keyEntries(table: Readonly<Record<string, KeySpec>>, written: Set<string>): CompletionEntry[] {
  return Object.values(table)
    .filter((k) => !written.has(k.key))
    .map((k) => ({
      label: k.key,
      kind: 'key' as const,
      insertText: `${k.key}=`,
      filterText: k.key,
      detail: k.title,
      documentation: `\`${k.key}\` — ${k.title}; e.g. \`${k.example}\``,
    }));
}

function unitEntries(dimensions: readonly Dimension[]): CompletionEntry[] {
  const out: CompletionEntry[] = [];
  for (const d of dimensions) {
    for (const u of unitsOf(d)) {
      const doc = describeUnit(u.symbol);
      const entry: CompletionEntry = {
        label: u.symbol,
        kind: 'unit',
        insertText: u.symbol,
        detail: `${u.title} (${dimensionTitle(d)})`,
      };
      if (doc) entry.documentation = doc.replace(/\n/g, '  \n');
      out.push(entry);
    }
  }
  return out;
}

/** States and mixes defined before `before`, newest last. */
function nameEntries(note: Note, before: number, except: string | null): CompletionEntry[] {
  const out: CompletionEntry[] = [];
  const seen = new Set<string>();
  for (const item of note.analysis.items) {
    if (item.statement.span.start >= before) break;
    if (item.kind === 'process' || item.name === except || seen.has(item.name)) continue;
    seen.add(item.name);
    let detail: string = item.kind;
    if (item.state) {
      const sys = note.analysis.units;
      detail += ` · ${show(note, item.state.db, 'temperature', sys)} db`;
      detail += `, ${show(note, item.state.rh, 'fraction', sys)} rh`;
    }
    out.push({ label: item.name, kind: 'name', insertText: item.name, detail });
  }
  return out;
}

/** A difference for the completion text of a reference to each key (none for rh). */
const DIFFERENCE_EXAMPLE: Readonly<Record<string, string>> = {
  db: '+0.8K',
  wb: '+0.8K',
  dp: '+0.8K',
  w: '+0.5g/kg',
  h: '+2kJ/kg',
};

/** Keys a reference can set and name (the defining properties). */
const REFERENCE_KEYS: readonly string[] = ['db', 'wb', 'dp', 'rh', 'w', 'h'];

/** `key=NAME-so-far` or `key=NAME.key-so-far` at the end of the text before the cursor. */
const REF_SO_FAR = new RegExp(String.raw`(?:^|\s)([A-Za-z_][A-Za-z0-9_]*)=(${NAME})?(?:\.([A-Za-z_]*))?$`);

/** The states and mixes above, each as `NAME.key` for the key being written (`w=` → `OA.w`). */
function refNameEntries(note: Note, before: number, except: string | null, key: string): CompletionEntry[] {
  const sys = note.analysis.units;
  const dim = STATE_KEYS[key]!.dimension;
  return nameEntries(note, before, except).map((e) => {
    const item = note.analysis.byName.get(e.label);
    const value =
      item && item.kind !== 'process' && item.state ? ` = ${show(note, item.state[key as 'db'], dim, sys)}` : '';
    return {
      ...e,
      label: `${e.label}.${key}`,
      insertText: `${e.label}.${key}`,
      filterText: `${e.label}.${key}`,
      detail: `${key} of ${e.label}${value}`,
      documentation: `Takes ${key} from ${e.label} (a reference: it follows every change of ${e.label}).`,
    };
  });
}

/** The keys of state `name` a reference can take, with their values now. */
function refKeyEntries(note: Note, before: number, name: string, key: string): CompletionEntry[] {
  const item = note.analysis.byName.get(name);
  if (!item || item.kind === 'process' || item.statement.span.start >= before) return [];
  const sys = note.analysis.units;
  const dim = STATE_KEYS[key]!.dimension;
  // Only keys of the same kind as the one being set (db, wb, dp for a temperature).
  return REFERENCE_KEYS.filter((k) => STATE_KEYS[k]!.dimension === dim).map((k) => {
    const now = item.state ? ` = ${show(note, item.state[k as 'db'], dim, sys)}` : '';
    const difference = DIFFERENCE_EXAMPLE[k]
      ? `add a difference with + or − and a unit where it helps (e.g. \`${key}=${name}.${k}${DIFFERENCE_EXAMPLE[k]}\`).`
      : 'it takes no difference.';
    return {
      label: k,
      kind: 'key' as const,
      insertText: k,
      detail: `${STATE_KEYS[k]!.title} of ${name}${now}`,
      documentation: `\`${key}=${name}.${k}\` takes ${STATE_KEYS[k]!.title} from ${name}; ${difference}`,
    };
  });
}

/** The entries with a space put before them, for a cursor right after the statement's `:`. */
function afterColon(items: CompletionEntry[], rest: string, typed: string): CompletionEntry[] {
  if (rest.length !== typed.length) return items;
  return items.map((e) => ({ ...e, insertText: ` ${e.insertText}` }));
}

/** The keys already written in the statement text before the cursor. */
function keysWritten(text: string): Set<string> {
  const out = new Set<string>();
  for (const m of text.matchAll(/(?:^|\s)([A-Za-z_]+)=/g)) out.add(m[1]!);
  return out;
}

/** Completion proposals at `offset`, or null outside statements and comments. */
export function completions(note: Note, offset: number, token?: CancellationFlag): CompletionResult | null {
  if (token?.isCancellationRequested) return null;
  const region = regionAt(note, offset);
  if (!region) return null;
  const from =
    region.origin === 'fence'
      ? Math.max(lineStart(note.text, offset), region.contentSpan.start)
      : region.contentSpan.start;
  const before = note.text.slice(from, offset);
  if (before.includes('#') || before.includes('`')) return null;

  // The word under the cursor: what is typed so far and what follows it.
  let wordEnd = offset;
  while (wordEnd < region.contentSpan.end && /[A-Za-z0-9_/%°³-]/.test(note.text[wordEnd]!)) wordEnd++;
  const replaceFrom = (typed: string): Span => ({ start: offset - typed.length, end: wordEnd });
  const result = (items: CompletionEntry[], typed: string): CompletionResult | null =>
    items.length > 0 ? { items, replace: replaceFrom(typed) } : null;

  // Start of a statement: keywords.
  const start = /^\s*([A-Za-z]*)$/.exec(before);
  if (start) return result(KEYWORDS, start[1]!);

  const units = /^\s*units:\s*([A-Za-z]*)$/.exec(before);
  if (units) return result(SYSTEMS, units[1]!);

  // A number just typed: units of the key's dimension (or of a mix stream's amount).
  const afterNumber = AFTER_NUMBER.exec(before);
  if (afterNumber) {
    const key = afterNumber[1]!;
    const spec = STATE_KEYS[key] ?? PROCESS_KEYS[key] ?? SITE_KEYS[key] ?? SUPPLY_KEYS[key];
    return spec ? result(unitEntries([spec.dimension]), afterNumber[2]!) : null;
  }

  const site = /^\s*site:(.*)$/.exec(before);
  if (site) {
    const k = KEY_SO_FAR.exec(site[1]!);
    return k ? result(afterColon(keyEntries(SITE_KEYS, keysWritten(site[1]!)), site[1]!, k[1]!), k[1]!) : null;
  }

  const state = new RegExp(String.raw`^\s*state\s+(${NAME})?\s*:(.*)$`).exec(before);
  if (state) {
    // A property taken from a state above: `w=O` offers `OA.w`, `w=OA.` the keys of OA.
    const ref = REF_SO_FAR.exec(state[2]!);
    if (ref && REFERENCE_KEYS.includes(ref[1]!)) {
      const [, key, stateName, dot] = ref;
      if (dot === undefined) return result(refNameEntries(note, offset, state[1] ?? null, key!), stateName ?? '');
      return result(refKeyEntries(note, offset, stateName!, key!), dot);
    }
    const rest = state[2]!;
    const k = KEY_SO_FAR.exec(rest);
    return k ? result(afterColon(keyEntries(STATE_KEYS, keysWritten(rest)), rest, k[1]!), k[1]!) : null;
  }

  const mix = new RegExp(String.raw`^\s*mix\s+(${NAME})?\s*:(.*)$`).exec(before);
  if (mix) {
    const self = mix[1] ?? null;
    const rest = mix[2]!;
    const stream = /(?:^|\+)\s*([A-Za-z][A-Za-z0-9_-]*|)$/.exec(rest);
    if (stream) return result(afterColon(nameEntries(note, offset, self), rest, stream[1]!), stream[1]!);
    const amount = new RegExp(String.raw`${WORD_NAME}\s+${NUMBER}(\S*)$`).exec(rest);
    if (amount) return result(unitEntries(STREAM_DIMENSIONS), amount[1]!);
    const k = /\s([A-Za-z_]*)$/.exec(rest);
    return k ? result(keyEntries(MIX_KEYS, keysWritten(rest)), k[1]!) : null;
  }

  const proc = new RegExp(String.raw`^\s*process\s+(${NAME})?\s*:(.*)$`).exec(before);
  if (proc) {
    const self = proc[1] ?? null;
    const rest = proc[2]!;
    const end = /(?:^|->)\s*([A-Za-z][A-Za-z0-9_]*|)$/.exec(rest);
    if (end && !/->.*->/.test(rest) && !new RegExp(String.raw`->\s*${NAME}\s`).test(rest)) {
      // After `MA ->` the leaving state is another one: MA itself is not offered.
      const fromName = rest.includes('->') ? new RegExp(String.raw`^\s*(${NAME})\s*->`).exec(rest)?.[1] : undefined;
      const names = nameEntries(note, offset, self).filter((e) => e.label !== fromName);
      const glued = rest.endsWith(`->${end[1]!}`)
        ? names.map((e) => ({ ...e, insertText: ` ${e.insertText}` }))
        : names;
      return result(afterColon(glued, rest, end[1]!), end[1]!);
    }
    if (rest.includes('->')) {
      const k = /\s([A-Za-z_]*)$/.exec(rest);
      return k ? result(keyEntries(PROCESS_KEYS, keysWritten(rest)), k[1]!) : null;
    }
    return null;
  }

  const supply = new RegExp(String.raw`^\s*supply\s+(${NAME})?\s*:(.*)$`).exec(before);
  if (supply) {
    const self = supply[1] ?? null;
    const rest = supply[2]!;
    // The room state first, then the loads, the supply dry-bulb or flow, and claims.
    const room = /^\s*([A-Za-z][A-Za-z0-9_-]*|)$/.exec(rest);
    if (room) return result(nameEntries(note, offset, self), room[1]!);
    const ref = REF_SO_FAR.exec(rest);
    if (ref && ref[1] === 'db') {
      const [, key, stateName, dot] = ref;
      if (dot === undefined) return result(refNameEntries(note, offset, self, key!), stateName ?? '');
      return result(refKeyEntries(note, offset, stateName!, key!), dot);
    }
    const k = /\s([A-Za-z_]*)$/.exec(rest);
    return k ? result(keyEntries(SUPPLY_KEYS, keysWritten(rest)), k[1]!) : null;
  }
  return null;
}
