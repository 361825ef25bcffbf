/**
 * Rigorous identification of proven orbits (src/prove/identify.ts).
 *
 * Regression (issue 7, item 1): `prove logistic --param r=3.00000001 --period 2` printed three
 * "proven" rows for one orbit, r = 3.0000001 two, and r = 3.4494898 period 4 two (the same orbit
 * shifted by 2). The period-2 orbit of the logistic map is born at r = 3 and is the only period-2
 * orbit for r > 3 (closed form x = (r + 1 ± √((r − 3)(r + 1)))/(2r), derived by hand); the
 * period-4 orbit is born at r = 1 + √6 ≈ 3.449489743 (OEIS A086180) and is the only period-4
 * orbit just past it.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { identifyOrbits, OrbitIdentifier, type IdentifiableOrbit } from '../../src/prove/identify.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import type { ProvenOrbit } from '../../src/prove/types.js';
import { findCandidates } from '../../src/search/find.js';

function provenCandidates(r: string, period: number): ProvenOrbit[] {
  const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: r } });
  const out: ProvenOrbit[] = [];
  for (const c of findCandidates(map, { period })) {
    const v = proveOrbit(map, c.points);
    if (v.status === 'proven') out.push(v.orbit);
  }
  return out;
}

describe('identifyOrbits on proven logistic orbits (regressions of issue 7)', () => {
  it.each([
    ['3.00000001', 2],
    ['3.0000001', 2],
    ['3.4494898', 4],
  ])('r = %s, period %i: exactly one orbit', (r, period) => {
    const orbits = provenCandidates(r, period);
    // the float search reports the orbit more than once (that is the bug being pinned)
    expect(orbits.length).toBeGreaterThan(1);
    const { duplicateOf, undecided } = identifyOrbits(orbits, period, 1);
    expect(undecided).toEqual([]);
    expect(duplicateOf.filter((d) => d === null)).toHaveLength(1);
  });

  it('r = 3.83, period 3: the two orbits stay two (OEIS A001037 via the saddle-node at 1 + √8; May 1976)', () => {
    const orbits = provenCandidates('3.83', 3);
    expect(orbits).toHaveLength(2);
    expect(identifyOrbits(orbits, 3, 1).duplicateOf).toEqual([null, null]);
  });
});

/** A synthetic proven orbit around the exact zero `z` (p × n), boxes z ± w, radius r. */
function orbitAround(z: number[][], w: number, r: string | null, skew = 0): IdentifiableOrbit {
  const D = Decimal.clone({ precision: 60 });
  return {
    boxes: z.map((pt) => pt.map((v) => [new D(v).sub(w).add(skew).toString(), new D(v).add(w).add(skew).toString()] as [string, string])),
    centre: z.map((pt) => pt.map((v) => new D(v).add(skew).toString())),
    uniquenessRadius: r,
  };
}
const shift = (z: number[][], s: number): number[][] => z.map((_, i) => z[(i + s) % z.length]!);

