/**
 * Which files are notes (`@dewmark/files`): folders and globs keep the same Markdown files and
 * leave out the same things (node_modules, hidden entries, .gitignore and .git/info/exclude,
 * --exclude, symbolic links), files named on the command line are read whatever they are, and
 * a walk that finds nothing says what it left out. Each tree is made in a fresh temporary folder.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { collectInputs, explainEmpty, selectInputs, type CollectOptions } from '../src/index';

const made: string[] = [];
afterAll(() => {
  for (const d of made) rmSync(d, { recursive: true, force: true });
});

/** A fresh folder holding `files` (path → content; a path ending in `/` is an empty folder). */
function tree(files: Record<string, string>): string {
  const root = mkdtempSync(join(tmpdir(), 'dewmark-files-'));
  made.push(root);
  for (const [path, text] of Object.entries(files)) {
    if (path.endsWith('/')) mkdirSync(join(root, path), { recursive: true });
    else {
      mkdirSync(dirname(join(root, path)), { recursive: true });
      writeFileSync(join(root, path), text);
    }
  }
  return root;
}

/** The displayed paths of what `args` select from `cwd`, and the problems' messages. */
function select(cwd: string, args: string[], opts: Partial<CollectOptions> = {}) {
  const s = collectInputs(args, { cwd, ...opts });
  return { paths: s.inputs.map((i) => i.display), problems: s.problems.map((p) => p.message), empty: s.empty };
}

const NOTE = '```air\nstate A: db=24C rh=50%\n```\n';

