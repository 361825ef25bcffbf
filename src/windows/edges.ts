/**
 * Bifurcation edges of one-dimensional maps (n = 1): Krawczyk on the augmented system
 * (DESIGN.md §4 "Bifurcation edges"). Unknowns z = (x_0, …, x_{p−1}, θ); equations
 *   G_i = x_{(i+1) mod p} − f(x_i, θ)  (i < p),
 *   G_p = Λ − 1 (fold), Λ + 1 (flip) with Λ = Π f_x(x_i, θ), or f_x(x_0, θ) (superstable:
 *   the orbit passes through a critical point).
 * The Jacobian needs f_xx and f_xθ: second-order forward mode over float64 intervals
 * (`FormulaMap.secondOrder` on the map with θ promoted to a state variable).
 * K(Z) ⊂ int Z proves exactly one such (orbit, θ) in Z.
 *
 * Seeds (@heuristic): float orbits at sample parameters (search for small periods, the float
 * attractor for any period), refined by float Newton on the augmented system.
 */
import { Decimal } from 'decimal.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import type { Arithmetic, IntervalArithmetic } from '../interval/arithmetic.js';
import { resetStatus } from '../interval/arithmetic.js';
import type { Interval } from '../interval/interval.js';
import { solve } from '../linalg/dense.js';
import { compileMap, withParameterAsState, type FormulaMap } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { findCandidates } from '../search/find.js';
import { floatInverseOfColumns, sparseKrawczyk, type SparseColumn } from './sparse-krawczyk.js';

export type EdgeKind = 'fold' | 'flip' | 'superstable';

export interface ProvenEdge {
  kind: EdgeKind;
  period: number;
  parameter: string;
  /** Enclosure of θ*. */
  param: DecimalPair;
  /** p boxes (n = 1; p·n flattened point by point for n ≥ 2, edges-n.ts), and the Krawczyk centre (x then θ). */
  boxes: DecimalPair[];
  centre: string[];
  centreParam: string;
  /** Equal to `period` when the boxes show it (X_i ∩ X_{i+p/q} = ∅ for primes q | p), else null. */
  minimalPeriod: number | null;
  /** Float estimate of θ* (@heuristic, for display). */
  approx: number;
}

type Evals<T> = {
  A: Arithmetic<T>;
  so: ReturnType<FormulaMap['secondOrder']> & { evaluate(x: readonly T[], out: T[], jac: T[], hess: T[]): void };
};

/** f, f_x, f_θ, f_xx, f_xθ at (x, θ) over one arithmetic. */
function derivs<T>(e: Evals<T>, x: T, th: T, buf: { out: T[]; jac: T[]; hess: T[] }): [T, T, T, T, T] {
  (e.so as unknown as { evaluate(x: readonly T[], out: T[], jac: T[], hess: T[]): void }).evaluate([x, th], buf.out, buf.jac, buf.hess);
  return [buf.out[0]!, buf.jac[0]!, buf.jac[1]!, buf.hess[0]!, buf.hess[1]!];
}

/**
 * G(z) and its Jacobian columns over one arithmetic (points → values, boxes → enclosures).
 * Columns: x_i → rows i (−f_x), i−1 (+1), p (∂g/∂x_i); θ → rows i (−f_θ), p (∂g/∂θ).
 */
