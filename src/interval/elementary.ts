/**
 * Proven enclosures of exp and log at a double, using only correctly rounded + − × ÷ (through the
 * successor formula of round.ts) — no Math.* accuracy assumption.
 *
 * exp(x): x = k·ln2 + r with k = round(x / ln2) and r enclosed using a two-part ln2
 * (LN2_HEAD with 32 significant bits, so k·LN2_HEAD is exact for |k| < 2^21, plus an enclosed
 * tail); e^r for |r| ≤ 0.36 by interval Horner evaluation of the Taylor polynomial of degree 16
 * with enclosed coefficients 1/j! and the Lagrange remainder |r|^17/17!·e^|r| < 2e-22; then the exact
 * (or directed, near under/overflow) scaling by 2^k.
 *
 * log(x): x = m·2^e with m ∈ [√½, √2); log m = 2·atanh(s) = 2s·Σ z^i/(2i+1), s = (m − 1)/(m + 1),
 * z = s² ≤ 0.0295, written 2s + 2s·z·Σ_{i<11} z^i/(2i+3) with remainder z^11/25/(1 − z); s = s0 + δ with
 * s0 = fl(s) and δ enclosed from the exact residual; log x = [e·LN2_HEAD + 2s0] (TwoSum, exact) +
 * [2δ + correction + e·tail] (directed), one final directed addition.
 *
 * Constants are checked against decimal.js in tests/interval/elementary.test.ts. Tightness on points
 * (normal results): exp ≤ 5 ulps (each Horner step rounds outward; the scaling by 2^k is exact),
 * log ≤ 3 ulps; measured maxima 5 and 3 on 3·10^5 and 1.2·10^6 random points.
 */

import { addDown, addUp, divDown, divUp, down, mulDown, mulUp, subDown, subUp, twoProductError, twoSumError, up } from './round.js';

/** ln 2 = LN2_HEAD + tail, LN2_HEAD = 0x3FE62E42FEE00000 (32 significant bits, as in fdlibm). */
export const LN2_HEAD = 6.93147180369123816490e-1;
/** Enclosure of ln 2 − LN2_HEAD (≈ 1.9082149292705877e-10). */
export const LN2_TAIL_LO = 1.9082149292705874e-10;
export const LN2_TAIL_HI = 1.908214929270588e-10;

const DEGREE_EXP = 16;
/** Bound of |r|^17/17!·e^|r| for |r| ≤ 0.36 (0.36^17 / 17! ≈ 8.0e-23, times e^0.36 < 1.44). */
const EXP_REMAINDER = 2e-22;
const R_LIMIT = 0.36;

// Enclosures of 1/j!, j = 0..DEGREE_EXP, by directed division.
const INV_FACT_LO = new Float64Array(DEGREE_EXP + 1);
const INV_FACT_HI = new Float64Array(DEGREE_EXP + 1);
INV_FACT_LO[0] = 1;
INV_FACT_HI[0] = 1;
for (let j = 1; j <= DEGREE_EXP; j++) {
  INV_FACT_LO[j] = divDown(INV_FACT_LO[j - 1]!, j);
  INV_FACT_HI[j] = divUp(INV_FACT_HI[j - 1]!, j);
}

const TERMS_LOG = 12;
// Enclosures of 1/(2i + 1), i = 0..TERMS_LOG − 1.
const INV_ODD_LO = new Float64Array(TERMS_LOG);
const INV_ODD_HI = new Float64Array(TERMS_LOG);
for (let i = 0; i < TERMS_LOG; i++) {
  INV_ODD_LO[i] = divDown(1, 2 * i + 1);
  INV_ODD_HI[i] = divUp(1, 2 * i + 1);
}

// Exact powers of two 2^k for k in [-1022, 1023] from the bit pattern.
const POW2 = new Float64Array(2046);
{
  const bits = new BigInt64Array(POW2.buffer);
  for (let k = -1022; k <= 1023; k++) bits[k + 1022] = BigInt(k + 1023) << 52n;
}
function pow2(k: number): number {
  return POW2[k + 1022]!;
}

/** v·2^k rounded down (v ≥ 0), exact when the result is normal. */
function scaleDown(v: number, k: number): number {
  while (k > 1023) {
    v = mulDown(v, pow2(1023));
    k -= 1023;
  }
  while (k < -1022) {
    v = Math.max(0, mulDown(v, pow2(-1022)));
    k += 1022;
  }
  const p = v * pow2(k);
  // Exact when the result is normal and finite; mulDown would otherwise take a needless successor
  // step for products below 2^-969 (seen: exp(−678.23) was 7 ulps wide).
  if (p >= 2 ** -1022 && p <= Number.MAX_VALUE) return p;
  return Math.max(0, mulDown(v, pow2(k)));
}

