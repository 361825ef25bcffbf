/**
 * The structured Krawczyk test for the shooting system of a map of dimension n = 2 (Hénon-type
 * saddles, long periods): O(p) time and memory, no dense matrix.
 *
 * As in cyclic.ts, C := B^{-1} for the exact block-cyclic matrix B with blocks −Ã_i (doubles,
 * Ã_i ≈ Df(m_i)) on the diagonal and I beside it, and
 *   K(X) ⊆ m + z̃ + C·R,  R_i = −F_i(m) − (B z̃)_i + (A_i(X) − Ã_i)(X_i − m_i),
 * valid for every real z̃; δ = C·r solves δ_{i+1} = Ã_i δ_i + r_i (indices mod p).
 * Change of coordinates: with ANY invertible real 2×2 matrices P_i (doubles; heuristic: columns
 * the unstable and stable directions of the cycle, by power iteration forwards and backwards),
 * δ_i = P_i y_i gives y_{i+1} = D_i y_i + h_i with D_i = P_{i+1}^{-1} Ã_i P_i and
 * h_i = P_{i+1}^{-1} r_i. P^{-1} is enclosed as adj(P)/det(P) in interval arithmetic, so D_i and h_i
 * are enclosed rigorously; D_i is nearly diagonal.
 * For each component k a direction is chosen (heuristic): 'back' when Π|D_kk| > 1, else 'forward'.
 * Every solution then satisfies, with G_{k,i} ≥ |h_{k,i}| and l ≠ k:
 *   back:    |y_{k,i}|   ≤ (|y_{k,i+1}| + mag D_{kl,i}·|y_{l,i}| + G_{k,i}) / mig D_{kk,i}
 *   forward: |y_{k,i+1}| ≤ mag D_{kk,i}·|y_{k,i}| + mag D_{kl,i}·|y_{l,i}| + G_{k,i}
 * i.e. e ≤ T·e + G for e = |y| and a nonnegative matrix T. If a positive vector ū satisfies
 * T·ū + G ≤ ū (checked with every operation rounded up) and G > 0, then T·ū ≤ θ·ū with θ < 1,
 * so ρ(T) < 1 (Collatz–Wielandt), (I − T)^{-1} = Σ T^j ≥ 0 and e ≤ (I − T)^{-1}G ≤ ū.
 * Then |δ_i| ≤ |P_i|·ū_i (rounded up) and K(X)_i ⊆ (m_i + z̃_i) ± |P_i| ū_i. ū itself is found
 * by a few Gauss–Seidel sweeps (heuristic; only the final check matters); G is replaced by
 * G + 2^-1000 (≥ G) to make it positive. When the check fails (no hyperbolic splitting, e.g.
 * complex multipliers), the bound is not established and the caller says so.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { addUp, divUp, mulUp, subDown } from '../interval/round.js';
import { ShootingSolver } from '../linalg/shooting.js';

export interface Cyclic2Plan<T> {
  readonly p: number;
  /** Ã_i as points of T (4 per block, row-major). */
  readonly at: readonly T[];
  /** P_{i}^{-1} enclosures (4 per block) and |P_i| (doubles, exact). */
  readonly pinv: readonly T[];
  readonly pabs: Float64Array;
  /** mag D_{kl,i} (4 per block) and 1/mig D_{kk,i} rounded up (2 per block). */
  readonly dmag: Float64Array;
  readonly invMig: Float64Array;
  readonly back: [boolean, boolean];
  /** Closure factors per component (< 1). */
  readonly closure: [number, number];
  readonly y0: readonly T[];
  readonly e0: readonly T[];
}

const TINY = 2 ** -1000;

function norm2(x: number, y: number): [number, number] {
  const h = Math.hypot(x, y);
  return h > 0 && Number.isFinite(h) ? [x / h, y / h] : [1, 0];
}

/** @heuristic unstable (v) and stable (w) directions along the cycle, by power iteration. */
function directions(A: Float64Array, p: number): { v: Float64Array; w: Float64Array } {
  const v = new Float64Array(2 * p);
  const w = new Float64Array(2 * p);
  const laps = Math.max(3, Math.ceil(300 / p));
  let x = 0.8;
  let y = 0.6;
  for (let lap = 0; lap < laps; lap++) {
    for (let i = 0; i < p; i++) {
      v[2 * i] = x;
      v[2 * i + 1] = y;
      const o = 4 * i;
      [x, y] = norm2(A[o]! * x + A[o + 1]! * y, A[o + 2]! * x + A[o + 3]! * y);
    }
  }
  x = 0.6;
  y = -0.8;
  for (let lap = 0; lap < laps; lap++) {
    for (let i = p - 1; i >= 0; i--) {
      // w_i ∝ Ã_i^{-1} w_{i+1}
      const o = 4 * i;
      const a = A[o]!;
      const b = A[o + 1]!;
      const c = A[o + 2]!;
      const d = A[o + 3]!;
      [x, y] = norm2(d * x - b * y, -c * x + a * y);
      w[2 * i] = x;
      w[2 * i + 1] = y;
    }
  }
  return { v, w };
}

