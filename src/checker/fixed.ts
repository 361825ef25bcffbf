/**
 * The checker's second exact arithmetic (issue 8 item 1): binary fixed-point intervals on BigInt,
 * for the inner loops of the structured Krawczyk bounds (cyclic.ts, cyclic2.ts). decimal.js stays
 * the arithmetic of literals, of the formula evaluator and the reference; this kernel only makes
 * the many + − × of the box tests cheap (one BigInt product and one shift per directed product,
 * no decimal object, no rounding-mode switch: profiles showed decimal.js allocation, not digits,
 * dominating the checker).
 *
 * Representation: an integer m stands for the dyadic rational m·2^−F (F = `frac` bits, fixed per
 * context). An interval is a pair of integers [lo, hi] with lo ≤ hi standing for [lo·2^−F, hi·2^−F].
 *
 * Contracts (every bound argued here; no floating point anywhere in a rigorous result):
 *  - + and − of two fixed-point numbers are exact (BigInt addition); interval ± is exact.
 *  - The exact product of m·2^−F and k·2^−F is (m·k)·2^−2F. BigInt `>>` is an arithmetic shift,
 *    i.e. floor division by 2^F for every sign (ECMAScript BigInt::signedRightShift), so
 *    `(m·k) >> F` is the largest representable number ≤ the product (directed down) and
 *    `−((−m·k) >> F)` the smallest ≥ it (directed up). Interval products take the min / max of the
 *    four end products, each rounded in its direction: the exact product set is contained.
 *  - A decimal (decimal.js instance: sign s, base-10^7 digit limbs, exponent e, all documented
 *    read-only properties) equals s·C·10^k for an integer C read exactly from the limbs. Its image
 *    is floor / ceil of s·C·10^k·2^F, computed by one exact BigInt division with the quotient
 *    adjusted toward −∞ / +∞ (`fromDecimalDown` / `fromDecimalUp`). Tiny values (|x| < 2^−F)
 *    become 0 / ±1 in the right direction; huge ones (|x| ≥ 2^MAX_INT_BITS) throw FixedRange.
 *  - A float64 heuristic value (never a rigorous input) converts to the nearest integer above or
 *    below: x·2^s is exact for a power-of-two scale in range, Math.ceil / Math.floor are exact on
 *    doubles, and BigInt(integer double) is exact (`fromFloatUp`).
 *  - Back to decimals: m·2^−F = m·5^F·10^−F exactly; `toDecimal` builds that string (only for
 *    messages and the decimal fallback, never inside a loop).
 * Special cases: the only divisions are `divUp` (upward quotient of a nonnegative number by a
 * positive one) and `recip` (1/a for a not containing 0: 1/x is decreasing on each sign, so
 * [floor(2^2F/hi), ceil(2^2F/lo)] in units 2^−F), each the floor / ceil of an exact BigInt quotient; a value out of range throws
 * FixedRange, which the callers treat as "this fast path cannot decide": they run the decimal
 * path, whose verdict is final.
 * Tightness: each directed product loses < 2^−F; F is chosen by the caller well above the working
 * precision (see `fracBitsFor`), so the fixed-point path decides whatever the decimal path decides
 * except within 2^−F of a boundary, where it defers to the decimal path.
 */
import type { Decimal } from 'decimal.js';
import type { Iv } from './interval.js';

/**
 * The fixed-point paths are on; tests/checker/fixed-differential.test.ts switches them off to
 * compare every verdict with the decimal-only checker. Nothing else writes it.
 */
export const fixedPaths = { enabled: true };

/** A fixed-point interval [lo·2^−F, hi·2^−F] of its context (lo ≤ hi). */
export interface Fx {
  lo: bigint;
  hi: bigint;
}

/** A value outside what the fixed-point path handles: defer to the decimal path. */
export class FixedRange extends Error {}

/** Most fraction bits of a context, and most binary digits of a scaled value's exponent in `dyadicString` (beyond: FixedRange). */
export const MAX_FRAC_BITS = 20000;
export const MAX_SCALE_BITS = 60000;

/** Integer parts beyond this many bits are refused (values ≥ 2^MAX_INT_BITS). */
export const MAX_INT_BITS = 4096;

const TEN = 10n;
const pow10Cache: bigint[] = [1n];
function pow10(k: number): bigint {
  while (pow10Cache.length <= k) pow10Cache.push(pow10Cache[pow10Cache.length - 1]! * TEN);
  return pow10Cache[k]!;
}

