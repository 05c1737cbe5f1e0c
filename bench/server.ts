/**
 * Language-server benchmark through the real protocol (driven with vscode-jsonrpc) on a generated
 * 10,000-line note with 2,000 statements, for the server started two ways: as the VS Code client
 * starts it (dist/server.js over node IPC with the client's Node options, protocol/src/nodeOptions.ts)
 * and as other editors start it (`dewmark-language-server --stdio`, no Node options):
 * - cold start: spawn → initialize → didOpen → first diagnostics (goal ≤ 300 ms);
 * - a one-character didChange → the new diagnostics of that version (goal ≤ 20 ms median), for a
 *   digit replaced (the text keeps its length) and for a character typed or deleted (everything
 *   after it moves);
 * - hover on a state name (goal ≤ 1 ms median);
 * - inlay hints for a 60-line range (goal ≤ 5 ms median);
 * - the server's resident memory (VmRSS) after the first diagnostics, after the edits and after all
 *   the runs (goal ≤ 80 MB).
 * Each figure is printed with its goal, whether it is met, and the load average at that moment.
 * Every time is a round trip as a client sees it (message encoding, pipe and decoding included).
 * Run alone: `node --import tsx bench/server.ts` (after `npm run build`).
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { createMessageConnection, IPCMessageReader, IPCMessageWriter } from 'vscode-jsonrpc/node';
import { SERVER_EXEC_ARGV } from '../protocol/src/nodeOptions';
import { PUSH_ONLY_CAPABILITIES, repoRoot, Session, startServer, type Position } from '../test/protocol/harness';
import { goalRow, infoRow, median, percentile } from './goals';

/** Lines and statements of the generated note. */
const LINES = 10_000;
const STATEMENTS = 2_000;
/** One-character edits sent of each kind (the first five are warm-up and not timed). */
const EDITS = 40;

/** A way of starting the server. */
interface Launch {
  label: string;
  start: () => Session;
}

/** The server as the VS Code client starts it: dist/server.js forked with node IPC and the client's execArgv. */
function startAsVsCode(): Session {
  const root = repoRoot();
  const proc = spawn(process.execPath, [...SERVER_EXEC_ARGV, join(root, 'dist', 'server.js'), '--node-ipc'], {
    cwd: root,
    stdio: ['pipe', 'pipe', 'pipe', 'ipc'],
  });
  return new Session(proc, createMessageConnection(new IPCMessageReader(proc), new IPCMessageWriter(proc)));
}

const LAUNCHES: Launch[] = [
  { label: `as VS Code starts it (node IPC, ${SERVER_EXEC_ARGV.join(' ')})`, start: startAsVsCode },
  { label: 'as other editors start it (dewmark-language-server --stdio, no Node options)', start: () => startServer() },
];

/** A note of an invented campus: 200 fenced blocks of 10 statements, each under a heading with prose. */
export function generateNote(): { text: string; stateLines: number[]; lineCount: number } {
  const lines: string[] = ['# Riverside campus — air-handling plant', ''];
  const stateLines: number[] = [];
  const blocks = STATEMENTS / 10;
  const proseLines = Math.floor((LINES - 2 - blocks * 16) / blocks);
  for (let b = 0; b < blocks; b++) {
    lines.push(`## Plant room ${b + 1}`, '');
    for (let p = 0; p < proseLines; p++)
      lines.push(
        `Design note ${b + 1}.${p + 1}: the unit serves zone ${(b % 17) + 1}; figures below are checked on save.`,
      );
    lines.push('', '```air');
    const n = (k: number) => `B${b}_${k}`;
    const db = 20 + (b % 15);
    const states = [
      `state ${n(1)}: db=${db}C rh=${40 + (b % 30)}%`,
      `state ${n(2)}: db=${db + 8}C wb=${db + 1}C`,
      `state ${n(3)}: db=${12 + (b % 4)}C rh=90%`,
      `state ${n(4)}: db=${db - 2}C dp=${8 + (b % 5)}C`,
      `state ${n(5)}: db=${db + 3}C w=${7 + (b % 6)}g/kg`,
      `state ${n(6)}: db=${db}C rh=50% w=${(7 + (b % 5)).toFixed(1)}g/kg`,
      `state ${n(7)}: db=${db + 1}C h=${45 + (b % 10)}kJ/kg`,
      `mix ${n(8)}: ${n(1)} 30% + ${n(2)} 70%`,
      `mix ${n(9)}: ${n(1)} 1.2kg/s + ${n(5)} 0.8kg/s`,
      `process ${n(10)}: ${n(8)} -> ${n(3)} m=${2 + (b % 4)}kg/s`,
    ];
    for (const s of states) {
      if (s.startsWith('state')) stateLines.push(lines.length);
      lines.push(s);
    }
    lines.push('```', '');
  }
  while (lines.length < LINES) lines.push('Closing remarks on the plant.');
  return { text: `${lines.join('\n')}\n`, stateLines, lineCount: lines.length };
}

