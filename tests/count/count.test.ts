/**
 * The counting search against values from outside the project.
 *  - Logistic map r = 4 on [0, 1]: orbits of minimal period p = OEIS A001037
 *    (2, 1, 2, 3, 6, 9, 18, 30, 56, 99, ... for p = 1, 2, ...): it is conjugate to the full
 *    2-shift (tent map), whose f^p has 2^p fixed points.
 *  - Tent map slope 2 on [0, 1]: f^p has 2^p fixed points (classical), so the same A001037.
 *  - Logistic r = 3.8: no period-3 orbit (the period-3 window opens at r = 1 + √8 ≈ 3.8284;
 *    common knowledge, e.g. Devaney, An Introduction to Chaotic Dynamical Systems, 1989).
 */
import { describe, expect, it } from 'vitest';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { countOrbits } from '../../src/workflow/count.js';

const A001037 = [2, 1, 2, 3, 6, 9, 18, 30, 56, 99, 186, 335, 630, 1161, 2182, 4080]; // OEIS A001037, p = 1..16

function logistic(r: string) {
  return compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: r } });
}

describe('count (n = 1)', () => {
  it('logistic r = 4: orbits of minimal period p = 1..9 equal OEIS A001037, 2^p points', async () => {
    const rep = await countOrbits({ map: logistic('4'), periods: [1, 2, 3, 4, 5, 6, 7, 8, 9], check: false, pieceDepth: 3 });
    for (const p of rep.periods) {
      expect(p.exact).toBe(true);
      expect(p.claims.orbitsByMinimalPeriod[String(p.period)]).toBe(A001037[p.period - 1]);
      expect(p.claims.zeros).toBe(2 ** p.period); // fixed points of f^p: 2^p (conjugacy to the 2-shift)
      // lower periods dividing p are told apart: d · orbits_d summed over d | p is 2^p
      const total = Object.entries(p.claims.orbitsByMinimalPeriod).reduce((s, [d, c]) => s + Number(d) * c, 0);
      expect(total).toBe(2 ** p.period);
      for (const [d, c] of Object.entries(p.claims.orbitsByMinimalPeriod)) expect(c).toBe(A001037[Number(d) - 1]);
    }
  }, 30_000);

  it('tent map slope 2 (abs/min slopes): A001037 for p = 1..6, re-verified by the checker', async () => {
    const tent = compileMap(getCatalogueMap('tent')!);
    const rep = await countOrbits({ map: tent, periods: [1, 2, 3, 4, 5, 6], pieceDepth: 2 });
    expect(rep.check?.verdict).toBe('VERIFIED');
    expect(rep.periods.map((p) => p.claims.orbitsByMinimalPeriod[String(p.period)])).toEqual(A001037.slice(0, 6));
  }, 30_000);

  it('zero is a count: logistic r = 3.8 has no period-3 orbit in [0, 1] (window opens at 1 + √8)', async () => {
    const rep = await countOrbits({ map: logistic('3.8'), periods: [3] });
    expect(rep.periods[0]!.exact).toBe(true);
    expect(rep.periods[0]!.claims.orbitsByMinimalPeriod['3']).toBe(0);
    expect(rep.periods[0]!.claims.orbitsByMinimalPeriod['1']).toBe(2); // fixed points 0 and 1 − 1/r
    expect(rep.check?.verdict).toBe('VERIFIED');
    // and at r = 3.83 (inside the window) the two period-3 orbits (stable and saddle) appear
    const in3 = await countOrbits({ map: logistic('3.83'), periods: [3], check: false });
    expect(in3.periods[0]!.claims.orbitsByMinimalPeriod['3']).toBe(2); // common knowledge: saddle-node pair born at 1 + √8
  }, 30_000);

});

describe('count (n = 2, Hénon a = 1.4, b = 0.3)', () => {
  // Z. Galias 2001, "Interval methods for rigorous investigations of periodic orbits", Int. J.
  // Bifurcation and Chaos 11(9): orbits of minimal period 1..4 are 2, 1, 0, 1 in a square holding
  // all bounded orbits. Values recalled from memory of its table (and agreeing with a float search).
  // [-2, 2]^2 holds every bounded orbit: |x|, |y| ≤ (1 + |b| + √((1 + |b|)² + 4a))/(2a) ≈ 1.43
  // (Devaney & Nitecki 1979, from memory).
  it('periods 1..4 in [-2, 2]^2: 2, 1, 0, 1 (Galias 2001, from memory)', async () => {
    const henon = compileMap(getCatalogueMap('henon')!);
    const rep = await countOrbits({ map: henon, periods: [1, 2, 3, 4], region: [['-2', '2'], ['-2', '2']], pieceDepth: 2 });
    expect(rep.periods.map((p) => p.exact)).toEqual([true, true, true, true]);
    expect(rep.periods.map((p) => p.claims.orbitsByMinimalPeriod[String(p.period)])).toEqual([2, 1, 0, 1]);
    expect(rep.check?.verdict).toBe('VERIFIED');
  }, 30_000);
});
