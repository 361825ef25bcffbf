/**
 * The structured (cyclic) Krawczyk bound of dimension 1 (src/prove/cyclic.ts) and long orbits
 * (issue 7 item 4): containment of the magnitude bound against decimal.js, and logistic r = 4
 * orbits past the old dense limit whose points and multiplier are known in closed form.
 */
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cyclicMagnitudeBound, cyclicSolveFloat } from '../../src/prove/cyclic.js';
import { divUp, mulUp } from '../../src/interval/round.js';
import { exactDecimalOfDouble } from '../../src/interval/mp-convert.js';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { balancedWord, henonNearReturn, logistic4Orbit, toDouble, wordToNumerator } from './fixtures.js';

const D80 = Decimal.clone({ precision: 80 });

/** Exact-ish (80 digits) solution of δ_{i+1} = a_i δ_i + r_i (cyclic) by the closed form. */
function solveCyclic(a: number[], r: number[]): Decimal[] {
  const p = a.length;
  // δ_0 = (Σ_j (Π_{k>j} a_k) r_j) / (1 − Π a_k), then forward
  let acc = new D80(0);
  let prod = new D80(1);
  // the EXACT values of the doubles (a double's shortest string is not its value)
  const A = a.map((x) => new D80(exactDecimalOfDouble(x)));
  const R = r.map((x) => new D80(exactDecimalOfDouble(x)));
  for (let j = 0; j < p; j++) {
    acc = acc.mul(A[j]!).add(R[j]!);
    prod = prod.mul(A[j]!);
  }
  let d = acc.div(new D80(1).sub(prod));
  const out: Decimal[] = [];
  for (let i = 0; i < p; i++) {
    out.push(d);
    d = d.mul(A[i]!).add(R[i]!);
  }
  return out;
}

describe('cyclicMagnitudeBound: |δ_i| ≤ u_i for every r with |r_i| ≤ g_i (containment vs decimal.js)', () => {
  const plan = (a: number[]) => {
    const s = a.reduce((t, x) => t + Math.log2(Math.abs(x)), 0);
    const direction = s > 0 ? ('back' as const) : ('forward' as const);
    const absA = Float64Array.from(a, Math.abs);
    const invAbsUp = Float64Array.from(a, (x) => divUp(1, Math.abs(x)));
    let closure = 1;
    for (let i = 0; i < a.length; i++) closure = mulUp(closure, direction === 'back' ? invAbsUp[i]! : absA[i]!);
    return { absA, invAbsUp, direction, closure };
  };
  it('random diagonals (expanding and contracting), random residuals inside ±g', () => {
    const diag = fc.double({ min: 0.05, max: 6, noNaN: true }).chain((m) => fc.constantFrom(m, -m));
    fc.assert(
      fc.property(
        fc.array(fc.tuple(diag, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true })), { minLength: 1, maxLength: 40 }),
        (rows) => {
          const a = rows.map((r) => r[0]);
          const pl = plan(a);
          fc.pre(pl.closure < 0.999);
          const g = Float64Array.from(rows, (r) => r[1]);
          const r = rows.map((x) => x[1] * x[2]);
          const u = new Float64Array(a.length);
          expect(cyclicMagnitudeBound(pl, g, u)).toBe(true);
          const delta = solveCyclic(a, r);
          delta.forEach((d, i) => expect(d.abs().lte(exactDecimalOfDouble(u[i]!))).toBe(true));
        },
      ),
      { numRuns: 300 },
    );
  });
  it('the float solve is a solve (heuristic part, sanity): residual small for an expanding cycle', () => {
    const a = Float64Array.from([2.5, -3, 1.5, 4]);
    const c = Float64Array.from([1, -2, 0.5, 3]);
    const z = new Float64Array(4);
    expect(cyclicSolveFloat(a, c, 'back', z)).toBe(true);
    for (let i = 0; i < 4; i++) expect(Math.abs(z[(i + 1) % 4]! - a[i]! * z[i]! - c[i]!)).toBeLessThan(1e-12);
  });
});

