/**
 * The interval kernel over endpoints: every operation reads its operands as (lo, hi) doubles,
 * writes the result into out[o], out[o + 1] and returns a bit set of flags. The object API
 * (interval.ts), the flat register API (flat.ts), decorations and the Arithmetic instance are thin
 * layers over these functions, so every enclosure is implemented exactly once.
 *
 * Representation (IEEE 1788 inf-sup, binary64): a non-empty interval is lo ≤ hi with
 * lo < +Inf and hi > −Inf; EMPTY is (+Inf, −Inf); ENTIRE is (−Inf, +Inf). NaN endpoints are
 * invalid input (flag F_UNDEF, result ENTIRE).
 *
 * Flags:
 *  - F_UNDEF: some point of the input box lies outside the domain where the operation is defined
 *    and continuous (IEEE 1788 local decoration trv), or an input was NaN.
 *  - F_OVERFLOW: all inputs bounded, the result unbounded (IEEE 1788 local decoration dac).
 *  - F_ASSUMED: the result rests on the accuracy assumption for `Math.*` (see README.md).
 *  - F_EMPTY: an input was empty (the result is empty).
 *
 * Rounding: + − × ÷ are directed (round.ts, tight in the normal range); √ is verified exactly;
 * exp, log, cosh, sin, cos, tan are proven (elementary.ts); atan, sinh, tanh and pow take Math.*
 * and widen by WIDEN steps of the successor formula (≥ 1 ulp each), under the documented
 * assumption that V8's Math.* (fdlibm ports) is within 1 ulp — those set F_ASSUMED.
 */

import { expEnclose, logEnclose, reduceHalfPi, sinCosEnclose } from './elementary.js';
import {
  MAX,
  TINY,
  addDown,
  addUp,
  divDown,
  divUp,
  down,
  mulDown,
  mulUp,
  nextDown,
  nextUp,
  sqrtDown,
  sqrtUp,
  subDown,
  subUp,
  twoProductError,
  up,
} from './round.js';

export const F_UNDEF = 1;
export const F_OVERFLOW = 2;
export const F_ASSUMED = 4;
export const F_EMPTY = 8;

/** Any flag that makes a box evaluation non-continuous for existence proofs. */
export const F_NOT_CONTINUOUS = F_UNDEF | F_OVERFLOW | F_EMPTY;

type Out = Float64Array | number[];

function put(out: Out, o: number, lo: number, hi: number): void {
  out[o] = lo;
  out[o + 1] = hi;
}

/** Result for invalid unary input: NaN → ENTIRE + F_UNDEF, empty → EMPTY + F_EMPTY. */
function bad1(out: Out, o: number, lo: number, hi: number): number {
  if (lo !== lo || hi !== hi) {
    put(out, o, -Infinity, Infinity);
    return F_UNDEF;
  }
  put(out, o, Infinity, -Infinity);
  return F_EMPTY;
}

function bad2(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (alo !== alo || ahi !== ahi || blo !== blo || bhi !== bhi) {
    put(out, o, -Infinity, Infinity);
    return F_UNDEF;
  }
  put(out, o, Infinity, -Infinity);
  return F_EMPTY;
}

function bounded(lo: number, hi: number): boolean {
  return lo !== -Infinity && hi !== Infinity;
}

function ovf1(lo: number, hi: number, alo: number, ahi: number): number {
  return (lo === -Infinity || hi === Infinity) && bounded(alo, ahi) ? F_OVERFLOW : 0;
}

function ovf2(lo: number, hi: number, alo: number, ahi: number, blo: number, bhi: number): number {
  return (lo === -Infinity || hi === Infinity) && bounded(alo, ahi) && bounded(blo, bhi) ? F_OVERFLOW : 0;
}

// ---------------------------------------------------------------------------------------------
// + − × ÷

/** [alo + blo]↓, [ahi + bhi]↑. Exact for unbounded ends. */
export function kAdd(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  const lo = addDown(alo, blo);
  const hi = addUp(ahi, bhi);
  put(out, o, lo, hi);
  return ovf2(lo, hi, alo, ahi, blo, bhi);
}

