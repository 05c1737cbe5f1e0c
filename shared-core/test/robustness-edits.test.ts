/**
 * Edits lose nothing (fast-check, seeded): every edit a quick fix, the unit-system rewrite, rename,
 * the results-table command or the units-switch command makes is checked on random notes:
 * - it changes only its own statement (or, for rename, the name's occurrences; for the units
 *   switch, the `SI`/`IP` word; for the tables, the table slots): the text before the first and
 *   after the last edited span is byte-identical, every other statement reads exactly as before,
 *   and the edited statement keeps its keyword, name, keys (in order) and comment;
 * - applying it twice is harmless: asked again after it was applied, the same fix is either not
 *   offered or changes nothing; rename there and back, and the units switch twice, give the
 *   original text byte for byte; the tables written once are current the second time.
 * The unit-system rewrite keeps every written value within the rounding of its new last digit.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { applyEdits } from './service-helpers';
import { fuzzConfig, note as anyNote, settings as someSettings, timeoutFor } from './robustness-generators';
import {
  analyzeText,
  codeActions,
  noteStatus,
  rename,
  resultsTableEdits,
  type Edit,
  type FixAction,
  type Note,
  type ServiceSettings,
} from '../src/service';
import type { QuantityNode, Statement } from '../src/notation/ast';
import { lookupUnit, toSI } from '../src/units';

const cfg = fuzzConfig();
/** Statement keywords: never valid names (a note may still write one, and rename will not write it back). */
const KEYWORDS = ['site', 'units', 'state', 'mix', 'process'];
/** Notes for the edit properties (each note is tried with every action it offers). */
const RUNS = Math.max(200, Math.round(cfg.notes / 5));

// ---------------------------------------------------------------------------------------------
// Notes rich in fixable statements

const temp = fc.integer({ min: -20, max: 45 });
const fixable = fc.oneof(
  // missing-unit on a temperature
  fc.tuple(temp, fc.integer({ min: 10, max: 90 })).map(([t, r]) => `state A${t + 20}: db=${t} rh=${r}%`),
  // wb-above-db
  fc
    .tuple(temp, fc.integer({ min: 1, max: 9 }))
    .map(([t, d]) => `state W${t + 20}: db=${t}C wb=${t + d}C  # as logged`),
  // claim-mismatch (a stale third figure), with and without a tolerance, in several units
  fc
    .tuple(
      temp,
      fc.integer({ min: 20, max: 80 }),
      fc.constantFrom(
        'w=7.3g/kg',
        'h=40kJ/kg',
        'dp=5.0C',
        'wb=60F',
        'v=0.85m3/kg',
        'w=50gr/lb',
        'h=20Btu/lb±0.5',
        'rh=42%±1',
      ),
    )
    .map(([t, r, claim]) => `state S${t + 20}: db=${t}C rh=${r}% ${claim}`),
  // unknown-unit with a suggestion
  fc.tuple(temp, fc.constantFrom('g/Kg', 'kpa', 'KJ/kg', 'Btu/LB', '°c', 'l/s')).map(([t, u]) => {
    if (u === 'kpa') return `state U${t + 20}: db=${t}C rh=50% p=84${u}`;
    if (u === 'l/s') return `state U${t + 20}: db=${t}C rh=50%`;
    const second =
      u === 'KJ/kg' ? `h=45${u}` : u === 'Btu/LB' ? `h=20${u}` : u === '°c' ? `wb=${t - 2}${u}` : `w=6.1${u}`;
    return `state U${t + 20}: db=${t}C ${second}`;
  }),
  // statements the unit-system rewrite works on (SI and IP, flows, pressures, tolerances)
  fc.constantFrom(
    'state OA: db=32C wb=23.5C p=84.5kPa',
    'state RA: db=75F rh=50% w=65gr/lb±2',
    'state RB: db=24C rh=50% h=47.8kJ/kg±1%',
    'mix MA: OA 1000L/s + RA 3000L/s',
    'mix MB: OA 2.5kg/s + RA 4000cfm db=26C',
    'process CC: MA -> OA q=4.8m3/s q_total=54kW water=14kg/h',
    'process HC: RA -> OA m=44000lb/h q_sensible=300MBH',
    'site: elev=5250ft',
    'state X: db=297.15K w=0.0093 elev=1600m',
  ),
);
const line = fc.oneof(
  { weight: 5, arbitrary: fixable },
  { weight: 1, arbitrary: fc.constantFrom('state A: db=24C rh=50%', 'units: IP', 'units: SI', '# a comment', '') },
);
const fixableNote = fc
  .tuple(
    fc.array(fc.array(line, { minLength: 1, maxLength: 6 }), { minLength: 1, maxLength: 3 }),
    fc.constantFrom('\n', '\r\n'),
    fc.constantFrom('', '# Kestrel Ridge AHU-2\n\nSupply air figures:\n\n'),
    fc.boolean(),
  )
  .map(([blocks, eol, head, inline]) => {
    const parts = blocks.map((b) => ['```air', ...b, '```'].join('\n'));
    if (inline) parts.push('The room is held at `state RI: db=24 rh=50%` in summer.');
    return `${head + parts.join('\n\nProse between the blocks.\n\n')}\n`.split('\n').join(eol);
  });
