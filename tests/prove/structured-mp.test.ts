/**
 * Issue 7 item 4: per-block precision escalation. A long orbit (p·n > MAX_DECIMAL_DENSE_UNKNOWNS,
 * where no dense multiprecision solve is allowed) that float64 cannot prove is proven in
 * multiprecision through the structured block-cyclic bound (refineMpStructured + cyclic.ts).
 *
 * Reference (conjugacy of 4x(1 − x) with the doubling map, derivable by hand): the period-p
 * points are x_i = sin²(π·2^i·k/(2^p − 1)), and with f'(x) = 4·cos 2θ for x = sin²θ the multiplier
 * is Π 4·cos(2^{i+1}θ) = 4^p·sin(2^{p+1}θ)/(2^p·sin 2θ) = ±2^p.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MAX_DECIMAL_DENSE_UNKNOWNS } from '../../src/certificate/limits.js';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { decimalContext } from '../../src/linalg/decimal.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { cyclicSolveDecimal } from '../../src/prove/refine.js';

const P = 620;
const D = Decimal.clone({ precision: 260 }) // 2^-P·k needs P·log10(2) ≈ 190 digits of k/M;
const PI = D.acos(-1);
const M = new D(2).pow(P).sub(1);

/** k: a p-bit word starting 0100…01 (70 bits) then pseudo-random bits, so x_0 ≈ 1/2 + 2^-70·π. */
function word(): bigint {
  let k = (1n << BigInt(P - 2)) + (1n << BigInt(P - 70));
  let s = 12345n;
  for (let b = 0; b < P - 72; b++) {
    s = (s * 6364136223846793005n + 1442695040888963407n) % (1n << 64n);
    if ((s >> 33n) & 1n) k += 1n << BigInt(b);
  }
  return k;
}

describe('structured multiprecision escalation (long orbits)', () => {
  it(`logistic r = 4, period ${P} passing 2^-70 from the critical point: float64 fails, proven in multiprecision without a dense solve`, () => {
    expect(P).toBeGreaterThan(MAX_DECIMAL_DENSE_UNKNOWNS);
    const def = getCatalogueMap('logistic')!;
    const overrides = { r: { kind: 'exact' as const, value: '4' } };
    const map = compileMap({ ...def, params: { ...def.params, ...overrides } });
    const k = word();
    const exact: Decimal[] = [];
    let num = new D(k.toString());
    for (let i = 0; i < P; i++) {
      exact.push(D.sin(PI.mul(num).div(M)).pow(2));
      num = num.mul(2).mod(M);
    }
    // the candidate: every point to 100 digits (an exact long start)
    const v = proveOrbit(map, exact.map((x) => [x.toSignificantDigits(100).toString()]));
    expect(v.status).toBe('proven');
    if (v.status !== 'proven') return;
    expect(v.orbit.attempts[0]!.outcome).toBe('failed');
    expect(v.orbit.bits).toBeGreaterThan(53);
    for (let i = 0; i < P; i++) {
      const [lo, hi] = v.orbit.boxes[i]![0]!;
      expect(exact[i]!.gte(lo) && exact[i]!.lte(hi), `point ${i}`).toBe(true);
    }
    const [lo, hi] = v.orbit.stability.multiplier!;
    const two = new D(2).pow(P);
    const inside = (x: Decimal) => x.gte(lo) && x.lte(hi);
    expect(inside(two) || inside(two.neg())).toBe(true);
    expect(v.orbit.stability.class).toBe('repelling');
    // and the independent checker re-verifies the certificate
    const cert = buildCertificate(v.orbit, def, { overrides });
    const report = checkCertificate(JSON.stringify(cert));
    expect(report.verdict, report.reason).toBe('VERIFIED');
  }, 120_000);

  it('cyclicSolveDecimal solves δ_{i+1} − a_i·δ_i = F_i (residual at 60 digits, either direction)', () => {
    const Dd = decimalContext(200);
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -6, max: 6, noNaN: true }), { minLength: 1, maxLength: 12 }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 12, maxLength: 12 }),
        (as, fs) => {
          const a = as.map((x) => new Dd(x));
          const F = a.map((_, i) => new Dd(fs[i]!));
          const prod = a.reduce((s, x) => s.mul(x), new Dd(1));
          fc.pre(prod.sub(1).abs().gt(1e-6) && a.every((x) => !x.isZero()));
          const d = cyclicSolveDecimal(Dd, a, F);
          expect(d).not.toBeNull();
          const p = a.length;
          for (let i = 0; i < p; i++) {
            const r = d![(i + 1) % p]!.sub(a[i]!.mul(d![i]!)).sub(F[i]!);
            const scale = d!.reduce((s, x) => Decimal.max(s, x.abs()), new Dd(1)).mul(7);
            expect(r.abs().lte(scale.mul('1e-55'))).toBe(true);
          }
        },
      ),
      { numRuns: 200 },
    );
  });
});