/** [alo − bhi]↓, [ahi − blo]↑. */
export function kSub(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  const lo = subDown(alo, bhi);
  const hi = subUp(ahi, blo);
  put(out, o, lo, hi);
  return ovf2(lo, hi, alo, ahi, blo, bhi);
}

/** Hull of the four endpoint products, each rounded outward; 0·∞ = 0 (IEEE 1788 convention). */
export function kMul(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  let lo: number;
  let hi: number;
  const p1 = alo * blo;
  const p2 = alo * bhi;
  const p3 = ahi * blo;
  const p4 = ahi * bhi;
  const mn = Math.min(p1, p2, p3, p4);
  const mx = Math.max(p1, p2, p3, p4);
  if (mn === mn && mn !== -Infinity && mx !== Infinity) {
    // Rounding to nearest is monotone, so fl(p_j) < fl(p_k) implies p_j < p_k: the exact extreme
    // products are among the corners whose rounded product is extreme. Round only those.
    lo = Infinity;
    if (p1 === mn) lo = mulDown(alo, blo);
    if (p2 === mn) lo = Math.min(lo, mulDown(alo, bhi));
    if (p3 === mn) lo = Math.min(lo, mulDown(ahi, blo));
    if (p4 === mn) lo = Math.min(lo, mulDown(ahi, bhi));
    hi = -Infinity;
    if (p1 === mx) hi = mulUp(alo, blo);
    if (p2 === mx) hi = Math.max(hi, mulUp(alo, bhi));
    if (p3 === mx) hi = Math.max(hi, mulUp(ahi, blo));
    if (p4 === mx) hi = Math.max(hi, mulUp(ahi, bhi));
  } else {
    // 0·∞ (NaN) or infinite products: all four corners with the IEEE 1788 convention 0·∞ = 0.
    lo = Math.min(mulDown(alo, blo), mulDown(alo, bhi), mulDown(ahi, blo), mulDown(ahi, bhi));
    hi = Math.max(mulUp(alo, blo), mulUp(alo, bhi), mulUp(ahi, blo), mulUp(ahi, bhi));
  }
  put(out, o, lo, hi);
  return ovf2(lo, hi, alo, ahi, blo, bhi);
}

/**
 * IEEE 1788 set-based division: the hull of {x / y : x ∈ a, y ∈ b, y ≠ 0}. b = [0, 0] → EMPTY;
 * 0 ∈ b → F_UNDEF and a half-line or ENTIRE (a = [0, 0] → [0, 0]).
 */
export function kDiv(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  let lo: number;
  let hi: number;
  if (blo > 0) {
    if (alo >= 0) {
      lo = divDown(alo, bhi);
      hi = divUp(ahi, blo);
    } else if (ahi <= 0) {
      lo = divDown(alo, blo);
      hi = divUp(ahi, bhi);
    } else {
      lo = divDown(alo, blo);
      hi = divUp(ahi, blo);
    }
  } else if (bhi < 0) {
    if (alo >= 0) {
      lo = divDown(ahi, bhi);
      hi = divUp(alo, blo);
    } else if (ahi <= 0) {
      lo = divDown(ahi, blo);
      hi = divUp(alo, bhi);
    } else {
      lo = divDown(ahi, bhi);
      hi = divUp(alo, bhi);
    }
  } else {
    // 0 ∈ b: the quotient is not defined on the whole box.
    if (blo === 0 && bhi === 0) {
      put(out, o, Infinity, -Infinity);
      return F_UNDEF;
    }
    if (alo === 0 && ahi === 0) {
      put(out, o, 0, 0);
      return F_UNDEF;
    }
    if (blo === 0) {
      // b = [0, bhi], bhi > 0: x / y with y ↓ 0+.
      if (alo >= 0) put(out, o, divDown(alo, bhi), Infinity);
      else if (ahi <= 0) put(out, o, -Infinity, divUp(ahi, bhi));
      else put(out, o, -Infinity, Infinity);
    } else if (bhi === 0) {
      // b = [blo, 0], blo < 0.
      if (alo >= 0) put(out, o, -Infinity, divUp(alo, blo));
      else if (ahi <= 0) put(out, o, divDown(ahi, blo), Infinity);
      else put(out, o, -Infinity, Infinity);
    } else put(out, o, -Infinity, Infinity);
    return F_UNDEF;
  }
  put(out, o, lo, hi);
  return ovf2(lo, hi, alo, ahi, blo, bhi);
}

