/**
 * `dewmark report --pdf`: the report printed to PDF by a headless Chromium or Chrome that is
 * already installed (dewmark ships no browser). The browser is found from `--chromium PATH`, else
 * the `DEWMARK_CHROMIUM` environment variable, else the first of {@link BROWSER_NAMES} on `PATH`;
 * when none is found the command says so and how to fix it (exit 2). The report's HTML is written
 * to a fresh temporary folder and printed with `--print-to-pdf` (the browser started with an
 * argument array, never through a shell, with its own throw-away profile, no extensions, no
 * network services); the paper size and margins are the report's own `@page` rules.
 */
import { accessSync, constants, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { delimiter, join } from 'node:path';
import { childProcess, os } from '../builtins';
import { pathToFileURL } from 'node:url';

/** Names of a Chromium-family browser looked for on `PATH`, in order. */
export const BROWSER_NAMES = ['chromium', 'chromium-browser', 'google-chrome', 'google-chrome-stable', 'chrome'];

/** The environment variable naming the browser (the editor tests read the same one). */
export const CHROMIUM_ENV = 'DEWMARK_CHROMIUM';

/** How long one print may take before the browser is stopped. */
export const PRINT_TIMEOUT_MS = 120_000;

function isExecutable(path: string): boolean {
  try {
    if (!statSync(path).isFile()) return false;
    accessSync(path, constants.X_OK);
    return true;
  } catch {
    return false;
  }
}

/** The browser to print with, or a message saying why there is none and how to give one. */
export function findChromium(
  option: string | undefined,
  env: NodeJS.ProcessEnv = process.env,
): { ok: true; path: string } | { ok: false; message: string } {
  if (option !== undefined) {
    if (isExecutable(option)) return { ok: true, path: option };
    return {
      ok: false,
      message:
        `--chromium '${option}' is not an executable file; give the ` +
        `path of a Chromium or Chrome program (e.g. /usr/bin/chromium)`,
    };
  }
  const fromEnv = env[CHROMIUM_ENV];
  if (fromEnv) {
    if (isExecutable(fromEnv)) return { ok: true, path: fromEnv };
    return {
      ok: false,
      message:
        `${CHROMIUM_ENV}='${fromEnv}' is not an executable file; set ` +
        `it to the path of a Chromium or Chrome program, or unset it`,
    };
  }
  const dirs = (env.PATH ?? '').split(delimiter).filter(Boolean);
  for (const name of BROWSER_NAMES)
    for (const dir of dirs) {
      const p = join(dir, name);
      if (isExecutable(p)) return { ok: true, path: p };
    }
  return {
    ok: false,
    message:
      `--pdf prints the report with a headless Chromium or Chrome, and none ` +
      `was found (looked for ${BROWSER_NAMES.join(', ')} on PATH); install one ` +
      `(e.g. apt-get install chromium), or give its path with --chromium PATH ` +
      `or ${CHROMIUM_ENV}=PATH — or leave out --pdf and print the HTML report from any browser`,
  };
}

/** Prints `html` to PDF with the browser at `chromium`; the PDF's bytes, or why it failed. */
export async function printPdf(
  chromium: string,
  html: string,
  timeoutMs = PRINT_TIMEOUT_MS,
): Promise<{ ok: true; pdf: Buffer } | { ok: false; message: string }> {
  const dir = mkdtempSync(join(os().tmpdir(), 'dewmark-pdf-'));
  try {
    const page = join(dir, 'report.html');
    const out = join(dir, 'report.pdf');
    writeFileSync(page, html, 'utf8');
    const args = [
      '--headless',
      '--disable-gpu',
      '--no-first-run',
      '--no-default-browser-check',
      '--disable-extensions',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
      `--user-data-dir=${join(dir, 'profile')}`,
      '--no-pdf-header-footer',
      `--print-to-pdf=${out}`,
      // Chromium refuses to start as root with its sandbox; the page is our own, script-free file.
      ...(process.getuid?.() === 0 ? ['--no-sandbox'] : []),
      pathToFileURL(page).href,
    ];
    const run = await new Promise<{ code: number | null; stderr: string; timedOut: boolean; error?: string }>(
      (resolve) => {
        const child = childProcess().spawn(chromium, args, { stdio: ['ignore', 'ignore', 'pipe'], detached: true });
        let stderr = '';
        let timedOut = false;
        child.stderr?.on('data', (b: Buffer) => {
          if (stderr.length < 64 * 1024) stderr += b.toString('utf8');
        });
        const timer = setTimeout(() => {
          timedOut = true;
          try {
            if (child.pid) process.kill(-child.pid, 'SIGKILL');
          } catch {
            child.kill('SIGKILL');
          }
        }, timeoutMs);
        child.on('error', (err) => {
          clearTimeout(timer);
          resolve({ code: null, stderr, timedOut, error: err.message });
        });
        child.on('close', (code) => {
          clearTimeout(timer);
          resolve({ code, stderr, timedOut });
        });
      },
    );
    if (run.error) return { ok: false, message: `could not start '${chromium}': ${run.error}` };
    if (run.timedOut)
      return {
        ok: false,
        message: `'${chromium}' did not finish printing within ${timeoutMs / 1000} s; it was stopped`,
      };
    let pdf: Buffer;
    try {
      pdf = readFileSync(out);
    } catch {
      pdf = Buffer.alloc(0);
    }
    if (run.code !== 0 || pdf.subarray(0, 5).toString('latin1') !== '%PDF-') {
      const last = run.stderr
        .split('\n')
        .map((l) => l.trim())
        .filter((l) => l !== '' && !/dbus|Fontconfig/i.test(l))
        .slice(-1)[0];
      return {
        ok: false,
        message:
          `'${chromium}' did not print a PDF (exit ${run.code})${last ? `: ${last}` : ''}; ` +
          `check that it is a Chromium or Chrome program that runs headless`,
      };
    }
    return { ok: true, pdf };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
