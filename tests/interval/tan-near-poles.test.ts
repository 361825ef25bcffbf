/**
 * tan near multiples of π/2, at small and large magnitude, in the three tan implementations:
 * multiprecision (src/interval/mp.ts), float64 kernel (src/interval/kernel.ts kTan) and the
 * checker's (src/checker/elementary.ts tanPoint / tanInterval).
 *
 * Regression for the FC_SEED=-855966943 failure of tests/interval/mp.test.ts ("other
 * precisions"): counterexample [24 bits, tan, 4319373607000000000000001e-22 = 431.937360700…01].
 * At 24 bits (10 digits) fromDecimal rounds the argument to [431.9373607, 431.9373608]; x is
 * 0.0201·(π/2) below the pole 275·π/2, tan x ≈ 31.6, and the condition number x·tan'(x)/tan(x)
 * ≈ 1.37e4, so the exact range of tan over that box is already about 1.0000e4 units of 1e-8 wide.
 * The enclosure contained the true value; the test's flat "10^4 units" tightness bound was wrong.
 *
 * Reference (outside the code under test): π from Machin's formula π = 16·atan(1/5) − 4·atan(1/239)
 * (J. Machin, 1706; common practice) summed in exact BigInt fixed point to 400 digits, checked
 * against decimal.js's own π (Decimal.acos(−1)) at 250 digits; x is reduced as r = x − k·π with
 * that π at 500 digits, and tan r is decimal.js at 300 digits on the small r (300, not 200: at
 * 700 bits the enclosures are 213 digits tight, finer than a 200-digit reference). The reduction
 * error is about k·10^−398, far below every tolerance used here.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { DomainViolation } from '../../src/checker/interval.js';
import { elementary, ivCtx } from '../../src/checker/elementary.js';
import { digitsForBits } from '../../src/interval/decimal-literal.js';
import { kTan } from '../../src/interval/kernel.js';
import { exactDecimalOfDouble } from '../../src/interval/mp-convert.js';
import { mpIntervalArithmetic, type MpInterval } from '../../src/interval/mp.js';

const REF = Decimal.clone({ precision: 300, rounding: Decimal.ROUND_HALF_EVEN });
const WIDE = Decimal.clone({ precision: 500, rounding: Decimal.ROUND_HALF_EVEN });
const EXACT = Decimal.clone({ precision: 100_000 });
const exact = (x: Decimal.Value): Decimal => new EXACT(x);

/** ⌊π·10^n⌋ up to a few units, BigInt fixed point, Machin 1706. */
function machinPi(n: number): bigint {
  const guard = 10n;
  const one = 10n ** BigInt(n + 10);
  const atanInv = (k: bigint): bigint => {
    // atan(1/k) = Σ (−1)^i / ((2i+1)·k^(2i+1)); each term truncated (error < 1 per term)
    let sum = 0n;
    let pow = one / k;
    const k2 = k * k;
    for (let i = 0n; pow !== 0n; i++) {
      const t = pow / (2n * i + 1n);
      sum += i % 2n === 0n ? t : -t;
      pow /= k2;
    }
    return sum;
  };
  return (16n * atanInv(5n) - 4n * atanInv(239n)) / 10n ** guard;
}

const PI_DIGITS = 400;
const PI = new WIDE(machinPi(PI_DIGITS).toString()).div(new WIDE(10).pow(PI_DIGITS));

/** tan x at 300 digits, by exact reduction modulo π (above) and decimal.js on the remainder. */
const refCache = new Map<string, Decimal>();
function refTan(x: string): Decimal {
  const hit = refCache.get(x);
  if (hit !== undefined) return hit;
  const X = new WIDE(x);
  const k = X.div(PI).round();
  const r = X.minus(k.times(PI));
  const v = REF.tan(new REF(r));
  refCache.set(x, v);
  return v;
}

/** The argument closest (at 25 significant digits) to m·π/2 + δ. */
function nearHalfPi(m: string, delta: string): string {
  return new WIDE(m).times(PI).div(2).plus(delta).toSignificantDigits(25).toString();
}

// The failing input, the literal as first misread (431937360.7…, x/(π/2) ≈ 2.75e8), and neighbours
// just below/above poles (odd m) and zeros (even m) of tan at magnitudes 1e2 … 1e20.
const INPUTS: string[] = [
  '4319373607000000000000001e-22',
  '431937360.7000000000000000000001',
  ...['275', '274979863', '274979864', '1000000000000001', '100000000000000000000001', '100000000000000000000000'].flatMap(
    (m) => ['-1e-3', '1e-3', '-1e-9', '1e-9'].map((d) => nearHalfPi(m, d)),
  ),
];

function mpContains(r: MpInterval, v: Decimal): boolean {
  return exact(r.lo).lte(v) && exact(r.hi).gte(v);
}

