/**
 * Random edits through the real protocol (a spawned `dewmark-language-server --stdio`): a few
 * hundred incremental `didChange`s of random notes (CRLF, lone surrogates, very long lines) with
 * requests of every kind fired in between without waiting (so they race with the edits), at
 * random and at out-of-range positions, on an open, a closed and an unknown document, with odd
 * settings pushed now and then. The server must never crash, must answer every request (a result,
 * or "cancelled"/"content modified" for a request overtaken by an edit, never an internal error),
 * must log no failure, and must end with exactly the text the client sent: its diagnostics equal
 * those of the same text analysed in-process.
 *
 * Seeded like the other fuzzing (DEWMARK_FUZZ_SEED; DEWMARK_FUZZ_PROTOCOL_EDITS for the count).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { TextDocument } from 'vscode-languageserver-textdocument';
import {
  FULL_CAPABILITIES,
  PUSH_ONLY_CAPABILITIES,
  startServer,
  type Position,
  type Range,
  type Session,
} from './harness';
import { fragment, fuzzConfig, note as noteArb, timeoutFor } from '../../shared-core/test/robustness-generators';
import { analyzeText, noteDiagnostics, readSettings } from '../../shared-core/src/service';

const cfg = fuzzConfig();
/** The note is kept below this size (large notes have their own benchmark, bench/robustness.ts). */
const MAX_NOTE = 200_000;
const URI = 'file:///fuzz/robust-note.md';
const OTHER = 'file:///fuzz/second-note.md';
const UNKNOWN = 'file:///fuzz/never-opened.md';
/** The settings the client answers with (valid, so the final comparison can use the same). */
const SETTINGS = { units: 'IP', precision: 2, checkClaims: true, 'inlayHints.properties': ['dp', 'h'] };
/** Settings pushed now and then: invalid values must be reported, never crash anything. */
const ODD_SETTINGS: unknown[] = [
  { units: 'XX', precision: 99, pressure: 'garbage', elevation: '1e308 m' },
  { pressure: '-5 kPa', 'inlayHints.properties': ['zz', 3, null] },
  null,
  'not an object',
  { checkClaims: 'yes', hover: { secondaryUnits: 1 } },
  { elevation: '11001 m' },
  SETTINGS,
];

interface Step {
  at: number;
  remove: number;
  text: string;
  /** Requests fired after this edit (indexes into the request kinds). */
  requests: number[];
  /** Where each request points: raw offsets (wrapped into the document), some far outside it. */
  where: number[];
  /** Also push settings, open/close the second note. */
  extra: number;
}

const step: fc.Arbitrary<Step> = fc.record({
  at: fc.nat(),
  remove: fc.oneof(
    { weight: 3, arbitrary: fc.constant(0) },
    { weight: 3, arbitrary: fc.nat({ max: 5 }) },
    { weight: 1, arbitrary: fc.nat({ max: 300 }) },
  ),
  // Mostly typing; now and then a paste of a very long line (digits after a key, or a repeated statement).
  text: fc.oneof(
    { weight: 60, arbitrary: fragment },
    {
      weight: 1,
      arbitrary: fc
        .tuple(
          fc.constantFrom('\nstate L: w=', '\n`state L: db=20C rh=50%` ', '\nmix M: A '),
          fc.constantFrom('9', 'a1', 'state Q: db=1C rh=5% '),
          fc.integer({ min: 5000, max: 40_000 }),
        )
        .map(([a, b, n]) => a + b.repeat(Math.ceil(n / b.length)).slice(0, n)),
    },
  ),
  requests: fc.array(fc.nat({ max: 13 }), { maxLength: 4 }),
  where: fc.array(fc.oneof(fc.nat(), fc.constant(-1), fc.constant(1 << 30)), { minLength: 3, maxLength: 3 }),
  extra: fc.nat({ max: 40 }),
});

/** An offset moved off the middle of a CRLF pair (a position cannot address it in LSP). */
function clean(text: string, offset: number): number {
  return offset > 0 && offset < text.length && text.charCodeAt(offset - 1) === 13 && text.charCodeAt(offset) === 10
    ? offset - 1
    : offset;
}

function positionIn(doc: TextDocument, raw: number): Position {
  if (raw === -1) return { line: 0, character: 1 << 20 }; // far past the end of the first line
  if (raw === 1 << 30) return { line: 1 << 20, character: 5 }; // far past the last line
  return doc.positionAt(raw % (doc.getText().length + 1));
}

interface Outcome {
  method: string;
  ok: boolean;
  code?: number;
  message?: string;
}

