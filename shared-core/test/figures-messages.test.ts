/**
 * Messages speak the note's units: every diagnostic that carries a figure (the engine's
 * feasibility problems, the evaluator's pressures, flows, temperatures and examples), its related
 * notes and the pressure a state was taken at read in IP in an IP note — psia, °F, gr/lb, Btu/lb,
 * lb/h, cfm, Btu/h — and in SI in an SI note. Each case is one short note written as an engineer in
 * the US would write it; the same statements under `units: SI` must show no IP figure.
 */
import { describe, expect, it } from 'vitest';
import { analyzeNote, createAnalyzer } from '../src/analyze';
import type { Analysis, StateResult } from '../src/evaluate/types';
import { hover } from '../src/service';
import { noteOf } from './service-helpers';

/** An SI unit anywhere: a figure (`84.556 kPa`) or notation (`e.g. total=3.9kg/s`). */
const SI_UNIT = /kPa|\bPa\b|kg\/s|kg\/h|\bkW\b|kJ\/kg|g\/kg|m³\/s|m3\/s|L\/s|°C|\d K\b|\d m(?![=\w])|m³\/kg/;
/** An IP figure: a number, a space and an IP unit (notation echoed from the input has no space). */
const IP_FIGURE = /\d (psia|inHg|°F|gr\/lb|Btu\/lb|lb\/h|cfm|Btu\/h|MBH|ft|ft³\/lb)(?![A-Za-z])/;

/** Every text a person reads about the note's problems: messages, related notes, the pressure used. */
function texts(a: Analysis): string[] {
  const out: string[] = [];
  for (const d of a.diagnostics) {
    out.push(d.message);
    for (const r of d.related ?? []) out.push(r.message);
  }
  for (const item of a.items) if (item.kind !== 'process') out.push(item.pressure.describe);
  return out;
}

const note = (units: 'IP' | 'SI', body: string): string =>
  `# Kestrel Ridge café wing\n\n\`\`\`air\nunits: ${units}\nsite: p=14.696psia\n${body}\n\`\`\`\n`;

/**
 * One note per message that carries a figure: the code it must raise and the statements (IP input).
 * Figures are invented demo data for the café wing.
 */
