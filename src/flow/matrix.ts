/**
 * Small matrix helpers for the Lohner update: a float orthonormal basis (heuristic: any
 * invertible basis keeps the method sound) and a rigorous enclosure of the inverse of a float
 * matrix.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { inverse } from '../linalg/dense.js';

/**
 * @heuristic Modified Gram–Schmidt on the columns of the n×n row-major `a`, taken in order of
 * decreasing `size` (Lohner's QR variant: the column that carries most of the set is kept
 * exactly in direction). Returns the orthonormal factor (row-major), or null when a column is
 * (numerically) dependent on the earlier ones.
 */
export function orthonormalColumns(a: Float64Array, n: number, size: Float64Array): Float64Array | null {
  const order = Array.from({ length: n }, (_, j) => j).sort((p, q) => size[q]! - size[p]!);
  const q = new Float64Array(n * n);
  const v = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    const j = order[c]!;
    let orig = 0;
    for (let i = 0; i < n; i++) {
      v[i] = a[i * n + j]!;
      orig += v[i]! * v[i]!;
    }
    for (let p = 0; p < c; p++) {
      let d = 0;
      for (let i = 0; i < n; i++) d += q[i * n + p]! * v[i]!;
      for (let i = 0; i < n; i++) v[i] = v[i]! - d * q[i * n + p]!;
    }
    let norm = 0;
    for (let i = 0; i < n; i++) norm += v[i]! * v[i]!;
    norm = Math.sqrt(norm);
    if (!(norm > 1e-12 * Math.sqrt(orig)) || !Number.isFinite(norm)) return null;
    for (let i = 0; i < n; i++) q[i * n + c] = v[i]! / norm;
  }
  return q;
}

/**
 * Enclosure of B^{-1} for a float n×n matrix B (row-major): with Y ≈ B^{-1} (float) and
 * E = I − Y·B (interval), if δ = ‖E‖∞ < 1 then B^{-1} = (I − E)^{-1}·Y, so
 * ‖B^{-1} − Y‖∞ ≤ δ·‖Y‖∞ / (1 − δ) and every entry of B^{-1} lies in Y_ij ± that bound
 * (Neumann series; e.g. Rump 2010, "Verification methods", Acta Numerica, §10). Returns null
 * when B is singular to float precision or δ ≥ 1/2.
 */
export function encloseInverse<T>(A: IntervalArithmetic<T>, b: Float64Array, n: number): T[] | null {
  const y = inverse(b, n);
  if (y === null) return null;
  const one = A.fromNumber(1);
  const zero = A.fromNumber(0);
  let delta = 0;
  let ynorm = 0;
  for (let i = 0; i < n; i++) {
    let row = 0;
    let yrow = 0;
    for (let j = 0; j < n; j++) {
      let s = i === j ? one : zero;
      for (let k = 0; k < n; k++) s = A.sub(s, A.mul(A.fromNumber(y[i * n + k]!), A.fromNumber(b[k * n + j]!)));
      row = A.hiUp(A.add(A.fromNumber(row), A.fromNumber(A.magUp(s)))); // upward sums
      yrow = A.hiUp(A.add(A.fromNumber(yrow), A.fromNumber(Math.abs(y[i * n + j]!))));
    }
    delta = Math.max(delta, row);
    ynorm = Math.max(ynorm, yrow);
  }
  if (!(delta < 0.5)) return null;
  // bound = δ·‖Y‖ / (1 − δ), rounded up
  const bound = A.hiUp(A.div(A.mul(A.fromNumber(delta), A.fromNumber(ynorm)), A.sub(one, A.fromNumber(delta))));
  const out = new Array<T>(n * n);
  for (let k = 0; k < n * n; k++) out[k] = A.inflate(A.fromNumber(y[k]!), bound);
  return out;
}
