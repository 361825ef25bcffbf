/**
 * @heuristic Float64 solves with the multiple-shooting Jacobian of a period-p orbit in dimension n.
 *
 * For unknowns x_0, …, x_{p−1} ∈ R^n and F_i(x) = x_{(i+1) mod p} − f(x_i) the Jacobian J is
 * block-cyclic bidiagonal: block row i holds −A_i = −Df(x_i) at block column i and the identity
 * at block column (i+1) mod p (for p = 1 the single block is I − A_0).
 *
 * Data layout: `blocks` is a Float64Array of p·n·n numbers, block A_i row-major at offset i·n²;
 * vectors of length p·n hold δ_i at offset i·n.
 *
 * Three solvers, with different stability (measured in bench/search-bench.ts):
 *  - `ShootingSolver` / `shootingSolve` (the default): structured Householder QR. It eliminates
 *    block column k from block row k and a moving "spike" row (what remains of the wrap-around
 *    row p−1) with one 2n×n orthogonal reduction per step, O(p·n³) time, O(p·n²) memory. It is
 *    exactly a QR factorization of J restricted to its sparsity pattern, hence normwise backward
 *    stable for every p and every mix of expanding and contracting blocks (saddles included).
 *    Partial-pivoting LU on the same pattern costs the same but can show exponential element
 *    growth on multiple-shooting matrices, so it is not used.
 *  - `shootingSolveCondensed`: eliminates around the cycle (δ_{i+1} = A_i δ_i + r_i), solves
 *    (I − M) δ_0 = s with the monodromy M = A_{p−1}⋯A_0 and recurses forward. Cheapest, but
 *    M grows like e^{λp} (overflow for long chaotic orbits) and the forward recursion amplifies
 *    the error of δ_0 by the growth of the partial products: only trustworthy when
 *    ‖A_{i}⋯A_0‖ stays moderate, i.e. short periods or attracting orbits.
 *  - `shootingSolveDense`: assembles J (p·n × p·n) and uses dense LU with partial pivoting;
 *    O((pn)³), a reference for small p·n (tests compare the structured solver against it).
 */
import { luFactorInPlace, luSolveInto, solve } from './dense.js';

/** out = J·x for the shooting Jacobian (out_i = x_{(i+1) mod p} − A_i x_i). Allocation-free. */
export function shootingMatVecInto(
  blocks: ArrayLike<number>,
  p: number,
  n: number,
  x: ArrayLike<number>,
  out: Float64Array,
): void {
  const nn = n * n;
  for (let i = 0; i < p; i++) {
    const next = ((i + 1) % p) * n;
    for (let r = 0; r < n; r++) {
      let s = x[next + r]!;
      const row = i * nn + r * n;
      for (let c = 0; c < n; c++) s -= blocks[row + c]! * x[i * n + c]!;
      out[i * n + r] = s;
    }
  }
}

/** The dense shooting Jacobian J, (p·n)×(p·n) row-major (fresh array). */
export function shootingJacobianDense(blocks: ArrayLike<number>, p: number, n: number): Float64Array {
  const N = p * n;
  const nn = n * n;
  const out = new Float64Array(N * N);
  for (let i = 0; i < p; i++) {
    const next = (i + 1) % p;
    for (let r = 0; r < n; r++) {
      const row = (i * n + r) * N;
      for (let c = 0; c < n; c++) out[row + i * n + c] = out[row + i * n + c]! - blocks[i * nn + r * n + c]!;
      out[row + next * n + r] = out[row + next * n + r]! + 1;
    }
  }
  return out;
}

/** Reference solve J·δ = rhs with the dense matrix (O((pn)³)); null when singular. */
export function shootingSolveDense(
  blocks: ArrayLike<number>,
  p: number,
  n: number,
  rhs: ArrayLike<number>,
): Float64Array | null {
  const sol = solve(shootingJacobianDense(blocks, p, n), p * n, rhs);
  return sol !== null && allFinite(sol) ? sol : null;
}

/**
 * Solve by condensation around the cycle through the monodromy matrix (see the module comment
 * for when this is unstable). Null when I − M is singular to working precision or overflows.
 */
