import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import {
  findCandidates,
  findOrbitFromSeed,
  findOrbitsFromLongOrbit,
  nearestCandidate,
  canonicalRotation,
  sameOrbitUpToShift,
  minimalPeriodApprox,
  multiplierModulus,
  SearchOptionError,
  type Candidate,
} from '../../src/search/index.js';
import type { CompiledMap } from '../../src/model/types.js';
import { henonFixture, logisticFixture } from './fixtures.js';

const realMultiplier = (c: Candidate, k = 0): number => {
  const m = c.multipliers[k]!;
  if (typeof m !== 'number') throw new Error('expected a real multiplier');
  return m;
};

describe('findCandidates on the logistic map (@heuristic)', () => {
  it('r = 3.83: exactly two period-3 orbits, one attracting and one repelling', () => {
    // The period-3 window opens at r = 1 + √8 ≈ 3.8284 by a fold (C. Zhang, "Cycles of the
    // logistic map", arXiv:1204.0546), so r = 3.83 has one stable and one unstable 3-cycle.
    const cands = findCandidates(logisticFixture('3.83'), { period: 3 });
    expect(cands).toHaveLength(2);
    expect(cands.map((c) => c.stabilityGuess).sort()).toEqual(['attracting', 'repelling']);
    for (const c of cands) {
      expect(c.period).toBe(3);
      expect(c.residual).toBeLessThan(1e-13);
      expect(c.points[0]![0]).toBeLessThan(c.points[1]![0]!); // canonical rotation starts at the smallest point
      expect(c.points[0]![0]).toBeLessThan(c.points[2]![0]!);
    }
  });

  it('r = 3.83: the 6 period-3 points are the sign changes of f³(x) − x besides the fixed points (decimal.js, 40 digits)', () => {
    // Independent check: scan g(x) = f³(x) − x on a fine grid in decimal.js (exact decimal r).
    const D = Decimal.clone({ precision: 40 });
    const r = new D('3.83');
    const f = (x: Decimal.Instance): Decimal.Instance => r.mul(x).mul(new D(1).sub(x));
    const g = (x: Decimal.Instance): Decimal.Instance => f(f(f(x))).sub(x);
    const steps = 4000;
    const roots: number[] = [];
    let prev = g(new D(0).add(new D(1).div(2 * steps)));
    for (let k = 1; k < steps; k++) {
      const x = new D(2 * k + 1).div(2 * steps);
      const cur = g(x);
      if (cur.isZero() || cur.isNegative() !== prev.isNegative()) roots.push((2 * k) / (2 * steps));
      prev = cur;
    }
    // Fixed points 0 (excluded by the offset grid) and 1 − 1/r ≈ 0.7389 (closed form).
    const period3 = roots.filter((x) => Math.abs(x - (1 - 1 / 3.83)) > 1e-3);
    expect(period3).toHaveLength(6);
    const found = findCandidates(logisticFixture('3.83'), { period: 3 }).flatMap((c) => c.points.map((q) => q[0]!));
    found.sort((a, b) => a - b);
    period3.forEach((x, i) => expect(Math.abs(found[i]! - x)).toBeLessThanOrEqual(1 / steps));
  });

  it('r = 3.8: no period-3 candidate (below 1 + √8, Zhang arXiv:1204.0546)', () => {
    expect(findCandidates(logisticFixture('3.8'), { period: 3 })).toEqual([]);
  });

  it('fixed point and period-2 orbit with their multipliers (closed forms, derived by hand)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 3100, max: 3440 }), (k) => {
        const rs = (k / 1000).toFixed(3);
        const r = k / 1000;
        const map = logisticFixture(rs);
        const fixed = findCandidates(map, { period: 1, gridPerAxis: 50, randomSeeds: 20, attractorSeeds: 10 });
        // Fixed points 0 (multiplier r) and 1 − 1/r (multiplier 2 − r).
        expect(fixed).toHaveLength(2);
        expect(fixed[0]!.points[0]![0]).toBeCloseTo(0, 14);
        expect(realMultiplier(fixed[0]!)).toBeCloseTo(r, 12);
        expect(fixed[1]!.points[0]![0]).toBeCloseTo(1 - 1 / r, 13);
        expect(realMultiplier(fixed[1]!)).toBeCloseTo(2 - r, 12);
        const two = findCandidates(map, { period: 2, gridPerAxis: 50, randomSeeds: 20, attractorSeeds: 10 });
        expect(two).toHaveLength(1);
        const disc = Math.sqrt((r - 3) * (r + 1));
        const [x1, x2] = two[0]!.points.map((q) => q[0]!);
        expect(x1).toBeCloseTo((r + 1 - disc) / (2 * r), 12);
        expect(x2).toBeCloseTo((r + 1 + disc) / (2 * r), 12);
        expect(realMultiplier(two[0]!)).toBeCloseTo(4 + 2 * r - r * r, 10);
        // 3.1 ≤ r ≤ 3.44 < 1 + √6: the 2-cycle is attracting (its multiplier is in (−1, 1)).
        expect(two[0]!.stabilityGuess).toBe('attracting');
      }),
      { numRuns: 15 },
    );
  });

  it('r = 4: orbit counts for p = 1..8 are the primitive binary necklaces (OEIS A001037)', () => {
    const a001037 = [2, 1, 2, 3, 6, 9, 18, 30]; // OEIS A001037, n = 1..8
    const map = logisticFixture('4');
    for (let p = 1; p <= 8; p++) {
      const cands = findCandidates(map, { period: p });
      expect(cands, `period ${p}`).toHaveLength(a001037[p - 1]!);
      // Every point is sin²(πk/(2^p ∓ 1)) (conjugacy with the doubling map, derived by hand).
      for (const c of cands) {
        for (const [x] of c.points) {
          const theta = Math.asin(Math.sqrt(Math.min(1, Math.max(0, x!)))) / Math.PI;
          const onMinus = Math.abs(theta * (2 ** p - 1) - Math.round(theta * (2 ** p - 1)));
          const onPlus = Math.abs(theta * (2 ** p + 1) - Math.round(theta * (2 ** p + 1)));
          expect(Math.min(onMinus, onPlus)).toBeLessThan(1e-6);
        }
        // |multiplier| = 2^p for every orbit of the r = 4 map except the fixed point 0 (4)
        // (derived by hand from the conjugacy with the tent map).
        if (!(p === 1 && c.points[0]![0]! < 0.5)) expect(multiplierModulus(c.multipliers[0]!) / 2 ** p).toBeCloseTo(1, 8);
      }
    }
  });

  it('is reproducible for a fixed seed and independent of nothing else', () => {
    const map = logisticFixture('3.9');
    const a = findCandidates(map, { period: 5, seed: 7 });
    const b = findCandidates(map, { period: 5, seed: 7 });
    expect(a).toEqual(b);
    expect(a.length).toBeGreaterThan(0);
  });

  it('`near` concentrates the seeds: finds the 3-cycle through a point near 0.5', () => {
    const cands = findCandidates(logisticFixture('3.83'), { period: 3, near: [0.5], gridPerAxis: 20, randomSeeds: 0, attractorSeeds: 0 });
    expect(cands.length).toBeGreaterThanOrEqual(1);
    const hit = nearestCandidate(cands, [0.5]);
    expect(hit).not.toBeNull();
    expect(hit!.distance).toBeLessThan(0.03);
  });

  it('rejects bad options with a typed error', () => {
    const map = logisticFixture('3.83');
    expect(() => findCandidates(map, { period: 0 })).toThrow(SearchOptionError);
    try {
      findCandidates(map, { period: 2.5 });
    } catch (e) {
      expect((e as SearchOptionError).code).toBe('bad-period');
      expect((e as SearchOptionError).path).toBe('period');
    }
    expect(() => findCandidates(map, { period: 2, near: [0.1, 0.2] })).toThrow(SearchOptionError);
  });
});

