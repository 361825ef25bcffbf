/**
 * Proven exp / log (src/interval/elementary.ts) against decimal.js at 60 digits, and the constants
 * they rest on. Sources: ln 2 = 0.693147180559945309417232121458176568… (from memory, confirmed by
 * decimal.js Dec60.ln(2)); the exp/log thresholds are checked by decimal.js below.
 */

import fc from 'fast-check';
import type Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import {
  HALF_PI_1,
  HALF_PI_2,
  HALF_PI_3_HI,
  HALF_PI_3_LO,
  LN2_HEAD,
  LN2_TAIL_HI,
  LN2_TAIL_LO,
  expEnclose,
  logEnclose,
  sinCosEnclose,
} from '../../src/interval/elementary.js';
import { nextUp } from '../../src/interval/round.js';
import { Dec60, dec60, exact, Exact } from './oracle.js';

const LN2 = Dec60.ln(2);

function ulps(lo: number, hi: number): number {
  let k = 0;
  for (let x = lo; x < hi && k < 100; k++) x = nextUp(x);
  return k;
}

describe('constants', () => {
  it('ln 2 ∈ LN2_HEAD + [TAIL_LO, TAIL_HI]; LN2_HEAD has 32 significant bits', () => {
    expect(LN2.toString().startsWith('0.693147180559945309417232121458176568')).toBe(true);
    expect(dec60(LN2_HEAD).plus(dec60(LN2_TAIL_LO)).lt(LN2)).toBe(true);
    expect(dec60(LN2_HEAD).plus(dec60(LN2_TAIL_HI)).gt(LN2)).toBe(true);
    expect(Number.isInteger(LN2_HEAD * 2 ** 32)).toBe(true); // 32 bits after the binary point
    expect(LN2_HEAD * 2 ** 32 < 2 ** 32).toBe(true);
  });
  it('π/2 ∈ HALF_PI_1 + HALF_PI_2 + [HALF_PI_3_LO, HALF_PI_3_HI] (decimal.js π at 100 digits)', () => {
    const D100 = Dec60.clone({ precision: 100 });
    const half = D100.acos(-1).div(2);
    const base = new D100(exact(HALF_PI_1).toString()).plus(new D100(exact(HALF_PI_2).toString()));
    expect(base.plus(new D100(exact(HALF_PI_3_LO).toString())).lt(half)).toBe(true);
    expect(base.plus(new D100(exact(HALF_PI_3_HI).toString())).gt(half)).toBe(true);
    expect(nextUp(nextUp(HALF_PI_3_LO))).toBe(HALF_PI_3_HI); // two ulps around fl(t3)
  });
  it('overflow / underflow thresholds: e^709.7827128933841 > MAX, e^-745.1332191019412 < 2^-1074', () => {
    expect(dec60(709.7827128933841).exp().gt(exact(Number.MAX_VALUE))).toBe(true);
    expect(dec60(-745.1332191019412).exp().lt(new Exact(2).pow(-1074))).toBe(true);
  });
});

type Encloser = (x: number, out: Float64Array, o?: number) => void;
/** [lo, hi] written by an enclosure function at an offset, checking it touches nothing else. */
function enclose(f: Encloser, x: number): [number, number] {
  const out = new Float64Array(4).fill(7);
  f(x, out, 1);
  expect(out[0]).toBe(7);
  expect(out[3]).toBe(7);
  return [out[1]!, out[2]!];
}

