// Keeps a bundle ASCII. esbuild writes every character outside ASCII in a string or template as
// its escape, but leaves those inside a regular-expression literal as they are (and those of a
// tagged template's text, whose raw form the tag may read). One such character makes Node read
// the whole bundle as two-byte text: a slower decode of every byte at every start (about a tenth
// of the CLI's own start-up on a small note) and twice the memory for the source.
//
// `escapeRegExpNonAscii` writes each character outside ASCII inside a regular-expression literal
// as its `\uXXXX` escape, which every regular expression reads as the same character: with or
// without the `u` or `v` flag, in a character class or not (a pair of surrogate escapes is one
// code point under `u`/`v`, as the pair of characters was). The literals are found by
// TypeScript's parser, so a `/` in a string, a comment or a division is never taken for one.
import ts from 'typescript';

const NON_ASCII = /[\u0080-\uFFFF]/;

/** `\uXXXX` of one UTF-16 code unit. */
function escapeUnit(code) {
  return `\\u${code.toString(16).toUpperCase().padStart(4, '0')}`;
}

/** The text of one regular-expression literal with its characters outside ASCII escaped. */
function escapeInRegExp(text) {
  let out = '';
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x5c /* \ */ && i + 1 < text.length) {
      const next = text.charCodeAt(i + 1);
      // `\` before a character outside ASCII (an identity escape, without `u`/`v`) means that
      // character: its `\u` escape replaces both.
      out += next > 0x7f ? escapeUnit(next) : text.slice(i, i + 2);
      i++;
      continue;
    }
    out += c > 0x7f ? escapeUnit(c) : text[i];
  }
  return out;
}

/**
 * `code` with the characters outside ASCII of its regular-expression literals escaped, and how
 * many characters outside ASCII are left elsewhere (in a comment, an identifier or a tagged
 * template; 0 for an ASCII result).
 */
export function escapeRegExpNonAscii(code) {
  if (!NON_ASCII.test(code)) return { code, left: 0 };
  /** Offsets of the characters outside ASCII, in order. */
  const places = [];
  for (let i = 0; i < code.length; i++) if (code.charCodeAt(i) > 0x7f) places.push(i);
  /** Whether one of them lies in [start, end). */
  const holds = (start, end) => {
    let lo = 0;
    let hi = places.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (places[mid] < start) lo = mid + 1;
      else hi = mid;
    }
    return lo < places.length && places[lo] < end;
  };
  const file = ts.createSourceFile('bundle.js', code, ts.ScriptTarget.Latest, false, ts.ScriptKind.JS);
  /** Regular-expression literals holding a character outside ASCII: [start, end]. */
  const literals = [];
  const visit = (node) => {
    if (!holds(node.pos, node.end)) return; // only subtrees that hold one are walked
    if (node.kind === ts.SyntaxKind.RegularExpressionLiteral) literals.push([node.getStart(file), node.end]);
    else ts.forEachChild(node, visit);
  };
  visit(file);
  let out = '';
  let at = 0;
  for (const [start, end] of literals) {
    out += code.slice(at, start) + escapeInRegExp(code.slice(start, end));
    at = end;
  }
  out += code.slice(at);
  let left = 0;
  for (let i = 0; i < out.length; i++) if (out.charCodeAt(i) > 0x7f) left++;
  return { code: out, left };
}
