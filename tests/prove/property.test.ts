/**
 * Property tests (fast-check): random parameters of catalogue maps; every claim of a proven orbit
 * is re-derived from an independent computation (decimal.js evaluation of the formula, float
 * eigenvalues) and closed forms (derived by hand).
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import type { ProvenOrbit } from '../../src/prove/types.js';
import { inPair } from './fixtures.js';

const D50 = Decimal.clone({ precision: 50 });

/** A decimal literal lo + k/1000 (exact; never via a double). */
const decimalIn = (lo: number, hi: number) =>
  fc.integer({ min: Math.round(lo * 1000), max: Math.round(hi * 1000) }).map((k) => new D50(k).div(1000).toString());

function classOf(moduli: number[]): string {
  if (moduli.every((m) => m < 1)) return 'attracting';
  if (moduli.every((m) => m > 1)) return 'repelling';
  return 'saddle';
}

function checkCommon(o: ProvenOrbit, step: (x: Decimal[]) => Decimal[]): void {
  // centre inside boxes; the centre is an orbit up to a tiny residual (independent decimal.js evaluation)
  for (let i = 0; i < o.period; i++) {
    const c = o.centre[i]!.map((s) => new D50(s));
    c.forEach((v, j) => expect(inPair(v, o.boxes[i]![j]!)).toBe(true));
    const img = step(c);
    const next = o.centre[(i + 1) % o.period]!.map((s) => new D50(s));
    img.forEach((v, j) => expect(v.sub(next[j]!).abs().lt('1e-12')).toBe(true));
  }
  // minimal period re-derived: the boxes are pairwise disjoint exactly when claimed
  let disjoint = true;
  for (let i = 0; i < o.period; i++) {
    for (let k = i + 1; k < o.period; k++) {
      const sep = o.boxes[i]!.some(([lo, hi], j) => new D50(hi).lt(o.boxes[k]![j]![0]) || new D50(o.boxes[k]![j]![1]).lt(lo));
      if (!sep) disjoint = false;
    }
  }
  expect(o.minimalPeriod === null ? !disjoint : disjoint).toBe(true);
}

describe('proven claims re-derive independently', () => {
  it('logistic fixed point and period-2 orbit for random r', () => {
    fc.assert(
      fc.property(decimalIn(1.5, 3.95), (r) => {
        const R = new D50(r);
        const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: r } });
        const step = (x: Decimal[]) => [R.mul(x[0]!).mul(new D50(1).sub(x[0]!))];
        const fixed = new D50(1).sub(new D50(1).div(R)); // closed form
        const v = proveOrbit(map, [[Number(fixed.toString())]], { maxBits: 53 });
        if (v.status !== 'proven') return false;
        checkCommon(v.orbit, step);
        const mult = 2 - Number(r); // independent float multiplier f'(x*) = 2 − r
        if (Math.abs(Math.abs(mult) - 1) > 1e-6) expect(v.orbit.stability.class).toBe(classOf([Math.abs(mult)]));
        expect(inPair(new D50(2).sub(R), v.orbit.stability.multiplier!)).toBe(true);
        if (R.gt('3.01')) {
          const root = R.sub(3).mul(R.add(1)).sqrt();
          const xs = [R.add(1).add(root).div(R.mul(2)), R.add(1).sub(root).div(R.mul(2))];
          const v2 = proveOrbit(map, xs.map((x) => [Number(x.toString())]), { maxBits: 53 });
          if (v2.status !== 'proven') return false;
          checkCommon(v2.orbit, step);
          expect(v2.orbit.minimalPeriod).toBe(2);
          const m2 = xs.reduce((acc, x) => acc * Number(r) * (1 - 2 * Number(x.toString())), 1);
          if (Math.abs(Math.abs(m2) - 1) > 1e-6) expect(v2.orbit.stability.class).toBe(classOf([Math.abs(m2)]));
        }
        return true;
      }),
      { numRuns: 15 },
    );
  });

  it('Hénon fixed points for random a, b: class from float eigenvalues', () => {
    fc.assert(
      fc.property(decimalIn(0.5, 1.4), decimalIn(0.1, 0.4), fc.boolean(), (as, bs, plus) => {
        const A = new D50(as);
        const B = new D50(bs);
        const map = compileMap(getCatalogueMap('henon')!, { a: { kind: 'exact', value: as }, b: { kind: 'exact', value: bs } });
        const step = (x: Decimal[]) => [new D50(1).sub(A.mul(x[0]!).mul(x[0]!)).add(x[1]!), B.mul(x[0]!)];
        const disc = new D50(1).sub(B).pow(2).add(A.mul(4)).sqrt();
        const x = new D50(1).sub(B).neg().add(plus ? disc : disc.neg()).div(A.mul(2)); // closed form
        const v = proveOrbit(map, [[Number(x.toString()), Number(B.mul(x).toString())]], { maxBits: 53 });
        if (v.status !== 'proven') return false;
        checkCommon(v.orbit, step);
        expect(inPair(B.neg(), v.orbit.stability.determinant!)).toBe(true); // det Df = −b
        // independent float eigenvalues of Df = [[−2a x, 1], [b, 0]]
        const T = -2 * Number(as) * Number(x.toString());
        const Dt = -Number(bs);
        const disc2 = T * T - 4 * Dt;
        const moduli = disc2 >= 0 ? [Math.abs((T + Math.sqrt(disc2)) / 2), Math.abs((T - Math.sqrt(disc2)) / 2)] : [Math.sqrt(Dt), Math.sqrt(Dt)];
        if (moduli.every((m) => Math.abs(m - 1) > 1e-6)) expect(v.orbit.stability.class).toBe(classOf(moduli));
        return true;
      }),
      { numRuns: 15 },
    );
  });
});
