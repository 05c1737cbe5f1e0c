/**
 * What the evaluator and the state solver allocate per state, counted in bytes by the engine's
 * heap profiler (`allocation-helpers.ts`; never timed), and the structure that keeps it low: the
 * shared empty list of warnings, a property read that works its figures out when read (the same
 * doubles as the checked ones), and a registry of names first made with room for the names a note
 * suggests. The notes and figures are invented; no physical value is checked here (the solver's
 * values are checked against their sources in physics-check-values.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { allocatedBytes } from './allocation-helpers';
import { assignedFields } from './field-helpers';
import { evaluate, type EvaluateReuse } from '../src/evaluate/evaluate';
import { solveForNote } from '../src/evaluate/solve';
import { NameTable } from '../src/evaluate/nameTable';
import { readProps, rowOf } from '../src/evaluate/props';
import type { KeySpec } from '../src/evaluate/keys';
import { ReadFigure, ReadPropertyFigure, readQuantity, type ResolvedQuantity } from '../src/evaluate/quantity';
import { EvalContext } from '../src/evaluate/context';
import { NoteNames, statementList } from '../src/evaluate/names';
import { resolveSettings } from '../src/evaluate/settings';
import { STATE_KEYS } from '../src/evaluate/keys';
import type { StateStatement } from '../src/notation/ast';
import { parseNote } from '../src/notation/parse';
import { solveState } from '../src/physics';
import { dewPointFromHumRatio, wetBulbFromHumRatio } from '../src/physics/wetbulb';
import { MoistAir } from '../src/physics/moistAir';

/** A block of `n` states with distinct names, each from db and rh (invented). */
function statesNote(n: number): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${15 + (i % 10)}C rh=${40 + (i % 30)}%`);
  lines.push('```', '');
  return lines.join('\n');
}

/** A pause in which the engine's compiler threads can finish and install what they compile. */
const settle = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 25));

/**
 * `run` made warm (compiled) first, then its bytes per call of `calls`: the least of twelve
 * counts, each after a pause (a count taken while the engine is still compiling a part of `run`
 * on its threads, which on a machine busy with other tests may take a while, holds that part's
 * first, slower form; code that allocates more once compiled still counts more in every round).
 */
async function bytesPerCall(calls: number, run: () => void): Promise<number> {
  for (let i = 0; i < 10; i++) run();
  let least = Number.POSITIVE_INFINITY;
  for (let i = 0; i < 12; i++) {
    await settle();
    least = Math.min(least, await allocatedBytes(run));
  }
  return least / calls;
}

describe('allocation per state', () => {
  it('evaluates a state from db and rh with at most 820 bytes allocated', async () => {
    const n = 4000;
    const text = statesNote(n);
    const parsed = parseNote(text);
    let items = 0;
    const perState = await bytesPerCall(n, () => {
      items = evaluate(parsed, {}, text).items.length;
    });
    expect(items).toBe(n);
    // Kept: its result (7 fields) and its state (13 figures in one array of unboxed doubles); let
    // go: the two properties read, the solver's input and outcome. The properties held their
    // value and band in heap numbers of their own, the solver took its doubles as heap numbers
    // from call to call, a solve made a list for its warnings and a state an object for its
    // pair: about 1000 bytes.
    expect(perState).toBeGreaterThan(300); // the count does see the results
    expect(perState).toBeLessThan(820);
  });

  it('solves a state with at most 400 bytes allocated, the state included', async () => {
    const n = 5000;
    let solved = 0;
    const perCall = await bytesPerCall(n, () => {
      solved = 0;
      for (let i = 0; i < n; i++) {
        const r = solveState({ db: -10 + (i % 50), rh: 0.05 + (i % 90) / 100 }, 101325, { allowFog: true });
        if (r.ok) solved++;
      }
    });
    expect(solved).toBe(n);
    // The state (~190 bytes), the outcome and the input object of the call above. The doubles
    // passed between the solver's steps were heap numbers of their own: about 490 bytes.
    expect(perCall).toBeGreaterThan(150);
    expect(perCall).toBeLessThan(400);
  });

  it('finds a wet-bulb and a dew point with at most 110 bytes allocated', async () => {
    const n = 5000;
    let sum = 0;
    const perCall = await bytesPerCall(n, () => {
      sum = 0;
      for (let i = 0; i < n; i++) {
        const w = 0.0005 + (i % 20) * 0.0002;
        sum += wetBulbFromHumRatio(10 + (i % 40), w, 101325) + dewPointFromHumRatio(w, 101325);
      }
    });
    expect(Number.isFinite(sum)).toBe(true);
    // Each iteration takes its arguments and gives its result in an array of unboxed doubles:
    // what is left is the two figures returned. Passed as arguments, about 200 bytes.
    expect(perCall).toBeLessThan(110);
  });
});