describe('long orbits of 4x(1 − x) past the old dense limit (conjugacy with the doubling map, derived by hand)', () => {
  const map = getCatalogueMap('logistic')!;
  const compiled = compileMap(map, { r: { kind: 'exact', value: '4' } });
  it('period 1,500: boxes contain sin²(π 2^j k/(2^p − 1)), |Λ| contains 2^1500 (beyond float64), checker VERIFIED', () => {
    const p = 1500;
    const w = balancedWord(p, 3);
    const xs = logistic4Orbit(wordToNumerator(w), p, false, 25);
    const v = proveOrbit(compiled, xs.map((x) => [toDouble(x)]));
    if (v.status !== 'proven') throw new Error(`${v.reason}: ${v.detail}`);
    const o = v.orbit;
    for (let i = 0; i < p; i++) {
      const [lo, hi] = o.boxes[i]![0]!;
      expect(xs[i]!.gte(lo) && xs[i]!.lte(hi)).toBe(true);
    }
    // Λ = Π (4 − 8x_i) = ±2^p for every periodic orbit inside (0, 1) (derived by hand)
    const [lo, hi] = o.stability.multiplier!;
    const two = new D80(2).pow(p);
    expect(two.gte(lo) && two.lte(hi) || two.neg().gte(lo) && two.neg().lte(hi)).toBe(true);
    expect(new D80(hi).sub(lo).abs().div(two).lt(1e-8)).toBe(true); // log2|Λ| within ±1e-8 (reports are widened by 2^-30)
    expect(o.stability.class).toBe('repelling');
    expect(o.minimalPeriod).toBe(p);
    const cert = buildCertificate(o, map, { overrides: { r: { kind: 'exact', value: '4' } } });
    const rep = checkCertificate(JSON.parse(JSON.stringify(cert)));
    expect(rep.reason).toBeUndefined();
    expect(rep.verdict).toBe('VERIFIED');
    expect(rep.claimsVerified).toEqual(['existence', 'uniqueness', 'minimal-period', 'stability']);
  }, 30_000);
});

describe('Hénon (a = 1.4, b = 0.3; Hénon 1976, Commun. Math. Phys. 50) with the structured 2-D bound', () => {
  const map = getCatalogueMap('henon')!;
  const over = { a: { kind: 'exact' as const, value: '1.4' }, b: { kind: 'exact' as const, value: '0.3' } };
  const compiled = compileMap(map, over);
  it('period 150 (300 unknowns) from a close return: proven, a saddle, det = (−0.3)^150 enclosed, VERIFIED; a moved box REJECTED', async () => {
    const p = 150;
    const v = proveOrbit(compiled, henonNearReturn(p));
    if (v.status !== 'proven') throw new Error(`${v.reason}: ${v.detail}`);
    const o = v.orbit;
    expect(o.minimalPeriod).toBe(p);
    expect(o.stability.class).toBe('saddle');
    // det Df = −b at every point, so det M = (−0.3)^p (derived by hand)
    const det = new D80('-0.3').pow(p);
    const [dl, dh] = o.stability.determinant!;
    expect(det.gte(dl) && det.lte(dh)).toBe(true);
    const cert = buildCertificate(o, map, { overrides: over });
    const doc = JSON.parse(JSON.stringify(cert));
    const rep = checkCertificate(doc);
    expect(rep.reason).toBeUndefined();
    expect(rep.verdict).toBe('VERIFIED');
    // tamper: move box 70 by twice its width (the hash is recomputed, so only the mathematics can object)
    const b = doc.orbit.boxes[70][0];
    const w = new D80(b[1]).sub(b[0]).mul(2);
    doc.orbit.boxes[70][0] = [new D80(b[0]).add(w).toString(), new D80(b[1]).add(w).toString()];
    doc.orbit.centre[70][0] = new D80(doc.orbit.centre[70][0]).add(w).toString();
    delete doc.sha256;
    const { certificateHash } = await import('../../src/checker/json.js');
    doc.sha256 = certificateHash(doc);
    expect(checkCertificate(doc).verdict).toBe('REJECTED');
  }, 60_000);
});
