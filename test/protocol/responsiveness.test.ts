/**
 * A long analysis does not hold the server: while a large note is being analysed (its first
 * diagnostics not yet published), a cancelled hover on it is answered with RequestCancelled and
 * a hover in a small note is answered — both before the large note's diagnostics arrive. Order of
 * events through the real protocol, never a timing.
 */
import { describe, expect, it } from 'vitest';
import { CancellationTokenSource } from 'vscode-jsonrpc/node';
import { PUSH_ONLY_CAPABILITIES, startServer } from './harness';

/** An invented note of `n` states in one block (about 36 bytes a line; under the default size limit). */
function largeNote(n: number): string {
  const lines = ['# Campus zones (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state Z${i}: db=${18 + (i % 12)}C rh=${30 + (i % 50)}%`);
  lines.push('```', '');
  return lines.join('\n');
}

describe('a long analysis yields to other requests', () => {
  it('answers a cancelled hover and a hover in a small note before the large note is analysed', async () => {
    const s = startServer();
    try {
      await s.initialize(PUSH_ONLY_CAPABILITIES);
      const small = 'file:///yield/small.md';
      const large = 'file:///yield/large.md';
      await s.open(small, '```air\nstate RA: db=24C rh=50%\n```\n');
      await s.diagnosticsFor(small, 1);

      const events: string[] = [];
      const largePublished = s
        .until('the large note diagnostics', () => s.published.find((p) => p.uri === large))
        .then(() => events.push('large published'));
      await s.open(large, largeNote(20_000));
      const source = new CancellationTokenSource();
      const cancelledHover = s.connection
        .sendRequest(
          'textDocument/hover',
          { textDocument: { uri: large }, position: { line: 3, character: 7 } },
          source.token,
        )
        .then(
          () => ({ code: 0 }),
          (e: { code?: number }) => ({ code: e.code ?? 0 }),
        )
        .then((r) => {
          events.push('cancelled hover answered');
          return r;
        });
      source.cancel();
      const smallHover = s
        .request<{ contents: { value: string } } | null>('textDocument/hover', {
          textDocument: { uri: small },
          position: { line: 1, character: 7 },
        })
        .then((h) => {
          events.push('small hover answered');
          return h;
        });

      expect((await cancelledHover).code).toBe(-32800); // RequestCancelled (LSP)
      expect((await smallHover)?.contents.value).toContain('**state RA**');
      await largePublished;
      expect(events.indexOf('large published')).toBe(2);
      // And the large note's analysis still finished, without problems.
      const pub = s.published.find((p) => p.uri === large)!;
      expect(pub.diagnostics).toEqual([]);
      expect(await s.shutdown()).toBe(0);
    } finally {
      s.kill();
    }
  }, 120_000);
});
