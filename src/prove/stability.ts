/**
 * Rigorous stability enclosures of a proven orbit, over its boxes X_0..X_{p−1}
 * (DESIGN.md §4 "Stability"), generic over an interval arithmetic.
 *
 *  - n = 1: multiplier Λ = Π f'(X_i) (interval product; contains f'(x_{p−1})···f'(x_0) for the
 *    orbit's true points since x_i ∈ X_i).
 *  - n = 2: trace T and determinant D of the monodromy matrix M = Df(X_{p−1})···Df(X_0).
 *    D = Π det Df(X_i) (multiplicative, no wrapping). T is formed in moving orthogonal frames to
 *    avoid the wrapping of a plain interval matrix product (whose width grows like the spectral
 *    radius of |Df|, not of Df): with float rotations Q_k from QR of the float products and
 *    Q_{−1} = I, M = Q_{p−1}·R_{p−1}···R_0 where R_k = Q_k^{-1}·Df(X_k)·Q_{k−1} is evaluated in
 *    intervals with Q_k^{-1} enclosed as adj(Q_k)/det(Q_k). Any nonsingular Q_k gives a rigorous
 *    enclosure; the rotations only make it tight (each R_k is nearly upper triangular).
 *    Eigenvalues λ = (T ± √(T² − 4D))/2: real when T² − 4D > 0 certainly; the larger in modulus
 *    is λ₁ = (T + sign(T)·√(T² − 4D))/2 and the other λ₂ = D/λ₁ (no cancellation); complex when
 *    T² − 4D < 0 certainly, both of modulus √D. Otherwise moduli are not claimed.
 *  - n ≥ 3: the monodromy is formed in moving frames as for n = 2 (Q_k from float modified
 *    Gram–Schmidt QR, Q_k^{-1} enclosed from ‖I − Q_kᵀQ_k‖∞ < 1 by a Neumann bound), giving an
 *    interval matrix S ∋ Q_{p−1}^{-1}·M·Q_{p−1} (similar to M); Gershgorin discs of S in an
 *    approximate eigenbasis (gershgorin.ts) bound |λ|. Reported as `proverOnly` (fast engine only,
 *    not re-verified by the checker); `class` stays 'undecided'.
 * Every reported enclosure is widened by 2^-30 relative + 1e-300 absolute (decimal-out.ts) and the
 * class is decided from the widened enclosures only.
 */
import type { IntervalArithmetic } from '../interval/arithmetic.js';
import { ExactCeil, ExactFloor, pairAbsAboveOne, pairAbsBelowOne, REPORT_ABSOLUTE_MARGIN, widenPair } from './decimal-out.js';
import { compareDecimal as cmp, decimalOfDouble } from '../interval/decimal-literal.js';
import { intervalMatMul, orthogonalInverseEnclosure, orthonormalColumns } from '../linalg/interval-matrix.js';
import { down, mulDown, mulUp, up } from '../interval/round.js';
import type { Decimal } from 'decimal.js';
import { gershgorinDiscs, type GershgorinBasis } from './gershgorin.js';
import type { DecimalPair, ProvenStability, StabilityClass } from './types.js';

function pairOf<T>(arith: IntervalArithmetic<T>, x: T): DecimalPair {
  const d = arith.toDecimal(x);
  return widenPair(d.lo, d.hi);
}

/**
 * Stability of the orbit whose Jacobian blocks over the boxes are `blocks` (p·n·n, row-major
 * per point, enclosing Df(X_i)).
 */
export function orbitStability<T>(arith: IntervalArithmetic<T>, blocks: readonly T[], p: number, n: number): ProvenStability {
  if (n === 1) return stability1(arith, blocks, p);
  if (n === 2) return arith.kind === 'interval' && arith.bits === 53 ? stability2Scaled(arith, blocks, p) : stability2(arith, blocks, p);
  return stabilityN(arith, blocks, p, n);
}