export function shootingSolveCondensed(
  blocks: ArrayLike<number>,
  p: number,
  n: number,
  rhs: ArrayLike<number>,
): Float64Array | null {
  const nn = n * n;
  // M = A_{p−1}⋯A_0 and u = the solution of the recursion started at δ_0 = 0.
  let m = new Float64Array(nn);
  let mNext = new Float64Array(nn);
  for (let i = 0; i < n; i++) m[i * n + i] = 1;
  let u = new Float64Array(n);
  let uNext = new Float64Array(n);
  for (let i = 0; i < p; i++) {
    const off = i * nn;
    for (let r = 0; r < n; r++) {
      let s = rhs[i * n + r]!;
      for (let c = 0; c < n; c++) s += blocks[off + r * n + c]! * u[c]!;
      uNext[r] = s;
      for (let c = 0; c < n; c++) {
        let t = 0;
        for (let l = 0; l < n; l++) t += blocks[off + r * n + l]! * m[l * n + c]!;
        mNext[r * n + c] = t;
      }
    }
    [m, mNext] = [mNext, m];
    [u, uNext] = [uNext, u];
  }
  const iMinusM = new Float64Array(nn);
  for (let k = 0; k < nn; k++) iMinusM[k] = -m[k]!;
  for (let i = 0; i < n; i++) iMinusM[i * n + i] = iMinusM[i * n + i]! + 1;
  const d0 = solve(iMinusM, n, u);
  if (d0 === null) return null;
  const out = new Float64Array(p * n);
  out.set(d0, 0);
  for (let i = 0; i + 1 < p; i++) {
    const off = i * nn;
    for (let r = 0; r < n; r++) {
      let s = rhs[i * n + r]!;
      for (let c = 0; c < n; c++) s += blocks[off + r * n + c]! * out[i * n + c]!;
      out[(i + 1) * n + r] = s;
    }
  }
  return allFinite(out) ? out : null;
}

/**
 * Structured Householder-QR solver for the shooting Jacobian of a fixed shape (p, n). Owns all
 * workspace, so repeated solves (Newton iterations) allocate nothing. Not thread-safe.
 */
export class ShootingSolver {
  readonly p: number;
  readonly n: number;
  /** Panel of 2n rows × (3n + 1) columns: [block col k | block col k+1 | block col p−1 | rhs]. */
  private readonly panel: Float64Array;
  private readonly v: Float64Array;
  /** Per elimination step k = 0..p−2: R_k (upper triangular), E_k, G_k (n×n) and rhs_k (n). */
  private readonly rBlocks: Float64Array;
  private readonly eBlocks: Float64Array;
  private readonly gBlocks: Float64Array;
  private readonly rhsBlocks: Float64Array;
  private readonly last: Float64Array;
  private readonly lastRhs: Float64Array;
  private readonly piv: Int32Array;
  private readonly work: Float64Array;

  constructor(p: number, n: number) {
    if (!(Number.isInteger(p) && p >= 1 && Number.isInteger(n) && n >= 1)) {
      throw new RangeError(`ShootingSolver: period and dimension must be positive integers (got p=${p}, n=${n})`);
    }
    this.p = p;
    this.n = n;
    const steps = Math.max(p - 1, 0);
    this.panel = new Float64Array(2 * n * (3 * n + 1));
    this.v = new Float64Array(2 * n);
    this.rBlocks = new Float64Array(steps * n * n);
    this.eBlocks = new Float64Array(steps * n * n);
    this.gBlocks = new Float64Array(steps * n * n);
    this.rhsBlocks = new Float64Array(steps * n);
    this.last = new Float64Array(n * n);
    this.lastRhs = new Float64Array(n);
    this.piv = new Int32Array(n);
    this.work = new Float64Array(n);
  }

