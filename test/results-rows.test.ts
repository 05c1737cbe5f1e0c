/**
 * One figure, one reading: a state's or a process's figures read the same in every place that
 * shows them — the inline hint, the hover, the preview and Markdown tables, the terminal tables of
 * `dewmark eval` and the HTML report — because all of them render the one results-row model
 * (`shared-core/src/present/rows.ts`). Each case goes through the features' own output.
 *
 * The notes are set in an invented building (Harbour Studio). Where a figure's value is checked,
 * its source is named beside the check; where two surfaces are compared, the engine's own figure is
 * the reference (its value is checked against PsychroLib in test/fixtures.test.ts).
 */
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { processesTable, statesTable, fileResult, stateJson } from '../cli/src/output';
import { analyzeNote } from '../shared-core/src/analyze';
import { stateRow } from '../shared-core/src/present/rows';
import { renderReportHtml } from '../cli/src/commands/report';
import { renderChart } from '../shared-core/src/chart';
import type { ProcessResult, StateResult } from '../shared-core/src/evaluate/types';
import { blockResults } from '../shared-core/src/present/blockResults';
import { resultsTableHtml, resultsTableMarkdown } from '../shared-core/src/present/resultsTable';
import {
  analyzeText,
  DEFAULT_SERVICE_SETTINGS,
  hover,
  inlayHints,
  type Note,
  type ServiceSettings,
} from '../shared-core/src/service';

interface Psy {
  SetUnitSystem(u: unknown): void;
  SI: unknown;
  GetHumRatioFromTDewPoint(tdp: number, p: number): number;
}
/** PsychroLib 1.1.1 (devDependency), the test oracle. */
const psy = createRequire(import.meta.url)('psychrolib') as Psy;
psy.SetUnitSystem(psy.SI);

function noteOf(text: string, settings: Partial<ServiceSettings> = {}): Note {
  return analyzeText(text, { ...DEFAULT_SERVICE_SETTINGS, ...settings });
}

const air = (...lines: string[]): string => ['```air', ...lines, '```', ''].join('\n');

/** Every output of one note: hints, hovers on names, preview, Markdown, terminal tables, report. */
function surfaces(text: string, settings: Partial<ServiceSettings> = {}) {
  const note = noteOf(text, settings);
  const a = note.analysis;
  const data = blockResults(a, a.parsed.regions[0]!);
  const file = fileResult('studio.md', text, a);
  const hoverOn = (name: string): string => {
    const at = text.indexOf(`${name}:`);
    const h = hover(note, at);
    if (!h) throw new Error(`no hover on ${name}`);
    return h.markdown;
  };
  const hintOn = (name: string): string => {
    const item = a.items.find((i) => i.name === name)!;
    const h = inlayHints(note, { start: 0, end: text.length }).find(
      (x) => x.offset >= item.statement.span.end && x.offset <= text.indexOf('\n', item.statement.span.end) + 1,
    );
    if (!h) throw new Error(`no hint on ${name}`);
    // Figures are kept whole with no-break spaces; read them as spaces here.
    return h.label.replace(/\u00a0/g, ' ');
  };
  return {
    note,
    analysis: a,
    markdown: resultsTableMarkdown(data).join('\n'),
    html: resultsTableHtml(data),
    data,
    states: statesTable(file) ?? '',
    processes: processesTable(file) ?? '',
    report: renderReportHtml(
      { path: 'studio.md', text, analysis: a },
      { generatedAt: '2026-01-01T00:00:00Z', version: 'test' },
    ),
    hoverOn,
    hintOn,
  };
}

/** The cells of the terminal-table row whose first cell is `name` (columns are two spaces apart). */
function terminalRow(table: string, name: string): string[] {
  const line = table.split('\n').find((l) => l.startsWith(`${name} `));
  if (!line) throw new Error(`no row ${name} in\n${table}`);
  return line.split(/ {2,}/).map((c) => c.trim());
}

/** The header cells of a terminal table. */
function terminalHeader(table: string): string[] {
  return table
    .split('\n')[0]!
    .split(/ {2,}/)
    .map((c) => c.trim());
}

