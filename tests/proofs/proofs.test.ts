/**
 * The committed certificates in proofs/ (see proofs/README.md) are re-checked on every CI run with
 * the independent checker, so a change to the checker, the certificate format or the map language
 * that breaks an old proof fails the build. Beyond VERIFIED, the stability enclosures written in
 * the files must contain closed-form values computed here with decimal.js (120 digits), so the
 * files also agree with mathematics from outside the project.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { certificateHash, checkCertificate, checkPaths } from '../../src/checker/index.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '../..');
const proofsDir = join(root, 'proofs');
const D = Decimal.clone({ precision: 120 });

/** Every *.json below proofs/, as a path relative to proofs/ with '/' separators. */
function listCertificates(dir: string): string[] {
  const out: string[] = [];
  for (const ent of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, ent.name);
    if (ent.isDirectory()) out.push(...listCertificates(p));
    else if (ent.name.endsWith('.json')) out.push(relative(proofsDir, p).split(sep).join('/'));
  }
  return out.sort();
}

type Iv = [string, string];
interface Stability {
  class: string;
  multiplier?: Iv;
  trace?: Iv;
  determinant?: Iv;
}
const readCert = (rel: string) =>
  JSON.parse(readFileSync(join(proofsDir, rel), 'utf8')) as { period: number; claims: { stability: Stability } };

/** Strict containment lo < v < hi (v is computed to 120 digits, far tighter than any enclosure here). */
const strictlyContains = (iv: Iv | undefined, v: Decimal): boolean =>
  iv !== undefined && new D(iv[0]).lt(v) && v.lt(new D(iv[1]));
/** Contains every value of [a, b]. */
const containsRange = (iv: Iv | undefined, a: Decimal, b: Decimal): boolean =>
  iv !== undefined && new D(iv[0]).lte(a) && b.lte(new D(iv[1]));

const d = (s: string) => new D(s);
const sqrt = (s: string) => new D(s).sqrt();

