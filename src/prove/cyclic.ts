/**
 * The structured (cyclic) Krawczyk test for the shooting system of a map of dimension n = 1, in
 * O(p) time and memory — no dense N×N matrix is ever formed.
 *
 * Shooting system: F_i(x) = x_{(i+1) mod p} − f(x_i), Jacobian J(x): −f'(x_i) on the diagonal and
 * 1 on the cyclic superdiagonal.
 *
 * Preconditioner. Let ã_0..ã_{p−1} be ANY doubles (we take ã_i ≈ f'(m_i)) and B the exact real
 * cyclic bidiagonal matrix with −ã_i on the diagonal and 1 on the cyclic superdiagonal. When
 * B is invertible we take C := B^{-1} (an exact real matrix, never formed). Krawczyk's operator is
 *   K(X) = m − C·F(m) + (I − C·J(X))·(X − m),
 * and I − C·J(X) = C·(B − J(X)), where B − J(X) is DIAGONAL with entries A_i(X) − ã_i
 * (A_i(X) ⊇ f'(X_i); the unit superdiagonals cancel). Hence, for every real J ∈ J(X), d ∈ X − m:
 *   K ∈ m + C·w,   w_i = −F_i(m) + (A_i(X) − ã_i)·(X_i − m_i)   (an interval vector W).
 * For any double vector z̃ (we take z̃ ≈ −B^{-1}F(m), heuristic), C·w = z̃ + C·(w − B·z̃), so
 *   K(X) ⊆ m + z̃ + C·R,   R_i = W_i − (z̃_{i+1} − ã_i·z̃_i)   (interval arithmetic, rigorous).
 * Bound on C·R: δ = C·r (r ∈ R) is the solution of δ_{i+1} = ã_i·δ_i + r_i (indices mod p).
 * With g_i ≥ |R_i| (rounded up):
 *  - expanding form (used when Π|ã_i| > 1): |δ_i| ≤ (|δ_{i+1}| + g_i)/|ã_i|. Running this
 *    recursion from i = p−1 down to 0 with a start value t for |δ_p| = |δ_0| gives an affine,
 *    increasing function u_0(t) = α + β·t with β = Π 1/|ã_i|. So |δ_0| ≤ α + β·|δ_0|; when the
 *    computed upper bound of β is < 1 this gives |δ_0| ≤ t* := α/(1 − β), and running the
 *    recursion again from t* bounds every |δ_i| (Krawczyk's form of the cyclic "closure").
 *    β < 1 also proves |Π ã_i| > 1, i.e. B invertible (det B = ±(Π ã_i − 1)).
 *  - contracting form (Π|ã_i| < 1): |δ_{i+1}| ≤ |ã_i|·|δ_i| + g_i, forward from i = 0, same
 *    closure with γ = Π|ã_i| < 1.
 * Every float operation of the bound rounds upward (round.ts `addUp`, `mulUp`, `divUp`), so u is
 * an upper bound of |δ|, and K(X)_i ⊆ (m_i + z̃_i) ± u_i (interval `inflate`, outward).
 * Krawczyk's theorem (any real C; Krawczyk 1969, from memory) then gives: K(X) ⊂ int X ⇒ exactly
 * one zero of F in X. When neither closure factor is certainly < 1 (|Π ã_i| ≈ 1: a fold/flip, or
 * a bad ã) the bound is reported as not established and the caller falls back or says undecided.
 *
 * Tightness: compared with the dense magnitude bound |C|·|R| this is exact up to the sign
 * cancellations inside the cyclic closure (factor ≤ 1/(1 − β) vs 1/|1 ∓ β|), which matter only
 * when |Π ã_i| is close to 1.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { addUp, divUp, mulUp, subDown } from '../interval/round.js';

/** A prepared cyclic Krawczyk test (n = 1) at a fixed centre m. */
export interface CyclicPlan<T> {
  /** The diagonal ã as doubles and as point elements of T. */
  readonly at: readonly T[];
  /** |ã_i| (exact doubles) and 1/|ã_i| rounded up. */
  readonly absA: Float64Array;
  readonly invAbsUp: Float64Array;
  /** 'back' = expanding form, 'forward' = contracting form. */
  readonly direction: 'back' | 'forward';
  /** Upper bound of the closure factor (β or γ), < 1. */
  readonly closure: number;
  /** m + z̃ (T), and e0 = −F(m) − B·z̃ (T). */
  readonly y0: readonly T[];
  readonly e0: readonly T[];
}

/** @heuristic the direction in which the cyclic recursion contracts, from Σ log|ã_i|. */
function directionOf(at: Float64Array): 'back' | 'forward' | null {
  let s = 0;
  for (let i = 0; i < at.length; i++) s += Math.log2(Math.abs(at[i]!));
  if (Number.isNaN(s)) return null;
  if (s > 1e-9) return 'back';
  if (s < -1e-9) return 'forward';
  return null;
}

