/**
 * No line of a tracked source file is longer than 120 characters (Biome formats code to that
 * width but cannot wrap a string or a comment; this test keeps those within it too).
 *
 * Sources are the tracked files ending in .ts .mts .mjs .js .cjs .json .jsonc .css .sh, outside
 * node_modules/ and dist/. Left out, with why:
 * - test/fixtures/: notes and the exact outputs expected from them, whose content is what the
 *   tests check (a diagnostic message is as long as the product writes it);
 * - in a .json file, a line that is one member with a string value (`"key": "…",`): JSON cannot
 *   continue a string on the next line, and package.json is written by client/manifest.mjs.
 * A line's length is counted in characters (code points), as an editor shows it.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

const root = join(__dirname, '..');
const MAX = 120;
const SOURCE = /\.(ts|mts|mjs|js|cjs|json|jsonc|css|sh)$/;
const LEFT_OUT = /(^|\/)(node_modules|dist)\/|^test\/fixtures\//;
/** A JSON line holding one member whose value is a string, and nothing else. */
const JSON_STRING_MEMBER = /^\s*"(?:[^"\\]|\\.)*":\s*"(?:[^"\\]|\\.)*",?$/;

/** `path:line (n characters)` for each line of `text` over the limit that no rule above leaves out. */
function longLines(path: string, text: string): string[] {
  const out: string[] = [];
  const json = path.endsWith('.json');
  text.split('\n').forEach((raw, i) => {
    const line = raw.endsWith('\r') ? raw.slice(0, -1) : raw;
    if (line.length <= MAX) return; // UTF-16 units never undercount code points
    const n = [...line].length;
    if (n <= MAX) return;
    if (json && JSON_STRING_MEMBER.test(line)) return;
    out.push(`${path}:${i + 1} (${n} characters)`);
  });
  return out;
}

function trackedSources(): string[] {
  const r = spawnSync('git', ['ls-files', '-z'], { cwd: root, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`git ls-files failed in ${root}: ${r.stderr || r.error?.message}`);
  return r.stdout.split('\0').filter((p) => SOURCE.test(p) && !LEFT_OUT.test(p));
}

describe('source lines', () => {
  it('the rule reports a long line by file and line, and leaves out only a JSON string member', () => {
    const long = 'x'.repeat(MAX + 1);
    expect(longLines('a.ts', `short\n// ${long}\n`)).toEqual(['a.ts:2 (124 characters)']);
    expect(longLines('a.ts', `${'é'.repeat(MAX)}\r\n${'°'.repeat(MAX + 1)}`)).toEqual(['a.ts:2 (121 characters)']);
    expect(longLines('a.json', `{\n  "description": "${long}",\n  "d": "${long}"\n}`)).toEqual([]);
    // Anything else on a long JSON line is reported: an array, two members, a number.
    const other = `  "include": ["${long}"],\n  "a": "1", "b": "${long}",\n  "n": 1${'0'.repeat(MAX)}`;
    expect(longLines('a.json', other).map((p) => p.split(' ')[0])).toEqual(['a.json:1', 'a.json:2', 'a.json:3']);
    // The JSON rule is for .json files only.
    expect(longLines('a.ts', `  "description": "${long}",`)).toEqual(['a.ts:1 (141 characters)']);
  });

  it(`no tracked source file has a line over ${MAX} characters`, () => {
    const files = trackedSources();
    expect(files.length).toBeGreaterThan(100);
    const problems = files.flatMap((f) => longLines(f, readFileSync(join(root, f), 'utf8')));
    expect(problems, `split these lines (every produced string unchanged) or rewrap the comment`).toEqual([]);
  });
});
