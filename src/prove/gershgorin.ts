/**
 * Eigenvalue moduli of an interval monodromy for n ≥ 3 by Gershgorin discs (DESIGN.md §4).
 *
 * Contract. For ANY real matrix M' in the interval matrix S (n×n) every eigenvalue λ of M' lies
 * in the union of the discs D_i = {z : |z − c_i| ≤ ρ_i} returned here, and every union of discs
 * that is disjoint from the other discs holds exactly as many eigenvalues (with multiplicity) as
 * it has discs (Gershgorin 1931, from memory).
 *
 * Method. V = float (complex) eigenvectors of mid S, R ≈ V⁻¹ in floats (both @heuristic; any
 * nonsingular V works). With W = R·V and E = I − W enclosed in intervals, δ = ‖E‖∞ < 1 gives
 * ‖W⁻¹ − I‖∞ ≤ δ/(1 − δ) (Neumann series), and
 *   V⁻¹·S·V = W⁻¹·(R·S·V) = B + Δ,   B = R·S·V (intervals),   ‖Δ‖∞ ≤ δ/(1 − δ)·‖B‖∞.
 * M' and V⁻¹M'V have the same eigenvalues, so the discs of B + Δ, centred at B_ii with radius
 * Σ_{j≠i}|B_ij| + ‖Δ‖∞, contain them. Complex magnitudes are bounded by |re| + |im| (rigorous,
 * at most √2 loose); all bounds are doubles rounded outward with the kernel's directed operations.
 * Special cases: non-finite entries, no float eigen-decomposition, δ ≥ 1 → null (nothing claimed).
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { addDown, addUp, divUp, mulDown, mulUp, sqrtDown, sqrtUp, subDown } from '../interval/round.js';
import { eigenvaluesQR } from '../linalg/eigen.js';

/** A Gershgorin disc: |λ| ∈ [modulusLo, modulusHi] for the eigenvalues it holds. */
export interface EigenDisc {
  /** Lower bound of min |z| over the disc (0 when the disc reaches the origin). */
  modulusLo: number;
  /** Upper bound of max |z| over the disc. */
  modulusHi: number;
}

/** Complex float n×n matrix, row-major. */
interface CMat {
  re: Float64Array;
  im: Float64Array;
}

/** @heuristic Gauss–Jordan inverse of a complex n×n matrix with partial pivoting; null if singular. */
function complexInverse(a: CMat, n: number): CMat | null {
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
function approxEigenvectors(s: Float64Array, n: number): CMat | null {
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
function cmagUp<T>(a: IntervalArithmetic<T>, re: T, im: T): number {
  const x = a.magUp(re);
  const y = a.magUp(im);
  return sqrtUp(addUp(mulUp(x, x), mulUp(y, y)));
}
/** Lower bound of |z| for a complex interval: √(mig re² + mig im²), rounded down. */
function cmigDown<T>(a: IntervalArithmetic<T>, re: T, im: T): number {
  const x = a.migDown(re);
  const y = a.migDown(im);
  return sqrtDown(addDown(mulDown(x, x), mulDown(y, y)));
}

/**
 * Gershgorin discs for the eigenvalues of every matrix in the interval matrix `S` (n×n, row-major).
 * Returns null when nothing can be claimed (see the module comment).
 */
export function gershgorinDiscs<T>(a: IntervalArithmetic<T>, S: readonly T[], n: number): EigenDisc[] | null {
  const mid = new Float64Array(n * n);
  for (let k = 0; k < n * n; k++) {
    mid[k] = a.midNumber(S[k]!);
    if (!Number.isFinite(mid[k]!) || !Number.isFinite(a.magUp(S[k]!))) return null;
  }
  const V = approxEigenvectors(mid, n);
  if (V === null) return null;
  const R = complexInverse(V, n);
  if (R === null) return null;
  const zero = a.fromNumber(0);
  const num = (x: number): T => a.fromNumber(x);
  // SV = S·V (real interval × complex point)
  const svR: T[] = new Array<T>(n * n);
  const svI: T[] = new Array<T>(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let sr = zero;
      let si = zero;
      for (let k = 0; k < n; k++) {
        sr = a.add(sr, a.mul(S[i * n + k]!, num(V.re[k * n + j]!)));
        si = a.add(si, a.mul(S[i * n + k]!, num(V.im[k * n + j]!)));
      }
      svR[i * n + j] = sr;
      svI[i * n + j] = si;
    }
  }
  // B = R·SV and E = I − R·V, row sums of magnitudes.
  let delta = 0;
  let normB = 0;
  const cR: T[] = new Array<T>(n);
  const cI: T[] = new Array<T>(n);
  const offB = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let rowE = 0;
    let rowB = 0;
    for (let j = 0; j < n; j++) {
      let br = zero;
      let bi = zero;
      let wr = zero;
      let wi = zero;
      for (let k = 0; k < n; k++) {
        const rr = num(R.re[i * n + k]!);
        const ri = num(R.im[i * n + k]!);
        br = a.add(br, a.sub(a.mul(rr, svR[k * n + j]!), a.mul(ri, svI[k * n + j]!)));
        bi = a.add(bi, a.add(a.mul(rr, svI[k * n + j]!), a.mul(ri, svR[k * n + j]!)));
        const vr = num(V.re[k * n + j]!);
        const vi = num(V.im[k * n + j]!);
        wr = a.add(wr, a.sub(a.mul(rr, vr), a.mul(ri, vi)));
        wi = a.add(wi, a.add(a.mul(rr, vi), a.mul(ri, vr)));
      }
      const er = i === j ? a.sub(num(1), wr) : a.neg(wr);
      const ei = a.neg(wi);
      rowE = addUp(rowE, cmagUp(a, er, ei));
      const mb = cmagUp(a, br, bi);
      rowB = addUp(rowB, mb);
      if (i === j) {
        cR[i] = br;
        cI[i] = bi;
      } else offB[i] = addUp(offB[i]!, mb);
    }
    delta = Math.max(delta, rowE);
    normB = Math.max(normB, rowB);
  }
  if (!(delta < 1) || !Number.isFinite(normB)) return null;
  const extra = mulUp(divUp(delta, subDown(1, delta)), normB);
  const discs: EigenDisc[] = [];
  for (let i = 0; i < n; i++) {
    const rho = addUp(offB[i]!, extra);
    const hi = addUp(cmagUp(a, cR[i]!, cI[i]!), rho);
    const lo = Math.max(0, subDown(cmigDown(a, cR[i]!, cI[i]!), rho));
    if (!Number.isFinite(hi)) return null;
    discs.push({ modulusLo: lo, modulusHi: hi });
  }
  return discs;
}
