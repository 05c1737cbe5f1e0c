/**
 * `dewmark report` print options without a browser: the `@page` rules the report carries for A4
 * and Letter (paper by ISO 216 and 8.5 × 11 in; running header and page numbers in the page-margin
 * boxes), the title escaped for CSS, and every way `--pdf` can fail before or while printing —
 * each an exit 2 with a message saying what to do. Printing in a real Chromium is in
 * test/e2e/report-print.test.ts. The note is set in an invented building.
 */
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cssString } from '../src/commands/report';
import { findChromium } from '../src/commands/reportPdf';
import { runCli as dewmark } from './lib/runCli';

const NOTE = '# Fernhill Pool — "hall" </style> AHU\n\n```air\nstate HALL: db=29C rh=60%\n```\n';

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'dewmark-report-pdf-'));
  writeFileSync(join(dir, 'pool.md'), NOTE);
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('the print stylesheet', () => {
  it('sets the paper, margins, running header and page numbers for --page a4 and letter', async () => {
    for (const [page, size] of [
      ['a4', '210mm 297mm'],
      ['letter', '215.9mm 279.4mm'],
    ] as const) {
      expect((await dewmark(['report', 'pool.md', '--page', page, '-o', `${page}.html`], dir)).code).toBe(0);
      const html = readFileSync(join(dir, `${page}.html`), 'utf8');
      expect(html).toContain(`@page{size:${size};margin:18mm 15mm 16mm 15mm;`);
      expect(html).toContain('@bottom-right{content:"Page " counter(page) " of " counter(pages);');
      expect(html).toMatch(/@top-left\{content:"Fernhill Pool — \\22 hall\\22 {2}\\3c \/style\\3e {2}AHU";/);
    }
    // Without --page the printer's paper is used: margins but no size.
    expect((await dewmark(['report', 'pool.md', '-o', 'any.html'], dir)).code).toBe(0);
    const any = readFileSync(join(dir, 'any.html'), 'utf8');
    expect(any).toContain('@page{margin:18mm 15mm 16mm 15mm;');
    // The title never closes the style element early: the first </style> comes after the page rules.
    expect(any.indexOf('</style>')).toBeGreaterThan(any.indexOf('@bottom-right{'));
    expect(any.indexOf('@bottom-right{')).toBeGreaterThan(0);
  });

  it('escapes quotes, backslashes, angle brackets and controls in a CSS string', () => {
    expect(cssString('a"b\\c<d>\ne')).toBe('"a\\22 b\\5c c\\3c d\\3e \\a e"');
  });
});

describe('--pdf without a usable browser: exit 2 and what to do', () => {
  it('names the missing browser and the ways to give one', async () => {
    const saved = { PATH: process.env.PATH, DEWMARK_CHROMIUM: process.env.DEWMARK_CHROMIUM };
    process.env.PATH = join(dir, 'no-such-bin');
    delete process.env.DEWMARK_CHROMIUM;
    try {
      const r = await dewmark(['report', 'pool.md', '--pdf', '-o', 'none.pdf'], dir);
      expect(r.code).toBe(2);
      expect(r.err).toContain('--pdf prints the report with a headless Chromium or Chrome, and none was found');
      expect(r.err).toContain('--chromium PATH or DEWMARK_CHROMIUM=PATH');
      expect(existsSync(join(dir, 'none.pdf'))).toBe(false);
    } finally {
      process.env.PATH = saved.PATH;
      if (saved.DEWMARK_CHROMIUM === undefined) delete process.env.DEWMARK_CHROMIUM;
      else process.env.DEWMARK_CHROMIUM = saved.DEWMARK_CHROMIUM;
    }
  });

  it('refuses a --chromium or DEWMARK_CHROMIUM that is not a program', async () => {
    const r = await dewmark(['report', 'pool.md', '--pdf', '--chromium', 'pool.md', '-o', 'x.pdf'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toContain("--chromium 'pool.md' is not an executable file");
    expect(findChromium(undefined, { DEWMARK_CHROMIUM: join(dir, 'nothing') })).toEqual({
      ok: false,
      message:
        `DEWMARK_CHROMIUM='${join(dir, 'nothing')}' is not an executable ` +
        `file; set it to the path of a Chromium or Chrome program, or unset it`,
    });
  });

  it('finds a browser on PATH by its usual names, in order', () => {
    const bin = mkdtempSync(join(tmpdir(), 'dewmark-bin-'));
    try {
      for (const name of ['google-chrome', 'chromium-browser']) {
        writeFileSync(join(bin, name), '#!/bin/sh\nexit 0\n');
        chmodSync(join(bin, name), 0o755);
      }
      expect(findChromium(undefined, { PATH: bin })).toEqual({ ok: true, path: join(bin, 'chromium-browser') });
    } finally {
      rmSync(bin, { recursive: true, force: true });
    }
  });

  it('reports a browser that fails to print, with its last error line, and writes nothing', async () => {
    const fake = join(dir, 'fake-chromium');
    writeFileSync(fake, '#!/bin/sh\necho "cannot open display" >&2\nexit 3\n');
    chmodSync(fake, 0o755);
    const r = await dewmark(['report', 'pool.md', '--pdf', '--chromium', fake, '-o', 'failed.pdf'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`'${fake}' did not print a PDF (exit 3): cannot open display`);
    expect(existsSync(join(dir, 'failed.pdf'))).toBe(false);
  });

  it('rejects an unknown paper and --chromium without --pdf', async () => {
    const a5 = await dewmark(['report', 'pool.md', '--page', 'a5', '-o', 'x.html'], dir);
    expect(a5.code).toBe(2);
    expect(a5.err).toContain("--page must be a4 or letter, not 'a5'");
    const lone = await dewmark(['report', 'pool.md', '--chromium', '/usr/bin/true', '-o', 'x.html'], dir);
    expect(lone.code).toBe(2);
    expect(lone.err).toContain('--chromium names the browser that prints --pdf');
  });
});