  /**
   * Writes δ with J·δ ≈ rhs into `out` (length p·n, may alias rhs). Returns false when J is
   * singular to working precision or something non-finite appeared (out is then garbage).
   */
  solveInto(blocks: ArrayLike<number>, rhs: ArrayLike<number>, out: Float64Array): boolean {
    const { p, n } = this;
    const nn = n * n;
    if (p === 1) {
      const a = this.last;
      for (let k = 0; k < nn; k++) a[k] = -blocks[k]!;
      for (let i = 0; i < n; i++) a[i * n + i] = a[i * n + i]! + 1;
      if (!luFactorInPlace(a, n, this.piv)) return false;
      for (let i = 0; i < n; i++) this.lastRhs[i] = rhs[i]!;
      luSolveInto({ n, lu: a, piv: this.piv }, this.lastRhs, out, this.work);
      return allFinite(out, n);
    }
    const W = this.panel;
    const cols = 3 * n + 1;
    const colK1 = n;
    const colLast = 2 * n;
    const colRhs = 3 * n;
    // Spike = wrap-around block row p−1: I at block column 0, −A_{p−1} at block column p−1.
    // It lives in panel rows n..2n−1; initialise its "column k" part with I and its last part.
    W.fill(0);
    const lastOff = (p - 1) * nn;
    for (let r = 0; r < n; r++) {
      const row = (n + r) * cols;
      W[row + r] = 1;
      for (let c = 0; c < n; c++) W[row + colLast + c] = -blocks[lastOff + r * n + c]!;
      W[row + colRhs] = rhs[(p - 1) * n + r]!;
    }
    for (let k = 0; k <= p - 2; k++) {
      const lastStep = k + 1 === p - 1;
      // Top rows: block row k.
      for (let r = 0; r < n; r++) {
        const row = r * cols;
        for (let c = 0; c < cols; c++) W[row + c] = 0;
        for (let c = 0; c < n; c++) W[row + c] = -blocks[k * nn + r * n + c]!;
        if (lastStep) W[row + colLast + r] = 1;
        else W[row + colK1 + r] = 1;
        W[row + colRhs] = rhs[k * n + r]!;
      }
      // Householder reduction of the 2n×n leading panel column block.
      for (let j = 0; j < n; j++) {
        let scale = 0;
        for (let i = j; i < 2 * n; i++) scale = Math.max(scale, Math.abs(W[i * cols + j]!));
        if (!(scale > 0)) {
          if (scale !== 0) return false; // NaN
          continue; // zero column: R_k singular, detected in back-substitution
        }
        if (!Number.isFinite(scale)) return false;
        let norm2 = 0;
        for (let i = j; i < 2 * n; i++) {
          const t = W[i * cols + j]! / scale;
          this.v[i] = t;
          norm2 += t * t;
        }
        const norm = Math.sqrt(norm2);
        const alpha = this.v[j]! >= 0 ? -norm : norm;
        this.v[j] = this.v[j]! - alpha;
        let vtv = 0;
        for (let i = j; i < 2 * n; i++) vtv += this.v[i]! * this.v[i]!;
        if (vtv > 0) {
          for (let c = j + 1; c < cols; c++) {
            let s = 0;
            for (let i = j; i < 2 * n; i++) s += this.v[i]! * W[i * cols + c]!;
            const f = (2 * s) / vtv;
            if (f !== 0) for (let i = j; i < 2 * n; i++) W[i * cols + c] = W[i * cols + c]! - f * this.v[i]!;
          }
        }
        W[j * cols + j] = alpha * scale;
        for (let i = j + 1; i < 2 * n; i++) W[i * cols + j] = 0;
      }
      // Store the finished top rows; the bottom rows become the next spike.
      for (let r = 0; r < n; r++) {
        const row = r * cols;
        for (let c = 0; c < n; c++) {
          this.rBlocks[k * nn + r * n + c] = W[row + c]!;
          this.eBlocks[k * nn + r * n + c] = W[row + colK1 + c]!;
          this.gBlocks[k * nn + r * n + c] = W[row + colLast + c]!;
        }
        this.rhsBlocks[k * n + r] = W[row + colRhs]!;
      }
      for (let r = 0; r < n; r++) {
        const row = (n + r) * cols;
        for (let c = 0; c < n; c++) W[row + c] = W[row + colK1 + c]!;
        for (let c = 0; c < n; c++) W[row + colK1 + c] = 0;
      }
    }
    // Final n×n system: after the last step the spike's "column k" part (moved to the leading
    // columns) is zero and its last-column part is the remaining block.
    for (let r = 0; r < n; r++) {
      const row = (n + r) * cols;
      for (let c = 0; c < n; c++) this.last[r * n + c] = W[row + c]! + W[row + colLast + c]!;
      this.lastRhs[r] = W[row + colRhs]!;
    }
    if (!luFactorInPlace(this.last, n, this.piv)) return false;
    const lastOut = (p - 1) * n;
    luSolveInto({ n, lu: this.last, piv: this.piv }, this.lastRhs, this.work);
    for (let r = 0; r < n; r++) out[lastOut + r] = this.work[r]!;
    for (let k = p - 2; k >= 0; k--) {
      const useE = k + 1 !== p - 1;
      for (let r = n - 1; r >= 0; r--) {
        let s = this.rhsBlocks[k * n + r]!;
        for (let c = 0; c < n; c++) {
          s -= this.gBlocks[k * nn + r * n + c]! * out[lastOut + c]!;
          if (useE) s -= this.eBlocks[k * nn + r * n + c]! * out[(k + 1) * n + c]!;
        }
        for (let c = r + 1; c < n; c++) s -= this.rBlocks[k * nn + r * n + c]! * out[k * n + c]!;
        const d = this.rBlocks[k * nn + r * n + r]!;
        if (d === 0) return false;
        out[k * n + r] = s / d;
      }
    }
    return allFinite(out, p * n);
  }
}

/**
 * Solve J·δ = rhs for the shooting Jacobian with the stable structured QR solver
 * (O(p·n³)); null when singular to working precision or non-finite.
 */
export function shootingSolve(
  blocks: ArrayLike<number>,
  p: number,
  n: number,
  rhs: ArrayLike<number>,
): Float64Array | null {
  const out = new Float64Array(p * n);
  return new ShootingSolver(p, n).solveInto(blocks, rhs, out) ? out : null;
}

function allFinite(x: ArrayLike<number>, length = x.length): boolean {
  for (let i = 0; i < length; i++) if (!Number.isFinite(x[i]!)) return false;
  return true;
}
