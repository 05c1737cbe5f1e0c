/**
 * The report in print, in headless Chromium (playwright-core): every note in examples/ (an
 * invented building) and a deliberately wide note are laid out at the content width of an A4 and
 * a Letter page under the print stylesheet, and no table, figure, image, code block or cell may
 * reach past the page box or clip its content (element boxes measured in the browser against the
 * page's content width). Then each is printed to PDF at its paper size, and `dewmark report --pdf`
 * prints through the same Chromium; the PDFs' page boxes are checked and kept in
 * test-artifacts/report-print/. Under CI=true a missing Chromium or playwright-core fails the
 * suite; elsewhere it is skipped with a message.
 *
 * Paper sizes: ISO 216 (A4 210 × 297 mm) and ANSI/ASME Y14.1 (Letter 8.5 × 11 in); 1 in = 25.4 mm
 * = 72 pt = 96 CSS px (CSS Values and Units Level 3, absolute lengths).
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PAGE_MARGIN_MM, PAPER_MM, type PageSize } from '../../cli/src/commands/report';
import { runCli as dewmark } from '../../cli/test/lib/runCli';
import { CHROMIUM_ARGS, loadPlaywright } from './lib/codeServer';
import { artifactsDir, REPO_ROOT, requireTool, skipWithout } from './lib/tools';

const PX_PER_MM = 96 / 25.4;
const PT_PER_MM = 72 / 25.4;

/** The width of a page's content box in CSS px: the paper less the left and right margins. */
function contentWidthPx(page: PageSize): number {
  return (PAPER_MM[page][0] - PAGE_MARGIN_MM.left - PAGE_MARGIN_MM.right) * PX_PER_MM;
}

/** A note made to be too wide: many columns, long words, a long URL, a long statement line. */
const WIDE = `# Thornbury Depot — plant room schedule with a deliberately wide table

| Unit | Location | Outdoor air | Return air | Supply air | \
Coil | Heater | Humidifier | Fan | Filter | Damper | Remarks |
|---|---|---|---|---|---|---|---|---|---|---|---|
| AHU-1 | Roof plant room north | 32 °C db / 22 °C wb | 24 °C / 50 % | 13 °C / 92 \
% | chilled water 6/12 °C | LTHW 70/50 °C | none | EC plenum fan | ePM1 60 % | \
modulating | Supercalifragilisticexpialidocious-long-unbroken-identifier-0123456789 |

See https://example.com/a/very/long/path/that/does/not/break/naturally/because/it/has/no/spaces/at/all/in/it.html \
and [the schedule](https://example.com/another/very/long/address/for/the/printed/url/after/the/link).

\`\`\`air
state OUTDOOR_DESIGN_SUMMER_ROOF_INTAKE_NORTH: db=32C wb=22C    # outdoor design for \
the roof intake on the north side of the depot, taken from the project's climate basis
state RETURN_FROM_THE_MAINTENANCE_WORKSHOP_HALL: db=24C rh=50% w=9.3g/kg
mix MIXED_AIR_AT_THE_COIL_FACE: OUTDOOR_DESIGN_SUMMER_ROOF_INTAKE_NORTH \
30% + RETURN_FROM_THE_MAINTENANCE_WORKSHOP_HALL 70%
state OFF_COIL_LEAVING_THE_CHILLED_WATER_COIL: db=12C rh=95%
process CHILLED_WATER_COIL_ONE: MIXED_AIR_AT_THE_COIL_FACE -> \
OFF_COIL_LEAVING_THE_CHILLED_WATER_COIL q=4.5m3/s q_total=80kW shr=0.70 water=30kg/h
\`\`\`

The workshop is held at \`state WORKSHOP_WINTER_CONDITION_FOR_THE_PAINT_BOOTH_AREA: db=20C rh=40%\` in winter.
`;

interface Box {
  what: string;
  left: number;
  right: number;
  scroll: number;
  client: number;
}

interface Measure {
  width: number;
  documentWidth: number;
  counts: { tables: number; figures: number; pre: number; cells: number };
  outside: Box[];
  clipped: Box[];
}