describe('domain errors (@heuristic)', () => {
  it('seeds running into log of a negative number (NaN) are dropped silently; both fixed points of log(x) + 2 are found', () => {
    // g(x) = x − log x − 2 is convex with g(1) = −1 < 0 and g → +∞ at 0⁺ and ∞: exactly two
    // fixed points (derived by hand). Half the region is outside the domain of log.
    const map: CompiledMap = {
      definition: {
        title: 'log fixture',
        state: ['x'],
        params: {},
        step: { x: 'log(x) + 2' },
        region: { x: ['-4', '4'] },
      },
      dim: 1,
      evalFloat(x, out) {
        out[0] = Math.log(x[0]!) + 2;
      },
      jacobianFloat(x, out) {
        out[0] = x[0]! > 0 ? 1 / x[0]! : NaN;
      },
      evaluator() {
        throw new Error('not needed');
      },
    };
    const cands = findCandidates(map, { period: 1 });
    expect(cands).toHaveLength(2);
    for (const c of cands) expect(Math.abs(c.points[0]![0]! - Math.log(c.points[0]![0]!) - 2)).toBeLessThan(1e-14);
    expect(cands.map((c) => c.stabilityGuess)).toEqual(['repelling', 'attracting']); // f' = 1/x: > 1 below x = 1, < 1 above
    expect(findCandidates(map, { period: 2 })).toEqual([]); // f is increasing: no 2-cycle (common practice)
  });
});

