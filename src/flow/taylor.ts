/**
 * Taylor coefficients of the solution of x' = F(t, x) by automatic differentiation over the
 * formula tape: every tape slot becomes a power series, computed order by order with the
 * classical recurrences (Moore 1966; the form used here is the one in Griewank & Walther 2008,
 * "Evaluating Derivatives", ch. 13):
 *
 *   c = a·b      c_k = Σ_{j=0..k} a_j b_{k−j}
 *   c = a/b      c_k = (a_k − Σ_{j=1..k} b_j c_{k−j}) / b_0
 *   c = √a       c_k = (a_k − Σ_{j=1..k−1} c_j c_{k−j}) / (2 c_0)
 *   c = exp a    c_k = (1/k) Σ_{j=1..k} j a_j c_{k−j}
 *   c = log a    c_k = (a_k − (1/k) Σ_{j=1..k−1} j c_j a_{k−j}) / a_0
 *   s = sin a,   s_k = (1/k) Σ j a_j c_{k−j},   c_k = −(1/k) Σ j a_j s_{k−j}   (pair)
 *   c = cos a
 *   x_{k+1} = F_k / (k + 1)                       (the ODE itself)
 *
 * Integer powers a^n (|n| ≤ 64) are expanded into a square-and-multiply chain of products (no
 * division by a_0, so x³ with x through 0 is fine); negative n then takes a reciprocal; real
 * powers a^b become exp(b·log a). Every step is one of the arithmetic's operations, so over an
 * interval arithmetic the coefficients enclose the true ones for every initial point in the
 * boxes, and over `dualArithmetic(I, n)` they carry their derivatives with respect to the
 * initial condition (the first variational equation, DESIGN.md §7).
 *
 * Domain: a series operation whose order-0 input leaves the domain (log of a box reaching 0,
 * division by a box containing 0) clears `status.continuous` exactly as the plain evaluator
 * does; the integrator refuses such steps.
 */
import type { Arithmetic } from '../interval/arithmetic.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import { Op, type Tape } from '../expr/tape.js';

const S = {
  konst: 0,
  state: 1,
  time: 2,
  neg: 3,
  add: 4,
  sub: 5,
  mul: 6,
  div: 7,
  sqr: 8,
  sqrt: 9,
  exp: 10,
  log: 11,
  sin: 12, // out = sin, aux = cos
  cos: 13, // out = cos, aux = sin
  sinh: 14, // out = sinh, aux = cosh
  cosh: 15, // out = cosh, aux = sinh
  one: 16, // the constant 1 (for reciprocals)
  int: 17, // the integer constant n (large powers)
} as const;

/** Tape operations the series engine supports (others are refused when the flow is loaded). */
export const SERIES_OPS: ReadonlySet<number> = new Set<number>([
  Op.state, Op.param, Op.literal, Op.pi, Op.e, Op.neg, Op.add, Op.sub, Op.mul, Op.div, Op.sqr,
  Op.pown, Op.pow, Op.sqrt, Op.exp, Op.log, Op.sin, Op.cos, Op.sinh, Op.cosh,
]);

/** Largest |n| expanded into products for a^n; beyond it a^n = exp(n·log a). */
const MAX_CHAIN_POWER = 64;

interface SeriesInstr {
  op: number;
  a: number;
  b: number;
  out: number;
  aux: number;
  /** For `konst`: the tape slot whose constant value it holds; for `state`: the state index. */
  n: number;
}

/** The tape rewritten as series instructions (built once per flow). */
export interface SeriesProgram {
  readonly tape: Tape;
  readonly instrs: readonly SeriesInstr[];
  readonly seriesCount: number;
  /** Series index of each right-hand side (state order, time excluded). */
  readonly outputs: readonly number[];
  /** Number of state variables (time excluded). */
  readonly dim: number;
  /** Tape state index of the time variable, or −1 for an autonomous flow. */
  readonly timeIndex: number;
}

/**
 * Compiles `tape` (state names = the flow's state, then the time variable when `timeIndex` ≥ 0;
 * outputs = the right-hand sides of the state, in order). Throws an internal error on an
 * unsupported operation (the loader refuses those with a positioned message first).
 */
