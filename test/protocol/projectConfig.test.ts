/**
 * The project file `dewmark.json` in the language server: the nearest one above an open local
 * note wins over the editor's settings, which fill only what it leaves open; its rules change what
 * is published, as on the command line; a changed file (watched-files notification) applies at
 * once; a broken one is reported with its path.
 */
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { PUSH_ONLY_CAPABILITIES, startServer } from './harness';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

// An invented note: a stale claim (claim-mismatch) on line 2.
const NOTE = '```air\nstate RA: db=24C rh=50% w=11.0g/kg\n```\n';

describe('dewmark.json in the language server', () => {
  it('wins over the editor settings, which fill the rest; its rules apply; a change applies at once', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-lsp-project-'));
    dirs.push(dir);
    mkdirSync(join(dir, 'calcs'));
    const configPath = join(dir, 'dewmark.json');
    writeFileSync(configPath, JSON.stringify({ units: 'SI', rules: { 'claim-mismatch': 'off' } }));
    writeFileSync(join(dir, 'calcs', 'room.md'), NOTE);
    const uri = pathToFileURL(join(dir, 'calcs', 'room.md')).href;
    const s = startServer();
    try {
      // Editor settings: IP units (the project file says SI) and an elevation (the project file is silent).
      await s.initialize(PUSH_ONLY_CAPABILITIES, {
        initializationOptions: { dewmark: { units: 'IP', elevation: '1600 m' } },
      });
      await s.open(uri, NOTE, 1);
      const first = await s.diagnosticsFor(uri, 1);
      expect(first.diagnostics.map((d) => d.code)).toEqual([]);
      const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
        textDocument: { uri },
        position: { line: 1, character: 7 },
      });
      expect(h.contents.value).toContain('°C');
      expect(h.contents.value).not.toContain('°F');
      expect(h.contents.value).toContain('dewmark.elevation = 1600 m');

      // The file changes on disk; the client says so.
      const before = s.published.length;
      writeFileSync(configPath, JSON.stringify({ units: 'SI', rules: { 'claim-mismatch': 'error' } }));
      await s.connection.sendNotification('workspace/didChangeWatchedFiles', {
        changes: [{ uri: pathToFileURL(configPath).href, type: 2 }],
      });
      const again = await s.until('diagnostics republished after the project file changed', () =>
        s.published.slice(before).find((p) => p.uri === uri && p.diagnostics.length > 0),
      );
      expect(again.diagnostics.map((d) => [d.code, d.severity])).toEqual([['claim-mismatch', 1]]);
    } finally {
      await s.shutdown();
    }
  });

  it('the hover names the project file a value came from, relative to the workspace folder', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-lsp-project-'));
    dirs.push(dir);
    mkdirSync(join(dir, 'calcs', 'roof'), { recursive: true });
    writeFileSync(join(dir, 'dewmark.json'), JSON.stringify({ pressure: '84 kPa' }));
    writeFileSync(join(dir, 'calcs', 'room.md'), NOTE);
    // The nearest file wins: the roof notes take their site and claims setting from calcs/roof/.
    writeFileSync(
      join(dir, 'calcs', 'roof', 'dewmark.json'),
      JSON.stringify({ elevation: '1600 m', checkClaims: false }),
    );
    writeFileSync(join(dir, 'calcs', 'roof', 'ahu.md'), NOTE);
    const room = pathToFileURL(join(dir, 'calcs', 'room.md')).href;
    const roof = pathToFileURL(join(dir, 'calcs', 'roof', 'ahu.md')).href;
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES, {
        workspaceFolders: [{ uri: pathToFileURL(dir).href, name: 'ws' }],
        initializationOptions: { dewmark: { pressure: '95 kPa' } }, // the editor's, overridden by both files
      });
      const hoverAt = async (uri: string) => {
        await s.open(uri, NOTE, 1);
        await s.diagnosticsFor(uri, 1);
        const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
          textDocument: { uri },
          position: { line: 1, character: 7 },
        });
        return h.contents.value;
      };
      const atRoom = await hoverAt(room);
      expect(atRoom).toMatch(/Pressure: 84(\.0+)? kPa — dewmark\.json: pressure 84 kPa/);
      expect(atRoom).not.toContain('setting dewmark.pressure');
      expect(atRoom).toContain('✗ computed'); // claims checked (the editor default)
      const atRoof = await hoverAt(roof);
      expect(atRoof).toContain('calcs/roof/dewmark.json: elevation 1600 m (standard atmosphere)');
      expect(atRoof).toContain('Claims: not checked (checkClaims is false in calcs/roof/dewmark.json).');
      expect(atRoof).not.toContain('setting dewmark.');
      // The status bar's request names the file that sets the units, and only when one does.
      writeFileSync(join(dir, 'dewmark.json'), JSON.stringify({ pressure: '84 kPa', units: 'IP' }));
      await s.connection.sendNotification('workspace/didChangeWatchedFiles', {
        changes: [{ uri: pathToFileURL(join(dir, 'dewmark.json')).href, type: 2 }],
      });
      const status = await s.request<{ units: string; unitsSource: string; unitsFile?: string }>('dewmark/noteStatus', {
        textDocument: { uri: room },
      });
      expect(status).toMatchObject({ units: 'IP', unitsSource: 'setting', unitsFile: 'dewmark.json' });
      const roofStatus = await s.request<{ unitsFile?: string }>('dewmark/noteStatus', { textDocument: { uri: roof } });
      expect(roofStatus.unitsFile).toBeUndefined();
    } finally {
      await s.shutdown();
    }
  });

  it('a broken project file is reported with its path, and the editor settings still apply', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-lsp-project-'));
    dirs.push(dir);
    writeFileSync(join(dir, 'dewmark.json'), '{ "units": ');
    writeFileSync(join(dir, 'room.md'), NOTE);
    const uri = pathToFileURL(join(dir, 'room.md')).href;
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES);
      await s.open(uri, NOTE, 1);
      const d = await s.diagnosticsFor(uri, 1);
      expect(d.diagnostics.map((x) => x.code)).toEqual(['claim-mismatch']);
      await s.until('the project file problem', () =>
        s.logs.find((l) => l.includes(`${join(dir, 'dewmark.json')}: it is not valid JSON`)),
      );
    } finally {
      await s.shutdown();
    }
  });
});