describe('a 3-D product map (eigenvalues for n ≥ 3)', () => {
  it('(x, y, z) ↦ (r x(1−x), r y(1−y), z/2) at r = 3.83: 4 fixed points with the product multipliers (closed form)', () => {
    const r = 3.83;
    const map: CompiledMap = {
      definition: {
        title: 'product fixture',
        state: ['x', 'y', 'z'],
        params: {},
        step: { x: '3.83*x*(1-x)', y: '3.83*y*(1-y)', z: 'z/2' },
        region: { x: ['0', '1'], y: ['0', '1'], z: ['-1', '1'] },
      },
      dim: 3,
      evalFloat(v, out) {
        out[0] = r * v[0]! * (1 - v[0]!);
        out[1] = r * v[1]! * (1 - v[1]!);
        out[2] = v[2]! / 2;
      },
      jacobianFloat(v, out) {
        out.fill(0);
        out[0] = r * (1 - 2 * v[0]!);
        out[4] = r * (1 - 2 * v[1]!);
        out[8] = 0.5;
      },
      evaluator() {
        throw new Error('not needed');
      },
    };
    const cands = findCandidates(map, { period: 1 });
    // Fixed points: x, y ∈ {0, 1 − 1/r}, z = 0; multipliers {r or 2 − r} × {r or 2 − r} × {1/2}.
    expect(cands).toHaveLength(4);
    for (const c of cands) {
      const [x, y, z] = c.points[0]!;
      expect(z).toBeCloseTo(0, 12);
      const mx = x! < 0.5 ? r : 2 - r;
      const my = y! < 0.5 ? r : 2 - r;
      const expected = [mx, my, 0.5].sort((a, b) => Math.abs(b) - Math.abs(a));
      const got = c.multipliers.map((m) => (typeof m === 'number' ? m : NaN));
      got.forEach((m, i) => expect(m).toBeCloseTo(expected[i]!, 8));
      expect(c.stabilityGuess).toBe('saddle');
    }
  });
});

