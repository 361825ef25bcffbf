/**
 * One proof attempt at a fixed precision, generic over the interval arithmetic:
 * epsilon-inflation to an existence box, writing the box as outward-rounded decimals and
 * re-testing exactly what was written, the uniqueness radius, minimal period and stability.
 *
 * Soundness rests on `krawczykShooting` (krawczyk.ts) and the kernel's enclosures; the centre,
 * the preconditioner and every search choice here are heuristic and cannot make a claim false.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import type { MapEvaluator } from '../model/types.js';
import { compareDecimal } from '../interval/decimal-literal.js';
import { absDiffUp, roundDecimal } from './decimal-out.js';
import {
  krawczykPlanned,
  prepareKrawczyk,
  shootingJacobianBlocks,
  type KrawczykPlan,
  type KrawczykOutcome,
  type Preconditioner,
  type ShootingSystem,
} from './krawczyk.js';
import { decimalAtLeast, nearDecimal, writtenAbove, writtenBelow } from './float-decimal.js';
import { nextDown, nextUp, subUp } from '../interval/round.js';
import { orbitStability } from './stability.js';
import type { DecimalPair, NotProvenReason, ProvenStability } from './types.js';

export interface AttemptInput<T> {
  arith: IntervalArithmetic<T>;
  evaluator: MapEvaluator<T>;
  period: number;
  dim: number;
  /** Thin centre (length p·n). */
  centre: T[];
  C: Preconditioner<T>;
  /** Significant digits of written decimals. */
  digits: number;
  /**
   * The endpoints of `arith` are doubles (float64 intervals): the written decimals are then read
   * off the doubles directly (writeFast), else through `arith.toDecimal`. Chosen by the caller,
   * which knows its arithmetic.
   */
  floatEndpoints: boolean;
  /** Search the uniqueness radius (default true). */
  uniqueness: boolean;
  maxInflations: number;
}

export interface AttemptClaims {
  centre: string[][];
  boxes: DecimalPair[][];
  uniquenessRadius: string | null;
  minimalPeriod: number | null;
  stability: ProvenStability;
  assumed: boolean;
  /** Existence, minimal period and (n <= 2) stability all established. */
  complete: boolean;
  /** What is missing when not complete. */
  missing: string;
  /** Phase times, ms: preparation + epsilon-inflation + written re-test; uniqueness; the rest. */
  existenceMs: number;
  uniquenessMs: number;
  claimsMs: number;
}

export type AttemptResult =
  | { kind: 'proven'; claims: AttemptClaims }
  | { kind: 'failed'; reason: NotProvenReason; detail: string };

/** Union hull of two intervals. */
function hullUnion<T>(a: IntervalArithmetic<T>, x: T, y: T): T {
  const lo = a.certainlyLe(a.lo(x), a.lo(y)) ? a.lo(x) : a.lo(y);
  const hi = a.certainlyLe(a.hi(x), a.hi(y)) ? a.hi(y) : a.hi(x);
  return a.hull(lo, hi);
}

/** Outer and inner T-enclosures of the decimal box [lo, hi]; inner null when empty in T. */
function writtenEnclosures<T>(a: IntervalArithmetic<T>, lo: string, hi: string): { outer: T; inner: T | null } {
  const l = a.fromDecimal(lo);
  const h = a.fromDecimal(hi);
  const outer = a.hull(a.lo(l), a.hi(h));
  const il = a.hi(l);
  const ih = a.lo(h);
  const inner = a.certainlyLt(il, ih) ? a.hull(il, ih) : null;
  return { outer, inner };
}

function describe<T>(out: KrawczykOutcome<T>): string {
  switch (out.kind) {
    case 'inside':
      return 'K(X) ⊂ int X';
    case 'excluded':
      return `K(X) ∩ X = ∅ at coordinate ${out.index}: no orbit in the box`;
    case 'undecided':
      return out.reason;
    case 'domain':
      return `evaluation left the domain at point ${out.point} (${out.where === 'centre' ? 'at the centre' : 'over the box'})`;
  }
}

/**
 * Verify K(W) ⊂ int W for the decimal box W = [lo, hi] (per coordinate) around the plan's centre:
 * K is evaluated on the outer enclosure of W (K(W) ⊂ K(outer W), inclusion monotonicity) and
 * compared with the inner enclosure of W. `centre` must be the strings the plan was made from.
 */
