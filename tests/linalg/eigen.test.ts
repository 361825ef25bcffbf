import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { eigenvaluesQR, eigenvaluesApprox, luFactor, characteristicPolynomial, polynomialRoots } from '../../src/linalg/index.js';

const square = fc.integer({ min: 1, max: 7 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    a: fc.array(fc.double({ min: -4, max: 4, noNaN: true }), { minLength: n * n, maxLength: n * n }),
  }),
);

function determinant(a: ArrayLike<number>, n: number): number {
  const f = luFactor(a, n);
  if (f === null) return 0;
  let det = 1;
  for (let i = 0; i < n; i++) det *= f.lu[i * n + i]!;
  // Sign of the row permutation piv (a cycle of even length is an odd permutation).
  const seen = new Uint8Array(n);
  let sign = 1;
  for (let i = 0; i < n; i++) {
    if (seen[i]) continue;
    let len = 0;
    for (let j = i; !seen[j]; j = f.piv[j]!) {
      seen[j] = 1;
      len++;
    }
    if (len % 2 === 0) sign = -sign;
  }
  return sign * det;
}

describe('approximate eigenvalues (@heuristic)', () => {
  it('sum of eigenvalues = trace and product = determinant (Vieta, property)', () => {
    fc.assert(
      fc.property(square, ({ n, a }) => {
        const ev = eigenvaluesQR(a, n);
        expect(ev).not.toBeNull();
        expect(ev).toHaveLength(n);
        let tr = 0;
        let scale = 1;
        for (let i = 0; i < n; i++) tr += a[i * n + i]!;
        for (const v of a) scale = Math.max(scale, Math.abs(v));
        let sr = 0, si = 0, pr = 1, pi = 0;
        for (const z of ev!) {
          sr += z.re;
          si += z.im;
          [pr, pi] = [pr * z.re - pi * z.im, pr * z.im + pi * z.re];
        }
        expect(Math.abs(sr - tr)).toBeLessThan(1e-10 * n * scale);
        expect(Math.abs(si)).toBeLessThan(1e-10 * n * scale);
        const det = determinant(a, n);
        const tolDet = 1e-9 * Math.pow(n * scale, n);
        expect(Math.abs(pr - det)).toBeLessThan(tolDet);
        expect(Math.abs(pi)).toBeLessThan(tolDet);
      }),
    );
  });

  it('triangular matrices: eigenvalues are the diagonal, repeated ones included (property)', () => {
    fc.assert(
      fc.property(square, fc.boolean(), ({ n, a }, repeat) => {
        const t = Float64Array.from(a);
        for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) t[i * n + j] = 0;
        if (repeat && n > 1) t[(n - 1) * n + n - 1] = t[0]!; // a double eigenvalue
        const diag = Array.from({ length: n }, (_, i) => t[i * n + i]!).sort((x, y) => x - y);
        const ev = eigenvaluesQR(t, n)!.map((z) => z.re).sort((x, y) => x - y);
        ev.forEach((v, i) => expect(Math.abs(v - diag[i]!)).toBeLessThan(1e-12 * 4 * n));
      }),
    );
  });

  it('companion-matrix roots: characteristic polynomial of diag(1, 2, 3) is (λ−1)(λ−2)(λ−3) (closed form)', () => {
    expect(Array.from(characteristicPolynomial([1, 0, 0, 0, 2, 0, 0, 0, 3], 3))).toEqual([-6, 11, -6, 1]);
    const roots = polynomialRoots([-6, 11, -6, 1]).map((z) => z.re).sort((x, y) => x - y);
    roots.forEach((v, i) => expect(v).toBeCloseTo(i + 1, 12));
    // eigenvaluesApprox orders by decreasing modulus.
    expect(eigenvaluesApprox([1, 0, 0, 0, -5, 0, 0, 0, 3], 3).map((z) => z.re)).toEqual([-5, 3, 1]);
  });
});
