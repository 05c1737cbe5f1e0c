/**
 * The Markdown preview plugin (client/src/preview.ts) on its own, under plain markdown-it: 14.x
 * (the major version VS Code's preview ships) and 15.x (the core's own). It adds the results
 * table under each air block (whole-note evaluation, so names from earlier blocks resolve),
 * escapes everything, leaves notes without air blocks exactly as they were, and shows a stale
 * written table's notice instead of repeating a current one.
 */
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { COMMAND_CATEGORY, COMMANDS } from '../../client/src/commands';
import { dewmarkPreviewPlugin } from '../../client/src/preview';
import { HOST_MAX_NOTE_KB, hostBounded } from '../../client/src/hostLimit';
import { analyzeText, DEFAULT_SERVICE_SETTINGS, resultsTableEdits } from '../../shared-core/src/service';
import { RESULTS_COMMAND_TITLE } from '../../shared-core/src/present/writtenTables';

interface Md {
  render(src: string, env?: object): string;
  parse(src: string, env: object): { type: string; content: string }[];
}
type MdCtor = new (preset?: string, opts?: object) => Md;

const root = join(__dirname, '..', '..');
/** markdown-it 14 (installed at the root, as a dependency of the packaging tool) and 15 (the core's). */
const versions: [string, MdCtor][] = [
  ['markdown-it 14', createRequire(join(root, 'package.json'))('markdown-it') as MdCtor],
  ['markdown-it 15', createRequire(join(root, 'shared-core', 'package.json'))('markdown-it') as MdCtor],
];

const NOTE = [
  '# Northgate clinic — AHU-1',
  '',
  '```air',
  'state OA: db=40C wb=20C',
  'state RA: db=24C rh=50%',
  '```',
  '',
  'Mixed air:',
  '',
  '```air',
  'mix MA: OA 25% + RA 75%',
  'state BAD: db=20C wb=25C',
  '```',
  '',
  '```js',
  'const x = "<b>not air</b>";',
  '```',
  '',
].join('\n');

/** The text inside each `div.dewmark-results`, tags removed. */
function resultBlocks(html: string): string[] {
  return [...html.matchAll(/<div class="dewmark-results"[^>]*>([\s\S]*?)<\/div>/g)].map((m) =>
    m[1]!
      .replace(/<[^>]+>/g, ' ')
      .replace(/&quot;/g, '"')
      .replace(/\s+/g, ' ')
      .trim(),
  );
}

for (const [label, MarkdownIt] of versions) {
  describe(`preview plugin with ${label}`, () => {
    const md = () => dewmarkPreviewPlugin(new MarkdownIt());

    it('is the version it says', () => {
      const pkg = createRequire(join(root, label.endsWith('14') ? 'package.json' : 'shared-core/package.json'))(
        'markdown-it/package.json',
      ) as { version: string };
      expect(pkg.version.split('.')[0]).toBe(label.split(' ')[1]);
    });

    it('puts a results table right after each air block, evaluating the whole note', () => {
      const html = md().render(NOTE);
      const blocks = resultBlocks(html);
      expect(blocks).toHaveLength(2);
      // ASHRAE HoF 2017 SI Ch.1 Example 1 (check values PL-SI-EX1):
      // 40 °C db, 20 °C wb → W 6.5 g/kg ±0.1, h 56.7 kJ/kg ±0.1.
      const oa = /OA 40\.0 20\.0 (-?\d+\.\d) (\d+\.\d) (\d+\.\d+) (\d+\.\d+)/.exec(blocks[0]!);
      expect(oa, blocks[0]).not.toBeNull();
      expect(Math.abs(Number(oa![3]) - 6.5)).toBeLessThanOrEqual(0.105);
      expect(Math.abs(Number(oa![4]) - 56.7)).toBeLessThanOrEqual(0.105);
      // The mix in the second block uses OA and RA from the first.
      expect(blocks[1]).toMatch(/MA mix: OA 25.0 % \+ RA 75.0 % \d+\.\d/);
      expect(blocks[1]).toMatch(/BAD not computed/);
      expect(blocks[1]).toMatch(/error wb-above-db .*wet-bulb 25.0 °C is above the dry-bulb 20.0 °C/);
      // Each table follows its own fence, before the next paragraph; the js fence gets none.
      const fences = [...html.matchAll(/<\/code><\/pre>\n?(<div class="dewmark-results")?/g)];
      expect(fences.map((f) => f[1] !== undefined)).toEqual([true, true, false]);
    });

    it('adds nothing to a note without air blocks (same HTML as without the plugin)', () => {
      const plain = '# Notes\n\nNo statements `state A: db=20C rh=50%` here but inline.\n\n```json\n{"a": 1}\n```\n';
      expect(md().render(plain)).toBe(new MarkdownIt().render(plain));
      expect(md().render('')).toBe('');
    });

    it('escapes everything from the note; html: true in the host changes nothing', () => {
      const hostile =
        '```air\nstate A: db=24C rh=50% <img src=x onerror=alert(1)>\nstate ' +
        'B: db=24C<script>alert(2)</script> rh=50%\n```\n';
      for (const opts of [{}, { html: true }]) {
        const html = dewmarkPreviewPlugin(new MarkdownIt('default', opts)).render(hostile);
        const ours = html.slice(html.indexOf('<div class="dewmark-results"'));
        expect(ours).toContain('&lt;img');
        expect(ours).toContain('&lt;script&gt;');
        expect(ours).not.toMatch(/<img|<script/);
      }
    });

    it('keeps the table inside the block quote of its block', () => {
      const html = md().render('> ```air\n> state A: db=24C rh=50%\n> ```\n\nAfter.\n');
      expect(html).toMatch(
        new RegExp(
          /<blockquote>\n<pre><code class="language-air">[\s\S]*?<\/code><\/pre>\n/.source +
            /<div class="dewmark-results"[\s\S]*?<\/div>\n<\/blockquote>/.source,
        ),
      );
    });

    it("uses the settings it is given (units from the editor setting), and the note's own units: line wins", () => {
      const ip = dewmarkPreviewPlugin(new MarkdownIt(), {
        settings: () => ({ ...DEFAULT_SERVICE_SETTINGS, units: 'IP' }),
      });
      // 24 °C = 75.2 °F (°F = °C × 9/5 + 32, by definition).
      expect(resultBlocks(ip.render('```air\nstate A: db=24C rh=50%\n```\n'))[0]).toMatch(/db °F .*A 75\.2 /);
      expect(resultBlocks(ip.render('```air\nunits: SI\nstate A: db=24C rh=50%\n```\n'))[0]).toMatch(
        /db °C .*A 24\.0 /,
      );
    });

    it('shows nothing more under a block whose written table is current, and a notice when it is stale', () => {
      const note = analyzeText(NOTE, DEFAULT_SERVICE_SETTINGS);
      let written = NOTE;
      for (const e of resultsTableEdits(note, { kind: 'all' }).edits.sort((a, b) => b.span.start - a.span.start))
        written = written.slice(0, e.span.start) + e.newText + written.slice(e.span.end);
      const current = md().render(written);
      expect(resultBlocks(current)).toEqual([]);
      expect(current.match(/<table>/g)?.length).toBe(2); // the two written states tables, rendered by markdown-it
      const stale = md().render(written.replace('state RA: db=24C rh=50%', 'state RA: db=25C rh=50%'));
      const blocks = resultBlocks(stale);
      expect(blocks).toHaveLength(2);
      expect(blocks[0]).toMatch(
        new RegExp(
          /^The results table written below this block is out of date; /.source +
            /run "Dewmark: Insert or Refresh Results Table" to refresh it\. Current results: state /.source,
        ),
      );
      expect(blocks[0]).toMatch(/RA 25\.0 /);
    });

    it('reports a failure to the host and renders the note without tables', () => {
      const errors: unknown[] = [];
      const broken = dewmarkPreviewPlugin(new MarkdownIt(), {
        settings: () => {
          throw new Error('settings unavailable');
        },
        onError: (e) => errors.push(e),
      });
      expect(broken.render(NOTE)).toBe(new MarkdownIt().render(NOTE));
      expect(String(errors[0])).toContain('settings unavailable');
    });

    it('reuses the analysis when the same note is rendered again', () => {
      let asked = 0;
      const counted = dewmarkPreviewPlugin(new MarkdownIt(), {
        settings: () => {
          asked++;
          return DEFAULT_SERVICE_SETTINGS;
        },
      });
      const first = counted.render(NOTE);
      expect(counted.render(NOTE)).toBe(first);
      expect(asked).toBe(2);
      expect(counted.render(NOTE.replace('db=40C', 'db=41C'))).not.toBe(first);
    });
  });
}

