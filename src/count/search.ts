/**
 * Exhaustive search for the zeros of the multiple-shooting system F_i(x) = x_{(i+1) mod p} − f(x_i)
 * in R^p, R = the region (a box of R^n with exactly representable ends): branch and prune on a
 * bisection tree of R^p (DESIGN.md §4, "Exclusion and counting").
 *
 * The tree. Node boxes B are exact dyadic pieces of R^p: the root is R^p; a split halves one
 * component k (point ⌊k/n⌋, coordinate k mod n) at its exact midpoint. The first `pieceDepth`
 * levels split component (level mod n) of point 0 and cut the work into 2^pieceDepth independent
 * pieces (for workers and shards). Each piece is written in preorder as one character per node:
 * a split of component k is ALPHABET[k] followed by the low then the high child; '-' a box with
 * no zero, '*' a box with exactly one zero (recorded), '?' a box left undecided.
 *
 * Each node is decided by (all steps sound: no zero of F in B is ever lost):
 *  1. image contraction, `CONTRACT_SWEEPS` cyclic sweeps X_{i+1} ← X_{i+1} ∩ f(X_i) starting
 *     from X = B (every zero x ∈ B has x_{i+1} = f(x_i)); an empty intersection proves "none";
 *  2. when every component of X is narrower than KRAWCZYK_WIDTH × the region, Krawczyk:
 *     X̃ = X inflated (`inflate`), K = K(X̃); K ⊂ int X̃ proves exactly one zero in X̃ (hence at
 *     most one in B, and that one is the zero recorded with (K, X̃)); otherwise X ← X ∩ K
 *     (zeros in X lie in K), empty ⇒ "none"; up to KRAWCZYK_ITERATIONS times;
 *  3. otherwise split the component where X is widest (relative to the region).
 * A box that would need a split below float resolution is left undecided ('?').
 */
import { addDown, addUp, divDown, divUp, mulDown, mulUp, subDown, subUp } from '../interval/round.js';
import type { FormulaMap } from '../model/compile.js';
import { ShootingEvaluator } from './shooting-box.js';
import { COUNT_ALPHABET } from '../certificate/types.js';
import { CONTRACT_SWEEPS, KRAWCZYK_ITERATIONS, KRAWCZYK_WIDTH, TIGHTEN_ITERATIONS, MEAN_VALUE_WIDTH, MIN_RELATIVE_WIDTH, SPLIT_FIRST_POINT_WIDTH } from './params.js';

export interface PieceResult {
  readonly period: number;
  readonly piece: number;
  /** The preorder code of the piece's subtree. */
  readonly code: string;
  /** Per zero found: K (2N doubles) then X̃ (2N doubles). */
  readonly zeros: Float64Array;
  readonly undecided: number;
  readonly nodes: number;
}

/** Half-width inflation of the Krawczyk box: w/8 + 1e-12·(|lo| + |hi|) + 1e-30 (the checker uses the same rule). */
export function inflation(lo: number, hi: number): number {
  return 0.125 * (hi - lo) + 1e-12 * (Math.abs(lo) + Math.abs(hi)) + 1e-30;
}

export class ShootingCounter {
  readonly n: number;
  readonly N: number;
  private readonly ev: ShootingEvaluator;
  private readonly scale: Float64Array;
  private readonly fbuf: Float64Array;
  private readonly jbuf: Float64Array;
  private readonly X: Float64Array;
  private readonly Xt: Float64Array;
  private readonly K: Float64Array;
  private readonly m: Float64Array;
  private readonly Fm: Float64Array;
  private readonly A: Float64Array;
  private readonly C: Float64Array;
  private readonly D: Float64Array;
  private readonly pool: Float64Array[] = [];
  private readonly pbuf: Float64Array;
  private readonly Xsave: Float64Array;
  private readonly fmbuf: Float64Array;
  private readonly mvbuf: Float64Array;

  constructor(
    map: FormulaMap,
    readonly period: number,
    /** n intervals, exact doubles: [lo0, hi0, lo1, hi1, ...] */
    readonly region: Float64Array,
    readonly pieceDepth: number,
  ) {
    this.ev = new ShootingEvaluator(map);
    const n = map.dim;
    this.n = n;
    const N = n * period;
    this.N = N;
    this.scale = new Float64Array(N);
    for (let k = 0; k < N; k++) this.scale[k] = 1 / (region[2 * (k % n) + 1]! - region[2 * (k % n)]!);
    this.fbuf = new Float64Array(2 * n);
    this.pbuf = new Float64Array(2 * n);
    this.Xsave = new Float64Array(2 * N);
    this.fmbuf = new Float64Array(2 * n);
    this.mvbuf = new Float64Array(2 * n);
    this.jbuf = new Float64Array(2 * n * n);
    this.X = new Float64Array(2 * N);
    this.Xt = new Float64Array(2 * N);
    this.K = new Float64Array(2 * N);
    this.m = new Float64Array(N);
    this.Fm = new Float64Array(2 * N);
    this.A = new Float64Array(N * N);
    this.C = new Float64Array(N * N);
    this.D = new Float64Array(2 * n * n * period);
  }

