/**
 * Benchmark of the notation: parse + evaluate one 10 000-line note with 2 000 statements (goal
 * ≤ 20 ms median), and `dewmark check` as a real process on 1 000 generated notes of 200 statements
 * each (goal ≤ 2 s). Every figure is printed with its goal, whether it is met, and the load average
 * of the machine at that moment. Runnable alone: `node --import tsx bench/notes.ts`.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { analyzeNote, createAnalyzer } from '../shared-core/src/analyze';
import { enthalpy, humRatioFromRelHum, stdAtmPressure } from '../shared-core/src/physics';
import { goalRow, infoRow, median, timeRuns } from './goals';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/**
 * A realistic note: headings, prose, tables and `air` fences, `statements` statements in about
 * `lines` lines. States carry a humidity-ratio claim worked out with the engine (so it passes, as
 * most figures in a maintained note do) except every `staleEvery`-th one, which is stale; per
 * block a mix, an off-coil state and a reheat process with a worked-out heat-rate claim.
 */
export function generateNote(statements: number, lines: number, seed = 1, staleEvery = 25): string {
  let x = seed >>> 0 || 1;
  const rnd = () => {
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    return (x >>> 0) / 4294967296;
  };
  const p = stdAtmPressure(1200);
  const wCoil = humRatioFromRelHum(12, 0.9, p);
  const out: string[] = [
    '# Generated plant note',
    '',
    'Prose that the reader skips.',
    '',
    '```air',
    'site: elev=1200m',
    '```',
    '',
  ];
  let made = 1;
  let block = 0;
  let states = 0;
  while (made < statements) {
    block++;
    out.push(
      `## Block ${block}`,
      '',
      `Paragraph ${block} with \`inline code\` that is not a statement, and a table:`,
      '',
      '| a | b |',
      '|---|---|',
      '| 1 | 2 |',
      '',
    );
    out.push('```air');
    const n = Math.min(10, statements - made);
    const names: string[] = [];
    for (let i = 0; i < n; i++) {
      if (i === 3 && names.length >= 2) {
        out.push(`mix M${block}: ${names[0]} 30% + ${names[1]} 70%   # mixed air`);
      } else if (i === 4) {
        out.push(`state C${block}: db=12C rh=90%   # off-coil`);
      } else if (i === 5) {
        out.push(`state H${block}: db=18C w=${(wCoil * 1000).toFixed(3)}g/kg   # after reheat`);
      } else if (i === 6) {
        const q = (2.5 * (enthalpy(18, wCoil) - enthalpy(12, wCoil))) / 1000;
        out.push(`process P${block}: C${block} -> H${block} m=2.5kg/s q_total=${q.toFixed(1)}kW`);
      } else {
        const id = `S${block}_${i}`;
        const db = Math.round((10 + rnd() * 25) * 10) / 10;
        const rh = Math.round(20 + rnd() * 60);
        states++;
        const w = humRatioFromRelHum(db, rh / 100, p) * 1000;
        const claim = states % staleEvery === 0 ? w + 0.5 : w;
        out.push(`state ${id}: db=${db}C rh=${rh}% w=${claim.toFixed(2)}g/kg   # claim`);
        names.push(id);
      }
      made++;
    }
    out.push('```', '');
  }
  while (out.length < lines)
    out.push(
      out.length % 7 === 0 ? '' : 'More prose to reach the target length of the note, as a long calculation has.',
    );
  return out.join('\n');
}

/** Runs `dewmark check` on `dir` `runs` times; wall-clock ms of each run and the summary line. */
function timeCheck(dir: string, runs: number, env: NodeJS.ProcessEnv): { ms: number[]; summary: string } {
  const ms: number[] = [];
  let summary = '';
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [join(root, 'bin', 'dewmark.js'), 'check', dir], {
      encoding: 'utf8',
      maxBuffer: 1 << 28,
      env,
    });
    ms.push(performance.now() - t0);
    if (r.status === 2 || r.status === null) throw new Error(`dewmark check failed: ${r.stderr}`);
    summary = r.stdout.trim().split('\n').at(-1) ?? '';
  }
  return { ms, summary };
}

/** Runs both benchmarks and prints the figures, each with its goal and the load average. */
export async function benchNotes(): Promise<void> {
  // 1. One large note in-process, analysed from scratch each time (as the CLI does).
  const big = generateNote(2000, 10_000);
  const lineCount = big.split('\n').length;
  const check = analyzeNote(big);
  const statementCount = check.parsed.statements.length;
  console.log(
    `parse+evaluate: ${lineCount} lines, ${statementCount} ` +
      `statements, ${check.items.length} results, ${check.diagnostics.length} diagnostics`,
  );
  // Warm-up first: the editor and the CLI run warmed code too.
  const full = timeRuns(() => analyzeNote(big), 31, 15);
  console.log(goalRow('parse+evaluate from scratch (median of 31)', median(full.wall), 'ms', 20));
  console.log(infoRow('  min', Math.min(...full.wall), 'ms'));
  console.log(infoRow('  max', Math.max(...full.wall), 'ms'));
  // CPU time of this process per run: less sensitive than wall time to other work on the machine
  // (it still includes the garbage collector's helper threads).
  console.log(infoRow('  CPU time per run (median)', median(full.cpu), 'ms'));
  // What the language server runs per edit: the document's analyzer after a one-digit edit in a
  // state line in the middle (the result is the same as a fresh analysis; see createAnalyzer).
  const target = big.indexOf('db=', big.length >> 1) + 4;
  const analyzer = createAnalyzer();
  analyzer.analyze(big);
  let k = 0;
  const edited = () => `${big.slice(0, target)}${k++ % 10}${big.slice(target + 1)}`;
  const inc = timeRuns(() => analyzer.analyze(edited()), 31, 15);
  console.log(infoRow('  incremental, one digit replaced (createAnalyzer)', median(inc.wall), 'ms'));
  // Worst case: every claim stale, so every state carries a warning with its message.
  const stale = generateNote(2000, 10_000, 1, 1);
  const staleRuns = timeRuns(() => analyzeNote(stale), 15, 3);
  console.log(
    infoRow(
      `  every claim stale (${analyzeNote(stale).diagnostics.length} diagnostics), median`,
      median(staleRuns.wall),
      'ms',
    ),
  );

  // 2. `dewmark check` as a real process on 1000 notes of 200 statements.
  const cli = join(root, 'dist', 'cli.js');
  if (!existsSync(cli)) {
    const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
    if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  }
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-bench-'));
  try {
    for (let i = 0; i < 1000; i++)
      writeFileSync(join(dir, `note-${String(i).padStart(4, '0')}.md`), generateNote(200, 1000, i + 1));
    const runs = timeCheck(dir, 5, process.env);
    console.log(`dewmark check: 1000 notes × 200 statements (${runs.summary})`);
    console.log(goalRow('dewmark check, as shipped (median of 5)', median(runs.ms) / 1000, 's', 2));
    console.log(infoRow('  min', Math.min(...runs.ms) / 1000, 's'));
    // The same in one thread (DEWMARK_WORKERS=0), to show what the worker threads add or cost here.
    const single = timeCheck(dir, 3, { ...process.env, DEWMARK_WORKERS: '0' });
    console.log(infoRow('  one thread (DEWMARK_WORKERS=0), median of 3', median(single.ms) / 1000, 's'));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  benchNotes().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
