import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';
import { catalogueNames, getCatalogueMap, resolveMap } from '../../src/model/catalogue.js';
import { compileMap } from '../../src/model/compile.js';
import { compileAnyMap } from '../../src/flow/compile.js';
import { MapLanguageError } from '../../src/expr/errors.js';

/**
 * Hand derivatives of every catalogue map (closed form, derived by hand from the formulas in
 * src/model/catalogue.ts at their customary parameters), row-major.
 */
const HAND: Record<string, (x: number[]) => number[]> = {
  logistic: ([x]) => [3.83 * (1 - 2 * x!)],
  henon: ([x]) => [-2 * 1.4 * x!, 1, 0.3, 0],
  ikeda: ([x, y]) => {
    const q = 1 + x! * x! + y! * y!;
    const t = 0.4 - 6 / q;
    const tx = (12 * x!) / (q * q);
    const ty = (12 * y!) / (q * q);
    const c = Math.cos(t);
    const s = Math.sin(t);
    const u = 0.9;
    return [
      u * (c - x! * s * tx - y! * c * tx),
      u * (-x! * s * ty - s - y! * c * ty),
      u * (s + x! * c * tx - y! * s * tx),
      u * (x! * c * ty + c - y! * s * ty),
    ];
  },
  lozi: ([x]) => [-1.7 * Math.sign(x!), 1, 0.5, 0],
  tent: ([x]) => [x! < 0.5 ? 2 : -2],
  sine: ([x]) => [0.9 * Math.PI * Math.cos(Math.PI * x!)],
  quadratic: ([x]) => [2 * x!],
  gauss: ([x]) => [-2 * 4.9 * x! * Math.exp(-4.9 * x! * x!)],
  'delayed-logistic': ([x, y]) => [0, 1, -2.1 * y!, 2.1 * (1 - x!)],
  tinkerbell: ([x, y]) => [2 * x! + 0.9, -2 * y! - 0.6013, 2 * y! + 2, 2 * x! + 0.5],
  duffing: ([, y]) => [0, 1, -0.2, 2.75 - 3 * y! * y!],
};

/** Kinks of the piecewise maps: keep float comparisons away from them. */
const nearKink = (name: string, x: number[]): boolean =>
  (name === 'lozi' && Math.abs(x[0]!) < 1e-6) || (name === 'tent' && Math.abs(x[0]! - 0.5) < 1e-6);

const pointIn = (name: string): fc.Arbitrary<number[]> => {
  const def = getCatalogueMap(name)!;
  return fc.tuple(
    ...def.state.map((s) => fc.double({ min: Number(def.region[s]![0]), max: Number(def.region[s]![1]), noNaN: true })),
  );
};

