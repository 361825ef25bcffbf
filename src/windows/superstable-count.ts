/**
 * Counting superstable parameters of a one-dimensional family (issue 10, "exactly N"): for a
 * critical point c (an exact decimal with f_x(c, θ) = 0 for every θ in the range, e.g. c = 1/2 for
 * r·x·(1 − x)), the parameters θ in [lo, hi] whose orbit of c is periodic of minimal period n with
 * all points in the region D are exactly N.
 *
 * The system (unknowns u = (x_1, …, x_{n−1}, θ), x_0 = c fixed):
 *   G_0 = x_1 − f(c, θ),  G_i = x_{i+1} − f(x_i, θ) (0 < i < n−1),  G_{n−1} = c − f(x_{n−1}, θ)
 * (n = 1: the one unknown θ and G_0 = c − f(c, θ)). Its zeros are the θ with f^n(c, θ) = c.
 * [lo, hi] is tiled by leaves, left to right:
 *  - `none` R: the chain X_1 = f(c, R) ∩ D, X_{i+1} = f(X_i, R) ∩ D dies or f(X_{n−1}, R) ∌ c:
 *    no zero with θ ∈ R;
 *  - `unique` R = Z_θ: Krawczyk K(Z) ⊂ int Z on the system (one zero in Z, in the interior of R),
 *    and the chain over R lies in Z_x (every zero with θ ∈ R is in Z): exactly one zero with θ ∈ R.
 *    Its minimal period is n when the point boxes c, Z_1, … show it (X_i ∩ X_{i+n/q} = ∅ for
 *    primes q | n); otherwise a `lower` proof: one zero of the period-d system (d | n, d < n) in
 *    boxes Y ⊆ ∩_k Z_{i+kd} with θ-box inside R; repeated, it is a zero in Z, so the only one.
 * Count = number of `unique` leaves of minimal period n. Leaves are found by bisection; a leaf
 * narrower than `newtonWidth` that is not excluded tries float Newton from its midpoint
 * (@heuristic) and, when proven, is split around the Krawczyk box.
 */
import { Decimal } from 'decimal.js';
import { resetStatus, type IntervalArithmetic } from '../interval/arithmetic.js';
import { decimalOfDouble } from '../interval/decimal-literal.js';
import { createFloatArithmetic } from '../interval/float-arith.js';
import { intervalArithmetic } from '../interval/interval-arith.js';
import type { Interval } from '../interval/interval.js';
import { compileMap, withParameterAsState } from '../model/compile.js';
import type { MapDefinition, ParamValue } from '../model/types.js';
import type { DecimalPair } from '../prove/types.js';
import { newtonOn } from './edges.js';
import { floatInverseOfColumns, sparseKrawczyk, type SparseColumn } from './sparse-krawczyk.js';

export interface OrbitOfCritical {
  /** θ-box (exact decimals), the x_1..x_{d−1} boxes and the Krawczyk centre (x then θ). */
  param: DecimalPair;
  boxes: DecimalPair[];
  centre: string[];
  centreParam: string;
}

export type CountLeaf =
  | { kind: 'none'; param: DecimalPair }
  | (OrbitOfCritical & { kind: 'unique'; minimalPeriod: number | null; lower?: OrbitOfCritical & { divisor: number } });

export type SuperstableCountVerdict =
  | { status: 'proven'; count: number; leaves: CountLeaf[]; region: DecimalPair; lowerPeriod: number }
  | { status: 'undecided'; at: DecimalPair; reason: string; leavesSoFar: number };

export interface SuperstableCountOptions {
  /** Most leaves (default 2 000 000). */
  maxLeaves?: number;
  /** Leaves narrower than this (relative to the range) try Newton before splitting (default 2^-12). */
  newtonWidth?: number;
  /** Smallest leaf (relative, default 2^-50). */
  minWidth?: number;
}

const Dd = Decimal.clone({ precision: 40 });