/** Fraction bits for a check at `digits` significant digits: 64 guard bits above log2(10)·digits plus the finest box scale. */
export function fracBitsFor(digits: number, finestExp10 = 0): number {
  return Math.ceil((digits + Math.max(0, -finestExp10)) * 3.3219280948873626) + 64;
}

interface DecimalParts {
  s: number;
  e: number;
  d: number[] | null;
}

/** Floor-division of an exact BigInt quotient (BigInt `/` truncates toward 0). */
function floorDiv(a: bigint, b: bigint): bigint {
  const q = a / b;
  return (a < 0n) !== (b < 0n) && q * b !== a ? q - 1n : q;
}
function ceilDiv(a: bigint, b: bigint): bigint {
  return -floorDiv(-a, b);
}

/** Exact decimal string of m·2^s: an integer for s ≥ 0, else m·5^−s with the point −s digits from the right. */
export function dyadicString(m: bigint, s: number): string {
  if (Math.abs(s) > MAX_SCALE_BITS) throw new FixedRange('a scale beyond what the fixed-point path converts');
  if (s >= 0) return (m << BigInt(s)).toString();
  const f = -s;
  const neg = m < 0n;
  let digits = ((neg ? -m : m) * 5n ** BigInt(f)).toString();
  if (digits.length <= f) digits = '0'.repeat(f - digits.length + 1) + digits;
  const ip = digits.slice(0, digits.length - f);
  const fp = digits.slice(digits.length - f).replace(/0+$/, '');
  return `${neg ? '-' : ''}${ip}${fp ? `.${fp}` : ''}`;
}

export class FixCtx {
  readonly frac: number;
  private readonly F: bigint;
  readonly one: bigint;
  private readonly maxAbs: bigint;
  private readonly floatScale: number;

  constructor(frac: number) {
    if (!Number.isInteger(frac) || frac < 8 || frac > MAX_FRAC_BITS) throw new FixedRange(`fraction bits ${frac} outside what the fixed-point path handles`);
    this.frac = frac;
    this.F = BigInt(frac);
    this.one = 1n << this.F;
    this.maxAbs = 1n << BigInt(frac + MAX_INT_BITS);
    this.floatScale = 2 ** Math.min(frac, 1000);
  }

  /** floor / ceil of x·2^F for a finite decimal (directed). FixedRange when |x| ≥ 2^MAX_INT_BITS. */
  fromDecimal(x: Decimal, up: boolean): bigint {
    const { s, e, d } = x as unknown as DecimalParts;
    if (!d) throw new FixedRange('not a finite number');
    if (d.length === 0 || (d.length === 1 && d[0] === 0)) return 0n;
    // x = s · 0.d... with limbs of 7 digits; C = all limbs as one integer, x = s·C·10^k
    let C = BigInt(d[0]!);
    for (let i = 1; i < d.length; i++) C = C * 10000000n + BigInt(d[i]!);
    const lead = String(d[0]!).length;
    const k = e - (lead - 1) - 7 * (d.length - 1);
    if (e > MAX_INT_BITS * 0.302) throw new FixedRange('a value too large for the fixed-point path');
    if (s < 0) C = -C;
    if (k >= 0) return (C * pow10(k)) << this.F;
    if (e < -(this.frac * 0.302) - 2) return up ? (s > 0 ? 1n : 0n) : s < 0 ? -1n : 0n; // |x| < 10^(e+1) < 2^−F
    const num = C << this.F;
    const den = pow10(-k);
    return up ? ceilDiv(num, den) : floorDiv(num, den);
  }

  /** Enclosure of a decimal interval (outward). */
  fromIv(a: Iv): Fx {
    return { lo: this.fromDecimal(a.lo, false), hi: this.fromDecimal(a.hi, true) };
  }

  /** Enclosure of one exact decimal (a point, or the two neighbours around it). */
  fromPoint(x: Decimal): Fx {
    return { lo: this.fromDecimal(x, false), hi: this.fromDecimal(x, true) };
  }

  /** Integer ≥ x·2^F (up) or ≤ x·2^F (down) for a finite double x (exact: see the header); FixedRange otherwise. */
  fromFloat(x: number, up: boolean): bigint {
    let t = x;
    for (let rest = this.frac; rest > 0 && Number.isFinite(t); rest -= 1000) t *= 2 ** Math.min(1000, rest);
    if (!Number.isFinite(t)) throw new FixedRange('a float out of range');
    return BigInt(up ? Math.ceil(t) : Math.floor(t));
  }

