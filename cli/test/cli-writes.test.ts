/**
 * What the `dewmark` command writes: `check` and `eval` write nothing; `report` and `chart` write
 * exactly the `-o` path they are given and nothing else, and refuse — writing nothing — a missing
 * `-o`, the note itself (by name, through a hard link or a symbolic link), any Markdown name, and a
 * link that leads to a Markdown file (existing or not). Each run is watched twice: by the
 * `io-audit.cjs` preload (every write, connection or started program is recorded) and by a
 * before/after snapshot of the folder.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { linkSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { AUDIT_PRELOAD, auditRecords, snapshot, type AuditRecord } from '../../test/security/audit';

const root = join(__dirname, '..', '..');
const bin = join(root, 'bin', 'dewmark.js');
let dir = '';

const NOTE = [
  '# Level 2 meeting room',
  '',
  '```air',
  'state OA: db=32C wb=23C',
  'state RA: db=24C rh=50%',
  'mix MA: OA 30% + RA 70%',
  '```',
  '',
].join('\n');
const BAD = ['```air', 'state X: db=20C wb=25C', '```', ''].join('\n');

interface Run {
  code: number | null;
  out: string;
  err: string;
  writes: AuditRecord[];
}

/** Runs `dewmark …` under the audit preload; `writes` are the recorded attempts. */
function dewmark(args: string[], input?: string): Run {
  const r = spawnSync(process.execPath, ['--require', AUDIT_PRELOAD, bin, ...args], {
    cwd: dir,
    input,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
    timeout: 60_000,
  });
  expect(r.stderr, 'the preload ran').toContain('[io-audit-ready]');
  const err = r.stderr
    .split('\n')
    .filter((l) => !l.startsWith('[io-audit'))
    .join('\n');
  return { code: r.status, out: r.stdout, err, writes: auditRecords(r.stderr) };
}

/** Runs a command and returns it with the folder's changes (added, changed or removed entries). */
function changes(args: string[], input?: string): { run: Run; changed: string[] } {
  const before = snapshot(dir);
  const run = dewmark(args, input);
  const after = snapshot(dir);
  const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
  const changed = [...keys].filter((k) => before[k] !== after[k]).map((k) => k.slice(dir.length + 1));
  return { run, changed: changed.sort() };
}

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-writes-'));
  writeFileSync(join(dir, 'note.md'), NOTE);
  writeFileSync(join(dir, 'other.md'), '# Another note\n');
  writeFileSync(join(dir, 'bad.md'), BAD);
  mkdirSync(join(dir, 'out'));
  linkSync(join(dir, 'note.md'), join(dir, 'hardlink.html'));
  symlinkSync('note.md', join(dir, 'to-note.svg'));
  symlinkSync('other.md', join(dir, 'to-other.html'));
  symlinkSync('not-there.md', join(dir, 'to-nothing.svg'));
  symlinkSync('out', join(dir, 'outlink'));
  // Chains of 12 links (more than a hand-written walk of 8 followed): to a note that does not
  // exist yet (a write would create it), to an existing note, and a loop.
  for (let i = 0; i < 12; i++)
    symlinkSync(i === 11 ? 'created-by-chain.md' : `chain${i + 1}.svg`, join(dir, `chain${i}.svg`));
  for (let i = 0; i < 12; i++)
    symlinkSync(i === 11 ? 'other.md' : `old-chain${i + 1}.html`, join(dir, `old-chain${i}.html`));
  symlinkSync('loop-b.svg', join(dir, 'loop-a.svg'));
  symlinkSync('loop-a.svg', join(dir, 'loop-b.svg'));
}, 120_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('check and eval write nothing', () => {
  it.each([
    [['check', 'note.md', 'bad.md']],
    [['check', '--format', 'json', '.']],
    [['eval', 'note.md']],
    [['eval', '--format', 'json', 'note.md', 'other.md']],
  ])('dewmark %j', (args) => {
    const { run, changed } = changes(args);
    expect(run.code === 0 || run.code === 1, run.err).toBe(true);
    expect(run.writes).toEqual([]);
    expect(changed).toEqual([]);
  });

  it('check of many files (worker threads) writes nothing either', () => {
    for (let i = 0; i < 12; i++) writeFileSync(join(dir, 'out', `n${i}.md`), NOTE);
    const { run, changed } = changes(['check', 'out']);
    expect(run.code, run.err).toBe(0);
    expect(run.writes).toEqual([]);
    expect(changed).toEqual([]);
  });
});

