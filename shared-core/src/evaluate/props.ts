/** Reading the `key=value` list of a statement against a table of keys. */
import type { PropertyNode, Statement } from '../notation/ast';
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
}

/** No keys (shared, never written to). */
const NO_KEYS: readonly string[] = [];

/**
 * Reads `props` against `table`: `unknown-key` (with a suggestion), `duplicate-key` for a key
 * written twice (the first one counts), and the unit diagnostics of {@link readQuantity}.
 * A reference value (`w=OA.w`) is read where it stands (see `./refs`): in `statement`, number
 * `index` of the note, which takes references when `allowed`.
 * @param what  the statement, for messages ("state OA", "site").
 */
export function readProps(
  ctx: EvalContext,
  props: PropertyNode[],
  table: Readonly<Record<string, KeySpec>>,
  what: string,
  statement: Statement,
  index: number,
  allowed: boolean,
): ReadProps {
  // At most one property read per written one: sized once (a growing list would take room for
  // 16 at its first element), cut to the number read at the end.
  const out: ReadProp[] = new Array<ReadProp>(props.length);
  let n = 0;
  // The properties of known keys that could not be read, made at the first (most statements have none).
  let broken: PropertyNode[] | null = null;
  let unknownKeys = 0;
  let refs: RefSite | null = null;
  for (let i = 0; i < props.length; i++) {
    const prop = props[i]!;
    // One look-up: a row of the table is its own key's (`spec.key`), which no property an
    // object inherits is (`constructor`, `toString`…), so the row found is the key's own.
    const found = table[prop.key];
    const spec = found !== undefined && found.key === prop.key ? found : undefined;
    if (!spec) {
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
      unknownKeys++;
      continue;
    }
    // The first property with this key is the one that counts. It is among the first properties
    // of known keys, read or not (one per key: a list no longer than the table, however long the
    // line), so a linear scan of those beats a Map here and stays linear in the line.
    const first = firstWithKey(out, n, broken, prop.key);
    if (first) {
      if (prop.ref) ctx.references.push({ name: prop.ref.state.text, span: prop.ref.state.span, statement });
      ctx.report({
        code: 'duplicate-key',
        severity: 'error',
        message: `${prop.key}= is written twice in ${what}; the first one is used, remove one of them`,
        span: prop.keySpan,
        related: [{ span: first.span, message: `first ${prop.key}=` }],
      });
      continue;
    }
    if (prop.ref) {
      // Where references are read (made at the first one: most statements have none).
      refs ??= { statement, index, allowed };
      const r = readReference(ctx, prop, prop.ref, spec, refs, what);
      if (!r) {
        broken = appended(broken, prop);
        continue;
      }
      out[n++] = { key: prop.key, spec, prop, q: r.q, ref: r.ref };
      continue;
    }
    if (prop.value === null) {
      // The parser has reported the syntax error already.
      broken = appended(broken, prop);
      continue;
    }
    // The property read is its own quantity (one object: `ReadPropertyFigure`).
    const read = resolveQuantity(prop, prop.value, spec, ctx, spec);
    if (!read) {
      broken = appended(broken, prop);
      continue;
    }
    out[n++] = read as ReadPropertyFigure;
  }
  out.length = n;
  return { props: out, broken: broken ? broken.map((p) => p.key) : NO_KEYS, unknownKeys };
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