/** G(u) and its sparse Jacobian columns for the period-q system through c; u = (x_1..x_{q−1}, θ). */
export function criticalSystem<T>(A: { fromNumber(x: number): T; sub(a: T, b: T): T; neg(a: T): T }, ev: { imageAndJacobian(x: readonly T[], out: T[], jac: T[]): void }, c: T, u: readonly T[]): { G: T[]; cols: SparseColumn<T>[] } {
  const q = u.length;
  const th = u[q - 1]!;
  const z = A.fromNumber(0);
  const out = [z, z];
  const jac = [z, z, z, z];
  const G: T[] = [];
  const cols: SparseColumn<T>[] = [];
  const thRows: number[] = [];
  const thVals: T[] = [];
  for (let i = 0; i < q; i++) {
    const x = i === 0 ? c : u[i - 1]!;
    ev.imageAndJacobian([x, th], out, jac);
    const next = i === q - 1 ? c : u[i]!;
    G.push(A.sub(next, out[0]!));
    thRows.push(i);
    thVals.push(A.neg(jac[1]!));
    // column of x_i (i ≥ 1): row i (−f_x), row i − 1 (+1)
    if (i >= 1) cols.push({ rows: [i, i - 1], values: [A.neg(jac[0]!), A.fromNumber(1)] });
  }
  cols.push({ rows: thRows, values: thVals });
  return { G, cols };
}

/**
 * Count the θ in [lo, hi] with f^n(c, θ) = c of minimal period n (orbit in the region), n ≥ 1.
 * The caller states c; the certificate's checker also verifies f_x(c, θ) = 0 over the range.
 */
