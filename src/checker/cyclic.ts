/**
 * The checker's structured Krawczyk test for dimension 1 (period p, no dense matrix): O(p)
 * decimal interval operations and O(p) memory. Written independently of the prover (decimal.js,
 * directed rounding through the checker's own IvCtx).
 *
 * Mathematics (every bound argued here; Krawczyk 1969 for the theorem, from memory):
 * F_i(x) = x_{i+1} − f(x_i) (indices mod p). Pick ANY decimals ã_i (here ≈ f'(M_i), rounded to
 * 20 digits; heuristic) and let B be the exact cyclic bidiagonal matrix with −ã_i on the diagonal
 * and 1 on the cyclic superdiagonal. If B is invertible, C := B^{-1} is a valid Krawczyk
 * preconditioner (never formed). Since B − J(X) is diagonal with entries D_i − ã_i (D_i ⊇ f'(X_i);
 * the unit superdiagonals cancel), I − C·J(X) = C·(B − J(X)) and
 *   K(X) = M − C·F(M) + (I − C·J(X))(X − M) ⊆ M + C·W,  W_i = −F_i(M) + (D_i − ã_i)(X_i − M_i).
 * For any decimals z̃ (≈ −C·F(M), heuristic): C·w = z̃ + C·(w − B z̃), so K(X) ⊆ M + z̃ + C·R with
 * R_i = W_i − (z̃_{i+1} − ã_i z̃_i) (interval arithmetic). δ = C·r solves δ_{i+1} = ã_i δ_i + r_i;
 * with g_i ≥ |R_i| (rounded up):
 *  - expanding form: |δ_i| ≤ (|δ_{i+1}| + g_i)/|ã_i|; from i = p−1 down to 0 with |δ_p| = |δ_0|:
 *    |δ_0| ≤ α + β|δ_0|, β = Π 1/|ã_i|. If an upper bound of β is < 1: |δ_0| ≤ α/(1 − β), and the
 *    same recursion started there bounds every |δ_i|. β < 1 also shows |Π ã_i| > 1, so B is
 *    invertible (det B = ±(Π ã_i − 1)).
 *  - contracting form: |δ_{i+1}| ≤ |ã_i||δ_i| + g_i forward, closure γ = Π|ã_i| < 1, likewise.
 * All magnitude arithmetic rounds up (the Up context), the closure denominator 1 − β down. Then
 * K(X)_i ⊆ M_i + z̃_i + [−u_i, u_i], and K(X) ⊂ int X proves exactly one zero in X.
 */
import { Decimal } from 'decimal.js';
import { DomainViolation, fmt, isInterior, type Iv } from './interval.js';
import { image, type KrawczykOutcome, type Shooting } from './krawczyk.js';

const Approx: Decimal.Constructor = Decimal.clone({ precision: 20, rounding: Decimal.ROUND_HALF_EVEN, minE: -9e15, maxE: 9e15 });

/** @heuristic log2 |x| of a decimal (any exponent), NaN for 0. */
function log2Abs(x: Decimal): number {
  if (x.isZero()) return NaN;
  const m = Number(x.abs().toSD(15).toExponential().split('e')[0]);
  return Math.log2(m) + x.e * Math.log2(10);
}

/** A Krawczyk test of a box X ⊇ inner around the prepared centre. */
export type BoxTest1 = (X: readonly Iv[], inner: readonly Iv[], label: string) => KrawczykOutcome;

/**
 * K(X) ⊂ int(inner)? for n = 1 with the cyclic preconditioner. `M` encloses the centre, X ⊇ inner.
 * Domain violations propagate as DomainViolation. Returns the Jacobians over X for stability.
 */
export function krawczykCyclic(s: Shooting, M: readonly Iv[], X: readonly Iv[], inner: readonly Iv[], label: string): KrawczykOutcome {
  return prepareCyclic(s, M)(X, inner, label);
}

