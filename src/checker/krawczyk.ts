/**
 * Krawczyk test on the multiple-shooting system F_i(x) = x_{(i+1) mod p} − f(x_i), i < p, and the
 * stability enclosures. Rigorous parts: F(m), J(X), C·F(m), I − C·J(X), the product with X − m and
 * the final interior test (exact comparisons against the certificate's own box ends).
 * Non-rigorous part (any C is valid): the preconditioner C ≈ mid(J(X))^{-1} (≈ J(m)^{-1} for smooth
 * maps; better at kinks of abs/min/max), by an LU factorisation
 * with partial pivoting that skips structural zeros, in floats (digits ≤ 17) or in round-to-nearest
 * decimals at the working precision (high-precision certificates).
 */
import type { Decimal } from 'decimal.js';
import { DomainViolation, fmt, isInterior, IvCtx, type Iv } from './interval.js';
import type { Evaluator, Node } from './formula.js';
import type { FixCtx, Fx } from './fixed.js';

export interface Shooting {
  c: IvCtx;
  ev: Evaluator;
  step: Node[];
  p: number;
  n: number;
  /** A map from a flow (flow.ts): the image and Jacobian of the map started at orbit point `point`. */
  flow?: (x: readonly Iv[], grad: boolean, point: number) => { f: Iv[]; jac: Iv[] | null };
}

/** f(x) and (optionally) Df over the box x (row-major n×n). */
export function image(s: Shooting, x: readonly Iv[], grad: boolean, point = 0): { f: Iv[]; jac: Iv[] | null } {
  if (s.flow) return s.flow(x, grad, point);
  const f: Iv[] = [];
  const jac: Iv[] | null = grad ? [] : null;
  for (const node of s.step) {
    const r = s.ev.eval(node, x, grad);
    f.push(r.v);
    if (jac) for (let j = 0; j < s.n; j++) jac.push(r.d ? r.d[j]! : s.c.zero);
  }
  return { f, jac };
}

interface Field<T> {
  zero: T;
  one: T;
  isZero(a: T): boolean;
  absGt(a: T, b: T): boolean;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  /** Non-rigorous conversions: from a decimal, to an exact decimal, decimal exponent of |a|. */
  of(d: Decimal): T;
  dec(a: T): string | Decimal;
  exp10(a: T): number;
}
const floatField: Field<number> = {
  zero: 0,
  one: 1,
  isZero: (a) => a === 0,
  absGt: (a, b) => Math.abs(a) > Math.abs(b),
  sub: (a, b) => a - b,
  mul: (a, b) => a * b,
  div: (a, b) => a / b,
  of: (d) => Number(d.toString()),
  dec: (a) => String(a), // the exact value of the shortest decimal string: C is any fixed matrix
  exp10: (a) => (a === 0 ? -Infinity : Math.floor(Math.log10(Math.abs(a)))),
};
function decimalField(D: Decimal.Constructor): Field<Decimal> {
  return {
    zero: new D('0'),
    one: new D('1'),
    isZero: (a) => a.isZero(),
    absGt: (a, b) => a.abs().gt(b.abs()),
    sub: (a, b) => D.sub(a, b),
    mul: (a, b) => D.mul(a, b),
    div: (a, b) => D.div(a, b),
    of: (d) => new D(d),
    dec: (a) => a,
    exp10: (a) => (a.isZero() ? -Infinity : a.e),
  };
}