const notes = fc.oneof({ weight: 4, arbitrary: fixableNote }, { weight: 1, arbitrary: anyNote });
/** Any settings, without a size limit (an edit that grows a note past a tiny limit would empty its analysis). */
const anySettings = someSettings.map((s): ServiceSettings => ({ ...s, maxNoteKB: 0 }));

// ---------------------------------------------------------------------------------------------
// Checks

/** What an edited statement must keep: keyword, name, keys in order, comment. */
function shape(text: string, s: Statement): string {
  const name = 'name' in s && s.name ? s.name.text : '';
  const keys = s.keyword === 'units' ? [] : s.props.map((p) => p.key);
  const streams = s.keyword === 'mix' ? s.streams.map((x) => x.name.text) : [];
  const lineEnd = text.slice(s.span.end).search(/\r|\n|$/);
  const rest = text.slice(s.span.end, s.span.end + lineEnd);
  const comment = rest.includes('#') ? rest.slice(rest.indexOf('#')) : '';
  return JSON.stringify([s.keyword, name, keys, streams, comment]);
}

function statementTexts(n: Note): string[] {
  return n.analysis.parsed.statements.map((s) => n.text.slice(s.span.start, s.span.end));
}

/** The span from the first edit's start to the last edit's end. */
function hull(edits: readonly Edit[]): { start: number; end: number } {
  return { start: Math.min(...edits.map((e) => e.span.start)), end: Math.max(...edits.map((e) => e.span.end)) };
}

/** Checks that `after` differs from `before` only inside the edits' hull. */
function onlyInside(before: string, after: string, edits: readonly Edit[], what: string): void {
  const h = hull(edits);
  expect(after.slice(0, h.start), `${what}: text before the edits`).toBe(before.slice(0, h.start));
  expect(after.slice(after.length - (before.length - h.end)), `${what}: text after the edits`).toBe(
    before.slice(h.end),
  );
}

