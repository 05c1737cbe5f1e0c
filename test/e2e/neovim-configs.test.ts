/**
 * The README's Neovim 0.11 (`vim.lsp.config`/`vim.lsp.enable`) and nvim-lspconfig configurations,
 * read from the README and run as written in the Neovim the tests have (Debian's 0.7.2) on top of
 * stand-ins for those APIs (test/e2e/lib/neovim-standins.lua, which refuse unknown fields): the
 * server they start answers with diagnostics and a hover, and the root folder they pick (the one
 * holding dewmark.json) is the workspace folder, so the hover names the project file relative to
 * it. This checks the configurations' text, command, root markers and settings against the real
 * server — not Neovim 0.11 or nvim-lspconfig themselves, which cannot be installed here.
 * Without `nvim` the tests are skipped with a message; under CI=true they fail.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { type EditorConfigName, writeEditorConfig } from './lib/editorConfigs';
import { hoverText, positionOf, runNeovim } from './lib/neovim';
import { REPO_ROOT, requireTool } from './lib/tools';

const SERVER = join(REPO_ROOT, 'bin', 'dewmark-language-server.js');
const STANDINS = join(REPO_ROOT, 'test', 'e2e', 'lib', 'neovim-standins.lua');
const CONFIG_DIR = mkdtempSync(join(tmpdir(), 'dewmark-nvim-configs-'));
afterAll(() => rmSync(CONFIG_DIR, { recursive: true, force: true }));

// Invented building; the project file sets the site.
const NOTE = [
  '# Harbour Street Lab — roof AHU',
  '',
  '```air',
  'state OA: db=40C wb=20C',
  'state RA: db=24 rh=50%',
  '```',
  '',
].join('\n');

describe.each<[EditorConfigName]>([['neovim-0.11'], ['neovim-lspconfig']])('the README configuration %s', (name) => {
  it('starts the server at the folder of dewmark.json, which diagnoses and hovers the note', async (ctx) => {
    const nvim = requireTool('nvim', ctx);
    const run = await runNeovim({
      nvim: nvim.path,
      preludeFile: STANDINS,
      configFile: writeEditorConfig(name, CONFIG_DIR),
      env: { DEWMARK_LANGUAGE_SERVER: SERVER },
      files: { 'dewmark.json': JSON.stringify({ elevation: '1600 m' }), 'calcs/roof.md': NOTE },
      steps: [
        { op: 'open', name: 'calcs/roof.md' },
        { op: 'waitDiagnostics', minCount: 1 },
        { op: 'hover', position: positionOf(NOTE, 'OA:') },
        { op: 'shutdown' },
      ],
    });
    expect(run.report.serverInfo?.name).toBe('dewmark-language-server');
    const diagnostics = run.step('waitDiagnostics').diagnostics;
    expect(diagnostics.map((d) => d.code)).toEqual(['missing-unit']);
    expect(diagnostics[0]!.range.start).toEqual(positionOf(NOTE, '24 rh', 0));
    const hover = hoverText(run.step('hover').result);
    expect(hover).toContain('**state OA**');
    // The root is the folder holding dewmark.json (the workspace folder), so the file is named relative to it.
    // (Without a root the server would name it by its absolute path.)
    expect(hover).toMatch(/kPa — dewmark\.json: elevation 1600 m \(standard atmosphere\)/);
    expect(hover).toContain('Design aid only');
  });
});

describe('the Neovim stand-ins refuse what the real APIs would not take', () => {
  it('a misspelt field fails the run instead of being ignored', async (ctx) => {
    const nvim = requireTool('nvim', ctx);
    const bad = join(CONFIG_DIR, 'misspelt.lua');
    writeFileSync(
      bad,
      "vim.lsp.config('dewmark', { cmd = { 'dewmark-language-server', '--stdio' }, filetype = { 'markdown' } })\n",
    );
    const run = await runNeovim({
      nvim: nvim.path,
      preludeFile: STANDINS,
      configFile: bad,
      files: { 'a.md': NOTE },
      steps: [{ op: 'open', name: 'a.md' }],
      throwOnFailure: false,
      stepTimeoutMs: 2000,
    });
    expect(run.report.ok).toBe(false);
    expect(run.report.error).toContain('unknown field "filetype"');
  });
});
