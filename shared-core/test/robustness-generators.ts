/**
 * Random notes for the robustness tests (fast-check arbitraries) and the checks every analysed note
 * must pass. A note is a mix of valid statements, near-misses (wrong units, swapped keys, extreme
 * numbers such as 1e308, -0, NaN and Infinity written out), garbage, characters outside the BMP,
 * lone surrogates, CRLF or lone CR line ends, a byte-order mark and very long lines.
 *
 * The seed and the number of runs come from `DEWMARK_FUZZ_SEED` and `DEWMARK_FUZZ_RUNS` (see
 * {@link fuzzConfig}); every test prints the seed it used, so a failure is reproduced with
 * `DEWMARK_FUZZ_SEED=<seed> npx vitest run <file>` (fast-check also prints the failing path).
 */
import fc from 'fast-check';
import {
  analyzeText,
  codeActions,
  completions,
  countDiagnostics,
  definition,
  documentSymbols,
  hover,
  inlayHints,
  noteDiagnostics,
  noteStatus,
  prepareRename,
  references,
  rename,
  HINT_KEYS,
  type HintKey,
  type Note,
  type ServiceSettings,
  type Span,
} from '../src/service';
import { allFinite } from '../src/evaluate';
import { keysOf } from '../src/vocabulary/keys';

// ---------------------------------------------------------------------------------------------
// Configuration

/** Seed and sizes of one fuzzing run. */
export interface FuzzConfig {
  seed: number;
  /** Random notes through parse, evaluate and every service feature. */
  notes: number;
  /** Random edit sequences through the in-memory service. */
  editSequences: number;
  /** Random edits through the real protocol (a spawned server). */
  protocolEdits: number;
  /** True when the counts came from the environment (a long run), not the CI defaults. */
  long: boolean;
}

/** CI defaults: a few thousand notes, a few hundred edit sequences (about a minute on two cores). */
export const CI_DEFAULTS = { notes: 4000, editSequences: 800, protocolEdits: 500 } as const;

function envInt(name: string): number | null {
  const raw = process.env[name];
  if (raw === undefined || raw.trim() === '') return null;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0) throw new Error(`${name} must be a non-negative integer, got '${raw}'`);
  return n;
}

/**
 * The run's configuration: `DEWMARK_FUZZ_SEED` (default: a fixed seed, so CI is reproducible),
 * `DEWMARK_FUZZ_RUNS` (notes; the edit sequences are a tenth of it and the protocol edits a
 * hundredth, at least the CI figures), `DEWMARK_FUZZ_EDITS` and `DEWMARK_FUZZ_PROTOCOL_EDITS` to
 * set those two on their own.
 */
export function fuzzConfig(): FuzzConfig {
  const seed = envInt('DEWMARK_FUZZ_SEED') ?? 20_260_701;
  const runs = envInt('DEWMARK_FUZZ_RUNS');
  const notes = runs ?? CI_DEFAULTS.notes;
  const editSequences =
    envInt('DEWMARK_FUZZ_EDITS') ?? (runs === null ? CI_DEFAULTS.editSequences : Math.max(1, Math.round(runs / 10)));
  const protocolEdits =
    envInt('DEWMARK_FUZZ_PROTOCOL_EDITS') ??
    (runs === null ? CI_DEFAULTS.protocolEdits : Math.max(CI_DEFAULTS.protocolEdits, Math.round(runs / 100)));
  return { seed, notes, editSequences, protocolEdits, long: runs !== null };
}

/** A vitest timeout for `count` units of work at `msEach`, never below a minute. */
export function timeoutFor(count: number, msEach: number): number {
  return Math.max(60_000, Math.ceil(count * msEach * 4));
}

// ---------------------------------------------------------------------------------------------
// Pieces of notes

const LONE_SURROGATES = ['\uD800', '\uDBFF', '\uDC00', '\uDFFF'];
const ASTRAL = ['😀', '𝔸', '𠀀', '🏳️‍🌈', '\u{10FFFF}', '\u{1F4A9}'];
const ODD_CHARS = [
  '\u0000',
  '\u0007',
  '\u000B',
  '\u000C',
  '\u0085',
  '\u2028',
  '\u2029',
  '\u00A0',
  '\u200B',
  '\uFEFF',
  '\uFFFD',
  '\u202E',
  '\t',
  '`',
  '```',
  '~~~',
  '#',
  '=',
  '+',
  '->',
  '%',
  '±',
  '°',
  '\\',
];

