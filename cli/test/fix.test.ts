/**
 * `dewmark fix` as a real process: a dry run prints a unified diff and writes nothing; `--write`
 * rewrites stale claims to the figure `check` proposes and refreshes stale results tables, changing
 * no byte outside those spans (a byte-order mark and CRLF line breaks kept); a second run has
 * nothing to do; afterwards `check --max-warnings 0` passes. The figures are never typed in here:
 * each expected replacement is the one `dewmark check` itself proposes in its message.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyzeNote } from '../../shared-core/src/analyze';
import { DEFAULT_SERVICE_SETTINGS, resultsTableEdits } from '../../shared-core/src/service';
import { unifiedDiff } from '../src/diff';

const root = join(__dirname, '..', '..');
const bin = join(root, 'bin', 'dewmark.js');
let dir = '';

function dewmark(args: string[], input?: string) {
  const r = spawnSync(process.execPath, [bin, ...args], {
    cwd: dir,
    input,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', DEWMARK_WORKERS: '0' },
    timeout: 60_000,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** The figure `check` proposes for each stale claim ("update it to 9.30g/kg"), in order. */
function proposed(file: string): string[] {
  const r = dewmark(['check', '--format', 'json', file]);
  const json = JSON.parse(r.out) as { files: { diagnostics: { code: string; message: string }[] }[] };
  return json.files[0]!.diagnostics.filter((d) => d.code === 'claim-mismatch').map(
    (d) => /update it to (\S+?)(?: or |$)/.exec(d.message)![1]!,
  );
}

/** A note with its results tables written (as the editor command writes them). */
function withTables(text: string): string {
  const plan = resultsTableEdits(
    { text, analysis: analyzeNote(text), settings: DEFAULT_SERVICE_SETTINGS },
    { kind: 'all' },
  );
  let out = text;
  for (const e of [...plan.edits].sort((a, b) => b.span.start - a.span.start))
    out = out.slice(0, e.span.start) + e.newText + out.slice(e.span.end);
  return out;
}

// Invented notes of an invented building.
const STALE = [
  '# Larch Street clinic, AHU-3',
  '',
  'Room design:',
  '',
  '```air',
  'state RA: db=24C rh=50% w=11.0g/kg   # w written long ago',
  'state OA: db=30C rh=40% dp=25.0C',
  '```',
  '',
  'End of note.',
  '',
].join('\r\n');

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-fix-'));
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('dewmark fix', () => {
  it('a dry run prints a unified diff of the claim rewrites, writes nothing, and exits 1', () => {
    writeFileSync(join(dir, 'dry.md'), STALE);
    const figures = proposed('dry.md');
    expect(figures).toHaveLength(2);
    const r = dewmark(['fix', 'dry.md']);
    expect(r.code).toBe(1);
    expect(readFileSync(join(dir, 'dry.md'), 'utf8')).toBe(STALE);
    expect(r.out).toMatch(/^--- a\/dry\.md\n\+\+\+ b\/dry\.md\n@@ -3,8 \+3,8 @@\n/);
    expect(r.out).toContain(
      [
        '-state RA: db=24C rh=50% w=11.0g/kg   # w written long ago',
        '-state OA: db=30C rh=40% dp=25.0C',
        `+state RA: db=24C rh=50% w=${figures[0]}   # w written long ago`,
        `+state OA: db=30C rh=40% dp=${figures[1]}`,
        ' ```',
      ].join('\n'),
    );
    expect(r.err).toContain('would fix 2 stale claims and 0 results tables in 1 file (run with --write to apply)');
  });

  it('--write changes only the claimed figures (byte-order mark and CRLF kept); a second run does nothing', () => {
    const file = join(dir, 'write.md');
    const before = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(STALE, 'utf8')]);
    writeFileSync(file, before);
    const figures = proposed('write.md');
    const r = dewmark(['fix', '--write', 'write.md']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toBe('');
    const expected = Buffer.concat([
      Buffer.from([0xef, 0xbb, 0xbf]),
      Buffer.from(STALE.replace('w=11.0g/kg', `w=${figures[0]}`).replace('dp=25.0C', `dp=${figures[1]}`), 'utf8'),
    ]);
    expect(readFileSync(file).equals(expected)).toBe(true);
    const again = dewmark(['fix', '--write', 'write.md']);
    expect(again.code).toBe(0);
    expect(again.err).toContain('nothing to fix');
    expect(readFileSync(file).equals(expected)).toBe(true);
    expect(dewmark(['check', '--max-warnings', '0', 'write.md']).code).toBe(0);
  });

  it('refreshes a results table that went stale, and only the text between its markers', () => {
    const fresh = withTables(
      ['# AHU-3 off-coil', '', '```air', 'state OFF: db=12C rh=92%', '```', '', 'After the table.', ''].join('\n'),
    );
    expect(fresh).toContain('dewmark-results');
    // The engineer changes the state and forgets the table.
    const stale = fresh.replace('rh=92%', 'rh=85%');
    writeFileSync(join(dir, 'table.md'), stale);
    expect(dewmark(['check', 'table.md']).out).toContain('stale-results-table');
    const r = dewmark(['fix', '--write', 'table.md']);
    expect(r.code, r.err).toBe(0);
    expect(r.err).toContain('fixed 0 stale claims and 1 results table in 1 file');
    const after = readFileSync(join(dir, 'table.md'), 'utf8');
    expect(after).toBe(
      withTables(
        ['# AHU-3 off-coil', '', '```air', 'state OFF: db=12C rh=85%', '```', '', 'After the table.', ''].join('\n'),
      ),
    );
    const start = stale.indexOf('<!-- dewmark-results');
    expect(after.slice(0, start)).toBe(stale.slice(0, start));
    expect(after.slice(after.lastIndexOf('-->') + 3)).toBe(stale.slice(stale.lastIndexOf('-->') + 3));
    expect(dewmark(['check', '--max-warnings', '0', 'table.md']).code).toBe(0);
  });

  it('a rewritten claim that feeds a table: both in one run, and the result is already fixed', () => {
    const note = withTables(['```air', 'state A: db=24C rh=50%', '```', ''].join('\n'))
      .replace('rh=50%', 'rh=50% w=11.0g/kg')
      .replace('db=24C', 'db=26C');
    writeFileSync(join(dir, 'both.md'), note);
    const r = dewmark(['fix', '--write', 'both.md']);
    expect(r.err).toContain('fixed 1 stale claim and 1 results table in 1 file');
    expect(dewmark(['fix', 'both.md']).code).toBe(0);
    expect(dewmark(['check', '--max-warnings', '0', 'both.md']).code).toBe(0);
  });

  it('a clean note: nothing to fix, exit 0; standard input gets the diff but cannot be written', () => {
    writeFileSync(join(dir, 'clean.md'), '```air\nstate RA: db=24C rh=50%\n```\n');
    const r = dewmark(['fix', 'clean.md']);
    expect(r.code).toBe(0);
    expect(r.err).toContain('nothing to fix');
    const piped = dewmark(['fix', '-'], STALE);
    expect(piped.code).toBe(1);
    expect(piped.out).toContain('--- a/<stdin>');
    const refused = dewmark(['fix', '--write', '-'], STALE);
    expect(refused.code).toBe(2);
    expect(refused.err).toContain('fix --write cannot write to standard input');
  });
});

