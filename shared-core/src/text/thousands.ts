/**
 * Thousands separators: the one rule of what a group is, shared by display (`units/`, which groups
 * IP figures: `39,700 Btu/h`) and entry (`notation/number.ts`, which reads `8,745cfm`), so that
 * every grouped figure Dewmark shows reads back to the same value. A comma separates the whole
 * part into groups of three digits counted from the right; the first group has one to three
 * digits. The fraction and the exponent are never grouped (common practice in US engineering
 * documents).
 */

/** The separator between groups, as written and shown. */
export const GROUP_SEPARATOR = ',';

/** The digits of every group after the first (the first has one to {@link GROUP_SIZE}). */
export const GROUP_SIZE = 3;

/** `1234567` → `1,234,567`: a run of digits (only digits) in groups of three from the right. */
export function groupDigits(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+$)/g, GROUP_SEPARATOR);
}

const SEPARATOR_CODE = GROUP_SEPARATOR.charCodeAt(0);

function isDigit(c: number): boolean {
  return c >= 0x30 && c <= 0x39;
}

/**
 * Whether a separator and a whole group start at `pos` in `text[…, end)`: the comma, then exactly
 * {@link GROUP_SIZE} digits not followed by another digit. The entry side of the rule; the scanner
 * takes groups only after a first group of one to three digits that does not start with 0.
 */
export function groupAt(text: string, pos: number, end: number): boolean {
  if (pos + GROUP_SIZE >= end || text.charCodeAt(pos) !== SEPARATOR_CODE) return false;
  for (let i = 1; i <= GROUP_SIZE; i++) if (!isDigit(text.charCodeAt(pos + i))) return false;
  return !(pos + GROUP_SIZE + 1 < end && isDigit(text.charCodeAt(pos + GROUP_SIZE + 1)));
}
