/**
 * `floatArithmetic`: plain double arithmetic with Math.* (@heuristic — no rounding control, no
 * enclosure). Used by the float candidate search; never by proofs. `constant(lo, hi)` is the double
 * nearest to the exact decimal midpoint (lo + hi)/2, decided with BigInt rationals.
 *
 * `status` is present for interface uniformity: `continuous` turns false when a result is NaN or
 * infinite (a cheap hint for the search), `assumed` is always true after any elementary function.
 */

import type { Arithmetic, EvalStatus } from './arithmetic.js';
import { encloseDecimal, parseDecimal } from './decimal-literal.js';

/** Nearest double to the exact rational (lo + hi)/2 of two decimal literals. */
export function nearestMidpoint(lo: string, hi: string): number {
  if (lo === hi) return nearestOfLiteral(lo);
  const a = parseDecimal(lo);
  const b = parseDecimal(hi);
  // Far-apart exponents (e.g. "1e-999999" and "1"): avoid huge BigInt powers; the heuristic
  // midpoint of the two nearest doubles is as good as the float search needs.
  if (Math.abs(a.exp10 - b.exp10) > 700) return 0.5 * nearestOfLiteral(lo) + 0.5 * nearestOfLiteral(hi);
  // Bring both to a common exponent e and write the midpoint as a decimal literal string exactly.
  const e = Math.min(a.exp10, b.exp10);
  const scale = (p: { negative: boolean; digits: bigint; exp10: number }) =>
    (p.negative ? -p.digits : p.digits) * 10n ** BigInt(p.exp10 - e);
  const sum = scale(a) + scale(b); // midpoint = sum / 2 · 10^e = sum·5 · 10^(e−1)
  const m = sum * 5n;
  const text = `${m < 0n ? '-' : ''}${(m < 0n ? -m : m).toString()}e${e - 1}`;
  return nearestOfLiteral(text);
}

/** Nearest double (ties to even) to an exact decimal literal. */
export function nearestOfLiteral(s: string): number {
  const { lo, hi } = encloseDecimal(s);
  if (lo === hi) return lo;
  // Number() is correctly rounded in V8 for decimal literals; check it lies in the enclosure.
  const g = Number(s);
  if (g === lo || g === hi) return g;
  return Math.abs(lo) < Math.abs(hi) ? lo : hi;
}

function makeFloatArithmetic(): Arithmetic<number> {
  const status: EvalStatus = { continuous: true, assumed: false };
  const check = (x: number): number => {
    if (!Number.isFinite(x)) status.continuous = false;
    return x;
  };
  const elem = (x: number): number => {
    status.assumed = true;
    return check(x);
  };
  return {
    kind: 'float',
    status,
    constant: nearestMidpoint,
    fromNumber: (x) => x,
    pi: () => Math.PI,
    e: () => Math.E,
    add: (a, b) => a + b,
    sub: (a, b) => a - b,
    mul: (a, b) => a * b,
    div: (a, b) => check(a / b),
    neg: (a) => -a,
    sqr: (a) => a * a,
    pown: (a, n) => check(n === 2 ? a * a : Math.pow(a, n)),
    pow: (a, b) => elem(Math.pow(a, b)),
    sqrt: (a) => check(Math.sqrt(a)),
    exp: (a) => elem(Math.exp(a)),
    log: (a) => elem(Math.log(a)),
    sin: (a) => elem(Math.sin(a)),
    cos: (a) => elem(Math.cos(a)),
    tan: (a) => elem(Math.tan(a)),
    atan: (a) => elem(Math.atan(a)),
    sinh: (a) => elem(Math.sinh(a)),
    cosh: (a) => elem(Math.cosh(a)),
    tanh: (a) => elem(Math.tanh(a)),
    abs: (a) => Math.abs(a),
    min: (a, b) => Math.min(a, b),
    max: (a, b) => Math.max(a, b),
    absSlope: (a) => (a > 0 ? 1 : a < 0 ? -1 : 0),
  };
}

/** Shared instance (@heuristic). Its status is shared too: use `createFloatArithmetic()` for your own. */
export const floatArithmetic: Arithmetic<number> = makeFloatArithmetic();

/** A new float arithmetic with its own status (@heuristic). */
export function createFloatArithmetic(): Arithmetic<number> {
  return makeFloatArithmetic();
}
