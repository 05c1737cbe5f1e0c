/** Source positions: UTF-16 offsets ⇄ 1-based lines and columns. */
export { LineIndex, type LinePosition } from './lineIndex';
export type { LineCol, Span } from './types';
