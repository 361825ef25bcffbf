/**
 * Checker for count certificates (kind "periodic-orbit-count", docs/certificate-format.md).
 *
 * It re-derives every count from the cover codes alone: it rebuilds each node box of the bisection
 * tree of R^p exactly (decimal midpoints at high precision), decides every leaf itself with its own
 * interval arithmetic (decimal.js, directed rounding) and its own contraction and Krawczyk steps,
 * then identifies the zeros, tests region membership and minimal periods, and compares the counts
 * with the claims. The certificate's leaf marks are only a plan: '-' must be excluded here, '*'
 * must hold exactly one zero here, '?' claims nothing.
 *
 * Mathematics used (beyond krawczyk.ts): every zero x in a box B satisfies x_{i+1} = f(x_i), so
 * X_{i+1} ← X_{i+1} ∩ f(X_i) and ∩ (f(m) + Df(X_i)(X_i − m)) (mean value) keep all zeros; for
 * n = 1 with 0 ∉ f'(X_i) also X_i ← X_i ∩ (m + (X_{i+1} − f(m))/f'(X_i)); zeros in X lie in K(X̃)
 * for X ⊂ X̃; K(X̃) ⊂ int X̃ ⇒ exactly one zero in X̃. Identification, region and minimal period as
 * in the prover's rules (repeated in checkCount's comments).
 */
import { Decimal } from 'decimal.js';
import { COUNT_ALPHABET } from '../certificate/types.js';
import { ivCtx } from './elementary.js';
import { Evaluator, FormulaError, isValidName, parseFormula, type Node } from './formula.js';
import { DomainViolation, Exact, isDecimalLiteral, type Iv, type IvCtx } from './interval.js';
import { certificateHash } from './json.js';
import { image, preconditioner, type Precond, type Shooting } from './krawczyk.js';

export class CountRejection extends Error {
  constructor(
    message: string,
    readonly path: string,
  ) {
    super(message);
  }
}
export const reject = (path: string, msg: string): never => {
  throw new CountRejection(msg, path);
};

/** Exact arithmetic for node boxes: dyadic midpoints of decimal ends need few hundred digits. */
export const Hi = Decimal.clone({ precision: 1000, rounding: Decimal.ROUND_HALF_EVEN, minE: -9e15, maxE: 9e15 });

const SWEEPS = 6;
const KRAWCZYK_STEPS = 6;
const TIGHTEN_STEPS = 5;
const MAX_PIECE_DEPTH = 16;
const MAX_COUNT_UNKNOWNS = COUNT_ALPHABET.length;

type Obj = Record<string, unknown>;
export function obj(v: unknown, path: string): Obj {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) reject(path, `expected an object at ${path}`);
  return v as Obj;
}
export function arr(v: unknown, path: string): unknown[] {
  if (!Array.isArray(v)) reject(path, `expected an array at ${path}`);
  return v as unknown[];
}
export function str(v: unknown, path: string): string {
  if (typeof v !== 'string') reject(path, `expected a string at ${path}`);
  return v as string;
}
export function int(v: unknown, path: string, min: number, max: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min || v > max) reject(path, `expected an integer in [${min}, ${max}] at ${path}`);
  return v as number;
}
function dec(v: unknown, path: string): string {
  const s = str(v, path);
  if (s.length > 400 || !isDecimalLiteral(s)) reject(path, `not a decimal literal (at most 400 characters) at ${path}`);
  return s;
}

export interface CountCheckLimits {
  maxPeriod: number;
  maxDimension: number;
  maxFormulaLength: number;
}

/**
 * The common part of count certificates: hash, map (state, parameters, step formulas) and region.
 * Throws CountRejection.
 */
