/**
 * The incremental parser and analyzer (createNoteParser, createAnalyzer) against a fresh parse
 * and analysis: for random notes and random sequences of edits (typed characters, deletions,
 * pasted statements, line breaks, backticks and tildes that open or close fences, container
 * markers, CRLF, settings changes between edits), every step's result is deep-equal to
 * parseNote / analyzeNote of the same text (fast-check, fixed seeds). A few fixed edits also
 * check that the reuse really happens (a state before the edit keeps its result object), so that
 * an analyzer that recomputed everything would not pass for the wrong reason.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeNote, createAnalyzer } from '../src/analyze';
import type { EvaluateSettings } from '../src/evaluate';
import { createNoteParser, findEdit } from '../src/notation/incremental';
import { parseNote } from '../src/notation/parse';

const name = fc.constantFrom('OA', 'RA', 'MA', 'SA', 'C1', 'H1', 'Zone𝔸');
const claim = fc.constantFrom('', ' w=7.3g/kg', ' h=50kJ/kg', ' rh=50%±2', ' dp=10C', ' v=0.85m3/kg', ' wb=18.0C');
const pair = fc.constantFrom(
  'db=24C rh=50%',
  'db=30C wb=20C',
  'db=12C dp=5C',
  'db=18C w=8g/kg',
  'db=20C h=45kJ/kg',
  'db=40C rh=120%',
  'db=20C wb=25C',
  'db=20 rh=50%',
  'dp=5C w=9g/kg',
  'db=75F rh=40%',
);
const statement = fc.oneof(
  {
    weight: 5,
    arbitrary: fc
      .tuple(name, pair, claim, fc.constantFrom('', ' p=90kPa', ' elev=1500m'))
      .map(([n, p, c, o]) => `state ${n}: ${p}${c}${o}`),
  },
  { weight: 2, arbitrary: fc.tuple(name, name, name).map(([m, a, b]) => `mix ${m}: ${a} 30% + ${b} 70%`) },
  {
    weight: 1,
    arbitrary: fc.tuple(name, name, name).map(([m, a, b]) => `mix ${m}: ${a} 1.2kg/s + ${b} 800L/s db=22C`),
  },
  // Mixes by total and remainder (and near-misses of one).
  {
    weight: 1,
    arbitrary: fc
      .tuple(
        name,
        name,
        name,
        fc.constantFrom(
          '0.78kg/s + B rest total=3.9kg/s',
          '20% + B rest',
          '20% + B rest total=3.9kg/s',
          '0.6m3/s + B rest total=3.4m3/s',
          '4kg/s + B rest total=3.9kg/s',
          'rest + B rest total=1kg/s',
          '1kg/s + B 2kg/s total=3kg/s',
        ),
      )
      .map(([m, a, b, tail]) => `mix ${m}: ${a} ${tail.replace('B ', `${b} `)}`),
  },
  {
    weight: 2,
    arbitrary: fc.tuple(name, name, name).map(([p, a, b]) => `process ${p}: ${a} -> ${b} m=2kg/s q_total=-30kW`),
  },
  // Supplies from room loads (by db, by flow, a reference, infeasible), and a process from one.
  {
    weight: 2,
    arbitrary: fc
      .tuple(
        name,
        name,
        fc.constantFrom('db=13.6C', 'm=3.9kg/s', 'q=3.4m3/s shr=0.84', 'db=X.db+0.8K', 'db=26C', 'db=13C rh=90%'),
      )
      .map(([n, r, tail]) => `supply ${n}: ${r} q_sensible=41.5kW q_latent=8kW ${tail.replace(/X\./g, `${r}.`)}`),
  },
  // References between states: defining, shifted, a claim beside them, pressure overrides, broken ones.
  {
    weight: 2,
    arbitrary: fc
      .tuple(
        name,
        name,
        fc.constantFrom(
          'db=24C w=X.w',
          'db=X.db+0.8K w=X.w',
          'w=X.w db=20C rh=50%',
          'db=X.db-1.8F rh=60% p=90kPa',
          'h=X.h+2kJ/kg db=30C',
          'dp=X.dp w=X.w',
          'db=X.db w=X.db',
          'db=X.',
          'db=X.db*2 rh=5%',
        ),
      )
      .map(([n, r, body]) => `state ${n}: ${body.replace(/X\./g, `${r}.`)}`),
  },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      'site: elev=1600m',
      'site: p=84.5kPa',
      'units: IP',
      'units: SI',
      'state : db=',
      'stat X: db=1C',
      '# a comment',
      '',
      '~~',
      '``',
      '~ a tilde',
      '  indented',
      'process PX: OA -> m=1kg/s p=1',
      'process PY: -> SA',
      'mix MX:',
      'mix MY: OA 50% + NOPE 50%',
      'process PZ: OA -> SA x=1',
    ),
  },
);
const fence = fc
  .tuple(
    fc.constantFrom('```air', '~~~air', '> ```air', '- ```air', '```js'),
    fc.array(statement, { maxLength: 7 }),
    fc.boolean(),
  )
  .map(([open, body, closed]) => {
    const prefix = open.startsWith('> ') ? '> ' : open.startsWith('- ') ? '  ' : '';
    const lines = [open, ...body.map((b) => prefix + b)];
    if (closed) lines.push(prefix + (open.includes('~') ? '~~~' : '```'));
    return lines.join('\n');
  });
/**
 * A block whose mixes and processes refer to states defined above them (so that their results depend on those states).
 */
