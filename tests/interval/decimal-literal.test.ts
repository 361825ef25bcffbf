import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decimalOfDouble, encloseDecimal, isDecimalLiteral, parseDecimal } from '../../src/interval/decimal-literal.js';
import { nearestMidpoint, nearestOfLiteral } from '../../src/interval/float-arith.js';
import { MAX, nextUp } from '../../src/interval/round.js';
import { Exact, anyDouble, exact } from './oracle.js';

/** lo ≤ value ≤ hi (decimal.js, exact) and lo, hi equal or adjacent. */
function checkEnclosure(s: string): { lo: number; hi: number } {
  const e = encloseDecimal(s);
  const v = new Exact(s);
  if (e.lo !== -Infinity) expect(exact(e.lo).lte(v), `${s}: lo ${e.lo}`).toBe(true);
  if (e.hi !== Infinity) expect(exact(e.hi).gte(v), `${s}: hi ${e.hi}`).toBe(true);
  expect(e.lo === e.hi || nextUp(e.lo) === e.hi, `${s}: [${e.lo}, ${e.hi}] not tight`).toBe(true);
  return e;
}

describe('encloseDecimal', () => {
  it('required literals (task statement); enclosures checked with decimal.js', () => {
    for (const s of ['0.1', '3.83', '1e-320', '1.7976931348623157e308', '2.5e-324', '-0.1', '+3.83', '1E-5', '.5', '7.']) checkEnclosure(s);
    // 0.1 is not a double: two adjacent doubles (common practice, no source).
    expect(encloseDecimal('0.1')).toEqual({ lo: 0.09999999999999999, hi: 0.1 });
    // 2.5e-324 lies between 0 and 2^-1074 ≈ 4.94e-324 (closed form).
    expect(encloseDecimal('2.5e-324')).toEqual({ lo: 0, hi: 2 ** -1074 });
    expect(encloseDecimal('-2.5e-324')).toEqual({ lo: -(2 ** -1074), hi: 0 });
    // 1.7976931348623157e308 is below MAX = 1.797693134862315708…e308 (from memory; decimal check above).
    expect(encloseDecimal('1.7976931348623157e308').hi).toBe(MAX);
  });
  it('exactly representable values give a point', () => {
    expect(encloseDecimal('0.5')).toEqual({ lo: 0.5, hi: 0.5 });
    expect(encloseDecimal('-1024')).toEqual({ lo: -1024, hi: -1024 });
    expect(encloseDecimal('0')).toEqual({ lo: 0, hi: 0 });
    expect(encloseDecimal('-0.000')).toEqual({ lo: 0, hi: 0 });
    expect(encloseDecimal('4.9406564584124654e-324').lo).toBe(0); // just below 2^-1074
    expect(encloseDecimal(decimalOfDouble(2 ** -1074))).toEqual({ lo: 2 ** -1074, hi: 2 ** -1074 });
  });
  it('beyond the double range: an infinite end (huge) or a zero end (tiny)', () => {
    expect(encloseDecimal('1e400')).toEqual({ lo: MAX, hi: Infinity });
    expect(encloseDecimal('-1e400')).toEqual({ lo: -Infinity, hi: -MAX });
    expect(encloseDecimal('1.7976931348623159e308')).toEqual({ lo: MAX, hi: Infinity }); // above MAX (from memory)
    expect(encloseDecimal('1e-400')).toEqual({ lo: 0, hi: 2 ** -1074 });
    expect(encloseDecimal('1e-999999999999')).toEqual({ lo: 0, hi: 2 ** -1074 });
    expect(encloseDecimal('1e999999999999')).toEqual({ lo: MAX, hi: Infinity });
  });
  it('random decimal literals are enclosed tightly (decimal.js exact comparison)', () => {
    const lit = fc
      .tuple(fc.boolean(), fc.bigInt({ min: 0n, max: 10n ** 40n }), fc.integer({ min: -340, max: 320 }))
      .map(([neg, d, e]) => `${neg ? '-' : ''}${d}e${e}`);
    fc.assert(fc.property(lit, (s) => void checkEnclosure(s)), { numRuns: 500 });
  });
  it('rejects malformed literals', () => {
    for (const s of ['', 'abc', '1e', '--1', '0x10', '1,5', 'Infinity', 'NaN']) {
      expect(isDecimalLiteral(s)).toBe(false);
      expect(() => encloseDecimal(s)).toThrow(/not a decimal literal/);
    }
    expect(parseDecimal('12.50e-3')).toEqual({ negative: false, digits: 1250n, exp10: -5 });
  });
});

describe('decimalOfDouble', () => {
  it('is exact: decimal.js reads it back to the same double and the value matches', () => {
    fc.assert(
      fc.property(anyDouble, (x) => {
        const s = decimalOfDouble(x);
        expect(/^-?\d+(\.\d+)?$/.test(s)).toBe(true);
        const e = encloseDecimal(s);
        expect(e.lo === x && e.hi === x).toBe(true); // exact: the enclosure is the point itself
      }),
      { numRuns: 500 },
    );
  });
  it('known expansions (from memory; 0.1 as a double is 0.1000000000000000055511151231257827…)', () => {
    expect(decimalOfDouble(0.1)).toBe('0.1000000000000000055511151231257827021181583404541015625');
    expect(decimalOfDouble(-2.5)).toBe('-2.5');
    expect(decimalOfDouble(2 ** 70)).toBe('1180591620717411303424'); // 2^70 (from memory)
    expect(decimalOfDouble(-0)).toBe('0');
    expect(() => decimalOfDouble(Infinity)).toThrow();
  });
});

describe('nearest double of literals (float arithmetic constants, @heuristic)', () => {
  it('nearestOfLiteral agrees with the correctly rounded conversion', () => {
    for (const s of ['0.1', '3.83', '1e-320', '2.5e-324', '1.4', '0.3']) expect(nearestOfLiteral(s)).toBe(Number(s));
  });
  it('nearestMidpoint of [3.83, 3.84] is the double nearest 3.835 (by hand)', () => {
    expect(nearestMidpoint('3.83', '3.84')).toBe(3.835);
    expect(nearestMidpoint('-1', '1')).toBe(0);
    expect(nearestMidpoint('0.1', '0.1')).toBe(0.1);
  });
});
