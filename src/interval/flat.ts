/**
 * Allocation-free interval operations on a register file R: Float64Array.
 *
 * Register i occupies R[2i] (lo) and R[2i+1] (hi). Register 0 is the status:
 *  - R[0] = 1 while every operation so far was continuous on its input box; set to 0 on a domain
 *    violation, an empty input or an overflow from bounded inputs (kernel F_UNDEF | F_EMPTY |
 *    F_OVERFLOW), never set back (call `fReset`);
 *  - R[1] = 1 once some result rests on the Math.* accuracy assumption (F_ASSUMED).
 * Operations take register indices: fAdd(R, d, a, b) sets register d to a + b. d may alias a or b.
 *
 * Enclosures are those of kernel.ts, except that + − × ÷ and sqr have an inlined fast path
 * (successor formula of Rump et al. 2009, see round.ts, with ε = 2^-1000 for η) that is taken only
 * when both result ends are finite (the check hi − lo ≤ MAX also rejects NaN and, through ∞ − ∞,
 * every infinite or empty operand); the fast path is one step outward even for exact results, so
 * it may be one ulp wider than the kernel's tight result. Everything else (infinite ends, empty, NaN, 0·∞, division by a box touching 0, overflow)
 * falls to the kernel, which handles all special cases and reports flags. The fast path of × rounds
 * min/max of the four rounded products outward, which is valid because down(min_i fl(p_i)) ≤
 * pred(fl(p_j)) ≤ p_j for the exact minimum p_j (round-to-nearest is monotone).
 *
 * Generated straight-line code calls these functions; keep them small and monomorphic.
 */

import * as K from './kernel.js';

/** Relative term φ = 2^-53·(1 + 2^-52) of the fast-path rounding c ± (φ|c| + ε) (Rump et al.). */
export const PHI = 2 ** -53 * (1 + 2 ** -52);
/**
 * Absolute term of the fast-path rounding. Rump et al. use η = 2^-1074; any larger ε is also
 * valid (fl(φ|c| + ε) ≥ fl(φ|c| + η) and rounding is monotone, so c + fl(φ|c| + ε) still rounds to
 * ≥ succ(c)). ε = 2^-1000 is a normal number: an operation with the subnormal η as operand takes a
 * microcode assist on x86 (≈10× slower). Cost: for |c| < 2^-947 the step is ε instead of one ulp.
 */
export const EPS = 2 ** -1000;
const MAXV = Number.MAX_VALUE;

/** Record kernel flags in the status register. */
function flag(R: Float64Array, f: number): void {
  if (f & K.F_NOT_CONTINUOUS) R[0] = 0;
  if (f & K.F_ASSUMED) R[1] = 1;
}

/** Reset the status register: continuous, no assumption. */
export function fReset(R: Float64Array): void {
  R[0] = 1;
  R[1] = 0;
}

/** True while no domain violation / overflow / empty input was recorded. */
export function fContinuous(R: Float64Array): boolean {
  return R[0] === 1;
}

/** True once a result rests on the Math.* accuracy assumption. */
export function fAssumed(R: Float64Array): boolean {
  return R[1] === 1;
}

/** Register d := [lo, hi] (the caller's enclosure, e.g. from encloseDecimal; no validation). */
export function fConst(R: Float64Array, d: number, lo: number, hi: number): void {
  R[2 * d] = lo;
  R[2 * d + 1] = hi;
}

/** Register d := register a. */
export function fCopy(R: Float64Array, d: number, a: number): void {
  R[2 * d] = R[2 * a]!;
  R[2 * d + 1] = R[2 * a + 1]!;
}

// Fast paths are kept small (V8 inlines a limited cumulative bytecode size into the caller); the
// special cases live in out-of-line functions that re-read the registers (nothing has been
// written when they run, so d may alias a or b).