const plant = fc
  .tuple(
    fc.constantFrom('', 'site: elev=800m\n'),
    fc.integer({ min: 18, max: 34 }),
    fc.integer({ min: 20, max: 80 }),
    fc.integer({ min: 5, max: 30 }),
  )
  .map(
    ([site, db, rh, oa]) =>
      `\`\`\`air\n${site}state OA: db=${db}C rh=${rh}%\nstate RA: db=24C rh=50% w=9.3g/kg\nmix MA: ` +
      `OA ${oa}% + RA ${100 - oa}% db=25C\nstate SA: db=13C rh=90%\nprocess CC: MA -> SA m=2kg/s ` +
      `q_total=-40kW\nmix MB: OA 0.5kg/s + MA 1.5kg/s\nprocess HC: SA -> OA q=1.2m3/s\nstate ` +
      `PH: db=OA.db+5K w=OA.w h=60kJ/kg\nstate SB: db=MA.db+0.8K w=MA.w\nsupply SU: RA ` +
      `q_sensible=30kW q_latent=5kW db=SB.db+0.5K\nprocess RM: SU -> RA q_total=35kW\n\`\`\``,
  );
const prose = fc.oneof(
  fc.constantFrom(
    '# Plant room',
    'Some prose.',
    '',
    '- a list item',
    '> quoted',
    '| a | b |\n|---|---|\n| 1 | 2 |',
    '    indented code',
  ),
  statement.map((s) => `The design point is \`${s}\` as agreed.`),
);
const note = fc
  .tuple(
    fc.array(
      fc.oneof({ weight: 2, arbitrary: fence }, { weight: 2, arbitrary: plant }, { weight: 2, arbitrary: prose }),
      { minLength: 1, maxLength: 8 },
    ),
    fc.constantFrom('\n', '\r\n'),
  )
  .map(([parts, eol]) => parts.join('\n\n').replace(/\n/g, eol) + eol);

/** What an edit inserts: characters, statements, structure. */
const insert = fc.oneof(
  {
    weight: 4,
    arbitrary: fc.constantFrom('1', '5', '0', '.', '-', 'C', 'F', '%', 'a', ' ', '=', '#', ':', '+', '±2', 'g/kg'),
  },
  {
    weight: 2,
    arbitrary: fc.constantFrom(
      '`',
      '``',
      '```',
      '~',
      '~~~',
      '\n',
      '\r\n',
      '\r',
      '\t',
      '> ',
      '- ',
      '\n```air\n',
      '\n```\n',
      '\uD83D\uDE00',
      '\u0000',
    ),
  },
  { weight: 2, arbitrary: statement.map((s) => `\n${s}\n`) },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      ' w=9g/kg',
      ' p=95kPa',
      'site: p=80kPa\n',
      '`state Q: db=1C rh=5%`',
      ' w=OA.w',
      ' db=RA.db+1K',
      '.w',
      'OA.',
      '+0.5K',
    ),
  },
  { weight: 2, arbitrary: fc.constant('') },
);

/**
 * One edit: where (a fraction of the text, or a place inside a statement line), how much to delete,
 * what to insert, and the settings of the next analysis.
 */