/** Random characters: any code point, lone surrogates, controls, and the notation's own punctuation. */
export function garbage(maxLength: number): fc.Arbitrary<string> {
  return fc
    .array(
      fc.oneof(
        { weight: 6, arbitrary: fc.string({ unit: 'binary', maxLength: 4 }) },
        { weight: 2, arbitrary: fc.constantFrom(...ASTRAL) },
        { weight: 1, arbitrary: fc.constantFrom(...LONE_SURROGATES) },
        { weight: 3, arbitrary: fc.constantFrom(...ODD_CHARS) },
        { weight: 3, arbitrary: fc.string({ unit: 'grapheme-ascii', maxLength: 6 }) },
      ),
      { maxLength: Math.max(1, Math.ceil(maxLength / 4)) },
    )
    .map((parts) => parts.join(''));
}

const NAMES = ['OA', 'RA', 'MA', 'SA', 'OFF', 'A', 'B', 'C1', 'AHU-3_off_coil', 'x', 'Zz9'];
const ODD_NAMES = ['state', 'mix', '3A', '-A', 'A😀', 'Ä', 'A:B', '', 'A'.repeat(300), 'ＡＢ'];

/** A name: mostly from a small pool (so references resolve), sometimes an odd one. */
export const name: fc.Arbitrary<string> = fc.oneof(
  { weight: 8, arbitrary: fc.constantFrom(...NAMES) },
  { weight: 1, arbitrary: fc.constantFrom(...ODD_NAMES) },
);

const NUMBERS_ORDINARY = fc.oneof(
  fc.integer({ min: -60, max: 250 }).map(String),
  fc.double({ min: -120, max: 220, noNaN: true }).map((x) => x.toFixed(fcDigits(x))),
  fc.double({ min: 0, max: 0.05, noNaN: true }).map((x) => x.toPrecision(3)),
  fc.integer({ min: 0, max: 100 }).map(String),
);
function fcDigits(x: number): number {
  return Math.abs(Math.round(x * 7)) % 4;
}

/** Numbers at and beyond the edges of a double, and spellings that are not numbers. */
const NUMBERS_EXTREME = fc.constantFrom(
  '1e308',
  '-1e308',
  '1.7976931348623157e308',
  '1e309',
  '-1e309',
  '1e-320',
  '5e-324',
  '-0',
  '-0.0',
  '0',
  '0.000',
  'NaN',
  'Infinity',
  '-Infinity',
  '+Infinity',
  'inf',
  '1e99999',
  '1e-99999',
  '00012',
  '1.2.3',
  '+5',
  '−5',
  '.5',
  '5.',
  '9'.repeat(400),
  `0.${'0'.repeat(300)}1`,
  '0x1F',
  '1_000',
  '1,5',
  '1e',
  '1e+',
  '--5',
  '٣',
  '１２',
);

/** A number as written: ordinary most of the time, extreme or not a number otherwise. */
export const numberText: fc.Arbitrary<string> = fc.oneof(
  { weight: 5, arbitrary: NUMBERS_ORDINARY },
  { weight: 2, arbitrary: NUMBERS_EXTREME },
);

