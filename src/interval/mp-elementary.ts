/**
 * Rigorous point enclosures of elementary functions in decimal.js, for the multiprecision
 * interval arithmetic (src/interval/mp.ts). Every function here takes an exact point x (a
 * Decimal) and a target number of significant digits p and returns an interval {lo, hi} that
 * contains the exact real value f(x). Results carry about p correct digits; the caller rounds
 * them outward to its working precision.
 *
 * How each enclosure is obtained (no result rests on an unproven accuracy claim; decimal.js's own
 * ln / atan are used only to pick a centre whose error is then bounded rigorously):
 *  - all series are evaluated in interval arithmetic on Decimal endpoints with ROUND_FLOOR /
 *    ROUND_CEIL contexts (decimal.js rounds + − × ÷ correctly in the set direction, DESIGN.md §5),
 *    so rounding errors are enclosed automatically; truncation is covered by an explicit
 *    remainder bound added as ±bound.
 *  - π: Machin's formula π = 16·atan(1/5) − 4·atan(1/239) (closed form, classical identity);
 *    alternating series, remainder ≤ first omitted term.
 *  - exp: x = 2^s·r with |r| <= 2^−8, Taylor series of exp(r) with tail
 *    Σ_{j>=n} |r|^j/j! <= 2·|r|^n/n! (valid for |r| <= 1/2), then s interval squarings; the
 *    working precision is raised by s·log10(2) digits to absorb the doubling of relative width.
 *  - log: near 1 (|x−1| < 0.01) ln x = 2·atanh(z), z = (x−1)/(x+1), tail <= 2·|term|; elsewhere
 *    y0 ≈ ln x (decimal.js, unverified), δ = x·exp(−y0) − 1 enclosed with the rigorous exp, and
 *    ln x = y0 + ln(1+δ) with δ/(1+δ) <= ln(1+δ) <= δ (δ > −1).
 *  - sin, cos: reduction x = k·π/2 + r with the rigorous π (precision raised by the decimal
 *    exponent of x), t = r/2^h with |t| <= 2^−5, Taylor series of sin t and cos t with Lagrange
 *    remainder |t|^n/n!, then h interval doublings (sin 2t = 2 sin t cos t, cos 2t = 1 − 2 sin²t).
 *  - atan: y0 ≈ atan x (decimal.js, unverified), δ = (x·cos y0 − sin y0)/(cos y0 + x·sin y0)
 *    enclosed with the rigorous sin/cos, atan x = y0 + atan δ and |atan δ − δ| <= |δ|³/3.
 *  - sinh, cosh: |x| < 1 Taylor series (Lagrange remainder <= cosh(1)·|x|^n/n! <= 2·|x|^n/n!);
 *    otherwise (E − 1/E)/2 and (E + 1/E)/2 with E = exp(|x|) enclosed, using monotonicity in E.
 *  - tanh: sinh/cosh by interval division; for x >= 1.16·(p+3), tanh x ∈ [1 − 10^−(p+2), 1]
 *    because tanh x >= 1 − 2e^{−2x}.
 */
import { Decimal } from 'decimal.js';

/** A closed interval of Decimals, lo <= hi (internal to the mp arithmetic). */
export interface DecimalEnclosure {
  readonly lo: Decimal;
  readonly hi: Decimal;
}

/** Rounding contexts at one precision: toward −∞, toward +∞, and to nearest (approximations). */
export interface MpContext {
  readonly digits: number;
  readonly Dn: Decimal.Constructor;
  readonly Up: Decimal.Constructor;
  readonly Nr: Decimal.Constructor;
}

// Immutable clones keyed by precision; sharing them is pure (nobody calls .set on them).
const contexts = new Map<number, MpContext>();

export function contextFor(digits: number): MpContext {
  let c = contexts.get(digits);
  if (c === undefined) {
    c = {
      digits,
      Dn: Decimal.clone({ precision: digits, rounding: Decimal.ROUND_FLOOR }),
      Up: Decimal.clone({ precision: digits, rounding: Decimal.ROUND_CEIL }),
      Nr: Decimal.clone({ precision: digits, rounding: Decimal.ROUND_HALF_EVEN }),
    };
    contexts.set(digits, c);
  }
  return c;
}