function applyAndCheck(n: Note, s: ServiceSettings, action: FixAction, counts: Record<string, number>): void {
  const text = n.text;
  const at = action.edits[0]!.span;
  const what = `'${action.title}' on ${JSON.stringify(text.slice(Math.max(0, at.start - 30), at.end + 30))}`;
  const before = n.analysis.parsed.statements;
  const target = before.filter((st) =>
    action.edits.some((e) => e.span.start >= st.span.start && e.span.end <= st.span.end),
  );
  expect(target.length, `${what}: every edit lies inside one statement`).toBe(1);
  const stmt = target[0]!;
  for (const e of action.edits) {
    expect(e.span.start >= stmt.span.start && e.span.end <= stmt.span.end, `${what}: edit inside its statement`).toBe(
      true,
    );
    expect(/[\r\n]/.test(e.newText), `${what}: no line break inserted`).toBe(false);
  }
  const after = applyEdits(text, action.edits);
  onlyInside(text, after, action.edits, what);
  const m = analyzeText(after, s);
  // Every other statement reads as before; the edited one keeps its shape.
  const i = before.indexOf(stmt);
  const oldTexts = statementTexts(n);
  const newTexts = statementTexts(m);
  expect(newTexts.length, `${what}: number of statements`).toBe(oldTexts.length);
  expect([...newTexts.slice(0, i), ...newTexts.slice(i + 1)], `${what}: the other statements`).toEqual([
    ...oldTexts.slice(0, i),
    ...oldTexts.slice(i + 1),
  ]);
  expect(shape(after, m.analysis.parsed.statements[i]!), `${what}: keyword, name, keys and comment`).toBe(
    shape(text, stmt),
  );
  // No new syntax-level problem in the edited statement.
  const syntax = new Set(['syntax', 'bad-number', 'missing-colon', 'unknown-key', 'missing-unit', 'duplicate-key']);
  const span = m.analysis.parsed.statements[i]!.span;
  const inStmt = (x: Note, sp: { start: number; end: number }) =>
    x.analysis.diagnostics.filter(
      (d) =>
        syntax.has(d.code) &&
        d.span.start >= sp.start &&
        d.span.end <= sp.end &&
        !(action.diagnostic && d.code === action.diagnostic.code),
    ).length;
  expect(inStmt(m, span), `${what}: no new syntax problem`).toBeLessThanOrEqual(inStmt(n, stmt.span));

  // Asked again, the same fix is not offered, or changes nothing.
  const again = codeActions(m, span).filter(
    (a) =>
      a.title === action.title || (action.kind === 'refactor' && a.kind === 'refactor' && a.title === action.title),
  );
  for (const a of again) {
    const twice = applyEdits(after, a.edits);
    expect(twice, `${what}: applied a second time`).toBe(after);
  }
  if (action.diagnostic) {
    // A quick fix removes the problem it fixes (a unit suggestion may leave another unit problem):
    // no diagnostic of its code is left on the rewritten text.
    let shift = 0;
    const rewritten = [...action.edits]
      .sort((x, y) => x.span.start - y.span.start)
      .map((e) => {
        const r = { start: e.span.start + shift, end: e.span.start + shift + e.newText.length };
        shift += e.newText.length - (e.span.end - e.span.start);
        return r;
      });
    const still = m.analysis.diagnostics.filter(
      (d) =>
        d.code === action.diagnostic!.code && rewritten.some((r) => d.span.start <= r.end && r.start <= d.span.end),
    );
    if (action.diagnostic.code !== 'unknown-unit' && action.diagnostic.code !== 'missing-unit') {
      expect(still.length, `${what}: the ${action.diagnostic.code} it fixes is gone`).toBe(0);
    }
  }
  if (action.kind === 'refactor') checkConversion(m, stmt, i, what);
  counts[action.diagnostic?.code ?? action.kind] = (counts[action.diagnostic?.code ?? action.kind] ?? 0) + 1;
}

/**
 * The unit-system rewrite keeps every written value: converted back to SI, each new figure is
 * within half a unit of its own last written digit of the old one (flows and powers: of their
 * fourth significant figure), since the factors are exact (e.g. °F = °C × 9/5 + 32 by definition)
 * and the new text is only rounded.
 */
const FLOW_LIKE = new Set(['massFlow', 'volumeFlow', 'power']);

