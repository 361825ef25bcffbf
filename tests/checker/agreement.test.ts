// Agreement (acceptance check): on a random sample of maps, whenever the prover proves an orbit
// and the independent checker VERIFIES its certificate, both enclosures (the certificate's boxes
// and stability enclosures) contain the same orbit computed independently here, in decimal.js at
// 80 significant digits (60+ correct digits) by Newton on g(x) = f^p(x) − x.
//
// Maps: logistic x' = r·x·(1 − x) (May 1976, Nature 261), r ∈ [2.6, 4], period 1..4;
// Hénon (x, y)' = (1 − a·x² + y, b·x) (Hénon 1976, Commun. Math. Phys. 50), a ∈ [1.0, 1.4],
// b ∈ [0.1, 0.3], period 1..2. Parameters are exact decimal strings throughout.
// Newton at 60 digits as a reference value: common practice, no source.
// The derivatives (chain rule) are written by hand below; nothing of the prover's or checker's
// arithmetic is used for the reference.
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import type { CertificateV1 } from '../../src/certificate/types.js';
import { checkCertificate } from '../../src/checker/index.js';
import { compileMap } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { findCandidates } from '../../src/search/index.js';

const counts = { provenVerified: 0, notProven: 0, rejected: 0, noCandidate: 0, multiplierChecks: 0, traceDetChecks: 0 };

/** 4-digit exact decimal string of the integer m / 10000 (m ≥ 0), e.g. 38271 → "3.8271". */
function dec4(m: number): string {
  const s = String(m).padStart(5, '0');
  return `${s.slice(0, -4)}.${s.slice(-4)}`;
}

/** Decimal context with enough digits for the certificate's narrowest box (at least 80). */
function contextFor(cert: CertificateV1): typeof Decimal {
  let minExp = 0;
  for (const pt of cert.orbit.boxes) {
    for (const [lo, hi] of pt) {
      const w = new Decimal(hi).minus(new Decimal(lo));
      if (!w.isZero()) minExp = Math.min(minExp, w.e);
    }
  }
  return Decimal.clone({ precision: Math.max(80, 40 - minExp) });
}

const inBox = (D: typeof Decimal, x: Decimal, iv: readonly [string, string]): boolean =>
  new D(iv[0]).lte(x) && x.lte(new D(iv[1]));

const contains = (D: typeof Decimal, iv: readonly [string, string] | null | undefined, x: Decimal, what: string): void => {
  expect(iv, `${what}: enclosure missing`).toBeTruthy();
  expect(inBox(D, x, iv!), `${what} = ${x.toSignificantDigits(30).toString()} not in [${iv![0]}, ${iv![1]}]`).toBe(true);
};

/** Prove, certify and check every candidate (up to 3); returns the verified certificates. */
function proveAndCheck(def: MapDefinition, period: number): CertificateV1[] {
  const map = compileMap(def);
  const cands = findCandidates(map, { period }).slice(0, 3);
  if (cands.length === 0) counts.noCandidate++;
  const out: CertificateV1[] = [];
  for (const cand of cands) {
    const v = proveOrbit(map, cand.points);
    if (v.status !== 'proven') {
      counts.notProven++;
      continue;
    }
    const cert = buildCertificate(v.orbit, def);
    const rep = checkCertificate(JSON.stringify(cert));
    if (rep.verdict !== 'VERIFIED') counts.rejected++;
    expect(rep.verdict, `checker rejected a prover certificate: ${rep.reason ?? ''} ${rep.path ?? ''}`).toBe('VERIFIED');
    counts.provenVerified++;
    out.push(cert);
  }
  return out;
}

// ---- logistic, n = 1 ----

function logisticAgreement(rStr: string, cert: CertificateV1): void {
  const D = contextFor(cert);
  const tol = new D(10).pow(-(D.precision - 20)); // ≤ 1e-60
  const r = new D(rStr); // exact decimal string, never a JS number
  const p = cert.period;
  const f = (x: Decimal): Decimal => r.times(x).times(new D(1).minus(x));
  const df = (x: Decimal): Decimal => r.times(new D(1).minus(x.times(2))); // f'(x) = r(1 − 2x), by hand
  let x = new D(cert.orbit.centre[0]![0]!);
  let converged = false;
  for (let it = 0; it < 100 && !converged; it++) {
    let y = x;
    let d = new D(1);
    for (let i = 0; i < p; i++) {
      d = d.times(df(y));
      y = f(y);
    }
    const step = y.minus(x).div(d.minus(1)); // g(x)/g'(x), g = f^p − id, g' = Π f'(x_i) − 1
    x = x.minus(step);
    converged = step.abs().lt(tol);
  }
  expect(converged, `Newton did not converge for r = ${rStr}, p = ${p}`).toBe(true);
  let y = x;
  let mult = new D(1);
  for (let i = 0; i < p; i++) {
    expect(inBox(D, y, cert.orbit.boxes[i]![0]!), `r = ${rStr}, p = ${p}: x_${i} = ${y.toSignificantDigits(30).toString()} not in box ${i} ${JSON.stringify(cert.orbit.boxes[i])}`).toBe(true);
    mult = mult.times(df(y));
    y = f(y);
  }
  expect(y.minus(x).abs().lt(tol.times(1e6)), 'the reference orbit does not close').toBe(true);
  const st = cert.claims.stability;
  if (st.class !== 'undecided' || st.multiplier) {
    contains(D, st.multiplier, mult, `r = ${rStr}, p = ${p}: multiplier`);
    counts.multiplierChecks++;
  }
}

// ---- Hénon, n = 2 ----

