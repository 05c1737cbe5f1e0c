/**
 * The results of a block as data, HTML and Markdown: which items belong to which block (names
 * from earlier blocks resolve), the figures in the note's unit system, the sign convention, the
 * per-kg figures of a process without a flow, and escaping (nothing a note writes becomes markup).
 */
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { analyzeNote } from '../src/analyze';
import { allBlockResults, blockResults, isEmptyResults } from '../src/present/blockResults';
import { escapeHtml, escapeMarkdown, resultsTableHtml, resultsTableMarkdown } from '../src/present/resultsTable';

/** The cells of the Markdown table row whose first cell starts with `name`. */
function row(lines: string[], name: string): string[] {
  const line = lines.find((l) => l.startsWith(`| ${name} `) || l.startsWith(`| ${name}:`));
  if (!line) throw new Error(`no row ${name} in\n${lines.join('\n')}`);
  return line
    .slice(1, -1)
    .split(' | ')
    .map((c) => c.trim());
}

/** The number at the start of a cell (figures are shown with the minus sign U+2212 and IP thousands commas). */
function num(cell: string | undefined): number {
  const m = /^[-−]?[\d,]+(\.\d+)?/.exec(cell ?? '');
  if (!m) throw new Error(`no number in '${cell}'`);
  return Number(m[0].replace('−', '-').replace(/,/g, ''));
}

const TWO_BLOCKS = [
  '# Level 3 lab — AHU-7',
  '',
  '```air',
  'site: p=101.325kPa',
  'state OA: db=40C wb=20C',
  'state RA: db=24C rh=50%',
  '```',
  '',
  'Then the mixing box and the coil:',
  '',
  '```air',
  'mix MA: OA 25% + RA 75%',
  'state OFF: db=13C rh=90%',
  'process CC: MA -> OFF m=5kg/s',
  'process DRY: RA -> OFF',
  '```',
  '',
].join('\n');

