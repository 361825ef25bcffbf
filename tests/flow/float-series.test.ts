/**
 * The flat float64 Taylor engine (src/flow/float-series.ts, @heuristic) against closed forms and
 * against the generic series engine (src/flow/taylor.ts) over floats and float duals, which runs
 * the same recurrences operation by operation through the Arithmetic interface.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compileFlowMap } from '../../src/flow/compile.js';
import { FloatSeries } from '../../src/flow/float-series.js';
import { SeriesEngine } from '../../src/flow/taylor.js';
import { dualArithmetic, type Dual } from '../../src/expr/dual.js';
import { createFloatArithmetic } from '../../src/interval/float-arith.js';
import type { MapDefinition } from '../../src/model/types.js';

const exact = (value: string) => ({ kind: 'exact' as const, value });
const base = { title: 't', step: {}, region: {} };

describe('FloatSeries', () => {
  it("x' = x: coefficient k of the solution through 1 is 1/k! (closed form e^t)", () => {
    const m = compileFlowMap({ ...base, params: {}, state: ['x'], region: { x: ['0', '1'] }, flow: { rhs: { x: 'x' }, duration: '1' } });
    const fs = new FloatSeries(m.program, m.enclosures, 16, true);
    fs.run([1], 0, 15);
    let f = 1;
    for (let k = 0; k <= 16; k++) {
      if (k > 0) f *= k;
      expect(fs.state(0, 0, k)).toBeCloseTo(1 / f, 15);
      expect(fs.state(0, 1, k)).toBeCloseTo(1 / f, 15); // d/dx0 of x0·t^k/k!
    }
  });

  it("x' = cos(t) (forced, time variable): x(t) = x0 + sin t, coefficients of sin at t0 = 0 (closed form)", () => {
    const m = compileFlowMap({ ...base, params: {}, state: ['x'], region: { x: ['0', '1'] }, flow: { rhs: { x: 'cos(t)' }, time: 't', duration: '1' } });
    const fs = new FloatSeries(m.program, m.enclosures, 10, false);
    fs.run([0.5], 0, 9);
    const want = [0.5, 1, 0, -1 / 6, 0, 1 / 120, 0, -1 / 5040];
    want.forEach((w, k) => expect(fs.state(0, 0, k)).toBeCloseTo(w, 15));
  });

  // every operation with a series rule: products, quotient, powers, sqrt, exp, log, sin/cos, sinh/cosh
  const ALL_OPS: MapDefinition = {
    ...base,
    params: { a: exact('0.7'), b: exact('1.3') },
    state: ['x', 'y', 'z'],
    region: { x: ['0.5', '1.5'], y: ['0.5', '1.5'], z: ['0.5', '1.5'] },
    flow: {
      rhs: {
        x: 'a*y - x*z/(1 + y^2) + sqrt(x + 2)',
        y: 'exp(-x*y) + log(1 + z^2) - sin(b*x)*cos(y) + x^3',
        z: 'sinh(0.3*z) - cosh(0.2*x) + y^(-2) + pow(x + 1, 0.5)',
      },
      duration: '1',
    },
  };

  it('equals the generic engine over floats and float duals at random points (property)', () => {
    const P = 12;
    const m = compileFlowMap(ALL_OPS, undefined, { order: P });
    const F = createFloatArithmetic();
    const FD = dualArithmetic(F, 3);
    const generic = new SeriesEngine<number>(m.program, F, m.enclosures, P);
    const genericDual = new SeriesEngine<Dual<number>>(m.program, FD, m.enclosures, P);
    const flat = new FloatSeries(m.program, m.enclosures, P, true);
    const close = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-11 * (1 + Math.abs(b));
    fc.assert(
      fc.property(fc.tuple(fc.double({ min: 0.5, max: 1.5, noNaN: true }), fc.double({ min: 0.5, max: 1.5, noNaN: true }), fc.double({ min: 0.5, max: 1.5, noNaN: true })), (x) => {
        generic.run(x, 0, P - 1);
        genericDual.run(x.map((v, i) => FD.variable(v, i)), FD.lift(0), P - 1);
        flat.run(x, 0, P - 1);
        for (let i = 0; i < 3; i++) {
          for (let k = 0; k <= P; k++) {
            if (!close(flat.state(i, 0, k), generic.xs[i]![k]!)) return false;
            for (let j = 0; j < 3; j++) if (!close(flat.state(i, 1 + j, k), genericDual.xs[i]![k]!.d[j] ?? 0)) return false;
          }
        }
        return true;
      }),
      { numRuns: 60 },
    );
  });
});
