/**
 * Krawczyk test for a square system G(z) = 0 whose interval Jacobian over the box is given as
 * sparse columns (the augmented fold/flip system and the junction test of a window cover).
 *
 * Contract: with m ∈ X a point, Gm ⊇ G(m), and J ⊇ {DG(z) : z ∈ X} (entries not listed are exactly
 * zero over X), K(X) = m − C·Gm + (I − C·J)(X − m) encloses every zero of G in X for ANY real
 * matrix C (Krawczyk 1969; DESIGN.md §4). K(X) ⊂ int X ⇒ exactly one zero in X;
 * K(X) ∩ X = ∅ in some coordinate ⇒ none. C is a float approximation of J(m)^{-1} (@heuristic:
 * any C is valid, only the enclosure is rigorous).
 * Tightness: one Krawczyk step; cost O(N·nnz) interval operations, O(N²) for bordered systems.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { inverse } from '../linalg/dense.js';

/** Column k of the Jacobian: rows and enclosures. */
export interface SparseColumn<T> {
  rows: number[];
  values: T[];
}

export type DenseKrawczykOutcome<T> =
  | { kind: 'inside'; image: T[] }
  | { kind: 'excluded'; image: T[]; index: number }
  | { kind: 'undecided'; image: T[] };

/** @heuristic C ≈ J^{-1} from float midpoints of the sparse columns; null when singular. */
export function floatInverseOfColumns<T>(A: IntervalArithmetic<T>, cols: readonly SparseColumn<T>[]): Float64Array | null {
  const N = cols.length;
  const a = new Float64Array(N * N);
  for (let k = 0; k < N; k++) {
    const c = cols[k]!;
    for (let e = 0; e < c.rows.length; e++) a[c.rows[e]! * N + k] += A.midNumber(c.values[e]!);
  }
  const inv = inverse(a, N);
  if (inv === null) return null;
  for (let i = 0; i < N * N; i++) if (!Number.isFinite(inv[i]!)) return null;
  return inv;
}

/** One Krawczyk step; `target` (default X) is the box K(X) must lie inside. */
export function sparseKrawczyk<T>(
  A: IntervalArithmetic<T>,
  m: readonly T[],
  Gm: readonly T[],
  cols: readonly SparseColumn<T>[],
  X: readonly T[],
  C: Float64Array,
  target: readonly T[] = X,
): DenseKrawczykOutcome<T> {
  const N = X.length;
  const zero = A.fromNumber(0);
  const d: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) d[k] = A.sub(X[k]!, m[k]!);
  const image: T[] = new Array<T>(N);
  for (let a = 0; a < N; a++) {
    // m_a − Σ_r C[a][r]·Gm[r] + Σ_k (δ_ak − Σ_r C[a][r]·J[r][k])·d_k
    let acc = zero;
    for (let r = 0; r < N; r++) {
      const c = C[a * N + r]!;
      if (c !== 0) acc = A.add(acc, A.mul(A.fromNumber(c), Gm[r]!));
    }
    let s = A.sub(m[a]!, acc);
    for (let k = 0; k < N; k++) {
      const col = cols[k]!;
      let e = a === k ? A.fromNumber(1) : zero;
      for (let q = 0; q < col.rows.length; q++) {
        const c = C[a * N + col.rows[q]!]!;
        if (c !== 0) e = A.sub(e, A.mul(A.fromNumber(c), col.values[q]!));
      }
      s = A.add(s, A.mul(e, d[k]!));
    }
    image[a] = s;
  }
  for (let k = 0; k < N; k++) {
    if (A.disjoint(image[k]!, X[k]!)) return { kind: 'excluded', image, index: k };
  }
  for (let k = 0; k < N; k++) {
    if (!A.isInterior(image[k]!, target[k]!)) return { kind: 'undecided', image };
  }
  return { kind: 'inside', image };
}
