/**
 * The Krawczyk test on the multiple-shooting system, written once over an interval arithmetic
 * (float64 intervals or multiprecision intervals), plus the 1-D interval Newton step.
 *
 * Shooting system (DESIGN.md §4): unknowns x_0..x_{p−1} ∈ R^n (vector of N = p·n numbers, point i
 * at offset i·n), F_i(x) = x_{(i+1) mod p} − f(x_i). Its Jacobian J is block-cyclic bidiagonal:
 * block row i holds −Df(x_i) at block column i and I at block column (i+1) mod p.
 *
 * Krawczyk operator, for a box X, a point m ∈ X and ANY real N×N matrix C:
 *   K(X) = m − C·F(m) + (I − C·J(X))·(X − m)
 * where F(m) is an interval enclosure of F at m and J(X) an interval enclosure of J over X.
 *  - K(X) ⊂ int X  ⇒ F has exactly one zero in X (Krawczyk 1969; uniqueness as in Moore's
 *    interval analysis, from memory).
 *  - K(X) ∩ X = ∅ ⇒ F has no zero in X (every zero of F in X lies in K(X)).
 * The proof needs f continuous (and differentiable, or with valid slope enclosures) on X: an
 * evaluation whose `status.continuous` ends false yields the outcome `domain`, never a proof.
 *
 * Cost: C is dense; the product C·J(X) exploits the two nonzero blocks per block column of J,
 * so one test costs O(N²·(n + 3)) interval operations and O(N) memory (rows are formed and
 * consumed one at a time).
 * Structured form (dimensions 1 and 2, long periods): a `CyclicPreconditioner` makes
 * `prepareKrawczyk` build the O(p) plan of cyclic.ts / cyclic2.ts, where C = B^{-1} for the exact
 * block-cyclic B with float blocks is never formed and (I − C·J(X))(X − m) is bounded through
 * B − J(X) being block-diagonal; the bounds are argued in those files.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { resetStatus } from '../interval/arithmetic.js';
import type { MapEvaluator } from '../model/types.js';
import { down, up } from '../interval/round.js';
import { cyclicImage, prepareCyclic, type CyclicPlan } from './cyclic.js';
import { cyclic2Image, prepareCyclic2, type Cyclic2Plan } from './cyclic2.js';

/** A real N×N matrix given entry-wise as degenerate (point) elements of T. */
export interface Preconditioner<T> {
  readonly size: number;
  /** The exact point C[r][c] as a T (degenerate interval, or a tight enclosure of it). */
  entry(r: number, c: number): T;
}

export interface ShootingSystem<T> {
  readonly arith: IntervalArithmetic<T>;
  readonly evaluator: MapEvaluator<T>;
  readonly period: number;
  readonly dim: number;
}

export type KrawczykOutcome<T> =
  /** K(X) ⊂ int X: exactly one zero of the shooting system in X. `image` = K(X). */
  | { kind: 'inside'; image: T[]; assumed: boolean }
  /** K(X) ∩ X = ∅ in coordinate `index`: no zero in X. */
  | { kind: 'excluded'; image: T[]; index: number; assumed: boolean }
  /** Neither; `image` = K(X) (used by epsilon-inflation). */
  | { kind: 'undecided'; image: T[]; reason: string; assumed: boolean }
  /** An evaluation left the domain of continuity: nothing is claimed. */
  | { kind: 'domain'; where: 'centre' | 'box'; point: number };

/**
 * Enclosure of F(m) for the shooting system at the (thin) point vector m.
 * Returns null when the evaluation left the domain (status.continuous false).
 */
export function shootingResidual<T>(sys: ShootingSystem<T>, m: readonly T[]): { value: T[]; assumed: boolean } | { domain: number } {
  const { arith, evaluator, period: p, dim: n } = sys;
  const xi: T[] = new Array<T>(n);
  const fx: T[] = new Array<T>(n);
  const out: T[] = new Array<T>(p * n);
  let assumed = false;
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) xi[j] = m[i * n + j]!;
    resetStatus(arith);
    evaluator.image(xi, fx);
    if (!arith.status.continuous) return { domain: i };
    assumed ||= arith.status.assumed;
    const next = ((i + 1) % p) * n;
    for (let j = 0; j < n; j++) out[i * n + j] = arith.sub(m[next + j]!, fx[j]!);
  }
  return { value: out, assumed };
}

