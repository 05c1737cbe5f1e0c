/**
 * The release convention CONTRIBUTING.md's "Releasing" section describes: CHANGELOG.md's newest
 * release is the version in package.json (root, client and lockfile agree), every release has a
 * section `## <version> — <YYYY-MM-DD> (tag v<version>)` with a real date, newest first; and each
 * `v*` git tag present in this clone points at a commit whose package.json has that version and
 * whose CHANGELOG's top release is that version. Tags are only read, never created; a clone
 * without tags (or without git) skips that part with a message.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(__dirname, '..', '..');
const read = (f: string) => readFileSync(join(root, f), 'utf8');

/** One release section of a changelog. */
interface Release {
  version: string;
  date: string;
  /** The `(tag v…)` the heading names, if any. */
  tag?: string;
  /** Lines of the section's body that carry text. */
  entries: number;
  line: number;
}

const SEMVER = String.raw`\d+\.\d+\.\d+(?:-[0-9A-Za-z.-]+)?`;
const RELEASE_HEADING = new RegExp(`^## (${SEMVER}) — (\\d{4}-\\d{2}-\\d{2})(?: \\(tag (v${SEMVER})\\))?$`);

/** The releases of a changelog, newest first as written, and every problem with its headings. */
function parseChangelog(text: string): { unreleased: boolean; releases: Release[]; problems: string[] } {
  const lines = text.split(/\r?\n/);
  const releases: Release[] = [];
  const problems: string[] = [];
  let unreleased = false;
  let current: Release | undefined;
  lines.forEach((l, i) => {
    if (!l.startsWith('## ')) {
      if (current && l.trim() !== '' && !l.startsWith('#')) current.entries++;
      return;
    }
    current = undefined;
    if (l === '## Unreleased') {
      if (releases.length > 0 || unreleased) problems.push(`line ${i + 1}: "## Unreleased" must be the first section`);
      unreleased = true;
      return;
    }
    const m = RELEASE_HEADING.exec(l);
    if (!m) {
      problems.push(`line ${i + 1}: "${l}" is not "## <version> — <YYYY-MM-DD> (tag v<version>)" nor "## Unreleased"`);
      return;
    }
    current = { version: m[1]!, date: m[2]!, tag: m[3], entries: 0, line: i + 1 };
    releases.push(current);
  });
  for (const r of releases) {
    const d = new Date(`${r.date}T00:00:00Z`);
    if (Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== r.date)
      problems.push(`line ${r.line}: ${r.date} is not a calendar date`);
    if (r.tag !== undefined && r.tag !== `v${r.version}`)
      problems.push(`line ${r.line}: the tag ${r.tag} is not v${r.version}`);
    if (r.entries === 0) problems.push(`line ${r.line}: release ${r.version} lists no changes`);
  }
  for (let i = 1; i < releases.length; i++) {
    const newer = releases[i - 1]!;
    const older = releases[i]!;
    if (compareVersions(newer.version, older.version) <= 0)
      problems.push(`line ${older.line}: ${older.version} is listed below ${newer.version} but is not older`);
    if (newer.date < older.date)
      problems.push(
        `line ${older.line}: ${older.version} (${older.date}) is dated after ${newer.version} (${newer.date})`,
      );
  }
  return { unreleased, releases, problems };
}

/** Semantic-version order of the numeric parts; a pre-release sorts before its release. */
function compareVersions(a: string, b: string): number {
  const parse = (v: string) => {
    const [core = '', pre] = v.split('-', 2);
    return { nums: core.split('.').map(Number), pre };
  };
  const x = parse(a);
  const y = parse(b);
  for (let i = 0; i < 3; i++) if (x.nums[i] !== y.nums[i]) return x.nums[i]! - y.nums[i]!;
  if (x.pre === y.pre) return 0;
  if (x.pre === undefined) return 1;
  if (y.pre === undefined) return -1;
  return x.pre < y.pre ? -1 : 1;
}

function git(args: string[]): { ok: boolean; out: string } {
  const r = spawnSync('git', args, { cwd: root, encoding: 'utf8', timeout: 30_000 });
  return { ok: r.status === 0, out: r.stdout ?? '' };
}

const version = (json: string) => (JSON.parse(json) as { version?: string }).version;

