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
import { addUp, divUp, mulUp, subDown } from '../interval/round.js';
import { approxEigenvectors, cmagUp, cmigDown, complexInverse } from '../linalg/complex.js';

/** A Gershgorin disc: |λ| ∈ [modulusLo, modulusHi] for the eigenvalues it holds. */
export interface EigenDisc {
  /** Lower bound of min |z| over the disc (0 when the disc reaches the origin). */
  modulusLo: number;
  /** Upper bound of max |z| over the disc. */
  modulusHi: number;
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