function checkConversion(m: Note, stmt: Statement, i: number, what: string): void {
  const next = m.analysis.parsed.statements[i]!;
  const quantities = (st: Statement): { key: string; q: QuantityNode }[] => {
    const out: { key: string; q: QuantityNode }[] = [];
    if (st.keyword === 'mix')
      for (const x of st.streams) if (x.amount) out.push({ key: `stream ${x.name.text}`, q: x.amount });
    if (st.keyword !== 'units') for (const p of st.props) if (p.value) out.push({ key: p.key, q: p.value });
    return out;
  };
  const before = quantities(stmt);
  const after = quantities(next);
  expect(after.length, `${what}: same quantities`).toBe(before.length);
  for (const [k, { key, q }] of before.entries()) {
    const r = after[k]!.q;
    const unitOf = (x: QuantityNode) =>
      x.unit
        ? lookupUnit(x.unit.text)
        : key === 'w' || key === 'shr'
          ? lookupUnit(key === 'w' ? 'kg/kg' : '%')
          : undefined;
    const u0 = unitOf(q);
    const u1 = unitOf(r);
    if (!u0 || !u1 || u0.dimension !== u1.dimension) continue;
    if (q.number.text === r.number.text && q.unit?.text === r.unit?.text) continue; // left as written
    const scale1 = key === 'shr' && !r.unit ? 1 : u1.scale;
    const v0 = key === 'shr' && !q.unit ? q.number.value : toSI(q.number.value, u0);
    const v1 = key === 'shr' && !r.unit ? r.number.value : toSI(r.number.value, u1);
    // Flows and powers are written to four significant figures (10170cfm stands for 1017×10).
    const shown = Math.abs(r.number.value);
    const resolution =
      FLOW_LIKE.has(u1.dimension) && shown > 0
        ? Math.max(r.number.resolution, 10 ** (Math.floor(Math.log10(shown)) - 3))
        : r.number.resolution;
    const band = 0.5 * resolution * scale1 * (1 + 1e-9) + 1e-12 * Math.abs(v0);
    expect(
      Math.abs(v1 - v0),
      `${what}: ${key} ${q.number.text}${q.unit?.text ?? ''} → ${r.number.text}${r.unit?.text ?? ''}`,
    ).toBeLessThanOrEqual(band);
  }
}