export function augmentedSystem<T>(A: Arithmetic<T>, so: unknown, kind: EdgeKind, z: readonly T[], withJacobian: boolean): { G: T[]; cols: SparseColumn<T>[] } {
  const p = z.length - 1;
  const th = z[p]!;
  const e = { A, so } as Evals<T>;
  const z0 = A.fromNumber(0);
  const buf = { out: [z0, z0], jac: [z0, z0, z0, z0], hess: new Array<T>(8).fill(z0) };
  const f: T[] = [], fx: T[] = [], fth: T[] = [], fxx: T[] = [], fxth: T[] = [];
  for (let i = 0; i < p; i++) {
    const d = derivs(e, z[i]!, th, buf);
    f.push(d[0]); fx.push(d[1]); fth.push(d[2]); fxx.push(d[3]); fxth.push(d[4]);
  }
  const G: T[] = [];
  for (let i = 0; i < p; i++) G.push(A.sub(z[(i + 1) % p]!, f[i]!));
  // prefix / suffix products of f_x (Π over j ≠ i without division)
  const pre: T[] = [A.fromNumber(1)];
  for (let i = 0; i < p; i++) pre.push(A.mul(pre[i]!, fx[i]!));
  const suf: T[] = new Array<T>(p + 1);
  suf[p] = A.fromNumber(1);
  for (let i = p - 1; i >= 0; i--) suf[i] = A.mul(suf[i + 1]!, fx[i]!);
  const lambda = pre[p]!;
  G.push(kind === 'fold' ? A.sub(lambda, A.fromNumber(1)) : kind === 'flip' ? A.add(lambda, A.fromNumber(1)) : fx[0]!);
  const cols: SparseColumn<T>[] = [];
  if (withJacobian) {
    let dgth = z0;
    for (let i = 0; i < p; i++) {
      const others = A.mul(pre[i]!, suf[i + 1]!);
      const dgx = kind === 'superstable' ? (i === 0 ? fxx[0]! : z0) : A.mul(fxx[i]!, others);
      if (kind !== 'superstable') dgth = A.add(dgth, A.mul(fxth[i]!, others));
      cols.push({ rows: [i, (i - 1 + p) % p, p], values: [A.neg(fx[i]!), A.fromNumber(1), dgx] });
    }
    if (kind === 'superstable') dgth = fxth[0]!;
    const rows: number[] = [];
    const values: T[] = [];
    for (let i = 0; i < p; i++) {
      rows.push(i);
      values.push(A.neg(fth[i]!));
    }
    rows.push(p);
    values.push(dgth);
    cols.push({ rows, values });
  }
  return { G, cols };
}

/** @heuristic float Newton on the augmented system; null when it does not converge. */
export function newtonAugmented(so: unknown, kind: EdgeKind, start: readonly number[], maxIter = 60): number[] | null {
  const A = createFloatArithmetic();
  return newtonOn((z) => augmentedSystem(A, so, kind, z, true), start, maxIter);
}

/** @heuristic float Newton on any square system given as G and sparse Jacobian columns. */
export function newtonOn(system: (z: readonly number[]) => { G: number[]; cols: SparseColumn<number>[] }, start: readonly number[], maxIter = 60): number[] | null {
  const z = [...start];
  const N = z.length;
  for (let it = 0; it < maxIter; it++) {
    const { G, cols } = system(z);
    const J = new Float64Array(N * N);
    for (let k = 0; k < N; k++) for (let q = 0; q < cols[k]!.rows.length; q++) J[cols[k]!.rows[q]! * N + k] += cols[k]!.values[q]!;
    const dz = solve(J, N, G);
    if (dz === null) return null;
    let step = 0, size = 0;
    for (let k = 0; k < N; k++) {
      z[k] = z[k]! - dz[k]!;
      step = Math.max(step, Math.abs(dz[k]!));
      size = Math.max(size, Math.abs(z[k]!));
    }
    if (!Number.isFinite(step)) return null;
    if (step <= 1e-14 * (1 + size)) return z;
  }
  return null;
}

export interface EdgeProofOptions {
  /** Epsilon-inflation steps (default 25). */
  maxInflations?: number;
}

/** An augmented system over float64 intervals: G(z) and (withJacobian) its sparse columns. */
export type AugmentedIntervalSystem = (A: IntervalArithmetic<Interval>, so: unknown, z: readonly Interval[], withJacobian: boolean) => { G: Interval[]; cols: SparseColumn<Interval>[] };

/** Krawczyk proof around a float solution z of the augmented system; null when not proven. */
export function proveEdgeAt(ext: FormulaMap, kind: EdgeKind, z: readonly number[], opts: EdgeProofOptions = {}): { Z: Interval[]; m: Interval[] } | null {
  return proveAugmentedAt(ext, (A, so, zz, j) => augmentedSystem(A, so, kind, zz, j), z, opts);
}

