/**
 * Complex matrices: float inverse and approximate eigenvectors (@heuristic, any nonsingular result
 * serves the callers), and rigorous bounds of |z| for a complex interval (re, im) rounded outward.
 * Used by the Gershgorin eigenvalue enclosure (prove/gershgorin.ts).
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { addDown, addUp, mulDown, mulUp, sqrtDown, sqrtUp } from '../interval/round.js';
import { eigenvaluesQR } from './eigen.js';

/** Complex float n×n matrix, row-major. */
export interface CMat {
  re: Float64Array;
  im: Float64Array;
}

/** @heuristic Gauss–Jordan inverse of a complex n×n matrix with partial pivoting; null if singular. */
export function complexInverse(a: CMat, n: number): CMat | null {
  const ar = Float64Array.from(a.re);
  const ai = Float64Array.from(a.im);
  const xr = new Float64Array(n * n);
  const xi = new Float64Array(n * n);
  for (let k = 0; k < n; k++) xr[k * n + k] = 1;
  for (let c = 0; c < n; c++) {
    let piv = c;
    let best = Math.hypot(ar[c * n + c]!, ai[c * n + c]!);
    for (let r = c + 1; r < n; r++) {
      const v = Math.hypot(ar[r * n + c]!, ai[r * n + c]!);
      if (v > best) [best, piv] = [v, r];
    }
    if (!(best > 0) || !Number.isFinite(best)) return null;
    if (piv !== c) {
      for (const m of [ar, ai, xr, xi]) {
        for (let j = 0; j < n; j++) {
          const t = m[c * n + j]!;
          m[c * n + j] = m[piv * n + j]!;
          m[piv * n + j] = t;
        }
      }
    }
    // scale row c by 1/pivot
    const pr = ar[c * n + c]!;
    const pi = ai[c * n + c]!;
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (const [mr, mi] of [[ar, ai], [xr, xi]] as const) {
      for (let j = 0; j < n; j++) {
        const vr = mr[c * n + j]!;
        const vi = mi[c * n + j]!;
        mr[c * n + j] = vr * ir - vi * ii;
        mi[c * n + j] = vr * ii + vi * ir;
      }
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const fr = ar[r * n + c]!;
      const fi = ai[r * n + c]!;
      if (fr === 0 && fi === 0) continue;
      for (const [mr, mi] of [[ar, ai], [xr, xi]] as const) {
        for (let j = 0; j < n; j++) {
          const vr = mr[c * n + j]!;
          const vi = mi[c * n + j]!;
          mr[r * n + j] = mr[r * n + j]! - (fr * vr - fi * vi);
          mi[r * n + j] = mi[r * n + j]! - (fr * vi + fi * vr);
        }
      }
    }
  }
  return { re: xr, im: xi };
}

/**
 * @heuristic eigenvectors of the real matrix s (n×n) as columns of V: two steps of inverse
 * iteration per float eigenvalue (shifted by a relative 1e-10 so that the solve is regular),
 * started from e_j + small entries.
 */
export function approxEigenvectors(s: Float64Array, n: number): CMat | null {
  const eig = eigenvaluesQR(s, n);
  if (eig === null || eig.length !== n) return null;
  let scale = 0;
  for (let k = 0; k < n * n; k++) scale = Math.max(scale, Math.abs(s[k]!));
  const V: CMat = { re: new Float64Array(n * n), im: new Float64Array(n * n) };
  for (let j = 0; j < n; j++) {
    const lr = eig[j]!.re + 1e-10 * (1 + scale) * (1 + 0.37 * j);
    const li = eig[j]!.im;
    const A: CMat = { re: Float64Array.from(s), im: new Float64Array(n * n) };
    for (let k = 0; k < n; k++) {
      A.re[k * n + k] = A.re[k * n + k]! - lr;
      A.im[k * n + k] = -li;
    }
    const Ai = complexInverse(A, n);
    if (Ai === null) return null;
    // distinct start vectors, so that a repeated (semisimple) eigenvalue gets independent vectors
    let vr = Float64Array.from({ length: n }, (_, k) => (k === j ? 1 : 0.1 / (1 + k)));
    let vi = new Float64Array(n);
    for (let step = 0; step < 2; step++) {
      const nr = new Float64Array(n);
      const ni = new Float64Array(n);
      let big = 0;
      for (let r = 0; r < n; r++) {
        for (let k = 0; k < n; k++) {
          nr[r] = nr[r]! + Ai.re[r * n + k]! * vr[k]! - Ai.im[r * n + k]! * vi[k]!;
          ni[r] = ni[r]! + Ai.re[r * n + k]! * vi[k]! + Ai.im[r * n + k]! * vr[k]!;
        }
        big = Math.max(big, Math.hypot(nr[r]!, ni[r]!));
      }
      if (!(big > 0) || !Number.isFinite(big)) return null;
      for (let r = 0; r < n; r++) {
        nr[r] = nr[r]! / big;
        ni[r] = ni[r]! / big;
      }
      vr = nr;
      vi = ni;
    }
    for (let r = 0; r < n; r++) {
      V.re[r * n + j] = vr[r]!;
      V.im[r * n + j] = vi[r]!;
    }
  }
  return V;
}

/** Upper bound of |z| for a complex interval (re, im): √(mag re² + mag im²), rounded up. */
export function cmagUp<T>(a: IntervalArithmetic<T>, re: T, im: T): number {
  const x = a.magUp(re);
  const y = a.magUp(im);
  return sqrtUp(addUp(mulUp(x, x), mulUp(y, y)));
}
/** Lower bound of |z| for a complex interval: √(mig re² + mig im²), rounded down. */
export function cmigDown<T>(a: IntervalArithmetic<T>, re: T, im: T): number {
  const x = a.migDown(re);
  const y = a.migDown(im);
  return sqrtDown(addDown(mulDown(x, x), mulDown(y, y)));
}