function stability1<T>(arith: IntervalArithmetic<T>, blocks: readonly T[], p: number): ProvenStability {
  let multiplier: DecimalPair | null;
  if (arith.kind === 'interval' && arith.bits === 53) {
    multiplier = scaledProduct(arith, blocks, p);
    if (multiplier === null) return { class: 'undecided', note: 'the multiplier enclosure is unbounded' };
  } else {
    let lambda: T = blocks[0]!;
    for (let i = 1; i < p; i++) lambda = arith.mul(lambda, blocks[i]!);
    if (!isBounded(arith, lambda)) return { class: 'undecided', note: 'the multiplier enclosure is unbounded (overflow)' };
    multiplier = pairOf(arith, lambda);
  }
  if (pairAbsBelowOne(multiplier)) return { class: 'attracting', multiplier };
  if (pairAbsAboveOne(multiplier)) return { class: 'repelling', multiplier };
  return { class: 'undecided', multiplier, note: 'the multiplier enclosure contains a value of modulus 1 or straddles it' };
}

/**
 * Π blocks_i for float64 intervals, in scaled form: a double interval [lo, hi] times 2^e with an
 * integer e, so the product never leaves float64's range (|Λ| = 2^10000 for a period-10,000 orbit
 * of 4x(1 − x) is fine). Contract: the returned decimal pair contains every product of points of
 * the factors. Each product end is rounded outward (mulDown/mulUp), each rescaling multiplies by
 * an exact power of two and is then stepped outward once more (down/up: exact scalings stay
 * enclosures, and a scaling into the subnormal range is covered by the step). The final
 * conversion lo·2^e, hi·2^e is done in decimal.js with the rounding directed outward and then
 * widened by widenPair. Null when a factor is unbounded or the exponent leaves ±10^6.
 */
function scaledProduct<T>(a: IntervalArithmetic<T>, blocks: readonly T[], p: number): DecimalPair | null {
  let lo = 1;
  let hi = 1;
  let e = 0;
  for (let i = 0; i < p; i++) {
    const bl = a.loDown(blocks[i]!);
    const bh = a.hiUp(blocks[i]!);
    if (!Number.isFinite(bl) || !Number.isFinite(bh)) return null;
    const l = Math.min(mulDown(lo, bl), mulDown(lo, bh), mulDown(hi, bl), mulDown(hi, bh));
    const h = Math.max(mulUp(lo, bl), mulUp(lo, bh), mulUp(hi, bl), mulUp(hi, bh));
    lo = l;
    hi = h;
    const mag = Math.max(Math.abs(lo), Math.abs(hi));
    if (!Number.isFinite(mag)) return null;
    if (mag > 2 ** 200 || (mag < 2 ** -200 && mag > 0)) {
      const k = Math.floor(Math.log2(mag));
      const s = 2 ** -k;
      lo = down(lo * s);
      hi = up(hi * s);
      e += k;
      if (Math.abs(e) > 1e6) return null;
    }
  }
  return scaledPair(lo, hi, e);
}

/** The decimal pair enclosing [lo, hi]·2^e (lo ≤ hi doubles, e an integer), rounded outward, widened. */
function scaledPair(lo: number, hi: number, e: number): DecimalPair {
  const pow = (r: typeof ExactFloor): Decimal => (e >= 0 ? new r(2).pow(e) : new r(1).div(new (r === ExactFloor ? ExactCeil : ExactFloor)(2).pow(-e)));
  // lower end: lo·2^e rounded down (2^e rounded so that the product moves down)
  const L = lo >= 0 ? ExactFloor.mul(decimalOfDouble(lo), pow(ExactFloor)) : ExactFloor.mul(decimalOfDouble(lo), pow(ExactCeil));
  const H = hi >= 0 ? ExactCeil.mul(decimalOfDouble(hi), pow(ExactCeil)) : ExactCeil.mul(decimalOfDouble(hi), pow(ExactFloor));
  // the absolute floor scaled like the value (1e-300·2^e, rounded up): a scaled enclosure of a
  // determinant (−0.3)^5000 is printed as itself, not as ±1e-300
  const floor = e < 0 ? ExactCeil.mul(REPORT_ABSOLUTE_MARGIN, pow(ExactCeil)).toSignificantDigits(3, ExactCeil.ROUND_CEIL).toString() : REPORT_ABSOLUTE_MARGIN;
  return widenPair(L.toString(), H.toString(), 20, floor);
}

/**
 * Multiplies every entry of xs by the same exact power of two 2^-k (an interval product, so
 * rounded outward) when their largest magnitude leaves [2^-200, 2^200]; returns k (the caller
 * adds it to the common exponent). |k| ≤ 1000, so 2^-k is a normal double.
 */