/** 1 / a, IEEE 1788 set-based (see kDiv). */
export function kRecip(out: Out, o: number, alo: number, ahi: number): number {
  return kDiv(out, o, 1, 1, alo, ahi);
}

/** [−ahi, −alo], exact. */
export function kNeg(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  put(out, o, -ahi, -alo);
  return 0;
}

/** Exact copy (with validation). */
export function kPos(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  put(out, o, alo, ahi);
  return 0;
}

/** a², with the minimum handled: [mig², mag²], lower end clamped to ≥ 0. */
export function kSqr(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  let lo: number;
  let hi: number;
  if (alo >= 0) {
    lo = mulDown(alo, alo);
    hi = mulUp(ahi, ahi);
  } else if (ahi <= 0) {
    lo = mulDown(ahi, ahi);
    hi = mulUp(alo, alo);
  } else {
    lo = 0;
    hi = alo < -ahi ? mulUp(alo, alo) : mulUp(ahi, ahi);
  }
  put(out, o, lo > 0 ? lo : 0, hi);
  return ovf1(lo, hi, alo, ahi);
}

/**
 * Scratch for the enclosures that the elementary functions write (elementary.ts): each caller
 * writes and reads it within one call, never across calls, so it carries no state between them.
 */
const PAIR = new Float64Array(4);

/**
 * Enclosure of x^n for x > 0, 2 ≤ n ≤ 64 with a double-double style tail: the invariant
 * x^i ∈ h + [tlo, thi] is kept with h·x = q + f exact (TwoProduct) and only the tail rounded
 * outward, so the final [h + tlo]↓, [h + thi]↑ is within 1 ulp of x^n. Writes [lo, hi] to
 * out[o], out[o + 1]; returns false if a partial product leaves the TwoProduct range [2^-969, 2^995].
 */
function powTight(x: number, n: number, out: Float64Array, o: number): boolean {
  let h = x;
  let tlo = 0;
  let thi = 0;
  for (let i = 1; i < n; i++) {
    const q = h * x;
    if (!(q >= 2 ** -969 && q <= 2 ** 995)) return false;
    const f = twoProductError(h, x, q);
    tlo = addDown(f, mulDown(tlo, x));
    thi = addUp(f, mulUp(thi, x));
    h = q;
  }
  out[o] = addDown(h, tlo);
  out[o + 1] = addUp(h, thi);
  return true;
}

/** Lower bound of x^n for x ≥ 0, n ≥ 1 (tight tail method, else binary powering with mulDown). */
export function powNonnegDown(x: number, n: number): number {
  if (x > 0 && x <= 2 ** 995 && n <= 64) {
    if (powTight(x, n, PAIR, 0)) return Math.max(0, PAIR[0]!);
  }
  let r = 1;
  let b = x;
  let k = n;
  for (;;) {
    if (k & 1) r = Math.max(0, mulDown(r, b));
    k = Math.floor(k / 2);
    if (k === 0) return r;
    b = Math.max(0, mulDown(b, b));
  }
}

/** Upper bound of x^n for x ≥ 0, n ≥ 1. */
export function powNonnegUp(x: number, n: number): number {
  if (x > 0 && x <= 2 ** 995 && n <= 64) {
    if (powTight(x, n, PAIR, 0)) return PAIR[1]!;
  }
  let r = 1;
  let b = x;
  let k = n;
  for (;;) {
    if (k & 1) r = mulUp(r, b);
    k = Math.floor(k / 2);
    if (k === 0) return r;
    b = mulUp(b, b);
  }
}

