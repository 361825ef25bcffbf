/**
 * The uniqueness radius: Y = centre ± ρ (every coordinate) with K(Y) ⊂ int Y claims that the
 * shooting system has exactly one zero in Y. Checked against zeros known in closed form (derived
 * by hand): ρ must stay below the max-norm distance from the centre to every OTHER zero of the
 * shooting system (else the claim would be false), and must not be absurdly small.
 *
 * Regression (pinned): an earlier search grew the radius from the written half-width by ×16 for at
 * most 14 steps; at a fixed point 0 the written box is ±1e-300, so it stopped at
 * 1e-300·16^14 ≈ 7.3e-284 (logistic r = 3.83, fixed point 0). A search bounded in steps from a
 * relative start also collapsed when the true radius is far below 1e-3·(1 + |centre|) (scaled
 * logistic below).
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import type { CompiledMap, MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import type { ProvenOrbit } from '../../src/prove/types.js';

const D50 = Decimal.clone({ precision: 50 });
const dbl = (d: Decimal): number => Number(d.toString()); // candidates only (heuristic)

function proven(v: ReturnType<typeof proveOrbit>): ProvenOrbit {
  if (v.status !== 'proven') throw new Error(`not proven: ${v.reason}: ${v.detail}`);
  return v.orbit;
}
function radiusOf(o: ProvenOrbit): Decimal {
  expect(o.uniquenessRadius).not.toBeNull();
  return new D50(o.uniquenessRadius!);
}
/** Max-norm distance between the centre (p × n strings) and another zero of the shooting system. */
function distance(centre: string[][], zero: Decimal[][]): Decimal {
  let d = new D50(0);
  centre.forEach((pt, i) => pt.forEach((c, j) => (d = Decimal.max(d, new D50(c).sub(zero[i]![j]!).abs()))));
  return d;
}
/** x → r x (1 − x/K): fixed points 0 and K(1 − 1/r) (closed form, derived by hand). */
function scaledLogistic(r: string, K: string): CompiledMap {
  const def: MapDefinition = {
    title: 'scaled logistic (test)',
    state: ['x'],
    params: { r: { kind: 'exact', value: r }, K: { kind: 'exact', value: K } },
    step: { x: 'r*x*(1 - x/K)' },
    region: { x: ['0', K] },
  };
  return compileMap(def);
}
const logistic = (r: string): CompiledMap => compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: r } });
const henon = (): CompiledMap => compileMap(getCatalogueMap('henon')!);

/**
 * Krawczyk threshold at the fixed point 0 of x → r x (1 − x/K), closed form (derived by hand):
 * F(x) = (1 − r)x + r x²/K, C = 1/(1 − r), K(Y) = −C·(2r/K)·(Y·Y) for Y = [−ρ, ρ], so
 * |K(Y)| ≤ 2rρ²/(K(r − 1)) < ρ  ⇔  ρ < K(r − 1)/(2r). The other zero is at K(r − 1)/r, twice as far.
 */
function thresholdAtZero(r: Decimal, K: Decimal): Decimal {
  return K.mul(r.sub(1)).div(r.mul(2));
}