const UNITS_BY_KEY: Record<string, string[]> = {
  db: ['C', '°C', 'F', '°F', 'K', 'R'],
  wb: ['C', 'F', 'K'],
  dp: ['C', '°F'],
  rh: ['%'],
  w: ['g/kg', 'kg/kg', 'gr/lb', 'lb/lb', ''],
  h: ['kJ/kg', 'J/kg', 'Btu/lb'],
  v: ['m3/kg', 'ft3/lb'],
  p: ['kPa', 'Pa', 'hPa', 'mbar', 'bar', 'atm', 'psia', 'psi', 'inHg'],
  elev: ['m', 'ft'],
  m: ['kg/s', 'kg/h', 'lb/h', 'lb/min'],
  q: ['m3/s', 'L/s', 'm3/h', 'cfm'],
  q_total: ['kW', 'W', 'MW', 'Btu/h', 'MBH', 'ton'],
  q_sensible: ['kW', 'Btu/h'],
  q_latent: ['kW'],
  q_coil: ['kW'],
  shr: ['', '%'],
  water: ['kg/h', 'kg/s', 'lb/h'],
  heat: ['kW', 'W', 'Btu/h'],
  dt: ['K', 'C', 'F', ''],
  dp_fan: ['Pa', 'kPa', 'inHg'],
  eff: ['', '%'],
  eff_motor: ['', '%'],
  adp: ['C', 'F'],
  bf: ['', '%'],
  p_steam: ['kPa', 'Pa'],
  eff_s: ['', '%'],
  eff_l: ['', '%'],
};
/** The keys of a state line, from the key table. */
const STATE_KEYS = Object.keys(keysOf('state'));
const PROCESS_KEYS = Object.keys(keysOf('process'));
/** Keys with which a process defines its leaving state (and the recover keys). */
const DERIVE_KEYS = ['heat', 'dt', 'dp_fan', 'eff', 'eff_motor', 'adp', 'bf', 'p_steam', 'rh', 'w'];
const RECOVER_KEYS = ['m', 'q', 'eff_s', 'eff_l', 'q_sensible', 'q_total'];
const WRONG_UNITS = [
  'degC',
  'C°',
  'kpa',
  'KPA',
  'g',
  'kg',
  '%%',
  'lb',
  'BTU',
  'cfm/s',
  '℃',
  '°',
  'C😀',
  '\u0301',
  'kJ/kg/kg',
  'mm',
  'Pa2',
  '',
];
const WRONG_KEYS = ['DB', 'Db', 'rH', 'wet', 't', 'T', 'wbb', '', '😀', 'q-total', '_', 'db db'];

/** One `key=value` of the given keys, or a near-miss of one. */
function property(keys: readonly string[]): fc.Arbitrary<string> {
  const key = fc.constantFrom(...keys);
  const good = fc.tuple(key, numberText, fc.nat()).map(([k, n, i]) => {
    const units = UNITS_BY_KEY[k] ?? [''];
    return `${k}=${n}${units[i % units.length]}`;
  });
  const tolerance = fc
    .tuple(good, fc.constantFrom('±2', '±0.5', '+-1', '±2%', '±0.3C', '±', '±-1', '±1e308', '±NaN'), fc.boolean())
    .map(([g, t, pct]) => (pct ? `${g}${t}` : g));
  const wrongUnit = fc
    .tuple(key, numberText, fc.constantFrom(...WRONG_UNITS, ...Object.values(UNITS_BY_KEY).flat()))
    .map(([k, n, u]) => `${k}=${n}${u}`);
  const swapped = fc
    .tuple(key, numberText, fc.nat())
    .map(([k, n, i]) => `${n}${(UNITS_BY_KEY[k] ?? [''])[i % (UNITS_BY_KEY[k]?.length ?? 1)]}=${k}`);
  const broken = fc
    .tuple(fc.oneof(key, fc.constantFrom(...WRONG_KEYS)), numberText)
    .chain(([k, n]) =>
      fc.constantFrom(
        `${k}=`,
        `${k}==${n}`,
        `${k} ${n}`,
        `${k}=${n} C`,
        `=${n}`,
        `${k}=C`,
        `${k}=${n}=${n}`,
        `${k}: ${n}`,
        `${k}=${n},`,
        `${k}=(${n})`,
      ),
    );
  return fc.oneof(
    { weight: 10, arbitrary: good },
    { weight: 3, arbitrary: tolerance },
    { weight: 3, arbitrary: wrongUnit },
    { weight: 1, arbitrary: swapped },
    { weight: 2, arbitrary: broken },
  );
}

const stateProps = fc.array(property(STATE_KEYS), { minLength: 0, maxLength: 5 });
const processProps = fc.array(
  fc.oneof(
    { weight: 6, arbitrary: property([...PROCESS_KEYS, ...STATE_KEYS.slice(0, 2), ...DERIVE_KEYS]) },
    { weight: 1, arbitrary: fc.constantFrom('steam', 'adiabatic', 'stem', 'fog=ok') },
  ),
  {
    minLength: 0,
    maxLength: 4,
  },
);