export function verifyWrittenBox<T>(
  plan: KrawczykPlan<T>,
  centre: readonly string[],
  lo: readonly string[],
  hi: readonly string[],
): KrawczykOutcome<T> | { kind: 'unrepresentable' } {
  const a = plan.sys.arith;
  const N = centre.length;
  const outer: T[] = new Array<T>(N);
  const inner: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) {
    if (compareDecimal(lo[k]!, centre[k]!) > 0 || compareDecimal(centre[k]!, hi[k]!) > 0) return { kind: 'unrepresentable' };
    const e = writtenEnclosures(a, lo[k]!, hi[k]!);
    if (e.inner === null) return { kind: 'unrepresentable' };
    outer[k] = e.outer;
    inner[k] = e.inner;
  }
  return krawczykPlanned(plan, outer, inner);
}

export function attempt<T>(inp: AttemptInput<T>): AttemptResult {
  const { arith: a, period: p, dim: n, C, digits } = inp;
  const N = p * n;
  const sys: ShootingSystem<T> = { arith: a, evaluator: inp.evaluator, period: p, dim: n };
  const t0 = performance.now();
  // The Krawczyk point is the written centre: the candidate rounded to `digits` digits, enclosed.
  // float64 fast path (float-decimal.ts): short strings and their enclosures without exact
  // double→decimal conversion; otherwise exact conversion through decimal.js.
  const fast = inp.floatEndpoints;
  const centreS: string[] = new Array<string>(N);
  const m: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) {
    const near = fast ? nearDecimal(a.midNumber(inp.centre[k]!), digits) : null;
    if (near !== null) {
      centreS[k] = near.s;
      m[k] = a.hull(a.fromNumber(near.lo), a.fromNumber(near.hi));
    } else {
      centreS[k] = roundDecimal(a.toDecimal(inp.centre[k]!).lo, digits, 'nearest');
      m[k] = a.fromDecimal(centreS[k]!);
    }
  }
  const plan = prepareKrawczyk(sys, m, C);
  if ('domain' in plan) return { kind: 'failed', reason: 'domain', detail: `evaluation at the centre left the domain at point ${plan.domain}` };
  if ('undecided' in plan) return { kind: 'failed', reason: 'undecided', detail: plan.undecided };
  // Epsilon-inflation (Rump): X ← hull(K(X), m) widened by 10 % of its width + η.
  const relTiny = Math.pow(2, -(a.bits - 4));
  const absTiny = 1e-300;
  const eta = m.map((x) => a.magUp(x) * relTiny + absTiny);
  let X = m.map((x, k) => a.inflate(x, eta[k]!));
  let last: KrawczykOutcome<T> | null = null;
  let found = false;
  // float64 fast path: each step tests K(X⁺) ⊂ int X with X⁺ = X widened by 3 ulps per end,
  // which covers the outer enclosure of the box as it will be written (float-decimal.ts; checked
  // below), so the last step is also the re-test of the written box.
  const loS: string[] = new Array<string>(N);
  const hiS: string[] = new Array<string>(N);
  let widened: T[] | null = null;
  for (let it = 0; it < inp.maxInflations; it++) {
    widened = fast ? ulpWiden(a, X, 3) : null;
    last = widened !== null ? krawczykPlanned(plan, widened, X) : krawczykPlanned(plan, X);
    if (last.kind === 'inside') {
      found = true;
      break;
    }
    if (last.kind === 'domain') {
      // In the first box a real domain problem; later, the box grew while inflating.
      if (it === 0) return { kind: 'failed', reason: 'domain', detail: describe(last) };
      return { kind: 'failed', reason: 'undecided', detail: `epsilon-inflation step ${it}: the box grew until ${describe(last)}` };
    }
    const K = last.image;
    const next: T[] = new Array<T>(N);
    for (let k = 0; k < N; k++) {
      const w = a.widUp(K[k]!);
      if (!Number.isFinite(w)) return { kind: 'failed', reason: 'undecided', detail: `Krawczyk image unbounded (coordinate ${k})` };
      next[k] = a.inflate(hullUnion(a, K[k]!, m[k]!), 0.1 * w + eta[k]!);
    }
    X = next;
  }
  if (!found || last === null) {
    const why = last === null ? 'no iteration' : describe(last);
    const reason: NotProvenReason = last?.kind === 'excluded' ? 'excluded' : 'undecided';
    return { kind: 'failed', reason, detail: `epsilon-inflation did not reach K(X) ⊂ int X in ${inp.maxInflations} steps: ${why}` };
  }
  // Write outward-rounded decimals and re-test exactly what was written.
  const written = fast ? writeFast(a, X, m, digits, loS, hiS) : null;
  let check: ReturnType<typeof verifyWrittenBox<T>>;
  let outer: T[];
  if (written !== null) {
    // K(outer W) ⊂ int(inner W) with inner W ⊂ W ⊂ outer W (float-decimal.ts) is what
    // verifyWrittenBox tests; m ⊂ inner W was checked, so the written centre lies in W. When
    // outer W ⊆ X⁺ and X ⊆ inner W, the last step already showed K(outer W) ⊆ K(X⁺) ⊂ int X.
    let covered = widened !== null;
    for (let k = 0; k < N && covered; k++) covered = a.isSubset(written.outer[k]!, widened![k]!) && a.isSubset(X[k]!, written.inner[k]!);
    check = covered ? last : krawczykPlanned(plan, written.outer, written.inner);
    outer = written.outer;
  } else {
    for (let k = 0; k < N; k++) {
      const xk = a.toDecimal(X[k]!);
      loS[k] = roundDecimal(xk.lo, digits, 'floor');
      hiS[k] = roundDecimal(xk.hi, digits, 'ceil');
    }
    check = verifyWrittenBox(plan, centreS, loS, hiS);
    outer = new Array<T>(N);
    for (let k = 0; k < N; k++) outer[k] = writtenEnclosures(a, loS[k]!, hiS[k]!).outer;
  }
  if (check.kind !== 'inside') {
    const why = check.kind === 'unrepresentable' ? 'written box not representable' : describe(check);
    return { kind: 'failed', reason: 'write-check-failed', detail: `re-test of the written box failed: ${why}` };
  }
  let assumed = check.assumed;
  const t1 = performance.now();
  // Uniqueness radius.
  let uniquenessRadius: string | null = null;
  if (inp.uniqueness) {
    const r0 = written !== null ? coverRadiusFast(a, m, outer) : null;
    const u = uniquenessSearch(plan, centreS, r0 ?? coverRadiusExact(centreS, loS, hiS));
    uniquenessRadius = u.radius;
    assumed ||= u.assumed;
  }
  const t2 = performance.now();
  // Minimal period: pairwise disjoint point boxes.
  const minimalPeriod = pairwiseDisjoint(a, outer, p, n) ? p : null;
  // Stability over the written boxes.
  const jb = shootingJacobianBlocks(sys, outer);
  let stability: ProvenStability;
  if ('domain' in jb) stability = { class: 'undecided', note: `Jacobian over the boxes left the domain at point ${jb.domain}` };
  else if (n >= 2 && jb.nonsmooth) {
    // slope sets at a kink: switching between branches could destabilise the orbit even when every
    // single product is stable (joint spectral radius), so no class is claimed.
    stability = { class: 'undecided', note: 'a box touches a kink of abs/min/max; in dimension >= 2 stability is not decided there' };
    assumed ||= jb.assumed;
  } else {
    stability = orbitStability(a, jb.blocks, p, n);
    assumed ||= jb.assumed;
  }
  const missing: string[] = [];
  if (minimalPeriod === null) missing.push('minimal period (boxes overlap)');
  if (n <= 2 && stability.class === 'undecided') missing.push(`stability (${stability.note ?? 'undecided'})`);
  const group = (s: readonly string[]): string[][] => Array.from({ length: p }, (_, i) => s.slice(i * n, i * n + n));
  const boxes: DecimalPair[][] = Array.from({ length: p }, (_, i) =>
    Array.from({ length: n }, (_, j): DecimalPair => [loS[i * n + j]!, hiS[i * n + j]!]),
  );
  return {
    kind: 'proven',
    claims: {
      centre: group(centreS),
      boxes,
      uniquenessRadius,
      minimalPeriod,
      stability,
      assumed,
      complete: missing.length === 0,
      missing: missing.join('; '),
      existenceMs: t1 - t0,
      uniquenessMs: t2 - t1,
      claimsMs: performance.now() - t2,
    },
  };
}

