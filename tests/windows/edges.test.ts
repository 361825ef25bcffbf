/**
 * Bifurcation edges of the logistic map f(x) = r·x·(1 − x), enclosed by Krawczyk on the augmented
 * system and re-verified by the independent checker.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildEdgeCertificate } from '../../src/certificate/build-window.js';
import { checkCertificate } from '../../src/checker/index.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import { compileMap, resolveMap, withParameterAsState } from '../../src/model/index.js';
import { augmentedSystem, findEdges, type EdgeKind } from '../../src/windows/edges.js';

const D = Decimal.clone({ precision: 60 });
const logistic = resolveMap('logistic');
const contains = (iv: [string, string], x: Decimal) => new D(iv[0]).lte(x) && x.lte(iv[1]);
const width = (iv: [string, string]) => new D(iv[1]).minus(iv[0]);

function edge(range: [string, string], period: number, kind: EdgeKind) {
  const found = findEdges(logistic, {}, 'r', range, period, [kind], { samples: 6, search: false });
  expect(found.length, `${kind} of period ${period} in ${range}`).toBeGreaterThanOrEqual(1);
  return found;
}

function verified(e: ReturnType<typeof findEdges>[number], range: [string, string]) {
  return checkCertificate(JSON.stringify(buildEdgeCertificate(e, logistic, range))).verdict;
}

describe('edges of the logistic map', () => {
  it('the period-3 window opens by a fold at r = 1 + √8 (C. Zhang, "Cycles of the logistic map", arXiv:1204.0546)', () => {
    const range: [string, string] = ['3.82', '3.835'];
    const [fold] = edge(range, 3, 'fold');
    expect(fold!.kind).toBe('fold');
    expect(contains(fold!.param, new D(8).sqrt().plus(1))).toBe(true);
    expect(width(fold!.param).lte('1e-12')).toBe(true);
    expect(fold!.minimalPeriod).toBe(3);
    expect(verified(fold!, range)).toBe('VERIFIED');
  });

  // the period-2^(k−1) orbit flips at r_k: r_1 = 3 (derived by hand: f'(1 − 1/r) = 2 − r = −1),
  // r_2 = 1 + √6 (OEIS A086180), r_3 (OEIS A086181), r_4 (OEIS A091517)
  const flips: [number, [string, string], Decimal][] = [
    [1, ['2.9', '3.1'], new D(3)],
    [2, ['3.4', '3.5'], new D(6).sqrt().plus(1)],
    [4, ['3.5', '3.55'], new D('3.5440903595519228536')],
    [8, ['3.56', '3.566'], new D('3.5644072660954325977')],
  ];
  for (const [p, range, value] of flips) {
    it(`flip of the period-${p} orbit at r = ${value.toSignificantDigits(20).toString()} is enclosed (width ≤ 1e-12) and re-verified`, () => {
      const [flip] = edge(range, p, 'flip');
      // the published values are given to 20 digits: the enclosure (width ~1e-14) must overlap value ± 1e-19
      expect(new D(flip!.param[0]).lte(value.plus('1e-19')) && value.minus('1e-19').lte(flip!.param[1])).toBe(true);
      expect(width(flip!.param).lte('1e-12')).toBe(true);
      expect(verified(flip!, range)).toBe('VERIFIED');
      // below the accumulation point r_∞ = 3.5699456718709449 (OEIS A098587)
      expect(new D(flip!.param[1]).lt('3.5699456718709449')).toBe(true);
    });
  }

  it('superstable parameters r = 2 (period 1) and r = 1 + √5 (period 2) (closed forms, derived by hand: f(1/2) = 1/2, f²(1/2) = 1/2)', () => {
    const [s1] = edge(['1.5', '2.5'], 1, 'superstable');
    expect(contains(s1!.param, new D(2))).toBe(true);
    const two = edge(['3.1', '3.3'], 2, 'superstable').filter((e) => e.minimalPeriod === 2);
    expect(two).toHaveLength(1);
    expect(contains(two[0]!.param, new D(5).sqrt().plus(1))).toBe(true);
    expect(verified(two[0]!, ['3.1', '3.3'])).toBe('VERIFIED');
  });

  it('superstable parameters of minimal period n = 1..6 in (0, 4]: 1, 1, 1, 2, 3, 5 found and proven (OEIS A000048; Metropolis, Stein & Stein 1973)', () => {
    // none lie in (0, 1/2]: there f^n(1/2) ≤ r/4 < 1/2 (derived by hand)
    const counts = [1, 2, 3, 4, 5, 6].map((n) => findEdges(logistic, {}, 'r', ['0.5', '4'], n, ['superstable'], { samples: 0 }).filter((e) => e.minimalPeriod === n).length);
    expect(counts).toEqual([1, 1, 1, 2, 3, 5]);
  });
});

describe('augmented system enclosure (property, against decimal.js at 60 digits)', () => {
  // logistic: f = r x (1 − x), f_x = r (1 − 2x), f_r = x (1 − x), f_xx = −2r, f_xr = 1 − 2x (derived by hand)
  const ext = withParameterAsState(compileMap(logistic, { r: { kind: 'interval', lo: '3', hi: '4' } }), 'r');
  const A = intervalArithmetic();
  const so = ext.secondOrder(A);
  it('G(box) and its Jacobian columns contain the exact values at points of the box', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.double({ min: 3, max: 4, noNaN: true }),
        fc.double({ min: 1e-9, max: 1e-3, noNaN: true }),
        fc.constantFrom<EdgeKind>('fold', 'flip', 'superstable'),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 4, maxLength: 4 }),
        (xs, r, rad, kind, ts) => {
          const z = [...xs, r];
          const box = z.map((v) => A.inflate(A.fromNumber(v), rad));
          const { G, cols } = augmentedSystem(A, so, kind, box, true);
          // a point of the box, exactly as decimals
          const pt = z.map((v, i) => new D(decimalOfDouble(v)).plus(new D(decimalOfDouble(rad)).times(new D(decimalOfDouble(ts[i]!)).times(2).minus(1))));
          const p = 3;
          const rr = pt[p]!;
          const f = (x: Decimal) => rr.times(x).times(new D(1).minus(x));
          const fx = (x: Decimal) => rr.times(new D(1).minus(x.times(2)));
          const lam = fx(pt[0]!).times(fx(pt[1]!)).times(fx(pt[2]!));
          const exactG = [0, 1, 2].map((i) => pt[(i + 1) % p]!.minus(f(pt[i]!)));
          exactG.push(kind === 'fold' ? lam.minus(1) : kind === 'flip' ? lam.plus(1) : fx(pt[0]!));
          const inIv = (iv: { lo: number; hi: number }, x: Decimal) => new D(decimalOfDouble(iv.lo)).lte(x) && x.lte(decimalOfDouble(iv.hi));
          for (let i = 0; i <= p; i++) if (!inIv(G[i] as never, exactG[i]!)) return false;
          // Jacobian: dense from the columns, compare with exact partials
          const J = Array.from({ length: p + 1 }, () => Array.from({ length: p + 1 }, () => ({ lo: 0, hi: 0 })));
          cols.forEach((c, k) => c.rows.forEach((row, q) => {
            const v = c.values[q] as unknown as { lo: number; hi: number };
            J[row]![k] = { lo: J[row]![k]!.lo + v.lo, hi: J[row]![k]!.hi + v.hi }; // only for the p = 3 layout (no duplicate rows)
          }));
          const exactJ: Decimal[][] = Array.from({ length: p + 1 }, () => Array.from({ length: p + 1 }, () => new D(0)));
          for (let i = 0; i < p; i++) {
            exactJ[i]![i] = fx(pt[i]!).neg();
            exactJ[i]![(i + 1) % p] = new D(1);
            exactJ[i]![p] = pt[i]!.times(new D(1).minus(pt[i]!)).neg();
            if (kind === 'superstable') continue;
            const others = [0, 1, 2].filter((j) => j !== i).reduce((acc, j) => acc.times(fx(pt[j]!)), new D(1));
            exactJ[p]![i] = rr.times(-2).times(others);
            exactJ[p]![p] = exactJ[p]![p]!.plus(new D(1).minus(pt[i]!.times(2)).times(others));
          }
          if (kind === 'superstable') {
            exactJ[p]![0] = rr.times(-2);
            exactJ[p]![p] = new D(1).minus(pt[0]!.times(2));
          }
          for (let i = 0; i <= p; i++) for (let k = 0; k <= p; k++) if (!inIv(J[i]![k]!, exactJ[i]![k]!)) return false;
          return true;
        },
      ),
      { numRuns: 200 },
    );
  });
});