describe('folders', () => {
  it('are walked depth first in name order for .md and .markdown only, each file once', () => {
    const root = tree({
      'b.md': NOTE,
      'a.markdown': NOTE,
      'c.txt': NOTE,
      'sub/z.MD': NOTE,
      'sub/deeper/y.md': NOTE,
      'empty/': '',
    });
    expect(select(root, ['.', 'b.md', '.']).paths).toEqual(['a.markdown', 'b.md', 'sub/deeper/y.md', 'sub/z.MD']);
  });

  it('leave out node_modules and hidden folders and files, and say so when nothing is left', () => {
    const root = tree({
      'node_modules/p/x.md': NOTE,
      '.github/t.md': NOTE,
      '.draft.md': NOTE,
      'docs/node_modules/q.md': NOTE,
    });
    const r = select(root, ['.']);
    expect(r.paths).toEqual([]);
    expect(r.empty).toEqual([
      {
        arg: '.',
        kind: 'folder',
        leftOut: { 'ignore-file': 0, exclude: 0, hidden: 2, node_modules: 2, symlink: 0 },
        notMarkdown: 0,
      },
    ]);
    expect(explainEmpty(r.empty)).toEqual([
      "in '.': folders and Markdown files: 2 hidden (name starting " +
        "with '.'; name them to read them), 2 in node_modules",
    ]);
    // Named, a hidden folder is walked like any other.
    expect(select(root, ['.github']).paths).toEqual(['.github/t.md']);
  });

  it('honour every .gitignore from the repository root down, deeper rules winning, and .git/info/exclude', () => {
    const root = tree({
      '.git/info/exclude': 'private/\n',
      '.gitignore': 'build/\n*.draft.md\n',
      'notes/a.md': NOTE,
      'notes/b.draft.md': NOTE,
      'notes/build/gen.md': NOTE,
      'notes/.gitignore': 'local.md\n',
      'notes/local.md': NOTE,
      'notes/keep/.gitignore': '!c.draft.md\n',
      'notes/keep/c.draft.md': NOTE,
      'private/p.md': NOTE,
    });
    expect(select(root, ['.']).paths).toEqual(['notes/a.md', 'notes/keep/c.draft.md']);
    // Walking a folder below the root still applies the root's rules and the exclude file.
    expect(select(join(root, 'notes'), ['.']).paths).toEqual(['a.md', 'keep/c.draft.md']);
    expect(select(root, ['.'], { gitignore: false }).paths).toEqual([
      'notes/a.md',
      'notes/b.draft.md',
      'notes/build/gen.md',
      'notes/keep/c.draft.md',
      'notes/local.md',
      'private/p.md',
    ]);
    // As in git, what is inside an ignored folder stays ignored when the folder is named; the
    // message says so.
    const named = select(root, ['private', 'notes/build']);
    expect(named.paths).toEqual([]);
    expect(explainEmpty(named.empty)).toEqual([
      "in 'private': folders and Markdown files: 1 left out by " +
        '.gitignore or .git/info/exclude (--no-gitignore reads it)',
      "in 'notes/build': folders and Markdown files: 1 left out by " +
        '.gitignore or .git/info/exclude (--no-gitignore reads it)',
    ]);
  });

  it('outside a repository only the walked folder’s own .gitignore files apply', () => {
    const outer = tree({
      '.gitignore': 'inner/\n*.md\n',
      'inner/a.md': NOTE,
      'inner/.gitignore': 'b.md\n',
      'inner/b.md': NOTE,
    });
    expect(select(join(outer, 'inner'), ['.']).paths).toEqual(['a.md']);
  });

  it('find the exclude file of a linked worktree through its .git file', () => {
    const root = tree({
      'main/.git/info/exclude': 'secret/\n',
      'main/.git/worktrees/wt/commondir': '../..\n',
      'wt/.git': '',
      'wt/secret/s.md': NOTE,
      'wt/open.md': NOTE,
    });
    writeFileSync(join(root, 'wt/.git'), `gitdir: ${join(root, 'main/.git/worktrees/wt')}\n`);
    expect(select(join(root, 'wt'), ['.']).paths).toEqual(['open.md']);
  });

  it('leave out what --exclude matches: a path, or a bare name at any depth', () => {
    const root = tree({
      'a.md': NOTE,
      'archive/old.md': NOTE,
      'plant/archive/x.md': NOTE,
      'plant/ahu.md': NOTE,
      'plant/notes.scratch.md': NOTE,
    });
    expect(select(root, ['.'], { exclude: ['archive'] }).paths).toEqual([
      'a.md',
      'plant/ahu.md',
      'plant/notes.scratch.md',
    ]);
    expect(select(root, ['.'], { exclude: ['plant/archive', '*.scratch.md'] }).paths).toEqual([
      'a.md',
      'archive/old.md',
      'plant/ahu.md',
    ]);
    const r = select(root, ['plant'], { exclude: ['plant/**'] });
    expect(r.paths).toEqual([]);
    expect(explainEmpty(r.empty)).toEqual(["in 'plant': folders and Markdown files: 3 left out by --exclude"]);
  });

  it('never follow symbolic links, inside the tree or out of it', () => {
    const outside = tree({ 'far.md': NOTE, 'dir/far2.md': NOTE });
    const root = tree({ 'real.md': NOTE, 'sub/in.md': NOTE });
    symlinkSync(join(outside, 'dir'), join(root, 'to-outside'));
    symlinkSync(join(outside, 'far.md'), join(root, 'far-link.md'));
    symlinkSync(join(root, 'sub'), join(root, 'sub-again'));
    symlinkSync(root, join(root, 'sub', 'loop'));
    const r = collectInputs(['.'], { cwd: root });
    expect(r.inputs.map((i) => i.display)).toEqual(['real.md', 'sub/in.md']);
    const onlyLinks = tree({});
    symlinkSync(join(outside, 'dir'), join(onlyLinks, 'to-outside'));
    symlinkSync(join(outside, 'far.md'), join(onlyLinks, 'far-link.md'));
    const none = select(onlyLinks, ['.']);
    expect(none.paths).toEqual([]);
    expect(explainEmpty(none.empty)).toEqual(["in '.': folders and Markdown files: 2 symbolic links not followed"]);
    // A link named on the command line is read: naming it is asking for it.
    expect(select(root, ['far-link.md']).paths).toEqual(['far-link.md']);
  });
});

