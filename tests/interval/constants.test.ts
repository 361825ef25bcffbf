/**
 * The kernel's constants against decimal.js: π = Decimal.acos(-1) and e = Decimal.exp(1) at 60
 * digits (decimal.js keeps π to 1025 digits internally); the first digits are also written out
 * from memory: π = 3.14159265358979323846264338327950288…, e = 2.71828182845904523536028747135…
 */

import { describe, expect, it } from 'vitest';
import { E, PI } from '../../src/interval/interval.js';
import { HALF_PI_HEAD, HALF_PI_TAIL_HI, HALF_PI_TAIL_LO } from '../../src/interval/kernel.js';
import { nextUp } from '../../src/interval/round.js';
import { Dec60, dec60 } from './oracle.js';

const PI60 = Dec60.acos(-1);
const E60 = Dec60.exp(1);

describe('π, e and the double-double π/2', () => {
  it('decimal.js agrees with the digits from memory', () => {
    expect(PI60.toString().startsWith('3.14159265358979323846264338327950288')).toBe(true);
    expect(E60.toString().startsWith('2.71828182845904523536028747135')).toBe(true);
  });
  it('PI = [3.141592653589793, 3.1415926535897936] encloses π tightly', () => {
    expect(PI.lo).toBe(3.141592653589793);
    expect(PI.hi).toBe(3.1415926535897936);
    expect(nextUp(PI.lo)).toBe(PI.hi);
    expect(dec60(PI.lo).lt(PI60) && dec60(PI.hi).gt(PI60)).toBe(true);
  });
  it('E encloses e tightly', () => {
    expect(nextUp(E.lo)).toBe(E.hi);
    expect(dec60(E.lo).lt(E60) && dec60(E.hi).gt(E60)).toBe(true);
  });
  it('π/2 ∈ HALF_PI_HEAD + [TAIL_LO, TAIL_HI], and the tail interval is two ulps wide', () => {
    const half = PI60.div(2);
    expect(dec60(HALF_PI_HEAD).plus(dec60(HALF_PI_TAIL_LO)).lt(half)).toBe(true);
    expect(dec60(HALF_PI_HEAD).plus(dec60(HALF_PI_TAIL_HI)).gt(half)).toBe(true);
    expect(nextUp(nextUp(HALF_PI_TAIL_LO))).toBe(HALF_PI_TAIL_HI);
    expect(HALF_PI_HEAD * 2).toBe(PI.lo);
  });
});
