/**
 * Long orbits (issue 7 item 4): time and peak memory of the prover and of the independent checker
 * for the logistic map at r = 4, periods 1,000 and 10,000, on orbits whose binary word avoids runs
 * longer than 2, and for Hénon (1.4, 0.3; Hénon 1976) periods 1,000 and 5,000 from a close return
 * of a trajectory on the attractor. Check values: x_j = sin²(π·2^j·k/(2^p − 1)) and multiplier ±2^p, from the
 * conjugacy with the doubling map (derived by hand). Each case runs in a child process so its
 * peak memory (maxRSS) is its own.
 *   node dist/bench/long-bench.js            (all cases)
 *   node dist/bench/long-bench.js one 10000  (one case, prints JSON)
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Decimal } from 'decimal.js';
import { getCatalogueMap } from '../src/model/catalogue.js';
import { compileMap } from '../src/model/compile.js';
import { proveOrbit } from '../src/prove/orbit.js';
import { buildCertificate } from '../src/certificate/build.js';
import { checkCertificate } from '../src/checker/index.js';
import { findCandidates } from '../src/search/index.js';

/** A primitive binary word of length p without three equal bits in a row (cyclically); deterministic. */
export function balancedWord(p: number, seed = 7): number[] {
  for (let s = seed; ; s++) {
    let state = (s * 2654435761) >>> 0;
    const w: number[] = [];
    while (w.length < p) {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      let bit = state >>> 31;
      const n = w.length;
      if (n >= 2 && w[n - 1] === w[n - 2]) bit = 1 - w[n - 1]!;
      w.push(bit);
    }
    let good = true;
    for (let i = 0; i < p && good; i++) good = !(w[i] === w[(i + 1) % p] && w[(i + 1) % p] === w[(i + 2) % p]);
    for (let d = 1; d < p && good; d++) {
      if (p % d !== 0) continue;
      let same = true;
      for (let i = 0; i < p && same; i++) same = w[i] === w[(i + d) % p];
      if (same) good = false;
    }
    if (good) return w;
  }
}

/**
 * The orbit of 4x(1 − x) through θ = k/(2^p − 1), k the word read in binary: x_j = sin²(πθ_j),
 * θ_j = the word rotated by j, read as 0.(w_j … w_{j−1}) in binary. θ_j to 80 bits from the word
 * itself (the tail beyond 80 bits changes x_j by < 2^-78), sin² at `digits` digits.
 */
export function logistic4Points(w: readonly number[], digits = 25): Decimal[] {
  const p = w.length;
  const D = Decimal.clone({ precision: digits + 10 });
  const pi = D.acos(-1);
  const out: Decimal[] = [];
  const bits = Math.min(80, p * 4);
  for (let j = 0; j < p; j++) {
    let num = 0n;
    for (let b = 0; b < bits; b++) num = (num << 1n) | BigInt(w[(j + b) % p]!);
    const theta = new D(num.toString()).div(new D((1n << BigInt(bits)).toString()));
    out.push(pi.mul(theta).sin().pow(2).toSignificantDigits(digits));
  }
  return out;
}

interface Figures {
  period: number;
  proveMs: number;
  checkMs: number;
  status: string;
  verdict: string;
  contained: boolean;
  log2Multiplier: [number, number] | null;
  maxRssMB: number;
  detail?: string;
}

