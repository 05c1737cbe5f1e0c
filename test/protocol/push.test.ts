/**
 * A client without pull diagnostics or configuration requests (like Neovim 0.7): diagnostics are
 * pushed with the document version after every change, settings come from didChangeConfiguration;
 * and the workspace check reads the Markdown files under the folders with work-done progress.
 */
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import type { CheckWorkspaceResult } from '@dewmark/protocol';
import { FULL_CAPABILITIES, PUSH_ONLY_CAPABILITIES, startServer, tableValue } from './harness';

const dirs: string[] = [];
afterAll(() => {
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

describe('push diagnostics', () => {
  it('publishes with the version after open and after each change', async () => {
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES);
      const uri = 'file:///notes/push.md';
      await s.open(uri, '```air\nstate A: db=24 rh=50%\n```\n', 1);
      const v1 = await s.diagnosticsFor(uri, 1);
      expect(v1.version).toBe(1);
      expect(v1.diagnostics.map((d) => d.code)).toEqual(['missing-unit']);
      expect(v1.diagnostics[0]!.range).toEqual({ start: { line: 1, character: 12 }, end: { line: 1, character: 14 } });

      await s.change(uri, 2, [
        { range: { start: { line: 1, character: 14 }, end: { line: 1, character: 14 } }, text: 'C' },
      ]);
      const v2 = await s.diagnosticsFor(uri, 2);
      expect(v2.version).toBe(2);
      expect(v2.diagnostics).toEqual([]);

      // Settings pushed with didChangeConfiguration apply at once (no workspace/configuration asked).
      await s.connection.sendNotification('workspace/didChangeConfiguration', {
        settings: { dewmark: { units: 'IP' } },
      });
      const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
        textDocument: { uri },
        position: { line: 1, character: 7 },
      });
      // 24 °C = 75.2 °F exactly (°F = °C × 9/5 + 32, by definition).
      expect(tableValue(h.contents.value, 'db')).toBe(75.2);
      expect(s.configurationRequests).toEqual([]);

      await s.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
      await s.until('the clearing publish', () =>
        s.published.length > 2 && s.published[s.published.length - 1]!.diagnostics.length === 0 ? true : undefined,
      );
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });

  it('names a bad setting in a message and keeps working with the default', async () => {
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES, { initializationOptions: { dewmark: { units: 'metric' } } });
      await s.until('the settings warning', () => s.logs.find((l) => l.includes('dewmark.units must be "SI" or "IP"')));
      const uri = 'file:///notes/defaults.md';
      await s.open(uri, '```air\nstate A: db=24C rh=50%\n```\n');
      const h = await s.request<{ contents: { value: string } }>('textDocument/hover', {
        textDocument: { uri },
        position: { line: 1, character: 7 },
      });
      expect(h.contents.value).toContain('°C');
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });
});

describe('check all notes in the workspace', () => {
  it('reads every Markdown file under the folders, reports progress, and pushes their diagnostics', async () => {
    const root = mkdtempSync(join(tmpdir(), 'dewmark-ws-'));
    dirs.push(root);
    mkdirSync(join(root, 'plant'));
    mkdirSync(join(root, 'node_modules', 'pkg'), { recursive: true });
    writeFileSync(
      join(root, 'plant', 'ahu.md'),
      '# AHU\n\n```air\nstate A: db=24 rh=50%\nstate B: db=20C wb=25C\n```\n',
    );
    writeFileSync(join(root, 'plant', 'ok.md'), 'Held at `state R: db=22C rh=45%` overnight.\n');
    writeFileSync(join(root, 'readme.md'), 'No statements here.\n');
    writeFileSync(join(root, 'node_modules', 'pkg', 'skip.md'), '```air\nstate X: db=1 rh=1\n```\n');
    writeFileSync(join(root, 'notes.txt'), '```air\nstate X: db=1 rh=1\n```\n');

    const s = startServer();
    try {
      const folder = pathToFileURL(root).href;
      await s.initialize(FULL_CAPABILITIES, { workspaceFolders: [{ uri: folder, name: 'ws' }] });
      const result = await s.request<CheckWorkspaceResult>('dewmark/checkWorkspace', {
        workDoneToken: 'check-1',
      });
      expect(result.filesRead).toBe(3);
      expect(result.notes.map((n) => n.uri.slice(folder.length))).toEqual(['/plant/ahu.md', '/plant/ok.md']);
      expect(result.errors).toBe(2); // missing-unit and wb-above-db
      const kinds = (s.progress as { token: string; value: { kind: string } }[])
        .filter((p) => p.token === 'check-1')
        .map((p) => p.value.kind);
      expect(kinds[0]).toBe('begin');
      expect(kinds[kinds.length - 1]).toBe('end');
      expect(kinds).toContain('report');
      const pushed = s.published.find((p) => p.uri.endsWith('/plant/ahu.md'));
      expect(pushed?.diagnostics.map((d) => d.code).sort()).toEqual(['missing-unit', 'wb-above-db']);
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });
});

describe('check all with folders that are not on this machine', () => {
  it('skips a file://host/… folder and a virtual folder (saying why) and checks the rest', async () => {
    const root = mkdtempSync(join(tmpdir(), 'dewmark-ws-odd-'));
    dirs.push(root);
    writeFileSync(join(root, 'ahu.md'), '```air\nstate A: db=24 rh=50%\n```\n');
    const s = startServer();
    try {
      const local = pathToFileURL(root).href;
      const folders = ['file://fileserver/share/notes', 'vscode-vfs://github/owner/repo', local];
      await s.initialize(FULL_CAPABILITIES, { workspaceFolders: folders.map((uri, i) => ({ uri, name: `f${i}` })) });
      const result = await s.request<{
        notes: { uri: string }[];
        filesRead: number;
        errors: number;
        skippedFolders: { uri: string; reason: string }[];
      }>('dewmark/checkWorkspace', {});
      expect(result.filesRead).toBe(1);
      expect(result.notes.map((n) => n.uri)).toEqual([`${local}/ahu.md`]);
      expect(result.errors).toBe(1); // missing-unit
      expect(result.skippedFolders.map((f) => f.uri)).toEqual(folders.slice(0, 2));
      expect(result.skippedFolders[0]!.reason).toMatch(/not a local path .*only folders on this machine are checked/);
      expect(result.skippedFolders[1]!.reason).toContain("not a folder on this machine's disk ('vscode-vfs:' scheme)");
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });
});