describe('globs', () => {
  const root = tree({
    '.gitignore': 'build/\n',
    'notes/a.md': NOTE,
    'notes/data.csv': '1,2\n',
    'notes/deep/b.md': NOTE,
    'notes/build/generated.md': NOTE,
    'notes/.hidden/h.md': NOTE,
    'notes/node_modules/n.md': NOTE,
    'other/c.md': NOTE,
  });
  mkdirSync(join(root, '.git'));

  it('keep the matching Markdown files, leaving out what folder walks leave out', () => {
    expect(select(root, ['notes/**/*.md']).paths).toEqual(['notes/a.md', 'notes/deep/b.md']);
    expect(select(root, ['notes/**/*.md'], { gitignore: false }).paths).toEqual([
      'notes/a.md',
      'notes/build/generated.md',
      'notes/deep/b.md',
    ]);
    expect(select(root, ['**/*.md'], { exclude: ['deep'] }).paths).toEqual(['notes/a.md', 'other/c.md']);
  });

  it('contribute only .md and .markdown files', () => {
    expect(select(root, ['notes/*']).paths).toEqual(['notes/a.md']);
  });

  it('without ** reach only as deep as they are written (and walk no deeper)', () => {
    expect(select(root, ['notes/*.md']).paths).toEqual(['notes/a.md']);
    expect(select(root, ['*/*/*.md']).paths).toEqual(['notes/deep/b.md']);
    const steps = selectInputs(['notes/*.md'], { cwd: root });
    let folders = 0;
    while (!steps.next().done) folders++;
    expect(folders).toBe(1); // notes/ only: its sub-folders are not read
  });

  it('that find nothing say why', () => {
    expect(select(root, ['nothing/*.md']).problems).toEqual(["no files match the pattern 'nothing/*.md'"]);
    expect(select(root, ['notes/*.csv']).problems).toEqual([
      "the pattern 'notes/*.csv' matches 1 file, none of them Markdown " +
        '(.md, .markdown); name a file to read it whatever its name',
    ]);
    expect(select(root, ['notes/build/*.md']).problems).toEqual([
      "no files match the pattern 'notes/build/*.md' (folders and Markdown files: " +
        '1 left out by .gitignore or .git/info/exclude (--no-gitignore reads it))',
    ]);
  });
});

describe('files named on the command line, and standard input', () => {
  it('a named file is read whatever its name, ignore files and --exclude notwithstanding', () => {
    const root = tree({ '.git/': '', '.gitignore': '*.md\n', 'ignored.md': NOTE, 'notes.txt': NOTE });
    expect(select(root, ['ignored.md', 'notes.txt'], { exclude: ['ignored.md'] }).paths).toEqual([
      'ignored.md',
      'notes.txt',
    ]);
  });

  it('- is standard input, once, in its place; a missing path is a problem', () => {
    const root = tree({ 'a.md': NOTE });
    const r = select(root, ['a.md', '-', 'nowhere.md', '-']);
    expect(r.paths).toEqual(['a.md', '<stdin>']);
    expect(r.problems).toEqual(["cannot read 'nowhere.md': no such file or folder"]);
  });

  it('the generator yields once per folder walked (work a server can pause between)', () => {
    const root = tree({ 'a/1.md': NOTE, 'a/b/2.md': NOTE, 'c/3.md': NOTE, 'node_modules/x/4.md': NOTE });
    const steps = selectInputs(['.'], { cwd: root });
    let folders = 0;
    let r = steps.next();
    while (!r.done) {
      folders++;
      r = steps.next();
    }
    expect(folders).toBe(4); // ., a, a/b, c
    expect(r.value.inputs.map((i) => i.display)).toEqual(['a/1.md', 'a/b/2.md', 'c/3.md']);
  });
});
