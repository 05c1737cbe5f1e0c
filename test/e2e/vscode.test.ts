/**
 * The extension in a real VS Code (code-server 4.139 = VS Code 1.139, in headless Chromium): the
 * packaged .vsix is installed into a fresh profile, the fixture note is opened, and the checks are
 * on what a user sees — the inline hint's figures, the hover's property table, a squiggle and a
 * Problems row for an infeasible state, a quick fix applied and the saved text afterwards, the
 * status-bar item, and a palette command. Screenshots go to test-artifacts/code-server/dewmark/.
 *
 * Expected figures: ASHRAE HoF 2017 SI Ch.1 Example 1 (copied with tolerances in
 * test/fixtures/e2e/expected.ts). Every wait is on a condition. Without the tools (scripts/
 * setup-e2e-tools.sh) the suite is skipped with a message; under CI=true it fails instead.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { EXAMPLE_1, FIXTURE_NOTE, INFEASIBLE, checkExample1, readFigure } from '../fixtures/e2e/expected';
import { type ExtensionSession, startExtensionSession } from './lib/extensionSession';
import { REPO_ROOT, skipWithout } from './lib/tools';

/** Process ids of the language servers started from this run's extensions folder (read from /proc). */
function serverPids(extensionsDir: string): number[] {
  const out: number[] = [];
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    let cmd = '';
    try {
      cmd = readFileSync(`/proc/${entry}/cmdline`, 'utf8');
    } catch {
      continue;
    }
    if (cmd.includes(extensionsDir) && cmd.includes('dist/server.js')) out.push(Number(entry));
  }
  return out;
}

/** A Playwright frame (the calls used here); the workbench's webviews are nested iframes. */
interface PwFrame {
  evaluate(expression: string): Promise<unknown>;
}

/** What the chart webview shows: its text (state labels) and how often it was redrawn. */
interface ChartView {
  text: string;
  updates: number;
  svgWidth: number;
  /** The chart's own width (the `<svg>`'s width attribute: the width it was drawn for). */
  drawnWidth: number;
  /** The width the page gives the chart (its container's). */
  roomWidth: number;
}

/** The chart webview's content, from whichever frame holds it (null while none does). */
async function chartView(page: unknown): Promise<ChartView | null> {
  const frames = (page as { frames(): PwFrame[] }).frames();
  for (const f of frames) {
    const v = (await f
      .evaluate(
        `(() => { const m = document.getElementById('dewmark-chart');\
 const svg = m && m.querySelector('svg'); if (!svg) return null;
          return { text: m.textContent || '', updates: \
Number(m.getAttribute('data-updates') || '0'), svgWidth: svg.getBoundingClientRect().width,
            drawnWidth: Number(svg.getAttribute('width')), roomWidth: m.clientWidth }; })()`,
      )
      .catch(() => null)) as ChartView | null;
    if (v) return v;
  }
  return null;
}

/** What the Markdown preview shows under the air blocks: each results box's rows, notice and style. */
interface PreviewResults {
  boxes: { rows: string[][]; notice: string | null; borderLeft: string; background: string }[];
  /** The text of the tables the note itself holds (a written results table renders as one). */
  noteTables: string[];
  /** The preview body's theme class (vscode-light, vscode-dark…). */
  theme: string;
}

/** The Markdown preview's content, from whichever frame holds it (null while none does). */
async function previewResults(page: unknown): Promise<PreviewResults | null> {
  const frames = (page as { frames(): PwFrame[] }).frames();
  for (const f of frames) {
    const v = (await f
      .evaluate(
        `(() => { if (!document.querySelector('.markdown-body, body.vscode-body')) return null;
          const boxes = [...document.querySelectorAll('.dewmark-results')].map((b) => { const cs = getComputedStyle(b);
            return { rows: [...b.querySelectorAll('tbody tr')].map((tr) \
=> [...tr.children].map((c) => (c.textContent || '').trim())),
              notice: b.querySelector('.dewmark-results-notice') \
? b.querySelector('.dewmark-results-notice').textContent : null,
              borderLeft: cs.borderLeftWidth + ' ' + cs.borderLeftStyle, background: cs.backgroundColor }; });
          const noteTables = [...document.querySelectorAll('table')].filter((t) \
=> !t.closest('.dewmark-results')).map((t) => t.textContent || '');
          if (boxes.length === 0 && noteTables.length === 0 && !document.querySelector('pre')) return null;
          return { boxes, noteTables, theme: document.body.className }; })()`,
      )
      .catch(() => null)) as PreviewResults | null;
    if (v) return v;
  }
  return null;
}

