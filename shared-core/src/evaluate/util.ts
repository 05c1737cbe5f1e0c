/** Small helpers of the evaluator: spans, number formatting (suggestions: `../text/suggest`), lists. */
import type { Span } from '../text/types';

/**
 * `list` with `x` appended, made at the first element (for lists that are most often empty: no
 * array until one is needed).
 */
export function appended<T>(list: T[] | null, x: T): T[] {
  if (list === null) return [x];
  list.push(x);
  return list;
}

/** The smallest span that covers all the given spans (the first one when only one). */
export function spanUnion(...spans: Span[]): Span {
  let start = Infinity;
  let end = -Infinity;
  for (const s of spans) {
    if (s.start < start) start = s.start;
    if (s.end > end) end = s.end;
  }
  if (!Number.isFinite(start) || !Number.isFinite(end)) return { start: 0, end: 0 };
  return { start, end };
}

/** Number of decimals that shows a value to the given place value (0.01 → 2, 1 → 0, 100 → 0). */
export function decimalsFor(resolution: number): number {
  if (!(resolution > 0) || !Number.isFinite(resolution)) return 3;
  const d = Math.round(-Math.log10(resolution));
  return Math.min(12, Math.max(0, d));
}

/** Formats a value to the place value of the last written digit (`resolution`), without `-0`. */
export function formatAtResolution(value: number, resolution: number): string {
  if (!Number.isFinite(value)) return String(value);
  let v = value;
  if (resolution >= 1 && Number.isFinite(resolution)) v = Math.round(value / resolution) * resolution;
  const text = v.toFixed(decimalsFor(resolution));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** Formats a number with `sig` significant figures for messages (no exponent for ordinary sizes). */
export function formatSig(value: number, sig = 4): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const mag = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(10, Math.max(0, sig - 1 - mag));
  const text = value.toFixed(decimals);
  const trimmed = text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
  return trimmed === '-0' ? '0' : trimmed;
}

/** True when every number reachable in `value` (objects, arrays) is finite. */
export function allFinite(value: unknown, seen = new Set<unknown>()): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (value === null || typeof value !== 'object') return true;
  if (seen.has(value)) return true;
  seen.add(value);
  if (value instanceof Map) {
    for (const v of value.values()) if (!allFinite(v, seen)) return false;
    return true;
  }
  for (const v of Object.values(value as Record<string, unknown>)) if (!allFinite(v, seen)) return false;
  return true;
}
