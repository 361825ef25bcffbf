/**
 * Decimal strings written by the prover: outward rounding to a number of significant digits,
 * the small relative widening of reported enclosures, |a − b| rounded up. All arithmetic here is
 * decimal.js with an explicit rounding mode per operation; exact comparison is `compareDecimal`
 * (src/interval/decimal-literal.ts).
 */
import { Decimal } from 'decimal.js';
import { compareDecimal } from '../interval/decimal-literal.js';

/** Exact work on short decimals: 2000 significant digits, directed modes set per call. */
const Exact = Decimal.clone({ precision: 2000, rounding: Decimal.ROUND_HALF_EVEN });
export const ExactFloor = Exact.clone({ rounding: Decimal.ROUND_FLOOR });
export const ExactCeil = Exact.clone({ rounding: Decimal.ROUND_CEIL });

export type RoundMode = 'floor' | 'ceil' | 'nearest';

function modeOf(m: RoundMode): Decimal.Rounding {
  return m === 'floor' ? Decimal.ROUND_FLOOR : m === 'ceil' ? Decimal.ROUND_CEIL : Decimal.ROUND_HALF_EVEN;
}

/** s (an exact decimal literal) rounded to `digits` significant digits in the given direction. */
export function roundDecimal(s: string, digits: number, mode: RoundMode): string {
  const d = new Exact(s);
  if (d.isZero()) return '0';
  return d.toSignificantDigits(digits, modeOf(mode)).toString();
}

/** |a − b| rounded up. */
export function absDiffUp(a: string, b: string): string {
  const x = new ExactCeil(a);
  const y = new ExactCeil(b);
  return (x.gte(y) ? x.sub(y) : y.sub(x)).toString();
}

/** Relative widening margin of reported enclosures (2^-30) and the absolute floor (1e-300). */
export const REPORT_RELATIVE_MARGIN = '9.3132257461547851562e-10';
export const REPORT_ABSOLUTE_MARGIN = '1e-300';

/**
 * [lo, hi] widened outward by |·|·2^-30 + `absoluteMargin` (default 1e-300; a quantity held in
 * scaled form m·2^e passes 1e-300·2^e, so a determinant like 0.3^5000 stays readable) and rounded outward to `digits` significant
 * digits, so an independent checker computing with different rounding lands inside it.
 */
export function widenPair(lo: string, hi: string, digits = 20, absoluteMargin: string = REPORT_ABSOLUTE_MARGIN): [string, string] {
  const Dn = ExactFloor;
  const Up = ExactCeil;
  const l = new Dn(lo);
  const h = new Up(hi);
  const wl = l.sub(l.abs().mul(REPORT_RELATIVE_MARGIN).toSignificantDigits(30, Decimal.ROUND_CEIL)).sub(absoluteMargin);
  const wh = h.add(h.abs().mul(REPORT_RELATIVE_MARGIN).toSignificantDigits(30, Decimal.ROUND_CEIL)).add(absoluteMargin);
  return [wl.toSignificantDigits(digits, Decimal.ROUND_FLOOR).toString(), wh.toSignificantDigits(digits, Decimal.ROUND_CEIL).toString()];
}

/** Certainly below 1 in absolute value: hi < 1 and lo > −1 (exact). */
export function pairAbsBelowOne(p: [string, string]): boolean {
  return compareDecimal(p[1], '1') < 0 && compareDecimal(p[0], '-1') > 0;
}
/** Certainly above 1 in absolute value: lo > 1 or hi < −1 (exact). */
export function pairAbsAboveOne(p: [string, string]): boolean {
  return compareDecimal(p[0], '1') > 0 || compareDecimal(p[1], '-1') < 0;
}