const scratch = new Float64Array(2);

/**
 * a^n for an integer n (IEEE 1788 pown). n = 0 → [1, 1] (also on zero-straddling a); odd n is
 * increasing (pown([−3, 2], 3) = [−27, 8]); even n handles the minimum ([mig^n, mag^n]); n < 0 is
 * 1 / a^|n| with F_UNDEF when 0 ∈ a. Non-integer n → ENTIRE + F_UNDEF.
 */
export function kPown(out: Out, o: number, alo: number, ahi: number, n: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  if (!Number.isInteger(n)) {
    put(out, o, -Infinity, Infinity);
    return F_UNDEF;
  }
  if (n === 0) {
    put(out, o, 1, 1);
    return 0;
  }
  if (n === 1) return kPos(out, o, alo, ahi);
  if (n === 2) return kSqr(out, o, alo, ahi);
  if (n < 0) {
    const f = kPown(scratch, 0, alo, ahi, -n);
    const g = f | kDiv(out, o, 1, 1, scratch[0]!, scratch[1]!);
    if ((alo > 0 || ahi < 0) && g === 0) {
      // Also (1/a)^|n| (avoids spurious overflow of a^|n|, e.g. MAX^-2) and keep the intersection
      // of the two enclosures.
      kDiv(scratch, 0, 1, 1, alo, ahi);
      kPown(scratch, 0, scratch[0]!, scratch[1]!, -n);
      const lo = Math.max(out[o]!, scratch[0]!);
      const hi = Math.min(out[o + 1]!, scratch[1]!);
      if (lo <= hi) put(out, o, lo, hi);
    } else if (alo > 0 || ahi < 0) {
      // a^|n| overflowed (F_OVERFLOW) although a^n is bounded: recompute as (1/a)^|n|.
      kDiv(scratch, 0, 1, 1, alo, ahi);
      const h = kPown(out, o, scratch[0]!, scratch[1]!, -n);
      return h | (g & ~F_OVERFLOW);
    }
    return g;
  }
  let lo: number;
  let hi: number;
  if (n % 2 === 1) {
    lo = alo >= 0 ? powNonnegDown(alo, n) : -powNonnegUp(-alo, n);
    hi = ahi >= 0 ? powNonnegUp(ahi, n) : -powNonnegDown(-ahi, n);
  } else if (alo >= 0) {
    lo = powNonnegDown(alo, n);
    hi = powNonnegUp(ahi, n);
  } else if (ahi <= 0) {
    lo = powNonnegDown(-ahi, n);
    hi = powNonnegUp(-alo, n);
  } else {
    lo = 0;
    hi = powNonnegUp(Math.max(-alo, ahi), n);
  }
  put(out, o, lo, hi);
  return ovf1(lo, hi, alo, ahi);
}

/** √a on a ∩ [0, ∞); lower end verified by s² ≤ x, upper by s² ≥ x (round.ts). F_UNDEF if alo < 0. */
export function kSqrt(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  if (ahi < 0) {
    put(out, o, Infinity, -Infinity);
    return F_UNDEF;
  }
  put(out, o, alo <= 0 ? 0 : sqrtDown(alo), sqrtUp(ahi));
  return alo < 0 ? F_UNDEF : 0;
}

/** |a| = [mig(a), mag(a)], exact. */
export function kAbs(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  if (alo >= 0) put(out, o, alo === 0 ? 0 : alo, ahi);
  else if (ahi <= 0) put(out, o, -ahi, -alo);
  else put(out, o, 0, Math.max(-alo, ahi));
  return 0;
}

/** min(a, b) = [min(alo, blo), min(ahi, bhi)], exact. */
export function kMin(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  put(out, o, Math.min(alo, blo), Math.min(ahi, bhi));
  return 0;
}

/** max(a, b) = [max(alo, blo), max(ahi, bhi)], exact. */
export function kMax(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  put(out, o, Math.max(alo, blo), Math.max(ahi, bhi));
  return 0;
}