function renormalise<T>(a: IntervalArithmetic<T>, xs: T[]): number {
  let mag = 0;
  for (const x of xs) mag = Math.max(mag, a.magUp(x));
  if (!Number.isFinite(mag) || !(mag > 2 ** 200 || (mag < 2 ** -200 && mag > 0))) return 0;
  const k = Math.max(-1000, Math.min(1000, Math.floor(Math.log2(mag))));
  const s = a.fromNumber(2 ** -k);
  for (let i = 0; i < xs.length; i++) xs[i] = a.mul(xs[i]!, s);
  return k;
}

function isBounded<T>(arith: IntervalArithmetic<T>, x: T): boolean {
  return Number.isFinite(arith.magUp(x)) || arith.kind === 'mp-interval';
}


/** Product of two 2×2 interval matrices (row-major), each entry enclosed. */
function mul2x2<T>(a: IntervalArithmetic<T>, x: readonly T[], y: readonly T[]): T[] {
  return [
    a.add(a.mul(x[0]!, y[0]!), a.mul(x[1]!, y[2]!)),
    a.add(a.mul(x[0]!, y[1]!), a.mul(x[1]!, y[3]!)),
    a.add(a.mul(x[2]!, y[0]!), a.mul(x[3]!, y[2]!)),
    a.add(a.mul(x[2]!, y[1]!), a.mul(x[3]!, y[3]!)),
  ];
}

/**
 * One step of the moving-frame monodromy product (shared by the plain and the scaled n = 2
 * stability): with the float rotation Q_k that triangularises mid(B_k)·Q_{k-1}, returns
 * R_k = Q_k^{-1}·B_k·Q_{k-1} enclosed (Q_k^{-1} = adj(Q_k)/det(Q_k), det(Q_k) = c² + s² enclosed),
 * and Q_k as floats and as point intervals. `midF`, `bF` are caller scratch (4 entries each).
 */
function movingFrameStep<T>(
  a: IntervalArithmetic<T>,
  blk: T[],
  qPrevF: Float64Array,
  qPrev: T[],
  midF: Float64Array,
  bF: Float64Array,
): { rk: T[]; qF: Float64Array<ArrayBuffer>; q: T[] } {
  for (let e = 0; e < 4; e++) midF[e] = a.midNumber(blk[e]!);
  bF[0] = midF[0]! * qPrevF[0]! + midF[1]! * qPrevF[2]!;
  bF[1] = midF[0]! * qPrevF[1]! + midF[1]! * qPrevF[3]!;
  bF[2] = midF[2]! * qPrevF[0]! + midF[3]! * qPrevF[2]!;
  bF[3] = midF[2]! * qPrevF[1]! + midF[3]! * qPrevF[3]!;
  const [c, s] = rotationOf(bF);
  const qF = new Float64Array([c, -s, s, c]);
  const q: T[] = [a.fromNumber(c), a.fromNumber(-s), a.fromNumber(s), a.fromNumber(c)];
  const dq = a.add(a.mul(q[0]!, q[3]!), a.neg(a.mul(q[1]!, q[2]!)));
  const qInv: T[] = [a.div(q[3]!, dq), a.div(a.neg(q[1]!), dq), a.div(a.neg(q[2]!), dq), a.div(q[0]!, dq)];
  return { rk: mul2x2(a, qInv, mul2x2(a, blk, qPrev)), qF, q };
}

/** @heuristic float rotation (c, s) taking the first column of b (2×2 row-major) to (h, 0). */
function rotationOf(b: Float64Array): [number, number] {
  const x = b[0]!;
  const y = b[2]!;
  const h = Math.hypot(x, y);
  if (!(h > 0) || !Number.isFinite(h)) return [1, 0];
  return [x / h, y / h];
}

