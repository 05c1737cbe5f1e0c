/**
 * Making text from outside (file names, note text quoted in messages) safe to print on one line of
 * a terminal or a CI log. A file named `x\n::error::…` or a note holding an escape sequence must
 * never start a workflow command, move the terminal's cursor, or change colours: control
 * characters are shown as visible escapes (`\n`, `\x1b`, `\u202e`) instead of being written.
 */

/**
 * Characters never written raw: C0 controls (tab included: it would shift columns), DEL, C1
 * controls (U+0080–U+009F, NEL among them), the line and paragraph separators, and the bidi
 * embedding, override and isolate marks that can make a line read differently from its bytes.
 */
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const NAMED: Record<string, string> = { '\n': '\\n', '\r': '\\r', '\t': '\\t' };

function escapeOne(c: string): string {
  const named = NAMED[c];
  if (named) return named;
  const code = c.charCodeAt(0);
  return code <= 0xff ? `\\x${code.toString(16).padStart(2, '0')}` : `\\u${code.toString(16).padStart(4, '0')}`;
}

/** `text` with every unsafe character replaced by a visible escape; one line, always. */
export function safeText(text: string): string {
  return text.replace(UNSAFE, escapeOne);
}

/**
 * A path for the start of an output line: {@link safeText}, and `./` in front of a relative path
 * that starts with `:` or a space, so that no line can begin with `::` (a workflow command).
 */
export function safeLinePath(path: string): string {
  const s = safeText(path);
  return /^[:\s]/.test(s) ? `./${s}` : s;
}
