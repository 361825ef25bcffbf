/**
 * Float64 inf-sup intervals (IEEE 1788-2015 vocabulary) as immutable objects. Every arithmetic
 * function delegates to kernel.ts (one implementation shared with flat.ts), so contracts, special
 * cases and tightness are documented there; the summaries below repeat what callers need.
 *
 * Representation: non-empty [lo, hi] with lo ≤ hi, lo < +Inf, hi > −Inf; EMPTY = (+Inf, −Inf);
 * ENTIRE = (−Inf, +Inf). Results are always enclosures of the exact set image; when an input box
 * leaves the domain the result encloses the image of the part inside the domain (IEEE 1788
 * set-based semantics) — use decoration.ts or interval-arith.ts to learn that it happened.
 */

import * as K from './kernel.js';
import { MAX, addUp, subUp } from './round.js';

/** A closed interval [lo, hi] of doubles (IEEE 1788 inf-sup, binary64); EMPTY is (+Inf, −Inf). */
export class Interval {
  /** Unsafe constructor: no validation (callers guarantee lo ≤ hi or the EMPTY encoding). */
  constructor(
    readonly lo: number,
    readonly hi: number,
  ) {}

  toString(): string {
    return isEmpty(this) ? '[empty]' : `[${this.lo}, ${this.hi}]`;
  }
}

/** Error for invalid interval construction (a broken caller invariant or bad user numbers). */
export class IntervalError extends Error {
  constructor(
    readonly code: 'INTERVAL_NAN' | 'INTERVAL_REVERSED' | 'INTERVAL_INFINITE_POINT',
    message: string,
  ) {
    super(message);
    this.name = 'IntervalError';
  }
}

export const EMPTY = new Interval(Infinity, -Infinity);
export const ENTIRE = new Interval(-Infinity, Infinity);

/**
 * Validated constructor: [lo, hi] with lo ≤ hi. NaN → IntervalError INTERVAL_NAN; lo > hi →
 * INTERVAL_REVERSED; lo = +Inf or hi = −Inf → INTERVAL_INFINITE_POINT (use EMPTY for the empty set).
 */
export function interval(lo: number, hi: number): Interval {
  if (lo !== lo || hi !== hi) throw new IntervalError('INTERVAL_NAN', `interval: NaN endpoint [${lo}, ${hi}]`);
  if (lo > hi) throw new IntervalError('INTERVAL_REVERSED', `interval: lo > hi in [${lo}, ${hi}]`);
  if (lo === Infinity || hi === -Infinity)
    throw new IntervalError('INTERVAL_INFINITE_POINT', `interval: infinite point [${lo}, ${hi}]`);
  return new Interval(lo, hi);
}

/** The degenerate interval [x, x] (x finite; validated like `interval`). */
export function point(x: number): Interval {
  return interval(x, x);
}

/** Enclosure of π: [0x1.921FB54442D18p1, 0x1.921FB54442D19p1] (checked with decimal.js in tests). */
export const PI = new Interval(K.PI_LO, K.PI_HI);
/** Enclosure of e: [0x1.5BF0A8B145769p1, 0x1.5BF0A8B14576Ap1] (checked with decimal.js in tests). */
export const E = new Interval(K.E_LO, K.E_HI);

// ---------------------------------------------------------------------------------------------
// Set operations and predicates (exact, no rounding).

export function isEmpty(a: Interval): boolean {
  return !(a.lo <= a.hi);
}

export function isEntire(a: Interval): boolean {
  return a.lo === -Infinity && a.hi === Infinity;
}

/** Bounded and non-empty. */
export function isBounded(a: Interval): boolean {
  return a.lo > -Infinity && a.hi < Infinity;
}

/** Convex hull of a ∪ b (IEEE 1788 convexHull); EMPTY is the neutral element. */
export function hull(a: Interval, b: Interval): Interval {
  if (isEmpty(a)) return b;
  if (isEmpty(b)) return a;
  return new Interval(Math.min(a.lo, b.lo), Math.max(a.hi, b.hi));
}

/** a ∩ b; EMPTY when disjoint (IEEE 1788 intersection). */
export function intersect(a: Interval, b: Interval): Interval {
  const lo = Math.max(a.lo, b.lo);
  const hi = Math.min(a.hi, b.hi);
  return lo <= hi ? new Interval(lo, hi) : EMPTY;
}