export function prepareCyclic2<T>(a: IntervalArithmetic<T>, m: readonly T[], Fm: readonly T[], A: Float64Array): Cyclic2Plan<T> | null {
  const p = A.length / 4;
  const { v, w } = directions(A, p);
  const at: T[] = Array.from(A, (x) => a.fromNumber(x));
  const pinv: T[] = new Array<T>(4 * p);
  const pabs = new Float64Array(4 * p);
  for (let i = 0; i < p; i++) {
    const P = [v[2 * i]!, w[2 * i]!, v[2 * i + 1]!, w[2 * i + 1]!];
    for (let k = 0; k < 4; k++) pabs[4 * i + k] = Math.abs(P[k]!);
    const Pt = P.map((x) => a.fromNumber(x));
    const det = a.sub(a.mul(Pt[0]!, Pt[3]!), a.mul(Pt[1]!, Pt[2]!));
    if (!(a.migDown(det) > 0)) return null;
    pinv[4 * i] = a.div(Pt[3]!, det);
    pinv[4 * i + 1] = a.div(a.neg(Pt[1]!), det);
    pinv[4 * i + 2] = a.div(a.neg(Pt[2]!), det);
    pinv[4 * i + 3] = a.div(Pt[0]!, det);
  }
  const mul2 = (x: readonly T[], xo: number, y: readonly T[], yo: number): T[] => [
    a.add(a.mul(x[xo]!, y[yo]!), a.mul(x[xo + 1]!, y[yo + 2]!)),
    a.add(a.mul(x[xo]!, y[yo + 1]!), a.mul(x[xo + 1]!, y[yo + 3]!)),
    a.add(a.mul(x[xo + 2]!, y[yo]!), a.mul(x[xo + 3]!, y[yo + 2]!)),
    a.add(a.mul(x[xo + 2]!, y[yo + 1]!), a.mul(x[xo + 3]!, y[yo + 3]!)),
  ];
  const dmag = new Float64Array(4 * p);
  const invMig = new Float64Array(2 * p);
  const logs = [0, 0];
  for (let i = 0; i < p; i++) {
    const Pi = [v[2 * i]!, w[2 * i]!, v[2 * i + 1]!, w[2 * i + 1]!].map((x) => a.fromNumber(x));
    const AP = mul2(at, 4 * i, Pi, 0);
    const D = mul2(pinv, 4 * ((i + 1) % p), AP, 0);
    for (let k = 0; k < 4; k++) dmag[4 * i + k] = a.magUp(D[k]!);
    for (let k = 0; k < 2; k++) {
      const mig = a.migDown(D[3 * k]!);
      invMig[2 * i + k] = mig > 0 ? divUp(1, mig) : Infinity;
      logs[k]! += Math.log2(Math.abs(a.midNumber(D[3 * k]!)));
    }
  }
  const back: [boolean, boolean] = [logs[0]! > 0, logs[1]! > 0];
  const closure: [number, number] = [1, 1];
  for (let k = 0; k < 2; k++) {
    for (let i = 0; i < p; i++) closure[k] = mulUp(closure[k]!, back[k] ? invMig[2 * i + k]! : dmag[4 * i + 3 * k]!);
    if (!(closure[k]! < 1)) return null;
  }
  // z̃ ≈ −B^{-1}F(m) with the structured QR solver (heuristic)
  const c = new Float64Array(2 * p);
  for (let k = 0; k < 2 * p; k++) c[k] = -a.midNumber(Fm[k]!);
  const z = new Float64Array(2 * p);
  if (!new ShootingSolver(p, 2).solveInto(A, c, z)) z.fill(0);
  const zT = Array.from(z, (x) => a.fromNumber(x));
  const y0: T[] = new Array<T>(2 * p);
  const e0: T[] = new Array<T>(2 * p);
  for (let i = 0; i < p; i++) {
    const nx = ((i + 1) % p) * 2;
    for (let r = 0; r < 2; r++) {
      y0[2 * i + r] = a.add(m[2 * i + r]!, zT[2 * i + r]!);
      // (B z̃)_i = z̃_{i+1} − Ã_i z̃_i
      const az = a.add(a.mul(at[4 * i + 2 * r]!, zT[2 * i]!), a.mul(at[4 * i + 2 * r + 1]!, zT[2 * i + 1]!));
      e0[2 * i + r] = a.sub(a.neg(Fm[2 * i + r]!), a.sub(zT[nx + r]!, az));
    }
  }
  return { p, at, pinv, pabs, dmag, invMig, back, closure, y0, e0 };
}

