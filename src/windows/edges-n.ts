/**
 * Folds and flips of period-p orbits of maps with n ≥ 2 state variables (DESIGN.md §4
 * "Bifurcation edges"): Krawczyk on the augmented system in z = (x_0, …, x_{p−1}, θ), x_i ∈ R^n,
 *   G_{i·n+a} = x_{(i+1) mod p}[a] − f_a(x_i, θ)   (i < p, a < n),
 *   G_{n·p}   = det(M − σI),  σ = +1 (fold) or −1 (flip),  M = Df(x_{p−1})⋯Df(x_0).
 * Its Jacobian needs the second derivatives of f (`FormulaMap.secondOrder` on the map with θ
 * promoted to a state variable) and the derivative of the determinant (Jacobi's formula):
 *   ∂ det(A)/∂z = tr(adj(A) ∂M/∂z),  ∂M/∂x_i[b] = S_i (∂Df(x_i)/∂x_i[b]) P_i,
 * with P_i = Df(x_{i−1})⋯Df(x_0) and S_i = Df(x_{p−1})⋯Df(x_{i+1}), so
 *   ∂g/∂x_i[b] = Σ_{a,c} W_i[c][a] ∂²f_a/∂x_c∂x_b (x_i),  W_i = P_i adj(A) S_i,
 *   ∂g/∂θ      = Σ_i Σ_{a,c} W_i[c][a] ∂²f_a/∂x_c∂θ (x_i).
 * Over an interval arithmetic every quantity is an enclosure over the box (products and sums of
 * enclosures), so K(Z) ⊂ int Z proves exactly one (orbit, θ) in Z with det(M ∓ I) = 0.
 * Determinants and adjugates by cofactor expansion (n ≤ MAX_EDGE_DIMENSION).
 *
 * Seeds (@heuristic): float orbits of the search and the float attractor at sample parameters,
 * refined by float Newton on the augmented system.
 */
import { Decimal } from 'decimal.js';
import { MAX_EDGE_DIMENSION } from '../certificate/limits.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import type { Arithmetic } from '../interval/arithmetic.js';
import { compileMap, withParameterAsState } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { findCandidates } from '../search/find.js';
import { newtonOn, proveAugmentedAt, type EdgeSearchOptions, type ProvenEdge } from './edges.js';
import type { SparseColumn } from './sparse-krawczyk.js';


export type EdgeKindN = 'fold' | 'flip';

/** det of the n×n row-major matrix m (cofactor expansion along the first row). */
export function determinant<T>(A: Arithmetic<T>, m: readonly T[], n: number): T {
  if (n === 1) return m[0]!;
  if (n === 2) return A.sub(A.mul(m[0]!, m[3]!), A.mul(m[1]!, m[2]!));
  let acc = A.fromNumber(0);
  for (let c = 0; c < n; c++) {
    const t = A.mul(m[c]!, determinant(A, minor(m, n, 0, c), n - 1));
    acc = c % 2 === 0 ? A.add(acc, t) : A.sub(acc, t);
  }
  return acc;
}

function minor<T>(m: readonly T[], n: number, row: number, col: number): T[] {
  const out: T[] = [];
  for (let i = 0; i < n; i++) {
    if (i === row) continue;
    for (let j = 0; j < n; j++) if (j !== col) out.push(m[i * n + j]!);
  }
  return out;
}

/** adj(m) (row-major): adj[c][a] = (−1)^(a+c) det(minor(a, c)), so adj(m)·m = det(m)·I. */
export function adjugate<T>(A: Arithmetic<T>, m: readonly T[], n: number): T[] {
  if (n === 1) return [A.fromNumber(1)];
  const out = new Array<T>(n * n);
  for (let a = 0; a < n; a++) {
    for (let c = 0; c < n; c++) {
      const d = determinant(A, minor(m, n, a, c), n - 1);
      out[c * n + a] = (a + c) % 2 === 0 ? d : A.neg(d);
    }
  }
  return out;
}

