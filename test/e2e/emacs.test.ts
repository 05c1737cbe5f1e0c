/**
 * A real independent client: batch Emacs (Debian's 28.2) with eglot (Debian's elpa-eglot 1.9) and
 * markdown-mode loads the README's Emacs configuration (read from the README, `<!-- editor-config:
 * emacs-eglot -->`), opens a note, and eglot starts `dewmark-language-server --stdio` on its own.
 * The test checks the published diagnostics and what flymake shows of them, a hover's figures, and
 * the diagnostics after an edit. Without Emacs, eglot or markdown-mode the test is skipped with a
 * message; under CI=true it fails (scripts/setup-e2e-tools.sh --emacs installs them).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeEditorConfig } from './lib/editorConfigs';
import { runEmacs } from './lib/emacs';
import { expectStateOaHover, NOTE, SERVER } from './lib/lspClientNote';
import { requireTool } from './lib/tools';

const CONFIG_DIR = mkdtempSync(join(tmpdir(), 'dewmark-emacs-config-'));
afterAll(() => rmSync(CONFIG_DIR, { recursive: true, force: true }));

describe('Emacs (eglot) as the LSP client', () => {
  it('starts the server from the README configuration, shows diagnostics, hovers and follows an edit', async (ctx) => {
    const emacs = requireTool('emacs', ctx);
    const { report } = await runEmacs({
      emacs: emacs.path,
      configFile: writeEditorConfig('emacs-eglot', CONFIG_DIR),
      env: { DEWMARK_LANGUAGE_SERVER: SERVER },
      note: { name: 'ahu2.md', text: NOTE },
      hoverAt: 'OA:',
      edit: { from: 'db=24 rh', to: 'db=24C rh' },
    });
    expect(report.emacsVersion).toMatch(/^\d+\.\d+/);
    expect(report.majorMode).toBe('markdown-mode');
    expect(report.languageId).toBe('markdown');
    expect(report.serverInfo?.name).toBe('dewmark-language-server');

    // RA's dry-bulb has no unit, and MA waits on RA (as in the Neovim test).
    expect(report.diagnostics!.map((d) => d.code)).toEqual(['missing-unit', 'unresolved-dependency']);
    expect(report.diagnostics![0]).toMatchObject({ line: 4, character: 'state RA: db='.length, severity: 1 });
    // flymake shows them on the same lines (1-based): an error, and the waiting mix as a note (info).
    const shown = [...report.flymake!].sort((a, b) => a.line - b.line);
    expect(shown.map((d) => [d.line, d.type])).toEqual([
      [5, 'eglot-error'],
      [6, 'eglot-note'],
    ]);
    expect(shown[0]!.text).toContain('missing-unit');

    const hover = report.hover!;
    expectStateOaHover(hover);

    // After the edit the note is clean: eglot sent the change, the server republished.
    expect(report.editVersion).toBeGreaterThan(0);
    expect(report.diagnosticsAfterEdit).toEqual([]);
  });
});
