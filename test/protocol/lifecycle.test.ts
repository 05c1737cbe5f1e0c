/**
 * The server's life cycle through the real protocol: the command line, initialize (only the
 * implemented capabilities, adapted to the client), dynamic registration, shutdown/exit, and the
 * node IPC transport the VS Code client uses.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { FULL_CAPABILITIES, PUSH_ONLY_CAPABILITIES, serverBin, startServer } from './harness';

describe('command line', () => {
  it('prints the usage and exits 2 without a transport', () => {
    const r = spawnSync(process.execPath, [serverBin()], { encoding: 'utf8', timeout: 20_000 });
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('Usage: dewmark-language-server --stdio');
  });

  it('prints its version', () => {
    const r = spawnSync(process.execPath, [serverBin(), '--version'], { encoding: 'utf8', timeout: 20_000 });
    expect(r.status).toBe(0);
    expect(r.stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });
});

describe('initialize', () => {
  it('advertises exactly the implemented capabilities to a full client', async () => {
    const s = startServer();
    try {
      const init = await s.initialize(FULL_CAPABILITIES);
      const caps = init.capabilities;
      expect(init.serverInfo?.name).toBe('dewmark-language-server');
      expect(caps.textDocumentSync).toEqual({ openClose: true, change: 2 }); // 2 = incremental
      expect(caps.hoverProvider).toBe(true);
      expect(caps.inlayHintProvider).toEqual({ resolveProvider: false });
      expect(caps.completionProvider).toMatchObject({ resolveProvider: false });
      expect(caps.documentSymbolProvider).toBeTruthy();
      expect(caps.definitionProvider).toBe(true);
      expect(caps.referencesProvider).toBe(true);
      expect(caps.renameProvider).toEqual({ prepareProvider: true });
      expect(caps.codeActionProvider).toEqual({
        codeActionKinds: ['quickfix', 'refactor.rewrite', 'source.dewmark.resultsTable'],
        resolveProvider: false,
      });
      expect(caps.executeCommandProvider).toEqual({ commands: ['dewmark.server.resultsTables'] });
      expect(caps.diagnosticProvider).toEqual({
        identifier: 'dewmark',
        interFileDependencies: false,
        workspaceDiagnostics: false,
      });
      expect(caps.experimental).toEqual({
        dewmark: { checkWorkspace: 'dewmark/checkWorkspace', noteStatus: 'dewmark/noteStatus' },
      });
      for (const absent of [
        'semanticTokensProvider',
        'documentFormattingProvider',
        'signatureHelpProvider',
        'foldingRangeProvider',
        'workspaceSymbolProvider',
      ]) {
        expect(caps[absent], absent).toBeUndefined();
      }
      // The configuration change notification is registered dynamically once initialized.
      await s.until('registration', () =>
        (s.registrations as { registrations: { method: string }[] }[]).some((r) =>
          r.registrations.some((x) => x.method === 'workspace/didChangeConfiguration'),
        ),
      );
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });

  it('pushes diagnostics (no pull provider) and renames without prepare for a client like Neovim 0.7', async () => {
    const s = startServer();
    try {
      const caps = (await s.initialize(PUSH_ONLY_CAPABILITIES)).capabilities;
      expect(caps.diagnosticProvider).toBeUndefined();
      expect(caps.renameProvider).toBe(true);
      expect(s.registrations).toEqual([]);
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });

  it('answers requests after shutdown with InvalidRequest, then exits 0 on exit (LSP 3.17)', async () => {
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES);
      const uri = 'file:///life/after-shutdown.md';
      await s.open(uri, '```air\nstate RA: db=24C rh=50%\n```\n');
      expect(await s.request('shutdown', undefined)).toBeNull();
      for (const [method, params] of [
        ['textDocument/hover', { textDocument: { uri }, position: { line: 1, character: 7 } }],
        ['textDocument/documentSymbol', { textDocument: { uri } }],
        ['shutdown', undefined],
      ] as const) {
        const err = await s.request(method, params).then(
          () => null,
          (e: { code?: number; message?: string }) => e,
        );
        expect(err?.code, method).toBe(-32600); // InvalidRequest
        expect(err?.message).toContain(`'${method}' is not accepted after 'shutdown'`);
      }
      const exited = new Promise<number | null>((resolve) => s.proc.on('exit', (code) => resolve(code)));
      await s.connection.sendNotification('exit');
      expect(await exited).toBe(0);
    } finally {
      s.kill();
    }
  });

  it('exits with code 1 on exit without shutdown (LSP 3.17 exit notification)', async () => {
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES);
      const exited = new Promise<number | null>((resolve) => s.proc.on('exit', (code) => resolve(code)));
      await s.connection.sendNotification('exit');
      expect(await exited).toBe(1);
    } finally {
      s.kill();
    }
  });

  it('speaks node IPC too (the VS Code client transport)', async () => {
    const s = startServer('node-ipc');
    try {
      await s.initialize(FULL_CAPABILITIES);
      const uri = 'file:///ipc/note.md';
      await s.open(uri, '```air\nstate RA: db=24C rh=50%\n```\n');
      const hover = await s.request<{ contents: { value: string } } | null>('textDocument/hover', {
        textDocument: { uri },
        position: { line: 1, character: 7 },
      });
      expect(hover?.contents.value).toContain('**state RA**');
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  });
});
