/**
 * Forward-mode evaluation of the checker's formula trees (formula.ts, whose parser builds them)
 * over fixed-point intervals (fixed.ts): the value and the gradient w.r.t. the state variables,
 * each an enclosure over the box. Issue 8 item 1: the decimal evaluator was a quarter of the
 * checker's time on Hénon orbits.
 *
 * Covered: numbers, parameters, state variables, unary −, + − × /, `^` and pow with an integer
 * exponent that is an exact point (|k| ≤ 64), sqr. Anything else — the elementary functions,
 * abs / min / max (their slope sets), pi, e, other powers — throws FixedRange, and the caller runs
 * the decimal evaluator instead (its verdict stands), so this file needs no elementary function.
 * Contracts: literals and parameters are first enclosed by the decimal kernel exactly as the
 * decimal evaluator encloses them (IvCtx.literal: its range checks and DomainViolations apply),
 * then widened outward to fixed point; + − are exact; × is FixCtx.mul; a / b = a · recip(b)
 * (FixedRange when b contains 0: the decimal path then reports the domain violation);
 * x^k by binary powering of the end magnitudes with directed products (even k: [mig^k, mag^k];
 * odd k: monotone, each end powered in its own direction); derivatives by the chain rule on
 * these enclosures ((x^k)' = k·x^(k−1)·x', (a/b)' = (a' − (a/b)·b')/b).
 */
import { FixedRange, type FixCtx, type Fx } from './fixed.js';
import type { IvCtx, Iv } from './interval.js';
import type { Node } from './formula.js';

export interface FDual {
  v: Fx;
  d: Fx[] | null;
}

const MAX_FIXED_POWER = 64;

export class FixedEvaluator {
  private readonly lits = new Map<string, Fx>();
  private readonly params = new Map<string, Fx>();
  private readonly n: number;

  constructor(
    private readonly k: FixCtx,
    private readonly c: IvCtx,
    params: ReadonlyMap<string, Iv>,
    n: number,
  ) {
    for (const [name, v] of params) this.params.set(name, k.fromIv(v));
    this.n = n;
  }

  /** f(x) and (optionally) Df(x) (row-major n×n) over the fixed-point box x. */
  image(step: readonly Node[], x: readonly Fx[], grad: boolean): { f: Fx[]; jac: Fx[] | null } {
    const k = this.k;
    const zero = k.point(0n);
    const f: Fx[] = [];
    const jac: Fx[] | null = grad ? [] : null;
    for (const node of step) {
      const r = this.eval(node, x, grad);
      f.push(r.v);
      if (jac) for (let j = 0; j < this.n; j++) jac.push(r.d ? r.d[j]! : zero);
    }
    return { f, jac };
  }

  private lin(a: Fx[] | null, ka: Fx | null, b: Fx[] | null, kb: Fx | null): Fx[] | null {
    const k = this.k;
    if (!a && !b) return null;
    const out: Fx[] = new Array(this.n);
    for (let i = 0; i < this.n; i++) {
      const x = a ? (ka ? k.mul(ka, a[i]!) : a[i]!) : null;
      const y = b ? (kb ? k.mul(kb, b[i]!) : b[i]!) : null;
      out[i] = x && y ? k.add(x, y) : (x ?? y)!;
    }
    return out;
  }

  eval(node: Node, x: readonly Fx[], grad: boolean): FDual {
    const k = this.k;
    switch (node.k) {
      case 'num': {
        let v = this.lits.get(node.text);
        if (!v) this.lits.set(node.text, (v = k.fromIv(this.c.literal(node.text))));
        return { v, d: null };
      }
      case 'par':
        return { v: this.params.get(node.name)!, d: null };
      case 'var': {
        const v = x[node.index]!;
        if (!grad) return { v, d: null };
        const d: Fx[] = new Array(this.n);
        for (let j = 0; j < this.n; j++) d[j] = k.point(j === node.index ? k.one : 0n);
        return { v, d };
      }
      case 'neg': {
        const a = this.eval(node.a, x, grad);
        return { v: k.neg(a.v), d: a.d && a.d.map((t) => k.neg(t)) };
      }
      case 'bin': {
        const a = this.eval(node.a, x, grad);
        const b = this.eval(node.b, x, grad);
        switch (node.op) {
          case '+':
            return { v: k.add(a.v, b.v), d: this.lin(a.d, null, b.d, null) };
          case '-':
            return { v: k.sub(a.v, b.v), d: this.lin(a.d, null, b.d, b.d ? k.point(-k.one) : null) };
          case '*':
            return { v: k.mul(a.v, b.v), d: this.lin(a.d, b.v, b.d, a.v) };
          case '/': {
            const r = k.recip(b.v);
            const v = k.mul(a.v, r);
            const d = this.lin(a.d, null, b.d, k.neg(v));
            return { v, d: d && d.map((t) => k.mul(t, r)) };
          }
          default:
            return this.pow(a, b);
        }
      }
      case 'call':
        if (node.f === 'sqr' || node.f === 'pow') {
          const a = this.eval(node.args[0]!, x, grad);
          const b = node.f === 'sqr' ? { v: k.point(2n * k.one), d: null } : this.eval(node.args[1]!, x, grad);
          return this.pow(a, b);
        }
        throw new FixedRange(`${node.f} is left to the decimal evaluator`);
      default:
        throw new FixedRange('constants are left to the decimal evaluator');
    }
  }

  private pow(a: FDual, b: FDual): FDual {
    const k = this.k;
    const e = b.v.lo;
    if (b.d || e !== b.v.hi || e % k.one !== 0n) throw new FixedRange('a non-integer power is left to the decimal evaluator');
    const n = Number(e / k.one);
    if (Math.abs(n) > MAX_FIXED_POWER) throw new FixedRange('a large power is left to the decimal evaluator');
    if (n < 0) return this.pow({ v: k.recip(a.v), d: a.d && a.d.map((t) => k.neg(k.mul(t, k.mul(k.recip(a.v), k.recip(a.v))))) }, { v: k.point(-e), d: null });
    const v = this.powInt(a.v, n);
    if (!a.d || n === 0) return { v, d: null };
    const dk = k.mul(k.point(BigInt(n) * k.one), this.powInt(a.v, n - 1));
    return { v, d: this.lin(a.d, dk, null, null) };
  }

  /** x^n (n ≥ 0) enclosed: see the header. */
  powInt(a: Fx, n: number): Fx {
    const k = this.k;
    if (n === 0) return k.point(k.one);
    if (n === 1) return a;
    const pw = (x: bigint, up: boolean): bigint => {
      // x ≥ 0: binary powering, every product rounded in one direction (monotone on x ≥ 0)
      let result = k.one;
      let base = x;
      let m = n;
      while (m > 0) {
        if (m & 1) result = up ? k.mulUp(result, base) : k.mulDown(result, base);
        m >>>= 1;
        if (m > 0) base = up ? k.mulUp(base, base) : k.mulDown(base, base);
      }
      return result;
    };
    if (n % 2 === 0) return { lo: pw(k.mig(a), false), hi: pw(k.mag(a), true) };
    const lo = a.lo >= 0n ? pw(a.lo, false) : -pw(-a.lo, true);
    const hi = a.hi >= 0n ? pw(a.hi, true) : -pw(-a.hi, false);
    return { lo, hi };
  }
}
