/**
 * Regressions found by the fuzzing (robustness-fuzz.test.ts), each as the smallest input that
 * showed it: figures at the limits of a double in messages, flows whose heat rates overflow, a
 * completion pattern that took cubic time on a long number, and notes with lone-CR line ends.
 * No figure here comes from a table: the checks are that a message or result is finite and says
 * what is wrong, and that a feature still gives its usual answer.
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import { allFinite } from '../src/evaluate';
import { solveState, stateRecord } from '../src/physics';
import { analyzeText, completions, DEFAULT_SERVICE_SETTINGS, inlayHints } from '../src/service';

const NON_FINITE = /NaN|(?<!reported as −)Infinity|undefined/;

function fenced(...lines: string[]): string {
  return ['```air', ...lines, '```', ''].join('\n');
}

function messages(text: string): { code: string; message: string; severity: string }[] {
  const a = analyzeNote(text);
  expect(allFinite(a), 'no NaN or Infinity in the Analysis').toBe(true);
  return a.diagnostics.map((d) => ({ code: d.code, message: d.message, severity: d.severity }));
}

describe('figures at the limits of a double are reported, not shown as Infinity', () => {
  it('w=-1e308lb/lb is a negative humidity ratio, shown in kg/kg', () => {
    const d = messages(fenced('state A: db=20C w=-1e308lb/lb'));
    const neg = d.find((x) => x.code === 'negative-humidity-ratio');
    expect(neg?.message).toContain('−1e+308 kg/kg');
    for (const x of d) expect(x.message).not.toMatch(NON_FINITE);
  });

  it('rh=0% with w=1e308 is no-solution with a finite figure', () => {
    const d = messages(fenced('state A: rh=0% w=1e308'));
    expect(d.map((x) => x.code)).toContain('no-solution');
    for (const x of d) expect(x.message).not.toMatch(NON_FINITE);
  });

  it('rh with h at a pressure below the vapour pressure at −100 °C is pressure-below-saturation', () => {
    const r = solveState({ rh: 0.01, h: 0 }, 1e-320);
    expect(r.ok ? 'solved' : r.problem.code).toBe('pressure-below-saturation');
    expect(r.ok ? '' : `${r.problem.message} ${r.problem.fix}`).not.toMatch(NON_FINITE);
    const d = messages(fenced('state A: h=0kJ/kg rh=1% p=1e-320Pa'));
    expect(d.map((x) => x.code)).toContain('pressure-below-saturation');
  });

  it('a vapour pressure that underflows to zero is not called a dew point of −Infinity', () => {
    const d = messages(fenced('state A: db=0C p=4.94e-324kPa w=2.47e-321g/kg'));
    expect(d.some((x) => x.severity === 'error')).toBe(true);
    for (const x of d) expect(x.message).not.toMatch(NON_FINITE);
  });

  it('a state whose volume overflows (p=1e-320 Pa, bone-dry) is out-of-range, not ok with v = Infinity', () => {
    const r = solveState({ db: 20, rh: 0 }, 1e-320);
    expect(r.ok ? 'solved' : r.problem.code).toBe('out-of-range');
    const big = solveState({ db: 20, w: 1e308 }, 1e308, { allowFog: true });
    expect(big.ok ? allFinite({ ...stateRecord(big.state), dp: 0, ws: 0 }) : big.problem.code).toBe('out-of-range');
  });

  it('saturated air at −100 °C has no warning about its own dew point', () => {
    const r = solveState({ db: -100, rh: 1 }, 101_325);
    expect(r.ok && r.warnings).toEqual([]);
  });
});

describe('flows that overflow', () => {
  const base = ['state A: db=24C rh=50%', 'state B: db=30C rh=40%'];

  it('a process flow whose heat rates overflow is an out-of-range error on the flow, with no result figures', () => {
    const text = fenced(...base, 'process P: A -> B m=1e307kg/s q_total=5kW', 'process Q: A -> B q=1.7e308m3/s');
    const a = analyzeNote(text);
    expect(allFinite(a)).toBe(true);
    const errs = a.diagnostics.filter((d) => d.code === 'out-of-range');
    expect(errs.map((d) => text.slice(d.span.start, d.span.end))).toEqual(['1e307kg/s', '1.7e308m3/s']);
    for (const d of errs) expect(d.message).toMatch(/too large/);
    const p = a.items.find((i) => i.name === 'P');
    expect(p?.kind === 'process' && [p.massFlowKgS, p.qTotalW, p.volumeFlowM3S]).toEqual([null, null, null]);
  });

  it('a process from a mix whose flow overflows the heat rates, and a mix whose flows overflow their sum', () => {
    const d = messages(
      fenced(...base, 'mix M: A 1e308kg/s + B 1e307kg/s', 'process R: M -> B', 'mix N: A 1e308kg/s + B 1e308kg/s'),
    );
    expect(d.find((x) => x.message.startsWith('process R'))?.code).toBe('out-of-range');
    expect(d.find((x) => x.message.startsWith('mix N'))?.message).toMatch(/too large to add up/);
  });
});

describe('completion on long lines', () => {
  it('after a 20,000-digit number it proposes units at once (the pattern was cubic: 4000 digits took 14 s)', () => {
    const text = fenced(`state A: db=24C w=${'9'.repeat(20_000)}g x`);
    const note = analyzeText(text, DEFAULT_SERVICE_SETTINGS);
    const afterG = text.indexOf('g x') + 1;
    expect(completions(note, afterG)?.items.map((i) => i.label)).toContain('g/kg');
    const end = text.indexOf(' x') + 2;
    expect(completions(note, end)?.items.map((i) => i.label)).toContain('rh');
  });

  it('after a mix stream name of 20,000 characters it proposes amounts', () => {
    const name = `A${'a1'.repeat(10_000)}`;
    const text = fenced(`state ${name}: db=24C rh=50%`, `mix M: ${name} 30`);
    const note = analyzeText(text, DEFAULT_SERVICE_SETTINGS);
    const at = text.indexOf(' 30\n') + 3;
    expect(completions(note, at)?.items.map((i) => i.label)).toContain('%');
  });
});

describe('notes with lone-CR line ends (as the Markdown reader splits them)', () => {
  const text = '```air\rstate A: db=24C rh=50%\rstate B: db=30C rh=40%\rstate C: db=2\r```\r';
  const note = analyzeText(text, DEFAULT_SERVICE_SETTINGS);

  it('each hint sits at the end of its own line', () => {
    const hints = inlayHints(note, { start: 0, end: text.length });
    expect(hints.map((h) => text.slice(h.offset - 3, h.offset))).toEqual(['50%', '40%']);
  });

  it('completion reads only the current line', () => {
    const at = text.indexOf('db=2\r') + 4;
    expect(completions(note, at)?.items.map((i) => i.label)).toContain('C');
    const keyAt = text.indexOf('rh=50%');
    expect(completions(note, keyAt)?.items.map((i) => i.label)).toContain('wb');
  });
});

describe('numbers with huge exponents', () => {
  it('0e400 has a finite value but no finite resolution: bad-number, and no Infinity in the tree', () => {
    const text = fenced(
      'state A: db=0e400C rh=50%',
      'state B: db=20C rh=50% h=0.0e999kJ/kg',
      `process P: A -> B m=0.${'0'.repeat(300)}e30800001kg/s`,
    );
    const a = analyzeNote(text);
    expect(allFinite(a)).toBe(true);
    const bad = a.diagnostics.filter((d) => d.code === 'bad-number').map((d) => text.slice(d.span.start, d.span.end));
    expect(bad.slice(0, 2)).toEqual(['0e400C', '0.0e999kJ/kg']);
    expect(bad.length).toBe(3);
  });
});
