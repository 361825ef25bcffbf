/**
 * The float64 fast path of writing boxes: every claimed order between a written decimal string
 * and doubles is checked exactly against decimal.js at 1200 digits, with the double's exact value
 * formed from its bits (mantissa·2^exponent, IEEE 754 binary64 layout; common practice).
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decimalAtLeast, nearDecimal, shortDecimal, writtenAbove, writtenBelow } from '../../src/prove/float-decimal.js';

const DX = Decimal.clone({ precision: 1200 });

/** Exact value of a finite double from its bits (IEEE 754 binary64). */
function exact(x: number): Decimal {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  const lo = view.getUint32(4);
  const sign = hi >>> 31 ? -1 : 1;
  const e = (hi >>> 20) & 0x7ff;
  const frac = new DX(hi & 0xfffff).mul(new DX(2).pow(32)).add(lo);
  const mant = e === 0 ? frac : frac.add(new DX(2).pow(52));
  return mant.mul(new DX(2).pow((e === 0 ? 1 : e) - 1075)).mul(sign);
}

const anyDouble = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.double({ min: -1e-300, max: 1e-300, noNaN: true }),
  fc.constantFrom(0, -0, 5e-324, -5e-324, 1, -1, 0.1, 1e21, -1.7976931348623157e308),
);

describe('float-decimal: short strings with exact orders', () => {
  it('property: writtenBelow(lo): outer < s < inner <= lo, all exact', () => {
    fc.assert(
      fc.property(anyDouble, fc.integer({ min: 3, max: 20 }), (lo, digits) => {
        const w = writtenBelow(lo, digits);
        if (w === null) return;
        const s = new DX(w.s);
        expect(exact(w.outer).lt(s) && s.lt(exact(w.inner)) && exact(w.inner).lte(exact(lo))).toBe(true);
        expect(w.s.replace(/^-/, '').replace(/e.*$/, '').replace('.', '').replace(/^0+/, '').length).toBeLessThanOrEqual(digits);
      }),
      { numRuns: 500, seed: 11 },
    );
  });

  it('property: writtenAbove(hi): hi <= inner < s < outer', () => {
    fc.assert(
      fc.property(anyDouble, (hi) => {
        const w = writtenAbove(hi, 20);
        if (w === null) return;
        const s = new DX(w.s);
        expect(exact(hi).lte(exact(w.inner)) && exact(w.inner).lt(s) && s.lt(exact(w.outer))).toBe(true);
      }),
      { numRuns: 500, seed: 12 },
    );
  });

  it('property: nearDecimal(x): lo <= s <= hi, and decimalAtLeast(r) >= r', () => {
    fc.assert(
      fc.property(anyDouble, (x) => {
        const c = nearDecimal(x, 20);
        if (c !== null) {
          const s = new DX(c.s);
          expect(exact(c.lo).lte(s) && s.lte(exact(c.hi))).toBe(true);
        }
        const r = Math.abs(x);
        const d = decimalAtLeast(r);
        if (d !== null) expect(new DX(d).gte(exact(r))).toBe(true);
      }),
      { numRuns: 500, seed: 13 },
    );
  });

  it('shortDecimal drops trailing zeros (toPrecision, ECMA-262)', () => {
    expect(shortDecimal(0.5, 20)).toBe('0.5');
    expect(shortDecimal(1e21, 20)).toBe('1e+21');
    expect(shortDecimal(-2, 5)).toBe('-2');
    expect(shortDecimal(0, 20)).toBe('0');
  });
});
