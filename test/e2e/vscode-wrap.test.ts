/**
 * Inline hints under word wrap, in a real VS Code (code-server + headless Chromium): with
 * `editor.wordWrap` on and a narrow window, long note lines wrap inside their hints, and a wrap
 * may fall only between figures — never inside one (`dp 12.⏎9 °C`, `39,⏎700 Btu/h`, `gr/⏎lb`,
 * `°⏎F`): each figure's number and unit stay on one visual line. The note is an IP note of the
 * invented building (figures with decimals, thousands separators, `/` and `°` in their units) and
 * an SI one. Without the tools the suite is skipped; under CI=true it fails instead.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type ExtensionSession, startExtensionSession } from './lib/extensionSession';
import { skipWithout } from './lib/tools';

const NOTE = 'cafe-wing-wrap.md';
// Demo data of the invented building; statement lines of several lengths, so that the wraps fall
// at different places in their hints.
const NOTE_TEXT = `# Kestrel Ridge café wing — hints under word wrap

\`\`\`air
units: IP
site: elev=5000ft
state OA: db=90F wb=60F
state RA: db=75F rh=50%
state COLD: db=10F rh=70%
state HOT_ROOM_EXHAUST_AIR: db=104F rh=35%
mix MA: OA 1,200cfm + RA 3,800cfm
process CC: MA -> OFF adp=50F bf=0.12
process RH: OFF -> SA dt=3F
\`\`\`

\`\`\`air
units: IP
state WARM: db=95.5F w=120gr/lb
\`\`\`
`;

/** A figure as the hints show it: a number (sign, thousands, decimals) and its unit. */
const FIGURE = new RegExp(
  /[−-]?\d[\d,]*(?:\.\d+)? /.source +
    /(?:°F|°C|%|gr\/lb|Btu\/lb|psia|lb\/h|cfm|Btu\/h|MBH|ft³\/lb|g\/kg|kJ\/kg|kW|kg\/h)(?![A-Za-z/])/.source,
  'g',
);

const skip = skipWithout('node24', 'code-server', 'chromium', 'playwright-core');

describe.skipIf(skip)('inline hints under word wrap in code-server', () => {
  let session: ExtensionSession;

  beforeAll(async () => {
    session = await startExtensionSession({
      workPrefix: 'dewmark-wrap-',
      vsixName: 'dewmark-e2e.vsix',
      server: {
        files: { [NOTE]: NOTE_TEXT },
        // Word wrap on for Markdown (the user's setting, as many have it); nothing else about wrapping is set.
        settings: { '[markdown]': { 'editor.wordWrap': 'on' } },
      },
      // A narrow window: with the side bar open the editor is about 50 columns wide.
      workbench: { name: 'dewmark-wrap', timeoutMs: 45_000, viewport: { width: 820, height: 900 } },
      open: NOTE,
    });
  }, 300_000);

  afterAll(async () => {
    await session?.close();
  });

  it('wraps a hinted line only between figures: every number stays with its unit', async () => {
    const wb = session.workbench;
    // Wait until the hints are there (the last state's humidity ratio and the coil's heat rate).
    await wb.waitForEditorLine(/gr\/lb/, { timeoutMs: 60_000 });
    await wb.waitFor('the hints of every statement', async () => {
      const joined = (await wb.editorLines()).join('');
      return /Btu\/h/.test(joined) && /WARM: db=95\.5F w=120gr\/lb.*rh/.test(joined) ? true : null;
    });
    const lines = await wb.editorLines();
    await wb.screenshot('wrapped-hints');
    const noteLines = NOTE_TEXT.split('\n');
    // Visual lines that continue a wrapped note line (they start no line of the note).
    const continuation = lines.map((l) => l.trim() !== '' && !noteLines.some((n) => n !== '' && l.startsWith(n)));
    expect(
      continuation.filter(Boolean).length,
      `some hinted lines wrap in this narrow editor:\n${lines.join('\n')}`,
    ).toBeGreaterThan(2);
    // Every figure, read across the visual lines, starts and ends on the same one.
    const starts: number[] = [];
    let joined = '';
    for (const l of lines) {
      starts.push(joined.length);
      joined += l;
    }
    const lineAt = (i: number): number => {
      let k = 0;
      while (k + 1 < starts.length && starts[k + 1]! <= i) k++;
      return k;
    };
    const figures = [...joined.matchAll(FIGURE)];
    expect(figures.length, joined).toBeGreaterThan(12);
    const split = figures
      .filter((m) => lineAt(m.index!) !== lineAt(m.index! + m[0].length - 1))
      .map((m) => `"${m[0]}" across:\n  ${lines[lineAt(m.index!)]}\n  ${lines[lineAt(m.index! + m[0].length - 1)]}`);
    expect(split, `figures split by a wrap:\n${split.join('\n')}`).toEqual([]);
    // And the wrapped continuation lines do hold figures (the check above saw wraps inside hints).
    const onContinuations = figures.filter((m) => continuation[lineAt(m.index!)]).length;
    expect(onContinuations, lines.join('\n')).toBeGreaterThan(0);
  }, 120_000);
});