describe('report and chart write exactly the -o path', () => {
  it.each([
    ['report', 'review.html'],
    ['chart', 'chart.svg'],
    ['report', 'out/deeper-review.html'],
    ['chart', 'outlink/through-a-folder-link.svg'],
  ])('dewmark %s note.md -o %s', (command, output) => {
    const { run, changed } = changes([command, 'note.md', '-o', output]);
    expect(run.code, run.err).toBe(0);
    expect(run.writes.map((w) => `${w.call} ${w.target}`)).toEqual([`writeFileSync ${join(dir, output)}`]);
    expect(changed).toEqual([output.replace(/^outlink\//, 'out/')]);
    expect(readFileSync(join(dir, output), 'utf8')).toMatch(command === 'report' ? /^<!doctype html>/i : /^<\?xml/);
  });

  it('an existing (non-Markdown) output is overwritten: it is the path given', () => {
    writeFileSync(join(dir, 'old.svg'), 'old');
    const { run, changed } = changes(['chart', 'note.md', '-o', 'old.svg']);
    expect(run.code).toBe(0);
    expect(changed).toEqual(['old.svg']);
  });

  it('standard input in, the -o file out', () => {
    const { run, changed } = changes(['report', '-', '-o', 'from-stdin.html'], NOTE);
    expect(run.code, run.err).toBe(0);
    expect(changed).toEqual(['from-stdin.html']);
  });

  it('a note with errors still gets its report (exit 1), and only that file is written', () => {
    const { run, changed } = changes(['report', 'bad.md', '-o', 'bad-review.html']);
    expect(run.code).toBe(1);
    expect(changed).toEqual(['bad-review.html']);
  });
});

describe('refusals write nothing (exit 2, with the reason)', () => {
  it.each([
    [['report', 'note.md'], /say where to write the report with -o/],
    [['report', 'note.md', '-o', 'note.md'], /over the note 'note.md' itself/],
    [['chart', 'note.md', '-o', './note.md'], /over the note 'note.md' itself/],
    [['report', 'note.md', '-o', 'hardlink.html'], /over the note 'note.md' itself/],
    [['chart', 'note.md', '-o', 'to-note.svg'], /over the note 'note.md' itself/],
    [['report', 'note.md', '-o', 'other.md'], /Markdown file name/],
    [['report', 'note.md', '-o', 'NEW.MARKDOWN'], /Markdown file name/],
    [['report', 'note.md', '-o', 'to-other.html'], /a link to .*other\.md.*Markdown/],
    [['chart', 'note.md', '-o', 'to-nothing.svg'], /a link to .*not-there\.md.*Markdown/],
    [['report', '-', '-o', 'piped.md'], /Markdown file name/],
    // Every Markdown-family ending, in any case (a new file or an existing note).
    ...['notes.mdwn', 'notes.mkdown', 'page.mdx', 'analysis.qmd', 'analysis.Rmd', 'x.MDTXT', 'book.livemd'].map(
      (o) => [['chart', 'note.md', '-o', o], /Markdown file name/] as [string[], RegExp],
    ),
    [['chart', 'note.md', '-o', 'chain0.svg'], /a link to .*created-by-chain\.md.*Markdown/],
    [['report', 'note.md', '-o', 'old-chain0.html'], /a link to .*other\.md.*Markdown/],
    [['chart', 'note.md', '-o', 'loop-a.svg'], /more than 40 symbolic links \(or a loop of them\)/],
    [['chart', 'note.md', '-o', 'out'], /it is a folder/],
    [['chart', 'note.md', '-o', 'missing-folder/chart.svg'], /its folder does not exist/],
    [['report', 'note.md', 'other.md', '-o', 'two.html'], /too many arguments/],
  ])('dewmark %j', (args, reason) => {
    const { run, changed } = changes(args, NOTE);
    expect(run.code, run.err).toBe(2);
    expect(run.err).toMatch(reason);
    expect(changed).toEqual([]);
    // The only write attempts are the refused path itself failing (a folder, a missing folder).
    for (const w of run.writes) expect(w.target).toMatch(/(out|missing-folder\/chart\.svg)$/);
  });
});
