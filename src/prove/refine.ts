/**
 * @heuristic Candidate refinement and preconditioners for the shooting system: float64 Newton
 * with the structured solver, and multiprecision Newton on decimal.js points for precision
 * escalation. Nothing here is rigorous; the Krawczyk test decides.
 */
import type { Decimal } from 'decimal.js';
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { resetStatus } from '../interval/arithmetic.js';
import { luFactorInPlace, luSolveInto } from '../linalg/dense.js';
import { ShootingSolver } from '../linalg/shooting.js';
import type { CompiledMap, MapEvaluator } from '../model/types.js';
import { decimalLuFactor, decimalLuSolve, decimalShootingJacobian, type DecimalCtor } from '../linalg/decimal.js';

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
 * C ≈ J(x)^{-1} (N×N row-major) from the float blocks; null when J is singular to working
 * precision or something non-finite appeared. The same structured Householder elimination as
 * `ShootingSolver` (linalg/shooting.ts: panels of block rows k and the wrap-around spike) applied
 * ONCE with all N right-hand sides (the identity) carried along, then N back-substitutions:
 * O(n·N²) operations instead of N separate factorisations.
 */
export function floatShootingInverse(blocks: Float64Array, p: number, n: number): Float64Array | null {
  const N = p * n;
  const nn = n * n;
  const C = new Float64Array(N * N);
  if (p === 1) {
    const a = new Float64Array(nn);
    for (let k = 0; k < nn; k++) a[k] = -blocks[k]!;
    for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + 1;
    const piv = new Int32Array(n);
    if (!luFactorInPlace(a, n, piv)) return null;
    const e = new Float64Array(n);
    const col = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      e.fill(0);
      e[k] = 1;
      luSolveInto({ n, lu: a, piv }, e, col);
      for (let r = 0; r < n; r++) C[r * n + k] = col[r]!;
    }
    return finite(C) ? C : null;
  }
  const cols = 3 * n + N;
  const colK1 = n;
  const colLast = 2 * n;
  const colRhs = 3 * n;
  const W = new Float64Array(2 * n * cols);
  const v = new Float64Array(2 * n);
  const steps = p - 1;
  const rB = new Float64Array(steps * nn);
  const eB = new Float64Array(steps * nn);
  const gB = new Float64Array(steps * nn);
  const rhsB = new Float64Array(steps * n * N);
  const lastOff = (p - 1) * nn;
  for (let r = 0; r < n; r++) {
    const row = (n + r) * cols;
    W[row + r] = 1;
    for (let c = 0; c < n; c++) W[row + colLast + c] = -blocks[lastOff + r * n + c]!;
    W[row + colRhs + (p - 1) * n + r] = 1;
  }
  for (let k = 0; k < steps; k++) {
    const lastStep = k + 1 === p - 1;
    for (let r = 0; r < n; r++) {
      const row = r * cols;
      W.fill(0, row, row + cols);
      for (let c = 0; c < n; c++) W[row + c] = -blocks[k * nn + r * n + c]!;
      W[row + (lastStep ? colLast : colK1) + r] = 1;
      W[row + colRhs + k * n + r] = 1;
    }
    for (let j = 0; j < n; j++) {
      let scale = 0;
      for (let i = j; i < 2 * n; i++) scale = Math.max(scale, Math.abs(W[i * cols + j]!));
      if (!(scale > 0)) {
        if (scale !== 0) return null;
        continue;
      }
      if (!Number.isFinite(scale)) return null;
      let norm2 = 0;
      for (let i = j; i < 2 * n; i++) {
        const t = W[i * cols + j]! / scale;
        v[i] = t;
        norm2 += t * t;
      }
      const alpha = v[j]! >= 0 ? -Math.sqrt(norm2) : Math.sqrt(norm2);
      v[j] = v[j]! - alpha;
      let vtv = 0;
      for (let i = j; i < 2 * n; i++) vtv += v[i]! * v[i]!;
      if (vtv > 0) {
        for (let c = j + 1; c < cols; c++) {
          let s = 0;
          for (let i = j; i < 2 * n; i++) s += v[i]! * W[i * cols + c]!;
          if (s === 0) continue;
          const f = (2 * s) / vtv;
          for (let i = j; i < 2 * n; i++) W[i * cols + c] = W[i * cols + c]! - f * v[i]!;
        }
      }
      W[j * cols + j] = alpha * scale;
      for (let i = j + 1; i < 2 * n; i++) W[i * cols + j] = 0;
    }
    for (let r = 0; r < n; r++) {
      const row = r * cols;
      for (let c = 0; c < n; c++) {
        rB[k * nn + r * n + c] = W[row + c]!;
        eB[k * nn + r * n + c] = W[row + colK1 + c]!;
        gB[k * nn + r * n + c] = W[row + colLast + c]!;
      }
      rhsB.set(W.subarray(row + colRhs, row + colRhs + N), (k * n + r) * N);
    }
    for (let r = 0; r < n; r++) {
      const row = (n + r) * cols;
      for (let c = 0; c < n; c++) W[row + c] = W[row + colK1 + c]!;
      for (let c = 0; c < n; c++) W[row + colK1 + c] = 0;
    }
  }
  // Final n×n system for the last block row of C, one column per right-hand side.
  const last = new Float64Array(nn);
  for (let r = 0; r < n; r++) {
    const row = (n + r) * cols;
    for (let c = 0; c < n; c++) last[r * n + c] = W[row + c]! + W[row + colLast + c]!;
  }
  const piv = new Int32Array(n);
  if (!luFactorInPlace(last, n, piv)) return null;
  const b = new Float64Array(n);
  const x = new Float64Array(n);
  const lastRow = (p - 1) * n;
  for (let col = 0; col < N; col++) {
    for (let r = 0; r < n; r++) b[r] = W[(n + r) * cols + colRhs + col]!;
    luSolveInto({ n, lu: last, piv }, b, x);
    for (let r = 0; r < n; r++) C[(lastRow + r) * N + col] = x[r]!;
  }
  // Back-substitution, all columns at once (row-major C: unknown index × right-hand side).
  for (let k = steps - 1; k >= 0; k--) {
    const useE = k + 1 !== p - 1;
    for (let r = n - 1; r >= 0; r--) {
      const out = (k * n + r) * N;
      C.set(rhsB.subarray(out, out + N), out);
      for (let c = 0; c < n; c++) {
        const g = gB[k * nn + r * n + c]!;
        if (g !== 0) {
          const src = (lastRow + c) * N;
          for (let q = 0; q < N; q++) C[out + q] = C[out + q]! - g * C[src + q]!;
        }
        if (useE) {
          const e = eB[k * nn + r * n + c]!;
          if (e !== 0) {
            const src = ((k + 1) * n + c) * N;
            for (let q = 0; q < N; q++) C[out + q] = C[out + q]! - e * C[src + q]!;
          }
        }
      }
      for (let c = r + 1; c < n; c++) {
        const u = rB[k * nn + r * n + c]!;
        if (u !== 0) {
          const src = (k * n + c) * N;
          for (let q = 0; q < N; q++) C[out + q] = C[out + q]! - u * C[src + q]!;
        }
      }
      const d = rB[k * nn + r * n + r]!;
      if (d === 0) return null;
      for (let q = 0; q < N; q++) C[out + q] = C[out + q]! / d;
    }
  }
  return finite(C) ? C : null;
}

