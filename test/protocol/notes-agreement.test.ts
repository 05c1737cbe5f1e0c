/**
 * The notes of a workspace are one notion: on the same folder tree, `dewmark check --format json
 * <folder>` and the server's `dewmark/checkWorkspace` read the same files and count the same
 * errors and warnings. The tree holds everything either used to treat differently: files that
 * .gitignore, a nested .gitignore and .git/info/exclude leave out, node_modules, a hidden folder,
 * symbolic links (into the tree and out of it), a binary file, a non-Markdown file, prose
 * without statements, and a fence whose only line does not parse (an error but no statement —
 * Check All used to skip it and report one error fewer than the command line). Project files
 * `dewmark.json` leave notes out for both alike: the root one excludes the folder `archive`, the
 * nearer one in `sub/` (which replaces it there) includes only `kept.markdown`; an excluded note
 * opened in the editor shows one information message saying so instead of its problems.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CheckWorkspaceResult } from '@dewmark/protocol';
import { FULL_CAPABILITIES, repoRoot, startServer } from './harness';

const ERROR_NOTE = '# Errors\n\n```air\nstate A: db=20C wb=25C\n```\n';
const files: Record<string, string | Buffer> = {
  '.git/info/exclude': 'private/\n',
  '.gitignore': 'build/\n*.draft.md\n',
  'good.md': '# Good\n\n```air\nstate RA: db=24C rh=50%\n```\n',
  'bad.md': '# Bad\n\n```air\nstate A: db=20C wb=25C\nstate B: db=24C w=9.3g/kg rh=80%\n```\n',
  'syntax-only.md': '# Only a broken line\n\n```air\nstat A: db=20C rh=50%\n```\n',
  'prose.md': '# Prose\n\nNo statements here.\n',
  'binary.md': Buffer.from([0x23, 0x20, 0x00, 0x01, 0x02]),
  'notes.txt': ERROR_NOTE,
  'x.draft.md': ERROR_NOTE,
  'build/gen.md': ERROR_NOTE,
  'private/p.md': ERROR_NOTE,
  'node_modules/pkg/r.md': ERROR_NOTE,
  '.hidden/h.md': ERROR_NOTE,
  'sub/.gitignore': 'local.md\n',
  'sub/local.md': ERROR_NOTE,
  'sub/kept.markdown': 'Held at `state B: db=24C w=9.3g/kg rh=80%` overnight.\n',
  'dewmark.json': JSON.stringify({ exclude: ['archive'] }),
  'archive/old.md': ERROR_NOTE,
  'archive/2019/older.md': ERROR_NOTE,
  'sub/dewmark.json': JSON.stringify({ include: ['kept.markdown'] }),
  'sub/skipped.md': ERROR_NOTE,
};

let root = '';
let outside = '';

beforeAll(() => {
  if (!existsSync(join(repoRoot(), 'dist', 'cli.js')) || !existsSync(join(repoRoot(), 'dist', 'server.js'))) {
    const b = spawnSync(process.execPath, [join(repoRoot(), 'scripts', 'build.mjs')], {
      cwd: repoRoot(),
      encoding: 'utf8',
    });
    if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  }
  root = mkdtempSync(join(tmpdir(), 'dewmark-agree-'));
  outside = mkdtempSync(join(tmpdir(), 'dewmark-outside-'));
  for (const [path, content] of Object.entries(files)) {
    mkdirSync(dirname(join(root, path)), { recursive: true });
    writeFileSync(join(root, path), content);
  }
  writeFileSync(join(outside, 'far.md'), ERROR_NOTE);
  symlinkSync(join(outside, 'far.md'), join(root, 'far-link.md'));
  symlinkSync(outside, join(root, 'outside-link'));
  symlinkSync(join(root, 'sub'), join(root, 'sub-link'));
});

afterAll(() => {
  for (const d of [root, outside]) if (d) rmSync(d, { recursive: true, force: true });
});

interface CliJson {
  files: { path: string; diagnostics: { severity: string; code: string }[] }[];
  summary: { files: number; errors: number; warnings: number; infos: number; unreadable: number };
}

describe('the CLI and Check All agree on the notes of a folder', () => {
  it('the same files, the same errors and warnings, the same unreadable file', async () => {
    const r = spawnSync(process.execPath, [join(repoRoot(), 'dist', 'cli.js'), 'check', '--format', 'json', '.'], {
      cwd: root,
      encoding: 'utf8',
    });
    expect(r.status, r.stderr).toBe(2); // binary.md cannot be read
    expect(r.stderr).toContain("'binary.md' is a binary file");
    const cli = JSON.parse(r.stdout) as CliJson;
    expect(cli.files.map((f) => f.path)).toEqual([
      'bad.md',
      'good.md',
      'prose.md',
      'sub/kept.markdown',
      'syntax-only.md',
    ]);
    expect(cli.summary).toMatchObject({ files: 5, errors: 2, warnings: 2, unreadable: 1 });

    const s = startServer();
    try {
      const folder = pathToFileURL(root).href;
      await s.initialize(FULL_CAPABILITIES, { workspaceFolders: [{ uri: folder, name: 'ws' }] });
      const result = await s.request<CheckWorkspaceResult>('dewmark/checkWorkspace', {});
      const rel = (uri: string) => uri.slice(folder.length + 1);
      expect({
        files: result.filesRead,
        errors: result.errors,
        warnings: result.warnings,
        unreadable: result.unreadable.length,
      }).toEqual({
        files: cli.summary.files,
        errors: cli.summary.errors,
        warnings: cli.summary.warnings,
        unreadable: cli.summary.unreadable,
      });
      expect(result.unreadable.map((u) => rel(u.uri))).toEqual(['binary.md']);
      // The notes the project files leave out: not read, not counted, no diagnostics pushed.
      expect(result.excluded.map((e) => [rel(e.uri), e.reason])).toEqual([
        ['archive/2019/older.md', 'dewmark.json: its exclude pattern "archive" matches it'],
        ['archive/old.md', 'dewmark.json: its exclude pattern "archive" matches it'],
        ['sub/skipped.md', 'sub/dewmark.json: its include pattern "kept.markdown" does not match it'],
      ]);
      expect(s.published.filter((p) => /\/(archive\/|sub\/skipped)/.test(p.uri))).toEqual([]);
      expect(result.unreadable[0]!.reason).toContain('is a binary file');
      // The notes listed are the files with statements or problems; prose.md is read but not a note.
      expect(result.notes.map((n) => rel(n.uri))).toEqual(['bad.md', 'good.md', 'sub/kept.markdown', 'syntax-only.md']);
      const perFile = (path: string) =>
        cli.files.find((f) => f.path === path)!.diagnostics.filter((d) => d.severity === 'error').length;
      for (const n of result.notes) expect(n.errors, rel(n.uri)).toBe(perFile(rel(n.uri)));
      // The note with an error and no statement, which Check All used to skip.
      expect(result.notes.find((n) => rel(n.uri) === 'syntax-only.md')).toMatchObject({ errors: 1, statements: 0 });
      const pushed = s.published.find((p) => p.uri.endsWith('/syntax-only.md'));
      expect(pushed?.diagnostics).toHaveLength(1);
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });

  it(
    'an excluded note named on the command line is left out; ' +
      'opened in the editor, it says so instead of its problems',
    async () => {
      const r = spawnSync(
        process.execPath,
        [join(repoRoot(), 'dist', 'cli.js'), 'check', '--format', 'json', join('archive', 'old.md')],
        { cwd: root, encoding: 'utf8' },
      );
      expect(r.status).toBe(2);
      expect(r.stderr).toContain(
        '\'archive/old.md\' is left out by dewmark.json: its exclude pattern "archive" matches it',
      );
      expect((JSON.parse(r.stdout) as CliJson).files).toEqual([]);

      const s = startServer();
      try {
        const folder = pathToFileURL(root).href;
        await s.initialize(FULL_CAPABILITIES, { workspaceFolders: [{ uri: folder, name: 'ws' }] });
        const uri = `${folder}/archive/old.md`;
        await s.open(uri, ERROR_NOTE, 1);
        const shown = await s.request<{ items: { code: string; severity: number; message: string }[] }>(
          'textDocument/diagnostic',
          { textDocument: { uri } },
        );
        expect(shown.items.map((d) => [d.code, d.severity])).toEqual([['note-excluded', 3]]);
        expect(shown.items[0]!.message).toContain(
          'This note is left out by dewmark.json: its exclude pattern ' +
            '"archive" matches it. `dewmark check` and Check All do not check it',
        );
        // The same note outside the excluded folder has its error.
        const kept = `${folder}/bad.md`;
        await s.open(kept, ERROR_NOTE, 1);
        const other = await s.request<{ items: { code: string }[] }>('textDocument/diagnostic', {
          textDocument: { uri: kept },
        });
        expect(other.items.map((d) => d.code)).toEqual(['wb-above-db']);
        // Check All counts the open excluded note as excluded too.
        const result = await s.request<CheckWorkspaceResult>('dewmark/checkWorkspace', {});
        expect(result.excluded.map((e) => e.uri)).toContain(uri);
        expect(result.notes.map((n) => n.uri)).not.toContain(uri);
        expect(await s.shutdown()).toBe(0);
      } finally {
        s.kill();
      }
    },
  );
});
