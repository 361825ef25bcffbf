/**
 * Decorations (IEEE 1788-2015 §11). The ITF1788 `_dec` vectors are run in itf1788.test.ts; here
 * the propagation rules themselves, with the standard's rule as the source of each expectation.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as D from '../../src/interval/decoration.js';
import { Decoration } from '../../src/interval/decoration.js';
import { EMPTY, ENTIRE, interval } from '../../src/interval/interval.js';
import { readItl } from './itl.js';

const com = (lo: number, hi: number) => D.newDec(interval(lo, hi));

describe('decorations', () => {
  it('are ordered com > dac > def > trv > ill (IEEE 1788 §11.2)', () => {
    expect(Decoration.com > Decoration.dac && Decoration.dac > Decoration.def).toBe(true);
    expect(Decoration.def > Decoration.trv && Decoration.trv > Decoration.ill).toBe(true);
  });
  it('newDec: bounded → com, unbounded → dac, empty → trv (§11.5.1)', () => {
    expect(D.newDec(interval(1, 2)).d).toBe(Decoration.com);
    expect(D.newDec(ENTIRE).d).toBe(Decoration.dac);
    expect(D.newDec(EMPTY).d).toBe(Decoration.trv);
  });
  it('domain violations give trv; overflow gives dac; otherwise the minimum of the inputs (§11.7)', () => {
    expect(D.sqrtDec(com(-1, 4)).d).toBe(Decoration.trv);
    expect(D.sqrtDec(com(0, 4)).d).toBe(Decoration.com);
    expect(D.logDec(com(0, 1)).d).toBe(Decoration.trv);
    expect(D.divDec(com(1, 2), com(-1, 1)).d).toBe(Decoration.trv);
    expect(D.tanDec(com(1, 2)).d).toBe(Decoration.trv);
    expect(D.powDec(com(-1, 2), com(2, 2)).d).toBe(Decoration.trv);
    expect(D.pownDec(com(-1, 2), -1).d).toBe(Decoration.trv);
    expect(D.mulDec(com(1e300, 1e300), com(1e300, 1e300)).d).toBe(Decoration.dac);
    expect(D.addDec(com(1, 2), D.decorated(interval(1, 2), Decoration.def)).d).toBe(Decoration.def);
    expect(D.addDec(com(1, 2), D.decorated(EMPTY, Decoration.trv)).d).toBe(Decoration.trv);
    expect(D.addDec(com(1, 2), D.decorated(EMPTY, Decoration.ill)).d).toBe(Decoration.ill);
    expect(D.intersectDec(com(1, 3), com(2, 4)).d).toBe(Decoration.trv); // set ops are not point functions
  });
  it('property: the decoration never exceeds the inputs, and is com exactly when the op is continuous and bounded', () => {
    const d = fc.double({ min: -10, max: 10, noNaN: true });
    fc.assert(
      fc.property(d, d, (a, b) => {
        const x = com(Math.min(a, b), Math.max(a, b));
        const s = D.sqrtDec(x);
        expect(s.d).toBe(x.x.lo >= 0 ? Decoration.com : Decoration.trv);
        const l = D.logDec(x);
        expect(l.d).toBe(x.x.lo > 0 ? Decoration.com : Decoration.trv);
        const q = D.divDec(com(1, 2), x);
        const bounded = Number.isFinite(q.x.lo) && Number.isFinite(q.x.hi); // 1/tiny overflows → dac
        expect(q.d).toBe(x.x.lo > 0 || x.x.hi < 0 ? (bounded ? Decoration.com : Decoration.dac) : Decoration.trv);
      }),
      { numRuns: 300 },
    );
  });
  it('ITF1788 _dec testcases are present for every decorated operation we support', () => {
    const ops = new Set(readItl('libieeep1788_tests_elem.itl').filter((c) => c.testcase.endsWith('_dec_test')).map((c) => c.op));
    for (const op of ['add', 'sub', 'mul', 'div', 'recip', 'sqr', 'sqrt', 'pown', 'pow', 'exp', 'log', 'sin', 'cos', 'tan', 'atan', 'sinh', 'cosh', 'tanh', 'abs', 'min', 'max'])
      expect(ops.has(op), op).toBe(true);
  });
});