/** Exact pairwise disjointness of the p point boxes (in at least one coordinate). */
function pairwiseDisjoint<T>(a: IntervalArithmetic<T>, boxes: readonly T[], p: number, n: number): boolean {
  // Sweep on coordinate 0 with outward double bounds as a filter; exact test on candidates.
  const order = Array.from({ length: p }, (_, i) => i);
  const lo0 = order.map((i) => a.loDown(boxes[i * n]!));
  const hi0 = order.map((i) => a.hiUp(boxes[i * n]!));
  order.sort((i, j) => lo0[i]! - lo0[j]!);
  for (let s = 0; s < p; s++) {
    const i = order[s]!;
    for (let t = s + 1; t < p; t++) {
      const j = order[t]!;
      if (lo0[j]! > hi0[i]!) break;
      let separated = false;
      for (let c = 0; c < n && !separated; c++) separated = a.disjoint(boxes[i * n + c]!, boxes[j * n + c]!);
      if (!separated) return false;
    }
  }
  return true;
}

/** X with each end moved outward by `ulps` doubles (float64 intervals). */
function ulpWiden<T>(a: IntervalArithmetic<T>, X: readonly T[], ulps: number): T[] {
  const out: T[] = new Array<T>(X.length);
  for (let k = 0; k < X.length; k++) {
    let lo = a.loDown(X[k]!);
    let hi = a.hiUp(X[k]!);
    for (let u = 0; u < ulps; u++) {
      lo = nextDown(lo);
      hi = nextUp(hi);
    }
    out[k] = a.hull(a.fromNumber(lo), a.fromNumber(hi));
  }
  return out;
}

