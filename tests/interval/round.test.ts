import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decimalOfDouble } from '../../src/interval/decimal-literal.js';
import {
  ETA,
  MAX,
  addDown,
  addUp,
  divDown,
  divUp,
  down,
  mulDown,
  mulUp,
  nextDown,
  nextUp,
  sqrtDown,
  sqrtUp,
  subDown,
  subUp,
  up,
} from '../../src/interval/round.js';
import { Exact, anyDouble, exact } from './oracle.js';

const finite = anyDouble;

describe('nextUp / nextDown (bit-exact)', () => {
  it('special values (IEEE 754-2008 §5.3.1, from memory)', () => {
    expect(nextUp(0)).toBe(ETA);
    expect(nextUp(-0)).toBe(ETA);
    expect(nextDown(0)).toBe(-ETA);
    expect(nextUp(MAX)).toBe(Infinity);
    expect(nextUp(Infinity)).toBe(Infinity);
    expect(nextUp(-Infinity)).toBe(-MAX);
    expect(nextDown(-MAX)).toBe(-Infinity);
    expect(nextUp(1)).toBe(1 + 2 ** -52); // closed form: ulp(1) = 2^-52
    expect(nextDown(1)).toBe(1 - 2 ** -53); // closed form: spacing below 1 is 2^-53
    expect(nextUp(-ETA)).toBe(-0);
    expect(nextUp(2 ** -1022 - ETA)).toBe(2 ** -1022); // largest subnormal → smallest normal
    expect(Number.isNaN(nextUp(NaN))).toBe(true);
  });

  it('nextUp(x) is the smallest double above x: no double strictly between (decimal midpoint check)', () => {
    fc.assert(
      fc.property(finite, (x) => {
        const n = nextUp(x);
        expect(n > x).toBe(true);
        if (n === Infinity) return;
        // The exact midpoint of x and n rounds back to one of them, so nothing lies between.
        const m = Number(exact(x).plus(exact(n)).div(2).toString());
        expect(m === x || m === n || (m === 0 && x === 0)).toBe(true);
        expect(nextDown(n) === x).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('up(c) ≥ nextUp(c) and down(c) ≤ nextDown(c) (Rump et al. 2009, Theorem 2.2), at most 2 steps', () => {
    fc.assert(
      fc.property(finite, (c) => {
        const u = up(c);
        const d = down(c);
        expect(u >= nextUp(c)).toBe(true);
        expect(d <= nextDown(c)).toBe(true);
        expect(u <= nextUp(nextUp(c))).toBe(true);
        expect(d >= nextDown(nextDown(c))).toBe(true);
      }),
      { numRuns: 2000 },
    );
    expect(up(-Infinity)).toBe(-MAX);
    expect(down(Infinity)).toBe(MAX);
  });
});

describe('directed + − × ÷ against exact decimal.js (precision 3000: exact for + − ×)', () => {
  const check = (lo: number, hi: number, v: InstanceType<typeof Exact>, inRange = true) => {
    if (lo !== -Infinity) expect(exact(lo).lte(v), `lo ${lo} > ${v.toString()}`).toBe(true);
    if (hi !== Infinity) expect(exact(hi).gte(v), `hi ${hi} < ${v.toString()}`).toBe(true);
    // Tightness: lo and hi are adjacent or equal doubles whenever both are finite and in range.
    if (inRange && Number.isFinite(lo) && Number.isFinite(hi) && Math.abs(lo) > 2 ** -960 && Math.abs(hi) < 2 ** 990)
      expect(hi === lo || nextUp(lo) === hi, `not tight: [${lo}, ${hi}]`).toBe(true);
  };
  it('addDown ≤ a + b ≤ addUp, subDown ≤ a − b ≤ subUp', () => {
    fc.assert(
      fc.property(finite, finite, (a, b) => {
        check(addDown(a, b), addUp(a, b), exact(a).plus(exact(b)));
        check(subDown(a, b), subUp(a, b), exact(a).minus(exact(b)));
      }),
      { numRuns: 1000 },
    );
  });
  it('mulDown ≤ a·b ≤ mulUp', () => {
    fc.assert(
      fc.property(finite, finite, (a, b) => {
        const lo = mulDown(a, b);
        const hi = mulUp(a, b);
        check(lo, hi, exact(a).times(exact(b)), Math.abs(a) < 2 ** 990 && Math.abs(b) < 2 ** 990);
      }),
      { numRuns: 1000 },
    );
  });
  it('divDown ≤ a/b ≤ divUp (decided by cross-multiplication, exact)', () => {
    fc.assert(
      fc.property(finite, finite, (a, b) => {
        fc.pre(b !== 0);
        const lo = divDown(a, b);
        const hi = divUp(a, b);
        // lo ≤ a/b ⟺ lo·b ≤ a (b > 0) or lo·b ≥ a (b < 0); exact products.
        const A = exact(a);
        const B = exact(b);
        if (lo !== -Infinity) expect(b > 0 ? exact(lo).times(B).lte(A) : exact(lo).times(B).gte(A)).toBe(true);
        if (hi !== Infinity) expect(b > 0 ? exact(hi).times(B).gte(A) : exact(hi).times(B).lte(A)).toBe(true);
        if (Math.abs(lo) > 2 ** -960 && Math.abs(hi) < 2 ** 990 && Math.abs(a) > 2 ** -960 && Math.abs(a) < 2 ** 990 && Math.abs(b) < 2 ** 990)
          expect(hi === lo || nextUp(lo) === hi).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });
  it('pinned: exact results stay exact (common practice, no source)', () => {
    expect(addDown(1, 2)).toBe(3);
    expect(addUp(0.5, 0.25)).toBe(0.75);
    expect(mulDown(3, 9)).toBe(27);
    expect(divUp(1, 4)).toBe(0.25);
    expect(addDown(1, -1)).toBe(0);
    expect(addUp(MAX, MAX)).toBe(Infinity);
    expect(addDown(MAX, MAX)).toBe(MAX); // overflow from finite operands: lower bound stays finite
    expect(mulUp(-MAX, 2)).toBe(-MAX);
    expect(mulDown(2 ** -600, 2 ** -600)).toBe(0); // exact 2^-1200 > 0 underflows: the lower bound 0 keeps the sign …
    expect(mulUp(2 ** -600, 2 ** -600)).toBe(ETA); // … and up gives the smallest subnormal
    expect(mulUp(-(2 ** -600), 2 ** -600)).toBe(0);
    expect(divDown(2 ** -1000, 2 ** 1000)).toBe(0);
  });
});

describe('sqrtDown / sqrtUp (verified with exact squares)', () => {
  it('sqrtDown(x)² ≤ x ≤ sqrtUp(x)², adjacent or equal', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, noNaN: true, noDefaultInfinity: true }), (x) => {
        const lo = sqrtDown(x);
        const hi = sqrtUp(x);
        const X = exact(x);
        expect(exact(lo).times(exact(lo)).lte(X)).toBe(true);
        expect(exact(hi).times(exact(hi)).gte(X)).toBe(true);
        expect(lo === hi || nextUp(lo) === hi).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });
  it('perfect squares are exact, incl. subnormal 2^-1074 (closed form)', () => {
    expect(sqrtDown(4)).toBe(2);
    expect(sqrtUp(4)).toBe(2);
    expect(sqrtDown(2 ** -1074)).toBe(2 ** -537);
    expect(sqrtUp(2 ** -1074)).toBe(2 ** -537);
    expect(sqrtUp(MAX) > Math.sqrt(MAX) || exact(sqrtUp(MAX)).pow(2).gte(exact(MAX))).toBe(true);
    expect(Number.isNaN(sqrtDown(-1))).toBe(true);
    expect(sqrtUp(Infinity)).toBe(Infinity);
    void decimalOfDouble;
  });
});
