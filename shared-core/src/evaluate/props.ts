/** Reading the `key=value` list of a statement against a table of keys. */
import type { PropertyNode, PropertyRefNode, Statement } from '../notation/ast';
import type { EvalContext } from './context';
import type { KeySpec } from './keys';
import type { ResolvedQuantity } from './quantity';
import { type ReadPropertyFigure, resolveQuantity } from './quantity';
import { suggestName } from '../text/suggest';
import { readReference, type ReadRef, type RefSite } from './refs';
import { appended } from './util';

/** A property whose key is known and whose value was read. */
export interface ReadProp {
  key: string;
  spec: KeySpec;
  prop: PropertyNode;
  /** The value in SI; for a reference, its value now (the quantity's text is the written reference). */
  q: ResolvedQuantity;
  /** Set when the value is another state's property (`w=OA.w`). */
  ref?: ReadRef;
}

/** The outcome of reading a statement's properties. */
export interface ReadProps {
  /** Usable properties in written order (first occurrence of each key). */
  props: ReadProp[];
  /** Keys written with a value that could not be read (its diagnostic is already reported). */
  broken: readonly string[];
  /** How many keys were not known (each reported as `unknown-key`). */
  unknownKeys: number;
  /**
   * Counted while reading, so that a statement need not pass over its properties again: how many
   * of {@link props} can define a state (their row says so), set the pressure (`p`, `elev`), and
   * are references.
   */
  defining: number;
  pressure: number;
  references: number;
}

/** No keys (shared, never written to). */
const NO_KEYS: readonly string[] = [];

/**
 * Reads `props` against `table`: `unknown-key` (with a suggestion), `duplicate-key` for a key
 * written twice (the first one counts), and the unit diagnostics of {@link readQuantity}.
 * A reference value (`w=OA.w`) is read where it stands (see `./refs`): in `statement`, number
 * `index` of the note, which takes references when `allowed`.
 * @param what  the statement, for messages ("state OA", "site"): the words, or the function
 *   that gives them for `statement` (called only when a message is made: the words of a state
 *   would otherwise be a string made for every state, and read for few).
 */
export function readProps<S extends Statement>(
  ctx: EvalContext,
  props: PropertyNode[],
  table: Readonly<Record<string, KeySpec>>,
  what: string | ((statement: S) => string),
  statement: S,
  index: number,
  allowed: boolean,
): ReadProps {
  // At most one property read per written one: sized once (a growing list would take room for
  // 16 at its first element), cut to the number read at the end. (The rare outcomes, a diagnostic
  // or a reference, are functions of their own, so that this one stays small enough for the
  // engine to build into its callers.)
  const out: ReadProp[] = new Array<ReadProp>(props.length);
  let n = 0;
  // The properties of known keys that could not be read, made at the first (most statements have none).
  let broken: PropertyNode[] | null = null;
  let unknownKeys = 0;
  let defining = 0;
  let pressure = 0;
  let references = 0;
  // Where the references of this statement are read, made at the first (most have none).
  let refs: RefSite | null = null;
  for (let i = 0; i < props.length; i++) {
    const prop = props[i]!;
    const spec = rowOf(table, prop.key);
    if (!spec) {
      unknownKey(ctx, prop, table, whatText(what, statement), statement);
      unknownKeys++;
      continue;
    }
    // The first property with this key is the one that counts. It is among the first properties
    // of known keys, read or not (one per key: a list no longer than the table, however long the
    // line), so a linear scan of those beats a Map here and stays linear in the line.
    const first = firstWithKey(out, n, broken, spec.key);
    if (first) {
      duplicateKey(ctx, prop, first, whatText(what, statement), statement);
      continue;
    }
    // A reference, or the property read as its own quantity (one object: `ReadPropertyFigure`);
    // null when it could not be read (a value missing is the parser's syntax error, reported).
    if (prop.ref) refs ??= { statement, index, allowed };
    const read = prop.ref
      ? referenceRead(ctx, prop, prop.ref, spec, refs!, whatText(what, statement))
      : prop.value === null
        ? null
        : (resolveQuantity(prop, prop.value, spec, ctx, spec) as ReadPropertyFigure | null);
    if (!read) {
      broken = appended(broken, prop);
      continue;
    }
    out[n++] = read;
    if (prop.ref) references++;
    if (spec.defining === true) defining++;
    if (isPressureKey(spec.key)) pressure++;
  }
  // Setting an array's length is a call into the engine: done only when a property was not read.
  if (n !== out.length) out.length = n;
  return {
    props: out,
    broken: broken ? broken.map((p) => p.key) : NO_KEYS,
    unknownKeys,
    defining,
    pressure,
    references,
  };
}

/** The words of `what` for `statement` (see {@link readProps}). */
function whatText<S extends Statement>(what: string | ((statement: S) => string), statement: S): string {
  return typeof what === 'string' ? what : what(statement);
}

/** True for a key that sets a statement's pressure rather than describing its air. */
export function isPressureKey(key: string): boolean {
  return key === 'p' || key === 'elev';
}