/**
 * Slope enclosure of |u| over a (DESIGN.md §4): [1, 1] if a > 0, [−1, −1] if a < 0, else
 * [−1, 1]. Empty → EMPTY.
 */
export function kAbsSlope(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  if (alo > 0) put(out, o, 1, 1);
  else if (ahi < 0) put(out, o, -1, -1);
  else put(out, o, -1, 1);
  return 0;
}

// ---------------------------------------------------------------------------------------------
// Elementary functions: Math.* widened by WIDEN successor steps (assumption: Math.* within 1 ulp).

/** Number of successor-formula steps applied to a Math.* result (each ≥ 1 ulp outward). */
export const WIDEN = 2;
/** Steps for Math.pow (fdlibm pow claims < 1 ulp too; one extra step of safety). */
export const WIDEN_POW = 3;
/**
 * Steps for Math.sinh and Math.tanh: NOT within 1 ulp in V8. Measured worst errors against
 * decimal.js on exact inputs (bench/math-accuracy-bench.ts): tanh 2.100 ulps (e.g. at
 * 0.23151242647785694; 0.25384379434399307 was reported in issue 7), sinh 1.574 ulps — so 2 steps
 * missed the true tanh. 4 steps leave a margin of about 2× over the worst error measured.
 */
export const WIDEN_HYPERBOLIC = 4;

/**
 * Lower bound of a value y that Math.* returned, assuming |error| < `steps` ulps; ±Inf handled.
 * Below 2^-969 the successor formula adds η = 2^-1074 and so may take 2 ulps per step (seen: atan at
 * −2.225073858507201e-308 was 5 ulps wide); there the exact nextDown is used instead (rare path), so
 * every step is exactly 1 ulp there and at most 2 elsewhere (usually exactly 1).
 */
export function widenDown(y: number, steps: number): number {
  if (y === Infinity) y = MAX;
  if (Math.abs(y) < TINY) {
    for (let i = 0; i < steps; i++) y = nextDown(y);
    return y;
  }
  for (let i = 0; i < steps; i++) y = down(y);
  return y;
}

/** Upper bound counterpart of widenDown. */
export function widenUp(y: number, steps: number): number {
  if (y === -Infinity) y = -MAX;
  if (Math.abs(y) < TINY) {
    for (let i = 0; i < steps; i++) y = nextUp(y);
    return y;
  }
  for (let i = 0; i < steps; i++) y = up(y);
  return y;
}

/**
 * exp, increasing, PROVEN (elementary.ts: range reduction with a two-part ln 2, Taylor polynomial
 * with Lagrange remainder, directed rounding throughout). exp(0) = 1 exactly; exp(−∞) = 0.
 * Overflow of a bounded box → F_OVERFLOW. A few ulps wide.
 */
export function kExp(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  let lo = 0;
  if (alo !== -Infinity) {
    expEnclose(alo, PAIR, 0);
    lo = PAIR[0]!;
  }
  let hi = Infinity;
  if (ahi !== Infinity) {
    expEnclose(ahi, PAIR, 0);
    hi = PAIR[1]!;
  }
  put(out, o, lo, hi);
  return ovf1(lo, hi, alo, ahi);
}

/**
 * log on a ∩ (0, ∞], PROVEN (elementary.ts: m·2^e split, atanh series with remainder). F_UNDEF if
 * alo ≤ 0 (then lo = −∞); ahi ≤ 0 → EMPTY. log(1) = 0 exactly.
 */
export function kLog(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  if (ahi <= 0) {
    put(out, o, Infinity, -Infinity);
    return F_UNDEF;
  }
  let lo = -Infinity;
  if (alo > 0) {
    logEnclose(alo, PAIR, 0);
    lo = PAIR[0]!;
  }
  let hi = Infinity;
  if (ahi !== Infinity) {
    logEnclose(ahi, PAIR, 0);
    hi = PAIR[1]!;
  }
  put(out, o, lo, hi);
  return alo <= 0 ? F_UNDEF : 0;
}