  /** After decide(B) returned 1 (one zero): copies of K (the zero's enclosure) and X̃ (its uniqueness box). */
  lastZero(): { K: Float64Array; Xt: Float64Array } {
    return { K: this.K.slice(), Xt: this.Xt.slice() };
  }

  get pieceCount(): number {
    return 2 ** this.pieceDepth;
  }

  private slot(h: number): Float64Array {
    while (this.pool.length <= h) this.pool.push(new Float64Array(2 * this.N));
    return this.pool[h]!;
  }

  /** The root box of piece j (exact halvings of component level mod n of point 0). */
  pieceBox(j: number, out: Float64Array): boolean {
    const { n, N, region } = this;
    for (let k = 0; k < N; k++) {
      out[2 * k] = region[2 * (k % n)]!;
      out[2 * k + 1] = region[2 * (k % n) + 1]!;
    }
    for (let l = 0; l < this.pieceDepth; l++) {
      const c = l % n;
      const lo = out[2 * c]!;
      const hi = out[2 * c + 1]!;
      const mid = exactMid(lo, hi);
      if (mid === undefined) return false;
      if ((j >> (this.pieceDepth - 1 - l)) & 1) out[2 * c] = mid;
      else out[2 * c + 1] = mid;
    }
    return true;
  }

  /** Decides piece j completely. */
  runPiece(j: number): PieceResult {
    const root = this.slot(0);
    if (!this.pieceBox(j, root)) {
      return { period: this.period, piece: j, code: '?', zeros: new Float64Array(0), undecided: 1, nodes: 1 };
    }
    return { period: this.period, piece: j, ...this.runRoot() };
  }

  /**
   * Decides the subtree of an explicit root box (2N doubles, exact dyadic splits below it), e.g. a
   * cycle's box sequence of the box graph; same coding as a piece.
   */
  runBox(root: Float64Array): { code: string; zeros: Float64Array; undecided: number; nodes: number } {
    this.slot(0).set(root);
    return this.runRoot();
  }

  private runRoot(): { code: string; zeros: Float64Array; undecided: number; nodes: number } {
    const N = this.N;
    const code: number[] = [];
    let zeros = new Float64Array(64 * N);
    let nz = 0;
    let undecided = 0;
    let nodes = 0;
    let h = 1; // stack height; slot(h-1) is the top box
    while (h > 0) {
      const B = this.slot(--h);
      nodes++;
      const verdict = this.decide(B);
      if (verdict === NONE) {
        code.push(MINUS);
        continue;
      }
      if (verdict === UNIQUE) {
        code.push(STAR);
        if ((nz + 1) * 4 * N > zeros.length) {
          const z = new Float64Array(zeros.length * 2);
          z.set(zeros);
          zeros = z;
        }
        zeros.set(this.K, nz * 4 * N);
        zeros.set(this.Xt, nz * 4 * N + 2 * N);
        nz++;
        continue;
      }
      // split the component where X is widest relative to the region
      const X = this.X;
      let best = -1;
      let bw = -1;
      // split point 0 (the other points follow from it by contraction) while it is not tiny
      for (let k = 0; k < N; k++) {
        if (k === this.n && bw > SPLIT_FIRST_POINT_WIDTH) break;
        const w = (X[2 * k + 1]! - X[2 * k]!) * this.scale[k]!;
        const bwid = (B[2 * k + 1]! - B[2 * k]!) * this.scale[k]!;
        if (w > bw && bwid > MIN_RELATIVE_WIDTH) {
          bw = w;
          best = k;
        }
      }
      const mid = best < 0 ? undefined : exactMid(B[2 * best]!, B[2 * best + 1]!);
      if (mid === undefined) {
        code.push(QUESTION);
        undecided++;
        continue;
      }
      code.push(COUNT_ALPHABET.charCodeAt(best));
      // B (slot h) becomes the high child, slot h+1 the low child (top of the stack: decided first)
      const loChild = this.slot(h + 1);
      loChild.set(B);
      loChild[2 * best + 1] = mid;
      B[2 * best] = mid;
      h += 2;
    }
    let text = '';
    for (let i = 0; i < code.length; i += 8192) text += String.fromCharCode(...code.slice(i, i + 8192));
    return { code: text, zeros: zeros.slice(0, nz * 4 * N), undecided, nodes };
  }

