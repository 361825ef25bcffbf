/**
 * Forward-mode dual numbers over any arithmetic: a value and its gradient with respect to `n`
 * seeded variables. `dualArithmetic(base, n)` is itself an `Arithmetic<Dual<T>>`, so the generic
 * tape evaluator runs on it unchanged, and nesting gives higher order: evaluating
 * `imageAndJacobian` over `dualArithmetic(I, n)` with seeded inputs yields Jacobian entries whose
 * gradients are the second derivatives ∂²f_k/∂x_j∂x_l (used for fold/flip systems, DESIGN.md §4).
 *
 * Over an interval base every rule is an enclosure of the true derivative over the box; abs,
 * min and max use `absSlope` (a slope/Clarke enclosure). The derivative of `absSlope` itself is
 * taken as 0, which is exact away from the kink; second-order results for abs/min/max at a
 * box that touches the kink are therefore not enclosures — the caller must not use them there.
 *
 * Values are immutable; the status object is the base arithmetic's.
 */
import type { Arithmetic, EvalStatus } from '../interval/arithmetic.js';

export interface Dual<T> {
  readonly v: T;
  /** ∂v/∂x_j for j < n. */
  readonly d: readonly T[];
}

export interface DualArithmetic<T> extends Arithmetic<Dual<T>> {
  readonly base: Arithmetic<T>;
  readonly n: number;
  /** The j-th seeded variable with value x: gradient e_j. */
  variable(x: T, j: number): Dual<T>;
  /** A value with zero gradient. */
  lift(x: T): Dual<T>;
}

export function dualArithmetic<T>(base: Arithmetic<T>, n: number): DualArithmetic<T> {
  const A = base;
  const zero = A.fromNumber(0);
  const one = A.fromNumber(1);
  const half = A.fromNumber(0.5);
  const two = A.fromNumber(2);
  const zeros: readonly T[] = new Array<T>(n).fill(zero);
  const lift = (x: T): Dual<T> => ({ v: x, d: zeros });
  /** chain rule for a one-argument function: y = f(u), s = f'(u). */
  const chain = (u: Dual<T>, y: T, s: T): Dual<T> => {
    if (u.d === zeros) return lift(y);
    const d = new Array<T>(n);
    for (let k = 0; k < n; k++) d[k] = A.mul(s, u.d[k]!);
    return { v: y, d };
  };
  const combine = (y: T, p: Dual<T>, sp: T, q: Dual<T>, sq: T): Dual<T> => {
    if (p.d === zeros && q.d === zeros) return lift(y);
    const d = new Array<T>(n);
    for (let k = 0; k < n; k++) {
      if (q.d === zeros) d[k] = A.mul(sp, p.d[k]!);
      else if (p.d === zeros) d[k] = A.mul(sq, q.d[k]!);
      else d[k] = A.add(A.mul(sp, p.d[k]!), A.mul(sq, q.d[k]!));
    }
    return { v: y, d };
  };
  const status: EvalStatus = A.status;
  const minmax = (p: Dual<T>, q: Dual<T>, isMax: boolean): Dual<T> => {
    const y = isMax ? A.max(p.v, q.v) : A.min(p.v, q.v);
    const s = A.absSlope(A.sub(p.v, q.v));
    const signed = isMax ? s : A.neg(s);
    // d = ((du + dw) ± s·(du − dw)) / 2
    const sp = A.mul(half, A.add(one, signed));
    const sq = A.mul(half, A.sub(one, signed));
    return combine(y, p, sp, q, sq);
  };
  const self: DualArithmetic<T> = {
    kind: A.kind,
    status,
    base: A,
    n,
    variable(x, j) {
      const d = new Array<T>(n).fill(zero);
      d[j] = one;
      return { v: x, d };
    },
    lift,
    constant: (lo, hi) => lift(A.constant(lo, hi)),
    fromNumber: (x) => lift(A.fromNumber(x)),
    pi: () => lift(A.pi()),
    e: () => lift(A.e()),
    add: (p, q) => combine(A.add(p.v, q.v), p, one, q, one),
    sub: (p, q) => combine(A.sub(p.v, q.v), p, one, q, A.neg(one)),
    mul: (p, q) => combine(A.mul(p.v, q.v), p, q.v, q, p.v),
    div: (p, q) => {
      const y = A.div(p.v, q.v);
      // d(u/w) = du/w − (u/w)·dw/w
      const inv = A.div(one, q.v);
      return combine(y, p, inv, q, A.neg(A.mul(y, inv)));
    },
    neg: (p) => chain(p, A.neg(p.v), A.neg(one)),
    sqr: (p) => chain(p, A.sqr(p.v), A.mul(two, p.v)),
    pown: (p, k) => {
      const y = A.pown(p.v, k);
      if (k === 0) return lift(y);
      return chain(p, y, k === 1 ? one : A.mul(A.fromNumber(k), A.pown(p.v, k - 1)));
    },
    pow: (p, q) => {
      const y = A.pow(p.v, q.v);
      const sp = p.d === zeros ? zero : A.mul(q.v, A.pow(p.v, A.sub(q.v, one)));
      const sq = q.d === zeros ? zero : A.mul(y, A.log(p.v));
      return combine(y, p, sp, q, sq);
    },
    sqrt: (p) => {
      const y = A.sqrt(p.v);
      return chain(p, y, A.div(half, y));
    },
    exp: (p) => {
      const y = A.exp(p.v);
      return chain(p, y, y);
    },
    log: (p) => chain(p, A.log(p.v), A.div(one, p.v)),
    sin: (p) => chain(p, A.sin(p.v), A.cos(p.v)),
    cos: (p) => chain(p, A.cos(p.v), A.neg(A.sin(p.v))),
    tan: (p) => {
      const y = A.tan(p.v);
      return chain(p, y, A.add(one, A.sqr(y)));
    },
    atan: (p) => chain(p, A.atan(p.v), A.div(one, A.add(one, A.sqr(p.v)))),
    sinh: (p) => chain(p, A.sinh(p.v), A.cosh(p.v)),
    cosh: (p) => chain(p, A.cosh(p.v), A.sinh(p.v)),
    tanh: (p) => {
      const y = A.tanh(p.v);
      return chain(p, y, A.sub(one, A.sqr(y)));
    },
    abs: (p) => chain(p, A.abs(p.v), A.absSlope(p.v)),
    min: (p, q) => minmax(p, q, false),
    max: (p, q) => minmax(p, q, true),
    absSlope: (p) => lift(A.absSlope(p.v)),
  };
  return self;
}