describe('committed proofs/ certificates', () => {
  const files = listCertificates(proofsDir);

  it('at least 15 certificates are committed (proofs/README.md lists them)', () => {
    expect(files.length).toBeGreaterThanOrEqual(15);
  });

  it('they stay small: under 2 MB in all (the period-200 Hénon orbit is the largest, ~60 KB)', () => {
    const bytes = files.reduce((sum, rel) => sum + statSync(join(proofsDir, rel)).size, 0);
    expect(bytes).toBeLessThan(2_000_000);
  });

  it('the independent checker VERIFIES every one of them, with every claim re-derived', () => {
    const reports = checkPaths([proofsDir]);
    expect(reports.length).toBe(files.length);
    const bad = reports.filter((r) => r.verdict !== 'VERIFIED').map((r) => `${r.file}: ${r.verdict} ${r.reason ?? ''}`);
    expect(bad).toEqual([]);
    for (const r of reports) {
      expect(r.claimsVerified).toEqual(expect.arrayContaining(['existence', 'uniqueness', 'minimal-period', 'stability']));
    }
  });

  it('a certificate whose multiplier enclosure was moved off the true value, hash recomputed, is REJECTED (the check above can fail)', () => {
    const text = readFileSync(join(proofsDir, 'logistic/r3.2/logistic-map-p2-1.json'), 'utf8');
    const cert = JSON.parse(text) as Record<string, unknown> & { claims: { stability: { multiplier: Iv } } };
    expect(checkCertificate(cert).verdict).toBe('VERIFIED');
    // The true multiplier is 0.16 (closed form, below); [0.17, 0.18] is a false claim.
    cert.claims.stability.multiplier = ['0.17', '0.18'];
    cert.sha256 = certificateHash(cert);
    const report = checkCertificate(cert);
    expect(report.verdict).toBe('REJECTED');
    expect(report.reason ?? '').not.toMatch(/hash|sha/i);
  });

  // Closed forms, all derived by hand (sources in each comment). For the logistic family
  // f(x) = r x (1 − x): f'(x) = r(1 − 2x); fixed points 0 (Λ = r) and 1 − 1/r (Λ = 2 − r);
  // the period-2 orbit has Λ = 4 + 2r − r² (May 1976, Nature 261, and derived by hand).
  // r = 4: conjugate to the doubling map, so every period-p orbit has |Λ| = 2^p (closed form,
  // derived by hand: the conjugacy x = sin²(πθ) cancels along a cycle).
  // Hénon-type maps (x, y) ↦ (1 − a x² + y, b x): det Df = −b, so det M = (−b)^p (Hénon 1976,
  // Commun. Math. Phys. 50); fixed points have trace −2a x* = (1 − b) ∓ √((1 − b)² + 4a); the
  // period-2 orbit has x0 + x1 = (1 − b)/a, x0·x1 = ((1 − b)² − a)/a², trace 4((1 − b)² − a) + 2b
  // (derived by hand).
  const logisticPeriod2 = (r: string) => d('4').plus(d(r).times(2)).minus(d(r).pow(2));
  const multiplierCases: [string, Decimal][] = [
    ['logistic/r3.83/logistic-map-p1-1.json', d('3.83')],
    ['logistic/r3.83/logistic-map-p1-2.json', d('-1.83')],
    ['logistic/r3.2/logistic-map-p2-1.json', logisticPeriod2('3.2')], // 0.16
    ['examples/meadow-beetle-census-p1-1.json', d('3.2')],
    ['examples/meadow-beetle-census-p1-2.json', d('-1.2')],
    ['examples/meadow-beetle-census-p2-1.json', logisticPeriod2('3.2')],
    // The moth census N' = rN(1 − N/K) is the logistic map rescaled by K (same multipliers).
    ['demo/orchard-moth-census-p1-1.json', d('3.83')],
    ['demo/orchard-moth-census-p1-2.json', d('-1.83')],
  ];
  it.each(multiplierCases)('%s: the multiplier enclosure contains the closed form', (rel, value) => {
    expect(strictlyContains(readCert(rel).claims.stability.multiplier, value)).toBe(true);
  });

  it.each(['logistic/r4/logistic-map-p10-1.json', 'logistic/r4/logistic-map-p50-1.json', 'logistic/r4/logistic-map-p100-1.json'])(
    '%s: |Λ| = 2^p for r = 4',
    (rel) => {
      const c = readCert(rel);
      const m = c.claims.stability.multiplier!;
      const twoP = d('2').pow(c.period);
      const abs: Iv = new D(m[0]).isNegative() ? [new D(m[1]).neg().toString(), new D(m[0]).neg().toString()] : m;
      expect(strictlyContains(abs, twoP)).toBe(true);
    },
  );

  it('logistic/r4/near-critical/logistic-map-p50-1.json: Λ ∋ +2^50, x0 ∋ sin²(π/(2^50 − 1)), proven above 53 bits', () => {
    // r = 4 is conjugate to θ ↦ 2θ mod 1 by x = sin²(πθ); θ = 1/(2^50 − 1) has period 50 and the
    // multiplier is +2^50 (closed form, derived by hand). Written by `prove --start` (proofs/README.md).
    const rel = 'logistic/r4/near-critical/logistic-map-p50-1.json';
    const c = JSON.parse(readFileSync(join(proofsDir, rel), 'utf8')) as {
      period: number;
      orbit: { boxes: Iv[][] };
      hints: { bits: number };
      claims: { stability: Stability };
    };
    expect(c.period).toBe(50);
    expect(strictlyContains(c.claims.stability.multiplier, d('2').pow(50))).toBe(true);
    const x0 = D.sin(D.acos(-1).div(d('2').pow(50).minus(1))).pow(2);
    expect(strictlyContains(c.orbit.boxes[0]![0], x0)).toBe(true);
    expect(c.hints.bits).toBeGreaterThan(53);
  });

  it('harvested fishery: for every h in [0.10, 0.12] the multipliers r − h (x = 0) and 2 + h − r lie in the enclosures', () => {
    const zero = readCert('examples/harvested-fishery-p1-1.json').claims.stability.multiplier;
    const inner = readCert('examples/harvested-fishery-p1-2.json').claims.stability.multiplier;
    expect(containsRange(zero, d('2.48'), d('2.5'))).toBe(true);
    expect(containsRange(inner, d('-0.5'), d('-0.48'))).toBe(true);
  });

  const henonFixedTrace = (a: string, b: string, sign: 1 | -1) => {
    const oneMinusB = d('1').minus(d(b));
    const root = oneMinusB.pow(2).plus(d(a).times(4)).sqrt();
    return sign > 0 ? oneMinusB.plus(root) : oneMinusB.minus(root);
  };
  const henonPeriod2Trace = (a: string, b: string) => d('1').minus(d(b)).pow(2).minus(d(a)).times(4).plus(d(b).times(2));
  // [file, determinant (−b)^p, trace or undefined]
  const planarCases: [string, Decimal, Decimal | undefined][] = [
    ['henon/henon-map-p1-1.json', d('-0.3'), henonFixedTrace('1.4', '0.3', 1)], // x* < 0
    ['henon/henon-map-p1-2.json', d('-0.3'), henonFixedTrace('1.4', '0.3', -1)],
    ['henon/henon-map-p2-1.json', d('0.09'), henonPeriod2Trace('1.4', '0.3')], // −3.04
    ['henon/henon-map-p200-1.json', d('0.3').pow(200), undefined],
    ['demo/alpine-vole-two-season-model-p1-1.json', d('-0.3'), henonFixedTrace('0.6', '0.3', 1)],
    ['demo/alpine-vole-two-season-model-p1-2.json', d('-0.3'), henonFixedTrace('0.6', '0.3', -1)],
    ['demo/alpine-vole-two-season-model-p2-1.json', d('0.09'), henonPeriod2Trace('0.6', '0.3')],
    // Two-commodity market (p, q) ↦ (c − p² + s q, p): det = −s, trace −2p* = 0.6 ∓ √5.56 (examples/ header).
    ['examples/two-commodity-market-p1-1.json', d('-0.4'), d('0.6').plus(sqrt('5.56'))],
    ['examples/two-commodity-market-p1-2.json', d('-0.4'), d('0.6').minus(sqrt('5.56'))],
  ];
  it.each(planarCases)('%s: determinant and trace enclosures contain the closed forms', (rel, det, trace) => {
    const s = readCert(rel).claims.stability;
    expect(strictlyContains(s.determinant, det)).toBe(true);
    if (trace !== undefined) expect(strictlyContains(s.trace, trace)).toBe(true);
  });

  it('every certificate named in this test exists (a renamed file must be renamed here too)', () => {
    const named = [
      ...multiplierCases.map((c) => c[0]),
      ...planarCases.map((c) => c[0]),
      'examples/harvested-fishery-p1-1.json',
      'examples/harvested-fishery-p1-2.json',
    ];
    for (const n of named) expect(files).toContain(n);
  });
});
