/**
 * References between states: a property value written as another state's property (`w=OA.w`,
 * `db=OFF.db`), optionally shifted by a signed difference (`db=OFF.db+0.8K`, `w=RA.w-0.5g/kg`).
 *
 * A reference is a defining input: its value is the referenced state's computed property (plus
 * the difference), so a change upstream flows into every state below that names it. The state it
 * names must be defined above (document order), which makes cycles impossible by construction.
 * Only the defining properties can be referenced and set (db wb dp rh w h), each from a property
 * of the same kind (a temperature from a temperature…). Differences: temperatures in K or °F (a
 * difference of 1 °F is 5/9 K; °C is not accepted, as it reads like a temperature), humidity
 * ratios and enthalpies in any of their units taken as a difference (scale only, no datum).
 */
import type { PropertyNode, PropertyRefNode, QuantityNode, Statement } from '../notation/ast';
import type { DefiningKey } from '../physics/types';
import type { EvalContext } from './context';
import { DEFINING_KEYS, STATE_KEYS, isDefiningKey, type KeySpec } from './keys';
import { dependencyInfo } from './mix';
import type { ResolvedQuantity } from './quantity';
import { dimensionWords, findUnit } from './quantity';
import { differenceExample } from '../vocabulary/keys';
import type { PropertySource, StateResult } from './types';

/**
 * Where a reference is read: the statement and its index (for `used-before-defined`), and whether
 * the statement takes references at all (a mix's claims or a process's figures do not).
 */
export interface RefSite {
  statement: Statement;
  index: number;
  allowed: boolean;
}

/** A reference as read: the item it names, its key, and the value it gives. */
export interface ReadRef {
  item: StateResult;
  fromKey: DefiningKey;
  offsetSI: number;
}

/** Difference units accepted per dimension (the key's own units, except temperature). */
const TEMPERATURE_DIFFERENCE: Readonly<Record<string, number>> = { K: 1, F: 5 / 9, '°F': 5 / 9 };

/** The written reference (`OA.w+0.5g/kg`). */
export function refText(ref: PropertyRefNode): string {
  const offset = ref.offset ? `${ref.offset.number.text}${ref.offset.unit?.text ?? ''}` : '';
  return `${ref.state.text}.${ref.key.text}${offset}`;
}

/** The value of a defining property of a computed state, SI. */
function definingValue(item: StateResult, key: DefiningKey): number {
  const s = item.state!;
  return s[key];
}

function bad(ctx: EvalContext, message: string, span: PropertyNode['span']): null {
  ctx.report({ code: 'bad-reference', severity: 'error', message, span });
  return null;
}

/**
 * A reference that names a process (`db=CC.db`, `db=CC.adp`): refused. A reference takes a
 * property of a state, so the chain stays a chain of states; a process's own figures (its
 * apparatus dew point, heat rates, water, flow) are results about the states it joins, shown in
 * its hover, tables and JSON, and a process's leaving values are its leaving state's, which can
 * be named. The message names that state.
 */
function processRefused(
  ctx: EvalContext,
  ref: PropertyRefNode,
  written: string,
  key: string,
  to: string,
  defSpan: PropertyNode['span'],
): null {
  const fromKey = ref.key.text;
  const stateKey = isDefiningKey(fromKey) ? fromKey : key;
  ctx.report({
    code: 'not-a-state',
    severity: 'error',
    message:
      `'${ref.state.text}' is a process, not a state; ${written} must name a state (or mix) defined above` +
      `${to ? `: the air leaving ${ref.state.text} is ${to}, so write ${key}=${to}.${stateKey}` : ''}` +
      (isDefiningKey(fromKey)
        ? ''
        : `. A process's own figures (${fromKey === 'adp' ? 'its apparatus dew point' : `'${fromKey}'`}, ` +
          'heat rates, water, flow) are not taken by reference: write the figure itself'),
    span: ref.state.span,
    related: [{ span: defSpan, message: `process ${ref.state.text}` }],
  });
  return null;
}

/** The difference of a reference in SI (K, kg/kg, J/kg), or null after a diagnostic. */
function readOffset(ctx: EvalContext, q: QuantityNode, spec: KeySpec, written: string): number | null {
  // The differences of the key table's row (`+0.8K or +1.5F`); none when the key takes none.
  const example = spec.differences?.map((d) => `+${d}`).join(' or ');
  if (q.tolerance)
    return bad(
      ctx,
      `${written}: a reference takes no tolerance; remove '${q.tolerance.number.text}' after the difference`,
      q.tolerance.span,
    );
  if (!example) {
    const off = `${q.number.text}${q.unit?.text ?? ''}`;
    const sign = q.number.value < 0 ? '-' : '+';
    const name = written.slice(written.indexOf('=') + 1, written.indexOf('.'));
    // Relative humidity (the one defining key without differences): why, and what to shift instead.
    return bad(
      ctx,
      spec.dimension === 'fraction'
        ? `${written}: a relative humidity takes no difference: '${off}' could ` +
            `mean ${Math.abs(q.number.value)} percentage points or ${Math.abs(q.number.value)} % of ${name}'s ` +
            `figure, and the same shift is other air at another temperature. Write rh= as a figure ` +
            `(e.g. rh=45%), or shift the moisture content, which is what a drier or moister air means: ` +
            `w=${name}.w${sign}${differenceExample('w')} or dp=${name}.dp${sign}${differenceExample('dp')}`
        : `${written}: ${spec.title} cannot be shifted by a ` +
            `difference; refer to the property as it is (remove '${off}')`,
      q.span,
    );
  }
  if (!q.unit) {
    ctx.report({
      code: 'missing-unit',
      severity: 'error',
      message: `${written}: the difference ${q.number.text} has no unit; write it with one, e.g. ${example}`,
      span: q.number.span,
    });
    return null;
  }
  const u = q.unit.text;
  if (spec.dimension === 'temperature') {
    const scale = TEMPERATURE_DIFFERENCE[u];
    if (scale === undefined) {
      const celsius = u === 'C' || u === '°C';
      return bad(
        ctx,
        celsius
          ? `${written}: write a temperature difference in K (${q.number.text}K; a difference ` +
              `of 1 °C is 1 K) or °F (${q.number.text}F), so it cannot be read as a temperature`
          : `${written}: '${u}' is not a temperature difference unit; write the difference in K or °F, e.g. ${example}`,
        q.unit.span,
      );
    }
    return q.number.value * scale;
  }
  const def = findUnit(u);
  if (!def || def.dimension !== spec.dimension) {
    return bad(
      ctx,
      `${written}: '${u}' is not a unit of ${spec.title}; write the difference in one, e.g. ${example}`,
      q.unit.span,
    );
  }
  return q.number.value * def.scale;
}