describe('block results', () => {
  const a = analyzeNote(TWO_BLOCKS);
  const blocks = allBlockResults(a);

  it('gives each fenced block its own items, with names from earlier blocks resolved', () => {
    expect(blocks).toHaveLength(2);
    expect(blocks[0]!.data.states.map((s) => s.name)).toEqual(['OA', 'RA']);
    expect(blocks[0]!.data.processes).toEqual([]);
    expect(blocks[1]!.data.states.map((s) => [s.name, s.kind, s.status])).toEqual([
      ['MA', 'mix', 'ok'],
      ['OFF', 'state', 'ok'],
    ]);
    expect(blocks[1]!.data.states[0]!.detail).toBe('mix: OA 25.0 % + RA 75.0 %');
    expect(blocks[1]!.data.processes.map((p) => p.name)).toEqual(['CC', 'DRY']);
  });

  it('shows ASHRAE HoF 2017 SI Ch.1 Example 1 (W 6.5 g/kg ±0.1, dp 7 °C ±0.5, rh 14 % ±1, h 56.7 kJ/kg ±0.1)', () => {
    // Check values PL-SI-EX1 (as cited in the PsychroLib test suite); half a shown digit added for rounding.
    const lines = resultsTableMarkdown(blocks[0]!.data);
    expect(lines[0]).toMatch(/^\| state +\| db °C \| wb °C \| dp °C \| rh % \| w g\/kg \| h kJ\/kg \|$/);
    const [, db, wb, dp, rh, w, h] = row(lines, 'OA');
    expect(num(db)).toBe(40);
    expect(num(wb)).toBe(20);
    expect(Math.abs(num(dp) - 7)).toBeLessThanOrEqual(0.55);
    expect(Math.abs(num(rh) - 14)).toBeLessThanOrEqual(1.05);
    expect(Math.abs(num(w) - 6.5)).toBeLessThanOrEqual(0.105);
    expect(Math.abs(num(h) - 56.7)).toBeLessThanOrEqual(0.105);
    expect(lines.join('\n')).toContain('Results in SI at 101.325 kPa.');
  });

  it('shows the same state in I-P units when asked (ASHRAE HoF 2017 I-P Ch.1 Example 1 is 100 °F db, 65 °F wb)', () => {
    const ip = analyzeNote('```air\nunits: IP\nsite: p=14.696psia\nstate S: db=100F wb=65F\n```\n');
    const lines = resultsTableMarkdown(blockResults(ip, ip.parsed.regions[0]!));
    expect(lines[0]).toContain('db °F');
    expect(lines[0]).toContain('w gr/lb');
    expect(lines[0]).toContain('h Btu/lb');
    const [, db, , dp, rh, w, h] = row(lines, 'S');
    // Check values PL-IP-EX1: W 0.00523 lb/lb ±0.0001 (= 36.6 gr/lb ±0.7, 7000 gr = 1 lb), dp 40 °F ±1,
    // rh 13 % ±1, h 29.8 Btu/lb ±0.1 (I-P datum).
    expect(num(db)).toBe(100);
    expect(Math.abs(num(dp) - 40)).toBeLessThanOrEqual(1.05);
    expect(Math.abs(num(rh) - 13)).toBeLessThanOrEqual(1.05);
    expect(Math.abs(num(w) / 7000 - 0.00523)).toBeLessThanOrEqual(0.0001 + 0.05 / 7000);
    expect(Math.abs(num(h) - 29.8)).toBeLessThanOrEqual(0.105);
  });

  it('signs heat and water as added to the air, with rates for a flow and per-kg figures without one', () => {
    const cc = a.items.find((i) => i.name === 'CC' && i.kind === 'process');
    const lines = resultsTableMarkdown(blocks[1]!.data);
    const [, kind, total, sensible, latent, shr, water] = row(lines, 'CC');
    expect(kind).toMatch(/^cooling and dehumidifying, ADP \d+\.\d °C$/); // the apparatus dew point beside the kind
    expect(total).toMatch(/^−\d+(\.\d+)? kW$/);
    expect(sensible).toMatch(/^−\d+(\.\d+)? kW$/);
    expect(latent).toMatch(/^−\d+(\.\d+)? kW$/);
    expect(water).toMatch(/^−\d+(\.\d+)? kg\/h$/);
    expect(num(shr)).toBeGreaterThan(0);
    expect(num(shr)).toBeLessThan(1);
    // The figures are the engine's, rounded for display (kW at 3 significant figures, kg/h from kg/s × 3600).
    if (cc?.kind !== 'process') throw new Error('CC not evaluated');
    expect(Math.abs(num(total) - cc.qTotalW! / 1000)).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(Math.abs(num(water) - cc.waterKgS! * 3600)).toBeLessThanOrEqual(0.005 + 1e-9);
    const dry = row(lines, 'DRY');
    expect(dry[2]).toMatch(/ kJ\/kg$/);
    expect(dry[6]).toMatch(/ g\/kg$/);
    expect(lines.join('\n')).toContain('per kg of dry air where a process has no flow');
  });

  it(
    'converts a per-kg enthalpy difference with the scale only ' +
      '(1 Btu/lb = 2.326 kJ/kg exactly, NIST SP 811), not the datum',
    () => {
      const text = '```air\nstate A: db=30C rh=40%\nstate B: db=20C rh=40%\nprocess P: A -> B\n```\n';
      const si = analyzeNote(text);
      const ip = analyzeNote(text, { units: 'IP' });
      const kj = num(row(resultsTableMarkdown(blockResults(si, si.parsed.regions[0]!)), 'P')[2]);
      const btu = num(row(resultsTableMarkdown(blockResults(ip, ip.parsed.regions[0]!)), 'P')[2]);
      expect(kj).toBeLessThan(0);
      expect(Math.abs(btu - kj / 2.326)).toBeLessThanOrEqual(0.01);
    },
  );

  it("lists the block's errors and failed claims, marks states that were not computed, and leaves infos out", () => {
    const bad = analyzeNote(
      '```air\nstate LOG7: db=20C wb=25C\nstate RA: db=24C rh=50% w=12g/kg\nmix M: LOG7 50% + RA 50%\n```\n',
    );
    const data = blockResults(bad, bad.parsed.regions[0]!);
    expect(data.states.find((s) => s.name === 'LOG7')).toMatchObject({ status: 'failed', detail: 'not computed' });
    expect(data.states.find((s) => s.name === 'LOG7')!.values.every((v) => v === '—')).toBe(true);
    expect(data.problems.map((p) => [p.severity, p.code, p.subject])).toEqual([
      ['error', 'wb-above-db', 'LOG7'],
      ['warning', 'claim-mismatch', 'RA'],
    ]);
    const md = resultsTableMarkdown(data).join('\n');
    expect(md).toMatch(/^- \*\*error\*\* wb-above-db .*wet-bulb/m);
    expect(md).toMatch(/^- \*\*warning\*\* claim-mismatch RA: .*w=/m);
    expect(resultsTableHtml(data)).toContain(
      '<li class="dewmark-error"><span class="dewmark-severity">' +
        'error</span> <span class="dewmark-code">wb-above-db</span>',
    );
  });

  it("adds a pressure column only when the block's states differ in pressure", () => {
    const one = analyzeNote('```air\nstate A: db=20C rh=50%\nstate B: db=20C rh=50% elev=1600m\n```\n');
    const data = blockResults(one, one.parsed.regions[0]!);
    expect(data.stateColumns.map((c) => c.key)).toEqual(['p', 'db', 'wb', 'dp', 'rh', 'w', 'h']);
    expect(data.pressure).toBeNull();
    // Standard atmosphere at 1600 m: 83.52 kPa (ASHRAE HoF 2017 SI Ch.1 eq 3, as the hover shows it).
    expect(num(data.states[1]!.values[0])).toBeCloseTo(83.52, 1);
  });

  it('says when a block holds nothing', () => {
    const empty = analyzeNote('```air\n# nothing yet\n```\n');
    const data = blockResults(empty, empty.parsed.regions[0]!);
    expect(isEmptyResults(data)).toBe(true);
    expect(resultsTableMarkdown(data)).toEqual(['_No states, mixes or processes in this block._']);
    expect(resultsTableHtml(data)).toContain('No states, mixes or processes in this block.');
  });
});

