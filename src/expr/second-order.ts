/**
 * Second-order forward mode: the first-order tape evaluator run over dual numbers
 * (`dualArithmetic`), i.e. a nested dual. Gives f, Df and D²f over any arithmetic; over
 * intervals every entry encloses the true derivative over the box (see dual.ts for the abs/min/max
 * caveat at kinks). Needed by fold/flip systems (DESIGN.md §4).
 */
import type { Arithmetic } from '../interval/arithmetic.js';
import { dualArithmetic, type Dual, type DualArithmetic } from './dual.js';
import { TapeEvaluator, type ParamEnclosure } from './evaluate.js';
import type { Tape } from './tape.js';

export class SecondOrderEvaluator<T> {
  private readonly dual: DualArithmetic<T>;
  private readonly inner: TapeEvaluator<Dual<T>>;
  private readonly xs: Dual<T>[];
  private readonly ys: Dual<T>[];
  private readonly js: Dual<T>[];
  readonly dim: number;

  constructor(tape: Tape, readonly arith: Arithmetic<T>, params: readonly ParamEnclosure[]) {
    const n = tape.stateNames.length;
    this.dim = n;
    this.dual = dualArithmetic(arith, n);
    this.inner = new TapeEvaluator(tape, this.dual, params);
    const z = this.dual.fromNumber(0);
    this.xs = new Array<Dual<T>>(n).fill(z);
    this.ys = new Array<Dual<T>>(n).fill(z);
    this.js = new Array<Dual<T>>(n * n).fill(z);
  }

  /**
   * out[i] = f_i(x); jac[i*n + j] = ∂f_i/∂x_j; hess[(i*n + j)*n + k] = ∂²f_i/∂x_j∂x_k.
   */
  evaluate(x: readonly T[], out: T[], jac: T[], hess: T[]): void {
    const n = this.dim;
    for (let j = 0; j < n; j++) this.xs[j] = this.dual.variable(x[j]!, j);
    this.inner.imageAndJacobian(this.xs, this.ys, this.js);
    for (let i = 0; i < n; i++) {
      out[i] = this.ys[i]!.v;
      for (let j = 0; j < n; j++) {
        const e = this.js[i * n + j]!;
        jac[i * n + j] = e.v;
        for (let k = 0; k < n; k++) hess[(i * n + j) * n + k] = e.d[k]!;
      }
    }
  }
}