/**
 * Epsilon-inflation and Krawczyk around a float zero z of any augmented system (n = 1 edges,
 * and det(M ∓ I) edges of n ≥ 2 in edges-n.ts); null when not proven. The returned Z is a box
 * where K(Z) ⊂ int Z was seen.
 */
export function proveAugmentedAt(ext: FormulaMap, augmentedSystem: AugmentedIntervalSystem, z: readonly number[], opts: EdgeProofOptions = {}): { Z: Interval[]; m: Interval[] } | null {
  const A: IntervalArithmetic<Interval> = intervalArithmetic();
  const so = ext.secondOrder(A);
  const m = z.map((v) => A.fromNumber(v));
  resetStatus(A);
  const Gm = augmentedSystem(A, so, m, false).G;
  if (!A.status.continuous) return null;
  let X = m.map((v) => A.inflate(v, 1e-15 * (1 + Math.abs(A.midNumber(v)))));
  let C: Float64Array | null = null;
  const maxInflations = opts.maxInflations ?? 25;
  for (let it = 0; it < maxInflations; it++) {
    resetStatus(A);
    const { cols } = augmentedSystem(A, so, X, true);
    if (!A.status.continuous) return null;
    if (C === null) C = floatInverseOfColumns(A, cols);
    if (C === null) return null;
    const k = sparseKrawczyk(A, m, Gm, cols, X, C);
    if (k.kind === 'inside') {
      // tighten: K(X) ⊂ int X, and K(K(X)) ⊂ int K(X) keeps the zero (one more step each)
      let Y = k.image.map((v, i) => A.intersect(v, X[i]!)!);
      for (let t = 0; t < 3; t++) {
        resetStatus(A);
        const c2 = augmentedSystem(A, so, Y, true).cols;
        if (!A.status.continuous) break;
        const k2 = sparseKrawczyk(A, m, Gm, c2, Y, C);
        if (k2.kind !== 'inside') break;
        X = Y;
        Y = k2.image;
      }
      // the returned box is one where the test was seen to pass
      return { Z: X, m };
    }
    if (k.kind === 'excluded') return null;
    X = k.image.map((v, i) => {
      const h = A.hull(v, X[i]!);
      return A.inflate(h, 0.1 * A.widUp(h) + 1e-15 * (1 + Math.abs(A.midNumber(h))));
    });
  }
  return null;
}

/** Minimal period from the boxes: X_i ∩ X_{i+p/q} = ∅ for every prime q | p. */
export function minimalFromBoxes(boxes: readonly [number, number][], p: number): number | null {
  for (let q = 2, rest = p; q <= rest; q++) {
    if (rest % q !== 0) continue;
    while (rest % q === 0) rest /= q;
    const d = p / q;
    for (let i = 0; i < p; i++) {
      const u = boxes[i]!;
      const v = boxes[(i + d) % p]!;
      if (!(u[1] < v[0] || v[1] < u[0])) return null;
    }
  }
  return p;
}

export interface EdgeSearchOptions {
  /** Sample parameters in the range (default 12). */
  samples?: number;
  /** Seed also from the float search at each sample (default: period ≤ 10); else the float attractor only. */
  search?: boolean;
  /** Float orbits to start from, in addition to the sampled ones (each p points). */
  seeds?: { orbit: number[]; param: number }[];
}

/** @heuristic float orbits of period p at θ: search (p ≤ 10) and the float attractor. */
function sampleOrbits(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, at: string, p: number, search: boolean): number[][] {
  const map = compileMap(def, { ...overrides, [name]: { kind: 'exact', value: at } });
  const out: number[][] = [];
  if (search) for (const c of findCandidates(map, { period: p })) out.push(c.points.map((pt) => pt[0]!));
  const region = def.region[def.state[0]!]!;
  let x = (Number(region[0]) + Number(region[1])) / 2 + 1e-3;
  const buf = new Float64Array(1);
  for (let k = 0; k < 20000 && Number.isFinite(x); k++) {
    map.evalFloat([x], buf);
    x = buf[0]!;
  }
  if (Number.isFinite(x)) {
    const orbit: number[] = [];
    for (let k = 0; k < p; k++) {
      orbit.push(x);
      map.evalFloat([x], buf);
      x = buf[0]!;
    }
    out.push(orbit);
  }
  return out;
}

