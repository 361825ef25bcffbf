/**
 * Decimal strings of a certificate shortened for people: interval ends are rounded OUTWARD (lower
 * end toward −∞, upper end toward +∞), so a displayed enclosure never claims more than was proven.
 * Shared by the terminal tables (cli/format.ts) and the HTML report (report/); one home.
 */
import { Decimal } from 'decimal.js';

const Down = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_FLOOR, toExpNeg: -7, toExpPos: 21 });
const Up = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_CEIL, toExpNeg: -7, toExpPos: 21 });

/** Lower end shortened to `sig` significant digits, rounded toward −∞ (decimal strings only). */
export function shortDown(x: string, sig = 12): string {
  return new Down(x).toSignificantDigits(sig, Decimal.ROUND_FLOOR).toString();
}

/** Upper end shortened to `sig` significant digits, rounded toward +∞. */
export function shortUp(x: string, sig = 12): string {
  return new Up(x).toSignificantDigits(sig, Decimal.ROUND_CEIL).toString();
}

/** `[lo, hi]` shortened outward to `sig` significant digits. */
export function formatInterval(iv: readonly [string, string], sig = 12): string {
  return `[${shortDown(iv[0], sig)}, ${shortUp(iv[1], sig)}]`;
}

/** Upper bound of hi − lo as a short exponent string, e.g. "2.3e-16". */
export function widthUp(iv: readonly [string, string]): string {
  const w = new Up(iv[1]).minus(new Up(iv[0]));
  if (w.isZero()) return '0';
  return w.toSignificantDigits(2, Decimal.ROUND_CEIL).toExponential();
}

/** A decimal string shortened to `sig` significant digits, round to nearest (for points only). */
export function shortPoint(x: string, sig = 12): string {
  return new Decimal(x).toSignificantDigits(sig).toString();
}
