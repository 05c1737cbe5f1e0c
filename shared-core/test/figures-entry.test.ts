/**
 * Figures as engineers write them: thousands separators, which trailing zeros count in a claim's
 * band, and that no suggestion (message or quick fix) ever changes a figure's magnitude.
 */
import { describe, expect, it } from 'vitest';
import type { CoreDiagnostic } from '../src/notation/ast';
import { parseNote } from '../src/notation/parse';
import { analyzeNote } from '../src/analyze';
import { significantResolution, withThousandsSeparators } from '../src/notation/number';
import { codeActions, noteDiagnostics } from '../src/service';
import { lookupUnit, toSI } from '../src/units';
import { air, applyEdits, noteOf } from './service-helpers';

/** The number written after `x=` in a state statement. */
function numberOf(written: string) {
  const parsed = parseNote(air(`state A: x=${written}`));
  const st = parsed.statements[0];
  const v = st && st.keyword === 'state' ? st.props[0]?.value : undefined;
  return { value: v?.number, diagnostics: parsed.diagnostics };
}

function badNumber(written: string): CoreDiagnostic {
  const { diagnostics } = numberOf(written);
  const d = diagnostics.find((x) => x.code === 'bad-number');
  expect(d, `a bad-number diagnostic for ${written}`).toBeDefined();
  return d!;
}

describe('thousands separators', () => {
  it('reads groups of three after a first group of one to three digits', () => {
    // The notation's own rule (common practice in US engineering documents): "," groups thousands.
    for (const [written, value, resolution] of [
      ['169,100Btu/h', 169100, 1],
      ['8,745cfm', 8745, 1],
      ['1,234,567.25W', 1234567.25, 0.01],
      ['-12,000lb/h', -12000, 1],
      ['\u22121,500W', -1500, 1],
      ['1,234e3W', 1234000, 1000],
    ] as const) {
      const { value: n, diagnostics } = numberOf(written);
      expect(diagnostics, written).toEqual([]);
      expect(n?.value, written).toBe(value);
      expect(n?.resolution, written).toBe(resolution);
      expect(n?.text, written).toBe(written.replace(/[A-Za-z/]+$/, ''));
    }
  });

  it('keeps the exact value for long grouped numbers (beyond 15 digits)', () => {
    const { value: n } = numberOf('1,234,567,890,123,456,789W');
    expect(n?.value).toBe(Number('1234567890123456789'));
  });

  it('refuses groupings that are not groups of three, proposing no figure that could change the magnitude', () => {
    for (const written of ['1,23,456W', '1234,567W', '1,2345W', '12,3456W', '1,234,5W', '1.234,5W', '12,34,567W']) {
      const d = badNumber(written);
      expect(d.message, written).toContain(`'${written}' is not a number`);
      expect(d.message, written).toContain('thousands separator');
      // No figure built from the written digits is offered (only the fixed examples 8,745 / 1,234,567.5 / 24.5).
      const digits = written.replace(/[^0-9]/g, '');
      const proposed = (d.message.replace(`'${written}'`, '').match(/[0-9][0-9.,]*/g) ?? []).map((s) =>
        s.replace(/[^0-9]/g, ''),
      );
      expect(
        proposed.filter((p) => p === digits),
        `${written}: ${d.message}`,
      ).toEqual([]);
    }
  });

  it('proposes a decimal point only where a comma can be nothing else', () => {
    expect(badNumber('24,5C').message).toContain('(24.5C)');
    expect(badNumber('0,75kg/s').message).toContain('(0.75kg/s)');
    expect(badNumber('1,5C').message).toContain('(1.5C)');
    expect(badNumber('0,0093kg/kg').message).toContain('(0.0093kg/kg)');
    expect(badNumber('0,500kg/s').message).toContain('(0.500kg/s)');
  });

  it('leaves a comma between properties to the property reader', () => {
    const parsed = parseNote(air('state A: db=24C,rh=50%'));
    expect(parsed.diagnostics.map((d) => d.code)).toEqual(['syntax']);
  });

  it('writes grouped figures that read back to the same value', () => {
    for (const [plain, grouped] of [
      ['277262', '277,262'],
      ['-1234.5', '-1,234.5'],
      ['999', '999'],
      ['1000000', '1,000,000'],
      ['0.000123', '0.000123'],
      ['1.5e6', '1.5e6'],
    ] as const) {
      expect(withThousandsSeparators(plain)).toBe(grouped);
      expect(numberOf(`${grouped}W`).value?.value).toBe(Number(plain));
    }
  });
});

