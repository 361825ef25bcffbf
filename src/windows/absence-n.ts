/**
 * Absence proofs for maps with n ≥ 2 state variables: no orbit of minimal period p with all its
 * points in the region box D ⊂ R^n, for every parameter value in the (possibly interval)
 * parameters (DESIGN.md §4 "Exclusion"). The n = 1 version is absence.ts.
 *
 * The cover of D is a bisection tree, written in pre-order: a `split` node halves the current
 * box along `axis` at the exact decimal `at` (lower half first); every other node is a leaf B:
 *  - `empty`: the chain J_0 = B, J_{i+1} = f(J_i) ∩ D (box-wise) becomes empty, or
 *    f(J_{p−1}) ∩ B = ∅: no orbit in D has x_0 ∈ B (image contraction);
 *  - `multiplier` (condition fold / flip only): det(M − σI) over the chain, M the interval
 *    product of Df(J_i), excludes 0, σ = +1 / −1: no zero of the period-p system with x_0 ∈ B
 *    has a multiplier σ;
 *  - `lower`: boxes X (p points) with B ⊆ X_0 and f(X_i) ∩ D ⊆ X_{i+1} hold every orbit in D with
 *    x_0 ∈ B; Krawczyk shows exactly one zero of the period-p shooting system in X, and one of
 *    the period-d system (d | p, d < p) in Y_i ⊆ ∩_k X_{i+kd}: the only zero there has period d.
 * A leaf narrower than `minWidth` (relative to D, every axis) that is none of these fails.
 */
import { Decimal } from 'decimal.js';
import { resetStatus } from '../interval/arithmetic.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import type { Interval } from '../interval/interval.js';
import { compileMap } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { determinant } from './edges-n.js';
import { floatInverseOfColumns, sparseKrawczyk, type SparseColumn } from './sparse-krawczyk.js';

export type AbsenceNode =
  | { kind: 'split'; axis: number; at: string }
  | { kind: 'empty' }
  | { kind: 'multiplier' }
  | { kind: 'lower'; divisor: number; boxes: DecimalPair[]; centre: string[]; lowerBoxes: DecimalPair[]; lowerCentre: string[] };

export type AbsenceNVerdict =
  | { status: 'proven'; cover: AbsenceNode[]; leaves: number; region: DecimalPair[] }
  | { status: 'undecided'; at: DecimalPair[]; reason: string; leavesSoFar: number };

export interface AbsenceNOptions {
  /** Smallest leaf width relative to D's width on every axis (default 2^-24). */
  minRelWidth?: number;
  /** Most leaves (default 200 000). */
  maxLeaves?: number;
  /** Edge-free instead of orbit-free: no zero of the period-p system with det(M − I) = 0 / det(M + I) = 0. */
  condition?: 'fold' | 'flip';
}

const Dd = Decimal.clone({ precision: 40 });

type Ev = ReturnType<ReturnType<typeof compileMap>['evaluator']>;

/** Krawczyk for the period-q shooting system of an n-dimensional map over boxes X (q·n, point by point). */
function shootingInsideN(ev: Ev, A: ReturnType<typeof intervalArithmetic>, X: Interval[], n: number): Interval[] | null {
  const q = X.length / n;
  const m = X.map((x) => A.midPoint(x));
  resetStatus(A);
  const out = new Array<Interval>(n).fill(A.fromNumber(0));
  const jac = new Array<Interval>(n * n).fill(A.fromNumber(0));
  const Gm: Interval[] = [];
  for (let i = 0; i < q; i++) {
    ev.image(m.slice(i * n, i * n + n), out);
    for (let a = 0; a < n; a++) Gm.push(A.sub(m[((i + 1) % q) * n + a]!, out[a]!));
  }
  const cols: SparseColumn<Interval>[] = [];
  for (let i = 0; i < q; i++) {
    ev.imageAndJacobian(X.slice(i * n, i * n + n), out, jac);
    for (let b = 0; b < n; b++) {
      const rows: number[] = [];
      const values: Interval[] = [];
      for (let a = 0; a < n; a++) {
        rows.push(i * n + a);
        values.push(A.neg(jac[a * n + b]!));
      }
      rows.push(((i - 1 + q) % q) * n + b);
      values.push(A.fromNumber(1));
      cols.push({ rows, values });
    }
  }
  if (!A.status.continuous) return null;
  const C = floatInverseOfColumns(A, cols);
  if (C === null) return null;
  return sparseKrawczyk(A, m, Gm, cols, X, C).kind === 'inside' ? m : null;
}

