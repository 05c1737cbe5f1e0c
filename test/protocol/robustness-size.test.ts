/**
 * Very large notes through the real protocol: past `dewmark.maxNoteSizeKB` (2048 KB by default) the
 * server says so with one info diagnostic and answers every request with nothing, instead of
 * evaluating megabytes after every keystroke; changing the setting takes effect at once. A 1 MB
 * single line is under the default and evaluated as usual. (Timings are in bench/robustness.ts.)
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { NoteStatusResult } from '@dewmark/protocol';
import { FULL_CAPABILITIES, PUSH_ONLY_CAPABILITIES, startServer, type Range, type Session } from './harness';

/** A note of about `chars` characters: blocks of states and mixes under headings (an invented campus). */
function bigNote(chars: number): string {
  const parts: string[] = ['# Harbourside campus (generated)\n\n'];
  let len = parts[0]!.length;
  for (let b = 0; len < chars; b++) {
    const part =
      `## Room ${b}\n\n\`\`\`air\nstate OA${b}: db=${29 + (b % 6)}C wb=${20 + (b % 6)}C\nstate ` +
      `RA${b}: db=24C rh=50%\nmix MA${b}: OA${b} 30% + RA${b} 70%\n\`\`\`\n\n`;
    parts.push(part);
    len += part.length;
  }
  return parts.join('');
}

interface Diag {
  code?: string;
  severity?: number;
  message: string;
  range: Range;
}

let s: Session;
let settings: Record<string, unknown> = {};

beforeAll(async () => {
  s = startServer();
  s.configuration = () => settings;
  await s.initialize(FULL_CAPABILITIES);
});

afterAll(async () => {
  if (s) {
    expect(await s.shutdown()).toBe(0);
    s.kill();
  }
});

async function pull(uri: string): Promise<Diag[]> {
  const r = await s.request<{ items: Diag[] }>('textDocument/diagnostic', { textDocument: { uri } });
  return r.items;
}

describe('notes over the size limit', () => {
  it('a 5 MB note: one info diagnostic, and every request is answered with nothing', async () => {
    const uri = 'file:///size/five-mb.md';
    const text = bigNote(5 * 1024 * 1024);
    await s.open(uri, text, 1);
    const d = await pull(uri);
    expect(d.map((x) => [x.code, x.severity])).toEqual([['note-too-large', 3]]);
    expect(d[0]!.message).toMatch(/5\.0 MB, more than the 2\.0 MB/);
    expect(d[0]!.range).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: text.indexOf('\n') } });
    const td = { textDocument: { uri } };
    const pos = { line: 6, character: 7 };
    expect(await s.request('textDocument/hover', { ...td, position: pos })).toBeNull();
    expect(
      await s.request('textDocument/inlayHint', {
        ...td,
        range: { start: { line: 0, character: 0 }, end: { line: 200, character: 0 } },
      }),
    ).toEqual([]);
    expect(await s.request('textDocument/documentSymbol', td)).toEqual([]);
    expect(
      await s.request('textDocument/codeAction', {
        ...td,
        range: { start: pos, end: pos },
        context: { diagnostics: [] },
      }),
    ).toEqual([]);
    const status = await s.request<NoteStatusResult>('dewmark/noteStatus', td);
    expect(status.units).toBe('SI');
    // Typing on: still one diagnostic, for the new version.
    await s.change(uri, 2, [
      { range: { start: { line: 6, character: 0 }, end: { line: 6, character: 0 } }, text: 'x' },
    ]);
    expect((await pull(uri)).map((x) => x.code)).toEqual(['note-too-large']);
    await s.connection.sendNotification('textDocument/didClose', td);
  });

  it('the setting applies at once: a 300 KB note is limited at 256 KB and evaluated at 512 KB', async () => {
    const uri = 'file:///size/three-hundred-kb.md';
    settings = { maxNoteSizeKB: 256 };
    await s.connection.sendNotification('workspace/didChangeConfiguration', { settings: { dewmark: settings } });
    await s.open(uri, bigNote(300 * 1024), 1);
    expect((await pull(uri)).map((x) => x.code)).toEqual(['note-too-large']);
    settings = { maxNoteSizeKB: 512 };
    await s.connection.sendNotification('workspace/didChangeConfiguration', { settings: { dewmark: settings } });
    const d = await pull(uri);
    expect(d.map((x) => x.code)).not.toContain('note-too-large');
    const hover = await s.request<{ contents: { value: string } } | null>('textDocument/hover', {
      textDocument: { uri },
      position: { line: 6, character: 7 },
    });
    expect(hover?.contents.value).toContain('RA0');
    settings = {};
    await s.connection.sendNotification('workspace/didChangeConfiguration', { settings: { dewmark: settings } });
    await s.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  });

  it('a single 1 MB line is under the default limit: evaluated, with hints', async () => {
    const uri = 'file:///size/one-line.md';
    const piece = (i: number) => `\`state L${i}: db=${20 + (i % 9)}C rh=${40 + (i % 30)}%\` then `;
    let line = 'Inline figures: ';
    for (let i = 0; line.length < 1024 * 1024; i++) line += piece(i);
    await s.open(uri, line, 1);
    expect((await pull(uri)).map((x) => `${x.code}: ${x.message}`)).toEqual([]);
    const hints = await s.request<unknown[]>('textDocument/inlayHint', {
      textDocument: { uri },
      range: { start: { line: 0, character: 500_000 }, end: { line: 0, character: 504_000 } },
    });
    expect(hints.length).toBeGreaterThan(10);
    await s.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  });

  it('a push-only client gets the info diagnostic pushed, with the limit from initializationOptions', async () => {
    const p = startServer();
    try {
      await p.initialize(PUSH_ONLY_CAPABILITIES, { initializationOptions: { dewmark: { maxNoteSizeKB: 64 } } });
      const uri = 'file:///size/pushed.md';
      await p.open(uri, bigNote(100 * 1024), 1);
      const pushed = await p.diagnosticsFor(uri, 1);
      expect(pushed.diagnostics.map((x) => x.code)).toEqual(['note-too-large']);
      expect(pushed.diagnostics[0]!.message).toContain('dewmark.maxNoteSizeKB = 64');
      expect(await p.shutdown()).toBe(0);
    } finally {
      p.kill();
    }
  });
});
