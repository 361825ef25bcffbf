/**
 * The checker's structured Krawczyk test for dimension 2 (no dense matrix; O(p) decimal interval
 * operations), written independently of the prover with the checker's own IvCtx rounding.
 *
 * Mathematics (Krawczyk 1969, from memory; Collatz–Wielandt bound for nonnegative matrices):
 * C := B^{-1} for the exact block-cyclic matrix B with blocks −Ã_i (decimals ≈ Df(M_i); any
 * choice is valid) and I beside them; B − J(X) is block-diagonal (D_i(X) − Ã_i), so
 *   K(X) ⊆ M + z̃ + C·R,  R_i = −F_i(M) − (B z̃)_i + (D_i(X) − Ã_i)(X_i − M_i)   (any decimals z̃),
 * and δ = C·r solves δ_{i+1} = Ã_i δ_i + r_i (indices mod p). With exact decimal 2×2 matrices P_i
 * (heuristic: unstable and stable directions), y_i = P_i^{-1} δ_i solves y_{i+1} = E_i y_i + h_i,
 * E_i = P_{i+1}^{-1} Ã_i P_i, h_i = P_{i+1}^{-1} r_i, P^{-1} enclosed as adj(P)/det(P). For each
 * component k, chosen 'back' or 'forward' (heuristic), with G_{k,i} ≥ |h_{k,i}| and l ≠ k:
 *   back:    |y_{k,i}|   ≤ (|y_{k,i+1}| + mag E_{kl,i}|y_{l,i}| + G_{k,i}) / mig E_{kk,i}
 *   forward: |y_{k,i+1}| ≤ mag E_{kk,i}|y_{k,i}| + mag E_{kl,i}|y_{l,i}| + G_{k,i}
 * i.e. e ≤ T e + G with T ≥ 0. A decimal vector ū > 0 with T ū + G ≤ ū (checked rounding up) and
 * G > 0 gives T ū ≤ θ ū, θ < 1, so ρ(T) < 1 and e ≤ (I − T)^{-1} G ≤ ū. Then |δ_i| ≤ |P_i| ū_i
 * and K(X)_i ⊆ M_i + z̃_i ± |P_i| ū_i. ū is found by float Gauss–Seidel sweeps on scaled values
 * (heuristic; the system is linear in G, so scaling is exact); only the decimal check counts.
 */
import { Decimal } from 'decimal.js';
import { DomainViolation, fmt, isInterior, type Iv } from './interval.js';
import { image, type KrawczykOutcome, type Shooting } from './krawczyk.js';

const Approx: Decimal.Constructor = Decimal.clone({ precision: 20, rounding: Decimal.ROUND_HALF_EVEN, minE: -9e15, maxE: 9e15 });

function unit(x: number, y: number): [number, number] {
  const h = Math.hypot(x, y);
  return h > 0 && Number.isFinite(h) ? [x / h, y / h] : [1, 0];
}

export type BoxTest = (X: readonly Iv[], inner: readonly Iv[], label: string) => KrawczykOutcome;

/** K(X) ⊂ int(inner)? for n = 2 with the structured bound; M encloses the centre, X ⊇ inner. */
export function krawczykCyclic2(s: Shooting, M: readonly Iv[], X: readonly Iv[], inner: readonly Iv[], label: string): KrawczykOutcome {
  return prepareCyclic2(s, M)(X, inner, label);
}

/**
 * The centre-only part (F(M), Ã, P, P^{-1}, the transformed cocycle, z̃) computed once; the returned
 * test runs the box-dependent part. Same contract as krawczykCyclic2.
 */