function stability2<T>(arith: IntervalArithmetic<T>, blocks: readonly T[], p: number): ProvenStability {
  const a = arith;
  const mul2 = (x: readonly T[], y: readonly T[]): T[] => mul2x2(a, x, y);
  // Determinant: product of the per-step determinants.
  let det = a.fromNumber(1);
  for (let k = 0; k < p; k++) {
    const b = blocks.slice(k * 4, k * 4 + 4);
    det = a.mul(det, a.sub(a.mul(b[0]!, b[3]!), a.mul(b[1]!, b[2]!)));
  }
  // Trace in moving frames.
  let qPrevF = new Float64Array([1, 0, 0, 1]);
  let qPrev: T[] = [a.fromNumber(1), a.fromNumber(0), a.fromNumber(0), a.fromNumber(1)];
  let prod: T[] = [a.fromNumber(1), a.fromNumber(0), a.fromNumber(0), a.fromNumber(1)];
  const midF = new Float64Array(4);
  const bF = new Float64Array(4);
  for (let k = 0; k < p; k++) {
    const { rk, qF, q } = movingFrameStep(a, blocks.slice(k * 4, k * 4 + 4), qPrevF, qPrev, midF, bF);
    prod = mul2(rk, prod);
    qPrevF = qF;
    qPrev = q;
  }
  const m = mul2(qPrev, prod);
  const trace = a.add(m[0]!, m[3]!);
  if (!isBounded(a, trace) || !isBounded(a, det)) {
    return { class: 'undecided', note: 'the monodromy enclosure is unbounded (overflow)' };
  }
  const tracePair = pairOf(a, trace);
  const detPair = pairOf(a, det);
  const zero = a.fromNumber(0);
  const disc = a.sub(a.sqr(trace), a.mul(a.fromNumber(4), det));
  let moduli: DecimalPair[] | undefined;
  if (!isBounded(a, disc)) {
    // T² overflows (long saddle orbits, e.g. Hénon period ≳ 850): with T certainly ≠ 0,
    // λ₁ = T·(1 + √(1 − 4D/T²))/2 and λ₂ = D/λ₁, with D/T² formed as (D/T)/T (no overflow).
    if (a.certainlyLt(zero, trace) || a.certainlyLt(trace, zero)) {
      const s = a.div(a.div(det, trace), trace);
      const d1 = a.sub(a.fromNumber(1), a.mul(a.fromNumber(4), s));
      if (a.certainlyLt(zero, d1)) {
        const l1 = a.mul(a.mul(trace, a.add(a.fromNumber(1), a.sqrt(d1))), a.fromNumber(0.5));
        if (isBounded(a, l1) && (a.certainlyLt(zero, l1) || a.certainlyLt(l1, zero))) {
          const l2 = a.div(det, l1);
          const m1 = pairOf(a, a.abs(l1));
          const m2 = pairOf(a, a.abs(l2));
          moduli = compareLo(m1, m2) <= 0 ? [m1, m2] : [m2, m1];
        }
      }
    }
  } else if (a.certainlyLt(zero, disc)) {
    const root = a.sqrt(disc);
    const half = a.fromNumber(0.5);
    let l1: T;
    let l2: T;
    if (a.certainlyLt(zero, trace)) {
      l1 = a.mul(a.add(trace, root), half);
      l2 = a.certainlyLt(zero, l1) ? a.div(det, l1) : a.mul(a.sub(trace, root), half);
    } else if (a.certainlyLt(trace, zero)) {
      l1 = a.mul(a.sub(trace, root), half);
      l2 = a.certainlyLt(l1, zero) ? a.div(det, l1) : a.mul(a.add(trace, root), half);
    } else {
      l1 = a.mul(a.add(trace, root), half);
      l2 = a.mul(a.sub(trace, root), half);
    }
    if (isBounded(a, l1) && isBounded(a, l2)) {
      const m1 = pairOf(a, a.abs(l1));
      const m2 = pairOf(a, a.abs(l2));
      moduli = compareLo(m1, m2) <= 0 ? [m1, m2] : [m2, m1];
    }
  } else if (a.certainlyLt(disc, zero) && a.certainlyLt(zero, det)) {
    const mod = pairOf(a, a.sqrt(det));
    moduli = [mod, [mod[0], mod[1]]];
  }
  const out: ProvenStability = { class: 'undecided', trace: tracePair, determinant: detPair };
  if (moduli === undefined) {
    out.note = 'the sign of T² − 4D is not decided';
    return out;
  }
  out.eigenvalueModuli = moduli;
  const below = moduli.map((x) => pairAbsBelowOne(x));
  const above = moduli.map((x) => pairAbsAboveOne(x));
  if (below.every(Boolean)) out.class = 'attracting';
  else if (above.every(Boolean)) out.class = 'repelling';
  else if ((below[0] && above[1]) || (below[1] && above[0])) out.class = 'saddle';
  else out.note = 'an eigenvalue modulus enclosure contains 1';
  return out;
}