/** `unknown-key` for `prop` (with a suggestion among the keys of `table`). */
function unknownKey(
  ctx: EvalContext,
  prop: PropertyNode,
  table: Readonly<Record<string, KeySpec>>,
  what: string,
  statement: Statement,
): void {
  const keys = Object.keys(table);
  const suggestion = suggestName(prop.key, keys);
  ctx.report({
    code: 'unknown-key',
    severity: 'error',
    message:
      `'${prop.key}' is not a property of ${what}; ` +
      `${suggestion ? `did you mean ${suggestion}=…? ` : ''}the keys are ${keys.join(', ')}`,
    span: prop.keySpan,
    data: suggestion ? { key: prop.key, suggestion } : { key: prop.key },
  });
  // A reference after an unknown key is still a use of the name (rename follows it).
  if (prop.ref) ctx.references.push({ name: prop.ref.state.text, span: prop.ref.state.span, statement });
}

/** `duplicate-key` for `prop`, whose key `first` is written with already. */
function duplicateKey(
  ctx: EvalContext,
  prop: PropertyNode,
  first: PropertyNode,
  what: string,
  statement: Statement,
): void {
  if (prop.ref) ctx.references.push({ name: prop.ref.state.text, span: prop.ref.state.span, statement });
  ctx.report({
    code: 'duplicate-key',
    severity: 'error',
    message: `${prop.key}= is written twice in ${what}; the first one is used, remove one of them`,
    span: prop.keySpan,
    related: [{ span: first.span, message: `first ${prop.key}=` }],
  });
}

/** The property `prop` whose value is the reference `ref`, read at `site` (see `./refs`); null after a diagnostic. */
function referenceRead(
  ctx: EvalContext,
  prop: PropertyNode,
  ref: PropertyRefNode,
  spec: KeySpec,
  site: RefSite,
  what: string,
): ReadProp | null {
  const r = readReference(ctx, prop, ref, spec, site, what);
  return r ? { key: spec.key, spec, prop, q: r.q, ref: r.ref } : null;
}

/** Rows found last, by a slot of the key as written (see {@link rowOf}). */
const ROW_SLOTS = 32;
const rowTables: (Readonly<Record<string, KeySpec>> | null)[] = new Array(ROW_SLOTS).fill(null);
const rowKeys: string[] = new Array<string>(ROW_SLOTS).fill('');
const rowSpecs: (KeySpec | null)[] = new Array(ROW_SLOTS).fill(null);
/**
 * Per slot, a key of one or two characters as a number, its length and code units (length·2^32 +
 * first·2^16 + last: no other string has it), or −1 for a longer key (compared as a string).
 */
const rowShortCodes = new Float64Array(ROW_SLOTS).fill(-1);

/**
 * The row of `table` for the key written `key`, or undefined when the table has none. A row of
 * the table is its own key's (`spec.key`), which no property an object inherits is
 * (`constructor`, `toString`…), so the row found is the key's own.
 *
 * The tables never change, so the last row found for each slot is kept with its table and the
 * key as written: a note writes a handful of keys over and over. A key of one or two characters
 * (`db`, `rh`, `w`: most keys) is recognised by its characters, read for the slot anyway, where
 * the comparison of two strings is a call (unless they are the same object, which is not known
 * before the call); a longer one is compared as a string. Looking a key up in the table itself
 * costs more: the note's string is first matched with the engine's own copy of the text.
 */
export function rowOf(table: Readonly<Record<string, KeySpec>>, key: string): KeySpec | undefined {
  const length = key.length;
  const first = key.charCodeAt(0);
  const last = key.charCodeAt(length - 1);
  const slot = (length * 7 + first * 3 + last) & (ROW_SLOTS - 1);
  const code = length <= 2 ? length * 4294967296 + first * 65536 + last : -1;
  if (rowTables[slot] === table && (code >= 0 ? rowShortCodes[slot] === code : rowKeys[slot] === key))
    return rowSpecs[slot]!;
  return rowFound(table, key, slot, code);
}

/** {@link rowOf} for a key not found in its slot: the table's row, kept in the slot. */
function rowFound(
  table: Readonly<Record<string, KeySpec>>,
  key: string,
  slot: number,
  code: number,
): KeySpec | undefined {
  const found = table[key];
  if (found === undefined || found.key !== key) return undefined;
  rowTables[slot] = table;
  rowKeys[slot] = key;
  rowSpecs[slot] = found;
  rowShortCodes[slot] = code;
  return found;
}

/** The property of key `key` among the first `n` read (`out`) and those that could not be read, if any. */
function firstWithKey(
  out: readonly ReadProp[],
  n: number,
  broken: readonly PropertyNode[] | null,
  key: string,
): PropertyNode | undefined {
  for (let j = 0; j < n; j++) if (out[j]!.key === key) return out[j]!.prop;
  if (broken) for (const p of broken) if (p.key === key) return p;
  return undefined;
}