/** Measured in the page: every table, figure, image, code block and cell against the content width. */
const MEASURE = `(() => {
  const width = document.documentElement.clientWidth;
  const name = (el) => el.tagName.toLowerCase() + (el.id ? '#' + el.id : '') + (el.className && typeof el.className \
=== 'string' ? '.' + el.className.split(' ').join('.') : '') + ' ' + (el.textContent || '').trim().slice(0, 40);
  const outside = [];
  const clipped = [];
  const boxes = [...document.querySelectorAll('table, figure, img, pre, \
.dm-results, .caution, th, td, main svg:not(svg svg), p, li, h1, h2, h3')];
  for (const el of boxes) {
    const r = el.getBoundingClientRect();
    if (r.width === 0 && r.height === 0) continue;
    const box = { what: name(el), left: r.left, right: r.right,\
 scroll: el.scrollWidth || 0, client: el.clientWidth || 0 };
    if (r.left < -0.5 || r.right > width + 0.5) outside.push(box);
    if (!(el instanceof SVGElement) && el.tagName !== 'IMG' && el.scrollWidth > el.clientWidth + 1) clipped.push(box);
  }
  return {
    width,
    documentWidth: document.documentElement.scrollWidth,
    counts: {
      tables: document.querySelectorAll('table').length,
      figures: document.querySelectorAll('figure, img, main svg:not(svg svg)').length,
      pre: document.querySelectorAll('pre').length,
      cells: document.querySelectorAll('th, td').length,
    },
    outside,
    clipped,
  };
})()`;

/** The page boxes of a PDF (`/MediaBox [0 0 w h]` of each page), in pt. */
function mediaBoxes(pdf: Buffer): { w: number; h: number }[] {
  const text = pdf.toString('latin1');
  return [...text.matchAll(/\/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]/g)].map((m) => ({
    w: Number(m[1]),
    h: Number(m[2]),
  }));
}

interface PrintPage {
  goto(url: string): Promise<unknown>;
  emulateMedia(options: { media: 'print' | 'screen' }): Promise<void>;
  evaluate<T>(expression: string): Promise<T>;
  pdf(options: { path: string; preferCSSPageSize: boolean; printBackground?: boolean }): Promise<Buffer>;
}
interface PrintBrowser {
  newContext(options: { viewport: { width: number; height: number } }): Promise<{
    newPage(): Promise<PrintPage>;
    close(): Promise<void>;
  }>;
  close(): Promise<void>;
}

const EXAMPLES = readdirSync(join(REPO_ROOT, 'examples'))
  .filter((f) => /\.md$/.test(f))
  .sort();