/**
 * n = 2 for float64 intervals, beyond float64's range: the same moving-frame product as
 * stability2, with the four entries of the product sharing one power-of-two exponent (renormalised
 * every step, see renormalise), the determinant a scaled product of the per-step determinants, and
 * the eigenvalues derived from the scaled trace t·2^eT and determinant d·2^eD:
 * T² − 4D = 2^(2eT)·(t² − 4d·2^(eD−2eT)); with T certainly ≠ 0, λ₁ = 2^eT·(t + sign(t)·√(·))/2 and
 * λ₂ = D/λ₁ = 2^(eD − eL)·d/l. When eD − 2eT < −900 the term 4d·2^(eD−2eT) is enclosed by the
 * hull of ±|4d|·2^−900 (it is smaller in modulus). Complex case: |λ| = √D = 2^(eD/2)·√d (eD even).
 */
function stability2Scaled<T>(a: IntervalArithmetic<T>, blocks: readonly T[], p: number): ProvenStability {
  const mul2 = (x: readonly T[], y: readonly T[]): T[] => mul2x2(a, x, y);
  const unbounded = (): ProvenStability => ({ class: 'undecided', note: 'the monodromy enclosure is unbounded (overflow)' });
  const dv: T[] = [a.fromNumber(1)];
  let eD = 0;
  for (let k = 0; k < p; k++) {
    const b = blocks.slice(k * 4, k * 4 + 4);
    dv[0] = a.mul(dv[0]!, a.sub(a.mul(b[0]!, b[3]!), a.mul(b[1]!, b[2]!)));
    eD += renormalise(a, dv);
  }
  let qPrevF = new Float64Array([1, 0, 0, 1]);
  let qPrev: T[] = [a.fromNumber(1), a.fromNumber(0), a.fromNumber(0), a.fromNumber(1)];
  let prod: T[] = [a.fromNumber(1), a.fromNumber(0), a.fromNumber(0), a.fromNumber(1)];
  let eP = 0;
  const midF = new Float64Array(4);
  const bF = new Float64Array(4);
  for (let k = 0; k < p; k++) {
    const { rk, qF, q } = movingFrameStep(a, blocks.slice(k * 4, k * 4 + 4), qPrevF, qPrev, midF, bF);
    prod = mul2(rk, prod);
    eP += renormalise(a, prod);
    qPrevF = qF;
    qPrev = q;
  }
  const m = mul2(qPrev, prod);
  const t = a.add(m[0]!, m[3]!);
  const d = dv[0]!;
  if (!Number.isFinite(a.magUp(t)) || !Number.isFinite(a.magUp(d)) || Math.abs(eP) > 1e6 || Math.abs(eD) > 1e6) return unbounded();
  const pairS = (x: T, e: number): DecimalPair => scaledPair(a.loDown(x), a.hiUp(x), e);
  const out: ProvenStability = { class: 'undecided', trace: pairS(t, eP), determinant: pairS(d, eD) };
  const zero = a.fromNumber(0);
  const kk = eD - 2 * eP;
  let moduli: DecimalPair[] | undefined;
  if (kk <= 900) {
    const d4 = a.mul(a.fromNumber(4), d);
    let s4: T;
    if (kk >= -900) s4 = a.mul(d4, a.fromNumber(2 ** kk));
    else {
      const eps = mulUp(a.magUp(d4), 2 ** -900);
      s4 = a.hull(a.fromNumber(-eps), a.fromNumber(eps));
    }
    const disc = a.sub(a.sqr(t), s4);
    const half = a.fromNumber(0.5);
    if (a.certainlyLt(zero, disc)) {
      const root = a.sqrt(disc);
      let l1: T | null = null;
      if (a.certainlyLt(zero, t)) l1 = a.mul(a.add(t, root), half);
      else if (a.certainlyLt(t, zero)) l1 = a.mul(a.sub(t, root), half);
      if (l1 !== null && (a.certainlyLt(zero, l1) || a.certainlyLt(l1, zero))) {
        const l2 = a.div(d, l1);
        if (Number.isFinite(a.magUp(l1)) && Number.isFinite(a.magUp(l2))) {
          const m1 = pairS(a.abs(l1), eP);
          const m2 = pairS(a.abs(l2), eD - eP);
          moduli = compareLo(m1, m2) <= 0 ? [m1, m2] : [m2, m1];
        }
      } else if (l1 === null) {
        // sign of T undecided: both roots (t ± √disc)/2, same exponent
        const m1 = pairS(a.abs(a.mul(a.add(t, root), half)), eP);
        const m2 = pairS(a.abs(a.mul(a.sub(t, root), half)), eP);
        moduli = compareLo(m1, m2) <= 0 ? [m1, m2] : [m2, m1];
      }
    } else if (a.certainlyLt(disc, zero) && a.certainlyLt(zero, d)) {
      const odd = ((eD % 2) + 2) % 2;
      const mod = pairS(a.sqrt(a.mul(d, a.fromNumber(2 ** odd))), (eD - odd) / 2);
      moduli = [mod, [mod[0], mod[1]]];
    }
  }
  if (moduli === undefined) {
    out.note = 'the sign of T² − 4D is not decided';
    return out;
  }
  out.eigenvalueModuli = moduli;
  const below = moduli.map((x) => pairAbsBelowOne(x));
  const above = moduli.map((x) => pairAbsAboveOne(x));
  if (below.every(Boolean)) out.class = 'attracting';
  else if (above.every(Boolean)) out.class = 'repelling';
  else if ((below[0] && above[1]) || (below[1] && above[0])) out.class = 'saddle';
  else out.note = 'an eigenvalue modulus enclosure contains 1';
  return out;
}