const edit = fc.record({
  at: fc.double({ min: 0, max: 1, noNaN: true }),
  inStatement: fc.constantFrom<Place>('anywhere', 'statement', 'statement', 'line'),
  del: fc.integer({ min: 0, max: 4 }),
  ins: insert,
  settings: fc.integer({ min: 0, max: 9 }),
});

const SETTINGS: (Partial<EvaluateSettings> | undefined)[] = [
  undefined,
  { units: 'IP' },
  { checkClaims: false },
  { pressurePa: 90_000, pressureOrigin: 'setting' },
];

/** The settings of a step: mostly the sequence's own, sometimes another (as when the user changes them). */
function settingsFor(base: number, n: number): Partial<EvaluateSettings> | undefined {
  return n < 8 ? SETTINGS[base % SETTINGS.length] : SETTINGS[n % SETTINGS.length];
}

/**
 * Where an edit goes: anywhere in the text, into a statement line (where typing usually happens),
 * or into any non-blank line.
 */
type Place = 'anywhere' | 'statement' | 'line';

/** Applies an edit at the place it names. */
function apply(text: string, e: { at: number; inStatement: Place; del: number; ins: string }): string {
  let pos = Math.floor(e.at * (text.length + 1));
  if (e.inStatement !== 'anywhere') {
    const lines = [
      ...text.matchAll(e.inStatement === 'statement' ? /(?:state|mix|process|site)[^\n\r]*/g : /[^\n\r]+/g),
    ];
    if (lines.length > 0) {
      const m = lines[Math.floor(e.at * lines.length) % lines.length]!;
      pos = m.index + Math.floor(((e.at * 7919) % 1) * (m[0].length + 1));
    }
  }
  return text.slice(0, pos) + e.ins + text.slice(pos + e.del);
}

describe('incremental parse', () => {
  it('equals parseNote after every edit of random edit sequences', () => {
    fc.assert(
      fc.property(note, fc.array(edit, { minLength: 1, maxLength: 25 }), (start, edits) => {
        const parser = createNoteParser();
        let text = start;
        expect(parser.parse(text).parsed).toStrictEqual(parseNote(text));
        for (const e of edits) {
          text = apply(text, e);
          const r = parser.parse(text);
          expect(r.parsed).toStrictEqual(parseNote(text));
          expect(r.origins.length).toBe(r.parsed.statements.length);
          expect(r.deltas.length).toBe(r.parsed.statements.length);
        }
      }),
      { seed: 4242, numRuns: 300 },
    );
  });

  it('finds the changed range of two texts', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), fc.string({ maxLength: 200 }), (a, b) => {
        const e = findEdit(a, b);
        expect(a.slice(0, e.start)).toBe(b.slice(0, e.start));
        expect(a.slice(e.oldEnd)).toBe(b.slice(e.newEnd));
        expect(b.slice(0, e.start) + b.slice(e.start, e.newEnd) + b.slice(e.newEnd)).toBe(b);
        expect(e.delta).toBe(b.length - a.length);
        expect(e.start).toBeLessThanOrEqual(Math.min(e.oldEnd, e.newEnd));
      }),
      { seed: 99, numRuns: 2000 },
    );
    // Long texts go through the halving search.
    const long = 'x'.repeat(100_000);
    expect(findEdit(long, `${long.slice(0, 54_321)}y${long.slice(54_322)}`)).toEqual({
      start: 54_321,
      oldEnd: 54_322,
      newEnd: 54_322,
      delta: 0,
    });
  });

  it('sees a fence line that an edit turns into a closing fence, or out of its container', () => {
    // [note, line before, line after, the state names read after the edit]
    const cases: [string, string, string, string[]][] = [
      ['~~~air\nstate A: db=24C rh=50%\n~~\nstate B: db=30C wb=20C\n~~~\n', '~~', '~~~', ['A']],
      ['```air\nstate A: db=24C rh=50%\n``\nstate B: db=30C wb=20C\n```\n', '``', '```', ['A']],
      ['> ```air\n> state A: db=24C rh=50%\n> ``\n> state B: db=30C wb=20C\n> ```\n', '> ``', '> ```', ['A']],
      ['> ```air\n> state A: db=24C rh=50%\n> state B: db=30C wb=20C\n> ```\n', '> state B', 'state B', ['A']],
      ['- ```air\n  state A: db=24C rh=50%\n  state B: db=30C wb=20C\n  ```\n', '  state B', 'state B', ['A']],
    ];
    for (const [text, from, to, names] of cases) {
      const parser = createNoteParser();
      const analyzer = createAnalyzer();
      parser.parse(text);
      analyzer.analyze(text);
      const edited = text.replace(`\n${from}`, `\n${to}`);
      expect(edited).not.toBe(text);
      expect(parser.parse(edited).parsed).toStrictEqual(parseNote(edited));
      expect(analyzer.analyze(edited)).toStrictEqual(analyzeNote(edited));
      expect(parseNote(edited).statements.map((st) => ('name' in st ? st.name?.text : null))).toEqual(names);
    }
  });

  it('reuses the statements an edit inside a fence line does not touch', () => {
    const text = '```air\nstate A: db=24C rh=50%\nstate B: db=30C wb=20C\nstate C: db=12C dp=5C\n```\n';
    const parser = createNoteParser();
    const first = parser.parse(text).parsed;
    const edited = text.replace('wb=20C', 'wb=21C');
    const second = parser.parse(edited);
    expect(second.parsed).toStrictEqual(parseNote(edited));
    expect(second.parsed.statements[0]).toBe(first.statements[0]);
    expect(second.origins[1]).toBeNull();
    expect(second.parsed.statements[2]).toBe(first.statements[2]);
    // One character longer: the statement after the edit is a moved copy of the old one.
    const longer = text.replace('wb=20C', 'wb=20.5C');
    const third = parser.parse(longer);
    expect(third.parsed).toStrictEqual(parseNote(longer));
    expect(third.origins[2]).toBe(second.parsed.statements[2]);
    expect(third.deltas[2]).toBe(2);
  });
});

