/**
 * Results tables through the real protocol: the `workspace/executeCommand` that answers with the
 * edit (versioned, never applied by the server), the source code actions, the
 * `stale-results-table` diagnostic and its quick fix, for a full client and a push-only one.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ResultsTableResult } from '@dewmark/protocol';
import {
  FULL_CAPABILITIES,
  PUSH_ONLY_CAPABILITIES,
  positionOf,
  startServer,
  type Range,
  type Session,
} from './harness';

const NOTE = [
  '# Northgate clinic — AHU-1', // 0
  '', // 1
  '```air', // 2
  'state OA: db=33C rh=40%', // 3
  'state RA: db=23C rh=50%', // 4
  '```', // 5
  '', // 6
  'The mix and the coil:', // 7
  '', // 8
  '```air', // 9
  'mix MA: OA 20% + RA 80%', // 10
  'state SA: db=13C rh=90%', // 11
  'process CC: MA -> SA m=3kg/s', // 12
  '```', // 13
  '', // 14
].join('\n');

const COMMAND = 'dewmark.server.resultsTables';

interface TextEdit {
  range: Range;
  newText: string;
}
/**
 * The server's result (`@dewmark/protocol`), its `edit` typed
 * as the text edits the server sends (versioned, or by URI).
 */
type Result = Omit<ResultsTableResult, 'edit'> & {
  edit: {
    documentChanges?: { textDocument: { uri: string; version: number }; edits: TextEdit[] }[];
    changes?: Record<string, TextEdit[]>;
  } | null;
};
interface Action {
  title: string;
  kind: string;
  isPreferred?: boolean;
  diagnostics?: { code?: string }[];
  edit: { changes: Record<string, TextEdit[]> };
}
interface Diag {
  range: Range;
  code?: string;
  severity?: number;
  message: string;
  source?: string;
}

/** Applies LSP text edits (non-overlapping) to `text`. */
function apply(text: string, edits: readonly TextEdit[]): string {
  const lines = text.split('\n');
  const offset = (p: { line: number; character: number }) =>
    lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
  let out = text;
  for (const e of [...edits].sort((a, b) => offset(b.range.start) - offset(a.range.start)))
    out = out.slice(0, offset(e.range.start)) + e.newText + out.slice(offset(e.range.end));
  return out;
}

let s: Session;
const URI = 'file:///work-notes/clinic-ahu1.md';

beforeAll(async () => {
  s = startServer();
  await s.initialize(FULL_CAPABILITIES);
  await s.open(URI, NOTE, 3);
});

afterAll(async () => {
  if (s) {
    expect(await s.shutdown()).toBe(0);
    s.kill();
  }
});

describe('workspace/executeCommand dewmark.server.resultsTables', () => {
  it('answers with a versioned edit for the block at the position, and applies nothing itself', async () => {
    const r = await s.request<Result>('workspace/executeCommand', {
      command: COMMAND,
      arguments: [{ textDocument: { uri: URI }, position: positionOf(NOTE, 'mix MA') }],
    });
    expect(r).toMatchObject({ blocks: 1, inserted: 1, refreshed: 0, unchanged: 0, unterminated: 0, version: 3 });
    const change = r.edit!.documentChanges![0]!;
    expect(change.textDocument).toEqual({ uri: URI, version: 3 });
    expect(change.edits).toHaveLength(1);
    expect(change.edits[0]!.range).toEqual({ start: { line: 13, character: 3 }, end: { line: 13, character: 3 } });
    expect(change.edits[0]!.newText).toMatch(/^\n\n<!-- dewmark-results [0-9a-f]{8}: [^\n]*-->\n\n\| state /);
    expect(change.edits[0]!.newText).toMatch(/\| CC: MA → SA \| cooling and dehumidifying, ADP [\d.]+ °C \|/);
    // The server's copy of the note is unchanged: it still has no table (nothing is stale, nothing was written).
    const diags = (await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri: URI } })).items;
    expect(diags).toEqual([]);
  });

  it('with all: true covers every block, and after the edit a second run has nothing to do', async () => {
    const r = await s.request<Result>('workspace/executeCommand', {
      command: COMMAND,
      arguments: [{ textDocument: { uri: URI }, all: true }],
    });
    expect(r).toMatchObject({ blocks: 2, inserted: 2 });
    const written = apply(NOTE, r.edit!.documentChanges![0]!.edits);
    const uri = 'file:///work-notes/clinic-ahu1-written.md';
    await s.open(uri, written, 1);
    const again = await s.request<Result>('workspace/executeCommand', {
      command: COMMAND,
      arguments: [{ textDocument: { uri }, all: true }],
    });
    expect(again).toMatchObject({ edit: null, blocks: 2, inserted: 0, refreshed: 0, unchanged: 2 });
  });

  it(
    'says blocks: 0 for a position outside every block, null ' +
      'for a note that is not open, and rejects bad arguments',
    async () => {
      const outside = await s.request<Result>('workspace/executeCommand', {
        command: COMMAND,
        arguments: [{ textDocument: { uri: URI }, position: positionOf(NOTE, 'The mix') }],
      });
      expect(outside).toMatchObject({ edit: null, blocks: 0 });
      expect(
        await s.request('workspace/executeCommand', {
          command: COMMAND,
          arguments: [{ textDocument: { uri: 'file:///work-notes/closed.md' }, all: true }],
        }),
      ).toBeNull();
      await expect(s.request('workspace/executeCommand', { command: COMMAND, arguments: [] })).rejects.toThrow(
        /takes one argument/,
      );
      await expect(
        s.request('workspace/executeCommand', { command: COMMAND, arguments: [{ textDocument: { uri: URI } }] }),
      ).rejects.toThrow(/needs a position/);
      await expect(
        s.request('workspace/executeCommand', { command: 'dewmark.nothing', arguments: [] }),
      ).rejects.toThrow(/unknown command/);
    },
  );
});

