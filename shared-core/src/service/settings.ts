/**
 * Editor settings of the language service: defaults, validation of what a client sends (every
 * problem named, with the default used instead), and the evaluator settings they imply.
 */
import type { EvaluateSettings, RuleSetting } from '../evaluate/types';
import { stdAtmPressure } from '../physics';
import { displaySymbol, lookupUnit, toSI } from '../units';
import type { Dimension } from '../units/types';
import { HINT_KEYS, type DefaultSite, type HintKey, type ServiceSettings } from './types';

/** Standard sea-level pressure, Pa (ASHRAE HoF 2017 SI Ch.1 Table 1, Z = 0). */
const SEA_LEVEL_PA = 101_325;

/** Largest number of extra decimals the `precision` setting accepts. */
export const MAX_EXTRA_DIGITS = 4;

/**
 * Default of `maxNoteSizeKB`: 2 MB of text. On a two-core machine a note of that size takes under
 * a second to evaluate after an edit (bench/robustness.ts); calculation notes are rarely a
 * hundredth of it.
 */
export const DEFAULT_MAX_NOTE_KB = 2048;

/** The settings used when the client offers none: SI, 101.325 kPa, automatic hints, claims checked. */
export const DEFAULT_SERVICE_SETTINGS: Readonly<ServiceSettings> = Object.freeze({
  units: 'SI',
  site: Object.freeze({ kind: 'pressure', pa: SEA_LEVEL_PA, written: 'default' }) as DefaultSite,
  hintProperties: 'auto',
  extraDigits: 0,
  checkClaims: true,
  secondaryUnits: false,
  maxNoteKB: DEFAULT_MAX_NOTE_KB,
});

/** Reads `obj.a.b` or a flat `obj['a.b']` (clients differ in how they nest dotted settings). */
function pick(obj: Record<string, unknown>, path: string): unknown {
  if (path in obj) return obj[path];
  let cur: unknown = obj;
  for (const part of path.split('.')) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[part];
  }
  return cur;
}

/** A quantity setting such as `"84 kPa"`, `"1600m"` or `"5250 ft"`, as SI, or a problem. */
function readQuantitySetting(
  name: string,
  raw: unknown,
  dimension: Dimension,
  example: string,
): { si: number; written: string } | { problem: string } {
  const text = typeof raw === 'number' ? String(raw) : typeof raw === 'string' ? raw.trim() : null;
  if (text === null)
    return {
      problem: `dewmark.${name} must be a text such as "${example}", not ${JSON.stringify(raw)}; the default is used.`,
    };
  const m = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(\S*)$/.exec(text);
  if (!m)
    return {
      problem:
        `dewmark.${name} = "${text}" ` +
        `is not a number with a unit (write e.g. "${example}"); ` +
        'the default is used.',
    };
  const value = Number(m[1]);
  const unitText = m[2] ?? '';
  if (unitText === '')
    return { problem: `dewmark.${name} = "${text}" has no unit (write e.g. "${example}"); the default is used.` };
  const unit = lookupUnit(unitText);
  if (!unit || unit.dimension !== dimension) {
    return {
      problem:
        `dewmark.${name} = "${text}": "${unitText}" is not a unit ` +
        `of ${dimension === 'length' ? 'length' : 'pressure'} (write e.g. "${example}"); the default is used.`,
    };
  }
  return { si: toSI(value, unit), written: `${m[1]} ${displaySymbol(unit)}` };
}

/** The default site from the `pressure` and `elevation` settings (a non-empty elevation wins). */
function readSite(obj: Record<string, unknown>, problems: string[]): DefaultSite {
  const elevation = pick(obj, 'elevation');
  if (elevation !== undefined && elevation !== null && elevation !== '') {
    const r = readQuantitySetting('elevation', elevation, 'length', '1600 m');
    if ('problem' in r) problems.push(r.problem);
    else {
      try {
        stdAtmPressure(r.si);
        return { kind: 'elevation', m: r.si, written: r.written };
      } catch (err) {
        problems.push(
          `dewmark.elevation = "${r.written}": ${err instanceof Error ? err.message : String(err)} ` +
            `The default is used.`,
        );
      }
    }
  }
  const pressure = pick(obj, 'pressure');
  if (pressure !== undefined && pressure !== null && pressure !== '') {
    const r = readQuantitySetting('pressure', pressure, 'pressure', '101.325 kPa');
    if ('problem' in r) problems.push(r.problem);
    else if (!(r.si > 0) || !Number.isFinite(r.si))
      problems.push(`dewmark.pressure = "${r.written}" is not a positive absolute pressure; the default is used.`);
    else return { kind: 'pressure', pa: r.si, written: r.written };
  }
  return DEFAULT_SERVICE_SETTINGS.site;
}

/**
 * Reads the `dewmark` settings section as a client sends it (nested or with dotted keys). Never
 * throws: each unusable value is named in `problems` and replaced by its default.
 */