  /** NONE, UNIQUE (K and Xt hold the Krawczyk data) or SPLIT (X holds the contracted box). */
  decide(B: Float64Array): number {
    const { n, N, X, fbuf } = this;
    const p = this.period;
    X.set(B);
    for (let s = 0; s < CONTRACT_SWEEPS; s++) {
      let shrunk = false;
      for (let i = 0; i < p; i++) {
        if (!this.ev.image(X, i, fbuf)) continue;
        const j = ((i + 1) % p) * n;
        const mv = this.meanValue(i);
        for (let a = 0; a < n; a++) {
          const k = j + a;
          const lo = X[2 * k]!;
          const hi = X[2 * k + 1]!;
          let ylo = fbuf[2 * a]!;
          let yhi = fbuf[2 * a + 1]!;
          if (mv) {
            if (this.mvbuf[2 * a]! > ylo) ylo = this.mvbuf[2 * a]!;
            if (this.mvbuf[2 * a + 1]! < yhi) yhi = this.mvbuf[2 * a + 1]!;
          }
          const nlo = ylo > lo ? ylo : lo;
          const nhi = yhi < hi ? yhi : hi;
          if (!(nlo <= nhi)) return NONE;
          if (nhi - nlo < 0.9 * (hi - lo)) shrunk = true;
          X[2 * k] = nlo;
          X[2 * k + 1] = nhi;
        }
        if (mv && n === 1) {
          // backward (n = 1): x_i ∈ m + (x_{i+1} − f(m)) / f'(X_i) when 0 ∉ f'(X_i)
          const dlo = this.jbuf[0]!;
          const dhi = this.jbuf[1]!;
          if (dlo > 0 || dhi < 0) {
            const m = this.pbuf[0]!;
            const tlo = subDown(X[2 * j]!, this.fmbuf[1]!);
            const thi = subUp(X[2 * j + 1]!, this.fmbuf[0]!);
            const qlo = Math.min(divDown(tlo, dlo), divDown(tlo, dhi), divDown(thi, dlo), divDown(thi, dhi));
            const qhi = Math.max(divUp(tlo, dlo), divUp(tlo, dhi), divUp(thi, dlo), divUp(thi, dhi));
            const blo = addDown(m, qlo);
            const bhi = addUp(m, qhi);
            const lo = X[2 * i]!;
            const hi = X[2 * i + 1]!;
            const nlo = blo > lo ? blo : lo;
            const nhi = bhi < hi ? bhi : hi;
            if (!(nlo <= nhi)) return NONE;
            if (nhi - nlo < 0.9 * (hi - lo)) shrunk = true;
            X[2 * i] = nlo;
            X[2 * i + 1] = nhi;
          }
        }
      }
      if (!shrunk) break;
    }
    for (let it = 0; it < KRAWCZYK_ITERATIONS; it++) {
      let widest = 0;
      for (let k = 0; k < N; k++) widest = Math.max(widest, (X[2 * k + 1]! - X[2 * k]!) * this.scale[k]!);
      if (widest > KRAWCZYK_WIDTH) return SPLIT;
      const r = this.krawczyk();
      if (r === UNIQUE) {
        this.tighten();
        return UNIQUE;
      }
      if (r !== SPLIT) return SPLIT; // evaluation failed
      let after = 0;
      for (let k = 0; k < N; k++) {
        const lo = Math.max(X[2 * k]!, this.K[2 * k]!);
        const hi = Math.min(X[2 * k + 1]!, this.K[2 * k + 1]!);
        if (!(lo <= hi)) return NONE;
        X[2 * k] = lo;
        X[2 * k + 1] = hi;
        after = Math.max(after, (hi - lo) * this.scale[k]!);
      }
      if (after > 0.7 * widest) return SPLIT;
    }
    return SPLIT;
  }

  /**
   * After K ⊂ int X̃: K ← K(K) ∩ K a few times (the zero stays in K), so that K is tight and
   * zeros found in two leaves are identified. X̃ (the uniqueness box) is kept.
   */
  private tighten(): void {
    const { N, X, Xt, K } = this;
    const keep = this.Xsave;
    keep.set(Xt);
    for (let it = 0; it < TIGHTEN_ITERATIONS; it++) {
      X.set(K);
      if (this.krawczyk(true) === FAIL) break;
      for (let k = 0; k < N; k++) {
        K[2 * k] = Math.max(K[2 * k]!, X[2 * k]!);
        K[2 * k + 1] = Math.min(K[2 * k + 1]!, X[2 * k + 1]!);
      }
    }
    Xt.set(keep);
  }

