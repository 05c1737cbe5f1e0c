/** Turning the engine's typed problems into diagnostics on the offending tokens. */
import type { PhysicsProblem } from '../physics/types';
import { PsychroError } from '../physics/types';
import type { CoreDiagnostic } from '../notation/ast';
import type { Span } from '../text/types';
import type { UnitSystem } from '../units/types';
import { problemTexts } from './figures';
import { spanUnion } from './util';

/** Codes whose natural severity is a warning even when the engine reports them as problems. */
const WARNING_CODES = new Set(['ill-conditioned']);

/**
 * A diagnostic for an engine problem: same stable code, the engine's message and fix (their figures
 * in the note's unit system `system`), the span of
 * the properties the problem names (or `fallback`), and `where` ("state OA") in the message.
 */
export function problemDiagnostic(
  problem: PhysicsProblem,
  system: UnitSystem,
  severity: 'error' | 'warning',
  spansByKey: ReadonlyMap<string, Span>,
  fallback: Span,
  where: string,
  related?: CoreDiagnostic['related'],
): CoreDiagnostic {
  const spans: Span[] = [];
  for (const k of problem.keys ?? []) {
    const s = spansByKey.get(k);
    if (s) spans.push(s);
  }
  const span = spans.length > 0 ? spanUnion(...spans) : fallback;
  const sev = WARNING_CODES.has(problem.code) ? 'warning' : severity;
  const texts = problemTexts(problem, system);
  const d: CoreDiagnostic = {
    code: problem.code,
    severity: sev,
    message: problemMessage(where, texts),
    span,
    data: { keys: [...(problem.keys ?? [])], fix: texts.fix },
  };
  if (related && related.length > 0) d.related = related;
  return d;
}

/** The problem carried by an error thrown by the engine, or a generic one for anything else. */
export function problemOf(err: unknown): PhysicsProblem {
  if (err instanceof PsychroError) return err.problem;
  if (err && typeof err === 'object' && 'problem' in err) {
    const p = (err as { problem: unknown }).problem;
    if (p && typeof p === 'object' && 'code' in p && 'message' in p) return p as PhysicsProblem;
  }
  return {
    code: 'no-solution',
    message: `the engine could not compute this (${err instanceof Error ? err.message : String(err)})`,
    fix: 'check the figures',
    keys: [],
  };
}

/**
 * A problem's diagnostic text: where it is, what is wrong and how to fix it, each a sentence
 * (`Coil CC-1: The coil … . Use …`) — the one form of every problem's message.
 */
export function problemMessage(where: string, texts: { message: string; fix: string }): string {
  const fix = texts.fix ? ` ${ensureSentence(capitalize(texts.fix))}` : '';
  return `${where}: ${ensureSentence(texts.message)}${fix}`;
}

function ensureSentence(s: string): string {
  const t = s.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}

function capitalize(s: string): string {
  return s.length > 0 ? s[0]!.toUpperCase() + s.slice(1) : s;
}
