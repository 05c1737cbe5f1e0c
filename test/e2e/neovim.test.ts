/**
 * A real independent client: headless Neovim (0.7.2 from Debian) starts the server with the
 * README's Neovim 0.7 configuration (read from the README, `<!-- editor-config: neovim-0.7 -->`), opens a note, and the
 * test checks hover, diagnostics after an edit, symbols, completion and an inlay-hint request, and the
 * results table written by a source action and refreshed by its quick fix. Without
 * `nvim` the test is skipped with a message; under CI=true it fails.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { writeEditorConfig } from './lib/editorConfigs';
import { completionLabels, hoverText, inlayHintLabels, positionOf, runNeovim, type StepResult } from './lib/neovim';
import { expectStateOaHover, NOTE, SERVER } from './lib/lspClientNote';
import { requireTool } from './lib/tools';

const CONFIG_DIR = mkdtempSync(join(tmpdir(), 'dewmark-nvim-config-'));
const CONFIG = writeEditorConfig('neovim-0.7', CONFIG_DIR);
afterAll(() => rmSync(CONFIG_DIR, { recursive: true, force: true }));

describe('Neovim as the LSP client', () => {
  it('hovers, diagnoses an edit, lists symbols, completes and answers an inlay-hint request', async (ctx) => {
    const nvim = requireTool('nvim', ctx);
    const run = await runNeovim({
      nvim: nvim.path,
      configFile: CONFIG,
      env: { DEWMARK_LANGUAGE_SERVER: SERVER },
      files: { 'ahu2.md': NOTE },
      steps: [
        { op: 'open', name: 'ahu2.md' },
        { op: 'waitDiagnostics', minCount: 1 },
        { op: 'hover', position: positionOf(NOTE, 'OA:') },
        { op: 'edit', startLine: 4, endLine: 5, lines: ['state RA: db=24C rh=50%'] },
        { op: 'documentSymbols' },
        { op: 'completion', position: positionOf(NOTE, 'mix MA: ', 0, 'mix MA: '.length) },
        { op: 'inlayHints' },
        { op: 'shutdown' },
      ],
    });
    expect(run.report.nvimVersion).toMatch(/^0\.\d+\.\d+/);
    expect(run.report.serverInfo?.name).toBe('dewmark-language-server');

    const before = run.step('waitDiagnostics');
    expect(before.diagnostics.map((d) => d.code)).toEqual(['missing-unit', 'unresolved-dependency']); // MA waits on RA
    expect(before.diagnostics[0]!.range.start).toEqual(positionOf(NOTE, '24 rh', 0));

    const hover = hoverText(run.step('hover').result);
    expectStateOaHover(hover);

    const edit = run.step('edit');
    expect(edit.diagnostics?.version).toBe(edit.version);
    expect(edit.diagnostics?.diagnostics).toEqual([]);

    const symbols = run.step('documentSymbols').result as { name: string; children?: { name: string }[] }[];
    expect(symbols.map((s) => s.name)).toEqual(['Harbour Street Lab — AHU-2']);
    expect(symbols[0]!.children!.map((c) => c.name)).toEqual(['OA', 'RA', 'MA']);

    expect(completionLabels(run.step('completion').result)).toEqual(['OA', 'RA']);

    const hints = inlayHintLabels(run.step('inlayHints').result);
    expect(hints).toHaveLength(3);
    expect(hints[0]).toMatch(
      /^rh\u00a0[\d.]+\u00a0% · w\u00a0[\d.]+\u00a0g\/kg · h\u00a0[\d.]+\u00a0kJ\/kg · dp\u00a0[\d.]+\u00a0°C$/,
    );
    expect(run.report.serverExit?.code ?? 0).toBe(0);
  });

  it(
    'writes a results table with the source action, reports it ' +
      'stale after an edit, and refreshes it with the quick fix',
    async (ctx) => {
      const nvim = requireTool('nvim', ctx);
      const fixed = NOTE.replace('db=24 rh', 'db=24C rh');
      const inBlock = { start: positionOf(fixed, 'state OA', 0), end: positionOf(fixed, 'state OA', 0) };
      // The start marker's line once the table is in: two lines below the closing fence (line 6).
      const marker = { start: { line: 8, character: 0 }, end: { line: 8, character: 0 } };
      const run = await runNeovim({
        nvim: nvim.path,
        configFile: CONFIG,
        env: { DEWMARK_LANGUAGE_SERVER: SERVER },
        files: { 'tables.md': fixed },
        steps: [
          { op: 'open', name: 'tables.md' },
          { op: 'waitDiagnostics' },
          { op: 'codeAction', range: inBlock, only: ['source'], apply: 'Insert a results table below this air block' },
          { op: 'edit', startLine: 4, endLine: 5, lines: ['state RA: db=25C rh=50%'], minCount: 1 },
          {
            op: 'codeAction',
            range: marker,
            only: ['quickfix'],
            apply: 'Refresh the results table below this air block',
          },
          { op: 'shutdown' },
        ],
      });
      const actions = run.report.steps.filter((x): x is StepResult<'codeAction'> => x.op === 'codeAction');
      const inserted = actions[0]!;
      expect(inserted.text).toMatch(
        /```\n\n<!-- dewmark-results [0-9a-f]{8}: generated from the air block above[^\n]*-->\n\n\| state +\| db °C/,
      );
      expect(inserted.text).toContain('<!-- dewmark-results end -->');
      expect(inserted.text!.startsWith(fixed.trimEnd())).toBe(true);
      const edited = run.step('edit');
      expect(edited.diagnostics?.diagnostics.map((d) => d.code)).toEqual(['stale-results-table']);
      expect(edited.diagnostics?.diagnostics[0]!.range.start).toEqual(marker.start);
      const refreshed = actions[1]!;
      expect(refreshed.text).toMatch(/\| RA +\| +25\.0 \|/);
      expect(refreshed.diagnostics?.diagnostics).toEqual([]);
      expect(run.report.serverExit?.code ?? 0).toBe(0);
    },
  );
});
