/**
 * Stability for n ≥ 3: the class from Gershgorin discs of the direct monodromy in an approximate
 * eigenbasis (re-verified by the checker, src/checker/stability-n.ts), and the moving-frame disc
 * moduli as prover-only information. Check values are closed forms derived
 * by hand: a decoupled product of logistic maps x → r x (1 − x) has as multipliers the 1-D ones
 * (fixed point 1 − 1/r: 2 − r; fixed point 0: r; 2-cycle: 4 + 2r − r²), and a map that is linear
 * plus quadratic terms has the eigenvalues of its linear part at 0.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { eigenvaluesQR } from '../../src/linalg/eigen.js';
import { compileMap } from '../../src/model/compile.js';
import type { MapDefinition } from '../../src/model/types.js';
import { gershgorinDiscs } from '../../src/prove/gershgorin.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import type { DecimalPair, ProvenOrbit } from '../../src/prove/types.js';

const D50 = Decimal.clone({ precision: 50 });
const dbl = (d: Decimal): number => Number(d.toString()); // candidates only (heuristic)

function proven(v: ReturnType<typeof proveOrbit>): ProvenOrbit {
  if (v.status !== 'proven') throw new Error(`not proven: ${v.reason}: ${v.detail}`);
  return v.orbit;
}
function product(r: string[]): MapDefinition {
  return {
    title: 'three decoupled logistic maps (test)',
    state: ['x', 'y', 'z'],
    params: { a: { kind: 'exact', value: r[0]! }, b: { kind: 'exact', value: r[1]! }, c: { kind: 'exact', value: r[2]! } },
    step: { x: 'a*x*(1 - x)', y: 'b*y*(1 - y)', z: 'c*z*(1 - z)' },
    region: { x: ['0', '1'], y: ['0', '1'], z: ['0', '1'] },
  };
}
/** Every expected modulus lies in its own reported enclosure (both sorted ascending). */
function matches(moduli: DecimalPair[], expected: Decimal[]): boolean {
  const e = expected.slice().sort((x, y) => x.cmp(y));
  return moduli.length === e.length && moduli.every((m, i) => e[i]!.gte(m[0]) && e[i]!.lte(m[1]));
}
function expectedClass(mods: Decimal[]): string {
  if (mods.every((m) => m.lt(1))) return 'attracting';
  if (mods.every((m) => m.gt(1))) return 'repelling';
  return 'saddle';
}
/** r = k/1000 with |2 − r| at least 0.02 away from 1 (so the class is decidable). */
const rAway = fc.integer({ min: 1100, max: 3950 }).filter((k) => Math.abs(k - 3000) >= 20 && Math.abs(k - 1000) >= 20);