/** @heuristic inverse of a (N×N, overwritten), returned as columns; null when singular. */
function invert<T>(F: Field<T>, a: T[][]): T[][] | null {
  const N = a.length;
  const pivots: number[] = [];
  const lower: { i: number; f: T }[][] = [];
  for (let k = 0; k < N; k++) {
    let piv = k;
    for (let i = k + 1; i < N; i++) if (F.absGt(a[i]![k]!, a[piv]![k]!)) piv = i;
    if (F.isZero(a[piv]![k]!)) return null;
    [a[k], a[piv]] = [a[piv]!, a[k]!];
    pivots.push(piv);
    const rk = a[k]!;
    const nz: number[] = [];
    for (let j = k + 1; j < N; j++) if (!F.isZero(rk[j]!)) nz.push(j);
    const ops: { i: number; f: T }[] = [];
    for (let i = k + 1; i < N; i++) {
      const ri = a[i]!;
      if (F.isZero(ri[k]!)) continue;
      const f = F.div(ri[k]!, rk[k]!);
      ops.push({ i, f });
      for (const j of nz) ri[j] = F.sub(ri[j]!, F.mul(f, rk[j]!));
    }
    lower.push(ops);
  }
  const upper = a.map((row, k) => {
    const cols: number[] = [];
    for (let j = k + 1; j < N; j++) if (!F.isZero(row[j]!)) cols.push(j);
    return cols;
  });
  const cols: T[][] = [];
  for (let j = 0; j < N; j++) {
    // replay the elimination (swaps and row operations) on e_j, then back-substitute with U
    const y: T[] = new Array<T>(N).fill(F.zero);
    y[j] = F.one;
    for (let k = 0; k < N; k++) {
      const pv = pivots[k]!;
      if (pv !== k) [y[k], y[pv]] = [y[pv]!, y[k]!];
      const yk = y[k]!;
      if (F.isZero(yk)) continue;
      for (const { i, f } of lower[k]!) y[i] = F.sub(y[i]!, F.mul(f, yk));
    }
    for (let k = N - 1; k >= 0; k--) {
      let s: T = y[k] as T;
      for (const c of upper[k]!) if (!F.isZero(y[c]!)) s = F.sub(s, F.mul(a[k]![c]!, y[c]!));
      y[k] = F.div(s, a[k]![k]!);
    }
    cols.push(y);
  }
  return cols;
}

/** Sparse rows of C: per row the column indices and exact decimal entries. */
export interface Precond {
  cols: Int32Array[];
  vals: Decimal[][];
}

/** @heuristic C ≈ mid(J(box))^{-1}; entries below 10^-20 (floats) or 10^-(digits+3) (decimals) of the row max are dropped (any C is valid). */
export function preconditioner(s: Shooting, box: readonly Iv[], highPrecision: boolean): Precond | null {
  return highPrecision ? precondWith(s, box, decimalField(s.c.Near)) : precondWith(s, box, floatField);
}

function precondWith<T>(s: Shooting, box: readonly Iv[], F: Field<T>): Precond | null {
  const { c, p, n } = s;
  const N = p * n;
  const a: T[][] = [];
  for (let r = 0; r < N; r++) a.push(new Array<T>(N).fill(F.zero));
  for (let i = 0; i < p; i++) {
    const { jac } = image(s, box.slice(i * n, i * n + n), true, i);
    for (let r = 0; r < n; r++) {
      const row = a[i * n + r]!;
      for (let q = 0; q < n; q++) row[i * n + q] = F.sub(F.zero, F.of(c.midpoint(jac![r * n + q]!)));
      const col = ((i + 1) % p) * n + r;
      row[col] = F.sub(row[col]!, F.sub(F.zero, F.one));
    }
  }
  const inv = invert(F, a);
  if (!inv) return null;
  const keep = (F as unknown) === floatField ? 20 : c.digits + 3; // float C is only good to ~16 digits
  const cols: Int32Array[] = [];
  const vals: Decimal[][] = [];
  for (let r = 0; r < N; r++) {
    let top = -Infinity;
    for (let j = 0; j < N; j++) top = Math.max(top, F.exp10(inv[j]![r]!));
    if (!Number.isFinite(top)) return null; // a zero row (singular) or an overflow
    const idx: number[] = [];
    const vs: Decimal[] = [];
    for (let j = 0; j < N; j++) {
      const v = inv[j]![r]!;
      if (F.exp10(v) < top - keep) continue;
      const d = new c.Down(F.dec(v));
      if (!d.isFinite()) return null;
      idx.push(j);
      vs.push(d);
    }
    cols.push(Int32Array.from(idx));
    vals.push(vs);
  }
  return { cols, vals };
}

/** Jacobians over X in fixed point (fixed.ts), when a fixed-point path showed the inclusion. */
export interface FixedJacobians {
  k: FixCtx;
  D: Fx[][];
}

export type KrawczykOutcome =
  | { ok: true; jacobians: Iv[][]; fixedJacobians?: FixedJacobians }
  | { ok: false; reason: string };

/**
 * K(X) = M − C·F(M) + (I − C·J(X))·(X − M) ⊂ int(inner)? M encloses the centre (a point, or a
 * tight box around it when the centre has more digits than the precision), X ⊇ `inner` the box
 * to be tested as written. Domain violations propagate as DomainViolation.
 */