/**
 * Interval Jacobian blocks A_i ⊇ Df(X_i) (row-major n×n per point) over the whole box, or the
 * index of the point whose evaluation left the domain.
 */
export function shootingJacobianBlocks<T>(
  sys: ShootingSystem<T>,
  box: readonly T[],
): { blocks: T[]; images: T[]; assumed: boolean; nonsmooth: boolean } | { domain: number } {
  const { arith, evaluator, period: p, dim: n } = sys;
  const xi: T[] = new Array<T>(n);
  const fx: T[] = new Array<T>(n);
  const jac: T[] = new Array<T>(n * n);
  const blocks: T[] = new Array<T>(p * n * n);
  const images: T[] = new Array<T>(p * n);
  let assumed = false;
  let nonsmooth = false;
  for (let i = 0; i < p; i++) {
    for (let j = 0; j < n; j++) xi[j] = box[i * n + j]!;
    resetStatus(arith);
    evaluator.imageAndJacobian(xi, fx, jac);
    if (!arith.status.continuous) return { domain: i };
    assumed ||= arith.status.assumed;
    nonsmooth ||= arith.status.nonsmooth === true;
    for (let k = 0; k < n * n; k++) blocks[i * n * n + k] = jac[k]!;
    for (let j = 0; j < n; j++) images[i * n + j] = fx[j]!;
  }
  return { blocks, images, assumed, nonsmooth };
}

/**
 * The Krawczyk test for the shooting system on the box X (length N = p·n) with point m ∈ X
 * (thin elements of T, or tight enclosures of the intended point: the operator is inclusion-
 * monotone, so an enclosure of m yields an enclosure of K) and preconditioner C.
 *
 * `target` (default X) is the box that K(X) must lie in the interior of. Passing an inner
 * enclosure W ⊂ X of a written box lets a caller verify K(W) ⊂ K(X) ⊂ int(inner W) ⊂ int W for a
 * box W whose ends are not representable in T (DESIGN.md §5: re-test the written box).
 *
 * Special cases: any non-continuous evaluation → `domain`; m not inside X → `undecided`.
 * Tightness: one interval evaluation of each operand; no wrapping beyond the dense products.
 */
export function krawczykShooting<T>(
  sys: ShootingSystem<T>,
  m: readonly T[],
  box: readonly T[],
  C: Preconditioner<T>,
  target: readonly T[] = box,
): KrawczykOutcome<T> {
  const { arith, period: p, dim: n } = sys;
  const N = p * n;
  if (m.length !== N || box.length !== N || C.size !== N || target.length !== N) {
    throw new RangeError(`krawczykShooting: sizes differ (N=${N}, m=${m.length}, X=${box.length}, C=${C.size})`);
  }
  for (let k = 0; k < N; k++) {
    if (!arith.isSubset(m[k]!, box[k]!)) {
      return { kind: 'undecided', image: box.slice(), reason: `the point m is not inside X (coordinate ${k})`, assumed: false };
    }
  }
  const res = shootingResidual(sys, m);
  if ('domain' in res) return { kind: 'domain', where: 'centre', point: res.domain };
  const jb = shootingJacobianBlocks(sys, box);
  if ('domain' in jb) return { kind: 'domain', where: 'box', point: jb.domain };
  const F = res.value;
  const A = jb.blocks;
  const assumed = res.assumed || jb.assumed;
  const d: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) d[k] = arith.sub(box[k]!, m[k]!);
  const zero = arith.fromNumber(0);
  const one = arith.fromNumber(1);
  const nn = n * n;
  const image: T[] = new Array<T>(N);
  const rowC: T[] = new Array<T>(N);
  let inside = true;
  let excludedAt = -1;
  let firstOut = -1;
  for (let r = 0; r < N; r++) {
    for (let k = 0; k < N; k++) rowC[k] = C.entry(r, k);
    // y_r = m_r − Σ_k C[r,k]·F_k
    let cf: T = zero;
    for (let k = 0; k < N; k++) cf = arith.add(cf, arith.mul(rowC[k]!, F[k]!));
    let acc: T = arith.sub(m[r]!, cf);
    // (I − C·J(X))[r, col]·d[col];  (C·J)[r, b·n+j] = C[r, prev(b)·n+j] − Σ_l C[r, b·n+l]·A_b[l, j]
    for (let b = 0; b < p; b++) {
      const prev = ((b - 1 + p) % p) * n;
      for (let j = 0; j < n; j++) {
        const col = b * n + j;
        let cj: T = rowC[prev + j]!;
        for (let l = 0; l < n; l++) cj = arith.sub(cj, arith.mul(rowC[b * n + l]!, A[b * nn + l * n + j]!));
        const e = r === col ? arith.sub(one, cj) : arith.neg(cj);
        acc = arith.add(acc, arith.mul(e, d[col]!));
      }
    }
    image[r] = acc;
    if (!arith.isInterior(acc, target[r]!)) {
      inside = false;
      if (firstOut < 0) firstOut = r;
      if (excludedAt < 0 && arith.disjoint(acc, box[r]!)) excludedAt = r;
    }
  }
  if (inside) return { kind: 'inside', image, assumed };
  if (excludedAt >= 0) return { kind: 'excluded', image, index: excludedAt, assumed };
  return { kind: 'undecided', image, reason: `K(X) not inside int X (first at coordinate ${firstOut})`, assumed };
}