describe('n = 3: Gershgorin discs on decoupled logistic products (closed forms, derived by hand)', () => {
  it('property: fixed point (1 − 1/a, 1 − 1/b, 1 − 1/c): moduli |2 − r| enclosed, class right and re-verified by the checker', () => {
    fc.assert(
      fc.property(fc.tuple(rAway, rAway, rAway), (ks) => {
        const rs = ks.map((k) => new D50(k).div(1000).toString());
        const def = product(rs);
        const fp = rs.map((r) => dbl(new D50(1).sub(new D50(1).div(r))));
        const o = proven(proveOrbit(compileMap(def), [fp]));
        const mods = rs.map((r) => new D50(2).sub(r).abs()); // multiplier 2 − r
        expect(o.stability.class).toBe(expectedClass(mods));
        const po = o.stability.proverOnly!;
        expect(po.method).toBe('gershgorin');
        expect(matches(po.eigenvalueModuli, mods)).toBe(true);
        expect(po.class).toBe(expectedClass(mods));
        const cert = buildCertificate(o, def);
        expect(cert.claims.stability.class).toBe(expectedClass(mods));
        expect(cert.claims.stability.eigenbasis).toBeDefined();
        expect(JSON.stringify(cert)).not.toContain('proverOnly');
        expect(checkCertificate(JSON.stringify(cert)).verdict).toBe('VERIFIED');
      }),
      { numRuns: 15, seed: 42 },
    );
  });

  it('fixed point 0 has multipliers a, b, c: repelling', () => {
    const o = proven(proveOrbit(compileMap(product(['2.5', '2.8', '3.2'])), [[0, 0, 0]]));
    expect(matches(o.stability.proverOnly!.eigenvalueModuli, ['2.5', '2.8', '3.2'].map((s) => new D50(s)))).toBe(true);
    expect(o.stability.proverOnly!.class).toBe('repelling');
  });

  it('a 2-cycle in every coordinate: multipliers 4 + 2r − r² (period 2 monodromy in moving frames)', () => {
    const rs = ['3.2', '3.4', '3.1'];
    const cyc = rs.map((rS) => {
      const r = new D50(rS);
      const root = r.sub(3).mul(r.add(1)).sqrt();
      return [r.add(1).add(root).div(r.mul(2)), r.add(1).sub(root).div(r.mul(2))];
    });
    const pts = [0, 1].map((i) => cyc.map((c) => dbl(c[i]!)));
    const o = proven(proveOrbit(compileMap(product(rs)), pts));
    const mods = rs.map((rS) => new D50(4).add(new D50(rS).mul(2)).sub(new D50(rS).pow(2)).abs());
    expect(matches(o.stability.proverOnly!.eigenvalueModuli, mods)).toBe(true);
    expect(o.stability.proverOnly!.class).toBe(expectedClass(mods)); // 0.16, 0.36, 0.41 → attracting
  });

  it('a complex pair: linear part [[0.5, −0.6], [0.6, 0.5]] ⊕ [2] gives |λ| = √0.61, √0.61, 2: saddle', () => {
    const def: MapDefinition = {
      title: 'rotation and stretch (test)',
      state: ['x', 'y', 'z'],
      params: {},
      step: { x: '0.5*x - 0.6*y + x*x', y: '0.6*x + 0.5*y', z: '2*z + z*z' },
      region: { x: ['-1', '1'], y: ['-1', '1'], z: ['-1', '1'] },
    };
    const o = proven(proveOrbit(compileMap(def), [[0, 0, 0]]));
    const s = new D50('0.61').sqrt();
    expect(matches(o.stability.proverOnly!.eigenvalueModuli, [s, s, new D50(2)])).toBe(true);
    expect(o.stability.proverOnly!.class).toBe('saddle');
  });

  it('a multiplier −1 (r = 3 at the fixed point 1 − 1/r) leaves the fast-engine class undecided', () => {
    const o = proven(proveOrbit(compileMap(product(['3', '2.5', '2.5'])), [[2 / 3, 0.6, 0.6]]));
    expect(o.stability.proverOnly!.class).toBe('undecided');
  });

  it('a repeated multiplier (a = b = 2.5: −0.5 twice) is still enclosed: attracting', () => {
    const o = proven(proveOrbit(compileMap(product(['2.5', '2.5', '2.2'])), [[0.6, 0.6, 1 - 1 / 2.2]]));
    expect(matches(o.stability.proverOnly!.eigenvalueModuli, ['0.5', '0.5', '0.2'].map((s) => new D50(s)))).toBe(true);
    expect(o.stability.proverOnly!.class).toBe('attracting');
  });
});

describe('gershgorinDiscs: containment', () => {
  it('property: every eigenvalue of a point matrix inside a 3×3 or 4×4 interval matrix lies in some disc', () => {
    const a = intervalArithmetic();
    fc.assert(
      fc.property(
        fc.integer({ min: 3, max: 4 }),
        fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 16, maxLength: 16 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 16, maxLength: 16 }),
        fc.double({ min: 0, max: 1e-3, noNaN: true }),
        (n, mids, ts, w) => {
          const S = Array.from({ length: n * n }, (_, k) => a.hull(a.fromNumber(mids[k]! - w), a.fromNumber(mids[k]! + w)));
          const discs = gershgorinDiscs(a, S, n);
          if (discs === null) return; // nothing claimed
          const pt = Float64Array.from({ length: n * n }, (_, k) => mids[k]! - w + 2 * w * ts[k]!);
          // float reference (common practice): backward stable, so accurate to ~1e-9 only for
          // well-separated eigenvalues (a defective one moves by ε^(1/k)); others are skipped
          const eig = eigenvaluesQR(pt, n);
          if (eig === null) return;
          for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) if (Math.hypot(eig[i]!.re - eig[j]!.re, eig[i]!.im - eig[j]!.im) < 0.05) return;
          for (const l of eig) {
            const m = Math.hypot(l.re, l.im);
            expect(discs.some((d) => d.modulusLo - 1e-9 <= m && m <= d.modulusHi + 1e-9)).toBe(true);
          }
        },
      ),
      { numRuns: 200, seed: 3 },
    );
  });
});
