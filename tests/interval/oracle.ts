/**
 * Reference values for containment tests, computed outside the kernel:
 *  - Exact: decimal.js with precision 3000, where + − × of two doubles are exact (the exact sum
 *    or product of binary64 numbers has fewer than 2900 significant decimal digits);
 *  - Dec60: decimal.js at 60 digits for elementary functions (far finer than a double ulp).
 * Doubles enter decimal.js only through their exact decimal expansion (decimalOfDouble), never
 * through `new Decimal(number)`.
 */

import Decimal from 'decimal.js';
import fc from 'fast-check';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import type { Interval } from '../../src/interval/interval.js';

export const Exact = Decimal.clone({ precision: 3000, toExpNeg: -9e15, toExpPos: 9e15 });
export const Dec60 = Decimal.clone({ precision: 60, toExpNeg: -9e15, toExpPos: 9e15 });

export function exact(x: number): Decimal {
  return new Exact(decimalOfDouble(x));
}
export function dec60(x: number): Decimal {
  return new Dec60(decimalOfDouble(x));
}

/**
 * True when the real number v (a Decimal; null = undefined point) lies in [r.lo, r.hi].
 * `slack` widens the reference by a relative amount (for 60-digit references of transcendental
 * values, 1e-50 covers decimal.js' own last-digit error; it is far below one double ulp).
 */
export function inInterval(v: Decimal, r: Interval, slack = 0): boolean {
  if (!(r.lo <= r.hi)) return false;
  const s = v.abs().times(slack);
  const loOk = r.lo === -Infinity || exact(r.lo).lte(v.plus(s));
  const hiOk = r.hi === Infinity || exact(r.hi).gte(v.minus(s));
  return loOk && hiOk;
}

/** Doubles of every kind: zeros, subnormals, huge, ordinary (fast-check biases to the edges). */
export const anyDouble = fc.double({ noNaN: true, noDefaultInfinity: true });
/** Moderate doubles, where elementary functions are cheap in decimal.js. */
export const moderate = (m: number) =>
  fc.oneof(fc.double({ min: -m, max: m, noNaN: true }), fc.integer({ min: -20, max: 20 }).map((k) => k / 8));

/**
 * A box [lo, hi] with a finite member x of it, from three doubles; ends may be replaced by ±∞.
 */
export function boxWithPoint(d: fc.Arbitrary<number>, allowInfinite = true) {
  return fc
    .tuple(d, d, d, fc.integer({ min: 0, max: allowInfinite ? 7 : 0 }))
    .map(([a, b, c, inf]) => {
      const [lo, x, hi] = [a, b, c].sort((p, q) => p - q) as [number, number, number];
      return { lo: inf === 1 ? -Infinity : lo, hi: inf === 2 ? Infinity : hi, x: x === 0 ? 0 : x };
    });
}
