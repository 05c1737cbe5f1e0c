/**
 * The diagnostic-code registry's own rules: codes are typed (an unknown code does not compile —
 * checked by the compiler on every `code:` in the sources), the engine's codes are the registry's
 * engine rows, and the one code no note can reach, `internal-error`, is forced here with a syntax
 * tree no parser makes.
 */
import { describe, expect, it } from 'vitest';
import { evaluate } from '../src/evaluate';
import { parseNote } from '../src/notation/parse';
import { SYNTAX_CODES } from '../src/notation/parse';
import { CODES, DIAGNOSTIC_CODES, isDiagnosticCode, type CodeFrom, type DiagnosticCode } from '../src/vocabulary/codes';
import type { PhysicsCode } from '../src/physics/types';

describe('the code registry', () => {
  it('lists each code once, each with a one-line meaning', () => {
    expect(new Set(DIAGNOSTIC_CODES).size).toBe(DIAGNOSTIC_CODES.length);
    for (const c of DIAGNOSTIC_CODES) {
      expect(c).toMatch(/^[a-z]+(-[a-z]+)*$/);
      expect(CODES[c].meaning.length, c).toBeGreaterThan(10);
      expect(CODES[c].meaning, c).not.toContain('\n');
    }
    expect(isDiagnosticCode('wb-above-db')).toBe(true);
    expect(isDiagnosticCode('wb-above-dp')).toBe(false);
    expect(isDiagnosticCode('toString')).toBe(false);
  });

  it("the parser's codes are the registry's parser rows", () => {
    const parser: CodeFrom<'parser'>[] = DIAGNOSTIC_CODES.filter((c): c is CodeFrom<'parser'> =>
      (CODES[c].from as readonly string[]).includes('parser'),
    );
    expect(Object.keys(SYNTAX_CODES).sort()).toEqual([...parser].sort());
  });

  it("the engine's codes are the registry's engine rows (the type is the same union)", () => {
    const engine: PhysicsCode[] = DIAGNOSTIC_CODES.filter((c): c is PhysicsCode =>
      (CODES[c].from as readonly string[]).includes('engine'),
    );
    expect(engine).toContain('overspecified');
    expect(engine).toContain('no-convergence');
    const asCode: DiagnosticCode = engine[0]!; // a PhysicsCode is a DiagnosticCode
    expect(isDiagnosticCode(asCode)).toBe(true);
  });
});

describe("'internal-error'", () => {
  it("a statement the evaluator cannot handle gets 'internal-error', and the rest of the note is evaluated", () => {
    const parsed = parseNote('```air\nstate A: db=24C rh=50%\nstate B: db=20C rh=40%\n```\n');
    const broken = parsed.statements[0]!;
    // A tree no parser makes: reading the statement's properties throws.
    Object.defineProperty(broken, 'props', {
      get() {
        throw new Error('a property list that cannot be read');
      },
    });
    const a = evaluate(parsed);
    const d = a.diagnostics.filter((x) => x.code === 'internal-error');
    expect(d.length).toBe(1);
    expect(d[0]!.severity).toBe('error');
    expect(d[0]!.span).toEqual(broken.span);
    expect(d[0]!.message).toContain('please report it with the note');
    expect(
      a.items.find((i) => i.name === 'B')?.kind === 'state' &&
        (a.items.find((i) => i.name === 'B') as { state: unknown }).state,
    ).toBeTruthy();
  });
});