export function readCountHeader(d: Obj, digits: number, limits: CountCheckLimits): { c: IvCtx; params: Map<string, Iv>; step: Node[]; n: number; region: { lo: Decimal; hi: Decimal }[] } {
  if (certificateHash(d) !== str(d.sha256, '$.sha256')) reject('$.sha256', `sha256 does not match the document (computed ${certificateHash(d)})`);
  const map = obj(d.map, '$.map');
  const state = arr(map.state, '$.map.state').map((s, i) => str(s, `$.map.state[${i}]`));
  const n = state.length;
  if (n < 1 || n > limits.maxDimension) reject('$.map.state', `state dimension ${n} outside [1, ${limits.maxDimension}]`);
  const ident = { test: isValidName }; // one identifier rule for prover and checker
  if (new Set(state).size !== n || state.some((s) => !ident.test(s))) reject('$.map.state', 'bad or repeated state names');
  const c = ivCtx(digits);
  const params = new Map<string, Iv>();
  for (const [k, v] of Object.entries(obj(map.params ?? {}, '$.map.params'))) {
    const path = `$.map.params.${k}`;
    if (!ident.test(k) || state.includes(k)) reject(path, `bad parameter name ${JSON.stringify(k)}`);
    if (typeof v === 'string') params.set(k, c.literal(dec(v, path)));
    else {
      const a = arr(v, path);
      if (a.length !== 2) reject(path, `expected [lo, hi] at ${path}`);
      const lo = dec(a[0], `${path}[0]`);
      const hi = dec(a[1], `${path}[1]`);
      if (new Exact(lo).gt(new Exact(hi))) reject(path, `lo > hi at ${path}`);
      params.set(k, c.literal(lo, hi));
    }
  }
  const stepRaw = obj(map.step, '$.map.step');
  if (Object.keys(stepRaw).length !== n) reject('$.map.step', 'map.step must have exactly one formula per state variable');
  const step: Node[] = state.map((s) => {
    const path = `$.map.step.${s}`;
    const src = str(stepRaw[s], path);
    if (src.length > limits.maxFormulaLength) reject(path, `formula longer than ${limits.maxFormulaLength} characters`);
    try {
      return parseFormula(src, state, new Set(params.keys()));
    } catch (e) {
      if (e instanceof FormulaError) reject(path, `${path}, column ${e.column}: ${e.message}`);
      throw e;
    }
  });
  const regionRaw = arr(d.region, '$.region');
  if (regionRaw.length !== n) reject('$.region', `expected ${n} intervals at $.region`);
  const region = regionRaw.map((v, a) => {
    const r = arr(v, `$.region[${a}]`);
    if (r.length !== 2) reject(`$.region[${a}]`, 'expected [lo, hi]');
    const lo = new Hi(dec(r[0], `$.region[${a}][0]`));
    const hi = new Hi(dec(r[1], `$.region[${a}][1]`));
    if (!lo.lt(hi)) reject(`$.region[${a}]`, 'region interval must have lo < hi');
    return { lo, hi };
  });
  return { c, params, step, n, region };
}

/** Verifies a parsed count certificate; throws CountRejection (or DomainViolation) when it cannot. */
export function checkCount(d: Obj, digits: number, limits: CountCheckLimits): void {
  const { c, params, step, n, region } = readCountHeader(d, digits, limits);
  const depth = int(d.pieceDepth, '$.pieceDepth', 0, MAX_PIECE_DEPTH);
  const counts = arr(d.counts, '$.counts');
  if (counts.length === 0) reject('$.counts', 'no counts');
  const seen = new Set<number>();
  counts.forEach((entry, e) => {
    const path = `$.counts[${e}]`;
    const o = obj(entry, path);
    const p = int(o.period, `${path}.period`, 1, limits.maxPeriod);
    if (seen.has(p)) reject(`${path}.period`, `period ${p} appears twice`);
    seen.add(p);
    if (p * n > MAX_COUNT_UNKNOWNS) reject(`${path}.period`, `period × dimension exceeds ${MAX_COUNT_UNKNOWNS}`);
    const pieces = arr(o.pieces, `${path}.pieces`).map((x, j) => str(x, `${path}.pieces[${j}]`));
    if (pieces.length !== 2 ** depth) reject(`${path}.pieces`, `expected ${2 ** depth} pieces, found ${pieces.length} (an incomplete cover)`);
    const claims = obj(o.claims, `${path}.claims`);
    const derived = countPeriod({ c, ev: new Evaluator(c, params), step, p, n }, region, depth, pieces, `${path}.pieces`);
    const want = (k: string, v: number): void => {
      const got = claims[k];
      if (got !== v) reject(`${path}.claims.${k}`, `claimed ${k} ${JSON.stringify(got)} but the checker derives ${v} for period ${p}`);
    };
    want('zeros', derived.zeros);
    want('undecidedBoxes', derived.undecidedBoxes);
    want('undecidedZeros', derived.undecidedZeros);
    const byPeriod = obj(claims.orbitsByMinimalPeriod, `${path}.claims.orbitsByMinimalPeriod`);
    const keys = Object.keys(derived.orbits);
    if (Object.keys(byPeriod).length !== keys.length) reject(`${path}.claims.orbitsByMinimalPeriod`, `expected exactly the divisors ${keys.join(', ')} of ${p}`);
    for (const k of keys) {
      if (byPeriod[k] !== derived.orbits[k]) reject(`${path}.claims.orbitsByMinimalPeriod.${k}`, `claimed ${JSON.stringify(byPeriod[k])} orbits of minimal period ${k} but the checker derives ${derived.orbits[k]}`);
    }
  });
}