describe('uniqueness radius against closed-form zeros', () => {
  it('logistic r = 3.83, fixed point 0: about 0.37, below the other fixed point 1 − 1/r (regression: was 7.3e-284)', () => {
    const o = proven(proveOrbit(logistic('3.83'), [[0]]));
    const rho = radiusOf(o);
    const r = new D50('3.83');
    const thr = thresholdAtZero(r, new D50(1)); // 0.3694…, closed form
    expect(rho.lte(thr)).toBe(true);
    expect(rho.gte(thr.mul('0.8'))).toBe(true);
    expect(rho.lt(new D50(1).sub(new D50(1).div(r)))).toBe(true); // other zero 1 − 1/r ≈ 0.739
  });

  it('property: logistic fixed points 0 and 1 − 1/r never reach each other; at 0 the radius is within 80 % of the threshold', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1050, max: 4000 }), fc.constantFrom(0, 1e-300, -1e-310, 1e-17), (k, start) => {
        const rS = new D50(k).div(1000).toString();
        const r = new D50(rS);
        const other = new D50(1).sub(new D50(1).div(r)); // closed form
        const map = logistic(rS);
        const o0 = proven(proveOrbit(map, [[start]]));
        const rho0 = radiusOf(o0);
        expect(rho0.lt(distance(o0.centre, [[other]]))).toBe(true);
        const thr = thresholdAtZero(r, new D50(1));
        expect(rho0.lte(thr) && rho0.gte(thr.mul('0.8'))).toBe(true);
        const o1 = proven(proveOrbit(map, [[dbl(other)]]));
        expect(radiusOf(o1).lt(distance(o1.centre, [[new D50(0)]]))).toBe(true);
      }),
      { numRuns: 25, seed: 20261201 },
    );
  });

  it.each([
    ['3.83', '1e-25'],
    ['2.5', '1e-12'],
    ['3.2', '1e20'],
  ])('scaled logistic r = %s, K = %s: the radius scales with K (regression: collapsed for small K)', (rS, KS) => {
    const r = new D50(rS);
    const K = new D50(KS);
    const o = proven(proveOrbit(scaledLogistic(rS, KS), [[0]]));
    const rho = radiusOf(o);
    const thr = thresholdAtZero(r, K);
    expect(rho.lte(thr)).toBe(true);
    expect(rho.gte(thr.mul('0.8'))).toBe(true);
    expect(rho.lt(K.mul(r.sub(1)).div(r))).toBe(true); // other fixed point K(1 − 1/r)
  });

  it('property: the logistic 2-cycle radius stays below the distance to the other zeros of the 2-point system', () => {
    // zeros of x₁ = f(x₀), x₀ = f(x₁): (0,0), (x*,x*) with x* = 1 − 1/r, (a,b) and (b,a) with
    // a, b = (r + 1 ± √((r − 3)(r + 1)))/(2r) (closed form, derived by hand)
    fc.assert(
      fc.property(fc.integer({ min: 3050, max: 4000 }), (k) => {
        const rS = new D50(k).div(1000).toString();
        const r = new D50(rS);
        const root = r.sub(3).mul(r.add(1)).sqrt();
        const a = r.add(1).add(root).div(r.mul(2));
        const b = r.add(1).sub(root).div(r.mul(2));
        const xs = new D50(1).sub(new D50(1).div(r));
        const o = proven(proveOrbit(logistic(rS), [[dbl(a)], [dbl(b)]]));
        const rho = radiusOf(o);
        for (const z of [[[0], [0]], [[xs], [xs]], [[b], [a]]].map((zz) => zz.map((pt) => pt.map((v) => new D50(v))))) {
          expect(rho.lt(distance(o.centre, z))).toBe(true);
        }
        expect(rho.gt('1e-3')).toBe(true); // common practice, no source: a sensible size here
      }),
      { numRuns: 12, seed: 7 },
    );
  });

  it('Hénon a = 1.4, b = 0.3: each fixed point radius is below the distance to the other (Hénon 1976, Commun. Math. Phys. 50)', () => {
    const A = new D50('1.4');
    const B = new D50('0.3');
    const s = new D50(1).sub(B).pow(2).add(A.mul(4)).sqrt();
    // x = (−(1 − b) ± √((1 − b)² + 4a))/(2a), y = b x (closed form, derived by hand)
    const fps = [s, s.neg()].map((t) => {
      const x = t.sub(new D50(1).sub(B)).div(A.mul(2));
      return [x, B.mul(x)];
    });
    for (let i = 0; i < 2; i++) {
      const o = proven(proveOrbit(henon(), [fps[i]!.map(dbl)]));
      const rho = radiusOf(o);
      expect(rho.lt(distance(o.centre, [fps[1 - i]!]))).toBe(true);
      expect(rho.gt('0.05')).toBe(true); // distance ≈ 1.76; common practice, no source
    }
  });
});