/** a ⊆ b (IEEE 1788 subset); EMPTY ⊆ everything. Signed zeros compare equal. */
export function isSubset(a: Interval, b: Interval): boolean {
  if (isEmpty(a)) return true;
  return b.lo <= a.lo && a.hi <= b.hi;
}

/** a ⊆ interior(b) (IEEE 1788 interior); infinite ends of b count as interior. */
export function isInterior(a: Interval, b: Interval): boolean {
  if (isEmpty(a)) return true;
  if (isEmpty(b)) return false;
  return (b.lo < a.lo || b.lo === -Infinity) && (a.hi < b.hi || b.hi === Infinity);
}

/** a ∩ b = ∅ (IEEE 1788 disjoint). */
export function disjoint(a: Interval, b: Interval): boolean {
  if (isEmpty(a) || isEmpty(b)) return true;
  return a.hi < b.lo || b.hi < a.lo;
}

/** x ∈ a (x a real given as a double; ±Inf and NaN are never members). */
export function contains(a: Interval, x: number): boolean {
  return Number.isFinite(x) && a.lo <= x && x <= a.hi;
}

/** Same set (IEEE 1788 equal); −0 = +0. */
export function equal(a: Interval, b: Interval): boolean {
  if (isEmpty(a) || isEmpty(b)) return isEmpty(a) && isEmpty(b);
  return a.lo === b.lo && a.hi === b.hi;
}

// ---------------------------------------------------------------------------------------------
// Numeric functions (IEEE 1788 §10.5.9 / §12.12.8).

/**
 * Midpoint: a double in a, nearest to (lo + hi)/2 (ties even). IEEE 1788 special cases: EMPTY →
 * NaN; ENTIRE → 0; [−Inf, x] → −MAX; [x, +Inf] → MAX. No overflow for [−MAX, MAX] (→ 0).
 */
export function mid(a: Interval): number {
  if (isEmpty(a)) return NaN;
  const { lo, hi } = a;
  if (lo === -Infinity) return hi === Infinity ? 0 : -MAX;
  if (hi === Infinity) return MAX;
  const m = 0.5 * (lo + hi);
  if (Number.isFinite(m)) {
    // 0.5·(lo + hi) can underflow-round outside for subnormal ends; keep it inside.
    return Math.min(hi, Math.max(lo, m)) + 0;
  }
  return 0.5 * lo + 0.5 * hi; // overflow of lo + hi: halves first (exact for such large ends)
}

/**
 * Radius: the smallest double r (rounded up) with a ⊆ [mid − r, mid + r]. EMPTY → NaN;
 * unbounded → +Inf.
 */
export function rad(a: Interval): number {
  if (isEmpty(a)) return NaN;
  if (!isBounded(a)) return Infinity;
  const m = mid(a);
  return Math.max(subUp(m, a.lo), subUp(a.hi, m));
}

/** Width hi − lo rounded up. EMPTY → NaN; unbounded → +Inf. */
export function wid(a: Interval): number {
  if (isEmpty(a)) return NaN;
  return subUp(a.hi, a.lo);
}

/** Magnitude max |x| over a (exact). EMPTY → NaN. */
export function mag(a: Interval): number {
  if (isEmpty(a)) return NaN;
  return Math.max(Math.abs(a.lo), Math.abs(a.hi));
}

/** Mignitude min |x| over a (exact; 0 when 0 ∈ a). EMPTY → NaN. */
export function mig(a: Interval): number {
  if (isEmpty(a)) return NaN;
  if (a.lo > 0) return a.lo;
  if (a.hi < 0) return -a.hi;
  return 0;
}

// ---------------------------------------------------------------------------------------------
// Arithmetic. Each wraps the kernel; see kernel.ts for the per-function contract.

// Scratch for kernel results; the flags are dropped here (decoration.ts and interval-arith.ts call
// the kernel themselves and keep them).
const S = new Float64Array(2);

function res(_flags: number): Interval {
  return new Interval(S[0]!, S[1]!);
}