export function proveAbsenceN(def: MapDefinition, overrides: Record<string, ParamValue>, period: number, opts: AbsenceNOptions = {}): AbsenceNVerdict {
  const n = def.state.length;
  if (n < 2) throw new RangeError('proveAbsenceN: n ≥ 2 only (absence.ts is n = 1)');
  const map = compileMap(def, overrides);
  const A = intervalArithmetic();
  const ev = map.evaluator(A);
  const region: DecimalPair[] = def.state.map((s) => [def.region[s]![0], def.region[s]![1]]);
  const D = region.map(([lo, hi]) => A.hull(A.fromDecimal(lo), A.fromDecimal(hi)));
  const Dw = D.map((d) => A.widUp(d));
  const minRel = opts.minRelWidth ?? 2 ** -24;
  const maxLeaves = opts.maxLeaves ?? 200_000;
  const divisors: number[] = [];
  for (let d = 1; d < period; d++) if (period % d === 0) divisors.push(d);
  const cover: AbsenceNode[] = [];
  let leaves = 0;
  const out = new Array<Interval>(n).fill(A.fromNumber(0));
  const jac = new Array<Interval>(n * n).fill(A.fromNumber(0));
  const meet = (u: readonly Interval[], v: readonly Interval[]): Interval[] | null => {
    const r: Interval[] = [];
    for (let a = 0; a < n; a++) {
      const w = A.intersect(u[a]!, v[a]!);
      if (w === null) return null;
      r.push(w);
    }
    return r;
  };
  const img = (x: readonly Interval[]): Interval[] | null => {
    resetStatus(A);
    ev.image(x, out);
    return A.status.continuous ? out.slice() : null;
  };
  const dec = (x: Interval): DecimalPair => {
    const t = A.toDecimal(x);
    return [t.lo, t.hi];
  };
  const stack: DecimalPair[][] = [region];
  while (stack.length > 0) {
    const Bs = stack.pop()!;
    const B = Bs.map(([lo, hi]) => A.hull(A.fromDecimal(lo), A.fromDecimal(hi)));
    if (chainEmpty(B)) {
      cover.push({ kind: 'empty' });
      leaves++;
      continue;
    }
    if (opts.condition && multiplierMisses(B, opts.condition === 'fold' ? 1 : -1)) {
      cover.push({ kind: 'multiplier' });
      leaves++;
      continue;
    }
    const rel = B.map((b, a) => A.widUp(b) / Dw[a]!);
    const widest = rel.indexOf(Math.max(...rel));
    if (!opts.condition && rel[widest]! <= 1 / 16) {
      const lower = tryLower(B);
      if (lower) {
        cover.push(lower);
        leaves++;
        continue;
      }
    }
    if (rel[widest]! <= minRel || leaves >= maxLeaves) {
      return { status: 'undecided', at: Bs, reason: leaves >= maxLeaves ? 'leaf budget exhausted' : 'neither excluded nor a lower-period orbit at the smallest width', leavesSoFar: leaves };
    }
    const [loS, hiS] = Bs[widest]!;
    const mid = decimalOfDouble(A.midNumber(B[widest]!));
    if (!(new Dd(mid).gt(loS) && new Dd(mid).lt(hiS))) {
      return { status: 'undecided', at: Bs, reason: 'cannot split further in float64', leavesSoFar: leaves };
    }
    cover.push({ kind: 'split', axis: widest, at: mid });
    const lower = Bs.slice();
    lower[widest] = [loS, mid];
    const upper = Bs.slice();
    upper[widest] = [mid, hiS];
    stack.push(upper, lower);
  }
  return { status: 'proven', cover, leaves, region };

  function chainEmpty(B: Interval[]): boolean {
    let J: Interval[] | null = B;
    for (let i = 0; i < period; i++) {
      const f = img(J!);
      if (f === null) return false;
      J = meet(f, i < period - 1 ? D : B);
      if (J === null) return true;
    }
    return false;
  }

  /** det(M − σI), M = Π Df(J_i) over the chain J_0 = B, J_{i+1} = f(J_i) ∩ D, misses 0. */
  function multiplierMisses(B: Interval[], sigma: number): boolean {
    let J: Interval[] = B;
    let M: Interval[] | null = null;
    resetStatus(A);
    for (let i = 0; i < period; i++) {
      ev.imageAndJacobian(J, out, jac);
      M = M === null ? jac.slice() : matMul(jac, M);
      if (i < period - 1) {
        const nx = meet(out, D);
        if (nx === null) return true;
        J = nx;
      }
    }
    if (!A.status.continuous) return false;
    const S = M!.map((v, k) => (k % (n + 1) === 0 ? A.sub(v, A.fromNumber(sigma)) : v));
    const g = determinant(A, S, n);
    const zero = A.fromNumber(0);
    return A.certainlyLt(g, zero) || A.certainlyLt(zero, g);
  }

  function matMul(x: readonly Interval[], y: readonly Interval[]): Interval[] {
    const r = new Array<Interval>(n * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = A.mul(x[i * n]!, y[j]!);
        for (let k = 1; k < n; k++) s = A.add(s, A.mul(x[i * n + k]!, y[k * n + j]!));
        r[i * n + j] = s;
      }
    }
    return r;
  }

  function tryLower(B: Interval[]): Extract<AbsenceNode, { kind: 'lower' }> | null {
    const X: Interval[] = B.map((b) => A.inflate(b, 0.5 * A.widUp(b) + 1e-300));
    for (let i = 1; i < period; i++) {
      const f = img(X.slice((i - 1) * n, i * n));
      if (f === null) return null;
      for (const v of f) X.push(A.inflate(v, 1e-9 * A.widUp(v) + 1e-15 * A.magUp(v) + 1e-300));
    }
    const mP = shootingInsideN(ev, A, X, n);
    if (mP === null) return null;
    for (const d of divisors) {
      const Y: Interval[] = [];
      for (let i = 0; i < d * n && Y.length === i; i++) {
        const a = i % n;
        const pt = (i - a) / n;
        let y: Interval | null = X[pt * n + a]!;
        for (let k = pt + d; k < period && y; k += d) y = A.intersect(y, X[k * n + a]!);
        if (y !== null) Y.push(y);
      }
      if (Y.length !== d * n) continue;
      const mD = shootingInsideN(ev, A, Y, n);
      if (mD === null) continue;
      return {
        kind: 'lower',
        divisor: d,
        boxes: X.map(dec),
        centre: mP.map((v) => decimalOfDouble(A.midNumber(v))),
        lowerBoxes: Y.map(dec),
        lowerCentre: mD.map((v) => decimalOfDouble(A.midNumber(v))),
      };
    }
    return null;
  }
}