describe('OrbitIdentifier: the rule (common practice, no source: uniqueness of a Krawczyk zero)', () => {
  const z = [[0.1], [0.5], [0.9]];
  it('a cyclic shift inside the uniqueness region is the same orbit, with the shift found', () => {
    const id = new OrbitIdentifier(3, 1);
    expect(id.add(orbitAround(z, 1e-12, '0.001'))).toEqual({ kind: 'distinct' });
    expect(id.add(orbitAround(shift(z, 2), 1e-12, '0.001'))).toEqual({ kind: 'same', sameAs: 0, shift: 1 });
    expect(id.size).toBe(1);
  });
  it('add(orbit, false) classifies without keeping (orbits not yet confirmed by the checker)', () => {
    const id = new OrbitIdentifier(3, 1);
    expect(id.add(orbitAround(z, 1e-12, '0.001'), false)).toEqual({ kind: 'distinct' });
    expect(id.size).toBe(0);
    expect(id.add(orbitAround(shift(z, 1), 1e-12, '0.001')).kind).toBe('distinct');
  });
  it('boxes far apart under every shift are distinct orbits', () => {
    const id = new OrbitIdentifier(3, 1);
    id.add(orbitAround(z, 1e-12, '0.001'));
    expect(id.add(orbitAround([[0.2], [0.5], [0.9]], 1e-12, '0.001'))).toEqual({ kind: 'distinct' });
    expect(id.size).toBe(2);
  });
  it('boxes that only MEET the other uniqueness region are not identified (undecided, kept apart)', () => {
    const id = new OrbitIdentifier(1, 1);
    id.add(orbitAround([[0.5]], 0.01, '0.02'));
    // box [0.495, 0.53] meets the first box [0.49, 0.51] and its region [0.48, 0.52], but neither
    // box lies in the other's uniqueness region
    expect(id.add(orbitAround([[0.5125]], 0.0175, null))).toEqual({ kind: 'undecided', overlapsWith: 0 });
  });
  it('the uniqueness region is centre ± r with its ends rounded inward (exact decimals)', () => {
    const fresh = (): OrbitIdentifier => {
      const id = new OrbitIdentifier(1, 1);
      id.add({ boxes: [[['0.4999', '0.5001']]], centre: [['0.5']], uniquenessRadius: '0.1' });
      return id;
    };
    // U = [0.4, 0.6] exactly: a box ending exactly at 0.6 is inside, one ending at 0.6 + 1e-40 is not
    expect(fresh().add({ boxes: [[['0.5', '0.6']]], centre: [['0.55']], uniquenessRadius: null }).kind).toBe('same');
    expect(
      fresh().add({ boxes: [[['0.5', '0.6000000000000000000000000000000000000001']]], centre: [['0.55']], uniquenessRadius: null }).kind,
    ).toBe('undecided');
  });
  it('n = 2: every coordinate must lie inside', () => {
    const id = new OrbitIdentifier(2, 2);
    id.add(orbitAround([[0, 1], [1, 0]], 1e-9, '0.01'));
    // shift 1: (1, 0.003) against (1, 0) — box ±0.005 holds the zero and lies in U = ±0.01
    expect(id.add(orbitAround([[1, 0.003], [0, 1]], 0.005, null)).kind).toBe('same');
    // second coordinate 0.5 away: disjoint under both shifts
    expect(id.add(orbitAround([[1, 0.5], [0, 1]], 0.005, null)).kind).toBe('distinct');
  });
});

describe('OrbitIdentifier: soundness property (fast-check)', () => {
  // Two exact zeros z and w of a hypothetical shooting system; uniqueness regions are chosen
  // consistent with the theorem (a region never holds another zero or shift of one). Then "same"
  // must mean w is a shift of z, and "distinct" must mean it is not.
  it('never merges different orbits and never separates one orbit', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }),
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 5, maxLength: 5 }),
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 5, maxLength: 5 }),
        fc.boolean(),
        fc.integer({ min: 0, max: 4 }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.double({ min: 1e-12, max: 1e-3, noNaN: true }),
        (p, zi, wi, sameOrbit, s, radiusFraction, width) => {
          const z = zi.slice(0, p).map((v) => [v / 1000]);
          const w = sameOrbit ? shift(z, s % p) : wi.slice(0, p).map((v) => [v / 1000]);
          // distance from z to the nearest shift of w that is a different zero
          let gap = Infinity;
          for (let t = 0; t < p; t++) {
            const d = Math.max(...z.map((pt, i) => Math.abs(pt[0]! - shift(w, t)[i]![0]!)));
            if (d > 0) gap = Math.min(gap, d);
          }
          const isShift = sameOrbit || z.some((_, t) => shift(w, t).every((pt, i) => pt[0] === z[i]![0]));
          // a radius below the gap keeps every region free of other zeros
          const r = Number.isFinite(gap) ? Math.min(gap * radiusFraction, 10) : 10;
          const bw = Math.min(width, r / 4);
          const id = new OrbitIdentifier(p, 1);
          id.add(orbitAround(z, bw, String(r)));
          const v = id.add(orbitAround(w, bw, String(r)));
          if (v.kind === 'same') expect(isShift).toBe(true);
          if (v.kind === 'distinct') expect(isShift).toBe(false);
          // with tight boxes well inside the regions the answer is always decided
          expect(v.kind).not.toBe('undecided');
        },
      ),
      { numRuns: 300 },
    );
  });
});