/**
 * Reads a reference value for `prop` (whose key has `spec`): resolves the state it names (a
 * reference for rename and go-to-definition even when something else is wrong), checks the keys
 * and the difference, and returns the value in SI as a quantity, or null after a diagnostic.
 */
export function readReference(
  ctx: EvalContext,
  prop: PropertyNode,
  ref: PropertyRefNode,
  spec: KeySpec,
  site: RefSite,
  what: string,
): { q: ResolvedQuantity; ref: ReadRef } | null {
  const written = `${prop.key}=${refText(ref)}`;
  if (!site.allowed) {
    // Still a use of the name (rename and find-references follow it), but not a value here.
    ctx.references.push({ name: ref.state.text, span: ref.state.span, statement: site.statement });
    const between = site.statement.keyword === 'process';
    return bad(
      ctx,
      between
        ? `${what} goes between two states defined above, so its figures are claims and ${written} ` +
            `cannot be used here: a reference defines a state. Write the figure itself, or ` +
            `give the leaving state a new name so that the process defines it from ${written}`
        : `${what} takes figures only: ${written} cannot be used here; ` +
            `references define state properties (in state and supply lines, and the ` +
            `leaving state of a process that defines it). Write the figure itself`,
      ref.span,
    );
  }
  const outcome = ctx.resolve(ref.state, site.statement, site.index);
  if (!isDefiningKey(prop.key)) {
    return bad(
      ctx,
      `${written}: only ${DEFINING_KEYS.join(', ')} can be taken from another state; write ${prop.key}= as a figure`,
      prop.keySpan,
    );
  }
  const fromKey = ref.key.text;
  if (outcome.ok && outcome.item.kind === 'process')
    return processRefused(ctx, ref, written, prop.key, outcome.item.to, outcome.def.span);
  if (!isDefiningKey(fromKey)) {
    const why = STATE_KEYS[fromKey] ? 'cannot be referenced' : `is not a property of ${ref.state.text}`;
    return bad(
      ctx,
      `${written}: '${fromKey}' ${why}; ` +
        `a reference names one of ${DEFINING_KEYS.join(', ')} (e.g. ${prop.key}=${ref.state.text}.${prop.key})`,
      ref.key.span,
    );
  }
  const fromSpec = STATE_KEYS[fromKey]!;
  if (fromSpec.dimension !== spec.dimension) {
    return bad(
      ctx,
      `${written}: ${ref.state.text}.${fromKey} is ${dimensionWords(fromSpec.dimension)}, ` +
        `but ${prop.key} is ${dimensionWords(spec.dimension)}; refer to a property ` +
        `of the same kind (e.g. ${prop.key}=${ref.state.text}.${prop.key})`,
      ref.key.span,
    );
  }
  let offsetSI = 0;
  if (ref.offset) {
    const o = readOffset(ctx, ref.offset, spec, written);
    if (o === null) return null;
    offsetSI = o;
  }
  if (!outcome.ok) {
    if (outcome.failed) ctx.report(dependencyInfo(what, ref.state.text, ref.state.span, outcome.def.span));
    return null;
  }
  const item = outcome.item;
  if (item.kind === 'process') return processRefused(ctx, ref, written, prop.key, item.to, outcome.def.span);
  if (item.state === null) {
    ctx.report(dependencyInfo(what, ref.state.text, ref.state.span, outcome.def.span));
    return null;
  }
  const si = definingValue(item, fromKey) + offsetSI;
  if (!Number.isFinite(si)) {
    return bad(
      ctx,
      `${written}: ${ref.state.text}.${fromKey} has no finite value ` +
        `(bone-dry air has no dew point); refer to another property`,
      ref.span,
    );
  }
  // The reference stands in for a written figure: its text is the reference, its band zero.
  const quantity: QuantityNode = {
    number: { value: si, text: refText(ref), resolution: 0, span: ref.span },
    unit: null,
    tolerance: null,
    span: ref.span,
  };
  return {
    q: { si, unit: null, unitText: '', toleranceSI: 0, explicitTolerance: false, quantity },
    ref: { item, fromKey, offsetSI },
  };
}

/** The sources of a state's referenced properties, for its result. */
export function sourcesOf(props: { key: string; q: ResolvedQuantity; ref?: ReadRef }[]): PropertySource[] | undefined {
  let out: PropertySource[] | undefined;
  for (const p of props) {
    if (!p.ref) continue;
    out ??= [];
    out.push({
      key: p.key,
      from: p.ref.item.name,
      fromKey: p.ref.fromKey,
      offsetSI: p.ref.offsetSI,
      valueSI: p.q.si,
    });
  }
  return out;
}
