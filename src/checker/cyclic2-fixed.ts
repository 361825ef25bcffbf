/**
 * The structured Krawczyk test for dimension 2 (cyclic2.ts, whose header states and argues the
 * bound) carried out in binary fixed point (fixed.ts) instead of decimal.js: the same theorem,
 * the same inequalities, only the arithmetic differs. Issue 8 item 1: the decimal path spent its
 * time creating decimal objects; here every interval operation is one or two BigInt operations.
 *
 * Every choice the bound leaves free is made here in fixed point, which keeps each of them exact:
 *  - Ã_i: the fixed-point midpoints of the decimal enclosures of Df(M_i) (any matrix is valid);
 *  - P_i: the float directions of cyclic2.ts rounded down to fixed point (any invertible exact
 *    matrix is valid); P_i^{-1} = adj(P_i)·(1/det P_i) enclosed with `recip`;
 *  - z̃_i = P_i ỹ_i rounded down to fixed point (any vector is valid);
 *  - ū from the float sweeps of cyclic2.ts, rounded up to fixed point; only the fixed-point check
 *    T ū + G ≤ ū (every product and quotient rounded up, all terms ≥ 0) counts.
 * The rigorous quantities are enclosures of their exact values: F(M) = M_{i+1} − f(M_i) from the
 * decimal formula evaluator's enclosure (outward to fixed point), E_i = P_{i+1}^{-1} Ã_i P_i by
 * interval products, mag E_kl rounded up, 1/mig E_kk by `divUp`, G_{k,i} ≥ |h_{k,i}| + 2^−F > 0,
 * and the final interior test compares K's ends with the box ends rounded inward (ceil of the
 * lower end, floor of the upper end), strictly.
 * Outcome: VERIFIED-grade "ok" only when every inequality holds; otherwise null, and the caller
 * runs the decimal path (cyclic2.ts), whose verdict and wording then stand. A fixed-point range
 * problem (FixedRange) or a domain violation also hands over to the decimal path, which meets the
 * same domain violation (the same formula evaluations) or decides otherwise.
 */
import { FixCtx, FixedRange, fixedPaths, fracBitsFor, type Fx } from './fixed.js';
import { DomainViolation, type Iv } from './interval.js';
import { image, type KrawczykOutcome, type Shooting } from './krawczyk.js';
import { FixedEvaluator } from './formula-fixed.js';
import { directions, prepareCyclic2, signedSolve, sweepBound, type BoxTest } from './cyclic2.js';

/** The box part: ok with the Jacobians over X, or null (not shown here). */
type FixedTest = (X: readonly Iv[], inner: readonly Iv[]) => KrawczykOutcome | null;

interface Centre {
  k: FixCtx;
  ev: FixedEvaluator;
  M: Fx[];
  e0: Fx[];
  y0: Fx[];
  At: Fx[];
  Pinv: Fx[][];
  Pabs: bigint[];
  Emag: bigint[];
  invMig: bigint[];
  magF: Float64Array;
  invMigF: Float64Array;
  back: boolean[];
}