/**
 * The structured preconditioner of dimension 1 (cyclic.ts): C = B^{-1} for the cyclic bidiagonal
 * B with diagonal −ã (doubles), applied by recursions, never formed. `entry` is not available.
 */
export interface CyclicPreconditioner<T> extends Preconditioner<T> {
  readonly cyclic: Float64Array;
}

/** The cyclic preconditioner from the doubles ã_i ≈ f'(m_i) (n = 1). */
export function cyclicPreconditioner<T>(at: Float64Array): CyclicPreconditioner<T> {
  return {
    size: at.length,
    cyclic: at,
    entry: () => {
      throw new Error('cyclicPreconditioner: entries are not formed (use prepareKrawczyk)');
    },
  };
}

/** Dense preconditioner over a row-major Float64Array (float path). */
export function floatPreconditioner<T>(arith: IntervalArithmetic<T>, c: Float64Array, size: number): DensePreconditioner<T> {
  return { size, dense: c, entry: (r, k) => arith.fromNumber(c[r * size + k]!) };
}

/** Dense preconditioner from precomputed point elements (multiprecision path). */
export function pointPreconditioner<T>(entries: readonly T[], size: number): Preconditioner<T> {
  return { size, entry: (r, k) => entries[r * size + k]! };
}

export type NewtonStepOutcome<T> =
  | { kind: 'ok'; image: T; /** N(X) ∩ X, null when empty (then X holds no zero). */ next: T | null; inside: boolean }
  | { kind: 'domain' }
  | { kind: 'zero-derivative' };

/**
 * One 1-D interval Newton step N(X) = m − f(m)/f'(X), m = midPoint(X).
 * Contract: every zero of f in X lies in N(X) ∩ X; N(X) ⊂ int X ⇒ exactly one zero in X
 * (Moore 1966, from memory). `f` returns an enclosure of f at a thin argument; `df` an enclosure
 * of f' over a box. Special cases: f'(X) ∋ 0 → `zero-derivative` (no extended division here);
 * domain left → `domain`. Tightness: one division; quadratic contraction near a simple zero.
 */
export function intervalNewtonStep<T>(
  arith: IntervalArithmetic<T>,
  f: (x: T) => T,
  df: (x: T) => T,
  X: T,
): NewtonStepOutcome<T> {
  const m = arith.midPoint(X);
  resetStatus(arith);
  const fm = f(m);
  const dX = df(X);
  if (!arith.status.continuous) return { kind: 'domain' };
  const zero = arith.fromNumber(0);
  if (!(arith.certainlyLt(zero, dX) || arith.certainlyLt(dX, zero))) return { kind: 'zero-derivative' };
  const image = arith.sub(m, arith.div(fm, dX));
  return { kind: 'ok', image, next: arith.intersect(image, X), inside: arith.isInterior(image, X) };
}