function rssMB(pid: number): number | null {
  try {
    const status = readFileSync(`/proc/${pid}/status`, 'utf8');
    const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(status)?.[1]);
    return Number.isFinite(kb) ? kb / 1024 : null;
  } catch {
    return null;
  }
}

function ms(t0: bigint): number {
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

/** CPU seconds (user + system) the process has used so far, from /proc/PID/stat; null elsewhere. */
function cpuSeconds(pid: number): number | null {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // Fields after the command name (which may hold spaces) start after the last ')'.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(fields[11]) + Number(fields[12]); // utime, stime (fields 14 and 15)
    return Number.isFinite(ticks) ? ticks / CLOCK_TICKS : null;
  } catch {
    return null;
  }
}

/** USER_HZ of Linux /proc figures (100 on every mainstream kernel build). */
const CLOCK_TICKS = 100;

/** Runs the server benchmark for each way of starting the server and prints the figures. */
export async function benchServer(): Promise<void> {
  const note = generateNote();
  const statements = note.text.split('\n').filter((l) => /^(state|mix|process) /.test(l)).length;
  console.log(`note: ${note.lineCount} lines, ${statements} statements, ${(note.text.length / 1024).toFixed(0)} KiB`);
  for (const launch of LAUNCHES) {
    console.log(`server ${launch.label}:`);
    await benchOne(launch, note);
  }
}

/**
 * Times `EDITS` one-character edits made by `edit(i)` (range
 * and text), returns the timed ones and the server CPU per edit.
 */
async function timeEdits(
  session: Session,
  uri: string,
  first: number,
  edit: (i: number) => { range: { start: Position; end: Position }; text: string },
): Promise<{ times: number[]; cpuMs: number | null; version: number }> {
  const pid = session.proc.pid ?? 0;
  const times: number[] = [];
  let version = first;
  let cpu0: number | null = null;
  for (let i = 0; i < EDITS; i++) {
    version++;
    if (i === 5) cpu0 = cpuSeconds(pid);
    const t0 = process.hrtime.bigint();
    await session.change(uri, version, [edit(i)]);
    await session.diagnosticsFor(uri, version);
    if (i >= 5) times.push(ms(t0));
  }
  const cpu1 = cpuSeconds(pid);
  return { times, cpuMs: cpu0 !== null && cpu1 !== null ? ((cpu1 - cpu0) * 1000) / (EDITS - 5) : null, version };
}