  /** @heuristic double nearest-ish to m·2^−F (for float sweeps only). */
  toFloat(m: bigint): number {
    const n = Number(m);
    if (Number.isFinite(n)) return this.frac <= 1000 ? n / this.floatScale : n / this.floatScale / 2 ** (this.frac - 1000);
    return m > 0n ? Infinity : -Infinity;
  }

  /** Exact decimal string of m·2^−F (m·5^F / 10^F). */
  toDecimalString(m: bigint): string {
    return dyadicString(m, -this.frac);
  }

  /** Exact decimal string of m·2^(e−F) (a scaled value; `toDecimalString` is e = 0). */
  toDecimalScaled(m: bigint, e: number): string {
    return dyadicString(m, e - this.frac);
  }

  private check(m: bigint): bigint {
    if (m > this.maxAbs || m < -this.maxAbs) throw new FixedRange('a value too large for the fixed-point path');
    return m;
  }

  /** Directed products of two numbers. */
  mulDown(x: bigint, y: bigint): bigint {
    return (x * y) >> this.F;
  }
  mulUp(x: bigint, y: bigint): bigint {
    return -((-(x * y)) >> this.F);
  }
  /** ceil(x / y · 2^F) for x ≥ 0, y > 0 (an upper bound of the quotient). */
  divUp(x: bigint, y: bigint): bigint {
    if (y <= 0n || x < 0n) throw new FixedRange('divUp needs x ≥ 0, y > 0');
    return this.check(ceilDiv(x << this.F, y));
  }

  /** 1/a for an interval not containing 0: [floor(2^2F/hi), ceil(2^2F/lo)] (1/x decreases on each sign). */
  recip(a: Fx): Fx {
    if (a.lo <= 0n && a.hi >= 0n) throw new FixedRange('reciprocal of an interval containing 0');
    const one2 = this.one << this.F;
    return { lo: this.check(floorDiv(one2, a.hi)), hi: this.check(ceilDiv(one2, a.lo)) };
  }
  /** A point: the interval [m, m]. */
  point(m: bigint): Fx {
    return { lo: m, hi: m };
  }
  /** @heuristic a fixed-point number near the middle of a (floor of the mean). */
  mid(a: Fx): bigint {
    return (a.lo + a.hi) >> 1n;
  }

  add(a: Fx, b: Fx): Fx {
    return { lo: a.lo + b.lo, hi: a.hi + b.hi };
  }
  sub(a: Fx, b: Fx): Fx {
    return { lo: a.lo - b.hi, hi: a.hi - b.lo };
  }
  neg(a: Fx): Fx {
    return { lo: -a.hi, hi: -a.lo };
  }

  /** Interval product by the sign-case table (each end one directed product). */
  mul(a: Fx, b: Fx): Fx {
    const { lo: al, hi: ah } = a;
    const { lo: bl, hi: bh } = b;
    let lo: bigint;
    let hi: bigint;
    if (al >= 0n) {
      if (bl >= 0n) [lo, hi] = [this.mulDown(al, bl), this.mulUp(ah, bh)];
      else if (bh <= 0n) [lo, hi] = [this.mulDown(ah, bl), this.mulUp(al, bh)];
      else [lo, hi] = [this.mulDown(ah, bl), this.mulUp(ah, bh)];
    } else if (ah <= 0n) {
      if (bl >= 0n) [lo, hi] = [this.mulDown(al, bh), this.mulUp(ah, bl)];
      else if (bh <= 0n) [lo, hi] = [this.mulDown(ah, bh), this.mulUp(al, bl)];
      else [lo, hi] = [this.mulDown(al, bh), this.mulUp(al, bl)];
    } else if (bl >= 0n) [lo, hi] = [this.mulDown(al, bh), this.mulUp(ah, bh)];
    else if (bh <= 0n) [lo, hi] = [this.mulDown(ah, bl), this.mulUp(al, bl)];
    else {
      const l1 = this.mulDown(al, bh);
      const l2 = this.mulDown(ah, bl);
      const h1 = this.mulUp(al, bl);
      const h2 = this.mulUp(ah, bh);
      lo = l1 < l2 ? l1 : l2;
      hi = h1 > h2 ? h1 : h2;
    }
    return { lo: this.check(lo), hi: this.check(hi) };
  }

  /** Upper bound of max |x| over a. */
  mag(a: Fx): bigint {
    const l = -a.lo;
    return l > a.hi ? l : a.hi;
  }
  /** Lower bound of min |x| over a (0 when a straddles 0). */
  mig(a: Fx): bigint {
    if (a.lo > 0n) return a.lo;
    if (a.hi < 0n) return -a.hi;
    return 0n;
  }
}