export function buildSeriesProgram(tape: Tape, dim: number, timeIndex: number): SeriesProgram {
  const instrs: SeriesInstr[] = [];
  const slotSeries = new Int32Array(tape.length).fill(-1);
  let count = 0;
  const fresh = (): number => count++;
  let oneSeries = -1;
  const one = (): number => {
    if (oneSeries < 0) {
      oneSeries = fresh();
      instrs.push({ op: S.one, a: -1, b: -1, out: oneSeries, aux: -1, n: -1 });
    }
    return oneSeries;
  };
  const emit = (op: number, a: number, b: number, n = -1, withAux = false): number => {
    const out = fresh();
    instrs.push({ op, a, b, out, aux: withAux ? fresh() : -1, n });
    return out;
  };
  const power = (a: number, n: number): number => {
    // square-and-multiply on series
    let result = -1;
    let base = a;
    let e = n;
    while (e > 0) {
      if (e & 1) result = result < 0 ? base : emit(S.mul, result, base);
      e >>= 1;
      if (e > 0) base = emit(S.sqr, base, -1);
    }
    return result;
  };
  for (let i = 0; i < tape.length; i++) {
    const code = tape.op[i]!;
    const a = tape.a[i]! >= 0 ? slotSeries[tape.a[i]!]! : -1;
    const b = tape.b[i]! >= 0 ? slotSeries[tape.b[i]!]! : -1;
    if (!tape.active[i]) {
      slotSeries[i] = emit(S.konst, -1, -1, i);
      continue;
    }
    switch (code) {
      case Op.state: {
        const k = tape.n[i]!;
        slotSeries[i] = emit(k === timeIndex ? S.time : S.state, -1, -1, k);
        break;
      }
      case Op.neg: slotSeries[i] = emit(S.neg, a, -1); break;
      case Op.add: slotSeries[i] = emit(S.add, a, b); break;
      case Op.sub: slotSeries[i] = emit(S.sub, a, b); break;
      case Op.mul: slotSeries[i] = emit(S.mul, a, b); break;
      case Op.div: slotSeries[i] = emit(S.div, a, b); break;
      case Op.sqr: slotSeries[i] = emit(S.sqr, a, -1); break;
      case Op.sqrt: slotSeries[i] = emit(S.sqrt, a, -1); break;
      case Op.exp: slotSeries[i] = emit(S.exp, a, -1); break;
      case Op.log: slotSeries[i] = emit(S.log, a, -1); break;
      case Op.sin: slotSeries[i] = emit(S.sin, a, -1, -1, true); break;
      case Op.cos: slotSeries[i] = emit(S.cos, a, -1, -1, true); break;
      case Op.sinh: slotSeries[i] = emit(S.sinh, a, -1, -1, true); break;
      case Op.cosh: slotSeries[i] = emit(S.cosh, a, -1, -1, true); break;
      case Op.pown: {
        const n = tape.n[i]!;
        if (n === 0) slotSeries[i] = one();
        else if (Math.abs(n) <= MAX_CHAIN_POWER) {
          const p = power(a, Math.abs(n));
          slotSeries[i] = n > 0 ? p : emit(S.div, one(), p);
        } else {
          // a^n = exp(n·log a): domain a > 0, refused by the log rule otherwise
          const nk = emit(S.int, -1, -1, n);
          slotSeries[i] = emit(S.exp, emit(S.mul, nk, emit(S.log, a, -1)), -1);
        }
        break;
      }
      case Op.pow:
        slotSeries[i] = emit(S.exp, emit(S.mul, b, emit(S.log, a, -1)), -1);
        break;
      default:
        throw new Error(`internal: tape operation ${code} has no series rule`);
    }
  }
  const outputs = Array.from(tape.outputs, (s) => slotSeries[s]!);
  return { tape, instrs, seriesCount: count, outputs, dim, timeIndex };
}

/**
 * Order-by-order series evaluation over one arithmetic. Reusable, not thread-safe. After
 * construction, `run` allocates only the T values the arithmetic returns.
 */
export class SeriesEngine<T> {
  /** coef[s][k]: coefficient k of series s. */
  private readonly coef: T[][];
  private readonly konst: T[];
  private readonly ints: T[];
  private readonly zero: T;
  private readonly one: T;
  private readonly constBad: boolean;
  private readonly constAssumed: boolean;
  /** State Taylor coefficients after `run`: xs[i][k], k = 0..order+1. */
  readonly xs: T[][];

  constructor(readonly prog: SeriesProgram, readonly arith: Arithmetic<T>, params: readonly ParamEnclosure[], readonly maxOrder: number) {
    const A = arith;
    this.zero = A.fromNumber(0);
    this.one = A.fromNumber(1);
    const saved = { c: A.status.continuous, a: A.status.assumed };
    A.status.continuous = true;
    A.status.assumed = false;
    const ev = new TapeEvaluator<T>(prog.tape, A, params);
    this.constBad = !ev.constantStatus().continuous;
    this.constAssumed = ev.constantStatus().assumed;
    A.status.continuous = saved.c;
    A.status.assumed = saved.a;
    this.konst = prog.instrs.map((ins) =>
      ins.op === S.konst ? ev.constantValue(ins.n) : ins.op === S.int ? A.fromNumber(ins.n) : this.zero,
    );
    this.ints = [];
    for (let k = 0; k <= maxOrder + 2; k++) this.ints.push(A.fromNumber(k));
    this.coef = [];
    for (let s = 0; s < prog.seriesCount; s++) this.coef.push(new Array<T>(maxOrder + 2).fill(this.zero));
    this.xs = [];
    for (let i = 0; i < prog.dim; i++) this.xs.push(new Array<T>(maxOrder + 2).fill(this.zero));
  }