/** v·2^k rounded up (v ≥ 0). */
function scaleUp(v: number, k: number): number {
  while (k > 1023) {
    v = mulUp(v, pow2(1023));
    k -= 1023;
  }
  while (k < -1022) {
    v = mulUp(v, pow2(-1022));
    k += 1022;
  }
  const p = v * pow2(k);
  if (p >= 2 ** -1022 && p <= Number.MAX_VALUE) return p; // exact, as in scaleDown
  return mulUp(v, pow2(k));
}

/** Range of Σ_{j ≤ 16} r^j/j! over r ∈ [rl, rh] (interval Horner), written to out[o], out[o + 1]. */
function expPoly(rl: number, rh: number, out: Float64Array, o: number): void {
  let tl = INV_FACT_LO[DEGREE_EXP]!;
  let th = INV_FACT_HI[DEGREE_EXP]!;
  for (let j = DEGREE_EXP - 1; j >= 0; j--) {
    const p1 = rl * tl;
    const p2 = rl * th;
    const p3 = rh * tl;
    const p4 = rh * th;
    if (j > 3) {
      tl = down(INV_FACT_LO[j]! + down(Math.min(p1, p2, p3, p4)));
      th = up(INV_FACT_HI[j]! + up(Math.max(p1, p2, p3, p4)));
    } else {
      // Last steps dominate the width: use the tight directed operations (round.ts).
      const ml = Math.min(mulDown(rl, tl), mulDown(rl, th), mulDown(rh, tl), mulDown(rh, th));
      const mh = Math.max(mulUp(rl, tl), mulUp(rl, th), mulUp(rh, tl), mulUp(rh, th));
      tl = addDown(INV_FACT_LO[j]!, ml);
      th = addUp(INV_FACT_HI[j]!, mh);
    }
  }
  out[o] = tl;
  out[o + 1] = th;
}

const EXP_OVER = 709.7827128933841; // > ln(MAX) = 709.782712893383996…: e^x > MAX beyond
const EXP_UNDER = -745.1332191019412; // < ln(2^-1075): e^x < 2^-1075 below

/** Writes [lo, hi] to out[o], out[o + 1]. */
function putPair(out: Float64Array, o: number, lo: number, hi: number): void {
  out[o] = lo;
  out[o + 1] = hi;
}

/**
 * Proven bounds [lo, hi] of e^x for a double x, written to out[o], out[o + 1]. Special cases:
 * 0 → [1, 1]; x > 709.79 → [MAX, +∞]; x < −745.14 → [0, 2^-1074] (callers handle infinities).
 */
export function expEnclose(x: number, out: Float64Array, o = 0): void {
  if (x === 0) return putPair(out, o, 1, 1);
  if (x >= EXP_OVER) return putPair(out, o, Number.MAX_VALUE, Infinity);
  if (x <= EXP_UNDER) return putPair(out, o, 0, 2 ** -1074);
  const k = Math.round(x * 1.4426950408889634); // any integer is correct; this one makes |r| small
  const kh = k * LN2_HEAD; // exact: |k| ≤ 1075 < 2^11 and LN2_HEAD has 32 significant bits
  const aL = subDown(x, kh);
  const aH = subUp(x, kh);
  const tL = k >= 0 ? mulDown(k, LN2_TAIL_LO) : mulDown(k, LN2_TAIL_HI);
  const tH = k >= 0 ? mulUp(k, LN2_TAIL_HI) : mulUp(k, LN2_TAIL_LO);
  const rl = subDown(aL, tH);
  const rh = subUp(aH, tL);
  if (!(rl >= -R_LIMIT && rh <= R_LIMIT)) throw new Error(`internal: exp reduction out of range at ${x}`);
  expPoly(rl, rh, out, o);
  const pl = out[o]!;
  const ph = out[o + 1]!;
  putPair(out, o, scaleDown(Math.max(0, subDown(pl, EXP_REMAINDER)), k), scaleUp(addUp(ph, EXP_REMAINDER), k));
}

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const LITTLE = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
const HI_WORD = LITTLE ? 1 : 0;
const SQRT_HALF = 0.7071067811865476; // only a split point: any value in (0.5, 1) keeps |s| < 1/3