/** The request of kind `k` at `where` on the document (or on another uri for some kinds). */
function request(
  s: Session,
  k: number,
  doc: TextDocument,
  where: number[],
): { method: string; promise: Promise<unknown> } {
  const p0 = positionIn(doc, where[0]!);
  const p1 = positionIn(doc, where[1]!);
  const range: Range =
    p0.line < p1.line || (p0.line === p1.line && p0.character <= p1.character)
      ? { start: p0, end: p1 }
      : { start: p1, end: p0 };
  const td = { uri: k === 13 ? UNKNOWN : k === 12 ? OTHER : URI };
  const send = (method: string, params: unknown) => {
    const promise = s.request(method, params);
    promise.catch(() => undefined); // the answer is looked at in settle(); never an unhandled rejection
    return { method, promise };
  };
  switch (k % 12) {
    case 0:
      return send('textDocument/hover', { textDocument: td, position: p0 });
    case 1:
      return send('textDocument/inlayHint', { textDocument: td, range });
    case 2:
      return send('textDocument/completion', { textDocument: td, position: p0 });
    case 3:
      return send('textDocument/documentSymbol', { textDocument: td });
    case 4:
      return send('textDocument/codeAction', { textDocument: td, range, context: { diagnostics: [] } });
    case 5:
      return send('textDocument/definition', { textDocument: td, position: p0 });
    case 6:
      return send('textDocument/references', { textDocument: td, position: p0, context: { includeDeclaration: true } });
    case 7:
      return send('textDocument/prepareRename', { textDocument: td, position: p0 });
    case 8:
      return send('textDocument/rename', {
        textDocument: td,
        position: p0,
        newName: where[2]! % 2 ? 'Fuzzed_1' : 'bad name!',
      });
    case 9:
      return send('textDocument/diagnostic', { textDocument: td });
    case 10:
      return send('dewmark/noteStatus', { textDocument: td });
    default:
      return send('workspace/executeCommand', {
        command: 'dewmark.server.resultsTables',
        arguments: [{ textDocument: td, all: where[2]! % 2 === 0, position: p0 }],
      });
  }
}

/** Allowed error answers: a request overtaken by an edit or cancelled; a rename refused with its reason. */
function allowed(o: Outcome): boolean {
  if (o.code === -32800 || o.code === -32801) return true;
  return (
    o.code === -32600 &&
    (o.method === 'textDocument/rename' || o.method === 'textDocument/prepareRename') &&
    (o.message ?? '').length > 20
  );
}

async function settle(pending: { method: string; promise: Promise<unknown> }[], outcomes: Outcome[]): Promise<void> {
  const all = pending.splice(0).map(({ method, promise }) =>
    promise.then(
      () => outcomes.push({ method, ok: true }),
      (err: { code?: number; message?: string }) =>
        outcomes.push({ method, ok: false, code: err.code, message: err.message }),
    ),
  );
  let timer: ReturnType<typeof setTimeout> | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${all.length} requests unanswered after 30 s`)), 30_000);
  });
  try {
    await Promise.race([Promise.all(all), timeout]);
  } finally {
    clearTimeout(timer);
  }
}

/** The diagnostics of `text` analysed in-process, in the server's wire form (code, range, message). */
function localDiagnostics(text: string): string[] {
  const doc = TextDocument.create(URI, 'markdown', 1, text);
  const note = analyzeText(text, readSettings(SETTINGS).settings);
  return noteDiagnostics(note).map((d) =>
    JSON.stringify([d.code, doc.positionAt(d.span.start), doc.positionAt(d.span.end), d.message]),
  );
}

function wireDiagnostics(items: { code?: string | number; range: Range; message: string }[]): string[] {
  return items.map((d) => JSON.stringify([d.code, d.range.start, d.range.end, d.message]));
}

async function fuzzSession(
  s: Session,
  pull: boolean,
  count: number,
  seed: number,
): Promise<{ outcomes: Outcome[]; edits: number; text: string }> {
  const [start] = fc.sample(
    noteArb.filter((t) => t.length < 20_000),
    { seed, numRuns: 1 },
  );
  const steps = fc.sample(step, { seed: seed + 1, numRuns: count });
  let text = start!;
  let version = 1;
  await s.open(URI, text, version);
  const outcomes: Outcome[] = [];
  const pending: { method: string; promise: Promise<unknown> }[] = [];
  let otherOpen = false;
  for (const [i, e] of steps.entries()) {
    const doc = TextDocument.create(URI, 'markdown', version, text);
    // Keep the note under MAX_NOTE characters: past it, an edit deletes instead of inserting.
    const big = text.length > MAX_NOTE;
    const insert = big ? '' : e.text;
    const a = clean(text, text.length === 0 ? 0 : e.at % (text.length + 1));
    const b = clean(text, Math.min(text.length, a + (big ? Math.max(e.remove, 50_000) : e.remove)));
    const range = { start: doc.positionAt(a), end: doc.positionAt(b) };
    text = text.slice(0, a) + insert + text.slice(b);
    version++;
    await s.change(URI, version, [{ range, text: insert }]);
    const now = TextDocument.create(URI, 'markdown', version, text);
    for (const k of e.requests) pending.push(request(s, k, now, e.where));
    if (e.extra === 0) {
      await s.connection.sendNotification('workspace/didChangeConfiguration', {
        settings: { dewmark: ODD_SETTINGS[i % ODD_SETTINGS.length] },
      });
    } else if (e.extra === 1) {
      if (otherOpen) await s.connection.sendNotification('textDocument/didClose', { textDocument: { uri: OTHER } });
      else await s.open(OTHER, 'state Z: db=24C rh=50%\r\n```air\nstate Y: db=20C wb=25C\n', 1);
      otherOpen = !otherOpen;
    }
    if (i % 25 === 24) await settle(pending, outcomes);
  }
  await settle(pending, outcomes);
  // Back to the fixed settings, then the final text must be the server's text.
  await s.connection.sendNotification('workspace/didChangeConfiguration', { settings: { dewmark: SETTINGS } });
  if (pull) {
    const report = await s.request<{ kind: string; items: { code?: string; range: Range; message: string }[] }>(
      'textDocument/diagnostic',
      { textDocument: { uri: URI } },
    );
    expect(report.kind).toBe('full');
    expect(wireDiagnostics(report.items)).toEqual(localDiagnostics(text));
  } else {
    // Push: after the last edit and the settings change, the latest push for the last version.
    await s.until(
      'diagnostics after the settings change',
      () => s.published.filter((p) => p.uri === URI && p.version === version).length >= 1,
    );
    const expected = localDiagnostics(text);
    const last = await s.until('the pushed diagnostics to match', () => {
      const latest = [...s.published].reverse().find((p) => p.uri === URI);
      return latest &&
        latest.version === version &&
        JSON.stringify(wireDiagnostics(latest.diagnostics)) === JSON.stringify(expected)
        ? latest
        : undefined;
    });
    expect(wireDiagnostics(last.diagnostics)).toEqual(expected);
  }
  return { outcomes, edits: steps.length, text };
}