const stateLine = fc
  .tuple(name, stateProps, fc.constantFrom(': ', ':', ' : ', ' ', '::'))
  .map(([n, props, colon]) => `state ${n}${colon}${props.join(' ')}`);
/** Two figures that define a state, both in range (a valid statement most of the time). */
const validState = fc
  .tuple(
    name,
    fc.integer({ min: -30, max: 45 }),
    fc.integer({ min: 1, max: 100 }),
    fc.constantFrom('rh', 'wb', 'dp', 'w', 'h'),
  )
  .map(([n, db, x, kind]) => {
    const second =
      kind === 'rh'
        ? `rh=${x}%`
        : kind === 'w'
          ? `w=${(x / 10).toFixed(1)}g/kg`
          : kind === 'h'
            ? `h=${x}kJ/kg`
            : `${kind}=${(db - x / 10).toFixed(1)}C`;
    return `state ${n}: db=${db}C ${second}`;
  });
const amount = fc.oneof(
  fc.integer({ min: -10, max: 110 }).map((x) => `${x}%`),
  fc
    .tuple(numberText, fc.constantFrom('kg/s', 'm3/s', 'L/s', 'cfm', 'lb/h', '%', '', 'kW'))
    .map(([n, u]) => `${n}${u}`),
);
const mixLine = fc
  .tuple(
    name,
    fc.array(fc.tuple(name, amount), { minLength: 0, maxLength: 4 }),
    fc.constantFrom(' + ', '+', ' ++ ', ' , '),
    fc.array(property(STATE_KEYS), { maxLength: 2 }),
  )
  .map(
    ([n, streams, plus, claims]) => `mix ${n}: ${streams.map(([s, a]) => `${s} ${a}`).join(plus)} ${claims.join(' ')}`,
  );
const processLine = fc
  .tuple(name, name, name, fc.constantFrom(' -> ', '->', ' => ', ' - > ', ' -> -> ', ' → '), processProps)
  .map(([n, a, b, arrow, props]) => `process ${n}: ${a}${arrow}${b} ${props.join(' ')}`);
const supplyLine = fc
  .tuple(
    name,
    name,
    fc.array(property(['q_sensible', 'q_latent', 'db', 'm', 'q', 'shr', 'rh', 'w']), { minLength: 0, maxLength: 5 }),
  )
  .map(([n, r, props]) => `supply ${n}: ${r} ${props.join(' ')}`);
/** A process that defines its leaving state, mostly with a usable specification. */
const derivedLine = fc
  .tuple(
    name,
    name,
    fc.constantFrom('N1', 'N2', 'OFF', 'SA', 'X9'),
    fc.constantFrom(
      'heat=20kW m=2kg/s',
      'heat=5kW',
      'dt=+5K',
      'dt=-30K',
      'db=35C',
      'db=13C rh=90%',
      'db=13C w=8g/kg',
      'rh=50%',
      'dp_fan=750Pa eff=0.62',
      'dp_fan=750Pa eff=0.62 eff_motor=0.9',
      'dp_fan=750Pa',
      'eff=1.5 dp_fan=1kPa',
      'adp=11C bf=0.1',
      'adp=11C',
      'bf=1',
      'adp=40C bf=0.1',
      'steam w=8g/kg',
      'steam rh=40% p_steam=200kPa',
      'steam',
      'steam w=1g/kg',
      'adiabatic eff=0.85',
      'adiabatic rh=60%',
      'adiabatic db=-50C',
      'heat=1kW adp=11C',
      'steam adiabatic w=5g/kg',
      'heat=1e308kW m=1e308kg/s',
    ),
    fc.array(property([...PROCESS_KEYS.slice(2), 'db', 'rh']), { maxLength: 2 }),
  )
  .map(([n, a, b, spec, claims]) => `process ${n}: ${a} -> ${b} ${spec} ${claims.join(' ')}`);