export interface Zero {
  K: Iv[];
  X: Iv[];
}

/** Replays the pieces of one period; returns the derived counts. */
function countPeriod(s: Shooting, region: { lo: Decimal; hi: Decimal }[], depth: number, pieces: string[], path: string): { zeros: number; orbits: Record<string, number>; undecidedBoxes: number; undecidedZeros: number } {
  const { p, n } = s;
  const N = p * n;
  const zeros: Zero[] = [];
  let undecidedBoxes = 0;
  const width = region.map((r) => Hi.sub(r.hi, r.lo));
  for (let j = 0; j < pieces.length; j++) {
    const code = pieces[j]!;
    const lo: Decimal[] = [];
    const hi: Decimal[] = [];
    for (let k = 0; k < N; k++) {
      lo.push(region[k % n]!.lo);
      hi.push(region[k % n]!.hi);
    }
    for (let l = 0; l < depth; l++) {
      const cmp = l % n;
      const mid = Hi.div(Hi.add(lo[cmp]!, hi[cmp]!), 2);
      if ((j >> (depth - 1 - l)) & 1) lo[cmp] = mid;
      else hi[cmp] = mid;
    }
    const r = replayTree(s, { lo, hi }, code, 0, width, zeros, `${path}[${j}]`, `piece ${j}`);
    undecidedBoxes += r.undecided;
    if (r.pos !== code.length) reject(`${path}[${j}]`, `cover code of piece ${j} has ${code.length - r.pos} characters after its last box`);
  }
  return classify(s, zeros, region, undecidedBoxes);
}

/**
 * Replays the subtree code starting at `start` for the root box B (exact decimal ends): every
 * leaf decided afresh, zeros appended to `zeros`. Returns the position after the subtree and the
 * number of '?' leaves. `width` scales the Krawczyk threshold (region widths).
 */
export function replayTree(s: Shooting, root: { lo: Decimal[]; hi: Decimal[] }, code: string, start: number, width: Decimal[], zeros: Zero[], path: string, label: string): { pos: number; undecided: number } {
  const N = s.p * s.n;
  const n = s.n;
  let undecided = 0;
  const stack: { lo: Decimal[]; hi: Decimal[] }[] = [root];
  let pos = start;
  while (stack.length > 0) {
    const B = stack.pop()!;
    if (pos >= code.length) reject(path, `cover code of ${label} ends early (a box is missing)`);
    const ch = code[pos++]!;
    if (ch === '?') {
      undecided++;
      continue;
    }
    if (ch === '-' || ch === '*') {
      const X: Iv[] = [];
      for (let k = 0; k < N; k++) X.push(s.c.literal(B.lo[k]!.toFixed(), B.hi[k]!.toFixed()));
      // the mark is a plan: what counts is the checker's own decision. A box decided "none" or
      // "one zero (recorded)" is accounted for either way (a zero recorded from a neighbouring
      // leaf's inflated box is a true zero and is identified with that leaf's zero later).
      const r = decide(s, X, width);
      if (r === 'split') reject(path, `${label}, code position ${pos - 1}: box marked '${ch}' is neither excluded nor shown to hold exactly one zero by the checker (${describe(B, n)})`);
      if (typeof r === 'object') zeros.push(r);
      continue;
    }
    const k = COUNT_ALPHABET.indexOf(ch);
    if (k < 0 || k >= N) reject(path, `${label}, code position ${pos - 1}: unknown mark ${JSON.stringify(ch)}`);
    const mid = Hi.div(Hi.add(B.lo[k]!, B.hi[k]!), 2);
    const low = { lo: [...B.lo], hi: [...B.hi] };
    low.hi[k] = mid;
    const high = { lo: [...B.lo], hi: [...B.hi] };
    high.lo[k] = mid;
    stack.push(high, low);
  }
  return { pos, undecided };
}

