/**
 * Processes that define their leaving state: `process HC: MA -> HCOFF heat=20kW` when HCOFF is
 * not defined above. The specification names the equipment and fixes the leaving state:
 *
 * | form      | specification                                   | model (physics/)            |
 * |-----------|-------------------------------------------------|-----------------------------|
 * | heater    | `heat=` (needs a flow), or `dt=`; W unchanged     | sensible.ts                 |
 * | fan       | `dp_fan=` with `eff=` [`eff_motor=`]              | sensible.ts                 |
 * | coil      | `adp=` with `bf=`                                 | coil.ts                     |
 * | steam     | the word `steam`, a target `w=` or `rh=` [`p_steam=`] | humidifier.ts           |
 * | adiabatic | the word `adiabatic`, `eff=` or a target `rh=`/`db=`/`w=` | humidifier.ts       |
 * | leaving   | leaving properties: `db=` alone (W unchanged), or a pair (`db=` with `rh=`/`w=`…) | state solver |
 *
 * With an equipment form, the leaving state's properties written on the line (`db=`, `rh=`…,
 * beyond a humidifier's target) are claims about it. The diagnostic codes of this module are
 * listed in `chainCodes.ts`.
 */
import {
  adiabaticByEffectiveness,
  adiabaticToDb,
  adiabaticToRh,
  adiabaticToW,
  coilFromAdp,
  fanLeaving,
  fanTemperatureRise,
  saturationEffectiveness,
  sensibleByDt,
  sensibleByDuty,
  sensibleToDb,
  steamEnthalpy,
  steamToRh,
  steamToW,
  type EquipmentOutcome,
  type EquipmentProblem,
  type MoistAirState,
  PsychroError,
} from '../physics';
import type { DefiningKey } from '../physics/types';
import { exampleIn, problemTexts } from './figures';
import type { CoreDiagnostic, ProcessStatement, PropertyNode } from '../notation/ast';
import type { Span } from '../text/types';
import type { EvalContext } from './context';
import { DERIVE_KEY_NAMES, PROCESS_KEYS, PROCESS_WORDS, isDefiningKey } from './keys';
import { problemDiagnostic, problemMessage } from './problems';
import type { ReadProp } from './props';
import { candidatePairs, pairsHolding, stateClaims, stateFinite, writtenList } from './state';
import type { ClaimResult, EquipmentResult, StateResult } from './types';
import { suggestName } from '../text/suggest';
import { spanUnion } from './util';

/** Keys of the leaving state (defining or claims). */
const STATE_KEY_SET: ReadonlySet<string> = new Set(['db', 'wb', 'dp', 'rh', 'w', 'h', 'v']);

/** Which equipment each equipment key belongs to (`eff` is the fan's or the adiabatic humidifier's). */
const KEY_FORM: Readonly<Record<string, EquipmentResult['form']>> = {
  heat: 'heater',
  dt: 'heater',
  dp_fan: 'fan',
  eff_motor: 'fan',
  adp: 'coil',
  bf: 'coil',
  p_steam: 'steam',
};

const FORM_WORDS: Readonly<Record<string, string>> = {
  heater: 'a sensible heater',
  fan: 'a fan',
  coil: 'a cooling coil',
  steam: 'a steam humidifier',
  adiabatic: 'an adiabatic humidifier',
  leaving: 'a leaving state',
};

/** `heat=` for a key, the word itself for an equipment word. */
function keyText(k: string): string {
  return Object.hasOwn(PROCESS_WORDS, k) ? k : `${k}=`;
}

/** Whether a process statement carries a specification that can define its leaving state. */
export function hasSpecification(stmt: ProcessStatement): boolean {
  return stmt.words.length > 0 || stmt.props.some((p) => DERIVE_KEY_NAMES.has(p.key));
}

/** The written text of the specification (`heat=20kW`, `steam w=5.65g/kg`), from the syntax tree. */
export function specText(stmt: ProcessStatement): string {
  const parts = stmt.words.map((w) => w.text);
  for (const p of stmt.props) {
    if (!DERIVE_KEY_NAMES.has(p.key) || !p.value) continue;
    const v = p.value;
    parts.push(`${p.key}=${v.number.text}${v.unit?.text ?? ''}`);
  }
  return parts.join(' ');
}

