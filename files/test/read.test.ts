/**
 * Reading a note (`readInput`): a regular file's bytes land in one buffer, read once (the sniffed
 * head is its start), and no second copy is made before they are decoded; binary, too large,
 * invalid UTF-8, empty and short files give the same outcomes as ever. Counts the buffers the
 * system reads into and the bytes asked for, never time.
 */
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest';
import * as fs from 'node:fs';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** Every `readSync` call: the memory it reads into and how many bytes it asks for. */
const reads: { into: ArrayBufferLike; length: number }[] = [];

vi.mock('node:fs', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:fs')>();
  const readSync = (fd: number, buf: NodeJS.ArrayBufferView, offset: number, length: number, position: null) => {
    reads.push({ into: buf.buffer, length });
    return real.readSync(fd, buf, offset, length, position);
  };
  return { ...real, default: { ...real, readSync }, readSync };
});

const { BINARY_SNIFF, readInput } = await import('../src/index');

const dir = mkdtempSync(join(tmpdir(), 'dewmark-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
afterEach(() => {
  reads.length = 0;
  vi.restoreAllMocks();
});

/** A file in the temporary folder holding `content`; its input as the CLI gives it. */
function file(name: string, content: string | Uint8Array): { display: string; abs: string } {
  const abs = join(dir, name);
  writeFileSync(abs, content);
  return { display: name, abs };
}

/** A note of `n` plain state lines (well past the sniffed head). */
function note(n: number): string {
  const lines = ['# Level 3 plant room (invented)', '', '```air'];
  for (let i = 0; i < n; i++) lines.push(`state S${i}: db=${20 + (i % 7)}C rh=${40 + (i % 30)}%`);
  lines.push('```', '');
  return lines.join('\n');
}

describe('readInput', () => {
  it('reads a regular file into one buffer, once, with no copy before decoding', () => {
    const text = note(5000);
    const size = Buffer.byteLength(text);
    expect(size).toBeGreaterThan(10 * BINARY_SNIFF);
    const concat = vi.spyOn(Buffer, 'concat');
    const r = readInput(file('long.md', text));
    expect(r).toEqual({ ok: true, text });
    // Every read lands in the same memory: the head, then the rest after it.
    expect(new Set(reads.map((c) => c.into)).size).toBe(1);
    expect(reads[0]?.into.byteLength).toBeGreaterThan(size);
    // The head, the rest with one byte more (to see a file that grew), and the read that finds the end.
    expect(reads.map((c) => c.length)).toEqual([BINARY_SNIFF, size + 1 - BINARY_SNIFF, 1]);
    expect(concat).not.toHaveBeenCalled();
  });

  it('reads a note shorter than the sniffed head into the head alone', () => {
    const text = note(3);
    const size = Buffer.byteLength(text);
    expect(readInput(file('short.md', text))).toEqual({ ok: true, text });
    // The read that fills the head, and the one that finds the end.
    expect(reads.map((c) => c.length)).toEqual([BINARY_SNIFF, BINARY_SNIFF - size]);
  });

  it('gives the empty text of an empty file', () => {
    expect(readInput(file('empty.md', ''))).toEqual({ ok: true, text: '' });
  });

  it('leaves the byte-order mark out of the text, as the decoder always did', () => {
    const text = note(400);
    expect(readInput(file('bom.md', `\uFEFF${text}`))).toEqual({ ok: true, text });
  });

  it('says a file with a NUL byte in its head is binary, and reads no further', () => {
    const bytes = Buffer.from(note(2000));
    bytes[100] = 0;
    const r = readInput(file('nul.md', bytes));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/'nul\.md' is a binary file/);
    expect(reads.map((c) => c.length)).toEqual([BINARY_SNIFF]);
  });

  it('says a file over the limit is too large after reading its head only', () => {
    const text = note(2000);
    const r = readInput(file('big.md', text), 20_000);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/'big\.md' is \d+(\.\d)? MB, more than the 0 MB one note may be/);
    expect(reads.map((c) => c.length)).toEqual([BINARY_SNIFF]);
  });

  it('says where the first invalid UTF-8 byte of a long file is', () => {
    const bytes = Buffer.from(note(2000));
    bytes[20_000] = 0xff;
    const r = readInput(file('latin.md', bytes));
    expect(r).toEqual({
      ok: false,
      message: "'latin.md' is not valid UTF-8 text (first bad byte at offset 20000); save it as UTF-8",
    });
  });

  it('says a folder is a folder', () => {
    expect(readInput({ display: 'here', abs: dir })).toEqual({
      ok: false,
      message: "cannot read 'here': it is a folder",
    });
  });
});

describe('readInput from a device (no size)', () => {
  it('reads /dev/zero only as far as its head (binary)', () => {
    if (!fs.existsSync('/dev/zero')) return;
    const r = readInput({ display: '/dev/zero', abs: '/dev/zero' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/binary file/);
  });
});