function describe(B: { lo: Decimal[]; hi: Decimal[] }, n: number): string {
  return `point 0 box ${B.lo.slice(0, n).map((l, a) => `[${l.toSD(8).toString()}, ${B.hi[a]!.toSD(8).toString()}]`).join(' × ')}`;
}

/** 'none', a zero (K, X̃), or 'split' (undecided here). */
function decide(s: Shooting, X: Iv[], width: Decimal[]): 'none' | 'split' | Zero {
  const { c, p, n } = s;
  const N = p * n;
  const rel = (k: number, frac: number): boolean => Hi.mul(Hi.sub(X[k]!.hi, X[k]!.lo), frac).lte(width[k % n]!);
  for (let sweep = 0; sweep < SWEEPS; sweep++) {
    for (let i = 0; i < p; i++) {
      const xi = X.slice(i * n, i * n + n);
      let f: Iv[];
      try {
        f = image(s, xi, false).f;
      } catch (e) {
        if (e instanceof DomainViolation) continue;
        throw e;
      }
      let mv: { fm: Iv[]; jac: Iv[]; m: Iv[] } | null = null;
      if (xi.every((_, a) => rel(i * n + a, 8))) {
        try {
          const m = xi.map((x) => c.point(c.midpoint(x)));
          const fm = image(s, m, false).f;
          const jac = image(s, xi, true).jac!;
          mv = { fm, jac, m };
          for (let a = 0; a < n; a++) {
            let y = fm[a]!;
            for (let b = 0; b < n; b++) y = c.add(y, c.mul(jac[a * n + b]!, c.sub(xi[b]!, m[b]!)));
            f[a] = meet(f[a]!, y) ?? f[a]!;
          }
        } catch (e) {
          if (!(e instanceof DomainViolation)) throw e;
          mv = null;
        }
      }
      const nx = ((i + 1) % p) * n;
      for (let a = 0; a < n; a++) {
        const r = meet(X[nx + a]!, f[a]!);
        if (!r) return 'none';
        X[nx + a] = r;
      }
      if (mv && n === 1) {
        const dv = mv.jac[0]!;
        if (dv.lo.gt(0) || dv.hi.lt(0)) {
          const back = c.add(mv.m[0]!, c.div(c.sub(X[nx]!, mv.fm[0]!), dv));
          const r = meet(X[i]!, back);
          if (!r) return 'none';
          X[i] = r;
        }
      }
    }
  }
  for (let it = 0; it < KRAWCZYK_STEPS; it++) {
    for (let k = 0; k < N; k++) if (!rel(k, 16)) return 'split';
    const Xt = X.map(inflate(c));
    const K = krawczykBox(s, Xt);
    if (!K) return 'split';
    if (K.every((k, r) => k.lo.gt(Xt[r]!.lo) && k.hi.lt(Xt[r]!.hi))) {
      let Kt = K;
      for (let t = 0; t < TIGHTEN_STEPS; t++) {
        const K2 = krawczykBox(s, Kt);
        if (!K2) break;
        const m = Kt.map((k, r) => meet(k, K2[r]!));
        if (m.some((x) => !x)) break;
        Kt = m as Iv[];
      }
      return { K: Kt, X: Xt };
    }
    for (let k = 0; k < N; k++) {
      const r = meet(X[k]!, K[k]!);
      if (!r) return 'none';
      X[k] = r;
    }
  }
  return 'split';
}

function meet(a: Iv, b: Iv): Iv | null {
  const lo = a.lo.gt(b.lo) ? a.lo : b.lo;
  const hi = a.hi.lt(b.hi) ? a.hi : b.hi;
  return lo.gt(hi) ? null : { lo, hi };
}

