/**
 * What one input may cost the command line: a binary device (`/dev/zero`) is recognised from its
 * first bytes and never read on; a note larger than `--max-note-size` (8 MB by default) is
 * refused with exit 2 before its contents are read (a regular file, by its size) or as soon as the
 * limit is passed (standard input, counted as the bytes the process took from its pipe); the
 * flag raises the limit. Exit 2 with a message that says what to do, never a crash.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..', '..');
const bin = join(root, 'bin', 'dewmark.js');
let dir = '';

function dewmark(args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [bin, ...args], {
    cwd: dir,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
    timeout: 60_000,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** An invented note padded with prose to `bytes` bytes. */
function paddedNote(bytes: number): string {
  const head = '# Level 4 lab exhaust (invented)\n\n```air\nstate EA: db=26C rh=45%\n```\n\n';
  const line = 'The exhaust runs all day; the fan is checked each spring.\n';
  return head + line.repeat(Math.ceil((bytes - head.length) / line.length));
}

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-limits-'));
  writeFileSync(join(dir, 'twelve.md'), paddedNote(12 * 1024 * 1024));
  writeFileSync(join(dir, 'two.md'), paddedNote(2 * 1024 * 1024));
}, 120_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('inputs that could exhaust memory', () => {
  it.runIf(existsSync('/dev/zero'))('dewmark check /dev/zero: binary, from its first bytes (exit 2)', () => {
    const r = dewmark(['check', '/dev/zero']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("'/dev/zero' is a binary file, not a Markdown note");
  });

  it('a 12 MB note is over the default 8 MB: exit 2, saying how to raise the limit', () => {
    const r = dewmark(['check', 'twelve.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("'twelve.md' is 12 MB, more than the 8 MB one note may be");
    expect(r.err).toContain('--max-note-size <MB>, e.g. --max-note-size 16');
  });

  it('--max-note-size lowers and raises the limit, for every command', () => {
    expect(dewmark(['check', '--max-note-size', '1', 'two.md']).err).toContain(
      "'two.md' is 2 MB, more than the 1 MB one note may be",
    );
    expect(dewmark(['eval', '--max-note-size', '1', 'two.md']).code).toBe(2);
    expect(dewmark(['chart', '--max-note-size', '1', 'two.md', '-o', 'two.svg']).code).toBe(2);
    const ok = dewmark(['check', '--max-note-size', '3', 'two.md']);
    expect(ok.err).toBe('');
    expect(ok.code).toBe(0);
  });

  it.each([['0'], ['-1'], ['lots'], ['']])('--max-note-size %j is a usage error', (v) => {
    const r = dewmark(['check', '--max-note-size', v, 'two.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--max-note-size must be a size in MB greater than 0');
  });

  it('standard input without end: stops taking bytes just past the limit (exit 2)', async () => {
    const child = spawn(process.execPath, [bin, 'check', '--max-note-size', '1', '-'], {
      cwd: dir,
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    const chunk = Buffer.from('Prose without end, no statement in it. '.repeat(1700));
    let written = 0;
    let open = true;
    child.stdin.on('error', () => (open = false));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    let code: number | null | undefined;
    void exited.then((c) => {
      code = c;
      open = false;
    });
    // Write until the process stops reading (or 64 MB, far more than it may take).
    while (open && written < 64 * 1024 * 1024) {
      const ok = child.stdin.write(chunk);
      written += chunk.length;
      if (!ok)
        await new Promise<void>((resolve) => {
          const done = () => resolve();
          child.stdin.once('drain', done);
          void exited.then(done);
        });
    }
    child.stdin.destroy();
    await exited;
    expect(code).toBe(2);
    expect(err).toContain("'<stdin>' goes on past 1 MB, more than the 1 MB one note may be");
    // What it took is the limit and the pipe's buffers, not everything offered.
    expect(written).toBeLessThan(8 * 1024 * 1024);
  });
});
