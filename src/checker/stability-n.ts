/**
 * Stability class in dimension n >= 3, re-derived by the checker (decimal.js, directed rounding).
 *
 * Claim. Every eigenvalue of the monodromy M = D_{p−1}···D_0 of the orbit (D_k ⊇ Df(X_k), so M
 * contains Df^p at the orbit point) lies in the union of n Gershgorin discs; when each disc lies
 * strictly inside or strictly outside the unit circle, the union of the inside discs is disjoint
 * from the union of the outside discs, so it holds exactly as many eigenvalues (with multiplicity)
 * as it has discs (Gershgorin 1931, counting form; from memory). All inside: attracting; all
 * outside: repelling; both kinds: saddle. Anything else: undecided (nothing claimed).
 *
 * Discs. The certificate carries an untrusted hint: a complex point matrix V (ideally the
 * eigenvectors of mid M) and R (ideally V⁻¹), as decimal strings. Nothing about them is assumed:
 * with W = R·V and E = I − W enclosed, δ ≥ ‖E‖∞ and δ < 1 checked, W is invertible, so V is, and
 * ‖W⁻¹ − I‖∞ ≤ δ/(1 − δ) (Neumann series). For every real M' in the interval matrix M:
 *   V⁻¹ M' V = W⁻¹ (R M' V) = B + Δ,  B = R·M·V (enclosed),  ‖Δ‖∞ ≤ δ/(1 − δ)·‖B‖∞,
 * and similar matrices have the same eigenvalues, so the discs centred at B_ii with radius
 * Σ_{j≠i} |B_ij| + δ‖B‖∞/(1 − δ) contain them. |z| is bounded above by |re z| + |im z| and below by
 * max(|re z|, |im z|) (both rigorous). Every bound is rounded outward (Down/Up contexts); the
 * literals of V and R are enclosed as intervals, and the argument holds for every point matrix in
 * those enclosures.
 *
 * Cost: O(p·n³) interval operations for M, O(n³) for the discs. Imports: decimal.js (through
 * ./interval.js) only.
 */
import type { Decimal } from 'decimal.js';
import { DomainViolation, isDecimalLiteral, type Iv, type IvCtx } from './interval.js';

/** The untrusted eigenbasis hint of `claims.stability.eigenbasis` (n × n each, decimal strings). */
export interface EigenbasisHint {
  re: string[][];
  im: string[][];
  inverseRe: string[][];
  inverseIm: string[][];
}

export interface StabilityN {
  cls: 'attracting' | 'repelling' | 'saddle' | 'undecided';
  /** Per disc: [lower bound of min |z|, upper bound of max |z|] (when the discs exist). */
  discs?: { lo: Decimal; hi: Decimal }[];
  /** Why nothing was decided (no hint, δ >= 1, ...). */
  why?: string;
}

interface Cx {
  re: Iv;
  im: Iv;
}

/**
 * Reads the hint's four n × n matrices of decimal literals; a message for the first malformed
 * entry (the caller rejects the certificate with it), or the matrices.
 */
export function parseEigenbasis(x: unknown, n: number): EigenbasisHint | string {
  if (typeof x !== 'object' || x === null || Array.isArray(x)) return 'must be an object';
  const o = x as Record<string, unknown>;
  for (const k of Object.keys(o)) if (!['re', 'im', 'inverseRe', 'inverseIm'].includes(k)) return `unknown field "${k}"`;
  const out: Partial<EigenbasisHint> = {};
  for (const k of ['re', 'im', 'inverseRe', 'inverseIm'] as const) {
    const m = o[k];
    if (!Array.isArray(m) || m.length !== n) return `${k} must be an array of ${n} rows`;
    for (let i = 0; i < n; i++) {
      const row = m[i] as unknown;
      if (!Array.isArray(row) || row.length !== n) return `${k}[${i}] must be an array of ${n} entries`;
      for (let j = 0; j < n; j++) {
        const v = row[j] as unknown;
        if (typeof v !== 'string' || v.length > 400 || !isDecimalLiteral(v)) return `${k}[${i}][${j}] must be a decimal literal string`;
      }
    }
    out[k] = m as string[][];
  }
  return out as EigenbasisHint;
}