const fixtureText = readFileSync(join(REPO_ROOT, 'test', 'fixtures', 'e2e', FIXTURE_NOTE), 'utf8');
/** A second note, never opened: only "Check All Notes" reads it. */
const CLOSED_NOTE = 'plant-room.md';
const closedText = readFileSync(join(REPO_ROOT, 'test', 'fixtures', 'e2e', CLOSED_NOTE), 'utf8');
/** A note that sets its own result units with a `units:` line. */
const UNITS_NOTE = 'units-line.md';
const unitsText = readFileSync(join(REPO_ROOT, 'test', 'fixtures', 'e2e', UNITS_NOTE), 'utf8');
/** The fixture's full source line of a statement (the editor shows it, then the inline hint). */
function sourceLine(starts: string): string {
  const line = fixtureText.split('\n').find((l) => l.startsWith(starts));
  if (!line) throw new Error(`the fixture has no line starting with ${starts}`);
  return line;
}
const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
/** A visible editor line that is `src` followed by a hint matching `hint`. */
const hintedLine = (src: string, hint: string) => new RegExp(`^${escapeRegExp(src)}.*${hint}`);
const skip = skipWithout('node24', 'code-server', 'chromium', 'playwright-core');

describe.skipIf(skip)('Dewmark extension in code-server', () => {
  let session: ExtensionSession;
  let marker: string;
  const t0 = Date.now();

  beforeAll(async () => {
    session = await startExtensionSession({
      workPrefix: 'dewmark-vsix-',
      vsixName: 'dewmark-e2e.vsix',
      server: (work) => {
        marker = join(work, 'activation.json');
        return {
          files: { [FIXTURE_NOTE]: fixtureText, [`notes/${CLOSED_NOTE}`]: closedText, [UNITS_NOTE]: unitsText },
          env: { DEWMARK_ACTIVATION_MARKER: marker },
          settings: { '[markdown]': { 'editor.wordWrap': 'off' } },
        };
      },
      // Word wrap off (Markdown wraps by default) so each note line is one editor line with its hint.
      workbench: { name: 'dewmark', timeoutMs: 45_000 },
      open: FIXTURE_NOTE,
    });
    console.log(`[e2e] packaged ${session.vsix}: ${(statSync(session.vsix).size / 1024).toFixed(1)} KiB`);
  }, 300_000);

  afterAll(async () => {
    await session?.close();
    console.log(`[e2e] code-server suite wall time ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  });

  it(`shows an inline hint with the computed values (${EXAMPLE_1.source})`, async () => {
    const wb = session.workbench;
    const src = sourceLine(EXAMPLE_1.line);
    const line = await wb.waitForEditorLine(hintedLine(src, 'dp -?\\d'), { timeoutMs: 60_000 });
    await wb.screenshot('hint');
    const hint = line.slice(src.length);
    expect(checkExample1(hint), `editor line: ${line}`).toEqual([]);
    // The extension activated in this profile and wrote its timing marker.
    const timing = JSON.parse(readFileSync(marker, 'utf8')) as { activateMs: number };
    expect(timing.activateMs).toBeGreaterThan(0);
    console.log(`[e2e] activate() took ${timing.activateMs.toFixed(1)} ms in code-server`);
  }, 90_000);

  it('shows a hover with the figures first, the pressure basis and the method', async () => {
    const wb = session.workbench;
    const text = await wb.hover('OA', { line: 'state OA', expect: 'g/kg' });
    await wb.screenshot('hover');
    for (const part of ['state OA', 'db', 'wb', 'dp', 'rh', 'w', 'h', 'v', 'Pressure: 101.325 kPa', 'Method: ASHRAE']) {
      expect(text, `hover text: ${text}`).toContain(part);
    }
    // The figures come before the pressure basis and the method.
    expect(text.indexOf('g/kg')).toBeLessThan(text.indexOf('Pressure:'));
    // The table's humidity ratio, read as shown (key, value, unit in their columns), is the source
    // value (ASHRAE HoF 2017 SI Ch.1 Example 1).
    const row = /\bw\s+(\d+(?:\.\d+)?)\s*g\/kg/.exec(text);
    expect(row, `a humidity ratio in g/kg in: ${text}`).not.toBeNull();
    const w = readFigure(`w ${row![1]} g/kg`, 'w', 'g/kg')!;
    expect(Math.abs(w.value - EXAMPLE_1.w.value)).toBeLessThanOrEqual(EXAMPLE_1.w.tol + w.halfStep + 1e-9);
  }, 90_000);

  it('marks the infeasible state with a squiggle and a Problems entry', async () => {
    const wb = session.workbench;
    const squiggle = await wb.waitForSquiggle('error', { line: INFEASIBLE.before });
    expect(squiggle.line).toContain(INFEASIBLE.before);
    const rows = await wb.waitForProblem(INFEASIBLE.code);
    const row = rows.find((r) => r.text.includes(INFEASIBLE.code) || r.ariaLabel.includes(INFEASIBLE.code))!;
    expect(row.severity).toBe('error');
    expect(`${row.text} ${row.ariaLabel}`).toMatch(/wet-bulb/i);
    await wb.screenshot('problems');
  }, 90_000);

  it('applies the quick fix, and the saved note is correct afterwards', async () => {
    const wb = session.workbench;
    await wb.applyQuickFix(INFEASIBLE.fixTitle, { word: 'wb', line: INFEASIBLE.before });
    await wb.waitForEditorLine(INFEASIBLE.after);
    const saved = await wb.saveAndRead(FIXTURE_NOTE);
    expect(saved).toBe(fixtureText.replace(INFEASIBLE.before, INFEASIBLE.after));
    await wb.waitFor(
      'the squiggle to go after the fix',
      async () => !(await wb.squiggles()).some((s) => s.severity === 'error'),
    );
    await wb.screenshot('after-fix');
  }, 90_000);

  it('restarts the language server when it dies, and says so', async () => {
    const wb = session.workbench;
    const before = await wb.waitFor('the language server process', () => {
      const pids = serverPids(session.server.extensionsDir);
      return pids.length === 1 ? pids[0] : undefined;
    });
    process.kill(before, 'SIGKILL'); // the server this test's code-server started
    const note = await wb.waitFor('the restart notification', async () =>
      (await wb.notifications()).find((t) => t.includes('stopped unexpectedly and was restarted')),
    );
    expect(note).toContain('Output → Dewmark');
    const after = await wb.waitFor('a new language server process', () => {
      const pids = serverPids(session.server.extensionsDir);
      return pids.length === 1 && pids[0] !== before ? pids[0] : undefined;
    });
    expect(after).not.toBe(before);
    // The new server answers: a hover needs it.
    await wb.hover('RA', { line: 'state RA:', expect: 'state RA' });
    // Said once: the client does not add its own "connection is erroring" or "server will not restart" toasts.
    expect((await wb.notifications()).filter((t) => /Dewmark/.test(t) && !t.includes('stopped unexpectedly'))).toEqual(
      [],
    );
    await wb.screenshot('restarted');
  }, 90_000);

  it('shows the unit system and pressure basis in the status ' +
    'bar, and switches units from the palette and by a click', async () => {
    const wb = session.workbench;
    // The note's own site line sets the pressure basis (the server's note status says so).
    await wb.waitFor('the Dewmark status-bar item', async () =>
      (await wb.statusBar()).find((t) => t.includes('SI · site 101.325 kPa')),
    );
    await wb.runCommand('Dewmark: Switch Result Units (SI/IP)');
    const src = sourceLine(EXAMPLE_1.line);
    const line = await wb.waitForEditorLine(hintedLine(src, '°F'));
    expect(line.slice(src.length)).not.toMatch(/°C|kJ\/kg|g\/kg/);
    await wb.waitFor('the status bar to say IP', async () =>
      (await wb.statusBar()).find((t) => t.includes('IP · site 14.696 psia')),
    );
    await wb.screenshot('ip-units');
    // Clicking the status-bar item switches back.
    const item = (await wb.page.evaluate(
      `(() => { const el = [...document.querySelectorAll('.statusbar-item')].find((e) \
=> (e.textContent || '').includes('IP · site')); if (!el) return null;
        const r = el.getBoundingClientRect(); return { x: r.x + r.width / 2, y: r.y + r.height / 2 }; })()`,
    )) as { x: number; y: number } | null;
    expect(item, 'the Dewmark status-bar item').not.toBeNull();
    await wb.page.mouse.click(item!.x, item!.y);
    await wb.waitForEditorLine(hintedLine(src, '°C'));
    await wb.waitFor('the status bar to say SI again', async () =>
      (await wb.statusBar()).find((t) => t.includes('SI · site 101.325 kPa')),
    );
  }, 90_000);

  it('shows the psychrometric chart beside the note, and redraws it when the note changes', async () => {
    const wb = session.workbench;
    await wb.runCommand('Dewmark: Show Psychrometric Chart');
    const first = await wb.waitFor("the chart webview with the note's states", async () => {
      const v = await chartView(wb.page);
      return v?.text.includes('OA') && v.text.includes('RA') && v.svgWidth > 100 ? v : undefined;
    });
    await wb.screenshot('chart');
    // Type a new state into the note: the chart follows.
    await wb.clickWord('RA', { line: 'state RA:' });
    await wb.page.keyboard.press('End');
    await wb.page.keyboard.press('Enter');
    await wb.page.keyboard.insertText('state SA9: db=14C rh=90%');
    const updated = await wb.waitFor('the chart to show the new state SA9', async () => {
      const v = await chartView(wb.page);
      return v?.text.includes('SA9') ? v : undefined;
    });
    expect(updated.updates).toBeGreaterThan(first.updates);
    await wb.screenshot('chart-updated');
  }, 90_000);

  it('draws the chart again at its panel width when the window is resized', async () => {
    const wb = session.workbench;
    // The room must first change (the workbench lays out after the resize, so a view read at once is still the old
    // one), then the drawing must follow it.
    const drawnFor = async (what: string, roomChanged: (room: number) => boolean) =>
      wb.waitFor(what, async () => {
        const v = await chartView(wb.page);
        // Drawn for the room it has (within the page's 8 px step; at least 480 px, scaled down below that).
        return v &&
          roomChanged(v.roomWidth) &&
          Math.abs(v.drawnWidth - Math.max(480, v.roomWidth)) <= 8 &&
          v.svgWidth <= v.roomWidth + 1
          ? v
          : undefined;
      });
    const before = await wb.waitFor('the chart before the resize', async () => (await chartView(wb.page)) ?? undefined);
    await wb.page.setViewportSize({ width: 1800, height: 1000 });
    const wide = await drawnFor('the chart drawn for a wide panel', (room) => room > before.roomWidth + 100);
    await wb.screenshot('chart-wide');
    await wb.page.setViewportSize({ width: 1400, height: 900 });
    const narrow = await drawnFor(
      'the chart drawn again for the narrower panel',
      (room) => room < wide.roomWidth - 100,
    );
    await wb.screenshot('chart-narrow');
    expect(narrow.drawnWidth).toBeLessThan(wide.drawnWidth - 100);
    expect(narrow.updates).toBeGreaterThan(wide.updates);
    await wb.page.setViewportSize({ width: 1280, height: 800 });
  }, 90_000);

  it("checks every note of the workspace with progress, and lists the closed note's problems", async () => {
    const wb = session.workbench;
    await wb.runCommand('Dewmark: Check All Notes in the Workspace');
    const summary = await wb.waitFor('the check-all summary', async () =>
      (await wb.notifications()).find((t) => t.startsWith('Dewmark: checked')),
    );
    // Three notes hold statements; only the closed plant-room note still has an error (PR1).
    expect(summary).toContain('checked 3 notes with statements (3 Markdown files read): 1 error, 0 warnings');
    await wb.waitFor(
      'the progress notification to close',
      async () => !(await wb.notifications()).some((t) => t.includes('finding Markdown files') || /^\d+\/\d+ /.test(t)),
    );
    const rows = await wb.waitForProblem(/PR1/);
    expect(rows.some((r) => r.kind === 'resource' && r.text.includes(CLOSED_NOTE))).toBe(true);
    await wb.screenshot('check-all');
  }, 90_000);

  it('switches a note that has its own units: line by rewriting that line', async () => {
    const wb = session.workbench;
    await wb.openFile(UNITS_NOTE);
    await wb.waitForEditorLine(/^state ANTE: db=70F rh=45%.*°F/);
    await wb.waitFor("the status bar to show the note's IP", async () =>
      (await wb.statusBar()).find((t) => t.includes('IP · 14.696 psia')),
    );
    await wb.runCommand('Dewmark: Switch Result Units (SI/IP)');
    await wb.waitForEditorLine(/^units: SI$/);
    await wb.waitForEditorLine(/^state ANTE: db=70F rh=45%.*°C/);
    const saved = await wb.saveAndRead(UNITS_NOTE);
    expect(saved).toBe(unitsText.replace('units: IP', 'units: SI'));
    await wb.screenshot('units-line');
  }, 90_000);

  it('shows the computed results under the air block in the Markdown preview, styled by the extension', async () => {
    const wb = session.workbench;
    // Room for the note and its preview in the screenshots.
    await wb.runCommand('Notifications: Clear All Notifications');
    // Both are open here (the Problems view from the check-all test, the Explorer from the start).
    await wb.runCommand('View: Toggle Panel Visibility');
    await wb.runCommand('View: Toggle Primary Side Bar Visibility');
    await wb.openFile(FIXTURE_NOTE);
    await wb.runCommand('Markdown: Open Preview to the Side');
    const view = await wb.waitFor(
      'the preview with a results table',
      async () => {
        const v = await previewResults(wb.page);
        return v && v.boxes.length === 1 && v.boxes[0]!.rows.some((r) => r[0] === 'OA') ? v : undefined;
      },
      { timeoutMs: 60_000 },
    );
    await wb.screenshot('preview-results');
    const box = view.boxes[0]!;
    // The extension's stylesheet (markdown.previewStyles) applies: the box's left rule.
    expect(box.borderLeft).toBe('3px solid');
    // Columns: state, db, wb, dp, rh, w, h (°C, %, g/kg, kJ/kg). Figures: ASHRAE HoF 2017 SI Ch.1 Example 1.
    const oa = box.rows.find((r) => r[0] === 'OA')!;
    const w = readFigure(`w ${oa[5]} g/kg`, 'w', 'g/kg')!;
    const h = readFigure(`h ${oa[6]} kJ/kg`, 'h', 'kJ/kg')!;
    expect(Math.abs(w.value - EXAMPLE_1.w.value)).toBeLessThanOrEqual(EXAMPLE_1.w.tol + w.halfStep + 1e-9);
    expect(Math.abs(h.value - EXAMPLE_1.h.value)).toBeLessThanOrEqual(EXAMPLE_1.h.tol + h.halfStep + 1e-9);
    // The preview shows the editor's text: the state typed in the chart test is there too.
    expect(box.rows.map((r) => r[0])).toEqual(expect.arrayContaining(['OA', 'RA', 'LOG7', 'SA9']));

    expect(view.theme).toContain('vscode-light');

    // In a dark theme the same box takes the dark theme's colours (the preview's --vscode-* variables).
    await wb.page.keyboard.press('Control+K');
    await wb.page.keyboard.press('Control+T');
    await wb.page.waitForFunction('window.__dm.quickInputOpen()', undefined, { timeout: 10_000 });
    await wb.page.keyboard.insertText('Dark Modern');
    await wb.waitFor('the theme picker to list Dark Modern', async () =>
      ((await wb.page.evaluate('window.__dm.quickInputRows()')) as { label: string; focused: boolean }[]).some(
        (r) => r.label.includes('Dark Modern') && r.focused,
      ),
    );
    await wb.page.keyboard.press('Enter');
    const dark = await wb.waitFor('the preview in the dark theme', async () => {
      const v = await previewResults(wb.page);
      return v?.theme.includes('vscode-dark') && v.boxes.length === 1 ? v : undefined;
    });
    expect(dark.boxes[0]!.background).not.toBe(box.background);
    await wb.screenshot('preview-results-dark');

    // The note has no units: line, so switching units changes the setting: the preview follows.
    await wb.clickWord('OA', { line: 'state OA' });
    await wb.runCommand('Dewmark: Switch Result Units (SI/IP)');
    const ip = await wb.waitFor("the preview's results in °F", async () => {
      const v = await previewResults(wb.page);
      return v?.boxes[0]?.rows.some((r) => r[0] === 'OA' && r[1] === '104.0') ? v : undefined;
    });
    expect(ip.boxes).toHaveLength(1); // 40 °C = 104 °F (by definition of the Fahrenheit scale)
    await wb.runCommand('Dewmark: Switch Result Units (SI/IP)');
    await wb.waitFor("the preview's results in °C again", async () =>
      (await previewResults(wb.page))?.boxes[0]?.rows.some((r) => r[0] === 'OA' && r[1] === '40.0'),
    );
  }, 120_000);

  it('writes the results table below the block with the palette ' +
    'command, and warns when the note changes without refreshing it', async () => {
    const wb = session.workbench;
    await wb.clickWord('OA', { line: 'state OA' });
    const before = await wb.editorText();
    await wb.clickWord('OA', { line: 'state OA' });
    await wb.runCommand('Dewmark: Insert or Refresh Results Table');
    await wb.waitForEditorLine(/^<!-- dewmark-results [0-9a-f]{8}: generated from the air block above/);
    const saved = await wb.saveAndRead(FIXTURE_NOTE);
    // Only the table was added, right below the block's closing fence.
    const table = /\n\n<!-- dewmark-results [0-9a-f]{8}: [^\n]*-->\n[\s\S]*?<!-- dewmark-results end -->/.exec(saved);
    expect(table, saved).not.toBeNull();
    expect(saved.slice(0, table!.index) + saved.slice(table!.index + table![0].length)).toBe(before);
    expect(saved.slice(0, table!.index).endsWith('```')).toBe(true);
    expect(table![0]).toMatch(/\n\| OA +\| +40\.0 \| +20\.0 \|/);
    // The preview now shows the written table and no second copy.
    await wb.waitFor('the preview to show the written table only', async () => {
      const v = await previewResults(wb.page);
      return v && v.boxes.length === 0 && v.noteTables.some((t) => t.includes('OA')) ? v : undefined;
    });
    await wb.screenshot('preview-written-table');

    // A new state in the block: the table is stale (a warning on its marker, a notice in the preview).
    await wb.clickWord('RA', { line: 'state RA:' });
    await wb.page.keyboard.press('End');
    await wb.page.keyboard.press('Enter');
    await wb.page.keyboard.insertText('state SB: db=16C rh=85%');
    const rows = await wb.waitForProblem('stale-results-table');
    const row = rows.find(
      (r) => r.text.includes('stale-results-table') || r.ariaLabel.includes('stale-results-table'),
    )!;
    expect(row.severity).toBe('warning');
    expect(`${row.text} ${row.ariaLabel}`).toContain('Insert or Refresh Results Table');
    const stale = await wb.waitFor("the preview's stale-table notice", async () => {
      const v = await previewResults(wb.page);
      return v && v.boxes.length === 1 && v.boxes[0]!.notice ? v : undefined;
    });
    expect(stale.boxes[0]!.rows.map((r) => r[0])).toContain('SB');
    await wb.screenshot('stale-results-table');

    // Refreshing rewrites the table and the warning goes.
    await wb.clickWord('SB', { line: 'state SB' });
    await wb.runCommand('Dewmark: Insert or Refresh Results Table');
    await wb.waitForEditorLine(/^\| SB +\| +16\.0 \|/);
    await wb.waitFor(
      'the stale warning to go',
      async () =>
        !(await wb.problems()).some(
          (r) => r.text.includes('stale-results-table') || r.ariaLabel.includes('stale-results-table'),
        ),
    );
    const refreshed = await wb.saveAndRead(FIXTURE_NOTE);
    expect(refreshed.match(/<!-- dewmark-results [0-9a-f]{8}:/g)).toHaveLength(1);
    expect(refreshed.match(/<!-- dewmark-results end -->/g)).toHaveLength(1);
  }, 120_000);
});