/**
 * Proven bounds [lo, hi] of ln x for a finite double x > 0, written to out[o], out[o + 1].
 * ln 1 = 0 exactly.
 */
export function logEnclose(x: number, out: Float64Array, o = 0): void {
  if (x === 1) return putPair(out, o, 0, 0);
  let e = 0;
  let m = x;
  if (m < 2 ** -1022) {
    m *= 2 ** 54; // exact: subnormal to normal
    e = -54;
  }
  f64[0] = m;
  const hw = u32[HI_WORD]!;
  e += ((hw >>> 20) & 0x7ff) - 1023;
  u32[HI_WORD] = (hw & 0x800fffff) | (1023 << 20); // m ∈ [1, 2), exact
  m = f64[0]!;
  if (m > 2 * SQRT_HALF) {
    m *= 0.5; // exact
    e += 1;
  }
  // s = (m − 1)/(m + 1) = s0 + δ: s0 = fl(num/(m + 1)), and δ = (num − s0·m − s0)/(m + 1) enclosed
  // from the exact TwoProduct s0·m = p + pe (|s0·m| ≥ 2^-54 when num ≠ 0, far inside its range).
  // m − 1 is exact (Sterbenz, m ∈ [0.7, 1.42]); m + 1 need not be, so it is never formed for s0's
  // residual. Keeping s0 as a separate head lets the final sum e·LN2_HEAD + 2s0 be done exactly
  // (TwoSum) and round only once: the cancellation for x just below 1/√2·2^k (log m ≈ −e·ln2/2)
  // otherwise costs 2–3 extra ulps (seen: log(0.7055587547072296) was 6 ulps wide).
  const num = m - 1;
  const dl = addDown(m, 1);
  const dh = addUp(m, 1);
  let s0 = 0;
  let dlo = 0; // δ ∈ [dlo, dhi]
  let dhi = 0;
  if (num !== 0) {
    s0 = num / (m + 1);
    const p = s0 * m;
    const pe = twoProductError(s0, m, p);
    // residual ρ = num − p − pe − s0, of order ulp(s0): enclosed by directed sums
    const rl = subDown(subDown(subDown(num, p), pe), s0);
    const rh = subUp(subUp(subUp(num, p), pe), s0);
    dlo = rl >= 0 ? divDown(rl, dh) : divDown(rl, dl);
    dhi = rh >= 0 ? divUp(rh, dl) : divUp(rh, dh);
  }
  const sl = addDown(s0, dlo);
  const sh = addUp(s0, dhi);
  // z = s² ∈ [zl, zh]
  const amin = sl > 0 ? sl : sh < 0 ? -sh : 0;
  const amax = Math.max(-sl, sh);
  const zl = Math.max(0, mulDown(amin, amin));
  const zh = mulUp(amax, amax);
  // log m = 2s + 2s·z·Q'(z), Q'(z) = Σ_{i < 11} z^i/(2i+3) + remainder ≤ z^11/25/(1 − z): the
  // correction is ≤ 1.1% of 2s, so its rounding errors are damped; z ≥ 0 keeps Horner monotone.
  let ql = INV_ODD_LO[TERMS_LOG - 1]!;
  let qh = INV_ODD_HI[TERMS_LOG - 1]!;
  for (let i = TERMS_LOG - 2; i >= 1; i--) {
    ql = addDown(INV_ODD_LO[i]!, mulDown(zl, ql));
    qh = addUp(INV_ODD_HI[i]!, mulUp(zh, qh));
  }
  let zp = zh;
  for (let i = 1; i < TERMS_LOG - 1; i++) zp = mulUp(zp, zh); // zh^11
  qh = addUp(qh, divUp(divUp(zp, 25), subDown(1, zh)));
  // correction c = 2s·z·Q' with z·Q' ∈ [zl·ql, zh·qh] (both ≥ 0)
  const wl = mulDown(zl, ql);
  const wh = mulUp(zh, qh);
  const cl = sl >= 0 ? mulDown(2 * sl, wl) : mulDown(2 * sl, wh);
  const ch = sh >= 0 ? mulUp(2 * sh, wh) : mulUp(2 * sh, wl);
  // log x = [e·LN2_HEAD + 2s0] + [2δ + c + e·tail]: the head sum by TwoSum (exact: hd + hl, e·LN2_HEAD
  // is exact as |e| ≤ 1075 and LN2_HEAD has 32 significant bits; 2s0, 2δ exact scalings), the small
  // tail with directed rounding, then one directed addition.
  const eh = e * LN2_HEAD;
  const hd = eh + 2 * s0;
  const hl = twoSumError(eh, 2 * s0, hd);
  let tl = addDown(addDown(hl, 2 * dlo), cl);
  let th = addUp(addUp(hl, 2 * dhi), ch);
  if (e !== 0) {
    tl = addDown(tl, e > 0 ? mulDown(e, LN2_TAIL_LO) : mulDown(e, LN2_TAIL_HI));
    th = addUp(th, e > 0 ? mulUp(e, LN2_TAIL_HI) : mulUp(e, LN2_TAIL_LO));
  }
  putPair(out, o, addDown(hd, tl), addUp(hd, th));
}

