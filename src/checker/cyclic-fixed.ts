/**
 * The structured Krawczyk test for dimension 1 (cyclic.ts, whose header states and argues the
 * bound) carried out in binary fixed point (fixed.ts, formula-fixed.ts): the same theorem and the
 * same recursions, only the arithmetic differs (issue 8 item 1).
 *
 * Choices the bound leaves free, made here exactly in fixed point: ã_i = the fixed-point midpoint
 * of the enclosure of f'(M_i) (any nonzero numbers are valid), z̃ from the float recursion of
 * cyclic.ts rounded down to fixed point (any vector is valid). Rigorous parts, each an enclosure
 * or a directed bound: F(M) and f'(X) by the fixed-point evaluator; |ã_i| exact, 1/|ã_i| by
 * `divUp`; the closure factor β (or γ) as a product rounded up and required < 1; 1 − β rounded
 * down (exact subtraction of an upper bound); g_i ≥ |R_i| by interval arithmetic; the two passes
 * of the recursion with products and quotients rounded up; K's ends compared strictly with the
 * box ends rounded inward.
 * Outcome: ok (with the fixed-point derivatives for stability-fixed.ts and the decimal
 * evaluator's derivatives made only if read), or null: then the decimal path of cyclic.ts runs
 * and its outcome and reason are final (also after FixedRange or a domain violation here).
 */
import { FixCtx, FixedRange, fixedPaths, fracBitsFor, type Fx } from './fixed.js';
import { FixedEvaluator } from './formula-fixed.js';
import { DomainViolation, type Iv } from './interval.js';
import { image, type KrawczykOutcome, type Shooting } from './krawczyk.js';
import { prepareCyclic, type BoxTest1 } from './cyclic.js';

interface Centre1 {
  k: FixCtx;
  ev: FixedEvaluator;
  M: Fx[];
  at: Fx[];
  e0: Fx[];
  y0: Fx[];
  absUp: bigint[];
  invUp: bigint[];
  den: bigint;
  back: boolean;
}

function centre1(s: Shooting, M: readonly Iv[]): Centre1 | null {
  const { c, p } = s;
  let finest = 0;
  for (const m of M) if (!m.lo.isZero()) finest = Math.min(finest, m.lo.e);
  const k = new FixCtx(fracBitsFor(c.digits, finest));
  const ev = new FixedEvaluator(k, c, s.ev.params, 1);
  const Mx = M.map((m) => k.fromIv(m));
  const Fm: Fx[] = new Array(p);
  const at: bigint[] = new Array(p);
  const atF = new Float64Array(p);
  let sumLog = 0;
  for (let i = 0; i < p; i++) {
    const { f, jac } = ev.image(s.step, [Mx[i]!], true);
    Fm[i] = k.sub(Mx[(i + 1) % p]!, f[0]!);
    at[i] = k.mid(jac![0]!);
    if (at[i] === 0n) return null;
    atF[i] = k.toFloat(at[i]!);
    sumLog += Math.log2(Math.abs(atF[i]!));
  }
  if (!(Math.abs(sumLog) > 1e-9) || !Number.isFinite(sumLog)) return null;
  const back = sumLog > 0;
  const absUp = at.map((a) => (a < 0n ? -a : a));
  const invUp = back ? absUp.map((a) => k.divUp(k.one, a)) : [];
  let closure = k.one;
  for (let i = 0; i < p; i++) closure = k.mulUp(closure, back ? invUp[i]! : absUp[i]!);
  const den = k.one - closure;
  if (den <= 0n) return null;
  // @heuristic z̃ ≈ −B^{-1}·F(M) by the recursion of cyclic.ts in floats (any z̃ is valid)
  const mid = Fm.map((f) => -k.toFloat(k.mid(f)));
  const zt = new Float64Array(p);
  let z = 0;
  let prod = 1;
  if (back) {
    for (let i = p - 1; i >= 0; i--) {
      z = (z - mid[i]!) / atF[i]!;
      prod /= atF[i]!;
    }
    z /= 1 - prod;
    for (let i = p - 1; i >= 0; i--) zt[i] = z = (z - mid[i]!) / atF[i]!;
  } else {
    for (let i = 0; i < p; i++) {
      z = atF[i]! * z + mid[i]!;
      prod *= atF[i]!;
    }
    z /= 1 - prod;
    for (let i = 0; i < p; i++) {
      zt[i] = z;
      z = atF[i]! * z + mid[i]!;
    }
  }
  const finite = zt.every((v) => Number.isFinite(v));
  const ztx = Array.from(zt, (v) => k.point(finite ? k.fromFloat(v, false) : 0n));
  const atx = at.map((a) => k.point(a));
  const e0: Fx[] = new Array(p);
  const y0: Fx[] = new Array(p);
  for (let i = 0; i < p; i++) {
    // e0 = −F(M) − (B z̃), (B z̃)_i = z̃_{i+1} − ã_i z̃_i
    e0[i] = k.sub(k.neg(Fm[i]!), k.sub(ztx[(i + 1) % p]!, k.mul(atx[i]!, ztx[i]!)));
    y0[i] = k.add(Mx[i]!, ztx[i]!);
  }
  return { k, ev, M: Mx, at: atx, e0, y0, absUp, invUp, den, back };
}

