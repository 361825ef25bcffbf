/**
 * The arithmetic contract that every evaluator, the search and the prover are written against
 * (DESIGN.md §5: algorithms written once over an arithmetic). Implementations:
 *  - `floatArithmetic` (T = number, @heuristic, no rounding control) — src/interval/float-arith.ts
 *  - `intervalArithmetic()` (T = Interval, float64 outward rounding) — src/interval/interval-arith.ts
 *  - `mpIntervalArithmetic(bits)` (T = MpInterval, decimal.js directed rounding) — src/interval/mp.ts
 *
 * Every instance owns a mutable `status` (never module-global state). Callers reset it with
 * `resetStatus(arith)` before an evaluation and read it afterwards.
 */

export interface EvalStatus {
  /**
   * Stays true while every operation so far was applied to inputs wholly inside the domain where
   * the operation is defined and continuous (IEEE 1788-2015 decoration `dac` or better). Becomes
   * false (and stays false until reset) as soon as one operation's input leaves that domain:
   * log/sqrt/real power of a box reaching outside their domain, division by a box containing 0,
   * overflow to an unbounded result, tan across a pole. Existence theorems may only be claimed
   * from evaluations that ended with `continuous === true`.
   */
  continuous: boolean;
  /**
   * Becomes true when some result rests on an accuracy assumption (e.g. an elementary function
   * built on `Math.*` widened by a margin rather than proven). The prover may still use it; the
   * independent checker never does.
   */
  assumed: boolean;
  /**
   * Becomes true when `absSlope` was asked about a range touching 0, i.e. a derivative enclosure
   * over the box is a slope set at a kink of abs/min/max, not a derivative. Krawczyk stays valid;
   * eigenvalues of one monodromy product then do not decide stability in dimension >= 2.
   */
  nonsmooth?: boolean;
}

export function resetStatus(a: { status: EvalStatus }): void {
  a.status.continuous = true;
  a.status.assumed = false;
  a.status.nonsmooth = false;
}

/** Real-number operations over some representation T (a float, an interval, ...). */
export interface Arithmetic<T> {
  readonly kind: 'float' | 'interval' | 'mp-interval';
  readonly status: EvalStatus;
  /**
   * Enclosure of the exact decimal interval [lo, hi]; both are decimal literal strings
   * ("3.83", "-1e-320", "0.1"), lo <= hi as exact rationals. For `float` this is the double
   * nearest to the midpoint. Throws only on malformed strings (callers validate first).
   */
  constant(lo: string, hi: string): T;
  /** The exact double x (x finite). */
  fromNumber(x: number): T;
  pi(): T;
  e(): T;
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  neg(a: T): T;
  sqr(a: T): T;
  /** a^n for an integer n (negative allowed; a^0 = 1). */
  pown(a: T, n: number): T;
  /** Real power a^b = exp(b·log a), domain a > 0 (a = 0 allowed when b > 0). */
  pow(a: T, b: T): T;
  sqrt(a: T): T;
  exp(a: T): T;
  log(a: T): T;
  sin(a: T): T;
  cos(a: T): T;
  tan(a: T): T;
  atan(a: T): T;
  sinh(a: T): T;
  cosh(a: T): T;
  tanh(a: T): T;
  abs(a: T): T;
  min(a: T, b: T): T;
  max(a: T, b: T): T;
  /**
   * Enclosure of every slope/Clarke derivative of |u| over the range a of u: 1 when a > 0,
   * −1 when a < 0, [−1, 1] when a touches or straddles 0 (float: sign(a), 0 at 0 is allowed).
   * Forward-mode differentiation uses it for abs, min and max so Krawczyk stays sound on
   * piecewise-smooth maps (DESIGN.md §4).
   */
  absSlope(a: T): T;
}

/**
 * Extra operations the prover needs from an interval arithmetic (float64 or multiprecision).
 * Comparisons are certain (true means true for every pair of points), never "possibly".
 */
export interface IntervalArithmetic<T> extends Arithmetic<T> {
  readonly kind: 'interval' | 'mp-interval';
  /** Working precision in bits (53 for float64 intervals). */
  readonly bits: number;
  /** Interval with the given endpoints (each an exact point of T); lo <= hi required. */
  hull(a: T, b: T): T;
  /** Intersection, or null when empty. */
  intersect(a: T, b: T): T | null;
  isSubset(a: T, b: T): boolean;
  /** a ⊂ interior of b (IEEE 1788 `interior`). */
  isInterior(a: T, b: T): boolean;
  disjoint(a: T, b: T): boolean;
  /** A point (degenerate interval) inside a, near its midpoint, exactly representable. */
  midPoint(a: T): T;
  /** Nearest double to the midpoint (@heuristic helper for float-side work). */
  midNumber(a: T): number;
  /** Upper bound of the width, as a double rounded up. */
  widUp(a: T): number;
  /** Upper bound of the magnitude max|a|, rounded up. */
  magUp(a: T): number;
  /** Lower bound of the mignitude min|a|, rounded down. */
  migDown(a: T): number;
  /** Lower end rounded down to a double, upper end rounded up. */
  loDown(a: T): number;
  hiUp(a: T): number;
  /** Lower / upper end as points of T (exact). */
  lo(a: T): T;
  hi(a: T): T;
  /** [a.lo − r, a.hi + r] rounded outward, r >= 0 a double. */
  inflate(a: T, r: number): T;
  /** Exact decimal strings of the endpoints (outward if a conversion must round). */
  toDecimal(a: T): { lo: string; hi: string };
  /** Certainly a < b, a <= b, a > 0 etc.: every point of a is below every point of b. */
  certainlyLt(a: T, b: T): boolean;
  certainlyLe(a: T, b: T): boolean;
  /** The point x given by an exact decimal string (enclosed outward if not representable). */
  fromDecimal(x: string): T;
}