/**
 * Find and enclose the fold / flip / superstable parameters of period-p orbits of a
 * one-dimensional map in [lo, hi]. Every edge returned is proven (K ⊂ int); the list is what the
 * float seeds led to, not a proof that no other edge exists.
 */
export function findEdges(
  def: MapDefinition,
  overrides: Record<string, ParamValue>,
  name: string,
  range: DecimalPair,
  period: number,
  kinds: readonly EdgeKind[],
  opts: EdgeSearchOptions = {},
): ProvenEdge[] {
  if (def.state.length !== 1) throw new RangeError('findEdges: one-dimensional maps only');
  const base = compileMap(def, { ...overrides, [name]: { kind: 'interval', lo: range[0], hi: range[1] } });
  const ext = withParameterAsState(base, name);
  const soFloat = ext.secondOrder(createFloatArithmetic());
  const lo = Number(range[0]);
  const hi = Number(range[1]);
  const S = opts.samples ?? 12;
  const starts: { orbit: number[]; param: number }[] = [...(opts.seeds ?? [])];
  const Dx = Decimal.clone({ precision: 30 });
  for (let s = 0; s < S; s++) {
    const at = new Dx(range[0]).plus(new Dx(range[1]).minus(range[0]).times(s + 0.5).div(S)).toSignificantDigits(12).toString();
    for (const orbit of sampleOrbits(def, overrides, name, at, period, opts.search ?? period <= 10)) starts.push({ orbit, param: Number(at) });
  }
  if (kinds.includes('superstable')) starts.push(...superstableSeeds(def, ext, range, period));
  const found: ProvenEdge[] = [];
  const seen: number[][] = [];
  for (const kind of kinds) {
    for (const st of starts) {
      let orbit = st.orbit;
      if (kind === 'superstable') {
        // rotate so that x_0 is the point with the smallest |f_x|
        const fxAbs = orbit.map((x) => Math.abs(floatDerivative(soFloat, x, st.param)));
        const k = fxAbs.indexOf(Math.min(...fxAbs));
        orbit = [...orbit.slice(k), ...orbit.slice(0, k)];
      }
      const z = newtonAugmented(soFloat, kind, [...orbit, st.param]);
      if (z === null) continue;
      const th = z[period]!;
      if (!(th >= lo && th <= hi)) continue;
      if (seen.some((w) => w[0] === kinds.indexOf(kind) && Math.abs(w[1]! - th) <= 1e-9 * (1 + Math.abs(th)) && sameCycle(w.slice(2), z.slice(0, period)))) continue;
      const proof = proveEdgeAt(ext, kind, z);
      if (proof === null) continue;
      const A = intervalArithmetic();
      const pBox = A.toDecimal(proof.Z[period]!);
      // the parameter enclosure must lie in the range asked for
      if (new Dx(pBox.lo).lt(range[0]) || new Dx(pBox.hi).gt(range[1])) continue;
      seen.push([kinds.indexOf(kind), th, ...z.slice(0, period)]);
      const boxes: DecimalPair[] = proof.Z.slice(0, period).map((b) => {
        const d = A.toDecimal(b);
        return [d.lo, d.hi];
      });
      found.push({
        kind,
        period,
        parameter: name,
        param: [pBox.lo, pBox.hi],
        boxes,
        centre: proof.m.slice(0, period).map((v) => decimalOfDouble(A.midNumber(v))),
        centreParam: decimalOfDouble(A.midNumber(proof.m[period]!)),
        minimalPeriod: minimalFromBoxes(proof.Z.slice(0, period).map((b) => [b.lo, b.hi]), period),
        approx: th,
      });
    }
  }
  return found.sort((u, v) => u.approx - v.approx);
}

/**
 * @heuristic seeds for superstable parameters: on a grid of θ, the critical points c of f(·, θ)
 * (sign changes of f_x over the region) and sign changes of f^p(c) − c between grid points.
 */
