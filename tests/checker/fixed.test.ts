import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { FixCtx, FixedRange, fracBitsFor, type Fx } from '../../src/checker/fixed.js';

// Reference: decimal.js at 1,000 digits, where every value below is exact (m·2^−F has F digits
// after the point, products of two such values at most 2F ≤ 600 digits): the oracle is exact
// rational arithmetic done by decimal.js (common practice, no source).
const H = Decimal.clone({ precision: 1000, rounding: Decimal.ROUND_HALF_EVEN, minE: -9e15, maxE: 9e15 });

describe('binary fixed-point intervals (checker/fixed.ts) against decimal.js at 1,000 digits', () => {
  for (const F of [64, 140, 300]) {
    const k = new FixCtx(F);
    const val = (m: bigint): Decimal => new H(k.toDecimalString(m));
    const span = 1n << BigInt(F + 8); // values up to 2^8 in magnitude
    const num = fc.oneof(fc.bigInt({ min: -span, max: span }), fc.bigInt({ min: -1000n, max: 1000n }), fc.constantFrom(0n, 1n, -1n, k.one, -k.one));
    const ivArb = fc.tuple(num, num).map(([a, b]) => (a <= b ? { lo: a, hi: b } : { lo: b, hi: a }));
    const member = (iv: Fx, t: number): Decimal => val(iv.lo).add(val(iv.hi).sub(val(iv.lo)).mul(t));
    const contains = (iv: Fx, x: Decimal): boolean => val(iv.lo).lte(x) && x.lte(val(iv.hi));

    it(`toDecimalString is exact and reads back to the same integer (F = ${F})`, () => {
      fc.assert(fc.property(num, (m) => {
        const d = val(m);
        // m·2^−F exactly: d·2^F is the integer m
        return d.mul(new H(2).pow(F)).eq(new H(m.toString())) && k.fromDecimal(d, false) === m && k.fromDecimal(d, true) === m;
      }), { numRuns: 300 });
    });

    it(`fromDecimal rounds down / up to the neighbouring fixed-point numbers (F = ${F})`, () => {
      const dec = fc.tuple(fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }), fc.integer({ min: -(F >> 1), max: 20 })).map(([m, e]) => new H(`${m}e${e}`));
      fc.assert(fc.property(dec, (x) => {
        const lo = k.fromDecimal(x, false);
        const hi = k.fromDecimal(x, true);
        // lo·2^−F ≤ x < (lo+1)·2^−F and (hi−1)·2^−F < x ≤ hi·2^−F
        return val(lo).lte(x) && val(lo + 1n).gt(x) && val(hi).gte(x) && val(hi - 1n).lt(x);
      }), { numRuns: 400 });
    });

    it(`tiny decimals (|x| < 2^−F) round to 0 / ±1 in the right direction (F = ${F})`, () => {
      for (const s of ['1e-400', '-1e-400', '3e-1000', '-7.5e-2000']) {
        const x = new H(s);
        const lo = k.fromDecimal(x, false);
        const hi = k.fromDecimal(x, true);
        expect(val(lo).lte(x) && val(hi).gte(x), s).toBe(true);
        expect(hi - lo, s).toBe(1n);
      }
      expect(() => k.fromDecimal(new H('1e5000'), true)).toThrow(FixedRange);
    });

    it(`interval + − × contain every product of members and are tight to one unit (F = ${F})`, () => {
      const t = fc.double({ min: 0, max: 1, noNaN: true });
      fc.assert(fc.property(ivArb, ivArb, t, t, (a, b, s, u) => {
        const x = member(a, s);
        const y = member(b, u);
        const m = k.mul(a, b);
        const ends = [val(a.lo).mul(val(b.lo)), val(a.lo).mul(val(b.hi)), val(a.hi).mul(val(b.lo)), val(a.hi).mul(val(b.hi))];
        const exLo = H.min(...ends);
        const exHi = H.max(...ends);
        const unit = val(1n);
        return contains(m, x.mul(y)) && contains(m, exLo) && contains(m, exHi) &&
          val(m.lo).gt(exLo.sub(unit)) && val(m.hi).lt(exHi.add(unit)) &&
          contains(k.add(a, b), x.add(y)) && contains(k.sub(a, b), x.sub(y)) && contains(k.neg(a), x.neg());
      }), { numRuns: 400 });
    });

    it(`directed products are the floor / ceil of the exact product, exact when representable (F = ${F})`, () => {
      fc.assert(fc.property(num, num, (x, y) => {
        const ex = val(x).mul(val(y));
        const d = k.mulDown(x, y);
        const up = k.mulUp(x, y);
        const exact = ex.mul(new H(2).pow(F)).isInteger();
        return val(d).lte(ex) && val(d + 1n).gt(ex) && val(up).gte(ex) && val(up - 1n).lt(ex) && (exact ? d === up : up === d + 1n);
      }), { numRuns: 400 });
    });

    it(`divUp is an upper bound of the quotient within one unit (F = ${F})`, () => {
      const pos = fc.bigInt({ min: 1n, max: span });
      fc.assert(fc.property(fc.bigInt({ min: 0n, max: span }), pos, (x, y) => {
        const q = k.divUp(x, y);
        const ex = val(x).div(val(y)); // 1,000 digits: the error is far below one unit 2^−F
        return val(q).gte(ex.sub(new H(`1e-${900}`))) && val(q - 1n).lt(ex);
      }), { numRuns: 300 });
      expect(() => k.divUp(1n, 0n)).toThrow(FixedRange);
    });

    it(`mag and mig bound |x| over the interval (F = ${F})`, () => {
      fc.assert(fc.property(ivArb, fc.double({ min: 0, max: 1, noNaN: true }), (a, s) => {
        const x = member(a, s).abs();
        return val(k.mag(a)).gte(x) && val(k.mig(a)).lte(x);
      }), { numRuns: 300 });
    });

    it(`fromFloat is the floor / ceil of the double's exact value (F = ${F})`, () => {
      fc.assert(fc.property(fc.double({ min: -4, max: 4, noNaN: true }), (x) => {
        const ex = new H(x.toPrecision(100) === 'NaN' ? '0' : exactDouble(x));
        const lo = k.fromFloat(x, false);
        const hi = k.fromFloat(x, true);
        return val(lo).lte(ex) && val(lo + 1n).gt(ex) && val(hi).gte(ex) && val(hi - 1n).lt(ex);
      }), { numRuns: 300 });
    });
  }

  it('fracBitsFor keeps 64 guard bits above the working precision and the finest scale', () => {
    // 30 digits = 99.66 bits (log2 10 = 3.3219..., common practice): 100 + 64
    expect(fracBitsFor(30)).toBe(164);
    expect(fracBitsFor(30, -10)).toBe(Math.ceil(40 * 3.3219280948873626) + 64);
  });
});

/** Exact decimal expansion of a double: mantissa·2^exponent from its bits (common practice, no source). */
function exactDouble(x: number): string {
  if (x === 0) return '0';
  const buf = new DataView(new ArrayBuffer(8));
  buf.setFloat64(0, x);
  const bits = buf.getBigUint64(0);
  const sign = bits >> 63n ? '-' : '';
  const ex = Number((bits >> 52n) & 0x7ffn);
  let mant = bits & ((1n << 52n) - 1n);
  let e2: number;
  if (ex === 0) e2 = -1074;
  else {
    mant |= 1n << 52n;
    e2 = ex - 1075;
  }
  if (e2 >= 0) return sign + (mant << BigInt(e2)).toString();
  // mant / 2^−e2 = mant·5^−e2 / 10^−e2
  const digits = (mant * 5n ** BigInt(-e2)).toString().padStart(-e2 + 1, '0');
  return `${sign}${digits.slice(0, digits.length + e2)}.${digits.slice(digits.length + e2)}`;
}