describe('names', () => {
  it('the messages name the command as the palette shows it', () => {
    expect(RESULTS_COMMAND_TITLE).toBe(`${COMMAND_CATEGORY}: ${COMMANDS.insertResultsTable.title}`);
  });
});

describe('the extension host never evaluates an unbounded note', () => {
  const MarkdownIt = versions[1]![1];
  it('the preview follows dewmark.maxNoteSizeKB: a note over it gets no tables (not evaluated)', () => {
    const padded = `${NOTE}\n${'Prose of the plant room, repeated to pass one KB. '.repeat(30)}\n`;
    expect(padded.length).toBeGreaterThan(1024);
    const at = (kb: number) =>
      resultBlocks(
        dewmarkPreviewPlugin(new MarkdownIt(), {
          settings: () => ({ ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: kb }),
        }).render(padded),
      );
    expect(at(1)).toEqual([]);
    expect(at(4)).toHaveLength(2);
  });

  it('the setting 0 ("no limit") still leaves the preview and chart bounded inside VS Code', () => {
    expect(hostBounded({ ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 0 }).maxNoteKB).toBe(HOST_MAX_NOTE_KB);
    expect(hostBounded({ ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 10 * HOST_MAX_NOTE_KB }).maxNoteKB).toBe(
      HOST_MAX_NOTE_KB,
    );
    expect(hostBounded({ ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 512 }).maxNoteKB).toBe(512);
    // One character over the host bound is not evaluated by the preview, whatever the setting.
    const over = `${NOTE}${'x'.repeat(HOST_MAX_NOTE_KB * 1024 - NOTE.length + 1)}`;
    let rendered = 0;
    const md = dewmarkPreviewPlugin(
      {
        core: {
          ruler: {
            push: (_n: string, rule: (s: unknown) => void) => {
              // A hand-made core state with one air fence: the plugin adds a token only when it evaluated the note.
              const tokens = [
                { type: 'fence', info: 'air', map: [2, 5] as [number, number], level: 0, content: '', block: true },
              ];
              rule({
                src: over,
                env: {},
                tokens,
                Token: class {
                  type = 'html_block';
                  info = '';
                  map = null;
                  level = 0;
                  content = '';
                  block = true;
                  constructor() {
                    rendered++;
                  }
                },
              });
              expect(tokens).toHaveLength(1);
            },
          },
        },
      },
      { settings: () => ({ ...DEFAULT_SERVICE_SETTINGS, maxNoteKB: 0 }) },
    );
    expect(md).toBeTruthy();
    expect(rendered).toBe(0);
  });
});
