/**
 * The production evaluation path of `compileMap`: generated straight-line code for the float
 * image/Jacobian (search, float Newton) and for the float64 interval image/Jacobian (the prover's
 * float64 Krawczyk, through `evaluator(intervalArithmetic())`), with the generic tape evaluator as
 * the reference.
 *  - float: bit-identical to the tape evaluator over float arithmetic;
 *  - interval: contains the exact image and Jacobian (decimal.js at 60 digits, doubles entering
 *    through their exact decimal expansion; derivatives of the polynomial maps derived by hand),
 *    the same continuity/assumption flags as the tape evaluator, and the same boxes within a few
 *    ulps (the inline rounding steps one ulp outward even for exact results, src/interval/flat.ts).
 */
import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TapeEvaluator } from '../../src/expr/evaluate.js';
import { createFloatArithmetic } from '../../src/interval/float-arith.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { Interval } from '../../src/interval/interval.js';
import { compileMap, paramBounds, type FormulaMap } from '../../src/model/compile.js';
import type { MapDefinition } from '../../src/model/types.js';
import { dec60, Dec60 } from '../interval/oracle.js';

function def(state: string[], step: string[], params: Record<string, string> = {}): MapDefinition {
  const p: MapDefinition['params'] = {};
  for (const [k, v] of Object.entries(params)) p[k] = { kind: 'exact', value: v };
  return {
    title: 'test map',
    state,
    params: p,
    step: Object.fromEntries(state.map((s, i) => [s, step[i]!])),
    region: Object.fromEntries(state.map((s) => [s, ['-2', '2'] as [string, string]])),
  };
}

// Hénon (1976, Commun. Math. Phys. 50): (x, y) ↦ (1 − a x² + y, b x); a 3-D product of the
// logistic map r x (1 − x) and the Hénon map; and a map using every elementary function.
const henon = compileMap(def(['x', 'y'], ['1 - a*x^2 + y', 'b*x'], { a: '1.4', b: '0.3' }));
const product = compileMap(def(['u', 'x', 'y'], ['r*u*(1 - u)', '1 - a*x^2 + y', 'b*x'], { r: '3.83', a: '1.4', b: '0.3' }));
const elementary = compileMap(
  def(
    ['x', 'y', 'z'],
    [
      '0.9*x*cos(y) - 0.2*sin(z) + exp(-x^2)/(2 + y^2) + x^3 - 0.1*x^4',
      'tanh(z)/3 + atan(y) - sqrt(1 + x^2) + log(2 + sinh(0.1*x)*cosh(y)/10) + tan(0.1*z)',
      'abs(z) + min(x, y) - max(y, z) + pow(1.5 + 0.1*y^2, x/4) + 1/(3 + x^2)',
    ],
  ),
);

/** Exact image and Jacobian of the polynomial maps (derivatives derived by hand). */
type Exact = (x: Decimal[]) => { f: Decimal[]; J: Decimal[] };
const L = (s: string): Decimal => new Dec60(s);
const henonExact: Exact = ([x, y]) => ({
  f: [L('1').minus(L('1.4').times(x!).times(x!)).plus(y!), L('0.3').times(x!)],
  J: [L('-2.8').times(x!), L('1'), L('0.3'), L('0')],
});
const productExact: Exact = ([u, x, y]) => ({
  f: [L('3.83').times(u!).times(L('1').minus(u!)), L('1').minus(L('1.4').times(x!).times(x!)).plus(y!), L('0.3').times(x!)],
  J: [L('3.83').minus(L('7.66').times(u!)), L('0'), L('0'), L('0'), L('-2.8').times(x!), L('1'), L('0'), L('0.3'), L('0')],
});

const inside = (v: Decimal, lo: number, hi: number): boolean =>
  (lo === -Infinity || dec60(lo).lte(v)) && (hi === Infinity || dec60(hi).gte(v));

const sameBits = (a: ArrayLike<number>, b: ArrayLike<number>): boolean =>
  a.length === b.length && Array.from(a).every((v, i) => Object.is(v, b[i]));