function matMul<T>(A: Arithmetic<T>, x: readonly T[], y: readonly T[], n: number): T[] {
  const out = new Array<T>(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = A.mul(x[i * n]!, y[j]!);
      for (let k = 1; k < n; k++) s = A.add(s, A.mul(x[i * n + k]!, y[k * n + j]!));
      out[i * n + j] = s;
    }
  }
  return out;
}

function identity<T>(A: Arithmetic<T>, n: number): T[] {
  const out = new Array<T>(n * n);
  for (let i = 0; i < n * n; i++) out[i] = A.fromNumber(i % (n + 1) === 0 ? 1 : 0);
  return out;
}

type SecondOrder<T> = { evaluate(x: readonly T[], out: T[], jac: T[], hess: T[]): void };

/**
 * G(z) and its Jacobian columns for the det(M ∓ I) system of an n-dimensional map; `so` is the
 * second-order evaluator of the map with θ promoted to state variable n (dimension n + 1).
 * Columns: x_i[b] → rows i·n+a (−Df_i[a][b]), ((i−1) mod p)·n+b (+1), n·p (∂g/∂x_i[b]);
 * θ → rows i·n+a (−∂f_a/∂θ), n·p (∂g/∂θ).
 */
export function augmentedSystemN<T>(A: Arithmetic<T>, so: unknown, n: number, kind: EdgeKindN, z: readonly T[], withJacobian: boolean): { G: T[]; cols: SparseColumn<T>[] } {
  const p = (z.length - 1) / n;
  if (!Number.isInteger(p) || p < 1) throw new RangeError(`augmentedSystemN: ${z.length} unknowns do not fit n = ${n}`);
  const N1 = n + 1;
  const th = z[n * p]!;
  const ev = so as SecondOrder<T>;
  const z0 = A.fromNumber(0);
  const xs = new Array<T>(N1).fill(z0);
  const out = new Array<T>(N1).fill(z0);
  const jac = new Array<T>(N1 * N1).fill(z0);
  const hess = new Array<T>(N1 * N1 * N1).fill(z0);
  const f: T[][] = [], Df: T[][] = [], fth: T[][] = [], Hx: T[][] = [], Hth: T[][] = [];
  for (let i = 0; i < p; i++) {
    for (let a = 0; a < n; a++) xs[a] = z[i * n + a]!;
    xs[n] = th;
    ev.evaluate(xs, out, jac, hess);
    f.push(out.slice(0, n));
    const d: T[] = [], ft: T[] = [], hx: T[] = [], ht: T[] = [];
    for (let a = 0; a < n; a++) {
      for (let c = 0; c < n; c++) {
        d.push(jac[a * N1 + c]!);
        // hx[(a·n + c)·n + b] = ∂²f_a/∂x_c∂x_b, ht[a·n + c] = ∂²f_a/∂x_c∂θ
        for (let b = 0; b < n; b++) hx.push(hess[(a * N1 + c) * N1 + b]!);
        ht.push(hess[(a * N1 + c) * N1 + n]!);
      }
      ft.push(jac[a * N1 + n]!);
    }
    Df.push(d); fth.push(ft); Hx.push(hx); Hth.push(ht);
  }
  const G: T[] = [];
  for (let i = 0; i < p; i++) for (let a = 0; a < n; a++) G.push(A.sub(z[((i + 1) % p) * n + a]!, f[i]![a]!));
  // prefix P[i] = Df_{i−1}⋯Df_0, suffix S[i] = Df_{p−1}⋯Df_{i+1}
  const P: T[][] = [identity(A, n)];
  for (let i = 0; i < p; i++) P.push(matMul(A, Df[i]!, P[i]!, n));
  const sigma = A.fromNumber(kind === 'fold' ? 1 : -1);
  const Am = P[p]!.slice();
  for (let a = 0; a < n; a++) Am[a * n + a] = A.sub(Am[a * n + a]!, sigma);
  G.push(determinant(A, Am, n));
  const cols: SparseColumn<T>[] = [];
  if (!withJacobian) return { G, cols };
  const S: T[][] = new Array<T[]>(p);
  S[p - 1] = identity(A, n);
  for (let i = p - 2; i >= 0; i--) S[i] = matMul(A, S[i + 1]!, Df[i + 1]!, n);
  const adj = adjugate(A, Am, n);
  let dgth = z0;
  for (let i = 0; i < p; i++) {
    const W = matMul(A, matMul(A, P[i]!, adj, n), S[i]!, n);
    for (let b = 0; b < n; b++) {
      let dg = z0;
      for (let a = 0; a < n; a++) for (let c = 0; c < n; c++) dg = A.add(dg, A.mul(W[c * n + a]!, Hx[i]![(a * n + c) * n + b]!));
      const rows: number[] = [];
      const values: T[] = [];
      for (let a = 0; a < n; a++) {
        rows.push(i * n + a);
        values.push(A.neg(Df[i]![a * n + b]!));
      }
      rows.push(((i - 1 + p) % p) * n + b, n * p);
      values.push(A.fromNumber(1), dg);
      cols.push({ rows, values });
    }
    for (let a = 0; a < n; a++) for (let c = 0; c < n; c++) dgth = A.add(dgth, A.mul(W[c * n + a]!, Hth[i]![a * n + c]!));
  }
  const rows: number[] = [];
  const values: T[] = [];
  for (let i = 0; i < p; i++) {
    for (let a = 0; a < n; a++) {
      rows.push(i * n + a);
      values.push(A.neg(fth[i]![a]!));
    }
  }
  rows.push(n * p);
  values.push(dgth);
  cols.push({ rows, values });
  return { G, cols };
}