/** The stability class of the monodromy of the blocks D (each n × n row-major), see the header. */
export function stabilityN(c: IvCtx, D: readonly Iv[][], n: number, hint: EigenbasisHint | null): StabilityN {
  if (hint === null) return { cls: 'undecided', why: 'no eigenbasis hint' };
  // M = D_{p−1}···D_0
  let M: Iv[] = [];
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) M.push(i === j ? c.one : c.zero);
  for (const d of D) M = realMatMul(c, d, M, n);

  const lit = (m: string[][]): Iv[] => m.flat().map((s) => c.literal(s));
  const V: Cx[] = zipCx(lit(hint.re), lit(hint.im));
  const R: Cx[] = zipCx(lit(hint.inverseRe), lit(hint.inverseIm));

  // δ ≥ ‖I − R·V‖∞
  const W = cxMatMul(c, R, V, n);
  let delta = c.Up.add(0, 0);
  for (let i = 0; i < n; i++) {
    let row = c.Up.add(0, 0);
    for (let j = 0; j < n; j++) {
      const w = W[i * n + j]!;
      const e: Cx = { re: c.sub(i === j ? c.one : c.zero, w.re), im: c.neg(w.im) };
      row = c.Up.add(row, magUp(c, e));
    }
    delta = c.Up.max(delta, row);
  }
  if (!delta.lt(1)) return { cls: 'undecided', why: `the eigenbasis hint is not invertible enough (‖I − R·V‖∞ ≤ ${delta.toSD(6).toString()} is not < 1)` };

  // B = R·(M·V)
  const MV: Cx[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let re = c.zero;
      let im = c.zero;
      for (let k = 0; k < n; k++) {
        re = c.add(re, c.mul(M[i * n + k]!, V[k * n + j]!.re));
        im = c.add(im, c.mul(M[i * n + k]!, V[k * n + j]!.im));
      }
      MV.push({ re, im });
    }
  }
  const B = cxMatMul(c, R, MV, n);
  let normB = c.Up.add(0, 0);
  const offRow: Decimal[] = [];
  for (let i = 0; i < n; i++) {
    let row = c.Up.add(0, 0);
    let off = c.Up.add(0, 0);
    for (let j = 0; j < n; j++) {
      const m = magUp(c, B[i * n + j]!);
      row = c.Up.add(row, m);
      if (j !== i) off = c.Up.add(off, m);
    }
    offRow.push(off);
    normB = c.Up.max(normB, row);
  }
  const spill = c.Up.div(c.Up.mul(delta, normB), c.Down.sub(1, delta));
  const discs: { lo: Decimal; hi: Decimal }[] = [];
  for (let i = 0; i < n; i++) {
    const centre = B[i * n + i]!;
    const radius = c.Up.add(offRow[i]!, spill);
    const hi = c.Up.add(magUp(c, centre), radius);
    const lo0 = c.Down.sub(migDown(c, centre), radius);
    discs.push({ lo: lo0.isNegative() ? c.Down.add(0, 0) : lo0, hi });
  }
  for (const d of discs) if (!d.hi.isFinite()) throw new DomainViolation('overflow in the monodromy discs');
  const inside = discs.map((d) => d.hi.lt(1));
  const outside = discs.map((d) => d.lo.gt(1));
  let cls: StabilityN['cls'] = 'undecided';
  if (inside.every(Boolean)) cls = 'attracting';
  else if (outside.every(Boolean)) cls = 'repelling';
  else if (inside.every((b, i) => b || outside[i])) cls = 'saddle';
  return cls === 'undecided' ? { cls, discs, why: 'a Gershgorin disc meets the unit circle' } : { cls, discs };
}

function zipCx(re: Iv[], im: Iv[]): Cx[] {
  return re.map((r, k) => ({ re: r, im: im[k]! }));
}

function realMatMul(c: IvCtx, a: readonly Iv[], b: readonly Iv[], n: number): Iv[] {
  const out: Iv[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let s = c.zero;
      for (let k = 0; k < n; k++) s = c.add(s, c.mul(a[i * n + k]!, b[k * n + j]!));
      out.push(s);
    }
  }
  return out;
}

function cxMatMul(c: IvCtx, a: readonly Cx[], b: readonly Cx[], n: number): Cx[] {
  const out: Cx[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let re = c.zero;
      let im = c.zero;
      for (let k = 0; k < n; k++) {
        const x = a[i * n + k]!;
        const y = b[k * n + j]!;
        re = c.add(re, c.sub(c.mul(x.re, y.re), c.mul(x.im, y.im)));
        im = c.add(im, c.add(c.mul(x.re, y.im), c.mul(x.im, y.re)));
      }
      out.push({ re, im });
    }
  }
  return out;
}

/** Upper bound of |z| over the complex box: |re| + |im|. */
function magUp(c: IvCtx, z: Cx): Decimal {
  return c.Up.add(c.mag(z.re), c.mag(z.im));
}

/** Lower bound of |z| over the complex box: max(mig re, mig im). */
function migDown(c: IvCtx, z: Cx): Decimal {
  const mig = (a: Iv): Decimal => (a.lo.gt(0) ? a.lo : a.hi.lt(0) ? c.negD(a.hi) : c.Down.add(0, 0));
  return c.Down.max(mig(z.re), mig(z.im));
}