const ONE = new Decimal('1');
const HALF = new Decimal('0.5');

export function point(x: Decimal): DecimalEnclosure {
  return { lo: x, hi: x };
}

function iadd(c: MpContext, a: DecimalEnclosure, b: DecimalEnclosure): DecimalEnclosure {
  return { lo: c.Dn.add(a.lo, b.lo), hi: c.Up.add(a.hi, b.hi) };
}

function isub(c: MpContext, a: DecimalEnclosure, b: DecimalEnclosure): DecimalEnclosure {
  return { lo: c.Dn.sub(a.lo, b.hi), hi: c.Up.sub(a.hi, b.lo) };
}

function ineg(a: DecimalEnclosure): DecimalEnclosure {
  return { lo: a.hi.neg(), hi: a.lo.neg() };
}

function nonNeg(x: Decimal): boolean {
  return x.isZero() || x.isPos();
}

function nonPos(x: Decimal): boolean {
  return x.isZero() || x.isNeg();
}

/** Interval product of finite intervals (sign-case analysis, directed endpoint products). */
function imul(c: MpContext, a: DecimalEnclosure, b: DecimalEnclosure): DecimalEnclosure {
  const { Dn, Up } = c;
  if (nonNeg(a.lo)) {
    if (nonNeg(b.lo)) return { lo: Dn.mul(a.lo, b.lo), hi: Up.mul(a.hi, b.hi) };
    if (nonPos(b.hi)) return { lo: Dn.mul(a.hi, b.lo), hi: Up.mul(a.lo, b.hi) };
    return { lo: Dn.mul(a.hi, b.lo), hi: Up.mul(a.hi, b.hi) };
  }
  if (nonPos(a.hi)) {
    if (nonNeg(b.lo)) return { lo: Dn.mul(a.lo, b.hi), hi: Up.mul(a.hi, b.lo) };
    if (nonPos(b.hi)) return { lo: Dn.mul(a.hi, b.hi), hi: Up.mul(a.lo, b.lo) };
    return { lo: Dn.mul(a.lo, b.hi), hi: Up.mul(a.lo, b.lo) };
  }
  if (nonNeg(b.lo)) return { lo: Dn.mul(a.lo, b.hi), hi: Up.mul(a.hi, b.hi) };
  if (nonPos(b.hi)) return { lo: Dn.mul(a.hi, b.lo), hi: Up.mul(a.lo, b.lo) };
  return {
    lo: Decimal.min(Dn.mul(a.lo, b.hi), Dn.mul(a.hi, b.lo)),
    hi: Decimal.max(Up.mul(a.lo, b.lo), Up.mul(a.hi, b.hi)),
  };
}

/** Interval quotient of finite intervals; b must not contain 0 (else null). */
function idiv(c: MpContext, a: DecimalEnclosure, b: DecimalEnclosure): DecimalEnclosure | null {
  const { Dn, Up } = c;
  if (b.lo.isPos()) {
    if (nonNeg(a.lo)) return { lo: Dn.div(a.lo, b.hi), hi: Up.div(a.hi, b.lo) };
    if (nonPos(a.hi)) return { lo: Dn.div(a.lo, b.lo), hi: Up.div(a.hi, b.hi) };
    return { lo: Dn.div(a.lo, b.lo), hi: Up.div(a.hi, b.lo) };
  }
  if (b.hi.isNeg() && !b.hi.isZero()) {
    if (nonNeg(a.lo)) return { lo: Dn.div(a.hi, b.hi), hi: Up.div(a.lo, b.lo) };
    if (nonPos(a.hi)) return { lo: Dn.div(a.hi, b.lo), hi: Up.div(a.lo, b.hi) };
    return { lo: Dn.div(a.hi, b.hi), hi: Up.div(a.lo, b.hi) };
  }
  return null;
}

/** a² (tight when a straddles 0). */
function isqr(c: MpContext, a: DecimalEnclosure): DecimalEnclosure {
  if (nonNeg(a.lo)) return { lo: c.Dn.mul(a.lo, a.lo), hi: c.Up.mul(a.hi, a.hi) };
  if (nonPos(a.hi)) return { lo: c.Dn.mul(a.hi, a.hi), hi: c.Up.mul(a.lo, a.lo) };
  const m = mag(a);
  return { lo: new Decimal('0'), hi: c.Up.mul(m, m) };
}