/** A heat recovery, valid or not. */
const recoverLine = fc
  .tuple(
    name,
    name,
    name,
    fc.constantFrom('R1', 'OA2', 'X9'),
    fc.constantFrom('R2', 'EA2', 'X9'),
    fc.array(property(RECOVER_KEYS), { maxLength: 2 }),
    fc.array(property(RECOVER_KEYS), { maxLength: 3 }),
    fc.constantFrom(', ', ',', ' ', ', , ', ' , '),
    fc.constantFrom('', ' fog=ok', ' fog=no', ' fog=', ' eff_s=0.7', ' eff_s=0.7 eff_l=0.6'),
  )
  .map(
    ([n, a, b, a2, b2, p1, p2, comma, tail]) =>
      `recover ${n}: ${a} -> ${a2} ${p1.join(' ')}${comma}${b} -> ${b2} ${p2.join(' ')}${tail}`,
  );
const siteLine = fc.oneof(
  property(['p', 'elev']).map((p) => `site: ${p}`),
  fc.constantFrom(
    'site:',
    'site: p=1kPa',
    'site: p=1MPa',
    'site: p=1000kPa',
    'site: elev=11000m',
    'site: elev=-5000m',
    'site: p=84kPa elev=1600m',
    'site p=84kPa',
  ),
);
const unitsLine = fc.constantFrom(
  'units: SI',
  'units: IP',
  'units:',
  'units: si',
  'units: XX',
  'units: SI IP',
  'units:IP',
);
const comment = fc.constantFrom('', '', '', '  # a comment', '# only a comment', ' #', ' # 😀 𝔸 ∑');

/** One statement line: valid, near-miss or a keyword with garbage after it. */
export const statement: fc.Arbitrary<string> = fc
  .tuple(
    fc.oneof(
      { weight: 5, arbitrary: validState },
      { weight: 5, arbitrary: stateLine },
      { weight: 3, arbitrary: mixLine },
      { weight: 3, arbitrary: processLine },
      { weight: 2, arbitrary: supplyLine },
      { weight: 2, arbitrary: derivedLine },
      { weight: 1, arbitrary: recoverLine },
      { weight: 1, arbitrary: siteLine },
      { weight: 1, arbitrary: unitsLine },
      {
        weight: 1,
        arbitrary: fc
          .tuple(fc.constantFrom('state', 'mix', 'process', 'supply', 'recover', 'site:', 'units:'), garbage(40))
          .map(([k, g]) => `${k} ${g}`),
      },
    ),
    comment,
  )
  .map(([s, c]) => s + c);

const prose = fc.oneof(
  fc.constantFrom(
    '# Kestrel Ridge plant room',
    'Some prose about the supply air.',
    '- a list item',
    '> a quote',
    '',
    '',
    '    indented code',
    '<!-- html comment -->',
    '| a | b |',
    '***',
  ),
  garbage(60),
);
const inlineParagraph = fc
  .tuple(prose, statement, fc.constantFrom('`', '``', '```'), fc.boolean())
  .map(([p, s, tick, closed]) => `${p} ${tick}${s}${closed ? tick : ''} and more prose`);
const fenceOpen = fc.constantFrom(
  '```air',
  '~~~air',
  '``` air',
  '```air extra',
  '````air',
  '> ```air',
  '- ```air',
  '   ```air',
  '```AIR',
  '```',
);
const fenceClose = (open: string): fc.Arbitrary<string> =>
  fc.constantFrom(
    open.startsWith('~')
      ? '~~~'
      : open.startsWith('````')
        ? '````'
        : open.startsWith('> ')
          ? '> ```'
          : open.startsWith('- ')
            ? '  ```'
            : '```',
    '',
    '``',
    '~~~',
  );
const fence = fenceOpen.chain((open) =>
  fc
    .tuple(
      fc.constant(open),
      fc.array(fc.oneof({ weight: 6, arbitrary: statement }, { weight: 1, arbitrary: prose }), { maxLength: 12 }),
      fenceClose(open),
    )
    .map(([o, body, close]) => {
      const prefix = o.startsWith('> ') ? '> ' : o.startsWith('- ') ? '  ' : '';
      return [o, ...body.map((l) => prefix + l), close].join('\n');
    }),
);

