/**
 * @heuristic Float64 Taylor coefficients of x' = F(t, x), optionally with the first variational
 * equation (the derivatives of every coefficient with respect to the initial point), for the
 * candidate search and the float Newton steps on flow maps. No rounding control: observations
 * only; the proof uses the interval engine (taylor.ts, integrate.ts).
 *
 * Same recurrences as taylor.ts (Moore 1966; Griewank & Walther 2008, ch. 13), on one flat
 * Float64Array instead of arrays of arithmetic objects: a coefficient is m = 1 + nTan numbers
 * (value, then its derivative along each of the nTan initial directions), and each rule below is
 * the recurrence of taylor.ts with its derivative by the product rule. `run` allocates nothing.
 * Why not generated straight-line code: at the orders used (≈ 16) the convolution loops are the
 * work and the per-instruction dispatch is a small part of it (bench/flow-bench.ts measures the
 * float steps/s of this engine).
 *
 * Layout: coef[((s·m) + d)·K + k], K = maxOrder + 2 (series s, component d, order k).
 */
import { createFloatArithmetic } from '../interval/float-arith.js';
import { TapeEvaluator, type ParamEnclosure } from '../expr/evaluate.js';
import type { SeriesProgram } from './taylor.js';

// series operation codes of taylor.ts (SeriesInstr.op)
const KONST = 0;
const STATE = 1;
const TIME = 2;
const NEG = 3;
const ADD = 4;
const SUB = 5;
const MUL = 6;
const DIV = 7;
const SQR = 8;
const SQRT = 9;
const EXP = 10;
const LOG = 11;
const SIN = 12;
const COS = 13;
const SINH = 14;
const COSH = 15;
const ONE = 16;
const INT = 17;

export class FloatSeries {
  /** Number of initial directions carried (0: values only; n: the whole Jacobian). */
  readonly nTan: number;
  private readonly m: number;
  private readonly K: number;
  private readonly coef: Float64Array;
  private readonly konst: Float64Array;
  private readonly op: Int32Array;
  private readonly ia: Int32Array;
  private readonly ib: Int32Array;
  private readonly io: Int32Array;
  private readonly ix: Int32Array;
  private readonly stateSeries: Int32Array;
  private readonly outputs: Int32Array;
  readonly dim: number;

  constructor(readonly prog: SeriesProgram, params: readonly ParamEnclosure[], readonly maxOrder: number, withTangents: boolean) {
    const n = prog.dim;
    this.dim = n;
    this.nTan = withTangents ? n : 0;
    this.m = 1 + this.nTan;
    this.K = maxOrder + 2;
    const count = prog.instrs.length;
    this.op = new Int32Array(count);
    this.ia = new Int32Array(count);
    this.ib = new Int32Array(count);
    this.io = new Int32Array(count);
    this.ix = new Int32Array(count);
    this.konst = new Float64Array(count);
    const ev = new TapeEvaluator<number>(prog.tape, createFloatArithmetic(), params);
    this.stateSeries = new Int32Array(n).fill(-1);
    prog.instrs.forEach((ins, q) => {
      this.op[q] = ins.op;
      this.ia[q] = ins.a;
      this.ib[q] = ins.b;
      this.io[q] = ins.out;
      this.ix[q] = ins.aux;
      if (ins.op === KONST) this.konst[q] = ev.constantValue(ins.n);
      else if (ins.op === INT || ins.op === STATE) this.konst[q] = ins.n;
    });
    // state coefficients live in their own series slots, after the program's series
    const base = prog.seriesCount;
    for (let i = 0; i < n; i++) this.stateSeries[i] = base + i;
    this.outputs = Int32Array.from(prog.outputs);
    this.coef = new Float64Array((base + n) * this.m * this.K);
  }

  private get(s: number, d: number, k: number): number {
    return this.coef[(s * this.m + d) * this.K + k]!;
  }

  private put(s: number, d: number, k: number, v: number): void {
    this.coef[(s * this.m + d) * this.K + k] = v;
  }

  /** Index of coefficient k of component d of series s. */
  private at(s: number, d: number, k: number): number {
    return (s * this.m + d) * this.K + k;
  }

