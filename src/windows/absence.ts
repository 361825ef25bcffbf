/**
 * Absence proofs for one-dimensional maps: no orbit of minimal period p with all its points in
 * the region D = [lo, hi], for every parameter value in the (possibly interval) parameters.
 *
 * Exclusion cover of D for the first point x_0 (DESIGN.md §4 "Exclusion"): each leaf I is
 *  - `empty`: the chain J_0 = I, J_{i+1} = f(J_i) ∩ D becomes empty, or f(J_{p−1}) ∩ I = ∅;
 *    then no orbit in D has x_0 ∈ I (image contraction);
 *  - `lower`: boxes X with I ⊆ X_0 and f(X_i) ∩ D ⊆ X_{i+1} hold every orbit in D with x_0 ∈ I;
 *    Krawczyk shows exactly one zero of the period-p shooting system in X, and exactly one
 *    zero of the period-d system (d | p, d < p) in Y_i = ∩_k X_{i+kd}; that d-orbit, repeated,
 *    is a zero in X, hence the only one: no orbit of minimal period p there.
 * Leaves tile D left to right. A piece narrower than `minWidth` that is neither fails the proof.
 */
import { Decimal } from 'decimal.js';
import { resetStatus } from '../interval/arithmetic.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import type { Interval } from '../interval/interval.js';
import { compileMap } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { floatInverseOfColumns, sparseKrawczyk, type SparseColumn } from './sparse-krawczyk.js';

export type AbsenceLeaf =
  | { kind: 'empty'; x: DecimalPair }
  | { kind: 'multiplier'; x: DecimalPair }
  | { kind: 'lower'; x: DecimalPair; divisor: number; boxes: DecimalPair[]; centre: string[]; lowerBoxes: DecimalPair[]; lowerCentre: string[] };

export type AbsenceVerdict =
  | { status: 'proven'; leaves: AbsenceLeaf[]; region: DecimalPair }
  | { status: 'undecided'; at: DecimalPair; reason: string; leavesSoFar: number };

export interface AbsenceOptions {
  /** Smallest leaf width (default width(D)·2^-30). */
  minWidth?: number;
  /** Most leaves (default 200 000). */
  maxLeaves?: number;
  /**
   * Instead of "no orbit of minimal period p": "no zero of the period-p shooting system with
   * multiplier Λ = +1 (fold) / −1 (flip)". Leaves are then `empty` or `multiplier` (the chain's
   * Λ = Π f'(J_i) enclosure misses ±1).
   */
  condition?: 'fold' | 'flip';
}

const Dd = Decimal.clone({ precision: 40 });

/** Krawczyk for the period-q shooting system of a 1-D map over boxes X (centre = float midpoints). */
function shootingInside(ev: ReturnType<ReturnType<typeof compileMap>['evaluator']>, A: ReturnType<typeof intervalArithmetic>, X: Interval[]): Interval[] | null {
  const q = X.length;
  const m = X.map((x) => A.midPoint(x));
  resetStatus(A);
  const fx = [A.fromNumber(0)];
  const jac = [A.fromNumber(0)];
  const Gm: Interval[] = [];
  for (let i = 0; i < q; i++) {
    ev.image([m[i]!], fx);
    Gm.push(A.sub(m[(i + 1) % q]!, fx[0]!));
  }
  const cols: SparseColumn<Interval>[] = [];
  for (let i = 0; i < q; i++) {
    ev.imageAndJacobian([X[i]!], fx, jac);
    cols.push({ rows: [i, (i - 1 + q) % q], values: [A.neg(jac[0]!), A.fromNumber(1)] });
  }
  if (!A.status.continuous) return null;
  const C = floatInverseOfColumns(A, cols);
  if (C === null) return null;
  return sparseKrawczyk(A, m, Gm, cols, X, C).kind === 'inside' ? m : null;
}

