/**
 * A unified diff of two texts by lines (Myers' O((N+M)·D) shortest edit script, D being the
 * number of changed lines), for `dewmark fix`'s dry run. Lines keep their line breaks, so a
 * change of CRLF to LF would show; a last line without a break is marked as `diff` marks it.
 */

/** Splits into lines, each with its line break. */
function linesOf(text: string): string[] {
  const out: string[] = [];
  let start = 0;
  for (;;) {
    const nl = text.indexOf('\n', start);
    if (nl < 0) break;
    out.push(text.slice(start, nl + 1));
    start = nl + 1;
  }
  if (start < text.length) out.push(text.slice(start));
  return out;
}

type Op = { kind: ' ' | '-' | '+'; line: string; a: number; b: number };

/** The edit script from `a` to `b` (equal, deleted and inserted lines in order). */
function editScript(a: string[], b: string[]): Op[] {
  // Common head and tail first: the usual fix changes a few lines of a long note.
  let head = 0;
  while (head < a.length && head < b.length && a[head] === b[head]) head++;
  let tail = 0;
  while (tail < a.length - head && tail < b.length - head && a[a.length - 1 - tail] === b[b.length - 1 - tail]) tail++;
  const A = a.slice(head, a.length - tail);
  const B = b.slice(head, b.length - tail);
  const n = A.length;
  const m = B.length;
  const max = n + m;
  const offset = max + 1;
  const v = new Int32Array(2 * max + 3);
  const trace: Int32Array[] = [];
  let found = n === 0 && m === 0;
  for (let d = 0; d <= max && !found; d++) {
    trace.push(v.slice());
    for (let k = -d; k <= d; k += 2) {
      let x =
        k === -d || (k !== d && v[offset + k - 1]! < v[offset + k + 1]!) ? v[offset + k + 1]! : v[offset + k - 1]! + 1;
      let y = x - k;
      while (x < n && y < m && A[x] === B[y]) {
        x++;
        y++;
      }
      v[offset + k] = x;
      if (x >= n && y >= m) {
        found = true;
        break;
      }
    }
  }
  // Walk back through the trace.
  const middle: Op[] = [];
  let x = n;
  let y = m;
  for (let d = trace.length - 1; d >= 0 && (x > 0 || y > 0); d--) {
    const vd = trace[d]!;
    const k = x - y;
    const prevK = k === -d || (k !== d && vd[offset + k - 1]! < vd[offset + k + 1]!) ? k + 1 : k - 1;
    const prevX = vd[offset + prevK]!;
    const prevY = prevX - prevK;
    while (x > prevX && y > prevY) {
      middle.push({ kind: ' ', line: A[x - 1]!, a: head + x - 1, b: head + y - 1 });
      x--;
      y--;
    }
    if (d > 0) {
      if (x === prevX) middle.push({ kind: '+', line: B[y - 1]!, a: head + x, b: head + y - 1 });
      else middle.push({ kind: '-', line: A[x - 1]!, a: head + x - 1, b: head + y });
    }
    x = prevX;
    y = prevY;
  }
  middle.reverse();
  const ops: Op[] = [];
  for (let i = 0; i < head; i++) ops.push({ kind: ' ', line: a[i]!, a: i, b: i });
  ops.push(...middle);
  for (let i = 0; i < tail; i++)
    ops.push({ kind: ' ', line: a[a.length - tail + i]!, a: a.length - tail + i, b: b.length - tail + i });
  return ops;
}

/** One line of the diff body: the line without its break, and the no-newline marker when it had none. */
function body(op: Op): string {
  const l = op.line;
  if (l.endsWith('\r\n')) return `${op.kind}${l.slice(0, -2)}\n`;
  if (l.endsWith('\n')) return `${op.kind}${l.slice(0, -1)}\n`;
  return `${op.kind}${l}\n\\ No newline at end of file\n`;
}

/** The unified diff (`--- a/path`, `+++ b/path`, hunks with `context` lines around), or '' when equal. */
export function unifiedDiff(path: string, before: string, after: string, context = 3): string {
  if (before === after) return '';
  const ops = editScript(linesOf(before), linesOf(after));
  let out = `--- a/${path}\n+++ b/${path}\n`;
  let i = 0;
  while (i < ops.length) {
    while (i < ops.length && ops[i]!.kind === ' ') i++;
    if (i >= ops.length) break;
    const start = Math.max(0, i - context);
    let end = i;
    // Extend over changes closer than 2·context lines apart.
    for (;;) {
      while (end < ops.length && ops[end]!.kind !== ' ') end++;
      let next = end;
      while (next < ops.length && ops[next]!.kind === ' ') next++;
      if (next < ops.length && next - end <= 2 * context) end = next;
      else break;
    }
    const stop = Math.min(ops.length, end + context);
    const hunk = ops.slice(start, stop);
    const aLines = hunk.filter((o) => o.kind !== '+').length;
    const bLines = hunk.filter((o) => o.kind !== '-').length;
    const aStart = hunk[0]!.a + (aLines > 0 ? 1 : 0);
    const bStart = hunk[0]!.b + (bLines > 0 ? 1 : 0);
    out += `@@ -${aStart},${aLines} +${bStart},${bLines} @@\n`;
    for (const op of hunk) out += body(op);
    i = stop;
  }
  return out;
}