export function prepareCyclic2(s: Shooting, M: readonly Iv[]): BoxTest {
  const { c, p } = s;
  const Up = c.Up;
  let label = '';
  const fail = (why: string): KrawczykOutcome => ({ ok: false, reason: `${label}: ${why} (structured bound, dimension 2)` });
  const failing = (why: string): BoxTest => (_X, _inner, lb) => {
    label = lb;
    return fail(why);
  };
  const mulU = (x: Decimal, y: Decimal): Decimal => {
    const r = Up.mul(x, y);
    if (!r.isFinite() || (r.isZero() && !x.isZero() && !y.isZero())) throw new DomainViolation('overflow or underflow in the structured bound');
    return r;
  };
  // centre: F(M), Ã (decimals and floats)
  const Fm: Iv[] = new Array(2 * p);
  const At: Decimal[] = new Array(4 * p);
  const Af = new Float64Array(4 * p);
  for (let i = 0; i < p; i++) {
    const { f, jac } = image(s, [M[2 * i]!, M[2 * i + 1]!], true, i);
    const nx = ((i + 1) % p) * 2;
    for (let r = 0; r < 2; r++) Fm[2 * i + r] = c.sub(M[nx + r]!, f[r]!);
    for (let k = 0; k < 4; k++) {
      At[4 * i + k] = new Approx(c.midpoint(jac![k]!));
      Af[4 * i + k] = Number(At[4 * i + k]!.toString());
    }
  }
  const { v, w } = directions(Af, p);
  // P_i exact decimals (from the shortest strings of the floats), P^{-1} enclosed, E_i enclosed
  const P: Decimal[][] = new Array(p);
  const Pinv: Iv[][] = new Array(p);
  for (let i = 0; i < p; i++) {
    const q = [v[2 * i]!, w[2 * i]!, v[2 * i + 1]!, w[2 * i + 1]!].map((t) => new c.Down(String(t)));
    P[i] = q;
    const det = c.sub(c.scale(q[0]!, c.point(q[3]!)), c.scale(q[1]!, c.point(q[2]!)));
    if (!(det.lo.gt(0) || det.hi.lt(0))) return failing(`singular change of coordinates at point ${i}`);
    const inv = c.div(c.one, det);
    Pinv[i] = [c.scale(q[3]!, inv), c.neg(c.scale(q[1]!, inv)), c.neg(c.scale(q[2]!, inv)), c.scale(q[0]!, inv)];
  }
  const mat = (a: readonly Iv[], b: readonly Iv[]): Iv[] => [
    c.add(c.mul(a[0]!, b[0]!), c.mul(a[1]!, b[2]!)),
    c.add(c.mul(a[0]!, b[1]!), c.mul(a[1]!, b[3]!)),
    c.add(c.mul(a[2]!, b[0]!), c.mul(a[3]!, b[2]!)),
    c.add(c.mul(a[2]!, b[1]!), c.mul(a[3]!, b[3]!)),
  ];
  const Emag: Decimal[] = new Array(4 * p);
  const invMig: Decimal[] = new Array(2 * p);
  const Emid = new Float64Array(4 * p);
  const logs = [0, 0];
  for (let i = 0; i < p; i++) {
    const Ai = [0, 1, 2, 3].map((k) => c.point(At[4 * i + k]!));
    const E = mat(Pinv[(i + 1) % p]!, mat(Ai, P[i]!.map((t) => c.point(t))));
    for (let k = 0; k < 4; k++) {
      Emag[4 * i + k] = c.mag(E[k]!);
      Emid[4 * i + k] = Number(new Approx(c.midpoint(E[k]!)).toString());
    }
    for (let k = 0; k < 2; k++) {
      const e = E[3 * k]!;
      const mig = e.lo.gt(0) ? e.lo : e.hi.lt(0) ? c.negD(e.hi) : null;
      if (mig === null) return failing(`a diagonal entry of the transformed cocycle contains 0 at point ${i}`);
      invMig[2 * i + k] = Up.div(1, mig);
      if (!invMig[2 * i + k]!.isFinite()) return failing('overflow');
      logs[k]! += Math.log2(Math.abs(Emid[4 * i + 3 * k]!));
    }
  }
  const back = [logs[0]! > 0, logs[1]! > 0];
  // @heuristic z̃ ≈ −C·F(M): float Gauss–Seidel on the transformed system, then z̃_i = P_i ỹ_i
  const hF = new Float64Array(2 * p);
  for (let i = 0; i < p; i++) {
    const q = (i + 1) % p;
    const f0 = -Number(new Approx(c.midpoint(Fm[2 * i]!)).toString());
    const f1 = -Number(new Approx(c.midpoint(Fm[2 * i + 1]!)).toString());
    for (let k = 0; k < 2; k++) {
      hF[2 * i + k] = Number(new Approx(c.midpoint(Pinv[q]![2 * k]!)).toString()) * f0 + Number(new Approx(c.midpoint(Pinv[q]![2 * k + 1]!)).toString()) * f1;
    }
  }
  const yt = signedSolve(hF, Emid, back, p);
  const zt: Decimal[] = new Array(2 * p);
  for (let i = 0; i < p; i++) {
    for (let r = 0; r < 2; r++) {
      const z = v[2 * i + r]! * yt[2 * i]! + w[2 * i + r]! * yt[2 * i + 1]!;
      zt[2 * i + r] = new Approx(Number.isFinite(z) ? String(z) : '0');
    }
  }
  // float images of the magnitudes for the (heuristic) sweeps, shared by both paths
  const magF = Float64Array.from(Emag, (e) => Number(e.toSD(17).toString()));
  const invMigF = Float64Array.from(invMig, (e) => Number(e.toSD(17).toString()));
  // over the box: R, G
  return (X: readonly Iv[], inner: readonly Iv[], lb: string): KrawczykOutcome => {
  label = lb;
  const D: Iv[][] = new Array(p);
  for (let i = 0; i < p; i++) D[i] = image(s, [X[2 * i]!, X[2 * i + 1]!], true, i).jac!;
  const G: Decimal[] = new Array(2 * p);
  let gTop = -Infinity;
  const tiny = new Up('1e-100000');
  for (let i = 0; i < p; i++) {
    const jac = D[i]!;
    const nx = ((i + 1) % p) * 2;
    const r: Iv[] = [];
    for (let row = 0; row < 2; row++) {
      const az = c.add(c.scale(At[4 * i + 2 * row]!, c.point(zt[2 * i]!)), c.scale(At[4 * i + 2 * row + 1]!, c.point(zt[2 * i + 1]!)));
      let acc = c.sub(c.neg(Fm[2 * i + row]!), c.sub(c.point(zt[nx + row]!), az));
      for (let col = 0; col < 2; col++) {
        acc = c.add(acc, c.mul(c.sub(jac[2 * row + col]!, c.point(At[4 * i + 2 * row + col]!)), c.sub(X[2 * i + col]!, M[2 * i + col]!)));
      }
      r.push(acc);
    }
    const q = Pinv[(i + 1) % p]!;
    for (let k = 0; k < 2; k++) {
      const h = c.add(c.mul(q[2 * k]!, r[0]!), c.mul(q[2 * k + 1]!, r[1]!));
      G[2 * i + k] = Up.add(c.mag(h), tiny);
      if (!G[2 * i + k]!.isZero()) gTop = Math.max(gTop, G[2 * i + k]!.e);
    }
  }
  // @heuristic ū by float sweeps on G/10^gTop (the inequalities are linear in G)
  const scale = new Up(`1e${gTop}`);
  const Gf = Float64Array.from(G, (g) => Number(Up.div(g, scale).toSD(17).toString()) + 1e-300);
  const U = sweepBound(Gf, magF, invMigF, back, p);
  if (typeof U === 'string') return fail(U);
  if (!U.every((t) => t > 0 && t < Infinity)) return fail('no finite bound');
  const Ud = Array.from(U, (t) => mulU(new Up(String(t * (1 + 2 ** -20))), scale));
  // rigorous: T ū + G ≤ ū
  for (let k = 0; k < 2; k++) {
    const l = 1 - k;
    for (let i = 0; i < p; i++) {
      const cpl = Up.add(mulU(Emag[4 * i + 2 * k + l]!, Ud[2 * i + l]!), G[2 * i + k]!);
      const nx = (i + 1) % p;
      if (back[k]) {
        if (!mulU(Up.add(Ud[2 * nx + k]!, cpl), invMig[2 * i + k]!).lte(Ud[2 * i + k]!)) return fail(`the magnitude bound is not a fixed point at point ${i}`);
      } else if (!Up.add(mulU(Emag[4 * i + 3 * k]!, Ud[2 * i + k]!), cpl).lte(Ud[2 * nx + k]!)) return fail(`the magnitude bound is not a fixed point at point ${i}`);
    }
  }
  for (let i = 0; i < p; i++) {
    for (let row = 0; row < 2; row++) {
      const pr = P[i]!;
      const rad = Up.add(mulU(pr[2 * row]!.abs(), Ud[2 * i]!), mulU(pr[2 * row + 1]!.abs(), Ud[2 * i + 1]!));
      const k = c.add(c.add(M[2 * i + row]!, c.point(zt[2 * i + row]!)), c.sym(rad));
      const box = inner[2 * i + row]!;
      if (!isInterior(k, box)) {
        const over = Up.max(Up.sub(box.lo, k.lo), Up.sub(k.hi, box.hi));
        return { ok: false, reason: `${label}: K(X) not inside the interior of the box at point ${i}, component ${row}: K = ${fmt(k, 20)}, box = ${fmt(box, 20)}, exceeds by ${over.toSD(3).toString()} (structured bound)` };
      }
    }
  }
  return { ok: true, jacobians: D };
  };
}

