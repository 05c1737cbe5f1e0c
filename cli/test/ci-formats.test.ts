/**
 * The CI pieces, through the real `dewmark` process: `--format github` annotations, `--format
 * sarif` (SARIF 2.1.0, its structure checked against the specification's required properties),
 * the problem matcher read against real text output, and sanitised output — a file name or note
 * text holding a newline or an escape sequence never starts a workflow command or reaches the
 * terminal raw.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..', '..');
const bin = join(root, 'bin', 'dewmark.js');
let dir = '';

function dewmark(args: string[], cwd = dir) {
  const r = spawnSync(process.execPath, [bin, ...args], {
    cwd,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', DEWMARK_WORKERS: '0' },
    timeout: 60_000,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

// Invented notes. A stale claim (warning), a wet-bulb above its dry-bulb (error).
const NOTE = [
  '# AHU-2, invented office',
  '',
  '```air',
  'state RA: db=24C rh=50% w=11.0g/kg',
  'state X: db=20C wb=25C',
  '```',
  '',
].join('\n');
// A note whose text carries an escape sequence and a line break into a quoted name.
const HOSTILE_NOTE = ['```air', 'state A: db=20C wb=25C', 'state B: \u001b[2Jdb=24C rh=50%', '```', ''].join('\n');
const HOSTILE_NAME = 'x\n::error file=a.md::injected\u001b[2J.md';
const COLON_NAME = '::warning::leading.md';

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-ci-'));
  mkdirSync(join(dir, 'notes'));
  writeFileSync(join(dir, 'notes', 'ahu 2.md'), NOTE);
  mkdirSync(join(dir, 'hostile'));
  writeFileSync(join(dir, 'hostile', HOSTILE_NAME), NOTE);
  writeFileSync(join(dir, 'hostile', COLON_NAME), NOTE);
  writeFileSync(join(dir, 'hostile', 'text.md'), HOSTILE_NOTE);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** Lines that the Actions runner would take as workflow commands (it reads stdout and stderr). */
function commandLines(text: string): string[] {
  return text.split(/\r?\n/).filter((l) => /^\s*::/.test(l));
}

describe('--format github', () => {
  it('prints one annotation per diagnostic with file, position, title and message, and the usual exit code', () => {
    const r = dewmark(['check', '--format', 'github', 'notes']);
    expect(r.code).toBe(1);
    const lines = commandLines(r.out);
    expect(lines).toEqual([
      expect.stringMatching(
        new RegExp(
          /^::warning file=notes\/ahu 2\.md,line=4,col=\d+,endLine=4,endColumn=\d+,/.source +
            /title=dewmark claim-mismatch::stale claim w=11\.0g\/kg/.source,
        ),
      ),
      expect.stringMatching(
        /^::error file=notes\/ahu 2\.md,line=5,col=\d+,endLine=5,endColumn=\d+,title=dewmark wb-above-db::state X: /,
      ),
    ]);
    // The `%` of "rh=50%" is escaped, as the workflow-command syntax requires.
    expect(lines[0]).toContain('rh=50%25');
    expect(r.out).toMatch(/^1 file, 1 error, 1 warning$/m);
  });

  it('a hostile file name or note text starts no command of its own and writes no control character', () => {
    const r = dewmark(['check', '--format', 'github', 'hostile']);
    const lines = commandLines(r.out + r.err);
    // Two annotations for each of the two hostile names, three for the note with an escape
    // sequence in its text (wb above db, the state left underspecified, the unreadable token): all ours.
    expect(lines).toHaveLength(7);
    for (const l of lines) expect(l).toMatch(/^::(error|warning) file=[^\n]*,title=dewmark [a-z-]+::/);
    expect(r.out + r.err).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
    expect(r.out).toContain('file=hostile/x\\n%3A%3Aerror file=a.md%3A%3Ainjected\\x1b[2J.md,');
    expect(r.out).toContain(
      '::error file=hostile/text.md,line=3,col=10,endLine=3,endColumn=20,title=dewmark ' +
        "syntax::unexpected '\\x1b[2Jdb=24C'",
    );
  });
});

