/**
 * Property (fast-check): the box decision never loses a zero of the shooting system, and a box
 * decided "one zero" encloses it. Oracle: the points of period p of the logistic map r = 4 are
 * x = sin²(π j/(2^p − 1)) and sin²(π j/(2^p + 1)) (conjugacy x = sin²(πθ) to the doubling map
 * θ ↦ 2θ mod 1, classical; e.g. Devaney 1989), computed with decimal.js at 50 digits; a box
 * around the orbit of random width, shifted at random, must not be decided "none".
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { ShootingCounter } from '../../src/count/search.js';

const D = Decimal.clone({ precision: 50 });
const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: '4' } });
const region = Float64Array.from([0, 1]);

/** The orbit (p points, decimal) of θ = j/(2^p ± 1) under doubling, as x = sin²(πθ). */
function orbit(p: number, j: number, plus: boolean): Decimal[] {
  const q = 2 ** p + (plus ? 1 : -1);
  const pi = D.acos(-1);
  const out: Decimal[] = [];
  let k = j % q;
  for (let i = 0; i < p; i++) {
    out.push(D.sin(pi.mul(k).div(q)).pow(2));
    k = (2 * k) % q;
  }
  return out;
}

describe('ShootingCounter.decide', () => {
  it('never excludes a box holding a zero; a "one zero" verdict encloses it', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5 }), fc.nat(1000), fc.boolean(), fc.integer({ min: 3, max: 40 }), fc.double({ min: 0, max: 1, noNaN: true }), (p, j, plus, k, shift) => {
        const c = new ShootingCounter(map, p, region, 0);
        const z = orbit(p, j, plus);
        const w = 2 ** -k;
        const B = new Float64Array(2 * p);
        z.forEach((x, i) => {
          const xf = x.toNumber();
          // box [x − s·w, x + (1 − s)·w] widened by 1e-15 so it surely holds the exact x
          B[2 * i] = Math.max(0, xf - shift * w - 1e-15);
          B[2 * i + 1] = Math.min(1, xf + (1 - shift) * w + 1e-15);
        });
        const verdict = c.decide(B);
        expect(verdict).not.toBe(0); // 0 = none
        if (verdict === 1) {
          const { K } = c.lastZero();
          z.forEach((x, i) => {
            expect(x.gte(new D(K[2 * i]!).minus('1e-40'))).toBe(true);
            expect(x.lte(new D(K[2 * i + 1]!).plus('1e-40'))).toBe(true);
          });
        }
      }),
      { numRuns: 150 },
    );
  });
});
