/**
 * The diagnostic-code registry (`shared-core/src/vocabulary/codes.ts`) against the docs and the
 * fixtures: every registered code has a row in docs/notation.md with the same severity, the docs
 * list no code the registry lacks, and every code has a fixture that produces it (a note under
 * test/fixtures/diagnostics/, the editor's settings for an editor-only code, an engine call under
 * test/fixtures/engine/) or, for a code no input can reach, a named test that forces it.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { solveState } from '../shared-core/src/physics';
import {
  CODES,
  DIAGNOSTIC_CODES,
  codeSpec,
  isDiagnosticCode,
  type DiagnosticCode,
} from '../shared-core/src/vocabulary/codes';

const root = join(__dirname, '..');
const fixtures = join(__dirname, 'fixtures');

/** The rows of every table of docs/notation.md whose first cell names codes: code → severity cell. */
function documentedCodes(): Map<string, string> {
  const docs = readFileSync(join(root, 'docs', 'notation.md'), 'utf8');
  const out = new Map<string, string>();
  let header: string[] | null = null;
  for (const line of docs.split('\n')) {
    if (!line.startsWith('|')) {
      header = null;
      continue;
    }
    const cells = line
      .split('|')
      .slice(1, -1)
      .map((c) => c.trim());
    if (header === null) {
      header = cells;
      continue;
    }
    if (header[0] !== 'code' || /^-+$/.test(cells[0] ?? '')) continue;
    for (const m of (cells[0] ?? '').matchAll(/`([a-z][a-z-]*)`/g)) out.set(m[1]!, cells[1] ?? '');
  }
  return out;
}

describe('the diagnostic-code registry', () => {
  const documented = documentedCodes();

  it('reads the docs tables (the scan itself can fail)', () => {
    expect(documented.size).toBeGreaterThan(30);
    expect(documented.get('wb-above-db')).toBe('error');
    expect(documented.get('ignore-comment')).toBe('warning, info');
  });

  it.each(DIAGNOSTIC_CODES.map((c) => [c]))('%s has a row in docs/notation.md with its severity', (code) => {
    expect(documented.has(code), `docs/notation.md has no row for '${code}'`).toBe(true);
    // The docs give the usual severity first; a code reported with a second one may name it after a comma.
    const [usual, ...others] = documented.get(code)!.split(/,\s*/);
    expect(usual, `the severity of '${code}' in the docs`).toBe(codeSpec(code).severity);
    for (const other of others)
      expect(other, `the second severity of '${code}' in the docs`).toBe(codeSpec(code).alsoAs);
  });

  it('the docs list no code the registry lacks', () => {
    expect([...documented.keys()].filter((c) => !isDiagnosticCode(c))).toEqual([]);
  });

  it('every fixture note is named after a registered code', () => {
    const names = readdirSync(join(fixtures, 'diagnostics'))
      .filter((f) => f.endsWith('.md'))
      .map((f) => basename(f, '.md'));
    expect(names.filter((n) => !isDiagnosticCode(n))).toEqual([]);
    const engine = readdirSync(join(fixtures, 'engine')).map((f) => basename(f, '.json'));
    expect(engine.filter((n) => !isDiagnosticCode(n) || codeSpec(n as DiagnosticCode).fixture !== 'engine')).toEqual(
      [],
    );
  });

  it.each(DIAGNOSTIC_CODES.map((c) => [c]))('%s has a fixture', (code) => {
    const kind = codeSpec(code).fixture;
    if (kind === 'note' || kind === 'editor') {
      expect(existsSync(join(fixtures, 'diagnostics', `${code}.md`)), `test/fixtures/diagnostics/${code}.md`).toBe(
        true,
      );
    } else if (kind === 'engine') {
      const f = JSON.parse(readFileSync(join(fixtures, 'engine', `${code}.json`), 'utf8')) as {
        input: Record<string, number>;
        pressurePa: number;
      };
      const r = solveState(f.input as Parameters<typeof solveState>[0], f.pressurePa);
      expect(r.ok ? 'solved' : r.problem.code).toBe(code);
    } else {
      // A code no input reaches: the named test forces it and checks it.
      const test = readFileSync(join(root, kind.test), 'utf8');
      expect(test, `${kind.test} forces '${code}'`).toContain(`'${code}'`);
      expect(kind.never.length).toBeGreaterThan(20);
    }
  });

  it('only codes that report bugs have no fixture input', () => {
    expect(DIAGNOSTIC_CODES.filter((c) => typeof CODES[c].fixture === 'object')).toEqual([
      'internal-error',
      'no-convergence',
    ]);
  });
});
