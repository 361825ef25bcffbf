/**
 * The checker's own Taylor coefficients of the solution of x' = F(t, x), from its own parse of the
 * right-hand sides (formula.ts), over two coefficient arithmetics: plain intervals (`Iv`) and
 * interval dual numbers (value + gradient with respect to the initial state), so that the first
 * variational equation comes out of the same recurrences. Independent of src/flow (which the
 * checker may not import); the recurrences are the classical ones (Moore 1966, "Interval
 * Analysis"; Griewank & Walther 2008, "Evaluating Derivatives", ch. 13):
 *
 *   c = a ± b    c_k = a_k ± b_k                 c = a·b    c_k = Σ_{j=0..k} a_j b_{k−j}
 *   c = a/b      c_k = (a_k − Σ_{j=1..k} b_j c_{k−j}) / b_0
 *   c = √a       c_k = (a_k − Σ_{j=1..k−1} c_j c_{k−j}) / (2 c_0)
 *   c = exp a    c_k = (1/k) Σ_{j=1..k} j a_j c_{k−j}
 *   c = log a    c_k = (a_k − (1/k) Σ_{j=1..k−1} j c_j a_{k−j}) / a_0
 *   s = sin a, c = cos a:  s_k = (1/k) Σ j a_j c_{k−j},  c_k = −(1/k) Σ j a_j s_{k−j}
 *   sinh / cosh: the same pair with + in both
 *   a^m (m a constant integer, |m| ≤ 64): square-and-multiply chain of products (1/chain if m < 0)
 *   a^b otherwise: exp(b·log a)
 *   x_{k+1} = F_k / (k + 1)          (the ODE);  time: t_0 = t, t_1 = 1, t_k = 0 beyond
 *
 * Contract: every coefficient is produced by interval operations only (IvCtx and the checker's
 * elementary.ts at order 0), so for every initial point in the input boxes and every time in the
 * time interval the true coefficient (and, over duals, its gradient) lies in the result. A domain
 * violation (log of a box reaching 0, a division by a box containing 0) throws DomainViolation.
 * Functions without a recurrence here (tan, atan, tanh, abs, min, max) are refused when the
 * program is built: `FlowUnsupported`, which the checker turns into REJECTED with that reason.
 */
import type { IvCtx, Iv } from './interval.js';
import { elementary as el } from './elementary.js';
import { Evaluator, type Node } from './formula.js';

/** A right-hand side uses something the checker cannot expand in a Taylor series. */
export class FlowUnsupported extends Error {}