/**
 * A Krawczyk test prepared once for a fixed centre m and preconditioner C, then applied to many
 * boxes (epsilon-inflation, uniqueness radius, re-test of the written box).
 *
 * Uses the centred splitting (valid for every real C and every point J_m ∈ J(m)):
 *   I − C·J(X) ⊆ E + C·(J(m) − J(X)),  E = I − C·J(m),
 * and J(m) − J(X) is block-diagonal with blocks A_i(X) − A_i(m) (the identity blocks cancel), so
 *   K(X) ⊆ y₀ + E·(X − m) + C·v,   y₀ = m − C·F(m),   v_i = (A_i(X) − A_i(m))·(X_i − m_i)
 * and, with the columns split into G contiguous groups and upper bounds
 * T_rg ≥ Σ_{c∈g} |E_rc|, S_rg ≥ Σ_{c∈g} |C_rc| formed once,
 *   K(X)_r ⊆ y₀_r ± Σ_g (T_rg·max_{c∈g}|d_c| + S_rg·max_{c∈g}|v_c|),   d = X − m.
 * Preparation costs O(N²·(n + 3)) operations (directed float64 operations of the kernel when the
 * arithmetic is float64 and C is given densely; interval operations of T otherwise); each box then
 * costs O(N·(G + n²)). With G = N (the default up to N = 64) the bound is the usual magnitude form
 * of the dense product; with fewer groups it is coarser when coordinates within one group differ
 * by orders of magnitude, never unsound. Double upper bounds are formed with the kernel's `up`
 * (successor formula, round.ts), so underflow/overflow only makes them coarser.
 */
export interface KrawczykPlan<T> {
  readonly sys: ShootingSystem<T>;
  readonly m: readonly T[];
  /** m − C·F(m). */
  readonly y0: readonly T[];
  /** A_i(m) blocks. */
  readonly Am: readonly T[];
  /** Group bounds, row-major N×G: |E| and |C|. */
  readonly Tg: Float64Array;
  readonly Sg: Float64Array;
  readonly groupStart: Int32Array;
  readonly assumed: boolean;
  /** Set for the structured test of dimension 1 (cyclic.ts); then y0/Tg/Sg are unused. */
  readonly cyclic?: CyclicPlan<T>;
  /** Set for the structured test of dimension 2 (cyclic2.ts). */
  readonly cyclic2?: Cyclic2Plan<T>;
}

/** A preconditioner that also exposes its dense float64 entries (enables the fast preparation). */
export interface DensePreconditioner<T> extends Preconditioner<T> {
  readonly dense: Float64Array;
}

