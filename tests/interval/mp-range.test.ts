// Regression (found in review): in the multiprecision arithmetic a difference of two numbers near
// decimal.js's exponent limit (1e-9e15) was flushed to 0 in both directions, giving a wrong bound
// and a false "proven" fixed point. (1.1·t − t)·T with t = 1e-9e15·…, T = 1/t is exactly 0.1
// (closed form, derived by hand): the enclosure must contain 0.1 or the status must say "not continuous".
import { describe, expect, it } from 'vitest';
import { mpIntervalArithmetic } from '../../src/interval/mp.js';
import { resetStatus } from '../../src/interval/arithmetic.js';

describe('mp add/sub near the exponent limits', () => {
  it('never returns a wrong bound for a cancelling difference of tiny numbers', () => {
    const A = mpIntervalArithmetic(106);
    resetStatus(A);
    const t = A.pown(A.pown(A.pown(A.constant('1e-9000', '1e-9000'), 10000), 10000), 10000);
    const T = A.pown(A.pown(A.pown(A.constant('1e9000', '1e9000'), 10000), 10000), 10000);
    const r = A.mul(A.sub(A.mul(A.constant('1.1', '1.1'), t), t), T);
    const contains = r.lo.lte('0.1') && r.hi.gte('0.1');
    expect(contains || A.status.continuous === false).toBe(true);
    expect(A.status.continuous).toBe(false);
  });
  it('keeps ordinary sums exact-or-rounded (control)', () => {
    const A = mpIntervalArithmetic(106);
    resetStatus(A);
    const r = A.sub(A.constant('1e-300', '1e-300'), A.constant('2e-300', '2e-300'));
    expect(r.lo.eq('-1e-300') && r.hi.eq('-1e-300')).toBe(true);
    expect(A.status.continuous).toBe(true);
  });
});