async function benchOne(launch: Launch, note: ReturnType<typeof generateNote>): Promise<void> {
  const { text, stateLines } = note;
  const uri = 'file:///bench/campus.md';

  // Cold start: spawn → initialize → didOpen → first publishDiagnostics.
  const colds: number[] = [];
  let s: Session | undefined;
  for (let round = 0; round < 5; round++) {
    const t0 = process.hrtime.bigint();
    const session = launch.start();
    await session.initialize(PUSH_ONLY_CAPABILITIES);
    await session.open(uri, text, 1);
    await session.diagnosticsFor(uri, 1);
    colds.push(ms(t0));
    if (round < 4) {
      await session.shutdown();
      session.kill();
    } else s = session;
  }
  const session = s!;
  const pid = session.proc.pid ?? 0;
  const rssAtOpen = pid ? rssMB(pid) : null;
  try {
    // One-character edits in a dry-bulb in the middle of the note. First its second digit takes
    // the values 0…9 in turn (each edit gives the state a figure it had not had just before);
    // then a digit is typed after it and deleted again, which moves everything after it.
    const line = stateLines[Math.floor(stateLines.length / 2)]!;
    const lineText = text.split('\n')[line]!;
    const col = lineText.indexOf('db=') + 4; // second digit of the temperature
    const at = (c: number): Position => ({ line, character: c });
    const replaced = await timeEdits(session, uri, 1, (i) => ({
      range: { start: at(col), end: at(col + 1) },
      text: String((Number(lineText[col]) + i + 1) % 10),
    }));
    const rssAfterEdits = pid ? rssMB(pid) : null;
    const typed = await timeEdits(session, uri, replaced.version, (i) =>
      i % 2 === 0
        ? { range: { start: at(col + 1), end: at(col + 1) }, text: '5' }
        : { range: { start: at(col + 1), end: at(col + 2) }, text: '' },
    );
    const rssAfterTyping = pid ? rssMB(pid) : null;

    // Hovers on state names spread over the note.
    const hovers: number[] = [];
    for (let i = 0; i < 300; i++) {
      const l = stateLines[(i * 37) % stateLines.length]!;
      const position: Position = { line: l, character: 7 };
      const t0 = process.hrtime.bigint();
      const h = await session.request<{ contents: { value: string } } | null>('textDocument/hover', {
        textDocument: { uri },
        position,
      });
      if (i >= 20) hovers.push(ms(t0));
      if (!h) throw new Error(`no hover at line ${l}`);
    }

    // Inlay hints for 60-line windows around statement blocks.
    const hints: number[] = [];
    for (let i = 0; i < 200; i++) {
      const start = stateLines[(i * 53) % stateLines.length]! - 20;
      const t0 = process.hrtime.bigint();
      const r = await session.request<unknown[]>('textDocument/inlayHint', {
        textDocument: { uri },
        range: {
          start: { line: Math.max(0, start), character: 0 },
          end: { line: Math.max(0, start) + 60, character: 0 },
        },
      });
      if (i >= 20) hints.push(ms(t0));
      if (!Array.isArray(r) || r.length === 0) throw new Error('no inlay hints in a range with statements');
    }

    const rss = pid ? rssMB(pid) : null;
    console.log(goalRow('  cold start → first diagnostics (median of 5)', median(colds), 'ms', 300));
    console.log(goalRow('  didChange, digit replaced → diagnostics (median)', median(replaced.times), 'ms', 20));
    console.log(infoRow('    p90', percentile(replaced.times, 0.9), 'ms'));
    console.log(infoRow('    server CPU time per edit (mean, /proc stat)', replaced.cpuMs, 'ms', 1));
    console.log(goalRow('  didChange, digit typed/deleted → diagnostics', median(typed.times), 'ms', 20));
    console.log(infoRow('    p90', percentile(typed.times, 0.9), 'ms'));
    console.log(infoRow('    server CPU time per edit (mean, /proc stat)', typed.cpuMs, 'ms', 1));
    console.log(goalRow('  hover (median)', median(hovers), 'ms', 1, 3));
    console.log(goalRow('  inlay hints, 60-line range (median)', median(hints), 'ms', 5));
    console.log(goalRow('  server RSS after the first diagnostics', rssAtOpen, 'MB', 80, 1));
    console.log(goalRow(`  server RSS after ${EDITS} digits replaced`, rssAfterEdits, 'MB', 80, 1));
    console.log(goalRow(`  server RSS after ${EDITS} more typed/deleted`, rssAfterTyping, 'MB', 80, 1));
    console.log(goalRow('  server RSS after all the runs', rss, 'MB', 80, 1));
    console.log(
      `  spread: hover p90 ${percentile(hovers, 0.9).toFixed(3)} ms, hints ` +
        `p90 ${percentile(hints, 0.9).toFixed(2)} ms, cold max ${Math.max(...colds).toFixed(1)} ms`,
    );
    await session.shutdown();
  } finally {
    session.kill();
  }
}

if (process.argv[1] && /bench[\\/]server\.ts$/.test(process.argv[1])) {
  benchServer().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