/** Minimal period from point boxes (n coordinates each): X_i ∩ X_{i+p/q} = ∅ for every prime q | p. */
export function minimalFromBoxesN(boxes: readonly [number, number][], p: number, n: number): number | null {
  const disjoint = (i: number, j: number): boolean => {
    for (let a = 0; a < n; a++) {
      const u = boxes[i * n + a]!;
      const v = boxes[j * n + a]!;
      if (u[1] < v[0] || v[1] < u[0]) return true;
    }
    return false;
  };
  for (let q = 2, rest = p; q <= rest; q++) {
    if (rest % q !== 0) continue;
    while (rest % q === 0) rest /= q;
    for (let i = 0; i < p; i++) if (!disjoint(i, (i + p / q) % p)) return null;
  }
  return p;
}

/** @heuristic float orbits (flattened, p·n numbers) of period p at θ = at: the search and the float attractor. */
function sampleOrbitsN(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, at: string, p: number, search: boolean): number[][] {
  const map = compileMap(def, { ...overrides, [name]: { kind: 'exact', value: at } });
  const n = def.state.length;
  const out: number[][] = [];
  if (search) for (const c of findCandidates(map, { period: p })) out.push(c.points.flat());
  let x = new Float64Array(def.state.map((s) => (Number(def.region[s]![0]) + Number(def.region[s]![1])) / 2 + 1e-3));
  const buf = new Float64Array(n);
  for (let k = 0; k < 20000 && x.every(Number.isFinite); k++) {
    map.evalFloat(x, buf);
    x = buf.slice();
  }
  if (x.every(Number.isFinite)) {
    const orbit: number[] = [];
    for (let k = 0; k < p; k++) {
      orbit.push(...x);
      map.evalFloat(x, buf);
      x = buf.slice();
    }
    out.push(orbit);
  }
  return out;
}

function sameCycleN(a: readonly number[], b: readonly number[], n: number): boolean {
  const p = a.length / n;
  for (let s = 0; s < p; s++) {
    let ok = true;
    for (let k = 0; k < p * n && ok; k++) ok = Math.abs(a[k]! - b[(k + s * n) % (p * n)]!) <= 1e-7 * (1 + Math.abs(a[k]!));
    if (ok) return true;
  }
  return false;
}