describe.skipIf(skipWithout('chromium', 'playwright-core'))('the report in print (headless Chromium)', () => {
  let browser: PrintBrowser | null = null;
  let chromiumPath = '';
  let dir = '';
  const out = artifactsDir('report-print');

  beforeAll(async () => {
    chromiumPath = requireTool('chromium').path;
    requireTool('playwright-core');
    browser = (await loadPlaywright().chromium.launch({
      executablePath: chromiumPath,
      headless: true,
      args: [...CHROMIUM_ARGS],
      timeout: 60_000,
    })) as unknown as PrintBrowser;
    mkdirSync(out, { recursive: true });
    dir = mkdtempSync(join(tmpdir(), 'dewmark-print-'));
    for (const f of EXAMPLES) writeFileSync(join(dir, f), readFileSync(join(REPO_ROOT, 'examples', f)));
    writeFileSync(join(dir, 'wide.md'), WIDE);
  });
  afterAll(async () => {
    await browser?.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('has notes to print', () => {
    expect(EXAMPLES.length).toBeGreaterThanOrEqual(2);
  });

  const cases = [...EXAMPLES, 'wide.md', 'since'].flatMap((note) =>
    (['a4', 'letter'] as const).map((page) => ({ note, page })),
  );
  it.each(cases)('$note on $page: nothing reaches past the page box or is clipped', async ({ note, page }) => {
    const html = `${note.replace(/\.md$/, '')}-${page}.html`;
    // 'since': the first example with a "Changes since HEAD" section (a scratch repository, the
    // first statement's dry-bulb raised by one kelvin in the working tree).
    const args = note === 'since' ? [EXAMPLES[0]!, '--since', 'HEAD'] : [note];
    if (note === 'since' && page === 'a4') {
      const g = (a: string[]) =>
        execFileSync('git', ['-c', 'user.name=Dewmark Test', '-c', 'user.email=test@example.invalid', ...a], {
          cwd: dir,
        });
      g(['init', '-q', '-b', 'main']);
      g(['add', EXAMPLES[0]!]);
      g(['commit', '-q', '-m', 'example']);
      const text = readFileSync(join(dir, EXAMPLES[0]!), 'utf8');
      const raised = text.replace(
        /(state \w+: db=)(\d+)C/,
        (_m, head: string, db: string) => `${head}${Number(db) + 1}C`,
      );
      expect(raised).not.toBe(text);
      writeFileSync(join(dir, EXAMPLES[0]!), raised);
    }
    const r = await dewmark(['report', ...args, '--page', page, '-o', html], dir);
    if (note === 'since') expect(readFileSync(join(dir, html), 'utf8')).toContain('<table id="changes"');
    expect(r.code, r.err).toBeLessThanOrEqual(1);
    const width = contentWidthPx(page);
    const ctx = await browser!.newContext({ viewport: { width: Math.floor(width), height: 1100 } });
    const p = await ctx.newPage();
    await p.goto(pathToFileURL(join(dir, html)).href);
    await p.emulateMedia({ media: 'print' });
    const m = await p.evaluate<Measure>(MEASURE);
    // The layout width is the page's content width (to the whole px below it).
    expect(m.width).toBe(Math.floor(width));
    expect(m.counts.tables).toBeGreaterThanOrEqual(4);
    expect(m.counts.figures).toBeGreaterThanOrEqual(1);
    expect(m.counts.cells).toBeGreaterThan(40);
    expect(m.outside, JSON.stringify(m.outside.slice(0, 5))).toEqual([]);
    expect(m.clipped, JSON.stringify(m.clipped.slice(0, 5))).toEqual([]);
    expect(m.documentWidth).toBeLessThanOrEqual(m.width);
    // Printed at its paper size: every page box is A4 or Letter (±1 pt).
    const pdf = await p.pdf({ path: join(out, html.replace(/\.html$/, '.pdf')), preferCSSPageSize: true });
    const boxes = mediaBoxes(pdf);
    expect(boxes.length).toBeGreaterThanOrEqual(note === 'wide.md' ? 2 : 3);
    for (const b of boxes) {
      expect(Math.abs(b.w - PAPER_MM[page][0] * PT_PER_MM)).toBeLessThan(1);
      expect(Math.abs(b.h - PAPER_MM[page][1] * PT_PER_MM)).toBeLessThan(1);
    }
    await ctx.close();
  });

  it.each(['a4', 'letter'] as const)('dewmark report --pdf --page %s prints through Chromium', async (page) => {
    const note = EXAMPLES[0]!;
    const pdfName = `cli-${page}.pdf`;
    const r = await dewmark(['report', note, '--pdf', '--page', page, '--chromium', chromiumPath, '-o', pdfName], dir);
    expect(r.code, r.err).toBeLessThanOrEqual(1);
    expect(r.err).toContain(`wrote ${pdfName}`);
    const pdf = readFileSync(join(dir, pdfName));
    writeFileSync(join(out, pdfName), pdf);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const boxes = mediaBoxes(pdf);
    expect(boxes.length).toBeGreaterThanOrEqual(3);
    for (const b of boxes) {
      expect(Math.abs(b.w - PAPER_MM[page][0] * PT_PER_MM)).toBeLessThan(1);
      expect(Math.abs(b.h - PAPER_MM[page][1] * PT_PER_MM)).toBeLessThan(1);
    }
  });
});