/** X̃ = [lo − δ, hi + δ], δ ≥ w/8 + 1e-12·(|lo| + |hi|) + 1e-30 (the prover's rule; any δ ≥ 0 is sound). */
function inflate(c: IvCtx): (x: Iv) => Iv {
  return (x) => {
    const w = c.Up.sub(x.hi, x.lo);
    const d = c.Up.add(c.Up.add(c.Up.mul(w, '0.125'), c.Up.mul(c.Up.add(x.lo.abs(), x.hi.abs()), '1e-12')), '1e-30');
    return { lo: c.Down.sub(x.lo, d), hi: c.Up.add(x.hi, d) };
  };
}

/** K(X) = m − C·F(m) + (I − C·J(X))(X − m) for the shooting system; null when an evaluation fails. */
function krawczykBox(s: Shooting, X: Iv[]): Iv[] | null {
  const { c, p, n } = s;
  const N = p * n;
  try {
    const M = X.map((x) => c.point(c.midpoint(x)));
    const C: Precond | null = preconditioner(s, M, false);
    if (!C) return null;
    const Fm: Iv[] = new Array<Iv>(N);
    for (let i = 0; i < p; i++) {
      const { f } = image(s, M.slice(i * n, i * n + n), false);
      const nx = ((i + 1) % p) * n;
      for (let a = 0; a < n; a++) Fm[i * n + a] = c.sub(M[nx + a]!, f[a]!);
    }
    const D: Iv[][] = [];
    for (let q = 0; q < p; q++) D.push(image(s, X.slice(q * n, q * n + n), true).jac!);
    const Z = X.map((x, i) => c.sub(x, M[i]!));
    const K: Iv[] = [];
    for (let r = 0; r < N; r++) {
      const row: (Decimal | undefined)[] = new Array<Decimal | undefined>(N);
      C.cols[r]!.forEach((col, t) => (row[col] = C.vals[r]![t]!));
      let acc = M[r]!;
      for (let j = 0; j < N; j++) if (row[j]) acc = c.sub(acc, c.scale(row[j]!, Fm[j]!));
      for (let q = 0; q < p; q++) {
        const prev = ((q - 1 + p) % p) * n;
        for (let b = 0; b < n; b++) {
          const col = q * n + b;
          let B: Iv = col === r ? c.one : c.zero;
          const cp = row[prev + b];
          if (cp) B = c.sub(B, c.point(cp));
          for (let a = 0; a < n; a++) {
            const ca = row[q * n + a];
            if (ca) B = c.add(B, c.scale(ca, D[q]![a * n + b]!));
          }
          acc = c.add(acc, c.mul(B, Z[col]!));
        }
      }
      K.push(acc);
    }
    return K;
  } catch (e) {
    if (e instanceof DomainViolation) return null;
    throw e;
  }
}