const CASES: readonly { code: string; body: string; figure: RegExp }[] = [
  { code: 'wb-above-db', body: 'state A: db=68F wb=77F', figure: /77\.0 °F/ },
  { code: 'dp-above-db', body: 'state A: db=68F dp=77F', figure: /77\.0 °F/ },
  { code: 'enthalpy-too-low', body: 'state A: db=86F h=10Btu/lb', figure: /10\.00 Btu\/lb/ },
  { code: 'rh-out-of-range', body: 'state A: db=68F rh=120%', figure: /120\.0 %/ },
  { code: 'negative-humidity-ratio', body: 'state A: db=68F w=-7gr/lb', figure: /−7\.0 gr\/lb/ },
  { code: 'out-of-range', body: 'state A: db=500F rh=10%', figure: /−148 °F to 392 °F/ },
  { code: 'wb-too-low', body: 'state A: db=104F wb=41F', figure: /14\.696 psia/ },
  { code: 'pressure-below-saturation', body: 'state A: p=7.25psia db=194F rh=80%', figure: /7\.250 psia/ },
  { code: 'no-solution', body: 'state A: wb=62.6F h=26Btu/lb', figure: /Btu\/lb/ },
  { code: 'ill-conditioned', body: 'state A: wb=62.6F h=28.2Btu/lb', figure: /per 18 °F of dry-bulb/ },
  { code: 'supersaturated', body: 'state A: db=68F w=140gr/lb', figure: /140\.0 gr\/lb/ },
  { code: 'unusual-pressure', body: 'state A: db=68F rh=50% p=84.5inHg', figure: /4\.351 psia to 15\.954 psia/ },
  { code: 'out-of-range', body: 'state A: db=68F rh=50% elev=50000ft', figure: /−16,404 ft to 36,089 ft/ },
  {
    code: 'pressure-mismatch',
    body: 'state A: db=75F rh=50%\nstate B: db=90F rh=20% p=12.2psia\nmix M: A 50% + B 50%',
    figure: /12\.200 psia to 14\.696 psia/,
  },
  {
    code: 'pressure-mismatch',
    body: 'state A: db=75F rh=50%\nstate B: db=90F rh=20% p=12.2psia\nprocess P: A -> B flow=1,000cfm',
    figure: /12\.200 psia/,
  },
  {
    code: 'pressure-mismatch',
    body: 'state R: db=75F rh=50% p=12.2psia\nsupply S: R q_sensible=60,000Btu/h q_latent=12,000Btu/h db=56F',
    figure: /12\.200 psia/,
  },
  {
    code: 'supersaturated',
    body: 'state A: db=10F rh=90%\nstate B: db=95F rh=95%\nmix M: A 50% + B 50%',
    figure: /gr\/lb is above saturation at the mixed dry-bulb [\d.]+ °F/,
  },
  {
    code: 'mix-rest',
    body: 'state A: db=90F wb=60F\nstate B: db=75F rh=50%\nmix M: A 20,000lb/h + B rest total=18,000lb/h',
    figure: /20,000 lb\/h/,
  },
  {
    code: 'impossible-process',
    body: 'state A: db=75F rh=50%\nstate B: db=85F w=60gr/lb\nprocess P: A -> B',
    figure: /gr\/lb\) while the air is heated.*[\d.]+ °F for A/,
  },
  {
    code: 'supply-infeasible',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=6,000Btu/h q_latent=60,000Btu/h db=56F',
    figure: /gr\/lb, below zero/,
  },
  {
    code: 'supply-infeasible',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=60,000Btu/h q_latent=12,000Btu/h db=80F',
    figure: /cooler than R \(75\.0 °F\)/,
  },
  {
    code: 'supply-infeasible',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=60,000Btu/h q_latent=-60,000Btu/h db=56F',
    figure: /above saturation at 56\.0 °F/,
  },
  {
    code: 'out-of-range',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=600,000Btu/h q_latent=1,000Btu/h m=100lb/h',
    figure: /outside −148 °F to 392 °F/,
  },
  {
    code: 'spec-unreachable',
    body: 'state A: db=75F rh=50%\nprocess HU: A -> B steam w=20gr/lb',
    figure: /20\.0 gr\/lb is below the entering [\d.]+ gr\/lb/,
  },
  {
    code: 'spec-unreachable',
    body: 'state A: db=90F wb=60F\nprocess EC: A -> B adiabatic db=50F',
    figure: /wet-bulb 60\.0 °F/,
  },
  {
    code: 'spec-unreachable',
    body: 'state A: db=75F rh=50%\nprocess C: A -> B db=40F',
    figure: /below its dew point [\d.]+ °F/,
  },
  {
    code: 'spec-unreachable',
    body: 'state A: db=75F rh=50%\nprocess C: A -> B adp=80F bf=0.1',
    figure: /80\.0 °F is not below the entering dry-bulb 75\.0 °F/,
  },
  {
    code: 'recovery-frost',
    body:
      'state OA: db=20F rh=60%\nstate EA: db=72F rh=50%\nrecover ' +
      'HX: OA -> OA2 m=9,000lb/h, EA -> EA2 m=9,000lb/h eff_s=0.75',
    figure: /°F/,
  },
  {
    code: 'claim-mismatch',
    body: 'state A: db=90F wb=60F\nstate B: db=55F rh=90%\nprocess CC: A -> B m=18,000lb/h q_total=100,000Btu/h',
    figure: /at 18,000 lb\/h dry air/,
  },
  { code: 'underspecified', body: 'site:', figure: /p=12\.2psia|elev=5250ft/ },
  { code: 'underspecified', body: 'state A: rh=50%', figure: /db=75F/ },
  {
    code: 'underspecified',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=60,000Btu/h',
    figure: /Btu\/h/,
  },
  {
    code: 'underspecified',
    body: 'state R: db=75F rh=50%\nsupply S: R q_sensible=60,000Btu/h q_latent=12,000Btu/h',
    figure: /db=56\.5F.*lb\/h.*cfm/,
  },
  {
    code: 'mix-rest',
    body: 'state A: db=90F wb=60F\nstate B: db=75F rh=50%\nmix M: A 20% + B rest total=5,000cfm',
    figure: /lb\/h/,
  },
  { code: 'spec-missing', body: 'state A: db=75F rh=50%\nprocess HU: A -> B steam', figure: /gr\/lb/ },
  { code: 'spec-missing', body: 'state A: db=75F rh=50%\nprocess C: A -> B bf=0.1', figure: /adp=52F/ },
  {
    code: 'spec-missing',
    body: 'state OA: db=20F rh=60%\nstate EA: db=72F rh=50%\nrecover HX: OA -> OA2, EA -> EA2 eff_s=0.75',
    figure: /lb\/h or q=/,
  },
];

