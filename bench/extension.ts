/**
 * Extension benchmark: the packaged .vsix size (goal ≤ 1 MB) and the activation time (goal
 * ≤ 50 ms), printed.
 *
 * Activation is measured two ways:
 * - in a real VS Code (code-server 4.139, when scripts/setup-e2e-tools.sh installed it): the
 *   extension writes a timing marker when the env var DEWMARK_ACTIVATION_MARKER names a file —
 *   `activate` = time inside activate() (performance.now() at entry and return), `load → activate
 *   end` = from the bundle's first statement to the end of activate() (this includes whatever the
 *   extension host does between loading the module and calling activate), `ready` = from
 *   activate() to the language server answering initialize. The goal applies to `activate`.
 * - in plain Node: the time to require dist/client.js (module evaluation of the bundle) with a
 *   stand-in `vscode` module, median of several fresh processes. No VS Code needed.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const SIZE_GOAL = 1024 * 1024;
const ACTIVATE_GOAL_MS = 50;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

const kib = (n: number) => `${(n / 1024).toFixed(1)} KiB`;

/** Requires dist/client.js in a fresh Node with a stand-in `vscode` module; returns ms. */
function requireTimeMs(): number {
  const script = `
    const Module = require('module');
    const stub = () => new Proxy(function () {}, {
      get: (t, k) => (k === 'prototype' ? {} : stub()),
      construct: () => ({}),
      apply: () => undefined,
    });
    const load = Module._load;
    Module._load = function (request, ...rest) {
      return request === 'vscode' ? stub() : load.call(this, request, ...rest);
    };
    const t = performance.now();
    require(${JSON.stringify(join(root, 'dist', 'client.js'))});
    process.stdout.write(String(performance.now() - t));`;
  const r = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`requiring dist/client.js failed: ${r.stderr}`);
  return Number(r.stdout);
}

/** Activation timings in code-server, or the reason they could not be taken. */
async function codeServerTimings(
  vsix: string,
  runs: number,
): Promise<{ activate: number[]; sinceLoad: number[]; ready: number[] } | string> {
  const { missingTools } = await import('../test/e2e/lib/tools');
  const missing = missingTools('node24', 'code-server', 'chromium', 'playwright-core');
  if (missing) return `not measured in code-server: ${missing}`;
  const { startSession, pollUntil } = await import('../test/e2e/lib/codeServer');
  const { FIXTURE_NOTE } = await import('../test/fixtures/e2e/expected');
  const note = readFileSync(join(root, 'test', 'fixtures', 'e2e', FIXTURE_NOTE), 'utf8');
  const out = { activate: [] as number[], sinceLoad: [] as number[], ready: [] as number[] };
  for (let i = 0; i < runs; i++) {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-bench-'));
    const marker = join(dir, 'activation.json');
    const session = await startSession(
      { extensions: [vsix], files: { [FIXTURE_NOTE]: note }, env: { DEWMARK_ACTIVATION_MARKER: marker } },
      { name: `bench-extension-${i}` },
    );
    try {
      await session.workbench.openFile(FIXTURE_NOTE);
      const t = await pollUntil(
        'the activation marker with readyMs',
        () => {
          if (!existsSync(marker)) return undefined;
          const m = JSON.parse(readFileSync(marker, 'utf8')) as {
            activateMs: number;
            sinceLoadMs: number;
            readyMs?: number;
            error?: string;
          };
          if (m.error) throw new Error(`the server did not start: ${m.error}`);
          return m.readyMs !== undefined ? m : undefined;
        },
        { timeoutMs: 60_000 },
      );
      out.activate.push(t.activateMs);
      out.sinceLoad.push(t.sinceLoadMs);
      out.ready.push(t.readyMs!);
    } finally {
      await session.close();
      rmSync(dir, { recursive: true, force: true });
    }
  }
  return out;
}

/** Prints the .vsix size and the activation times against their goals. */
export async function benchExtension(): Promise<void> {
  const work = mkdtempSync(join(tmpdir(), 'dewmark-vsix-bench-'));
  try {
    const vsix = join(work, 'dewmark-bench.vsix');
    const r = spawnSync(process.execPath, [join(root, 'client', 'package-vsix.mjs'), '--no-build', '--out', vsix], {
      cwd: root,
      encoding: 'utf8',
    });
    if (r.status !== 0) throw new Error(`packaging failed:\n${r.stdout}\n${r.stderr}`);
    const size = statSync(vsix).size;
    console.log(
      `vsix size            ${kib(size)}  (goal ≤ ${kib(SIZE_GOAL)}: ${size <= SIZE_GOAL ? 'met' : 'NOT met'})`,
    );
    console.log(`  dist/client.js     ${kib(statSync(join(root, 'dist', 'client.js')).size)} unpacked`);
    console.log(`  dist/server.js     ${kib(statSync(join(root, 'dist', 'server.js')).size)} unpacked`);

    console.log(
      `machine load         ${loadavg()
        .map((x) => x.toFixed(1))
        .join(' / ')} (1/5/15-min load average; timings below are noisy when it exceeds the 2 cores)`,
    );
    const loads = Array.from({ length: 7 }, requireTimeMs);
    console.log(
      `require client.js    median ${median(loads).toFixed(1)} ms over ${loads.length} ` +
        `fresh Node ${process.version} processes (stand-in vscode module)`,
    );

    const runs = Math.max(1, Number(process.env.DEWMARK_BENCH_RUNS ?? 3));
    const t = await codeServerTimings(vsix, runs);
    if (typeof t === 'string') {
      console.log(`activation           ${t}`);
      return;
    }
    const a = median(t.activate);
    const each = (xs: number[]) => xs.map((x) => x.toFixed(1)).join(', ');
    console.log(
      `activate()           median ${a.toFixed(1)} ms over ${runs} code-server run(s) ` +
        `[${each(t.activate)}]  (goal ≤ ${ACTIVATE_GOAL_MS} ms: ${a <= ACTIVATE_GOAL_MS ? 'met' : 'NOT met'})`,
    );
    console.log(
      `load → activate end  median ${median(t.sinceLoad).toFixed(1)} ms (from the bundle's ` +
        `first statement; includes the extension host's own work before it calls activate)`,
    );
    console.log(
      `server ready         median ${median(t.ready).toFixed(1)} ms after activate() (process start + initialize)`,
    );
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}