describe('text output is sanitised', () => {
  it('a file name with a newline and an escape sequence prints on one line, escaped', () => {
    const r = dewmark(['check', 'hostile']);
    expect(commandLines(r.out + r.err)).toEqual([]);
    expect(r.out + r.err).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
    expect(r.out).toContain('hostile/x\\n::error file=a.md::injected\\x1b[2J.md:5:');
  });

  it('a relative path that starts with "::" is printed as ./::…, so no line begins with "::"', () => {
    const r = dewmark(['check', COLON_NAME], join(dir, 'hostile'));
    expect(r.code).toBe(1);
    expect(commandLines(r.out)).toEqual([]);
    expect(r.out).toMatch(/^\.\/::warning::leading\.md:5:\d+: error\[wb-above-db\]/m);
  });

  it('a missing path with a newline is reported on one line; an unknown option likewise', () => {
    const missing = dewmark(['check', 'nope\n::error::x.md']);
    expect(missing.code).toBe(2);
    expect(commandLines(missing.err)).toEqual([]);
    expect(missing.err).toContain("cannot read 'nope\\n::error::x.md'");
    const option = dewmark(['check', '--zz\n::error::x']);
    expect(option.code).toBe(2);
    expect(commandLines(option.err)).toEqual([]);
    expect(option.err).toContain("unknown option '--zz\\n::error::x'");
  });

  it('report and chart print the note and the written file on one line, escaped', () => {
    mkdirSync(join(dir, 'out'), { recursive: true });
    for (const [command, ext] of [
      ['report', 'html'],
      ['chart', 'svg'],
    ] as const) {
      const output = join('out', `r\n::error::written\u001b[2J.${ext}`);
      const r = dewmark([command, join('hostile', HOSTILE_NAME), '-o', output]);
      expect(r.code, r.err).toBe(1); // the note has an error (wet-bulb above dry-bulb); the file is still written
      expect(existsSync(join(dir, output))).toBe(true);
      expect(commandLines(r.out + r.err)).toEqual([]);
      expect(r.out + r.err).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
      expect(r.err).toContain(
        `dewmark: wrote out/r\\n::error::written\\x1b[2J.${ext} ` +
          `(hostile/x\\n::error file=a.md::injected\\x1b[2J.md: 1 error`,
      );
    }
  });

  it('note text with an escape sequence is shown escaped in eval tables and messages', () => {
    const r = dewmark(['eval', join('hostile', 'text.md')]);
    expect(r.out + r.err).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f]/);
  });
});

describe('problem matcher', () => {
  const matcher = JSON.parse(readFileSync(join(root, 'ci', 'dewmark-problem-matcher.json'), 'utf8')) as {
    problemMatcher: {
      owner: string;
      severity: string;
      pattern: { regexp: string; file: number; line: number; column: number; code: number; message: number }[];
    }[];
  };

  /** What the matchers make of each line: the first matcher that matches, as the runner does. */
  function read(output: string) {
    const found: { severity: string; file: string; line: number; column: number; code: string; message: string }[] = [];
    for (const line of output.split('\n')) {
      for (const m of matcher.problemMatcher) {
        const p = m.pattern[0]!;
        const x = new RegExp(p.regexp).exec(line);
        if (!x) continue;
        found.push({
          severity: m.severity,
          file: x[p.file]!,
          line: Number(x[p.line]),
          column: Number(x[p.column]),
          code: x[p.code]!,
          message: x[p.message]!,
        });
        break;
      }
    }
    return found;
  }

  it('reads every diagnostic line of real text output, with its severity, code and message, and nothing else', () => {
    const r = dewmark(['check', 'notes']);
    const json = JSON.parse(dewmark(['check', '--format', 'json', 'notes']).out) as {
      files: {
        path: string;
        diagnostics: { line: number; column: number; severity: string; code: string; message: string }[];
      }[];
    };
    const expected = json.files.flatMap((f) =>
      f.diagnostics.map((d) => ({
        severity: d.severity === 'info' ? 'notice' : d.severity,
        file: f.path,
        line: d.line,
        column: d.column,
        code: d.code,
        message: d.message,
      })),
    );
    expect(expected.length).toBeGreaterThan(1);
    expect(read(r.out)).toEqual(expected);
    // The summary line is not a problem.
    expect(read('1 file, 1 error, 1 warning')).toEqual([]);
  });

  it('keeps a message that itself holds ":1:2: error[x]:" whole, and reads info lines as notices', () => {
    const line = 'notes/a.md:3:7: info[note-too-large]: see notes/b.md:1:2: error[x]: quoted';
    expect(read(line)).toEqual([
      {
        severity: 'notice',
        file: 'notes/a.md',
        line: 3,
        column: 7,
        code: 'note-too-large',
        message: 'see notes/b.md:1:2: error[x]: quoted',
      },
    ]);
  });

  it('the generic gcc-style pattern does not read the severity of these lines (why this matcher exists)', () => {
    const gcc = /^(.+):(\d+):(\d+):\s+(?:fatal\s+)?(warning|error):\s+(.*)$/;
    expect(gcc.exec('notes/a.md:4:27: warning[claim-mismatch]: stale claim')).toBeNull();
  });
});

