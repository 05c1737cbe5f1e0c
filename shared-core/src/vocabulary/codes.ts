/**
 * The one registry of diagnostic codes: every code any part of Dewmark reports (parser,
 * evaluator, engine, results tables, editor service, command line), with its usual severity,
 * where it comes from and what it means in one line. `DiagnosticCode` is the union of its keys,
 * so a diagnostic with a code the registry lacks does not compile. Codes are stable strings:
 * add, never rename (tests, docs, quick fixes and CI configurations key on them).
 *
 * A test holds the registry to `docs/notation.md` (a row for every code, the same severity) and to
 * `test/fixtures/` (a fixture that produces every code; `fixture` says which kind).
 *
 * Adding a code is adding one row here, a fixture, and a row in the docs table.
 */

/** How serious a diagnostic is. */
export type Severity = 'error' | 'warning' | 'info';

/** The part of Dewmark that reports a code. */
export type CodeSource = 'parser' | 'evaluator' | 'engine' | 'results-table' | 'suppressions' | 'editor' | 'cli';

/**
 * How a fixture produces the code:
 * - `note`: `test/fixtures/diagnostics/<code>.md`, evaluated as `dewmark check` does;
 * - `editor`: the same file, analysed by the editor service with the settings in its first line;
 * - `engine`: `test/fixtures/engine/<code>.json`, the inputs of a call of the engine's `solveState`;
 * - `never`: no input can produce it (it reports a bug); `test` names the test that forces it.
 */
export type FixtureKind = 'note' | 'editor' | 'engine' | { never: string; test: string };

/** One registered code. */
export interface CodeSpec {
  /** The usual severity (the one docs/notation.md gives). */
  severity: Severity;
  /** Another severity it is reported with in some situations (an engine warning about a computed state). */
  alsoAs?: Severity;
  /** Who reports it. */
  from: readonly CodeSource[];
  /** What it means, in one line. */
  meaning: string;
  fixture: FixtureKind;
}

const P = ['parser'] as const;
const E = ['evaluator'] as const;
const X = ['engine'] as const;
const XE = ['engine', 'evaluator'] as const;