/** a / k for a positive integer k. */
function idivInt(c: MpContext, a: DecimalEnclosure, k: number): DecimalEnclosure {
  const kk = String(k); // k is a safe positive integer: its decimal string is exact
  return { lo: c.Dn.div(a.lo, kk), hi: c.Up.div(a.hi, kk) };
}

/** a · k for a positive integer k. */
function imulInt(c: MpContext, a: DecimalEnclosure, k: number): DecimalEnclosure {
  const kk = String(k);
  return { lo: c.Dn.mul(a.lo, kk), hi: c.Up.mul(a.hi, kk) };
}

/** Upper bound of max |a| (exact: no rounding needed). */
function mag(a: DecimalEnclosure): Decimal {
  return Decimal.max(a.lo.abs(), a.hi.abs());
}

/** [−m, m] for m >= 0. */
function symmetric(m: Decimal): DecimalEnclosure {
  return { lo: m.neg(), hi: m };
}

function tolerance(c: MpContext, extra: number): Decimal {
  return new c.Nr(`1e-${c.digits + extra}`);
}

// ---------------------------------------------------------------------------------------------
// π

const piCache = new Map<number, DecimalEnclosure>();

/** atan(1/m) for an integer m >= 2 by its alternating series; remainder <= first omitted term. */
function atanOfReciprocal(c: MpContext, m: number): DecimalEnclosure {
  const m2 = String(m * m);
  let power: DecimalEnclosure = { lo: c.Dn.div('1', String(m)), hi: c.Up.div('1', String(m)) };
  let sum = power;
  const tol = tolerance(c, 2);
  for (let k = 1; ; k++) {
    power = { lo: c.Dn.div(power.lo, m2), hi: c.Up.div(power.hi, m2) };
    const term = idivInt(c, power, 2 * k + 1);
    if (term.hi.lt(tol)) return iadd(c, sum, symmetric(term.hi));
    sum = k % 2 === 1 ? isub(c, sum, term) : iadd(c, sum, term);
  }
}

/** Enclosure of π with about p correct digits (cached per p). */
export function piEnclosure(p: number): DecimalEnclosure {
  let pi = piCache.get(p);
  if (pi === undefined) {
    const c = contextFor(p + 3);
    const a = atanOfReciprocal(c, 5);
    const b = atanOfReciprocal(c, 239);
    pi = isub(c, imulInt(c, a, 16), imulInt(c, b, 4));
    piCache.set(p, pi);
  }
  return pi;
}

// ---------------------------------------------------------------------------------------------
// exp

/** Enclosure of exp(x) for a finite point x; |x| must stay below about 2e16 (overflow). */
export function expPoint(x: Decimal, p: number): DecimalEnclosure {
  if (x.isZero()) return point(ONE);
  const approxAbs = Math.abs(x.toNumber()); // only picks the number of halvings
  const s = approxAbs <= 2 ** -8 ? 0 : Math.ceil(Math.log2(approxAbs)) + 8;
  const c = contextFor(p + Math.ceil(s * 0.30103) + 4);
  const scale = (1n << BigInt(s)).toString();
  const r: DecimalEnclosure = { lo: c.Dn.div(x, scale), hi: c.Up.div(x, scale) };
  if (mag(r).gt(HALF)) throw new Error('internal error: exp range reduction left |r| > 1/2');
  const tol = tolerance(c, 2);
  let sum = point(ONE);
  let term = point(ONE);
  for (let k = 1; ; k++) {
    term = idivInt(c, imul(c, term, r), k);
    const m = mag(term);
    if (m.lt(tol)) {
      sum = iadd(c, sum, symmetric(c.Up.mul(m, '2')));
      break;
    }
    sum = iadd(c, sum, term);
  }
  // exp(r) >= exp(−1/2) > 0, so squaring is monotone on the enclosure.
  for (let i = 0; i < s; i++) sum = { lo: c.Dn.mul(sum.lo, sum.lo), hi: c.Up.mul(sum.hi, sum.hi) };
  return sum;
}