export function prepareKrawczyk<T>(
  sys: ShootingSystem<T>,
  m: readonly T[],
  C: Preconditioner<T>,
  opts: { groups?: number; fast?: boolean } = {},
): KrawczykPlan<T> | { domain: number; where: 'centre' } | { undecided: string } {
  const { arith: a, period: p, dim: n } = sys;
  const N = p * n;
  const nn = n * n;
  const res = shootingResidual(sys, m);
  if ('domain' in res) return { domain: res.domain, where: 'centre' };
  const jb = shootingJacobianBlocks(sys, m);
  if ('domain' in jb) return { domain: jb.domain, where: 'centre' };
  const cyc = (C as Partial<CyclicPreconditioner<T>>).cyclic;
  if (cyc !== undefined) {
    if (n > 2 || cyc.length !== p * nn) throw new RangeError(`prepareKrawczyk: cyclic preconditioner needs n <= 2 and p·n² = ${p * nn} entries`);
    const empty = new Float64Array(0);
    const base = { sys, m, y0: [], Am: jb.blocks, Tg: empty, Sg: empty, groupStart: new Int32Array(1), assumed: res.assumed || jb.assumed };
    if (n === 2) {
      const cyclic2 = prepareCyclic2(a, m, res.value, cyc);
      if (cyclic2 === null) return { undecided: 'the structured Krawczyk bound found no hyperbolic splitting of the cycle (or a product of derivatives too close to 1)' };
      return { ...base, cyclic2 };
    }
    const cyclic = prepareCyclic(a, m, res.value, cyc);
    if (cyclic === null) return { undecided: 'the cyclic Krawczyk bound has no contracting direction (|product of derivatives| too close to 1)' };
    return { ...base, cyclic };
  }
  const G = Math.min(N, Math.max(1, opts.groups ?? 64));
  const groupStart = new Int32Array(G + 1);
  for (let g = 0; g <= G; g++) groupStart[g] = Math.floor((g * N) / G);
  const groupOf = new Int32Array(N);
  for (let g = 0; g < G; g++) for (let c = groupStart[g]!; c < groupStart[g + 1]!; c++) groupOf[c] = g;
  const A = jb.blocks;
  const F = res.value;
  const y0: T[] = new Array<T>(N);
  const Tg = new Float64Array(N * G);
  const Sg = new Float64Array(N * G);
  const dense = (C as Partial<DensePreconditioner<T>>).dense;
  if (dense !== undefined && a.bits === 53 && opts.fast !== false) {
    // float64 fast path: endpoints are exact doubles; every bound is directed with up/down.
    const Fl = new Float64Array(N);
    const Fh = new Float64Array(N);
    for (let k = 0; k < N; k++) {
      Fl[k] = a.loDown(F[k]!);
      Fh[k] = a.hiUp(F[k]!);
    }
    const Al = new Float64Array(p * nn);
    const Ah = new Float64Array(p * nn);
    for (let k = 0; k < p * nn; k++) {
      Al[k] = a.loDown(A[k]!);
      Ah[k] = a.hiUp(A[k]!);
    }
    for (let r = 0; r < N; r++) {
      const row = r * N;
      let cfl = 0;
      let cfh = 0;
      for (let k = 0; k < N; k++) {
        const c = dense[row + k]!;
        if (c === 0) continue;
        const p1 = c * Fl[k]!;
        const p2 = c * Fh[k]!;
        cfl = down(cfl + down(Math.min(p1, p2)));
        cfh = up(cfh + up(Math.max(p1, p2)));
      }
      y0[r] = a.sub(m[r]!, a.hull(a.fromNumber(cfl), a.fromNumber(cfh)));
      for (let b = 0; b < p; b++) {
        const prev = ((b - 1 + p) % p) * n;
        for (let j = 0; j < n; j++) {
          const col = b * n + j;
          let lo = dense[row + prev + j]!;
          let hi = lo;
          for (let l = 0; l < n; l++) {
            const c = dense[row + b * n + l]!;
            if (c === 0) continue;
            const p1 = c * Al[b * nn + l * n + j]!;
            const p2 = c * Ah[b * nn + l * n + j]!;
            lo = down(lo - up(Math.max(p1, p2)));
            hi = up(hi - down(Math.min(p1, p2)));
          }
          const delta = r === col ? 1 : 0;
          const el = down(delta - hi);
          const eh = up(delta - lo);
          const g = r * G + groupOf[col]!;
          Tg[g] = up(Tg[g]! + Math.max(Math.abs(el), Math.abs(eh)));
          Sg[g] = up(Sg[g]! + Math.abs(dense[row + col]!));
        }
      }
    }
  } else {
    const zero = a.fromNumber(0);
    const one = a.fromNumber(1);
    const rowC: T[] = new Array<T>(N);
    for (let r = 0; r < N; r++) {
      for (let k = 0; k < N; k++) rowC[k] = C.entry(r, k);
      let cf: T = zero;
      for (let k = 0; k < N; k++) cf = a.add(cf, a.mul(rowC[k]!, F[k]!));
      y0[r] = a.sub(m[r]!, cf);
      for (let b = 0; b < p; b++) {
        const prev = ((b - 1 + p) % p) * n;
        for (let j = 0; j < n; j++) {
          const col = b * n + j;
          let cj: T = rowC[prev + j]!;
          for (let l = 0; l < n; l++) cj = a.sub(cj, a.mul(rowC[b * n + l]!, A[b * nn + l * n + j]!));
          const e = r === col ? a.sub(one, cj) : a.neg(cj);
          const g = r * G + groupOf[col]!;
          Tg[g] = up(Tg[g]! + a.magUp(e));
          Sg[g] = up(Sg[g]! + a.magUp(rowC[col]!));
        }
      }
    }
  }
  return { sys, m, y0, Am: A, Tg, Sg, groupStart, assumed: res.assumed || jb.assumed };
}

/**
 * The Krawczyk test of a prepared plan on box X (the plan's m must lie in X); `target` as in
 * `krawczykShooting`. Same contract and outcomes as `krawczykShooting`.
 */
