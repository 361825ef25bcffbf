/**
 * The flat register API agrees with the object API: for every operation the register result
 * contains the object result (which itself is checked against decimal.js in interval.test.ts) and
 * is at most one successor step wider on each side; the status register records the same flags.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as F from '../../src/interval/flat.js';
import * as I from '../../src/interval/interval.js';
import { Interval } from '../../src/interval/interval.js';
import { intervalArithmetic } from '../../src/interval/interval-arith.js';
import { PHI } from '../../src/interval/round.js';
import { anyDouble, boxWithPoint, moderate } from './oracle.js';

const box = (b: { lo: number; hi: number }) => new Interval(b.lo, b.hi);

function agree(flat: Interval, obj: Interval, what: string): void {
  if (I.isEmpty(obj)) {
    expect(I.isEmpty(flat), what).toBe(true);
    return;
  }
  expect(I.isSubset(obj, flat), `${what}: flat ${flat} ⊉ object ${obj}`).toBe(true);
  // The fast path takes one successor step c ± (φ|c| + 2^-1000) after round-to-nearest (flat.ts),
  // the kernel is tight: allow two such steps.
  const step = (c: number) => 2 * (PHI * Math.abs(c) + 2 ** -1000);
  expect(flat.lo >= obj.lo - step(obj.lo), `${what}: flat lo ${flat.lo} too low vs ${obj.lo}`).toBe(true);
  expect(flat.hi <= obj.hi + step(obj.hi), `${what}: flat hi ${flat.hi} too high vs ${obj.hi}`).toBe(true);
}

type Bin = [string, (R: Float64Array, d: number, a: number, b: number) => void, (a: Interval, b: Interval) => Interval];
type Un = [string, (R: Float64Array, d: number, a: number) => void, (a: Interval) => Interval];

const BIN: Bin[] = [
  ['add', F.fAdd, I.add],
  ['sub', F.fSub, I.sub],
  ['mul', F.fMul, I.mul],
  ['div', F.fDiv, I.div],
  ['min', F.fMin, I.min],
  ['max', F.fMax, I.max],
  ['pow', F.fPow, I.pow],
];
const UN: Un[] = [
  ['neg', F.fNeg, I.neg],
  ['sqr', F.fSqr, I.sqr],
  ['recip', F.fRecip, I.recip],
  ['sqrt', F.fSqrt, I.sqrt],
  ['exp', F.fExp, I.exp],
  ['log', F.fLog, I.log],
  ['sin', F.fSin, I.sin],
  ['cos', F.fCos, I.cos],
  ['tan', F.fTan, I.tan],
  ['atan', F.fAtan, I.atan],
  ['sinh', F.fSinh, I.sinh],
  ['cosh', F.fCosh, I.cosh],
  ['tanh', F.fTanh, I.tanh],
  ['abs', F.fAbs, I.abs],
  ['absSlope', F.fAbsSlope, I.absSlope],
];

describe('flat ops agree with object ops', () => {
  const boxes = fc.oneof(boxWithPoint(anyDouble), boxWithPoint(moderate(50)));
  it('binary operations (also d aliasing a)', () => {
    fc.assert(
      fc.property(boxes, boxes, (a, b) => {
        for (const [name, f, g] of BIN) {
          const R = new Float64Array(8);
          F.fReset(R);
          F.fConst(R, 1, a.lo, a.hi);
          F.fConst(R, 2, b.lo, b.hi);
          f(R, 3, 1, 2);
          const obj = g(box(a), box(b));
          agree(new Interval(R[6]!, R[7]!), obj, `${name}(${box(a)}, ${box(b)})`);
          // Status register matches the arithmetic's status.
          const A = intervalArithmetic();
          (A as unknown as Record<string, (x: Interval, y: Interval) => Interval>)[name]!(box(a), box(b));
          expect(F.fContinuous(R), `${name} continuous`).toBe(A.status.continuous);
          f(R, 1, 1, 2); // aliasing: d = a
          agree(new Interval(R[2]!, R[3]!), obj, `${name} aliased`);
        }
      }),
      { numRuns: 300 },
    );
  });
  it('unary operations and pown', () => {
    fc.assert(
      fc.property(boxes, fc.integer({ min: -5, max: 5 }), (a, n) => {
        for (const [name, f, g] of UN) {
          const R = new Float64Array(6);
          F.fReset(R);
          F.fConst(R, 1, a.lo, a.hi);
          f(R, 2, 1);
          agree(new Interval(R[4]!, R[5]!), g(box(a)), `${name}(${box(a)})`);
          const A = intervalArithmetic();
          if (name === 'recip') A.div(new Interval(1, 1), box(a));
          else (A as unknown as Record<string, (x: Interval) => Interval>)[name]!(box(a));
          expect(F.fContinuous(R), `${name} continuous`).toBe(A.status.continuous);
          expect(F.fAssumed(R), `${name} assumed`).toBe(A.status.assumed);
        }
        const R = new Float64Array(6);
        F.fReset(R);
        F.fConst(R, 1, a.lo, a.hi);
        F.fPown(R, 2, 1, n);
        agree(new Interval(R[4]!, R[5]!), I.pown(box(a), n), `pown(${box(a)}, ${n})`);
      }),
      { numRuns: 200 },
    );
  });
  it('special boxes: EMPTY, ENTIRE, zeros, half-lines — every pair, every operation (regression: EMPTY divisor took the fast path)', () => {
    const special = [
      [Infinity, -Infinity],
      [-Infinity, Infinity],
      [0, 0],
      [-0, 0],
      [-Infinity, 0],
      [1, Infinity],
      [-2, 3],
      [1e308, 1e308],
      [-(2 ** -1074), 2 ** -1074],
    ] as const;
    for (const [alo, ahi] of special) {
      for (const [blo, bhi] of special) {
        for (const [name, f, g] of BIN) {
          const R = new Float64Array(8);
          F.fReset(R);
          F.fConst(R, 1, alo, ahi);
          F.fConst(R, 2, blo, bhi);
          f(R, 3, 1, 2);
          const A = new Interval(alo, ahi);
          const B = new Interval(blo, bhi);
          agree(new Interval(R[6]!, R[7]!), g(A, B), `${name}(${A}, ${B})`);
          const arith = intervalArithmetic();
          (arith as unknown as Record<string, (x: Interval, y: Interval) => Interval>)[name]!(A, B);
          expect(F.fContinuous(R), `${name}(${A}, ${B}) continuous`).toBe(arith.status.continuous);
        }
      }
      for (const [name, f, g] of UN) {
        const R = new Float64Array(6);
        F.fReset(R);
        F.fConst(R, 1, alo, ahi);
        f(R, 2, 1);
        agree(new Interval(R[4]!, R[5]!), g(new Interval(alo, ahi)), `${name}([${alo}, ${ahi}])`);
      }
    }
  });
  it('status register: domain violations clear R[0], Math.* sets R[1]; fCopy copies', () => {
    const R = new Float64Array(8);
    F.fReset(R);
    F.fConst(R, 1, -1, 4);
    F.fSqrt(R, 2, 1);
    expect(F.fContinuous(R)).toBe(false);
    expect(R[4]).toBe(0);
    expect(R[5]).toBe(2);
    F.fReset(R);
    F.fAtan(R, 2, 1);
    expect(F.fContinuous(R)).toBe(true);
    expect(F.fAssumed(R)).toBe(true);
    F.fReset(R);
    F.fConst(R, 2, 1e308, 1e308);
    F.fMul(R, 3, 2, 2); // overflow from bounded inputs
    expect(R[7]).toBe(Infinity);
    expect(F.fContinuous(R)).toBe(false);
    F.fCopy(R, 1, 3);
    expect(R[3]).toBe(Infinity);
  });
});