describe('code actions and the stale-table diagnostic', () => {
  it('offers the source actions when asked for source actions, and not on an automatic request', async () => {
    const range = { start: positionOf(NOTE, 'state OA'), end: positionOf(NOTE, 'state OA') };
    const asked = await s.request<Action[]>('textDocument/codeAction', {
      textDocument: { uri: URI },
      range,
      context: { diagnostics: [], only: ['source'] },
    });
    expect(asked.map((a) => [a.kind, a.title])).toEqual([
      ['source.dewmark.resultsTable', 'Insert a results table below this air block'],
      ['source.dewmark.resultsTable', 'Insert or refresh the results tables of every air block (2 to insert)'],
    ]);
    const edited = apply(NOTE, asked[0]!.edit.changes[URI]!);
    expect(edited.split('\n').slice(0, 6)).toEqual(NOTE.split('\n').slice(0, 6));
    expect(edited).toMatch(/```\n\n<!-- dewmark-results [0-9a-f]{8}: /);
    const invoked = await s.request<Action[]>('textDocument/codeAction', {
      textDocument: { uri: URI },
      range,
      context: { diagnostics: [], triggerKind: 1 },
    });
    expect(invoked.filter((a) => a.kind.startsWith('source.')).length).toBe(2);
    const automatic = await s.request<Action[]>('textDocument/codeAction', {
      textDocument: { uri: URI },
      range,
      context: { diagnostics: [], triggerKind: 2 },
    });
    expect(automatic.filter((a) => a.kind.startsWith('source.'))).toEqual([]);
    const quickfixOnly = await s.request<Action[]>('textDocument/codeAction', {
      textDocument: { uri: URI },
      range,
      context: { diagnostics: [], only: ['quickfix'], triggerKind: 1 },
    });
    expect(quickfixOnly).toEqual([]);
  });

  it('reports a stale table with its code on the start marker, and the quick fix refreshes it', async () => {
    const r = await s.request<Result>('workspace/executeCommand', {
      command: COMMAND,
      arguments: [{ textDocument: { uri: URI }, all: true }],
    });
    const stale = apply(NOTE, r.edit!.documentChanges![0]!.edits).replace(
      'state RA: db=23C rh=50%',
      'state RA: db=24C rh=50%',
    );
    const uri = 'file:///work-notes/clinic-ahu1-stale.md';
    await s.open(uri, stale, 1);
    const diags = (await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri } })).items;
    const warnings = diags.filter((d) => d.code === 'stale-results-table');
    expect(warnings).toHaveLength(2);
    for (const d of warnings) {
      expect(d.severity).toBe(2); // Warning
      expect(d.source).toBe('dewmark');
      expect(d.range.start.character).toBe(0);
      expect(stale.split('\n')[d.range.start.line]).toMatch(/^<!-- dewmark-results [0-9a-f]{8}: /);
      expect(d.message).toContain('Dewmark: Insert or Refresh Results Table');
    }
    const fixes = await s.request<Action[]>('textDocument/codeAction', {
      textDocument: { uri },
      range: warnings[0]!.range,
      context: { diagnostics: [warnings[0]], only: ['quickfix'] },
    });
    const fix = fixes.find((a) => a.title === 'Refresh the results table below this air block');
    expect(fix?.isPreferred).toBe(true);
    expect(fix?.diagnostics?.[0]?.code).toBe('stale-results-table');
    const edits = fix!.edit.changes[uri]!;
    expect(edits).toHaveLength(1);
    expect(edits[0]!.range.start).toEqual(warnings[0]!.range.start);
    const fixed = apply(stale, edits);
    await s.change(uri, 2, [
      {
        range: { start: { line: 0, character: 0 }, end: { line: stale.split('\n').length, character: 0 } },
        text: fixed,
      },
    ]);
    const after = (await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri } })).items;
    expect(after.filter((d) => d.code === 'stale-results-table')).toHaveLength(1);
  });
});

describe('a push-only client (like Neovim 0.7)', () => {
  it('gets the edit as plain changes, and the stale warning pushed', async () => {
    const p = startServer();
    try {
      const caps = (await p.initialize(PUSH_ONLY_CAPABILITIES)).capabilities;
      expect(caps.executeCommandProvider).toEqual({ commands: [COMMAND] });
      const uri = 'file:///work-notes/push.md';
      await p.open(uri, NOTE, 1);
      const r = await p.request<Result>('workspace/executeCommand', {
        command: COMMAND,
        arguments: [{ textDocument: { uri }, all: true }],
      });
      expect(r.edit!.documentChanges).toBeUndefined();
      const stale = apply(NOTE, r.edit!.changes![uri]!).replace('rh=90%', 'rh=88%');
      await p.open('file:///work-notes/push-stale.md', stale, 1);
      const pushed = await p.diagnosticsFor('file:///work-notes/push-stale.md', 1);
      expect(pushed.diagnostics.map((d) => d.code)).toEqual(['stale-results-table']);
      expect(await p.shutdown()).toBe(0);
    } finally {
      p.kill();
    }
  });
});