describe('unifiedDiff', () => {
  it('gives separate hunks for changes far apart, with 3 lines of context, and marks a missing last newline', () => {
    const a = Array.from({ length: 20 }, (_, i) => `line ${i + 1}`).join('\n');
    const b = a.replace('line 2\n', 'line two\n').replace('line 19\nline 20', 'line nineteen\nline 20');
    expect(unifiedDiff('n.md', a, b)).toBe(
      [
        '--- a/n.md',
        '+++ b/n.md',
        '@@ -1,5 +1,5 @@',
        ' line 1',
        '-line 2',
        '+line two',
        ' line 3',
        ' line 4',
        ' line 5',
        '@@ -16,5 +16,5 @@',
        ' line 16',
        ' line 17',
        ' line 18',
        '-line 19',
        '+line nineteen',
        ' line 20',
        '\\ No newline at end of file',
        '',
      ].join('\n'),
    );
    expect(unifiedDiff('n.md', a, a)).toBe('');
  });
});

describe('--help of check and eval', () => {
  it('shows the exit codes and examples', () => {
    for (const cmd of ['check', 'eval']) {
      const r = dewmark([cmd, '--help']);
      expect(r.code).toBe(0);
      expect(r.out, cmd).toMatch(/Exit codes:\n {2}0 {2}no errors[^\n]*\n {2}1 {2}[^\n]+\n {2}2 {2}a usage problem/);
      expect(r.out, cmd).toMatch(new RegExp(`Examples:\\n {2}dewmark ${cmd} `));
    }
  });
});

describe('suppressed diagnostics on the command line', () => {
  it(
    'check --format json lists them under suppressed (with the ' +
      'reason) and counts them apart; sarif marks them in-source',
    () => {
      writeFileSync(
        join(dir, 'ack.md'),
        [
          '```air',
          'state RA: db=24C rh=50% w=11.0g/kg   # dewmark-ignore claim-mismatch -- logged on site',
          'state X: db=20C wb=25C',
          '```',
          '',
        ].join('\n'),
      );
      const json = JSON.parse(dewmark(['check', '--format', 'json', 'ack.md']).out);
      expect(json.files[0].diagnostics.map((d: { code: string }) => d.code)).toEqual(['wb-above-db']);
      expect(json.files[0].suppressed).toEqual([
        expect.objectContaining({ code: 'claim-mismatch', line: 2, justification: 'logged on site', ignoreLine: 2 }),
      ]);
      expect(json.summary).toMatchObject({ errors: 1, warnings: 0, suppressed: 1 });
      const text = dewmark(['check', '--max-warnings', '0', 'ack.md']);
      expect(text.out).not.toContain('claim-mismatch');
      const sarif = JSON.parse(dewmark(['check', '--format', 'sarif', 'ack.md']).out);
      const results = sarif.runs[0].results as { ruleId: string; suppressions?: unknown[] }[];
      expect(results.map((r) => [r.ruleId, r.suppressions ?? null])).toEqual([
        ['wb-above-db', null],
        ['claim-mismatch', [{ kind: 'inSource', justification: 'logged on site' }]],
      ]);
    },
  );
});
