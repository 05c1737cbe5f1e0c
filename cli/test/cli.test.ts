/**
 * The `dewmark` command as a real process: built once with the project's build script, then run as
 * `node bin/dewmark.js …` with files in a temporary folder. Exit codes: 0 clean, 1 errors in notes,
 * 2 usage or I/O problems.
 */
import { beforeAll, afterAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { closeSync, mkdirSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..', '..');
const bin = join(root, 'bin', 'dewmark.js');
let dir = '';

interface Run {
  code: number | null;
  out: string;
  err: string;
}

function dewmark(
  args: string[],
  opts: { cwd?: string; input?: string | Buffer; env?: Record<string, string> } = {},
): Run {
  const r = spawnSync(process.execPath, [bin, ...args], {
    cwd: opts.cwd ?? dir,
    input: opts.input,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', ...opts.env },
    timeout: 60_000,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

const GOOD = [
  '# Good note',
  '',
  '```air',
  'site: elev=1600m',
  'state RA: db=24C rh=50%',
  'state OA: db=32C wb=16.5C',
  'mix MA: OA 25% + RA 75%',
  'state OFF: db=12C rh=92%',
  'process CC: MA -> OFF m=4.6kg/s',
  '```',
  '',
].join('\n');
const BAD = ['# Bad note', '', '```air', 'state A: db=20C wb=25C', 'state B: db=24C w=9.3g/kg rh=80%', '```', ''].join(
  '\n',
);
const WARN = ['# Warning only', '', '```air', 'state B: db=24C w=9.3g/kg rh=80%', '```', ''].join('\n');

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-cli-'));
  writeFileSync(join(dir, 'good.md'), GOOD);
  writeFileSync(join(dir, 'bad.md'), BAD);
  writeFileSync(join(dir, 'warn.markdown'), WARN);
  mkdirSync(join(dir, 'notes', 'deep'), { recursive: true });
  writeFileSync(join(dir, 'notes', 'a.md'), GOOD);
  writeFileSync(join(dir, 'notes', 'deep', 'b.md'), GOOD);
  writeFileSync(join(dir, 'notes', 'deep', 'skip.txt'), 'not markdown');
  mkdirSync(join(dir, 'notes', 'build'));
  writeFileSync(join(dir, 'notes', 'build', 'generated.md'), BAD);
  writeFileSync(join(dir, 'notes', '.gitignore'), 'build/\n');
  writeFileSync(join(dir, 'binary.md'), Buffer.from([0x23, 0x20, 0x00, 0x01, 0x02, 0xff]));
  writeFileSync(join(dir, 'latin1.md'), Buffer.from('# Caf\xe9 note\n', 'latin1'));
}, 120_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('dewmark check', () => {
  it('exit 0 and a summary for a clean note', () => {
    const r = dewmark(['check', 'good.md']);
    expect(r.code).toBe(0);
    expect(r.out.trim()).toBe('1 file, 0 errors, 0 warnings');
  });

  it('exit 1 with path:line:col: severity[code]: message lines', () => {
    const r = dewmark(['check', 'bad.md']);
    expect(r.code).toBe(1);
    const lines = r.out.trim().split('\n');
    expect(lines[0]).toMatch(/^bad\.md:4:10: error\[wb-above-db\]: .+/);
    expect(lines[1]).toMatch(/^bad\.md:5:30: warning\[claim-mismatch\]: .+computed rh=/);
    expect(lines.at(-1)).toBe('1 file, 1 error, 1 warning');
  });

  it('--format json gives the diagnostics with 1-based ranges and a summary', () => {
    const r = dewmark(['check', '--format', 'json', 'bad.md']);
    expect(r.code).toBe(1);
    const doc = JSON.parse(r.out);
    expect(doc.summary).toEqual({ files: 1, errors: 1, warnings: 1, infos: 0, suppressed: 0, unreadable: 0 });
    expect(doc.files[0].path).toBe('bad.md');
    expect(doc.files[0].diagnostics[0]).toMatchObject({
      line: 4,
      column: 10,
      endLine: 4,
      endColumn: 23,
      severity: 'error',
      code: 'wb-above-db',
    });
  });

  it('columns are right with a byte-order mark and CRLF line ends', () => {
    writeFileSync(join(dir, 'crlf.md'), `\ufeff${BAD.replace(/\n/g, '\r\n')}`);
    const r = dewmark(['check', 'crlf.md']);
    expect(r.out).toMatch(/^crlf\.md:4:10: error\[wb-above-db\]/m);
  });

  it('reads standard input with -', () => {
    const r = dewmark(['check', '-'], { input: BAD });
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/^<stdin>:4:10: error\[wb-above-db\]/m);
  });

  it('folders are walked recursively for .md and .markdown, honouring .gitignore', () => {
    const r = dewmark(['check', 'notes']);
    expect(r.code).toBe(0);
    expect(r.out.trim()).toBe('2 files, 0 errors, 0 warnings');
    const all = dewmark(['check', '--no-gitignore', 'notes']);
    expect(all.code).toBe(1);
    expect(all.out).toContain('generated.md');
  });

  it('globs keep the Markdown files that match, honouring .gitignore like folder walks', () => {
    // Globs used to read what .gitignore leaves out (notes/build/generated.md) while folder walks did not.
    const r = dewmark(['check', '--format', 'json', 'notes/**/*.md']);
    const doc = JSON.parse(r.out);
    expect(doc.files.map((f: { path: string }) => f.path).sort()).toEqual(['notes/a.md', 'notes/deep/b.md']);
    const all = dewmark(['check', '--format', 'json', '--no-gitignore', 'notes/**/*.md']);
    expect(
      JSON.parse(all.out)
        .files.map((f: { path: string }) => f.path)
        .sort(),
    ).toEqual(['notes/a.md', 'notes/build/generated.md', 'notes/deep/b.md']);
    // Only Markdown files: notes/deep/skip.txt matches notes/**/* but is not read.
    const star = dewmark(['check', '--format', 'json', 'notes/**/*']);
    expect(
      JSON.parse(star.out)
        .files.map((f: { path: string }) => f.path)
        .sort(),
    ).toEqual(['notes/a.md', 'notes/deep/b.md']);
  });

  it('--exclude leaves matching files and folders out of folders and globs (repeatable)', () => {
    const r = dewmark(['check', '--format', 'json', '--exclude', 'deep', '--exclude', 'bad.md', '.']);
    const paths = JSON.parse(r.out).files.map((f: { path: string }) => f.path);
    expect(paths).toContain('notes/a.md');
    expect(paths).not.toContain('notes/deep/b.md');
    expect(paths).not.toContain('bad.md');
    expect(paths).toContain('good.md');
  });

  it('a folder where nothing is left says what was left out', () => {
    const r = dewmark(['check', '--exclude', '*.md', 'notes']);
    expect(r.code).toBe(2);
    expect(r.err).toContain(
      "dewmark: no Markdown files (.md, .markdown) found in 'notes'; in " +
        "'notes': folders and Markdown files: 1 left out by .gitignore or " +
        '.git/info/exclude (--no-gitignore reads it), 2 left out by --exclude',
    );
  });

  it('a glob that matches only other files says so', () => {
    const r = dewmark(['check', 'notes/**/*.txt']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("the pattern 'notes/**/*.txt' matches 1 file, none of them Markdown (.md, .markdown)");
  });

  it('a missing file is exit 2 with a clear message', () => {
    const r = dewmark(['check', 'nowhere.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("cannot read 'nowhere.md': no such file or folder");
  });

  it('a glob that matches nothing is exit 2', () => {
    const r = dewmark(['check', 'nothing/*.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("no files match the pattern 'nothing/*.md'");
  });

  it('a binary file is exit 2', () => {
    const r = dewmark(['check', 'binary.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("'binary.md' is a binary file");
  });

  it('a file that is not UTF-8 is exit 2, and the other files are still checked', () => {
    const r = dewmark(['check', 'latin1.md', 'good.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("'latin1.md' is not valid UTF-8 text (first bad byte at offset 5)");
    expect(r.out).toContain('1 file, 0 errors, 0 warnings, 1 could not be read');
  });

  it('--no-claims drops claim warnings; --max-warnings turns warnings into a failure', () => {
    expect(dewmark(['check', 'warn.markdown']).code).toBe(0);
    expect(dewmark(['check', '--max-warnings', '0', 'warn.markdown']).code).toBe(1);
    const r = dewmark(['check', '--no-claims', 'warn.markdown']);
    expect(r.out.trim()).toBe('1 file, 0 errors, 0 warnings');
  });

  it('many files (checked in worker threads) keep their order and totals', () => {
    const many = join(dir, 'many');
    mkdirSync(many);
    for (let i = 0; i < 200; i++)
      writeFileSync(join(many, `n${String(i).padStart(3, '0')}.md`), i % 10 === 3 ? BAD : GOOD);
    // Two workers whatever the machine's load (by default a busy machine gets none).
    const r = dewmark(['check', '--format', 'json', 'many'], { env: { DEWMARK_WORKERS: '2' } });
    expect(r.code).toBe(1);
    const doc = JSON.parse(r.out);
    expect(doc.files.map((f: { path: string }) => f.path)).toEqual(
      Array.from({ length: 200 }, (_, i) => `many/n${String(i).padStart(3, '0')}.md`),
    );
    expect(doc.summary).toEqual({ files: 200, errors: 20, warnings: 20, infos: 0, suppressed: 0, unreadable: 0 });
    const serial = spawnSync(process.execPath, [bin, 'check', '--format', 'json', 'many'], {
      cwd: dir,
      encoding: 'utf8',
      env: { ...process.env, DEWMARK_WORKERS: '0' },
    });
    expect(JSON.parse(serial.stdout)).toEqual(doc);
  });

  it('reports a stale results table as a warning with its code, and its position on the start marker', () => {
    const fixture = join(root, 'test', 'fixtures', 'diagnostics', 'stale-results-table.md');
    const r = dewmark(['check', fixture]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(
      new RegExp(
        /stale-results-table\.md:12:1: warning\[stale-results-table\]: /.source +
          /the results table below the air block at line 6 is out of date: .*Insert or Refresh Results Table/.source,
      ),
    );
    expect(r.out).toContain('1 file, 0 errors, 1 warning');
    expect(dewmark(['check', '--max-warnings', '0', fixture]).code).toBe(1);
    expect(dewmark(['check', join(root, 'test', 'fixtures', 'features', 'results-table.md')]).out).toContain(
      '1 file, 0 errors, 0 warnings',
    );
  });

  it('--elevation sets the default pressure (notes without a site line)', () => {
    const note = ['```air', 'state A: db=20C rh=50%', '```', ''].join('\n');
    const r = dewmark(['eval', '--format', 'json', '--elevation', '1000m', '-'], { input: note });
    // ASHRAE HoF 2017 SI Ch.1 Table 1: 89.875 kPa at 1000 m (±1 Pa).
    expect(Math.abs(JSON.parse(r.out).files[0].states[0].p_kPa - 89.875)).toBeLessThanOrEqual(0.001);
  });
});

describe('dewmark eval', () => {
  it('--format json has the documented fields in SI', () => {
    const r = dewmark(['eval', '--format', 'json', 'good.md']);
    expect(r.code).toBe(0);
    const f = JSON.parse(r.out).files[0];
    expect(f.path).toBe('good.md');
    const ra = f.states.find((s: { name: string }) => s.name === 'RA');
    for (const k of ['name', 'line', 'kind', 'p_kPa', 'db_C', 'wb_C', 'dp_C', 'rh_pct', 'w_kgkg', 'h_kJkg', 'v_m3kg'])
      expect(ra).toHaveProperty(k);
    expect(ra).toMatchObject({ name: 'RA', line: 5, kind: 'state', db_C: 24, rh_pct: 50 });
    expect(f.states.find((s: { name: string }) => s.name === 'MA').kind).toBe('mix');
    const cc = f.processes[0];
    for (const k of ['name', 'line', 'm_kgs', 'q_total_kW', 'q_sensible_kW', 'q_latent_kW', 'shr', 'water_kgh'])
      expect(cc).toHaveProperty(k);
    expect(cc).toMatchObject({ name: 'CC', line: 9, m_kgs: 4.6, kind: 'cooling-dehumidifying' });
    expect(cc.q_total_kW).toBeLessThan(0);
    expect(f.diagnostics).toEqual([]);
  });

  it('a table in the note unit system', () => {
    const r = dewmark(['eval', 'good.md']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('States');
    expect(r.out).toMatch(/db °C/);
    expect(r.out).toMatch(/^RA\s+5\s+state/m);
    expect(r.out).toContain('Processes');
    const ip = dewmark(['eval', '--units', 'IP', 'good.md']);
    expect(ip.out).toMatch(/db °F/);
  });

  it('exit 1 when a note has errors, and the diagnostics are listed', () => {
    const r = dewmark(['eval', 'bad.md']);
    expect(r.code).toBe(1);
    expect(r.out).toContain('error[wb-above-db]');
  });

  /** A note of `n` invented states: its JSON (about 500 bytes a state) is many pieces, far more than a pipe holds. */
  const manyStates = (n: number): string =>
    ['# Zones (invented)', '', '```air']
      .concat(Array.from({ length: n }, (_, i) => `state Z${i}: db=${18 + (i % 12)}.${i % 10}C rh=${30 + (i % 50)}%`))
      .concat('```', '')
      .join('\n');

  /** Runs `dewmark args…` with its output on a pipe read by `reader`; its exit code, output and errors. */
  const throughPipe = (
    args: string[],
    reader: (out: NodeJS.ReadableStream, chunk: Buffer) => void,
  ): Promise<{ code: number | null; out: Buffer; err: string }> =>
    new Promise((resolve) => {
      const child = spawn(process.execPath, [bin, ...args], { cwd: dir, stdio: ['ignore', 'pipe', 'pipe'] });
      const out: Buffer[] = [];
      let err = '';
      child.stdout.on('data', (chunk: Buffer) => {
        out.push(chunk);
        reader(child.stdout, chunk);
      });
      child.stderr.on('data', (chunk: Buffer) => {
        err += chunk.toString('utf8');
      });
      child.on('close', (code) => resolve({ code, out: Buffer.concat(out), err }));
    });

  it('--format json writes the same bytes to a file and to a pipe whose reader falls behind', async () => {
    writeFileSync(join(dir, 'many.md'), manyStates(4000));
    const args = ['eval', '--format', 'json', 'many.md'];
    const path = join(dir, 'many.json');
    const fd = openSync(path, 'w');
    const r = spawnSync(process.execPath, [bin, ...args], { cwd: dir, stdio: ['ignore', fd, 'pipe'], timeout: 60_000 });
    closeSync(fd);
    expect(r.status).toBe(0);
    const toFile = readFileSync(path);
    expect(toFile.length).toBeGreaterThan(1_000_000);
    // The text is what JSON.stringify prints for what it holds.
    const doc = JSON.parse(toFile.toString('utf8'));
    expect(doc.files[0].states).toHaveLength(4000);
    expect(toFile.toString('utf8')).toBe(`${JSON.stringify(doc, null, 2)}\n`);
    // A reader that stops after every chunk it reads: the pipe fills, the writes are partial and
    // the rest waits in the stream (bytes the command must not write over).
    const slow = await throughPipe(args, (out) => {
      out.pause();
      setTimeout(() => out.resume(), 2);
    });
    expect(slow.code).toBe(0);
    expect(slow.err).toBe('');
    expect(slow.out.equals(toFile)).toBe(true);
  });

  it('writes its bytes to a pipe as the reader takes them, holding none back in memory', async () => {
    // The command's own output function, in a process of its own whose pipe is read slowly:
    // 200 pieces of 64 KB (far more than a pipe holds). It reports the most bytes the stream ever
    // held back, and how many pieces it was told were kept (then it would take new memory).
    const script = [
      `const { processIO } = await import(${JSON.stringify(join(root, 'cli', 'src', 'run.ts'))});`,
      'const io = processIO();',
      'let held = 0, kept = 0;',
      'for (let i = 0; i < 200; i++) {',
      '  if (io.outBytes(new Uint8Array(65536).fill(48 + (i % 10)))) kept++;',
      '  held = Math.max(held, process.stdout.writableLength);',
      '}',
      'process.stderr.write(JSON.stringify({ held, kept }));',
    ].join('\n');
    const r = await new Promise<{ code: number | null; bytes: number; err: string }>((resolve) => {
      const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
        cwd: root,
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      let bytes = 0;
      let err = '';
      child.stdout.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        child.stdout.pause();
        setTimeout(() => child.stdout.resume(), 1);
      });
      child.stderr.on('data', (chunk: Buffer) => {
        err += chunk.toString('utf8');
      });
      child.on('close', (code) => resolve({ code, bytes, err }));
    });
    expect(r.code).toBe(0);
    expect(r.bytes).toBe(200 * 65536);
    expect(JSON.parse(r.err)).toEqual({ held: 0, kept: 0 });
  });

  it('--format json to a reader that stops reading (| head) ends quietly', async () => {
    writeFileSync(join(dir, 'many.md'), manyStates(4000));
    const r = await throughPipe(['eval', '--format', 'json', 'many.md'], (out) => {
      (out as NodeJS.ReadableStream & { destroy(): void }).destroy();
    });
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out.toString('utf8').startsWith('{\n  "files": [\n')).toBe(true);
  });

  it("check's text to a reader that stops reading (| head) ends quietly", async () => {
    const lines = Array.from({ length: 5000 }, (_, i) => `state B${i}: db=24C w=9.3g/kg rh=80%`);
    writeFileSync(join(dir, 'stale.md'), ['# Stale claims (invented)', '', '```air', ...lines, '```', ''].join('\n'));
    const r = await throughPipe(['check', 'stale.md'], (out) => {
      (out as NodeJS.ReadableStream & { destroy(): void }).destroy();
    });
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out.toString('utf8').startsWith('stale.md:4:')).toBe(true);
  });

  it('check and eval --format json on a clean note make no output stream (Node loads stream modules for one)', () => {
    // A preload that says, straight to the descriptor, when process.stdout or process.stderr is
    // first read (Node makes the stream then).
    const preload = join(dir, 'stream-reads.cjs');
    writeFileSync(
      preload,
      `for (const name of ['stdout', 'stderr']) {
  const d = Object.getOwnPropertyDescriptor(process, name);
  Object.defineProperty(process, name, { configurable: true, enumerable: d.enumerable, get() {
    require('node:fs').writeSync(2, 'made process.' + name + '\\n');
    Object.defineProperty(process, name, d);
    return d.get.call(process);
  } });
}\n`,
    );
    const run = (args: string[]) =>
      spawnSync(process.execPath, ['-r', preload, bin, ...args], { cwd: dir, encoding: 'utf8', timeout: 60_000 });
    const json = run(['eval', '--format', 'json', 'good.md']);
    expect(json.status).toBe(0);
    expect(JSON.parse(json.stdout).files[0].states.length).toBeGreaterThan(0);
    expect(json.stderr).toBe('');
    const text = run(['check', 'good.md']);
    expect(text.status).toBe(0);
    expect(text.stdout).toBe('1 file, 0 errors, 0 warnings\n');
    // Text goes to the descriptor (not on Windows, where a console needs the stream).
    expect(text.stderr).toBe(process.platform === 'win32' ? 'made process.stdout\n' : '');
    // A message on stderr goes through its stream: then it is made (the preload does see it).
    const usage = run(['check', '--format', 'nope', 'good.md']);
    expect(usage.status).toBe(2);
    expect(usage.stderr).toMatch(/^made process\.stderr\ndewmark: --format must be/);
  });

  it('is an ASCII bundle, which Node reads as one-byte text (scripts/ascii-bundle.mjs)', () => {
    const bundle = readFileSync(join(root, 'dist', 'cli.js'), 'latin1');
    const at = bundle.search(/[\u0080-\u00FF]/);
    expect(at < 0 ? '' : bundle.slice(Math.max(0, at - 80), at + 20)).toBe('');
  });

  it('builds the HTML entity table only for a note with an entity to decode (the decoder loads then)', () => {
    // V8's precise coverage counts the calls of the function that builds the table, by name.
    const preload = join(dir, 'count-calls.cjs');
    writeFileSync(
      preload,
      `const inspector = require('node:inspector');
const session = new inspector.Session();
session.connect();
session.post('Profiler.enable');
session.post('Profiler.startPreciseCoverage', { callCount: true, detailed: false });
process.on('exit', () => {
  session.post('Profiler.takePreciseCoverage', (err, res) => {
    let calls = 0;
    for (const s of res.result)
      if (s.url.endsWith('cli.js'))
        for (const f of s.functions) if (f.functionName === 'decodeTrieDict') calls += f.ranges[0].count;
    require('node:fs').writeSync(2, 'table built ' + calls + '\\n');
  });
});\n`,
    );
    const run = (file: string) =>
      spawnSync(process.execPath, ['-r', preload, bin, 'eval', '--format', 'json', file], {
        cwd: dir,
        encoding: 'utf8',
        timeout: 60_000,
      });
    const plain = run('good.md');
    expect(plain.status).toBe(0);
    expect(plain.stderr).toBe('table built 0\n');
    // `&lt;` in a fence's info string is decoded (the info string is not the block's language).
    writeFileSync(join(dir, 'entity.md'), '# E\n\n```air &lt;tag&gt;\nstate A: db=20C rh=50%\n```\n');
    const entity = run('entity.md');
    expect(entity.status).toBe(0);
    expect(entity.stderr).toBe('table built 1\n');
    expect(JSON.parse(entity.stdout).files[0].states).toHaveLength(1);
  });
});

describe('usage', () => {
  it('--version and --help', () => {
    const v = dewmark(['--version']);
    expect(v.code).toBe(0);
    expect(v.out.trim()).toMatch(/^\d+\.\d+\.\d+/);
    const h = dewmark(['--help']);
    expect(h.code).toBe(0);
    expect(h.out).toContain('check');
    expect(h.out).toContain('eval');
  });

  it('an unknown option is exit 2 with a hint', () => {
    const r = dewmark(['check', '--colour', 'good.md']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("unknown option '--colour'");
  });

  it('an unknown command is exit 2', () => {
    const r = dewmark(['chekc']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/unknown command 'chekc'/);
  });

  it('bad option values are exit 2', () => {
    expect(dewmark(['check', '--units', 'metric', 'good.md']).err).toContain('--units must be SI or IP');
    expect(dewmark(['check', '--pressure', '84', 'good.md']).code).toBe(2);
    expect(dewmark(['check', '--elevation', '1600kPa', 'good.md']).err).toContain('not a length unit');
    expect(dewmark(['check', '--format', 'xml', 'good.md']).code).toBe(2);
  });
});

describe('dewmark chart', () => {
  const SEASONS = [
    '# Heron Quay library',
    '',
    '## Summer',
    '',
    '```air',
    'state OA: db=31C wb=22C',
    'state RA: db=24C rh=50%',
    '```',
    '',
    '```air',
    'mix MA: OA 25% + RA 75%',
    '```',
    '',
    '## Winter',
    '',
    '```air',
    'state OA_W: db=-5C rh=80%',
    '```',
    '',
  ].join('\n');
  const charts = (svg: string) => [...svg.matchAll(/<title id="([^"]*)">([^<]*)</g)].map((m) => [m[1], m[2]]);

  it('one chart per heading section by default, stacked in one SVG document', () => {
    writeFileSync(join(dir, 'seasons.md'), SEASONS);
    const r = dewmark(['chart', 'seasons.md', '-o', 'seasons.svg']);
    expect(r.code, r.err).toBe(0);
    expect(r.err).toContain('wrote seasons.svg (seasons.md: 0 errors; 2 charts)');
    const svg = readFileSync(join(dir, 'seasons.svg'), 'utf8');
    expect(svg).toMatch(
      /^<\?xml[^>]*>\n<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg" width="960" height="\d+"[^>]*data-charts="2">/,
    );
    expect(charts(svg)).toEqual([
      ['dmc-1-title', 'Psychrometric chart — seasons.md — Summer'],
      ['dmc-2-title', 'Psychrometric chart — seasons.md — Winter'],
    ]);
  });

  it('--per block: one chart per fence; --per all: the whole note on one chart', () => {
    expect(dewmark(['chart', 'seasons.md', '--per', 'block', '-o', 'blocks.svg']).err).toContain('0 errors; 3 charts)');
    expect(charts(readFileSync(join(dir, 'blocks.svg'), 'utf8')).map((c) => c[1])).toEqual([
      'Psychrometric chart — seasons.md — Summer — block at line 5',
      'Psychrometric chart — seasons.md — Summer — block at line 10',
      'Psychrometric chart — seasons.md — Winter — block at line 16',
    ]);
    expect(dewmark(['chart', 'seasons.md', '--per', 'all', '-o', 'all.svg']).err).toContain('0 errors; 1 chart)');
    expect(charts(readFileSync(join(dir, 'all.svg'), 'utf8'))).toEqual([
      ['dmc-title', 'Psychrometric chart — seasons.md'],
    ]);
  });

  it('an unknown grouping is exit 2 naming the choices', () => {
    const r = dewmark(['chart', 'seasons.md', '--per', 'season', '-o', 'x.svg']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('Allowed choices are section, block, all');
  });
});