describe('findCandidates on the Hénon map a = 1.4, b = 0.3 (@heuristic)', () => {
  it('the two fixed points (closed form, derived by hand; Hénon 1976, Commun. Math. Phys. 50)', () => {
    const a = 1.4;
    const b = 0.3;
    const cands = findCandidates(henonFixture(), { period: 1 });
    expect(cands).toHaveLength(2);
    const root = Math.sqrt((1 - b) ** 2 + 4 * a);
    const xs = [(-(1 - b) - root) / (2 * a), (-(1 - b) + root) / (2 * a)];
    cands.forEach((c, i) => {
      expect(c.points[0]![0]).toBeCloseTo(xs[i]!, 13);
      expect(c.points[0]![1]).toBeCloseTo(b * xs[i]!, 13);
      expect(c.stabilityGuess).toBe('saddle');
      // det Df = −b, so the product of the two multipliers is −b (closed form).
      expect(realMultiplier(c, 0) * realMultiplier(c, 1)).toBeCloseTo(-b, 12);
    });
  });

  it('the period-2 orbit x = (1 ± √(59/7))/4, y = b·(other x) (closed form, derived by hand)', () => {
    // Derivation: x1 + x2 = (1 − b)/a and a²x² − a(1 − b)x + (1 − b)² − a = 0; for a = 1.4,
    // b = 0.3 the roots are (0.7 ± √4.13)/2.8 = (1 ± √(59/7))/4.
    const cands = findCandidates(henonFixture(), { period: 2 });
    expect(cands).toHaveLength(1);
    const [p0, p1] = cands[0]!.points;
    expect(p0![0]).toBeCloseTo((1 - Math.sqrt(59 / 7)) / 4, 13);
    expect(p1![0]).toBeCloseTo((1 + Math.sqrt(59 / 7)) / 4, 13);
    expect(p0![1]).toBeCloseTo(0.3 * p1![0]!, 13);
    expect(p1![1]).toBeCloseTo(0.3 * p0![0]!, 13);
    // det M = (−b)² = 0.09 (closed form).
    expect(realMultiplier(cands[0]!, 0) * realMultiplier(cands[0]!, 1)).toBeCloseTo(0.09, 12);
  });

  it('no orbit of period 3 or 5 (from memory: Galias 2001 lists none for these periods)', () => {
    expect(findCandidates(henonFixture(), { period: 3 })).toEqual([]);
    expect(findCandidates(henonFixture(), { period: 5 })).toEqual([]);
  });

  it('orbit counts 1, 2, 4 for periods 4, 6, 7 (from memory: Galias 2001, Int. J. Bifurcation and Chaos 11)', () => {
    const map = henonFixture();
    expect(findCandidates(map, { period: 4 })).toHaveLength(1);
    expect(findCandidates(map, { period: 6 })).toHaveLength(2);
    expect(findCandidates(map, { period: 7 })).toHaveLength(4);
  });
});

describe('long periods from a float orbit (@heuristic)', () => {
  it('logistic r = 4, p = 200: converges to a repelling orbit with |multiplier| = 2^p', () => {
    const cands = findOrbitsFromLongOrbit(logisticFixture('4'), { period: 200, maxSeeds: 3 });
    expect(cands.length).toBeGreaterThanOrEqual(1);
    for (const c of cands) {
      expect(c.points).toHaveLength(200);
      expect(c.residual).toBeLessThan(1e-12);
      expect(c.stabilityGuess).toBe('repelling');
      // log2 |multiplier| = p for the r = 4 map (conjugacy, derived by hand): Infinity is not expected below 2^1024.
      expect(Math.log2(multiplierModulus(c.multipliers[0]!))).toBeCloseTo(200, 6);
    }
  });

  it('Hénon p = 30 from near-returns of the attractor orbit, and findOrbitFromSeed on one of them', () => {
    const map = henonFixture();
    const cands = findOrbitsFromLongOrbit(map, { period: 30, maxSeeds: 10 });
    expect(cands.length).toBeGreaterThanOrEqual(1);
    for (const c of cands) {
      expect(c.stabilityGuess).toBe('saddle');
      expect(realMultiplier(c, 0) * realMultiplier(c, 1) / 0.3 ** 30).toBeCloseTo(1, 8); // det M = (−b)^30 (closed form)
    }
    // Perturb a found orbit by 1e−6 and refine it again: the same orbit comes back.
    const perturbed = cands[0]!.points.map((q, i) => q.map((v) => v + 1e-6 * Math.sin(i + 1)));
    const again = findOrbitFromSeed(map, perturbed);
    expect(again).not.toBeNull();
    expect(sameOrbitUpToShift(again!.points, cands[0]!.points, 1e-9)).toBe(true);
  });

  it('findOrbitFromSeed returns null for a seed of a smaller minimal period', () => {
    // Fixed point 1 − 1/r repeated 4 times has minimal period 1, not 4.
    const x = 1 - 1 / 3.83;
    expect(findOrbitFromSeed(logisticFixture('3.83'), [[x], [x], [x], [x]])).toBeNull();
  });
});