  /**
   * Taylor coefficients 0..order+1 of the solution through x0 at time t0 (ignored when
   * autonomous); with tangents, seeded with the identity (derivatives w.r.t. x0).
   */
  run(x0: ArrayLike<number>, t0: number, order: number): void {
    const n = this.dim;
    const m = this.m;
    const c = this.coef;
    for (let i = 0; i < n; i++) {
      const s = this.stateSeries[i]!;
      c[this.at(s, 0, 0)] = x0[i]!;
      for (let d = 1; d < m; d++) c[this.at(s, d, 0)] = d - 1 === i ? 1 : 0;
    }
    for (let k = 0; k <= order; k++) {
      for (let q = 0; q < this.op.length; q++) this.coefficient(q, k, t0);
      for (let i = 0; i < n; i++) {
        const src = this.outputs[i]!;
        const dst = this.stateSeries[i]!;
        for (let d = 0; d < m; d++) c[this.at(dst, d, k + 1)] = c[this.at(src, d, k)]! / (k + 1);
      }
    }
  }

  /** Coefficient k of component d of state variable i after `run`. */
  state(i: number, d: number, k: number): number {
    return this.coef[this.at(this.stateSeries[i]!, d, k)]!;
  }

  /** Σ_k c_k h^k (Horner) of component d of state i, orders 0..order. */
  stateAt(i: number, d: number, h: number, order: number): number {
    const c = this.coef;
    const base = this.at(this.stateSeries[i]!, d, 0);
    let s = c[base + order]!;
    for (let k = order - 1; k >= 0; k--) s = s * h + c[base + k]!;
    return s;
  }

  /** max_i |x_i coefficient k| (values only), for the step size. */
  maxAbs(k: number): number {
    let mx = 0;
    for (let i = 0; i < this.dim; i++) mx = Math.max(mx, Math.abs(this.state(i, 0, k)));
    return mx;
  }

  /** Σ_{j=lo..hi} a_j ⊗ b_{k−j} into component d (the product rule for d ≥ 1). */
  private conv(a: number, b: number, d: number, k: number, lo: number, hi: number): number {
    const c = this.coef;
    const a0 = this.at(a, 0, 0);
    const b0 = this.at(b, 0, 0);
    let s = 0;
    if (d === 0) {
      for (let j = lo; j <= hi; j++) s += c[a0 + j]! * c[b0 + k - j]!;
      return s;
    }
    const ad = this.at(a, d, 0);
    const bd = this.at(b, d, 0);
    for (let j = lo; j <= hi; j++) s += c[ad + j]! * c[b0 + k - j]! + c[a0 + j]! * c[bd + k - j]!;
    return s;
  }

  /** Σ_{j=lo..hi} j·a_j ⊗ b_{k−j} into component d. */
  private wconv(a: number, b: number, d: number, k: number, lo: number, hi: number): number {
    const c = this.coef;
    const a0 = this.at(a, 0, 0);
    const b0 = this.at(b, 0, 0);
    let s = 0;
    if (d === 0) {
      for (let j = lo; j <= hi; j++) s += j * c[a0 + j]! * c[b0 + k - j]!;
      return s;
    }
    const ad = this.at(a, d, 0);
    const bd = this.at(b, d, 0);
    for (let j = lo; j <= hi; j++) s += j * (c[ad + j]! * c[b0 + k - j]! + c[a0 + j]! * c[bd + k - j]!);
    return s;
  }