describe('trailing zeros of a whole number are not significant unless marked', () => {
  it('reads the place value of the last significant digit', () => {
    // The usual engineering reading of significant figures (common practice), with at least two
    // significant digits read (the notation's own rule).
    const r = (written: string) => {
      const n = numberOf(`${written}W`).value!;
      return significantResolution(n.text, n.resolution);
    };
    expect(r('39700')).toBe(100);
    expect(r('169,100')).toBe(100);
    expect(r('1000')).toBe(100);
    expect(r('500')).toBe(10);
    expect(r('50')).toBe(1);
    expect(r('0')).toBe(1);
    expect(r('8,745')).toBe(1);
    expect(r('39700.')).toBe(1);
    expect(r('39700.0')).toBe(0.1);
    expect(r('3.970e4')).toBe(10);
    expect(r('-12,000')).toBe(1000);
  });

  // A to B: sensible heating of 10 K at W = 0.010 kg/kg and 1 kg/s dry air:
  // q = (1.006 + 1.86 × 0.010) × 10 = 10.2460 kW (ASHRAE HoF 2017 SI Ch.1 eq 32, the sensible part
  // as docs/notation.md defines it).
  const heater = (claim: string) =>
    noteDiagnostics(
      noteOf(air('state A: db=20C w=10g/kg', 'state B: db=30C w=10g/kg', `process H: A -> B m=1kg/s ${claim}`)),
    ).filter((d) => d.code === 'claim-mismatch');

  it('checks 10200W to ±50 W (not ±0.5 W) and 10200.W to ±0.5 W', () => {
    expect(heater('q_sensible=10200W')).toEqual([]); // 10246 − 10200 = 46 ≤ 50
    expect(heater('q_sensible=10,200W')).toEqual([]);
    expect(heater('q_sensible=10300W')).toHaveLength(1); // 54 > 50
    expect(heater('q_sensible=10200.W')).toHaveLength(1); // marked: ±0.5 W
    expect(heater('q_sensible=10200W±10')).toHaveLength(1); // marked by an explicit band
    expect(heater('q_sensible=10246.W')).toEqual([]);
  });

  it('reads temperatures and percentages to their last written digit whatever it is', () => {
    const mismatches = (line: string) => noteDiagnostics(noteOf(air(line))).filter((x) => x.code === 'claim-mismatch');
    // 140 °F db, 26.4 % rh: wet-bulb 100.6 °F (PsychroLib 1.1.1 as oracle, GetTWetBulbFromRelHum
    // at 14.696 psia). "100F" is read to ±0.5 °F, not to the ±5 °F two significant digits would give.
    expect(mismatches('state A: db=140F rh=26.4% wb=100F')).toHaveLength(1);
    expect(mismatches('state A: db=140F rh=26.4% wb=101F')).toEqual([]);
    // dp 0.1 K below a 20 °C db: rh = p_ws(19.9 °C) / p_ws(20 °C) ≈ 99.4 % (eq 6, from first
    // principles), outside the ±0.5 % that "100%" is read to.
    expect(mismatches('state S: db=20C dp=19.9C rh=100%')).toHaveLength(1);
    expect(mismatches('state S: db=20C dp=19.9C rh=99%')).toEqual([]);
  });
});

