/**
 * The canonical spelling of a decimal literal in a map definition (bounded length and exponent).
 * No doubles anywhere (DESIGN.md §5: a literal "3.83" is exactly 383/100). The syntax and the
 * exact comparison live in src/interval/decimal-literal.ts.
 */
import { DECIMAL_LITERAL } from '../interval/decimal-literal.js';

export const MAX_DECIMAL_LENGTH = 1000;
export const MAX_DECIMAL_EXPONENT = 9999;

/**
 * Canonical spelling of a decimal literal, or null when `text` is not one: a leading '+' is
 * dropped, '.5' becomes '0.5', '5.' becomes '5', '-0' becomes '0'; digits are otherwise kept as
 * written ("0.1000000000000000055511151231257827" stays that text). Hex, inf, nan, underscores,
 * blanks inside: null. Length and exponent are bounded (MAX_DECIMAL_*).
 */
export function normalizeDecimal(text: string): string | null {
  const s = text.trim();
  if (s.length === 0 || s.length > MAX_DECIMAL_LENGTH) return null;
  const m = DECIMAL_LITERAL.exec(s);
  if (m === null) return null;
  if (m[3] !== undefined && Math.abs(Number(m[3])) > MAX_DECIMAL_EXPONENT) return null;
  let mant = m[2]!;
  if (mant.startsWith('.')) mant = `0${mant}`;
  if (mant.endsWith('.')) mant = mant.slice(0, -1);
  const exp = m[3] !== undefined ? `e${m[3]}` : '';
  const sign = m[1] === '-' && /[1-9]/.test(mant) ? '-' : '';
  return `${sign}${mant}${exp}`;
}
