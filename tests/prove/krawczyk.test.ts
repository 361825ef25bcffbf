import { Decimal } from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Interval } from '../../src/interval/interval.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { compileMap } from '../../src/model/compile.js';
import type { MapDefinition } from '../../src/model/types.js';
import {
  floatPreconditioner,
  intervalNewtonStep,
  krawczykPlanned,
  krawczykShooting,
  prepareKrawczyk,
  type ShootingSystem,
} from '../../src/prove/krawczyk.js';

const D50 = Decimal.clone({ precision: 50 });

function oneDimMap(step: string): MapDefinition {
  return { title: 'test map', state: ['x'], params: {}, step: { x: step }, region: { x: ['-10', '10'] } };
}

describe('interval Newton on f(x) = x² − 2', () => {
  const a = intervalArithmetic();
  const two = a.fromNumber(2);
  const f = (x: Interval): Interval => a.sub(a.sqr(x), two);
  const df = (x: Interval): Interval => a.mul(two, x);

  it('one step from [1, 2] gives exactly [11/8, 23/16]', () => {
    // Moore, Interval Analysis (1966), from memory; by hand: 1.5 − 0.25/[2, 4] = [1.375, 1.4375].
    const out = intervalNewtonStep(a, f, df, a.hull(a.fromNumber(1), a.fromNumber(2)));
    expect(out.kind).toBe('ok');
    if (out.kind !== 'ok') return;
    expect(a.loDown(out.image)).toBe(11 / 8);
    expect(a.hiUp(out.image)).toBe(23 / 16);
    expect(out.inside).toBe(true);
  });

  it('iterates contain √2 and shrink quadratically', () => {
    const sqrt2 = new D50(2).sqrt(); // decimal.js, 50 digits
    let X = a.hull(a.fromNumber(1), a.fromNumber(2));
    let prevWidth = 1;
    for (let k = 0; k < 6; k++) {
      const out = intervalNewtonStep(a, f, df, X);
      if (out.kind !== 'ok' || out.next === null) throw new Error(`step ${k} failed`);
      X = out.next;
      const d = a.toDecimal(X);
      expect(sqrt2.gte(d.lo) && sqrt2.lte(d.hi)).toBe(true);
      const w = a.widUp(X);
      // quadratic contraction (closed form: w' ≈ w²/(2√2)), allowing a few ulps of rounding
      if (prevWidth > 1e-7) expect(w).toBeLessThanOrEqual(prevWidth * prevWidth + 1e-15);
      prevWidth = w;
    }
    expect(prevWidth).toBeLessThan(1e-14);
  });

  it('reports a derivative enclosure containing 0 instead of dividing', () => {
    const out = intervalNewtonStep(a, f, df, a.hull(a.fromNumber(-1), a.fromNumber(2)));
    expect(out.kind).toBe('zero-derivative');
  });
});