function addSlow(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kAdd(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}
function subSlow(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kSub(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}
function mulSlow(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kMul(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}
function divSlow(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kDiv(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}
function sqrSlow(R: Float64Array, d: number, a: number): void {
  flag(R, K.kSqr(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

/** d := a + b. */
export function fAdd(R: Float64Array, d: number, a: number, b: number): void {
  const s = R[2 * a]! + R[2 * b]!;
  const t = R[2 * a + 1]! + R[2 * b + 1]!;
  const lo = s - (PHI * Math.abs(s) + EPS);
  const hi = t + (PHI * Math.abs(t) + EPS);
  if (hi - lo <= MAXV) {
    R[2 * d] = lo;
    R[2 * d + 1] = hi;
  } else addSlow(R, d, a, b);
}

/** d := a − b. */
export function fSub(R: Float64Array, d: number, a: number, b: number): void {
  const s = R[2 * a]! - R[2 * b + 1]!;
  const t = R[2 * a + 1]! - R[2 * b]!;
  const lo = s - (PHI * Math.abs(s) + EPS);
  const hi = t + (PHI * Math.abs(t) + EPS);
  if (hi - lo <= MAXV) {
    R[2 * d] = lo;
    R[2 * d + 1] = hi;
  } else subSlow(R, d, a, b);
}

/** d := a · b. */
export function fMul(R: Float64Array, d: number, a: number, b: number): void {
  const alo = R[2 * a]!;
  const ahi = R[2 * a + 1]!;
  const blo = R[2 * b]!;
  const bhi = R[2 * b + 1]!;
  const p1 = alo * blo;
  const p2 = alo * bhi;
  const p3 = ahi * blo;
  const p4 = ahi * bhi;
  const mn = Math.min(p1, p2, p3, p4);
  const mx = Math.max(p1, p2, p3, p4);
  const lo = mn - (PHI * Math.abs(mn) + EPS);
  const hi = mx + (PHI * Math.abs(mx) + EPS);
  if (hi - lo <= MAXV) {
    R[2 * d] = lo;
    R[2 * d + 1] = hi;
  } else mulSlow(R, d, a, b);
}

/** d := a / b (IEEE 1788 set-based; 0 ∈ b marks the status non-continuous). */
export function fDiv(R: Float64Array, d: number, a: number, b: number): void {
  const alo = R[2 * a]!;
  const ahi = R[2 * a + 1]!;
  const blo = R[2 * b]!;
  const bhi = R[2 * b + 1]!;
  const q1 = alo / blo;
  const q2 = alo / bhi;
  const q3 = ahi / blo;
  const q4 = ahi / bhi;
  const mn = Math.min(q1, q2, q3, q4);
  const mx = Math.max(q1, q2, q3, q4);
  const lo = mn - (PHI * Math.abs(mn) + EPS);
  const hi = mx + (PHI * Math.abs(mx) + EPS);
  // blo <= bhi rejects an EMPTY divisor (whose quotients x/±∞ would look finite).
  if ((blo > 0 || bhi < 0) && blo <= bhi && hi - lo <= MAXV) {
    R[2 * d] = lo;
    R[2 * d + 1] = hi;
  } else divSlow(R, d, a, b);
}

/** d := a² (minimum at 0 handled: lower end 0 when a straddles 0, clamped at 0). */
export function fSqr(R: Float64Array, d: number, a: number): void {
  const x = R[2 * a]!;
  const y = R[2 * a + 1]!;
  const p = x * x;
  const q = y * y;
  const mn = x >= 0 ? p : y <= 0 ? q : 0;
  const mx = Math.max(p, q);
  const lo = Math.max(0, mn - (PHI * mn + EPS));
  const hi = mx + (PHI * mx + EPS);
  if (hi - lo <= MAXV) {
    R[2 * d] = lo;
    R[2 * d + 1] = hi;
  } else sqrSlow(R, d, a);
}

/** d := −a (exact). */
export function fNeg(R: Float64Array, d: number, a: number): void {
  const lo = R[2 * a]!;
  const hi = R[2 * a + 1]!;
  if (lo <= hi) {
    R[2 * d] = -hi;
    R[2 * d + 1] = -lo;
    return;
  }
  flag(R, K.kNeg(R, 2 * d, lo, hi));
}

/** d := 1 / a. */
export function fRecip(R: Float64Array, d: number, a: number): void {
  flag(R, K.kRecip(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

/** d := a^n, n integer (n = 2 uses fSqr). */
export function fPown(R: Float64Array, d: number, a: number, n: number): void {
  if (n === 2) fSqr(R, d, a);
  else flag(R, K.kPown(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, n));
}

/** d := a^b (real power). */
export function fPow(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kPow(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}

/** d := √a. */
export function fSqrt(R: Float64Array, d: number, a: number): void {
  flag(R, K.kSqrt(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fExp(R: Float64Array, d: number, a: number): void {
  flag(R, K.kExp(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fLog(R: Float64Array, d: number, a: number): void {
  flag(R, K.kLog(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fSin(R: Float64Array, d: number, a: number): void {
  flag(R, K.kSin(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fCos(R: Float64Array, d: number, a: number): void {
  flag(R, K.kCos(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fTan(R: Float64Array, d: number, a: number): void {
  flag(R, K.kTan(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fAtan(R: Float64Array, d: number, a: number): void {
  flag(R, K.kAtan(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fSinh(R: Float64Array, d: number, a: number): void {
  flag(R, K.kSinh(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fCosh(R: Float64Array, d: number, a: number): void {
  flag(R, K.kCosh(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fTanh(R: Float64Array, d: number, a: number): void {
  flag(R, K.kTanh(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fAbs(R: Float64Array, d: number, a: number): void {
  flag(R, K.kAbs(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fAbsSlope(R: Float64Array, d: number, a: number): void {
  flag(R, K.kAbsSlope(R, 2 * d, R[2 * a]!, R[2 * a + 1]!));
}

export function fMin(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kMin(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}

export function fMax(R: Float64Array, d: number, a: number, b: number): void {
  flag(R, K.kMax(R, 2 * d, R[2 * a]!, R[2 * a + 1]!, R[2 * b]!, R[2 * b + 1]!));
}