// ---------------------------------------------------------------------------------------------
// sin / cos at a double: x = m·π/2 + r with the double-double π/2 of kernel.ts, |r| ≤ 0.8.

/**
 * π/2 as a triple-double: HALF_PI_1 + HALF_PI_2 + t3 with t3 ∈ [HALF_PI_3_LO, HALF_PI_3_HI]
 * (HALF_PI_1 = fl(π/2), HALF_PI_2 = fl(π/2 − HALF_PI_1), t3 ≈ −1.4973849048591698e-33; checked
 * against decimal.js in tests/interval/elementary.test.ts).
 */
export const HALF_PI_1 = 1.5707963267948966;
export const HALF_PI_2 = 6.123233995736766e-17;
export const HALF_PI_3_LO = -1.49738490485917e-33;
export const HALF_PI_3_HI = -1.4973849048591697e-33;

const K_TRIG = 10;
// sin r = r + r·z·S(z), S(z) = Σ_{k=1..10} (−1)^k z^(k−1)/(2k+1)!; remainder ≤ |r|^23/23!.
// cos r = 1 + z·C(z),   C(z) = Σ_{k=1..10} (−1)^k z^(k−1)/(2k)!;   remainder ≤ r^22/22!.
const S_LO = new Float64Array(K_TRIG);
const S_HI = new Float64Array(K_TRIG);
const C_LO = new Float64Array(K_TRIG);
const C_HI = new Float64Array(K_TRIG);
{
  // 1/n! enclosures for n ≤ 21 by directed division.
  let fl = 1;
  let fh = 1;
  const invLo: number[] = [1];
  const invHi: number[] = [1];
  for (let n = 1; n <= 21; n++) {
    fl = divDown(fl, n);
    fh = divUp(fh, n);
    invLo.push(fl);
    invHi.push(fh);
  }
  for (let k = 1; k <= K_TRIG; k++) {
    const neg = k % 2 === 1;
    S_LO[k - 1] = neg ? -invHi[2 * k + 1]! : invLo[2 * k + 1]!;
    S_HI[k - 1] = neg ? -invLo[2 * k + 1]! : invHi[2 * k + 1]!;
    C_LO[k - 1] = neg ? -invHi[2 * k]! : invLo[2 * k]!;
    C_HI[k - 1] = neg ? -invLo[2 * k]! : invHi[2 * k]!;
  }
}
/** |r|^22/23! for |r| ≤ 0.8, rounded up generously (0.8^22/23! ≈ 2.85e-25). */
const SIN_REL_REM = 3e-25;
/** 0.8^22/22! ≈ 6.6e-24, rounded up. */
const COS_REM = 1e-23;
const TRIG_R_LIMIT = 0.8;

/**
 * Enclosure of x − m·π/2, written to out[o], out[o + 1], for integers |m| ≤ 2^40, |x| ≤ 2^41:
 * m·P1 = p + e and m·P2 = q + f (TwoProduct, exact), x − p = s + t (TwoSum, exact), so
 * x − m·π/2 = s + (t − e − q − f − m·t3), the small part summed with directed rounding.
 */
export function reduceHalfPi(x: number, m: number, out: Float64Array, o = 0): void {
  if (m === 0) return putPair(out, o, x, x);
  const p = m * HALF_PI_1;
  const e = twoProductError(m, HALF_PI_1, p);
  const q = m * HALF_PI_2;
  const f = twoProductError(m, HALF_PI_2, q);
  const s = x - p;
  const t = twoSumError(x, -p, s);
  const m3Lo = m > 0 ? mulDown(m, HALF_PI_3_LO) : mulDown(m, HALF_PI_3_HI);
  const m3Hi = m > 0 ? mulUp(m, HALF_PI_3_HI) : mulUp(m, HALF_PI_3_LO);
  const smallLo = subDown(subDown(subDown(subDown(t, e), q), f), m3Hi);
  const smallHi = subUp(subUp(subUp(subUp(t, e), q), f), m3Lo);
  putPair(out, o, addDown(s, smallLo), addUp(s, smallHi));
}