/**
 * @heuristic ū ≥ 0 with T ū + G ≈≤ ū by float Gauss–Seidel sweeps (closed-form cyclic solve per
 * component), or the reason why none exists (a component does not contract around the cycle).
 * Only the rigorous check that follows it counts.
 */
export function sweepBound(Gf: Float64Array, magF: Float64Array, invMigF: Float64Array, back: readonly boolean[], p: number): Float64Array | string {
  const U = new Float64Array(2 * p);
  for (let sweep = 0; sweep < 40; sweep++) {
    let change = 0;
    for (let k = 0; k < 2; k++) {
      const l = 1 - k;
      const g = (i: number): number => Gf[2 * i + k]! + magF[4 * i + 2 * k + l]! * U[2 * i + l]!;
      const before = U[k]!;
      let t = 0;
      let prod = 1;
      if (back[k]) {
        for (let i = p - 1; i >= 0; i--) {
          t = (t + g(i)) * invMigF[2 * i + k]!;
          prod *= invMigF[2 * i + k]!;
        }
        t /= 1 - prod;
        for (let i = p - 1; i >= 0; i--) U[2 * i + k] = t = (t + g(i)) * invMigF[2 * i + k]!;
      } else {
        for (let i = 0; i < p; i++) {
          t = magF[4 * i + 3 * k]! * t + g(i);
          prod *= magF[4 * i + 3 * k]!;
        }
        t /= 1 - prod;
        for (let i = 0; i < p; i++) {
          U[2 * i + k] = t;
          t = magF[4 * i + 3 * k]! * t + g(i);
        }
      }
      if (!(prod < 1)) return `component ${k} does not contract around the cycle`;
      change = Math.max(change, Math.abs(U[k]! - before) / Math.max(U[k]!, 1e-300));
    }
    if (sweep > 0 && change < 1e-9) break;
  }
  return U;
}