/** @heuristic float solve of B·z = c (cyclic recursion in the contracting direction). */
export function cyclicSolveFloat(at: Float64Array, c: Float64Array, direction: 'back' | 'forward', out: Float64Array): boolean {
  const p = at.length;
  if (direction === 'back') {
    // z_i = (z_{i+1} − c_i)/ã_i ; z_p = z_0 = α/(1 − β), β = Π 1/ã_i (signed).
    let z = 0;
    let beta = 1;
    for (let i = p - 1; i >= 0; i--) {
      z = (z - c[i]!) / at[i]!;
      beta /= at[i]!;
    }
    z = z / (1 - beta);
    for (let i = p - 1; i >= 0; i--) {
      z = (z - c[i]!) / at[i]!;
      out[i] = z;
    }
  } else {
    let z = 0;
    let gamma = 1;
    for (let i = 0; i < p; i++) {
      z = at[i]! * z + c[i]!;
      gamma *= at[i]!;
    }
    z = z / (1 - gamma);
    for (let i = 0; i < p; i++) {
      out[i] = z;
      z = at[i]! * z + c[i]!;
    }
  }
  for (let i = 0; i < p; i++) if (!Number.isFinite(out[i]!)) return false;
  return true;
}

/**
 * Prepare the cyclic test at centre m (enclosures, length p) with F(m) enclosed in `Fm` and the
 * doubles ã. Null when no contracting direction is established (|Π ã| ≈ 1, zeros, overflow).
 */
export function prepareCyclic<T>(a: IntervalArithmetic<T>, m: readonly T[], Fm: readonly T[], atF: Float64Array): CyclicPlan<T> | null {
  const p = atF.length;
  const direction = directionOf(atF);
  if (direction === null) return null;
  const absA = new Float64Array(p);
  const invAbsUp = new Float64Array(p);
  let closure = 1;
  for (let i = 0; i < p; i++) {
    const v = Math.abs(atF[i]!);
    absA[i] = v;
    if (direction === 'back') {
      if (!(v > 0)) return null;
      invAbsUp[i] = divUp(1, v);
      closure = mulUp(closure, invAbsUp[i]!);
    } else {
      closure = mulUp(closure, v);
    }
  }
  if (!(closure < 1)) return null;
  const c = new Float64Array(p);
  for (let i = 0; i < p; i++) c[i] = -a.midNumber(Fm[i]!);
  const z = new Float64Array(p);
  if (!cyclicSolveFloat(atF, c, direction, z)) z.fill(0);
  const at: T[] = new Array<T>(p);
  const zT: T[] = new Array<T>(p);
  for (let i = 0; i < p; i++) {
    at[i] = a.fromNumber(atF[i]!);
    zT[i] = a.fromNumber(z[i]!);
  }
  const y0: T[] = new Array<T>(p);
  const e0: T[] = new Array<T>(p);
  for (let i = 0; i < p; i++) {
    y0[i] = a.add(m[i]!, zT[i]!);
    const bz = a.sub(zT[(i + 1) % p]!, a.mul(at[i]!, zT[i]!));
    e0[i] = a.sub(a.neg(Fm[i]!), bz);
  }
  return { at, absA, invAbsUp, direction, closure, y0, e0 };
}

/**
 * Upper bounds u_i ≥ |δ_i| for every solution of δ_{i+1} = ã_i δ_i + r_i with |r_i| ≤ g_i
 * (see the module comment), written into `u`. False when a bound overflowed.
 */
export function cyclicMagnitudeBound(plan: Pick<CyclicPlan<unknown>, 'absA' | 'invAbsUp' | 'direction' | 'closure'>, g: Float64Array, u: Float64Array): boolean {
  const { absA, invAbsUp, direction, closure } = plan;
  const p = g.length;
  let t = 0;
  if (direction === 'back') {
    for (let i = p - 1; i >= 0; i--) t = mulUp(addUp(t, g[i]!), invAbsUp[i]!);
    t = divUp(t, subDown(1, closure));
    for (let i = p - 1; i >= 0; i--) {
      t = mulUp(addUp(t, g[i]!), invAbsUp[i]!);
      u[i] = t;
    }
  } else {
    for (let i = 0; i < p; i++) t = addUp(mulUp(absA[i]!, t), g[i]!);
    t = divUp(t, subDown(1, closure));
    for (let i = 0; i < p; i++) {
      u[i] = t;
      t = addUp(mulUp(absA[i]!, t), g[i]!);
    }
  }
  for (let i = 0; i < p; i++) if (!(u[i]! < Infinity)) return false;
  return true;
}

/**
 * K(X) enclosure of the cyclic plan for the box X with Jacobian enclosures A_i(X) (`blocks`) and
 * d = X − m; returns the image, or null when the bound overflowed.
 */
export function cyclicImage<T>(a: IntervalArithmetic<T>, plan: CyclicPlan<T>, blocks: readonly T[], d: readonly T[]): T[] | null {
  const p = plan.at.length;
  const g = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    const r = a.add(plan.e0[i]!, a.mul(a.sub(blocks[i]!, plan.at[i]!), d[i]!));
    g[i] = a.magUp(r);
  }
  const u = new Float64Array(p);
  if (!cyclicMagnitudeBound(plan, g, u)) return null;
  const image: T[] = new Array<T>(p);
  for (let i = 0; i < p; i++) image[i] = a.inflate(plan.y0[i]!, u[i]!);
  return image;
}