describe('no suggestion changes a figure’s magnitude', () => {
  /**
   * Every written value of a note by `line:key` (stream amounts by `line:name`): its number and,
   * with a known unit, its SI value.
   */
  function figures(text: string): Map<string, { number: number; si: number | null }> {
    const out = new Map<string, { number: number; si: number | null }>();
    const lines = text.split('\n');
    const lineOf = (offset: number) => text.slice(0, offset).split('\n').length;
    for (const st of parseNote(text).statements) {
      const items: { key: string; q: NonNullable<import('../src/notation/ast').PropertyNode['value']> }[] = [];
      if (st.keyword === 'mix') for (const s of st.streams) if (s.amount) items.push({ key: s.name.text, q: s.amount });
      if ('props' in st) for (const p of st.props) if (p.value) items.push({ key: p.key, q: p.value });
      for (const { key, q } of items) {
        const unit = q.unit ? lookupUnit(q.unit.text) : undefined;
        out.set(`${lineOf(q.span.start)}:${key}`, {
          number: q.number.value,
          si: unit ? toSI(q.number.value, unit) : null,
        });
      }
    }
    expect(lines.length).toBeGreaterThan(0);
    return out;
  }

  // An IP note with grouped figures and one fault of each kind that has a quick fix.
  const note = air(
    'units: IP',
    'state OA: db=95F wb=76F',
    'state RA: db=75F rh=50%',
    'state MISS: db=70 rh=50%',
    'state SW: db=60F wb=70F',
    'state WU: db=75F w=65gr/lbs',
    'mix MA: OA 1,500cfm + RA 7,245cfm',
    'state OFF: db=55F rh=95% w=62gr/lb',
    'process CC: MA -> OFF q=8,745cfm q_total=169,100Btu/h q_sensible=39700Btu/h water=40lb/h',
    'process HX: RA -> OA m=12,000lb/h q_total=1,000Btuh',
    'process P2: OA -> RA m=1,200kg/h q_total=1,500W',
  );

  it('covers every kind of quick fix and both conversions', () => {
    const actions = codeActions(noteOf(note), { start: 0, end: note.length });
    const titles = actions.map((a) => a.title).join('\n');
    for (const kind of ['Add unit', 'Swap the dry-bulb', 'Replace the stale claim', 'Change unit', 'to IP', 'to SI'])
      expect(titles, kind).toContain(kind);
  });

  it('keeps every figure’s size, except a stale claim (which becomes the computed value) and a swap', () => {
    const before = figures(note);
    const n = noteOf(note);
    const actions = codeActions(n, { start: 0, end: note.length });
    expect(actions.length).toBeGreaterThan(8);
    for (const action of actions) {
      const text = applyEdits(note, action.edits);
      const after = figures(text);
      for (const [where, b] of before) {
        const a = after.get(where);
        expect(a, `${action.title}: ${where} still there`).toBeDefined();
        if (!a || (a.number === b.number && a.si === b.si)) continue;
        const what = `${action.title}: ${where} ${b.number} → ${a.number}`;
        if (action.title.startsWith('Swap')) {
          const other = before.get(where.replace(/:(db|wb)$/, (_, k: string) => (k === 'db' ? ':wb' : ':db')));
          expect(a.number, what).toBe(other?.number);
        } else if (action.title.startsWith('Replace the stale claim')) {
          // The new figure is the computed value in the written unit: within the claim's band of it.
          const d = action.diagnostic!;
          expect(Math.abs((a.si as number) - (d.data!.computedSI as number)), what).toBeLessThanOrEqual(
            (d.data!.toleranceSI as number) * 1.000001,
          );
        } else if (b.si !== null && a.si !== null) {
          // A conversion: the same quantity to the precision written (4 significant figures for flows).
          expect(Math.abs(a.si - b.si), what).toBeLessThanOrEqual(Math.abs(b.si) * 0.002 + 0.06);
        } else {
          expect(a.number, what).toBe(b.number);
        }
      }
    }
  });

  it('replaces a stale grouped claim with a grouped figure of the computed size', () => {
    const n = noteOf(note);
    const fix = codeActions(n, { start: 0, end: note.length }).find((a) => a.title.includes('q_total=169,100Btu/h'));
    expect(fix).toBeDefined();
    const newText = fix!.edits[0]!.newText;
    expect(newText).toMatch(/^\d{1,3}(,\d{3})+$/);
    const after = applyEdits(note, fix!.edits);
    expect(
      noteDiagnostics(noteOf(after)).filter(
        (d) => d.code === 'claim-mismatch' && d.message.includes('q_total=') && d.message.includes('MA -> OFF'),
      ),
    ).toEqual([]);
  });
});

describe('volume flow: q= and its other names flow= and V=', () => {
  const base = ['units: IP', 'state MA: db=80F wb=65F', 'state OFF: db=55F rh=90%'];
  const processOf = (flow: string) => {
    const a = analyzeNote(air(...base, `process CC: MA -> OFF ${flow}`));
    return { a, p: a.items.find((i) => i.kind === 'process') as import('../src/evaluate/types').ProcessResult };
  };

  it('reads flow= and V= exactly as q=, and keeps q= working', () => {
    const q = processOf('q=8,745cfm').p;
    // 8745 cfm = 8745 × 0.3048³ / 60 m³/s = 4.1272 m³/s (exact unit definitions, NIST SP 811).
    expect(Math.abs(q.volumeFlowM3S! - (8745 * 0.3048 ** 3) / 60)).toBeLessThan(1e-9);
    for (const written of ['flow=8,745cfm', 'V=8,745cfm', 'flow=8745cfm']) {
      const { a, p } = processOf(written);
      expect(a.diagnostics, written).toEqual([]);
      expect(p.massFlowKgS, written).toBe(q.massFlowKgS);
      expect(p.qTotalW, written).toBe(q.qTotalW);
    }
  });

  it('refuses two names for the one flow, and m= with flow=', () => {
    expect(processOf('q=8745cfm flow=8745cfm').a.diagnostics.map((d) => d.code)).toEqual(['flow-conflict']);
    const both = processOf('m=600lb/min V=8745cfm').a.diagnostics;
    expect(both.map((d) => d.code)).toEqual(['flow-conflict']);
    expect(both[0]!.message).toContain('m= and V=');
  });
});
