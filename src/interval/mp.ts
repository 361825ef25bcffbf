/**
 * Multiprecision interval arithmetic on decimal.js 10.6.0 with directed rounding, used for
 * precision escalation (DESIGN.md §5) when float64 intervals fail for conditioning reasons.
 *
 * Representation: MpInterval = { lo, hi } (immutable Decimals, lo <= hi; ±Infinity marks an
 * unbounded end). Lower ends are computed in a Decimal clone with ROUND_FLOOR, upper ends in a
 * clone with ROUND_CEIL, both at `digits = ceil(bits·log10 2) + 2` significant digits; the
 * global Decimal settings are never read or changed. Any Decimal may be passed in as an end
 * (of any clone, with any number of digits); results are rounded to `digits`.
 *
 * Enclosure method per operation (tests: tests/interval/mp.test.ts, mp-itf1788.test.ts):
 *  - add, sub, mul, div, neg, abs, min, max, sqr: endpoint formulas with decimal.js + − × ÷,
 *    which round correctly in the set direction (DESIGN.md §5). Tight: each end within one unit
 *    in the last place (ulp) of the exact result.
 *  - pown: binary powering of |ends| with directed products (rigorous, a few ulps).
 *  - sqrt: decimal.js sqrt in the directed context, then checked exactly (s² <= x for the lower
 *    end, s² >= x for the upper one, in a context wide enough for the product to be exact) and
 *    moved outward if the check fails: rigorous whatever decimal.js's sqrt does.
 *  - pi, e, exp, log, sin, cos, tan, atan, sinh, cosh, tanh, pow: rigorous from first
 *    principles (range reduction + series with explicit remainder bounds, only + − × ÷ in
 *    directed rounding), see src/interval/mp-elementary.ts for each method. `status.assumed` is
 *    never set by this arithmetic; decimal.js exp/ln/pow (upstream issue 244) bound nothing.
 *    Tight to a few ulps for point arguments.
 *  - sin, cos: extrema at m·π/2 are located with the rigorous π; when it cannot be decided
 *    whether an extremum lies in the box, it is included. tan: a box that may contain a pole
 *    gives the entire line and status.continuous = false.
 *
 * Special values and domain (status.continuous = false marks IEEE 1788 `trv`; it is never
 * reset here, see resetStatus):
 *   | operation            | input                          | result            | continuous |
 *   |----------------------|--------------------------------|-------------------|------------|
 *   | div                  | 0 ∈ b, b ≠ [0,0], a = [0,0]    | [0, 0]            | false      |
 *   | div                  | b = [0, d] or [d, 0], d ≠ 0    | a·[1/d, +∞] etc.  | false      |
 *   | div                  | b straddles 0 or b = [0, 0]    | [−∞, +∞]          | false      |
 *   | pown(a, n), n < 0    | 0 ∈ a                          | as div            | false      |
 *   | pown(a, 0)           | any a                          | [1, 1]            | unchanged  |
 *   | sqrt                 | lo < 0 <= hi / hi < 0          | sqrt[0, hi] / ent.| false      |
 *   | log                  | lo <= 0 < hi / hi <= 0         | [−∞, log hi]/ent. | false      |
 *   | pow(a, b)            | lo(a) < 0, or 0 ∈ a, b ⊄ (0,∞) | on the domain part| false      |
 *   | pow(a, b)            | a = [0, 0], b > 0              | [0, 0]            | unchanged  |
 *   | exp, sinh, cosh      | end > 1e15 (overflow)          | end +∞            | false      |
 *   | exp                  | end < −1e15                    | [0, tiny]         | unchanged  |
 *   | sin, cos             | |end| >= 1e401 or ±∞           | [−1, 1]           | unchanged  |
 *   | tan                  | possible pole, |end| >= 1e401  | [−∞, +∞]          | false      |
 *   | atan, tanh           | ±∞ ends                        | ±π/2, ±1 ends     | unchanged  |
 *   | any                  | NaN end                        | [−∞, +∞]          | false      |
 *   | mul, div             | decimal.js exponent overflow   | end ±∞ / ±1e9e15  | false      |
 *   | mul, div             | exponent underflow (< 1e−9e15) | end 0 or ±1e−9e15 | unchanged  |
 * add/sub: a difference of two numbers beyond 1e±15 could underflow below decimal.js's 1e−9e15 and
 * be flushed to 0 in both directions (a wrong bound); so add/sub with any finite non-zero operand
 * end of |decimal exponent| > 1e15 clear status.continuous and return the entire line.
 *
 * Conversions: fromNumber is the exact double (rounded outward when it needs more than `digits`
 * digits, e.g. subnormals); fromDecimal/constant are exact when the literal fits in `digits`
 * significant digits, outward otherwise; loDown/hiUp/widUp/magUp/migDown convert to doubles with
 * an exact comparison (src/interval/mp-convert.ts); toDecimal returns decimal.js toString of the
 * ends, which is exact (it may use exponent notation such as "1.25e-30", and "-Infinity" /
 * "Infinity" for unbounded ends). midPoint is the working-precision rounding of (lo + hi)/2
 * clamped into the box (0, or twice the finite end, for unbounded boxes).
 */