/** The centre part in fixed point, or null when the bound has no contracting form here. */
function centre(s: Shooting, M: readonly Iv[]): Centre | null {
  const { c, p } = s;
  let finest = 0;
  for (const m of M) if (!m.lo.isZero()) finest = Math.min(finest, m.lo.e);
  const k = new FixCtx(fracBitsFor(c.digits, finest));
  const ev = new FixedEvaluator(k, c, s.ev.params, 2);
  const Mx = M.map((m) => k.fromIv(m));
  const Fm: Fx[] = new Array(2 * p);
  const At: Fx[] = new Array(4 * p);
  const Af = new Float64Array(4 * p);
  for (let i = 0; i < p; i++) {
    const { f, jac } = ev.image(s.step, [Mx[2 * i]!, Mx[2 * i + 1]!], true);
    const nx = ((i + 1) % p) * 2;
    for (let r = 0; r < 2; r++) Fm[2 * i + r] = k.sub(Mx[nx + r]!, f[r]!);
    for (let q = 0; q < 4; q++) {
      const a = k.mid(jac![q]!);
      At[4 * i + q] = k.point(a);
      Af[4 * i + q] = k.toFloat(a);
    }
  }
  const { v, w } = directions(Af, p);
  const P: Fx[][] = new Array(p);
  const Pinv: Fx[][] = new Array(p);
  const Pabs: bigint[] = new Array(4 * p);
  for (let i = 0; i < p; i++) {
    const q = [v[2 * i]!, w[2 * i]!, v[2 * i + 1]!, w[2 * i + 1]!].map((t) => k.point(k.fromFloat(t, false)));
    P[i] = q;
    for (let t = 0; t < 4; t++) Pabs[4 * i + t] = k.mag(q[t]!);
    const det = k.sub(k.mul(q[0]!, q[3]!), k.mul(q[1]!, q[2]!));
    if (det.lo <= 0n && det.hi >= 0n) return null;
    const inv = k.recip(det);
    Pinv[i] = [k.mul(q[3]!, inv), k.neg(k.mul(q[1]!, inv)), k.neg(k.mul(q[2]!, inv)), k.mul(q[0]!, inv)];
  }
  const mat = (a: readonly Fx[], b: readonly Fx[]): Fx[] => [
    k.add(k.mul(a[0]!, b[0]!), k.mul(a[1]!, b[2]!)),
    k.add(k.mul(a[0]!, b[1]!), k.mul(a[1]!, b[3]!)),
    k.add(k.mul(a[2]!, b[0]!), k.mul(a[3]!, b[2]!)),
    k.add(k.mul(a[2]!, b[1]!), k.mul(a[3]!, b[3]!)),
  ];
  const Emag: bigint[] = new Array(4 * p);
  const invMig: bigint[] = new Array(2 * p);
  const Emid = new Float64Array(4 * p);
  const logs = [0, 0];
  for (let i = 0; i < p; i++) {
    const E = mat(Pinv[(i + 1) % p]!, mat(At.slice(4 * i, 4 * i + 4), P[i]!));
    for (let q = 0; q < 4; q++) {
      Emag[4 * i + q] = k.mag(E[q]!);
      Emid[4 * i + q] = k.toFloat(k.mid(E[q]!));
    }
    for (let t = 0; t < 2; t++) {
      const mig = k.mig(E[3 * t]!);
      if (mig === 0n) return null;
      invMig[2 * i + t] = k.divUp(k.one, mig);
      logs[t]! += Math.log2(Math.abs(Emid[4 * i + 3 * t]!));
    }
  }
  const back = [logs[0]! > 0, logs[1]! > 0];
  // @heuristic z̃ ≈ −C·F(M) (cyclic2.ts), then rounded to fixed point (any z̃ is valid)
  const hF = new Float64Array(2 * p);
  for (let i = 0; i < p; i++) {
    const q = Pinv[(i + 1) % p]!;
    const f0 = -k.toFloat(k.mid(Fm[2 * i]!));
    const f1 = -k.toFloat(k.mid(Fm[2 * i + 1]!));
    for (let t = 0; t < 2; t++) hF[2 * i + t] = k.toFloat(k.mid(q[2 * t]!)) * f0 + k.toFloat(k.mid(q[2 * t + 1]!)) * f1;
  }
  const yt = signedSolve(hF, Emid, back, p);
  const zt: Fx[] = new Array(2 * p);
  for (let i = 0; i < p; i++) {
    for (let r = 0; r < 2; r++) {
      const z = v[2 * i + r]! * yt[2 * i]! + w[2 * i + r]! * yt[2 * i + 1]!;
      zt[2 * i + r] = k.point(Number.isFinite(z) ? k.fromFloat(z, false) : 0n);
    }
  }
  const e0: Fx[] = new Array(2 * p);
  const y0: Fx[] = new Array(2 * p);
  for (let i = 0; i < p; i++) {
    const nx = ((i + 1) % p) * 2;
    for (let row = 0; row < 2; row++) {
      // e0 = −F(M) − (B z̃): (B z̃)_i = z̃_{i+1} − Ã_i z̃_i
      const az = k.add(k.mul(At[4 * i + 2 * row]!, zt[2 * i]!), k.mul(At[4 * i + 2 * row + 1]!, zt[2 * i + 1]!));
      e0[2 * i + row] = k.sub(k.neg(Fm[2 * i + row]!), k.sub(zt[nx + row]!, az));
      y0[2 * i + row] = k.add(Mx[2 * i + row]!, zt[2 * i + row]!);
    }
  }
  const magF = Float64Array.from(Emag, (e) => k.toFloat(e));
  const invMigF = Float64Array.from(invMig, (e) => k.toFloat(e));
  return { k, ev, M: Mx, e0, y0, At, Pinv, Pabs, Emag, invMig, magF, invMigF, back };
}

