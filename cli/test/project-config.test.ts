/**
 * The project file `dewmark.json` on the command line: the nearest one above each note sets its
 * units, default site and rule severities; `include`/`exclude` choose the notes; options given on
 * the command line win over it; a broken file is a clear exit-2 message. Figures are never typed
 * in: a note under a project file must give exactly what the same note gives with the equivalent
 * command-line options.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
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

/** The states without the text that says where the pressure came from. */
function figures(states: Record<string, unknown>[] | undefined) {
  return (states ?? []).map(({ pressure: _pressure, ...rest }) => rest);
}

function json(args: string[], cwd = dir) {
  const r = dewmark(args, cwd);
  return JSON.parse(r.out) as {
    files: {
      path: string;
      units?: string;
      states?: { name: string; p_kPa: number; db_C: number; pressure: string }[];
      diagnostics: { code: string; severity: string }[];
    }[];
  };
}

// Invented notes: a room state with a stale claim, and an archived note with an error.
const ROOM = ['```air', 'state RA: db=24C rh=50% w=11.0g/kg', '```', ''].join('\n');
const OLD = ['```air', 'state X: db=20C wb=25C', '```', ''].join('\n');

function write(rel: string, text: string): void {
  const abs = join(dir, rel);
  mkdirSync(join(abs, '..'), { recursive: true });
  writeFileSync(abs, text);
}

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-project-'));
  write(
    'repo/dewmark.json',
    JSON.stringify({ units: 'IP', elevation: '1600 m', rules: { 'claim-mismatch': 'error' }, exclude: ['archive/**'] }),
  );
  write('repo/calcs/room.md', ROOM);
  write('repo/archive/old.md', OLD);
  write('repo/calcs/sub/dewmark.json', JSON.stringify({ units: 'SI' }));
  write('repo/calcs/sub/room.md', ROOM);
  write('plain/room.md', ROOM);
  write('included/dewmark.json', JSON.stringify({ include: ['calcs/**/*.md'] }));
  write('included/calcs/a.md', ROOM);
  write('included/drafts/b.md', OLD);
  write('broken/dewmark.json', '{ "units": "IP", }');
  write('broken/room.md', ROOM);
  write('unknown/dewmark.json', JSON.stringify({ unit: 'IP', rules: { 'claim-mismatch': 'fatal' } }));
  write('unknown/room.md', ROOM);
  write('none/dewmark.json', JSON.stringify({ exclude: ['**/*.md'] }));
  write('none/room.md', ROOM);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('dewmark.json on the command line', () => {
  it('sets units, site and rule severities, and excludes what it says', () => {
    const r = json(['eval', '--format', 'json', 'repo'], dir);
    const paths = r.files.map((f) => f.path).sort();
    expect(paths).toEqual(['repo/calcs/room.md', 'repo/calcs/sub/room.md']);
    const room = r.files.find((f) => f.path === 'repo/calcs/room.md')!;
    expect(room.units).toBe('IP');
    expect(room.diagnostics.map((d) => `${d.code}:${d.severity}`)).toEqual(['claim-mismatch:error']);
    // The same note with the same settings given as options.
    const same = json(['eval', '--format', 'json', '--units', 'IP', '--elevation', '1600m', 'plain/room.md'], dir)
      .files[0]!;
    expect(figures(room.states)).toEqual(figures(same.states));
    expect(room.states![0]!.pressure).toMatch(/^repo\/dewmark\.json: elevation 1600 m \(standard atmosphere\)/);
    expect(dewmark(['check', 'repo']).code).toBe(1);
  });

  it('the nearest file wins: a sub-folder file replaces the keys it sets, and no others are inherited', () => {
    const sub = json(['eval', '--format', 'json', 'repo/calcs/sub/room.md']).files[0]!;
    expect(sub.units).toBe('SI');
    const plain = json(['eval', '--format', 'json', 'plain/room.md']).files[0]!;
    expect(sub.states).toEqual(plain.states); // not the parent file's elevation (the default basis, same description)
    expect(sub.diagnostics.map((d) => `${d.code}:${d.severity}`)).toEqual(['claim-mismatch:warning']);
  });

  it('options given on the command line win over the project file', () => {
    const r = json(['eval', '--format', 'json', '--units', 'SI', 'repo/calcs/room.md']).files[0]!;
    expect(r.units).toBe('SI');
    const onlyElevation = json(['eval', '--format', 'json', '--units', 'SI', '--elevation', '1600m', 'plain/room.md'])
      .files[0]!;
    expect(figures(r.states)).toEqual(figures(onlyElevation.states));
  });

  it('include keeps only the notes it matches; all left out is explained', () => {
    const r = json(['check', '--format', 'json', 'included']);
    expect(r.files.map((f) => f.path)).toEqual(['included/calcs/a.md']);
    const none = dewmark(['check', 'none']);
    expect(none.code).toBe(2);
    // One file found: the message names it, the project file and the pattern.
    expect(none.err).toContain(
      '\'none/room.md\' is left out by none/dewmark.json: its exclude pattern "**/*.md" matches it',
    );
    write('none/second.md', ROOM);
    const two = dewmark(['check', 'none']);
    expect(two.code).toBe(2);
    expect(two.err).toContain(
      'all 2 Markdown file(s) found are left out by the include/exclude patterns of dewmark.json',
    );
  });

  it('a folder name in exclude leaves out every note below it, as "folder/**" does', () => {
    write('bare/dewmark.json', JSON.stringify({ exclude: ['archive'] }));
    write('bare/archive/2019/old.md', OLD);
    write('bare/calcs/archive.md', ROOM); // a bare name matches a whole name at any depth: archive.md is not archive
    write('bare/calcs/room.md', ROOM);
    const r = json(['check', '--format', 'json', 'bare']);
    expect(r.files.map((f) => f.path)).toEqual(['bare/calcs/archive.md', 'bare/calcs/room.md']);
  });

  it('a broken file or an unknown key is an exit-2 message naming the file and the fix', () => {
    const broken = dewmark(['check', 'broken']);
    expect(broken.code).toBe(2);
    expect(broken.err).toMatch(/broken\/dewmark\.json: it is not valid JSON/);
    const unknown = dewmark(['check', 'unknown']);
    expect(unknown.code).toBe(2);
    expect(unknown.err).toContain('"unit" is not a key of dewmark.json; the keys are units, pressure, elevation');
    expect(unknown.err).toContain('rules.claim-mismatch must be one of error, warning, info, off, not "fatal"');
  });

  it('fix reads it too: a rule turned off leaves its claims alone', () => {
    write('quiet/dewmark.json', JSON.stringify({ rules: { 'claim-mismatch': 'off' } }));
    write('quiet/room.md', ROOM);
    const r = dewmark(['fix', 'quiet']);
    expect(r.code).toBe(0);
    expect(r.err).toContain('nothing to fix');
  });
});