describe('expEnclose / logEnclose contain decimal.js values and are tight', () => {
  const SLACK = 1e-50;
  it('exp on [-745, 710], including tiny and exact points', () => {
    const xs = fc.oneof(
      fc.double({ min: -746, max: 710, noNaN: true }),
      fc.double({ min: -1e-300, max: 1e-300, noNaN: true }),
      fc.integer({ min: -20, max: 20 }).map((k) => k / 4),
      fc.double({ min: -700, max: -660, noNaN: true }), // results in [2^-1010, 2^-952]: exact scaling
    );
    fc.assert(
      fc.property(xs, (x) => {
        const [lo, hi] = enclose(expEnclose, x);
        const v = dec60(x).exp();
        expect(exact(lo).lte(v.times(1 + SLACK)), `exp(${x}) lo ${lo} > ${v}`).toBe(true);
        if (hi !== Infinity) expect(exact(hi).gte(v.times(1 - SLACK)), `exp(${x}) hi ${hi} < ${v}`).toBe(true);
        if (lo > 2 ** -1000 && hi < 1e300) expect(ulps(lo, hi), `exp(${x}) = [${lo}, ${hi}]`).toBeLessThanOrEqual(5);
      }),
      { numRuns: 400 },
    );
  });
  it('log on all positive doubles (subnormal to MAX)', () => {
    const xs = fc.oneof(
      fc.double({ min: 2 ** -1074, noNaN: true, noDefaultInfinity: true }),
      fc.double({ min: 0.5, max: 2, noNaN: true }),
      fc.double({ min: 0.999999, max: 1.000001, noNaN: true }),
      // just around √½·2^k, the split point of the reduction (worst cancellation)
      fc.tuple(fc.double({ min: 0.7, max: 0.715, noNaN: true }), fc.integer({ min: -1000, max: 1000 })).map(([m, k]) => m * 2 ** k),
    );
    fc.assert(
      fc.property(xs, (x) => {
        const [lo, hi] = enclose(logEnclose, x);
        const v = dec60(x).ln();
        const s = v.abs().times(SLACK);
        expect(exact(lo).lte(v.plus(s)), `log(${x}) lo ${lo} > ${v}`).toBe(true);
        expect(exact(hi).gte(v.minus(s)), `log(${x}) hi ${hi} < ${v}`).toBe(true);
        // README contract: ≤ 3 ulps (one rounding of head + tail; measured max 3 on 1.2e6 random points)
        expect(ulps(lo, hi), `log(${x}) = [${lo}, ${hi}]`).toBeLessThanOrEqual(3);
      }),
      { numRuns: 400 },
    );
  });
  it('sin / cos on |x| ≤ 1e6 and near multiples of π/2 (decimal.js at 60 digits)', () => {
    const xs = fc.oneof(
      fc.double({ min: -1e6, max: 1e6, noNaN: true }),
      fc.integer({ min: -100000, max: 100000 }).map((k) => k * HALF_PI_1),
      fc.double({ min: -1e-200, max: 1e-200, noNaN: true }),
    );
    fc.assert(
      fc.property(xs, (x) => {
        const sc = new Float64Array(4);
        expect(sinCosEnclose(x, sc)).toBe(true);
        const d = dec60(x);
        for (const [lo, hi, v, name] of [
          [sc[0]!, sc[1]!, d.sin(), 'sin'],
          [sc[2]!, sc[3]!, d.cos(), 'cos'],
        ] as const) {
          const s = v.abs().times(SLACK);
          expect(exact(lo).lte(v.plus(s)), `${name}(${x}) lo ${lo} > ${v}`).toBe(true);
          expect(exact(hi).gte(v.minus(s)), `${name}(${x}) hi ${hi} < ${v}`).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  });
  it('regressions found by random seeds: log near 2^k/√2 (cancellation), exp scaled below 2^-969', () => {
    // log(0.7055587547072296) was 6 ulps wide (seed −945624626): log m ≈ −(e·ln 2)/2 cancels.
    // exp(−678.232980809577) was 7 ulps wide: the exact scaling by 2^k took a needless step.
    // Reference: decimal.js at 60 digits; bounds as in the properties above.
    const cases: [number, Encloser, (x: number) => Decimal, number][] = [
      [0.7055587547072296, logEnclose, (x) => dec60(x).ln(), 3],
      [0.7104767839886383, logEnclose, (x) => dec60(x).ln(), 3],
      [1.4142135623730951 * 2 ** -600, logEnclose, (x) => dec60(x).ln(), 3],
      [-678.232980809577, expEnclose, (x) => dec60(x).exp(), 5],
      [-672.6894953004147, expEnclose, (x) => dec60(x).exp(), 5],
    ];
    for (const [x, f, ref, bound] of cases) {
      const [lo, hi] = enclose(f, x);
      const v = ref(x);
      expect(exact(lo).lte(v) && exact(hi).gte(v), `${x}: [${lo}, ${hi}] ∌ ${v}`).toBe(true);
      expect(ulps(lo, hi), `${x}: [${lo}, ${hi}]`).toBeLessThanOrEqual(bound);
    }
  });
  it('exact points (closed form): exp(0) = 1, log(1) = 0, log(2^k) encloses k·ln 2', () => {
    expect(enclose(expEnclose, 0)).toEqual([1, 1]);
    expect(enclose(logEnclose, 1)).toEqual([0, 0]);
    const [lo, hi] = enclose(logEnclose, 2 ** -1074);
    const v = LN2.times(-1074);
    expect(dec60(lo).lte(v) && dec60(hi).gte(v)).toBe(true);
  });
});