/** @heuristic directions along the cocycle Ã_i (floats): v forward (unstable), w backward (stable). */
export function directions(Af: Float64Array, p: number): { v: Float64Array; w: Float64Array } {
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
      [x, y] = unit(Af[o]! * x + Af[o + 1]! * y, Af[o + 2]! * x + Af[o + 3]! * y);
    }
  }
  x = 0.6;
  y = -0.8;
  for (let lap = 0; lap < laps; lap++) {
    for (let i = p - 1; i >= 0; i--) {
      const o = 4 * i;
      [x, y] = unit(Af[o + 3]! * x - Af[o + 1]! * y, -Af[o + 2]! * x + Af[o]! * y);
      w[2 * i] = x;
      w[2 * i + 1] = y;
    }
  }
  return { v, w };
}

/** @heuristic ỹ ≈ solution of y_{i+1} = E_i y_i + h_i (float Gauss–Seidel, closed-form cyclic solve per component). */
export function signedSolve(hF: Float64Array, Emid: Float64Array, back: readonly boolean[], p: number): Float64Array {
  const yt = new Float64Array(2 * p);
  const sweepSigned = (): void => {
    for (let k = 0; k < 2; k++) {
      const l = 1 - k;
      const g = (i: number): number => hF[2 * i + k]! + Emid[4 * i + 2 * k + l]! * yt[2 * i + l]!;
      // closed-form cyclic solve of y_{k,i+1} = E_kk y_{k,i} + g_i
      let t = 0;
      let prod = 1;
      if (back[k]) {
        for (let i = p - 1; i >= 0; i--) {
          t = (t - g(i)) / Emid[4 * i + 3 * k]!;
          prod /= Emid[4 * i + 3 * k]!;
        }
        t /= 1 - prod;
        for (let i = p - 1; i >= 0; i--) yt[2 * i + k] = t = (t - g(i)) / Emid[4 * i + 3 * k]!;
      } else {
        for (let i = 0; i < p; i++) {
          t = Emid[4 * i + 3 * k]! * t + g(i);
          prod *= Emid[4 * i + 3 * k]!;
        }
        t /= 1 - prod;
        for (let i = 0; i < p; i++) {
          yt[2 * i + k] = t;
          t = Emid[4 * i + 3 * k]! * t + g(i);
        }
      }
    }
  };
  for (let sw = 0; sw < 4; sw++) sweepSigned();
  return yt;
}
