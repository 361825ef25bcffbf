import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ShootingSolver,
  shootingJacobianDense,
  shootingMatVecInto,
  shootingSolve,
  shootingSolveCondensed,
  shootingSolveDense,
  monodromy,
  monodromyEigenvalues,
  eigenvaluesApprox,
  normInf,
} from '../../src/linalg/index.js';

const shootingCase = fc
  .record({ p: fc.integer({ min: 1, max: 9 }), n: fc.integer({ min: 1, max: 3 }) })
  .chain(({ p, n }) =>
    fc.record({
      p: fc.constant(p),
      n: fc.constant(n),
      blocks: fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: p * n * n, maxLength: p * n * n }),
      x: fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: p * n, maxLength: p * n }),
    }),
  );

describe('multiple-shooting Jacobian (@heuristic float)', () => {
  it('dense form matches the structured matrix-vector product (property)', () => {
    fc.assert(
      fc.property(shootingCase, ({ p, n, blocks, x }) => {
        const N = p * n;
        const dense = shootingJacobianDense(blocks, p, n);
        const out = new Float64Array(N);
        shootingMatVecInto(blocks, p, n, x, out);
        for (let i = 0; i < N; i++) {
          let s = 0;
          for (let j = 0; j < N; j++) s += dense[i * N + j]! * x[j]!;
          expect(Math.abs(s - out[i]!)).toBeLessThan(1e-12 * (1 + normInf(x)));
        }
      }),
    );
  });

  it('shootingSolve agrees with the dense solve and has a small residual (property)', () => {
    fc.assert(
      fc.property(shootingCase, ({ p, n, blocks, x }) => {
        const N = p * n;
        const rhs = new Float64Array(N);
        shootingMatVecInto(blocks, p, n, x, rhs);
        const dense = shootingSolveDense(blocks, p, n, rhs);
        const structured = shootingSolve(blocks, p, n, rhs);
        // Skip (nearly) singular draws: the contract is about well-posed systems.
        fc.pre(dense !== null && normInf(dense) < 1e6);
        expect(structured).not.toBeNull();
        const back = new Float64Array(N);
        shootingMatVecInto(blocks, p, n, structured!, back);
        for (let i = 0; i < N; i++) expect(Math.abs(back[i]! - rhs[i]!)).toBeLessThan(1e-9 * (1 + normInf(rhs)));
        for (let i = 0; i < N; i++) {
          expect(Math.abs(structured![i]! - dense![i]!)).toBeLessThan(1e-7 * (1 + normInf(dense!)));
        }
      }),
    );
  });

  it('structured solve is backward stable on long products of expanding and contracting blocks (property)', () => {
    const longCase = fc
      .record({ p: fc.integer({ min: 10, max: 120 }), n: fc.integer({ min: 1, max: 2 }), seed: fc.integer() })
      .map(({ p, n, seed }) => {
        let s = seed >>> 0;
        const next = (): number => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296) * 2 - 1;
        // Entries of either sign and magnitude between ~0.05 and ~4: saddle-like, chaotic mixes.
        const blocks = Float64Array.from({ length: p * n * n }, () => next() * Math.exp(1.4 * next()) * 1.5);
        const rhs = Float64Array.from({ length: p * n }, next);
        return { p, n, blocks, rhs };
      });
    fc.assert(
      fc.property(longCase, ({ p, n, blocks, rhs }) => {
        const sol = shootingSolve(blocks, p, n, rhs);
        fc.pre(sol !== null);
        const back = new Float64Array(p * n);
        shootingMatVecInto(blocks, p, n, sol!, back);
        let worst = 0;
        for (let i = 0; i < p * n; i++) worst = Math.max(worst, Math.abs(back[i]! - rhs[i]!));
        // Normwise backward error of a Householder QR solve: a modest multiple of p·n·eps (common practice).
        const jNorm = 1 + 2 * normInf(blocks) * n;
        expect(worst / (jNorm * normInf(sol!) + normInf(rhs))).toBeLessThan(1e-12);
      }),
      { numRuns: 60 },
    );
  });

  it('the solver reuses its workspace: two different systems in a row give the right answers', () => {
    const solver = new ShootingSolver(3, 1);
    const out = new Float64Array(3);
    // F_i = x_{i+1} − a x_i with a = 2: J = [[−2,1,0],[0,−2,1],[1,0,−2]]; J·(1,1,1) = (−1,−1,−1) (by hand).
    expect(solver.solveInto([2, 2, 2], [-1, -1, -1], out)).toBe(true);
    for (const v of out) expect(v).toBeCloseTo(1, 14);
    // a = 0: J = cyclic shift, J·(1,2,3) = (2,3,1) (by hand).
    expect(solver.solveInto([0, 0, 0], [2, 3, 1], out)).toBe(true);
    expect(Array.from(out).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([1, 2, 3]);
  });

  it('a singular shooting system is reported (monodromy with eigenvalue 1)', () => {
    // p = 2, n = 1, a_0·a_1 = 1 makes I − M singular, hence J singular (closed form, by hand).
    expect(shootingSolve([2, 0.5], 2, 1, [1, 1])).toBeNull();
  });

  it('long expanding products: the structured solve stays accurate where condensation overflows', () => {
    // p = 2000, n = 1, every block 2 (doubling-like): the exact solution of J·δ = r with
    // r = J·(1,…,1) = (−1,…,−1) is δ = (1,…,1); M = 2^2000 overflows the double range (closed form).
    const p = 2000;
    const blocks = new Float64Array(p).fill(2);
    const rhs = new Float64Array(p).fill(-1);
    const sol = shootingSolve(blocks, p, 1, rhs)!;
    for (const v of sol) expect(Math.abs(v - 1)).toBeLessThan(1e-12);
    expect(shootingSolveCondensed(blocks, p, 1, rhs)).toBeNull();
  });

  it('monodromy product and eigenvalues (closed forms, derived by hand)', () => {
    // Blocks diag(2, 1/2) and [[0,1],[1,0]]: M = A_1·A_0 = [[0, 1/2],[2, 0]], eigenvalues ±1.
    const blocks = [2, 0, 0, 0.5, 0, 1, 1, 0];
    expect(Array.from(monodromy(blocks, 2, 2))).toEqual([0, 0.5, 2, 0]);
    const ev = monodromyEigenvalues(blocks, 2, 2).map((z) => z.re).sort((a, b) => a - b);
    expect(ev[0]).toBeCloseTo(-1, 14);
    expect(ev[1]).toBeCloseTo(1, 14);
    // Rotation by 90° has eigenvalues ±i.
    const rot = eigenvaluesApprox([0, -1, 1, 0], 2);
    expect(Math.abs(rot[0]!.im)).toBeCloseTo(1, 14);
    expect(rot[0]!.re).toBeCloseTo(0, 14);
    // 3×3 upper triangular: eigenvalues are the diagonal 5, −3, 0.5.
    const tri = eigenvaluesApprox([5, 1, 2, 0, -3, 4, 0, 0, 0.5], 3).map((z) => z.re);
    expect(tri[0]).toBeCloseTo(5, 10);
    expect(tri[1]).toBeCloseTo(-3, 10);
    expect(tri[2]).toBeCloseTo(0.5, 10);
  });

  it('saddle monodromy over a long product: tiny eigenvalue from the determinant (closed form)', () => {
    // p = 300 blocks diag(3, 0.1): eigenvalues 3^300 ≈ 1.37e143 and 0.1^300 = 1e−300.
    const p = 300;
    const blocks = new Float64Array(4 * p);
    for (let i = 0; i < p; i++) blocks.set([3, 0, 0, 0.1], 4 * i);
    const [big, small] = monodromyEigenvalues(blocks, p, 2);
    expect(big!.re / Math.pow(3, 300)).toBeCloseTo(1, 10);
    expect(small!.re / 1e-300).toBeCloseTo(1, 10);
  });
});
