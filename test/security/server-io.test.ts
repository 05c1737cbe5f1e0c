/**
 * The language server opens no network connection, writes no file and starts no program: a whole
 * protocol session (every request kind, edits, settings changes, the workspace check that reads
 * the folder's notes, shutdown) runs under the `io-audit.cjs` preload, which records each such
 * attempt on standard error. The preload is shown to catch those attempts first (the check can
 * fail), and the workspace folder is byte-for-byte the same afterwards.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter } from 'vscode-jsonrpc/node';
import type { CheckWorkspaceResult } from '@dewmark/protocol';
import { FULL_CAPABILITIES, repoRoot, serverBin, Session } from '../protocol/harness';
import { AUDIT_PRELOAD as AUDIT, auditRecords, snapshot } from './audit';

let dir = '';

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(repoRoot(), 'scripts', 'build.mjs')], {
    cwd: repoRoot(),
    encoding: 'utf8',
  });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-io-'));
  mkdirSync(join(dir, 'calcs'));
  writeFileSync(
    join(dir, 'calcs', 'ahu-1.md'),
    '# AHU-1\n\n```air\nstate OA: db=32C wb=23C\nstate RA: db=24C rh=50%\nmix MA: OA 30% + RA 70%\n```\n',
  );
  writeFileSync(join(dir, 'calcs', 'bad.md'), '```air\nstate X: db=20C wb=25C\n```\n');
  writeFileSync(join(dir, 'readme.txt'), 'not a note');
}, 120_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('the I/O audit preload', () => {
  it(
    'records a file write, a write-open, a connection attempt, a ' +
      'listen and a started program (so its silence means something)',
    () => {
      const target = join(dir, 'control-output.txt');
      const script = `
      const fs = require('node:fs'); const net = require('node:net'); const cp = require('node:child_process');
      fs.readFileSync(${JSON.stringify(join(dir, 'readme.txt'))});
      fs.writeFileSync(${JSON.stringify(target)}, 'x');
      fs.closeSync(fs.openSync(${JSON.stringify(target)}, 'a'));
      const s = net.connect(9, '127.0.0.1'); s.on('error', () => {}); s.destroy();
      const srv = net.createServer(); srv.listen(0, '127.0.0.1', () => srv.close());
      cp.spawnSync(process.execPath, ['-e', '0']);
      fs.rmSync(${JSON.stringify(target)});
    `;
      const r = spawnSync(process.execPath, ['--require', AUDIT, '-e', script], { encoding: 'utf8' });
      expect(r.status).toBe(0);
      expect(r.stderr).toContain('[io-audit-ready]');
      const calls = auditRecords(r.stderr).map((x) => `${x.kind}:${x.call}`);
      expect(calls).toEqual(
        expect.arrayContaining([
          'file:writeFileSync',
          'file:openSync',
          'network:connect',
          'network:listen',
          'process:spawnSync',
          'file:rmSync',
        ]),
      );
      expect(calls.filter((c) => c.startsWith('file:open')).length, 'a read-only open is not recorded').toBe(1);
    },
  );
});

describe('the language server under the audit', () => {
  it(
    'a full session (every request, edits, settings, the workspace ' +
      'check, shutdown) makes no connection, writes nothing, starts nothing',
    async () => {
      const before = snapshot(dir);
      const proc = spawn(process.execPath, ['--require', AUDIT, serverBin(), '--stdio'], {
        cwd: dir,
        stdio: ['pipe', 'pipe', 'pipe'],
      });
      const s = new Session(
        proc,
        createMessageConnection(new StreamMessageReader(proc.stdout!), new StreamMessageWriter(proc.stdin!)),
      );
      try {
        s.configuration = () => ({ units: 'SI', precision: 1 });
        const folder = pathToFileURL(dir).href;
        await s.initialize(FULL_CAPABILITIES, { rootUri: folder, workspaceFolders: [{ uri: folder, name: 'calcs' }] });
        const uri = pathToFileURL(join(dir, 'calcs', 'ahu-1.md')).href;
        const text = readFileSync(join(dir, 'calcs', 'ahu-1.md'), 'utf8');
        await s.open(uri, text, 1);
        const td = { textDocument: { uri } };
        const pos = { line: 3, character: 7 };
        const range = { start: { line: 0, character: 0 }, end: { line: 8, character: 0 } };
        const answers = await Promise.all([
          s.request('textDocument/diagnostic', td),
          s.request('textDocument/hover', { ...td, position: pos }),
          s.request('textDocument/inlayHint', { ...td, range }),
          s.request('textDocument/completion', { ...td, position: { line: 4, character: 16 } }),
          s.request('textDocument/documentSymbol', td),
          s.request('textDocument/codeAction', { ...td, range, context: { diagnostics: [] } }),
          s.request('textDocument/definition', { ...td, position: { line: 5, character: 8 } }),
          s.request('textDocument/references', { ...td, position: pos, context: { includeDeclaration: true } }),
          s.request('textDocument/prepareRename', { ...td, position: pos }),
          s.request('textDocument/rename', { ...td, position: pos, newName: 'OUT' }),
          s.request('dewmark/noteStatus', td),
          s.request('workspace/executeCommand', {
            command: 'dewmark.server.resultsTables',
            arguments: [{ textDocument: { uri }, all: true }],
          }),
        ]);
        expect(answers.filter((a) => a !== null).length).toBeGreaterThan(8);
        await s.change(uri, 2, [
          { range: { start: { line: 3, character: 13 }, end: { line: 3, character: 15 } }, text: '35' },
        ]);
        await s.connection.sendNotification('workspace/didChangeConfiguration', {
          settings: { dewmark: { units: 'IP' } },
        });
        const checked = await s.request<CheckWorkspaceResult>('dewmark/checkWorkspace', {});
        expect(checked.filesRead).toBe(2); // read, not written
        expect(checked.errors).toBeGreaterThan(0);
        await s.connection.sendNotification('textDocument/didClose', td);
        expect(await s.shutdown()).toBe(0);
      } finally {
        s.kill();
      }
      expect(s.stderr, 'the preload ran in the server').toContain(`[io-audit-ready] ${proc.pid}`);
      const records = auditRecords(s.stderr);
      expect(records, `the server attempted: ${JSON.stringify(records)}`).toEqual([]);
      expect(snapshot(dir)).toEqual(before);
    },
  );
});
