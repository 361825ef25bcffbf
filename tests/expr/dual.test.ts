import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compileFormulas } from '../../src/expr/compile.js';
import { dualArithmetic } from '../../src/expr/dual.js';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { createFloatArithmetic } from '../../src/interval/float-arith.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import type { Interval } from '../../src/interval/interval.js';

const I = intervalArithmetic();
const box = (lo: number, hi: number): Interval => I.hull(I.fromNumber(lo), I.fromNumber(hi));
const has = (v: Interval, x: number): boolean => v.lo <= x && x <= v.hi;

describe('first-order forward mode: closed-form derivatives (derived by hand)', () => {
  it.each([
    // [formula, x, df/dx at x]
    ['x^3', 2, 12],
    ['x^-2', 2, -0.25],
    ['sqrt(x)', 4, 0.25],
    ['exp(2*x)', 0, 2],
    ['log(x)', 4, 0.25],
    ['sin(x)', 0, 1],
    ['cos(x)', 0, 0],
    ['tan(x)', 0, 1],
    ['atan(x)', 1, 0.5],
    ['sinh(x)', 0, 1],
    ['cosh(x)', 0, 0],
    ['tanh(x)', 0, 1],
    ['abs(x)', -3, -1],
    ['min(x, 2)', 1, 1],
    ['max(x, 2)', 1, 0],
    ['pow(x, 3)', 2, 12],
    ['pow(2, x)', 0, Math.LN2],
    ['x/(1+x)', 1, 0.25],
    ['sqr(x - 1)', 3, 4],
    ['2^x', 1, 2 * Math.LN2],
  ] as const)('d/dx %s at %d = %d', (src, x, d) => {
    const c = compileFormulas([src], ['x']);
    const out: Interval[] = [];
    const jac: Interval[] = [];
    resetStatus(I);
    c.evaluator(I).imageAndJacobian([I.fromNumber(x)], out, jac);
    expect(has(box(jac[0]!.lo, jac[0]!.hi), d) || Math.abs(jac[0]!.lo - d) < 1e-15).toBe(true);
    expect(jac[0]!.hi - jac[0]!.lo).toBeLessThan(1e-12);
    const F = createFloatArithmetic();
    const fo: number[] = [];
    const fj: number[] = [];
    c.evaluator(F).imageAndJacobian([x], fo, fj);
    expect(fj[0]).toBeCloseTo(d, 13);
  });

  it('abs uses the slope enclosure [-1, 1] on a box straddling 0 (DESIGN.md §4)', () => {
    const jac: Interval[] = [];
    compileFormulas(['abs(x)'], ['x']).evaluator(I).imageAndJacobian([box(-1, 2)], [], jac);
    expect(jac[0]!.lo).toBeLessThanOrEqual(-1);
    expect(jac[0]!.hi).toBeGreaterThanOrEqual(1);
  });

  it('min/max slopes are sound across the switch: f(b) − f(a) ∈ J(X)·(b − a) (property)', () => {
    const c = compileFormulas(['max(x, y) - 2*min(x^2, y)', 'abs(x - y)'], ['x', 'y']);
    const ev = c.evaluator(I);
    const F = createFloatArithmetic();
    const ef = c.evaluator(F);
    const unit = fc.double({ min: -1, max: 1, noNaN: true });
    fc.assert(
      fc.property(unit, unit, unit, unit, (ax, ay, bx, by) => {
        const X = [box(Math.min(ax, bx), Math.max(ax, bx)), box(Math.min(ay, by), Math.max(ay, by))];
        const jac: Interval[] = [];
        ev.imageAndJacobian(X, [], jac);
        const fa: number[] = [];
        const fb: number[] = [];
        ef.image([ax, ay], fa);
        ef.image([bx, by], fb);
        for (let i = 0; i < 2; i++) {
          // mean-value (slope) inclusion, float rounding allowance 1e-12 (common practice)
          const s = I.add(I.mul(jac[i * 2]!, I.fromNumber(bx - ax)), I.mul(jac[i * 2 + 1]!, I.fromNumber(by - ay)));
          const d = fb[i]! - fa[i]!;
          expect(s.lo - 1e-12).toBeLessThanOrEqual(d);
          expect(s.hi + 1e-12).toBeGreaterThanOrEqual(d);
        }
      }),
      { numRuns: 500 },
    );
  });
});

describe('second-order forward mode (nested duals)', () => {
  it('Hénon: ∂²f1/∂x² = −2a, other second derivatives 0 (closed form, derived by hand)', () => {
    const c = compileFormulas(['1 - a*x^2 + y', 'b*x'], ['x', 'y'], [{ name: 'a', lo: '1.4', hi: '1.4' }, { name: 'b', lo: '0.3', hi: '0.3' }]);
    const out: Interval[] = [];
    const jac: Interval[] = [];
    const hess: Interval[] = [];
    c.secondOrder(I).evaluate([box(-1, 1), box(-0.4, 0.4)], out, jac, hess);
    expect(has(hess[0]!, -2.8)).toBe(true);
    expect(hess[0]!.hi - hess[0]!.lo).toBeLessThan(1e-14);
    for (const k of [1, 2, 3, 4, 5, 6, 7]) expect([hess[k]!.lo, hess[k]!.hi]).toEqual([0, 0]);
    expect(jac[0]!.lo).toBeLessThanOrEqual(-2.8);
    expect(jac[0]!.hi).toBeGreaterThanOrEqual(2.8);
  });

  it('Hessian of exp(x*y)·sin(x) matches the hand formula and is symmetric (property)', () => {
    const c = compileFormulas(['exp(x*y)*sin(x)', 'x'], ['x', 'y']);
    const F = createFloatArithmetic();
    const so = c.secondOrder(F);
    const pt = fc.double({ min: -1.5, max: 1.5, noNaN: true });
    fc.assert(
      fc.property(pt, pt, (x, y) => {
        const hess: number[] = [];
        so.evaluate([x, y], [], [], hess);
        const E = Math.exp(x * y);
        const s = Math.sin(x);
        const co = Math.cos(x);
        // closed form, derived by hand: f = e^{xy} sin x
        const fxx = E * (y * y * s + 2 * y * co - s);
        const fxy = E * (s + x * y * s + x * co);
        const fyy = E * x * x * s;
        const tol = (v: number): number => 1e-12 * (1 + Math.abs(v));
        expect(Math.abs(hess[0]! - fxx)).toBeLessThanOrEqual(tol(fxx));
        expect(Math.abs(hess[1]! - fxy)).toBeLessThanOrEqual(tol(fxy));
        expect(Math.abs(hess[2]! - fxy)).toBeLessThanOrEqual(tol(fxy));
        expect(Math.abs(hess[3]! - fyy)).toBeLessThanOrEqual(tol(fyy));
      }),
      { numRuns: 200 },
    );
  });

  it('dualArithmetic nests: d²/dx² of x^3 at 2 is 12 (closed form)', () => {
    const D1 = dualArithmetic(createFloatArithmetic(), 1);
    const D2 = dualArithmetic(D1, 1);
    const x = D2.variable(D1.variable(2, 0), 0);
    const y = D2.pown(x, 3);
    expect(y.v.v).toBe(8);
    expect(y.d[0]!.v).toBe(12);
    expect(y.v.d[0]).toBe(12);
    expect(y.d[0]!.d[0]).toBe(12);
  });
});
