/**
 * Exact decimal literals as text: syntax check, a canonical spelling, and exact comparison.
 * No doubles anywhere (DESIGN.md §5: a literal "3.83" is exactly 383/100).
 */

const DECIMAL = /^([+-]?)(\d+\.?\d*|\.\d+)(?:[eE]([+-]?\d+))?$/;
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
  const m = DECIMAL.exec(s);
  if (m === null) return null;
  if (m[3] !== undefined && Math.abs(Number(m[3])) > MAX_DECIMAL_EXPONENT) return null;
  let mant = m[2]!;
  if (mant.startsWith('.')) mant = `0${mant}`;
  if (mant.endsWith('.')) mant = mant.slice(0, -1);
  const exp = m[3] !== undefined ? `e${m[3]}` : '';
  const sign = m[1] === '-' && /[1-9]/.test(mant) ? '-' : '';
  return `${sign}${mant}${exp}`;
}

/** sign, significant digits (no leading/trailing zeros), and E with value = ±0.d1d2… × 10^E. */
function split(text: string): { sign: number; digits: string; e: number } {
  const m = DECIMAL.exec(text.trim());
  if (m === null) throw new Error(`internal: not a decimal literal: ${text}`);
  const [intPart, fracPart = ''] = m[2]!.split('.') as [string, string?];
  let digits = intPart + fracPart;
  let e = intPart.length + (m[3] !== undefined ? Number(m[3]) : 0);
  const lead = digits.search(/[1-9]/);
  if (lead < 0) return { sign: 0, digits: '', e: 0 };
  digits = digits.slice(lead);
  e -= lead;
  digits = digits.replace(/0+$/, '');
  return { sign: m[1] === '-' ? -1 : 1, digits, e };
}

/** Exact comparison of two decimal literals: −1, 0 or 1. */
export function compareDecimal(a: string, b: string): number {
  const x = split(a);
  const y = split(b);
  if (x.sign !== y.sign) return x.sign < y.sign ? -1 : 1;
  if (x.sign === 0) return 0;
  let mag: number;
  if (x.e !== y.e) mag = x.e < y.e ? -1 : 1;
  else {
    const len = Math.max(x.digits.length, y.digits.length);
    const dx = x.digits.padEnd(len, '0');
    const dy = y.digits.padEnd(len, '0');
    mag = dx === dy ? 0 : dx < dy ? -1 : 1;
  }
  return x.sign * mag;
}