/** A derived leaving state. */
export interface Derivation {
  state: MoistAirState;
  equipment: EquipmentResult;
  /** The defining pair when the leaving state is given by its properties. */
  defining: DefiningKey[];
  /** Props used as the specification (the rest of the derive keys are claims about the leaving state). */
  used: ReadProp[];
  /** For a coil: the apparatus dew point and bypass factor. */
  adp: { adp: number; bf: number } | null;
  /** The leaving state's properties written beyond the specification, compared with it. */
  claims: ClaimResult[];
}

/** The outcome of a model, reported on the key it blames; null when it failed. */
function modelValue<T>(
  ctx: EvalContext,
  what: string,
  o: EquipmentOutcome<T>,
  props: ReadProp[],
  fallback: Span,
): T | null {
  if (o.ok) return o.value;
  ctx.report(problemReport(ctx, what, o.problem, props, fallback));
  return null;
}

function problemReport(
  ctx: EvalContext,
  what: string,
  p: EquipmentProblem,
  props: ReadProp[],
  fallback: Span,
): CoreDiagnostic {
  const prop = props.find((x) => x.key === p.key);
  const texts = problemTexts(p, ctx.units);
  return {
    code: p.code === 'unreachable' ? 'spec-unreachable' : 'out-of-range',
    severity: 'error',
    message: problemMessage(what, texts),
    span: prop ? prop.prop.span : fallback,
  };
}

/** A property function threw for a state outside the formulation: reported as the engine's problem. */
function guarded<T>(ctx: EvalContext, what: string, span: Span, f: () => T | null): T | null {
  try {
    return f();
  } catch (err) {
    if (err instanceof PsychroError) {
      ctx.report(problemDiagnostic(err.problem, ctx.units, 'error', new Map(), span, what));
      return null;
    }
    throw err;
  }
}

/** `dt=+5K` as a difference in kelvin (the unit's scale, without its offset). */
function difference(p: ReadProp): number {
  return p.q.unit ? p.q.quantity.number.value * p.q.unit.scale : p.q.quantity.number.value;
}

/**
 * Defines the leaving state of `stmt` from entering state `from` (computed) and the process's
 * dry-air flow (null when unknown). Reports every problem of the specification; null when the
 * state cannot be defined. `props` are the statement's readable properties.
 */