const boxSpec = (n: number) =>
  fc.array(fc.tuple(fc.double({ min: -1.5, max: 1.5, noNaN: true }), fc.double({ min: 0, max: 1e-3, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: n, maxLength: n });

describe('compileMap: float image and Jacobian are generated code, bit-identical to the tape evaluator', () => {
  for (const [name, m] of [['Hénon', henon], ['logistic × Hénon', product], ['elementary', elementary]] as const) {
    it(name, () => {
      const n = m.dim;
      const ref = new TapeEvaluator<number>(m.tape, createFloatArithmetic(), m.paramValues.map(paramBounds));
      const out = new Float64Array(n);
      const jac = new Float64Array(n * n);
      const rOut: number[] = [];
      const rJac: number[] = [];
      fc.assert(
        fc.property(fc.array(fc.double({ min: -3, max: 3 }), { minLength: n, maxLength: n }), (x) => {
          m.evalFloat(x, out);
          m.jacobianFloat(x, jac);
          ref.imageAndJacobian(x, rOut, rJac);
          expect(sameBits(out, rOut)).toBe(true);
          expect(sameBits(jac, rJac)).toBe(true);
        }),
        { numRuns: 300 },
      );
    });
  }
});

describe('compileMap: float64 interval image and Jacobian of a box on the production path', () => {
  /** compiled (production) and tape (reference) evaluators over the same arithmetic kind */
  function both(m: FormulaMap) {
    const A = intervalArithmetic();
    const B = intervalArithmetic();
    return { A, B, prod: m.evaluator(A), tape: new TapeEvaluator<Interval>(m.tape, B, m.paramValues.map(paramBounds)) };
  }

  it('the prover gets the compiled evaluator for intervalArithmetic(), the tape for other arithmetics', () => {
    expect(henon.evaluator(intervalArithmetic())).not.toBeInstanceOf(TapeEvaluator);
    expect(henon.evaluator(createFloatArithmetic())).toBeInstanceOf(TapeEvaluator);
  });

  for (const [name, m, exact] of [['Hénon', henon, henonExact], ['logistic × Hénon', product, productExact], ['elementary', elementary, null]] as const) {
    it(`${name}: contains the exact values, same flags as the tape, same boxes within a few ulps`, () => {
      const n = m.dim;
      const { A, B, prod, tape } = both(m);
      const pOut: Interval[] = [];
      const pJac: Interval[] = [];
      const tOut: Interval[] = [];
      const tJac: Interval[] = [];
      fc.assert(
        fc.property(boxSpec(n), (spec) => {
          const box = spec.map(([c, r]) => new Interval(c - r, c + r));
          A.status.continuous = true; A.status.assumed = false; A.status.nonsmooth = false;
          B.status.continuous = true; B.status.assumed = false; B.status.nonsmooth = false;
          prod.imageAndJacobian(box, pOut, pJac);
          tape.imageAndJacobian(box, tOut, tJac);
          expect(A.status.continuous).toBe(B.status.continuous);
          expect(A.status.assumed).toBe(B.status.assumed);
          expect(A.status.nonsmooth).toBe(B.status.nonsmooth);
          if (!B.status.continuous) return;
          const pairs: [Interval, Interval][] = [...pOut.map((v, i) => [v, tOut[i]!] as [Interval, Interval]), ...pJac.map((v, i) => [v, tJac[i]!] as [Interval, Interval])];
          for (const [p, t] of pairs) {
            const tol = 1e-14 * (1 + Math.max(Math.abs(t.lo), Math.abs(t.hi)));
            expect(p.lo).toBeLessThanOrEqual(t.hi);
            expect(p.lo).toBeGreaterThanOrEqual(t.lo - tol);
            expect(p.hi).toBeLessThanOrEqual(t.hi + tol);
          }
          // the image box also through intervalImage / intervalJacobian directly
          const bx = Float64Array.from(box.flatMap((b) => [b.lo, b.hi]));
          const o = new Float64Array(2 * n);
          const j = new Float64Array(2 * n * n);
          const flags = (B.status.assumed ? 2 : 0) | (B.status.nonsmooth === true ? 4 : 0);
          expect(m.intervalJacobian(bx, o, j)).toBe(flags);
          expect(Array.from(o)).toEqual(pOut.flatMap((v) => [v.lo, v.hi]));
          expect(Array.from(j)).toEqual(pJac.flatMap((v) => [v.lo, v.hi]));
          if (exact === null) return;
          // a point of the box (corner mix) — exact image and Jacobian inside the enclosures
          const pt = spec.map(([c, r, t], i) => (t < 0.5 ? box[i]!.lo : box[i]!.hi) + 0 * c * r);
          const e = exact(pt.map(dec60));
          e.f.forEach((v, i) => expect(inside(v, pOut[i]!.lo, pOut[i]!.hi)).toBe(true));
          e.J.forEach((v, k) => expect(inside(v, pJac[k]!.lo, pJac[k]!.hi)).toBe(true));
          const im = new Float64Array(2 * n);
          expect(m.intervalImage(bx, im)).toBe(0); // polynomial maps: no assumption
          e.f.forEach((v, i) => expect(inside(v, im[2 * i]!, im[2 * i + 1]!)).toBe(true));
        }),
        { numRuns: 200 },
      );
    });
  }

  it('a domain violation is reported, never a proof: log of a box reaching 0', () => {
    const m = compileMap(def(['x'], ['log(x)']));
    const A = intervalArithmetic();
    const out: Interval[] = [];
    const jac: Interval[] = [];
    m.evaluator(A).imageAndJacobian([new Interval(-1e-3, 1)], out, jac);
    expect(A.status.continuous).toBe(false);
    expect(m.intervalImage(Float64Array.of(-1, 1), new Float64Array(2)) & 1).toBe(1);
  });
});