// ---------------------------------------------------------------------------------------------
// log

// ln 10 ∈ [2.302585092994045, 2.302585092994046] (common practice; checked in the tests against
// decimal.js at 200 digits). Used only by the crude fallback for extreme exponents.
const LN10_LO = new Decimal('2.302585092994045');
const LN10_HI = new Decimal('2.302585092994046');

/** Enclosure of ln(x) for a finite point x > 0. */
export function logPoint(x: Decimal, p: number): DecimalEnclosure {
  if (x.eq(ONE)) return point(new Decimal('0'));
  const c = contextFor(p + 5);
  const { Dn, Up, Nr } = c;
  if (Nr.sub(x, '1').abs().lt('0.01')) {
    const xi = point(x);
    const z = idiv(c, isub(c, xi, point(ONE)), iadd(c, xi, point(ONE)));
    if (z === null) throw new Error('internal error: log series denominator');
    const z2 = imul(c, z, z);
    const tol = Dn.mul(mag(z), tolerance(c, 2));
    let power = z;
    let sum = z;
    for (let k = 1; ; k++) {
      power = imul(c, power, z2);
      const term = idivInt(c, power, 2 * k + 1);
      const m = mag(term);
      if (m.lt(tol)) {
        // tail Σ_{j>=k} |z|^{2j+1}/(2j+1) <= |term_k|/(1 − z²) <= 2·|term_k| since z² < 1/2
        sum = iadd(c, sum, symmetric(Up.mul(m, '2')));
        break;
      }
      sum = iadd(c, sum, term);
    }
    return imulInt(c, sum, 2);
  }
  // y0 only needs about half the digits: the bounds on ln(1+δ) differ by about δ².
  const y0 = contextFor(Math.ceil(c.digits / 2) + 5).Nr.ln(x);
  const e = y0.isFinite() && y0.abs().lt('1e16') ? expPoint(y0.neg(), p + 5) : null;
  if (e !== null) {
    const dLo = Dn.sub(Dn.mul(x, e.lo), '1');
    const dHi = Up.sub(Up.mul(x, e.hi), '1');
    const den = nonNeg(dLo) ? Up.add('1', dLo) : Dn.add('1', dLo);
    if (dLo.isFinite() && dHi.isFinite() && den.isPos() && !den.isZero()) {
      return { lo: Dn.add(y0, Dn.div(dLo, den)), hi: Up.add(y0, dHi) };
    }
  }
  // Crude but sound fallback for extreme exponents: x = m·10^e with 1 <= m < 10.
  const e10 = String(x.e);
  const e10p1 = String(x.e + 1);
  return {
    lo: x.e >= 0 ? Dn.mul(e10, LN10_LO) : Dn.mul(e10, LN10_HI),
    hi: x.e + 1 >= 0 ? Up.mul(e10p1, LN10_HI) : Up.mul(e10p1, LN10_LO),
  };
}

// ---------------------------------------------------------------------------------------------
// sin, cos

export interface SinCos {
  readonly sin: DecimalEnclosure;
  readonly cos: DecimalEnclosure;
}

/** Largest decimal exponent of |x| for which sin/cos/tan reduce the argument (else [−1, 1]). */
export const TRIG_MAX_EXPONENT = 400; // covers every finite double (< 1.8e308)

function clampUnit(a: DecimalEnclosure): DecimalEnclosure {
  const lo = a.lo.lt('-1') ? new Decimal('-1') : a.lo;
  const hi = a.hi.gt(ONE) ? ONE : a.hi;
  return { lo, hi };
}