/** The cells (name first) of the first line of the report's table `id` for the item `name`. */
function reportRow(report: string, id: string, name: string): string[] {
  const table = new RegExp(`<table id="${id}"[\\s\\S]*?</table>`).exec(report)?.[0] ?? '';
  const body = table
    .split('<tbody')
    .find(
      (b) => b.includes(`<th scope="row" class="dm-name">${name}</th>`) || b.includes(`class="dm-name">${name}<br>`),
    );
  if (!body) throw new Error(`no row ${name} in report table ${id}`);
  const first = body.split('</tr>')[0]!;
  return [...first.matchAll(/<t[hd][^>]*>([\s\S]*?)<\/t[hd]>/g)].map((m) =>
    m[1]!
      .replace(/<[^>]+>/g, ' ')
      .replace(/\s+/g, ' ')
      .trim(),
  );
}

function reportHeader(report: string, id: string): string[] {
  const table = new RegExp(`<table id="${id}"[\\s\\S]*?</table>`).exec(report)?.[0] ?? '';
  return [...table.matchAll(/<th scope="col"[^>]*>([\s\S]*?)<\/th>/g)].map((m) => m[1]!.replace(/<[^>]+>/g, '').trim());
}

/** The cells of the Markdown table row whose first cell starts with `name`. */
function markdownRow(markdown: string, name: string): string[] {
  const line = markdown.split('\n').find((l) => l.startsWith(`| ${name} `) || l.startsWith(`| ${name}:`));
  if (!line) throw new Error(`no row ${name} in\n${markdown}`);
  return line
    .slice(1, -1)
    .split(' | ')
    .map((c) => c.trim());
}

const COIL = air(
  'units: SI',
  'state RA: db=26C rh=50%          # studio return',
  'state OFF: db=12C rh=95%        # off-coil',
  'process CC: RA -> OFF q=1.5m3/s',
);

describe('one results row for every surface', () => {
  const s = surfaces(COIL);
  const cc = s.analysis.items.find((i) => i.name === 'CC') as ProcessResult;

  it('shows the condensate at one precision in the hint, hover, preview, terminal table and report', () => {
    // Reference: the engine's own water rate (kg/s × 3600), shown at 3 significant figures.
    const kgh = -cc.waterKgS! * 3600;
    expect(kgh).toBeGreaterThan(10);
    expect(kgh).toBeLessThan(100);
    const shown = kgh.toFixed(1);
    expect(s.hintOn('CC')).toContain(`${shown} kg/h condensate`);
    expect(s.hoverOn('CC')).toContain(`| condensate | ${shown} kg/h |`);
    expect(markdownRow(s.markdown, 'CC')[6]).toBe(`−${shown} kg/h`);
    expect(s.html).toContain(`<td class="dewmark-num">−${shown} kg/h</td>`);
    const header = terminalHeader(s.processes);
    expect(terminalRow(s.processes, 'CC')[header.indexOf('water kg/h')]).toBe(`−${shown}`);
    const rheader = reportHeader(s.report, 'processes');
    expect(reportRow(s.report, 'processes', 'CC')[rheader.indexOf('water')]).toBe(`−${shown} kg/h`);
  });

  it('names the kind of process in the same words everywhere', () => {
    const words = 'cooling and dehumidifying';
    expect(cc.processKind).toBe('cooling-dehumidifying');
    expect(s.hintOn('CC').startsWith(words)).toBe(true);
    expect(s.hoverOn('CC')).toContain(`— ${words},`);
    // The written table puts the apparatus dew point beside the kind, as the hover shows it.
    const adp = /^cooling and dehumidifying, ADP (.+)$/.exec(markdownRow(s.markdown, 'CC')[1]!);
    expect(adp).not.toBeNull();
    expect(s.hoverOn('CC')).toContain(`| apparatus dew point | ${adp![1]} |`);
    expect(terminalRow(s.processes, 'CC')[terminalHeader(s.processes).indexOf('kind')]).toBe(words);
    // The report's kind cell is the written table's: the words, then the ADP.
    expect(reportRow(s.report, 'processes', 'CC')[reportHeader(s.report, 'processes').indexOf('kind')]).toBe(
      markdownRow(s.markdown, 'CC')[1],
    );
  });

  it('shows the sensible heat ratio as a plain ratio at two decimals everywhere', () => {
    const shr = cc.shr!.toFixed(2);
    expect(s.hintOn('CC')).toContain(`SHR ${shr}`);
    expect(s.hoverOn('CC')).toContain(`| sensible heat ratio | ${shr} |`);
    expect(markdownRow(s.markdown, 'CC')[5]).toBe(shr);
    expect(terminalRow(s.processes, 'CC')[terminalHeader(s.processes).indexOf('SHR')]).toBe(shr);
    expect(reportRow(s.report, 'processes', 'CC')[reportHeader(s.report, 'processes').indexOf('SHR')]).toBe(shr);
  });

  it('shows the same total heat in the hint, hover, preview, terminal table and report', () => {
    const kw = (-cc.qTotalW! / 1000).toPrecision(3);
    expect(s.hintOn('CC')).toContain(`${kw} kW removed`);
    expect(s.hoverOn('CC')).toContain(`| total heat | ${kw} kW removed |`);
    expect(markdownRow(s.markdown, 'CC')[2]).toBe(`−${kw} kW`);
    expect(terminalRow(s.processes, 'CC')[terminalHeader(s.processes).indexOf('total kW')]).toBe(`−${kw}`);
    expect(reportRow(s.report, 'processes', 'CC')[reportHeader(s.report, 'processes').indexOf('total')]).toBe(
      `−${kw} kW`,
    );
  });
});

