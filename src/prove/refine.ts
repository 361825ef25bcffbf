/**
 * @heuristic Candidate refinement and preconditioners for the shooting system: float64 Newton
 * with the structured solver, and multiprecision Newton on decimal.js points for precision
 * escalation. Nothing here is rigorous; the Krawczyk test decides.
 */
import type { Decimal } from 'decimal.js';
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { resetStatus } from '../interval/arithmetic.js';
import { ShootingSolver } from '../linalg/shooting.js';
import type { CompiledMap, MapEvaluator } from '../model/types.js';
import { decimalLuFactor, decimalLuSolve, decimalShootingJacobian, type DecimalCtor } from './mp-point.js';

export interface FloatRefinement {
  /** Refined shooting vector (length p·n). */
  x: Float64Array;
  /** Jacobian blocks Df(x_i) at the refined point (p·n·n). */
  blocks: Float64Array;
  converged: boolean;
  iterations: number;
  /** max-norm of the last Newton correction. */
  lastStep: number;
  residual: number;
}

function floatResidual(map: CompiledMap, x: Float64Array, p: number, n: number, out: Float64Array, fx: Float64Array): number {
  let norm = 0;
  for (let i = 0; i < p; i++) {
    map.evalFloat(x.subarray(i * n, i * n + n), fx);
    const next = ((i + 1) % p) * n;
    for (let j = 0; j < n; j++) {
      const v = x[next + j]! - fx[j]!;
      out[i * n + j] = v;
      norm = Math.max(norm, Math.abs(v));
    }
  }
  return norm;
}

function floatBlocks(map: CompiledMap, x: Float64Array, p: number, n: number, blocks: Float64Array): void {
  for (let i = 0; i < p; i++) map.jacobianFloat(x.subarray(i * n, i * n + n), blocks.subarray(i * n * n, (i + 1) * n * n));
}

/**
 * Float Newton on the shooting system from `start` (length p·n). Converged when a correction
 * falls below 1e-13·(1 + ‖x‖∞) (one more step is then taken); non-finite values stop it.
 */
export function refineFloat(map: CompiledMap, start: ArrayLike<number>, p: number, n: number, maxIter = 60): FloatRefinement {
  const N = p * n;
  const x = Float64Array.from(start);
  const blocks = new Float64Array(p * n * n);
  const F = new Float64Array(N);
  const delta = new Float64Array(N);
  const fx = new Float64Array(n);
  const solver = new ShootingSolver(p, n);
  let lastStep = Infinity;
  let converged = false;
  let it = 0;
  let extra = false;
  for (; it < maxIter; it++) {
    const res = floatResidual(map, x, p, n, F, fx);
    if (!Number.isFinite(res)) break;
    floatBlocks(map, x, p, n, blocks);
    if (!solver.solveInto(blocks, F, delta)) break;
    let step = 0;
    let size = 0;
    for (let k = 0; k < N; k++) {
      x[k] = x[k]! - delta[k]!;
      step = Math.max(step, Math.abs(delta[k]!));
      size = Math.max(size, Math.abs(x[k]!));
    }
    lastStep = step;
    if (!Number.isFinite(step)) break;
    if (step <= 1e-13 * (1 + size)) {
      if (extra) {
        converged = true;
        it++;
        break;
      }
      extra = true;
    }
  }
  const residual = floatResidual(map, x, p, n, F, fx);
  floatBlocks(map, x, p, n, blocks);
  let finite = Number.isFinite(residual);
  for (let k = 0; k < N && finite; k++) finite = Number.isFinite(x[k]!);
  if (!converged && finite && lastStep <= 1e-9 * (1 + maxAbs(x))) converged = true;
  return { x, blocks, converged: converged && finite, iterations: it, lastStep, residual };
}

function maxAbs(x: ArrayLike<number>): number {
  let m = 0;
  for (let k = 0; k < x.length; k++) m = Math.max(m, Math.abs(x[k]!));
  return m;
}

/**
 * C ≈ J(x)^{-1} (N×N row-major) from the float blocks, column by column with the structured
 * solver; null when J is singular to working precision.
 */
export function floatShootingInverse(blocks: Float64Array, p: number, n: number): Float64Array | null {
  const N = p * n;
  const solver = new ShootingSolver(p, n);
  const C = new Float64Array(N * N);
  const e = new Float64Array(N);
  const col = new Float64Array(N);
  for (let k = 0; k < N; k++) {
    e.fill(0);
    e[k] = 1;
    if (!solver.solveInto(blocks, e, col)) return null;
    for (let r = 0; r < N; r++) C[r * N + k] = col[r]!;
  }
  return C;
}