describe('catalogue', () => {
  it('ships the published maps', () => {
    expect(catalogueNames()).toEqual([
      'logistic', 'henon', 'ikeda', 'lozi', 'tent', 'sine', 'quadratic', 'gauss', 'delayed-logistic', 'tinkerbell', 'duffing',
      'lorenz', 'lorenz-maxima', 'forced-duffing',
    ]);
    for (const name of catalogueNames()) {
      const def = getCatalogueMap(name)!;
      expect(def.origin).toBe(`catalogue:${name}`);
      expect(compileAnyMap(def).dim).toBe(def.state.length);
    }
  });

  it('flows: Lorenz with sigma = 10, rho = 28, beta = 8/3 exactly (Lorenz 1963, J. Atmos. Sci. 20), forced Duffing with delta = 0.25, gamma = 0.3, omega = 1 (issue 12, from memory)', () => {
    for (const name of ['lorenz', 'lorenz-maxima']) {
      const def = getCatalogueMap(name)!;
      expect(def.params).toEqual({ sigma: { kind: 'exact', value: '10' }, rho: { kind: 'exact', value: '28' } });
      // beta = 8/3 is the exact quotient in the formula, never a rounded decimal parameter
      expect(def.flow!.rhs).toEqual({ x: 'sigma*(y - x)', y: 'x*(rho - z) - y', z: 'x*y - 8/3*z' });
      expect(def.flow!.section!.crossing).toBe('decreasing');
    }
    expect(getCatalogueMap('lorenz')!.flow!.section!.surface).toBe('z - (rho - 1)');
    expect(getCatalogueMap('lorenz-maxima')!.flow!.section!.surface).toBe('x*y - 8/3*z');
    // the z = 27 region keeps away from the equilibria (±√72, ±√72, 27) (closed form): |x|, |y| < √72
    const r = getCatalogueMap('lorenz')!.region;
    for (const v of ['x', 'y']) expect(Math.max(Math.abs(Number(r[v]![0])), Math.abs(Number(r[v]![1])))).toBeLessThan(Math.sqrt(72));
    const duffing = getCatalogueMap('forced-duffing')!;
    expect(duffing.params).toEqual({ delta: { kind: 'exact', value: '0.25' }, gamma: { kind: 'exact', value: '0.3' }, omega: { kind: 'exact', value: '1' } });
    expect(duffing.flow!.duration).toBe('2*pi/omega');
    // fresh copies: changing one does not change the catalogue
    getCatalogueMap('lorenz')!.flow!.rhs['x'] = 'x';
    expect(getCatalogueMap('lorenz')!.flow!.rhs['x']).toBe('sigma*(y - x)');
  });

  it('Hénon parameters are those of Hénon 1976 (a = 1.4, b = 0.3, Commun. Math. Phys. 50)', () => {
    expect(getCatalogueMap('henon')!.params).toEqual({ a: { kind: 'exact', value: '1.4' }, b: { kind: 'exact', value: '0.3' } });
  });

  it('Hénon fixed point: x* = (−(1−b) + sqrt((1−b)² + 4a))/(2a) maps to itself (closed form, derived by hand)', () => {
    const m = compileMap(getCatalogueMap('henon')!);
    const a = 1.4;
    const b = 0.3;
    const x = (-(1 - b) + Math.sqrt((1 - b) ** 2 + 4 * a)) / (2 * a);
    const out = new Float64Array(2);
    m.evalFloat([x, b * x], out);
    expect(out[0]).toBeCloseTo(x, 14);
    expect(out[1]).toBeCloseTo(b * x, 14);
  });

  it('getCatalogueMap returns fresh copies and undefined for unknown names', () => {
    const a = getCatalogueMap('logistic')!;
    a.params['r'] = { kind: 'exact', value: '1' };
    expect(getCatalogueMap('logistic')!.params['r']).toEqual({ kind: 'exact', value: '3.83' });
    expect(getCatalogueMap('constructor')).toBeUndefined();
    expect(getCatalogueMap('__proto__')).toBeUndefined();
  });

  it('resolveMap: catalogue names, catalogue:NAME, and a clear error with suggestion', () => {
    expect(resolveMap('henon').title).toBe('Hénon map');
    expect(resolveMap('catalogue:lozi').title).toBe('Lozi map');
    try {
      resolveMap('henonn');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(MapLanguageError);
      expect((e as MapLanguageError).code).toBe('unknown-map');
      expect((e as MapLanguageError).hint).toContain("'henon'");
    }
    expect(() => resolveMap('./no/such/file.yaml')).toThrow(MapLanguageError);
  });

  describe.each(catalogueNames().filter((name) => getCatalogueMap(name)!.flow === undefined))('%s: forward-mode Jacobian', (name) => {
    const m = compileMap(getCatalogueMap(name)!);
    const n = m.dim;

    it('float AD equals the hand derivative at random points (property)', () => {
      const jac = new Float64Array(n * n);
      fc.assert(
        fc.property(pointIn(name), (x) => {
          fc.pre(!nearKink(name, x));
          m.jacobianFloat(x, jac);
          const want = HAND[name]!(x);
          for (let k = 0; k < n * n; k++) {
            expect(Math.abs(jac[k]! - want[k]!)).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(want[k]!)));
          }
        }),
        { numRuns: 200 },
      );
    });

    it('interval Jacobian over a box contains float difference quotients inside it (property)', () => {
      const I = intervalArithmetic();
      const ev = m.evaluator(I);
      const out: Interval[] = [];
      const jac: Interval[] = [];
      const f0 = new Float64Array(n);
      const f1 = new Float64Array(n);
      const r = 1e-2;
      const h = 1e-3;
      // float FD rounding error is about 4·ulp(|f|)/h ≤ 1e-10 here (common practice bound)
      const tol = 1e-9;
      fc.assert(
        fc.property(pointIn(name), fc.integer({ min: 0, max: n - 1 }), (x, j) => {
          const box = x.map((v) => I.hull(I.fromNumber(v - r), I.fromNumber(v + r)));
          resetStatus(I);
          ev.imageAndJacobian(box, out, jac);
          expect(I.status.continuous).toBe(true);
          const xh = [...x];
          xh[j] = x[j]! + h;
          m.evalFloat(x, f0);
          m.evalFloat(xh, f1);
          for (let i = 0; i < n; i++) {
            const q = (f1[i]! - f0[i]!) / h;
            const e = jac[i * n + j]!;
            expect(e.lo - tol).toBeLessThanOrEqual(q);
            expect(e.hi + tol).toBeGreaterThanOrEqual(q);
            // and the image box contains the float image of the centre
            expect(out[i]!.lo - tol).toBeLessThanOrEqual(f0[i]!);
            expect(out[i]!.hi + tol).toBeGreaterThanOrEqual(f0[i]!);
          }
        }),
        { numRuns: 150 },
      );
    });

    it('the flat compiled image agrees with the generic interval image on random boxes (property)', () => {
      const I = intervalArithmetic();
      const ev = m.evaluator(I);
      const flat = m.flatImage();
      const R = flat.newRegisters();
      const out: Interval[] = [];
      const centre: Interval[] = [];
      // the slow image is operation calls on integer registers only (the fast image is checked in tests/expr/flat.test.ts)
      expect(flat.code.split('\n// slow image\n')[1] ?? '').toMatch(/^(f[A-Z][a-z]+\(R, \d+, \d+(, -?\d+)?\);\n?)*$/);
      expect(flat.code).not.toMatch(/["'`\\]/);
      // the flat fast path and the object API may round differently by an ulp or so: both are enclosures
      const close = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-14 * (1 + Math.max(Math.abs(a), Math.abs(b)));
      fc.assert(
        fc.property(pointIn(name), fc.double({ min: 0, max: 0.1, noNaN: true }), (x, r) => {
          const box = x.map((v) => I.hull(I.fromNumber(v - r), I.fromNumber(v + r)));
          ev.image(box, out);
          ev.image(x.map((v) => I.fromNumber(v)), centre);
          flat.resetStatus(R);
          x.forEach((v, i) => flat.setInput(R, i, box[i]!.lo, box[i]!.hi));
          flat.run(R);
          for (let i = 0; i < n; i++) {
            const reg = flat.outputRegisters[i]!;
            const lo = R[2 * reg]!;
            const hi = R[2 * reg + 1]!;
            expect(close(lo, out[i]!.lo) && close(hi, out[i]!.hi)).toBe(true);
            // both enclose f(centre): the flat box meets the enclosure of the centre's image
            expect(lo).toBeLessThanOrEqual(centre[i]!.hi);
            expect(hi).toBeGreaterThanOrEqual(centre[i]!.lo);
          }
          expect(R[0]).toBe(1);
        }),
        { numRuns: 100 },
      );
    });
  });
});
