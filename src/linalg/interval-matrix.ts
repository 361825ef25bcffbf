/**
 * Interval matrices over any `IntervalArithmetic<T>` (rigorous when `a` rounds outward), and the
 * float orthonormalisation they start from (@heuristic: any Q with ‖I − QᵀQ‖∞ < 1 works). Used by
 * the prover's stability step for n ≥ 3 (prove/stability.ts).
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { addUp, divUp, mulUp, subDown } from '../interval/round.js';

/** @heuristic float modified Gram–Schmidt: Q (n×n, row-major, orthonormal columns) of b; null if rank-deficient. */
export function orthonormalColumns(b: Float64Array, n: number): Float64Array | null {
  const q = Float64Array.from(b);
  for (let j = 0; j < n; j++) {
    for (let k = 0; k < j; k++) {
      let dot = 0;
      for (let i = 0; i < n; i++) dot += q[i * n + k]! * q[i * n + j]!;
      for (let i = 0; i < n; i++) q[i * n + j] = q[i * n + j]! - dot * q[i * n + k]!;
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm = Math.hypot(norm, q[i * n + j]!);
    if (!(norm > 0) || !Number.isFinite(norm)) return null;
    for (let i = 0; i < n; i++) q[i * n + j] = q[i * n + j]! / norm;
  }
  return q;
}

/** The product x·y of two n×n interval matrices (row-major), each entry enclosed by the arithmetic `a`. */
export function intervalMatMul<T>(a: IntervalArithmetic<T>, x: readonly T[], y: readonly T[], n: number): T[] {
  const out: T[] = new Array<T>(n * n);
  const zero = a.fromNumber(0);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = zero;
      for (let k = 0; k < n; k++) s = a.add(s, a.mul(x[i * n + k]!, y[k * n + j]!));
      out[i * n + j] = s;
    }
  }
  return out;
}

/**
 * Enclosure of Q^{-1} for a float matrix Q with QᵀQ ≈ I: with E = I − QᵀQ (intervals) and
 * δ = ‖E‖∞ < 1, Q^{-1} = (I − E)^{-1}Qᵀ = Qᵀ + G·Qᵀ with ‖G‖∞ ≤ δ/(1 − δ), so entry (i, j) lies in
 * Qᵀ_ij ± δ/(1 − δ)·max_l |Qᵀ_lj| (Neumann series, from memory). Null when δ ≥ 1.
 */
export function orthogonalInverseEnclosure<T>(a: IntervalArithmetic<T>, q: Float64Array, n: number): T[] | null {
  let delta = 0;
  for (let i = 0; i < n; i++) {
    let row = 0;
    for (let j = 0; j < n; j++) {
      let s = a.fromNumber(i === j ? 1 : 0);
      for (let k = 0; k < n; k++) s = a.sub(s, a.mul(a.fromNumber(q[k * n + i]!), a.fromNumber(q[k * n + j]!)));
      row = addUp(row, a.magUp(s));
    }
    delta = Math.max(delta, row);
  }
  if (!(delta < 1)) return null;
  const g = divUp(delta, subDown(1, delta));
  const out: T[] = new Array<T>(n * n);
  for (let j = 0; j < n; j++) {
    let colMax = 0;
    for (let l = 0; l < n; l++) colMax = Math.max(colMax, Math.abs(q[j * n + l]!)); // column j of Qᵀ = row j of Q
    const e = mulUp(g, colMax);
    for (let i = 0; i < n; i++) out[i * n + j] = a.inflate(a.fromNumber(q[j * n + i]!), e);
  }
  return out;
}
