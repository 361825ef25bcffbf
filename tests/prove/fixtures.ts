/**
 * Test fixtures for the prover: exact orbits of the logistic map at r = 4 from the conjugacy with
 * the doubling map (x = sin²(πθ), closed form, derived by hand), computed with decimal.js at 60
 * significant digits and exact BigInt arithmetic for θ·2^i mod 1.
 */
import { Decimal } from 'decimal.js';

export const D60 = Decimal.clone({ precision: 60 });
const PI60 = D60.acos(-1);

/**
 * A binary word of length p with runs of equal bits of length <= 2 that is primitive (not a
 * power of a shorter word); deterministic from `seed` (common practice, no source).
 */
export function balancedWord(p: number, seed = 1): number[] {
  for (let s = seed; ; s++) {
    let state = s * 2654435761 >>> 0;
    const w: number[] = [];
    while (w.length < p) {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      let bit = state >>> 31;
      const n = w.length;
      if (n >= 2 && w[n - 1] === w[n - 2]) bit = 1 - w[n - 1]!;
      w.push(bit);
    }
    // cyclic run constraint at the wrap-around
    const ok = (i: number) => !(w[i % p] === w[(i + 1) % p] && w[(i + 1) % p] === w[(i + 2) % p]);
    let good = true;
    for (let i = 0; i < p && good; i++) good = ok(i);
    if (good && isPrimitive(w)) return w;
  }
}

function isPrimitive(w: number[]): boolean {
  const p = w.length;
  for (let d = 1; d < p; d++) {
    if (p % d !== 0) continue;
    let same = true;
    for (let i = 0; i < p && same; i++) same = w[i] === w[(i + d) % p];
    if (same) return false;
  }
  return true;
}

/** k with θ = k/(2^p − 1) having the repeating binary expansion 0.(w_0 w_1 … w_{p−1}). */
export function wordToNumerator(w: number[]): bigint {
  let k = 0n;
  for (const b of w) k = (k << 1n) | BigInt(b);
  return k;
}

/**
 * The orbit x_i = sin²(π·θ·2^i) of f(x) = 4x(1 − x) through θ = k/(2^p − 1) (or k/(2^p + 1) when
 * `plus`), as 60-digit Decimals. θ·2^i mod 1 is formed exactly with BigInt.
 */
export function logistic4Orbit(k: bigint, p: number, plus = false): InstanceType<typeof D60>[] {
  const M = plus ? (1n << BigInt(p)) + 1n : (1n << BigInt(p)) - 1n;
  const out: InstanceType<typeof D60>[] = [];
  let ki = k % M;
  for (let i = 0; i < p; i++) {
    const theta = new D60(ki.toString()).div(new D60(M.toString()));
    out.push(PI60.mul(theta).sin().pow(2));
    ki = (ki * 2n) % M;
  }
  return out;
}

/** @heuristic nearest double of a Decimal (test candidates only; never a parameter). */
export function toDouble(d: Decimal): number {
  return Number(d.toString());
}

/** lo <= x <= hi for decimal strings and a Decimal. */
export function inPair(x: Decimal, pair: [string, string]): boolean {
  return x.gte(new D60(pair[0])) && x.lte(new D60(pair[1]));
}
