import { describe, expect, it } from 'vitest';
import { resetStatus } from '../../src/interval/arithmetic.js';
import { EMPTY, Interval, interval } from '../../src/interval/interval.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { createFloatArithmetic, floatArithmetic } from '../../src/interval/float-arith.js';
import { Exact, exact } from './oracle.js';

describe('intervalArithmetic status', () => {
  it('each call gives a new instance with its own status', () => {
    const a = intervalArithmetic();
    const b = intervalArithmetic();
    a.sqrt(interval(-1, 1));
    expect(a.status.continuous).toBe(false);
    expect(b.status.continuous).toBe(true);
    resetStatus(a);
    expect(a.status).toEqual({ continuous: true, assumed: false, nonsmooth: false });
  });

  const cases: [string, (A: ReturnType<typeof intervalArithmetic>) => unknown, boolean, boolean][] = [
    // [what, evaluation, continuous afterwards, assumed afterwards] — IEEE 1788 §11 domains.
    ['sqrt inside', (A) => A.sqrt(interval(0, 4)), true, false],
    ['sqrt reaching below 0', (A) => A.sqrt(interval(-1e-300, 4)), false, false],
    ['log inside (proven log)', (A) => A.log(interval(1, 4)), true, false],
    ['log touching 0', (A) => A.log(interval(0, 4)), false, false],
    ['div by box containing 0', (A) => A.div(interval(1, 2), interval(-1, 1)), false, false],
    ['div by box touching 0', (A) => A.div(interval(1, 2), interval(0, 1)), false, false],
    ['div ok', (A) => A.div(interval(1, 2), interval(1, 3)), true, false],
    ['tan across π/2', (A) => A.tan(interval(1, 2)), false, false],
    ['tan ok (proven)', (A) => A.tan(interval(-1, 1)), true, false],
    ['atan (Math.atan, assumed)', (A) => A.atan(interval(-1, 1)), true, true],
    ['pow with base reaching 0 and exponent ≤ 0', (A) => A.pow(interval(0, 1), interval(-1, 1)), false, true],
    ['pow with base 0, exponent > 0', (A) => A.pow(interval(0, 1), interval(0.5, 1)), true, true],
    ['pow negative base', (A) => A.pow(interval(-1, 1), interval(2, 2)), false, true],
    ['pown negative power through 0', (A) => A.pown(interval(-1, 1), -2), false, false],
    ['overflow from bounded inputs', (A) => A.mul(interval(1e300, 1e300), interval(1e300, 1e300)), false, false],
    ['exp overflow', (A) => A.exp(interval(1, 1000)), false, false],
    ['cosh (proven)', (A) => A.cosh(interval(-1, 2)), true, false],
    ['empty input', (A) => A.add(EMPTY, interval(1, 2)), false, false],
    ['NaN from fromNumber', (A) => A.fromNumber(NaN), false, false],
    ['sin (proven)', (A) => A.sin(interval(0, 1)), true, false],
  ];
  for (const [what, f, cont, assumed] of cases) {
    it(what, () => {
      const A = intervalArithmetic();
      f(A);
      expect(A.status.continuous).toBe(cont);
      expect(A.status.assumed).toBe(assumed);
    });
  }

  it('constant(lo, hi) encloses the exact decimals (decimal.js check)', () => {
    const A = intervalArithmetic();
    const c = A.constant('3.83', '3.84');
    expect(exact(c.lo).lte(new Exact('3.83'))).toBe(true);
    expect(exact(c.hi).gte(new Exact('3.84'))).toBe(true);
    expect(A.constant('3.83', '3.84')).toBe(c); // cached per instance
    const t = A.constant('0.1', '0.1');
    expect(t.lo < t.hi).toBe(true);
    expect(A.fromDecimal('0.5')).toEqual(new Interval(0.5, 0.5));
    expect(() => A.constant('2', '1')).toThrow();
  });

  it('helpers: mid, wid, mag, mig, inflate, toDecimal, comparisons, absSlope', () => {
    const A = intervalArithmetic();
    const x = interval(-1, 3);
    expect(A.midNumber(x)).toBe(1);
    expect(A.midPoint(x)).toEqual(new Interval(1, 1));
    expect(A.widUp(x)).toBe(4);
    expect(A.magUp(x)).toBe(3);
    expect(A.migDown(x)).toBe(0);
    const y = A.inflate(interval(1, 1), 0.1);
    expect(exact(y.lo).lte(new Exact(1).minus(exact(0.1)))).toBe(true);
    expect(exact(y.hi).gte(new Exact(1).plus(exact(0.1)))).toBe(true);
    expect(A.toDecimal(interval(0.1, 0.5))).toEqual({ lo: '0.1000000000000000055511151231257827021181583404541015625', hi: '0.5' });
    expect(A.certainlyLt(interval(0, 1), interval(2, 3))).toBe(true);
    expect(A.certainlyLt(interval(0, 2), interval(2, 3))).toBe(false);
    expect(A.certainlyLe(interval(0, 2), interval(2, 3))).toBe(true);
    expect(A.absSlope(interval(-1, 1))).toEqual(new Interval(-1, 1));
    expect(A.absSlope(interval(0.5, 1))).toEqual(new Interval(1, 1));
    expect(A.intersect(interval(0, 1), interval(2, 3))).toBeNull();
    expect(A.isInterior(interval(0.5, 0.6), interval(0, 1))).toBe(true);
    expect(A.bits).toBe(53);
  });
});

describe('floatArithmetic (@heuristic)', () => {
  it('plain doubles, constants at the nearest midpoint', () => {
    const F = createFloatArithmetic();
    expect(F.add(0.1, 0.2)).toBe(0.1 + 0.2);
    expect(F.constant('3.83', '3.83')).toBe(3.83);
    expect(F.constant('1', '2')).toBe(1.5);
    expect(F.pown(2, -2)).toBe(0.25);
    F.log(-1);
    expect(F.status.continuous).toBe(false);
    expect(F.status.assumed).toBe(true);
    expect(floatArithmetic.kind).toBe('float');
    expect(F.absSlope(-2)).toBe(-1);
  });
});
