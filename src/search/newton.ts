/**
 * @heuristic Damped Newton on the multiple-shooting system F_i(x) = x_{(i+1) mod p} − f(x_i)
 * (p·n unknowns; f^p is never formed). Linear solves use the structured QR solver of
 * src/linalg/shooting.ts, so the cost per iteration is O(p·n³) for any period.
 */
import type { CompiledMap } from '../model/types.js';
import { ShootingSolver } from '../linalg/shooting.js';

export interface ShootingNewtonResult {
  /** The refined shooting vector (fresh copy, length p·n). */
  x: Float64Array;
  /** max|F(x)| at the returned x. */
  residual: number;
  iterations: number;
  /**
   * Max-norm of the last full Newton step taken (an estimate of the distance to the exact
   * zero; large near a double root, where nearby float solutions must be merged).
   */
  lastStep: number;
}

/**
 * Reusable damped-Newton refiner for one map and one period. Holds all buffers, so refining many
 * seeds allocates only the returned result. Not thread-safe.
 */
export class ShootingNewton {
  readonly map: CompiledMap;
  readonly period: number;
  readonly dim: number;
  /** Iterates whose components exceed this magnitude count as escaped (seed discarded). */
  escapeBound: number;
  private readonly solver: ShootingSolver;
  private x: Float64Array;
  private trial: Float64Array;
  private readonly image: Float64Array;
  private readonly jac: Float64Array;
  private readonly blocks: Float64Array;
  private readonly fx: Float64Array;
  private readonly fTrial: Float64Array;
  private readonly step: Float64Array;
  private readonly pointIn: Float64Array;

  constructor(map: CompiledMap, period: number, escapeBound = 1e8) {
    this.map = map;
    this.period = period;
    this.dim = map.dim;
    this.escapeBound = escapeBound;
    const N = period * map.dim;
    this.solver = new ShootingSolver(period, map.dim);
    this.x = new Float64Array(N);
    this.trial = new Float64Array(N);
    this.image = new Float64Array(map.dim);
    this.jac = new Float64Array(map.dim * map.dim);
    this.blocks = new Float64Array(period * map.dim * map.dim);
    this.fx = new Float64Array(N);
    this.fTrial = new Float64Array(N);
    this.step = new Float64Array(N);
    this.pointIn = new Float64Array(map.dim);
  }

  /** F(x) into out; returns max|F|, NaN when something is not finite or x escaped. */
  residualInto(x: Float64Array, out: Float64Array): number {
    const { period: p, dim: n, image, pointIn } = this;
    let worst = 0;
    for (let i = 0; i < p; i++) {
      for (let c = 0; c < n; c++) {
        const v = x[i * n + c]!;
        if (!(Math.abs(v) <= this.escapeBound)) return NaN;
        pointIn[c] = v;
      }
      this.map.evalFloat(pointIn, image);
      const next = ((i + 1) % p) * n;
      for (let c = 0; c < n; c++) {
        const r = x[next + c]! - image[c]!;
        if (!Number.isFinite(r)) return NaN;
        out[i * n + c] = r;
        if (Math.abs(r) > worst) worst = Math.abs(r);
      }
    }
    return worst;
  }

  /** Jacobian blocks Df(x_i) into `out` (p·n·n); false when not finite. */
  blocksInto(x: Float64Array, out: Float64Array): boolean {
    const { period: p, dim: n, jac, pointIn } = this;
    const nn = n * n;
    for (let i = 0; i < p; i++) {
      for (let c = 0; c < n; c++) pointIn[c] = x[i * n + c]!;
      this.map.jacobianFloat(pointIn, jac);
      for (let k = 0; k < nn; k++) {
        const v = jac[k]!;
        if (!Number.isFinite(v)) return false;
        out[i * nn + k] = v;
      }
    }
    return true;
  }

  /**
   * Damped Newton from the shooting vector `start` (length p·n). Returns null when the iteration
   * fails (singular Jacobian, no descent, escape, NaN) or does not reach the tolerance.
   */
  refine(
    start: ArrayLike<number>,
    maxIterations = 40,
    residualTolerance?: number,
  ): ShootingNewtonResult | null {
    const N = this.period * this.dim;
    let x = this.x;
    let trial = this.trial;
    for (let k = 0; k < N; k++) x[k] = start[k]!;
    let norm = this.residualInto(x, this.fx);
    if (Number.isNaN(norm)) return null;
    let converged = false;
    let iterations = 0;
    let lastStep = Infinity;
    for (; iterations < maxIterations; iterations++) {
      const tol = residualTolerance ?? 1e-10 * (1 + maxAbs(x, N));
      if (norm <= tol) {
        converged = true;
        // Polish with full steps while they do not increase the residual and still move x:
        // one step at a simple root (quadratic convergence reaches the rounding floor), many at
        // a (nearly) double root such as a fold, where the residual test alone stops ~√tol away.
        for (let extra = 0; extra < POLISH_STEPS; extra++) {
          const polished = this.newtonStep(x, trial, norm, 1);
          if (polished === null) break;
          const moved = maxAbs(this.step, N);
          [x, trial] = [trial, x];
          norm = polished;
          this.fx.set(this.fTrial);
          lastStep = moved;
          if (!(moved > 1e-15 * (1 + maxAbs(x, N)))) break;
        }
        break;
      }
      const accepted = this.newtonStep(x, trial, norm, 1 / 1024);
      if (accepted === null) break;
      lastStep = maxAbs(this.step, N);
      [x, trial] = [trial, x];
      norm = accepted;
      this.fx.set(this.fTrial);
    }
    this.x = x;
    this.trial = trial;
    if (!converged) {
      const tol = residualTolerance ?? 1e-10 * (1 + maxAbs(x, N));
      if (!(norm <= tol)) return null;
    }
    return { x: Float64Array.from(x), residual: norm, iterations, lastStep };
  }

  /**
   * Newton direction at x (this.fx must hold F(x)), then backtracking from t = 1 down to tMin
   * until max|F| decreases; writes the accepted point into `trial`, F(trial) into fTrial.
   * Returns the new max|F|, or null when no step is acceptable.
   */
  private newtonStep(x: Float64Array, trial: Float64Array, norm: number, tMin: number): number | null {
    const N = this.period * this.dim;
    if (!this.blocksInto(x, this.blocks)) return null;
    for (let k = 0; k < N; k++) this.step[k] = -this.fx[k]!;
    if (!this.solver.solveInto(this.blocks, this.step, this.step)) return null;
    for (let t = 1; t >= tMin; t /= 2) {
      for (let k = 0; k < N; k++) trial[k] = x[k]! + t * this.step[k]!;
      const tNorm = this.residualInto(trial, this.fTrial);
      if (tNorm < (1 - 1e-4 * t) * norm || (tMin === 1 && tNorm <= norm)) return tNorm;
      if (tMin === 1) return null;
    }
    return null;
  }
}

/** Full Newton steps allowed after the residual test passed (see refine). */
const POLISH_STEPS = 40;

function maxAbs(x: Float64Array, length: number): number {
  let m = 0;
  for (let k = 0; k < length; k++) if (Math.abs(x[k]!) > m) m = Math.abs(x[k]!);
  return m;
}