/** a + b, each end one step outward. */
export const add = (a: Interval, b: Interval): Interval => res(K.kAdd(S, 0, a.lo, a.hi, b.lo, b.hi));
/** a − b. */
export const sub = (a: Interval, b: Interval): Interval => res(K.kSub(S, 0, a.lo, a.hi, b.lo, b.hi));
/** a · b (hull of endpoint products, 0·∞ = 0). */
export const mul = (a: Interval, b: Interval): Interval => res(K.kMul(S, 0, a.lo, a.hi, b.lo, b.hi));
/** a / b, IEEE 1788 set-based: 0 ∈ b gives a half-line or ENTIRE (domain violation), b = [0,0] → EMPTY. */
export const div = (a: Interval, b: Interval): Interval => res(K.kDiv(S, 0, a.lo, a.hi, b.lo, b.hi));
/** 1 / a (as div). */
export const recip = (a: Interval): Interval => res(K.kRecip(S, 0, a.lo, a.hi));
/** −a, exact. */
export const neg = (a: Interval): Interval => res(K.kNeg(S, 0, a.lo, a.hi));
/** a² with the minimum at 0 handled. */
export const sqr = (a: Interval): Interval => res(K.kSqr(S, 0, a.lo, a.hi));
/** a^n, n integer (negative allowed; odd powers of zero-straddling a are increasing). */
export const pown = (a: Interval, n: number): Interval => res(K.kPown(S, 0, a.lo, a.hi, n));
/** √a on a ∩ [0, ∞), both ends verified exactly. */
export const sqrt = (a: Interval): Interval => res(K.kSqrt(S, 0, a.lo, a.hi));
/** exp (proven: elementary.ts). */
export const exp = (a: Interval): Interval => res(K.kExp(S, 0, a.lo, a.hi));
/** log on a ∩ (0, ∞] (proven: elementary.ts). */
export const log = (a: Interval): Interval => res(K.kLog(S, 0, a.lo, a.hi));
/** sin (proven: elementary.ts), extrema decided with a triple-double π/2. */
export const sin = (a: Interval): Interval => res(K.kSin(S, 0, a.lo, a.hi));
/** cos (proven), extrema decided rigorously. */
export const cos = (a: Interval): Interval => res(K.kCos(S, 0, a.lo, a.hi));
/** tan (proven); a possible pole inside → ENTIRE. */
export const tan = (a: Interval): Interval => res(K.kTan(S, 0, a.lo, a.hi));
/** atan (Math.atan widened, assumption). */
export const atan = (a: Interval): Interval => res(K.kAtan(S, 0, a.lo, a.hi));
/** sinh (Math.sinh widened, assumption). */
export const sinh = (a: Interval): Interval => res(K.kSinh(S, 0, a.lo, a.hi));
/** cosh (minimum 1 at 0 handled; proven via exp). */
export const cosh = (a: Interval): Interval => res(K.kCosh(S, 0, a.lo, a.hi));
/** tanh (Math.tanh widened, assumption). */
export const tanh = (a: Interval): Interval => res(K.kTanh(S, 0, a.lo, a.hi));
/** |a| = [mig, mag], exact. */
export const abs = (a: Interval): Interval => res(K.kAbs(S, 0, a.lo, a.hi));
/** Pointwise min, exact. */
export const min = (a: Interval, b: Interval): Interval => res(K.kMin(S, 0, a.lo, a.hi, b.lo, b.hi));
/** Pointwise max, exact. */
export const max = (a: Interval, b: Interval): Interval => res(K.kMax(S, 0, a.lo, a.hi, b.lo, b.hi));
/** Real power a^b on {x > 0} ∪ {x = 0, y > 0} (Math.pow at the corners, widened). */
export const pow = (a: Interval, b: Interval): Interval => res(K.kPow(S, 0, a.lo, a.hi, b.lo, b.hi));
/** Slope enclosure of |·| over a: 1, −1 or [−1, 1]. */
export const absSlope = (a: Interval): Interval => res(K.kAbsSlope(S, 0, a.lo, a.hi));

/** [a.lo − r, a.hi + r] rounded outward (r ≥ 0). EMPTY stays EMPTY. */
export function inflate(a: Interval, r: number): Interval {
  if (isEmpty(a)) return a;
  return new Interval(-addUp(-a.lo, r), addUp(a.hi, r));
}