/** Enclosures of sin(x) and cos(x) for a finite point x with exponent <= TRIG_MAX_EXPONENT. */
export function sinCosPoint(x: Decimal, p: number): SinCos {
  if (x.isZero()) return { sin: point(new Decimal('0')), cos: point(ONE) };
  const c = contextFor(p + 7 + Math.max(0, x.e + 1));
  let r: DecimalEnclosure = point(x);
  let quadrant = 0;
  if (x.abs().gt('0.785')) {
    const pi = piEnclosure(c.digits);
    const halfPi: DecimalEnclosure = { lo: c.Dn.div(pi.lo, '2'), hi: c.Up.div(pi.hi, '2') };
    const k = c.Nr.div(x, halfPi.lo).round();
    r = isub(c, point(x), imul(c, point(k), halfPi));
    quadrant = Number(((BigInt(k.toFixed(0)) % 4n) + 4n) % 4n);
  }
  // Halve h times (|r|/2^h <= 2^−5) for a shorter series, then double back with
  // sin 2t = 2·sin t·cos t and cos 2t = 1 − 2·sin² t; each doubling at most doubles the relative
  // width, which the 2 extra digits of c absorb (h <= 5).
  const h = Math.max(0, Math.ceil(Math.log2(mag(r).toNumber())) + 5);
  if (h > 0) {
    const scale = String(2 ** h);
    r = { lo: c.Dn.div(r.lo, scale), hi: c.Up.div(r.hi, scale) };
  }
  const rho = mag(r);
  const tol = rho.lt(ONE) ? c.Dn.mul(rho, tolerance(c, 2)) : tolerance(c, 2);
  let sinSum = point(new Decimal('0'));
  let cosSum = point(ONE);
  let term = point(ONE);
  for (let n = 1; ; n++) {
    term = idivInt(c, imul(c, term, r), n);
    const m = mag(term);
    if (m.lt(tol) && !m.isZero()) {
      // Lagrange: both Taylor polynomials of degree n − 1 miss by at most |r|^n/n! <= m.
      sinSum = iadd(c, sinSum, symmetric(m));
      cosSum = iadd(c, cosSum, symmetric(m));
      break;
    }
    if (m.isZero()) break; // r = 0 exactly: the sums are exact
    const signed = (n >> 1) % 2 === 0 ? term : ineg(term);
    if (n % 2 === 1) sinSum = iadd(c, sinSum, signed);
    else cosSum = iadd(c, cosSum, signed);
  }
  for (let i = 0; i < h; i++) {
    const sc = imul(c, sinSum, cosSum);
    const sq = isqr(c, sinSum);
    sinSum = imulInt(c, sc, 2);
    cosSum = isub(c, point(ONE), imulInt(c, sq, 2));
  }
  const s = clampUnit(sinSum);
  const co = clampUnit(cosSum);
  switch (quadrant) {
    case 0:
      return { sin: s, cos: co };
    case 1:
      return { sin: co, cos: ineg(s) };
    case 2:
      return { sin: ineg(s), cos: ineg(co) };
    default:
      return { sin: ineg(co), cos: s };
  }
}

/**
 * Whether some m·π/2 with m ≡ offset (mod modulus) may lie in [a, b] (finite, exponents <=
 * TRIG_MAX_EXPONENT). True whenever it does; may also be true when it does not (undecidable at
 * this precision), which callers treat as "does".
 */
export function mayContainHalfPiMultiple(a: Decimal, b: Decimal, offset: number, modulus: number, p: number): boolean {
  const c = contextFor(p + 5 + Math.max(0, a.e + 1, b.e + 1));
  const pi = piEnclosure(c.digits);
  const hpLo = c.Dn.div(pi.lo, '2');
  const hpHi = c.Up.div(pi.hi, '2');
  const aLo = nonNeg(a) ? c.Dn.div(a, hpHi) : c.Dn.div(a, hpLo); // <= a/(π/2)
  const bHi = nonNeg(b) ? c.Up.div(b, hpLo) : c.Up.div(b, hpHi); // >= b/(π/2)
  const m0 = BigInt(aLo.ceil().toFixed(0));
  const mod = BigInt(modulus);
  const m = m0 + (((BigInt(offset) - m0) % mod) + mod) % mod;
  return new Decimal(m.toString()).lte(bHi);
}

// ---------------------------------------------------------------------------------------------
// atan