/** Interval Horner of Σ c_k z^(k−1) over z ∈ [zl, zh] with enclosed coefficients, written to out[o], out[o + 1]. */
function hornerZ(zl: number, zh: number, cl: Float64Array, ch: Float64Array, out: Float64Array, o: number): void {
  let tl = cl[K_TRIG - 1]!;
  let th = ch[K_TRIG - 1]!;
  for (let k = K_TRIG - 2; k >= 0; k--) {
    const ml = Math.min(mulDown(zl, tl), mulDown(zl, th), mulDown(zh, tl), mulDown(zh, th));
    const mh = Math.max(mulUp(zl, tl), mulUp(zl, th), mulUp(zh, tl), mulUp(zh, th));
    tl = addDown(cl[k]!, ml);
    th = addUp(ch[k]!, mh);
  }
  putPair(out, o, tl, th);
}

function mulIntervalLo(al: number, ah: number, bl: number, bh: number): number {
  return Math.min(mulDown(al, bl), mulDown(al, bh), mulDown(ah, bl), mulDown(ah, bh));
}
function mulIntervalHi(al: number, ah: number, bl: number, bh: number): number {
  return Math.max(mulUp(al, bl), mulUp(al, bh), mulUp(ah, bl), mulUp(ah, bh));
}

/**
 * Proven enclosures of sin x and cos x for a double |x| ≤ 2^40, written to out[o..o + 3] as
 * [sin lo, sin hi, cos lo, cos hi]. Returns false (out unspecified) when the reduction is out of
 * range (the caller then uses [−1, 1]).
 */
export function sinCosEnclose(x: number, out: Float64Array, o = 0): boolean {
  if (!(Math.abs(x) <= 2 ** 40)) return false;
  const m = Math.round(x / HALF_PI_1);
  reduceHalfPi(x, m, out, o);
  const rl = out[o]!;
  const rh = out[o + 1]!;
  if (!(rl >= -TRIG_R_LIMIT && rh <= TRIG_R_LIMIT)) return false;
  const amin = rl > 0 ? rl : rh < 0 ? -rh : 0;
  const amax = Math.max(-rl, rh);
  const zl = Math.max(0, mulDown(amin, amin));
  const zh = mulUp(amax, amax);
  // sin r ∈ r + r·(z·S) ± amax·SIN_REL_REM
  hornerZ(zl, zh, S_LO, S_HI, out, o);
  const sl0 = out[o]!;
  const sh0 = out[o + 1]!;
  const wl = mulIntervalLo(zl, zh, sl0, sh0);
  const wh = mulIntervalHi(zl, zh, sl0, sh0);
  const rwl = mulIntervalLo(rl, rh, wl, wh);
  const rwh = mulIntervalHi(rl, rh, wl, wh);
  const rem = mulUp(amax, SIN_REL_REM);
  // Fold the remainder into the small correction first, so r + correction rounds only once.
  const sinRl = addDown(rl, subDown(rwl, rem));
  const sinRh = addUp(rh, addUp(rwh, rem));
  // cos r ∈ 1 + z·C ± COS_REM
  hornerZ(zl, zh, C_LO, C_HI, out, o);
  const cl0 = out[o]!;
  const ch0 = out[o + 1]!;
  const cosRl = addDown(1, subDown(mulIntervalLo(zl, zh, cl0, ch0), COS_REM));
  const cosRh = addUp(1, addUp(mulIntervalHi(zl, zh, cl0, ch0), COS_REM));
  let sinLo: number;
  let sinHi: number;
  let cosLo: number;
  let cosHi: number;
  switch (((m % 4) + 4) % 4) {
    case 0:
      sinLo = sinRl; sinHi = sinRh; cosLo = cosRl; cosHi = cosRh;
      break;
    case 1:
      sinLo = cosRl; sinHi = cosRh; cosLo = -sinRh; cosHi = -sinRl;
      break;
    case 2:
      sinLo = -sinRh; sinHi = -sinRl; cosLo = -cosRh; cosHi = -cosRl;
      break;
    default:
      sinLo = -cosRh; sinHi = -cosRl; cosLo = sinRl; cosHi = sinRh;
  }
  out[o] = Math.max(-1, sinLo);
  out[o + 1] = Math.min(1, sinHi);
  out[o + 2] = Math.max(-1, cosLo);
  out[o + 3] = Math.min(1, cosHi);
  return true;
}
