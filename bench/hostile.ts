/**
 * Hostile-input benchmark: what the attacks of the robustness review cost now, and the whole job
 * against the peer. Figures are printed (with the load average), never asserted:
 * - many stale results tables (20,000 tables, each numbered in its message);
 * - the chart with 8,000 and 16,000 states (label placement and drawing), and the work counters
 *   of the placement (candidates scored, grid entries visited);
 * - the command line's memory per input byte (peak RSS above an empty run, over the note's bytes)
 *   for `check` and `eval --format json` on a 4 MB note;
 * - the whole job: `dewmark eval --format json` on a note of 100,000 (db, rh) states against a Node
 *   script computing the same states with PsychroLib (npm psychrolib, the test oracle) and printing
 *   them as JSON; whole processes, runs alternated, medians; the ratio (goal ≤ 0.5);
 * - the language server over stdio without Node options: resident memory after 10,000 edits of a
 *   2,602-line note, measured as soon as the last edit's diagnostics arrive (goal ≤ 80 MB), with the
 *   server's CPU time per edit, its resident memory after opening the note, and after 10 s without
 *   edits (V8's memory reducer may have collected the heap down to its live size by then: it acts
 *   about 8 s after a full collection that found the heap some 10 MB larger than when it last
 *   acted, so this figure is the live size in some runs and unchanged in others).
 * Run alone: `npm run bench -- hostile` (builds first) or `node --import tsx bench/hostile.ts`.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { goalRow, infoRow, median } from './goals';
import { repoRoot, startServer } from '../test/protocol/harness';

const root = repoRoot();
const cli = join(root, 'bin', 'dewmark.js');

function seconds(f: () => void): number {
  const t = process.hrtime.bigint();
  f();
  return Number(process.hrtime.bigint() - t) / 1e9;
}

/** A deterministic pseudo-random sequence in [0, 1). */
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

async function staleTables(): Promise<void> {
  const { analyzeNote } = await import('../shared-core/src/analyze');
  const { staleTableDiagnostics } = await import('../shared-core/src/present/writtenTables');
  const parts: string[] = [];
  for (let i = 0; i < 20_000; i++) {
    parts.push(
      `Zone ${i}:\n\n\`\`\`air\nstate Z${i}: db=${20 + (i % 5)}C rh=${40 + (i % 7)}%\n\`\`\`\n\n<!-- ` +
        `dewmark-results 00000000: generated from the air block above; refresh it, do not edit ` +
        `-->\n\n| state | db °C |\n|---|---|\n| Z${i} | 1 |\n\n<!-- dewmark-results end -->\n`,
    );
  }
  const text = parts.join('\n');
  const analysis = analyzeNote(text.replace(/dewmark-results/g, 'dewmark-resultz'));
  let n = 0;
  const s = seconds(() => (n = staleTableDiagnostics(analysis, text).length));
  console.log(infoRow(`stale-table check, ${n} stale tables (${(text.length / 1e6).toFixed(1)} MB)`, s, 's', 2));
}

async function chart(): Promise<void> {
  const { renderChartFromData } = await import('../shared-core/src/chart');
  type Data = Parameters<typeof renderChartFromData>[0];
  for (const n of [8_000, 16_000]) {
    const random = rng(n);
    const points: Data['points'] = [];
    for (let i = 0; i < n; i++)
      points.push({ name: `Z${i}`, kind: 'state', db: 5 + 30 * random(), w: 0.002 + 0.012 * random() });
    const processes: Data['processes'] = [];
    for (let i = 0; i + 1 < n; i += 4) processes.push({ name: `P${i}`, from: `Z${i}`, to: `Z${i + 1}` });
    const stats = { visited: 0, candidates: 0 };
    let size = 0;
    const s = seconds(
      () =>
        (size = renderChartFromData(
          { pressurePa: 101_325, units: 'SI', points, mixes: [], processes, infeasible: [] },
          {},
          stats,
        ).length),
    );
    console.log(
      infoRow(`chart of ${n} states, ${processes.length} processes (${(size / 1e6).toFixed(1)} MB SVG)`, s, 's', 2),
    );
    console.log(infoRow(`  placement: grid entries visited per candidate`, stats.visited / stats.candidates, '', 1));
  }
}