describe('incremental analysis (createAnalyzer)', () => {
  it('equals analyzeNote after every edit of random edit sequences, settings changes included', () => {
    fc.assert(
      fc.property(
        note,
        fc.integer({ min: 0, max: 3 }),
        fc.array(edit, { minLength: 1, maxLength: 20 }),
        (start, base, edits) => {
          const analyzer = createAnalyzer();
          let text = start;
          expect(analyzer.analyze(text, SETTINGS[base])).toStrictEqual(analyzeNote(text, SETTINGS[base]));
          for (const e of edits) {
            text = apply(text, e);
            const settings = settingsFor(base, e.settings);
            expect(analyzer.analyze(text, settings)).toStrictEqual(analyzeNote(text, settings));
          }
        },
      ),
      { seed: 2718, numRuns: 250 },
    );
  });

  it('re-evaluates a state with references when the state it names changes, and reuses it when not', () => {
    const text = '```air\nstate OA: db=30C rh=40%\nstate PH: db=OA.db+5K w=OA.w\nstate RA: db=24C rh=50%\n```\n';
    const analyzer = createAnalyzer();
    const first = analyzer.analyze(text);
    // An edit below: PH is taken over as it was.
    const below = text.replace('rh=50%', 'rh=55%');
    const second = analyzer.analyze(below);
    expect(second).toStrictEqual(analyzeNote(below));
    expect(second.byName.get('PH')).toBe(first.byName.get('PH'));
    // An edit of OA: PH follows it (no stale result).
    const upstream = below.replace('db=30C', 'db=31C');
    const third = analyzer.analyze(upstream);
    expect(third).toStrictEqual(analyzeNote(upstream));
    const ph = third.byName.get('PH');
    expect(ph?.kind === 'state' && ph.state?.db).toBe(36);
  });

  it('takes a state before the edit over as it was, and moves one after it', () => {
    const text =
      '```air\nsite: elev=1200m\nstate A: db=24C rh=50% w=9g/kg\nstate B: ' +
      'db=30C wb=20C\nmix M: A 30% + B 70%\nstate C: db=12C dp=5C rh=60%\n```\n';
    const analyzer = createAnalyzer();
    const first = analyzer.analyze(text);
    // The same text again is the same analysis.
    expect(analyzer.analyze(text)).toBe(first);
    const edited = text.replace('wb=20C', 'wb=19.5C');
    const second = analyzer.analyze(edited);
    expect(second).toStrictEqual(analyzeNote(edited));
    const a1 = first.byName.get('A');
    const a2 = second.byName.get('A');
    expect(a2).toBe(a1);
    // C moved by two characters: a new result with the same state, its claim on the moved statement.
    const c1 = first.byName.get('C');
    const c2 = second.byName.get('C');
    expect(c2).not.toBe(c1);
    expect(c2?.kind === 'state' && c1?.kind === 'state' && c2.state === c1.state).toBe(true);
    expect(c2?.statement).toBe(second.parsed.statements[4]);
    // A settings change is evaluated afresh (and still equal).
    const ip = analyzer.analyze(edited, { units: 'IP' });
    expect(ip).toStrictEqual(analyzeNote(edited, { units: 'IP' }));
    expect(ip.byName.get('A')).not.toBe(a2);
  });

  it('re-evaluates a process when the flow of the mix it starts from changes but not its state', () => {
    const text =
      '```air\nstate OA: db=30C rh=40%\nstate RA: db=24C rh=50%\nmix MB: OA ' +
      '0.5kg/s + RA 1.5kg/s\nstate SA: db=13C rh=90%\nprocess CC: MB -> SA\n```\n';
    const analyzer = createAnalyzer();
    const first = analyzer.analyze(text);
    // Both flows doubled: the same mixed state, twice the dry-air flow through the coil.
    const edited = text.replace('OA 0.5kg/s + RA 1.5kg/s', 'OA 1.0kg/s + RA 3.0kg/s');
    const second = analyzer.analyze(edited);
    expect(second).toStrictEqual(analyzeNote(edited));
    const q1 = first.byName.get('CC');
    const q2 = second.byName.get('CC');
    expect(q1?.kind === 'process' && q2?.kind === 'process' ? q2.massFlowKgS! / q1.massFlowKgS! : null).toBeCloseTo(
      2,
      12,
    );
  });

  it('re-evaluates a state when the site line above it changes', () => {
    const text = '```air\nsite: elev=1200m\nstate A: db=24C rh=50% w=9.9g/kg\n```\n';
    const analyzer = createAnalyzer();
    analyzer.analyze(text);
    const edited = text.replace('elev=1200m', 'elev=1300m');
    const r = analyzer.analyze(edited);
    expect(r).toStrictEqual(analyzeNote(edited));
    const a = r.byName.get('A');
    expect(a?.kind === 'state' ? a.pressure.elevationM : null).toBe(1300);
  });
});

