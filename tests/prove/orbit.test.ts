import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { getCatalogueMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import type { CompiledMap } from '../../src/model/types.js';
import type { ProvenOrbitData } from '../../src/certificate/build.js';
import { proveOrbit, proveOrbitWith } from '../../src/prove/orbit.js';
import { mpIntervalArithmetic } from '../../src/interval/mp.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { IntervalArithmetic } from '../../src/interval/arithmetic.js';
import type { DecimalPair, ProvenOrbit } from '../../src/prove/types.js';
import { balancedWord, henonNearReturn, inPair, logistic4Orbit, wordToNumerator } from './fixtures.js';

const D50 = Decimal.clone({ precision: 50 });

function logistic(r: string): CompiledMap {
  return compileMap(getCatalogueMap('logistic')!, { r: { kind: 'exact', value: r } });
}
function henon(a = '1.4', b = '0.3'): CompiledMap {
  return compileMap(getCatalogueMap('henon')!, { a: { kind: 'exact', value: a }, b: { kind: 'exact', value: b } });
}
function proven(v: ReturnType<typeof proveOrbit>): ProvenOrbit {
  if (v.status !== 'proven') throw new Error(`not proven: ${v.reason}: ${v.detail}`);
  return v.orbit;
}
const contains = (pair: DecimalPair | undefined, x: Decimal): boolean => pair !== undefined && inPair(x, pair);
const dbl = (d: Decimal): number => Number(d.toString()); // candidates only (heuristic)

describe('logistic map x → r x (1 − x): closed forms (derived by hand)', () => {
  it.each([
    ['2.5', 'attracting'],
    ['3.2', 'repelling'],
    ['3.83', 'repelling'],
  ])('fixed point 1 − 1/r with multiplier 2 − r at r = %s', (r, cls) => {
    const R = new D50(r);
    const x = new D50(1).sub(new D50(1).div(R)); // closed form
    const o = proven(proveOrbit(logistic(r), [[dbl(x)]]));
    expect(inPair(x, o.boxes[0]![0]!)).toBe(true);
    expect(contains(o.stability.multiplier, new D50(2).sub(R))).toBe(true); // 2 − r, closed form
    expect(o.stability.class).toBe(cls);
    expect(o.minimalPeriod).toBe(1);
    expect(o.bits).toBe(53);
    expect(o.uniquenessRadius).not.toBeNull();
  });

  it.each([
    ['3.2', 'attracting'], // 4 + 2r − r² = 0.16
    ['3.5', 'repelling'], // −1.25
    ['3.83', 'repelling'], // −3.0089
  ])('period-2 orbit (r + 1 ± √((r − 3)(r + 1)))/(2r), multiplier 4 + 2r − r², r = %s', (r, cls) => {
    const R = new D50(r);
    const root = R.sub(3).mul(R.add(1)).sqrt();
    const xs = [R.add(1).add(root).div(R.mul(2)), R.add(1).sub(root).div(R.mul(2))];
    const o = proven(proveOrbit(logistic(r), xs.map((x) => [dbl(x)])));
    xs.forEach((x, i) => expect(inPair(x, o.boxes[i]![0]!)).toBe(true));
    expect(contains(o.stability.multiplier, new D50(4).add(R.mul(2)).sub(R.mul(R)))).toBe(true);
    expect(o.stability.class).toBe(cls);
    expect(o.minimalPeriod).toBe(2);
  });

  it('an interval parameter r ∈ [3.2, 3.21]: the claims hold at both ends (closed forms)', () => {
    const map = compileMap(getCatalogueMap('logistic')!, { r: { kind: 'interval', lo: '3.2', hi: '3.21' } });
    const o = proven(proveOrbit(map, [[0.5130445095326298], [0.7994554904673701]]));
    for (const r of ['3.2', '3.21']) {
      const R = new D50(r);
      const root = R.sub(3).mul(R.add(1)).sqrt();
      const xs = [R.add(1).sub(root).div(R.mul(2)), R.add(1).add(root).div(R.mul(2))];
      xs.forEach((x, i) => expect(inPair(x, o.boxes[i]![0]!)).toBe(true));
      expect(contains(o.stability.multiplier, new D50(4).add(R.mul(2)).sub(R.mul(R)))).toBe(true);
    }
    expect(o.stability.class).toBe('attracting');
    // the certificate builder takes the verdict as it is (src/certificate/build.ts)
    const data: ProvenOrbitData = o;
    expect(data.bits).toBe(53);
  });

  it('the written boxes are outward-rounded decimals that contain the centre', () => {
    const o = proven(proveOrbit(logistic('3.2'), [[0.5130445095326298], [0.7994554904673701]]));
    for (let i = 0; i < 2; i++) {
      const [lo, hi] = o.boxes[i]![0]!;
      const c = new D50(o.centre[i]![0]!);
      expect(c.gte(lo) && c.lte(hi)).toBe(true);
      expect(lo.replace(/^-|\.|e.*$/g, '').replace(/^0+/, '').length).toBeLessThanOrEqual(20);
    }
  });
});

describe('logistic r = 4: conjugacy with the doubling map, x = sin²(πθ) (closed form, by hand)', () => {
  it.each([10, 100, 1000])('period %i through θ = k/(2^p − 1) with multiplier +2^p', (p) => {
    const w = balancedWord(p);
    const xs = logistic4Orbit(wordToNumerator(w), p); // decimal.js, 60 digits; θ·2^i mod 1 with BigInt
    const o = proven(proveOrbit(logistic('4'), xs.map((x) => [dbl(x)]), { maxBits: 53 }));
    xs.forEach((x, i) => expect(inPair(x, o.boxes[i]![0]!)).toBe(true));
    expect(contains(o.stability.multiplier, new Decimal(2).pow(p))).toBe(true); // exactly 2^p
    expect(o.stability.class).toBe('repelling');
    expect(o.minimalPeriod).toBe(p);
  });

  it('period 10 through θ = k/(2^p + 1) with multiplier −2^p', () => {
    const p = 10;
    const xs = logistic4Orbit(wordToNumerator(balancedWord(p, 7)), p, true);
    const o = proven(proveOrbit(logistic('4'), xs.map((x) => [dbl(x)])));
    xs.forEach((x, i) => expect(inPair(x, o.boxes[i]![0]!)).toBe(true));
    expect(contains(o.stability.multiplier, new Decimal(2).pow(p).neg())).toBe(true);
  });

  it.each([20, 50, 100])('precision escalation: θ = 1/(2^p − 1), p = %i', (p) => {
    // passes within ~2^-p of the critical point 1/2: needs about 2p bits (DESIGN.md §5)
    const xs = logistic4Orbit(1n, p, false, 160); // 160 digits: tighter than the mp boxes
    const o = proven(proveOrbit(logistic('4'), xs.map((x) => [x.toString()]), { maxBits: 512 }));
    xs.forEach((x, i) => expect(inPair(x, o.boxes[i]![0]!)).toBe(true));
    expect(contains(o.stability.multiplier, new Decimal(2).pow(p))).toBe(true);
    expect(o.stability.class).toBe('repelling');
    expect(o.minimalPeriod).toBe(p);
    expect(o.attempts[0]!.bits).toBe(53);
    if (p >= 50) {
      expect(o.attempts[0]!.outcome).not.toBe('proven'); // float64 must fail here
      expect(o.bits).toBeGreaterThan(53);
    }
  });
});

describe('logistic r = 3.83: the two period-3 orbits (window opening at 1 + √8, Zhang arXiv:1204.0546)', () => {
  it('one attracting, one repelling', () => {
    const r = 3.83;
    const f = (x: number) => r * x * (1 - x);
    const g = (x: number) => f(f(f(x))) - x;
    const roots: number[] = [];
    const M = 200000;
    for (let k = 1; k < M; k++) {
      let lo = k / M;
      let hi = (k + 1) / M;
      if (g(lo) * g(hi) > 0) continue;
      for (let j = 0; j < 60; j++) {
        const mid = (lo + hi) / 2;
        if (g(lo) * g(mid) <= 0) hi = mid;
        else lo = mid;
      }
      roots.push((lo + hi) / 2);
    }
    const fixed = 1 - 1 / r;
    const period3 = roots.filter((x) => Math.abs(x - fixed) > 1e-6 && x > 1e-6);
    expect(period3.length).toBe(6); // two orbits of period 3 (Zhang, arXiv:1204.0546)
    const classes: string[] = [];
    const seen = new Set<number>();
    for (const x of period3) {
      if ([...seen].some((y) => Math.abs(y - x) < 1e-9)) continue;
      const orbit = [x, f(x), f(f(x))];
      orbit.forEach((y) => seen.add(y));
      const o = proven(proveOrbit(logistic('3.83'), orbit.map((y) => [y])));
      expect(o.minimalPeriod).toBe(3);
      classes.push(o.stability.class);
    }
    expect(classes.sort()).toEqual(['attracting', 'repelling']);
  });
});

describe('Hénon map a = 1.4, b = 0.3 (Hénon 1976, Commun. Math. Phys. 50, 69–77)', () => {
  const a = new D50('1.4');
  const b = new D50('0.3');
  const detPow = (p: number) => b.neg().pow(p); // det Df = −b, so det M = (−b)^p

  it('both fixed points x = (−(1 − b) ± √((1 − b)² + 4a))/(2a), y = bx are saddles', () => {
    for (const sign of [1, -1]) {
      const disc = new D50(1).sub(b).pow(2).add(a.mul(4)).sqrt();
      const x = new D50(1).sub(b).neg().add(disc.mul(sign)).div(a.mul(2));
      const y = b.mul(x);
      const o = proven(proveOrbit(henon(), [[dbl(x), dbl(y)]]));
      expect(inPair(x, o.boxes[0]![0]!) && inPair(y, o.boxes[0]![1]!)).toBe(true);
      expect(contains(o.stability.determinant, detPow(1))).toBe(true);
      expect(o.stability.class).toBe('saddle');
    }
  });

  it('the period-2 orbit: x₀ + x₁ = (1 − b)/a, x₀x₁ = ((1 − b)s + a s² − 2)/(2a) (by hand)', () => {
    const s = new D50(1).sub(b).div(a);
    const q = s.mul(new D50(1).sub(b)).add(a.mul(s).mul(s)).sub(2).div(a.mul(2));
    const root = s.mul(s).sub(q.mul(4)).sqrt();
    const x0 = s.add(root).div(2);
    const x1 = s.sub(root).div(2);
    const pts = [[x0, b.mul(x1)], [x1, b.mul(x0)]];
    const o = proven(proveOrbit(henon(), pts.map((pt) => pt.map(dbl))));
    pts.forEach((pt, i) => pt.forEach((c, j) => expect(inPair(c, o.boxes[i]![j]!)).toBe(true)));
    expect(contains(o.stability.determinant, detPow(2))).toBe(true);
    expect(o.stability.class).toBe('saddle');
    expect(o.minimalPeriod).toBe(2);
  });

  it('the generic path (multiprecision intervals, 80 bits) proves a period-10 saddle', () => {
    const ariths = { float: () => mpIntervalArithmetic(80) as IntervalArithmetic<unknown> };
    const o = proven(proveOrbitWith(ariths, henon(), henonNearReturn(10)));
    expect(o.stability.class).toBe('saddle');
    expect(contains(o.stability.determinant, detPow(10))).toBe(true);
    expect(o.minimalPeriod).toBe(10);
  });

  it('a period-200 orbit shadowing a near-return of the float orbit is a saddle', () => {
    const o = proven(proveOrbit(henon(), henonNearReturn(200), { maxBits: 53 }));
    expect(o.period).toBe(200);
    expect(contains(o.stability.determinant, detPow(200))).toBe(true);
    expect(o.stability.class).toBe('saddle');
    expect(o.stability.eigenvalueModuli).toHaveLength(2);
  });
});

describe('what must not be proven', () => {
  it('a wrong candidate without refinement is not proven', () => {
    const v = proveOrbit(logistic('3.2'), [[0.3]], { refine: false, maxBits: 106 });
    expect(v.status).toBe('not-proven');
  });

  it('a map without fixed points (x² + 1) is not proven', () => {
    const m = compileMap({ title: 'no fixed point', state: ['x'], params: {}, step: { x: 'x^2 + 1' }, region: { x: ['-2', '2'] } });
    const v = proveOrbit(m, [[0.5]]);
    expect(v.status).toBe('not-proven');
  });

  it('acceptAssumed: false replaces a float64 proof resting on an assumption by a multiprecision one', () => {
    // A float64 arithmetic whose sin is marked as resting on an accuracy assumption (as a kernel
    // built on Math.sin widened by a margin would be); multiprecision never assumes (src/interval/mp.ts).
    const assuming = (): IntervalArithmetic<unknown> => {
      const base = intervalArithmetic();
      const sin = base.sin.bind(base);
      return Object.assign(Object.create(base) as typeof base, {
        sin: (v: Parameters<typeof sin>[0]) => {
          base.status.assumed = true;
          return sin(v);
        },
      }) as IntervalArithmetic<unknown>;
    };
    const ariths = { float: assuming, mp: (bits: number) => mpIntervalArithmetic(bits) as IntervalArithmetic<unknown> };
    const m = compileMap({ title: 'sine', state: ['x'], params: { r: { kind: 'exact', value: '0.9' } }, step: { x: 'r*sin(pi*x)' }, region: { x: ['0', '1'] } });
    const x = 0.7104167292817497; // fixed point of 0.9·sin(πx) (float iteration of the inverse branch, heuristic)
    const fast = proven(proveOrbitWith(ariths, m, [[x]]));
    expect(fast.assumed).toBe(true);
    expect(fast.bits).toBe(53);
    const strict = proven(proveOrbitWith(ariths, m, [[x]], { acceptAssumed: false }));
    expect(strict.assumed).toBe(false);
    expect(strict.bits).toBeGreaterThan(53);
    expect(proveOrbitWith(ariths, m, [[x]], { acceptAssumed: false, maxBits: 53 }).status).toBe('not-proven');
  });

  it('bad input is a typed outcome, not an exception', () => {
    const v = proveOrbit(logistic('3.2'), [[Number.NaN]]);
    expect(v.status === 'not-proven' && v.reason === 'bad-input').toBe(true);
  });
});