export function deriveLeaving(
  ctx: EvalContext,
  stmt: ProcessStatement,
  what: string,
  props: ReadProp[],
  from: StateResult,
  massFlow: number | null,
): Derivation | null {
  const a = from.state!;
  const toName = stmt.to?.text ?? 'the leaving state';
  const fallback = stmt.to?.span ?? stmt.keywordSpan;
  const get = (k: string): ReadProp | undefined => props.find((p) => p.key === k);

  // The equipment words.
  let word: { text: string; span: Span } | null = null;
  for (const w of stmt.words) {
    if (!Object.hasOwn(PROCESS_WORDS, w.text)) {
      const suggestion = suggestName(w.text, Object.keys(PROCESS_WORDS));
      ctx.report({
        code: 'unknown-key',
        severity: 'error',
        message:
          `'${w.text}' is not a kind of equipment a process ` +
          `knows; ${suggestion ? `did you mean ${suggestion}? ` : ''}write steam ` +
          `(${PROCESS_WORDS.steam}) or adiabatic (${PROCESS_WORDS.adiabatic}), or key=value`,
        span: w.span,
        data: suggestion ? { key: w.text, suggestion } : { key: w.text },
      });
      return null;
    }
    if (word && word.text !== w.text) {
      ctx.report({
        code: 'spec-conflict',
        severity: 'error',
        message:
          `${what}: '${word.text}' and '${w.text}' name two different ` +
          `humidifiers; one process is one piece of equipment: keep one word`,
        span: w.span,
        related: [{ span: word.span, message: `'${word.text}'` }],
      });
      return null;
    }
    word ??= w;
  }

  // Which equipment the keys name.
  const forms = new Map<EquipmentResult['form'], ReadProp | { key: string; prop: { span: Span } }>();
  if (word) forms.set(word.text as 'steam' | 'adiabatic', { key: word.text, prop: { span: word.span } });
  for (const p of props) {
    const f = KEY_FORM[p.key];
    if (f && !forms.has(f)) forms.set(f, p);
  }
  const eff = get('eff');
  if (eff && !forms.has('fan') && !forms.has('adiabatic')) {
    ctx.report({
      code: 'spec-missing',
      severity: 'error',
      message:
        `${what}: eff= is the total efficiency of a fan (with dp_fan=, e.g. dp_fan=750Pa ` +
        `eff=0.62) or the saturation effectiveness of an adiabatic humidifier ` +
        `(with the word adiabatic, e.g. adiabatic eff=0.85); add the one you mean`,
      span: eff.prop.span,
    });
    return null;
  }
  if (forms.size > 1) {
    const [first, second] = [...forms.entries()];
    ctx.report({
      code: 'spec-conflict',
      severity: 'error',
      message:
        `${what}: ${keyText(first![1].key)} describes ${FORM_WORDS[first![0]]} ` +
        `and ${keyText(second![1].key)} ${FORM_WORDS[second![0]]}; one process is one piece of ` +
        `equipment: keep one specification, or split it into two processes with a state between them`,
      span: second![1].prop.span,
      related: [{ span: first![1].prop.span, message: `${keyText(first![1].key)}: ${FORM_WORDS[first![0]]}` }],
    });
    return null;
  }
  if (forms.has('steam') && !word) {
    const ps = get('p_steam')!;
    ctx.report({
      code: 'spec-missing',
      severity: 'error',
      message:
        `${what}: p_steam= is the steam supply of a steam humidifier; add the word steam and a target ` +
        `(e.g. ${ctx.units === 'IP' ? 'steam w=39.6gr/lb p_steam=29psia' : 'steam w=5.65g/kg p_steam=200kPa'})`,
      span: ps.prop.span,
    });
    return null;
  }
  const form: EquipmentResult['form'] = forms.keys().next().value ?? 'leaving';
  const spec = ''; // filled in below, from the keys that defined the state
  const missing = (message: string, span: Span): null => {
    ctx.report({ code: 'spec-missing', severity: 'error', message: `${what}: ${message}`, span });
    return null;
  };
  const guard = <T>(f: () => T | null): T | null => guarded(ctx, what, fallback, f);

  let out: Derivation | null = null;
  switch (form) {
    case 'heater': {
      const heat = get('heat');
      const dt = get('dt');
      if (heat && dt) {
        ctx.report({
          code: 'spec-conflict',
          severity: 'error',
          message:
            `${what}: heat= and dt= both fix the leaving temperature; keep ` +
            `one (the leaving dry-bulb can be written as a claim, db=…)`,
          span: dt.prop.span,
          related: [{ span: heat.prop.span, message: 'heat=' }],
        });
        return null;
      }
      if (heat) {
        if (massFlow === null)
          return missing(
            `heat=${heat.q.quantity.number.text}${heat.q.unitText} needs ` +
              `the dry-air flow to find the leaving temperature: add m= or q=, ` +
              `or let the process leave a mix (or a state) that carries a flow`,
            heat.prop.span,
          );
        const state = guard(() => modelValue(ctx, what, sensibleByDuty(a, heat.q.si, massFlow), props, fallback));
        if (!state) return null;
        out = { state, equipment: { form, spec }, defining: [], used: [heat], adp: null, claims: [] };
      } else {
        const state = guard(() => modelValue(ctx, what, sensibleByDt(a, difference(dt!)), props, fallback));
        if (!state) return null;
        out = { state, equipment: { form, spec }, defining: [], used: [dt!], adp: null, claims: [] };
      }
      break;
    }
    case 'fan': {
      const dp = get('dp_fan');
      const motor = get('eff_motor');
      if (!dp)
        return missing(
          `a fan needs its total pressure rise: add dp_fan= (e.g. dp_fan=750Pa eff=0.62)`,
          (motor ?? eff)?.prop.span ?? fallback,
        );
      if (!eff)
        return missing(
          `a fan needs its total efficiency (electrical input to air power): add ` +
            `eff= (e.g. dp_fan=${dp.q.quantity.number.text}${dp.q.unitText} eff=0.62)`,
          dp.prop.span,
        );
      const o = { dpPa: dp.q.si, efficiency: eff.q.si, motorEfficiency: motor ? motor.q.si : null };
      const state = guard(() => modelValue(ctx, what, fanLeaving(a, o), props, fallback));
      if (!state) return null;
      out = {
        state,
        equipment: { form, spec, fanRiseK: fanTemperatureRise(a, o) },
        defining: [],
        used: [dp, eff, ...(motor ? [motor] : [])],
        adp: null,
        claims: [],
      };
      break;
    }
    case 'coil': {
      const adp = get('adp');
      const bf = get('bf');
      if (!adp)
        return missing(
          `bf= needs the apparatus dew point: add adp= (e.g. ${exampleIn('adp', ctx.units)} ` +
            `bf=${bf!.q.quantity.number.text}${bf!.q.unitText})`,
          bf!.prop.span,
        );
      if (!bf)
        return missing(
          `adp= needs the bypass factor (the share of air that misses the coil; contact factor ` +
            `1 − bf): add bf= (e.g. adp=${adp.q.quantity.number.text}${adp.q.unitText} bf=0.1)`,
          adp.prop.span,
        );
      const r = guard(() => modelValue(ctx, what, coilFromAdp(a, adp.q.si, bf.q.si), props, fallback));
      if (!r) return null;
      out = {
        state: r.state,
        equipment: { form, spec, dryCoil: r.dry },
        defining: [],
        used: [adp, bf],
        adp: r.dry ? null : { adp: adp.q.si, bf: bf.q.si },
        claims: [],
      };
      break;
    }
    case 'steam': {
      const target = props.find((p) => p.key === 'w' || p.key === 'rh');
      if (!target)
        return missing(
          `a steam humidifier needs its target: add w= (e.g. ` +
            `steam ${ctx.units === 'IP' ? 'w=39.6gr/lb' : 'w=5.65g/kg'}) or rh= (e.g. steam rh=40%)`,
          word!.span,
        );
      const ps = get('p_steam');
      const steam = guard(() => steamEnthalpy(ps ? ps.q.si : undefined));
      if (!steam) return null;
      const r = guard(() =>
        modelValue(
          ctx,
          what,
          target.key === 'w' ? steamToW(a, target.q.si, steam.h) : steamToRh(a, target.q.si, steam.h),
          props,
          fallback,
        ),
      );
      if (!r) return null;
      out = {
        state: r.state,
        equipment: { form, spec, steamTempC: steam.tSat, steamEnthalpyJkg: steam.h },
        defining: [],
        used: [target, ...(ps ? [ps] : [])],
        adp: null,
        claims: [],
      };
      break;
    }
    case 'adiabatic': {
      const target = eff ?? props.find((p) => p.key === 'rh' || p.key === 'db' || p.key === 'w');
      if (!target)
        return missing(
          `an adiabatic humidifier needs its saturation effectiveness ` +
            `or a target: add eff= (e.g. adiabatic eff=0.85), rh= or db=`,
          word!.span,
        );
      const r = guard(() => {
        switch (target.key) {
          case 'eff':
            return modelValue(ctx, what, adiabaticByEffectiveness(a, target.q.si), props, fallback);
          case 'rh':
            return modelValue(ctx, what, adiabaticToRh(a, target.q.si), props, fallback);
          case 'db':
            return modelValue(ctx, what, adiabaticToDb(a, target.q.si), props, fallback);
          default:
            // To a target humidity ratio on the wet-bulb line.
            return modelValue(ctx, what, adiabaticToW(a, target.q.si), props, fallback);
        }
      });
      if (!r) return null;
      out = {
        state: r.state,
        equipment: { form, spec, saturationEffectiveness: saturationEffectiveness(a, r.state) },
        defining: [],
        used: [target],
        adp: null,
        claims: [],
      };
      break;
    }
    case 'leaving': {
      const defs = props.filter((p) => isDefiningKey(p.key));
      if (defs.length === 0)
        return missing(
          `to define ${toName}, give the equipment (heat=, dt=, dp_fan= eff=, adp= bf=, steam ` +
            `w=…, adiabatic eff=…) or ${toName}'s dry-bulb (db=) and, for a coil, its rh= or w=`,
          props.find((p) => STATE_KEY_SET.has(p.key))?.prop.span ?? fallback,
        );
      if (defs.length === 1) {
        const only = defs[0]!;
        if (only.key !== 'db') {
          return missing(
            `${only.key}= alone does not fix ${toName}: add db= (the leaving dry-bulb ` +
              `with ${only.key}= fixes it), or give the equipment (steam, adiabatic, adp= bf=…)`,
            only.prop.span,
          );
        }
        const state = guard(() => modelValue(ctx, what, sensibleToDb(a, only.q.si), props, fallback));
        if (!state) return null;
        out = { state, equipment: { form: 'heater', spec }, defining: ['db'], used: [only], adp: null, claims: [] };
        break;
      }
      // A reference always defines: the pair holds every reference (as on a state line).
      const refs = defs.filter((d) => d.ref);
      if (refs.length > 2) {
        ctx.report({
          code: 'bad-reference',
          severity: 'error',
          message:
            `${what}: ${writtenList(refs)} are ${refs.length} properties of ${toName} taken from other ` +
            `states, but two fix a state and a reference always defines; write the others as figures (claims)`,
          span: spanUnion(...refs.slice(2).map((d) => d.prop.span)),
        });
        return null;
      }
      const pairs = pairsHolding(candidatePairs(defs), refs);
      if (pairs.length === 0)
        return missing(
          `${writtenList(defs)} fix the same thing (the moisture content) twice; add db= to fix ${toName}`,
          spanUnion(...defs.map((d) => d.prop.span)),
        );
      const p1 = pairs[0]!;
      const p2 = pairs[1]!;
      const input: Partial<Record<DefiningKey, number>> = { [p1.key]: p1.q.si, [p2.key]: p2.q.si };
      const solved = ctx.solve(input, a.p);
      if (!solved.ok) {
        ctx.report(
          problemDiagnostic(
            solved.problem,
            ctx.units,
            'error',
            new Map(defs.map((d) => [d.key, d.prop.span])),
            spanUnion(p1.prop.span, p2.prop.span),
            `${what} (${toName})`,
          ),
        );
        return null;
      }
      for (const w of solved.warnings)
        ctx.report(
          problemDiagnostic(
            w,
            ctx.units,
            'warning',
            new Map(defs.map((d) => [d.key, d.prop.span])),
            spanUnion(p1.prop.span, p2.prop.span),
            `${what} (${toName})`,
          ),
        );
      out = {
        state: solved.state,
        equipment: { form, spec },
        defining: [p1.key as DefiningKey, p2.key as DefiningKey],
        used: [p1, p2],
        adp: null,
        claims: [],
      };
      break;
    }
    default:
      return null;
  }
  if (!stateFinite(out.state)) {
    ctx.report({
      code: 'out-of-range',
      severity: 'error',
      message:
        `${what}: ${toName} would have a property without a finite value (bone-dry air has ` +
        `no dew point); Dewmark needs every property finite: give a humidity ratio above zero`,
      span: spanUnion(...out.used.map((p) => p.prop.span)),
    });
    return null;
  }
  const used = out.used;
  // The specification as written: the equipment word and the keys that defined the state.
  out.equipment.spec = [
    ...(word ? [word.text] : []),
    ...used.map((p) => `${p.key}=${p.q.quantity.number.text}${p.q.unitText}`),
  ].join(' ');
  const claimProps: ReadProp[] = [];
  for (const p of props) {
    if (!STATE_KEY_SET.has(p.key) || used.includes(p)) continue;
    if (!p.ref) {
      claimProps.push(p);
      continue;
    }
    // A reference defines; beside equipment that fixes the state, it could only be a claim.
    ctx.report({
      code: 'bad-reference',
      severity: 'error',
      message:
        `${what}: ${p.key}=${p.q.quantity.number.text} would be a claim ` +
        `about ${toName}, which ${out.equipment.spec || 'the specification'} already ` +
        `fixes, and a reference always defines; write ${p.key}= as a figure to ` +
        `check it, or drop the equipment to define ${toName} from its properties`,
      span: p.prop.span,
    });
  }
  if (claimProps.length > 0)
    out.claims = stateClaims(
      ctx,
      claimProps,
      out.state,
      () => `for ${toName} from ${from.name} by ${out!.equipment.spec}`,
    );
  return out;
}

/** The props of a process that are not claims about its heat rates (flow, specification, leaving state). */
export function isSpecOrFlow(p: PropertyNode): boolean {
  return PROCESS_KEYS[p.key]?.kind === 'flow' || DERIVE_KEY_NAMES.has(p.key);
}