/** Coefficient arithmetic: intervals or interval duals. */
export interface CoefArith<T> {
  readonly c: IvCtx;
  zero: T;
  one: T;
  lift(v: Iv): T;
  value(a: T): Iv;
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  neg(a: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  /** a·k for an interval constant k (no gradient). */
  scale(a: T, k: Iv): T;
  fn(f: 'sqrt' | 'exp' | 'log' | 'sin' | 'cos' | 'sinh' | 'cosh', a: T): T;
}

function elemValue(c: IvCtx, f: string, u: Iv): Iv {
  switch (f) {
    case 'sqrt': return c.sqrt(u);
    case 'exp': return el.expInterval(c, u);
    case 'log': return el.logInterval(c, u);
    case 'sin': return el.sinCosInterval(c, u, 0);
    case 'cos': return el.sinCosInterval(c, u, 1);
    case 'sinh': return el.sinhInterval(c, u);
    default: return el.coshInterval(c, u);
  }
}

export function ivArith(c: IvCtx): CoefArith<Iv> {
  return {
    c, zero: c.zero, one: c.one,
    lift: (v) => v, value: (a) => a,
    add: (a, b) => c.add(a, b), sub: (a, b) => c.sub(a, b), neg: (a) => c.neg(a),
    mul: (a, b) => c.mul(a, b), div: (a, b) => c.div(a, b), scale: (a, k) => c.mul(a, k),
    fn: (f, a) => elemValue(c, f, a),
  };
}

/** Value and gradient (n components) with respect to the initial state. */
export interface Dual { v: Iv; d: Iv[] }

export function dualArith(c: IvCtx, n: number): CoefArith<Dual> {
  const zeros = (): Iv[] => new Array<Iv>(n).fill(c.zero);
  const flat = (d: Iv[]): boolean => d.every((x) => x.lo.isZero() && x.hi.isZero());
  const lin = (a: Iv[], ka: Iv | null, b: Iv[], kb: Iv | null): Iv[] =>
    a.map((x, i) => c.add(ka ? c.mul(ka, x) : x, kb ? c.mul(kb, b[i]!) : b[i]!));
  return {
    c, zero: { v: c.zero, d: zeros() }, one: { v: c.one, d: zeros() },
    lift: (v) => ({ v, d: zeros() }), value: (a) => a.v,
    add: (a, b) => ({ v: c.add(a.v, b.v), d: lin(a.d, null, b.d, null) }),
    sub: (a, b) => ({ v: c.sub(a.v, b.v), d: a.d.map((x, i) => c.sub(x, b.d[i]!)) }),
    neg: (a) => ({ v: c.neg(a.v), d: a.d.map((x) => c.neg(x)) }),
    mul: (a, b) => {
      // a factor without gradient (a constant, the time) contributes no product terms
      if (flat(a.d)) return { v: c.mul(a.v, b.v), d: flat(b.d) ? zeros() : b.d.map((x) => c.mul(a.v, x)) };
      if (flat(b.d)) return { v: c.mul(a.v, b.v), d: a.d.map((x) => c.mul(b.v, x)) };
      return { v: c.mul(a.v, b.v), d: lin(a.d, b.v, b.d, a.v) };
    },
    div: (a, b) => {
      const v = c.div(a.v, b.v);
      return { v, d: a.d.map((x, i) => c.div(c.sub(x, c.mul(v, b.d[i]!)), b.v)) };
    },
    scale: (a, k) => ({ v: c.mul(a.v, k), d: a.d.map((x) => c.mul(x, k)) }),
    fn: (f, a) => {
      const v = elemValue(c, f, a.v);
      if (flat(a.d)) return { v, d: zeros() }; // e.g. cos(ω·t)
      // derivative of f at a.v
      const dv = f === 'sqrt' ? c.div(c.one, c.scale(new c.Down('2'), v))
        : f === 'exp' ? v
          : f === 'log' ? c.div(c.one, a.v)
            : f === 'sin' ? elemValue(c, 'cos', a.v)
              : f === 'cos' ? c.neg(elemValue(c, 'sin', a.v))
                : f === 'sinh' ? elemValue(c, 'cosh', a.v) : elemValue(c, 'sinh', a.v);
      return { v, d: a.d.map((x) => c.mul(dv, x)) };
    },
  };
}

type Op = 'konst' | 'state' | 'time' | 'neg' | 'add' | 'sub' | 'mul' | 'div' | 'sqrt' | 'exp' | 'log' | 'sin' | 'cos' | 'sinh' | 'cosh';
interface Instr { op: Op; a: number; b: number; out: number; aux: number; konst?: Iv; index?: number }

/** The right-hand sides as series instructions (built once per certificate and context). */
export interface SeriesProgram {
  instrs: Instr[];
  /**
   * Polynomial degree in the time offset s of each series, when known (constants 0, the time 1,
   * sums and products of those); Infinity otherwise. Coefficients above it are exactly 0, so sums
   * skip those terms (cost only: the skipped products are products with an exact 0).
   */
  deg: number[];
  count: number;
  outputs: number[];
  n: number;
}

const MAX_CHAIN_POWER = 64;

/**
 * Compiles the right-hand sides (parsed with state names = the flow's state, then the time
 * variable when `hasTime`). Constant subtrees are evaluated once with the checker's evaluator.
 */
export function buildSeries(rhs: readonly Node[], n: number, c: IvCtx, params: ReadonlyMap<string, Iv>): SeriesProgram {
  const ev = new Evaluator(c, params);
  const instrs: Instr[] = [];
  const deg: number[] = [];
  let count = 0;
  const emit = (op: Op, a = -1, b = -1, extra: Partial<Instr> = {}): number => {
    const out = count++;
    const aux = op === 'sin' || op === 'cos' || op === 'sinh' || op === 'cosh' ? count++ : -1;
    const da = a >= 0 ? deg[a]! : 0;
    const db = b >= 0 ? deg[b]! : 0;
    deg[out] = op === 'konst' ? 0 : op === 'time' ? 1 : op === 'neg' ? da : op === 'add' || op === 'sub' ? Math.max(da, db) : op === 'mul' ? da + db : Infinity;
    if (aux >= 0) deg[aux] = Infinity;
    instrs.push({ op, a, b, out, aux, ...extra });
    return out;
  };
  const hasVar = (node: Node): boolean => {
    switch (node.k) {
      case 'var': return true;
      case 'neg': return hasVar(node.a);
      case 'bin': return hasVar(node.a) || hasVar(node.b);
      case 'call': return node.args.some(hasVar);
      default: return false;
    }
  };
  const konst = (v: Iv): number => emit('konst', -1, -1, { konst: v });
  const chain = (a: number, m: number): number => {
    let result = -1;
    let base = a;
    for (let e = m; e > 0; e >>= 1) {
      if (e & 1) result = result < 0 ? base : emit('mul', result, base);
      if (e > 1) base = emit('mul', base, base);
    }
    return result;
  };
  const power = (a: number, bNode: Node): number => {
    if (!hasVar(bNode)) {
      const bv = ev.eval(bNode, [], false).v;
      if (bv.lo.eq(bv.hi) && bv.lo.isInteger() && bv.lo.abs().lte(MAX_CHAIN_POWER)) {
        const m = Number(bv.lo.toString());
        if (m === 0) return konst(c.one);
        const p = chain(a, Math.abs(m));
        return m > 0 ? p : emit('div', konst(c.one), p);
      }
      return emit('exp', emit('mul', konst(bv), emit('log', a)));
    }
    return emit('exp', emit('mul', walk(bNode), emit('log', a)));
  };
  const walk = (node: Node): number => {
    if (!hasVar(node)) return konst(ev.eval(node, [], false).v);
    switch (node.k) {
      case 'var': return node.index < n ? emit('state', -1, -1, { index: node.index }) : emit('time');
      case 'neg': return emit('neg', walk(node.a));
      case 'bin': {
        if (node.op === '^') return power(walk(node.a), node.b);
        const op = node.op === '+' ? 'add' : node.op === '-' ? 'sub' : node.op === '*' ? 'mul' : 'div';
        return emit(op, walk(node.a), walk(node.b));
      }
      case 'call': {
        const f = node.f;
        if (f === 'sqr') {
          const a = walk(node.args[0]!);
          return emit('mul', a, a);
        }
        if (f === 'pow') return power(walk(node.args[0]!), node.args[1]!);
        if (f === 'sqrt' || f === 'exp' || f === 'log' || f === 'sin' || f === 'cos' || f === 'sinh' || f === 'cosh') return emit(f, walk(node.args[0]!));
        throw new FlowUnsupported(`the checker has no Taylor recurrence for ${f}() in a right-hand side`);
      }
      default: throw new Error('internal: constant node with a variable');
    }
  };
  const outputs = rhs.map((r) => walk(r));
  return { instrs, deg, count, outputs, n };
}

/**
 * Taylor coefficients x_0..x_K of the solution through x0 at time t (t: the time interval; its
 * series is t + s). Returns xs[i][k]; `last` is the highest order K computed.
 */
export function taylor<T>(A: CoefArith<T>, prog: SeriesProgram, x0: readonly T[], t: Iv, K: number): T[][] {
  const { c } = A;
  const co: T[][] = Array.from({ length: prog.count }, () => []);
  const xs: T[][] = x0.map((v) => [v]);
  const recipK: Iv[] = [c.one];
  const intK: Iv[] = [c.zero];
  for (let k = 1; k <= K + 1; k++) {
    const lit = c.literal(String(k));
    intK.push(lit);
    recipK.push(c.div(c.one, lit));
  }
  const deg = prog.deg;
  const conv = (a: T[], b: T[], da: number, db: number, k: number): T => {
    let s = A.zero;
    for (let j = Math.max(0, k - db); j <= Math.min(k, da); j++) s = A.add(s, A.mul(a[j]!, b[k - j]!));
    return s;
  };
  for (let k = 0; k < K; k++) {
    for (let q = 0; q < prog.instrs.length; q++) {
      const ins = prog.instrs[q]!;
      const out = ins.out;
      const a = ins.a >= 0 ? co[ins.a]! : [];
      const b = ins.b >= 0 ? co[ins.b]! : [];
      let v: T;
      switch (ins.op) {
        case 'konst': v = k === 0 ? A.lift(ins.konst!) : A.zero; break;
        case 'state': v = xs[ins.index!]![k]!; break;
        case 'time': v = k === 0 ? A.lift(t) : k === 1 ? A.one : A.zero; break;
        case 'neg': v = A.neg(a[k]!); break;
        case 'add': v = A.add(a[k]!, b[k]!); break;
        case 'sub': v = A.sub(a[k]!, b[k]!); break;
        case 'mul': v = conv(a, b, deg[ins.a]!, deg[ins.b]!, k); break;
        case 'div': {
          const self = co[out]!;
          let s: T = a[k]!;
          for (let j = 1; j <= k; j++) s = A.sub(s, A.mul(b[j]!, self[k - j]!));
          v = A.div(s, b[0]!);
          break;
        }
        case 'sqrt': {
          const self = co[out]!;
          if (k === 0) v = A.fn('sqrt', a[0]!);
          else {
            let s: T = a[k]!;
            for (let j = 1; j < k; j++) s = A.sub(s, A.mul(self[j]!, self[k - j]!));
            v = A.div(s, A.scale(self[0]!, intK[2]!));
          }
          break;
        }
        case 'exp': {
          const self = co[out]!;
          if (k === 0) v = A.fn('exp', a[0]!);
          else {
            let s = A.zero;
            for (let j = 1; j <= Math.min(k, deg[ins.a]!); j++) s = A.add(s, A.mul(A.scale(a[j]!, intK[j]!), self[k - j]!));
            v = A.scale(s, recipK[k]!);
          }
          break;
        }
        case 'log': {
          const self = co[out]!;
          if (k === 0) v = A.fn('log', a[0]!);
          else {
            let s = A.zero;
            for (let j = 1; j < k; j++) s = A.add(s, A.mul(A.scale(self[j]!, intK[j]!), a[k - j]!));
            v = A.div(A.sub(a[k]!, A.scale(s, recipK[k]!)), a[0]!);
          }
          break;
        }
        default: {
          // sin/cos/sinh/cosh: out and aux are the pair (f, partner)
          const f = ins.op;
          const self = co[out]!;
          const partner = co[ins.aux]!;
          let sv: T;
          let pv: T;
          if (k === 0) {
            sv = A.fn(f, a[0]!);
            pv = A.fn(f === 'sin' ? 'cos' : f === 'cos' ? 'sin' : f === 'sinh' ? 'cosh' : 'sinh', a[0]!);
          } else {
            let s1 = A.zero;
            let s2 = A.zero;
            for (let j = 1; j <= Math.min(k, deg[ins.a]!); j++) {
              const ja = A.scale(a[j]!, intK[j]!);
              s1 = A.add(s1, A.mul(ja, partner[k - j]!));
              s2 = A.add(s2, A.mul(ja, self[k - j]!));
            }
            // d sin = cos da, d cos = −sin da; d sinh = cosh da, d cosh = sinh da
            sv = A.scale(s1, recipK[k]!);
            pv = A.scale(s2, recipK[k]!);
            if (f === 'cos') sv = A.neg(sv);
            if (f === 'sin') pv = A.neg(pv);
          }
          self.push(sv);
          partner.push(pv);
          continue;
        }
      }
      co[out]!.push(v);
    }
    for (let i = 0; i < xs.length; i++) xs[i]!.push(A.scale(co[prog.outputs[i]!]![k]!, recipK[k + 1]!));
  }
  return xs;
}

/** Horner Σ_{k=0}^{K} h^k a_k over intervals. */
export function horner(c: IvCtx, a: readonly Iv[], h: Iv, K: number): Iv {
  let s = a[K]!;
  for (let k = K - 1; k >= 0; k--) s = c.add(c.mul(s, h), a[k]!);
  return s;
}
