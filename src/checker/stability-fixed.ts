/**
 * Stability in dimension 2 (krawczyk.ts `stability`, same mathematics) with the products of the
 * monodromy carried out in scaled binary fixed point (fixed.ts) instead of decimal.js (issue 8
 * item 1: the decimal products were a third of the checker's time on Hénon orbits).
 *
 * What is computed, each an enclosure of the exact quantity over the boxes:
 *  - the direct product D_{p−1}···D_0 (only p ≤ 64, as in krawczyk.ts), its trace and determinant;
 *  - the moving-frame product R = R_{p−1}···R_0 with R_k = Q_k^{-1} D_k Q_{k−1}: Q_k = [[c, −s],
 *    [s, c]] for fixed-point numbers c, s (heuristic: the direction of mid(D_k Q_{k−1})'s first
 *    column; any exact invertible Q is valid), Q_k^{-1} = adj(Q_k)·(1/det Q_k) enclosed with
 *    `recip`; M = Q_{p−1} R, whose trace and determinant enclose the monodromy's;
 *  - the product of det D_k.
 * Scaling (the products grow or shrink like 2^(p·Lyapunov exponent)): a product is held as
 * mantissas (fixed-point intervals) times 2^e with one exponent e per matrix; after each step,
 * when an end reaches 2^(F+32) every end is shifted right by 32 bits rounding outward (floor the
 * lower ends, ceil the upper ends: `>>` is floor), e += 32; when every end is below 2^(F−32) they
 * are shifted left (exact), e −= 32. Shifts change no value's enclosure (exact, or outward).
 * The trace and determinant are converted exactly (dyadicString) to decimals and rounded outward
 * to the working precision; the meets and the eigenvalue moduli are then krawczyk.ts's own
 * `fromTraceDet`, so the class rule is literally the same code.
 * Outcome: a Stability, or null when this path cannot decide (a value out of the fixed-point
 * range or a domain problem): the caller then uses the decimal `stability`, and it also does so
 * whenever a claim does not contain this path's enclosure, so a verdict never rests on this
 * path's looseness.
 */
import { dyadicString, FixCtx, FixedRange, fracBitsFor, type Fx } from './fixed.js';
import { DomainViolation, type Iv, type IvCtx } from './interval.js';
import { classify, fromTraceDet, type FixedJacobians, type Stability } from './krawczyk.js';

interface Scaled {
  m: Fx[];
  e: number;
}

const STEP = 32n;

/** Shift a scaled set of intervals so its largest end lies in [2^(F−32), 2^(F+32)) (see the header). */
function renorm(k: FixCtx, s: Scaled): Scaled {
  let top = 0n;
  for (const x of s.m) {
    const a = x.lo < 0n ? -x.lo : x.lo;
    const b = x.hi < 0n ? -x.hi : x.hi;
    if (a > top) top = a;
    if (b > top) top = b;
  }
  if (top === 0n) return s;
  const hiLim = k.one << STEP;
  const loLim = k.one >> STEP;
  let shift = 0n;
  while (top >= hiLim) {
    top >>= STEP;
    shift += STEP;
  }
  if (shift > 0n) return { m: s.m.map((x) => ({ lo: x.lo >> shift, hi: -((-x.hi) >> shift) })), e: s.e + Number(shift) };
  while (top < loLim) {
    top <<= STEP;
    shift += STEP;
  }
  if (shift > 0n) return { m: s.m.map((x) => ({ lo: x.lo << shift, hi: x.hi << shift })), e: s.e - Number(shift) };
  return s;
}

function mat(k: FixCtx, a: readonly Fx[], b: readonly Fx[]): Fx[] {
  return [
    k.add(k.mul(a[0]!, b[0]!), k.mul(a[1]!, b[2]!)),
    k.add(k.mul(a[0]!, b[1]!), k.mul(a[1]!, b[3]!)),
    k.add(k.mul(a[2]!, b[0]!), k.mul(a[3]!, b[2]!)),
    k.add(k.mul(a[2]!, b[1]!), k.mul(a[3]!, b[3]!)),
  ];
}

/**
 * A scaled fixed-point interval x·2^(e−F) as a decimal interval at the working precision: its
 * exact value rounded outward when the scale is moderate; beyond 4,000 binary digits of scale
 * (an exact decimal would have thousands of digits) the integer ends rounded outward times an
 * enclosure of 2^(e−F) by the decimal kernel's directed binary powering (IvCtx.powInt).
 */
