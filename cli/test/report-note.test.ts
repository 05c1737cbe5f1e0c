/**
 * `dewmark report` renders the whole note: its Markdown through the preview's markdown-it set-up,
 * each air block followed by its results, each inline statement by its figures, every claim as
 * written → computed with its verdict in print, a statement's line comment as its description,
 * the title from the first heading, the header block (path, digest, date), the sign-off block
 * (blank, or filled from front matter) — and nothing from the note survives as markup or script.
 *
 * The notes are set in an invented building (Larchmoor Library). Computed figures are checked
 * against PsychroLib 1.1.1 as oracle.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli as dewmark } from './lib/runCli';

interface Psy {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromRelHum(t: number, rh: number, p: number): number;
  GetTWetBulbFromRelHum(t: number, rh: number, p: number): number;
}
const psy = createRequire(import.meta.url)('psychrolib') as Psy;
psy.SetUnitSystem(psy.SI);

/** A 1×1 PNG (the smallest valid image: signature, IHDR, IDAT, IEND). */
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);

const NOTE = `---
title: Front-matter title (not used: the note has a heading)
revision: B
prepared_by: R. Okafor
prepared_on: 2026-11-30
checked_by: "M. Lindqvist"
project: Larchmoor Library
---

# Larchmoor Library — reading room AHU check

Design basis for the **reading room** air handler. The plan is in ![plan of the room](img/plan.png)
and the section in ![section](img/missing.png).

| Item | Value |
|---|---|
| Occupancy | 60 people |

- return air from the stacks
- no return-fan heat

\`\`\`air
state OA: db=30C rh=40%          # outdoor summer design
state RA: db=24C rh=50% w=9.9g/kg  # reading room return
\`\`\`

The stacks are held at \`state ST: db=22C rh=45%\` all year.

Raw HTML stays text: <script>alert("x")</script> <img src=x onerror=alert(1)>
and [a bad link](javascript:alert(1)), ![remote](https://example.com/x.png).

## Notes

Closing words.
`;

let dir = '';
let html = '';
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'dewmark-report-note-'));
  writeFileSync(join(dir, 'reading-room.md'), NOTE);
  const img = join(dir, 'img');
  mkdirSync(img);
  writeFileSync(join(img, 'plan.png'), PNG);
  const r = await dewmark(['report', 'reading-room.md', '-o', 'review.html'], dir);
  expect(r.code).toBe(0); // a failed claim is a warning, not an error
  html = readFileSync(join(dir, 'review.html'), 'utf8');
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** The HTML of the note's body. */
function body(): string {
  return /<article class="note-body" id="note">([\s\S]*?)<\/article>/.exec(html)?.[1] ?? '';
}