describe('the structure that keeps it low', () => {
  it('shares one frozen empty list of warnings; a solve with warnings keeps its own', () => {
    const a = solveState({ db: 20, rh: 0.5 }, 101325);
    const b = solveState({ db: 25, rh: 0.4 }, 101325);
    expect(a.ok && b.ok).toBe(true);
    if (!a.ok || !b.ok) return;
    expect(a.warnings).toEqual([]);
    expect(a.warnings).toBe(b.warnings);
    expect(Object.isFrozen(a.warnings)).toBe(true);
    // Fog (invented figures: more water than air at 20 °C holds) warns; its list is its own,
    // and neither the next solve with a warning nor one without changes it.
    const fog = solveState({ db: 20, w: 0.03 }, 101325, { allowFog: true });
    expect(fog.ok).toBe(true);
    if (!fog.ok) return;
    expect(fog.warnings.map((w) => w.code)).toEqual(['supersaturated']);
    const first = fog.warnings[0];
    const again = solveState({ db: 10, w: 0.03 }, 101325, { allowFog: true });
    solveState({ db: 21, rh: 0.5 }, 101325);
    expect(again.ok && again.warnings).not.toBe(fog.warnings);
    expect(fog.warnings).toHaveLength(1);
    expect(fog.warnings[0]).toBe(first);
    // A solve that failed leaves nothing behind for the next one.
    expect(solveState({ db: 20, w: -1 }, 101325).ok).toBe(false);
    const next = solveState({ db: 22, rh: 0.45 }, 101325);
    expect(next.ok && next.warnings).toEqual([]);
  });

  it('hands the solver an input of its own per state: six fields, the pair written and nothing else', () => {
    // A figure stored to an object made long before costs the garbage collector's record of the
    // store; one made for the solve does not. The input is the same shape for every pair.
    const seen: { input: object; entries: [string, unknown][] }[] = [];
    const reuse: EvaluateReuse = {
      state: (_ctx, _stmt, _index, compute) => compute(),
      dependent: (_ctx, _stmt, _index, compute) => compute(),
      solve: (input, p, options) => {
        seen.push({ input, entries: Object.entries(input) });
        return solveForNote(input, p, options);
      },
      basis: (basis) => basis,
    };
    const analysis = evaluate(parseNote(statesNote(3)), undefined, undefined, reuse);
    expect(analysis.diagnostics).toEqual([]);
    expect(seen).toHaveLength(3);
    expect(new Set(seen.map((s) => s.input)).size).toBe(3);
    seen.forEach((s, i) => {
      expect(s.entries.map(([k]) => k)).toEqual(['db', 'wb', 'dp', 'rh', 'w', 'h']);
      const values = Object.fromEntries(s.entries) as Record<string, number | undefined>;
      expect(values.db).toBe(15 + i);
      expect(values.rh).toBeCloseTo((40 + i) / 100, 12);
      for (const k of ['wb', 'dp', 'w', 'h']) expect(values[k]).toBeUndefined();
      // Not filled anew by a later solve.
      expect(Object.entries(s.input)).toEqual(s.entries);
    });
  });

  it('finds the row of a key kept in its slot by its characters, for keys of one or two, or as a string', () => {
    // Keys of one slot (a code unit 32 apart at the end, `da` and `dA`; a length 32 apart) and
    // keys of code units far from ASCII: each written as a new string every time, looked up in
    // turn, so that every look-up meets the row another key left in its slot.
    const keys = [
      'da',
      'dA',
      'd',
      'a',
      'aa',
      'a'.repeat(33),
      '\uffff',
      '\uffff\uffff',
      '\u8061a',
      'a\u8061',
      'dbx',
      'dbX',
    ];
    const table = Object.fromEntries(keys.map((k) => [k, { key: k } as unknown as KeySpec]));
    const fresh = (k: string): string => [...k].map((c) => String.fromCharCode(c.charCodeAt(0))).join('');
    for (let round = 0; round < 3; round++) {
      for (const k of keys) expect(rowOf(table, fresh(k))).toBe(table[k]);
      for (const other of ['db', 'dB', 'Da', 'b', '\ufffe', 'aaa', 'constructor', 'toString'])
        expect(rowOf(table, fresh(other))).toBeUndefined();
    }
    // Another table with the same keys has rows of its own.
    const second = Object.fromEntries(keys.map((k) => [k, { key: k } as unknown as KeySpec]));
    for (const k of keys) {
      expect(rowOf(second, fresh(k))).toBe(second[k]);
      expect(rowOf(table, fresh(k))).toBe(table[k]);
    }
  });

  it('reads the same doubles for a property as for the quantity it is written as', () => {
    // Figures in several units, with and without a written band (invented).
    const line =
      'state X: db=75.2F±0.5 wb=14C±2% dp=285.15K rh=45.5% w=7.5g/kg±0.2 h=40kJ/kg±1kJ/kg p=98.7kPa v=0.85m3/kg';
    const text = `\`\`\`air\n${line}\n\`\`\`\n`;
    const stmt = parseNote(text).statements[0] as StateStatement;
    const ctx = new EvalContext(resolveSettings({}), text, 'SI', new NoteNames(statementList([stmt])));
    const { props } = readProps(ctx, stmt.props, STATE_KEYS, 'state X', stmt, 0, true);
    expect(props.map((p) => p.key)).toEqual(['db', 'wb', 'dp', 'rh', 'w', 'h', 'p', 'v']);
    expect(ctx.diagnostics).toEqual([]);
    for (const p of props) {
      const alone = readQuantity(p.prop, p.prop.value!, p.spec);
      expect(alone.ok).toBe(true);
      const q = (alone as { value: ResolvedQuantity }).value;
      expect(Object.is(p.q.si, q.si)).toBe(true);
      expect(Object.is(p.q.toleranceSI, q.toleranceSI)).toBe(true);
      expect(p.q.unit).toBe(q.unit);
      expect(p.q.explicitTolerance).toBe(q.explicitTolerance);
      expect(p.q.unitText).toBe(q.unitText);
    }
  });

  it('makes a registry of names with room for the names expected: it never grows while they are added', () => {
    const n = 50_000;
    const table = new NameTable(n);
    const slots = Reflect.get(table, 'slots') as Int32Array;
    const chars = Reflect.get(table, 'chars') as Uint16Array;
    for (let i = 0; i < n; i++) expect(table.add(`S${i}`, i)).toBe(true);
    expect(Reflect.get(table, 'slots')).toBe(slots); // no doubling: the names were placed once
    expect(Reflect.get(table, 'chars')).toBe(chars);
    expect(table.get('S0')).toBe(0);
    expect(table.get(`S${n - 1}`)).toBe(n - 1);
    expect(table.add('S7', 1)).toBe(false);
    // Without a guess it starts small and grows, with the same answers.
    const small = new NameTable();
    const first = Reflect.get(small, 'slots') as Int32Array;
    for (let i = 0; i < n; i++) small.add(`S${i}`, i);
    expect(Reflect.get(small, 'slots')).not.toBe(first);
    expect(first.length).toBeLessThan(slots.length);
    for (let i = 0; i < n; i += 997) expect(small.get(`S${i}`)).toBe(table.get(`S${i}`));
  });
});

describe('the objects made per state', () => {
  it('sets each field once, in order, with no field defined before the constructor', () => {
    const parsed = parseNote('```air\nstate OA: db=24C rh=50%\n```\n');
    const stmt = parsed.statements[0] as StateStatement;
    const prop = stmt.props[0]!;
    const spec = STATE_KEYS.db!;
    const figure = readQuantity(prop, prop.value!, spec);
    expect(figure.ok).toBe(true);
    const unit = (figure as { value: ResolvedQuantity }).value.unit;
    const cases: [object, readonly string[], () => object][] = [
      [MoistAir.prototype, ['figures', 'fog'], () => new MoistAir([101325, 24], false)],
      [ReadPropertyFigure.prototype, ['unit', 'prop', 'spec', 'key'], () => new ReadPropertyFigure(unit, prop, spec)],
      [
        ReadFigure.prototype,
        ['si', 'unit', 'toleranceSI', 'quantity'],
        () => new ReadFigure(24, unit, 0.5, prop.value!),
      ],
    ];
    for (const [proto, names, make] of cases) {
      expect(assignedFields(proto, names, make)).toEqual({ set: names.length, keys: [...names] });
    }
  });
});