function summarize(outcomes: Outcome[]): { answered: number; errors: Outcome[]; byMethod: Record<string, number> } {
  const byMethod: Record<string, number> = {};
  for (const o of outcomes) byMethod[o.method] = (byMethod[o.method] ?? 0) + 1;
  return { answered: outcomes.length, errors: outcomes.filter((o) => !o.ok && !allowed(o)), byMethod };
}

describe('random edits through the real protocol', () => {
  let s: Session;
  let push: Session;

  beforeAll(async () => {
    s = startServer();
    s.configuration = () => SETTINGS;
    await s.initialize(FULL_CAPABILITIES);
    push = startServer();
    await push.initialize(PUSH_ONLY_CAPABILITIES, { initializationOptions: { dewmark: SETTINGS } });
  });

  afterAll(async () => {
    for (const x of [s, push]) {
      if (!x) continue;
      if (x.proc.exitCode === null) await x.shutdown().catch(() => undefined);
      x.kill();
    }
  });

  it(
    `${cfg.protocolEdits} edits with racing requests (pull diagnostics, ` +
      `seed ${cfg.seed}): every request answered, the server's text is the client's`,
    async () => {
      const t0 = performance.now();
      const r = await fuzzSession(s, true, cfg.protocolEdits, cfg.seed + 10);
      const sum = summarize(r.outcomes);
      console.log(
        `[protocol] ${r.edits} edits, ${sum.answered} requests answered ` +
          `in ${((performance.now() - t0) / 1000).toFixed(1)} s (final ` +
          `note ${r.text.length} characters); by method ${JSON.stringify(sum.byMethod)}`,
      );
      expect(
        sum.errors.map((e) => `${e.method} ${e.code} ${e.message}`),
        'no internal errors',
      ).toEqual([]);
      expect(sum.answered).toBeGreaterThan(cfg.protocolEdits / 2);
      expect(Object.keys(sum.byMethod).length, 'every request kind was sent').toBeGreaterThanOrEqual(12);
      expect(s.proc.exitCode, 'the server is still running').toBeNull();
      expect(
        s.logs.filter((l) => / failed/.test(l)),
        'no handler failure logged',
      ).toEqual([]);
    },
    timeoutFor(cfg.protocolEdits, 100),
  );

  it(
    `${Math.ceil(cfg.protocolEdits / 3)} edits to a push-only client (like ` +
      `Neovim 0.7): the last push is the diagnostics of the client's text`,
    async () => {
      const r = await fuzzSession(push, false, Math.ceil(cfg.protocolEdits / 3), cfg.seed + 20);
      const sum = summarize(r.outcomes);
      expect(sum.errors.map((e) => `${e.method} ${e.code} ${e.message}`)).toEqual([]);
      expect(push.proc.exitCode).toBeNull();
      expect(push.logs.filter((l) => / failed/.test(l))).toEqual([]);
    },
    timeoutFor(cfg.protocolEdits, 100),
  );

  it('both servers shut down cleanly afterwards (exit code 0)', async () => {
    expect(await s.shutdown()).toBe(0);
    expect(await push.shutdown()).toBe(0);
  });
});
