import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  identityMatrix,
  inverse,
  luFactor,
  matMul,
  matVec,
  solve,
  normInf,
} from '../../src/linalg/index.js';

/** A diagonally dominant (hence well-conditioned) n×n matrix from raw entries in [−1, 1]. */
function wellConditioned(n: number, raw: number[]): Float64Array {
  const a = Float64Array.from(raw.slice(0, n * n));
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) if (j !== i) s += Math.abs(a[i * n + j]!);
    a[i * n + i] = (a[i * n + i]! >= 0 ? 1 : -1) * (s + 0.5 + Math.abs(a[i * n + i]!));
  }
  return a;
}

const matrixAndVector = fc
  .integer({ min: 1, max: 8 })
  .chain((n) =>
    fc.record({
      n: fc.constant(n),
      raw: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
      x: fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
    }),
  );

describe('dense float linear algebra (@heuristic)', () => {
  it('solve recovers x from b = A·x for well-conditioned A (property)', () => {
    fc.assert(
      fc.property(matrixAndVector, ({ n, raw, x }) => {
        const a = wellConditioned(n, raw);
        const b = matVec(a, n, n, x);
        const sol = solve(a, n, b);
        expect(sol).not.toBeNull();
        // Diagonal dominance margin 0.5 bounds ‖A⁻¹‖∞ ≤ 2, so the error is a few ulps of ‖x‖ (common practice).
        for (let i = 0; i < n; i++) expect(Math.abs(sol![i]! - x[i]!)).toBeLessThanOrEqual(1e-12 * (1 + normInf(x)));
      }),
    );
  });

  it('inverse times matrix is the identity (property)', () => {
    fc.assert(
      fc.property(matrixAndVector, ({ n, raw }) => {
        const a = wellConditioned(n, raw);
        const inv = inverse(a, n)!;
        const prod = matMul(inv, a, n, n, n);
        const id = identityMatrix(n);
        for (let k = 0; k < n * n; k++) expect(Math.abs(prod[k]! - id[k]!)).toBeLessThan(1e-12 * n);
      }),
    );
  });

  it('matMul is associative with matVec: (A·B)·x = A·(B·x) (property)', () => {
    fc.assert(
      fc.property(matrixAndVector, matrixAndVector, ({ n, raw, x }, other) => {
        const b = Float64Array.from({ length: n * n }, (_, k) => other.raw[k % other.raw.length]!);
        const a = Float64Array.from(raw);
        const left = matVec(matMul(a, b, n, n, n), n, n, x);
        const right = matVec(a, n, n, matVec(b, n, n, x));
        for (let i = 0; i < n; i++) expect(Math.abs(left[i]! - right[i]!)).toBeLessThan(1e-12 * (1 + normInf(x)) * n * n);
      }),
    );
  });

  it('hand-checked 2×2 solve and inverse (closed form, derived by hand)', () => {
    // [[0, 2], [3, 1]]·x = [4, 5] has x = [1, 2] (needs a row exchange: zero leading pivot).
    expect(Array.from(solve([0, 2, 3, 1], 2, [4, 5])!)).toEqual([1, 2]);
    // inverse of [[2, 1], [1, 1]] is [[1, −1], [−1, 2]] (det 1).
    expect(Array.from(inverse([2, 1, 1, 1], 2)!)).toEqual([1, -1, -1, 2]);
  });

  it('reports singular and non-finite matrices as null', () => {
    expect(luFactor([1, 2, 2, 4], 2)).toBeNull(); // rank 1 (closed form)
    expect(solve([1, 0, 0, 0], 2, [1, 1])).toBeNull();
    expect(inverse([NaN, 0, 0, 1], 2)).toBeNull();
  });
});
