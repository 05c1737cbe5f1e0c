/**
 * `dewmark report --since REV` on a scratch git repository made in a temporary folder: the report
 * gets a "Changes since REV" section holding exactly what `dewmark diff REV` computes for the note
 * (each changed figure old → new with the claims on it, statements added and removed), says so
 * when nothing changed or the note is new, and a bad revision, a folder outside git or standard
 * input is a clear exit 2. The notes are of an invented building; both sides of every comparison
 * are the engine's own figures, so no published value is needed.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from './lib/runCli';

let repo = '';
let outside = '';

const note = (oaDb: string, extra = '') =>
  [
    '# Wrenfield Hall — AHU-3 summer check',
    '',
    '```air',
    `state OA: db=${oaDb} wb=21C          # outdoor design`,
    'state RA: db=24C rh=50%',
    'mix MA: OA 30% + RA 70% db=26.4C',
    'state OFF: db=12C rh=92%',
    'process CC: MA -> OFF m=3.2kg/s q_total=-60kW',
    extra,
    '```',
    '',
  ].join('\n');

function git(args: string[], cwd = repo): string {
  return execFileSync(
    'git',
    ['-c', 'user.name=Dewmark Test', '-c', 'user.email=test@example.invalid', '-c', 'commit.gpgsign=false', ...args],
    { cwd, encoding: 'utf8' },
  );
}

/** Runs the command line in `repo` by default; standard input holds the note as first written. */
const dewmark = (args: string[], cwd = repo) => runCli(args, cwd, new TextEncoder().encode(note('32C')));

/** The rows of the report's changes table as cell texts (tags removed). */
function changeRows(html: string): string[][] {
  const table = /<table id="changes"[\s\S]*?<\/table>/.exec(html)?.[0] ?? '';
  const body = /<tbody>([\s\S]*)<\/tbody>/.exec(table)?.[1] ?? '';
  return body
    .split('</tr>')
    .filter((r) => r.includes('<td'))
    .map((r) =>
      [...r.matchAll(/<td[^>]*>([\s\S]*?)<\/td>/g)].map((m) =>
        m[1]!
          .replace(/<br>/g, '\n')
          .replace(/<[^>]+>/g, '')
          .replace(/&gt;/g, '>')
          .replace(/&amp;/g, '&')
          .trim(),
      ),
    );
}

beforeAll(() => {
  repo = mkdtempSync(join(tmpdir(), 'dewmark-since-'));
  outside = mkdtempSync(join(tmpdir(), 'dewmark-since-outside-'));
  git(['init', '-q', '-b', 'main']);
  writeFileSync(join(repo, 'ahu-3.md'), note('32C'));
  git(['add', '.']);
  git(['commit', '-q', '-m', 'AHU-3 summer check']);
});
afterAll(() => {
  for (const d of [repo, outside]) if (d) rmSync(d, { recursive: true, force: true });
});

describe('dewmark report --since REV', () => {
  it('holds what dewmark diff computes: each changed figure, old → new, its claims; added statements', async () => {
    writeFileSync(join(repo, 'ahu-3.md'), note('34C', 'state ROOM2: db=22C rh=45%'));
    const diff = await dewmark(['diff', 'HEAD', '--format', 'json', '--', 'ahu-3.md']);
    expect(diff.code).toBe(0);
    const d = JSON.parse(diff.out) as {
      commit: string;
      files: {
        items: {
          name: string;
          status: string;
          figures: { key: string; old: string; new: string; claims: { written: string }[] }[];
        }[];
      }[];
    };
    const r = await dewmark(['report', 'ahu-3.md', '--since', 'HEAD', '-o', 'review.html']);
    expect(r.code, r.err).toBe(0);
    const html = readFileSync(join(repo, 'review.html'), 'utf8');
    expect(html).toContain('<h2 class="part" id="h-changes">Changes since HEAD</h2>');
    expect(html).toContain(`(commit <code>${d.commit.slice(0, 12)}</code>)`);
    const rows = changeRows(html);
    // One row per figure diff lists, in its order, with its old and new text and its claims.
    const expected = d.files[0]!.items.flatMap((it) =>
      it.status === 'changed'
        ? it.figures.map((f) => ({ name: it.name, key: f.key, old: f.old, new: f.new, claims: f.claims }))
        : [{ name: it.name, key: it.status, old: '', new: '', claims: [] }],
    );
    expect(expected.length).toBeGreaterThanOrEqual(5); // OA's db, wb-derived figures, MA, CC, and ROOM2 added
    expect(rows.length).toBe(expected.length);
    expected.forEach((e, i) => {
      const row = rows[i]!;
      expect(row[0]).toMatch(new RegExp(`^(state|mix|process|supply) ${e.name} line \\d+$`));
      if (e.key === 'added') {
        expect(row[1]).toBe('added since HEAD');
        return;
      }
      expect(row.slice(1, 4)).toEqual([e.key, e.old, e.new]);
      for (const c of e.claims) expect(row[4]).toContain(c.written);
    });
    // The mix's db claim was right at HEAD and is now outside its band.
    const maDb = rows.find((row) => row[0]!.startsWith('mix MA') && row[1] === 'db')!;
    expect(maDb[4]).toMatch(/^db=26\.4C \(line 6\): ✓ 26\.4C → ✗ \d+\.\dC$/);
    expect(rows.find((row) => row[0]!.startsWith('state OA') && row[1] === 'db')!.slice(2, 4)).toEqual([
      '32.0 °C',
      '34.0 °C',
    ]);
  });

  it('says so when nothing changed, and when the note is new since the revision', async () => {
    git(['add', '.']);
    git(['commit', '-q', '-m', 'warmer outdoor design']);
    expect((await dewmark(['report', 'ahu-3.md', '--since', 'HEAD', '-o', 'same.html'])).code).toBe(0);
    expect(readFileSync(join(repo, 'same.html'), 'utf8')).toContain(': no computed figure or claim changed.</p>');
    writeFileSync(join(repo, 'new.md'), note('30C'));
    expect((await dewmark(['report', 'new.md', '--since', 'HEAD~1', '-o', 'new.html'])).code).toBe(0);
    expect(readFileSync(join(repo, 'new.html'), 'utf8')).toMatch(
      /<p id="changes-summary">The note is not in HEAD~1 \(commit <code>[0-9a-f]{12}<\/code>\): it was added since/,
    );
  });

  it('a bad revision, a folder outside git or standard input is exit 2 with what to do', async () => {
    const bad = await dewmark(['report', 'ahu-3.md', '--since', 'no-such-branch', '-o', 'x.html']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^dewmark: unknown revision 'no-such-branch': .*HEAD~1/);
    writeFileSync(join(outside, 'loose.md'), note('32C'));
    const loose = await dewmark(['report', 'loose.md', '--since', 'HEAD', '-o', 'x.html'], outside);
    expect(loose.code).toBe(2);
    expect(loose.err).toContain('is not inside a git repository');
    const stdin = await dewmark(['report', '-', '--since', 'HEAD', '-o', 'x.html']);
    expect(stdin.code).toBe(2);
    expect(stdin.err).toContain('--since compares the note with its version at a git revision');
  });
});
