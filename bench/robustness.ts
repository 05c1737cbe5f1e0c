/**
 * Robustness benchmark: very large notes, in memory and through the real protocol.
 * - a 5 MB note (headings, prose, fenced blocks and inline statements of an invented campus);
 * - a note of 100,000 statements (one fence);
 * - a single 1 MB line (inline statements in one paragraph, no line break);
 * For each: parse + evaluate time, then the features an editor asks for while typing (diagnostics,
 * inlay hints for a 60-line window, hover, completion, outline); through a spawned server the
 * open → first diagnostics time, a one-character didChange → its diagnostics, and how long a
 * hover sent right after that change waits (the server must answer, never block for long), with
 * the default size limit (notes over 2 MB get one info diagnostic instead) and with it off.
 * Also the fuzzing throughput (random notes per second through every feature), and the "did you
 * mean" attacks (a 50,000-letter name; 4,000 unknown names) analysed as per keystroke.
 * Figures are printed, not asserted. Run alone: `node --import tsx bench/robustness.ts` (after
 * `npm run build`).
 */
import fc from 'fast-check';
import {
  analyzeText,
  completions,
  DEFAULT_SERVICE_SETTINGS,
  documentSymbols,
  hover,
  inlayHints,
  noteDiagnostics,
} from '../shared-core/src/service';
import {
  checkNote,
  note as noteArb,
  offsets,
  settings as settingsArb,
  spread,
  timeSummary,
} from '../shared-core/test/robustness-generators';
import { PUSH_ONLY_CAPABILITIES, startServer, type Position, type Published } from '../test/protocol/harness';

/** A big note and a cursor inside it (offset of a state name) for the per-request figures. */
interface BigNote {
  label: string;
  text: string;
  cursor: number;
}

function campusNote(targetChars: number): string {
  const parts: string[] = ['# Harbourside campus — plant rooms (generated)\n\n'];
  let len = parts[0]!.length;
  for (let b = 0; len < targetChars; b++) {
    const db = 20 + (b % 6);
    const part =
      `## Plant room ${b}\n\nThe room is held at \`state R${b}: db=${db}C ` +
      `rh=${40 + (b % 20)}%\` in summer; figures below are checked on save.\n\n` +
      '```air\n' +
      `state OA${b}: db=${db + 9}C wb=${db}C\n` +
      `state RA${b}: db=${db}C rh=50%\n` +
      `mix MA${b}: OA${b} 30% + RA${b} 70%\n` +
      `state SA${b}: db=13C rh=90%\n` +
      `process CC${b}: MA${b} -> SA${b} m=${2 + (b % 5)}kg/s\n` +
      '```\n\n';
    parts.push(part);
    len += part.length;
  }
  return parts.join('');
}