function compareLo(x: DecimalPair, y: DecimalPair): number {
  // Decimal strings: compare numerically and exactly (compareDecimal, interval/decimal-literal.ts).
  return cmp(x[0], y[0]);
}

/**
 * n >= 3, the class the independent checker re-verifies: Gershgorin discs of the DIRECT monodromy
 * product M = A_{p−1}···A_0 (intervals) in an approximate eigenbasis of mid M (gershgorin.ts); the
 * basis goes into the certificate as a hint (src/checker/stability-n.ts repeats the argument in
 * decimal arithmetic). Null when the discs decide nothing (e.g. long orbits: the direct product
 * wraps; then the moving-frame bound below is reported as fast engine only).
 */
function stabilityDirect<T>(a: IntervalArithmetic<T>, blocks: readonly T[], p: number, n: number, moduliOut?: DecimalPair[]): ProvenStability | null {
  const nn = n * n;
  let M: T[] = [];
  for (let i = 0; i < nn; i++) M.push(a.fromNumber(i % (n + 1) === 0 ? 1 : 0));
  for (let k = 0; k < p; k++) M = intervalMatMul(a, blocks.slice(k * nn, (k + 1) * nn), M, n);
  for (const x of M) if (!isBounded(a, x)) return null;
  const basis: GershgorinBasis = {};
  const discs = gershgorinDiscs(a, M, n, basis);
  if (discs === null || basis.V === undefined || basis.R === undefined) return null;
  const inside = discs.map((d) => d.modulusHi < 1);
  const outside = discs.map((d) => d.modulusLo > 1);
  let cls: StabilityClass | null = null;
  if (inside.every(Boolean)) cls = 'attracting';
  else if (outside.every(Boolean)) cls = 'repelling';
  else if (inside.every((b, i) => b || outside[i])) cls = 'saddle';
  if (cls === null) return null;
  // the discs' moduli (each disc is inside or outside the unit circle, so the two unions are
  // disjoint; per-disc moduli as in the moving-frame report below)
  if (moduliOut) {
    for (const d of discs) moduliOut.push(widenPair(decimalOfDouble(d.modulusLo), decimalOfDouble(d.modulusHi)));
    moduliOut.sort((x, y) => cmp(x[0], y[0]));
  }
  const rows = (m: Float64Array): string[][] =>
    Array.from({ length: n }, (_, i) => Array.from(m.subarray(i * n, i * n + n), (v) => decimalOfDouble(v)));
  return {
    class: cls,
    eigenbasis: { re: rows(basis.V.re), im: rows(basis.V.im), inverseRe: rows(basis.R.re), inverseIm: rows(basis.R.im) },
  };
}