describe('the report renders the whole note', () => {
  it('takes its title from the first heading, and has the path, the digest and the date in its header', () => {
    expect(html).toContain('<title>Larchmoor Library — reading room AHU check</title>');
    expect(html).toContain('<h1 id="title">Larchmoor Library — reading room AHU check</h1>');
    expect(html).toContain('<code id="note-path">reading-room.md</code>');
    const digest = createHash('sha256').update(NOTE, 'utf8').digest('hex');
    expect(html).toContain(`<code id="note-digest">${digest}</code>`);
    expect(html).toMatch(/<td id="report-date">\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d/);
    // Front-matter fields other than the sign-off are listed in the header.
    expect(html).toContain('<tr><th scope="row">project</th><td>Larchmoor Library</td></tr>');
  });

  it('renders headings, prose, tables and lists, in the note order', () => {
    const b = body();
    const order = [
      '<h1>Larchmoor Library — reading room AHU check</h1>',
      'Design basis for the <strong>reading room</strong> air handler.',
      '<td>Occupancy</td>',
      '<li>return air from the stacks</li>',
      '<code class="language-air">',
      'class="dm-results"',
      'The stacks are held at',
      '<h2>Notes</h2>',
      '<p>Closing words.</p>',
    ].map((x) => b.indexOf(x));
    for (const at of order) expect(at).toBeGreaterThanOrEqual(0);
    expect([...order].sort((x, y) => x - y)).toEqual(order);
    // The front matter is metadata, not text: no rule, no "prepared_by:" paragraph.
    expect(b).not.toContain('prepared_by');
    expect(b.trimStart().startsWith('<h1>')).toBe(true);
  });

  it('follows the air block with its results: figures, claims as written → computed, and line comments', () => {
    const results = /<div class="dm-results"[\s\S]*?<\/div>/.exec(body())![0];
    // PsychroLib 1.1.1 as oracle: w of 24 °C, 50 % at 101.325 kPa, shown at 2 decimals in g/kg.
    const w = (psy.GetHumRatioFromRelHum(24, 0.5, 101325) * 1000).toFixed(2);
    expect(w).not.toBe('9.90');
    expect(results).toContain(`<span class="dm-claim fail">w=9.9g/kg → ${w} g/kg ✗ outside ±0.05 g/kg</span>`);
    const wb = psy.GetTWetBulbFromRelHum(30, 0.4, 101325).toFixed(1);
    expect(results).toMatch(
      new RegExp(`<th scope="row" class="dm-name">OA</th><td class="num">30\\.0</td><td class="num">${wb}</td>`),
    );
    expect(results).toContain('<span class="dm-desc">outdoor summer design</span>');
    expect(results).toContain('<span class="dm-desc">reading room return</span>');
  });

  it('follows an inline statement with its figures', () => {
    // PsychroLib 1.1.1 as oracle: wet-bulb of 22 °C, 45 %.
    const wb = psy.GetTWetBulbFromRelHum(22, 0.45, 101325).toFixed(1);
    expect(body()).toContain(`<code>state ST: db=22C rh=45%</code> <span class="dm-inline">[→ ST: wb ${wb} °C · dp `);
  });

  it('includes an image beside the note as a data: URI, and marks one it could not include', () => {
    expect(body()).toContain(`<img src="data:image/png;base64,${PNG.toString('base64')}" alt="plan of the room">`);
    expect(body()).toContain(
      '[image not included: section — <code>img/missing.png</code>: no such file beside the note]',
    );
    expect(body()).toContain('<code>https://example.com/x.png</code>: not a file beside the note');
  });

  it('fills the sign-off from the front matter, leaving the signatures and what is not given blank', () => {
    const signoff = /<table class="signoff" id="signoff">[\s\S]*?<\/table>/.exec(html)![0];
    expect(signoff).toContain('<caption>Revision B — names and dates from the note’s front matter');
    expect(signoff).toContain('<tr><td>prepared by</td><td>R. Okafor</td><td></td><td>2026-11-30</td></tr>');
    expect(signoff).toContain('<tr><td>checked by</td><td>M. Lindqvist</td><td></td><td></td></tr>');
    expect(signoff).toContain('<tr><td>approved by (licensed engineer)</td><td></td><td></td><td></td></tr>');
  });

  it('lets no script or markup from the note through, and keeps the caution', () => {
    expect(html).not.toMatch(/<script|<iframe|<link\b|href="javascript:|<[^>]+\bon\w+=/i);
    expect(html).not.toMatch(/<img(?![^>]*src="data:image\/png)/);
    expect(body()).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;');
    // markdown-it's link check refuses the javascript: link: it stays text.
    expect(body()).toContain('[a bad link](javascript:alert(1))');
    expect(html).toMatch(/<p class="caution" id="caution" role="note"><strong>Caution.<\/strong> Design aid only\./);
    expect(html).toMatch(/<footer>[\s\S]*licensed professional engineer[\s\S]*<\/footer>/);
  });

  it('leaves the sign-off blank without front matter, and titles a note without a heading by its path', async () => {
    writeFileSync(join(dir, 'plain.md'), '```air\nstate A: db=20C rh=50%\n```\n');
    expect((await dewmark(['report', 'plain.md', '-o', 'plain.html'], dir)).code).toBe(0);
    const plain = readFileSync(join(dir, 'plain.html'), 'utf8');
    expect(plain).toContain('<title>plain.md</title>');
    expect(plain).toContain('<caption>Revision ______</caption>');
    expect(plain).toContain('<tr><td>prepared by</td><td></td><td></td><td></td></tr>');
  });

  it('draws one chart per heading section, each captioned by its heading; one section keeps one chart', async () => {
    // Invented demo data for the library's two design cases.
    const two = [
      '# Larchmoor Library — AHU-3',
      '## Summer',
      '```air\nstate OA: db=30C rh=40%\nstate RA: db=24C rh=50%\n```',
      '## Winter',
      '```air\nstate OA_W: db=-5C rh=80%\nstate RA_W: db=21C rh=35%\n```',
      '',
    ].join('\n\n');
    writeFileSync(join(dir, 'cases.md'), two);
    expect((await dewmark(['report', 'cases.md', '-o', 'cases.html'], dir)).code).toBe(0);
    const out = readFileSync(join(dir, 'cases.html'), 'utf8');
    const figures = [...out.matchAll(/<figure class="chart" id="chart-(\d+)"><figcaption>([^<]*)<\/figcaption>/g)];
    expect(figures.map((f) => f[2])).toEqual(['Summer', 'Winter']);
    expect(out).toContain('<h2 class="part" id="h-chart">Charts</h2>');
    // Each chart marks its own section's states only.
    const svgs = out.split('<figure class="chart"').slice(1);
    expect(svgs[0]).toContain('data-name="OA"');
    expect(svgs[0]).not.toContain('data-name="OA_W"');
    expect(svgs[1]).toContain('data-name="RA_W"');
    expect(svgs[1]).not.toContain('data-name="RA"');
    // The note of the other tests has one section: one chart, no caption.
    expect(html.match(/<figure class="chart"/g)).toHaveLength(1);
    expect(html).not.toContain('<figcaption>');
  });

  it('reads a leading rule followed by prose as a rule, not as front matter', async () => {
    writeFileSync(join(dir, 'rule.md'), '---\nIntro under a rule.\n\n---\n\n# Boiler house\n');
    expect((await dewmark(['report', 'rule.md', '-o', 'rule.html'], dir)).code).toBe(0);
    const out = readFileSync(join(dir, 'rule.html'), 'utf8');
    const note = /<article class="note-body" id="note">([\s\S]*?)<\/article>/.exec(out)![1]!;
    expect(note.trim()).toBe('<hr>\n<p>Intro under a rule.</p>\n<hr>\n<h1>Boiler house</h1>');
    expect(out).toContain('<caption>Revision ______</caption>');
  });

  it('never loses a statement: one the text rendering could not place is shown with its results', async () => {
    // In a table cell `\|` is a pipe for the table parser and a backslash-pipe for the scanner.
    const text = '| a | b |\n|---|---|\n| `state T: db=20C rh=50% \\| x` | y |\n';
    writeFileSync(join(dir, 'cell.md'), text);
    await dewmark(['report', 'cell.md', '-o', 'cell.html'], dir);
    const out = readFileSync(join(dir, 'cell.html'), 'utf8');
    const unplaced = /<div id="unplaced">[\s\S]*?<\/section>/.exec(out)?.[0] ?? '';
    expect(unplaced).toContain('<p>Line 3:</p><pre><code>state T: db=20C rh=50% \\| x</code></pre>');
    expect(unplaced).toContain('<th scope="row" class="dm-name">T</th><td class="num">20.0</td>');
  });
});
