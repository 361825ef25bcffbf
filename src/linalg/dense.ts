/**
 * @heuristic Dense float64 linear algebra on row-major `Float64Array`s.
 *
 * Nothing here is rigorous: these routines compute approximate solutions, inverses and products
 * in plain IEEE double arithmetic (round to nearest). They serve the float candidate search and
 * the Krawczyk preconditioner C ≈ J(m)^{-1}, where any C is admissible (DESIGN.md §2) and only
 * the quality of C, never the soundness of a proof, depends on these results.
 *
 * Conventions: an m×n matrix is a Float64Array of length ≥ m·n with entry (i, j) at i·n + j.
 * Routines that take an `out` argument write into it and allocate nothing; `out` must not alias
 * an input unless the routine says so. Singular or non-finite input is reported by return value
 * (`false` / `null`), never by an exception.
 */

/** A square matrix of order n factored in place as P·A = L·U (partial pivoting). */
export interface LuFactorization {
  readonly n: number;
  /** L (unit lower, below the diagonal) and U (on and above) packed row-major, n×n. */
  readonly lu: Float64Array;
  /** Row i of the factored matrix is row piv[i] of the original. */
  readonly piv: Int32Array;
}

/** The identity of order n (fresh array). */
export function identityMatrix(n: number): Float64Array {
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) out[i * n + i] = 1;
  return out;
}

/**
 * In-place LU factorization with partial (row) pivoting: overwrites `a` (n×n) with L\U and fills
 * `piv`. Returns false when a pivot is exactly zero or non-finite (matrix singular to working
 * precision, or input containing NaN/Infinity); `a` is then garbage. Allocation-free.
 */
export function luFactorInPlace(a: Float64Array, n: number, piv: Int32Array): boolean {
  for (let i = 0; i < n; i++) piv[i] = i;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(a[k * n + k]!);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * n + k]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return false;
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = a[k * n + j]!;
        a[k * n + j] = a[p * n + j]!;
        a[p * n + j] = t;
      }
      const t = piv[k]!;
      piv[k] = piv[p]!;
      piv[p] = t;
    }
    const pivot = a[k * n + k]!;
    for (let i = k + 1; i < n; i++) {
      const l = a[i * n + k]! / pivot;
      a[i * n + k] = l;
      if (l !== 0) {
        for (let j = k + 1; j < n; j++) a[i * n + j] = a[i * n + j]! - l * a[k * n + j]!;
      }
    }
  }
  return true;
}

/** LU factorization of a copy of `a` (n×n); null when singular to working precision. */
export function luFactor(a: ArrayLike<number>, n: number): LuFactorization | null {
  const lu = Float64Array.from({ length: n * n }, (_, i) => a[i]!);
  const piv = new Int32Array(n);
  return luFactorInPlace(lu, n, piv) ? { n, lu, piv } : null;
}

/**
 * Solves A·x = b from a factorization; `b` and `x` may be the same array only if `work` is
 * given (length n) — otherwise x must differ from b. Allocation-free when `work` is given.
 */
export function luSolveInto(
  f: LuFactorization,
  b: ArrayLike<number>,
  x: Float64Array,
  work?: Float64Array,
): void {
  const { n, lu, piv } = f;
  const y = work ?? x;
  for (let i = 0; i < n; i++) y[i] = b[piv[i]!]!;
  for (let i = 0; i < n; i++) {
    let s = y[i]!;
    for (let j = 0; j < i; j++) s -= lu[i * n + j]! * y[j]!;
    y[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i]!;
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j]! * y[j]!;
    y[i] = s / lu[i * n + i]!;
  }
  if (y !== x) for (let i = 0; i < n; i++) x[i] = y[i]!;
}

/** x with A·x ≈ b (fresh array), or null when A is singular to working precision. */
export function solve(a: ArrayLike<number>, n: number, b: ArrayLike<number>): Float64Array | null {
  const f = luFactor(a, n);
  if (f === null) return null;
  const x = new Float64Array(n);
  luSolveInto(f, b, x, new Float64Array(n));
  return x;
}

/**
 * Approximate inverse of A (n×n, fresh array), or null when singular to working precision.
 * This is the intended source of the Krawczyk preconditioner C ≈ J(m)^{-1}.
 */
export function inverse(a: ArrayLike<number>, n: number): Float64Array | null {
  const f = luFactor(a, n);
  if (f === null) return null;
  const out = new Float64Array(n * n);
  const e = new Float64Array(n);
  const col = new Float64Array(n);
  const work = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    luSolveInto(f, e, col, work);
    for (let i = 0; i < n; i++) out[i * n + j] = col[i]!;
  }
  return out;
}

/** out = A·x for A m×n; out (length m) must not alias x. Allocation-free. */
export function matVecInto(
  a: ArrayLike<number>,
  m: number,
  n: number,
  x: ArrayLike<number>,
  out: Float64Array,
): void {
  for (let i = 0; i < m; i++) {
    let s = 0;
    const row = i * n;
    for (let j = 0; j < n; j++) s += a[row + j]! * x[j]!;
    out[i] = s;
  }
}

/** A·x as a fresh array. */
export function matVec(a: ArrayLike<number>, m: number, n: number, x: ArrayLike<number>): Float64Array {
  const out = new Float64Array(m);
  matVecInto(a, m, n, x, out);
  return out;
}

/** out = A·B for A m×k and B k×n; out (m×n) must alias neither input. Allocation-free. */
export function matMulInto(
  a: ArrayLike<number>,
  b: ArrayLike<number>,
  m: number,
  k: number,
  n: number,
  out: Float64Array,
): void {
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < n; j++) out[i * n + j] = 0;
    for (let l = 0; l < k; l++) {
      const ail = a[i * k + l]!;
      if (ail === 0) continue;
      for (let j = 0; j < n; j++) out[i * n + j] = out[i * n + j]! + ail * b[l * n + j]!;
    }
  }
}

/** A·B as a fresh array. */
export function matMul(
  a: ArrayLike<number>,
  b: ArrayLike<number>,
  m: number,
  k: number,
  n: number,
): Float64Array {
  const out = new Float64Array(m * n);
  matMulInto(a, b, m, k, n, out);
  return out;
}

/** max_i |x_i| (NaN if some entry is NaN). */
export function normInf(x: ArrayLike<number>, length = x.length): number {
  let m = 0;
  for (let i = 0; i < length; i++) {
    const v = Math.abs(x[i]!);
    if (!(v <= m)) m = v; // propagates NaN
  }
  return m;
}

/** Induced ∞-norm (max absolute row sum) of an m×n matrix. */
export function matrixNormInf(a: ArrayLike<number>, m: number, n: number): number {
  let best = 0;
  for (let i = 0; i < m; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j]!);
    if (!(s <= best)) best = s;
  }
  return best;
}