describe('tan near multiples of π/2 (reference: Machin π, decimal.js at 200 digits)', () => {
  it('the Machin π agrees with decimal.js π to 250 digits', () => {
    const dPi = Decimal.clone({ precision: 250 }).acos(-1);
    expect(PI.minus(dPi.toString()).abs().lt('1e-248')).toBe(true);
    // first digits: common practice, no source
    expect(PI.toString().startsWith('3.14159265358979323846264338327950288')).toBe(true);
  });

  it('regression FC_SEED=-855966943: 24-bit tan(431.937360700…01) is sound and tight', () => {
    const B = mpIntervalArithmetic(24);
    const t = '4319373607000000000000001e-22';
    const a = B.fromDecimal(t);
    expect([a.lo.toString(), a.hi.toString()]).toEqual(['431.9373607', '431.9373608']);
    const r = B.tan(a);
    expect(B.status.continuous).toBe(true);
    // contains tan of the literal and of both ends of the rounded argument
    for (const x of [t, a.lo.toString(), a.hi.toString()]) expect(mpContains(r, refTan(x))).toBe(true);
    // tight: within 2 units of 10^−8 of the exact range [tan(a.lo), tan(a.hi)]
    const lo = refTan(a.lo.toString());
    const hi = refTan(a.hi.toString());
    expect(exact(lo).minus(r.lo).lte('2e-8')).toBe(true);
    expect(exact(r.hi).minus(hi).lte('2e-8')).toBe(true);
    // that range is 0.99993e-4 wide, so its outward rounding to 10 digits is 1.0001e-4: wider than
    // the old flat bound of 10^4 units of 1e-8 (the mistake of mp.test.ts, not of tan)
    expect(exact(hi).minus(lo).gt('0.9999e-4')).toBe(true);
    expect(exact(r.hi).minus(r.lo).toString()).toBe('0.00010001');
  });

  it('multiprecision tan contains the reference at 24 … 700 bits (or is the whole line)', () => {
    let finite = 0;
    for (const bits of [24, 53, 113, 333, 700]) {
      const B = mpIntervalArithmetic(bits);
      const digits = digitsForBits(bits);
      for (const x of INPUTS) {
        const v = refTan(x);
        const r = B.tan(B.fromDecimal(x));
        expect(mpContains(r, v), `${bits} bits, tan(${x}) = ${v.toSignificantDigits(20)}`).toBe(true);
        if (r.lo.isFinite() && r.hi.isFinite()) {
          // finite answers are also not absurdly wide: relative width below 10^(8 − digits)
          // unless the argument's own rounding (relative 10^(1−digits)) is amplified by the
          // condition number |x·tan'(x)/tan(x)| = |x·(1 + tan²x)/tan x|
          const cond = exact(x).abs().times(exact(1).plus(exact(v).pow(2))).div(exact(v).abs());
          const allowed = exact(v).abs().times(`1e${8 - digits}`).times(cond.plus(1));
          expect(exact(r.hi).minus(r.lo).lte(allowed), `${bits} bits, width at ${x}`).toBe(true);
          finite++;
        } else {
          expect(B.status.continuous).toBe(false);
          B.status.continuous = true;
        }
      }
    }
    // most answers are finite (measured 101 of 130): a test that cannot fail would return ENTIRE
    expect(finite).toBeGreaterThanOrEqual(90);
  });

  it('float64 kernel kTan contains the reference at the double nearest each input', () => {
    const out = new Float64Array(2);
    let finite = 0;
    for (const s of INPUTS) {
      const x = Number(s);
      const v = refTan(exactDecimalOfDouble(x));
      kTan(out, 0, x, x);
      const [lo, hi] = [out[0]!, out[1]!];
      expect(lo <= hi).toBe(true);
      if (Number.isFinite(lo)) expect(exact(exactDecimalOfDouble(lo)).lte(v), `kTan lo at ${s}`).toBe(true);
      if (Number.isFinite(hi)) expect(exact(exactDecimalOfDouble(hi)).gte(v), `kTan hi at ${s}`).toBe(true);
      if (Number.isFinite(lo) && Number.isFinite(hi)) finite++;
    }
    // kTan is proven up to |x| <= 2^40: the inputs below that magnitude get finite answers
    expect(finite).toBeGreaterThanOrEqual(10);
  });

  it('checker tanPoint / tanInterval contain the reference (or report a domain violation)', () => {
    for (const digits of [17, 30, 60]) {
      const g = ivCtx(digits);
      for (const s of INPUTS) {
        const v = refTan(s);
        let r;
        try {
          r = elementary.tanPoint(g, new Decimal(s));
        } catch (e) {
          expect(e).toBeInstanceOf(DomainViolation);
          continue;
        }
        expect(exact(r.lo).lte(v) && exact(r.hi).gte(v), `checker ${digits} digits, tan(${s})`).toBe(true);
      }
      // an interval across the pole near the failing input is refused
      expect(() =>
        elementary.tanInterval(g, { lo: new g.Down('431.9'), hi: new g.Up('432') }),
      ).toThrow(DomainViolation);
    }
  });
});