/** A very long line (1k–60k characters): a statement or garbage repeated, or one huge number or name after a key. */
const longLine = fc
  .tuple(
    fc.constantFrom(
      '',
      '',
      'state A: w=',
      'state A: db=',
      'mix M: A ',
      'mix M: ',
      'process P: A -> ',
      'state A: db=20C ',
    ),
    fc.oneof(
      statement,
      garbage(30),
      fc.constant('state A: db=20C rh=50% '),
      fc.constant('9'),
      fc.constant('a1'),
      fc.constant('->'),
      fc.constant(' '),
    ),
    fc.integer({ min: 1000, max: 60_000 }),
    fc.constantFrom('', 'g', 'C', ' ', '%'),
  )
  .map(([prefix, piece, len, suffix]) => {
    const unit = piece.length > 0 ? piece : 'x';
    return prefix + unit.repeat(Math.ceil(len / unit.length)).slice(0, len) + suffix;
  });
const longBlock = fc.tuple(longLine, fc.boolean()).map(([l, inFence]) => (inFence ? `\`\`\`air\n${l}\n\`\`\`` : l));

/** One block of a note. */
const block = fc.oneof(
  { weight: 6, arbitrary: fence },
  { weight: 3, arbitrary: inlineParagraph },
  { weight: 3, arbitrary: prose },
  { weight: 1, arbitrary: garbage(200) },
  {
    weight: 1,
    arbitrary: fc.constant(
      '```air\nstate A: db=24C rh=50%\nstate B: db=30C wb=20C\nmix M: A 30% + B 70%\nprocess P: M -> A m=2kg/s\n```',
    ),
  },
);

/** How a note ends its lines. */
const eol = fc.constantFrom('\n', '\n', '\n', '\r\n', '\r', 'mixed');

function joinLines(text: string, ending: string, pick: number): string {
  if (ending === '\n') return text;
  const lines = text.split('\n');
  if (ending !== 'mixed') return lines.join(ending);
  let out = lines[0] ?? '';
  for (let i = 1; i < lines.length; i++)
    out += ((pick + i) % 3 === 0 ? '\r\n' : (pick + i) % 7 === 0 ? '\r' : '\n') + lines[i];
  return out;
}

/** A whole note: blocks, line ends, maybe a BOM, rarely a very long line. */
export const note: fc.Arbitrary<string> = fc
  .tuple(
    fc.array(block, { minLength: 0, maxLength: 10 }),
    eol,
    fc.nat(),
    fc.oneof({ weight: 9, arbitrary: fc.constant('') }, { weight: 1, arbitrary: fc.constant('\uFEFF') }),
    fc.oneof({ weight: 30, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: longBlock }),
    fc.constantFrom('', '\n', '\n\n', '\r\n'),
  )
  .map(([blocks, ending, pick, bom, long, tail]) => {
    const parts =
      long === null
        ? blocks
        : [...blocks.slice(0, pick % (blocks.length + 1)), long, ...blocks.slice(pick % (blocks.length + 1))];
    return bom + joinLines(parts.join('\n\n'), ending, pick) + tail;
  });

/** A fragment typed or pasted during an edit. */
export const fragment: fc.Arbitrary<string> = fc.oneof(
  { weight: 4, arbitrary: fc.string({ unit: 'grapheme-ascii', maxLength: 3 }) },
  { weight: 3, arbitrary: statement.map((s) => `\n${s}`) },
  {
    weight: 2,
    arbitrary: fc.constantFrom(
      '\n',
      '\r\n',
      '```air\n',
      '\n```\n',
      '`',
      ' ',
      '=',
      'C',
      '%',
      '.',
      '-',
      '0',
      '9',
      '😀',
      '\uD800',
      '\uFEFF',
      'e308',
    ),
  },
  { weight: 1, arbitrary: garbage(20) },
  { weight: 1, arbitrary: numberText },
);

// ---------------------------------------------------------------------------------------------
// Settings

const siteSetting = fc.oneof(
  fc.constant({ kind: 'pressure' as const, pa: 101_325, written: '101.325 kPa' }),
  fc
    .constantFrom(1000, 30_000, 84_000, 110_000, 1_000_000)
    .map((pa) => ({ kind: 'pressure' as const, pa, written: `${pa / 1000} kPa` })),
  fc.constantFrom(-5000, 0, 1600, 11_000).map((m) => ({ kind: 'elevation' as const, m, written: `${m} m` })),
);