export function krawczyk(s: Shooting, C: Precond, M: readonly Iv[], X: readonly Iv[], inner: readonly Iv[], label: string): KrawczykOutcome {
  const { c, p, n } = s;
  const N = p * n;
  const Fm: Iv[] = new Array(N);
  for (let i = 0; i < p; i++) {
    const { f } = image(s, M.slice(i * n, i * n + n), false, i);
    const nx = ((i + 1) % p) * n;
    for (let a = 0; a < n; a++) Fm[i * n + a] = c.sub(M[nx + a]!, f[a]!);
  }
  const D: Iv[][] = [];
  for (let q = 0; q < p; q++) D.push(image(s, X.slice(q * n, q * n + n), true, q).jac!);
  const Z = X.map((x, i) => c.sub(x, M[i]!));
  const row: (Decimal | undefined)[] = new Array(N);
  const mark = new Uint8Array(p);
  const blocks: number[] = [];
  for (let r = 0; r < N; r++) {
    const cols = C.cols[r]!;
    const vals = C.vals[r]!;
    let acc = M[r]!;
    blocks.length = 0;
    const addBlock = (q: number): void => {
      if (!mark[q]) {
        mark[q] = 1;
        blocks.push(q);
      }
    };
    addBlock(Math.floor(r / n));
    for (let t = 0; t < cols.length; t++) {
      const j = cols[t]!;
      row[j] = vals[t]!;
      acc = c.sub(acc, c.scale(vals[t]!, Fm[j]!));
      const q = Math.floor(j / n);
      addBlock(q);
      addBlock((q + 1) % p);
    }
    for (const q of blocks) {
      const Dq = D[q]!;
      const prev = ((q - 1 + p) % p) * n;
      for (let b = 0; b < n; b++) {
        const col = q * n + b;
        // B = δ(r,col) − C[r,(q−1,b)] + Σ_a C[r,(q,a)]·D_q[a][b]
        let B: Iv = col === r ? c.one : c.zero;
        const cp = row[prev + b];
        if (cp) B = c.sub(B, c.point(cp));
        for (let a = 0; a < n; a++) {
          const ca = row[q * n + a];
          if (ca) B = c.add(B, c.scale(ca, Dq[a * n + b]!));
        }
        acc = c.add(acc, c.mul(B, Z[col]!));
      }
    }
    for (const q of blocks) mark[q] = 0;
    for (let t = 0; t < cols.length; t++) row[cols[t]!] = undefined;
    const box = inner[r]!;
    if (!isInterior(acc, box)) {
      const over = c.Up.max(c.Up.sub(box.lo, acc.lo), c.Up.sub(acc.hi, box.hi));
      return {
        ok: false,
        reason: `${label}: K(X) not inside the interior of the box at point ${Math.floor(r / n)}, component ${r % n}: K = ${fmt(acc, 20)}, box = ${fmt(box, 20)}, exceeds by ${over.toSD(3).toString()}`,
      };
    }
  }
  return { ok: true, jacobians: D };
}

export interface Stability {
  cls: 'attracting' | 'repelling' | 'saddle' | 'undecided';
  multiplier?: Iv;
  trace?: Iv;
  determinant?: Iv;
  moduli?: Iv[];
}

/** The class from enclosures of the eigenvalue moduli. */
export function classify(moduli: Iv[]): Stability['cls'] {
  if (moduli.every((m) => m.hi.lt(1))) return 'attracting';
  if (moduli.every((m) => m.lo.gt(1))) return 'repelling';
  if (moduli.some((m) => m.hi.lt(1)) && moduli.some((m) => m.lo.gt(1))) return 'saddle';
  return 'undecided';
}