function manyStatements(n: number): string {
  const lines = ['# One block of many states', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${20 + (i % 10)}C rh=${30 + (i % 50)}%`);
  lines.push('```', '');
  return lines.join('\n');
}

function oneLongLine(chars: number): string {
  const piece = (i: number) => `\`state L${i}: db=${20 + (i % 9)}C rh=${40 + (i % 30)}%\` then `;
  const out: string[] = ['Inline figures: '];
  let len = out[0]!.length;
  for (let i = 0; len < chars; i++) {
    const p = piece(i);
    out.push(p);
    len += p.length;
  }
  return out.join('');
}

function notes(): BigNote[] {
  const five = campusNote(5 * 1024 * 1024);
  const many = manyStatements(100_000);
  const line = oneLongLine(1024 * 1024);
  return [
    { label: '5 MB note', text: five, cursor: five.indexOf('state OA', five.length >> 1) + 6 },
    { label: '100,000 statements', text: many, cursor: many.indexOf('state S50000:') + 6 },
    { label: '1 MB single line', text: line, cursor: line.indexOf('state L', line.length >> 1) + 6 },
  ];
}

function ms(t0: bigint): number {
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

function time<T>(f: () => T): { ms: number; value: T } {
  const t0 = process.hrtime.bigint();
  const value = f();
  return { ms: ms(t0), value };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1] ?? 0;
}

function size(text: string): string {
  const bytes = Buffer.byteLength(text, 'utf8');
  return bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(2)} MB` : `${(bytes / 1024).toFixed(0)} KB`;
}

/** Parse + evaluate and each feature in memory (size limit off: the engine's own cost), medians of a few rounds. */
function inMemory(n: BigNote): void {
  const rounds = 3;
  const analyse: number[] = [];
  const settings = { ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 0 };
  let note = analyzeText(n.text, settings);
  for (let i = 0; i < rounds; i++) {
    const r = time(() => analyzeText(n.text, settings));
    analyse.push(r.ms);
    note = r.value;
  }
  const lineAt = n.text.lastIndexOf('\n', n.cursor) + 1;
  let windowEnd = lineAt;
  for (let k = 0; k < 60 && windowEnd >= 0; k++) windowEnd = n.text.indexOf('\n', windowEnd + 1);
  if (windowEnd < 0) windowEnd = n.text.length;
  // A one-line note has no 60-line window: ask for 4 KB around the cursor, as an editor would for a visible part.
  const window =
    windowEnd - lineAt > 8192
      ? { start: Math.max(0, n.cursor - 2048), end: n.cursor + 2048 }
      : { start: lineAt, end: windowEnd };
  const feature = (f: () => unknown) => median([0, 1, 2, 3, 4].map(() => time(f).ms));
  const diag = feature(() => noteDiagnostics(note));
  const hints = feature(() => inlayHints(note, window));
  const hov = feature(() => hover(note, n.cursor));
  // Completion just after the digits of a dry-bulb (the unit list), on the cursor's statement.
  const afterDigits = n.text.indexOf('db=', n.cursor) + 5;
  const comp = feature(() => completions(note, afterDigits));
  const syms = feature(() => documentSymbols(note));
  const a = note.analysis;
  console.log(
    `${n.label.padEnd(20)} ${size(n.text).padStart(8)} ` +
      ` ${String(a.parsed.statements.length).padStart(7)} statements  ` +
      `analyse ${median(analyse).toFixed(0).padStart(5)} ms | ` +
      `diagnostics ${diag.toFixed(1)} ms, hints (window) ${hints.toFixed(2)} ms, ` +
      `hover ${hov.toFixed(2)} ms, completion ${comp.toFixed(2)} ms, outline ${syms.toFixed(0)} ms`,
  );
}

/**
 * Through the spawned server: open → diagnostics, one edit → diagnostics, a hover sent right after
 * the edit. `limitKB` is the dewmark.maxNoteSizeKB setting (undefined: the default, 2048; 0: none).
 */
async function throughServer(n: BigNote, limitKB?: number): Promise<void> {
  const s = startServer();
  try {
    await s.initialize(
      PUSH_ONLY_CAPABILITIES,
      limitKB === undefined ? {} : { initializationOptions: { dewmark: { maxNoteSizeKB: limitKB } } },
    );
    const uri = `file:///bench/robustness-${n.label.replace(/\W+/g, '-')}.md`;
    let t0 = process.hrtime.bigint();
    await s.open(uri, n.text, 1);
    const first: Published = await s.diagnosticsFor(uri, 1);
    const openMs = ms(t0);
    // Edits: toggle one digit near the cursor; a hover follows each edit at once.
    const before = n.text.slice(0, n.cursor);
    const line = before.split(/\r\n|\r|\n/).length - 1;
    const col = n.cursor - (Math.max(before.lastIndexOf('\n'), before.lastIndexOf('\r')) + 1);
    const pos: Position = { line, character: col };
    const editPos: Position = { line, character: col + 1 };
    const edits: number[] = [];
    const hovers: number[] = [];
    let version = 1;
    let current = n.text[n.cursor + 1] ?? 'x';
    for (let i = 0; i < 6; i++) {
      version++;
      const next = current === 'Q' ? 'Z' : 'Q';
      t0 = process.hrtime.bigint();
      await s.change(uri, version, [{ range: { start: editPos, end: { line, character: col + 2 } }, text: next }]);
      current = next;
      const th = process.hrtime.bigint();
      const hv = s
        .request('textDocument/hover', { textDocument: { uri }, position: pos })
        .then(() => hovers.push(ms(th)));
      await s.diagnosticsFor(uri, version);
      edits.push(ms(t0));
      await hv;
    }
    const limited = first.diagnostics.some((d) => d.code === 'note-too-large');
    console.log(
      `${n.label.padEnd(20)} server${limitKB === 0 ? ' (no limit)' : ''}: ` +
        `${limited ? 'over the limit (note-too-large), ' : ''}` +
        `open → ${first.diagnostics.length} diagnostics ${openMs.toFixed(0)} ms; ` +
        `1-char edit → diagnostics ${median(edits).toFixed(0)} ms (median of 6); ` +
        `hover sent after the edit answered in ${median(hovers).toFixed(0)} ms`,
    );
    await s.shutdown();
  } finally {
    s.kill();
  }
}

