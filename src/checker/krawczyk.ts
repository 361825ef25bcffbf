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

export interface Shooting {
  c: IvCtx;
  ev: Evaluator;
  step: Node[];
  p: number;
  n: number;
}

/** f(x) and (optionally) Df over the box x (row-major n×n). */
export function image(s: Shooting, x: readonly Iv[], grad: boolean): { f: Iv[]; jac: Iv[] | null } {
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
}
const floatField: Field<number> = {
  zero: 0,
  one: 1,
  isZero: (a) => a === 0,
  absGt: (a, b) => Math.abs(a) > Math.abs(b),
  sub: (a, b) => a - b,
  mul: (a, b) => a * b,
  div: (a, b) => a / b,
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

/** @heuristic C ≈ mid(J(box))^{-1}; entries below 10^-(digits+3)·(row max) are dropped (any C is valid). */
export function preconditioner(s: Shooting, box: readonly Iv[], highPrecision: boolean): Precond | null {
  const { c, p, n } = s;
  const N = p * n;
  const Dn = c.Near;
  const useDec = highPrecision;
  const F: Field<number> | Field<Decimal> = useDec ? decimalField(Dn) : floatField;
  const zero = F.zero;
  const a: (number | Decimal)[][] = [];
  for (let r = 0; r < N; r++) a.push(new Array(N).fill(zero));
  for (let i = 0; i < p; i++) {
    const { jac } = image(s, box.slice(i * n, i * n + n), true);
    for (let r = 0; r < n; r++) {
      for (let q = 0; q < n; q++) {
        const mid = c.midpoint(jac![r * n + q]!);
        const v = useDec ? Dn.sub(0, mid) : -Number(mid.toString());
        a[i * n + r]![i * n + q] = v;
      }
      const col = ((i + 1) % p) * n + r;
      const cur = a[i * n + r]![col]!;
      a[i * n + r]![col] = useDec ? Dn.add(cur as Decimal, 1) : (cur as number) + 1;
    }
  }
  const inv = (useDec ? invert(F as Field<Decimal>, a as Decimal[][]) : invert(F as Field<number>, a as number[][])) as
    | (number | Decimal)[][]
    | null;
  if (!inv) return null;
  const cols: Int32Array[] = [];
  const vals: Decimal[][] = [];
  const drop = useDec ? new c.Near('10').pow(-(c.digits + 3)) : 1e-20;
  for (let r = 0; r < N; r++) {
    let rowMax = 0;
    let rowMaxD: Decimal | null = null;
    for (let j = 0; j < N; j++) {
      const v = inv[j]![r]!;
      if (useDec) rowMaxD = rowMaxD === null || (v as Decimal).abs().gt(rowMaxD) ? (v as Decimal).abs() : rowMaxD;
      else rowMax = Math.max(rowMax, Math.abs(v as number));
    }
    if (!useDec && !Number.isFinite(rowMax)) return null;
    const idx: number[] = [];
    const vs: Decimal[] = [];
    for (let j = 0; j < N; j++) {
      const v = inv[j]![r]!;
      if (useDec) {
        const d = v as Decimal;
        if (d.isZero() || d.abs().lt(Dn.mul(drop as Decimal, rowMaxD!))) continue;
        idx.push(j);
        vs.push(new c.Down(d));
      } else {
        const x = v as number;
        if (x === 0 || Math.abs(x) < rowMax * (drop as number)) continue;
        idx.push(j);
        vs.push(new c.Down(String(x))); // the exact value of the shortest decimal string: C is any fixed matrix
      }
    }
    cols.push(Int32Array.from(idx));
    vals.push(vs);
  }
  return { cols, vals };
}

export type KrawczykOutcome =
  | { ok: true; jacobians: Iv[][] }
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
    const { f } = image(s, M.slice(i * n, i * n + n), false);
    const nx = ((i + 1) % p) * n;
    for (let a = 0; a < n; a++) Fm[i * n + a] = c.sub(M[nx + a]!, f[a]!);
  }
  const D: Iv[][] = [];
  for (let q = 0; q < p; q++) D.push(image(s, X.slice(q * n, q * n + n), true).jac!);
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
        reason: `${label}: K(X) not inside the interior of the box at point ${Math.floor(r / n)}, component ${r % n}: K = ${fmt(acc)}, box = ${fmt(box)}, exceeds by ${over.toSD(3).toString()}`,
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

function classify(moduli: Iv[]): Stability['cls'] {
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
  let M = [c.one, c.zero, c.zero, c.one];
  let detProd = c.one;
  for (const d of D) {
    const [a, b, e, f] = d as [Iv, Iv, Iv, Iv];
    M = [
      c.add(c.mul(a, M[0]!), c.mul(b, M[2]!)),
      c.add(c.mul(a, M[1]!), c.mul(b, M[3]!)),
      c.add(c.mul(e, M[0]!), c.mul(f, M[2]!)),
      c.add(c.mul(e, M[1]!), c.mul(f, M[3]!)),
    ];
    detProd = c.mul(detProd, c.sub(c.mul(a, f), c.mul(b, e)));
  }
  const T = c.add(M[0]!, M[3]!);
  const detDirect = c.sub(c.mul(M[0]!, M[3]!), c.mul(M[1]!, M[2]!));
  const det = { lo: c.Down.max(detDirect.lo, detProd.lo), hi: c.Up.min(detDirect.hi, detProd.hi) };
  if (det.lo.gt(det.hi)) throw new DomainViolation('internal: determinant enclosures disjoint');
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