  /**
   * Mean-value enclosure of f over point box i of X when it is narrower than MEAN_VALUE_WIDTH of
   * the region: f(m) + Df(X_i)·(X_i − m) into mvbuf (f(m) in fmbuf, m in pbuf, Df(X_i) in jbuf).
   * False when not applicable or an evaluation left its domain.
   */
  private meanValue(i: number): boolean {
    const { n, X, pbuf, fmbuf, mvbuf, jbuf } = this;
    for (let a = 0; a < n; a++) {
      const k = i * n + a;
      if ((X[2 * k + 1]! - X[2 * k]!) * this.scale[k]! > MEAN_VALUE_WIDTH) return false;
      const m = 0.5 * X[2 * k]! + 0.5 * X[2 * k + 1]!;
      pbuf[2 * a] = m;
      pbuf[2 * a + 1] = m;
    }
    if (!this.ev.image(pbuf, 0, fmbuf)) return false;
    if (!this.ev.jacobian(X, i, jbuf)) return false;
    for (let a = 0; a < n; a++) {
      let lo = fmbuf[2 * a]!;
      let hi = fmbuf[2 * a + 1]!;
      for (let b = 0; b < n; b++) {
        const k = i * n + b;
        const m = pbuf[2 * b]!;
        const zlo = subDown(X[2 * k]!, m);
        const zhi = subUp(X[2 * k + 1]!, m);
        const dlo = jbuf[2 * (a * n + b)]!;
        const dhi = jbuf[2 * (a * n + b) + 1]!;
        lo = addDown(lo, Math.min(mulDown(dlo, zlo), mulDown(dlo, zhi), mulDown(dhi, zlo), mulDown(dhi, zhi)));
        hi = addUp(hi, Math.max(mulUp(dlo, zlo), mulUp(dlo, zhi), mulUp(dhi, zlo), mulUp(dhi, zhi)));
      }
      if (!(lo <= hi)) return false;
      mvbuf[2 * a] = lo;
      mvbuf[2 * a + 1] = hi;
    }
    return true;
  }

  /**
   * K(X̃) into this.K with X̃ = inflate(X) in this.Xt. Returns UNIQUE when K ⊂ int X̃, SPLIT when K
   * was computed but is not interior, FAIL when an evaluation left its domain or C is singular.
   */
  private krawczyk(noInflation = false): number {
    const { n, N, X, Xt, K, m, Fm, A, C, D, fbuf, jbuf } = this;
    const p = this.period;
    for (let k = 0; k < N; k++) {
      const lo = X[2 * k]!;
      const hi = X[2 * k + 1]!;
      const d = noInflation ? 0 : inflation(lo, hi);
      Xt[2 * k] = lo - d;
      Xt[2 * k + 1] = hi + d;
      m[k] = 0.5 * lo + 0.5 * hi;
    }
    // F(m), with m as a point box (stored in K temporarily)
    for (let k = 0; k < N; k++) {
      K[2 * k] = m[k]!;
      K[2 * k + 1] = m[k]!;
    }
    A.fill(0);
    for (let i = 0; i < p; i++) {
      if (!this.ev.image(K, i, fbuf)) return FAIL;
      const nx = ((i + 1) % p) * n;
      for (let a = 0; a < n; a++) {
        Fm[2 * (i * n + a)] = subDown(m[nx + a]!, fbuf[2 * a + 1]!);
        Fm[2 * (i * n + a) + 1] = subUp(m[nx + a]!, fbuf[2 * a]!);
      }
      const Jm = this.ev.jacobianAtMid(K, i);
      for (let a = 0; a < n; a++) {
        for (let b = 0; b < n; b++) A[(i * n + a) * N + i * n + b]! -= Jm[a * n + b]!;
        A[(i * n + a) * N + nx + a]! += 1;
      }
      if (!this.ev.jacobian(Xt, i, jbuf)) return FAIL;
      D.set(jbuf, i * 2 * n * n);
    }
    if (!invert(A, C, N)) return FAIL;
    let interior = true;
    for (let r = 0; r < N; r++) {
      let lo = m[r]!;
      let hi = lo;
      const row = r * N;
      for (let j = 0; j < N; j++) {
        const c = C[row + j]!;
        if (c === 0) continue;
        const flo = Fm[2 * j]!;
        const fhi = Fm[2 * j + 1]!;
        // acc −= c·F_j
        if (c > 0) {
          lo = subDown(lo, mulUp(c, fhi));
          hi = subUp(hi, mulDown(c, flo));
        } else {
          lo = subDown(lo, mulUp(c, flo));
          hi = subUp(hi, mulDown(c, fhi));
        }
      }
      for (let q = 0; q < p; q++) {
        const prev = ((q - 1 + p) % p) * n;
        const Dq = q * 2 * n * n;
        for (let b = 0; b < n; b++) {
          const col = q * n + b;
          // B = δ(r,col) − C[r,(q−1,b)] + Σ_a C[r,(q,a)]·D_q[a][b]
          let blo = subDown(col === r ? 1 : 0, C[row + prev + b]!);
          let bhi = subUp(col === r ? 1 : 0, C[row + prev + b]!);
          for (let a = 0; a < n; a++) {
            const c = C[row + q * n + a]!;
            if (c === 0) continue;
            const dlo = D[Dq + 2 * (a * n + b)]!;
            const dhi = D[Dq + 2 * (a * n + b) + 1]!;
            if (c > 0) {
              blo = addDown(blo, mulDown(c, dlo));
              bhi = addUp(bhi, mulUp(c, dhi));
            } else {
              blo = addDown(blo, mulDown(c, dhi));
              bhi = addUp(bhi, mulUp(c, dlo));
            }
          }
          // acc += B·(X̃_col − m_col)
          const zlo = subDown(Xt[2 * col]!, m[col]!);
          const zhi = subUp(Xt[2 * col + 1]!, m[col]!);
          const p1 = mulDown(blo, zlo);
          const p2 = mulDown(blo, zhi);
          const p3 = mulDown(bhi, zlo);
          const p4 = mulDown(bhi, zhi);
          const q1 = mulUp(blo, zlo);
          const q2 = mulUp(blo, zhi);
          const q3 = mulUp(bhi, zlo);
          const q4 = mulUp(bhi, zhi);
          lo = addDown(lo, Math.min(p1, p2, p3, p4));
          hi = addUp(hi, Math.max(q1, q2, q3, q4));
        }
      }
      if (!(lo <= hi)) return FAIL; // NaN from an overflow
      K[2 * r] = lo;
      K[2 * r + 1] = hi;
      if (!(lo > Xt[2 * r]! && hi < Xt[2 * r + 1]!)) interior = false;
    }
    return interior ? UNIQUE : SPLIT;
  }
}

