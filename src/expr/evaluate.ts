/**
 * Generic evaluator of a tape over any `Arithmetic<T>`: the image and, by first-order forward-mode
 * differentiation, the Jacobian. Over an interval arithmetic the Jacobian encloses every
 * derivative over the box (for abs/min/max: slope enclosures via `absSlope`, DESIGN.md §4).
 *
 * Slots that do not depend on the state (parameters, literals and their combinations) are
 * computed once when the evaluator is made; the status flags that computation raised are
 * re-applied on every evaluation, so `status.continuous` is honest about constant parts too.
 * After construction `image` and `imageAndJacobian` allocate nothing but the T values the
 * arithmetic returns.
 */
import type { Arithmetic } from '../interval/arithmetic.js';
import { Op, type Tape } from './tape.js';

/** Enclosure of one parameter: an exact decimal or a closed decimal interval. */
export interface ParamEnclosure {
  lo: string;
  hi: string;
}

export class TapeEvaluator<T> {
  private readonly vals: T[];
  /** grads[slot * n + j] = ∂slot/∂x_j; meaningful only for active slots. */
  private readonly grads: T[];
  private readonly zero: T;
  private readonly one: T;
  private readonly half: T;
  private readonly two: T;
  private readonly constDiscontinuous: boolean;
  private readonly constAssumed: boolean;
  readonly dim: number;

  constructor(readonly tape: Tape, readonly arith: Arithmetic<T>, params: readonly ParamEnclosure[]) {
    if (params.length !== tape.paramNames.length) {
      throw new Error(`internal: ${params.length} parameter values for ${tape.paramNames.length} parameters`);
    }
    const A = arith;
    this.dim = tape.stateNames.length;
    this.zero = A.fromNumber(0);
    this.one = A.fromNumber(1);
    this.half = A.fromNumber(0.5);
    this.two = A.fromNumber(2);
    this.vals = new Array<T>(tape.length).fill(this.zero);
    this.grads = new Array<T>(tape.length * this.dim).fill(this.zero);
    const saved = { continuous: A.status.continuous, assumed: A.status.assumed };
    A.status.continuous = true;
    A.status.assumed = false;
    const literalValues = tape.literals.map((s) => A.constant(s, s));
    for (let i = 0; i < tape.length; i++) {
      if (tape.active[i]) continue;
      const code = tape.op[i]!;
      if (code === Op.literal) this.vals[i] = literalValues[tape.n[i]!]!;
      else if (code === Op.param) {
        const p = params[tape.n[i]!]!;
        this.vals[i] = A.constant(p.lo, p.hi);
      } else this.vals[i] = this.valueOf(i, code);
    }
    this.constDiscontinuous = !A.status.continuous;
    this.constAssumed = A.status.assumed;
    A.status.continuous = saved.continuous && A.status.continuous;
    A.status.assumed = saved.assumed || A.status.assumed;
  }

  /** Value of a slot that does not depend on the state (computed at construction). */
  constantValue(slot: number): T {
    if (this.tape.active[slot]) throw new Error(`internal: slot ${slot} depends on the state`);
    return this.vals[slot]!;
  }

  /** Status flags raised while computing the constant slots. */
  constantStatus(): { continuous: boolean; assumed: boolean } {
    return { continuous: !this.constDiscontinuous, assumed: this.constAssumed };
  }

  private applyConstStatus(): void {
    if (this.constDiscontinuous) this.arith.status.continuous = false;
    if (this.constAssumed) this.arith.status.assumed = true;
  }

  /** Value of slot i from the values of its operands (which must be current). */
  private valueOf(i: number, code: number): T {
    const A = this.arith;
    const v = this.vals;
    const x = v[this.tape.a[i]!]!;
    switch (code) {
      case Op.pi: return A.pi();
      case Op.e: return A.e();
      case Op.neg: return A.neg(x);
      case Op.add: return A.add(x, v[this.tape.b[i]!]!);
      case Op.sub: return A.sub(x, v[this.tape.b[i]!]!);
      case Op.mul: return A.mul(x, v[this.tape.b[i]!]!);
      case Op.div: return A.div(x, v[this.tape.b[i]!]!);
      case Op.sqr: return A.sqr(x);
      case Op.pown: return A.pown(x, this.tape.n[i]!);
      case Op.pow: return A.pow(x, v[this.tape.b[i]!]!);
      case Op.sqrt: return A.sqrt(x);
      case Op.exp: return A.exp(x);
      case Op.log: return A.log(x);
      case Op.sin: return A.sin(x);
      case Op.cos: return A.cos(x);
      case Op.tan: return A.tan(x);
      case Op.atan: return A.atan(x);
      case Op.sinh: return A.sinh(x);
      case Op.cosh: return A.cosh(x);
      case Op.tanh: return A.tanh(x);
      case Op.abs: return A.abs(x);
      case Op.min: return A.min(x, v[this.tape.b[i]!]!);
      case Op.max: return A.max(x, v[this.tape.b[i]!]!);
      default: throw new Error(`internal: opcode ${code} has no value rule`);
    }
  }

  /** out[k] = f_k(x). */
  image(x: readonly T[], out: T[]): void {
    const t = this.tape;
    const v = this.vals;
    this.applyConstStatus();
    for (let i = 0; i < t.length; i++) {
      if (!t.active[i]) continue;
      const code = t.op[i]!;
      v[i] = code === Op.state ? x[t.n[i]!]! : this.valueOf(i, code);
    }
    for (let k = 0; k < t.outputs.length; k++) out[k] = v[t.outputs[k]!]!;
  }

