/**
 * `markdown/markdownIt.ts` repeats a few of markdown-it's internals (listed in its header: the
 * line table and getLines of the block state, the tokens' constructor and push, the closing-fence
 * test). This test fails when the installed markdown-it is not the version they were copied from,
 * or when one of those functions as markdown-it ships it has changed: then compare each copy with
 * the new source, update it, and record the new version and fingerprints here.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import MarkdownIt from 'markdown-it';
import { describe, expect, it } from 'vitest';
import { MARKDOWN_IT_COPIED_FROM } from '../src/markdown/markdownIt';

/** The version of the markdown-it the core resolves (its package.json above the resolved entry). */
function installedVersion(): string {
  let dir = dirname(createRequire(import.meta.url).resolve('markdown-it'));
  for (;;) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg)) {
      const json = JSON.parse(readFileSync(pkg, 'utf8')) as { name?: string; version?: string };
      if (json.name === 'markdown-it' && json.version) return json.version;
    }
    const up = dirname(dir);
    if (up === dir) throw new Error('markdown-it package.json not found above its entry point');
    dir = up;
  }
}

type AnyFunction = (...args: never[]) => unknown;

/** The markdown-it functions the copies repeat, as markdown-it ships them. */
function upstream(): Record<string, AnyFunction> {
  const md = new MarkdownIt('commonmark');
  const fence = md.block.ruler.__rules__.find((r) => r.name === 'fence');
  if (!fence) throw new Error('markdown-it has no fence rule');
  return {
    'Token (constructor)': new md.core.State('', md, {}).Token as unknown as AnyFunction,
    'StateBlock (constructor)': md.block.State as unknown as AnyFunction,
    'StateBlock.prototype.getLines': md.block.State.prototype.getLines as AnyFunction,
    'StateBlock.prototype.push': md.block.State.prototype.push as AnyFunction,
    'StateInline.prototype.push': md.inline.State.prototype.push as AnyFunction,
    'StateInline.prototype.pushPending': md.inline.State.prototype.pushPending as AnyFunction,
    'fence rule': fence.fn as AnyFunction,
  };
}

const fingerprint = (f: AnyFunction): string =>
  createHash('sha256').update(Function.prototype.toString.call(f)).digest('hex').slice(0, 16);

/** Fingerprints (sha-256 of the source text, 16 hex digits) of the functions above in markdown-it 15.0.3. */
const COPIED: Record<string, string> = {
  'Token (constructor)': '665738eae4ef6479',
  'StateBlock (constructor)': 'feed0e7d47db3399',
  'StateBlock.prototype.getLines': '3fe4997bdde55e94',
  'StateBlock.prototype.push': '3a2f4161ca7e5b52',
  'StateInline.prototype.push': 'bfd569c86498dfb5',
  'StateInline.prototype.pushPending': '04f44b33bedfe944',
  'fence rule': '26ae2e39e1efc86b',
};

describe('the markdown-it internals repeated in markdownIt.ts', () => {
  it('were copied from the installed version', () => {
    expect(installedVersion()).toBe(MARKDOWN_IT_COPIED_FROM);
  });

  it('are unchanged in the installed markdown-it', () => {
    const now = Object.fromEntries(Object.entries(upstream()).map(([name, f]) => [name, fingerprint(f)]));
    expect(now).toEqual(COPIED);
  });

  it('the fingerprint sees a change of one character (the check can fail)', () => {
    const a = function getLines(begin: number) {
      return begin + 1;
    };
    const b = function getLines(begin: number) {
      return begin + 2;
    };
    expect(fingerprint(a as AnyFunction)).not.toBe(fingerprint(b as AnyFunction));
  });
});