/** Service settings across their whole range. */
export const settings: fc.Arbitrary<ServiceSettings> = fc.record({
  units: fc.constantFrom('SI' as const, 'IP' as const),
  site: siteSetting,
  hintProperties: fc.oneof(fc.constant('auto' as const), fc.subarray([...HINT_KEYS] as HintKey[])),
  extraDigits: fc.integer({ min: 0, max: 4 }),
  checkClaims: fc.boolean(),
  secondaryUnits: fc.boolean(),
  // Mostly the default; sometimes no limit, or one so small that the note is over it.
  maxNoteKB: fc.oneof({ weight: 8, arbitrary: fc.constant(2048) }, { weight: 1, arbitrary: fc.constantFrom(0, 1, 4) }),
});

// ---------------------------------------------------------------------------------------------
// Checks

/** Throws with `what` when `cond` is false (keeps the checks readable inside properties). */
function must(cond: boolean, what: () => string): void {
  if (!cond) throw new Error(what());
}

function inside(span: Span, length: number): boolean {
  return (
    Number.isInteger(span.start) &&
    Number.isInteger(span.end) &&
    0 <= span.start &&
    span.start <= span.end &&
    span.end <= length
  );
}

/** Words that mean a non-finite number leaked into text meant for the engineer. */
const NON_FINITE_WORDS = /\bNaN\b|\bInfinity\b|\bundefined\b/;

/** Checks a string shown to the engineer: no NaN/Infinity/undefined unless the note itself wrote it. */
function cleanText(s: string, noteText: string, what: string): void {
  // The one sentence that names −Infinity on purpose: why bone-dry air has no dew point.
  const m = NON_FINITE_WORDS.exec(s.replace('(reported as −Infinity)', ''));
  if (m && !noteText.includes(m[0])) throw new Error(`${what} shows '${m[0]}': ${s.slice(0, 300)}`);
}

/** Checks a span returned by a feature: integer offsets inside the document. */
function spanInside(span: Span, text: string, what: string): void {
  must(
    inside(span, text.length),
    () => `${what}: span ${JSON.stringify(span)} is outside the document (length ${text.length})`,
  );
}

/** Counts of what the checks looked at, for the report. */
export interface CheckCounts {
  diagnostics: number;
  hovers: number;
  hints: number;
  completions: number;
  actions: number;
  renames: number;
}

/** A fresh zeroed {@link CheckCounts}. */
export function zeroCounts(): CheckCounts {
  return { diagnostics: 0, hovers: 0, hints: 0, completions: 0, actions: 0, renames: 0 };
}

/**
 * Analyses `text` and runs every service feature at the given offsets (clamped into the
 * document), checking: nothing throws; the whole Analysis and every result hold only finite
 * numbers; every diagnostic and returned span lies inside the document; shown text carries no
 * NaN, Infinity or undefined. Returns the note for further checks.
 */
