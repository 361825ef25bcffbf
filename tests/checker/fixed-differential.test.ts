// Differential test (issue 8 item 1): the checker with its fixed-point paths (fixed.ts,
// cyclic2-fixed.ts, formula-fixed.ts, stability-fixed.ts) and the decimal-only checker it had
// before give the same verdict, and the same reason, on prover certificates of Hénon orbits and
// on thousands of random mutations of them (boxes, centres, parameters, uniqueness radius,
// stability enclosures and class), each re-hashed so that the mathematics, not the hash, decides.
// Hénon map (x, y)' = (1 − a·x² + y, b·x) (Hénon 1976, Commun. Math. Phys. 50); the base
// certificates are the prover's, and each must be VERIFIED by both checkers (a check value
// outside the fixed-point code: the decimal checker, kept as the reference).
import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { buildCertificate } from '../../src/certificate/build.js';
import { checkCertificate } from '../../src/checker/index.js';
import { FixCtx, fixedPaths, fracBitsFor } from '../../src/checker/fixed.js';
import { certificateHash } from '../../src/checker/json.js';
import { compileMap } from '../../src/model/index.js';
import type { MapDefinition } from '../../src/model/types.js';
import { proveOrbit } from '../../src/prove/orbit.js';
import { findCandidates } from '../../src/search/index.js';
import { ivCtx } from '../../src/checker/elementary.js';
import { Evaluator, parseFormula } from '../../src/checker/formula.js';
import type { Iv } from '../../src/checker/interval.js';
import { stability, type FixedJacobians, type Shooting } from '../../src/checker/krawczyk.js';
import { prepareCyclic } from '../../src/checker/cyclic.js';
import { prepareCyclicFixed } from '../../src/checker/cyclic-fixed.js';
import { stability1Fixed } from '../../src/checker/stability-fixed.js';
import { logistic4Orbit, logistic4Primitive } from './certs.js';

type Cert = Record<string, unknown> & {
  map: { params: Record<string, string>; step: Record<string, string> };
  orbit: { centre: string[][]; boxes: [string, string][][] };
  claims: { uniqueness: { radius: string } | null; stability: Record<string, unknown> | null };
};

const H = Decimal.clone({ precision: 60 });
const bases: Cert[] = [];
const henonBases: Cert[] = [];
const logisticBases: Cert[] = [];

function logistic(r: string): MapDefinition {
  return { title: 'logistic', state: ['x'], step: { x: 'r*x*(1 - x)' }, region: { x: ['0', '1'] }, params: { r: { kind: 'exact', value: r } } };
}

function prove(def: MapDefinition, periods: readonly number[], into: Cert[]): void {
  const map = compileMap(def);
  for (const p of periods) {
    for (const cand of findCandidates(map, { period: p }).slice(0, 2)) {
      const v = proveOrbit(map, cand.points);
      if (v.status === 'proven') into.push(JSON.parse(JSON.stringify(buildCertificate(v.orbit, def))) as Cert);
    }
  }
}

function henon(a: string, b: string): MapDefinition {
  return {
    title: 'Hénon', state: ['x', 'y'], step: { x: '1 - a*x^2 + y', y: 'b*x' },
    region: { x: ['-3', '3'], y: ['-3', '3'] },
    params: { a: { kind: 'exact', value: a }, b: { kind: 'exact', value: b } },
  };
}

/** Verdict and reason of one certificate, with the fixed-point paths on or off. */
function run(cert: unknown, fixed: boolean): string {
  fixedPaths.enabled = fixed;
  const rep = checkCertificate(cert);
  return `${rep.verdict} ${rep.path ?? ''} ${rep.reason ?? ''}`;
}

function rehash(c: Cert): Cert {
  const { sha256: _, ...rest } = c;
  return { ...rest, sha256: certificateHash(rest) } as Cert;
}

beforeAll(() => {
  for (const [a, b, periods] of [['1.4', '0.3', [1, 2, 4, 6]], ['1.2', '0.2', [1, 2, 4]], ['1.05', '0.3', [1, 2]]] as const) {
    prove(henon(a, b), periods, henonBases);
  }
  // dimension 1, short periods (dense Krawczyk before, now the fixed-point structured bound first):
  // logistic x' = r·x·(1 − x) (May 1976, Nature 261)
  for (const r of ['3.83', '3.9', '4']) prove(logistic(r), [1, 2, 3, 5], logisticBases);
  bases.push(...henonBases, ...logisticBases);
}, 60_000);

afterEach(() => {
  fixedPaths.enabled = true;
});