/** One component's closed-form cyclic bound given its right-hand sides g (see cyclic.ts). */
function componentBound(plan: Cyclic2Plan<unknown>, k: number, g: Float64Array, u: Float64Array): void {
  const { p, back, closure, invMig, dmag } = plan;
  let t = 0;
  if (back[k]) {
    for (let i = p - 1; i >= 0; i--) t = mulUp(addUp(t, g[i]!), invMig[2 * i + k]!);
    t = divUp(t, subDown(1, closure[k]!));
    for (let i = p - 1; i >= 0; i--) u[i] = t = mulUp(addUp(t, g[i]!), invMig[2 * i + k]!);
  } else {
    for (let i = 0; i < p; i++) t = addUp(mulUp(dmag[4 * i + 3 * k]!, t), g[i]!);
    t = divUp(t, subDown(1, closure[k]!));
    for (let i = 0; i < p; i++) {
      u[i] = t;
      t = addUp(mulUp(dmag[4 * i + 3 * k]!, t), g[i]!);
    }
  }
}

/** K(X) enclosure for box X with Jacobian blocks A_i(X) and d = X − m; null when not established. */
export function cyclic2Image<T>(a: IntervalArithmetic<T>, plan: Cyclic2Plan<T>, blocks: readonly T[], d: readonly T[]): T[] | null {
  const { p, at, pinv, dmag, invMig, back, pabs } = plan;
  const G = [new Float64Array(p), new Float64Array(p)];
  for (let i = 0; i < p; i++) {
    const r: T[] = [];
    for (let row = 0; row < 2; row++) {
      let s: T = plan.e0[2 * i + row]!;
      for (let col = 0; col < 2; col++) s = a.add(s, a.mul(a.sub(blocks[4 * i + 2 * row + col]!, at[4 * i + 2 * row + col]!), d[2 * i + col]!));
      r.push(s);
    }
    const q = 4 * ((i + 1) % p);
    for (let k = 0; k < 2; k++) {
      const h = a.add(a.mul(pinv[q + 2 * k]!, r[0]!), a.mul(pinv[q + 2 * k + 1]!, r[1]!));
      G[k]![i] = addUp(a.magUp(h), TINY);
    }
  }
  // @heuristic Gauss–Seidel sweeps for ū
  const U = [new Float64Array(p), new Float64Array(p)];
  const g = new Float64Array(p);
  for (let sweep = 0; sweep < 40; sweep++) {
    let change = 0;
    for (let k = 0; k < 2; k++) {
      const l = 1 - k;
      for (let i = 0; i < p; i++) g[i] = addUp(G[k]![i]!, mulUp(dmag[4 * i + 2 * k + l]!, U[l]![i]!));
      const before = U[k]![0]!;
      componentBound(plan as Cyclic2Plan<unknown>, k, g, U[k]!);
      change = Math.max(change, Math.abs(U[k]![0]! - before) / Math.max(U[k]![0]!, 1e-300));
    }
    if (sweep > 0 && change < 1e-6) break;
  }
  for (let k = 0; k < 2; k++) for (let i = 0; i < p; i++) U[k]![i] = mulUp(U[k]![i]!, 1 + 2 ** -20);
  // rigorous check T·ū + G ≤ ū (every operation rounded up)
  for (let k = 0; k < 2; k++) {
    const l = 1 - k;
    for (let i = 0; i < p; i++) {
      const cpl = addUp(mulUp(dmag[4 * i + 2 * k + l]!, U[l]![i]!), G[k]![i]!);
      if (back[k]) {
        const rhs = mulUp(addUp(U[k]![(i + 1) % p]!, cpl), invMig[2 * i + k]!);
        if (!(rhs <= U[k]![i]!)) return null;
      } else {
        const rhs = addUp(mulUp(dmag[4 * i + 3 * k]!, U[k]![i]!), cpl);
        if (!(rhs <= U[k]![(i + 1) % p]!)) return null;
      }
    }
  }
  const image: T[] = new Array<T>(2 * p);
  for (let i = 0; i < p; i++) {
    for (let row = 0; row < 2; row++) {
      const rad = addUp(mulUp(pabs[4 * i + 2 * row]!, U[0]![i]!), mulUp(pabs[4 * i + 2 * row + 1]!, U[1]![i]!));
      if (!(rad < Infinity)) return null;
      image[2 * i + row] = a.inflate(plan.y0[2 * i + row]!, rad);
    }
  }
  return image;
}