  /** out = f(x), jac[k*n + j] = ∂f_k/∂x_j (row-major). */
  imageAndJacobian(x: readonly T[], out: T[], jac: T[]): void {
    const t = this.tape;
    const A = this.arith;
    const v = this.vals;
    const g = this.grads;
    const n = this.dim;
    const act = t.active;
    this.applyConstStatus();
    for (let i = 0; i < t.length; i++) {
      if (!act[i]) continue;
      const code = t.op[i]!;
      const ia = t.a[i]!;
      const ib = t.b[i]!;
      const base = i * n;
      if (code === Op.state) {
        const j = t.n[i]!;
        v[i] = x[j]!;
        for (let k = 0; k < n; k++) g[base + k] = k === j ? this.one : this.zero;
        continue;
      }
      v[i] = this.valueOf(i, code);
      const u = v[ia]!;
      const ga = ia * n;
      const gb = ib * n;
      const aAct = act[ia] === 1;
      const bAct = ib >= 0 && act[ib] === 1;
      switch (code) {
        case Op.neg:
          for (let k = 0; k < n; k++) g[base + k] = A.neg(g[ga + k]!);
          break;
        case Op.add:
          for (let k = 0; k < n; k++) {
            g[base + k] = aAct && bAct ? A.add(g[ga + k]!, g[gb + k]!) : aAct ? g[ga + k]! : g[gb + k]!;
          }
          break;
        case Op.sub:
          for (let k = 0; k < n; k++) {
            g[base + k] = aAct && bAct ? A.sub(g[ga + k]!, g[gb + k]!) : aAct ? g[ga + k]! : A.neg(g[gb + k]!);
          }
          break;
        case Op.mul: {
          const w = v[ib]!;
          for (let k = 0; k < n; k++) {
            if (aAct && bAct) g[base + k] = A.add(A.mul(u, g[gb + k]!), A.mul(w, g[ga + k]!));
            else if (aAct) g[base + k] = A.mul(w, g[ga + k]!);
            else g[base + k] = A.mul(u, g[gb + k]!);
          }
          break;
        }
        case Op.div: {
          // d(u/w) = (du − (u/w)·dw) / w
          const w = v[ib]!;
          const q = v[i]!;
          for (let k = 0; k < n; k++) {
            if (aAct && bAct) g[base + k] = A.div(A.sub(g[ga + k]!, A.mul(q, g[gb + k]!)), w);
            else if (aAct) g[base + k] = A.div(g[ga + k]!, w);
            else g[base + k] = A.neg(A.div(A.mul(q, g[gb + k]!), w));
          }
          break;
        }
        case Op.sqr: {
          const s = A.mul(this.two, u);
          for (let k = 0; k < n; k++) g[base + k] = A.mul(s, g[ga + k]!);
          break;
        }
        case Op.pown: {
          const p = t.n[i]!;
          if (p === 0) {
            for (let k = 0; k < n; k++) g[base + k] = this.zero;
          } else {
            const s = p === 1 ? this.one : A.mul(A.fromNumber(p), A.pown(u, p - 1));
            for (let k = 0; k < n; k++) g[base + k] = A.mul(s, g[ga + k]!);
          }
          break;
        }
        case Op.pow: {
          // d(u^w) = w·u^(w−1)·du + u^w·log(u)·dw
          const w = v[ib]!;
          const su = aAct ? A.mul(w, A.pow(u, A.sub(w, this.one))) : this.zero;
          const sw = bAct ? A.mul(v[i]!, A.log(u)) : this.zero;
          for (let k = 0; k < n; k++) {
            if (aAct && bAct) g[base + k] = A.add(A.mul(su, g[ga + k]!), A.mul(sw, g[gb + k]!));
            else if (aAct) g[base + k] = A.mul(su, g[ga + k]!);
            else g[base + k] = A.mul(sw, g[gb + k]!);
          }
          break;
        }
        case Op.min:
        case Op.max: {
          // min(u,w) = (u + w − |u − w|)/2, max(u,w) = (u + w + |u − w|)/2; d|d| = absSlope(d)·dd
          const s = A.absSlope(A.sub(u, v[ib]!));
          const signed = code === Op.min ? A.neg(s) : s;
          for (let k = 0; k < n; k++) {
            const du = aAct ? g[ga + k]! : this.zero;
            const dw = bAct ? g[gb + k]! : this.zero;
            g[base + k] = A.mul(this.half, A.add(A.add(du, dw), A.mul(signed, A.sub(du, dw))));
          }
          break;
        }
        default: {
          const s = this.unarySlope(code, u, v[i]!);
          for (let k = 0; k < n; k++) g[base + k] = A.mul(s, g[ga + k]!);
        }
      }
    }
    for (let r = 0; r < t.outputs.length; r++) {
      const s = t.outputs[r]!;
      out[r] = v[s]!;
      const on = act[s] === 1;
      for (let k = 0; k < n; k++) jac[r * n + k] = on ? g[s * n + k]! : this.zero;
    }
  }

  /** f'(u) for the one-argument functions, given u and the value y = f(u). */
  private unarySlope(code: number, u: T, y: T): T {
    const A = this.arith;
    switch (code) {
      case Op.sqrt: return A.div(this.half, y); // 1/(2√u)
      case Op.exp: return y;
      case Op.log: return A.div(this.one, u);
      case Op.sin: return A.cos(u);
      case Op.cos: return A.neg(A.sin(u));
      case Op.tan: return A.add(this.one, A.sqr(y));
      case Op.atan: return A.div(this.one, A.add(this.one, A.sqr(u)));
      case Op.sinh: return A.cosh(u);
      case Op.cosh: return A.sinh(u);
      case Op.tanh: return A.sub(this.one, A.sqr(y));
      case Op.abs: return A.absSlope(u);
      default: throw new Error(`internal: opcode ${code} has no derivative rule`);
    }
  }
}