export function countSuperstable(def: MapDefinition, overrides: Record<string, ParamValue>, name: string, range: DecimalPair, period: number, critical: string, opts: SuperstableCountOptions = {}): SuperstableCountVerdict {
  if (def.state.length !== 1) throw new RangeError('countSuperstable: one-dimensional maps only');
  const base = compileMap(def, { ...overrides, [name]: { kind: 'interval', lo: range[0], hi: range[1] } });
  const ext = withParameterAsState(base, name);
  const A: IntervalArithmetic<Interval> = intervalArithmetic();
  const ev = ext.evaluator(A);
  const F = createFloatArithmetic();
  const evF = ext.evaluator(F);
  const region = def.region[def.state[0]!]!;
  const D = A.hull(A.fromDecimal(region[0]), A.fromDecimal(region[1]));
  const c = A.fromDecimal(critical);
  const cF = Number(critical);
  const thLo = Number(range[0]);
  const thHi = Number(range[1]);
  const width = thHi - thLo;
  const minWidth = (opts.minWidth ?? 2 ** -44) * width;
  const maxLeaves = opts.maxLeaves ?? 2_000_000;
  const out = [A.fromNumber(0), A.fromNumber(0)];
  const jac = [A.fromNumber(0), A.fromNumber(0), A.fromNumber(0), A.fromNumber(0)];
  const divisors: number[] = [];
  for (let d = 1; d < period; d++) if (period % d === 0) divisors.push(d);
  const xs = new Float64Array(2);
  const ys = new Float64Array(2);
  const gap = (th: number): number => {
    let x = cF;
    for (let i = 0; i < period; i++) {
      xs[0] = x;
      xs[1] = th;
      ext.evalFloat(xs, ys);
      x = ys[0]!;
    }
    return x - cF;
  };

  // phase 1 (@heuristic seeds, proven boxes): sign changes of f^n(c, θ) − c on a grid
  const zeros: Extract<CountLeaf, { kind: 'unique' }>[] = [];
  const addSeeds = (a: number, b: number, samples: number): number => {
    let added = 0;
    let prevT = a;
    let prevG = gap(a);
    for (let k = 1; k <= samples; k++) {
      const t = a + ((b - a) * k) / samples;
      const g = gap(t);
      if (Number.isFinite(g) && Number.isFinite(prevG) && g * prevG <= 0) {
        const z = proveNear(prevG === 0 ? prevT : g === 0 ? t : (prevT + t) / 2);
        if (z && insert(z)) added++;
      }
      prevT = t;
      prevG = g;
    }
    return added;
  };
  addSeeds(thLo, thHi, Math.min(1 << 18, Math.max(4096, 1 << (period + 8))));

  // phase 2: exclude the gaps between the zeros' θ-boxes; a stuck leaf gets a local seed search
  for (let round = 0; round < 64; round++) {
    const leaves: CountLeaf[] = [];
    let stuck: DecimalPair | null = null;
    let at = range[0];
    for (const z of [...zeros, null]) {
      const end = z ? z.param[0] : range[1];
      if (new Dd(at).lt(end)) {
        const r = excludeGap([at, end], leaves);
        if (r !== null) {
          stuck = r;
          break;
        }
      }
      if (z) {
        leaves.push(z);
        at = z.param[1];
      }
      if (leaves.length > maxLeaves) return { status: 'undecided', at: [at, at], reason: 'leaf budget exhausted', leavesSoFar: leaves.length };
    }
    if (stuck === null) {
      const count = zeros.filter((z) => z.minimalPeriod === period).length;
      return { status: 'proven', count, leaves, region: [region[0], region[1]], lowerPeriod: zeros.length - count };
    }
    if (addSeeds(Number(stuck[0]), Number(stuck[1]), 4096) === 0) {
      return { status: 'undecided', at: stuck, reason: 'neither excluded nor a proven zero at the smallest width', leavesSoFar: leaves.length };
    }
  }
  return { status: 'undecided', at: range, reason: 'too many rounds of local seed search', leavesSoFar: 0 };

  /** Insert a proven zero (sorted by θ); false when it overlaps one already there. */
  function insert(z: Extract<CountLeaf, { kind: 'unique' }>): boolean {
    const lo = new Dd(z.param[0]);
    const hi = new Dd(z.param[1]);
    if (lo.lt(range[0]) || hi.gt(range[1])) return false;
    let k = 0;
    while (k < zeros.length && new Dd(zeros[k]!.param[1]).lte(lo)) k++;
    if (k < zeros.length && new Dd(zeros[k]!.param[0]).lt(hi)) return false;
    zeros.splice(k, 0, z);
    return true;
  }

  /** Bisect [lo, hi] into `none` leaves; returns the first leaf that could not be excluded. */
  function excludeGap(g: DecimalPair, leaves: CountLeaf[]): DecimalPair | null {
    const stack: DecimalPair[] = [g];
    while (stack.length > 0) {
      const [loS, hiS] = stack.pop()!;
      const R = A.hull(A.fromDecimal(loS), A.fromDecimal(hiS));
      if (excluded(R)) {
        leaves.push({ kind: 'none', param: [loS, hiS] });
        continue;
      }
      const w = A.widUp(R);
      const mid = decimalOfDouble(A.midNumber(R));
      if (w <= minWidth || !(new Dd(mid).gt(loS) && new Dd(mid).lt(hiS))) return [loS, hiS];
      stack.push([mid, hiS], [loS, mid]);
    }
    return null;
  }

  /**
   * No θ ∈ R with f^n(c, θ) = c and the orbit in D: the chain X_{i+1} = f(X_i, R) ∩ D dies or
   * misses c, or the mean-value form x_n(m) − c + X'_n·(R − m) excludes 0, with
   * X'_{i+1} = f_x(X_i, R)·X'_i + f_θ(X_i, R) over the chain without ∩ D (the θ-derivative of
   * x_i(θ) for every θ ∈ R) and x_i(m) the point chain at the float midpoint m (each step the
   * natural and the centred enclosure intersected).
   */
  function excluded(R: Interval): boolean {
    let X = c;
    resetStatus(A);
    for (let i = 0; i < period; i++) {
      ev.image([X, R], out);
      if (!A.status.continuous) return false;
      if (i < period - 1) {
        const Y = A.intersect(out[0]!, D);
        if (Y === null) return true;
        X = Y;
      } else if (A.disjoint(out[0]!, c)) return true;
    }
    const m = A.midPoint(R);
    let Xm = c;
    let Xr = c;
    let dX = A.fromNumber(0);
    resetStatus(A);
    for (let i = 0; i < period; i++) {
      ev.imageAndJacobian([Xr, R], out, jac);
      dX = A.add(A.mul(jac[0]!, dX), jac[1]!);
      Xr = out[0]!;
      // the point chain in centred form f(x̃, m) + f_x(X, m)(X − x̃): natural evaluation of a
      // thin interval grows like r^i (dependency in r·x·(1 − x)), the centred form like |f_x|
      const xt = A.midPoint(Xm);
      ev.image([xt, m], out);
      const fpt = out[0]!;
      ev.imageAndJacobian([Xm, m], out, jac);
      Xm = A.intersect(out[0]!, A.add(fpt, A.mul(jac[0]!, A.sub(Xm, xt)))) ?? out[0]!;
    }
    if (!A.status.continuous) return false;
    const g = A.add(A.sub(Xm, c), A.mul(dX, A.sub(R, m)));
    const zero = A.fromNumber(0);
    return A.certainlyLt(g, zero) || A.certainlyLt(zero, g);
  }

  /** Newton from θ0, Krawczyk, then the widest θ-box (the gaps beside it are then easy to exclude). */
  function proveNear(th0: number): Extract<CountLeaf, { kind: 'unique' }> | null {
    const orbit: number[] = [];
    let x = cF;
    for (let i = 1; i < period; i++) {
      xs[0] = x;
      xs[1] = th0;
      ext.evalFloat(xs, ys);
      x = ys[0]!;
      orbit.push(x);
    }
    const cf = F.fromNumber(cF);
    const u = newtonOn((uu) => criticalSystem(F, evF, cf, uu), [...orbit, th0]);
    if (u === null || !u.every(Number.isFinite)) return null;
    const th = u[period - 1]!;
    for (const rel of [1e-9, 1e-11, 1e-13]) {
      const z = proveOnTheta(u, th - rel * width, th + rel * width);
      if (z) return z;
    }
    const tight = proveAt(u);
    return tight ? proveOnTheta(u, Number(tight.param[0]), Number(tight.param[1]), tight.param) : null;
  }

  /**
   * Krawczyk on X = (chain over Θ, inflated; Θ) with Θ = [a, b] (exact decimals of the doubles):
   * one zero in X, and every zero with θ ∈ Θ has its points in the chain, inside X.
   */
  function proveOnTheta(u: number[], a: number, b: number, exact?: DecimalPair): Extract<CountLeaf, { kind: 'unique' }> | null {
    const thS: DecimalPair = exact ?? [decimalOfDouble(a), decimalOfDouble(b)];
    const T = A.hull(A.fromDecimal(thS[0]), A.fromDecimal(thS[1]));
    const X: Interval[] = [];
    let Y = c;
    resetStatus(A);
    for (let i = 0; i < period - 1; i++) {
      ev.image([Y, T], out);
      const next = A.intersect(out[0]!, D);
      if (next === null) return null;
      X.push(A.inflate(next, 0.01 * A.widUp(next) + 1e-15 * (1 + A.magUp(next))));
      Y = next;
    }
    X.push(T);
    const m = [...u.slice(0, period - 1).map((v, i) => (A.isSubset(A.fromNumber(v), X[i]!) ? A.fromNumber(v) : A.midPoint(X[i]!))), A.midPoint(T)];
    const Gm = criticalSystem<Interval>(A, ev, c, m).G;
    const { cols } = criticalSystem<Interval>(A, ev, c, X);
    if (!A.status.continuous) return null;
    const C = floatInverseOfColumns(A, cols);
    if (C === null || sparseKrawczyk(A, m, Gm, cols, X, C).kind !== 'inside') return null;
    const o = pack(X, m);
    o.param = thS;
    return decideMinimal(o);
  }

  /** Epsilon-inflation and Krawczyk around a float zero u of the period-(u.length) system. */
  function proveAt(u: number[]): OrbitOfCritical | null {
    const m = u.map((v) => A.fromNumber(v));
    resetStatus(A);
    const Gm = criticalSystem<Interval>(A, ev, c, m).G;
    if (!A.status.continuous) return null;
    let X = m.map((v) => A.inflate(v, 1e-15 * (1 + Math.abs(A.midNumber(v)))));
    let C: Float64Array | null = null;
    for (let it = 0; it < 25; it++) {
      resetStatus(A);
      const { cols } = criticalSystem<Interval>(A, ev, c, X);
      if (!A.status.continuous) return null;
      if (C === null) C = floatInverseOfColumns(A, cols);
      if (C === null) return null;
      const k = sparseKrawczyk(A, m, Gm, cols, X, C);
      if (k.kind === 'inside') return pack(X, m);
      if (k.kind === 'excluded') return null;
      X = k.image.map((v, i) => {
        const h = A.hull(v, X[i]!);
        return A.inflate(h, 0.1 * A.widUp(h) + 1e-15 * (1 + Math.abs(A.midNumber(h))));
      });
    }
    return null;
  }

  function pack(X: Interval[], m: Interval[]): OrbitOfCritical {
    const q = X.length;
    const dec = (v: Interval): DecimalPair => {
      const t = A.toDecimal(v);
      return [t.lo, t.hi];
    };
    return {
      param: dec(X[q - 1]!),
      boxes: X.slice(0, q - 1).map(dec),
      centre: m.slice(0, q - 1).map((v) => decimalOfDouble(A.midNumber(v))),
      centreParam: decimalOfDouble(A.midNumber(m[q - 1]!)),
    };
  }

  /** Minimal period n shown by disjoint boxes, or the zero reduced to a divisor d (`lower`); null when neither. */
  function decideMinimal(cur: OrbitOfCritical): Extract<CountLeaf, { kind: 'unique' }> | null {
    const pts: [number, number][] = [[cF, cF], ...cur.boxes.map(([a, b]) => [Number(a), Number(b)] as [number, number])];
    if (minimalShown(pts, period)) return { kind: 'unique', ...cur, minimalPeriod: period };
    for (const d of divisors) {
      // the period-d system on Y_i = ∩_k Z_{i+kd} (c ∈ Z_{kd}) with the same θ-box: one zero there,
      // repeated it is a zero in Z, hence the only one
      const Zb = [[critical, critical] as DecimalPair, ...cur.boxes].map(([a, b]) => A.hull(A.fromDecimal(a), A.fromDecimal(b)));
      let ok = true;
      const Y: Interval[] = [];
      for (let i = 0; i < d && ok; i++) {
        let y: Interval | null = Zb[i]!;
        for (let k = i + d; k < period && y; k += d) y = A.intersect(y, Zb[k]!);
        if (y === null || (i === 0 && !A.isSubset(c, y))) ok = false;
        else if (i > 0) Y.push(y);
      }
      if (!ok) continue;
      const R = A.hull(A.fromDecimal(cur.param[0]), A.fromDecimal(cur.param[1]));
      const Xd = [...Y, R];
      const m = Xd.map((v) => A.midPoint(v));
      resetStatus(A);
      const Gm = criticalSystem<Interval>(A, ev, c, m).G;
      const { cols } = criticalSystem<Interval>(A, ev, c, Xd);
      const C = floatInverseOfColumns(A, cols);
      if (C === null || !A.status.continuous || sparseKrawczyk(A, m, Gm, cols, Xd, C).kind !== 'inside') continue;
      return { kind: 'unique', ...cur, minimalPeriod: null, lower: { ...pack(Xd, m), divisor: d } };
    }
    return null;
  }
}

/** X_i ∩ X_{i+p/q} = ∅ for every prime q | p (float ends, exact). */
function minimalShown(boxes: readonly [number, number][], p: number): boolean {
  for (let q = 2, rest = p; q <= rest; q++) {
    if (rest % q !== 0) continue;
    while (rest % q === 0) rest /= q;
    for (let i = 0; i < p; i++) {
      const u = boxes[i]!;
      const v = boxes[(i + p / q) % p]!;
      if (!(u[1] < v[0] || v[1] < u[0])) return false;
    }
  }
  return true;
}