export interface MpRefinement {
  x: Decimal[];
  /** Preconditioner J(x)^{-1} in the working precision, row-major N×N; null when singular. */
  inverse: Decimal[] | null;
  converged: boolean;
  iterations: number;
  /** Last correction relative to 1 + ‖x‖∞ (a Decimal as a string, for messages). */
  lastStep: string;
}

/** f(x_i) and Df(x_i) at decimal points via the multiprecision evaluator (midpoints taken). */
function mpPointEval<T>(
  arith: IntervalArithmetic<T>,
  ev: MapEvaluator<T>,
  D: DecimalCtor,
  x: readonly Decimal[],
  p: number,
  n: number,
): { f: Decimal[]; blocks: Decimal[] } | null {
  const xi: T[] = new Array<T>(n);
  const fx: T[] = new Array<T>(n);
  const jac: T[] = new Array<T>(n * n);
  const f: Decimal[] = new Array<Decimal>(p * n);
  const blocks: Decimal[] = new Array<Decimal>(p * n * n);
  const toD = (t: T): Decimal => new D(arith.toDecimal(arith.midPoint(t)).lo);
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) xi[j] = arith.midPoint(arith.fromDecimal(x[i * n + j]!.toString()));
    resetStatus(arith);
    ev.imageAndJacobian(xi, fx, jac);
    if (!arith.status.continuous) return null;
    for (let j = 0; j < n; j++) f[i * n + j] = toD(fx[j]!);
    for (let k = 0; k < n * n; k++) blocks[i * n * n + k] = toD(jac[k]!);
  }
  return { f, blocks };
}

/**
 * Newton on the shooting system in decimal.js point arithmetic with the precision of `D`,
 * evaluating f and Df through the multiprecision interval evaluator (midpoints). Converged when a
 * correction is below 2^-(bits−8)·(1 + ‖x‖∞). Also returns C = J(x)^{-1} at the final point.
 */
export function refineMp<T>(
  arith: IntervalArithmetic<T>,
  ev: MapEvaluator<T>,
  D: DecimalCtor,
  start: readonly Decimal[],
  p: number,
  n: number,
  maxIter = 60,
): MpRefinement {
  const N = p * n;
  let x = start.map((v) => new D(v));
  const tol = new D(2).pow(-(arith.bits - 8));
  let converged = false;
  let extra = false;
  let it = 0;
  let lastStep = new D(Infinity);
  // Stagnation at the noise level (the conditioning of J amplifies the evaluation error) also
  // counts as converged: the rigorous test decides anyway.
  const noise = new D(2).pow(-Math.floor(arith.bits / 2));
  for (; it < maxIter; it++) {
    const ev0 = mpPointEval(arith, ev, D, x, p, n);
    if (ev0 === null) break;
    const F: Decimal[] = new Array<Decimal>(N);
    for (let i = 0; i < p; i++) {
      const next = ((i + 1) % p) * n;
      for (let j = 0; j < n; j++) F[i * n + j] = x[next + j]!.sub(ev0.f[i * n + j]!);
    }
    const lu = decimalLuFactor(decimalShootingJacobian(D, ev0.blocks, p, n), N);
    if (lu === null) break;
    const delta = decimalLuSolve(lu, F);
    let step = new D(0);
    let size = new D(0);
    x = x.map((v, k) => {
      const nv = v.sub(delta[k]!);
      const a = delta[k]!.abs();
      if (a.gt(step)) step = a;
      if (nv.abs().gt(size)) size = nv.abs();
      return nv;
    });
    if (!step.isFinite()) break;
    const prevStep = lastStep;
    lastStep = step.div(size.add(1));
    if (lastStep.lte(noise) && lastStep.gte(prevStep.div(4))) {
      converged = true;
      it++;
      break;
    }
    if (lastStep.lte(tol)) {
      if (extra) {
        converged = true;
        it++;
        break;
      }
      extra = true;
    }
  }
  let inverse: Decimal[] | null = null;
  const evEnd = mpPointEval(arith, ev, D, x, p, n);
  if (evEnd !== null) {
    const lu = decimalLuFactor(decimalShootingJacobian(D, evEnd.blocks, p, n), N);
    if (lu !== null) {
      inverse = new Array<Decimal>(N * N);
      const zero = new D(0);
      for (let k = 0; k < N; k++) {
        const e: Decimal[] = new Array<Decimal>(N).fill(zero);
        e[k] = new D(1);
        const col = decimalLuSolve(lu, e);
        for (let r = 0; r < N; r++) inverse[r * N + k] = col[r]!;
      }
    }
  }
  return { x, inverse, converged, iterations: it, lastStep: lastStep.toString() };
}
