/**
 * Benchmark of the notation: parse + evaluate one 10 000-line note with 2 000 statements (goal
 * ≤ 20 ms median), and `dewmark check` as a real process on 1 000 generated notes of 200 statements
 * each (goal ≤ 2 s). Runnable alone: `node --import tsx bench/notes.ts`.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { analyzeNote } from '../shared-core/src/evaluate';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

/** A realistic note: headings, prose, tables and `air` fences; `statements` statements in `lines` lines. */
export function generateNote(statements: number, lines: number, seed = 1): string {
  let x = seed >>> 0 || 1;
  const rnd = () => {
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    return (x >>> 0) / 4294967296;
  };
  const out: string[] = ['# Generated plant note', '', 'Prose that the reader skips.', '', '```air', 'site: elev=1200m', '```', ''];
  let made = 1;
  let block = 0;
  while (made < statements) {
    block++;
    out.push(`## Block ${block}`, '', `Paragraph ${block} with \`inline code\` that is not a statement and a table:`, '', '| a | b |', '|---|---|', '| 1 | 2 |', '');
    out.push('```air');
    const n = Math.min(10, statements - made);
    const names: string[] = [];
    for (let i = 0; i < n; i++) {
      const id = `S${block}_${i}`;
      const kind = i % 5;
      if (kind === 3 && names.length >= 2) {
        out.push(`mix M${block}_${i}: ${names[0]} 30% + ${names[1]} 70%   # mix`);
      } else if (kind === 4 && names.length >= 2) {
        out.push(`process P${block}_${i}: ${names[0]} -> ${names[1]} m=2.5kg/s q_total=10kW`);
      } else {
        const db = (10 + rnd() * 25).toFixed(1);
        const rh = Math.round(20 + rnd() * 60);
        out.push(`state ${id}: db=${db}C rh=${rh}% w=9.3g/kg   # claim`);
        names.push(id);
      }
      made++;
    }
    out.push('```', '');
  }
  while (out.length < lines) out.push(out.length % 7 === 0 ? '' : 'More prose to reach the target length of the note, as a long calculation has.');
  return out.slice(0, Math.max(lines, out.length)).join('\n');
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

/** Runs both benchmarks and prints the figures. */
export async function benchNotes(): Promise<void> {
  // 1. One large note in-process.
  const big = generateNote(2000, 10_000);
  const lineCount = big.split('\n').length;
  const check = analyzeNote(big);
  const statementCount = check.parsed.statements.length;
  for (let i = 0; i < 5; i++) analyzeNote(big); // warm-up
  const times: number[] = [];
  for (let i = 0; i < 25; i++) {
    const t0 = performance.now();
    analyzeNote(big);
    times.push(performance.now() - t0);
  }
  const med = median(times);
  console.log(`parse+evaluate: ${lineCount} lines, ${statementCount} statements, ${check.items.length} results, ${check.diagnostics.length} diagnostics`);
  console.log(`  median ${med.toFixed(2)} ms, min ${Math.min(...times).toFixed(2)} ms, max ${Math.max(...times).toFixed(2)} ms (goal ≤ 20 ms median) ${med <= 20 ? 'OK' : 'OVER GOAL'}`);

  // 2. `dewmark check` as a real process on 1000 notes of 200 statements.
  const cli = join(root, 'dist', 'cli.js');
  if (!existsSync(cli)) {
    const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
    if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  }
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-bench-'));
  try {
    for (let i = 0; i < 1000; i++) writeFileSync(join(dir, `note-${String(i).padStart(4, '0')}.md`), generateNote(200, 1000, i + 1));
    const runs: number[] = [];
    let summary = '';
    for (let i = 0; i < 3; i++) {
      const t0 = performance.now();
      const r = spawnSync(process.execPath, [join(root, 'bin', 'dewmark.js'), 'check', dir], { encoding: 'utf8', maxBuffer: 1 << 28 });
      runs.push(performance.now() - t0);
      if (r.status === 2) throw new Error(`dewmark check failed: ${r.stderr}`);
      summary = r.stdout.trim().split('\n').at(-1) ?? '';
    }
    const m = median(runs);
    console.log(`dewmark check: 1000 notes × 200 statements (${summary})`);
    console.log(`  median ${(m / 1000).toFixed(2)} s over ${runs.length} runs (goal ≤ 2 s) ${m <= 2000 ? 'OK' : 'OVER GOAL'}`);
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