describe('the changelog parser (so the checks below can fail)', () => {
  it('reports a missing date, a bad date, a wrong tag, an empty section and releases out of order', () => {
    const bad = [
      '# Changelog',
      '',
      '## 0.2.0',
      '- a',
      '## 0.3.0 — 2026-02-30 (tag v0.3.0)',
      '- b',
      '## 0.1.0 — 2026-03-01 (tag v0.2.0)',
      '',
      '## Unreleased',
    ].join('\n');
    const { problems, releases } = parseChangelog(bad);
    expect(releases.map((r) => r.version)).toEqual(['0.3.0', '0.1.0']);
    expect(problems).toEqual([
      'line 3: "## 0.2.0" is not "## <version> — <YYYY-MM-DD> (tag v<version>)" nor "## Unreleased"',
      'line 9: "## Unreleased" must be the first section',
      'line 5: 2026-02-30 is not a calendar date',
      'line 7: the tag v0.2.0 is not v0.1.0',
      'line 7: release 0.1.0 lists no changes',
      'line 7: 0.1.0 (2026-03-01) is dated after 0.3.0 (2026-02-30)',
    ]);
    expect(parseChangelog('## 0.1.0 — 2026-01-01\n- a\n## 0.2.0 — 2025-01-01\n- b\n').problems).toEqual([
      'line 3: 0.2.0 is listed below 0.1.0 but is not older',
    ]);
    expect(compareVersions('1.0.0-rc.1', '1.0.0')).toBeLessThan(0);
    expect(compareVersions('0.10.0', '0.9.9')).toBeGreaterThan(0);
  });
});

describe('CHANGELOG.md and the version', () => {
  const changelog = parseChangelog(read('CHANGELOG.md'));

  it('has well-formed release sections, newest first, each dated and with entries', () => {
    expect(changelog.problems).toEqual([]);
    expect(changelog.releases.length).toBeGreaterThan(0);
  });

  it("has package.json's version as its top release, and the client, the lockfile and the root agree", () => {
    const rootVersion = version(read('package.json'));
    expect(changelog.releases[0]?.version).toBe(rootVersion);
    expect(changelog.releases[0]?.tag).toBe(`v${rootVersion}`);
    expect(version(read('client/package.json'))).toBe(rootVersion);
    const lock = JSON.parse(read('package-lock.json')) as {
      version: string;
      packages: Record<string, { version?: string }>;
    };
    expect(lock.version).toBe(rootVersion);
    expect(lock.packages['']?.version).toBe(rootVersion);
    expect(lock.packages.client?.version).toBe(rootVersion);
  });

  it('CONTRIBUTING.md says how to release and tag, in the form this test checks', () => {
    const contributing = read('CONTRIBUTING.md');
    const section = contributing.slice(contributing.indexOf('\n## Releasing'));
    expect(section.startsWith('\n## Releasing')).toBe(true);
    expect(section).toContain('`## <version> — <YYYY-MM-DD> (tag v<version>)`');
    expect(section).toContain('git tag -a v<version>');
    expect(section).toContain('`package.json` and `client/package.json`');
    expect(section).toContain('test/release/changelog.test.ts');
  });
});

describe('git tags present in this clone', () => {
  it('each v* tag is on a commit whose package.json has its version and whose CHANGELOG tops with it', (ctx) => {
    if (!existsSync(join(root, '.git')) || !git(['rev-parse', '--git-dir']).ok) {
      ctx.skip('not a git checkout: no tags to check');
    }
    const tags = git(['tag', '--list', 'v*']).out.split('\n').filter(Boolean);
    if (tags.length === 0)
      ctx.skip('this clone has no v* tags (a clone without tags); the CHANGELOG checks above still ran');
    const listed = new Set(changelogVersions());
    for (const tag of tags) {
      expect(tag, 'a tag is v<semver>').toMatch(new RegExp(`^v${SEMVER}$`));
      const v = tag.slice(1);
      expect(listed.has(v), `CHANGELOG.md has a section for ${tag}`).toBe(true);
      const pkg = git(['show', `${tag}:package.json`]);
      expect(pkg.ok, `git show ${tag}:package.json`).toBe(true);
      expect(version(pkg.out), `package.json at ${tag}`).toBe(v);
      const client = git(['show', `${tag}:client/package.json`]);
      expect(version(client.out), `client/package.json at ${tag}`).toBe(v);
      const then = parseChangelog(git(['show', `${tag}:CHANGELOG.md`]).out);
      expect(then.releases[0]?.version, `the top release of CHANGELOG.md at ${tag}`).toBe(v);
      expect(git(['cat-file', '-t', tag]).out.trim(), `${tag} is an annotated tag`).toBe('tag');
    }
  });
});

function changelogVersions(): string[] {
  return parseChangelog(read('CHANGELOG.md')).releases.map((r) => r.version);
}