// π/2 as a double-double: HP_H = fl(π/2) = 0x1.921FB54442D18p0 < π/2, and π/2 − HP_H ∈ [HP_L_LO,
// HP_L_HI] (adjacent doubles around 6.123233995736766e-17). Verified against decimal.js in
// tests/interval/constants.test.ts.
export const HALF_PI_HEAD = 1.5707963267948966;
export const HALF_PI_TAIL_LO = 6.123233995736765e-17;
export const HALF_PI_TAIL_HI = 6.123233995736767e-17;
/** Enclosure of π: [0x1.921FB54442D18p1, 0x1.921FB54442D19p1]. */
export const PI_LO = 3.141592653589793;
export const PI_HI = 3.1415926535897936;
/** Enclosure of e: [0x1.5BF0A8B145769p1, 0x1.5BF0A8B14576Ap1]. */
export const E_LO = 2.718281828459045;
export const E_HI = 2.7182818284590455;
/** Upper bound of π/2 as a double (= nextUp(HALF_PI_HEAD)). */
const HALF_PI_UP = nextUp(HALF_PI_HEAD);

/**
 * Sign of x − m·π/2 for an integer m with |m| ≤ 2^40 and |x| ≤ 2^41: −1 (certainly below),
 * +1 (certainly above), 0 (equal or undecided). Decided from the enclosure of x − m·π/2 of
 * elementary.ts reduceHalfPi (triple-double π/2, exact TwoProduct / TwoSum, directed small sum).
 */
export function cmpMultipleOfHalfPi(x: number, m: number): number {
  if (m === 0) return x > 0 ? 1 : x < 0 ? -1 : 0;
  reduceHalfPi(x, m, PAIR, 0);
  return PAIR[0]! > 0 ? 1 : PAIR[1]! < 0 ? -1 : 0;
}

const TRIG_LIMIT = 2 ** 40;

/**
 * Residues r (bit r of the result, r = 0..3) such that some m ≡ r (mod 4) may have m·π/2 ∈ [lo, hi].
 * Conservative: 15 (all) for unbounded, very wide or very large arguments.
 */
export function halfPiResidues(lo: number, hi: number): number {
  if (!(hi - lo <= 8) || !(Math.abs(lo) <= TRIG_LIMIT) || !(Math.abs(hi) <= TRIG_LIMIT)) return 15;
  const mFirst = Math.floor(lo / HALF_PI_HEAD) - 1;
  const mLast = Math.ceil(hi / HALF_PI_HEAD) + 1;
  let mask = 0;
  for (let m = mFirst; m <= mLast; m++) {
    if (cmpMultipleOfHalfPi(lo, m) <= 0 && cmpMultipleOfHalfPi(hi, m) >= 0) mask |= 1 << (((m % 4) + 4) % 4);
  }
  return mask;
}

// Endpoint values of sin / cos / tan are PROVEN (elementary.ts sinCosEnclose: reduction by the
// double-double π/2, Taylor polynomials with remainder). |x| > 2^40 → [−1, 1].
function sinDown(x: number): number {
  return x === 0 ? 0 : sinCosEnclose(x, PAIR, 0) ? PAIR[0]! : -1;
}
function sinUp(x: number): number {
  return x === 0 ? 0 : sinCosEnclose(x, PAIR, 0) ? PAIR[1]! : 1;
}
function cosDown(x: number): number {
  return x === 0 ? 1 : sinCosEnclose(x, PAIR, 0) ? PAIR[2]! : -1;
}
function cosUp(x: number): number {
  return x === 0 ? 1 : sinCosEnclose(x, PAIR, 0) ? PAIR[3]! : 1;
}

/**
 * sin, PROVEN: hull of the end enclosures plus +1 / −1 when a point π/2 + 2kπ / −π/2 + 2kπ may
 * lie in a (decided with the double-double π/2, cmpMultipleOfHalfPi). Unbounded → [−1, 1].
 */