  /**
   * Taylor coefficients x_0..x_{order+1} of the solution through `x0` at time `t0` (ignored for
   * autonomous flows) into `this.xs`. `order + 1 ≤ maxOrder + 1`.
   */
  run(x0: readonly T[], t0: T, order: number): void {
    const A = this.arith;
    if (this.constBad) A.status.continuous = false;
    if (this.constAssumed) A.status.assumed = true;
    const { instrs, outputs, dim } = this.prog;
    const c = this.coef;
    const xs = this.xs;
    for (let i = 0; i < dim; i++) xs[i]![0] = x0[i]!;
    for (let k = 0; k <= order; k++) {
      for (let q = 0; q < instrs.length; q++) {
        const ins = instrs[q]!;
        const out = c[ins.out]!;
        out[k] = this.coefficient(ins, q, k, t0);
      }
      for (let i = 0; i < dim; i++) xs[i]![k + 1] = A.div(c[outputs[i]!]![k]!, this.ints[k + 1]!);
    }
  }

  private coefficient(ins: SeriesInstr, q: number, k: number, t0: T): T {
    const A = this.arith;
    const c = this.coef;
    const Z = this.zero;
    switch (ins.op) {
      case S.konst:
      case S.int:
        return k === 0 ? this.konst[q]! : Z;
      case S.one:
        return k === 0 ? this.one : Z;
      case S.state:
        return this.xs[ins.n]![k]!;
      case S.time:
        return k === 0 ? t0 : k === 1 ? this.one : Z;
      case S.neg:
        return A.neg(c[ins.a]![k]!);
      case S.add:
        return A.add(c[ins.a]![k]!, c[ins.b]![k]!);
      case S.sub:
        return A.sub(c[ins.a]![k]!, c[ins.b]![k]!);
      case S.mul: {
        const a = c[ins.a]!;
        const b = c[ins.b]!;
        let s = A.mul(a[0]!, b[k]!);
        for (let j = 1; j <= k; j++) s = A.add(s, A.mul(a[j]!, b[k - j]!));
        return s;
      }
      case S.sqr: {
        const a = c[ins.a]!;
        if (k === 0) return A.sqr(a[0]!);
        // 2·Σ_{j<k/2} a_j a_{k−j} (+ a_{k/2}² for even k)
        let s = Z;
        for (let j = 0; 2 * j < k; j++) s = A.add(s, A.mul(a[j]!, a[k - j]!));
        s = A.mul(this.ints[2]!, s);
        if (k % 2 === 0) s = A.add(s, A.sqr(a[k / 2]!));
        return s;
      }
      case S.div: {
        const a = c[ins.a]!;
        const b = c[ins.b]!;
        const o = c[ins.out]!;
        let s: T = a[k]!;
        for (let j = 1; j <= k; j++) s = A.sub(s, A.mul(b[j]!, o[k - j]!));
        return A.div(s, b[0]!);
      }
      case S.sqrt: {
        const a = c[ins.a]!;
        const o = c[ins.out]!;
        if (k === 0) return A.sqrt(a[0]!);
        let s: T = a[k]!;
        for (let j = 1; j < k; j++) s = A.sub(s, A.mul(o[j]!, o[k - j]!));
        return A.div(s, A.mul(this.ints[2]!, o[0]!));
      }
      case S.exp: {
        const a = c[ins.a]!;
        const o = c[ins.out]!;
        if (k === 0) return A.exp(a[0]!);
        let s = Z;
        for (let j = 1; j <= k; j++) s = A.add(s, A.mul(A.mul(this.ints[j]!, a[j]!), o[k - j]!));
        return A.div(s, this.ints[k]!);
      }
      case S.log: {
        const a = c[ins.a]!;
        const o = c[ins.out]!;
        if (k === 0) return A.log(a[0]!);
        let s = Z;
        for (let j = 1; j < k; j++) s = A.add(s, A.mul(A.mul(this.ints[j]!, o[j]!), a[k - j]!));
        return A.div(A.sub(a[k]!, A.div(s, this.ints[k]!)), a[0]!);
      }
      case S.sin:
      case S.cos:
      case S.sinh:
      case S.cosh: {
        // out and aux form the pair (sin, cos) or (cos, sin) / (sinh, cosh) or (cosh, sinh)
        const a = c[ins.a]!;
        const o = c[ins.out]!;
        const x = c[ins.aux]!;
        const isSin = ins.op === S.sin || ins.op === S.sinh;
        const hyper = ins.op === S.sinh || ins.op === S.cosh;
        const sn = isSin ? o : x;
        const cs = isSin ? x : o;
        if (k === 0) {
          const a0 = a[0]!;
          sn[0] = hyper ? A.sinh(a0) : A.sin(a0);
          cs[0] = hyper ? A.cosh(a0) : A.cos(a0);
          return o[0]!;
        }
        let ss = Z;
        let cc = Z;
        for (let j = 1; j <= k; j++) {
          const ja = A.mul(this.ints[j]!, a[j]!);
          ss = A.add(ss, A.mul(ja, cs[k - j]!));
          cc = A.add(cc, A.mul(ja, sn[k - j]!));
        }
        sn[k] = A.div(ss, this.ints[k]!);
        cs[k] = hyper ? A.div(cc, this.ints[k]!) : A.neg(A.div(cc, this.ints[k]!));
        return o[k]!;
      }
      default:
        throw new Error(`internal: series op ${ins.op}`);
    }
  }
}