describe('orbit bookkeeping (properties)', () => {
  const orbitArb = fc
    .integer({ min: 1, max: 12 })
    .chain((p) =>
      fc.record({
        p: fc.constant(p),
        pts: fc.uniqueArray(fc.integer({ min: -1000, max: 1000 }), { minLength: p, maxLength: p }),
        shift: fc.integer({ min: 0, max: p - 1 }),
      }),
    );

  it('canonical rotation is invariant under cyclic shifts and starts at the minimum', () => {
    fc.assert(
      fc.property(orbitArb, ({ p, pts, shift }) => {
        const x = pts.map((v) => v / 7);
        const shifted = x.slice(shift).concat(x.slice(0, shift));
        const a = canonicalRotation(x, p, 1);
        const b = canonicalRotation(shifted, p, 1);
        expect(a).toEqual(b);
        expect(a[0]![0]).toBe(Math.min(...x));
        expect(sameOrbitUpToShift(canonicalRotation(x, p, 1), x.map((v) => [v]), 0)).toBe(true);
      }),
    );
  });

  it('minimal period of a d-periodic sequence repeated p/d times is d', () => {
    fc.assert(
      fc.property(orbitArb, fc.integer({ min: 1, max: 5 }), ({ p, pts }, reps) => {
        const base = pts.map((v) => v / 3);
        const x = Array.from({ length: reps }, () => base).flat();
        expect(minimalPeriodApprox(x, p * reps, 1, 1e-12)).toBe(p);
      }),
    );
  });
});

// Regression (new-user trial): `prove logistic --param r=4 --period 1000` spent minutes in the
// default search (40 000 grid seeds, each a Newton solve in 1000 unknowns). The default effort now
// has a work budget for long shooting vectors; the attractor seeds still find long orbits.
// Orbits at r = 4 of period 1000 exist in abundance (2^1000/1000 by the doubling-map conjugacy,
// derived by hand); the search must return some within seconds.
import { compileMap as compileMapForBudget, getCatalogueMap as catalogueForBudget } from '../../src/model/index.js';
import { findCandidates as findForBudget } from '../../src/search/index.js';
describe('default search effort for long periods', () => {
  it('logistic r = 4, period 1000: candidates within a few seconds', () => {
    const m = compileMapForBudget(catalogueForBudget('logistic'), { r: { kind: 'exact', value: '4' } });
    // no timing assertion (benchmarks measure time); before the budget this ran for minutes and
    // hit the suite's 120 s test timeout
    const c = findForBudget(m, { period: 1000 });
    expect(c.length).toBeGreaterThan(0);
    expect(c.every((k) => k.points.length === 1000 && k.residual < 1e-9)).toBe(true);
  });
});

describe('default effort grows with the period (issue 7, item 2)', () => {
  it('Hénon (1.4, 0.3), period 18: all 233 orbits (Galias 2001, Int. J. Bifurcation and Chaos 11(9), from memory)', () => {
    // before: a fixed 40² grid found 213
    expect(findCandidates(henonFixture(), { period: 18 })).toHaveLength(233);
  }, 30_000);
  it('effort must be a positive number', () => {
    expect(() => findCandidates(henonFixture(), { period: 2, effort: 0 })).toThrow(SearchOptionError);
  });
  it('enough: the search stops once that many candidates exist', () => {
    // logistic r = 4 has 99 orbits of period 10 (OEIS A001037)
    expect(findCandidates(logisticFixture('4'), { period: 10, enough: 5 })).toHaveLength(5);
  });
});
