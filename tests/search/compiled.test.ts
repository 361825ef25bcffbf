/**
 * The search on maps built by the real map-language compiler (catalogue entries), as the CLI
 * will call it. The fixture-based tests (find.test.ts) cover the mathematics independently of it.
 */
import { describe, expect, it } from 'vitest';
import { compileMap, getCatalogueMap } from '../../src/model/index.js';
import { findCandidates, multiplierModulus } from '../../src/search/index.js';

const catalogue = (name: string) => compileMap(getCatalogueMap(name)!);

describe('findCandidates on compiled catalogue maps (@heuristic)', () => {
  it('logistic (r = 3.83): two period-3 orbits (Zhang, arXiv:1204.0546: window opens at 1 + √8)', () => {
    const cands = findCandidates(catalogue('logistic'), { period: 3 });
    expect(cands).toHaveLength(2);
  });

  it('params override r = 4 (exact decimal text): counts follow OEIS A001037 for p = 1..6', () => {
    const map = catalogue('logistic');
    const counts = [1, 2, 3, 4, 5, 6].map((period) => findCandidates(map, { period, params: { r: { kind: 'exact', value: '4' } } }).length);
    expect(counts).toEqual([2, 1, 2, 3, 6, 9]); // OEIS A001037
    // The override does not leak into the caller's map.
    expect(map.definition.params['r']).toEqual({ kind: 'exact', value: '3.83' });
    expect(findCandidates(map, { period: 3 })).toHaveLength(2);
  });

  it('an unknown parameter in params is a typed user error, not a crash', () => {
    expect(() => findCandidates(catalogue('logistic'), { period: 1, params: { q: { kind: 'exact', value: '1' } } })).toThrow(
      expect.objectContaining({ code: 'unknown-parameter' }),
    );
  });

  it('regression: at a fold (double root) the slowly converging Newton runs are merged into one neutral candidate', () => {
    // x ↦ x² + c at c = −7/4 is the period-3 saddle-node: conjugate to the logistic map at
    // r = 1 + √8 via c = (2r − r²)/4 (closed form, derived by hand; Zhang arXiv:1204.0546).
    // Past failure: 40 "distinct" period-3 candidates ~1e−7 apart, all from the same double root.
    const cands = findCandidates(catalogue('quadratic'), { period: 3 });
    expect(cands).toHaveLength(1);
    expect(cands[0]!.stabilityGuess).toBe('neutral');
    expect(multiplierModulus(cands[0]!.multipliers[0]!)).toBeCloseTo(1, 5);
  });

  it('Hénon (a = 1.4, b = 0.3): fixed points x = (−(1 − b) ± √((1 − b)² + 4a))/(2a) (closed form; Hénon 1976)', () => {
    const cands = findCandidates(catalogue('henon'), { period: 1 });
    expect(cands).toHaveLength(2);
    const root = Math.sqrt(0.49 + 5.6);
    expect(cands[0]!.points[0]![0]).toBeCloseTo((-0.7 - root) / 2.8, 12);
    expect(cands[1]!.points[0]![0]).toBeCloseTo((-0.7 + root) / 2.8, 12);
  });
});