/**
 * Find and enclose the folds (det(M − I) = 0) and flips (det(M + I) = 0) of period-p orbits of a
 * map with n ≥ 2 state variables in [lo, hi]. Every edge returned is proven (K ⊂ int, unique in
 * its box); the list is what the float seeds led to, not a proof that no other edge exists.
 * `boxes` and `centre` of each edge are flattened point by point (x_0[0..n), x_1[0..n), …).
 */
export function findEdgesN(
  def: MapDefinition,
  overrides: Record<string, ParamValue>,
  name: string,
  range: DecimalPair,
  period: number,
  kinds: readonly EdgeKindN[],
  opts: EdgeSearchOptions = {},
): ProvenEdge[] {
  const n = def.state.length;
  if (n < 2 || n > MAX_EDGE_DIMENSION) throw new RangeError(`findEdgesN: dimension ${n} not in [2, ${MAX_EDGE_DIMENSION}]`);
  const base = compileMap(def, { ...overrides, [name]: { kind: 'interval', lo: range[0], hi: range[1] } });
  const ext = withParameterAsState(base, name);
  const F = createFloatArithmetic();
  const soFloat = ext.secondOrder(F);
  const lo = Number(range[0]);
  const hi = Number(range[1]);
  const S = opts.samples ?? 12;
  const starts: { orbit: number[]; param: number }[] = [...(opts.seeds ?? [])];
  const Dx = Decimal.clone({ precision: 30 });
  for (let s = 0; s < S; s++) {
    const at = new Dx(range[0]).plus(new Dx(range[1]).minus(range[0]).times(s + 0.5).div(S)).toSignificantDigits(12).toString();
    for (const orbit of sampleOrbitsN(def, overrides, name, at, period, opts.search ?? period <= 10)) starts.push({ orbit, param: Number(at) });
  }
  const A = intervalArithmetic();
  const found: ProvenEdge[] = [];
  const seen: { kind: EdgeKindN; th: number; orbit: number[] }[] = [];
  for (const kind of kinds) {
    for (const st of starts) {
      if (st.orbit.length !== period * n) continue;
      const z = newtonOn((zz) => augmentedSystemN(F, soFloat, n, kind, zz, true), [...st.orbit, st.param]);
      if (z === null) continue;
      const th = z[period * n]!;
      if (!(th >= lo && th <= hi)) continue;
      const orbit = z.slice(0, period * n);
      if (seen.some((w) => w.kind === kind && Math.abs(w.th - th) <= 1e-9 * (1 + Math.abs(th)) && sameCycleN(w.orbit, orbit, n))) continue;
      const proof = proveAugmentedAt(ext, (Ai, so, zz, j) => augmentedSystemN(Ai, so, n, kind, zz, j), z);
      if (proof === null) continue;
      const pBox = A.toDecimal(proof.Z[period * n]!);
      if (new Dx(pBox.lo).lt(range[0]) || new Dx(pBox.hi).gt(range[1])) continue;
      seen.push({ kind, th, orbit });
      const boxes: DecimalPair[] = proof.Z.slice(0, period * n).map((b) => {
        const d = A.toDecimal(b);
        return [d.lo, d.hi];
      });
      found.push({
        kind,
        period,
        parameter: name,
        param: [pBox.lo, pBox.hi],
        boxes,
        centre: proof.m.slice(0, period * n).map((v) => decimalOfDouble(A.midNumber(v))),
        centreParam: decimalOfDouble(A.midNumber(proof.m[period * n]!)),
        minimalPeriod: minimalFromBoxesN(proof.Z.slice(0, period * n).map((b) => [b.lo, b.hi]), period, n),
        approx: th,
      });
    }
  }
  return found.sort((u, v) => u.approx - v.approx);
}