function boxTest1(fx: Centre1, s: Shooting, X: readonly Iv[], inner: readonly Iv[]): KrawczykOutcome | null {
  const { k, back } = fx;
  const p = s.p;
  const Df: Fx[][] = new Array(p);
  const g: bigint[] = new Array(p);
  for (let i = 0; i < p; i++) {
    const x = k.fromIv(X[i]!);
    const d = fx.ev.image(s.step, [x], true).jac!;
    Df[i] = d;
    g[i] = k.mag(k.add(fx.e0[i]!, k.mul(k.sub(d[0]!, fx.at[i]!), k.sub(x, fx.M[i]!))));
  }
  const u: bigint[] = new Array(p);
  let t = 0n;
  if (back) {
    for (let i = p - 1; i >= 0; i--) t = k.mulUp(t + g[i]!, fx.invUp[i]!);
    t = k.divUp(t, fx.den);
    for (let i = p - 1; i >= 0; i--) u[i] = t = k.mulUp(t + g[i]!, fx.invUp[i]!);
  } else {
    for (let i = 0; i < p; i++) t = k.mulUp(fx.absUp[i]!, t) + g[i]!;
    t = k.divUp(t, fx.den);
    for (let i = 0; i < p; i++) {
      u[i] = t;
      t = k.mulUp(fx.absUp[i]!, t) + g[i]!;
    }
  }
  for (let i = 0; i < p; i++) {
    const y = fx.y0[i]!;
    const box = inner[i]!;
    if (!(y.lo - u[i]! > k.fromDecimal(box.lo, true) && y.hi + u[i]! < k.fromDecimal(box.hi, false))) return null;
  }
  let D: Iv[][] | undefined;
  const out = { ok: true as const, fixedJacobians: { k, D: Df } } as KrawczykOutcome & { jacobians: Iv[][] };
  Object.defineProperty(out, 'jacobians', { enumerable: true, get: () => (D ??= X.map((x, i) => image(s, [x], true, i).jac!)) });
  return out;
}

/** The fixed-point test alone (prepared lazily): ok, or null for "not shown here". */
export function prepareCyclicFixed(s: Shooting, M: readonly Iv[]): (X: readonly Iv[], inner: readonly Iv[]) => KrawczykOutcome | null {
  let fx: Centre1 | null | undefined;
  return (X, inner) => {
    if (s.flow) return null; // a map from a flow: s.step is the vector field, not the map (decimal path only)
    try {
      if (fx === undefined) fx = centre1(s, M);
      return fx === null ? null : boxTest1(fx, s, X, inner);
    } catch (e) {
      if (e instanceof FixedRange || e instanceof DomainViolation) return null;
      throw e;
    }
  };
}

/**
 * Dimension 1, structured bound: the fixed-point path first, then (only when it did not show the
 * inclusion) the decimal path of cyclic.ts, whose outcome and reason are final.
 */
export function prepareCyclicFast(s: Shooting, M: readonly Iv[]): BoxTest1 {
  const fixed = prepareCyclicFixed(s, M);
  let decimal: BoxTest1 | undefined;
  return (X, inner, label) => {
    const out = fixedPaths.enabled ? fixed(X, inner) : null;
    if (out) return out;
    decimal ??= prepareCyclic(s, M);
    return decimal(X, inner, label);
  };
}
