/**
 * IEEE 1788-2015 decorations (§8, §11): a decorated interval carries what is known about the
 * evaluation that produced it. Ordered com > dac > def > trv > ill:
 *  - com: non-empty, bounded, every operation defined and continuous on its input box, and the
 *    result bounded;
 *  - dac: defined and continuous on the input boxes (results may be unbounded, e.g. overflow);
 *  - def: defined but possibly discontinuous (no operation here produces def by itself);
 *  - trv: nothing known (some input box left a domain);
 *  - ill: not an interval (NaI).
 *
 * Propagation (§11.7): the result's decoration is min(local decoration, input decorations), where
 * the local decoration of op on boxes x is trv if op is not defined and continuous on all of x
 * (kernel flag F_UNDEF or an empty input), dac if it is but the result is unbounded, com otherwise.
 * Existence theorems need dac or better (the kernel's F_OVERFLOW additionally turns the
 * arithmetic's `status.continuous` off; see interval-arith.ts).
 */

import * as K from './kernel.js';
import { EMPTY, Interval, isEmpty } from './interval.js';

export enum Decoration {
  ill = 0,
  trv = 1,
  def = 2,
  dac = 3,
  com = 4,
}

export interface DecoratedInterval {
  readonly x: Interval;
  readonly d: Decoration;
}

/** IEEE 1788 newDec: EMPTY → trv, unbounded → dac, otherwise com. */
export function newDec(x: Interval): DecoratedInterval {
  if (isEmpty(x)) return { x, d: Decoration.trv };
  if (x.lo === -Infinity || x.hi === Infinity) return { x, d: Decoration.dac };
  return { x, d: Decoration.com };
}

/** Decorated interval with an explicit decoration (no consistency check: caller's contract). */
export function decorated(x: Interval, d: Decoration): DecoratedInterval {
  return { x, d };
}

/**
 * Local decoration from kernel flags and the result: trv if F_UNDEF / F_EMPTY, dac if the result is
 * unbounded (including overflow), com otherwise.
 */
export function localDecoration(flags: number, r: Interval): Decoration {
  if (flags & (K.F_UNDEF | K.F_EMPTY)) return Decoration.trv;
  if (isEmpty(r)) return Decoration.trv;
  if (r.lo === -Infinity || r.hi === Infinity) return Decoration.dac;
  return Decoration.com;
}

const S = new Float64Array(2);

function finish(flags: number, ...inputs: DecoratedInterval[]): DecoratedInterval {
  let d = Decoration.com;
  for (const a of inputs) {
    if (a.d === Decoration.ill) return { x: EMPTY, d: Decoration.ill };
    if (a.d < d) d = a.d;
  }
  const r = new Interval(S[0]!, S[1]!);
  const l = localDecoration(flags, r);
  return { x: r, d: l < d ? l : d };
}

type Unary = (out: Float64Array, o: number, lo: number, hi: number) => number;
type Binary = (out: Float64Array, o: number, alo: number, ahi: number, blo: number, bhi: number) => number;

function unary(k: Unary): (a: DecoratedInterval) => DecoratedInterval {
  return (a) => finish(k(S, 0, a.x.lo, a.x.hi), a);
}
function binary(k: Binary): (a: DecoratedInterval, b: DecoratedInterval) => DecoratedInterval {
  return (a, b) => finish(k(S, 0, a.x.lo, a.x.hi, b.x.lo, b.x.hi), a, b);
}

// Decorated versions of every kernel operation (contracts as in kernel.ts).
export const addDec = binary(K.kAdd);
export const subDec = binary(K.kSub);
export const mulDec = binary(K.kMul);
export const divDec = binary(K.kDiv);
export const minDec = binary(K.kMin);
export const maxDec = binary(K.kMax);
export const powDec = binary(K.kPow);
export const negDec = unary(K.kNeg);
export const posDec = unary(K.kPos);
export const recipDec = unary(K.kRecip);
export const sqrDec = unary(K.kSqr);
export const sqrtDec = unary(K.kSqrt);
export const expDec = unary(K.kExp);
export const logDec = unary(K.kLog);
export const sinDec = unary(K.kSin);
export const cosDec = unary(K.kCos);
export const tanDec = unary(K.kTan);
export const atanDec = unary(K.kAtan);
export const sinhDec = unary(K.kSinh);
export const coshDec = unary(K.kCosh);
export const tanhDec = unary(K.kTanh);
export const absDec = unary(K.kAbs);

export function pownDec(a: DecoratedInterval, n: number): DecoratedInterval {
  return finish(K.kPown(S, 0, a.x.lo, a.x.hi, n), a);
}

/**
 * IEEE 1788 intersection / convexHull of decorated intervals: the set operation on the intervals,
 * decoration trv (they are not point functions, §11.7.1).
 */
export function intersectDec(a: DecoratedInterval, b: DecoratedInterval): DecoratedInterval {
  if (a.d === Decoration.ill || b.d === Decoration.ill) return { x: EMPTY, d: Decoration.ill };
  const lo = Math.max(a.x.lo, b.x.lo);
  const hi = Math.min(a.x.hi, b.x.hi);
  return { x: lo <= hi ? new Interval(lo, hi) : EMPTY, d: Decoration.trv };
}

export function hullDec(a: DecoratedInterval, b: DecoratedInterval): DecoratedInterval {
  if (a.d === Decoration.ill || b.d === Decoration.ill) return { x: EMPTY, d: Decoration.ill };
  if (isEmpty(a.x)) return { x: b.x, d: Decoration.trv };
  if (isEmpty(b.x)) return { x: a.x, d: Decoration.trv };
  return { x: new Interval(Math.min(a.x.lo, b.x.lo), Math.max(a.x.hi, b.x.hi)), d: Decoration.trv };
}