describe('Krawczyk on the shooting system', () => {
  const a = intervalArithmetic();
  // f(x) = x − (x² − 2) + 0 has fixed points ±√2: F(x) = x − f(x) = x² − 2 (closed form, by hand).
  const map = compileMap(oneDimMap('x - x^2 + 2'));
  const sys: ShootingSystem<Interval> = { arith: a, evaluator: map.evaluator(a), period: 1, dim: 1 };
  const box = (lo: number, hi: number): Interval[] => [a.hull(a.fromNumber(lo), a.fromNumber(hi))];
  const C = (m: number) => floatPreconditioner(a, new Float64Array([1 / (2 * m)]), 1);

  it('proves a unique zero in [1, 2] (K([1,2]) = [1.25, 1.5834] by hand)', () => {
    const out = krawczykShooting(sys, [a.fromNumber(1.5)], box(1, 2), C(1.5));
    expect(out.kind).toBe('inside');
    if (out.kind === 'inside') {
      expect(a.loDown(out.image[0]!)).toBeCloseTo(1.25, 10);
      expect(a.hiUp(out.image[0]!)).toBeCloseTo(1.5 - 0.25 / 3 + 1 / 6, 10);
    }
    const planned = prepareKrawczyk(sys, [a.fromNumber(1.5)], C(1.5));
    if ('domain' in planned) throw new Error('domain');
    expect(krawczykPlanned(planned, box(1, 2)).kind).toBe('inside');
  });

  it('excludes [2, 3] (K = [1.55, 1.75] by hand)', () => {
    expect(krawczykShooting(sys, [a.fromNumber(2.5)], box(2, 3), C(2.5)).kind).toBe('excluded');
    const planned = prepareKrawczyk(sys, [a.fromNumber(2.5)], C(2.5));
    if ('domain' in planned) throw new Error('domain');
    expect(krawczykPlanned(planned, box(2, 3)).kind).toBe('excluded');
  });

  it('never proves across a domain violation', () => {
    const logMap = compileMap(oneDimMap('log(x)'));
    const s2: ShootingSystem<Interval> = { arith: a, evaluator: logMap.evaluator(a), period: 1, dim: 1 };
    const out = krawczykShooting(s2, [a.fromNumber(0.5)], box(-0.5, 1.5), floatPreconditioner(a, new Float64Array([1]), 1));
    expect(out.kind).toBe('domain');
  });

  it('property: every zero in X lies in K(X) (both forms), logistic period 2', () => {
    // logistic r = 3.2, period-2 points (r + 1 ± √((r − 3)(r + 1)))/(2r) (closed form, by hand)
    const logi = compileMap({ title: 'logistic', state: ['x'], params: { r: { kind: 'exact', value: '3.2' } }, step: { x: 'r*x*(1 - x)' }, region: { x: ['0', '1'] } });
    const r = new D50('3.2');
    const root = r.sub(3).mul(r.add(1)).sqrt();
    const x0 = r.add(1).add(root).div(r.mul(2));
    const x1 = r.add(1).sub(root).div(r.mul(2));
    const s2: ShootingSystem<Interval> = { arith: a, evaluator: logi.evaluator(a), period: 2, dim: 1 };
    const exact = [x0, x1];
    fc.assert(
      fc.property(
        fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
        fc.double({ min: -1e-3, max: 1e-3, noNaN: true }),
        fc.double({ min: 1e-12, max: 0.05, noNaN: true }),
        (e0, e1, rad) => {
          const m = [Number(x0.toString()) + e0, Number(x1.toString()) + e1];
          const X = m.map((v) => a.inflate(a.fromNumber(v), rad + Math.abs(e0) + Math.abs(e1)));
          // C = J(m)^{-1} for J = [[-f'(m0), 1], [1, -f'(m1)]] (by hand)
          const d0 = 3.2 * (1 - 2 * m[0]!);
          const d1 = 3.2 * (1 - 2 * m[1]!);
          const det = d0 * d1 - 1;
          const Cm = floatPreconditioner(a, new Float64Array([-d1 / det, -1 / det, -1 / det, -d0 / det]), 2);
          const mT = m.map((v) => a.fromNumber(v));
          const ref = krawczykShooting(s2, mT, X, Cm);
          const plan = prepareKrawczyk(s2, mT, Cm);
          if ('domain' in plan) return false;
          const fast = krawczykPlanned(plan, X);
          for (const out of [ref, fast]) {
            if (out.kind === 'domain') return false;
            for (let k = 0; k < 2; k++) {
              const xd = a.toDecimal(X[k]!);
              if (!(exact[k]!.gte(xd.lo) && exact[k]!.lte(xd.hi))) return true; // zero not in X
            }
            for (let k = 0; k < 2; k++) {
              const kd = a.toDecimal(out.image[k]!);
              if (!(exact[k]!.gte(kd.lo) && exact[k]!.lte(kd.hi))) return false;
            }
            if (out.kind === 'excluded') return false;
          }
          return true;
        },
      ),
      { numRuns: 200 },
    );
  });
});