/** The box part of the bound in fixed point (see the header and cyclic2.ts). */
function boxTest(fx: Centre, s: Shooting, X: readonly Iv[], inner: readonly Iv[]): KrawczykOutcome | null {
  const { k } = fx;
  const p = s.p;
  const Df: Fx[][] = new Array(p);
  const G: bigint[] = new Array(2 * p);
  let gMax = 0n;
  for (let i = 0; i < p; i++) {
    const x0 = k.fromIv(X[2 * i]!);
    const x1 = k.fromIv(X[2 * i + 1]!);
    const jac = fx.ev.image(s.step, [x0, x1], true).jac!;
    Df[i] = jac;
    const z0 = k.sub(x0, fx.M[2 * i]!);
    const z1 = k.sub(x1, fx.M[2 * i + 1]!);
    // R_i = e0_i + (D_i(X) − Ã_i)(X_i − M_i), h_i = P_{i+1}^{-1} R_i, G ≥ |h| + 2^−F
    const r: Fx[] = [];
    for (let row = 0; row < 2; row++) {
      let acc = fx.e0[2 * i + row]!;
      acc = k.add(acc, k.mul(k.sub(jac[2 * row]!, fx.At[4 * i + 2 * row]!), z0));
      acc = k.add(acc, k.mul(k.sub(jac[2 * row + 1]!, fx.At[4 * i + 2 * row + 1]!), z1));
      r.push(acc);
    }
    const q = fx.Pinv[(i + 1) % p]!;
    for (let t = 0; t < 2; t++) {
      const g = k.mag(k.add(k.mul(q[2 * t]!, r[0]!), k.mul(q[2 * t + 1]!, r[1]!))) + 1n;
      G[2 * i + t] = g;
      if (g > gMax) gMax = g;
    }
  }
  // @heuristic ū by the float sweeps on G·2^−sh (sh keeps the floats below 2^62; linear in G)
  const sh = BigInt(Math.max(0, gMax.toString(16).length * 4 - 62));
  const Gf = Float64Array.from(G, (g) => Number(g >> sh) + 1e-300);
  const U = sweepBound(Gf, fx.magF, fx.invMigF, fx.back, p);
  if (typeof U === 'string' || !U.every((t) => t > 0 && t < Infinity)) return null;
  const Ud = Array.from(U, (t) => (BigInt(Math.ceil(t * (1 + 2 ** -20))) + 1n) << sh);
  // rigorous: T ū + G ≤ ū, every product and quotient rounded up (all terms ≥ 0)
  for (let t = 0; t < 2; t++) {
    const l = 1 - t;
    for (let i = 0; i < p; i++) {
      const cpl = k.mulUp(fx.Emag[4 * i + 2 * t + l]!, Ud[2 * i + l]!) + G[2 * i + t]!;
      const nx = (i + 1) % p;
      if (fx.back[t]) {
        if (!(k.mulUp(Ud[2 * nx + t]! + cpl, fx.invMig[2 * i + t]!) <= Ud[2 * i + t]!)) return null;
      } else if (!(k.mulUp(fx.Emag[4 * i + 3 * t]!, Ud[2 * i + t]!) + cpl <= Ud[2 * nx + t]!)) return null;
    }
  }
  // K(X)_i ⊆ M_i + z̃_i ± |P_i| ū_i strictly inside the box (ends rounded inward)
  for (let i = 0; i < p; i++) {
    for (let row = 0; row < 2; row++) {
      const rad = k.mulUp(fx.Pabs[4 * i + 2 * row]!, Ud[2 * i]!) + k.mulUp(fx.Pabs[4 * i + 2 * row + 1]!, Ud[2 * i + 1]!);
      const y = fx.y0[2 * i + row]!;
      const box = inner[2 * i + row]!;
      if (!(y.lo - rad > k.fromDecimal(box.lo, true) && y.hi + rad < k.fromDecimal(box.hi, false))) return null;
    }
  }
  return fixedOutcome(s, X, k, Df);
}

/**
 * The outcome of a shown inclusion: the fixed-point Jacobians over X for the fixed-point stability
 * (stability-fixed.ts), and the decimal evaluator's Jacobians over X (what the decimal path would
 * have returned) made only if a decimal consumer reads them.
 */
function fixedOutcome(s: Shooting, X: readonly Iv[], k: FixCtx, Df: Fx[][]): KrawczykOutcome {
  let D: Iv[][] | undefined;
  const decimalJacobians = (): Iv[][] => Df.map((_, i) => image(s, [X[2 * i]!, X[2 * i + 1]!], true, i).jac!);
  const out = { ok: true as const, fixedJacobians: { k, D: Df } } as KrawczykOutcome & { jacobians: Iv[][] };
  Object.defineProperty(out, 'jacobians', { enumerable: true, get: () => (D ??= decimalJacobians()) });
  return out;
}

function handOver(e: unknown): null {
  if (e instanceof FixedRange || e instanceof DomainViolation) return null;
  throw e;
}

/** The fixed-point test alone (prepared lazily): ok, or null for "not shown here". */
export function prepareCyclic2Fixed(s: Shooting, M: readonly Iv[]): FixedTest {
  let fx: Centre | null | undefined;
  return (X, inner) => {
    if (s.flow) return null; // a map from a flow: s.step is the vector field, not the map (decimal path only)
    try {
      if (fx === undefined) fx = centre(s, M);
      return fx === null ? null : boxTest(fx, s, X, inner);
    } catch (e) {
      return handOver(e);
    }
  };
}

/**
 * Dimension 2, structured bound: the fixed-point path first, then (only when it did not show the
 * inclusion) the decimal path of cyclic2.ts, whose outcome and reason are final. Same contract as
 * prepareCyclic2.
 */
export function prepareCyclic2Fast(s: Shooting, M: readonly Iv[]): BoxTest {
  const fixed = prepareCyclic2Fixed(s, M);
  let decimal: BoxTest | undefined;
  return (X, inner, label) => {
    const out = fixedPaths.enabled ? fixed(X, inner) : null;
    if (out) return out;
    decimal ??= prepareCyclic2(s, M);
    return decimal(X, inner, label);
  };
}
