/**
 * The evaluation that hands its items out as they are made (`evaluateHandingOut`, what the command
 * line writes a large note's results with) against the whole-note evaluation (`evaluate`): the
 * same items in the same order, field for field, and the same diagnostics, on notes whose states
 * are referred to after they were let go (under another site's pressure, by a duplicate name, from
 * a mix, a process, a supply and a heat recovery), and the bytes it keeps per state while it runs
 * (forced collections; counted, never timed). The notes are invented; no figure is checked here
 * (the physics is checked against its sources in the physics and fixture tests).
 */
import { describe, expect, it, vi } from 'vitest';
import { heapBytes } from './heap-helpers';
import { analyzeHandingOut } from '../src/analyze/handingOut';
import { analyzeNote } from '../src/analyze/analyze';
import { evaluate, evaluateHandingOut } from '../src/evaluate/evaluate';
import { ForgottenStates } from '../src/evaluate/forgotten';
import { STATEMENTS_PER_GROUP } from '../src/evaluate/group';
import type { EvaluatedItem, EvaluateSettings, StateResult } from '../src/evaluate/types';
import { parseNote } from '../src/notation/parse';

/** The items a handing-out evaluation of `text` hands out, and its analysis. */
function handedOut(text: string, settings?: Partial<EvaluateSettings>) {
  const evaluation = evaluateHandingOut(text, settings);
  expect(evaluation, 'the note can be evaluated one statement at a time').not.toBeNull();
  const items: EvaluatedItem[] = [];
  const analysis = evaluation!.run((item) => items.push(item));
  return { items, analysis, units: evaluation!.units };
}

/** Checks that handing out gives `evaluate`'s items and diagnostics for `text`; returns the whole analysis. */
function expectSame(text: string, settings?: Partial<EvaluateSettings>) {
  const whole = evaluate(parseNote(text), settings, text);
  const out = handedOut(text, settings);
  expect(JSON.stringify(out.items)).toBe(JSON.stringify(whole.items));
  expect(out.analysis.diagnostics).toEqual(whole.diagnostics);
  expect(out.units).toBe(whole.units);
  expect(out.analysis.units).toBe(whole.units);
  expect(out.analysis.unitsSource).toBe(whole.unitsSource);
  expect(out.analysis.parsed.regions).toEqual(whole.parsed.regions);
  return whole;
}

/** The computed state of `name` in an analysis (it must have been computed). */
function computed(items: readonly EvaluatedItem[], name: string): StateResult {
  const item = items.find((i): i is StateResult => i.name === name && i.kind !== 'process');
  expect(item?.state, `${name} is computed`).toBeTruthy();
  return item!;
}