  private coefficient(q: number, k: number, t0: number): void {
    const c = this.coef;
    const m = this.m;
    const o = this.io[q]!;
    const a = this.ia[q]!;
    const b = this.ib[q]!;
    switch (this.op[q]!) {
      case KONST:
      case INT:
        for (let d = 0; d < m; d++) this.put(o, d, k, k === 0 && d === 0 ? this.konst[q]! : 0);
        return;
      case ONE:
        for (let d = 0; d < m; d++) this.put(o, d, k, k === 0 && d === 0 ? 1 : 0);
        return;
      case STATE: {
        const s = this.stateSeries[this.konst[q]!]!;
        for (let d = 0; d < m; d++) this.put(o, d, k, this.get(s, d, k));
        return;
      }
      case TIME:
        for (let d = 0; d < m; d++) this.put(o, d, k, d > 0 ? 0 : k === 0 ? t0 : k === 1 ? 1 : 0);
        return;
      case NEG:
        for (let d = 0; d < m; d++) this.put(o, d, k, -this.get(a, d, k));
        return;
      case ADD:
        for (let d = 0; d < m; d++) this.put(o, d, k, this.get(a, d, k) + this.get(b, d, k));
        return;
      case SUB:
        for (let d = 0; d < m; d++) this.put(o, d, k, this.get(a, d, k) - this.get(b, d, k));
        return;
      case MUL:
        for (let d = 0; d < m; d++) this.put(o, d, k, this.conv(a, b, d, k, 0, k));
        return;
      case SQR:
        for (let d = 0; d < m; d++) this.put(o, d, k, this.conv(a, a, d, k, 0, k));
        return;
      case DIV: {
        // o_k = (a_k − Σ_{j=1..k} b_j o_{k−j}) / b_0
        const b0 = this.get(b, 0, 0);
        const v = (this.get(a, 0, k) - this.conv(b, o, 0, k, 1, k)) / b0;
        this.put(o, 0, k, v);
        for (let d = 1; d < m; d++) this.put(o, d, k, (this.get(a, d, k) - this.conv(b, o, d, k, 1, k) - v * this.get(b, d, 0)) / b0);
        return;
      }
      case SQRT: {
        if (k === 0) {
          const r = Math.sqrt(this.get(a, 0, 0));
          this.put(o, 0, k, r);
          for (let d = 1; d < m; d++) this.put(o, d, k, this.get(a, d, 0) / (2 * r));
          return;
        }
        const o0 = this.get(o, 0, 0);
        const v = (this.get(a, 0, k) - this.conv(o, o, 0, k, 1, k - 1)) / (2 * o0);
        this.put(o, 0, k, v);
        for (let d = 1; d < m; d++) this.put(o, d, k, (this.get(a, d, k) - this.conv(o, o, d, k, 1, k - 1) - 2 * v * this.get(o, d, 0)) / (2 * o0));
        return;
      }
      case EXP: {
        if (k === 0) {
          const e = Math.exp(this.get(a, 0, 0));
          this.put(o, 0, k, e);
          for (let d = 1; d < m; d++) this.put(o, d, k, e * this.get(a, d, 0));
          return;
        }
        for (let d = 0; d < m; d++) this.put(o, d, k, this.wconv(a, o, d, k, 1, k) / k);
        return;
      }
      case LOG: {
        const a0 = this.get(a, 0, 0);
        if (k === 0) {
          this.put(o, 0, k, Math.log(a0));
          for (let d = 1; d < m; d++) this.put(o, d, k, this.get(a, d, 0) / a0);
          return;
        }
        // o_k = (a_k − (1/k) Σ_{j=1..k−1} j o_j a_{k−j}) / a_0
        const v = (this.get(a, 0, k) - this.wconv(o, a, 0, k, 1, k - 1) / k) / a0;
        this.put(o, 0, k, v);
        for (let d = 1; d < m; d++) this.put(o, d, k, (this.get(a, d, k) - this.wconv(o, a, d, k, 1, k - 1) / k - v * this.get(a, d, 0)) / a0);
        return;
      }
      case SIN:
      case COS:
      case SINH:
      case COSH: {
        const op = this.op[q]!;
        const isSin = op === SIN || op === SINH;
        const hyper = op === SINH || op === COSH;
        const x = this.ix[q]!;
        const sn = isSin ? o : x;
        const cs = isSin ? x : o;
        if (k === 0) {
          const a0 = this.get(a, 0, 0);
          const s0 = hyper ? Math.sinh(a0) : Math.sin(a0);
          const c0 = hyper ? Math.cosh(a0) : Math.cos(a0);
          c[this.at(sn, 0, 0)] = s0;
          c[this.at(cs, 0, 0)] = c0;
          for (let d = 1; d < m; d++) {
            const ad = this.get(a, d, 0);
            c[this.at(sn, d, 0)] = c0 * ad;
            c[this.at(cs, d, 0)] = (hyper ? s0 : -s0) * ad;
          }
          return;
        }
        for (let d = 0; d < m; d++) {
          const ss = this.wconv(a, cs, d, k, 1, k) / k;
          const cc = this.wconv(a, sn, d, k, 1, k) / k;
          c[this.at(sn, d, k)] = ss;
          c[this.at(cs, d, k)] = hyper ? cc : -cc;
        }
        return;
      }
      default:
        throw new Error(`internal: series op ${this.op[q]}`);
    }
  }
}
