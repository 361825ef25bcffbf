/**
 * Decimal strings of a certificate shortened for people: interval ends are rounded OUTWARD (lower
 * end toward −∞, upper end toward +∞), so a displayed enclosure never claims more than was proven.
 * Shared by the terminal tables (cli/format.ts) and the HTML report (report/); one home.
 */
import { Decimal } from 'decimal.js';

const Down = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_FLOOR, toExpNeg: -7, toExpPos: 7 });
const Up = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_CEIL, toExpNeg: -7, toExpPos: 7 });

/** Lower end shortened to `sig` significant digits, rounded toward −∞ (decimal strings only). */
export function shortDown(x: string, sig = 12): string {
  return compact(new Down(x).toSignificantDigits(sig, Decimal.ROUND_FLOOR).toString());
}

/** Upper end shortened to `sig` significant digits, rounded toward +∞. */
export function shortUp(x: string, sig = 12): string {
  return compact(new Up(x).toSignificantDigits(sig, Decimal.ROUND_CEIL).toString());
}

/** "1.1260072e+15" → "1.1260072e15": scientific form, compact (numbers ≥ 1e7 or < 1e-7 use it). */
function compact(s: string): string {
  return s.replace('e+', 'e');
}

/** Below this magnitude an enclosure of 0 is shown as "0 ± r". */
const TINY = new Up('1e-20');

/**
 * `[lo, hi]` shortened outward to `sig` significant digits. An enclosure of zero narrower than
 * 1e-20 reads "0 ± r" with r ≥ max(|lo|, |hi|) (e.g. the fixed point 0: "0 ± 1.1e-300").
 */
export function formatInterval(iv: readonly [string, string], sig = 12): string {
  const lo = new Up(iv[0]);
  const hi = new Up(iv[1]);
  if (lo.lte(0) && hi.gte(0)) {
    const mag = Decimal.max(lo.abs(), hi.abs());
    if (mag.isZero()) return '0';
    if (mag.lt(TINY)) return `0 ± ${shortUp(mag.toString(), 2)}`;
  }
  return `[${shortDown(iv[0], sig)}, ${shortUp(iv[1], sig)}]`;
}

/**
 * A modulus enclosure (|λ| ≥ 0 always): like formatInterval, with a negative lower end shown as 0
 * (still outward: the true modulus is never below 0).
 */
export function formatModulus(iv: readonly [string, string], sig = 12): string {
  const lo = new Up(iv[0]);
  if (lo.lt(0) || lo.isZero()) {
    const hi = new Up(iv[1]);
    return hi.lte(0) ? '0' : `[0, ${shortUp(iv[1], sig)}]`;
  }
  return formatInterval(iv, sig);
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