export function kSin(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const mask = halfPiResidues(alo, ahi);
  if (mask === 15) {
    put(out, o, -1, 1);
    return 0;
  }
  let lo = Math.min(sinDown(alo), sinDown(ahi));
  let hi = Math.max(sinUp(alo), sinUp(ahi));
  if (mask & 2) hi = 1;
  if (mask & 8) lo = -1;
  put(out, o, lo, hi);
  return 0;
}

/** cos, PROVEN: as sin with maxima at 2kπ (residue 0) and minima at (2k+1)π (residue 2). */
export function kCos(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const mask = halfPiResidues(alo, ahi);
  if (mask === 15) {
    put(out, o, -1, 1);
    return 0;
  }
  let lo = Math.min(cosDown(alo), cosDown(ahi));
  let hi = Math.max(cosUp(alo), cosUp(ahi));
  if (mask & 1) hi = 1;
  if (mask & 4) lo = -1;
  put(out, o, lo, hi);
  return 0;
}

/** Scratch for kTan's two end enclosures (written and read within one call). */
const TAN_ENDS = new Float64Array(4);

/**
 * Enclosure of tan x at a double (sin x / cos x from the proven enclosures), written to out[o],
 * out[o + 1]; false if undecided.
 */
function tanAt(x: number, out: Float64Array, o: number): boolean {
  if (x === 0) {
    out[o] = 0;
    out[o + 1] = 0;
    return true;
  }
  if (!sinCosEnclose(x, PAIR, 0)) return false;
  const cl = PAIR[2]!;
  const ch = PAIR[3]!;
  if (!(cl > 0 || ch < 0)) return false;
  kDiv(out, o, PAIR[0]!, PAIR[1]!, cl, ch);
  return true;
}

/**
 * tan, PROVEN: a pole (π/2 + kπ, odd residues) possibly in a → ENTIRE + F_UNDEF; otherwise
 * increasing, [tan(alo)↓, tan(ahi)↑] with tan = sin/cos at the ends. Unbounded, |a| > 2^40 or an
 * end too close to a pole to separate cos from 0 → ENTIRE + F_UNDEF (undecided).
 */
export function kTan(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const mask = halfPiResidues(alo, ahi);
  if (mask & 10 || !tanAt(alo, TAN_ENDS, 0) || !tanAt(ahi, TAN_ENDS, 2)) {
    put(out, o, -Infinity, Infinity);
    return F_UNDEF;
  }
  put(out, o, TAN_ENDS[0]!, TAN_ENDS[3]!);
  return 0;
}

/** atan, increasing, clamped to [−π/2↑, π/2↑]; atan(±Inf) = ±π/2 (enclosed). */
export function kAtan(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const lo = alo === 0 ? 0 : Math.max(-HALF_PI_UP, widenDown(Math.atan(alo), WIDEN));
  const hi = ahi === 0 ? 0 : Math.min(HALF_PI_UP, widenUp(Math.atan(ahi), WIDEN));
  put(out, o, lo, hi);
  return F_ASSUMED;
}

/** sinh, increasing; sinh(0) = 0 exactly. */
export function kSinh(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const lo = alo === 0 || alo === -Infinity ? alo : widenDown(Math.sinh(alo), WIDEN_HYPERBOLIC);
  const hi = ahi === 0 || ahi === Infinity ? ahi : widenUp(Math.sinh(ahi), WIDEN_HYPERBOLIC);
  put(out, o, lo, hi);
  return F_ASSUMED | ovf1(lo, hi, alo, ahi);
}

/**
 * cosh, minimum 1 at 0: [cosh(mig)↓, cosh(mag)↑], lower end clamped at 1. PROVEN:
 * cosh t = (e^t + e^−t)/2 with the proven exp (no cancellation: both terms positive).
 */