function superstableSeeds(def: MapDefinition, ext: FormulaMap, range: DecimalPair, p: number): { orbit: number[]; param: number }[] {
  const lo = Number(range[0]);
  const hi = Number(range[1]);
  const region = def.region[def.state[0]!]!;
  const xlo = Number(region[0]);
  const xhi = Number(region[1]);
  const grid = Math.min(1 << 18, Math.max(2000, 1 << (p + 7)));
  const xs = new Float64Array(2);
  const ys = new Float64Array(2);
  const jac = new Float64Array(4);
  const f = (x: number, th: number): number => {
    xs[0] = x;
    xs[1] = th;
    ext.evalFloat(xs, ys);
    return ys[0]!;
  };
  const fx = (x: number, th: number): number => {
    xs[0] = x;
    xs[1] = th;
    ext.jacobianFloat(xs, jac);
    return jac[0]!;
  };
  const criticals = (th: number): number[] => {
    const out: number[] = [];
    const K = 64;
    let prev = fx(xlo, th);
    for (let k = 1; k <= K; k++) {
      const x = xlo + ((xhi - xlo) * k) / K;
      const cur = fx(x, th);
      if (prev === 0 || prev * cur < 0) {
        let a = x - (xhi - xlo) / K;
        let b = x;
        let fa = fx(a, th);
        for (let it = 0; it < 60; it++) {
          const m = (a + b) / 2;
          const fm = fx(m, th);
          if (fa * fm <= 0) b = m;
          else {
            a = m;
            fa = fm;
          }
        }
        out.push((a + b) / 2);
      }
      prev = cur;
    }
    return out;
  };
  // critical points move slowly with θ: a full scan every 512 grid points, secant updates between
  let cache: number[] = [];
  const criticalsAt = (th: number, k: number): number[] => {
    if (k % 512 === 0 || cache.length === 0) return (cache = criticals(th));
    cache = cache.map((c) => {
      const h = 1e-7 * (1 + Math.abs(c));
      let x = c;
      for (let it = 0; it < 2; it++) {
        const d = (fx(x + h, th) - fx(x - h, th)) / (2 * h);
        if (d === 0 || !Number.isFinite(d)) break;
        x -= fx(x, th) / d;
      }
      return x;
    });
    return cache;
  };
  const gap = (th: number, c: number): number => {
    let x = c;
    for (let k = 0; k < p; k++) x = f(x, th);
    return x - c;
  };
  const seeds: { orbit: number[]; param: number }[] = [];
  let prevTh = lo;
  let prevG = criticalsAt(lo, 0).map((c) => gap(lo, c));
  for (let k = 1; k <= grid; k++) {
    const th = lo + ((hi - lo) * k) / grid;
    const cs = criticalsAt(th, k);
    const gs = cs.map((c) => gap(th, c));
    for (let j = 0; j < Math.min(gs.length, prevG.length); j++) {
      if (Number.isFinite(gs[j]!) && Number.isFinite(prevG[j]!) && gs[j]! * prevG[j]! <= 0) {
        const t = (prevTh + th) / 2;
        const orbit: number[] = [cs[j]!];
        for (let i = 1; i < p; i++) orbit.push(f(orbit[i - 1]!, t));
        seeds.push({ orbit, param: t });
      }
    }
    prevTh = th;
    prevG = gs;
  }
  return seeds;
}

function sameCycle(a: readonly number[], b: readonly number[]): boolean {
  const p = a.length;
  for (let s = 0; s < p; s++) {
    let ok = true;
    for (let i = 0; i < p && ok; i++) ok = Math.abs(a[i]! - b[(i + s) % p]!) <= 1e-7 * (1 + Math.abs(a[i]!));
    if (ok) return true;
  }
  return false;
}

function floatDerivative(so: unknown, x: number, th: number): number {
  const A = createFloatArithmetic();
  const buf = { out: [0, 0], jac: [0, 0, 0, 0], hess: new Array<number>(8).fill(0) };
  return derivs({ A, so } as Evals<number>, x, th, buf)[1];
}