import { Decimal } from 'decimal.js';
import { MAX_BITS } from '../certificate/limits.js';
import type { EvalStatus, IntervalArithmetic } from './arithmetic.js';
import { DECIMAL_LITERAL, digitsForBits } from './decimal-literal.js';
import { decimalValueOfDouble, doubleDown, doubleUp } from './mp-convert.js';
import {
  atanPoint,
  contextFor,
  divideEnclosures,
  expPoint,
  logPoint,
  mayContainHalfPiMultiple,
  piEnclosure,
  sinCosPoint,
  sinhCoshPoint,
  tanhPoint,
  TRIG_MAX_EXPONENT,
  type DecimalEnclosure,
} from './mp-elementary.js';

/** A closed interval [lo, hi] of decimal.js values; lo <= hi; ends may be ±Infinity. */
export interface MpInterval {
  readonly lo: Decimal;
  readonly hi: Decimal;
}

/** Smallest and largest supported working precisions in bits. */
export const MP_MIN_BITS = 24;
export const MP_MAX_BITS = MAX_BITS;

/** Arguments above this make exp/sinh/cosh report overflow (upper end +Infinity). */
const EXP_LIMIT = new Decimal('1e15');

/**
 * Multiprecision interval arithmetic with `bits` binary digits of working precision
 * (24 <= bits <= 100000). See the header of this file for each operation's contract.
 */