/**
 * float64 fast path of writing the box X: decimal ends loS < lo(X), hiS > hi(X) (float-decimal.ts)
 * with outer/inner double enclosures of the written box; null when some end needs the exact path
 * or the centre enclosure m is not inside the inner box.
 */
function writeFast<T>(
  a: IntervalArithmetic<T>,
  X: readonly T[],
  m: readonly T[],
  digits: number,
  loS: string[],
  hiS: string[],
): { outer: T[]; inner: T[] } | null {
  const N = X.length;
  const outer: T[] = new Array<T>(N);
  const inner: T[] = new Array<T>(N);
  for (let k = 0; k < N; k++) {
    const wl = writtenBelow(a.loDown(X[k]!), digits);
    const wh = writtenAbove(a.hiUp(X[k]!), digits);
    if (wl === null || wh === null) return null;
    loS[k] = wl.s;
    hiS[k] = wh.s;
    outer[k] = a.hull(a.fromNumber(wl.outer), a.fromNumber(wh.outer));
    inner[k] = a.hull(a.fromNumber(wl.inner), a.fromNumber(wh.inner));
    if (!a.isSubset(m[k]!, inner[k]!)) return null;
  }
  return { outer, inner };
}

/** A 3-digit decimal r with centre ± r ⊇ written box, from double enclosures (null: use exact). */
function coverRadiusFast<T>(a: IntervalArithmetic<T>, m: readonly T[], outer: readonly T[]): string | null {
  let r = 0;
  for (let k = 0; k < m.length; k++) {
    r = Math.max(r, subUp(a.hiUp(m[k]!), a.loDown(outer[k]!)), subUp(a.hiUp(outer[k]!), a.loDown(m[k]!)));
  }
  return decimalAtLeast(r);
}

/** The same from the decimal strings (exact, decimal.js). */
function coverRadiusExact(centre: readonly string[], lo: readonly string[], hi: readonly string[]): string {
  let r0 = '0';
  for (let k = 0; k < centre.length; k++) {
    for (const e of [absDiffUp(centre[k]!, lo[k]!), absDiffUp(hi[k]!, centre[k]!)]) if (compareDecimal(e, r0) > 0) r0 = e;
  }
  return roundDecimal(r0, 3, 'ceil');
}

