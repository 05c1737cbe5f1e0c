/**
 * The web build in a real browser editor's web worker extension host: code-server 4.139 (VS Code
 * 1.139) in headless Chromium, with the packaged .vsix installed and the setting
 * `remote.extensionKind` naming the extension `web`, so that the workbench runs its `browser` entry
 * (dist/web/client.js) in the browser's extension host, which starts dist/web/server.js in a Web
 * Worker — as the browser-only editor does, where there is no Node extension host at all. Checks
 * what a reviewer sees: an inline hint and a hover on a state, a squiggle, and `dewmark.json` read
 * through the editor (a folder whose project file sets IP units); and that no Node language server
 * was started. Screenshots go to test-artifacts/code-server/dewmark-web/.
 *
 * Expected figures: ASHRAE HoF 2017 SI Ch.1 Example 1 (test/fixtures/e2e/expected.ts). Without the
 * tools (scripts/setup-e2e-tools.sh) the suite is skipped with a message; under CI=true it fails.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { EXAMPLE_1, FIXTURE_NOTE, INFEASIBLE, checkExample1, readFigure } from '../fixtures/e2e/expected';
import { type ExtensionSession, startExtensionSession } from './lib/extensionSession';
import { REPO_ROOT, skipWithout } from './lib/tools';

/** Processes whose command line names `needle` (read from /proc). */
function processesNaming(needle: string): number[] {
  const out: number[] = [];
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      if (readFileSync(`/proc/${entry}/cmdline`, 'utf8').includes(needle)) out.push(Number(entry));
    } catch {
      // gone meanwhile
    }
  }
  return out;
}

const fixtureText = readFileSync(join(REPO_ROOT, 'test', 'fixtures', 'e2e', FIXTURE_NOTE), 'utf8');
/** A note in a folder whose dewmark.json sets IP units (an invented plant room). */
const IP_NOTE = 'imperial/plant-room.md';
const IP_TEXT = '# Plant room (IP)\n\n```air\nstate PR: db=40C wb=20C\n```\n';
const escapeRegExp = (t: string) => t.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
const skip = skipWithout('node24', 'code-server', 'chromium', 'playwright-core');

describe.skipIf(skip)('Dewmark web build in the web worker extension host of code-server', () => {
  let session: ExtensionSession;

  beforeAll(async () => {
    session = await startExtensionSession({
      workPrefix: 'dewmark-web-vsix-',
      vsixName: 'dewmark-web-e2e.vsix',
      server: {
        files: {
          [FIXTURE_NOTE]: fixtureText,
          [IP_NOTE]: IP_TEXT,
          'imperial/dewmark.json': JSON.stringify({ units: 'IP' }),
        },
        settings: {
          // Run the extension where the browser-only editor runs it: the web worker extension host.
          'remote.extensionKind': { 'dewmark.dewmark': ['web'] },
          '[markdown]': { 'editor.wordWrap': 'off' },
        },
      },
      workbench: { name: 'dewmark-web', timeoutMs: 45_000 },
      open: FIXTURE_NOTE,
    });
  }, 300_000);

  afterAll(async () => {
    await session?.close();
  });

  it(`shows an inline hint with the computed values (${EXAMPLE_1.source})`, async () => {
    const wb = session.workbench;
    const src = fixtureText.split('\n').find((l) => l.startsWith(EXAMPLE_1.line))!;
    const line = await wb.waitForEditorLine(new RegExp(`^${escapeRegExp(src)}.*dp -?\\d`), { timeoutMs: 60_000 });
    await wb.screenshot('hint');
    expect(checkExample1(line.slice(src.length)), `editor line: ${line}`).toEqual([]);
  }, 90_000);

  it('shows a hover with the property table, the pressure basis and the method', async () => {
    const wb = session.workbench;
    const text = await wb.hover('OA', { line: 'state OA', expect: 'g/kg' });
    await wb.screenshot('hover');
    // The compact layout: the figures first (key, value, unit), then the pressure basis and method.
    for (const part of ['state OA', 'db', 'wb', 'dp', 'Pressure: 101.325 kPa', 'Method: ASHRAE'])
      expect(text, `hover text: ${text}`).toContain(part);
    const row = /\bw\s+(\d+(?:\.\d+)?)\s*g\/kg/.exec(text);
    expect(row, `a humidity-ratio row in g/kg in: ${text}`).not.toBeNull();
    const w = readFigure(`w ${row![1]} g/kg`, 'w', 'g/kg')!;
    expect(Math.abs(w.value - EXAMPLE_1.w.value)).toBeLessThanOrEqual(EXAMPLE_1.w.tol + w.halfStep + 1e-9);
  }, 90_000);

  it('marks the infeasible state with a squiggle', async () => {
    const squiggle = await session.workbench.waitForSquiggle('error', { line: INFEASIBLE.before });
    expect(squiggle.line).toContain(INFEASIBLE.before);
  }, 90_000);

  it("reads the folder's dewmark.json through the editor: IP units in that folder's note", async () => {
    const wb = session.workbench;
    await wb.openFile(IP_NOTE);
    const text = await wb.hover('PR', { line: 'state PR', expect: 'gr/lb' });
    await wb.screenshot('hover-ip');
    expect(text).toContain('°F');
  }, 90_000);

  it('ran in the web worker: no Node language server was started', () => {
    const nodeServers = processesNaming('dist/server.js').filter((pid) =>
      readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes(session.server.extensionsDir),
    );
    expect(nodeServers).toEqual([]);
  });
});