describe('fixed-point checker paths vs the decimal-only checker', () => {
  it('every base certificate is VERIFIED by both, under equivalent formulas too (sin defers to decimal)', () => {
    expect(henonBases.length).toBeGreaterThanOrEqual(10);
    expect(logisticBases.length).toBeGreaterThanOrEqual(8);
    for (const base of logisticBases) {
      for (const x of ['r*x*(1 - x)', 'r*x - r*x^2', 'r*(x - sqr(x))', 'r*x*(1 - x) + 0*exp(x)']) {
        const cert = rehash({ ...base, map: { ...base.map, step: { x } } });
        const fast = run(cert, true);
        expect(fast, x).toMatch(/^VERIFIED/);
        expect(run(cert, false), x).toBe(fast);
      }
    }
    const forms = ['1 - a*x^2 + y', '1 - a*x*x + y', '1 - a*sqr(x) + y', '1 + y - a*pow(x, 2)', '(2 - 2*a*x^2 + 2*y)/2', '1 - a*x^2 + y + 0*sin(x)'];
    // a/x^-2 encloses a·x² more loosely (division by an interval): a verdict either way, the same from both
    for (const base of henonBases) {
      for (const x of [...forms, '1 - a/x^-2 + y']) {
        const cert = rehash({ ...base, map: { ...base.map, step: { ...base.map.step, x } } });
        const fast = run(cert, true);
        if (forms.includes(x)) expect(fast, x).toMatch(/^VERIFIED/);
        expect(run(cert, false), x).toBe(fast);
      }
    }
  });

  it('thousands of mutants get the same verdict and reason from both', () => {
    const factor = fc.constantFrom('1e-12', '1e-6', '0.001', '0.1', '0.49', '1', '2', '1000', '-1e-6', '-0.3', '-1');
    const mutation = fc.oneof(
      fc.record({ kind: fc.constant('box' as const), pt: fc.nat(), comp: fc.nat(1), end: fc.nat(1), f: factor }),
      fc.record({ kind: fc.constant('centre' as const), pt: fc.nat(), comp: fc.nat(1), f: factor }),
      fc.record({ kind: fc.constant('param' as const), name: fc.constantFrom('a', 'b'), f: fc.constantFrom('1e-30', '1e-20', '1e-16', '1e-13', '1e-10', '1e-6', '-1e-14') }),
      fc.record({ kind: fc.constant('radius' as const), f: fc.constantFrom('0.5', '2', '10', '1000', '1e6') }),
      fc.record({ kind: fc.constant('stability' as const), key: fc.constantFrom('trace', 'determinant', 'multiplier'), end: fc.nat(1), f: fc.constantFrom('1e-12', '1e-6', '0.01', '0.5', '-0.5') }),
      fc.record({ kind: fc.constant('class' as const), cls: fc.constantFrom('attracting', 'repelling', 'saddle', 'undecided') }),
    );
    let verified = 0;
    let total = 0;
    fc.assert(
      fc.property(fc.nat(), mutation, (which, m) => {
        const base = bases[which % bases.length]!;
        const c = structuredClone(base);
        const p = c.orbit.centre.length;
        const n = c.orbit.centre[0]!.length;
        if (m.kind === 'box') {
          const iv = c.orbit.boxes[m.pt % p]![m.comp % n]!;
          const w = new H(iv[1]).sub(iv[0]);
          iv[m.end] = new H(iv[m.end]!).add(w.mul(m.f)).toString();
        } else if (m.kind === 'centre') {
          const iv = c.orbit.boxes[m.pt % p]![m.comp % n]!;
          const w = new H(iv[1]).sub(iv[0]);
          c.orbit.centre[m.pt % p]![m.comp % n] = new H(c.orbit.centre[m.pt % p]![m.comp % n]!).add(w.mul(m.f)).toString();
        } else if (m.kind === 'param') {
          const name = m.name in c.map.params ? m.name : 'r';
          c.map.params[name] = new H(c.map.params[name]!).add(m.f).toString();
        } else if (m.kind === 'radius') {
          if (c.claims.uniqueness) c.claims.uniqueness.radius = new H(c.claims.uniqueness.radius).mul(m.f).toString();
        } else if (m.kind === 'stability') {
          const iv = c.claims.stability?.[m.key] as [string, string] | undefined;
          if (iv) {
            const w = new H(iv[1]).sub(iv[0]);
            iv[m.end] = new H(iv[m.end]).add(w.mul(m.f).mul(m.end === 0 ? 1 : -1)).toString();
          }
        } else if (c.claims.stability) c.claims.stability.class = m.cls;
        const cert = rehash(c);
        const fast = run(cert, true);
        const slow = run(cert, false);
        total++;
        if (fast.startsWith('VERIFIED')) verified++;
        expect(fast).toBe(slow);
      }),
      { numRuns: 800 },
    );
    // both outcomes occur in numbers: the comparison is not vacuous
    expect(verified).toBeGreaterThan(total / 5);
    expect(total - verified).toBeGreaterThan(total / 5);
  }, 120_000);
});