/** Random notes per second through parse, evaluate and every feature (the fuzzing's own loop). */
function fuzzThroughput(): void {
  const samples = fc.sample(fc.tuple(noteArb, settingsArb, offsets), { seed: 4242, numRuns: 2000 });
  const times: number[] = [];
  let chars = 0;
  const t0 = process.hrtime.bigint();
  for (const [text, s, raw] of samples) {
    const t = process.hrtime.bigint();
    checkNote(text, s, spread(raw, text));
    times.push(ms(t));
    chars += text.length;
  }
  const total = ms(t0);
  const t = timeSummary(times);
  console.log(
    `fuzzing: ${samples.length} random notes (mean ${(chars / samples.length).toFixed(0)} ` +
      `chars) in ${(total / 1000).toFixed(1)} s = ` +
      `${((samples.length / total) * 1000).toFixed(0)} notes/s through every feature; per note ` +
      `median ${t.median.toFixed(2)} ms, p99 ${t.p99.toFixed(1)} ms, max ${t.max.toFixed(1)} ms`,
  );
}

/**
 * The "did you mean" attacks: a 147 KB note whose one state has a 50,000-letter name and whose
 * process names a similar unknown one; and 4,000 short unknown names among 8,000 defined ones.
 * Each is analysed the way the editor does per keystroke (size limit off), and the unknown-name
 * diagnostics are counted. (Before the bounded engine: about 9 s and 27 s per analysis.)
 */
function suggestionAttacks(): void {
  const long = `N${'ab'.repeat(25_000)}`;
  const filler = Array.from({ length: 1200 }, (_, i) => `state F${i}: db=${20 + (i % 9)}C rh=${30 + (i % 40)}%`);
  const longNote = [
    '```air',
    `state ${long}: db=24C rh=50%`,
    `process P: ${long.slice(0, -1)}x -> ${long}`,
    ...filler,
    '```',
    '',
  ].join('\n');
  const many: string[] = ['```air'];
  for (let i = 0; i < 4000; i++)
    many.push(`state S${i}: db=${20 + (i % 9)}C rh=${30 + (i % 40)}%`, `process P${i}: Q${i}x -> S${i}`);
  many.push('```', '');
  const manyNote = many.join('\n');
  const settings = { ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 0 };
  for (const [label, text] of [
    ['50,000-letter name', longNote],
    ['4,000 unknown names', manyNote],
  ] as const) {
    analyzeText(text, settings);
    const runs = [0, 1, 2].map(() => time(() => analyzeText(text, settings)));
    const unknown = runs[0]!.value.analysis.diagnostics.filter((d) => d.code === 'unknown-name');
    const suggested = unknown.filter((d) => d.message.includes('did you mean')).length;
    console.log(
      `did you mean: ${label.padEnd(20)} ${size(text).padStart(8)}  analyse ${median(runs.map((r) => r.ms))
        .toFixed(0)
        .padStart(5)} ms (median of 3); ` + `${unknown.length} unknown names, ${suggested} with a suggestion`,
    );
  }
}

/** Runs the robustness benchmark and prints the figures. */
export async function benchRobustness(): Promise<void> {
  suggestionAttacks();
  fuzzThroughput();
  const big = notes();
  console.log('in memory, size limit off (medians of 3 analyses, 5 feature calls):');
  for (const n of big) inMemory(n);
  console.log('through the server (stdio), default dewmark.maxNoteSizeKB (2048):');
  for (const n of big) await throughServer(n);
  console.log('through the server with the limit off (dewmark.maxNoteSizeKB = 0), for comparison:');
  for (const n of big) await throughServer(n, 0);
}

if (process.argv[1] && /bench[\\/]robustness\.ts$/.test(process.argv[1])) {
  benchRobustness().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