export function readSettings(raw: unknown): { settings: ServiceSettings; problems: string[] } {
  const problems: string[] = [];
  const d = DEFAULT_SERVICE_SETTINGS;
  if (raw === null || raw === undefined) return { settings: { ...d }, problems };
  if (typeof raw !== 'object' || Array.isArray(raw)) {
    return {
      settings: { ...d },
      problems: [`the dewmark settings must be an object, not ${JSON.stringify(raw)}; defaults are used.`],
    };
  }
  const obj = raw as Record<string, unknown>;

  let units = d.units;
  const u = pick(obj, 'units');
  if (u === 'SI' || u === 'IP') units = u;
  else if (u !== undefined && u !== null)
    problems.push(`dewmark.units must be "SI" or "IP", not ${JSON.stringify(u)}; SI is used.`);

  const site = readSite(obj, problems);

  let hintProperties: ServiceSettings['hintProperties'] = d.hintProperties;
  const hp = pick(obj, 'inlayHints.properties');
  if (Array.isArray(hp)) {
    const keys: HintKey[] = [];
    for (const k of hp) {
      if (typeof k === 'string' && (HINT_KEYS as readonly string[]).includes(k)) {
        if (!keys.includes(k as HintKey)) keys.push(k as HintKey);
      } else {
        problems.push(
          `dewmark.inlayHints.properties: ${JSON.stringify(k)} is not one of ${HINT_KEYS.join(', ')}; it is left out.`,
        );
      }
    }
    hintProperties = keys.length > 0 ? keys : 'auto';
  } else if (hp === 'auto' || hp === undefined || hp === null) {
    hintProperties = 'auto';
  } else {
    problems.push(
      `dewmark.inlayHints.properties must be a list of keys such ` +
        `as ["rh", "w", "h", "dp"]; the automatic choice is used.`,
    );
  }

  let extraDigits = d.extraDigits;
  const pr = pick(obj, 'precision');
  if (typeof pr === 'number' && Number.isInteger(pr) && pr >= 0 && pr <= MAX_EXTRA_DIGITS) extraDigits = pr;
  else if (pr !== undefined && pr !== null) {
    problems.push(
      `dewmark.precision must be a whole number of extra decimals from ` +
        `0 to ${MAX_EXTRA_DIGITS}, not ${JSON.stringify(pr)}; 0 is used.`,
    );
  }

  let checkClaims = d.checkClaims;
  const cc = pick(obj, 'checkClaims');
  if (typeof cc === 'boolean') checkClaims = cc;
  else if (cc !== undefined && cc !== null)
    problems.push(`dewmark.checkClaims must be true or false, not ${JSON.stringify(cc)}; true is used.`);

  let secondaryUnits = d.secondaryUnits;
  const su = pick(obj, 'hover.secondaryUnits');
  if (typeof su === 'boolean') secondaryUnits = su;
  else if (su !== undefined && su !== null)
    problems.push(`dewmark.hover.secondaryUnits must be true or false, not ${JSON.stringify(su)}; false is used.`);

  let maxNoteKB = d.maxNoteKB;
  const mk = pick(obj, 'maxNoteSizeKB');
  if (typeof mk === 'number' && Number.isInteger(mk) && mk >= 0) maxNoteKB = mk;
  else if (mk !== undefined && mk !== null) {
    problems.push(
      `dewmark.maxNoteSizeKB must be a whole number of KB (0 for no ` +
        `limit), not ${JSON.stringify(mk)}; ${d.maxNoteKB} is used.`,
    );
  }

  const settings: ServiceSettings = {
    units,
    site,
    hintProperties,
    extraDigits,
    checkClaims,
    secondaryUnits,
    maxNoteKB,
  };
  const rules = readRules(pick(obj, 'rules'), problems);
  if (rules) settings.rules = rules;
  return { settings, problems };
}

/** What a rule may set a diagnostic code to. */
export const RULE_VALUES: readonly RuleSetting[] = ['error', 'warning', 'info', 'off'];

/** The `rules` object (diagnostic code → severity or off); each unusable entry is named and left out. */
function readRules(raw: unknown, problems: string[]): Record<string, RuleSetting> | undefined {
  if (raw === undefined || raw === null) return undefined;
  if (typeof raw !== 'object' || Array.isArray(raw)) {
    problems.push(
      `dewmark.rules must be an object of diagnostic codes, e.g. { ` +
        `"claim-mismatch": "error" }, not ${JSON.stringify(raw)}; it is ignored.`,
    );
    return undefined;
  }
  const out: Record<string, RuleSetting> = {};
  for (const [code, value] of Object.entries(raw as Record<string, unknown>)) {
    if (!/^[a-z0-9]+(?:-[a-z0-9]+)*$/.test(code))
      problems.push(
        `dewmark.rules: "${code}" is not a diagnostic code (lower-case ` +
          `words joined by hyphens, e.g. claim-mismatch); it is ignored.`,
      );
    else if (typeof value !== 'string' || !(RULE_VALUES as readonly string[]).includes(value))
      problems.push(
        `dewmark.rules.${code} must be one of ${RULE_VALUES.join(', ')}, not ${JSON.stringify(value)}; it is ignored.`,
      );
    else out[code] = value as RuleSetting;
  }
  return Object.keys(out).length > 0 ? out : undefined;
}

/** The evaluator settings that the service settings imply (default pressure and where it came from). */
export function toEvaluateSettings(s: ServiceSettings): EvaluateSettings {
  // The evaluator describes the basis as `${pressureOrigin} ${kPa} kPa`.
  // A project file names itself (`calcs/dewmark.json: pressure 84 kPa, i.e.`), an editor setting its key.
  let pressurePa = SEA_LEVEL_PA;
  let pressureOrigin = 'default';
  const file = s.sources?.site;
  if (s.site.kind === 'elevation') {
    pressurePa = stdAtmPressure(s.site.m);
    const setting = file ? `${file}: elevation` : 'setting dewmark.elevation =';
    pressureOrigin = `${setting} ${s.site.written} (standard atmosphere):`;
  } else if (s.site.written !== 'default') {
    pressurePa = s.site.pa;
    pressureOrigin = `${file ? `${file}: pressure` : 'setting dewmark.pressure ='} ${s.site.written}, i.e.`;
  }
  const out: EvaluateSettings = { units: s.units, pressurePa, pressureOrigin, checkClaims: s.checkClaims };
  if (s.rules) out.rules = s.rules;
  return out;
}