describe('escaping', () => {
  const hostile = [
    '```air',
    'state A: db=24C rh=50% <img src=x onerror=alert(1)>',
    'state B: db=24C rh=50% `state X: db=1C rh=1%` &amp; | *bold* [link](http://x) <!-- -->',
    'state C: db=24C<script>alert(2)</script> rh=50%',
    '```',
    '',
  ].join('\n');
  const a = analyzeNote(hostile);
  const data = blockResults(a, a.parsed.regions[0]!);

  it("has something to escape (the note's text reaches the messages)", () => {
    const all = data.problems.map((p) => p.message).join('\n');
    expect(all).toMatch(/[<>`]/);
  });

  it('writes no tag, comment or entity of the note into the HTML', () => {
    const html = resultsTableHtml(data, { notice: '<b>notice</b>' });
    const tags = [...html.matchAll(/<\/?([a-zA-Z]+)/g)].map((m) => m[1]);
    expect(new Set(tags)).toEqual(
      new Set(['div', 'p', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 'span', 'ul', 'li']),
    );
    expect(html).not.toMatch(/<img|<script|<!--|<b>/);
    expect(html).toContain('&amp;amp;'); // the note's own "&amp;" shows as written
    expect(html).not.toMatch(/&(?!(amp|lt|gt|quot|#39);)/);
  });

  it(
    'writes Markdown that markdown-it reads as tables and text ' +
      'only: no HTML, code span, link or emphasis from the note',
    () => {
      const md = resultsTableMarkdown(data).join('\n');
      const tokens = new MarkdownIt().parse(md, {});
      const kinds = new Set<string>();
      const walk = (ts: { type: string; children: unknown }[]) => {
        for (const t of ts) {
          kinds.add(t.type);
          if (Array.isArray(t.children)) walk(t.children as { type: string; children: unknown }[]);
        }
      };
      walk(tokens as unknown as { type: string; children: unknown }[]);
      for (const k of ['html_block', 'html_inline', 'code_inline', 'link_open', 'image', 'fence', 'code_block'])
        expect(kinds.has(k), k).toBe(false);
      expect(kinds.has('table_open')).toBe(true);
      // Emphasis only where the builder puts it (the severity words and the basis line).
      const rendered = new MarkdownIt().render(md);
      expect(rendered.match(/<em>/g)?.length ?? 0).toBe(1);
      expect(
        [...rendered.matchAll(/<strong>([^<]*)<\/strong>/g)]
          .map((m) => m[1])
          .every((t) => t === 'error' || t === 'warning'),
      ).toBe(true);
    },
  );

  it('escapes every character that starts Markdown or HTML markup', () => {
    expect(escapeMarkdown('a|b`c*d_e[f]g<h>i&j\\k#l\nm')).toBe('a\\|b\\`c\\*d\\_e\\[f\\]g\\<h\\>i\\&j\\\\k\\#l m');
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
  });
});