describe('edits lose nothing', () => {
  it(
    `quick fixes and the unit-system rewrite change only their statement, and ` +
      `a second application changes nothing (${RUNS} notes, seed ${cfg.seed})`,
    () => {
      const counts: Record<string, number> = {};
      fc.assert(
        fc.property(notes, anySettings, (text, s) => {
          const n = analyzeText(text, s);
          let tried = 0;
          // Every quick fix of every diagnostic, and the rewrites of every statement.
          const seen = new Set<string>();
          const spans = [
            ...n.analysis.diagnostics.map((d) => d.span),
            ...n.analysis.parsed.statements.map((st) => st.span),
          ];
          for (const span of spans) {
            for (const action of codeActions(n, span)) {
              if (action.kind === 'source' || seen.has(action.title) || tried >= 12) continue;
              if (action.diagnostic?.code === 'stale-results-table') continue; // the table fix is checked below
              seen.add(action.title);
              tried++;
              applyAndCheck(n, s, action, counts);
            }
          }
        }),
        { seed: cfg.seed + 2, numRuns: RUNS },
      );
      console.log(`[edits] actions applied and checked: ${JSON.stringify(counts)}`);
      for (const code of ['missing-unit', 'wb-above-db', 'claim-mismatch', 'unknown-unit', 'refactor'])
        expect(counts[code] ?? 0, code).toBeGreaterThan(10);
    },
    timeoutFor(RUNS, 40),
  );

  it(
    `rename there and back gives the note back byte for byte, and a second rename is refused (${RUNS} notes)`,
    () => {
      let renamed = 0;
      fc.assert(
        fc.property(notes, anySettings, fc.nat(), (text, s, pick) => {
          const n = analyzeText(text, s);
          // Names of well-formed heads (`state NAME:`): in a head without its colon (`state A =`) a
          // name and a key look alike, so a renamed name may be read as a key there.
          const names = n.analysis.parsed.statements.flatMap((st) =>
            'name' in st &&
            st.name &&
            /^[A-Za-z][A-Za-z0-9_-]*$/.test(st.name.text) &&
            !KEYWORDS.includes(st.name.text) &&
            /^\s*:/.test(text.slice(st.name.span.end))
              ? [st.name]
              : [],
          );
          if (names.length === 0) return;
          const target = names[pick % names.length]!;
          const fresh = `Z${pick % 1000}_renamed`;
          const r = rename(n, target.span.start, fresh);
          if (!('edits' in r)) return; // refused (e.g. a duplicate definition elsewhere): nothing to check
          renamed++;
          for (const e of r.edits) expect(text.slice(e.span.start, e.span.end)).toBe(target.text);
          const after = applyEdits(text, r.edits);
          onlyInside(text, after, r.edits, `rename ${target.text}`);
          // Outside the renamed spans, not a character differs.
          const stripped = (t: string, name: string) => t.split(name).join('\u0000');
          expect(stripped(after, fresh).length).toBe(after.length - r.edits.length * (fresh.length - 1));
          const m = analyzeText(after, s);
          const at = r.edits[0]!.span.start;
          const again = rename(m, at, fresh);
          expect('error' in again, 'renaming to the same name again is refused').toBe(true);
          const back = rename(m, at, target.text);
          expect('edits' in back, `renaming back to ${target.text}`).toBe(true);
          if ('edits' in back) expect(applyEdits(after, back.edits)).toBe(text);
        }),
        { seed: cfg.seed + 3, numRuns: RUNS },
      );
      expect(renamed).toBeGreaterThan(RUNS / 4);
    },
    timeoutFor(RUNS, 20),
  );

  it(
    'the units switch (Switch Result Units) rewrites only the SI/IP word, and twice gives the note back',
    () => {
      let switched = 0;
      fc.assert(
        fc.property(notes, anySettings, (text, s) => {
          const n = analyzeText(text, s);
          const st = noteStatus(n);
          // As the client does: the note's own units: line is rewritten; otherwise the setting changes.
          if (st.unitsSource !== 'note' || !st.unitsSpan) return;
          switched++;
          const other = st.units === 'SI' ? 'IP' : 'SI';
          const edit: Edit = { span: st.unitsSpan, newText: other };
          expect(text.slice(st.unitsSpan.start, st.unitsSpan.end)).toMatch(/^(SI|IP)$/);
          const after = applyEdits(text, [edit]);
          onlyInside(text, after, [edit], 'units switch');
          const m = analyzeText(after, s);
          const st2 = noteStatus(m);
          expect(st2.units).toBe(other);
          expect(st2.unitsSpan).toEqual(st.unitsSpan);
          expect(applyEdits(after, [{ span: st2.unitsSpan!, newText: st.units }])).toBe(text);
        }),
        { seed: cfg.seed + 4, numRuns: RUNS },
      );
      expect(switched).toBeGreaterThan(10);
    },
    timeoutFor(RUNS, 10),
  );

  it(
    'results tables: written once they are current, so writing them again changes nothing; only table slots change',
    () => {
      let written = 0;
      fc.assert(
        fc.property(notes, anySettings, (text, s) => {
          const n = analyzeText(text, s);
          const plan = resultsTableEdits(n, { kind: 'all' });
          if (plan.edits.length === 0) return;
          written++;
          const after = applyEdits(text, plan.edits);
          // The statements are exactly the ones before (tables are prose to the parser).
          const m = analyzeText(after, s);
          expect(statementTexts(m)).toEqual(statementTexts(n));
          // Every original character is still there, in order, outside the inserted or replaced spans.
          const sorted = [...plan.edits].sort((a, b) => a.span.start - b.span.start);
          let pos = 0;
          let outPos = 0;
          for (const e of sorted) {
            const keep = text.slice(pos, e.span.start);
            expect(after.slice(outPos, outPos + keep.length)).toBe(keep);
            outPos += keep.length + e.newText.length;
            pos = e.span.end;
          }
          expect(after.slice(outPos)).toBe(text.slice(pos));
          const second = resultsTableEdits(m, { kind: 'all' });
          expect(second.edits, 'the second time changes nothing').toEqual([]);
        }),
        { seed: cfg.seed + 5, numRuns: RUNS },
      );
      expect(written).toBeGreaterThan(RUNS / 4);
    },
    timeoutFor(RUNS, 20),
  );
});