function stabilityN<T>(a: IntervalArithmetic<T>, blocks: readonly T[], p: number, n: number): ProvenStability {
  const moving = stabilityMovingFrames(a, blocks, p, n);
  const directModuli: DecimalPair[] = [];
  const direct = stabilityDirect(a, blocks, p, n, directModuli);
  if (direct === null) return moving;
  // the class the checker re-verifies; the moduli stay as prover-only information: the moving-frame
  // discs, or the direct product's discs when those are narrower (e.g. return maps of flows,
  // whose monodromy has an eigenvalue 0 and a strongly contracting one: the moving frames there
  // gave |λ| ∈ [0, 7260] where the direct discs give [4.4, 4.5])
  const widest = (ms: readonly DecimalPair[]): number => Math.max(...ms.map((m) => Number(m[1]) - Number(m[0])));
  const moduli = moving.proverOnly && widest(moving.proverOnly.eigenvalueModuli) <= widest(directModuli) ? moving.proverOnly.eigenvalueModuli : directModuli;
  return { ...direct, proverOnly: { class: direct.class, eigenvalueModuli: moduli, method: 'gershgorin' } };
}

function stabilityMovingFrames<T>(a: IntervalArithmetic<T>, blocks: readonly T[], p: number, n: number): ProvenStability {
  const nn = n * n;
  const undecided = (why: string): ProvenStability => ({ class: 'undecided', note: `n = ${n} >= 3: ${why}` });
  const identity: Float64Array = new Float64Array(nn);
  for (let i = 0; i < n; i++) identity[i * n + i] = 1;
  let qPrevF: Float64Array = identity;
  let qPrev: T[] = Array.from(identity, (v) => a.fromNumber(v));
  let prod: T[] = qPrev.slice();
  const bF = new Float64Array(nn);
  for (let k = 0; k < p; k++) {
    const blk = blocks.slice(k * nn, (k + 1) * nn);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let s = 0;
        for (let l = 0; l < n; l++) s += a.midNumber(blk[i * n + l]!) * qPrevF[l * n + j]!;
        bF[i * n + j] = s;
      }
    }
    let qF: Float64Array = orthonormalColumns(bF, n) ?? identity;
    let qInv = orthogonalInverseEnclosure(a, qF, n);
    if (qInv === null) {
      qF = identity;
      qInv = Array.from(identity, (v) => a.fromNumber(v));
    }
    const q = Array.from(qF, (v) => a.fromNumber(v));
    prod = intervalMatMul(a, intervalMatMul(a, qInv, intervalMatMul(a, blk, qPrev, n), n), prod, n);
    qPrevF = qF;
    qPrev = q;
  }
  const S = intervalMatMul(a, prod, qPrev, n);
  for (const x of S) if (!isBounded(a, x)) return undecided('the monodromy enclosure is unbounded (overflow)');
  const discs = gershgorinDiscs(a, S, n);
  if (discs === null) return undecided('no Gershgorin enclosure (approximate eigenbasis too ill-conditioned)');
  const moduli = discs
    .map((d): DecimalPair => widenPair(decimalOfDouble(d.modulusLo), decimalOfDouble(d.modulusHi)))
    .sort((x, y) => cmp(x[0], y[0]));
  const below = moduli.map((x) => pairAbsBelowOne(x));
  const above = moduli.map((x) => pairAbsAboveOne(x));
  let cls: StabilityClass = 'undecided';
  // Each disc is strictly inside or strictly outside the unit circle; the inside union is then
  // disjoint from the outside union, so each holds as many eigenvalues as discs (Gershgorin).
  if (below.every(Boolean)) cls = 'attracting';
  else if (above.every(Boolean)) cls = 'repelling';
  else if (below.every((b, i) => b || above[i])) cls = 'saddle';
  return {
    class: 'undecided',
    note:
      `n = ${n} >= 3: the independent checker does not re-verify stability; the fast engine's Gershgorin bound ` +
      (cls === 'undecided' ? 'is undecided (a disc contains a point of modulus 1)' : `says ${cls} (fast engine only, not re-verified)`),
    proverOnly: { class: cls, eigenvalueModuli: moduli, method: 'gershgorin' },
  };
}