function henonAgreement(aStr: string, bStr: string, cert: CertificateV1): void {
  const D = contextFor(cert);
  const tol = new D(10).pow(-(D.precision - 20));
  const a = new D(aStr);
  const b = new D(bStr);
  const p = cert.period;
  const f = (x: Decimal, y: Decimal): [Decimal, Decimal] => [new D(1).minus(a.times(x).times(x)).plus(y), b.times(x)];
  /** f^p and the monodromy M = Df(x_{p−1})···Df(x_0), Df(x, y) = [[−2a x, 1], [b, 0]] (by hand). */
  const orbitAndMonodromy = (x0: Decimal, y0: Decimal) => {
    let x = x0;
    let y = y0;
    let m = [new D(1), new D(0), new D(0), new D(1)]; // row-major 2×2
    for (let i = 0; i < p; i++) {
      const j00 = a.times(x).times(-2);
      // Df · m with Df = [[j00, 1], [b, 0]]
      m = [j00.times(m[0]!).plus(m[2]!), j00.times(m[1]!).plus(m[3]!), b.times(m[0]!), b.times(m[1]!)];
      [x, y] = f(x, y);
    }
    return { x, y, m };
  };
  let x = new D(cert.orbit.centre[0]![0]!);
  let y = new D(cert.orbit.centre[0]![1]!);
  let converged = false;
  for (let it = 0; it < 100 && !converged; it++) {
    const o = orbitAndMonodromy(x, y);
    // Solve (M − I) δ = (f^p − id)(x, y) by Cramer's rule; then (x, y) −= δ.
    const g0 = o.x.minus(x);
    const g1 = o.y.minus(y);
    const A = o.m[0]!.minus(1);
    const B = o.m[1]!;
    const C = o.m[2]!;
    const E = o.m[3]!.minus(1);
    const det = A.times(E).minus(B.times(C));
    const d0 = g0.times(E).minus(B.times(g1)).div(det);
    const d1 = A.times(g1).minus(C.times(g0)).div(det);
    x = x.minus(d0);
    y = y.minus(d1);
    converged = Decimal.max(d0.abs(), d1.abs()).lt(tol);
  }
  expect(converged, `Newton did not converge for a = ${aStr}, b = ${bStr}, p = ${p}`).toBe(true);
  let px = x;
  let py = y;
  for (let i = 0; i < p; i++) {
    const box = cert.orbit.boxes[i]!;
    const where = `a = ${aStr}, b = ${bStr}, p = ${p}: point ${i} (${px.toSignificantDigits(30).toString()}, ${py.toSignificantDigits(30).toString()})`;
    expect(inBox(D, px, box[0]!) && inBox(D, py, box[1]!), `${where} not in box ${JSON.stringify(box)}`).toBe(true);
    [px, py] = f(px, py);
  }
  expect(Decimal.max(px.minus(x).abs(), py.minus(y).abs()).lt(tol.times(1e6)), 'the reference orbit does not close').toBe(true);
  const { m } = orbitAndMonodromy(x, y);
  const st = cert.claims.stability;
  if (st.class !== 'undecided' || st.trace || st.determinant) {
    // det M = Π det Df = (−b)^p exactly (closed form, derived by hand).
    const detExact = b.neg().pow(p);
    expect(m[0]!.times(m[3]!).minus(m[1]!.times(m[2]!)).minus(detExact).abs().lt(tol.times(1e6)), 'det M ≠ (−b)^p').toBe(true);
    contains(D, st.determinant, detExact, `a = ${aStr}, b = ${bStr}, p = ${p}: determinant`);
    contains(D, st.trace, m[0]!.plus(m[3]!), `a = ${aStr}, b = ${bStr}, p = ${p}: trace`);
    counts.traceDetChecks++;
  }
}

describe('agreement: prover boxes, checker verdict and a 60-digit reference orbit', () => {
  it('logistic r ∈ [2.6, 4], period 1..4 (May 1976, Nature 261)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 14000 }), fc.integer({ min: 1, max: 4 }), (k, period) => {
        const r = dec4(26000 + k);
        const def: MapDefinition = {
          title: 'logistic', state: ['x'], params: { r: { kind: 'exact', value: r } },
          step: { x: 'r*x*(1 - x)' }, region: { x: ['0', '1'] },
        };
        for (const cert of proveAndCheck(def, period)) logisticAgreement(r, cert);
      }),
      { numRuns: 30 },
    );
  }, 60_000);

  it('Hénon a ∈ [1.0, 1.4], b ∈ [0.1, 0.3], period 1..2 (Hénon 1976, Commun. Math. Phys. 50)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 4000 }), fc.integer({ min: 0, max: 2000 }), fc.integer({ min: 1, max: 2 }), (ka, kb, period) => {
        const a = dec4(10000 + ka);
        const b = dec4(1000 + kb);
        const def: MapDefinition = {
          title: 'Hénon', state: ['x', 'y'], params: { a: { kind: 'exact', value: a }, b: { kind: 'exact', value: b } },
          step: { x: '1 - a*x^2 + y', y: 'b*x' }, region: { x: ['-2', '2'], y: ['-1', '1'] },
        };
        for (const cert of proveAndCheck(def, period)) henonAgreement(a, b, cert);
      }),
      { numRuns: 25 },
    );
  }, 60_000);

  it('enough cases were proven and verified, none rejected', () => {
    console.log(`agreement counts: ${JSON.stringify(counts)}`);
    expect(counts.rejected).toBe(0);
    expect(counts.provenVerified).toBeGreaterThanOrEqual(10);
  });
});