describe('messages of an IP note speak IP', () => {
  for (const c of CASES) {
    it(`${c.code}: ${c.body.split('\n').pop()}`, () => {
      const a = analyzeNote(note('IP', c.body));
      expect(a.units).toBe('IP');
      const raised = a.diagnostics.filter((d) => d.code === c.code);
      expect(raised.length, `${c.code} raised; got ${a.diagnostics.map((d) => d.code).join(', ')}`).toBeGreaterThan(0);
      expect(raised.map((d) => d.message).join('\n')).toMatch(c.figure);
      for (const t of texts(a)) expect(t, 'no SI unit in an IP note').not.toMatch(SI_UNIT);
    });
  }

  it('the same statements in an SI note show no IP figure', () => {
    for (const c of CASES) {
      const a = analyzeNote(note('SI', c.body));
      expect(a.units).toBe('SI');
      expect(
        a.diagnostics.some((d) => d.code === c.code),
        c.body,
      ).toBe(true);
      for (const t of texts(a)) expect(t, `no IP figure in an SI note (${c.body})`).not.toMatch(IP_FIGURE);
    }
  });

  it('an analyzer that keeps its previous run re-writes the messages when the units: line changes', () => {
    const analyzer = createAnalyzer();
    const ip = note('IP', 'state A: db=68F wb=77F');
    expect(analyzer.analyze(ip).diagnostics[0]?.message).toMatch(/77\.0 °F/);
    const si = analyzer.analyze(ip.replace('units: IP', 'units: SI'));
    expect(si.diagnostics[0]?.message).toMatch(/25\.0 °C/);
    expect(si.diagnostics).toEqual(analyzeNote(ip.replace('units: IP', 'units: SI')).diagnostics);
  });

  it('a units: line anywhere in the note sets the units of messages above it too', () => {
    const a = analyzeNote('```air\nsite: p=14.696psia\nstate A: db=68F wb=77F\nunits: IP\n```\n');
    const d = a.diagnostics.find((x) => x.code === 'wb-above-db');
    expect(d?.message).toMatch(/wet-bulb 77\.0 °F is above the dry-bulb 68\.0 °F/);
  });

  it('an IP note’s figures use the one formatter: the same figure reads the same in a message and a hover', () => {
    // Pressure at 5000 ft from ASHRAE HoF 2017 IP Ch.1 eq 3 / Table 1: 12.228 psia (from memory).
    const text = '```air\nunits: IP\nsite: elev=5000ft\nstate A: db=68F wb=77F\nstate B: db=75F rh=50%\n```\n';
    const a = analyzeNote(text);
    const d = a.diagnostics.find((x) => x.code === 'wb-above-db');
    expect(d?.related?.map((r) => r.message).join(' ') ?? '').not.toMatch(SI_UNIT);
    const b = a.items.find((i) => i.name === 'B' && i.kind === 'state') as StateResult;
    expect(b.pressure.describe).toBe('site line 3: elev=5000ft → 12.228 psia (standard atmosphere)');
    const n = noteOf(text);
    const h = hover(n, text.indexOf('B:'));
    expect(h?.markdown).toContain('12.228');
    expect(h?.markdown ?? '').not.toMatch(/kPa/);
  });
  it('a figure at the top of the number range reads as a number, never Infinity', () => {
    // 1.7976931348623157e308 m is the largest double; 4 significant figures round it up to
    // 1.798e308, which is beyond the range of a double (found by the fuzz run, seed 20260701).
    const a = analyzeNote('```air\nunits: IP\nsite: elev=1.7976931348623157e308m\n```\n');
    const d = a.diagnostics.find((x) => x.code === 'out-of-range');
    expect(d?.message).toMatch(/Elevation 1\.798e\+308 m is outside/);
    expect(d?.message).not.toMatch(/Infinity/);
  });
});