/** @heuristic a float pseudo-orbit of Hénon (1.4, 0.3) of length p closing up best within a long trajectory. */
export function henonCloseReturn(p: number, length = 20000): number[][] {
  let x = 0;
  let y = 0;
  for (let i = 0; i < 1000; i++) [x, y] = [1 - 1.4 * x * x + y, 0.3 * x];
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < length + p; i++) {
    xs.push(x);
    ys.push(y);
    [x, y] = [1 - 1.4 * x * x + y, 0.3 * x];
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

export function runHenon(p: number): Figures {
  const map = getCatalogueMap('henon')!;
  const over = { a: { kind: 'exact' as const, value: '1.4' }, b: { kind: 'exact' as const, value: '0.3' } };
  const compiled = compileMap(map, over);
  const pts = henonCloseReturn(p);
  const t0 = performance.now();
  const v = proveOrbit(compiled, pts);
  const proveMs = performance.now() - t0;
  if (v.status !== 'proven') {
    return { period: p, proveMs, checkMs: 0, status: v.status, verdict: '-', contained: false, log2Multiplier: null, maxRssMB: process.resourceUsage().maxRSS / 1024, detail: `${v.reason}: ${v.detail}` };
  }
  const cert = buildCertificate(v.orbit, map, { overrides: over });
  const t1 = performance.now();
  const rep = checkCertificate(JSON.parse(JSON.stringify(cert)));
  const checkMs = performance.now() - t1;
  return {
    period: p, proveMs, checkMs, status: v.status, verdict: rep.verdict, contained: true, log2Multiplier: null,
    maxRssMB: process.resourceUsage().maxRSS / 1024, detail: `stability ${v.orbit.stability.class}${rep.reason ? `; ${rep.reason}` : ''}`,
  };
}

export function runOne(p: number): Figures {
  const map = getCatalogueMap('logistic')!;
  const compiled = compileMap(map, { r: { kind: 'exact', value: '4' } });
  const w = balancedWord(p);
  const xs = logistic4Points(w);
  const t0 = performance.now();
  const v = proveOrbit(compiled, xs.map((x) => [Number(x.toString())]));
  const proveMs = performance.now() - t0;
  if (v.status !== 'proven') {
    return { period: p, proveMs, checkMs: 0, status: v.status, verdict: '-', contained: false, log2Multiplier: null, maxRssMB: process.resourceUsage().maxRSS / 1024, detail: `${v.reason}: ${v.detail}` };
  }
  const o = v.orbit;
  let contained = true;
  for (let i = 0; i < p && contained; i++) {
    const [lo, hi] = o.boxes[i]![0]!;
    // the closed form to 25 digits is within 1e-24 of x_i; boxes are wider than that here
    contained = xs[i]!.gte(lo) && xs[i]!.lte(hi);
  }
  let log2: [number, number] | null = null;
  if (o.stability.multiplier) {
    const L = Decimal.clone({ precision: 30 });
    const [lo, hi] = o.stability.multiplier;
    const l2 = (s: string): number => new L(s).abs().log(2).toNumber();
    log2 = [l2(lo), l2(hi)].sort((a, b) => a - b) as [number, number];
  }
  const cert = buildCertificate(o, map, { overrides: { r: { kind: 'exact', value: '4' } } });
  const t1 = performance.now();
  const rep = checkCertificate(JSON.parse(JSON.stringify(cert)));
  const checkMs = performance.now() - t1;
  return {
    period: p, proveMs, checkMs, status: v.status, verdict: rep.verdict, contained, log2Multiplier: log2,
    maxRssMB: process.resourceUsage().maxRSS / 1024, ...(rep.reason ? { detail: rep.reason } : {}),
  };
}

/**
 * Issue 8 item 1: checker time per orbit over prover time per orbit for Hénon (1.4, 0.3) orbits of
 * periods 10, 20, 40 (the first 12 search candidates of each period, proven, then checked).
 */
export function henonRatios(): string[] {
  const map = getCatalogueMap('henon')!;
  const over = { a: { kind: 'exact' as const, value: '1.4' }, b: { kind: 'exact' as const, value: '0.3' } };
  const compiled = compileMap(map, over);
  const out: string[] = [];
  for (const p of [10, 20, 40]) {
    let tp = 0;
    let tc = 0;
    let n = 0;
    let bad = 0;
    for (const c of findCandidates(compiled, { period: p }).slice(0, 12)) {
      const t0 = performance.now();
      const v = proveOrbit(compiled, c.points);
      tp += performance.now() - t0;
      if (v.status !== 'proven') continue;
      const cert = JSON.parse(JSON.stringify(buildCertificate(v.orbit, map, { overrides: over })));
      const t1 = performance.now();
      if (checkCertificate(cert).verdict !== 'VERIFIED') bad++;
      tc += performance.now() - t1;
      n++;
    }
    out.push(`henon p=${p}: ${n} orbits; prover ${(tp / n).toFixed(1)} ms/orbit, checker ${(tc / n).toFixed(1)} ms/orbit, checker/prover ${(tc / tp).toFixed(2)}${bad ? `; ${bad} NOT verified` : ''}`);
  }
  return out;
}

export async function runLongBench(): Promise<string[]> {
  const lines: string[] = ['case              prove s   check s  chk/prv  maxRSS MB  verdict'];
  const self = fileURLToPath(import.meta.url);
  const cases: Array<[string, number]> = [['one', 1000], ['one', 10000], ['henon', 1000], ['henon', 5000]];
  for (const [kind, p] of cases) {
    const out = execFileSync(process.execPath, [self, kind, String(p)], { encoding: 'utf8', maxBuffer: 1 << 24 });
    const f = JSON.parse(out.trim().split('\n').pop()!) as Figures;
    const name = `${kind === 'one' ? 'logistic4' : 'henon'} p=${p}`.padEnd(17);
    lines.push(
      `${name} ${(f.proveMs / 1000).toFixed(2).padStart(7)} ${(f.checkMs / 1000).toFixed(2).padStart(9)} ${(f.checkMs / f.proveMs).toFixed(2).padStart(8)} ${f.maxRssMB.toFixed(0).padStart(10)}  ${f.verdict}`,
    );
    if (kind === 'one') lines.push(`  boxes contain sin²: ${f.contained}; log2|Λ| in ${f.log2Multiplier ? f.log2Multiplier.map((x) => x.toFixed(4)).join('..') : '-'}${f.detail ? `; ${f.detail.slice(0, 40)}` : ''}`);
    else lines.push(`  ${(f.detail ?? '').slice(0, 74)}`);
  }
  const ratios = execFileSync(process.execPath, [self, 'ratios'], { encoding: 'utf8', maxBuffer: 1 << 24 });
  lines.push(...ratios.trim().split('\n'));
  return lines;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  if (process.argv[2] === 'one') console.log(JSON.stringify(runOne(Number(process.argv[3]))));
  else if (process.argv[2] === 'henon') console.log(JSON.stringify(runHenon(Number(process.argv[3]))));
  else if (process.argv[2] === 'ratios') for (const l of henonRatios()) console.log(l);
  else for (const l of await runLongBench()) console.log(l);
}