export interface AbsenceNPiece {
  param: DecimalPair;
  cover: AbsenceNode[];
}

export type RangeAbsenceNVerdict =
  | { status: 'proven'; parameter: string; range: DecimalPair; region: DecimalPair[]; pieces: AbsenceNPiece[]; leaves: number }
  | { status: 'undecided'; parameter: string; at: DecimalPair; reason: string };

/**
 * Absence for every θ in [lo, hi] (lo = hi allowed), n ≥ 2: the range is split adaptively (at
 * most `maxDepth` halvings, default 10) and each piece gets a cover of its own.
 */
export function proveAbsenceOverRangeN(
  def: MapDefinition,
  overrides: Record<string, ParamValue>,
  name: string,
  range: DecimalPair,
  period: number,
  opts: AbsenceNOptions & { maxDepth?: number; maxTotalLeaves?: number } = {},
): RangeAbsenceNVerdict {
  const maxDepth = opts.maxDepth ?? 10;
  const maxTotal = opts.maxTotalLeaves ?? 400_000;
  const pieces: AbsenceNPiece[] = [];
  let total = 0;
  let region: DecimalPair[] = [];
  const stack: { param: DecimalPair; depth: number }[] = [{ param: range, depth: 0 }];
  while (stack.length > 0) {
    const { param, depth } = stack.pop()!;
    const value: ParamValue = param[0] === param[1] ? { kind: 'exact', value: param[0] } : { kind: 'interval', lo: param[0], hi: param[1] };
    const v = proveAbsenceN(def, { ...overrides, [name]: value }, period, { ...opts, maxLeaves: Math.min(opts.maxLeaves ?? 20_000, maxTotal - total) });
    if (v.status === 'proven') {
      pieces.push({ param, cover: v.cover });
      region = v.region;
      total += v.leaves;
      continue;
    }
    if (depth >= maxDepth || param[0] === param[1] || total >= maxTotal) {
      return { status: 'undecided', parameter: name, at: param, reason: `${v.reason} (at ${v.at.map(([a, b]) => `[${a.slice(0, 12)}, ${b.slice(0, 12)}]`).join(' × ')})` };
    }
    const mid = new Dd(param[0]).plus(param[1]).div(2).toString();
    stack.push({ param: [mid, param[1]], depth: depth + 1 }, { param: [param[0], mid], depth: depth + 1 });
  }
  return { status: 'proven', parameter: name, range, region, pieces, leaves: total };
}