/** Identification, region membership and minimal period (the prover's rules, derived afresh). */
export function classify(s: Shooting, all: Zero[], region: { lo: Decimal; hi: Decimal }[], undecidedBoxes: number): { zeros: number; orbits: Record<string, number>; undecidedBoxes: number; undecidedZeros: number } {
  const { c, p, n } = s;
  const N = p * n;
  const sub = (a: Iv[], b: Iv[], sa = 0, sb = 0): boolean => {
    for (let k = 0; k < N; k++) {
      const x = a[(k + sa) % N]!;
      const y = b[(k + sb) % N]!;
      if (x.lo.lt(y.lo) || x.hi.gt(y.hi)) return false;
    }
    return true;
  };
  const disjoint = (a: Iv[], b: Iv[], sa: number): boolean => {
    for (let k = 0; k < N; k++) {
      const x = a[(k + sa) % N]!;
      const y = b[k]!;
      if (x.hi.lt(y.lo) || y.hi.lt(x.lo)) return true;
    }
    return false;
  };
  // identification: same when K_a ⊂ X̃_b or K_b ⊂ X̃_a; distinct when K_a ∩ K_b = ∅
  const order = all.map((_, i) => i).sort((a, b) => all[a]!.K[0]!.lo.cmp(all[b]!.K[0]!.lo) || a - b);
  const parent = all.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) i = parent[i] = parent[parent[i]!]!;
    return i;
  };
  let undecidedZeros = 0;
  for (let x = 0; x < order.length; x++) {
    const a = all[order[x]!]!;
    for (let y = x + 1; y < order.length; y++) {
      const b = all[order[y]!]!;
      if (b.K[0]!.lo.gt(a.K[0]!.hi)) break;
      if (disjoint(a.K, b.K, 0)) continue;
      // same zero; or undecided — merged too, so that the counts stay lower bounds
      if (!(sub(a.K, b.X) || sub(b.K, a.X))) undecidedZeros++;
      parent[find(order[x]!)] = find(order[y]!);
    }
  }
  const divisors: number[] = [];
  for (let d = 1; d < p; d++) if (p % d === 0) divisors.push(d);
  const byPeriod = new Map<number, number>();
  let zeros = 0;
  for (let i = 0; i < all.length; i++) {
    if (find(i) !== i) continue;
    const z = all[i]!;
    // region: K ⊂ R^p, or K ∩ R^p = ∅, or an exact zero at a point of X̃ ∩ R^p
    let inside = true;
    let outside = false;
    for (let k = 0; k < N; k++) {
      const r = region[k % n]!;
      if (z.K[k]!.lo.lt(r.lo) || z.K[k]!.hi.gt(r.hi)) inside = false;
      if (z.K[k]!.hi.lt(r.lo) || z.K[k]!.lo.gt(r.hi)) outside = true;
    }
    if (outside) continue;
    if (!inside && !exactZeroInside(s, z, region)) {
      undecidedZeros++;
      continue;
    }
    zeros++;
    // minimal period: σ_d z = z when σ_d K ⊂ X̃ or K ⊂ σ_d X̃; σ_d z ≠ z when σ_d K ∩ K = ∅
    let minimal = p;
    for (const d of divisors) {
      if (disjoint(z.K, z.K, d * n)) continue;
      minimal = sub(z.K, z.X, d * n, 0) || sub(z.K, z.X, 0, d * n) ? d : -1;
      break;
    }
    if (minimal < 0) {
      undecidedZeros++;
      continue;
    }
    byPeriod.set(minimal, (byPeriod.get(minimal) ?? 0) + 1);
  }
  const orbits: Record<string, number> = {};
  for (const d of [...divisors, p]) {
    const k = byPeriod.get(d) ?? 0;
    if (k % d !== 0) undecidedZeros += k % d;
    orbits[String(d)] = Math.floor(k / d);
  }
  void c;
  return { zeros, orbits, undecidedBoxes, undecidedZeros };
}

/** A point m ∈ X̃ ∩ R^p (region ends where K straddles them, else midpoints) with F(m) = 0 exactly. */
function exactZeroInside(s: Shooting, z: Zero, region: { lo: Decimal; hi: Decimal }[]): boolean {
  const { c, p, n } = s;
  const N = p * n;
  const m: Iv[] = [];
  for (let k = 0; k < N; k++) {
    const r = region[k % n]!;
    const K = z.K[k]!;
    const v = K.lo.lte(r.lo) && r.lo.lte(K.hi) ? r.lo : K.lo.lte(r.hi) && r.hi.lte(K.hi) ? r.hi : c.midpoint(K);
    if (v.lt(z.X[k]!.lo) || v.gt(z.X[k]!.hi) || v.lt(r.lo) || v.gt(r.hi)) return false;
    m.push(c.literal(v.toFixed()));
  }
  try {
    for (let i = 0; i < p; i++) {
      const { f } = image(s, m.slice(i * n, i * n + n), false);
      const nx = ((i + 1) % p) * n;
      for (let a = 0; a < n; a++) {
        const F = c.sub(m[nx + a]!, f[a]!);
        if (!F.lo.isZero() || !F.hi.isZero()) return false;
      }
    }
  } catch (e) {
    if (e instanceof DomainViolation) return false;
    throw e;
  }
  return true;
}

/** For tests and diagnostics: the leaf decision on an explicit box. */
export const decideLeafForTests = decide;