/** Enclosure of atan(x) for a finite point x. */
export function atanPoint(x: Decimal, p: number): DecimalEnclosure {
  if (x.isZero()) return point(new Decimal('0'));
  const c = contextFor(p + 5);
  // y0 only needs about a third of the digits: the bound on atan δ − δ is |δ|³/3.
  const y0 = contextFor(Math.ceil(c.digits / 3) + 5).Nr.atan(x);
  const { sin: s, cos: co } = sinCosPoint(y0, p + 5);
  const xi = point(x);
  const num = isub(c, imul(c, xi, co), s);
  const den = iadd(c, co, imul(c, xi, s));
  const delta = idiv(c, num, den);
  if (delta === null || !den.lo.isPos()) {
    // Sound fallback (never expected): atan x lies between 0 and ±π/2.
    const pi = piEnclosure(p);
    const hp = c.Up.div(pi.hi, '2');
    return x.isPos() ? { lo: new Decimal('0'), hi: hp } : { lo: hp.neg(), hi: new Decimal('0') };
  }
  const m = mag(delta);
  const cubic = c.Up.div(c.Up.mul(c.Up.mul(m, m), m), '3');
  return { lo: c.Dn.sub(c.Dn.add(y0, delta.lo), cubic), hi: c.Up.add(c.Up.add(y0, delta.hi), cubic) };
}

// ---------------------------------------------------------------------------------------------
// sinh, cosh, tanh

export interface SinhCosh {
  readonly sinh: DecimalEnclosure;
  readonly cosh: DecimalEnclosure;
}

/** Enclosures of sinh(x), cosh(x) for a finite point x, |x| below about 2e16. */
export function sinhCoshPoint(x: Decimal, p: number): SinhCosh {
  if (x.isZero()) return { sinh: point(new Decimal('0')), cosh: point(ONE) };
  const c = contextFor(p + 5);
  const { Dn, Up } = c;
  if (x.abs().lt(ONE)) {
    const r = point(x);
    const tol = Dn.mul(x.abs(), tolerance(c, 2));
    let sinhSum = point(new Decimal('0'));
    let coshSum = point(ONE);
    let term = point(ONE);
    for (let n = 1; ; n++) {
      term = idivInt(c, imul(c, term, r), n);
      const m = mag(term);
      if (m.lt(tol)) {
        const bound = symmetric(Up.mul(m, '2')); // cosh(1) < 2
        sinhSum = iadd(c, sinhSum, bound);
        coshSum = iadd(c, coshSum, bound);
        break;
      }
      if (n % 2 === 1) sinhSum = iadd(c, sinhSum, term);
      else coshSum = iadd(c, coshSum, term);
    }
    return { sinh: sinhSum, cosh: coshSum.lo.lt(ONE) ? { lo: ONE, hi: coshSum.hi } : coshSum };
  }
  const e = expPoint(x.abs(), p + 5); // e.lo > e > 1
  const sinhAbs: DecimalEnclosure = {
    lo: Dn.div(Dn.sub(e.lo, Up.div('1', e.lo)), '2'),
    hi: Up.div(Up.sub(e.hi, Dn.div('1', e.hi)), '2'),
  };
  const cosh: DecimalEnclosure = {
    lo: Dn.div(Dn.add(e.lo, Dn.div('1', e.lo)), '2'),
    hi: Up.div(Up.add(e.hi, Up.div('1', e.hi)), '2'),
  };
  return { sinh: x.isNeg() ? ineg(sinhAbs) : sinhAbs, cosh };
}

/** Enclosure of tanh(x) for a finite point x. */
export function tanhPoint(x: Decimal, p: number): DecimalEnclosure {
  if (x.isZero()) return point(new Decimal('0'));
  const c = contextFor(p + 5);
  if (x.abs().gte(String(Math.ceil(1.16 * (p + 3))))) {
    const near = { lo: c.Dn.sub('1', `1e-${p + 2}`), hi: ONE };
    return x.isNeg() ? ineg(near) : near;
  }
  const { sinh, cosh } = sinhCoshPoint(x, p);
  const q = idiv(c, sinh, cosh);
  if (q === null) throw new Error('internal error: cosh enclosure contains 0');
  return clampUnit(q);
}

/** Quotient of two enclosures (null when the divisor contains 0), exported for tan. */
export function divideEnclosures(p: number, a: DecimalEnclosure, b: DecimalEnclosure): DecimalEnclosure | null {
  return idiv(contextFor(p), a, b);
}
