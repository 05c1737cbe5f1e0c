/** What the JSON writer tests compare the writer's pieces with. */
import { expect } from 'vitest';
import { pieceText } from '../../src/jsonWriter';

/** JSON.stringify(value, null, 2) as if the value were nested `depth` levels deep (in arrays). */
export function stringifiedAt(value: unknown, depth: number): string {
  let nested: unknown = value;
  let before = '';
  let after = '';
  for (let k = 0; k < depth; k++) {
    nested = [nested];
    before += `${'  '.repeat(k)}[\n`;
    after = `\n${'  '.repeat(k)}]${after}`;
  }
  before += '  '.repeat(depth);
  const whole = JSON.stringify(nested, null, 2);
  expect(whole.startsWith(before) && whole.endsWith(after)).toBe(true);
  return whole.slice(before.length, whole.length - after.length);
}

/** Takes lent pieces as a stream that writes them at once would: their text, each decoded on its own. */
export function collector(): { take: (piece: Uint8Array) => boolean; pieces: string[]; text: () => string } {
  const pieces: string[] = [];
  return {
    take: (piece) => {
      pieces.push(pieceText(piece));
      return false;
    },
    pieces,
    text: () => pieces.join(''),
  };
}
