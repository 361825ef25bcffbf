/**
 * Stability of Hénon orbits whose monodromy leaves float64's range (issue 7 item 4): the n = 2
 * trace/determinant enclosure in scaled form (src/prove/stability.ts stability2Scaled) and the
 * checker's decimal re-derivation.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { orbitStability } from '../../src/prove/stability.js';
import { exactDecimalOfDouble } from '../../src/interval/mp-convert.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { certificateHash } from '../../src/checker/json.js';
import { henonNearReturn } from './fixtures.js';

const D40 = Decimal.clone({ precision: 40 });

describe('Hénon (a = 1.4, b = 0.3; Hénon 1976, Commun. Math. Phys. 50), monodromy past float64 range', () => {
  const map = getCatalogueMap('henon')!;
  const over = { a: { kind: 'exact' as const, value: '1.4' }, b: { kind: 'exact' as const, value: '0.3' } };
  const compiled = compileMap(map, over);
  it('period 5,000: a saddle, det = (−0.3)^5000 enclosed, |trace| beyond 2^1024, VERIFIED; a claimed "repelling" REJECTED', () => {
    const p = Number(process.env.HP ?? 5000);
    const t0 = Date.now();
    const v = proveOrbit(compiled, henonNearReturn(p));
    if (v.status !== 'proven') throw new Error(`${v.reason}: ${v.detail}`);
    const o = v.orbit;
    expect(o.minimalPeriod).toBe(p);
    expect(o.stability.class).toBe('saddle');
    // det Df = −b at every point, so det M = (−0.3)^p (closed form: common practice, no source)
    const det = new D40('-0.3').pow(p);
    const [dl, dh] = o.stability.determinant!;
    expect(det.gte(dl) && det.lte(dh)).toBe(true);
    // printed as a scaled enclosure, not as ±1e-300 (issue 7 item 7): same sign, relatively tight
    expect(new D40(dl).s).toBe(new D40(dh).s);
    expect(new D40(dh).sub(dl).abs().lte(det.abs().mul('1e-6'))).toBe(true);
    // the float product overflows: |T| > 2^1024 (it is ≈ |λ_u|^p)
    const [tl, th] = o.stability.trace!;
    const tmin = Decimal.min(new D40(tl).abs(), new D40(th).abs());
    expect(new D40(tl).s).toBe(new D40(th).s);
    expect(tmin.gt(new D40(2).pow(1024))).toBe(true);
    // moduli: the small one is |det|/|big| ≤ 1, the big one |T|-sized
    const [small, big] = o.stability.eigenvalueModuli!;
    expect(new D40(small![1]).lt(1) && new D40(big![0]).gt(new D40(2).pow(1024))).toBe(true);
    // the small modulus too: |λ_s| = |det|/|λ_u| enclosed away from 0, tight (not [0, 1e-300])
    expect(new D40(small![0]).gt(0)).toBe(true);
    expect(new D40(small![1]).sub(small![0]).lte(new D40(small![0]).mul('1e-6'))).toBe(true);
    const cert = buildCertificate(o, map, { overrides: over });
    const rep = checkCertificate(JSON.parse(JSON.stringify(cert)));
    expect(rep.reason).toBeUndefined();
    expect(rep.verdict).toBe('VERIFIED');
    expect(rep.claimsVerified).toContain('stability');
    // tamper: claim "repelling" (hash recomputed, so only the mathematics can object)
    const doc = JSON.parse(JSON.stringify(cert));
    doc.claims.stability.class = 'repelling';
    delete doc.sha256;
    doc.sha256 = certificateHash(doc);
    const bad = checkCertificate(doc);
    expect(bad.verdict).toBe('REJECTED');
    expect(String(bad.reason)).toMatch(/derives "saddle"/);
    console.log(`henon p=${p} prove+check ${Date.now() - t0} ms`);
  }, 180_000); // ~30 s on a quiet 2-core machine; 80 s seen with 8 builds running
});

describe('orbitStability n = 2, scaled (float64) path: containment vs decimal.js', () => {
  const a = intervalArithmetic();
  const DX = Decimal.clone({ precision: 2000, maxE: 9e15, minE: -9e15 });
  it('trace and determinant of products of up to 400 random 2×2 blocks (beyond float64 range) are enclosed', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true })), { minLength: 1, maxLength: 400 }),
        (bs) => {
          const blocks = bs.flatMap((b) => b.map((x) => a.fromNumber(x)));
          const st = orbitStability(a, blocks, bs.length, 2);
          let m = [new DX(1), new DX(0), new DX(0), new DX(1)];
          // the reference multiplies the EXACT values of the doubles (a subnormal such as 2.5e-323 is
          // really 5·2^-1074 = 2.4703…e-323; its shortest decimal string is not its value)
          for (const [p, q, r, s] of bs.map((b) => b.map((x) => exactDecimalOfDouble(x)))) {
            m = [
              m[0]!.mul(p).add(m[2]!.mul(q)), m[1]!.mul(p).add(m[3]!.mul(q)),
              m[0]!.mul(r).add(m[2]!.mul(s)), m[1]!.mul(r).add(m[3]!.mul(s)),
            ];
          }
          const tr = m[0]!.add(m[3]!);
          const det = m[0]!.mul(m[3]!).sub(m[1]!.mul(m[2]!));
          if (st.trace === undefined) return st.class === 'undecided';
          const inside = (x: Decimal, pr: [string, string]) => x.gte(new DX(pr[0])) && x.lte(new DX(pr[1]));
          return inside(tr, st.trace) && inside(det, st.determinant!);
        },
      ),
      { numRuns: 60 },
    );
  }, 60_000);
});