describe('analysis in steps (what the language server drives between other requests)', () => {
  it('equals analyzeNote, also after runs abandoned half-way (the text changed while it ran)', () => {
    fc.assert(
      fc.property(
        note,
        fc.integer({ min: 0, max: 3 }),
        fc.array(fc.tuple(edit, edit, fc.integer({ min: 0, max: 2 })), { minLength: 1, maxLength: 12 }),
        (start, base, steps) => {
          const analyzer = createAnalyzer();
          let text = start;
          for (const [e, abandoned, pauses] of steps) {
            // A run for an intermediate text, stopped after `pauses` pauses (0: right after it started).
            const run = analyzer.analyzeSteps(apply(text, abandoned), SETTINGS[base]);
            for (let i = 0; i <= pauses; i++) if (run.next().done) break;
            text = apply(text, e);
            const settings = settingsFor(base, e.settings);
            const steps2 = analyzer.analyzeSteps(text, settings);
            let r = steps2.next();
            while (!r.done) r = steps2.next();
            expect(r.value).toStrictEqual(analyzeNote(text, settings));
          }
        },
      ),
      { seed: 31337, numRuns: 60 },
    );
  });

  it('pauses every few hundred statements of a long note', () => {
    const lines = ['```air'];
    for (let i = 0; i < 1000; i++) lines.push(`state S${i}: db=${20 + (i % 9)}C rh=${30 + (i % 40)}%`);
    const text = `${lines.join('\n')}\n\`\`\`\n`;
    const run = createAnalyzer().analyzeSteps(text);
    let pauses = 0;
    let r = run.next();
    while (!r.done) {
      pauses++;
      r = run.next();
    }
    // One after parsing, then one per 256 statements evaluated (after 256, 512 and 768).
    expect(pauses).toBe(4);
    expect(r.value).toStrictEqual(analyzeNote(text));
  });
});