/** Every code, grouped by where it comes from. */
export const CODES = {
  // --- parser ---
  syntax: {
    severity: 'error',
    from: ['parser', 'evaluator'],
    meaning: 'the statement could not be read (a stray token, comma or arrow; also a negative tolerance)',
    fixture: 'note',
  },
  'unknown-keyword': {
    severity: 'error',
    from: P,
    meaning: 'a fence line does not start with site:, units:, state, mix, process, supply or recover',
    fixture: 'note',
  },
  'missing-name': {
    severity: 'error',
    from: P,
    meaning: 'a statement, stream or process end has no name',
    fixture: 'note',
  },
  'bad-name': {
    severity: 'error',
    from: P,
    meaning: 'a name does not follow the naming rule (a letter, then letters, digits, _ or -)',
    fixture: 'note',
  },
  'missing-colon': {
    severity: 'error',
    from: P,
    meaning: "the ':' after the statement head is missing",
    fixture: 'note',
  },
  'missing-value': {
    severity: 'error',
    from: P,
    meaning: "'key=' with nothing after it, a stream without an amount, units: without a system",
    fixture: 'note',
  },
  'bad-number': {
    severity: 'error',
    from: P,
    meaning: 'a value is not a finite decimal number (1,5 as a decimal, NaN, 1e999, abc)',
    fixture: 'note',
  },
  'value-spacing': {
    severity: 'error',
    from: P,
    meaning: 'a space between a number and its unit or tolerance (24 C)',
    fixture: 'note',
  },
  // --- evaluator: keys, units, names ---
  'unknown-key': { severity: 'error', from: E, meaning: 'a key the statement does not take', fixture: 'note' },
  'duplicate-key': {
    severity: 'error',
    from: E,
    meaning: 'a key written twice in one statement; the first is used',
    fixture: 'note',
  },
  'missing-unit': { severity: 'error', from: E, meaning: 'a bare number where a unit is needed', fixture: 'note' },
  'unknown-unit': {
    severity: 'error',
    from: E,
    meaning: 'an unknown unit, or a unit of the wrong kind for its key',
    fixture: 'note',
  },
  'unknown-unit-system': { severity: 'error', from: E, meaning: 'units: is not SI or IP', fixture: 'note' },
  'units-conflict': {
    severity: 'warning',
    from: E,
    meaning: 'a second units: line that disagrees with the first',
    fixture: 'note',
  },
  'duplicate-name': { severity: 'error', from: E, meaning: 'a name defined twice', fixture: 'note' },
  'unknown-name': {
    severity: 'error',
    from: E,
    meaning: 'a reference to a name that is never defined',
    fixture: 'note',
  },
  'used-before-defined': {
    severity: 'error',
    from: E,
    meaning: 'a reference to a name defined further down',
    fixture: 'note',
  },
  'not-a-state': {
    severity: 'error',
    from: E,
    meaning: 'a process name used where a state is needed',
    fixture: 'note',
  },
  'unresolved-dependency': {
    severity: 'info',
    from: E,
    meaning: 'a mix or process not computed because a state it uses failed',
    fixture: 'note',
  },
  // --- evaluator: pressure, mixes, processes, claims ---
  'pressure-conflict': { severity: 'warning', from: E, meaning: 'both p= and elev= are written', fixture: 'note' },
  'unusual-pressure': {
    severity: 'warning',
    from: E,
    meaning: 'a pressure outside 30–110 kPa (4.351–15.954 psia)',
    fixture: 'note',
  },
  'pressure-mismatch': {
    severity: 'warning',
    from: E,
    meaning: "mix streams, or a process's two states, at different pressures",
    fixture: 'note',
  },
  'mix-fractions': {
    severity: 'error',
    from: E,
    meaning: 'fractions not adding to 100 %, a negative fraction, or no flow at all',
    fixture: 'note',
  },
  'mix-amounts': {
    severity: 'error',
    from: E,
    meaning: 'fractions mixed with flows, or a stream without an amount',
    fixture: 'note',
  },
  'flow-conflict': { severity: 'error', from: E, meaning: 'm= and q= on one process', fixture: 'note' },
  'missing-flow': {
    severity: 'warning',
    from: E,
    meaning: 'a rate claim on a process without a flow',
    fixture: 'note',
  },
  'claim-undefined': {
    severity: 'warning',
    from: E,
    meaning: 'an shr= claim where the SHR is not defined',
    fixture: 'note',
  },
  'impossible-process': {
    severity: 'error',
    from: E,
    meaning: 'moisture removed along a line that never meets saturation',
    fixture: 'note',
  },
  'claim-mismatch': {
    severity: 'warning',
    from: E,
    meaning: 'a claim outside its band; the computed value is shown',
    fixture: 'note',
  },
  'supply-infeasible': {
    severity: 'error',
    from: E,
    meaning:
      'a supply state that cannot carry the room loads (the humidity ratio ' +
      'the latent load needs is negative or above saturation, the supply ' +
      'is not below the room for cooling, or the flow is not positive)',
    fixture: 'note',
  },
  'bad-reference': {
    severity: 'error',
    from: E,
    meaning:
      'a property reference that cannot be used (a key that cannot be referenced, ' +
      'another kind, a wrong difference unit, a reference where only a figure goes)',
    fixture: 'note',
  },
  'mix-rest': {
    severity: 'error',
    from: E,
    meaning:
      'a mix by total and remainder that does not add up (more than one rest stream, a rest without ' +
      'total=, streams of another kind than the total, or streams that leave nothing for the rest)',
    fixture: 'note',
  },
  'spec-missing': {
    severity: 'error',
    from: E,
    meaning:
      'a process or recover specification lacks a key it needs (adp= without bf=, heat= ' +
      'without a flow, dp_fan= without eff=, steam without a target, recover without eff_s=)',
    fixture: 'note',
  },
  'spec-conflict': {
    severity: 'error',
    from: E,
    meaning:
      'specification keys that cannot go together (heat= with dt=, heat= with ' +
      'adp=), or a specification on a process whose leaving state is already defined',
    fixture: 'note',
  },
  'spec-unreachable': {
    severity: 'error',
    from: E,
    meaning:
      'a specification asks for a state the equipment cannot reach (steam ' +
      'to a lower humidity, an adiabatic humidifier beyond saturation…)',
    fixture: 'note',
  },
  'recovery-condensation': {
    severity: 'warning',
    alsoAs: 'info',
    from: E,
    meaning: 'heat recovery condenses water on the side of the stream being cooled (info when fog=ok acknowledges it)',
    fixture: 'note',
  },
  'recovery-frost': {
    severity: 'warning',
    alsoAs: 'info',
    from: E,
    meaning: 'heat recovery forms frost on the side of the stream being cooled (info when fog=ok acknowledges it)',
    fixture: 'note',
  },
  'internal-error': {
    severity: 'error',
    from: E,
    meaning: 'a bug in Dewmark: a statement could not be evaluated; the rest of the note is',
    fixture: {
      never: 'no note reaches it unless the evaluator has a bug',
      test: 'shared-core/test/vocabulary-codes.test.ts',
    },
  },
  // --- the engine (and the evaluator's own checks of the same kind) ---
  'out-of-range': {
    severity: 'error',
    alsoAs: 'warning',
    from: XE,
    meaning:
      'a figure outside the range the engine computes, a non-positive ' +
      'pressure or flow, or a property without a finite value',
    fixture: 'note',
  },
  'wb-above-db': { severity: 'error', from: X, meaning: 'wet-bulb above the dry-bulb', fixture: 'note' },
  'dp-above-db': { severity: 'error', from: X, meaning: 'dew point above the dry-bulb', fixture: 'note' },
  'rh-out-of-range': {
    severity: 'error',
    from: X,
    meaning: 'relative humidity below 0 % or above 100 %',
    fixture: 'note',
  },
  supersaturated: {
    severity: 'warning',
    alsoAs: 'error',
    from: XE,
    meaning: 'humidity ratio above saturation (fog region)',
    fixture: 'note',
  },
  'negative-humidity-ratio': { severity: 'error', from: X, meaning: 'a humidity ratio below zero', fixture: 'note' },
  'enthalpy-too-low': {
    severity: 'error',
    from: X,
    meaning: 'enthalpy below that of bone-dry air at the dry-bulb',
    fixture: 'note',
  },
  'wb-too-low': {
    severity: 'error',
    from: X,
    meaning: 'wet-bulb so far below the dry-bulb that the humidity ratio would be negative',
    fixture: 'note',
  },
  'pressure-below-saturation': {
    severity: 'error',
    from: X,
    meaning: 'the pressure is at or below the saturation pressure the state needs',
    fixture: 'note',
  },
  'dependent-pair': {
    severity: 'error',
    from: XE,
    meaning: 'the two properties fix the same thing (dp with w)',
    fixture: 'note',
  },
  underspecified: {
    severity: 'error',
    from: XE,
    meaning: 'fewer than two defining properties, an empty site:, or a mix without streams',
    fixture: 'note',
  },
  overspecified: {
    severity: 'error',
    from: X,
    meaning:
      "more than two defining properties handed to the engine's solver (a note's extra properties are claims instead)",
    fixture: 'engine',
  },
  'ill-conditioned': {
    severity: 'warning',
    from: XE,
    meaning: 'wb with h: nearly parallel on the chart',
    fixture: 'note',
  },
  'no-solution': { severity: 'error', from: XE, meaning: 'the pair admits no state', fixture: 'note' },
  'no-convergence': {
    severity: 'error',
    from: X,
    meaning: 'an iterative solve hit its bound (reported instead of looping)',
    fixture: {
      never: 'every solve converges well inside its bound for any input; only a lowered bound reaches it',
      test: 'shared-core/test/robustness-solver-bounds.test.ts',
    },
  },
  // --- results tables, ignore comments, the editor ---
  'stale-results-table': {
    severity: 'warning',
    from: ['results-table'],
    meaning: 'a results table written in the note no longer matches its block, was edited, or lost its end marker',
    fixture: 'note',
  },
  'ignore-comment': {
    severity: 'warning',
    alsoAs: 'info',
    from: ['suppressions'],
    meaning: 'a # dewmark-ignore comment that names no code (warning) or acknowledges nothing where it stands (info)',
    fixture: 'note',
  },
  'note-too-large': {
    severity: 'info',
    from: ['editor'],
    meaning: 'the note is over the dewmark.maxNoteSizeKB setting, so the editor does not evaluate it as you type',
    fixture: 'editor',
  },
  'note-excluded': {
    severity: 'info',
    from: ['editor'],
    meaning:
      "the note's project file dewmark.json leaves it out (include/exclude), " +
      'so, as for dewmark check, its problems are not shown',
    fixture: 'editor',
  },
} as const satisfies Record<string, CodeSpec>;

/** A registered diagnostic code: a code the registry lacks is a compile error. */
export type DiagnosticCode = keyof typeof CODES;

/** The codes a source reports. */
export type CodeFrom<S extends CodeSource> = {
  [K in DiagnosticCode]: S extends (typeof CODES)[K]['from'][number] ? K : never;
}[DiagnosticCode];

/** Every code, in registry order. */
export const DIAGNOSTIC_CODES: readonly DiagnosticCode[] = Object.keys(CODES) as DiagnosticCode[];

/** The registry row of a code. */
export function codeSpec(code: DiagnosticCode): CodeSpec {
  return CODES[code];
}

/** True when `code` is a registered code (for codes read from outside: settings, JSON). */
export function isDiagnosticCode(code: string): code is DiagnosticCode {
  return Object.hasOwn(CODES, code);
}