describe('one minus sign (U+2212) on every figure shown', () => {
  const s = surfaces(
    air(
      'state COLD: db=-5C rh=60%      # winter intake',
      'state WARM: db=22C w=1.6g/kg',
      'process PH: COLD -> WARM m=1kg/s',
    ),
  );

  it('in the preview, Markdown, terminal table, report and hover; never an ASCII hyphen before a figure', () => {
    expect(markdownRow(s.markdown, 'COLD')[1]).toBe('−5.0');
    expect(s.html).toContain('<td class="dewmark-num">−5.0</td>');
    expect(terminalRow(s.states, 'COLD')[terminalHeader(s.states).indexOf('db °C')]).toBe('−5.0');
    expect(reportRow(s.report, 'states', 'COLD')[reportHeader(s.report, 'states').indexOf('db °C')]).toBe('−5.0');
    expect(s.hoverOn('COLD')).toContain('| `db` | −5.0 | °C given |');
    // The frost point of COLD is negative too: the hint shows it with the same sign.
    expect(s.hintOn('COLD')).toMatch(/(dp|fp) −\d+\.\d °C/);
    for (const out of [s.markdown, s.states, s.processes]) expect(out).not.toMatch(/(^|[\s|(])-\d/m);
  });
});

describe('significant figures where fixed decimals would lose the value', () => {
  // A dry room held at a −60 °C dew point (frost point) at 101.325 kPa.
  const s = surfaces(air('state DRYROOM: db=20C dp=-60C'));
  const st = (s.analysis.items[0] as StateResult).state!;

  it('shows w to two significant figures in every surface (PsychroLib 1.1.1 as oracle)', () => {
    const w = psy.GetHumRatioFromTDewPoint(-60, 101325) * 1000;
    expect(Math.abs(st.w * 1000 - w) / w).toBeLessThan(0.01);
    const shown = w.toPrecision(2);
    expect(shown).toMatch(/^0\.00\d\d$/);
    expect(markdownRow(s.markdown, 'DRYROOM')[5]).toBe(shown);
    expect(terminalRow(s.states, 'DRYROOM')[terminalHeader(s.states).indexOf('w g/kg')]).toBe(shown);
    expect(reportRow(s.report, 'states', 'DRYROOM')[reportHeader(s.report, 'states').indexOf('w g/kg')]).toBe(shown);
    expect(s.hoverOn('DRYROOM')).toContain(`| \`w\` | ${shown} | g/kg |`);
    expect(s.hintOn('DRYROOM')).toContain(`w ${shown} g/kg`);
  });

  it('shows a tiny relative humidity as a figure, not 0.0 %', () => {
    const rh = markdownRow(s.markdown, 'DRYROOM')[4]!;
    expect(rh).not.toBe('0.0');
    expect(Number(rh)).toBeGreaterThan(0);
    // Two significant figures of the engine's own rh.
    expect(rh).toBe((st.rh * 100).toPrecision(2));
  });

  it('keeps the usual fixed decimals for ordinary figures and for temperatures near zero', () => {
    const t = surfaces(air('state S: db=0.04C rh=50%'));
    expect(markdownRow(t.markdown, 'S')[1]).toBe('0.0');
    expect(markdownRow(t.markdown, 'S')[5]).toMatch(/^\d\.\d\d$/);
  });
});

describe('a claim is judged and reported in the unit it was written in', () => {
  const text = air(
    'state RA: db=26C rh=50% w=0.0100',
    'state OFF: db=12C rh=95%',
    'process CC: RA -> OFF q=1.5m3/s shr=0.50',
  );
  const s = surfaces(text);
  const cc = s.analysis.items.find((i) => i.name === 'CC') as ProcessResult;

  it('a bare shr claim: computed as a ratio with its band as a ratio, in the hover, hint and report', () => {
    // shr=0.50 has its last digit in the hundredths: band ±0.005; the ratio is shown one place finer than a percent.
    const computed = cc.shr!.toFixed(3);
    const hov = s.hoverOn('CC');
    expect(hov).toContain(`\`shr=0.50\` ✗ computed ${computed} (band ±0.005)`);
    const claimLine = hov.split('\n').find((l) => l.includes('shr=0.50'))!;
    expect(claimLine).not.toContain('%');
    expect(s.hintOn('CC')).toContain(`✗ shr is ${computed}`);
    expect(s.report).toContain(`shr=0.50 → ${computed} ✗ outside ±0.005`);
  });

  it('a bare w claim: computed in kg/kg as written, not in g/kg', () => {
    const rows = s.analysis.items.find((i) => i.name === 'RA') as StateResult;
    const w = rows.state!.w;
    // Written to 0.0001: shown at the finer kg/kg precision of the display unit (0.01 g/kg = 0.00001 kg/kg).
    const computed = w.toFixed(5);
    expect(s.hoverOn('RA')).toContain(`\`w=0.0100\` ✗ computed ${computed} (band ±0.00005)`);
    expect(s.hintOn('RA')).toContain(`✗ w is ${computed}`);
  });
});

describe("the pressure of a site elevation, at one precision and in the note's units", () => {
  // ASHRAE HoF 2017 SI Ch.1 Table 1: 1500 m → 84.556 kPa; 1 psi = 6894.757 Pa (NIST SP 811).
  const SITE = ['site: elev=1500m', 'state S: db=20C rh=50%'];

  it('SI: the hover names the figure once, at the table precision', () => {
    const s = surfaces(air(...SITE));
    const line = s
      .hoverOn('S')
      .split('\n')
      .find((l) => l.startsWith('Pressure:'))!;
    const m = /^Pressure: (\d+\.\d{3}) kPa — site line \d+: elev=1500m \(standard atmosphere\)$/.exec(line);
    expect(m, line).not.toBeNull();
    expect(Math.abs(Number(m![1]) - 84.556)).toBeLessThanOrEqual(0.0015);
  });

  it('IP: the hover and the chart caption speak psia, not kPa', () => {
    const s = surfaces(air('units: IP', ...SITE));
    const line = s
      .hoverOn('S')
      .split('\n')
      .find((l) => l.startsWith('Pressure:'))!;
    const m = /^Pressure: (\d+\.\d{3}) psia — site line \d+: elev=1500m \(standard atmosphere\)$/.exec(line);
    expect(m, line).not.toBeNull();
    expect(Math.abs(Number(m![1]) - 84556 / 6894.757)).toBeLessThanOrEqual(0.0015);
    const svg = renderChart(s.analysis, { source: 'x' });
    const captions = [...svg.matchAll(/<text class="dmc-caption"[^>]*>([^<]*)<\/text>/g)].map((x) => x[1]).join(' ');
    expect(captions).toContain('psia');
    expect(captions).not.toContain('kPa');
    expect(s.report).not.toMatch(/<ul id="pressure-basis">[\s\S]*?kPa[\s\S]*?<\/ul>/);
  });
});

describe('IP figures: thousands separated by commas, flows in cfm and lb/h, heat in Btu/h', () => {
  const s = surfaces(
    air('units: IP', 'state RA: db=78F rh=50%', 'state OFF: db=55F rh=92%', 'process CC: RA -> OFF q=12000cfm'),
  );
  const cc = s.analysis.items.find((i) => i.name === 'CC') as ProcessResult;

  it('groups a heat rate of six figures in every table and the hint (1 Btu/h = 0.29307107 W, NIST SP 811)', () => {
    const btuh = -cc.qTotalW! / 0.29307107;
    expect(btuh).toBeGreaterThan(100_000);
    const grouped = Number(btuh.toPrecision(3)).toLocaleString('en-US');
    expect(s.hintOn('CC')).toContain(`${grouped} Btu/h removed`);
    expect(markdownRow(s.markdown, 'CC')[2]).toBe(`−${grouped} Btu/h`);
    expect(terminalRow(s.processes, 'CC')[terminalHeader(s.processes).indexOf('total Btu/h')]).toBe(`−${grouped}`);
    expect(reportRow(s.report, 'processes', 'CC')[reportHeader(s.report, 'processes').indexOf('total')]).toBe(
      `−${grouped} Btu/h`,
    );
  });

  it(
    'shows the water in lb/h by the unit table (1 lb = 0.45359237 kg, ' +
      'NIST SP 811), the same in the report and the tables',
    () => {
      const lbh = (-cc.waterKgS! * 3600) / 0.45359237;
      const shown = Number(lbh.toPrecision(3)).toLocaleString('en-US', { maximumFractionDigits: 1 });
      expect(markdownRow(s.markdown, 'CC')[6]).toBe(`−${shown} lb/h`);
      expect(terminalRow(s.processes, 'CC')[terminalHeader(s.processes).indexOf('water lb/h')]).toBe(`−${shown}`);
      expect(reportRow(s.report, 'processes', 'CC')[reportHeader(s.report, 'processes').indexOf('water')]).toBe(
        `−${shown} lb/h`,
      );
      expect(s.hoverOn('CC')).toContain(`| dry-air flow | `);
      expect(s.hoverOn('CC')).toMatch(/\| dry-air flow \| [\d,]+ lb\/h \([\d,]+ cfm at RA\) \|/);
    },
  );

  it('leaves SI figures ungrouped', () => {
    const si = surfaces(air('state RA: db=26C rh=50%', 'state OFF: db=12C rh=95%', 'process CC: RA -> OFF q=40m3/s'));
    expect(markdownRow(si.markdown, 'CC')[2]).toMatch(/^−\d+ kW$/);
  });
});

describe('degree of saturation above the boiling point', () => {
  // At 150 °C the saturation pressure of water is about 476 kPa (ASHRAE HoF 2017 SI Ch.1 eq 6;
  // steam tables give 476.2 kPa, from memory), above 101.325 kPa: W/Ws does not exist there.
  const text = '```air\nstate HOT: db=150C rh=5%\nstate WARM: db=24C rh=50%\n```\n';

  it('is — in the results rows every table and the report read, and has no JSON field', () => {
    const a = analyzeNote(text);
    const hot = a.items.find((i) => i.name === 'HOT' && i.kind === 'state') as StateResult;
    expect(stateRow(hot, 'SI').figures.mu.value).toBe('—');
    const warm = a.items.find((i) => i.name === 'WARM' && i.kind === 'state') as StateResult;
    expect(stateRow(warm, 'SI').figures.mu.value).toMatch(/^49\.\d$/);
    const json = stateJson(fileResult('hot.md', text, a), hot);
    expect(Object.keys(json).some((k) => k.startsWith('mu'))).toBe(false);
  });
});
