/**
 * scripts/ascii-bundle.mjs: the characters outside ASCII of a bundle's regular-expression
 * literals are written as `\u` escapes that every regular expression reads as the same character
 * (each pattern matches exactly what it matched before, flags and classes included), and nothing
 * else of the code is touched.
 */
import { describe, expect, it } from 'vitest';
// @ts-expect-error: a build script without type declarations
import { escapeRegExpNonAscii } from '../scripts/ascii-bundle.mjs';

const escapeRegExps = escapeRegExpNonAscii as (code: string) => { code: string; left: number };

/** Patterns written with characters outside ASCII (the literal text between the slashes, and flags). */
const PATTERNS: [string, string][] = [
  ['[º˚]', 'g'],
  ['[\\s._^°]', 'g'],
  ['^[+\\-−]', ''],
  ['([?!])…', 'g'],
  ["[ilI.,:;'|!·]", ''],
  ['\\−x', ''], // an identity escape of a character outside ASCII
  ['[^°]+', 'i'],
  ['é+', 'iu'],
  ['😀|[😀-😂]', 'u'],
  ['😀', ''],
  ['[\\p{L}·]+', 'v'],
  ['a\\\\·', ''], // an escaped backslash, then the character
];

const SUBJECTS = [
  'º',
  '˚°',
  'a.b_c',
  '+5',
  '−5',
  '-5',
  '?…',
  '!!…',
  'x·y',
  '−x',
  '\\·',
  'a\\·',
  'É',
  'ééé',
  '😀',
  '😁x',
  '\uD83D',
  'ab°c',
];

/** What `re` finds in each subject: every match with its index, or null. */
function behaviour(re: RegExp): unknown[] {
  return SUBJECTS.map((s) => {
    re.lastIndex = 0;
    return re.global ? [...s.matchAll(re)].map((m) => [m.index, m[0]]) : re.exec(s)?.slice();
  });
}

describe('escapeRegExpNonAscii', () => {
  it('writes each regular expression in ASCII, matching exactly what it matched', () => {
    for (const [source, flags] of PATTERNS) {
      const code = `module.exports = /${source}/${flags};`;
      const out = escapeRegExps(code);
      expect(out.left, code).toBe(0);
      expect(out.code).not.toMatch(/[\u0080-\uFFFF]/);
      const before = new Function('module', `${code}; return module.exports;`)({}) as RegExp;
      const after = new Function('module', `${out.code}; return module.exports;`)({}) as RegExp;
      expect(after.flags).toBe(before.flags);
      expect(behaviour(after), code).toEqual(behaviour(before));
    }
  });

  it('leaves strings, comments, divisions and tagged templates as they are', () => {
    const code = [
      'const a = "x/°/y"; // a comment ° /not a regex/',
      'const b = 4 / 2 / 1; const c = `é`;',
      'const d = tag`−${a}`;',
      'const e = /°/.test(a) ? "·" : "";',
    ].join('\n');
    const out = escapeRegExps(code);
    expect(out.code).toBe(code.replace('/°/.test', '/\\u00B0/.test'));
    expect(out.left).toBe(5);
  });

  it('gives ASCII code back unchanged', () => {
    const code = 'const r = /[a-z]+/g; const s = "\\u00B0";';
    expect(escapeRegExps(code)).toEqual({ code, left: 0 });
  });
});