export function proveAbsence(def: MapDefinition, overrides: Record<string, ParamValue>, period: number, opts: AbsenceOptions = {}): AbsenceVerdict {
  if (def.state.length !== 1) throw new RangeError('proveAbsence: one-dimensional maps only');
  const map = compileMap(def, overrides);
  const A = intervalArithmetic();
  const ev = map.evaluator(A);
  const region = def.region[def.state[0]!]!;
  const Dlo = A.fromDecimal(region[0]);
  const Dhi = A.fromDecimal(region[1]);
  const D = A.hull(Dlo, Dhi);
  const minWidth = opts.minWidth ?? A.widUp(D) * 2 ** -30;
  const maxLeaves = opts.maxLeaves ?? 200_000;
  const divisors: number[] = [];
  for (let d = 1; d < period; d++) if (period % d === 0) divisors.push(d);
  const leaves: AbsenceLeaf[] = [];
  const out = [A.fromNumber(0)];
  const img = (x: Interval): Interval | null => {
    resetStatus(A);
    ev.image([x], out);
    return A.status.continuous ? out[0]! : null;
  };
  const dec = (x: Interval): DecimalPair => {
    const t = A.toDecimal(x);
    return [t.lo, t.hi];
  };
  // leaf ends are exact decimals: region ends, then float midpoints (exact as decimals)
  const stack: [string, string][] = [[region[0], region[1]]];
  while (stack.length > 0) {
    const [loS, hiS] = stack.pop()!;
    const I = A.hull(A.fromDecimal(loS), A.fromDecimal(hiS));
    let J: Interval | null = I;
    let empty = false;
    for (let i = 0; i < period && !empty; i++) {
      const f = img(J!);
      if (f === null) break;
      J = i < period - 1 ? A.intersect(f, D) : A.intersect(f, I);
      if (J === null) empty = true;
    }
    if (empty) {
      leaves.push({ kind: 'empty', x: [loS, hiS] });
      continue;
    }
    if (opts.condition && multiplierMisses(I, opts.condition === 'fold' ? 1 : -1)) {
      leaves.push({ kind: 'multiplier', x: [loS, hiS] });
      continue;
    }
    const w = A.widUp(I);
    if (!opts.condition && w <= A.widUp(D) / 16) {
      const lower = tryLower(I);
      if (lower) {
        leaves.push({ ...lower, x: [loS, hiS] });
        continue;
      }
    }
    if (w <= minWidth || leaves.length >= maxLeaves) {
      return { status: 'undecided', at: [loS, hiS], reason: leaves.length >= maxLeaves ? 'leaf budget exhausted' : 'neither excluded nor a lower-period orbit at the smallest width', leavesSoFar: leaves.length };
    }
    const mid = decimalOfDouble(A.midNumber(I));
    if (!(new Dd(mid).gt(loS) && new Dd(mid).lt(hiS))) {
      return { status: 'undecided', at: [loS, hiS], reason: 'cannot split further in float64', leavesSoFar: leaves.length };
    }
    stack.push([mid, hiS], [loS, mid]);
  }
  return { status: 'proven', leaves, region: [region[0], region[1]] };

  /** Λ = Π f'(J_i) over the chain J_0 = I, J_{i+1} = f(J_i) ∩ D misses `target`. */
  function multiplierMisses(I: Interval, target: number): boolean {
    const jac = [A.fromNumber(0)];
    let J: Interval | null = I;
    let lam = A.fromNumber(1);
    resetStatus(A);
    for (let i = 0; i < period; i++) {
      ev.imageAndJacobian([J!], out, jac);
      lam = A.mul(lam, jac[0]!);
      if (i < period - 1) {
        J = A.intersect(out[0]!, D);
        if (J === null) return true;
      }
    }
    if (!A.status.continuous) return false;
    const t = A.fromNumber(target);
    return A.certainlyLt(lam, t) || A.certainlyLt(t, lam);
  }

  function tryLower(I: Interval): Omit<Extract<AbsenceLeaf, { kind: 'lower' }>, 'x'> | null {
    const X: Interval[] = [A.inflate(I, 0.5 * A.widUp(I) + 1e-300)];
    for (let i = 1; i < period; i++) {
      const f = img(X[i - 1]!);
      if (f === null) return null;
      X.push(A.inflate(f, 1e-9 * A.widUp(f) + 1e-15 * A.magUp(f) + 1e-300));
    }
    const mP = shootingInside(ev, A, X);
    if (mP === null) return null;
    for (const d of divisors) {
      const Y: Interval[] = [];
      for (let i = 0; i < d; i++) {
        let y: Interval | null = X[i]!;
        for (let k = i + d; k < period && y; k += d) y = A.intersect(y, X[k]!);
        if (y === null) break;
        Y.push(y);
      }
      if (Y.length !== d) continue;
      const mD = shootingInside(ev, A, Y);
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

export interface AbsencePiece {
  param: DecimalPair;
  leaves: AbsenceLeaf[];
}

export type RangeAbsenceVerdict =
  | { status: 'proven'; parameter: string; range: DecimalPair; region: DecimalPair; pieces: AbsencePiece[] }
  | { status: 'undecided'; parameter: string; at: DecimalPair; reason: string };

/**
 * Absence for every θ in [lo, hi] (lo = hi allowed): the range is split adaptively (at most
 * `maxDepth` halvings, default 12) and each piece gets an exclusion cover of its own.
 */
export function proveAbsenceOverRange(
  def: MapDefinition,
  overrides: Record<string, ParamValue>,
  name: string,
  range: DecimalPair,
  period: number,
  opts: AbsenceOptions & { maxDepth?: number; maxTotalLeaves?: number } = {},
): RangeAbsenceVerdict {
  // condition set: an edge-free range (no zero of the period-p system with Λ = ±1)
  const maxDepth = opts.maxDepth ?? 12;
  const maxTotal = opts.maxTotalLeaves ?? 400_000;
  const pieces: AbsencePiece[] = [];
  let total = 0;
  const stack: { param: DecimalPair; depth: number }[] = [{ param: range, depth: 0 }];
  let region: DecimalPair = ['0', '0'];
  while (stack.length > 0) {
    const { param, depth } = stack.pop()!;
    const value: ParamValue = param[0] === param[1] ? { kind: 'exact', value: param[0] } : { kind: 'interval', lo: param[0], hi: param[1] };
    const v = proveAbsence(def, { ...overrides, [name]: value }, period, { ...opts, maxLeaves: Math.min(opts.maxLeaves ?? 20_000, maxTotal - total) });
    if (v.status === 'proven') {
      pieces.push({ param, leaves: v.leaves });
      region = v.region;
      total += v.leaves.length;
      continue;
    }
    if (depth >= maxDepth || param[0] === param[1] || total >= maxTotal) {
      return { status: 'undecided', parameter: name, at: param, reason: `${v.reason} (x in [${v.at[0].slice(0, 12)}, ${v.at[1].slice(0, 12)}])` };
    }
    const mid = new Dd(param[0]).plus(param[1]).div(2).toString();
    stack.push({ param: [mid, param[1]], depth: depth + 1 }, { param: [param[0], mid], depth: depth + 1 });
  }
  return { status: 'proven', parameter: name, range, region, pieces };
}