export function krawczykPlanned<T>(plan: KrawczykPlan<T>, box: readonly T[], target: readonly T[] = box): KrawczykOutcome<T> {
  const { sys, m, y0, Am, Tg, Sg, groupStart } = plan;
  const { arith: a, period: p, dim: n } = sys;
  const N = p * n;
  const nn = n * n;
  for (let k = 0; k < N; k++) {
    if (!a.isSubset(m[k]!, box[k]!)) {
      return { kind: 'undecided', image: box.slice(), reason: `the point m is not inside X (coordinate ${k})`, assumed: false };
    }
  }
  const jb = shootingJacobianBlocks(sys, box);
  if ('domain' in jb) return { kind: 'domain', where: 'box', point: jb.domain };
  const assumed = plan.assumed || jb.assumed;
  if (plan.cyclic !== undefined || plan.cyclic2 !== undefined) {
    const d: T[] = new Array<T>(N);
    for (let k = 0; k < N; k++) d[k] = a.sub(box[k]!, m[k]!);
    const img = plan.cyclic !== undefined ? cyclicImage(a, plan.cyclic, jb.blocks, d) : cyclic2Image(a, plan.cyclic2!, jb.blocks, d);
    if (img === null) return { kind: 'undecided', image: box.slice(), reason: 'Krawczyk bound overflowed', assumed };
    return classifyImage(a, img, box, target, assumed);
  }
  const zero = a.fromNumber(0);
  const G = groupStart.length - 1;
  const md = new Float64Array(G);
  const mv = new Float64Array(G);
  const d: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) d[k] = a.sub(box[k]!, m[k]!);
  for (let g = 0, c = 0; g < G; g++) {
    for (; c < groupStart[g + 1]!; c++) {
      const i = Math.floor(c / n);
      const r = c - i * n;
      let s: T = zero;
      for (let k = 0; k < n; k++) {
        const delta = a.sub(jb.blocks[i * nn + r * n + k]!, Am[i * nn + r * n + k]!);
        s = a.add(s, a.mul(delta, d[i * n + k]!));
      }
      md[g] = Math.max(md[g]!, a.magUp(d[c]!));
      mv[g] = Math.max(mv[g]!, a.magUp(s));
    }
  }
  const image: T[] = new Array<T>(N);
  let inside = true;
  let excludedAt = -1;
  let firstOut = -1;
  for (let r = 0; r < N; r++) {
    let bound = 0;
    for (let g = 0; g < G; g++) {
      const t = Tg[r * G + g]!;
      const u = Sg[r * G + g]!;
      if (t !== 0) bound = up(bound + up(t * md[g]!));
      if (u !== 0) bound = up(bound + up(u * mv[g]!));
    }
    if (!(bound < Infinity)) {
      return { kind: 'undecided', image: box.slice(), reason: 'Krawczyk bound overflowed', assumed };
    }
    const k = a.inflate(y0[r]!, bound);
    image[r] = k;
    if (!a.isInterior(k, target[r]!)) {
      inside = false;
      if (firstOut < 0) firstOut = r;
      if (excludedAt < 0 && a.disjoint(k, box[r]!)) excludedAt = r;
    }
  }
  if (inside) return { kind: 'inside', image, assumed };
  if (excludedAt >= 0) return { kind: 'excluded', image, index: excludedAt, assumed };
  return { kind: 'undecided', image, reason: `K(X) not inside int X (first at coordinate ${firstOut})`, assumed };
}

function classifyImage<T>(a: IntervalArithmetic<T>, image: T[], box: readonly T[], target: readonly T[], assumed: boolean): KrawczykOutcome<T> {
  let firstOut = -1;
  let excludedAt = -1;
  for (let r = 0; r < image.length; r++) {
    if (!a.isInterior(image[r]!, target[r]!)) {
      if (firstOut < 0) firstOut = r;
      if (a.disjoint(image[r]!, box[r]!)) {
        excludedAt = r;
        break;
      }
    }
  }
  if (firstOut < 0) return { kind: 'inside', image, assumed };
  if (excludedAt >= 0) return { kind: 'excluded', image, index: excludedAt, assumed };
  return { kind: 'undecided', image, reason: `K(X) not inside int X (first at coordinate ${firstOut})`, assumed };
}