export function kCosh(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const mig = alo >= 0 ? alo : ahi <= 0 ? -ahi : 0;
  const mag = Math.max(-alo, ahi);
  let lo = 1;
  if (mig !== 0) {
    expEnclose(mig, PAIR, 0);
    expEnclose(-mig, PAIR, 2);
    const p = PAIR[0]!;
    const q = PAIR[2]!;
    lo = Math.max(1, 0.5 * addDown(p, q)); // halving is exact except in the subnormal range (not reached: ≥ 1)
  }
  let hi = 1;
  if (mag === Infinity) hi = Infinity;
  else if (mag !== 0) {
    expEnclose(mag, PAIR, 0);
    expEnclose(-mag, PAIR, 2);
    const p = PAIR[1]!;
    const q = PAIR[3]!;
    hi = 0.5 * addUp(p, q);
  }
  put(out, o, lo, hi);
  return ovf1(lo, hi, alo, ahi);
}

/** tanh, increasing, clamped to [−1, 1]; tanh(0) = 0 exactly. */
export function kTanh(out: Out, o: number, alo: number, ahi: number): number {
  if (!(alo <= ahi)) return bad1(out, o, alo, ahi);
  const lo = alo === 0 ? 0 : Math.max(-1, widenDown(Math.tanh(alo), WIDEN_HYPERBOLIC));
  const hi = ahi === 0 ? 0 : Math.min(1, widenUp(Math.tanh(ahi), WIDEN_HYPERBOLIC));
  put(out, o, lo, hi);
  return F_ASSUMED;
}

/**
 * A bound of x^y at a corner (x ≥ 0, x, y endpoints, possibly infinite): the lower bound, or the
 * upper one when `toUpper`. Limits at the boundary of the domain: 0^y = 0 (y > 0), 1 (y = 0, the
 * limit along x → 0+ is 1 only on y = 0, which is enough for a hull), +Inf (y < 0).
 */
function powCorner(x: number, y: number, toUpper: boolean): number {
  if (x === 0) return y > 0 ? 0 : y === 0 ? 1 : Infinity;
  if (x === 1 || y === 0) return 1;
  if (y === 1) return x;
  if (x === Infinity) return y > 0 ? Infinity : 0;
  if (y === Infinity) return x > 1 ? Infinity : 0;
  if (y === -Infinity) return x > 1 ? 0 : Infinity;
  const v = Math.pow(x, y);
  return toUpper ? widenUp(v, WIDEN_POW) : Math.max(0, widenDown(v, WIDEN_POW));
}

/**
 * Real power a^b = exp(b·log a) on the domain {x > 0} ∪ {x = 0, y > 0} (IEEE 1788 pow). x^y is
 * monotone in x for fixed y and in y for fixed x, so the hull is attained at the corners of
 * (a ∩ [0, ∞)) × b (with limits at x = 0). F_UNDEF when the box leaves the domain.
 */
export function kPow(out: Out, o: number, alo: number, ahi: number, blo: number, bhi: number): number {
  if (!(alo <= ahi) || !(blo <= bhi)) return bad2(out, o, alo, ahi, blo, bhi);
  if (ahi < 0 || (ahi === 0 && bhi <= 0)) {
    put(out, o, Infinity, -Infinity);
    return F_UNDEF;
  }
  let flags = alo < 0 ? F_UNDEF : 0;
  const xlo = alo > 0 ? alo : 0;
  if (xlo === 0 && blo <= 0) flags |= F_UNDEF;
  if (ahi === 0) {
    put(out, o, 0, 0);
    return flags;
  }
  // x^y is monotone in y for fixed x, so the four corners — with the x → 0+ limits at y = blo, bhi
  // when 0 is in the box — bound the hull.
  const lo = Math.min(
    powCorner(xlo, blo, false),
    powCorner(xlo, bhi, false),
    powCorner(ahi, blo, false),
    powCorner(ahi, bhi, false),
  );
  const hi = Math.max(
    powCorner(xlo, blo, true),
    powCorner(xlo, bhi, true),
    powCorner(ahi, blo, true),
    powCorner(ahi, bhi, true),
  );
  put(out, o, lo, hi);
  return flags | F_ASSUMED | ((flags & F_UNDEF) === 0 ? ovf2(lo, hi, alo, ahi, blo, bhi) : 0);
}

export { up, down };