/** Peak RSS (MB) of `dewmark ARGS`, read at exit by a preload. */
function peakRssMB(args: string[]): number | null {
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-rss-'));
  try {
    const preload = join(dir, 'rss.cjs');
    writeFileSync(
      preload,
      "process.on('exit', () => process.stderr.write(`[peak-rss ${process.resourceUsage().maxRSS}]\\n`));\n",
    );
    const r = spawnSync(process.execPath, ['--require', preload, cli, ...args], {
      encoding: 'utf8',
      maxBuffer: 1 << 30,
      env: { ...process.env, DEWMARK_WORKERS: '0' },
    });
    const kb = Number(/\[peak-rss (\d+)\]/.exec(r.stderr)?.[1]);
    return Number.isFinite(kb) ? kb / 1024 : null;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function memoryPerByte(): void {
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-mem-'));
  try {
    const lines = ['# Campus zones (invented)', '', '```air'];
    let bytes = 0;
    for (let i = 0; bytes < 4 * 1024 * 1024; i++) {
      const l = `state Z${i}: db=${18 + (i % 12)}C rh=${30 + (i % 50)}%`;
      lines.push(l);
      bytes += l.length + 1;
    }
    lines.push('```', '');
    const note = join(dir, 'big.md');
    writeFileSync(note, lines.join('\n'));
    const size = readFileSync(note).length;
    const base = peakRssMB(['--version']);
    for (const args of [['check'], ['eval', '--format', 'json']]) {
      const peak = peakRssMB([...args, note]);
      const per = peak !== null && base !== null ? ((peak - base) * 1024 * 1024) / size : null;
      console.log(infoRow(`dewmark ${args.join(' ')}, ${(size / 1e6).toFixed(1)} MB note: peak RSS`, peak, 'MB', 0));
      console.log(infoRow('  bytes of memory per input byte (above an empty run)', per, '', 0));
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * CPU seconds (user + system) of this process's finished children, from /proc (Linux; null
 * elsewhere). On a busy machine a child's CPU time varies less than its wall time.
 */
function childrenCpu(): number | null {
  try {
    // Fields after the command name: cutime and cstime are the 14th and 15th, in clock ticks (100 per second).
    const f = readFileSync('/proc/self/stat', 'utf8').split(') ')[1]!.split(' ');
    return (Number(f[13]) + Number(f[14])) / 100;
  } catch {
    return null;
  }
}

/** CPU seconds of each whole process run by {@link runProcess} (null where /proc is missing). */
let lastCpu: number | null = null;

/** Wall seconds of a whole process (its CPU seconds in {@link lastCpu}). */
function runProcess(args: string[], input?: string): number {
  const c0 = childrenCpu();
  const t = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, {
    encoding: 'utf8',
    maxBuffer: 1 << 30,
    input,
    stdio: ['pipe', 'ignore', 'pipe'],
    env: { ...process.env, DEWMARK_WORKERS: '0' },
  });
  if (r.status !== 0 && r.status !== 1) throw new Error(`${args.join(' ')} failed: ${r.stderr}`);
  const wall = Number(process.hrtime.bigint() - t) / 1e9;
  const c1 = childrenCpu();
  lastCpu = c0 !== null && c1 !== null ? c1 - c0 : null;
  return wall;
}

function wholeJob(): void {
  const N = 100_000;
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-peer-'));
  try {
    const random = rng(20261203);
    const lines = ['# Peer comparison (invented states)', '', '```air'];
    const states: [number, number][] = [];
    for (let i = 0; i < N; i++) {
      const db = Math.round((-10 + 50 * random()) * 10) / 10;
      const rh = Math.round((5 + 90 * random()) * 10) / 10;
      states.push([db, rh]);
      lines.push(`state S${i}: db=${db}C rh=${rh}%`);
    }
    lines.push('```', '');
    const note = join(dir, 'states.md');
    writeFileSync(note, lines.join('\n'));
    const data = join(dir, 'states.json');
    writeFileSync(data, JSON.stringify(states));
    const psychrolib = createRequire(join(root, 'package.json')).resolve('psychrolib');
    // The peer: the same states computed with PsychroLib and printed as JSON (name and properties).
    const peer = join(dir, 'peer.cjs');
    writeFileSync(
      peer,
      `const psy = require(${JSON.stringify(psychrolib)});
psy.SetUnitSystem(psy.SI);
const states = JSON.parse(require('fs').readFileSync(${JSON.stringify(data)}, 'utf8'));
const out = [];
states.forEach(([db, rh], i) => {
  const [w, wb, dp, pw, h, v, mu] = psy.CalcPsychrometricsFromRelHum(db, rh / 100, 101325);
  out.push({ name: 'S' + i, db, rh: rh / 100, w, wb, dp, pw, h, v, mu });
});
process.stdout.write(JSON.stringify({ states: out }, null, 2) + '\\n');
`,
    );
    const ours: number[] = [];
    const theirs: number[] = [];
    const oursCpu: number[] = [];
    const theirsCpu: number[] = [];
    for (let r = 0; r < 3; r++) {
      ours.push(runProcess([cli, 'eval', '--format', 'json', note]));
      if (lastCpu !== null) oursCpu.push(lastCpu);
      theirs.push(runProcess([peer]));
      if (lastCpu !== null) theirsCpu.push(lastCpu);
    }
    const a = median(ours);
    const b = median(theirs);
    console.log(infoRow(`dewmark eval --format json, ${N} states (median of 3)`, a, 's', 2));
    console.log(infoRow('PsychroLib script, same states as JSON (median of 3)', b, 's', 2));
    console.log(goalRow('whole job, dewmark / PsychroLib', a / b, '×', 0.5, 2));
    // The same in CPU seconds (user + system): steadier than wall time when other work shares the cores.
    const ac = oursCpu.length === 3 ? median(oursCpu) : null;
    const bc = theirsCpu.length === 3 ? median(theirsCpu) : null;
    console.log(infoRow('  CPU seconds, dewmark (median of 3)', ac, 's', 2));
    console.log(infoRow('  CPU seconds, PsychroLib script (median of 3)', bc, 's', 2));
    console.log(
      goalRow('  whole job in CPU time, dewmark / PsychroLib', ac !== null && bc ? ac / bc : null, '×', 0.5, 2),
    );
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function rssOf(pid: number): number | null {
  try {
    const kb = Number(/VmRSS:\s+(\d+)\s+kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1]);
    return Number.isFinite(kb) ? kb / 1024 : null;
  } catch {
    return null;
  }
}

function cpuMsOf(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    // utime and stime, fields 14 and 15 of /proc/PID/stat (11 and 12 after the name), in ticks of 10 ms
    return (Number(fields[11]) + Number(fields[12])) * 10;
  } catch {
    return null;
  }
}

async function serverMemory(): Promise<void> {
  const EDITS = 10_000;
  /** The pause after the edits, before the last figure (see the module comment). */
  const PAUSE_MS = 10_000;
  const lines = ['# Riverside campus (invented)', ''];
  for (let b = 0; b < 200; b++) {
    lines.push(`## Plant room ${b}`, '', '```air');
    for (let k = 0; k < 8; k++) lines.push(`state R${b}_${k}: db=${18 + k}C rh=${40 + (b % 30)}%`);
    lines.push('```', '');
  }
  const s = startServer();
  try {
    await s.initialize({ textDocument: { publishDiagnostics: {} } });
    const uri = 'file:///bench/edits.md';
    await s.open(uri, lines.join('\n'));
    await s.diagnosticsFor(uri, 1);
    const pid = s.proc.pid;
    const rssOpen = pid ? rssOf(pid) : null;
    const cpuOpen = pid ? cpuMsOf(pid) : null;
    const line = 5; // `state R0_0: db=18C …`: the digit after `db=1` is replaced back and forth
    for (let v = 2; v <= EDITS + 1; v++) {
      await s.change(uri, v, [
        { range: { start: { line, character: 16 }, end: { line, character: 17 } }, text: String(v % 10) },
      ]);
      if (v % 50 === 0) await s.diagnosticsFor(uri, v);
    }
    await s.diagnosticsFor(uri, EDITS + 1);
    const rss = pid ? rssOf(pid) : null;
    const cpuEdits = pid ? cpuMsOf(pid) : null;
    console.log(
      goalRow(
        `server RSS after ${EDITS} edits of a ${lines.length}-line note (stdio, no Node options)`,
        rss,
        'MB',
        80,
        1,
      ),
    );
    console.log(infoRow('  server RSS after opening the note', rssOpen, 'MB', 1));
    console.log(
      infoRow(
        '  server CPU time per edit (mean, /proc stat)',
        cpuEdits !== null && cpuOpen !== null ? (cpuEdits - cpuOpen) / EDITS : null,
        'ms',
        3,
      ),
    );
    await new Promise((resolve) => setTimeout(resolve, PAUSE_MS));
    console.log(infoRow(`  server RSS after ${PAUSE_MS / 1000} s without edits`, pid ? rssOf(pid) : null, 'MB', 1));
    await s.shutdown();
  } finally {
    s.kill();
  }
}

/** Runs the hostile-input benchmark and prints its figures. */
export async function benchHostile(): Promise<void> {
  await staleTables();
  await chart();
  memoryPerByte();
  wholeJob();
  await serverMemory();
}

if (process.argv[1] && /hostile\.ts$/.test(process.argv[1])) void benchHostile();