export function checkNote(
  text: string,
  s: ServiceSettings,
  offsets: readonly number[],
  counts: CheckCounts = zeroCounts(),
): Note {
  const n = analyzeText(text, s);
  const a = n.analysis;
  must(allFinite(a), () => 'the Analysis holds a NaN or an infinite number');
  const diags = noteDiagnostics(n);
  counts.diagnostics += diags.length;
  for (const d of diags) {
    spanInside(d.span, text, `diagnostic ${d.code}`);
    for (const r of d.related ?? []) spanInside(r.span, text, `related information of ${d.code}`);
    must(typeof d.code === 'string' && d.code.length > 0, () => `a diagnostic without a code: ${d.message}`);
    must(d.message.trim().length > 0, () => `diagnostic ${d.code} has an empty message`);
    cleanText(d.message, text, `diagnostic ${d.code}`);
  }
  const c = countDiagnostics(n);
  must(c.errors + c.warnings <= diags.length, () => 'countDiagnostics counts more than there are');
  const status = noteStatus(n);
  if (status.unitsSpan) spanInside(status.unitsSpan, text, 'note status units span');
  cleanText(status.pressureLabel + status.pressureDescribe, text, 'note status');

  const symbols = documentSymbols(n);
  must(allFinite(symbols), () => 'document symbols hold a non-finite number');
  const walk = (list: typeof symbols): void => {
    for (const sym of list) {
      spanInside(sym.span, text, `symbol ${sym.name}`);
      spanInside(sym.selectionSpan, text, `symbol ${sym.name} selection`);
      cleanText(sym.detail ?? '', text, `symbol ${sym.name}`);
      walk(sym.children ?? []);
    }
  };
  walk(symbols);

  const len = text.length;
  const hintsAll = inlayHints(n, { start: 0, end: len });
  counts.hints += hintsAll.length;
  for (const h of hintsAll) {
    must(
      Number.isInteger(h.offset) && h.offset >= 0 && h.offset <= len,
      () => `inlay hint at ${h.offset} is outside the document`,
    );
    cleanText(h.label, text, 'inlay hint');
    cleanText(h.tooltip, text, 'inlay hint tooltip');
  }
  for (const raw of offsets) {
    const at = Math.min(len, Math.max(0, raw));
    const end = Math.min(len, at + (raw % 40));
    const hv = hover(n, at);
    if (hv) {
      counts.hovers++;
      spanInside(hv.span, text, 'hover');
      cleanText(hv.markdown, text, 'hover');
    }
    const hs = inlayHints(n, { start: at, end });
    must(allFinite(hs), () => 'inlay hints hold a non-finite number');
    const comp = completions(n, at);
    if (comp) {
      counts.completions += comp.items.length;
      spanInside(comp.replace, text, 'completion replace span');
      must(
        comp.replace.end >= at && comp.replace.start <= at,
        () => `completion replaces ${JSON.stringify(comp.replace)}, not around the cursor ${at}`,
      );
      for (const item of comp.items)
        cleanText(`${item.label} ${item.detail ?? ''} ${item.documentation ?? ''}`, text, 'completion item');
    }
    for (const action of codeActions(n, { start: at, end })) {
      counts.actions++;
      cleanText(action.title, text, 'code action title');
      must(action.edits.length > 0, () => `code action '${action.title}' has no edit`);
      for (const e of action.edits) spanInside(e.span, text, `code action '${action.title}'`);
      const sorted = [...action.edits].sort((x, y) => x.span.start - y.span.start);
      for (let i = 1; i < sorted.length; i++) {
        must(
          sorted[i - 1]!.span.end <= sorted[i]!.span.start,
          () => `code action '${action.title}' has overlapping edits`,
        );
      }
    }
    const def = definition(n, at);
    if (def) {
      spanInside(def.nameSpan, text, 'definition name');
      spanInside(def.statementSpan, text, 'definition statement');
    }
    for (const r of references(n, at, true) ?? []) spanInside(r, text, 'reference');
    const prep = prepareRename(n, at);
    if (prep && 'span' in prep) {
      spanInside(prep.span, text, 'prepareRename');
      const r = rename(n, at, 'Renamed_1');
      if ('edits' in r) {
        counts.renames++;
        for (const e of r.edits) spanInside(e.span, text, 'rename edit');
      }
    }
  }
  return n;
}

/** Offsets for the feature checks: spread over the note plus both ends. */
export const offsets: fc.Arbitrary<number[]> = fc.array(fc.nat({ max: 1 << 20 }), { minLength: 1, maxLength: 8 });

/**
 * Maps raw offsets into the document (so they spread over any note size), plus both ends of the
 * document and the end of its longest line (where completion reads the most text before the cursor).
 */
export function spread(raw: readonly number[], text: string): number[] {
  const length = text.length;
  let longestEnd = 0;
  let longest = -1;
  for (let start = 0; start <= length; ) {
    let end = start;
    while (end < length && text.charCodeAt(end) !== 10 && text.charCodeAt(end) !== 13) end++;
    if (end - start > longest) {
      longest = end - start;
      longestEnd = end;
    }
    start = end + 1;
  }
  return [0, length, longestEnd, ...raw.map((r) => (length === 0 ? 0 : r % (length + 1)))];
}

/** Median, p99 and maximum of a list of times, ms. */
export function timeSummary(ms: readonly number[]): { median: number; p99: number; max: number } {
  const s = [...ms].sort((x, y) => x - y);
  const at = (q: number) => s[Math.min(s.length - 1, Math.floor(q * s.length))] ?? 0;
  return { median: at(0.5), p99: at(0.99), max: s[s.length - 1] ?? 0 };
}