/** Enclosures over the box from the Jacobians D_i = Df(X_i). n ≥ 3: undecided. */
export function stability(c: IvCtx, D: Iv[][], n: number): Stability {
  if (n === 1) {
    let m = c.one;
    for (const d of D) m = c.mul(m, d[0]!);
    return { cls: classify([c.abs(m)]), multiplier: m };
  }
  if (n !== 2) return { cls: 'undecided' };
  const mul2 = (x: Iv[], y: Iv[]): Iv[] => [
    c.add(c.mul(x[0]!, y[0]!), c.mul(x[1]!, y[2]!)),
    c.add(c.mul(x[0]!, y[1]!), c.mul(x[1]!, y[3]!)),
    c.add(c.mul(x[2]!, y[0]!), c.mul(x[3]!, y[2]!)),
    c.add(c.mul(x[2]!, y[1]!), c.mul(x[3]!, y[3]!)),
  ];
  const I = [c.one, c.zero, c.zero, c.one];
  // Direct product M = D_{p−1}···D_0, and the same product in moving frames (less wrapping):
  // R_k = Q_k^{-1} D_k Q_{k−1} with Q_k a rotation (point matrix) aligning the first column of
  // mid(D_k Q_{k−1}); M = Q_{p−1} R_{p−1}···R_0 (Q_{−1} = I). Q^{-1} = adj(Q)/det(Q) is enclosed.
  let M = I;
  let R = I;
  let Q = I;
  let detProd = c.one;
  const N = c.Near;
  // the direct product wraps (its width grows like the spectral radius of |D_i|): past 64 steps
  // it is never the tighter one, so only the moving-frame product is formed (cost, not rigour)
  const direct = D.length <= 64;
  for (const d of D) {
    const [a, b, e, f] = d as [Iv, Iv, Iv, Iv];
    if (direct) M = mul2(d, M);
    detProd = c.mul(detProd, c.sub(c.mul(a, f), c.mul(b, e)));
    const B = mul2(d, Q);
    const x = c.midpoint(B[0]!);
    const y = c.midpoint(B[2]!);
    const h = N.sqrt(N.add(N.mul(x, x), N.mul(y, y)));
    const [cs, sn] = h.isZero() ? [new N('1'), new N('0')] : [N.div(x, h).toSD(20), N.div(y, h).toSD(20)];
    const Qn = [c.point(cs), c.point(new c.Down(sn).neg()), c.point(sn), c.point(cs)];
    const dq = c.add(c.mul(Qn[0]!, Qn[3]!), c.sqr(Qn[2]!));
    const inv = c.div(c.one, dq); // Q^{-1} = adj(Q)·(1/det Q), one division
    const Qinv = [c.mul(Qn[3]!, inv), c.mul(Qn[2]!, inv), c.mul(c.neg(Qn[2]!), inv), c.mul(Qn[0]!, inv)];
    R = mul2(mul2(Qinv, B), R);
    Q = Qn;
  }
  const Mf = mul2(Q, R);
  const meet = (u: Iv, v: Iv): Iv => ({ lo: c.Down.max(u.lo, v.lo), hi: c.Up.min(u.hi, v.hi) });
  const detFrames = c.sub(c.mul(Mf[0]!, Mf[3]!), c.mul(Mf[1]!, Mf[2]!));
  const T = direct ? meet(c.add(M[0]!, M[3]!), c.add(Mf[0]!, Mf[3]!)) : c.add(Mf[0]!, Mf[3]!);
  const detDirect = direct ? meet(c.sub(c.mul(M[0]!, M[3]!), c.mul(M[1]!, M[2]!)), detFrames) : detFrames;
  return fromTraceDet(c, T, meet(detDirect, detProd));
}

/** n = 2: the class and the moduli from enclosures T ∋ trace and det ∋ determinant of the monodromy. */
export function fromTraceDet(c: IvCtx, T: Iv, det: Iv): Stability {
  if (det.lo.gt(det.hi) || T.lo.gt(T.hi)) throw new DomainViolation('internal: monodromy enclosures disjoint');
  const disc = c.sub(c.sqr(T), c.scale(new c.Down('4'), det));
  const out: Stability = { cls: 'undecided', trace: T, determinant: det };
  if (disc.lo.gt(0)) {
    const sq = c.sqrt(disc);
    const half = c.literal('0.5');
    const l1 = c.abs(c.mul(half, c.sub(T, sq)));
    const l2 = c.abs(c.mul(half, c.add(T, sq)));
    let small: Iv = { lo: c.Down.min(l1.lo, l2.lo), hi: c.Up.min(l1.hi, l2.hi) };
    const big: Iv = { lo: c.Down.max(l1.lo, l2.lo), hi: c.Up.max(l1.hi, l2.hi) };
    if (big.lo.gt(0)) {
      const alt = c.div(c.abs(det), big); // |λ_small| = |det| / |λ_big|
      small = { lo: c.Down.max(small.lo, alt.lo), hi: c.Up.min(small.hi, alt.hi) };
    }
    out.moduli = [small, big];
  } else if (disc.hi.lt(0)) {
    const r = c.sqrt(det);
    out.moduli = [r, r];
  }
  if (out.moduli) out.cls = classify(out.moduli);
  return out;
}
