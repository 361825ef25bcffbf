/**
 * floatShootingInverse (one structured elimination with all right-hand sides): J·C ≈ I for the
 * block-cyclic shooting Jacobian J (block row i: −A_i at block column i, I at column i + 1 mod p),
 * checked by forming J·C directly (definition of the inverse; common practice), and agreement
 * with column-by-column solves of the independent structured solver (linalg/shooting.ts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { shootingSolve } from '../../src/linalg/shooting.js';
import { floatShootingInverse } from '../../src/prove/refine.js';

function jTimesC(blocks: Float64Array, C: Float64Array, p: number, n: number): Float64Array {
  const N = p * n;
  const out = new Float64Array(N * N);
  for (let i = 0; i < p; i++) {
    const next = ((i + 1) % p) * n;
    for (let r = 0; r < n; r++) {
      for (let col = 0; col < N; col++) {
        let s = C[(next + r) * N + col]!;
        for (let c = 0; c < n; c++) s -= blocks[i * n * n + r * n + c]! * C[(i * n + c) * N + col]!;
        out[(i * n + r) * N + col] = s;
      }
    }
  }
  return out;
}

describe('floatShootingInverse', () => {
  it('property: J·C = I to 1e-9 and C agrees with column-by-column solves (p = 1..8, n = 1..3)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 8 }),
        fc.integer({ min: 1, max: 3 }),
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 8 * 9, maxLength: 8 * 9 }),
        (p, n, vals) => {
          const N = p * n;
          // blocks 2.5·I + small entries: |eigenvalues| > 1, J well conditioned
          const blocks = Float64Array.from({ length: p * n * n }, (_, k) => 0.2 * vals[k]! + ((k % (n * n)) % (n + 1) === 0 ? 2.5 : 0));
          const C = floatShootingInverse(blocks, p, n);
          expect(C).not.toBeNull();
          const JC = jTimesC(blocks, C!, p, n);
          let err = 0;
          for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) err = Math.max(err, Math.abs(JC[i * N + j]! - (i === j ? 1 : 0)));
          expect(err).toBeLessThan(1e-9);
          const e = new Float64Array(N);
          e[N - 1] = 1;
          const col = shootingSolve(blocks, p, n, e);
          let diff = 0;
          for (let i = 0; i < N; i++) diff = Math.max(diff, Math.abs(col![i]! - C![i * N + N - 1]!));
          expect(diff).toBeLessThan(1e-9);
        },
      ),
      { numRuns: 200, seed: 5 },
    );
  });

  it('a singular J (A_0 = 1 with p = 1: J = 0) gives null', () => {
    expect(floatShootingInverse(Float64Array.of(1), 1, 1)).toBeNull();
  });
});