export function mpIntervalArithmetic(bits: number): IntervalArithmetic<MpInterval> {
  if (!Number.isInteger(bits) || bits < MP_MIN_BITS || bits > MP_MAX_BITS) {
    throw new RangeError(`mpIntervalArithmetic: bits must be an integer in [${MP_MIN_BITS}, ${MP_MAX_BITS}], got ${bits}`);
  }
  const digits = digitsForBits(bits);
  const { Dn, Up, Nr } = contextFor(digits);
  // Products of two working-precision numbers are exact at 2·digits + 2 (sqrt check).
  const Wide = contextFor(2 * digits + 2).Nr;
  const status: EvalStatus = { continuous: true, assumed: false };

  const ZERO = new Dn('0');
  const ONE = new Dn('1');
  const MINUS_ONE = new Dn('-1');
  const POS_INF = new Dn('Infinity');
  const NEG_INF = new Dn('-Infinity');
  const ENTIRE: MpInterval = { lo: NEG_INF, hi: POS_INF };
  const UNIT: MpInterval = { lo: MINUS_ONE, hi: ONE };

  // Endpoint operations. The receiver's class decides the rounding, so coerce it first.
  const dn = (x: Decimal): Decimal => (x.constructor === Dn ? x : new Dn(x));
  const up = (x: Decimal): Decimal => (x.constructor === Up ? x : new Up(x));
  const isNonNeg = (x: Decimal): boolean => x.isZero() || x.isPos();
  const isNonPos = (x: Decimal): boolean => x.isZero() || x.isNeg();
  // decimal.js flushes results with decimal exponent below minE = −9e15 to 0 and above
  // maxE = 9e15 to ±Infinity, whatever the rounding mode. Products and quotients of finite
  // non-zero operands are repaired outward: |v| < 1e−9e15 = TINY after an underflow, |v| > 1e9e15
  // = HUGE after an overflow (which also clears status.continuous).
  const TINY = new Dn('1e-9000000000000000');
  const HUGE = new Dn('1e9000000000000000');
  function repairDn(r: Decimal, x: Decimal, y: Decimal): Decimal {
    if ((r.isFinite() && !r.isZero()) || !x.isFinite() || !y.isFinite() || x.isZero()) return r;
    const negative = x.isNeg() !== y.isNeg();
    if (r.isZero()) return negative ? TINY.neg() : ZERO;
    status.continuous = false;
    return negative ? NEG_INF : HUGE;
  }
  function repairUp(r: Decimal, x: Decimal, y: Decimal): Decimal {
    if ((r.isFinite() && !r.isZero()) || !x.isFinite() || !y.isFinite() || x.isZero()) return r;
    const negative = x.isNeg() !== y.isNeg();
    if (r.isZero()) return negative ? ZERO : TINY;
    status.continuous = false;
    return negative ? HUGE.neg() : POS_INF;
  }
  // 0 · ±∞ = 0 for endpoint products (IEEE 1788 multiplication of extended intervals).
  const mulDn = (x: Decimal, y: Decimal): Decimal =>
    x.isZero() || y.isZero() ? ZERO : repairDn(dn(x).times(y), x, y);
  const mulUp = (x: Decimal, y: Decimal): Decimal =>
    x.isZero() || y.isZero() ? ZERO : repairUp(up(x).times(y), x, y);
  // y != 0 wherever these are used.
  const divDn = (x: Decimal, y: Decimal): Decimal => repairDn(dn(x).div(y), x, y);
  const divUp = (x: Decimal, y: Decimal): Decimal => repairUp(up(x).div(y), x, y);
  const roundDn = (x: Decimal): Decimal => (x.isFinite() ? new Dn(x).toSD(digits, Decimal.ROUND_FLOOR) : x);
  const roundUp = (x: Decimal): Decimal => (x.isFinite() ? new Up(x).toSD(digits, Decimal.ROUND_CEIL) : x);
  const outward = (e: DecimalEnclosure): MpInterval => ({ lo: roundDn(e.lo), hi: roundUp(e.hi) });
  const minD = (x: Decimal, y: Decimal): Decimal => (x.lte(y) ? x : y);
  const maxD = (x: Decimal, y: Decimal): Decimal => (x.gte(y) ? x : y);

  function domainError(): MpInterval {
    status.continuous = false;
    return ENTIRE;
  }

  function checked(r: MpInterval): MpInterval {
    if (r.lo.isNaN() || r.hi.isNaN()) return domainError();
    return r;
  }

  /** Operand end far enough inside decimal.js's exponent range for + and − to be exact-or-rounded. */
  const ADD_EXPONENT_LIMIT = 1e15;
  function addRangeOk(x: Decimal): boolean {
    return x.isZero() || !x.isFinite() || (x.e <= ADD_EXPONENT_LIMIT && x.e >= -ADD_EXPONENT_LIMIT);
  }
  function addOperandsOk(a: MpInterval, b: MpInterval): boolean {
    return addRangeOk(a.lo) && addRangeOk(a.hi) && addRangeOk(b.lo) && addRangeOk(b.hi);
  }

  function isNaNBox(a: MpInterval): boolean {
    return a.lo.isNaN() || a.hi.isNaN();
  }

  function fromDecimalExact(s: string): Decimal {
    const t = s.trim();
    if (!DECIMAL_LITERAL.test(t)) throw new TypeError(`not a decimal literal: ${JSON.stringify(s)}`);
    return new Nr(t); // the constructor never rounds
  }

  function mul(a: MpInterval, b: MpInterval): MpInterval {
    if (isNonNeg(a.lo)) {
      if (isNonNeg(b.lo)) return { lo: mulDn(a.lo, b.lo), hi: mulUp(a.hi, b.hi) };
      if (isNonPos(b.hi)) return { lo: mulDn(a.hi, b.lo), hi: mulUp(a.lo, b.hi) };
      return { lo: mulDn(a.hi, b.lo), hi: mulUp(a.hi, b.hi) };
    }
    if (isNonPos(a.hi)) {
      if (isNonNeg(b.lo)) return { lo: mulDn(a.lo, b.hi), hi: mulUp(a.hi, b.lo) };
      if (isNonPos(b.hi)) return { lo: mulDn(a.hi, b.hi), hi: mulUp(a.lo, b.lo) };
      return { lo: mulDn(a.lo, b.hi), hi: mulUp(a.lo, b.lo) };
    }
    if (isNonNeg(b.lo)) return { lo: mulDn(a.lo, b.hi), hi: mulUp(a.hi, b.hi) };
    if (isNonPos(b.hi)) return { lo: mulDn(a.hi, b.lo), hi: mulUp(a.lo, b.lo) };
    return {
      lo: minD(mulDn(a.lo, b.hi), mulDn(a.hi, b.lo)),
      hi: maxD(mulUp(a.lo, b.lo), mulUp(a.hi, b.hi)),
    };
  }

  function div(a: MpInterval, b: MpInterval): MpInterval {
    if (isNaNBox(a) || isNaNBox(b)) return domainError();
    if (b.lo.isPos() && !b.lo.isZero()) {
      if (isNonNeg(a.lo)) return { lo: divDn(a.lo, b.hi), hi: divUp(a.hi, b.lo) };
      if (isNonPos(a.hi)) return { lo: divDn(a.lo, b.lo), hi: divUp(a.hi, b.hi) };
      return { lo: divDn(a.lo, b.lo), hi: divUp(a.hi, b.lo) };
    }
    if (b.hi.isNeg() && !b.hi.isZero()) {
      if (isNonNeg(a.lo)) return { lo: divDn(a.hi, b.hi), hi: divUp(a.lo, b.lo) };
      if (isNonPos(a.hi)) return { lo: divDn(a.hi, b.lo), hi: divUp(a.lo, b.hi) };
      return { lo: divDn(a.hi, b.hi), hi: divUp(a.lo, b.hi) };
    }
    // 0 ∈ b: not continuous. One-sided divisors give a half-line, others the entire line.
    status.continuous = false;
    if (a.lo.isZero() && a.hi.isZero() && !(b.lo.isZero() && b.hi.isZero())) return { lo: ZERO, hi: ZERO };
    if (b.lo.isZero() && !b.hi.isZero()) return mul(a, { lo: dn(ONE).div(b.hi), hi: POS_INF });
    if (b.hi.isZero() && !b.lo.isZero()) return mul(a, { lo: NEG_INF, hi: up(ONE).div(b.lo) });
    return ENTIRE;
  }

  /** |x|^n rounded down (rd) or up for x >= 0, n >= 1, by binary powering. */
  function powAbs(x: Decimal, n: number, roundUpward: boolean): Decimal {
    const mulR = roundUpward ? mulUp : mulDn;
    let base = x;
    let result: Decimal | null = null;
    let k = n;
    for (;;) {
      if (k & 1) result = result === null ? base : mulR(result, base);
      k = Math.floor(k / 2);
      if (k === 0) break;
      base = mulR(base, base);
    }
    return result ?? ONE;
  }

  function pown(a: MpInterval, n: number): MpInterval {
    if (!Number.isSafeInteger(n)) throw new RangeError(`pown: exponent must be a safe integer, got ${n}`);
    if (isNaNBox(a)) return domainError();
    if (n === 0) return { lo: ONE, hi: ONE };
    if (n < 0) return div({ lo: ONE, hi: ONE }, pown(a, -n));
    if (n === 1) return a;
    const even = n % 2 === 0;
    if (isNonNeg(a.lo)) return { lo: powAbs(a.lo, n, false), hi: powAbs(a.hi, n, true) };
    if (isNonPos(a.hi)) {
      const lo = powAbs(a.hi.neg(), n, false);
      const hi = powAbs(a.lo.neg(), n, true);
      return even ? { lo, hi } : { lo: hi.neg(), hi: lo.neg() };
    }
    const left = powAbs(a.lo.neg(), n, true);
    const right = powAbs(a.hi, n, true);
    return even ? { lo: ZERO, hi: maxD(left, right) } : { lo: left.neg(), hi: right };
  }

  /** Largest working-precision s with s² <= x (x >= 0 finite), checked exactly. */
  function sqrtDn(x: Decimal): Decimal {
    if (x.isZero()) return ZERO;
    let s = dn(x).sqrt();
    while (new Wide(s).times(s).gt(x)) s = dn(s).minus(new Dn(s).times(`1e-${digits - 1}`).abs());
    return s;
  }

  function sqrtUp(x: Decimal): Decimal {
    if (x.isZero()) return ZERO;
    if (!x.isFinite()) return x;
    let s = up(x).sqrt();
    while (new Wide(s).times(s).lt(x)) s = up(s).plus(new Up(s).times(`1e-${digits - 1}`).abs());
    return s;
  }

  // Elementary point enclosures at the working precision plus guard digits.
  const guard = digits + 3;
  const expLo = (x: Decimal): Decimal => {
    if (!x.isFinite()) return x.isNeg() ? ZERO : POS_INF;
    if (x.lt(EXP_LIMIT.neg())) return ZERO;
    return roundDn(expPoint(x.gt(EXP_LIMIT) ? EXP_LIMIT : x, guard).lo);
  };
  const expHi = (x: Decimal): Decimal => {
    if (!x.isFinite()) return x.isNeg() ? ZERO : POS_INF;
    if (x.gt(EXP_LIMIT)) {
      status.continuous = false;
      return POS_INF;
    }
    return roundUp(expPoint(x.lt(EXP_LIMIT.neg()) ? EXP_LIMIT.neg() : x, guard).hi);
  };

  function expI(a: MpInterval): MpInterval {
    if (isNaNBox(a)) return domainError();
    if (a.lo.eq(a.hi) && a.lo.isFinite() && a.lo.abs().lte(EXP_LIMIT)) return outward(expPoint(a.lo, guard));
    return { lo: expLo(a.lo), hi: expHi(a.hi) };
  }

  /** log without the domain flag (pow decides the domain itself). */
  function logRaw(a: MpInterval): MpInterval {
    const lo = isNonPos(a.lo) ? NEG_INF : roundDn(logPoint(a.lo, guard).lo);
    const hi = !a.hi.isFinite() ? POS_INF : roundUp(logPoint(a.hi, guard).hi);
    return { lo, hi };
  }

  function logI(a: MpInterval): MpInterval {
    if (isNaNBox(a) || isNonPos(a.hi)) return domainError();
    if (isNonPos(a.lo)) status.continuous = false;
    if (a.lo.eq(a.hi)) return outward(logPoint(a.lo, guard));
    return logRaw(a);
  }

  function trigTooLarge(a: MpInterval): boolean {
    return !a.lo.isFinite() || !a.hi.isFinite() || a.lo.e > TRIG_MAX_EXPONENT || a.hi.e > TRIG_MAX_EXPONENT;
  }

  /** sin (which = 0) or cos (which = 1) of a box; extrema at m·π/2, m ≡ maxAt / minAt mod 4. */
  function periodic(a: MpInterval, which: 0 | 1): MpInterval {
    if (isNaNBox(a)) return domainError();
    if (trigTooLarge(a) || up(a.hi).minus(a.lo).gt('7')) return UNIT;
    const pick = (x: Decimal): DecimalEnclosure => {
      const sc = sinCosPoint(x, guard);
      return which === 0 ? sc.sin : sc.cos;
    };
    const fl = pick(a.lo);
    if (a.lo.eq(a.hi)) return outward(fl);
    const fh = pick(a.hi);
    let lo = roundDn(minD(fl.lo, fh.lo));
    let hi = roundUp(maxD(fl.hi, fh.hi));
    const maxAt = which === 0 ? 1 : 0;
    if (mayContainHalfPiMultiple(a.lo, a.hi, maxAt, 4, guard)) hi = ONE;
    if (mayContainHalfPiMultiple(a.lo, a.hi, maxAt + 2, 4, guard)) lo = MINUS_ONE;
    return { lo, hi };
  }

  function tanI(a: MpInterval): MpInterval {
    if (isNaNBox(a) || trigTooLarge(a)) return domainError();
    if (up(a.hi).minus(a.lo).gt('3.2') || mayContainHalfPiMultiple(a.lo, a.hi, 1, 2, guard)) return domainError();
    const pt = (x: Decimal): DecimalEnclosure | null => {
      const sc = sinCosPoint(x, guard + 2);
      return divideEnclosures(guard + 2, sc.sin, sc.cos);
    };
    const tl = pt(a.lo);
    const th = a.lo.eq(a.hi) ? tl : pt(a.hi);
    if (tl === null || th === null) return domainError();
    return { lo: roundDn(tl.lo), hi: roundUp(th.hi) };
  }

  function halfPi(): MpInterval {
    const pi = piEnclosure(guard);
    return { lo: roundDn(new Dn(pi.lo).div('2')), hi: roundUp(new Up(pi.hi).div('2')) };
  }

  function atanI(a: MpInterval): MpInterval {
    if (isNaNBox(a)) return domainError();
    const hp = halfPi();
    const lo = a.lo.isFinite() ? roundDn(atanPoint(a.lo, guard).lo) : a.lo.isNeg() ? hp.hi.neg() : hp.lo;
    const hi = a.hi.isFinite() ? roundUp(atanPoint(a.hi, guard).hi) : a.hi.isNeg() ? hp.lo.neg() : hp.hi;
    return { lo, hi };
  }

  function sinhI(a: MpInterval): MpInterval {
    if (isNaNBox(a)) return domainError();
    const end = (x: Decimal, upper: boolean): Decimal => {
      if (!x.isFinite()) return x;
      if (x.abs().gt(EXP_LIMIT)) {
        if (upper === x.isPos()) {
          status.continuous = false;
          return upper ? POS_INF : NEG_INF;
        }
        x = x.isPos() ? EXP_LIMIT : EXP_LIMIT.neg();
      }
      const s = sinhCoshPoint(x, guard).sinh;
      return upper ? roundUp(s.hi) : roundDn(s.lo);
    };
    return { lo: end(a.lo, false), hi: end(a.hi, true) };
  }

  function coshI(a: MpInterval): MpInterval {
    if (isNaNBox(a)) return domainError();
    const at = (x: Decimal): DecimalEnclosure => {
      if (!x.isFinite() || x.abs().gt(EXP_LIMIT)) {
        status.continuous = false;
        return { lo: ONE, hi: POS_INF };
      }
      return sinhCoshPoint(x, guard).cosh;
    };
    // cosh decreases on (−∞, 0] and increases on [0, ∞).
    if (isNonNeg(a.lo)) return { lo: roundDn(at(a.lo).lo), hi: roundUp(at(a.hi).hi) };
    if (isNonPos(a.hi)) return { lo: roundDn(at(a.hi).lo), hi: roundUp(at(a.lo).hi) };
    const far = a.lo.neg().gt(a.hi) ? a.lo : a.hi;
    return { lo: ONE, hi: roundUp(at(far).hi) };
  }

  function tanhI(a: MpInterval): MpInterval {
    if (isNaNBox(a)) return domainError();
    const lo = a.lo.isFinite() ? roundDn(tanhPoint(a.lo, guard).lo) : a.lo.isNeg() ? MINUS_ONE : ONE;
    const hi = a.hi.isFinite() ? roundUp(tanhPoint(a.hi, guard).hi) : a.hi.isNeg() ? MINUS_ONE : ONE;
    return { lo, hi };
  }

  function powI(a: MpInterval, b: MpInterval): MpInterval {
    if (isNaNBox(a) || isNaNBox(b)) return domainError();
    const bPositive = b.lo.isPos() && !b.lo.isZero();
    if (a.hi.isZero() && b.hi.isPos() && !b.hi.isZero()) {
      // 0^y = 0 for y > 0; only the part y > 0 of b is in the domain (IEEE 1788 pow)
      if (!(a.lo.isZero() && bPositive)) status.continuous = false;
      return { lo: ZERO, hi: ZERO };
    }
    if (isNonPos(a.hi)) return domainError();
    if (a.lo.isNeg() && !a.lo.isZero()) {
      status.continuous = false;
      a = { lo: ZERO, hi: a.hi };
    }
    if (a.lo.isZero() && !bPositive) status.continuous = false;
    const l = logRaw(a);
    return expI(mul(b, l));
  }

  let piCached: MpInterval | null = null;
  let eCached: MpInterval | null = null;

  const arith: IntervalArithmetic<MpInterval> = {
    kind: 'mp-interval',
    bits,
    status,

    constant(lo: string, hi: string): MpInterval {
      const l = fromDecimalExact(lo);
      const h = fromDecimalExact(hi);
      if (l.gt(h)) throw new RangeError(`constant: lo ${lo} > hi ${hi}`);
      return { lo: roundDn(l), hi: roundUp(h) };
    },
    fromNumber(x: number): MpInterval {
      if (!Number.isFinite(x)) {
        status.continuous = false;
        if (x === Infinity) return { lo: roundDn(decimalValueOfDouble(Dn, Number.MAX_VALUE)), hi: POS_INF };
        if (x === -Infinity) return { lo: NEG_INF, hi: roundUp(decimalValueOfDouble(Up, -Number.MAX_VALUE)) };
        return ENTIRE;
      }
      const d = decimalValueOfDouble(Dn, x);
      return { lo: roundDn(d), hi: roundUp(d) };
    },
    fromDecimal(x: string): MpInterval {
      const d = fromDecimalExact(x);
      return { lo: roundDn(d), hi: roundUp(d) };
    },
    pi(): MpInterval {
      if (piCached === null) piCached = outward(piEnclosure(guard));
      return piCached;
    },
    e(): MpInterval {
      if (eCached === null) eCached = outward(expPoint(ONE, guard));
      return eCached;
    },

    add(a, b) {
      if (!addOperandsOk(a, b)) return domainError();
      return checked({ lo: dn(a.lo).plus(b.lo), hi: up(a.hi).plus(b.hi) });
    },
    sub(a, b) {
      if (!addOperandsOk(a, b)) return domainError();
      return checked({ lo: dn(a.lo).minus(b.hi), hi: up(a.hi).minus(b.lo) });
    },
    mul(a, b) {
      if (isNaNBox(a) || isNaNBox(b)) return domainError();
      return mul(a, b);
    },
    div,
    neg(a) {
      return { lo: a.hi.neg(), hi: a.lo.neg() };
    },
    sqr(a) {
      return pown(a, 2);
    },
    pown,
    pow: powI,
    sqrt(a) {
      if (isNaNBox(a) || (a.hi.isNeg() && !a.hi.isZero())) return domainError();
      let lo = a.lo;
      if (lo.isNeg() && !lo.isZero()) {
        status.continuous = false;
        lo = ZERO;
      }
      return { lo: sqrtDn(lo), hi: sqrtUp(a.hi) };
    },
    exp: expI,
    log: logI,
    sin: (a) => periodic(a, 0),
    cos: (a) => periodic(a, 1),
    tan: tanI,
    atan: atanI,
    sinh: sinhI,
    cosh: coshI,
    tanh: tanhI,
    abs(a) {
      if (isNonNeg(a.lo)) return a;
      if (isNonPos(a.hi)) return { lo: a.hi.neg(), hi: a.lo.neg() };
      return { lo: ZERO, hi: maxD(a.lo.neg(), a.hi) };
    },
    min(a, b) {
      return { lo: minD(a.lo, b.lo), hi: minD(a.hi, b.hi) };
    },
    max(a, b) {
      return { lo: maxD(a.lo, b.lo), hi: maxD(a.hi, b.hi) };
    },
    absSlope(a) {
      if (a.lo.isPos() && !a.lo.isZero()) return { lo: ONE, hi: ONE };
      if (a.hi.isNeg() && !a.hi.isZero()) return { lo: MINUS_ONE, hi: MINUS_ONE };
      status.nonsmooth = true;
      return UNIT;
    },

    hull(a, b) {
      return { lo: minD(a.lo, b.lo), hi: maxD(a.hi, b.hi) };
    },
    intersect(a, b) {
      const lo = maxD(a.lo, b.lo);
      const hi = minD(a.hi, b.hi);
      return lo.gt(hi) ? null : { lo, hi };
    },
    isSubset(a, b) {
      return b.lo.lte(a.lo) && a.hi.lte(b.hi);
    },
    isInterior(a, b) {
      const loOk = b.lo.lt(a.lo) || (b.lo.isNeg() && !b.lo.isFinite());
      const hiOk = a.hi.lt(b.hi) || (b.hi.isPos() && !b.hi.isFinite());
      return loOk && hiOk;
    },
    disjoint(a, b) {
      return a.hi.lt(b.lo) || b.hi.lt(a.lo);
    },
    midPoint(a) {
      const m = midpointOf(a);
      return { lo: m, hi: m };
    },
    midNumber(a) {
      return Number(midpointOf(a).toString());
    },
    widUp(a) {
      return doubleUp(up(a.hi).minus(a.lo));
    },
    magUp(a) {
      return doubleUp(maxD(a.lo.abs(), a.hi.abs()));
    },
    migDown(a) {
      if (isNonNeg(a.lo)) return doubleDown(a.lo);
      if (isNonPos(a.hi)) return doubleDown(a.hi.neg());
      return 0;
    },
    loDown(a) {
      return doubleDown(a.lo);
    },
    hiUp(a) {
      return doubleUp(a.hi);
    },
    lo(a) {
      return { lo: a.lo, hi: a.lo };
    },
    hi(a) {
      return { lo: a.hi, hi: a.hi };
    },
    inflate(a, r) {
      if (!(r >= 0)) throw new RangeError(`inflate: radius must be >= 0, got ${r}`);
      if (r === Infinity) return ENTIRE;
      const rr = decimalValueOfDouble(Nr, r);
      return { lo: dn(a.lo).minus(rr), hi: up(a.hi).plus(rr) };
    },
    toDecimal(a) {
      return { lo: a.lo.toString(), hi: a.hi.toString() };
    },
    certainlyLt(a, b) {
      return a.hi.lt(b.lo);
    },
    certainlyLe(a, b) {
      return a.hi.lte(b.lo);
    },
  };

  /** A working-precision point in a, near its midpoint (finite even for unbounded a). */
  function midpointOf(a: MpInterval): Decimal {
    const loInf = !a.lo.isFinite();
    const hiInf = !a.hi.isFinite();
    if (loInf && hiInf) return ZERO;
    if (loInf) return isNonNeg(a.hi) ? ZERO : dn(a.hi).times('2');
    if (hiInf) return isNonPos(a.lo) ? ZERO : up(a.lo).times('2');
    const m = new Nr(a.lo).plus(a.hi).div('2');
    if (m.lt(a.lo)) return a.lo;
    if (m.gt(a.hi)) return a.hi;
    return m;
  }

  return arith;
}
