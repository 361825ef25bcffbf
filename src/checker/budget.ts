/**
 * The checker's work estimate, made from the certificate's shape before any arithmetic, so that a
 * hostile certificate (a huge period, a formula of thousands of terms, thousands of digits) is
 * refused in milliseconds instead of running for hours. Not part of any proof: it only decides
 * whether the checker starts.
 *
 * Unit: about one decimal.js interval operation at 30 digits (measured ≈ 0.3–0.5 µs on this
 * project's 2-core benchmark machine: logistic period 1,000, dense, ≈ 3·10^7 units in 11 s).
 * Model (an upper-side estimate; constants from the operation counts in krawczyk.ts/cyclic.ts):
 *  - precision factor φ(d) = max(1, (d/30)²) (schoolbook multiplication in decimal.js);
 *  - one evaluation of the step with derivatives: Σ over nodes of (n + 1) operations, an
 *    elementary function counted as 20 + d operations (series length grows with the digits);
 *  - evaluations: 4 per point (centre, box, uniqueness box, preconditioner);
 *  - dense Krawczyk (N = p·n unknowns): 2·N²·(n + 3) interval operations (existence and
 *    uniqueness) and a float LU inverse of N³/50 units, or a decimal one of N³ units;
 *  - structured Krawczyk (n ≤ 2): 60·p·n² operations.
 */
import type { Node } from './formula.js';

const ELEMENTARY = new Set(['sqrt', 'exp', 'log', 'sin', 'cos', 'tan', 'atan', 'sinh', 'cosh', 'tanh', 'pow']);

/** Operations (before the precision factor) of one evaluation with n derivative components. */
export function formulaOps(node: Node, n: number, digits: number): number {
  let total = 0;
  const stack: Node[] = [node];
  while (stack.length > 0) {
    const x = stack.pop()!;
    switch (x.k) {
      case 'num':
      case 'var':
      case 'par':
      case 'const':
        total += 1;
        break;
      case 'neg':
        total += n + 1;
        stack.push(x.a);
        break;
      case 'bin':
        total += x.op === '^' ? (20 + digits) * (n + 1) : 2 * (n + 1);
        stack.push(x.a, x.b);
        break;
      case 'call':
        total += ELEMENTARY.has(x.f) ? (20 + digits) * (n + 1) : 2 * (n + 1);
        for (const a of x.args) stack.push(a);
        break;
    }
  }
  return total;
}

export interface WorkShape {
  period: number;
  dim: number;
  digits: number;
  /** Operations of one evaluation of all n step formulas (formulaOps summed). */
  stepOps: number;
  /** The Krawczyk form the checker will use first. */
  form: 'dense-float' | 'dense-decimal' | 'cyclic';
}

/** Estimated work in units (see the module comment). */
export function estimateWork(w: WorkShape): number {
  const phi = Math.max(1, (w.digits / 30) ** 2);
  const N = w.period * w.dim;
  const evals = 4 * w.period * w.stepOps;
  let linear: number;
  if (w.form === 'cyclic') linear = 60 * w.period * w.dim * w.dim;
  else linear = 2 * N * N * (w.dim + 3) + (w.form === 'dense-decimal' ? N ** 3 : N ** 3 / 50 / phi);
  return (evals + linear) * phi;
}
