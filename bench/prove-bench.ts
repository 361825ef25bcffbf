/**
 * Prover benchmark:
 *  - logistic r = 4 orbits of period 10, 100, 1000 through θ = k/(2^p − 1) (x_j = sin²(π θ 2^j),
 *    conjugacy with the doubling map, derived by hand; multiplier +2^p), binary words with runs of
 *    at most two equal bits: proving time beside the float Newton solve time (ratio);
 *  - logistic r = 4, θ = 1/(2^p − 1) for p = 50, 100 (precision escalation, about 2p bits);
 *  - Hénon (a = 1.4, b = 0.3; Hénon 1976, Commun. Math. Phys. 50) saddle orbits of period 10, 50,
 *    200 shadowing close returns of a float trajectory.
 *   npx tsx bench/prove-bench.ts
 */
import { pathToFileURL } from 'node:url';
import { Decimal } from 'decimal.js';
import { getCatalogueMap } from '../src/model/catalogue.js';
import { compileMap } from '../src/model/compile.js';
import type { CompiledMap } from '../src/model/types.js';
import { proveOrbit } from '../src/prove/orbit.js';
import { refineFloat } from '../src/prove/refine.js';

/** Word of length p, runs of equal bits <= 2 cyclically, primitive; deterministic. */
function word(p: number): number[] {
  for (let s = 1; ; s++) {
    let state = (s * 2654435761) >>> 0;
    const w: number[] = [];
    while (w.length < p) {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      let bit = state >>> 31;
      const n = w.length;
      if (n >= 2 && w[n - 1] === w[n - 2]) bit = 1 - w[n - 1]!;
      w.push(bit);
    }
    let ok = true;
    for (let i = 0; i < p && ok; i++) ok = !(w[i] === w[(i + 1) % p] && w[(i + 1) % p] === w[(i + 2) % p]);
    for (let d = 1; d < p && ok; d++) {
      if (p % d !== 0) continue;
      let same = true;
      for (let i = 0; i < p && same; i++) same = w[i] === w[(i + d) % p];
      if (same) ok = false;
    }
    if (ok) return w;
  }
}

/** sin²(π k 2^j/(2^p − 1)), j = 0..p−1, as decimal strings (`digits` digits). */
function doublingOrbit(k: bigint, p: number, digits: number): string[] {
  const D = Decimal.clone({ precision: digits + 10 });
  const pi = D.acos(-1);
  const M = (1n << BigInt(p)) - 1n;
  const out: string[] = [];
  let kj = k % M;
  for (let j = 0; j < p; j++) {
    out.push(pi.mul(new D(kj.toString()).div(new D(M.toString()))).sin().pow(2).toSignificantDigits(digits).toString());
    kj = (kj * 2n) % M;
  }
  return out;
}

function henonNearReturn(p: number, length = 20000): number[][] {
  const xs: number[] = [];
  const ys: number[] = [];
  let x = 0;
  let y = 0;
  for (let i = 0; i < 1000; i++) [x, y] = [1 - 1.4 * x * x + y, 0.3 * x];
  for (let i = 0; i < length + p; i++) {
    xs.push(x);
    ys.push(y);
    [x, y] = [1 - 1.4 * x * x + y, 0.3 * x];
  }
  let best = 0;
  let bestD = Infinity;
  for (let i = 0; i < length; i++) {
    const d = Math.hypot(xs[i + p]! - xs[i]!, ys[i + p]! - ys[i]!);
    if (d < bestD) [bestD, best] = [d, i];
  }
  return Array.from({ length: p }, (_, k) => [xs[best + k]!, ys[best + k]!]);
}

/** Median wall time of the float Newton solve (after warm-up), ms. */
function newtonMs(map: CompiledMap, pts: number[][]): number {
  const flat = pts.flat();
  const p = pts.length;
  const n = map.dim;
  for (let i = 0; i < 5; i++) refineFloat(map, flat, p, n); // warm-up (JIT)
  const reps = p >= 1000 ? 5 : 41;
  const times: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t = performance.now();
    refineFloat(map, flat, p, n);
    times.push(performance.now() - t);
  }
  times.sort((x, y) => x - y);
  return times[Math.floor(reps / 2)]!;
}

/** Median wall time of `reps` proofs after one warm-up run (JIT), and the last verdict. */
function timed(map: CompiledMap, pts: ReadonlyArray<ReadonlyArray<number | string>>, reps: number) {
  let v = proveOrbit(map, pts, { maxBits: 512 });
  const times: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t = performance.now();
    v = proveOrbit(map, pts, { maxBits: 512 });
    times.push(performance.now() - t);
  }
  times.sort((x, y) => x - y);
  return { v, ms: times[Math.floor(times.length / 2)]!, min: times[0]! };
}

function line(name: string, map: CompiledMap, pts: ReadonlyArray<ReadonlyArray<number | string>>, withNewton: boolean): string {
  const { v, ms, min } = timed(map, pts, pts.length >= 200 || !withNewton ? 3 : 21);
  if (v.status !== 'proven') return `${name}: NOT PROVEN (${v.reason}: ${v.detail}) in ${ms.toFixed(0)} ms`;
  const o = v.orbit;
  const tm = o.timing;
  let s = `${name}: ${ms.toFixed(1)} ms at ${o.bits} bits (existence ${tm.existenceMs.toFixed(1)}, uniqueness ${tm.uniquenessMs.toFixed(1)}, ` +
    `claims ${tm.claimsMs.toFixed(1)}, refine ${tm.refineMs.toFixed(1)} ms); ${o.stability.class}, minimal period ${o.minimalPeriod ?? 'not claimed'}, ` +
    `uniqueness radius ${o.uniquenessRadius ?? 'none'}`;
  if (withNewton) {
    const nm = newtonMs(map, pts.map((pt) => pt.map((c) => Number(c))));
    s += `; float Newton ${nm.toFixed(2)} ms, ratio ${(ms / nm).toFixed(0)}x (fastest proof ${min.toFixed(1)} ms: ${(min / nm).toFixed(0)}x; ` +
      `existence only ${(tm.existenceMs / nm).toFixed(0)}x)`;
  }
  return s;
}

export async function runProveBench(): Promise<string[]> {
  const out: string[] = [];
  const logistic4 = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
  for (const p of [10, 100, 1000]) {
    let k = 0n;
    for (const b of word(p)) k = (k << 1n) | BigInt(b);
    // candidate = exact orbit perturbed by ~1e-9 so that Newton has work to do
    const pts = doublingOrbit(k, p, 40).map((s, j) => [Number(s) + 1e-9 * Math.sin(j)]);
    out.push(line(`logistic r=4 period ${p}`, logistic4, pts, true));
  }
  for (const p of [50, 100]) {
    const pts = doublingOrbit(1n, p, 160).map((s) => [s]);
    out.push(line(`logistic r=4 period ${p} through 1/(2^p-1) (escalation)`, logistic4, pts, false));
  }
  const henon = compileMap(getCatalogueMap('henon')!);
  for (const p of [10, 50, 200]) out.push(line(`Henon period ${p}`, henon, henonNearReturn(p), true));
  return out;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  for (const l of await runProveBench()) console.log(l);
}
