/**
 * Test fixtures for the prover: exact orbits of the logistic map at r = 4 from the conjugacy with
 * the doubling map (x = sin²(πθ), closed form, derived by hand), computed with decimal.js at 60
 * significant digits and exact BigInt arithmetic for θ·2^i mod 1.
 */
import { Decimal } from 'decimal.js';

export const D60 = Decimal.clone({ precision: 60 });

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
export function logistic4Orbit(k: bigint, p: number, plus = false, digits = 60): Decimal[] {
  const M = plus ? (1n << BigInt(p)) + 1n : (1n << BigInt(p)) - 1n;
  const Dd = Decimal.clone({ precision: digits + 10 });
  const pi = Dd.acos(-1);
  const out: Decimal[] = [];
  let ki = k % M;
  for (let i = 0; i < p; i++) {
    const theta = new Dd(ki.toString()).div(new Dd(M.toString()));
    out.push(pi.mul(theta).sin().pow(2).toSignificantDigits(digits));
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
  return x.gte(pair[0]) && x.lte(pair[1]);
}

/**
 * @heuristic A float pseudo-orbit of the Hénon map (a = 1.4, b = 0.3) of length p that nearly
 * closes: the float orbit from (0, 0) after a transient, the start i minimising |x_{i+p} − x_i|
 * over `length` steps (common practice for shadowing, no source).
 */
export function henonNearReturn(p: number, length = 20000): number[][] {
  const a = 1.4;
  const b = 0.3;
  const xs: number[] = [];
  const ys: number[] = [];
  let x = 0;
  let y = 0;
  for (let i = 0; i < 1000; i++) [x, y] = [1 - a * x * x + y, b * x];
  for (let i = 0; i < length + p; i++) {
    xs.push(x);
    ys.push(y);
    [x, y] = [1 - a * x * x + y, b * x];
  }
  let best = 0;
  let bestD = Infinity;
  for (let i = 0; i < length; i++) {
    const d = Math.hypot(xs[i + p]! - xs[i]!, ys[i + p]! - ys[i]!);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return Array.from({ length: p }, (_, k) => [xs[best + k]!, ys[best + k]!]);
}
