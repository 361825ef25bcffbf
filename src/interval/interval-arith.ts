/**
 * `intervalArithmetic()`: the float64 interval instance of IntervalArithmetic<Interval>
 * (arithmetic.ts). Each call returns a NEW instance with its own `status`:
 *  - status.continuous := false when an operation's input leaves its domain of definition /
 *    continuity (kernel F_UNDEF: sqrt/log/pow outside the domain, division by a box containing 0,
 *    tan across a possible pole, NaN), when an input is empty (F_EMPTY), and when bounded inputs
 *    overflow to an unbounded result (F_OVERFLOW);
 *  - status.assumed := true when a result rests on the accuracy of Math.* (F_ASSUMED: atan, sinh,
 *    tanh, pow; exp, log, cosh, sin, cos and tan are proven; see README.md).
 * Enclosures are those of kernel.ts. `constant(lo, hi)` encloses the exact decimals
 * (decimal-literal.ts) and caches them per instance.
 */

import type { EvalStatus, IntervalArithmetic } from './arithmetic.js';
import { decimalOfDouble, encloseDecimal } from './decimal-literal.js';
import * as K from './kernel.js';
import { E, ENTIRE, Interval, PI, isEmpty, mag, mid, mig } from './interval.js';
import { addUp, subDown, subUp } from './round.js';

/** The float64 interval arithmetic (outward rounding, proven elementary functions) as an `IntervalArithmetic`. */
export function intervalArithmetic(): IntervalArithmetic<Interval> {
  const status: EvalStatus = { continuous: true, assumed: false, nonsmooth: false };
  const S = new Float64Array(2);
  const constants = new Map<string, Interval>();

  function done(flags: number): Interval {
    if (flags !== 0) {
      if (flags & K.F_NOT_CONTINUOUS) status.continuous = false;
      if (flags & K.F_ASSUMED) status.assumed = true;
    }
    return new Interval(S[0]!, S[1]!);
  }

  function enclose(lo: string, hi: string): Interval {
    const key = `${lo}|${hi}`;
    let c = constants.get(key);
    if (c === undefined) {
      const l = encloseDecimal(lo).lo;
      const h = encloseDecimal(hi).hi;
      if (!(l <= h)) throw new Error(`constant: lower end ${lo} exceeds upper end ${hi}`);
      c = new Interval(l, h);
      constants.set(key, c);
    }
    return c;
  }

  const arith: IntervalArithmetic<Interval> = {
    kind: 'interval',
    bits: 53,
    status,
    constant: enclose,
    fromNumber(x: number): Interval {
      if (!Number.isFinite(x)) {
        status.continuous = false;
        return ENTIRE;
      }
      return new Interval(x, x);
    },
    pi: () => PI,
    e: () => E,
    add: (a, b) => done(K.kAdd(S, 0, a.lo, a.hi, b.lo, b.hi)),
    sub: (a, b) => done(K.kSub(S, 0, a.lo, a.hi, b.lo, b.hi)),
    mul: (a, b) => done(K.kMul(S, 0, a.lo, a.hi, b.lo, b.hi)),
    div: (a, b) => done(K.kDiv(S, 0, a.lo, a.hi, b.lo, b.hi)),
    neg: (a) => done(K.kNeg(S, 0, a.lo, a.hi)),
    sqr: (a) => done(K.kSqr(S, 0, a.lo, a.hi)),
    pown: (a, n) => done(K.kPown(S, 0, a.lo, a.hi, n)),
    pow: (a, b) => done(K.kPow(S, 0, a.lo, a.hi, b.lo, b.hi)),
    sqrt: (a) => done(K.kSqrt(S, 0, a.lo, a.hi)),
    exp: (a) => done(K.kExp(S, 0, a.lo, a.hi)),
    log: (a) => done(K.kLog(S, 0, a.lo, a.hi)),
    sin: (a) => done(K.kSin(S, 0, a.lo, a.hi)),
    cos: (a) => done(K.kCos(S, 0, a.lo, a.hi)),
    tan: (a) => done(K.kTan(S, 0, a.lo, a.hi)),
    atan: (a) => done(K.kAtan(S, 0, a.lo, a.hi)),
    sinh: (a) => done(K.kSinh(S, 0, a.lo, a.hi)),
    cosh: (a) => done(K.kCosh(S, 0, a.lo, a.hi)),
    tanh: (a) => done(K.kTanh(S, 0, a.lo, a.hi)),
    abs: (a) => done(K.kAbs(S, 0, a.lo, a.hi)),
    min: (a, b) => done(K.kMin(S, 0, a.lo, a.hi, b.lo, b.hi)),
    max: (a, b) => done(K.kMax(S, 0, a.lo, a.hi, b.lo, b.hi)),
    absSlope: (a) => {
      if (!(a.lo > 0) && !(a.hi < 0)) status.nonsmooth = true;
      return done(K.kAbsSlope(S, 0, a.lo, a.hi));
    },

    hull(a, b) {
      if (isEmpty(a)) return b;
      if (isEmpty(b)) return a;
      return new Interval(Math.min(a.lo, b.lo), Math.max(a.hi, b.hi));
    },
    intersect(a, b) {
      const lo = Math.max(a.lo, b.lo);
      const hi = Math.min(a.hi, b.hi);
      return lo <= hi ? new Interval(lo, hi) : null;
    },
    isSubset: (a, b) => isEmpty(a) || (b.lo <= a.lo && a.hi <= b.hi),
    isInterior: (a, b) =>
      isEmpty(a) ||
      (!isEmpty(b) && (b.lo < a.lo || b.lo === -Infinity) && (a.hi < b.hi || b.hi === Infinity)),
    disjoint: (a, b) => isEmpty(a) || isEmpty(b) || a.hi < b.lo || b.hi < a.lo,
    midPoint(a) {
      const m = mid(a);
      return new Interval(m, m);
    },
    midNumber: (a) => mid(a),
    widUp: (a) => (isEmpty(a) ? 0 : subUp(a.hi, a.lo)),
    magUp: (a) => mag(a),
    migDown: (a) => mig(a),
    loDown: (a) => a.lo,
    hiUp: (a) => a.hi,
    lo: (a) => new Interval(a.lo, a.lo),
    hi: (a) => new Interval(a.hi, a.hi),
    inflate(a, r) {
      if (isEmpty(a)) return a;
      return new Interval(subDown(a.lo, r), addUp(a.hi, r));
    },
    toDecimal(a) {
      if (isEmpty(a) || !Number.isFinite(a.lo) || !Number.isFinite(a.hi))
        throw new Error(`toDecimal: interval ${a.toString()} has no finite decimal endpoints`);
      return { lo: decimalOfDouble(a.lo), hi: decimalOfDouble(a.hi) };
    },
    certainlyLt: (a, b) => a.hi < b.lo,
    certainlyLe: (a, b) => a.hi <= b.lo,
    fromDecimal(x) {
      const { lo, hi } = encloseDecimal(x);
      return new Interval(lo, hi);
    },
  };
  return arith;
}