function decimalIv(c: IvCtx, k: FixCtx, x: Fx, e: number): Iv {
  const s = e - k.frac;
  if (Math.abs(s) <= 4000) return c.round({ lo: new c.Down(dyadicString(x.lo, s)), hi: new c.Up(dyadicString(x.hi, s)) });
  const ends = c.round({ lo: new c.Down(x.lo.toString()), hi: new c.Up(x.hi.toString()) });
  return c.mul(ends, c.powInt(c.literal('2'), s));
}

/**
 * Stability for n = 1: the multiplier Π f'(X_i) as a scaled fixed-point product (each step one
 * interval product, then the outward shifts of the header), its class by krawczyk.ts's `classify`.
 */
export function stability1Fixed(c: IvCtx, jac: FixedJacobians): Stability | null {
  try {
    const k = jac.k;
    let m: Scaled = { m: [k.point(k.one)], e: 0 };
    for (const d of jac.D) m = renorm(k, { m: [k.mul(m.m[0]!, d[0]!)], e: m.e });
    const multiplier = decimalIv(c, k, m.m[0]!, m.e);
    return { cls: classify([c.abs(multiplier)]), multiplier };
  } catch (e) {
    if (e instanceof FixedRange || e instanceof DomainViolation) return null;
    throw e;
  }
}

/** Stability for n = 2 from D_k ⊇ Df(X_k) (row-major; decimal, or fixed point from a fixed-point Krawczyk path), or null: see the header. */
export function stability2Fixed(c: IvCtx, D: readonly Iv[][] | FixedJacobians): Stability | null {
  try {
    return run(c, D);
  } catch (e) {
    if (e instanceof FixedRange || e instanceof DomainViolation) return null;
    throw e;
  }
}

function run(c: IvCtx, jac: readonly Iv[][] | FixedJacobians): Stability {
  const k = 'k' in jac ? jac.k : new FixCtx(fracBitsFor(c.digits));
  const D = 'k' in jac ? jac.D : jac.map((row) => row.map((x) => k.fromIv(x)));
  const I = [k.point(k.one), k.point(0n), k.point(0n), k.point(k.one)];
  const direct = D.length <= 64; // as krawczyk.ts: past 64 steps the direct product never wins
  let M: Scaled = { m: I, e: 0 };
  let R: Scaled = { m: I, e: 0 };
  let Q = I;
  let detProd: Scaled = { m: [k.point(k.one)], e: 0 };
  for (const d of D) {
    if (direct) M = renorm(k, { m: mat(k, d, M.m), e: M.e });
    detProd = renorm(k, { m: [k.mul(detProd.m[0]!, k.sub(k.mul(d[0]!, d[3]!), k.mul(d[1]!, d[2]!)))], e: detProd.e });
    const B = mat(k, d, Q);
    // @heuristic the frame: direction of mid(B)'s first column, rounded to fixed point
    const x = k.toFloat(k.mid(B[0]!));
    const y = k.toFloat(k.mid(B[2]!));
    const h = Math.hypot(x, y);
    const [cs, sn] = h > 0 && Number.isFinite(h) ? [k.fromFloat(x / h, false), k.fromFloat(y / h, false)] : [k.one, 0n];
    const Qn = [k.point(cs), k.point(-sn), k.point(sn), k.point(cs)];
    const inv = k.recip(k.add(k.mul(Qn[0]!, Qn[3]!), k.mul(Qn[2]!, Qn[2]!)));
    const Qinv = [k.mul(Qn[3]!, inv), k.mul(Qn[2]!, inv), k.neg(k.mul(Qn[2]!, inv)), k.mul(Qn[0]!, inv)];
    R = renorm(k, { m: mat(k, mat(k, Qinv, B), R.m), e: R.e });
    Q = Qn;
  }
  const toIv = (x: Fx, e: number): Iv => decimalIv(c, k, x, e);
  const trace = (a: Fx[]): Fx => k.add(a[0]!, a[3]!);
  const det = (a: Fx[]): Fx => k.sub(k.mul(a[0]!, a[3]!), k.mul(a[1]!, a[2]!));
  const meet = (u: Iv, v: Iv): Iv => ({ lo: c.Down.max(u.lo, v.lo), hi: c.Up.min(u.hi, v.hi) });
  const Mf = mat(k, Q, R.m);
  const Tf = toIv(trace(Mf), R.e);
  const detFrames = toIv(det(Mf), 2 * R.e);
  const T = direct ? meet(toIv(trace(M.m), M.e), Tf) : Tf;
  const detDirect = direct ? meet(toIv(det(M.m), 2 * M.e), detFrames) : detFrames;
  return fromTraceDet(c, T, meet(detDirect, toIv(detProd.m[0]!, detProd.e)));
}