function finite(x: Float64Array): boolean {
  for (let i = 0; i < x.length; i++) if (!Number.isFinite(x[i]!)) return false;
  return true;
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

/**
 * @heuristic Solve J·δ = F for the shooting Jacobian of a map of dimension 1 (−a_i on the
 * diagonal, 1 on the cyclic superdiagonal: δ_{i+1} − a_i·δ_i = F_i) in decimal.js, O(p): the
 * recursion run in its contracting direction as an affine function of the wrap-around value,
 * then closed. Null when a_i = 0 in the backward direction or the closure 1 − Π is zero.
 */
export function cyclicSolveDecimal(D: DecimalCtor, a: readonly Decimal[], F: readonly Decimal[]): Decimal[] | null {
  const p = a.length;
  let logSum = 0;
  for (let i = 0; i < p; i++) {
    // log2|a_i| from the double when in range, else from the decimal exponent (a direction only)
    const v = Math.abs(a[i]!.toNumber());
    logSum += a[i]!.isZero() ? -Infinity : v > 0 && v < Infinity ? Math.log2(v) : a[i]!.e * Math.LOG2E * Math.LN10;
  }
  const out: Decimal[] = new Array<Decimal>(p);
  if (logSum > 0) {
    // δ_i = (δ_{i+1} − F_i)/a_i from δ_p = δ_0 = t: δ_0 = α + β·t
    let alpha = new D(0);
    let beta = new D(1);
    for (let i = p - 1; i >= 0; i--) {
      if (a[i]!.isZero()) return null;
      alpha = alpha.sub(F[i]!).div(a[i]!);
      beta = beta.div(a[i]!);
    }
    const close = new D(1).sub(beta);
    if (close.isZero()) return null;
    let t = alpha.div(close);
    for (let i = p - 1; i >= 0; i--) {
      t = t.sub(F[i]!).div(a[i]!);
      out[i] = t;
    }
  } else {
    // δ_{i+1} = a_i·δ_i + F_i from δ_0 = t: δ_p = α + γ·t
    let alpha = new D(0);
    let gamma = new D(1);
    for (let i = 0; i < p; i++) {
      alpha = a[i]!.mul(alpha).add(F[i]!);
      gamma = gamma.mul(a[i]!);
    }
    const close = new D(1).sub(gamma);
    if (close.isZero()) return null;
    let t = alpha.div(close);
    for (let i = 0; i < p; i++) {
      out[i] = t;
      t = a[i]!.mul(t).add(F[i]!);
    }
  }
  return out.every((v) => v.isFinite()) ? out : null;
}

/** The outcome of `refineMpStructured`: the refined point and float blocks for a structured C. */
export interface MpStructuredRefinement {
  x: Decimal[];
  /** Df(x_i) rounded to doubles (p·n·n) at the final point: the blocks of a structured (block-cyclic) preconditioner; null when an evaluation failed. */
  blocks: Float64Array | null;
  converged: boolean;
  iterations: number;
  /** Last correction relative to 1 + ‖x‖∞ (a Decimal as a string, for messages). */
  lastStep: string;
}

/**
 * @heuristic Newton by iterative refinement for long orbits (per-block precision, no dense
 * matrix): the residual F(x) in decimal.js at the working precision of `D` (through the
 * multiprecision evaluator), the correction from the float64 structured solver (ShootingSolver,
 * O(p·n³)) applied to F scaled by a power of two into float64's range, subtracted in decimal.js.
 * Each step gains about −log10(cond·2^-53) digits, so the iterates reach the working precision
 * linearly; converged as in `refineMp` (relative correction ≤ 2^-(bits−8), or stagnation at the
 * noise level 2^-(bits/2)). O(p·n³) time and O(p·n²) memory per step.
 */
export function refineMpStructured<T>(
  arith: IntervalArithmetic<T>,
  ev: MapEvaluator<T>,
  D: DecimalCtor,
  start: readonly Decimal[],
  p: number,
  n: number,
  maxIter = 60,
): MpStructuredRefinement {
  const N = p * n;
  let x = start.map((v) => new D(v));
  const tol = new D(2).pow(-(arith.bits - 8));
  const noise = new D(2).pow(-Math.floor(arith.bits / 2));
  const solver = new ShootingSolver(p, n);
  const blocks = new Float64Array(p * n * n);
  const rhs = new Float64Array(N);
  const delta = new Float64Array(N);
  let converged = false;
  let extra = false;
  let it = 0;
  let lastStep = new D(Infinity);
  let stagnant = 0;
  const floatBlocks = (b: readonly Decimal[]): boolean => {
    for (let k = 0; k < b.length; k++) {
      blocks[k] = b[k]!.toNumber();
      if (!Number.isFinite(blocks[k]!)) return false;
    }
    return true;
  };
  for (; it < maxIter; it++) {
    const ev0 = mpPointEval(arith, ev, D, x, p, n);
    if (ev0 === null || !floatBlocks(ev0.blocks)) return { x, blocks: null, converged: false, iterations: it, lastStep: lastStep.toString() };
    const F: Decimal[] = new Array<Decimal>(N);
    let big = new D(0);
    for (let i = 0; i < p; i++) {
      const next = ((i + 1) % p) * n;
      for (let j = 0; j < n; j++) {
        const v = x[next + j]!.sub(ev0.f[i * n + j]!);
        F[i * n + j] = v;
        if (v.abs().gt(big)) big = v.abs();
      }
    }
    if (big.isZero()) {
      converged = true;
      lastStep = new D(0);
      break;
    }
    // F·2^s with max |F·2^s| ≈ 1: the float solve sees the correction's digits, not its exponent
    const bigF = big.toNumber();
    const s = bigF > 0 && Number.isFinite(bigF) ? -Math.floor(Math.log2(bigF)) : -big.log(2).floor().toNumber();
    const scale = new D(2).pow(s);
    let dx: Decimal[];
    if (n === 1) {
      // dimension 1: the cyclic recursion solved in decimal.js itself (no float64 range limit:
      // a block near 0, an orbit passing within 2^-p of the critical point, is fine)
      const sol = cyclicSolveDecimal(D, ev0.blocks, F);
      if (sol === null) return { x, blocks: null, converged: false, iterations: it, lastStep: lastStep.toString() };
      dx = sol;
    } else {
      for (let k = 0; k < N; k++) rhs[k] = F[k]!.mul(scale).toNumber();
      if (!solver.solveInto(blocks, rhs, delta)) return { x, blocks: null, converged: false, iterations: it, lastStep: lastStep.toString() };
      const inv = new D(2).pow(-s);
      dx = Array.from(delta, (v) => new D(v).mul(inv));
    }
    let step = new D(0);
    let size = new D(0);
    x = x.map((v, k) => {
      const d = dx[k]!;
      const nv = v.sub(d);
      if (d.abs().gt(step)) step = d.abs();
      if (nv.abs().gt(size)) size = nv.abs();
      return nv;
    });
    if (!step.isFinite()) break;
    const prevStep = lastStep;
    lastStep = step.div(size.add(1));
    if (lastStep.lte(tol)) {
      if (extra) {
        converged = true;
        it++;
        break;
      }
      extra = true;
    } else if (lastStep.lte(noise) && lastStep.gte(prevStep.div(4))) {
      // linear convergence slowed to nothing at the noise level: the rigorous test decides
      if (++stagnant >= 2) {
        converged = true;
        it++;
        break;
      }
    }
  }
  const evEnd = mpPointEval(arith, ev, D, x, p, n);
  const ok = evEnd !== null && floatBlocks(evEnd.blocks);
  return { x, blocks: ok ? Float64Array.from(blocks) : null, converged, iterations: it, lastStep: lastStep.toString() };
}