const NONE = 0;
const UNIQUE = 1;
const SPLIT = 2;
const FAIL = 3;
const MINUS = '-'.charCodeAt(0);
const STAR = '*'.charCodeAt(0);
const QUESTION = '?'.charCodeAt(0);

/** The exact midpoint of two doubles, or undefined when it is not a double (or equals an end). */
export function exactMid(lo: number, hi: number): number | undefined {
  const mid = 0.5 * lo + 0.5 * hi;
  if (!(mid > lo && mid < hi)) return undefined;
  // exact iff mid − lo and hi − mid are exact and equal
  if (mid - lo !== hi - mid) return undefined;
  if (mid - (mid - lo) !== lo || mid + (hi - mid) !== hi) return undefined;
  return mid;
}

/** @heuristic C := A^{-1} (N×N row-major) by Gauss–Jordan with partial pivoting; false when singular. A is destroyed. */
function invert(A: Float64Array, C: Float64Array, N: number): boolean {
  C.fill(0);
  for (let i = 0; i < N; i++) C[i * N + i] = 1;
  for (let k = 0; k < N; k++) {
    let piv = k;
    let best = Math.abs(A[k * N + k]!);
    for (let i = k + 1; i < N; i++) {
      const v = Math.abs(A[i * N + k]!);
      if (v > best) {
        best = v;
        piv = i;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return false;
    if (piv !== k) {
      for (let j = 0; j < N; j++) {
        let t = A[k * N + j]!;
        A[k * N + j] = A[piv * N + j]!;
        A[piv * N + j] = t;
        t = C[k * N + j]!;
        C[k * N + j] = C[piv * N + j]!;
        C[piv * N + j] = t;
      }
    }
    const inv = 1 / A[k * N + k]!;
    for (let j = 0; j < N; j++) {
      A[k * N + j]! *= inv;
      C[k * N + j]! *= inv;
    }
    for (let i = 0; i < N; i++) {
      if (i === k) continue;
      const f = A[i * N + k]!;
      if (f === 0) continue;
      for (let j = 0; j < N; j++) {
        A[i * N + j]! -= f * A[k * N + j]!;
        C[i * N + j]! -= f * C[k * N + j]!;
      }
    }
  }
  for (let i = 0; i < N * N; i++) if (!Number.isFinite(C[i]!)) return false;
  return true;
}