/** The centre part (F(M), ã, closure factor, z̃, e0 = −F(M) − B·z̃) once; the test per box. */
export function prepareCyclic(s: Shooting, M: readonly Iv[]): BoxTest1 {
  const { c, p } = s;
  // upward products/quotients that refuse an underflow to 0 (it would round an upper bound down)
  const mulU = (x: Decimal, y: Decimal): Decimal => {
    const r = c.Up.mul(x, y);
    if (!r.isFinite() || (r.isZero() && !x.isZero() && !y.isZero())) throw new DomainViolation('overflow or underflow in the cyclic bound');
    return r;
  };
  const divU = (x: Decimal, y: Decimal): Decimal => {
    const r = c.Up.div(x, y);
    if (!r.isFinite() || (r.isZero() && !x.isZero())) throw new DomainViolation('overflow or underflow in the cyclic bound');
    return r;
  };
  const failing = (why: string): BoxTest1 => (_X, _inner, label) => ({ ok: false, reason: `${label}: ${why}` });
  const Fm: Iv[] = new Array(p);
  const at: Decimal[] = new Array(p);
  let sumLog = 0;
  for (let i = 0; i < p; i++) {
    const { f, jac } = image(s, [M[i]!], true, i);
    Fm[i] = c.sub(M[(i + 1) % p]!, f[0]!);
    const a = new Approx(c.midpoint(jac![0]!));
    at[i] = a;
    sumLog += log2Abs(a);
  }
  if (!(Math.abs(sumLog) > 1e-9)) return failing('the cyclic Krawczyk bound has no contracting direction (|product of derivatives| ≈ 1 or a zero derivative)');
  const back = sumLog > 0;
  const absUp: Decimal[] = new Array(p);
  const invUp: Decimal[] = new Array(p);
  let closure = new c.Up('1');
  for (let i = 0; i < p; i++) {
    absUp[i] = at[i]!.abs();
    if (back) {
      if (at[i]!.isZero()) return failing(`zero derivative estimate at point ${i}`);
      invUp[i] = divU(new c.Up('1'), absUp[i]!);
      closure = mulU(closure, invUp[i]!);
    } else closure = mulU(closure, absUp[i]!);
  }
  if (!closure.lt(1)) return failing(`the cyclic closure factor ${closure.toSD(6).toString()} is not < 1`);
  const den = c.Down.sub(1, closure);
  if (!den.gt(0)) return failing('the cyclic closure factor is too close to 1');
  // @heuristic z̃ ≈ −B^{-1}·F(M) by the same recursion in round-to-nearest (any z̃ is valid)
  const mid: Decimal[] = Fm.map((f) => new Approx(c.midpoint(f)).neg());
  const zt: Decimal[] = new Array(p);
  let z: Decimal = new Approx('0');
  let prod: Decimal = new Approx('1');
  if (back) {
    for (let i = p - 1; i >= 0; i--) {
      z = z.sub(mid[i]!).div(at[i]!);
      prod = prod.div(at[i]!);
    }
    z = z.div(new Approx('1').sub(prod));
    for (let i = p - 1; i >= 0; i--) zt[i] = z = z.sub(mid[i]!).div(at[i]!);
  } else {
    for (let i = 0; i < p; i++) {
      z = at[i]!.mul(z).add(mid[i]!);
      prod = prod.mul(at[i]!);
    }
    z = z.div(new Approx('1').sub(prod));
    for (let i = 0; i < p; i++) {
      zt[i] = z;
      z = at[i]!.mul(z).add(mid[i]!);
    }
  }
  if (!zt.every((v) => v.isFinite())) zt.fill(new Approx('0'));
  const e0: Iv[] = new Array(p);
  const y0: Iv[] = new Array(p);
  for (let i = 0; i < p; i++) {
    const bz = c.sub(c.point(zt[(i + 1) % p]!), c.scale(at[i]!, c.point(zt[i]!)));
    e0[i] = c.sub(c.neg(Fm[i]!), bz);
    y0[i] = c.add(M[i]!, c.point(zt[i]!));
  }
  const atIv = at.map((a) => c.point(a));
  return (X: readonly Iv[], inner: readonly Iv[], label: string): KrawczykOutcome => {
    const D: Iv[][] = new Array(p);
    const g: Decimal[] = new Array(p);
    for (let i = 0; i < p; i++) {
      D[i] = image(s, [X[i]!], true, i).jac!;
      g[i] = c.mag(c.add(e0[i]!, c.mul(c.sub(D[i]![0]!, atIv[i]!), c.sub(X[i]!, M[i]!))));
    }
    const u: Decimal[] = new Array(p);
    let t = new c.Up('0');
    if (back) {
      for (let i = p - 1; i >= 0; i--) t = mulU(c.Up.add(t, g[i]!), invUp[i]!);
      t = divU(t, den);
      for (let i = p - 1; i >= 0; i--) u[i] = t = mulU(c.Up.add(t, g[i]!), invUp[i]!);
    } else {
      for (let i = 0; i < p; i++) t = c.Up.add(mulU(absUp[i]!, t), g[i]!);
      t = divU(t, den);
      for (let i = 0; i < p; i++) {
        u[i] = t;
        t = c.Up.add(mulU(absUp[i]!, t), g[i]!);
      }
    }
    for (let i = 0; i < p; i++) {
      const k = c.add(y0[i]!, c.sym(u[i]!));
      const box = inner[i]!;
      if (!isInterior(k, box)) {
        const over = c.Up.max(c.Up.sub(box.lo, k.lo), c.Up.sub(k.hi, box.hi));
        return { ok: false, reason: `${label}: K(X) not inside the interior of the box at point ${i}, component 0: K = ${fmt(k, 20)}, box = ${fmt(box, 20)}, exceeds by ${over.toSD(3).toString()} (cyclic bound)` };
      }
    }
    return { ok: true, jacobians: D };
  };
}