/** Largest tested r (3 significant digits) with K(Y) ⊂ int Y for Y = centre ± r, from r0 (Y ⊇ written box). */
function uniquenessSearch<T>(
  plan: KrawczykPlan<T>,
  centre: readonly string[],
  r0: string,
): { radius: string | null; assumed: boolean } {
  const N = centre.length;
  if (compareDecimal(r0, '0') === 0) return { radius: null, assumed: false };
  let assumed = false;
  const ar = plan.sys.arith;
  const m = plan.m;
  // @heuristic contraction ratio of the last tests: q(r) = max_k |K(Y)_k − m_k| / r, which for
  // the Krawczyk bound behaves like T + L·r; the radius where q reaches 1 guides the search.
  const samples: Array<{ r: number; q: number }> = [];
  const test = (r: string): boolean => {
    // Y = centre ± r: outer enclosure from the ends of m and r, inner one likewise (T operations).
    const rr = ar.fromDecimal(r);
    const outer: T[] = new Array<T>(N);
    const inner: T[] = new Array<T>(N);
    for (let k = 0; k < N; k++) {
      const mk = m[k]!;
      const ol = ar.lo(ar.sub(ar.lo(mk), ar.hi(rr)));
      const oh = ar.hi(ar.add(ar.hi(mk), ar.hi(rr)));
      const il = ar.hi(ar.sub(ar.hi(mk), ar.lo(rr)));
      const ih = ar.lo(ar.add(ar.lo(mk), ar.lo(rr)));
      if (!ar.certainlyLt(il, ih)) return false;
      outer[k] = ar.hull(ol, oh);
      inner[k] = ar.hull(il, ih);
    }
    const out = krawczykPlanned(plan, outer, inner);
    const rd = Number(r);
    if (out.kind !== 'domain' && rd > 0) {
      let dev = 0;
      for (let k = 0; k < N; k++) {
        const img = out.image[k]!;
        dev = Math.max(dev, ar.hiUp(img) - ar.loDown(m[k]!), ar.hiUp(m[k]!) - ar.loDown(img));
      }
      samples.push({ r: rd, q: dev / rd });
    }
    if (out.kind === 'inside') {
      assumed ||= out.assumed;
      return true;
    }
    return false;
  };
  // @heuristic search on doubles; every tested radius is an exact 3-digit decimal > r0, and the
  // result is the largest radius that passed (r0 itself is tested only when none did). Keeps a
  // bracket g < bad (g = r0 at first, bad = Infinity). The first test is at the ABSOLUTE start
  // 1e-3·(1 + max|centre|) (never r0·16^k alone: near a zero coordinate r0 is ~1e-300). Then each
  // step proposes (1) 0.97 × the radius where q reaches 1 on the line through the last two (r, q)
  // samples — or, with one usable sample of q < 1, at r/q (q ∝ r) — but at least 1.12·g, unless
  // the previous such proposal failed; else (2) growth by 16, 256, 65536, … while nothing failed,
  // or (3) the log-space midpoint of the bracket. Stops when bad/g <= 1.25, or after 40 tests.
  let good: string | null = null;
  let g = Math.max(Number(r0), Number.MIN_VALUE);
  let bad = Infinity;
  let scale = 0;
  for (const c of centre) scale = Math.max(scale, Math.abs(Number(c)));
  let growth = 16;
  let secantFailed = false;
  let first = true;
  const secant = (): number | null => {
    if (samples.length === 1 && samples[0]!.q > 0 && samples[0]!.q < 1) return samples[0]!.r / samples[0]!.q;
    if (samples.length < 2) return null;
    const a1 = samples[samples.length - 2]!;
    const a2 = samples[samples.length - 1]!;
    if (!(Number.isFinite(a1.q) && Number.isFinite(a2.q)) || a1.r === a2.r) return null;
    const L = (a2.q - a1.q) / (a2.r - a1.r);
    const est = L > 0 ? a2.r + (1 - a2.q) / L : a2.q > 0 && a2.q < 1 ? a2.r / a2.q : NaN;
    return Number.isFinite(est) && est > 0 ? est : null;
  };
  for (let j = 0; j < 40 && bad / g > 1.25; j++) {
    let cand = NaN;
    let viaSecant = false;
    if (first) {
      cand = Math.max(g * 16, 1e-3 * (1 + scale));
      first = false;
    } else {
      const est = secantFailed ? null : secant();
      if (est !== null) {
        cand = Math.max(0.97 * est, g * 1.12);
        viaSecant = cand < bad;
      }
      if (!viaSecant) {
        if (bad === Infinity) {
          cand = g * growth;
          growth = Math.min(growth * growth, 1e30);
        } else cand = Math.exp((Math.log(g) + Math.log(bad)) / 2);
      }
    }
    if (!(cand <= 1e300)) break;
    const s = cand.toPrecision(3);
    const v = Number(s);
    if (!(v > g && v < bad)) {
      if (viaSecant) {
        secantFailed = true;
        continue;
      }
      break;
    }
    if (test(s)) {
      good = s;
      g = v;
      secantFailed = false;
    } else {
      bad = v;
      secantFailed = viaSecant;
    }
  }
  if (good === null) good = test(r0) ? r0 : null;
  return { radius: good, assumed: good === null ? false : assumed };
}