/** A block of `n` states with distinct names, each from db and rh (invented). */
function statesNote(n: number): string {
  const lines = ['# Plant room states (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${15 + (i % 10)}C rh=${40 + (i % 30)}%`);
  lines.push('```', '');
  return lines.join('\n');
}

/** Invented: the air side of a lab wing, written so that every kind of statement refers to states let go. */
const REFERRING_NOTE = `# Lab wing, level 3 (invented)

\`\`\`air
state OA: db=31C rh=40% h=99kJ/kg        # a claim that fails: reported once, not again when OA is read back
state OVR: db=26C rh=50% p=97kPa         # its own pressure
site: elev=1200m
state RA: db=23C rh=45%
state OA: db=10C rh=10%                  # a second OA: the first stays the one referred to
state OFF: w=OA.w db=OA.db-3K            # read back from a state let go, under sea-level pressure
state RA2: h=RA.h rh=55%                 # read back under the 1200 m pressure
state OVR2: db=OVR.db rh=60%
mix MA: OA 30% + RA 70%
process HTG: RA -> OVR
process CC: MA -> LVG db=13C rh=95%
supply SA: RA q_sensible=12kW q_latent=2kW db=14C
recover HX: OA -> OAHX m=1.2kg/s, RA -> EAHX m=1.0kg/s eff_s=0.65
state BAD: w=OAA.w db=20C                # no such name: the suggestions read the whole note again
state EARLY: w=LATE.w db=20C             # defined further down
state LATE: db=20C rh=50%
\`\`\`

A state in the text, \`state TXT: db=21C rh=48%\`, is kept as it was made.

\`\`\`air
site: p=101.325kPa
state TXT2: w=TXT.w db=RA.db
state RA3: db=RA.db rh=RA.rh             # RA again, now kept
state AFTER: w=LVG.w db=LVG.db+1K        # states a process and a heat recovery defined
state WARM: db=OAHX.db rh=30%
\`\`\`
`;

describe('evaluating a note one statement at a time, keeping nothing', () => {
  it('hands out the items and diagnostics of the whole evaluation, on states read back after they were let go', () => {
    const whole = expectSame(REFERRING_NOTE);
    // Each reference above resolved to a computed state (so the comparison covers the read back).
    for (const name of ['OFF', 'RA2', 'OVR2', 'MA', 'LVG', 'SA', 'OAHX', 'EAHX', 'TXT2', 'RA3', 'AFTER', 'WARM'])
      computed(whole.items, name);
    // OFF takes the first OA's humidity ratio (not the second's), RA2 the enthalpy RA had under the site's pressure.
    const [firstOA, secondOA] = whole.items.filter((i): i is StateResult => i.name === 'OA');
    expect(computed(whole.items, 'OFF').state!.w).toBe(firstOA!.state!.w);
    expect(firstOA!.state!.w).not.toBe(secondOA!.state!.w);
    expect(computed(whole.items, 'RA2').state!.h).toBe(computed(whole.items, 'RA').state!.h);
    expect(computed(whole.items, 'RA').state!.p).toBeLessThan(firstOA!.state!.p);
    const codes = whole.diagnostics.map((d) => d.code);
    for (const code of ['claim-mismatch', 'duplicate-name', 'unknown-name', 'used-before-defined'])
      expect(codes, code).toContain(code);
    // The failed claim of OA, read back three times, is reported once.
    expect(whole.diagnostics.filter((d) => d.code === 'claim-mismatch' && d.message.includes('h'))).toHaveLength(1);
  });

  it('gives the same in IP, with a project rule, and on notes that end mid-statement or hold nothing', () => {
    expectSame(REFERRING_NOTE, { units: 'IP', pressurePa: 90_000, pressureOrigin: 'setting dewmark.pressure' });
    expectSame('# Nothing here\n\nProse only.\n');
    expectSame('```air\nstate A: db=20C rh=\nstate B: w=A.w db=\n');
    expectSame('```air\nstate A db=20C\nmix M: A + \nprocess P: A ->\n```\n');
    const ruled = analyzeHandingOut(REFERRING_NOTE, { rules: { 'unknown-name': 'warning', 'claim-mismatch': 'off' } });
    const items: EvaluatedItem[] = [];
    const a = ruled!.run((i) => items.push(i));
    const b = analyzeNote(REFERRING_NOTE, { rules: { 'unknown-name': 'warning', 'claim-mismatch': 'off' } });
    expect(a.diagnostics).toEqual(b.diagnostics);
    expect(a.diagnostics.some((d) => d.code === 'unknown-name' && d.severity === 'warning')).toBe(true);
    expect(JSON.stringify(items)).toBe(JSON.stringify(b.items));
  });

  it('applies ignore comments as the whole analysis does', () => {
    const text = REFERRING_NOTE.replace(
      'state BAD: w=OAA.w db=20C                # no such name',
      'state BAD: w=OAA.w db=20C   # dewmark-ignore unknown-name -- a placeholder until the survey',
    ).replace('state LATE:', '# dewmark-ignore fog\nstate LATE:');
    const evaluation = analyzeHandingOut(text);
    const a = evaluation!.run(() => {});
    const b = analyzeNote(text);
    expect(a.diagnostics).toEqual(b.diagnostics);
    expect(a.suppressed).toEqual(b.suppressed);
    expect(a.suppressed?.map((d) => d.code)).toEqual(['unknown-name']);
    expect(a.diagnostics.some((d) => d.code === 'ignore-comment')).toBe(true);
  });

  it('gives the same when references cross the groups the statements are evaluated in', () => {
    // Invented: 300 states (several groups of STATEMENTS_PER_GROUP), with references back to
    // states of earlier groups (let go), within a group, forward within a group and into a later
    // group, a duplicate name across groups, and a site line in the middle of a group.
    const lines = ['# Riser states, floors 1 to 300 (invented)', '', '```air'];
    for (let i = 0; i < 300; i++) {
      if (i === 100) lines.push('site: elev=900m');
      if (i % 37 === 5) lines.push(`state R${i}: w=S${i - 5}.w db=S${Math.max(0, i - 70)}.db+1K`);
      else if (i === 60) lines.push('state EARLY: w=S61.w db=20C');
      else if (i === 62) lines.push('state AHEAD: w=S250.w db=20C');
      else if (i === 130) lines.push('state S3: db=30C rh=20%');
      lines.push(`state S${i}: db=${12 + (i % 17)}C rh=${35 + (i % 40)}%`);
    }
    lines.push('```', '');
    const whole = expectSame(lines.join('\n'));
    expect(whole.items.length).toBeGreaterThan(2 * STATEMENTS_PER_GROUP);
    for (const name of ['R42', 'R79', 'R116', 'R264']) computed(whole.items, name);
    const codes = whole.diagnostics.map((d) => d.code);
    for (const code of ['duplicate-name', 'used-before-defined']) expect(codes, code).toContain(code);
  });

  it('makes the slots of the states let go first for a few, then for the note, doubling past that', () => {
    // Counted, not timed: the slots are made by one call at the first state let go and again a
    // few states later (so that the engine has met the call before it optimises `forget`, and a
    // doubling late in a long note keeps its optimised code), then only as the note outgrows
    // them. Invented: 3000 states, a state near the end reading back the first and a middle one.
    const grow = vi.spyOn(ForgottenStates.prototype as unknown as { grow(need: number): void }, 'grow');
    try {
      const text = statesNote(3000).replace('```\n', 'state LAST: w=S0.w db=S1500.db\n```\n');
      const whole = expectSame(text);
      expect(computed(whole.items, 'LAST').state!.w).toBe(computed(whole.items, 'S0').state!.w);
      const needs = grow.mock.calls.map(([need]) => need);
      expect(needs.slice(0, 2)).toEqual([1, 65]);
      // 3000 states: made for a few, then for the ~2500 the note's length suggests, then one doubling.
      expect(needs).toHaveLength(3);
    } finally {
      grow.mockRestore();
    }
  });

  it('hands out nothing for a note that may name other units than the settings, or holds a results table', () => {
    expect(evaluateHandingOut('```air\nstate A: db=20C rh=50%\nunits: IP\n```\n')).toBeNull();
    expect(evaluateHandingOut('Figures below are in `units: IP`.\n')).toBeNull();
    expect(evaluateHandingOut('```air\nunits : SI\n```\n', { units: 'IP' })).toBeNull();
    expect(evaluateHandingOut('```air\nunits: metric\n```\n')).toBeNull();
    expect(evaluateHandingOut('```air\nunits: SI\nunits: SIx\n```\n')).toBeNull();
    // A units: line naming the settings' units is read as it comes (the same as the whole evaluation).
    expect(evaluateHandingOut('```air\nstate A: db=20C rh=50%\nunits: SI\n```\n')!.units).toBe('SI');
    const whole = expectSame('```air\nstate A: db=70F rh=50%\nunits:  IP   # the plant is in IP\nunits: IP\n```\n', {
      units: 'IP',
    });
    expect(whole.unitsSource).toBe('note');
    expectSame('```air\nstate A: db=20C rh=50%\nunits: SI\nstate B: db=A.db rh=40%\nunits: SI\n```\n');
    expect(analyzeHandingOut('```air\nstate A: db=20C rh=50%\n```\n<!-- dewmark-results end -->\n')).toBeNull();
    // The word alone, without the colon, is prose.
    expect(evaluateHandingOut('All units are SI.\n```air\nstate A: db=20C rh=50%\n```\n')).not.toBeNull();
  });

  it('runs no pattern over a note that never writes the word units', () => {
    // The note is searched for the word once; the pattern that reads a units: line (a match tried
    // at every character) runs only over a note that holds it.
    const lines = ['```air'];
    for (let i = 0; i < 200; i++) lines.push(`state S${i}: db=${15 + (i % 10)}C rh=${40 + (i % 30)}%`);
    const text = `${lines.join('\n')}\n\`\`\`\n`;
    const withUnits = `${text}\`units: SI\`\n`;
    const exec = vi.spyOn(RegExp.prototype, 'exec');
    try {
      expect(evaluateHandingOut(text)).not.toBeNull();
      expect(exec.mock.calls.filter((args) => args[0] === text)).toEqual([]);
      expect(evaluateHandingOut(withUnits)).not.toBeNull();
      expect(exec.mock.calls.filter((args) => args[0] === withUnits).length).toBeGreaterThan(0);
    } finally {
      exec.mockRestore();
    }
  });

  it('keeps a fixed amount per state while it runs: its name, and where its line is, not its tree or result', () => {
    const n = 20_000;
    const text = statesNote(n);
    // Warm up, so that compiled code and the parser's shared scratch space are not counted.
    handedOut(statesNote(200));
    let heldWhileRunning = 0;
    const base = heapBytes();
    let seen = 0;
    evaluateHandingOut(text)!.run(() => {
      if (++seen === n) heldWhileRunning = heapBytes() - base;
    });
    expect(seen).toBe(n);
    const perState = heldWhileRunning / n;
    // The name in the table of names (its characters, slot and value) and three 4-byte slots of where its line is.
    expect(perState).toBeLessThan(120);
    // The whole evaluation holds every tree and result by then (several hundred bytes each).
    const before = heapBytes();
    const whole = evaluate(parseNote(text), {}, text);
    const wholePerState = (heapBytes() - before) / n;
    expect(whole.items).toHaveLength(n);
    expect(wholePerState).toBeGreaterThan(4 * perState);
  });
});