describe('dimension 1: the fixed-point structured bound vs the decimal one (cyclic.ts)', () => {
  it('same verdicts on logistic r = 4 orbits, unmutated and mutated; the multiplier encloses ±2^p', () => {
    // Check values: x_j = sin²(π 2^j k/(2^p − 1)) and |multiplier| = 2^p, from the conjugacy of
    // 4x(1 − x) with the doubling map (derived by hand, as in tests/checker/certs.ts).
    let fixedOk = 0;
    let decimalOk = 0;
    let runs = 0;
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 20 }), fc.bigInt({ min: 1n, max: (1n << 40n) - 2n }), fc.integer({ min: 12, max: 24 }), fc.integer({ min: 0, max: 4 }), fc.nat(), (p, kRaw, radExp, mutation, where) => {
        const kk = kRaw % ((1n << BigInt(p)) - 1n);
        fc.pre(kk > 0n && logistic4Primitive(p, kk));
        const c = ivCtx(30);
        const s: Shooting = { c, ev: new Evaluator(c, new Map([['r', c.literal('4')]])), step: [parseFormula('r*x*(1-x)', ['x'], new Set(['r']))], p, n: 1 };
        const pts = logistic4Orbit(p, kk, 40).map((x) => x[0]!);
        fc.pre(pts.every((x) => new H(4).sub(new H(8).mul(x)).abs().gt(0.01)));
        const rad = new H(`1e-${radExp}`);
        const i = where % p;
        // 0 none; 1 box i shifted off its point; 2 box i shrunk to exclude it; 3 centre i moved; 4 all shifted
        const X: Iv[] = pts.map((x, j) => {
          let lo = new H(x).sub(rad);
          let hi = new H(x).add(rad);
          if ((mutation === 1 && j === i) || mutation === 4) [lo, hi] = [lo.add(rad.mul(3)), hi.add(rad.mul(3))];
          if (mutation === 2 && j === i) lo = new H(x).add(rad.div(10));
          return c.literal(lo.toString(), hi.toString());
        });
        const M = pts.map((x, j) => c.literal(mutation === 3 && j === i ? new H(x).add(rad.div(2)).toString() : x));
        const fixed = prepareCyclicFixed(s, M)(X, X);
        const decimal = prepareCyclic(s, M)(X, X, 'existence');
        runs++;
        if (fixed) fixedOk++;
        if (decimal.ok) decimalOk++;
        // the fixed-point path never shows what the decimal path cannot (verdicts cannot change)
        expect(fixed === null || decimal.ok).toBe(true);
        if (fixed && mutation === 0) {
          const st = stability1Fixed(c, (fixed as { fixedJacobians: FixedJacobians }).fixedJacobians)!;
          const two = new H(2).pow(p);
          expect(st.multiplier!.lo.abs().lte(two) || st.multiplier!.hi.abs().lte(two)).toBe(true);
          expect(c.abs(st.multiplier!).lo.lte(two) && c.abs(st.multiplier!).hi.gte(two)).toBe(true);
          expect(st.cls).toBe('repelling');
        }
      }),
      { numRuns: 150 },
    );
    // the fixed-point path decides (almost) everything the decimal path decides, and something
    expect(fixedOk).toBeGreaterThan(runs / 5);
    expect(fixedOk).toBeGreaterThanOrEqual(decimalOk * 0.95);
  }, 60_000);
});

describe('scaled fixed-point products far outside float64 range', () => {
  it('multipliers 2^±5000 and 3^4000 are enclosed (closed forms), as by the decimal product', () => {
    // Check values: Π of p equal derivatives d is d^p exactly (common practice, no source).
    const c = ivCtx(30);
    const k = new FixCtx(fracBitsFor(30));
    for (const [d, p] of [['2', 5000], ['0.5', 5000], ['3', 4000], ['-1.5', 3001]] as const) {
      const Df = Array.from({ length: p }, () => [k.fromIv(c.literal(d))]);
      const st = stability1Fixed(c, { k, D: Df })!;
      const ref = stability(c, Array.from({ length: p }, () => [c.literal(d)]), 1);
      const H2 = Decimal.clone({ precision: 3000 });
      const ex = new H2(d).pow(p); // exact to 3,000 digits (d^p has at most ~1,300 significant digits)
      expect(new H2(st.multiplier!.lo).lte(ex) && new H2(st.multiplier!.hi).gte(ex), `${d}^${p}`).toBe(true);
      expect(st.cls).toBe(ref.cls);
      // as tight as the decimal product to a few units of the 30th digit
      const w = new H2(st.multiplier!.hi).sub(st.multiplier!.lo).div(ex.abs());
      expect(w.lt('1e-24'), `${d}^${p} relative width ${w.toSD(3).toString()}`).toBe(true);
    }
  });
});
