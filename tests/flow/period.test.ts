/**
 * encloseFlowPeriod (src/flow/period.ts) on closed forms.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { compileFlowMap } from '../../src/flow/compile.js';
import { encloseFlowPeriod } from '../../src/flow/period.js';

const D = Decimal.clone({ precision: 40 });
const TWO_PI = D.acos(-1).mul(2);
const inside = (x: Decimal, T: { decimal: { lo: string; hi: string } }): boolean => new D(T.decimal.lo).lte(x) && x.lte(T.decimal.hi);

describe('encloseFlowPeriod', () => {
  // harmonic oscillator x' = y, y' = −x: every orbit is a circle run in time 2π (closed form
  // cos/sin); the section y = 0 crossed with y decreasing is met once per turn, at x > 0
  const oscillator = compileFlowMap({
    title: 'harmonic', state: ['x', 'y'], params: {}, step: {}, region: { x: ['0.5', '2'], y: ['-0.1', '0.1'] },
    flow: { rhs: { x: 'y', y: '-x' }, section: { surface: 'y', crossing: 'decreasing' } },
  });

  it('return map of the harmonic oscillator: the return time of points on the section is 2π (closed form)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 2, noNaN: true }), fc.double({ min: 1e-9, max: 1e-3, noNaN: true }), (x, r) => {
        const box: [string, string][] = [[String(x - r * x), String(x + r * x)], ['0', '0']];
        const T = encloseFlowPeriod(oscillator, [box]);
        // width about the box width over the crossing speed x (measured: ≈ 1·(2rx)/x + 1e-9)
        return T.ok && inside(TWO_PI, T) && T.hi - T.lo < 10 * 2 * r + 1e-8;
      }),
      { numRuns: 8 },
    );
  });

  it('two turns (period 2): 4π; a time-T map: p·T (closed forms)', () => {
    const box: [string, string][] = [['0.999', '1.001'], ['0', '0']];
    const T2 = encloseFlowPeriod(oscillator, [box, box]);
    expect(T2.ok && inside(TWO_PI.mul(2), T2)).toBe(true);
    const timeMap = compileFlowMap({
      title: 'linear', state: ['x'], params: { a: { kind: 'exact', value: '0.5' } }, step: {}, region: { x: ['0', '1'] },
      flow: { rhs: { x: 'a - x' }, duration: '3/7' },
    });
    const T3 = encloseFlowPeriod(timeMap, [[['0.5', '0.5']], [['0.5', '0.5']], [['0.5', '0.5']]]);
    expect(T3.ok && inside(new D(9).div(7), T3)).toBe(true);
  });

  it('refuses (no claim) where the flow is tangent to the section', () => {
    // on y = 0 the crossing speed −y' = x vanishes at x = 0, inside this box
    const T = encloseFlowPeriod(oscillator, [[['-0.01', '0.01'], ['0', '0']]]);
    expect(T.ok).toBe(false);
  });
});