describe('--format sarif', () => {
  /** The properties SARIF 2.1.0 (OASIS standard, §3.13–3.30) requires, and the values it allows. */
  function sarifProblems(log: any): string[] {
    const p: string[] = [];
    if (log.version !== '2.1.0') p.push('version must be "2.1.0" (§3.13.2)');
    if (!Array.isArray(log.runs)) p.push('runs must be an array (§3.13.4)');
    for (const [i, run] of (log.runs ?? []).entries()) {
      const driver = run?.tool?.driver;
      if (typeof driver?.name !== 'string' || driver.name === '')
        p.push(`runs[${i}].tool.driver.name is required (§3.19.8)`);
      const rules: any[] = driver?.rules ?? [];
      const ids = rules.map((r) => r.id);
      if (new Set(ids).size !== ids.length) p.push('rule ids must be unique (§3.49.3)');
      if (run.columnKind !== undefined && !['utf16CodeUnits', 'unicodeCodePoints'].includes(run.columnKind))
        p.push('columnKind value (§3.14.17)');
      for (const [k, r] of (run.results ?? []).entries()) {
        const where = `runs[${i}].results[${k}]`;
        if (typeof r.message?.text !== 'string' || r.message.text === '')
          p.push(`${where}.message.text is required (§3.27.11)`);
        if (r.level !== undefined && !['none', 'note', 'warning', 'error'].includes(r.level))
          p.push(`${where}.level (§3.27.10)`);
        if (r.ruleIndex !== undefined && rules[r.ruleIndex]?.id !== r.ruleId)
          p.push(`${where}.ruleIndex must point at the rule of ruleId (§3.27.6)`);
        for (const loc of r.locations ?? []) {
          const region = loc.physicalLocation?.region;
          const uri = loc.physicalLocation?.artifactLocation?.uri;
          if (typeof uri !== 'string' || /[\s]/.test(uri))
            p.push(`${where} artifactLocation.uri must be a URI reference (§3.4.3)`);
          if (
            loc.physicalLocation?.artifactLocation?.uriBaseId !== undefined &&
            !run.originalUriBaseIds?.[loc.physicalLocation.artifactLocation.uriBaseId]
          )
            p.push(`${where} uriBaseId must be defined in originalUriBaseIds (§3.14.14)`);
          if (!(region.startLine >= 1) || !(region.startColumn >= 1))
            p.push(`${where} region lines and columns are 1-based (§3.30.5)`);
          if (
            region.endLine < region.startLine ||
            (region.endLine === region.startLine && region.endColumn < region.startColumn)
          )
            p.push(`${where} region ends before it starts (§3.30)`);
        }
      }
      for (const [name, base] of Object.entries(run.originalUriBaseIds ?? {})) {
        if (!String((base as any).uri).endsWith('/'))
          p.push(`originalUriBaseIds.${name}.uri must end with a slash (§3.14.14)`);
      }
    }
    return p;
  }

  it("writes a SARIF 2.1.0 log with a rule per code and a result per diagnostic, at the JSON's positions", () => {
    const r = dewmark(['check', '--format', 'sarif', 'notes']);
    expect(r.code).toBe(1);
    const log = JSON.parse(r.out);
    expect(sarifProblems(log)).toEqual([]);
    const run = log.runs[0];
    expect(run.tool.driver.name).toBe('dewmark');
    expect(run.tool.driver.rules.map((x: { id: string }) => x.id).sort()).toEqual(['claim-mismatch', 'wb-above-db']);
    const json = JSON.parse(dewmark(['check', '--format', 'json', 'notes']).out);
    const d = json.files[0].diagnostics;
    expect(
      run.results.map((x: any) => [
        x.ruleId,
        x.level,
        x.locations[0].physicalLocation.region.startLine,
        x.locations[0].physicalLocation.region.startColumn,
        x.locations[0].physicalLocation.region.endColumn,
      ]),
    ).toEqual(d.map((x: any) => [x.code, x.severity, x.line, x.column, x.endColumn]));
    // A space in the file name is percent-encoded in the URI, relative to the source root.
    expect(run.results[0].locations[0].physicalLocation.artifactLocation).toEqual({
      uri: 'notes/ahu%202.md',
      uriBaseId: '%SRCROOT%',
    });
  });

  it('the structure check catches what it should (it is not a check that cannot fail)', () => {
    const log = JSON.parse(dewmark(['check', '--format', 'sarif', 'notes']).out);
    log.runs[0].results[0].level = 'fatal';
    log.runs[0].results[1].ruleIndex = 7;
    delete log.runs[0].tool.driver.name;
    expect(sarifProblems(log)).toHaveLength(3);
  });

  it('a hostile file name stays data inside the JSON string', () => {
    const r = dewmark(['check', '--format', 'sarif', 'hostile']);
    const log = JSON.parse(r.out);
    expect(sarifProblems(log)).toEqual([]);
    expect(commandLines(r.out)).toEqual([]);
    const uris = log.runs[0].results.map((x: any) => x.locations[0].physicalLocation.artifactLocation.uri);
    expect(uris).toContain(`hostile/${encodeURIComponent(HOSTILE_NAME)}`);
  });

  it('rejects an unknown format with the list of formats', () => {
    const r = dewmark(['check', '--format', 'xml', 'notes']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--format must be text, json, github, sarif for check');
  });
});

describe('the CI files exist where the docs say', () => {
  it('action.yml, .pre-commit-hooks.yaml and the problem matcher are in the npm package', () => {
    const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { files: string[] };
    for (const f of ['action.yml', '.pre-commit-hooks.yaml', 'ci/']) {
      expect(manifest.files, f).toContain(f);
      expect(existsSync(join(root, f)), f).toBe(true);
    }
  });
});
