/**
 * From the zeros proven in the leaves of a cover to counts: identification, region membership
 * and minimal period. Every zero z comes with K ∋ z and X̃ in which z is the only zero.
 *
 *  - identity: zeros a, b are the same when K_a ⊂ X̃_b or K_b ⊂ X̃_a (both lie in X̃ of one of
 *    them, which holds one zero); distinct when K_a ∩ K_b = ∅; otherwise undecided;
 *  - region: z ∈ R^p when K ⊂ R^p; z ∉ R^p when K ∩ R^p = ∅; otherwise the exact-point test:
 *    a point m ∈ X̃ ∩ R^p with F(m) = 0 exactly (tight interval evaluation gives [0, 0]) is z;
 *  - minimal period: for each proper divisor d of p, σ_d z = z (σ_d the cyclic shift by d points)
 *    when σ_d K ⊂ X̃ (σ_d z is a zero in X̃), σ_d z ≠ z when σ_d K ∩ K = ∅; the minimal period is the
 *    least d with σ_d z = z, decided only when every smaller divisor was decided.
 * Orbits of minimal period d among the p-periodic zeros number (zeros of minimal period d) / d.
 */
import type { CountClaims } from '../certificate/types.js';

export interface ZeroSet {
  readonly p: number;
  readonly n: number;
  /** K then X̃ per zero (4N doubles each). */
  readonly data: Float64Array;
}

/** Exact test F(m) = 0 for the point m (N doubles): supplied by the caller (tight evaluation). */
export type ExactZeroTest = (m: Float64Array) => boolean;

export function classifyZeros(sets: readonly Float64Array[], p: number, n: number, region: Float64Array, undecidedBoxes: number, exactZero: ExactZeroTest): CountClaims {
  const N = p * n;
  const all: Float64Array[] = [];
  for (const s of sets) for (let o = 0; o + 4 * N <= s.length; o += 4 * N) all.push(s.subarray(o, o + 4 * N));
  const Kin = (z: Float64Array, k: number): [number, number] => [z[2 * k]!, z[2 * k + 1]!];
  const Xin = (z: Float64Array, k: number): [number, number] => [z[2 * N + 2 * k]!, z[2 * N + 2 * k + 1]!];
  // identification: sort by K[0].lo, sweep overlapping ones
  const order = all.map((_, i) => i).sort((a, b) => all[a]![0]! - all[b]![0]! || a - b);
  const parent = all.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]!]!;
    return i;
  };
  let ambiguous = 0;
  for (let x = 0; x < order.length; x++) {
    const a = all[order[x]!]!;
    for (let y = x + 1; y < order.length; y++) {
      const b = all[order[y]!]!;
      if (b[0]! > a[1]!) break;
      let overlap = true;
      for (let k = 0; k < N && overlap; k++) if (b[2 * k]! > a[2 * k + 1]! || a[2 * k]! > b[2 * k + 1]!) overlap = false;
      if (!overlap) continue;
      // same zero; or undecided — merged too, so that `zeros` stays a lower bound
      if (!(inside(a, b, N, 0) || inside(b, a, N, 0))) ambiguous++;
      parent[find(order[x]!)] = find(order[y]!);
    }
  }
  const reps: Float64Array[] = [];
  for (let i = 0; i < all.length; i++) if (find(i) === i) reps.push(all[i]!);
  let undecidedZeros = ambiguous;
  const m = new Float64Array(N);
  const byPeriod = new Map<number, number>();
  const divisors: number[] = [];
  for (let d = 1; d < p; d++) if (p % d === 0) divisors.push(d);
  let zeros = 0;
  for (const z of reps) {
    // region membership
    let inR = true;
    let outR = false;
    for (let k = 0; k < N; k++) {
      const [lo, hi] = Kin(z, k);
      const rlo = region[2 * (k % n)]!;
      const rhi = region[2 * (k % n) + 1]!;
      if (lo < rlo || hi > rhi) inR = false;
      if (hi < rlo || lo > rhi) outR = true;
    }
    if (outR) continue;
    if (!inR) {
      let ok = true;
      for (let k = 0; k < N; k++) {
        const [lo, hi] = Kin(z, k);
        const rlo = region[2 * (k % n)]!;
        const rhi = region[2 * (k % n) + 1]!;
        // a zero on the region's boundary is tried at the boundary value itself
        const v = lo <= rlo && rlo <= hi ? rlo : lo <= rhi && rhi <= hi ? rhi : 0.5 * lo + 0.5 * hi;
        const [xlo, xhi] = Xin(z, k);
        if (v < xlo || v > xhi) ok = false;
        m[k] = v;
      }
      if (!ok || !exactZero(m)) {
        undecidedZeros++;
        continue;
      }
    }
    zeros++;
    let minimal = p;
    for (const d of divisors) {
      let disjoint = false;
      let equal = true;
      for (let k = 0; k < N; k++) {
        const s = (k + d * n) % N;
        const [alo, ahi] = Kin(z, s);
        const [blo, bhi] = Kin(z, k);
        if (ahi < blo || bhi < alo) disjoint = true;
        const [xlo, xhi] = Xin(z, k);
        if (!(alo >= xlo && ahi <= xhi)) equal = false;
      }
      if (disjoint) continue;
      // σ_d z has the uniqueness box σ_d X̃: K ⊂ σ_d X̃ also shows σ_d z = z
      if (!equal) equal = inside(z, shiftX(z, N, d * n), N, 0);
      minimal = equal ? d : -1;
      break;
    }
    if (minimal < 0) {
      undecidedZeros++;
      continue;
    }
    byPeriod.set(minimal, (byPeriod.get(minimal) ?? 0) + 1);
  }
  const orbitsByMinimalPeriod: Record<string, number> = {};
  for (const d of [...divisors, p]) {
    const c = byPeriod.get(d) ?? 0;
    if (c % d !== 0) undecidedZeros += c % d; // some shift of an orbit was not decided
    orbitsByMinimalPeriod[String(d)] = Math.floor(c / d);
  }
  return { zeros, orbitsByMinimalPeriod, undecidedBoxes, undecidedZeros };
}

/** K of zero a inside X̃ of zero b, componentwise with the shift s (in points·n). */
function inside(a: Float64Array, b: Float64Array, N: number, s: number): boolean {
  for (let k = 0; k < N; k++) {
    const ka = (k + s) % N;
    if (!(a[2 * ka]! >= b[2 * N + 2 * k]! && a[2 * ka + 1]! <= b[2 * N + 2 * k + 1]!)) return false;
  }
  return true;
}

/** A copy of zero z whose X̃ is shifted by s components (X̃'_k = X̃_{k+s}); K unchanged. */
function shiftX(z: Float64Array, N: number, s: number): Float64Array {
  const out = new Float64Array(4 * N);
  out.set(z.subarray(0, 2 * N));
  for (let k = 0; k < N; k++) {
    const t = (k + s) % N;
    out[2 * N + 2 * k] = z[2 * N + 2 * t]!;
    out[2 * N + 2 * k + 1] = z[2 * N + 2 * t + 1]!;
  }
  return out;
}
